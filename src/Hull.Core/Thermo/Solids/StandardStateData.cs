using System.Globalization;
using Hull.Core.Chemistry;

namespace Hull.Core.Thermo.Solids;

/// <summary>
/// Handbook standard-state data of one substance per formula unit at 298.15 K and 1 bar: the standard enthalpy of
/// formation ΔfH° (kJ/mol; 0 for an element in its standard state) and the standard entropy S° (J/(mol K), solid
/// elements included, never negative).
/// </summary>
public sealed record StandardStateData
{
    /// <exception cref="ThermoInputException">A formula that does not parse, a non-finite value or a negative entropy.</exception>
    public StandardStateData(string formula, double formationEnthalpyKjPerMol, double entropyJPerMolK)
    {
        ArgumentNullException.ThrowIfNull(formula);
        if (!Composition.TryParse(formula, out Composition? composition, out FormulaParseException? error))
        {
            throw new ThermoInputException($"Standard-state data: formula '{formula}' does not parse: {error.Message}");
        }

        if (!double.IsFinite(formationEnthalpyKjPerMol) || !double.IsFinite(entropyJPerMolK) || entropyJPerMolK < 0)
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"Standard-state data of {formula}: ΔfH° must be finite and S° finite and not negative; got {formationEnthalpyKjPerMol} kJ/mol and {entropyJPerMolK} J/(mol K)."));
        }

        Formula = formula;
        Composition = composition;
        FormationEnthalpyKjPerMol = formationEnthalpyKjPerMol;
        EntropyJPerMolK = entropyJPerMolK;
    }

    public string Formula { get; }

    public Composition Composition { get; }

    /// <summary>ΔfH°(298.15 K) per formula unit, kJ/mol.</summary>
    public double FormationEnthalpyKjPerMol { get; }

    /// <summary>S°(298.15 K) per formula unit, J/(mol K).</summary>
    public double EntropyJPerMolK { get; }
}
