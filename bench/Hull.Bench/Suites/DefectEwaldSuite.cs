using System.Diagnostics;
using System.Globalization;
using System.Text;
using System.Text.Json.Nodes;
using Hull.Bench.Measure;
using Hull.Core.Defects;

namespace Hull.Bench.Suites;

/// <summary>
/// The defect image-charge energy (triclinic cell, full 3×3 tensor) and the model potential at 200 atomic sites,
/// ours against the NumPy/SciPy evaluation of the same sums (tests/Hull.Core.Tests/References/defect_electrostatics.py)
/// in one run. Targets: energy converged to 1e-6 eV in ≤ 20 ms; 200 site potentials ≤ 50 ms.
/// </summary>
public static class DefectEwaldSuite
{
    public const string Name = "defect-ewald";

    private const int DefaultReps = 15;

    public static string Run(BenchOptions options, string repoRoot)
    {
        int reps = options.InProcessReps ?? (options.Quick ? 2 : DefaultReps);
        var cell = LatticeCell.Create(new(9.1, 0.0, 0.0), new(2.3, 8.4, 0.0), new(-1.7, 1.9, 9.6));
        var eps = DielectricTensor.FromMatrix(Matrix3.FromRows([[9.0, 1.5, -0.8], [1.5, 6.5, 2.1], [-0.8, 2.1, 11.2]]));
        var random = new Random(options.Seed);
        var sites = Enumerable.Range(0, 200).Select(_ => new Vector3D(random.NextDouble(), random.NextDouble(), random.NextDouble())).ToList();
        var defect = new Vector3D(0.21, 0.37, 0.64);

        var report = new StringBuilder();
        report.AppendLine($"# {Name}\n");
        report.AppendLine($"Command: `{options.CommandLine}`  ");
        report.AppendLine($"Machine: {MachineInfo.Describe()}  ");
        report.AppendLine($"Cell: triclinic, 706 Å³; tensor with off-diagonal terms (eigenvalues 5–13); {reps} warm repetitions, medians.\n");
        report.AppendLine("| case | ours (ms) | NumPy (ms) | ours − NumPy | ours − tighter tail | target |");
        report.AppendLine("| --- | ---: | ---: | ---: | ---: | --- |");

        var reference = new JsonArray();
        foreach (var model in new[] { ModelCharge.Default, ModelCharge.Point })
        {
            reference.Add(Task("lattice", cell, eps, model, 2, reps));
        }

        reference.Add(Sites(cell, eps, ModelCharge.Default, 2, defect, sites, reps));
        reference.Add(Sites(cell, eps, ModelCharge.Point, 2, defect, sites, reps));
        var answers = PythonReference.Run(repoRoot, "defect_electrostatics.py", reference, TimeSpan.FromMinutes(10));

        int k = 0;
        foreach (var (model, label) in new[] { (ModelCharge.Default, "E_lat, Gaussian σ = 1 Å, q = 2"), (ModelCharge.Point, "E_lat, point charge, q = 2") })
        {
            double value = 0;
            double ms = Time(reps, () => value = ImageChargeEwald.LatticeCorrection(cell, eps, model, 2).CorrectionEv);
            double tight = ImageChargeEwald.LatticeCorrection(cell, eps, model, 2, new EwaldSettings(RelativeTail: 1e-16)).CorrectionEv;
            var answer = answers[k++]!;
            report.AppendLine($"| {label} | {ms:F2} | {1000 * answer["median_seconds"]!.GetValue<double>():F1} | {value - answer["value"]!.GetValue<double>():E1} eV | {value - tight:E1} eV | ≤ 20 ms, 1e-6 eV |");
        }

        foreach (var (model, label) in new[] { (ModelCharge.Default, "200 site potentials, Gaussian σ = 1 Å"), (ModelCharge.Point, "200 site potentials, point charge") })
        {
            double[] ours = [];
            double ms = Time(reps, () => ours = ModelPotential.AtSites(cell, eps, model, 2, defect, sites));
            double[] tight = ModelPotential.AtSites(cell, eps, model, 2, defect, sites, new EwaldSettings(RelativeTail: 1e-16));
            var answer = answers[k++]!;
            double[] theirs = [.. answer["value"]!.AsArray().Select(v => v!.GetValue<double>())];
            double worst = ours.Zip(theirs, (a, b) => Math.Abs(a - b)).Max();
            double worstTight = ours.Zip(tight, (a, b) => Math.Abs(a - b)).Max();
            report.AppendLine($"| {label} | {ms:F2} | {1000 * answer["median_seconds"]!.GetValue<double>():F1} | max {worst:E1} V | max {worstTight:E1} V | ≤ 50 ms |");
        }

        report.AppendLine($"\nLoad average at the end: {MachineInfo.LoadAverage()}.");
        string text = report.ToString();
        Console.Write(text);
        return text;
    }

    private static double Time(int reps, Action action)
    {
        action(); // warm-up: JIT and first-touch
        var times = new List<double>();
        for (int i = 0; i < reps; i++)
        {
            var clock = Stopwatch.StartNew();
            action();
            times.Add(clock.Elapsed.TotalMilliseconds);
        }

        return Stats.Median(times);
    }

    private static JsonObject Task(string kind, LatticeCell cell, DielectricTensor eps, ModelCharge model, int q, int reps) => new()
    {
        ["kind"] = kind, ["cell"] = Rows(cell.Rows), ["eps"] = Rows(eps.Tensor), ["cov"] = Rows(model.Covariance), ["q"] = q, ["repeat"] = reps,
    };

    private static JsonObject Sites(LatticeCell cell, DielectricTensor eps, ModelCharge model, int q, Vector3D defect, List<Vector3D> sites, int reps)
    {
        var task = Task("sites", cell, eps, model, q, reps);
        task["defect"] = new JsonArray(defect.X, defect.Y, defect.Z);
        task["sites"] = new JsonArray([.. sites.Select(s => (JsonNode)new JsonArray(s.X, s.Y, s.Z))]);
        return task;
    }

    private static JsonArray Rows(Matrix3 m) => new([.. m.ToRows().Select(r => (JsonNode)new JsonArray([.. r.Select(v => (JsonNode)v)]))]);
}
