using Hull.Core.Tests.Generators;
using Hull.Core.Tests.References;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Uncertainty;

namespace Hull.Core.Tests.Thermo.Uncertainty;

/// <summary>
/// The per-sample local programs (each composition's program over the points near its plain plane, with the bound
/// that covers the rest) against the plain way (each sample's hull built over its kept points and read), sample by
/// sample with the same draws, on degenerate data (lattice compositions, equal-energy twins, points exactly on the
/// planes of others, coplanar sets, errors of zero on some entries); and both against SciPy's HiGHS LP (Debian
/// python3-scipy) at every entry's composition for some of the samples.
/// </summary>
public sealed class LocalProgramsTests
{
    private static readonly string[] Symbols = ["Li", "Co", "Mn", "Ni", "O", "Fe"];

    [Theory]
    [InlineData(3, 160, 301)]
    [InlineData(4, 200, 302)]
    [InlineData(5, 220, 303)]
    [InlineData(6, 240, 304)]
    public void Every_sample_reads_the_same_as_the_hull_built_over_its_kept_points(int components, int points, int seed)
    {
        PointSet set = DegenerateDataGenerator.Generate(components, points, seed);
        PhaseEntry[] entries = set.AsFormationEntries(Symbols[..components], i => $"p{i:000}");
        SystemHull plain = SystemHull.OverElements(entries);
        // Some entries without error keep exact ties and planes in every sample; a third share a group's error.
        var uncertainties = entries.Select((e, k) => new EnergyUncertainty(
            e.Id, k % 5 == 0 ? 0.0 : 0.005 * (1 + k % 4), k % 3 == 0 ? "g" : null)).ToArray();
        CorrelationGroup[] groups = [new("g", 0.01)];
        const int samples = 60;
        const ulong drawSeed = 77;

        SamplingSetup local = SamplingSetup.Prepare(plain, uncertainties, groups, rebuildAll: false, localPrograms: true);
        SamplingSetup built = SamplingSetup.Prepare(plain, uncertainties, groups, rebuildAll: false, localPrograms: false);
        Assert.NotNull(local.Local);
        Assert.Null(built.Local);
        var fast = new SampleTally(local.EntryPoints.Length);
        var reference = new SampleTally(built.EntryPoints.Length);
        fast.Run(local, drawSeed, 0, samples, threads: 2, CancellationToken.None);
        reference.Run(built, drawSeed, 0, samples, threads: 1, CancellationToken.None);

        int differentDecompositions = 0;
        for (int s = 0; s < samples; s++)
        {
            Assert.Equal(reference.StableSet(s), fast.StableSet(s));
            for (int e = 0; e < local.EntryPoints.Length; e++)
            {
                var a = fast.Reading(e, s);
                var b = reference.Reading(e, s);
                string where = $"{components} components, sample {s}, point {local.EntryPoints[e]}";
                Assert.True(a.IsVertex == b.IsVertex, $"{where}: vertex {a.IsVertex} against {b.IsVertex}");
                Assert.True(Math.Abs(a.AboveEvPerAtom - b.AboveEvPerAtom) <= 1e-9, $"{where}: above {a.AboveEvPerAtom} against {b.AboveEvPerAtom}");
                if (!a.Products.AsSpan().SequenceEqual(b.Products)) differentDecompositions++;
            }
        }

        Assert.Equal(0, differentDecompositions);

        // Both against the LP at every entry's composition, over every point at the sample's energies.
        var amounts = Enumerable.Range(0, plain.PointCount).Select(i => plain.PointAt(i).Amounts).ToArray();
        foreach (int s in new[] { 0, 17, 41 })
        {
            (_, double[] energy) = StabilitySampling.Draw(local, drawSeed, s);
            var queries = local.EntryPoints.Select(i => local.Fractions[i]).ToArray();
            IReadOnlyList<HullLpAnswer> answers = ScipyLpRunner.Solve(new HullLpProblem(amounts, energy, queries));
            for (int e = 0; e < local.EntryPoints.Length; e++)
            {
                int i = local.EntryPoints[e];
                double hull = energy[i] - fast.Reading(e, s).AboveEvPerAtom;
                Assert.True(Math.Abs(hull - answers[e].HullEnergyEvPerAtom) <= 1e-7,
                    $"{components} components, sample {s}, point {i}: hull energy {hull}, SciPy HiGHS {answers[e].HullEnergyEvPerAtom}");
            }
        }
    }
}
