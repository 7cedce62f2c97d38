using Hull.Cli.Client;
using Hull.Cli.Commands;
using Hull.Cli.Input;
using Hull.Cli.Output;
using Hull.Protos.V1;

namespace Hull.Cli.Demo;

/// <summary>
/// The demo's defect step: the alumina coating's native vacancies and a Mg dopant (data-demo/defects), their
/// formation energies at the vertices of the Al2O3 window and in air at a furnace temperature, transition levels,
/// the formation-energy figure, the self-consistent Fermi level grown at 1600 K and quenched to room temperature, the
/// Mg solubility over growth temperatures, the carrier figure, and the study exported byte for byte.
/// </summary>
internal static class DefectDemoStep
{
    public const string StudyName = "al2o3-native-and-mg";

    /// <summary>The figure's file inside the figures folder (a subfolder of its own).</summary>
    public static string FigurePath(string figuresFolder) => Path.Combine(figuresFolder, "defects", "Al2O3-formation-energies-O-rich.svg");

    /// <summary>The carrier figure's file inside the figures folder.</summary>
    public static string CarrierFigurePath(string figuresFolder) => Path.Combine(figuresFolder, "defects", "Al2O3-carriers-O-rich.svg");

    public static string CarrierPathFigurePath(string figuresFolder) => Path.Combine(figuresFolder, "defects", "Al2O3-carriers-O-rich-to-Al-rich.svg");

    public static async Task RunAsync(HullConnection hull, TextWriter output, TextWriter error, string dataset, string data, string figuresFolder, CancellationToken t)
    {
        const string title = "11. Defects in the Al2O3 coating: vacancies and a Mg dopant at the window's vertices and in air";
        output.WriteLine();
        output.WriteLine(title);
        output.WriteLine(new string('=', Math.Min(title.Length, 100)));
        string folder = Path.Combine(data, "defects");

        // The dopant needs its elemental reference and its phases with the host's elements in the dataset.
        string phases = Path.Combine(folder, "mg-phases.csv");
        var importer = new ImportRunner(hull, error, showProgress: false);
        var imported = await importer.ImportAsync(dataset, phases, EntryFileReader.Read(phases), DuplicatePolicy.Reject, ImportRunner.DefaultBatchSize, "Mg phases for the defect study", t);
        output.WriteLine($"  {Path.GetFileName(phases)} -> version {imported[^1].Response.DatasetVersion}: the Mg reference, MgO and MgAl2O4");

        string json = await File.ReadAllTextAsync(Path.Combine(folder, "al2o3-study.json"), t);
        string csv = await File.ReadAllTextAsync(Path.Combine(folder, "al2o3-charge-states.csv"), t);
        ImportDefectStudyResponse stored = await hull.Defects.ImportDefectStudyAsync(new ImportDefectStudyRequest
        {
            Dataset = dataset, StudyName = StudyName, StudyJson = json, ChargeStatesCsv = csv, SourceLabel = "data-demo/defects", Note = "invented",
        }, hull.Call(t));
        output.WriteLine($"  Study {stored.Study.StudyName} version {stored.Study.StudyVersion} of {stored.Study.HostFormula} stored (sha256 {stored.Study.ContentSha256[..16]}...):");
        TableRenderer.WriteAligned(output, DefectCommands.SummaryTable(stored.Defects), "  ");
        foreach (string w in stored.Warnings) output.WriteLine($"  warning: {w}");

        // Every vertex of the host's window, at the VBM and at mid-gap: the lowest state of each defect.
        var energies = new GetDefectFormationEnergiesRequest { Dataset = dataset, StudyName = StudyName };
        energies.FermiLevelsEv.AddRange([0.0, stored.Study.BandGapEv / 2]);
        GetDefectFormationEnergiesResponse atVertices = await hull.Defects.GetDefectFormationEnergiesAsync(energies, hull.Call(t));
        output.WriteLine("  " + DefectCommands.Caption(atVertices.Used, atVertices.Study, atVertices.HostEntryId, null));
        foreach (DefectPointEnergies p in atVertices.Points) output.WriteLine("  " + DefectCommands.PointText(p.Point));
        TableRenderer.WriteAligned(output, DefectCommands.EnergiesTable(atVertices.Points, lowestOnly: true), "  ");
        output.WriteLine("  Finite-size corrections, each term on its own:");
        TableRenderer.WriteAligned(output, DefectCommands.CorrectionsTable(atVertices.Corrections.Where(c => c.Charge != 0)), "  ");

        GetChargeTransitionLevelsResponse levels = await hull.Defects.GetChargeTransitionLevelsAsync(
            new GetChargeTransitionLevelsRequest { Dataset = dataset, StudyName = StudyName, Conditions = new DefectConditions { Vertex = "O" } }, hull.Call(t));
        output.WriteLine("  Charge-transition levels (E_f at the level on the O-rich vertex):");
        TableRenderer.WriteAligned(output, DefectCommands.LevelsTable(levels.Levels.Where(l => l.Thermodynamic)), "  ");
        foreach (string line in DefectCommands.ExtrasText(levels).Split('\n', StringSplitOptions.RemoveEmptyEntries)) output.WriteLine("  " + line);

        // Annealing in air: O from the gas at (T, p), Al from the host's window, Mg at its solubility limit.
        var inAir = new GetDefectFormationEnergiesRequest
        {
            Dataset = dataset, StudyName = StudyName,
            Conditions = new DefectConditions { Gas = new DefectGasConditions { Gas = "O2", TemperatureK = 1273.15, PressureBar = 0.21, Reference = DefectGasReference.Fitted } },
        };
        inAir.FermiLevelsEv.Add(stored.Study.BandGapEv / 2);
        GetDefectFormationEnergiesResponse air = await hull.Defects.GetDefectFormationEnergiesAsync(inAir, hull.Call(t));
        output.WriteLine("  " + DefectCommands.Caption(air.Used, air.Study, air.HostEntryId, air.Gas).Split('\n')[^1]);
        output.WriteLine("  " + DefectCommands.PointText(air.Points[0].Point));
        TableRenderer.WriteAligned(output, DefectCommands.EnergiesTable(air.Points, lowestOnly: true), "  ");

        string path = FigurePath(figuresFolder);
        Directory.CreateDirectory(Path.GetDirectoryName(path)!);
        DrawDefectFormationFigureResponse figure = await hull.Defects.DrawDefectFormationFigureAsync(
            new DrawDefectFormationFigureRequest { Dataset = dataset, StudyName = StudyName, Conditions = new DefectConditions { Vertex = "O" } }, hull.Call(t));
        await File.WriteAllTextAsync(path, figure.Svg, t);
        output.WriteLine($"  Formation energy against Fermi level at the O-rich vertex: {path} ({figure.DefectCount} defects, {figure.MarkedLevelCount} transition levels marked)");

        // The study file's carriers block (invented masses, Varshni gap, a background donor): the Fermi level where
        // the coating grows at 1600 K, and what is left after it cools to room temperature with its defects frozen in.
        FermiLevelResponse fermi = await hull.Defects.SolveFermiLevelAsync(new FermiLevelRequest
        {
            Dataset = dataset, StudyName = StudyName, TemperatureK = 1600, OperatingTemperatureK = 300,
        }, hull.Call(t));
        output.WriteLine("  Self-consistent Fermi level at every vertex, grown at 1600 K and quenched to 300 K (Fermi-Dirac carriers, dilute defects):");
        TableRenderer.WriteAligned(output, DefectCommands.FermiTable(fermi.Points), "  ");
        foreach (string w in fermi.Warnings) output.WriteLine($"  warning: {w}");

        var solubilityRequest = new DefectSolubilityRequest { Dataset = dataset, StudyName = StudyName, Form = DefectConcentrationForm.SiteBlocking };
        solubilityRequest.TemperaturesK.AddRange([1400, 1600, 1800]);
        DefectSolubilityResponse solubility = await hull.Defects.GetDopantSolubilityAsync(solubilityRequest, hull.Call(t));
        output.WriteLine($"  Mg solubility (site blocking): highest dmu_Mg {solubility.MaxDeltaMuEv:0.###} eV against {string.Join(" ", solubility.LimitingPhaseIds)}; the most soluble vertex per growth temperature:");
        TableRenderer.WriteAligned(output, DefectCommands.SolubilityTable(solubility, everyVertex: false), "  ");
        foreach (string caution in solubility.Cautions) output.WriteLine($"  {caution}");

        var carrierRequest = new DefectCarrierFigureRequest { Dataset = dataset, StudyName = StudyName, Conditions = new DefectConditions { Vertex = "O" } };
        carrierRequest.TemperaturesK.AddRange(Enumerable.Range(0, 21).Select(i => 900.0 + 50 * i));
        DefectCarrierFigureResponse carriers = await hull.Defects.DrawCarrierFigureAsync(carrierRequest, hull.Call(t));
        string carrierPath = CarrierFigurePath(figuresFolder);
        await File.WriteAllTextAsync(carrierPath, carriers.Svg, t);
        output.WriteLine($"  Concentrations and Fermi level against temperature at the O-rich vertex: {carrierPath}");

        // The same at one growth temperature, along the window from its O-rich to its Al-rich vertex.
        var pathRequest = new DefectCarrierFigureRequest
        {
            Dataset = dataset, StudyName = StudyName, Conditions = new DefectConditions { Vertex = "O" }, PathTo = new DefectConditions { Vertex = "Al" },
        };
        pathRequest.TemperaturesK.Add(1600);
        DefectCarrierFigureResponse alongPath = await hull.Defects.DrawCarrierFigureAsync(pathRequest, hull.Call(t));
        string pathFigure = CarrierPathFigurePath(figuresFolder);
        await File.WriteAllTextAsync(pathFigure, alongPath.Svg, t);
        output.WriteLine($"  The same at 1600 K along the window from the O-rich to the Al-rich vertex: {pathFigure}");

        ExportDefectStudyResponse exported = await hull.Defects.ExportDefectStudyAsync(new ExportDefectStudyRequest { Dataset = dataset, StudyName = StudyName }, hull.Call(t));
        bool same = exported.StudyJson == json && exported.ChargeStatesCsv == csv;
        output.WriteLine($"  The study exports byte for byte as imported: {(same ? "yes" : "NO")}");
        output.WriteLine("  Caution: oxide anneals at 1000 °C in air or oxygen, and magnesium metal (which burns fiercely and cannot be put out with water),");
        output.WriteLine("  are hazards of real work; these numbers are invented and say nothing about how to run a furnace or handle Mg. Follow local rules.");
    }
}
