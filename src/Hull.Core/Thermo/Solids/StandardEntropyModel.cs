using System.Globalization;
using Hull.Core.Chemistry;

namespace Hull.Core.Thermo.Solids;

/// <summary>
/// A solid's standard entropy S°(298.15 K) per formula unit, held constant with its enthalpy: the Ellingham
/// approximation, in which G(T) = H°(298.15 K) − T S° and a reaction's ΔH and ΔS do not change with T.
/// </summary>
public sealed record StandardEntropyModel : SolidTemperatureModel
{
    /// <param name="entropyJPerMolK">S° per formula unit, J/(mol K); finite and not negative (solid elements included).</param>
    /// <param name="formula">The formula unit S° refers to; null or blank for the entry's own.</param>
    /// <exception cref="ThermoInputException">A negative or non-finite entropy, or a formula that does not parse.</exception>
    public StandardEntropyModel(double entropyJPerMolK, string? formula = null)
        : base(ParseFormula(formula, "Standard entropy"))
    {
        if (!double.IsFinite(entropyJPerMolK) || entropyJPerMolK < 0)
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"Standard entropy must be a finite number of J/(mol K), not negative; got {entropyJPerMolK}."));
        }

        EntropyJPerMolK = entropyJPerMolK;
    }

    /// <summary>S°(298.15 K) per formula unit, J/(mol K).</summary>
    public double EntropyJPerMolK { get; }
}
