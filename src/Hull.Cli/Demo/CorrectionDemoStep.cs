using Hull.Cli.Client;
using Hull.Cli.Commands;
using Hull.Cli.Input;
using Hull.Cli.Output;
using Hull.Protos.V1;

namespace Hull.Cli.Demo;

/// <summary>
/// The demo's corrections step: an invented Li-Co-O mixture of two methods (data-demo/corrections), a correction set
/// that aligns them on LiCoO2 and fits the oxygen reference, a corrected version derived with it, and the stable
/// phases before and after, each answer naming the set it used.
/// </summary>
internal static class CorrectionDemoStep
{
    public const string Dataset = "cathodes-mixed";

    public static async Task RunAsync(HullConnection hull, TextWriter output, TextWriter error, string data, CancellationToken t)
    {
        output.WriteLine();
        const string title = "7i. Energy corrections: two methods mixed in Li-Co-O, aligned on LiCoO2 (data-demo/corrections)";
        output.WriteLine(title);
        output.WriteLine(new string('=', title.Length));
        await hull.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = Dataset, Description = "Li-Co-O from two methods (invented)" }, hull.Call(t));
        string file = Path.Combine(data, "corrections", "two-methods.csv");
        await new ImportRunner(hull, error, showProgress: false).ImportAsync(Dataset, file, EntryFileReader.Read(file), DuplicatePolicy.Reject, ImportRunner.DefaultBatchSize, "two methods", t);

        CorrectionSetInfo set = await hull.Corrections.PutCorrectionSetAsync(
            new PutCorrectionSetRequest { SetJson = await File.ReadAllTextAsync(Path.Combine(data, "corrections", "demo-mix.json"), t) }, hull.Call(t));
        output.WriteLine($"  Stored correction set {set.Name} v{set.Version}: base method {set.BaseMethod}, {set.FittedReferenceCount} fitted reference, "
            + $"{set.SpeciesShiftCount} species shift, {set.MethodRuleCount} method rule.");

        var raw = await hull.Stability.GetStablePhasesAsync(new GetStablePhasesRequest { Dataset = Dataset, ChemicalSystem = "Li-Co-O" }, hull.Call(t));
        DeriveCorrectedVersionResponse derived = await hull.Corrections.DeriveCorrectedVersionAsync(new DeriveCorrectedVersionRequest
        {
            Dataset = Dataset, Stored = new CorrectionSetName { Name = set.Name, Version = set.Version },
        }, hull.Call(t));
        output.WriteLine("  " + CorrectionCommands.Caption(derived));
        TableRenderer.WriteAligned(output, CorrectionCommands.ShiftsTable(derived), "  ");

        var corrected = await hull.Stability.GetStablePhasesAsync(new GetStablePhasesRequest { Dataset = Dataset, ChemicalSystem = "Li-Co-O" }, hull.Call(t));
        output.WriteLine($"  Stable phases mixed raw (version {raw.Used.Version}, no correction set): {string.Join(", ", raw.Phases.Select(p => p.PhaseId))}");
        output.WriteLine($"  Stable phases corrected (version {corrected.Used.Version}, correction set {corrected.Used.Corrections.SetName} "
            + $"v{corrected.Used.Corrections.SetVersion}): {string.Join(", ", corrected.Phases.Select(p => p.PhaseId))}");
        output.WriteLine("  Corrections move energies by fitted amounts: they can change a verdict, so every answer names the set it used.");
    }
}
