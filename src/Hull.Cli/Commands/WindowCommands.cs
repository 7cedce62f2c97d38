using System.CommandLine;
using System.Globalization;
using Hull.Cli.Output;
using Hull.Protos.V1;

namespace Hull.Cli.Commands;

/// <summary>
/// `hull window`, `hull window-slice` and `hull dopant-limits`: chemical-potential windows as tables with one row
/// per vertex and one column per Δμ (eV), limiting phases named. Every number comes from the server.
/// </summary>
public static class WindowCommands
{
    public static IEnumerable<Command> Build(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap) =>
        [WindowCommand(wrap), SliceCommand(wrap), DopantCommand(wrap), FigureCommand(wrap)];

    private sealed record Common(
        Argument<string> Dataset, Argument<string> Compound, Option<bool> ByFormula, Option<long> Version,
        Option<double?> Tolerance, Option<double?> Lowering, Option<string> Omit, Option<double?> GasTemperature, Option<double?> GasPressure,
        Option<string[]> GasMolecule)
    {
        public IEnumerable<Symbol> All => [Dataset, Compound, ByFormula, Version, Tolerance, Lowering, Omit, GasTemperature, GasPressure, GasMolecule];

        public CompoundRef CompoundOf(CliContext c) =>
            c.Get(ByFormula) ? new CompoundRef { Formula = c.Get(Compound)! } : new CompoundRef { EntryId = c.Get(Compound)! };

        public WindowSettings SettingsOf(CliContext c)
        {
            var settings = new WindowSettings { ProjectionOmits = c.Get(Omit) ?? string.Empty };
            if (c.Get(Tolerance) is double t) settings.AboveHullToleranceEvPerAtom = t;
            if (c.Get(Lowering) is double l) settings.LoweringEvPerAtom = l;
            if (c.Get(GasTemperature) is double gt) settings.GasAtTemperatureK = gt;
            if (c.Get(GasPressure) is double gp) settings.GasAtPressureBar = gp;
            foreach (string text in c.Get(GasMolecule) ?? []) settings.GasMolecules.Add(ParseMolecule(text));
            return settings;
        }
    }

    private static Common Options() => new(
        CommandTree.DatasetArgument(),
        new Argument<string>("compound") { Description = "entry id of the compound (or a formula with --by-formula)" },
        new Option<bool>("--by-formula") { Description = "read the compound as a formula: its lowest-energy entry" },
        CommandTree.VersionOption(),
        ValueOptions.OptionalNumber("--above-hull-tolerance", "treat a compound at most this far above the hull (eV/atom) as lowered below it", "an energy in eV/atom"),
        ValueOptions.OptionalNumber("--lowering", "how far below the hull such a compound is placed, eV/atom (default 0.001)", "an energy in eV/atom"),
        new Option<string>("--projection-omits") { Description = "element left out of the projected size (default: the one with most atoms)" },
        ValueOptions.OptionalNumber("--gas-temperature", "also give each gas element's dmu (O, N, H, F, Cl) as its gas's pressure at this temperature, K", "a temperature in K"),
        ValueOptions.OptionalNumber("--gas-pressure", "also give each gas element's dmu as the temperature at this pressure, bar", "a pressure in bar"),
        new Option<string[]>("--gas-molecule")
        {
            Description = "read a gas through its computed molecule, GAS=ENERGY_EV,ZERO_POINT_EV per molecule, against the dataset's total-energy reference (repeatable), e.g. --gas-molecule O2=-9.86,0.098",
            Arity = ArgumentArity.OneOrMore,
        });

    private static Command WindowCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        Common o = Options();
        var command = new Command("window", "the chemical-potential window in which a compound is stable: vertices, limiting phases, size");
        foreach (Symbol s in o.All) Add(command, s);
        command.SetAction(wrap(async (c, t) =>
        {
            GetStabilityWindowResponse response = await c.Server.Windows.GetStabilityWindowAsync(
                new GetStabilityWindowRequest { Dataset = c.Get(o.Dataset)!, Version = c.Get(o.Version), Compound = o.CompoundOf(c), Settings = o.SettingsOf(c) },
                c.Server.Call(t));
            c.Emit(response, () => VerticesTable(response.Window.Elements, response.Window.Vertices), Caption(response.Used, response.Window));
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command SliceCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        Common o = Options();
        var fix = new Option<string[]>("--fix") { Description = "a fixed potential ELEMENT=EV (repeatable), e.g. --fix O=-1.5", Arity = ArgumentArity.OneOrMore };
        var fixGas = new Option<string[]>("--fix-gas") { Description = "a gas element fixed by its gas at GAS=T_K,P_BAR (repeatable), e.g. --fix-gas O2=1273,0.21", Arity = ArgumentArity.OneOrMore };
        var allow = new Option<bool>("--allow-above-reference") { Description = "accept fixed potentials above 0 (such a slice always misses)" };
        var command = new Command("window-slice", "the window with some potentials held fixed, or the nearest window point when that misses");
        foreach (Symbol s in o.All) Add(command, s);
        command.Options.Add(fix);
        command.Options.Add(fixGas);
        command.Options.Add(allow);
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new SliceStabilityWindowRequest
            {
                Dataset = c.Get(o.Dataset)!, Version = c.Get(o.Version), Compound = o.CompoundOf(c), Settings = o.SettingsOf(c),
                AllowAboveReference = c.Get(allow),
            };
            foreach (string text in c.Get(fix) ?? []) request.FixedPotentials.Add(ParseFixed(text));
            foreach (string text in c.Get(fixGas) ?? []) request.FixedGases.Add(ParseGas(text, "--fix-gas"));
            if (request.FixedPotentials.Count + request.FixedGases.Count == 0) throw new UsageException("a slice needs --fix ELEMENT=EV or --fix-gas GAS=T_K,P_BAR");
            SliceStabilityWindowResponse response = await c.Server.Windows.SliceStabilityWindowAsync(request, c.Server.Call(t));
            string caption = Caption(response.Used, response.Slice) + "\n" + (response.Misses
                ? $"the slice misses the window; nearest window point ({Join(response.Whole.Elements)}): " +
                  $"{string.Join(", ", response.NearestPointEv.Select(v => Number(v)))} eV, {Number(response.DistanceEv)} eV from the slice"
                : $"slice at {string.Join(", ", response.FixedPotentialsUsed.Select(p => $"dmu_{p.Element} = {Number(p.ChemicalPotentialEv)} eV"))}" +
                  string.Concat(request.FixedGases.Select(g => $"; {g.Gas} at {Number(g.TemperatureK)} K, {Number(g.PressureBar)} bar")));
            c.Emit(response, () => VerticesTable(response.Slice.Elements, response.Slice.Vertices), caption);
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command DopantCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        Common o = Options();
        var dopants = new Argument<string[]>("dopants") { Description = "dopant element symbols, each answered independently", Arity = ArgumentArity.OneOrMore };
        var extended = new Option<bool>("--extended") { Description = "list the extended (host + dopant) vertices instead of the per-host-vertex limits" };
        var command = new Command("dopant-limits", "the highest dopant potential the host's window allows, per host vertex and overall");
        foreach (Symbol s in o.All) Add(command, s);
        command.Arguments.Add(dopants);
        command.Options.Add(extended);
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new GetDopantLimitsRequest { Dataset = c.Get(o.Dataset)!, Version = c.Get(o.Version), Compound = o.CompoundOf(c), Settings = o.SettingsOf(c) };
            request.Dopants.AddRange(c.Get(dopants)!);
            GetDopantLimitsResponse response = await c.Server.Windows.GetDopantLimitsAsync(request, c.Server.Call(t));
            string caption = Caption(response.Used, response.Host) + "\n" + string.Join("\n", response.Limits.Select(l => l.HasOverallMaxEv
                ? $"dopant {l.Dopant}: highest dmu_{l.Dopant} {Number(l.OverallMaxEv)} eV, limited by {LimitText(l.OverallLimitingPhaseIds, l.Dopant)}"
                : $"dopant {l.Dopant}: no limit (the host has no window)"));
            c.Emit(response, () => c.Get(extended) ? ExtendedTable(response.Limits) : DopantTable(response), caption);
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command FigureCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        Common o = Options();
        var x = new Option<string?>("--x") { Description = "element whose Δμ runs along x (with --y; default: the first two elements other than the most abundant)" };
        var y = new Option<string?>("--y") { Description = "element whose Δμ runs up y" };
        var at = new Option<string[]>("--at") { Description = "for 4+ elements, a section potential ELEMENT=EV (repeatable; all but x, y and one more; default: the vertices' mean)", Arity = ArgumentArity.OneOrMore };
        var atGas = new Option<string[]>("--at-gas") { Description = "a section potential set by a gas, GAS=T_K,P_BAR (repeatable), e.g. --at-gas O2=1273,0.21", Arity = ArgumentArity.OneOrMore };
        var output = new Option<string?>("--output", "-o") { Description = "SVG file to write (default: DATASET-vVERSION-COMPOUND-window.svg)" };
        var command = new Command("window-figure", "draw a compound's window (or a section of it) in the plane of two potentials as SVG");
        foreach (Symbol s in o.All) Add(command, s);
        foreach (Option option in new Option[] { x, y, at, atGas, output }) command.Options.Add(option);
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new DrawWindowFigureRequest
            {
                Dataset = c.Get(o.Dataset)!, Version = c.Get(o.Version), Compound = o.CompoundOf(c), Settings = o.SettingsOf(c),
                XElement = c.Get(x) ?? string.Empty, YElement = c.Get(y) ?? string.Empty,
            };
            foreach (string text in c.Get(at) ?? []) request.Section.Add(ParseFixed(text, "--at"));
            foreach (string text in c.Get(atGas) ?? []) request.SectionGases.Add(ParseGas(text, "--at-gas"));
            DrawWindowFigureResponse response = await c.Server.Windows.DrawWindowFigureAsync(request, c.Server.Call(t));
            string path = c.Get(output) ?? FigureFileName(response);
            await File.WriteAllTextAsync(path, response.Svg, new System.Text.UTF8Encoding(false), t);
            var summary = response.Clone();
            summary.Svg = string.Empty;
            c.Emit(summary, () => VerticesTable(response.Window.Elements, response.DrawnVertices), FigureCaption(response, path));
            return ExitCodes.Ok;
        }));
        return command;
    }

    internal static string FigureFileName(DrawWindowFigureResponse response) =>
        string.Concat($"{response.Used.Dataset}-v{response.Used.Version}-{response.Window.EntryId}-window.svg".Select(ch => char.IsAsciiLetterOrDigit(ch) || ch is '-' or '.' or '_' ? ch : '_'));

    internal static string FigureCaption(DrawWindowFigureResponse r, string path)
    {
        string drawn = r.DrawnDimension switch
        {
            2 => "a polygon",
            1 => "a segment",
            0 => "a point",
            _ => r.SectionMisses ? "nothing: the section misses the window" : "nothing: no window",
        };
        string section = r.Section.Count == 0 ? string.Empty
            : $"; section at {string.Join(", ", r.Section.Select(p => $"dmu_{p.Element} = {Number(p.ChemicalPotentialEv)} eV"))}{(r.SectionChosenByDefault ? " (the vertices' mean)" : string.Empty)}";
        return Caption(r.Used, r.Window) + "\n" +
               $"drawn on dmu_{r.XElement} (x) and dmu_{r.YElement} (y){(r.DependentElement.Length > 0 ? $", dmu_{r.DependentElement} from the compound's energy" : string.Empty)}{section}: {drawn}, " +
               $"{r.DrawnLineIds.Count} lines{(r.LinesLeftOut > 0 ? $" ({r.LinesLeftOut} more left out)" : string.Empty)}; wrote {path}";
    }

    private static void Add(Command command, Symbol symbol)
    {
        if (symbol is Argument a) command.Arguments.Add(a);
        else command.Options.Add((Option)symbol);
    }

    internal static FixedPotential ParseFixed(string text, string option = "--fix")
    {
        (string element, double value) = ElectrochemistryCommands.ParseElementValue(text, option, "O=-1.5");
        return new FixedPotential { Element = element, ChemicalPotentialEv = value };
    }

    /// <summary>GAS=T_K,P_BAR, or a usage error naming the option and an example.</summary>
    internal static GasPotential ParseGas(string text, string option)
    {
        (string gas, double t, double p) = ParseGasPair(text, option, "GAS=T_K,P_BAR (e.g. O2=1273,0.21)");
        return new GasPotential { Gas = gas, TemperatureK = t, PressureBar = p };
    }

    /// <summary>GAS=ENERGY_EV,ZERO_POINT_EV, or a usage error naming the option and an example.</summary>
    internal static WindowGasMolecule ParseMolecule(string text)
    {
        (string gas, double energy, double zeroPoint) = ParseGasPair(text, "--gas-molecule", "GAS=ENERGY_EV,ZERO_POINT_EV (e.g. O2=-9.86,0.098)");
        return new WindowGasMolecule { Gas = gas, MoleculeEnergyEv = energy, ZeroPointEnergyEv = zeroPoint };
    }

    /// <summary>GAS=A,B as the gas and two numbers, or a usage error naming the option and the form.</summary>
    private static (string Gas, double First, double Second) ParseGasPair(string text, string option, string form)
    {
        int eq = text.IndexOf('=');
        string[] parts = eq > 0 ? text[(eq + 1)..].Split(',') : [];
        if (parts.Length != 2
            || !double.TryParse(parts[0], NumberStyles.Float, CultureInfo.InvariantCulture, out double first)
            || !double.TryParse(parts[1], NumberStyles.Float, CultureInfo.InvariantCulture, out double second))
        {
            throw new UsageException($"{option} '{text}' is not {form}");
        }

        return (text[..eq].Trim(), first, second);
    }

    internal static string Caption(VersionUsed used, StabilityWindow w)
    {
        string kind = w.Kind switch
        {
            WindowKind.Full => $"window of dimension {w.Dimension}",
            WindowKind.LowerDimensional => $"on the hull inside a face (coexisting with {string.Join(", ", w.CoexistingPhaseIds)}): window of dimension {w.Dimension}",
            WindowKind.Lowered => $"{Number(w.EnergyAboveHullEvPerAtom)} eV/atom above the hull, treated as lowered {Number(w.LoweredByEvPerAtom)} eV/atom below it: window of dimension {w.Dimension}",
            WindowKind.AboveHull => $"no window: {Number(w.EnergyAboveHullEvPerAtom)} eV/atom above the hull, decomposes as {w.Decomposition?.Reaction}",
            _ => "unknown answer",
        };
        var lines = new List<string> { $"{VersionText.Of(used)}: {w.EntryId} ({w.Formula}) in {w.ChemicalSystem}, {kind}" };
        if (w.Size is { } size && w.Vertices.Count > 0)
        {
            lines.Add($"size: {Number(size.MeasureInPlaneEvPowK)} eV^{size.Dimension} in its own plane, {Number(size.ProjectedMeasureEvPowK)} eV^{size.Dimension} projected on dmu of {Join(size.ProjectionElements)}");
        }

        if (w.Vertices.Any(v => v.GasConditions.Count > 0))
        {
            lines.Add("gas columns: log10 of the gas's pressure (bar) at the chosen temperature, or the temperature (K) at the chosen pressure, " +
                      "that gives each vertex's dmu (ideal gas, " + GasReferenceText(w) + "); " +
                      "pressurised oxygen and hydrogen are fire and explosion hazards: follow local rules and licensed practice");
        }

        foreach (ElementExtremes e in w.Extremes)
        {
            lines.Add($"{e.Element}: richest dmu {Number(e.HighestEv)} eV at vertex {Join(e.HighestAtVertices.Select(i => (i + 1).ToString(CultureInfo.InvariantCulture)))}, " +
                      $"leanest {Number(e.LowestEv)} eV at vertex {Join(e.LowestAtVertices.Select(i => (i + 1).ToString(CultureInfo.InvariantCulture)))}");
        }

        return string.Join("\n", lines);
    }

    private static string GasReferenceText(StabilityWindow w)
    {
        string[] computed = [.. w.Vertices.SelectMany(v => v.GasConditions).Where(g => g.ComputedMolecule).Select(g => g.Gas).Distinct()];
        return computed.Length == 0
            ? "the dataset's references as fitted H(298.15 K) references"
            : $"{Join(computed)} through the computed molecule given, against the dataset's total-energy reference; other gases with the dataset's references as fitted H(298.15 K) references";
    }

    internal static Table VerticesTable(IReadOnlyList<string> elements, IEnumerable<WindowVertex> vertices)
    {
        WindowVertex[] rows = vertices.ToArray();
        string[] voltages = rows.Length == 0 ? [] : rows[0].Voltages.Select(v => $"{v.Element}_volts_vs_metal").ToArray();
        GasCondition[] gases = rows.Length == 0 ? [] : [.. rows[0].GasConditions];
        bool pressures = gases.Any(g => g.HasLog10PressureBar), temperatures = gases.Any(g => g.TemperatureStatus.Length > 0);
        string[] gasColumns = [.. gases.SelectMany(g => (pressures ? new[] { $"log10_p_{g.Gas}_bar" } : []).Concat(temperatures ? [$"T_{g.Gas}_k"] : []))];
        var table = new Table(["vertex", .. elements.Select(e => $"dmu_{e}_ev"), .. voltages, .. gasColumns, "limiting_phases", "at_reference"]);
        int n = 0;
        foreach (WindowVertex v in rows)
        {
            IEnumerable<object?> gasCells = v.GasConditions.SelectMany(g => (pressures ? new object?[] { g.HasLog10PressureBar ? g.Log10PressureBar : null } : [])
                .Concat(temperatures ? [g.HasTemperatureK ? g.TemperatureK : null] : []));
            table.Add([++n, .. v.ChemicalPotentialsEv.Select(x => (object?)x), .. v.Voltages.Select(x => (object?)x.VoltsAgainstMetal), .. gasCells,
                string.Join(" ", v.LimitingPhaseIds), string.Join(" ", v.ElementsAtReference)]);
        }

        return table;
    }

    private static Table DopantTable(GetDopantLimitsResponse response)
    {
        var table = new Table(["dopant", "host_vertex", .. response.Host.Elements.Select(e => $"dmu_{e}_ev"), "max_dmu_dopant_ev", "limited_by"]);
        foreach (DopantLimit l in response.Limits)
        {
            foreach (HostVertexDopantLimit v in l.PerHostVertex)
            {
                WindowVertex host = response.Host.Vertices[v.HostVertex];
                table.Add([l.Dopant, v.HostVertex + 1, .. host.ChemicalPotentialsEv.Select(x => (object?)x), v.MaxDopantPotentialEv, LimitText(v.LimitingPhaseIds, l.Dopant)]);
            }
        }

        return table;
    }

    private static Table ExtendedTable(IEnumerable<DopantLimit> limits)
    {
        DopantLimit[] all = limits.ToArray();
        int width = all.Length == 0 ? 0 : all[0].ExtendedElements.Count;
        var table = new Table(["dopant", "vertex", .. Enumerable.Range(0, width).Select(i => $"dmu_{(i == width - 1 ? "dopant" : all[0].ExtendedElements[i])}_ev"), "limiting_phases"]);
        foreach (DopantLimit l in all)
        {
            int n = 0;
            foreach (WindowVertex v in l.ExtendedVertices) table.Add([l.Dopant, ++n, .. v.ChemicalPotentialsEv.Select(x => (object?)x), string.Join(" ", v.LimitingPhaseIds)]);
        }

        return table;
    }

    private static string LimitText(IEnumerable<string> phases, string dopant)
    {
        string text = string.Join(" ", phases);
        return text.Length > 0 ? text : $"{dopant} at its reference";
    }

    private static string Join(IEnumerable<string> items) => string.Join(", ", items);

    private static string Number(double? value) => value is double v ? v.ToString("0.######", CultureInfo.InvariantCulture) : "-";
}
