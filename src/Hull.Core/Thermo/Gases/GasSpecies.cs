using System.Globalization;

namespace Hull.Core.Thermo.Gases;

/// <summary>
/// An ideal gas of one element's molecules (O2, N2, H2, F2, Cl2): its Shomate table for H°(T) − H°(298.15 K) and
/// S°(T), and the tabulated H°(298.15 K) − H°(0 K) that the computed-molecule-energy mode needs.
/// </summary>
public sealed class GasSpecies
{
    public GasSpecies(string formula, string element, int atomsPerMolecule, ShomateTable table,
        double enthalpyStandardAboveZeroKjPerMol, string enthalpyStandardAboveZeroSource)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(formula);
        ArgumentException.ThrowIfNullOrWhiteSpace(element);
        ArgumentNullException.ThrowIfNull(table);
        ArgumentException.ThrowIfNullOrWhiteSpace(enthalpyStandardAboveZeroSource);
        ArgumentOutOfRangeException.ThrowIfLessThan(atomsPerMolecule, 1);
        if (!double.IsFinite(enthalpyStandardAboveZeroKjPerMol) || enthalpyStandardAboveZeroKjPerMol <= 0)
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"H°(298.15 K) − H°(0) of {formula} must be positive and finite; got {enthalpyStandardAboveZeroKjPerMol} kJ/mol."));
        }

        Formula = formula;
        Element = element;
        AtomsPerMolecule = atomsPerMolecule;
        Table = table;
        EnthalpyStandardAboveZeroKjPerMol = enthalpyStandardAboveZeroKjPerMol;
        EnthalpyStandardAboveZeroSource = enthalpyStandardAboveZeroSource;
    }

    /// <summary>The molecule's formula, e.g. "O2".</summary>
    public string Formula { get; }

    /// <summary>The one element the molecule is made of, e.g. "O".</summary>
    public string Element { get; }

    /// <summary>Atoms per molecule (2 for every gas in <see cref="GasTables"/>).</summary>
    public int AtomsPerMolecule { get; }

    /// <summary>The Shomate fit and its source.</summary>
    public ShomateTable Table { get; }

    /// <summary>H°(298.15 K) − H°(0 K) in kJ/mol: the thermal enthalpy from 0 K to the standard temperature.</summary>
    public double EnthalpyStandardAboveZeroKjPerMol { get; }

    /// <summary>Where <see cref="EnthalpyStandardAboveZeroKjPerMol"/> comes from.</summary>
    public string EnthalpyStandardAboveZeroSource { get; }

    /// <summary>H°(T) − H°(298.15 K) in kJ/mol.</summary>
    /// <exception cref="ThermoInputException">The temperature lies outside the table.</exception>
    public double EnthalpyAboveStandardKjPerMol(double temperatureK) =>
        Table.RangeAt(temperatureK, Formula).EnthalpyAboveStandardKjPerMol(temperatureK);

    /// <summary>S°(T) at p° = 1 bar, J/(mol K).</summary>
    /// <exception cref="ThermoInputException">The temperature lies outside the table.</exception>
    public double EntropyJPerMolK(double temperatureK) =>
        Table.RangeAt(temperatureK, Formula).EntropyJPerMolK(temperatureK);

    public override string ToString() => Formula;
}
