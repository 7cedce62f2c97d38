using System.Globalization;
using Hull.Cli.Client;
using Hull.Cli.Commands;
using Hull.Cli.Input;
using Hull.Cli.Output;
using Hull.Protos.V1;

namespace Hull.Cli.Demo;

/// <summary>
/// The demo's temperature step: O2's chemical potential in a furnace and in air, the Li-Co-O hull at temperature in
/// air, the temperature at which the delithiated cathode (the invented LiCo2O4 spinel) gives off oxygen at two oxygen
/// pressures, and the stability-against-temperature figure, with the invented entropies of data-demo/thermo.
/// </summary>
internal static class ThermoDemoStep
{
    public const string Cathode = "ter-LiCo2O4-delithiated";

    /// <summary>The figure's file inside the figures folder.</summary>
    public static string FigurePath(string figuresFolder) => Path.Combine(figuresFolder, "thermo-Li-Co-O-in-air.svg");

    public static async Task RunAsync(HullConnection hull, TextWriter output, string dataset, string data, string figuresFolder, CancellationToken t)
    {
        IReadOnlyList<ThermoSolidModel> models = ThermoModelFile.Read(Path.Combine(data, "thermo", "li-co-o-entropies.csv"));
        Heading(output, "12. Temperature and oxygen pressure: when does the delithiated cathode give off oxygen?");
        output.WriteLine($"  Invented standard entropies for {models.Count} Li-Co-O entries (data-demo/thermo/li-co-o-entropies.csv), sent with each request.");

        Heading(output, "12a. O2 in air at 900 K against the dataset's oxygen reference, and Δμ_O = -1.0 eV as a pressure and a temperature");
        var gas = new GetGasPotentialRequest
        {
            Dataset = dataset, Gas = new ThermoGasConditions { Gas = "O2", PressureBar = 0.21 }, TemperatureK = 900, DeltaMuEvPerAtom = -1.0,
        };
        GetGasPotentialResponse mu = await hull.Thermo.GetGasPotentialAsync(gas, hull.Call(t));
        output.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"  μ(O2) = {mu.Point.MuEvPerMolecule:0.0000} eV per molecule, {mu.Point.MuEvPerAtom:0.0000} eV per atom; reference {mu.Point.DatasetReferenceEntryId} at {mu.Point.DatasetReferenceEvPerAtom:0.000} eV/atom; Δμ_O = {mu.Point.DeltaMuEvPerAtom:0.0000} eV/atom"));
        output.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"  Δμ_O = -1.0 eV/atom is p(O2) = {mu.PressureForDeltaMuBar:G3} bar at 900 K, or T = {mu.TemperatureForDeltaMuK:0.0} K in air ({mu.TableSource})"));

        Heading(output, "12b. The Li-Co-O hull at 900 K in air (tabulated O2, entropies of the solids)");
        var hullRequest = new GetHullAtConditionsRequest
        {
            Dataset = dataset, ChemicalSystem = "Li-Co-O", TemperatureK = 900, Gas = new ThermoGasConditions { Gas = "O2", PressureBar = 0.21 },
        };
        hullRequest.Models.AddRange(models);
        GetHullAtConditionsResponse atT = await hull.Thermo.GetHullAtConditionsAsync(hullRequest, hull.Call(t));
        output.WriteLine($"  {atT.EnergyAxis}, in {atT.EnergyUnit}; stable: {string.Join(" ", atT.StablePhaseIds)}");
        output.WriteLine("  References at 900 K: " + string.Join(", ", atT.References.Select(r =>
            $"{r.Element} {r.EntryId}{(r.ChangedFromAnchor ? $" (at the anchor: {r.AnchorEntryId})" : string.Empty)}")));
        var table = new Table("entry_id", "formula", "free_energy_ev_per_closed_atom", "above_hull_ev_per_closed_atom", "decomposes_to");
        foreach (ThermoHullEntry e in atT.Entries.Where(e => e.EnergyAboveHullEvPerClosedAtom < 0.15).Take(10))
        {
            table.Add(e.EntryId, e.Formula, e.FreeEnergyEvPerClosedAtom, e.EnergyAboveHullEvPerClosedAtom, e.Decomposition.Reaction);
        }

        TableRenderer.WriteAligned(output, table, "  ");
        if (atT.UnmodelledEntryIds.Count > 0) output.WriteLine($"  Left out (no temperature model): {string.Join(" ", atT.UnmodelledEntryIds)}");

        Heading(output, $"12c. The delithiated cathode {Cathode}: oxygen release in air and under a 1 mbar O2 purge");
        foreach ((double bar, ThermoTreatment treatment) in new[] { (0.21, ThermoTreatment.Ellingham), (0.21, ThermoTreatment.TabulatedGas), (1e-3, ThermoTreatment.TabulatedGas) })
        {
            var request = new FindDecompositionTemperaturesRequest
            {
                Dataset = dataset, Phase = new CompoundRef { EntryId = Cathode }, FromK = 300, ToK = 1500, ChemicalSystem = "Li-Co-O",
                Gas = new ThermoGasConditions { Gas = "O2", PressureBar = bar }, Treatment = treatment,
            };
            request.Models.AddRange(models);
            FindDecompositionTemperaturesResponse r = await hull.Thermo.FindDecompositionTemperaturesAsync(request, hull.Call(t));
            output.WriteLine();
            foreach (string line in ThermoCommands.DecompositionCaption(r).Split('\n').Where(l => !l.StartsWith("released oxygen", StringComparison.Ordinal)))
            {
                output.WriteLine("  " + line);
            }

            TableRenderer.WriteAligned(output, ThermoCommands.CrossingsTable(r), "  ");
        }

        Heading(output, "12d. Figure: stability against temperature in air");
        var figure = new DrawTemperatureFigureRequest
        {
            Dataset = dataset, FromK = 300, ToK = 1500, ChemicalSystem = "Li-Co-O", Gas = new ThermoGasConditions { Gas = "O2", PressureBar = 0.21 },
        };
        figure.Phases.AddRange(new[] { Cathode, "ter-LiCoO2-r3m", "bin-Co3O4", "bin-CoO" }.Select(id => new CompoundRef { EntryId = id }));
        figure.Models.AddRange(models);
        DrawTemperatureFigureResponse drawn = await hull.Thermo.DrawTemperatureFigureAsync(figure, hull.Call(t));
        string path = FigurePath(figuresFolder);
        Directory.CreateDirectory(figuresFolder);
        await File.WriteAllTextAsync(path, drawn.Svg, t);
        output.WriteLine($"  Figure: {Path.GetFullPath(path)}");
        output.WriteLine();
        output.WriteLine("  Caution: released oxygen and hot cathodes are a fire hazard (oxygen feeds the burning of the electrolyte");
        output.WriteLine("  and of anything nearby). These temperatures are estimates from invented, computed energies; real thermal and");
        output.WriteLine("  thermal-runaway safety work follows local rules and licensed practice.");
    }

    private static void Heading(TextWriter output, string title)
    {
        output.WriteLine();
        output.WriteLine(title);
        output.WriteLine(new string('=', Math.Min(title.Length, 100)));
    }
}
