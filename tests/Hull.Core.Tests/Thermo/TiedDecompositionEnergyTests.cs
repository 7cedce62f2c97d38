using Hull.Core.Chemistry;
using Hull.Core.Tests.References;
using Hull.Core.Thermo;
using static Hull.Core.Tests.Thermo.ThermoTestData;

namespace Hull.Core.Tests.Thermo;

/// <summary>
/// Decomposition energy where entries tie: the vertex of a composition carries the composition's margin (its energy
/// minus the hull without every entry of that reduced composition, checked against SciPy's HiGHS linear program,
/// Debian python3-scipy); its exact duplicate, a polymorph written with other amounts at the same energy per atom,
/// and an entry lying on a hull segment all read 0 (they only touch the hull).
/// </summary>
public sealed class TiedDecompositionEnergyTests
{
    // HiGHS solves to 1e-7 feasibility by default; the energies here are of order 0.1 eV/atom.
    private const double LinearProgramToleranceEvPerAtom = 1e-7;

    // Ag2O: standard enthalpy of formation -31.05 kJ/mol at 298.15 K (NBS tables of chemical thermodynamic
    // properties, 1982; from memory), i.e. -0.3218 eV per formula unit of 3 atoms.
    private const double Ag2OEvPerAtom = -31.05 / 96.485 / 3;

    [Fact]
    public void Vertex_carries_the_margin_and_its_ties_read_zero()
    {
        PhaseEntry[] entries =
        [
            Formation("Ag", "Ag", 0.0),
            Formation("O2", "O2", 0.0),
            Formation("Ag2O-a", "Ag2O", Ag2OEvPerAtom),
            Formation("Ag2O-b", "Ag2O", Ag2OEvPerAtom),
            Formation("Ag4O2", "Ag4O2", Ag2OEvPerAtom),
            // Halfway between Ag (x_O = 0) and Ag2O (x_O = 1/3) on the hull segment: exactly on it (halving is exact).
            Formation("Ag5O", "Ag5O", Ag2OEvPerAtom / 2),
        ];
        SystemHull hull = SystemHull.OverElements(entries);

        EntryStability vertex = hull.GetEntry("Ag2O-a");
        Assert.True(vertex.IsHullVertex);
        foreach (string tied in new[] { "Ag2O-b", "Ag4O2", "Ag5O" })
        {
            EntryStability entry = hull.GetEntry(tied);
            Assert.True(entry.IsOnHull, tied);
            Assert.False(entry.IsHullVertex, tied);
            Assert.Equal(0.0, entry.DecompositionEnergyEvPerAtom);
            Assert.Equal(0.0, hull.DecompositionEnergyByFullRebuild(tied));
        }

        // The reference: the hull at x(Ag2O) over every point of another reduced composition.
        string[] components = [.. hull.Components];
        long[][] amounts = entries.Select(e => components.Select(c => (long)e.Composition.AmountOf(c).ToDouble()).ToArray()).ToArray();
        double[] energies = entries.Select(e => e.EnergyEv).ToArray();
        Composition reduced = Composition.Parse("Ag2O").Reduced;
        int[] excluded = Enumerable.Range(0, entries.Length).Where(i => entries[i].Composition.Reduced == reduced).ToArray();
        double[] at = components.Select(c => vertex.Composition.AtomicFraction(c)).ToArray();
        HullLpAnswer lp = ScipyLpRunner.Solve(new HullLpProblem(amounts, energies, [at], [excluded]))[0];

        double margin = Ag2OEvPerAtom - lp.HullEnergyEvPerAtom;
        Assert.True(margin < -0.01, $"the margin {margin} must be a real one for the check to mean anything");
        Assert.Equal(margin, vertex.DecompositionEnergyEvPerAtom!.Value, LinearProgramToleranceEvPerAtom);
        Assert.Equal(margin, hull.DecompositionEnergyByFullRebuild("Ag2O-a")!.Value, LinearProgramToleranceEvPerAtom);
    }
}
