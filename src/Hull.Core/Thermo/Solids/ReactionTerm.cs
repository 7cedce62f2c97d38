using System.Globalization;
using Hull.Core.Chemistry;

namespace Hull.Core.Thermo.Solids;

/// <summary>One substance in a reaction and its positive amount (mol per mol of reaction).</summary>
public sealed record ReactionTerm
{
    /// <exception cref="ThermoInputException">A coefficient that is not positive.</exception>
    public ReactionTerm(Rational coefficient, StandardStateData substance)
    {
        ArgumentNullException.ThrowIfNull(substance);
        if (coefficient <= Rational.Zero)
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"The coefficient of {substance.Formula} in a reaction must be positive; got {coefficient}."));
        }

        Coefficient = coefficient;
        Substance = substance;
    }

    public Rational Coefficient { get; }

    public StandardStateData Substance { get; }
}
