using System.CommandLine;
using System.Globalization;
using System.Text;
using Hull.Cli.Output;
using Hull.Protos.V1;

namespace Hull.Cli.Commands;

/// <summary>
/// `hull open-hull`, `hull voltage`, `hull react` and `hull ion-window`: grand-potential hulls, insertion voltage
/// profiles, two-phase reaction profiles and electrochemical windows. Every number and figure comes from the server.
/// </summary>
public static class ElectrochemistryCommands
{
    /// <summary>Printed under every voltage and reaction answer.</summary>
    public const string SafetyNote =
        "estimates from 0 K energies; before handling reactive metals (Li, Na, K), fluorides or high-voltage cells, follow your site's safety rules and licensed practice";

    public static IEnumerable<Command> Build(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap) =>
        [OpenHullCommand(wrap), VoltageCommand(wrap), ReactCommand(wrap), IonWindowCommand(wrap)];

    private static Option<string[]> OpenOption(bool required) => new("--open")
    {
        Description = "an open element at its chemical potential ELEMENT=EV (Δμ relative to the element's reference; repeatable), e.g. --open O=-2",
        Arity = ArgumentArity.OneOrMore,
        Required = required,
    };

    private static Option<bool> AbsoluteOption() => new("--absolute") { Description = "read the --open values as absolute μ on the scale of the total energies" };

    private static Option<bool> AllowAboveOption() => new("--allow-above-reference") { Description = "accept Δμ above 0 (richer than the pure element)" };

    private static Option<long> ChargeOption() => ValueOptions.WholeNumber(
        "--charge", "the ion's charge number z (default: 1 for Li, Na, K; 2 for Mg, Ca, Zn)", min: 0, max: 8, fallback: 0, meaning: "a charge number");

    private static Option<string?> FigureOption(string what) => new("--figure") { Description = $"also write the {what} figure (SVG) to this file" };

    private static IEnumerable<OpenElementPotential> Potentials(CliContext c, Option<string[]> open, Option<bool> absolute) =>
        (c.Get(open) ?? []).Select(text =>
        {
            (string element, double value) = ParseElementValue(text, "--open", "O=-2");
            return new OpenElementPotential { Element = element, ChemicalPotentialEvPerAtom = value, Absolute = c.Get(absolute) };
        });

    /// <summary>ELEMENT=NUMBER, or a usage error naming the option and an example.</summary>
    internal static (string Element, double Value) ParseElementValue(string text, string option, string example)
    {
        int eq = text.IndexOf('=');
        if (eq <= 0 || !double.TryParse(text[(eq + 1)..], NumberStyles.Float, CultureInfo.InvariantCulture, out double value) || !double.IsFinite(value))
        {
            throw new UsageException($"{option} '{text}' is not ELEMENT=EV (e.g. {example})");
        }

        return (text[..eq].Trim(), value);
    }

    private static Command OpenHullCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = CommandTree.DatasetArgument();
        var system = new Argument<string>("system") { Description = "every element of the system, open ones included, e.g. Li-Co-O" };
        var version = CommandTree.VersionOption();
        var open = OpenOption(required: true);
        var absolute = AbsoluteOption();
        var allow = AllowAboveOption();
        var command = new Command("open-hull", "the hull with elements open to a reservoir: grand potential per closed-element atom, stability, decompositions")
        {
            dataset, system, version, open, absolute, allow,
        };
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new GetOpenElementHullRequest
            {
                Dataset = c.Get(dataset)!, Version = c.Get(version), ChemicalSystem = c.Get(system)!, AllowAboveReference = c.Get(allow),
            };
            request.OpenElements.AddRange(Potentials(c, open, absolute));
            GetOpenElementHullResponse r = await c.Server.Electrochemistry.GetOpenElementHullAsync(request, c.Server.Call(t));
            var caption = new StringBuilder($"{VersionText.Of(r.Used)}: {r.EnergyAxis} over {r.ChemicalSystem}, in {r.EnergyUnit}");
            caption.Append($"\nstable: {string.Join(" ", r.StablePhaseIds)}");
            if (r.ExcludedEntryIds.Count > 0) caption.Append($"\nleft out (open elements only, the reservoir): {string.Join(" ", r.ExcludedEntryIds)}");
            c.Emit(r, () =>
            {
                var table = new Table("entry_id", "formula", "grand_potential_ev_per_closed_atom", "above_hull_ev_per_closed_atom", "stable", "decomposes_to");
                foreach (OpenHullEntry e in r.Entries)
                {
                    table.Add(e.EntryId, e.Formula, e.GrandPotentialEvPerClosedAtom, e.EnergyAboveHullEvPerClosedAtom, e.IsHullVertex ? "yes" : "no", e.Decomposition.Reaction);
                }

                return table;
            }, caption.ToString());
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command VoltageCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = CommandTree.DatasetArgument();
        var host = new Argument<string>("host") { Description = "the ion-poorest end-member as a formula, e.g. CoO2 (x counts ions per this formula unit)" };
        var version = CommandTree.VersionOption();
        var ion = new Option<string>("--ion") { Description = "the inserted element, e.g. Li", Required = true };
        var charge = ChargeOption();
        var to = new Option<string?>("--to") { Description = "the ion-richest end-member, e.g. LiCoO2 (default: on until the ion's metal comes in)" };
        var figure = FigureOption("voltage-profile");
        var command = new Command("voltage", "the voltage profile of inserting an ion into a host: plateaus, mean voltage, capacity, energy density")
        {
            dataset, host, version, ion, charge, to, figure,
        };
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new GetVoltageProfileRequest
            {
                Dataset = c.Get(dataset)!, Version = c.Get(version), HostFormula = c.Get(host)!, Ion = c.Get(ion)!,
                InsertedEndFormula = c.Get(to) ?? string.Empty, IncludeFigure = c.Get(figure) is not null,
            };
            if (c.Get(charge) is long z and > 0) request.ChargeNumber = (int)z;
            GetVoltageProfileResponse r = await c.Server.Electrochemistry.GetVoltageProfileAsync(request, c.Server.Call(t));
            await WriteFigureAsync(c, c.Get(figure), r.FigureSvg, t);
            Protos.V1.VoltageProfile p = r.Profile;
            string caption = string.Create(CultureInfo.InvariantCulture,
                $"{VersionText.Of(r.Used)}: {p.Ion} (z = {p.ChargeNumber}) into {p.HostFormula} in {p.ChemicalSystem}, up to {p.FullyInsertedFormula}{(p.EndsAtIonMetal ? $" (then {p.Ion} metal)" : string.Empty)}\n")
                + string.Create(CultureInfo.InvariantCulture,
                $"mean {p.AverageVoltsAgainstMetal:0.000} V over Δx = {p.IonsPerHostInserted:0.###}; capacity {p.CapacityPerHostMassMahPerG:0.0} mAh/g of {p.HostFormula}, {p.CapacityPerInsertedMassMahPerG:0.0} mAh/g of {p.FullyInsertedFormula}; ")
                + string.Create(CultureInfo.InvariantCulture,
                $"energy {p.EnergyDensityPerHostMassWhPerKg:0} Wh/kg of {p.HostFormula}, {p.EnergyDensityPerInsertedMassWhPerKg:0} Wh/kg of {p.FullyInsertedFormula}\n{p.Caveat}\n{SafetyNote}");
            c.Emit(WithoutFigure(r), () =>
            {
                var table = new Table("plateau", "x_from", "x_to", "volts_vs_metal", "kind", "phases");
                int n = 0;
                foreach (Protos.V1.VoltagePlateau q in p.Plateaus)
                {
                    table.Add(++n, q.IonsPerHostFrom, q.IonsPerHostTo, q.VoltsAgainstMetal, q.IsConversion ? "conversion" : "two-phase", string.Join(" + ", q.Phases.Select(x => x.Formula)));
                }

                return table;
            }, caption);
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command ReactCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = CommandTree.DatasetArgument();
        var first = new Argument<string>("first") { Description = "entry id of the first phase (or a formula with --by-formula); x counts its share" };
        var second = new Argument<string>("second") { Description = "entry id of the second phase (or a formula with --by-formula)" };
        var byFormula = new Option<bool>("--by-formula") { Description = "read both phases as formulas: each its lowest-energy entry" };
        var version = CommandTree.VersionOption();
        var open = OpenOption(required: false);
        var absolute = AbsoluteOption();
        var allow = AllowAboveOption();
        var figure = FigureOption("reaction-profile");
        var command = new Command("react", "the reaction energy of two phases in contact over the whole mixing ratio, its minimum and products")
        {
            dataset, first, second, byFormula, version, open, absolute, allow, figure,
        };
        command.SetAction(wrap(async (c, t) =>
        {
            CompoundRef Ref(Argument<string> a) => c.Get(byFormula) ? new CompoundRef { Formula = c.Get(a)! } : new CompoundRef { EntryId = c.Get(a)! };
            var request = new GetReactionProfileRequest
            {
                Dataset = c.Get(dataset)!, Version = c.Get(version), First = Ref(first), Second = Ref(second),
                AllowAboveReference = c.Get(allow), IncludeFigure = c.Get(figure) is not null,
            };
            request.OpenElements.AddRange(Potentials(c, open, absolute));
            GetReactionProfileResponse r = await c.Server.Electrochemistry.GetReactionProfileAsync(request, c.Server.Call(t));
            await WriteFigureAsync(c, c.Get(figure), r.FigureSvg, t);
            c.Emit(WithoutFigure(r), () => PointsTable(r), ReactionCaption(r));
            return ExitCodes.Ok;
        }));
        return command;
    }

    internal static string ReactionCaption(GetReactionProfileResponse r)
    {
        Protos.V1.ReactionPoint best = r.Points[r.MostNegativeIndex];
        Protos.V1.ReactionPoint perUnit = r.Points[r.MostNegativePerFormulaUnitIndex];
        string Reactant(Reactant x) => x.EnergyAboveHullEvPerAtom > 0
            ? string.Create(CultureInfo.InvariantCulture, $"{x.EntryId} ({x.Formula}, {x.EnergyAboveHullEvPerAtom:0.###} above the hull)")
            : $"{x.EntryId} ({x.Formula})";
        var lines = new List<string>
        {
            $"{VersionText.Of(r.Used)}: {Reactant(r.First)} with {Reactant(r.Second)} in {r.ChemicalSystem}, {r.EnergyAxis} in {r.EnergyUnit}",
            r.Reacts
                ? string.Create(CultureInfo.InvariantCulture, $"most negative (headline, per atom of mixture): {best.ReactionEnergyEvPerAtom:0.####} at x = {best.AtomFractionExact} -> {Products(best)}")
                : "no reaction: the two phases coexist at every ratio",
        };
        if (r.Reacts && r.MostNegativePerFormulaUnitIndex != r.MostNegativeIndex)
        {
            lines.Add(string.Create(CultureInfo.InvariantCulture,
                $"per formula unit of mixture the minimum is {perUnit.ReactionEnergyEvPerFormulaUnit:0.####} eV at formula-unit fraction {perUnit.FormulaUnitFractionOfFirst:0.####}"));
        }

        lines.Add(SafetyNote);
        return string.Join("\n", lines);
    }

    private static Table PointsTable(GetReactionProfileResponse r)
    {
        var table = new Table("x_atoms_first", "x_exact", "formula_unit_fraction_first", $"reaction_energy_{UnitToken(r.EnergyUnit)}", "reaction_energy_ev_per_formula_unit", "products");
        foreach (Protos.V1.ReactionPoint p in r.Points)
        {
            table.Add(p.AtomFractionOfFirst, p.AtomFractionExact, p.FormulaUnitFractionOfFirst, p.ReactionEnergyEvPerAtom, p.ReactionEnergyEvPerFormulaUnit, Products(p));
        }

        return table;
    }

    private static string UnitToken(string unit) => unit == "eV/atom" ? "ev_per_atom" : "ev_per_closed_atom";

    private static string Products(Protos.V1.ReactionPoint p) =>
        string.Join(" + ", p.Products.Select(x => $"{x.FormulaUnitsExact} {x.Phase.Formula}"));

    private static Command IonWindowCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = CommandTree.DatasetArgument();
        var phase = new Argument<string>("phase") { Description = "entry id of the phase (or a formula with --by-formula)" };
        var byFormula = new Option<bool>("--by-formula") { Description = "read the phase as a formula: its lowest-energy entry" };
        var version = CommandTree.VersionOption();
        var ion = new Option<string>("--ion") { Description = "the ion of the reference electrode, e.g. Li (voltages against Li/Li+)", Required = true };
        var charge = ChargeOption();
        var command = new Command("ion-window", "the voltages against A/A+ between which a phase is stable, and what it turns into beyond them")
        {
            dataset, phase, byFormula, version, ion, charge,
        };
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new GetElectrochemicalWindowRequest
            {
                Dataset = c.Get(dataset)!, Version = c.Get(version), Ion = c.Get(ion)!,
                Phase = c.Get(byFormula) ? new CompoundRef { Formula = c.Get(phase)! } : new CompoundRef { EntryId = c.Get(phase)! },
            };
            if (c.Get(charge) is long z and > 0) request.ChargeNumber = (int)z;
            GetElectrochemicalWindowResponse r = await c.Server.Electrochemistry.GetElectrochemicalWindowAsync(request, c.Server.Call(t));
            string caption = $"{VersionText.Of(r.Used)}: {r.EntryId} ({r.Formula}) against {r.Ion}/{r.Ion}+ in {r.ChemicalSystem}\n{r.Caveat}";
            c.Emit(r, () => WindowTable(r), caption);
            return ExitCodes.Ok;
        }));
        return command;
    }

    internal static Table WindowTable(GetElectrochemicalWindowResponse r)
    {
        var table = new Table("end", "volts_vs_metal", "dmu_ion_ev", "beyond_it");
        if (!r.Exists)
        {
            return table.Add("none", null, null, string.Create(CultureInfo.InvariantCulture, $"{r.EnergyAboveHullEvPerAtom:0.####} eV/atom above the hull: stable at no voltage"));
        }

        table.Add("reduction", r.ReductionLimitVolts, r.HighestIonPotentialEvPerAtom,
            r.ReductionProducts?.Reaction ?? (r.HighestIonPotentialEvPerAtom >= 0 ? $"stable down to {r.Ion} metal" : "-"));
        table.Add("oxidation", r.HasOxidationLimitVolts ? r.OxidationLimitVolts : null, r.HasLowestIonPotentialEvPerAtom ? r.LowestIonPotentialEvPerAtom : null,
            r.OxidationProducts?.Reaction ?? $"no upper limit in {r.ChemicalSystem} (holds no {r.Ion})");
        return table;
    }

    private static async Task WriteFigureAsync(CliContext c, string? path, string svg, CancellationToken t)
    {
        if (path is null) return;
        await File.WriteAllTextAsync(path, svg, new UTF8Encoding(false), t);
        c.Err.WriteLine($"wrote {path}");
    }

    private static T WithoutFigure<T>(T response) where T : Google.Protobuf.IMessage<T>, Google.Protobuf.IDeepCloneable<T>
    {
        T copy = response.Clone();
        Google.Protobuf.Reflection.FieldDescriptor? field = copy.Descriptor.FindFieldByName("figure_svg");
        field?.Accessor.SetValue(copy, string.Empty);
        return copy;
    }
}
