using Hull.Core.Defects;
using Hull.Core.Tests.References;

namespace Hull.Core.Tests.Defects;

public sealed class ChemicalPotentialPathTests
{
    [Fact]
    public void A_sweep_along_the_path_matches_scipy_at_every_point()
    {
        var study = WorkedDefectStudy.Study();
        var oxygenRich = new ChemicalPotentialPoint("O-rich", new Dictionary<string, double> { ["O"] = 0.0, ["Mg"] = -6.0, ["Li"] = -3.0 });
        var oxygenLean = new ChemicalPotentialPoint("O-lean", new Dictionary<string, double> { ["O"] = -6.0, ["Mg"] = 0.0, ["Li"] = 0.0 });
        var path = ChemicalPotentialPath.Between(oxygenRich, oxygenLean, 5);
        Assert.Equal([0.0, 0.25, 0.5, 0.75, 1.0], path.Select(p => p.Fraction));
        Assert.Equal(-3.0, path[2].Point.DeltaMuEv["O"], 15);
        Assert.Equal(oxygenLean.DeltaMuEv["Li"], path[^1].Point.DeltaMuEv["Li"]);

        var model = new CarrierModel(ParabolicBands.FromEffectiveStates(1e19, 5e19));
        var reference = new CarriersReference();
        var tasks = new List<int>();
        var solutions = new List<FermiLevelSolution>();
        foreach (var (_, point) in path)
        {
            var ensemble = DefectEnsemble.FromCalculator(new FormationEnergyCalculator(study, WorkedDefectStudy.References, point));
            solutions.Add(ChargeNeutrality.Solve(ensemble, model, 1300));
            var byHand = WorkedDefectStudy.HandEnsemble(point.DeltaMuEv);
            tasks.Add(reference.Neutrality(byHand, 1e19, 5e19, 1300, CarrierStatistics.FermiDirac));
        }

        var results = reference.Run();
        for (int k = 0; k < path.Count; k++)
        {
            // The study's intercepts carry the published 4-digit Madelung constant (~2e-6 eV off the hand values).
            Assert.Equal(results[tasks[k]]!["fermi"]!.GetValue<double>(), solutions[k].FermiLevelEv, 1e-5);
        }

        // Oxygen-lean growth favours the vacancy donor: the level rises along the path.
        Assert.True(solutions[^1].FermiLevelEv > solutions[0].FermiLevelEv);
    }

    [Fact]
    public void Mismatched_ends_and_too_few_points_are_refused()
    {
        var a = new ChemicalPotentialPoint("a", new Dictionary<string, double> { ["O"] = 0 });
        var b = new ChemicalPotentialPoint("b", new Dictionary<string, double> { ["Mg"] = 0 });
        Assert.Equal("to", Assert.Throws<DefectInputException>(() => ChemicalPotentialPath.Between(a, b, 3)).Field);
        Assert.Equal("points", Assert.Throws<DefectInputException>(() => ChemicalPotentialPath.Between(a, a, 1)).Field);
    }
}
