using Hull.Core.Chemistry;
using Hull.Core.Thermo;

namespace Hull.Core.Tests.Thermo;

/// <summary>
/// Heavily degenerate data: every compound lies exactly on a convex piecewise-linear surface, so most touch the hull
/// inside a facet and tie it. Their decomposition energy must be 0, vertices' negative, and the fast path must agree
/// with a full rebuild.
/// </summary>
public sealed class DegenerateHullTests
{
    [Fact]
    public void Points_on_a_piecewise_linear_surface()
    {
        // e(x) = the largest of three planes (a convex function) at every composition with amounts 0..3 of Fe, Li, O.
        // The elements are put at 0 (this lifts the O corner from -0.5); the surface still lies below every point, so
        // every compound lies exactly on the hull, most of them inside a facet, and some share a reduced composition.
        string[] elements = ["Fe", "Li", "O"];
        double[][] planes = [[0, 0, -1.0], [-0.5, -0.25, -0.5], [-0.25, -0.5, -0.75]];
        var entries = new List<PhaseEntry>();
        for (int fe = 0; fe <= 3; fe++)
        {
            for (int li = 0; li <= 3; li++)
            {
                for (int o = 0; o <= 3; o++)
                {
                    int[] amounts = [fe, li, o];
                    int total = fe + li + o;
                    if (total == 0)
                    {
                        continue;
                    }

                    double energy = planes.Max(p => (p[0] * fe + p[1] * li + p[2] * o) / total);
                    if (amounts.Count(a => a > 0) == 1)
                    {
                        energy = 0.0; // elements at their reference
                    }

                    var composition = Composition.FromAmounts(
                        elements.Zip(amounts).Where(z => z.Second > 0).Select(z => (z.First, new Rational(z.Second, 1))).ToArray());
                    entries.Add(new PhaseEntry($"p{fe}{li}{o}", composition, energy, EnergyBasis.FormationPerAtom));
                }
            }
        }

        SystemHull hull = SystemHull.OverElements(entries);
        Assert.Contains(hull.Entries, e => e.IsOnHull && !e.IsHullVertex
            && !hull.Entries.Any(v => v.IsHullVertex && v.Composition.Reduced == e.Composition.Reduced));
        Assert.All(hull.Entries.Where(e => e.Composition.Elements.Count > 1), e => Assert.True(e.IsOnHull, e.Id));
        foreach (EntryStability entry in hull.Entries)
        {
            ThermoTestData.AssertBalancedExactly(entry.Decomposition);
            if (entry.DecompositionEnergyEvPerAtom is not double decomposition)
            {
                continue;
            }

            Assert.Equal(hull.DecompositionEnergyByFullRebuild(entry.Id)!.Value, decomposition, 1e-12);
            // A vertex carries its composition's margin, < 0; every other entry on the hull (a tied polymorph such as
            // p111/p222, or an entry inside a facet) only touches it: exactly 0.
            if (entry.IsHullVertex)
            {
                Assert.True(decomposition < 0.0, entry.Id);
            }
            else
            {
                Assert.Equal(0.0, decomposition);
            }
        }
    }
}
