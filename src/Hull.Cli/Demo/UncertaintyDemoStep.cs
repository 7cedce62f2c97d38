using Hull.Cli.Client;
using Hull.Cli.Commands;
using Hull.Cli.Input;
using Hull.Cli.Output;
using Hull.Protos.V1;

namespace Hull.Cli.Demo;

/// <summary>
/// The demo's uncertainty step: a second dataset of Li-Co-O formation energies with error bars (data-demo/uncertainty,
/// DFT rows and ML predictions sharing the model's systematic error), sampled for each phase's probability of being
/// stable, and the ternary of those probabilities.
/// </summary>
internal static class UncertaintyDemoStep
{
    public const string Dataset = "cathodes-ml";

    public static async Task RunAsync(HullConnection hull, TextWriter output, TextWriter error, string data, string figuresFolder, CancellationToken t)
    {
        output.WriteLine();
        const string title = "7h. Stability with error bars: Li-Co-O formation energies from DFT and an ML model (data-demo/uncertainty)";
        output.WriteLine(title);
        output.WriteLine(new string('=', title.Length));
        await hull.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = Dataset, Description = "Li-Co-O with error bars (invented)" }, hull.Call(t));
        string file = Path.Combine(data, "uncertainty", "ml-li-co-o.csv");
        await new ImportRunner(hull, error, showProgress: false).ImportAsync(Dataset, file, EntryFileReader.Read(file), DuplicatePolicy.Reject, ImportRunner.DefaultBatchSize, "ml round", t);
        var request = new SampleStabilityRequest { Dataset = Dataset, ChemicalSystem = "Li-Co-O", Samples = 4000, Seed = 2026 };
        request.GroupSigmas.Add(new GroupSigma { Group = "ml-model", SigmaEvPerAtom = 0.02 });
        SampleStabilityResponse odds = await hull.Uncertainty.SampleStabilityAsync(request, hull.Call(t));
        foreach (string line in OddsCommand.Caption(odds).Split('\n')) output.WriteLine("  " + line);
        TableRenderer.WriteAligned(output, OddsCommand.OddsTable(odds), "  ");

        DrawStabilityOddsFigureResponse figure = await hull.Uncertainty.DrawStabilityOddsFigureAsync(new DrawStabilityOddsFigureRequest { Sampling = request }, hull.Call(t));
        Directory.CreateDirectory(figuresFolder);
        string path = Path.Combine(figuresFolder, "odds-Li-Co-O.svg");
        await File.WriteAllTextAsync(path, figure.Svg, t);
        output.WriteLine($"  Figure: {Path.GetFullPath(path)}");
        output.WriteLine("  A probability is only as good as the error bars put in: ML error bars are often too narrow far from the training data.");
    }
}
