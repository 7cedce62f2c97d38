using System.CommandLine;
using System.Globalization;
using System.Text;
using Hull.Cli.Input;
using Hull.Cli.Output;
using Hull.Protos.V1;

namespace Hull.Cli.Commands;

/// <summary>
/// `hull defects ...`: defect studies stored beside a dataset (import, list, export) and their formation energies,
/// transition levels and figure at chemical-potential points, the self-consistent Fermi level (with quenching),
/// dopant solubility and the carrier figure. Every number comes from the server.
/// </summary>
public static class DefectCommands
{
    public static Command Build(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap) =>
        new("defects", "defect studies of a host compound: import, list, export, formation energies, transition levels, figures, Fermi level, solubility")
        {
            ImportCommand(wrap), ListCommand(wrap), ExportCommand(wrap), EnergiesCommand(wrap), LevelsCommand(wrap), FigureCommand(wrap),
            FermiCommand(wrap), SolubilityCommand(wrap), CarrierFigureCommand(wrap),
        };

    /// <summary>How carriers are counted: the request's statistics and concentration form.</summary>
    private sealed record Counting(Option<string> Statistics, Option<string> Form)
    {
        public IEnumerable<Symbol> All => [Statistics, Form];

        public static Counting Options() => new(
            ValueOptions.Choice("--statistics", "carrier statistics: fermi-dirac, or the boltzmann limit (wrong within a few k_BT of a band edge)", "fermi-dirac", "fermi-dirac", "boltzmann"),
            ValueOptions.Choice("--form", "defect concentrations: dilute, or site-blocking (one defect per site; for concentrations near the site density)", "dilute", "dilute", "site-blocking"));

        public FermiStatistics StatisticsOf(CliContext c) => c.Get(Statistics) == "boltzmann" ? FermiStatistics.Boltzmann : FermiStatistics.FermiDirac;

        public DefectConcentrationForm FormOf(CliContext c) => c.Get(Form) == "site-blocking" ? DefectConcentrationForm.SiteBlocking : DefectConcentrationForm.Dilute;
    }

    /// <summary>The options every evaluation shares: which study, which dataset version, which point.</summary>
    private sealed record Common(
        Argument<string> Dataset, Argument<string> Study, Option<long> Version, Option<long> StudyVersion, Option<string> Host,
        Option<string> Vertex, Option<string[]> Point, Option<string> Gas, Option<double?> Temperature, Option<double?> Pressure,
        Option<string> GasReference, Option<double?> MoleculeEnergy, Option<double?> ZeroPoint, Option<string[]> Defects)
    {
        public IEnumerable<Symbol> All =>
            [Dataset, Study, Version, StudyVersion, Host, Vertex, Point, Gas, Temperature, Pressure, GasReference, MoleculeEnergy, ZeroPoint, Defects];

        public DefectConditions? ConditionsOf(CliContext c)
        {
            string? vertex = c.Get(Vertex);
            string[] point = c.Get(Point) ?? [];
            string? gas = c.Get(Gas);
            int given = (vertex is null ? 0 : 1) + (point.Length == 0 ? 0 : 1) + (gas is null ? 0 : 1);
            if (given > 1) throw new UsageException("give one of --vertex, --point or --gas");
            if (vertex is not null) return new DefectConditions { Vertex = vertex };
            if (point.Length > 0)
            {
                var given_ = new DefectGivenPoint();
                foreach (string text in point)
                {
                    FixedPotential p = WindowCommands.ParseFixed(text);
                    given_.Potentials.Add(new DefectElementPotential { Element = p.Element, DeltaMuEv = p.ChemicalPotentialEv });
                }

                return new DefectConditions { Point = given_ };
            }

            if (gas is not null)
            {
                if (c.Get(Temperature) is not double t || c.Get(Pressure) is not double p) throw new UsageException("--gas needs --temperature K and --pressure BAR");
                var conditions = new DefectGasConditions { Gas = gas, TemperatureK = t, PressureBar = p };
                if (c.Get(GasReference) == "computed")
                {
                    if (c.Get(MoleculeEnergy) is not double e) throw new UsageException("--gas-reference computed needs --molecule-energy EV (and --zero-point-energy EV)");
                    conditions.Reference = DefectGasReference.ComputedMolecule;
                    conditions.MoleculeEnergyEv = e;
                    conditions.ZeroPointEnergyEv = c.Get(ZeroPoint) ?? 0;
                }
                else
                {
                    conditions.Reference = DefectGasReference.Fitted;
                }

                return new DefectConditions { Gas = conditions };
            }

            return null;
        }
    }

    private static Common Options() => new(
        CommandTree.DatasetArgument(),
        new Argument<string>("study") { Description = "the defect study's name" },
        CommandTree.VersionOption(),
        ValueOptions.WholeNumber("--study-version", "study version to read (default: the latest)", min: 0, max: long.MaxValue, fallback: 0, meaning: "a study version"),
        new Option<string>("--host-entry") { Description = "the host's entry id (default: the lowest-energy entry of the host's formula)" },
        new Option<string>("--vertex") { Description = "one vertex of the host's window: its number or name, e.g. 1 or O (default: every vertex)" },
        new Option<string[]>("--point") { Description = "a point given outright, ELEMENT=EV per element (repeatable), e.g. --point Al=-3 --point O=-3.72", Arity = ArgumentArity.OneOrMore },
        new Option<string>("--gas") { Description = "a gas reservoir fixing its element: O2, N2, H2, F2 or Cl2 (with --temperature and --pressure)" },
        ValueOptions.OptionalNumber("--temperature", "gas temperature, K", "a temperature in K"),
        ValueOptions.OptionalNumber("--pressure", "gas partial pressure, bar", "a pressure in bar"),
        ValueOptions.Choice("--gas-reference", "the dataset's reference of the gas element is a fitted one (standing for H°(298.15 K)), or a computed molecule given here", "fitted", "fitted", "computed"),
        ValueOptions.OptionalNumber("--molecule-energy", "with --gas-reference computed: the molecule's energy at rest, eV", "an energy in eV"),
        ValueOptions.OptionalNumber("--zero-point-energy", "with --gas-reference computed: the molecule's zero-point energy, eV", "an energy in eV"),
        new Option<string[]>("--defect") { Description = "only these defects (repeatable)", Arity = ArgumentArity.OneOrMore });

    private static Command With(Command command, IEnumerable<Symbol> symbols)
    {
        foreach (Symbol s in symbols)
        {
            if (s is Argument a) command.Arguments.Add(a);
            else command.Options.Add((Option)s);
        }

        return command;
    }

    private static Command ImportCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = CommandTree.DatasetArgument();
        var study = new Argument<string>("study") { Description = "the study's name; a name already stored gets a new version" };
        var json = new Argument<string>("study-json") { Description = "the study document (JSON, layout hull-defect-study-1)" };
        var csv = new Argument<string>("charge-states-csv") { Description = "the charge-state table (CSV: defect,charge,total_energy_ev[,shift_volts])" };
        var note = new Option<string>("--note") { Description = "note recorded with the study version" };
        var command = new Command("import", "store a defect study file as a new study version (checked against the dataset's latest version first)")
        {
            dataset, study, json, csv, note,
        };
        command.SetAction(wrap(async (c, t) =>
        {
            string jsonPath = c.Get(json)!, csvPath = c.Get(csv)!;
            var request = new ImportDefectStudyRequest
            {
                Dataset = c.Get(dataset)!, StudyName = c.Get(study)!, StudyJson = ReadText(jsonPath), ChargeStatesCsv = ReadText(csvPath),
                SourceLabel = $"{Path.GetFileName(jsonPath)} + {Path.GetFileName(csvPath)}", Note = c.Get(note) ?? string.Empty,
            };
            ImportDefectStudyResponse response = await c.Server.Defects.ImportDefectStudyAsync(request, c.Server.Call(t));
            c.Emit(response, () => SummaryTable(response.Defects),
                $"dataset {request.Dataset}: study {response.Study.StudyName} version {response.Study.StudyVersion} of {response.Study.HostFormula} (sha256 {response.Study.ContentSha256[..16]}...)");
            WriteWarnings(c, response.Warnings);
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command ListCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = CommandTree.DatasetArgument();
        var command = new Command("list", "the dataset's defect studies with their latest versions") { dataset };
        command.SetAction(wrap(async (c, t) =>
        {
            ListDefectStudiesResponse response = await c.Server.Defects.ListDefectStudiesAsync(new ListDefectStudiesRequest { Dataset = c.Get(dataset)! }, c.Server.Call(t));
            c.Emit(response, () =>
            {
                var table = new Table("study", "latest_version");
                foreach (DefectStudyListing s in response.Studies) table.Add(s.StudyName, s.LatestVersion);
                return table;
            });
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command ExportCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = CommandTree.DatasetArgument();
        var study = new Argument<string>("study") { Description = "the study's name" };
        var studyVersion = ValueOptions.WholeNumber("--study-version", "study version (default: the latest)", min: 0, max: long.MaxValue, fallback: 0, meaning: "a study version");
        var jsonOut = new Option<string>("--study-json-out") { Description = "file for the study document", Required = true };
        var csvOut = new Option<string>("--charge-states-out") { Description = "file for the charge-state table", Required = true };
        var command = new Command("export", "write a study version's two files exactly as they were imported") { dataset, study, studyVersion, jsonOut, csvOut };
        command.SetAction(wrap(async (c, t) =>
        {
            ExportDefectStudyResponse response = await c.Server.Defects.ExportDefectStudyAsync(
                new ExportDefectStudyRequest { Dataset = c.Get(dataset)!, StudyName = c.Get(study)!, StudyVersion = c.Get(studyVersion) }, c.Server.Call(t));
            var utf8 = new UTF8Encoding(false);
            await File.WriteAllTextAsync(c.Get(jsonOut)!, response.StudyJson, utf8, t);
            await File.WriteAllTextAsync(c.Get(csvOut)!, response.ChargeStatesCsv, utf8, t);
            var summary = response.Clone();
            summary.StudyJson = string.Empty;
            summary.ChargeStatesCsv = string.Empty;
            c.Emit(summary, () => new Table("study", "study_version", "sha256", "study_json", "charge_states_csv")
                .Add(response.Study.StudyName, response.Study.StudyVersion, response.Study.ContentSha256, c.Get(jsonOut), c.Get(csvOut)));
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command EnergiesCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        Common o = Options();
        var fermi = new Option<string[]>("--fermi") { Description = "Fermi levels, eV above the VBM (repeatable; default 0)", Arity = ArgumentArity.OneOrMore };
        var lowest = new Option<bool>("--lowest-only") { Description = "only the lowest charge state of each defect at each Fermi level" };
        var corrections = new Option<bool>("--corrections") { Description = "print the finite-size corrections (and alignment details) instead of the energies" };
        var command = With(new Command("energies", "formation energies of every charge state at window vertices, a given point or a gas condition, term by term"), [.. o.All, fermi, lowest, corrections]);
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new GetDefectFormationEnergiesRequest
            {
                Dataset = c.Get(o.Dataset)!, Version = c.Get(o.Version), StudyName = c.Get(o.Study)!, StudyVersion = c.Get(o.StudyVersion),
                Conditions = o.ConditionsOf(c), HostEntryId = c.Get(o.Host) ?? string.Empty,
            };
            request.Defects.AddRange(c.Get(o.Defects) ?? []);
            request.FermiLevelsEv.AddRange((c.Get(fermi) ?? []).Select(f => Number(f, "--fermi", "a Fermi level in eV")));
            GetDefectFormationEnergiesResponse response = await c.Server.Defects.GetDefectFormationEnergiesAsync(request, c.Server.Call(t));
            c.Emit(response, () => c.Get(corrections) ? CorrectionsTable(response.Corrections) : EnergiesTable(response.Points, c.Get(lowest)),
                Caption(response.Used, response.Study, response.HostEntryId, response.Gas));
            WriteWarnings(c, response.Warnings);
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command LevelsCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        Common o = Options();
        var command = With(new Command("levels", "charge-transition levels (thermodynamic and between non-ground states), effective U and complex binding energies"), o.All);
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new GetChargeTransitionLevelsRequest
            {
                Dataset = c.Get(o.Dataset)!, Version = c.Get(o.Version), StudyName = c.Get(o.Study)!, StudyVersion = c.Get(o.StudyVersion),
                Conditions = o.ConditionsOf(c), HostEntryId = c.Get(o.Host) ?? string.Empty,
            };
            request.Defects.AddRange(c.Get(o.Defects) ?? []);
            GetChargeTransitionLevelsResponse response = await c.Server.Defects.GetChargeTransitionLevelsAsync(request, c.Server.Call(t));
            string caption = Caption(response.Used, response.Study, response.HostEntryId, response.Gas) + "\n" + PointText(response.Point) + "\n" + ExtrasText(response);
            c.Emit(response, () => LevelsTable(response.Levels), caption);
            WriteWarnings(c, response.Warnings);
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command FigureCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        Common o = Options();
        var min = ValueOptions.OptionalNumber("--fermi-min", "left end of the Fermi-level axis, eV above the VBM (default 0)", "a Fermi level in eV");
        var max = ValueOptions.OptionalNumber("--fermi-max", "right end, eV above the VBM (default: the band gap)", "a Fermi level in eV");
        var output = new Option<string?>("--output", "-o") { Description = "SVG file to write (default: DATASET-STUDY-vVERSION-defects.svg)" };
        var command = With(new Command("figure", "draw formation energy against Fermi level at one point (lowest charge state per defect, transition levels marked) as SVG"),
            [.. o.All, min, max, output]);
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new DrawDefectFormationFigureRequest
            {
                Dataset = c.Get(o.Dataset)!, Version = c.Get(o.Version), StudyName = c.Get(o.Study)!, StudyVersion = c.Get(o.StudyVersion),
                Conditions = o.ConditionsOf(c), HostEntryId = c.Get(o.Host) ?? string.Empty,
            };
            request.Defects.AddRange(c.Get(o.Defects) ?? []);
            if (c.Get(min) is double lo) request.FermiMinEv = lo;
            if (c.Get(max) is double hi) request.FermiMaxEv = hi;
            DrawDefectFormationFigureResponse response = await c.Server.Defects.DrawDefectFormationFigureAsync(request, c.Server.Call(t));
            string path = c.Get(output) ?? SafeFileName($"{response.Used.Dataset}-{response.Study.StudyName}-v{response.Study.StudyVersion}-defects.svg");
            await File.WriteAllTextAsync(path, response.Svg, new UTF8Encoding(false), t);
            var summary = response.Clone();
            summary.Svg = string.Empty;
            c.Emit(summary, () => FigureTable(response, path), $"{VersionText.Of(response.Used)}, study {response.Study.StudyName} version {response.Study.StudyVersion}");
            WriteWarnings(c, response.Warnings);
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command FermiCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        Common o = Options();
        Counting k = Counting.Options();
        var at = ValueOptions.OptionalNumber("--solve-at", "temperature of the equilibrium (of growth with --quench-to), K; default with --gas: the gas's temperature", "a temperature in K");
        var quench = ValueOptions.OptionalNumber("--quench-to", "quench: totals frozen at --solve-at, charge states and carriers re-solved at this operating temperature, K", "a temperature in K");
        var states = new Option<bool>("--charge-states") { Description = "print every charge state's concentration instead of the Fermi levels and carriers" };
        var command = With(new Command("fermi", "the self-consistent Fermi level from charge neutrality at window vertices, a point or a gas condition, with every concentration (cm^-3)"),
            [.. o.All.Where(s => s != o.Defects), .. k.All, at, quench, states]);
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new FermiLevelRequest
            {
                Dataset = c.Get(o.Dataset)!, Version = c.Get(o.Version), StudyName = c.Get(o.Study)!, StudyVersion = c.Get(o.StudyVersion),
                Conditions = o.ConditionsOf(c), HostEntryId = c.Get(o.Host) ?? string.Empty, TemperatureK = c.Get(at) ?? 0,
                Statistics = k.StatisticsOf(c), Form = k.FormOf(c),
            };
            if (c.Get(quench) is double op) request.OperatingTemperatureK = op;
            if (request.TemperatureK == 0 && request.Conditions?.WhichCase != DefectConditions.WhichOneofCase.Gas) throw new UsageException("give --solve-at K (the temperature of the equilibrium)");
            FermiLevelResponse response = await c.Server.Defects.SolveFermiLevelAsync(request, c.Server.Call(t));
            c.Emit(response, () => c.Get(states) ? ChargeStatesTable(response.Points) : FermiTable(response.Points), Caption(response.Used, response.Study, response.HostEntryId, response.Gas));
            WriteWarnings(c, response.Warnings);
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command SolubilityCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = CommandTree.DatasetArgument();
        var study = new Argument<string>("study") { Description = "the defect study's name" };
        var version = CommandTree.VersionOption();
        var studyVersion = ValueOptions.WholeNumber("--study-version", "study version to read (default: the latest)", min: 0, max: long.MaxValue, fallback: 0, meaning: "a study version");
        var host = new Option<string>("--host-entry") { Description = "the host's entry id (default: the lowest-energy entry of the host's formula)" };
        var dopant = new Option<string>("--dopant") { Description = "the dopant element (default: the study's only dopant)" };
        var temperatures = new Option<string[]>("--growth") { Description = "growth temperatures, K (repeatable), e.g. --growth 1400 --growth 1700", Arity = ArgumentArity.OneOrMore, Required = true };
        var others = new Option<string[]>("--other") { Description = "Δμ of the study's other dopants, ELEMENT=EV (repeatable)", Arity = ArgumentArity.OneOrMore };
        var all = new Option<bool>("--every-vertex") { Description = "a row per vertex and temperature (default: the most soluble vertex per temperature)" };
        Counting k = Counting.Options();
        var command = With(new Command("solubility", "how much dopant dissolves at each vertex of the host + dopant window over growth temperatures, Fermi level solved at each"),
            [dataset, study, version, studyVersion, host, dopant, temperatures, others, all, .. k.All]);
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new DefectSolubilityRequest
            {
                Dataset = c.Get(dataset)!, Version = c.Get(version), StudyName = c.Get(study)!, StudyVersion = c.Get(studyVersion), HostEntryId = c.Get(host) ?? string.Empty,
                Dopant = c.Get(dopant) ?? string.Empty, Statistics = k.StatisticsOf(c), Form = k.FormOf(c),
            };
            request.TemperaturesK.AddRange((c.Get(temperatures) ?? []).Select(x => Number(x, "--growth", "a temperature in K")));
            foreach (string text in c.Get(others) ?? [])
            {
                FixedPotential p = WindowCommands.ParseFixed(text);
                request.OtherPotentials.Add(new DefectElementPotential { Element = p.Element, DeltaMuEv = p.ChemicalPotentialEv });
            }

            DefectSolubilityResponse response = await c.Server.Defects.GetDopantSolubilityAsync(request, c.Server.Call(t));
            string caption = Caption(response.Used, response.Study, response.HostEntryId, null) +
                $"\n{response.Dopant}: highest dmu_{response.Dopant} = {Invariant(response.MaxDeltaMuEv)} eV, limited by {string.Join(" ", response.LimitingPhaseIds.DefaultIfEmpty("its reference"))}";
            c.Emit(response, () => SolubilityTable(response, c.Get(all)), caption);
            WriteWarnings(c, response.Warnings);
            WriteCautions(c, response.Cautions);
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command CarrierFigureCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        Common o = Options();
        Counting k = Counting.Options();
        var temperatures = new Option<string[]>("--sweep") { Description = "two or more rising temperatures, K (repeatable), e.g. --sweep 800 --sweep 1200 --sweep 1600", Arity = ArgumentArity.OneOrMore, Required = true };
        var quench = ValueOptions.OptionalNumber("--quench-to", "draw each temperature quenched to this operating temperature, K", "a temperature in K");
        var pathTo = new Option<string?>("--path-to") { Description = "sweep along the straight Δμ path from the point (--vertex, --point or --gas) to this window vertex (number or name) at the one --sweep temperature, instead of sweeping temperature" };
        var pathPoints = ValueOptions.WholeNumber("--path-points", "points along the --path-to path, both ends included (default 41)", 2, 1001, 0, "a number of points");
        var output = new Option<string?>("--output", "-o") { Description = "SVG file to write (default: DATASET-STUDY-vVERSION-carriers.svg)" };
        var command = With(new Command("carrier-figure", "draw defect and carrier concentrations and the Fermi level against temperature, or along a Δμ path between two points, as SVG"),
            [.. o.All.Where(s => s != o.Defects), .. k.All, temperatures, quench, pathTo, pathPoints, output]);
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new DefectCarrierFigureRequest
            {
                Dataset = c.Get(o.Dataset)!, Version = c.Get(o.Version), StudyName = c.Get(o.Study)!, StudyVersion = c.Get(o.StudyVersion),
                Conditions = o.ConditionsOf(c), HostEntryId = c.Get(o.Host) ?? string.Empty, Statistics = k.StatisticsOf(c), Form = k.FormOf(c),
            };
            request.TemperaturesK.AddRange((c.Get(temperatures) ?? []).Select(x => Number(x, "--sweep", "a temperature in K")));
            if (c.Get(quench) is double op) request.OperatingTemperatureK = op;
            if (c.Get(pathTo) is string end)
            {
                request.PathTo = new DefectConditions { Vertex = end };
                request.PathPoints = (int)c.Get(pathPoints);
            }
            else if (c.Get(pathPoints) != 0)
            {
                throw new UsageException("--path-points needs --path-to VERTEX");
            }

            DefectCarrierFigureResponse response = await c.Server.Defects.DrawCarrierFigureAsync(request, c.Server.Call(t));
            string path = c.Get(output) ?? SafeFileName($"{response.Used.Dataset}-{response.Study.StudyName}-v{response.Study.StudyVersion}-carriers.svg");
            await File.WriteAllTextAsync(path, response.Svg, new UTF8Encoding(false), t);
            var summary = response.Clone();
            summary.Svg = string.Empty;
            c.Emit(summary, () => new Table("file", "point", "temperatures", "path_to").Add(path, response.Point.Label, request.TemperaturesK.Count, c.Get(pathTo) ?? ""),
                $"{VersionText.Of(response.Used)}, study {response.Study.StudyName} version {response.Study.StudyVersion}");
            WriteWarnings(c, response.Warnings);
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static string PointLabel(DefectConditionPoint p) => p.VertexNumber > 0 ? $"{p.VertexNumber} ({p.Label})" : p.Label;

    private static IEnumerable<(string State, FermiSolution Solution)> States(FermiPointSolution p) =>
        p.Quenched is null ? [("equilibrium", p.Equilibrium)] : [("growth", p.Equilibrium), ("quenched", p.Quenched)];

    internal static Table FermiTable(IEnumerable<FermiPointSolution> points)
    {
        var table = new Table("point", "state", "temperature_k", "fermi_level_ev", "electrons_per_cm3", "holes_per_cm3", "status", "form", "statistics");
        foreach (FermiPointSolution p in points)
        {
            foreach (var (state, s) in States(p))
            {
                table.Add(PointLabel(p.Point), state, s.TemperatureK, s.FermiLevelEv, new Scientific(s.ElectronsPerCm3), new Scientific(s.HolesPerCm3), s.Status, s.Form, s.Statistics);
            }
        }

        return table;
    }

    internal static Table ChargeStatesTable(IEnumerable<FermiPointSolution> points)
    {
        var table = new Table("point", "state", "temperature_k", "defect", "charge", "formation_energy_ev", "per_cm3");
        foreach (FermiPointSolution p in points)
        {
            foreach (var (state, s) in States(p))
            {
                foreach (FermiChargeState x in s.ChargeStates) table.Add(PointLabel(p.Point), state, s.TemperatureK, x.Defect, Charge(x.Charge), x.FormationEnergyEv, new Scientific(x.PerCm3));
            }
        }

        return table;
    }

    internal static Table SolubilityTable(DefectSolubilityResponse r, bool everyVertex)
    {
        var table = new Table("temperature_k", "vertex", "limiting_phases", "dopant_per_cm3", "fermi_level_ev", "most_soluble");
        foreach (DefectSolubilityAtTemperature atT in r.Temperatures)
        {
            foreach (DefectSolubilityAtVertex v in atT.Vertices.Where(v => everyVertex || v.VertexNumber == atT.MostSolubleVertex))
            {
                table.Add(atT.TemperatureK, v.VertexNumber, string.Join(" ", r.Vertices[v.VertexNumber - 1].LimitingPhaseIds), new Scientific(v.DopantPerCm3), v.Solution.FermiLevelEv,
                    v.VertexNumber == atT.MostSolubleVertex);
            }
        }

        return table;
    }

    /// <summary>Safety cautions go to stderr beside warnings (the table on stdout stays machine-readable); --quiet does not hide them.</summary>
    internal static void WriteCautions(CliContext c, IEnumerable<string> cautions)
    {
        foreach (string w in cautions) c.Err.WriteLine($"hull: {w}");
    }

    internal static string Caption(VersionUsed used, DefectStudyInfo study, string hostEntryId, DefectGasPoint? gas)
    {
        string text = $"{VersionText.Of(used)}: study {study.StudyName} version {study.StudyVersion} of {study.HostFormula} (host entry {hostEntryId}), " +
                      $"band gap {Invariant(study.BandGapEv)} eV, E_F from the VBM";
        if (gas is not null)
        {
            text += $"\n{gas.Element} from its gas at {Invariant(gas.TemperatureK)} K, {Invariant(gas.PressureBar)} bar: dmu_{gas.Element} = {Invariant(gas.DeltaMuEv)} eV" +
                    (gas.ZeroPointOffsetEv != 0 ? $" (of which {Invariant(gas.ZeroPointOffsetEv)} eV zero-point energy)" : string.Empty);
        }

        return text;
    }

    internal static string PointText(DefectConditionPoint p) =>
        $"point {(p.VertexNumber > 0 ? $"{p.VertexNumber} " : string.Empty)}({p.Label}): " +
        string.Join(", ", p.Potentials.Select(x => $"dmu_{x.Element} = {Invariant(x.DeltaMuEv)} eV")) +
        string.Concat(p.Dopants.Where(d => !d.Given).Select(d => $"; {d.Element} at its limit, set by {(d.LimitingPhaseIds.Count > 0 ? string.Join(" ", d.LimitingPhaseIds) : "its reference")}"));

    internal static Table EnergiesTable(IEnumerable<DefectPointEnergies> points, bool lowestOnly)
    {
        var table = new Table("point", "defect", "charge", "fermi_level_ev", "formation_energy_ev", "supercell_difference_ev", "chemical_potential_ev",
            "electron_reservoir_ev", "image_charge_ev", "alignment_ev", "correction_ev", "lowest");
        foreach (DefectPointEnergies p in points)
        {
            string label = p.Point.VertexNumber > 0 ? $"{p.Point.VertexNumber} ({p.Point.Label})" : p.Point.Label;
            foreach (DefectFormationEnergy e in p.Energies.Where(e => !lowestOnly || e.Lowest))
            {
                table.Add(label, e.Defect, e.Charge, e.FermiLevelEv, e.FormationEnergyEv, e.SupercellDifferenceEv, e.ChemicalPotentialEv,
                    e.ElectronReservoirEv, e.ImageChargeEv, e.AlignmentEv, e.CorrectionEv, e.Lowest);
            }
        }

        return table;
    }

    internal static Table CorrectionsTable(IEnumerable<DefectChargeStateCorrection> corrections)
    {
        var table = new Table("defect", "charge", "image_charge_ev", "alignment_ev", "alignment_method", "shift_volts", "spread_volts", "points_used", "sign_correlation");
        foreach (DefectChargeStateCorrection x in corrections)
        {
            table.Add(x.Defect, x.Charge, x.ImageChargeEv, x.AlignmentEv, x.AlignmentMethod, x.ShiftVolts, x.SpreadVolts, x.PointsUsed, double.IsNaN(x.SignCorrelation) ? null : x.SignCorrelation);
        }

        return table;
    }

    internal static Table LevelsTable(IEnumerable<DefectTransitionLevel> levels)
    {
        var table = new Table("defect", "transition", "level_ev", "kind", "inside_gap", "formation_energy_ev");
        foreach (DefectTransitionLevel l in levels)
        {
            table.Add(l.Defect, $"{Charge(l.Charge)}/{Charge(l.OtherCharge)}", l.LevelEv, l.Thermodynamic ? "thermodynamic" : "not-ground", l.InsideGap, l.FormationEnergyEv);
        }

        return table;
    }

    internal static string ExtrasText(GetChargeTransitionLevelsResponse r)
    {
        var lines = new List<string>();
        foreach (DefectEffectiveU u in r.EffectiveU)
        {
            lines.Add($"{u.Defect}: U at q = {Charge(u.Charge)} is {Invariant(u.UEv)} eV{(u.Negative ? " (negative-U)" : string.Empty)}");
        }

        foreach (DefectComplexBinding b in r.Bindings)
        {
            lines.Add($"{b.Complex} {Charge(b.Charge)}: binding energy {Invariant(b.BindingEnergyEv)} eV against {string.Join(" + ", b.Parts.Select(p => $"{p.Defect} {Charge(p.Charge)}"))}");
        }

        return string.Join("\n", lines);
    }

    internal static Table SummaryTable(IEnumerable<DefectSummary> defects)
    {
        var table = new Table("defect", "kind", "atoms", "site_set", "degeneracy", "charges", "constituents");
        foreach (DefectSummary d in defects)
        {
            table.Add(d.Name, d.Kind, string.Join(" ", d.Atoms.Select(a => $"{(a.Count > 0 ? "+" : string.Empty)}{a.Count}{a.Element}")), d.SiteSet, d.Degeneracy,
                string.Join(" ", d.Charges.Select(Charge)), string.Join(" ", d.Constituents));
        }

        return table;
    }

    internal static Table FigureTable(DrawDefectFormationFigureResponse r, string path) =>
        new Table("file", "point", "defects", "marked_levels").Add(path, r.Point.Label, r.DefectCount, r.MarkedLevelCount);

    /// <summary>Warnings go to stderr with a prefix, so that the table on stdout stays machine-readable.</summary>
    internal static void WriteWarnings(CliContext c, IEnumerable<string> warnings)
    {
        if (c.Quiet) return;
        foreach (string w in warnings) c.Err.WriteLine($"hull: warning: {w}");
    }

    internal static string ReadText(string path)
    {
        try
        {
            return File.ReadAllText(path);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new InputFileException(path, null, $"cannot read it: {e.Message}", e);
        }
    }

    private static double Number(string text, string option, string meaning) =>
        double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out double v) && double.IsFinite(v)
            ? v
            : throw new UsageException($"{option} '{text}' is not {meaning} (a finite number such as 1.5)");

    private static string SafeFileName(string raw) => string.Concat(raw.Select(ch => char.IsAsciiLetterOrDigit(ch) || ch is '-' or '.' or '_' ? ch : '_'));

    private static string Charge(int q) => q > 0 ? $"+{q}" : q.ToString(CultureInfo.InvariantCulture);

    private static string Invariant(double v) => v.ToString("0.####", CultureInfo.InvariantCulture);
}
