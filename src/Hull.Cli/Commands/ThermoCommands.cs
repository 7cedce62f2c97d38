using System.CommandLine;
using System.Globalization;
using System.Text;
using Hull.Cli.Input;
using Hull.Cli.Output;
using Hull.Protos.V1;

namespace Hull.Cli.Commands;

/// <summary>
/// `hull thermo gas|hull|decompose|figure`: gas potentials μ(T, p) and their conversions, the hull at (T, p),
/// decomposition temperatures at a gas pressure, and the stability-against-temperature figure. Every number and
/// figure comes from the server.
/// </summary>
public static class ThermoCommands
{
    /// <summary>Printed under every answer about temperatures.</summary>
    public const string SafetyNote =
        "released oxygen and hot oxides or cathodes are a fire hazard; these are estimates from computed energies, and real thermal and thermal-runaway safety work follows local rules and licensed practice";

    public static Command Build(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap) =>
        new("thermo", "temperature and gas pressure: gas potentials, the hull at (T, p), decomposition temperatures, a figure against T")
        {
            GasCommand(wrap), HullCommand(wrap), DecomposeCommand(wrap), FigureCommand(wrap),
        };

    /// <summary>The options that describe the gas and the treatment, shared by every thermo command.</summary>
    private sealed record GasOptions(
        Option<string> Gas, Option<double?> Pressure, Option<string> Reference, Option<double?> MoleculeEnergy,
        Option<double?> ZeroPoint, Option<double?> StandardEntropy, Option<string> Treatment)
    {
        public IEnumerable<Option> All => [Gas, Pressure, Reference, MoleculeEnergy, ZeroPoint, StandardEntropy, Treatment];

        public static GasOptions Create(bool pressureRequired) => new(
            new Option<string>("--gas") { Description = "the gas: O2, N2, H2, F2 or Cl2", DefaultValueFactory = _ => "O2" },
            ValueOptions.OptionalNumber("--pressure", pressureRequired ? "the gas's partial pressure, bar (e.g. 0.21 for air)" : "the gas's partial pressure, bar", "a pressure in bar"),
            ValueOptions.Choice("--reference", "what the dataset's reference for the gas's element stands for: fitted (H at 298.15 K) or computed (a molecule at rest; give --molecule-energy and --zero-point-energy)", "fitted", "fitted", "computed"),
            ValueOptions.OptionalNumber("--molecule-energy", "computed reference: the molecule's energy at rest, eV per molecule", "an energy in eV"),
            ValueOptions.OptionalNumber("--zero-point-energy", "computed reference: the molecule's zero-point energy, eV per molecule", "an energy in eV"),
            ValueOptions.OptionalNumber("--standard-entropy", "Ellingham treatment: the gas's S°(298.15 K) in J/(mol K), to match the handbook of the solids' entropies (default: the gas table's)", "an entropy"),
            ValueOptions.Choice("--treatment", "ellingham (H and S at 298.15 K for every species, exact crossings) or tabulated (the gas's tabulated H(T), S(T); crossings root-solved on a scan)", "tabulated", "tabulated", "ellingham"));

        public ThermoGasConditions Conditions(CliContext c) => new()
        {
            Gas = c.Get(Gas)!,
            PressureBar = c.Get(Pressure) ?? 0,
            Reference = c.Get(Reference) == "computed" ? ThermoGasReference.ComputedMolecule : ThermoGasReference.Fitted,
            MoleculeEnergyEv = c.Get(MoleculeEnergy) ?? 0,
            ZeroPointEnergyEv = c.Get(ZeroPoint) ?? 0,
            StandardEntropyJPerMolK = c.Get(StandardEntropy) ?? 0,
        };

        public ThermoTreatment TreatmentOf(CliContext c) => c.Get(Treatment) == "ellingham" ? ThermoTreatment.Ellingham : ThermoTreatment.TabulatedGas;

        public void RequirePressure(CliContext c)
        {
            if (c.Get(Pressure) is null) throw new UsageException("--pressure is required: the gas's partial pressure in bar (e.g. 0.21 for air)");
        }
    }

    private static Option<string?> ModelsOption() => new("--models")
    {
        Description = "temperature models: CSV (entry_id,formula,standard_entropy_j_per_mol_k,source) or JSON ({\"models\": [...]}); default: the models stored with the entries",
    };

    private static Option<double?> FromOption() => ValueOptions.OptionalNumber("--from", "low end of the temperature range, K (default 300)", "a temperature in K");

    private static Option<double?> ToOption() => ValueOptions.OptionalNumber("--to", "high end of the temperature range, K (default 1500)", "a temperature in K");

    private static Option<string?> SystemOption() => new("--system") { Description = "a larger chemical system to hull in, e.g. Li-Co-O (default: the phase's elements and the gas's)" };

    private static IEnumerable<ThermoSolidModel> Models(CliContext c, Option<string?> option) =>
        c.Get(option) is { } path ? ThermoModelFile.Read(path) : [];

    private static string Treatment(ThermoTreatment t) => t == ThermoTreatment.Ellingham ? "Ellingham approximation" : "tabulated gas";

    private static string Gas(ThermoGasPoint? g) => g is null ? "no gas open" : string.Create(CultureInfo.InvariantCulture,
        $"{g.Gas} at {g.PressureBar:G4} bar (Δμ_{g.Element} = {g.DeltaMuEvPerAtom:0.0000} eV/atom at {g.TemperatureK:0.##} K{(g.ZeroPointOffsetEvPerAtom != 0 ? $", of which zero-point {g.ZeroPointOffsetEvPerAtom:0.0000}" : string.Empty)})");

    private static Command GasCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var gasOptions = GasOptions.Create(pressureRequired: false);
        var temperature = ValueOptions.OptionalNumber("--temperature", "temperature, K", "a temperature in K");
        var dataset = new Option<string?>("--dataset") { Description = "measure Δμ from this dataset's reference for the gas's element (default: --reference-energy)" };
        var version = CommandTree.VersionOption();
        var referenceEnergy = ValueOptions.OptionalNumber("--reference-energy", "without --dataset: the reference for the gas's element, eV/atom (default 0, a formation-energy scale)", "an energy in eV");
        var deltaMu = ValueOptions.OptionalNumber("--delta-mu", "also give the pressure at --temperature, and the temperature at --pressure, at which Δμ has this value (eV/atom)", "an energy in eV");
        var command = new Command("gas", "μ(T, p) of a gas per molecule and per atom, Δμ of its element, and Δμ as a pressure or a temperature")
        {
            temperature, dataset, version, referenceEnergy, deltaMu,
        };
        foreach (Option option in gasOptions.All) command.Options.Add(option);
        command.SetAction(wrap(async (c, t) =>
        {
            if (c.Get(temperature) is not double kelvin) throw new UsageException("--temperature is required (K)");
            if (c.Get(gasOptions.Pressure) is null && c.Get(deltaMu) is null) throw new UsageException("give --pressure, --delta-mu or both");
            var request = new GetGasPotentialRequest
            {
                Dataset = c.Get(dataset) ?? string.Empty, Version = c.Get(version), Gas = gasOptions.Conditions(c), TemperatureK = kelvin,
                Treatment = gasOptions.TreatmentOf(c), ReferenceEvPerAtom = c.Get(referenceEnergy) ?? 0,
            };
            if (c.Get(deltaMu) is double target) request.DeltaMuEvPerAtom = target;
            GetGasPotentialResponse r = await c.Server.Thermo.GetGasPotentialAsync(request, c.Server.Call(t));
            var caption = new StringBuilder(string.Create(CultureInfo.InvariantCulture,
                $"{request.Gas.Gas} at {kelvin:0.##} K, {Treatment(r.Treatment)}, reference anchored at {r.AnchorTemperatureK:0.##} K; table {r.TableSource} ({r.TableMinimumK:0.##} K to {r.TableMaximumK:0.##} K)"));
            if (r.Used is not null) caption.Append($"\n{VersionText.Of(r.Used)}");
            if (r.HasConversion)
            {
                caption.Append(string.Create(CultureInfo.InvariantCulture, $"\nΔμ_{r.Element} = {request.DeltaMuEvPerAtom:0.####} eV/atom: p = {r.PressureForDeltaMuBar:G4} bar (log10 {r.Log10PressureForDeltaMuBar:0.###}) at {kelvin:0.##} K"));
                if (c.Get(gasOptions.Pressure) is double p)
                {
                    caption.Append(r.TemperatureFound
                        ? string.Create(CultureInfo.InvariantCulture, $"; T = {r.TemperatureForDeltaMuK:0.###} K at {p:G4} bar")
                        : $"; at {p.ToString("G4", CultureInfo.InvariantCulture)} bar: {r.TemperatureSolveStatus}");
                }
            }

            c.Emit(r, () =>
            {
                var table = new Table("quantity", "value", "unit");
                table.Add("E_ref", r.ReferenceEnergyEvPerMolecule, "eV/molecule");
                table.Add("H(T) - H(anchor)", r.EnthalpyAboveAnchorEvPerMolecule, "eV/molecule");
                table.Add("T S", r.EntropyTermEvPerMolecule, "eV/molecule");
                table.Add("k_B T ln(p/p0)", r.PressureTermEvPerMolecule, "eV/molecule");
                if (r.Point is { } g)
                {
                    table.Add("mu", g.MuEvPerMolecule, "eV/molecule");
                    table.Add("mu per atom", g.MuEvPerAtom, "eV/atom");
                    table.Add("dataset reference", g.DatasetReferenceEvPerAtom, "eV/atom");
                    table.Add("delta mu", g.DeltaMuEvPerAtom, "eV/atom");
                    table.Add("zero-point part of delta mu", g.ZeroPointOffsetEvPerAtom, "eV/atom");
                }

                return table;
            }, caption.ToString());
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command HullCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = CommandTree.DatasetArgument();
        var system = new Argument<string>("system") { Description = "every element of the system, the gas's included, e.g. Li-Co-O" };
        var version = CommandTree.VersionOption();
        var gasOptions = GasOptions.Create(pressureRequired: true);
        var noGas = new Option<bool>("--no-gas") { Description = "open no element: every element needs modelled solids" };
        var temperature = ValueOptions.OptionalNumber("--temperature", "temperature, K", "a temperature in K");
        var models = ModelsOption();
        var command = new Command("hull", "the hull at a temperature with the gas's element open at Δμ(T, p): stability and decompositions")
        {
            dataset, system, version, noGas, temperature, models,
        };
        foreach (Option option in gasOptions.All) command.Options.Add(option);
        command.SetAction(wrap(async (c, t) =>
        {
            if (c.Get(temperature) is not double kelvin) throw new UsageException("--temperature is required (K)");
            var request = new GetHullAtConditionsRequest
            {
                Dataset = c.Get(dataset)!, Version = c.Get(version), ChemicalSystem = c.Get(system)!, TemperatureK = kelvin, Treatment = gasOptions.TreatmentOf(c),
            };
            if (!c.Get(noGas))
            {
                gasOptions.RequirePressure(c);
                request.Gas = gasOptions.Conditions(c);
            }

            request.Models.AddRange(Models(c, models));
            GetHullAtConditionsResponse r = await c.Server.Thermo.GetHullAtConditionsAsync(request, c.Server.Call(t));
            var caption = new StringBuilder($"{VersionText.Of(r.Used)}: {r.EnergyAxis} over {r.ChemicalSystem}, in {r.EnergyUnit}; {Treatment(r.Treatment)}; models: {r.ModelsFrom}");
            caption.Append($"\ngas: {Gas(r.Gas)}");
            caption.Append("\nreferences at T: " + string.Join(", ", r.References.Select(x =>
                $"{x.Element} {x.EntryId}{(x.ChangedFromAnchor ? $" (not {x.AnchorEntryId} as at the anchor)" : string.Empty)}")));
            caption.Append($"\nstable: {string.Join(" ", r.StablePhaseIds)}");
            if (r.UnmodelledEntryIds.Count > 0) caption.Append($"\nleft out (no temperature model): {string.Join(" ", r.UnmodelledEntryIds)}");
            caption.Append($"\n{SafetyNote}");
            c.Emit(r, () =>
            {
                var table = new Table("entry_id", "formula", "free_energy_ev_per_closed_atom", "above_hull_ev_per_closed_atom", "stable", "decomposes_to");
                foreach (ThermoHullEntry e in r.Entries)
                {
                    table.Add(e.EntryId, e.Formula, e.FreeEnergyEvPerClosedAtom, e.EnergyAboveHullEvPerClosedAtom, e.IsHullVertex ? "yes" : "no", e.Decomposition.Reaction);
                }

                return table;
            }, caption.ToString());
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command DecomposeCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = CommandTree.DatasetArgument();
        var phase = new Argument<string>("phase") { Description = "the phase: an entry id (a formula with --by-formula)" };
        var byFormula = ByFormulaOption("the phase");
        var version = CommandTree.VersionOption();
        var gasOptions = GasOptions.Create(pressureRequired: true);
        var from = FromOption();
        var to = ToOption();
        var models = ModelsOption();
        var scan = ValueOptions.WholeNumber("--scan", "tabulated treatment: scan intervals of the range (default 256)", min: 1, max: 20000, fallback: 0, meaning: "a number of intervals");
        var system = SystemOption();
        var command = new Command("decompose", "every temperature in a range where a phase decomposes (or forms) at a gas pressure, and what it turns into")
        {
            dataset, phase, byFormula, version, from, to, models, scan, system,
        };
        foreach (Option option in gasOptions.All) command.Options.Add(option);
        command.SetAction(wrap(async (c, t) =>
        {
            gasOptions.RequirePressure(c);
            var request = new FindDecompositionTemperaturesRequest
            {
                Dataset = c.Get(dataset)!, Version = c.Get(version), Phase = PhaseRef(c.Get(phase)!, c.Get(byFormula)), FromK = c.Get(from) ?? 300, ToK = c.Get(to) ?? 1500,
                Gas = gasOptions.Conditions(c), Treatment = gasOptions.TreatmentOf(c), ScanIntervals = (int)c.Get(scan), ChemicalSystem = c.Get(system) ?? string.Empty,
            };
            request.Models.AddRange(Models(c, models));
            FindDecompositionTemperaturesResponse r = await c.Server.Thermo.FindDecompositionTemperaturesAsync(request, c.Server.Call(t));
            c.Emit(r, () => CrossingsTable(r), DecompositionCaption(r));
            return ExitCodes.Ok;
        }));
        return command;
    }

    /// <summary>The words above a decomposition-temperature table (the demo prints the same).</summary>
    internal static string DecompositionCaption(FindDecompositionTemperaturesResponse r)
    {
        var caption = new StringBuilder(string.Create(CultureInfo.InvariantCulture,
            $"{VersionText.Of(r.Used)}: {r.Formula} ({r.PhaseId}) in {r.ChemicalSystem}, {r.FromK:0.##} K to {r.ToK:0.##} K; {Treatment(r.Treatment)}; models: {r.ModelsFrom}"));
        caption.Append($"\ngas: {Gas(r.Gas)}");
        caption.Append(string.Create(CultureInfo.InvariantCulture,
            $"\nsigned decomposition energy {r.EnergyAtFromEvPerClosedAtom:0.0000} at {r.FromK:0.##} K ({(r.StableAtFrom ? "stable" : "unstable")}), {r.EnergyAtToEvPerClosedAtom:0.0000} at {r.ToK:0.##} K ({(r.StableAtTo ? "stable" : "unstable")}), {r.EnergyUnit}"));
        if (r.Crossings.Count == 0) caption.Append("\nno crossing in the range");
        foreach (ThermoReferenceChange change in r.ReferenceChanges)
        {
            caption.Append(string.Create(CultureInfo.InvariantCulture, $"\nreference of {change.Element} changes from {change.FromEntryId} to {change.ToEntryId} at {change.TemperatureK:0.##} K"));
        }

        if (r.UnmodelledEntryIds.Count > 0) caption.Append($"\nleft out (no temperature model): {string.Join(" ", r.UnmodelledEntryIds)}");
        caption.Append($"\n{SafetyNote}");
        return caption.ToString();
    }

    /// <summary>One row per crossing.</summary>
    internal static Table CrossingsTable(FindDecompositionTemperaturesResponse r)
    {
        var table = new Table("temperature_k", "direction", "reaction", "gas_molecules_released_per_formula_unit", "method");
        foreach (ThermoCrossing x in r.Crossings)
        {
            table.Add(x.TemperatureK, x.Direction == ThermoCrossingDirection.DecomposesAbove ? "decomposes above" : "forms above",
                x.Competitors.Reaction, x.GasReleasedMoleculesPerFormulaUnit, x.Method);
        }

        return table;
    }

    private static Option<bool> ByFormulaOption(string what) => new("--by-formula") { Description = $"read {what} as formulas: each its lowest-energy entry" };

    private static CompoundRef PhaseRef(string text, bool byFormula) =>
        byFormula ? new CompoundRef { Formula = text } : new CompoundRef { EntryId = text };

    private static Command FigureCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = CommandTree.DatasetArgument();
        var phases = new Argument<string[]>("phases") { Description = "one to eight phases: entry ids (formulas with --by-formula)", Arity = new ArgumentArity(1, 8) };
        var byFormula = ByFormulaOption("the phases");
        var version = CommandTree.VersionOption();
        var gasOptions = GasOptions.Create(pressureRequired: true);
        var from = FromOption();
        var to = ToOption();
        var models = ModelsOption();
        var samples = ValueOptions.WholeNumber("--samples", "tabulated treatment: points per curve (default 200)", min: 2, max: 5000, fallback: 0, meaning: "a number of points");
        var system = SystemOption();
        var output = new Option<string>("--output") { Description = "the SVG file to write", Required = true };
        var command = new Command("figure", "the signed decomposition energies of phases against temperature at a gas pressure, as SVG")
        {
            dataset, phases, byFormula, version, from, to, models, samples, system, output,
        };
        foreach (Option option in gasOptions.All) command.Options.Add(option);
        command.SetAction(wrap(async (c, t) =>
        {
            gasOptions.RequirePressure(c);
            var request = new DrawTemperatureFigureRequest
            {
                Dataset = c.Get(dataset)!, Version = c.Get(version), FromK = c.Get(from) ?? 300, ToK = c.Get(to) ?? 1500,
                Gas = gasOptions.Conditions(c), Treatment = gasOptions.TreatmentOf(c), Samples = (int)c.Get(samples), ChemicalSystem = c.Get(system) ?? string.Empty,
            };
            request.Phases.AddRange(c.Get(phases)!.Select(p => PhaseRef(p, c.Get(byFormula))));
            request.Models.AddRange(Models(c, models));
            DrawTemperatureFigureResponse r = await c.Server.Thermo.DrawTemperatureFigureAsync(request, c.Server.Call(t));
            string path = c.Get(output)!;
            await File.WriteAllTextAsync(path, r.Svg, new UTF8Encoding(false), t);
            c.Err.WriteLine($"wrote {path}");
            var copy = r.Clone();
            copy.Svg = string.Empty;
            c.Emit(copy, () =>
            {
                var table = new Table("phase_id", "formula", "temperature_k", "direction", "reaction");
                foreach (FindDecompositionTemperaturesResponse p in r.Phases)
                {
                    foreach (ThermoCrossing x in p.Crossings)
                    {
                        table.Add(p.PhaseId, p.Formula, x.TemperatureK, x.Direction == ThermoCrossingDirection.DecomposesAbove ? "decomposes above" : "forms above", x.Competitors.Reaction);
                    }
                }

                return table;
            }, $"{VersionText.Of(r.Used)}: wrote {path}\n{SafetyNote}");
            return ExitCodes.Ok;
        }));
        return command;
    }
}
