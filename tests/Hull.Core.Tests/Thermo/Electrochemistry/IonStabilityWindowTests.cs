using Hull.Core.Chemistry;
using Hull.Core.Optimization;
using Hull.Core.Tests.References;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Electrochemistry;
using Xunit;
using static Hull.Core.Tests.Thermo.OpenElementHullTests;

namespace Hull.Core.Tests.Thermo.Electrochemistry;

public sealed class IonStabilityWindowTests
{
    /// <summary>
    /// Hand-worked Li-Fe-F (formation energies per formula unit: LiF −6.0, FeF2 −7.0 eV). The hull's triangles are
    /// (Li, Fe, LiF), (Fe, LiF, FeF2) and (LiF, FeF2, F) (Fe + 2 LiF at −12 eV lies below FeF2 + 2 Li at −7). Their
    /// Li potentials: 0; μ_Fe = 0, μ_F = −3.5, μ_Li = −6 + 3.5 = −2.5; μ_F = 0, μ_Li = −6. So LiF is stable from 0 V to
    /// 6 V against Li/Li⁺, and FeF2 from 2.5 V (the conversion voltage, where it turns into Fe + LiF) upwards without
    /// end in this system (it holds no Li).
    /// </summary>
    [Fact]
    public void Hand_worked_fluoride_windows()
    {
        SystemHull hull = SystemHull.OverElements(
        [
            Formation("Li", "Li", 0), Formation("Fe", "Fe", 0), Formation("F", "F", 0),
            Formation("LiF", "LiF", -6.0), Formation("FeF2", "FeF2", -7.0), Formation("LiFeF3", "LiFeF3", -12.0),
        ]);
        IonStabilityWindow lif = IonStabilityWindows.Of(hull, "LiF", "Li");
        Assert.Equal(0.0, lif.ReductionLimitVolts!.Value, 12);
        Assert.Equal(6.0, lif.OxidationLimitVolts!.Value, 12);
        Assert.Null(lif.ReductionProducts); // stable down to Li metal itself: no reaction at that end
        Assert.Equal(["F"], lif.OxidationProducts!.Products.Select(p => p.Phase.Id)); // above 6 V: LiF gives Li⁺ and F2

        IonStabilityWindow fef2 = IonStabilityWindows.Of(hull, "FeF2", "Li");
        Assert.Equal(2.5, fef2.ReductionLimitVolts!.Value, 12);
        Assert.Null(fef2.OxidationLimitVolts);
        Assert.Equal(["Fe", "LiF"], fef2.ReductionProducts!.Products.Select(p => p.Phase.Id));
        Assert.Null(fef2.OxidationProducts);

        // LiFeF3 lies above Li F + FeF2 (−13 eV): no window at all.
        IonStabilityWindow above = IonStabilityWindows.Of(hull, "LiFeF3", "Li");
        Assert.False(above.Exists);
        Assert.Null(above.ReductionLimitVolts);
    }

    [Theory]
    [InlineData(61)]
    [InlineData(62)]
    public void Window_ends_agree_with_scipy_and_with_the_open_hull(int seed)
    {
        PhaseEntry[] entries = DecompositionEnergyReferenceTests.RandomQuaternary(seed, compounds: 120);
        SystemHull hull = SystemHull.OverElements(entries);
        string[] components = [.. hull.Components];
        EntryStability[] stable = hull.Entries.Where(e => e.IsHullVertex && !e.Composition.IsSingleElement).Take(12).ToArray();
        Assert.Contains(stable, e => !e.Composition.Contains("Li"));

        var programs = new List<LinearProgram>();
        foreach (EntryStability phase in stable)
        {
            foreach (ObjectiveSense sense in new[] { ObjectiveSense.Maximize, ObjectiveSense.Minimize })
            {
                programs.Add(WindowProgram(hull, components, phase, sense));
            }
        }

        IReadOnlyList<GeneralLpAnswer> lp = ScipyGeneralLpRunner.Solve(programs);
        for (int k = 0; k < stable.Length; k++)
        {
            IonStabilityWindow window = IonStabilityWindows.Of(hull, stable[k].Id, "Li");
            Assert.Equal("optimal", lp[2 * k].Status);
            Assert.Equal(lp[2 * k].Objective, window.HighestIonPotentialEvPerAtom!.Value, 1e-9);
            if (stable[k].Composition.Contains("Li"))
            {
                Assert.Equal("optimal", lp[(2 * k) + 1].Status);
                Assert.Equal(lp[(2 * k) + 1].Objective, window.LowestIonPotentialEvPerAtom!.Value, 1e-9);
            }
            else
            {
                Assert.Equal("unbounded", lp[(2 * k) + 1].Status);
                Assert.Null(window.LowestIonPotentialEvPerAtom);
            }

            // On the Li-open hull the phase is stable just inside each end and not just outside.
            const double step = 1e-3;
            Assert.True(OnOpenHull(hull, stable[k].Id, window.HighestIonPotentialEvPerAtom!.Value - step));
            if (window.HighestIonPotentialEvPerAtom!.Value + step <= 0)
            {
                Assert.False(OnOpenHull(hull, stable[k].Id, window.HighestIonPotentialEvPerAtom!.Value + step));
            }

            if (window.LowestIonPotentialEvPerAtom is { } lowest)
            {
                Assert.True(OnOpenHull(hull, stable[k].Id, lowest + step));
                Assert.False(OnOpenHull(hull, stable[k].Id, lowest - step));
            }
        }
    }

    private static bool OnOpenHull(SystemHull hull, string id, double muLi) =>
        OpenElementHull.Open(hull, [new ReservoirPotential("Li", muLi)]).Hull.GetEntry(id).IsHullVertex;

    /// <summary>max / min μ_Li over {μ: n_P·μ = E_P, n_j·μ ≤ E_j for every entry j} (formation energies per formula unit).</summary>
    private static LinearProgram WindowProgram(SystemHull hull, string[] components, EntryStability phase, ObjectiveSense sense)
    {
        var builder = new LinearProgramBuilder(sense);
        int[] columns = components.Select(c => builder.AddColumn(c == "Li" ? 1.0 : 0.0, double.NegativeInfinity, double.PositiveInfinity)).ToArray();
        foreach (EntryStability entry in hull.Entries)
        {
            (int, double)[] terms = components.Select((c, k) => (columns[k], entry.Composition.AmountOf(c).ToDouble())).Where(t => t.Item2 != 0).ToArray();
            double perUnit = entry.FormationEnergyEvPerAtom!.Value * entry.Composition.AtomsPerFormulaUnit.ToDouble();
            if (entry.Id == phase.Id)
            {
                builder.AddEquality(terms, perUnit);
            }
            else
            {
                builder.AddRow(terms, double.NegativeInfinity, perUnit);
            }
        }

        return builder.Build();
    }
}
