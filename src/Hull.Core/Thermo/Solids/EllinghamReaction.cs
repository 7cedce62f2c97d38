using System.Globalization;
using Hull.Core.Chemistry;
using Hull.Core.Thermo.Gases;

namespace Hull.Core.Thermo.Solids;

/// <summary>
/// A reaction of solids that releases ν mol of one gas per mol of reaction, in the Ellingham approximation: ΔH and
/// ΔS taken at 298.15 K from standard-state data (the released gas's S°(298.15 K) included once, here) and held
/// constant in T, so ΔG(T, p) = ΔH − T [ΔS − ν R ln(p/p°)]. The balance of every element is checked exactly.
/// </summary>
public sealed class EllinghamReaction
{
    /// <exception cref="ThermoInputException">An empty side, or an element that does not balance.</exception>
    public EllinghamReaction(IReadOnlyList<ReactionTerm> reactants, IReadOnlyList<ReactionTerm> solidProducts, ReactionTerm releasedGas)
    {
        ArgumentNullException.ThrowIfNull(reactants);
        ArgumentNullException.ThrowIfNull(solidProducts);
        ArgumentNullException.ThrowIfNull(releasedGas);
        if (reactants.Count == 0)
        {
            throw new ThermoInputException("A reaction needs at least one reactant.");
        }

        var balance = new SortedDictionary<string, Rational>(StringComparer.Ordinal);
        double enthalpyKj = 0, entropyJ = 0;
        foreach ((ReactionTerm term, int sign) in reactants.Select(t => (t, -1))
                     .Concat(solidProducts.Select(t => (t, 1))).Append((releasedGas, 1)))
        {
            foreach ((string element, Rational amount) in term.Substance.Composition.Amounts)
            {
                balance[element] = balance.GetValueOrDefault(element) + (sign > 0 ? amount * term.Coefficient : -(amount * term.Coefficient));
            }

            double nu = term.Coefficient.ToDouble() * sign;
            enthalpyKj += nu * term.Substance.FormationEnthalpyKjPerMol;
            entropyJ += nu * term.Substance.EntropyJPerMolK;
        }

        string[] unbalanced = balance.Where(kv => !kv.Value.IsZero).Select(kv => $"{kv.Key} ({kv.Value})").ToArray();
        if (unbalanced.Length > 0)
        {
            throw new ThermoInputException(
                $"The reaction does not balance: products minus reactants leave {string.Join(", ", unbalanced)}.",
                element: balance.First(kv => !kv.Value.IsZero).Key);
        }

        Reactants = reactants.ToArray();
        SolidProducts = solidProducts.ToArray();
        ReleasedGas = releasedGas;
        EnthalpyChangeJPerMol = enthalpyKj * 1000.0;
        EntropyChangeJPerMolK = entropyJ;
    }

    public IReadOnlyList<ReactionTerm> Reactants { get; }

    public IReadOnlyList<ReactionTerm> SolidProducts { get; }

    public ReactionTerm ReleasedGas { get; }

    /// <summary>ΔH°(298.15 K) of the reaction, J per mol of reaction.</summary>
    public double EnthalpyChangeJPerMol { get; }

    /// <summary>ΔS°(298.15 K) of the reaction at p° = 1 bar, J/(mol K) per mol of reaction.</summary>
    public double EntropyChangeJPerMolK { get; }

    /// <summary>ν: mol of gas released per mol of reaction.</summary>
    public double GasReleasedMolPerMol => ReleasedGas.Coefficient.ToDouble();

    /// <summary>ΔG(T, p) = ΔH − T [ΔS − ν R ln(p/p°)], J per mol of reaction.</summary>
    /// <exception cref="ThermoInputException">A temperature that is not positive and finite, or a bad pressure.</exception>
    public double GibbsEnergyChangeJPerMol(double temperatureK, double gasPressureBar)
    {
        EllinghamDecomposition.RequireTemperature(temperatureK);
        return EnthalpyChangeJPerMol - temperatureK
            * EllinghamDecomposition.EffectiveEntropyChangeJPerMolK(EntropyChangeJPerMolK, GasReleasedMolPerMol, gasPressureBar);
    }

    /// <summary>The temperature where ΔG changes sign at this gas pressure (see <see cref="EllinghamDecomposition"/>).</summary>
    public bool TryFindDecompositionTemperatureK(double gasPressureBar, out double temperatureK) =>
        EllinghamDecomposition.TryFindTemperatureK(EnthalpyChangeJPerMol, EntropyChangeJPerMolK, GasReleasedMolPerMol, gasPressureBar, out temperatureK);

    public override string ToString() => string.Create(CultureInfo.InvariantCulture,
        $"{string.Join(" + ", Reactants.Select(Text))} -> {string.Join(" + ", SolidProducts.Append(ReleasedGas).Select(Text))}");

    private static string Text(ReactionTerm term) =>
        term.Coefficient == Rational.One ? term.Substance.Formula : $"{term.Coefficient} {term.Substance.Formula}";
}
