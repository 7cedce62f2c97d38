using Hull.Core.Tests.Generators;
using Hull.Core.Tests.References;
using Hull.Core.Thermo;
using Hull.Core.Windows;
using static Hull.Core.Tests.Windows.WindowReferenceData;

namespace Hull.Core.Tests.Windows;

/// <summary>
/// Extreme potentials against SciPy's HiGHS linear program (Debian python3-scipy): for every compound on the hull
/// of degenerate systems of 3–8 elements, the highest and lowest Δμ_i over its window, and the highest Δμ_X of a
/// dopant over the extended polytope, each an LP over every entry's limit.
/// </summary>
public sealed class WindowLpReferenceTests
{
    /// <summary>HiGHS solves to 1e-10 feasibility here; extremes agree to 1e-9 eV, the agreed tolerance.</summary>
    private const double ToleranceEv = 1e-9;

    [Theory]
    [InlineData(3, 30, 31)]
    [InlineData(4, 30, 32)]
    [InlineData(5, 24, 33)]
    [InlineData(6, 30, 34)]
    [InlineData(7, 18, 35)]
    [InlineData(8, 16, 36)]
    public void Extreme_potentials_and_dopant_limits_match_the_lp(int elementCount, int phaseCount, int seed)
    {
        // The last element is the dopant; hosts are the compounds of all the others.
        (string[] all, PhaseEntry[] entries) = WindowDataGenerator.Generate(elementCount, phaseCount, seed);
        string dopant = all[^1];
        string[] host = all[..^1];
        string[] extendedOrder = [.. host, dopant];
        SystemHull hostHull = SystemHull.OverElements(Within(entries, host), elements: host);
        SystemHull extended = SystemHull.OverElements(entries, elements: all);
        var problems = new List<WindowLpRunner.Problem>();
        var windows = new List<StabilityWindow>();
        var limits = new List<DopantLimit>();
        foreach (EntryStability compound in hostHull.Entries.Where(e => e.Composition.Elements.Count == host.Length && e.IsOnHull))
        {
            StabilityWindow window = StabilityWindows.Of(hostHull, compound.Id);
            DopantLimit limit = DopantLimits.Of(hostHull, extended, compound.Id, dopant);
            Assert.True(window.Exists);
            windows.Add(window);
            limits.Add(limit);

            double[] x = Fractions(compound.Entry, host);
            var hostLimits = Limits(Within(entries, host), compound.Entry, host);
            problems.Add(new WindowLpRunner.Problem(
                hostLimits.Select(l => l.A).ToArray(), hostLimits.Select(l => l.B).ToArray(),
                [x], [compound.FormationEnergyEvPerAtom!.Value],
                host.Select((_, i) => host.Select((_, k) => k == i ? 1.0 : 0.0).ToArray()).ToArray()));
            var extendedLimits = Limits(entries, compound.Entry, extendedOrder);
            problems.Add(new WindowLpRunner.Problem(
                extendedLimits.Select(l => l.A).ToArray(), extendedLimits.Select(l => l.B).ToArray(),
                [[.. x, 0.0]], [compound.FormationEnergyEvPerAtom!.Value],
                [extendedOrder.Select((_, k) => k == host.Length ? 1.0 : 0.0).ToArray()], MaxOnly: true));
        }

        Assert.True(windows.Count >= 2, $"only {windows.Count} host compounds on the hull");
        IReadOnlyList<WindowLpRunner.Answer> answers = WindowLpRunner.Solve(problems);
        for (int w = 0; w < windows.Count; w++)
        {
            WindowLpRunner.Answer extremes = answers[2 * w];
            for (int i = 0; i < host.Length; i++)
            {
                Assert.Equal(extremes.Max[i], windows[w].Extremes[i].HighestEv, ToleranceEv);
                Assert.Equal(extremes.Min[i], windows[w].Extremes[i].LowestEv, ToleranceEv);
            }

            Assert.Equal(answers[2 * w + 1].Max[0], limits[w].OverallMaxEv, ToleranceEv);
            Assert.True(limits[w].PerHostVertex.All(v => v.MaxDopantPotentialEv <= limits[w].OverallMaxEv + ToleranceEv));
        }
    }
}
