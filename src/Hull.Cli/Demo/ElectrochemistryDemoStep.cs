using System.Globalization;
using Hull.Cli.Client;
using Hull.Cli.Commands;
using Hull.Cli.Output;
using Hull.Protos.V1;

namespace Hull.Cli.Demo;

/// <summary>
/// The demo's electrochemistry steps: the Li-Co-O hull with oxygen open, the voltage profile of lithium into CoO2,
/// the coating question (which alumina-based coating reacts least with which cathode) and the coatings'
/// electrochemical windows against Li/Li+.
/// </summary>
internal static class ElectrochemistryDemoStep
{
    private static readonly string[] Coatings = ["coat-Al2O3-corundum", "coat-LiAlO2-gamma", "coat-LiAl5O8-spinel", "coat-Li5AlO4-beta"];

    // Minima closer than this are one answer (the shown precision of the table).
    private const double TieEvPerAtom = 1e-6;

    private static readonly string[] Cathodes = ["ter-LiCoO2-r3m", "ter-LiNiO2-r3m", "ter-LiMn2O4-spinel", "nmc-n04m04c04-A"];

    public static async Task RunAsync(HullConnection hull, TextWriter output, string dataset, string figuresFolder, CancellationToken t)
    {
        Heading(output, "7d. The Li-Co-O hull with oxygen open to a reservoir at Δμ_O = -1.5 eV");
        var open = new GetOpenElementHullRequest { Dataset = dataset, ChemicalSystem = "Li-Co-O" };
        open.OpenElements.Add(new OpenElementPotential { Element = "O", ChemicalPotentialEvPerAtom = -1.5 });
        GetOpenElementHullResponse openHull = await hull.Electrochemistry.GetOpenElementHullAsync(open, hull.Call(t));
        output.WriteLine($"  {openHull.EnergyAxis}, in {openHull.EnergyUnit}; stable: {string.Join(" ", openHull.StablePhaseIds)}");
        var openTable = new Table("entry_id", "formula", "grand_potential_ev_per_closed_atom", "above_hull_ev_per_closed_atom", "decomposes_to");
        foreach (OpenHullEntry e in openHull.Entries.Where(e => e.EnergyAboveHullEvPerClosedAtom < 0.5).Take(12))
        {
            openTable.Add(e.EntryId, e.Formula, e.GrandPotentialEvPerClosedAtom, e.EnergyAboveHullEvPerClosedAtom, e.Decomposition.Reaction);
        }

        TableRenderer.WriteAligned(output, openTable, "  ");
        output.WriteLine($"  Left out (oxygen only: the reservoir): {string.Join(" ", openHull.ExcludedEntryIds)}");

        Heading(output, "7e. Voltage profile: lithium into CoO2, up to LiCoO2");
        Directory.CreateDirectory(figuresFolder);
        var voltage = new GetVoltageProfileRequest { Dataset = dataset, HostFormula = "CoO2", Ion = "Li", InsertedEndFormula = "LiCoO2", IncludeFigure = true };
        GetVoltageProfileResponse profile = await hull.Electrochemistry.GetVoltageProfileAsync(voltage, hull.Call(t));
        var plateaus = new Table("plateau", "x_from", "x_to", "volts_vs_Li", "phases");
        int n = 0;
        foreach (VoltagePlateau p in profile.Profile.Plateaus)
        {
            plateaus.Add(++n, p.IonsPerHostFrom, p.IonsPerHostTo, p.VoltsAgainstMetal, string.Join(" + ", p.Phases.Select(x => x.Formula)));
        }

        TableRenderer.WriteAligned(output, plateaus, "  ");
        VoltageProfile v = profile.Profile;
        output.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"  Mean {v.AverageVoltsAgainstMetal:0.000} V; {v.CapacityPerHostMassMahPerG:0.0} mAh/g of CoO2, {v.CapacityPerInsertedMassMahPerG:0.0} mAh/g of LiCoO2; {v.EnergyDensityPerInsertedMassWhPerKg:0} Wh/kg of LiCoO2."));
        string voltagePath = Path.Combine(figuresFolder, "voltage-Li-into-CoO2.svg");
        await File.WriteAllTextAsync(voltagePath, profile.FigureSvg, t);
        output.WriteLine($"  Figure: {Path.GetFullPath(voltagePath)}");
        output.WriteLine($"  {v.Caveat}");

        Heading(output, "7f. The coating question: which alumina-based coating reacts least with which cathode");
        var minima = new Dictionary<(string, string), GetReactionProfileResponse>();
        foreach (string cathode in Cathodes)
        {
            foreach (string coating in Coatings)
            {
                var request = new GetReactionProfileRequest
                {
                    Dataset = dataset, First = new CompoundRef { EntryId = coating }, Second = new CompoundRef { EntryId = cathode },
                };
                minima[(cathode, coating)] = await hull.Electrochemistry.GetReactionProfileAsync(request, hull.Call(t));
            }
        }

        var grid = new Table(["cathode", .. Coatings.Select(c => $"{c}_ev_per_atom"), "least_reactive"]);
        foreach (string cathode in Cathodes)
        {
            double[] values = Coatings.Select(c => Minimum(minima[(cathode, c)])).ToArray();
            // Ties (several coatings end on the same products) are all named.
            string best = values.All(x => x == 0) ? "none reacts"
                : string.Join(" ", Coatings.Where((_, k) => values[k] >= values.Max() - TieEvPerAtom));
            grid.Add([cathode, .. values.Select(x => (object?)x), best]);
        }

        TableRenderer.WriteAligned(output, grid, "  ");
        output.WriteLine("  (most negative reaction energy over the whole mixing ratio, eV per atom of mixture; 0 = the two coexist)");
        // The most reactive pair is drawn and spelled out.
        (string worstCathode, string worstCoating) = minima.MinBy(p => Minimum(p.Value)).Key;
        GetReactionProfileResponse shown = await hull.Electrochemistry.GetReactionProfileAsync(new GetReactionProfileRequest
        {
            Dataset = dataset, First = new CompoundRef { EntryId = worstCoating }, Second = new CompoundRef { EntryId = worstCathode }, IncludeFigure = true,
        }, hull.Call(t));
        foreach (string line in ElectrochemistryCommands.ReactionCaption(shown).Split('\n')) output.WriteLine("  " + line);
        string reactionPath = Path.Combine(figuresFolder, $"reaction-{worstCoating}-{worstCathode}.svg");
        await File.WriteAllTextAsync(reactionPath, shown.FigureSvg, t);
        output.WriteLine($"  Figure: {Path.GetFullPath(reactionPath)}");

        Heading(output, "7g. Electrochemical windows of the coatings against Li/Li+");
        var windows = new Table("coating", "reduction_limit_volts", "reduced_to", "oxidation_limit_volts", "oxidised_to");
        foreach (string coating in Coatings)
        {
            GetElectrochemicalWindowResponse w = await hull.Electrochemistry.GetElectrochemicalWindowAsync(
                new GetElectrochemicalWindowRequest { Dataset = dataset, Phase = new CompoundRef { EntryId = coating }, Ion = "Li" }, hull.Call(t));
            Table rows = ElectrochemistryCommands.WindowTable(w);
            windows.Add(coating,
                w.HasReductionLimitVolts ? w.ReductionLimitVolts : null, rows.Rows[0][3],
                w.HasOxidationLimitVolts ? w.OxidationLimitVolts : null, rows.Rows.Count > 1 ? rows.Rows[1][3] : null);
        }

        TableRenderer.WriteAligned(output, windows, "  ");
        output.WriteLine("  " + ElectrochemistryCommands.SafetyNote + ".");
    }

    private static double Minimum(GetReactionProfileResponse r) => r.Points[r.MostNegativeIndex].ReactionEnergyEvPerAtom;

    private static void Heading(TextWriter output, string title)
    {
        output.WriteLine();
        output.WriteLine(title);
        output.WriteLine(new string('=', title.Length));
    }
}
