using Hull.Core.Chemistry;
using Hull.Core.Thermo;

namespace Hull.Core.Tests.Thermo;

/// <summary>Small helpers to write entries tersely in tests.</summary>
internal static class ThermoTestData
{
    public static PhaseEntry Entry(string id, string formula, double energyEv, EnergyBasis basis) =>
        new(id, Composition.Parse(formula), energyEv, basis);

    public static PhaseEntry Formation(string id, string formula, double evPerAtom) =>
        Entry(id, formula, evPerAtom, EnergyBasis.FormationPerAtom);

    /// <summary>Checks that one formula unit of the decomposed composition equals the products, element by element, exactly.</summary>
    public static void AssertBalancedExactly(Decomposition decomposition)
    {
        Assert.True(decomposition.IsExact, decomposition.ToReactionString());
        foreach (string element in decomposition.Composition.Elements.Concat(decomposition.Products.SelectMany(p => p.Phase.Composition.Elements)).Distinct())
        {
            Rational made = Rational.Zero;
            foreach (DecompositionProduct product in decomposition.Products)
            {
                made += product.ExactFormulaUnits!.Value * product.Phase.Composition.AmountOf(element);
            }

            Assert.Equal(decomposition.Composition.AmountOf(element), made);
        }

        double fractionSum = decomposition.Products.Sum(p => p.AtomFraction);
        Assert.Equal(1.0, fractionSum, 1e-12);
    }

    /// <summary>Checks the balance in floating point (for decompositions that are not exact).</summary>
    public static void AssertBalanced(Decomposition decomposition, double tolerance = 1e-9)
    {
        foreach (string element in decomposition.Composition.Elements.Concat(decomposition.Products.SelectMany(p => p.Phase.Composition.Elements)).Distinct())
        {
            double made = decomposition.Products.Sum(p => p.FormulaUnits * p.Phase.Composition.AmountOf(element).ToDouble());
            Assert.Equal(decomposition.Composition.AmountOf(element).ToDouble(), made, tolerance);
        }

        Assert.Equal(1.0, decomposition.Products.Sum(p => p.AtomFraction), tolerance);
    }

    public static IReadOnlyList<T> Shuffled<T>(IReadOnlyList<T> items, int seed)
    {
        var copy = items.ToArray();
        new Random(seed).Shuffle(copy);
        return copy;
    }
}
