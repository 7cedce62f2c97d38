using System.Globalization;
using Hull.Core.Chemistry;

namespace Hull.Core.Thermo;

/// <summary>
/// The energy axis of a hull: which quantity is hulled, its display name and unit, and which atoms the per-atom
/// energies and the composition fractions count. Every result of a hull carries it, so that a table or a figure
/// can name what its energies are. Immutable.
/// </summary>
/// <remarks>
/// Every axis is measured from the elemental references (an element in its reference state sits at 0), which is why
/// an element without entries may stand in as a synthetic corner at 0 on any axis.
/// </remarks>
public sealed class HullAxis
{
    private HullAxis(
        HullAxisQuantity quantity,
        string displayName,
        AtomNormalisation normalisation,
        IReadOnlyList<OpenElement> openElements,
        double? temperatureK,
        int? sampleIndex)
    {
        Quantity = quantity;
        DisplayName = displayName;
        Normalisation = normalisation;
        OpenElements = openElements;
        TemperatureK = temperatureK;
        SampleIndex = sampleIndex;
    }

    /// <summary>Formation energy per atom: the closed hull.</summary>
    public static HullAxis FormationEnergy { get; } =
        new(HullAxisQuantity.FormationEnergy, "formation energy", AtomNormalisation.PerAtom, [], null, null);

    /// <summary>What is hulled.</summary>
    public HullAxisQuantity Quantity { get; }

    /// <summary>A name for tables and figure axes, e.g. "grand potential (O open at -2.5 eV)".</summary>
    public string DisplayName { get; }

    /// <summary>Which atoms the per-atom energies and fractions count.</summary>
    public AtomNormalisation Normalisation { get; }

    /// <summary>The unit of the axis's energies: eV per atom, or eV per closed-element atom.</summary>
    public string Unit => Normalisation == AtomNormalisation.PerAtom ? "eV/atom" : "eV per closed-element atom";

    /// <summary>The open elements and their chemical potentials, by symbol; empty for a closed hull.</summary>
    public IReadOnlyList<OpenElement> OpenElements { get; }

    /// <summary>The temperature of a free-energy axis (K); null otherwise.</summary>
    public double? TemperatureK { get; }

    /// <summary>Which sample of an ensemble a sampled-energy axis holds; null otherwise.</summary>
    public int? SampleIndex { get; }

    /// <summary>True when <paramref name="symbol"/> is one of the open elements.</summary>
    public bool IsOpen(string symbol) => OpenElements.Any(o => string.Equals(o.Symbol, symbol, StringComparison.Ordinal));

    /// <summary>
    /// Grand potential per closed-element atom, with the given elements open at the given chemical potentials
    /// (eV/atom relative to their elemental references).
    /// </summary>
    /// <exception cref="ThermoInputException">No open element, an unknown or repeated symbol, or a non-finite potential.</exception>
    public static HullAxis GrandPotential(IEnumerable<KeyValuePair<string, double>> chemicalPotentialsEvPerAtom)
    {
        ArgumentNullException.ThrowIfNull(chemicalPotentialsEvPerAtom);
        var open = new SortedDictionary<string, double>(StringComparer.Ordinal);
        foreach ((string symbol, double mu) in chemicalPotentialsEvPerAtom)
        {
            if (!ElementTable.IsSymbol(symbol))
            {
                throw new ThermoInputException($"Open element '{symbol}' is not an element symbol.", element: symbol);
            }

            if (!double.IsFinite(mu))
            {
                throw new ThermoInputException(
                    string.Create(CultureInfo.InvariantCulture, $"The chemical potential of open element {symbol} is not finite ({mu} eV/atom)."),
                    element: symbol);
            }

            if (!open.TryAdd(symbol, mu))
            {
                throw new ThermoInputException($"Open element {symbol} is given twice.", element: symbol);
            }
        }

        if (open.Count == 0)
        {
            throw new ThermoInputException("A grand-potential axis needs at least one open element.");
        }

        OpenElement[] elements = open.Select(p => new OpenElement(p.Key, p.Value)).ToArray();
        string name = "grand potential ("
            + string.Join(", ", elements.Select(o => string.Create(CultureInfo.InvariantCulture, $"{o.Symbol} open at {o.ChemicalPotentialEvPerAtom:G6} eV")))
            + ")";
        return new HullAxis(HullAxisQuantity.GrandPotential, name, AtomNormalisation.PerClosedElementAtom, elements, null, null);
    }

    /// <summary>
    /// Grand free energy per closed-element atom at <paramref name="temperatureK"/>: the solids' free energies at T
    /// with the given elements open to a gas at their Δμ(T, p) (eV/atom relative to their references).
    /// </summary>
    /// <exception cref="ThermoInputException">A bad temperature, or what <see cref="GrandPotential"/> refuses.</exception>
    public static HullAxis GrandPotentialAt(double temperatureK, IEnumerable<KeyValuePair<string, double>> chemicalPotentialsEvPerAtom)
    {
        HullAxis open = GrandPotential(chemicalPotentialsEvPerAtom);
        FreeEnergy(temperatureK);
        string name = string.Create(CultureInfo.InvariantCulture, $"grand free energy at {temperatureK:0.##} K (")
            + string.Join(", ", open.OpenElements.Select(o => string.Create(CultureInfo.InvariantCulture, $"{o.Symbol} open at {o.ChemicalPotentialEvPerAtom:G6} eV")))
            + ")";
        return new HullAxis(HullAxisQuantity.GrandPotential, name, AtomNormalisation.PerClosedElementAtom, open.OpenElements, temperatureK, null);
    }

    /// <summary>Formation free energy per atom at <paramref name="temperatureK"/>.</summary>
    /// <exception cref="ThermoInputException">When the temperature is not a finite, non-negative number of kelvin.</exception>
    public static HullAxis FreeEnergy(double temperatureK)
    {
        if (!double.IsFinite(temperatureK) || temperatureK < 0)
        {
            throw new ThermoInputException(
                string.Create(CultureInfo.InvariantCulture, $"A free-energy axis needs a finite, non-negative temperature; got {temperatureK} K."));
        }

        return new HullAxis(
            HullAxisQuantity.FreeEnergy,
            string.Create(CultureInfo.InvariantCulture, $"formation free energy at {temperatureK:G6} K"),
            AtomNormalisation.PerAtom,
            [],
            temperatureK,
            null);
    }

    /// <summary>Sample <paramref name="sampleIndex"/> of formation energies drawn from their uncertainty.</summary>
    /// <exception cref="ThermoInputException">When the index is negative.</exception>
    public static HullAxis SampledEnergy(int sampleIndex)
    {
        if (sampleIndex < 0)
        {
            throw new ThermoInputException(
                string.Create(CultureInfo.InvariantCulture, $"A sample index counts from 0; got {sampleIndex}."));
        }

        return new HullAxis(
            HullAxisQuantity.SampledEnergy,
            string.Create(CultureInfo.InvariantCulture, $"sampled formation energy #{sampleIndex}"),
            AtomNormalisation.PerAtom,
            [],
            null,
            sampleIndex);
    }

    /// <summary>Formation energy per atom of entries corrected by the set <paramref name="setLabel"/> names ("name v2").</summary>
    /// <exception cref="ThermoInputException">When the label is blank.</exception>
    public static HullAxis CorrectedFormationEnergy(string setLabel)
    {
        if (string.IsNullOrWhiteSpace(setLabel))
        {
            throw new ThermoInputException("A corrected-energy axis needs the correction set's name.");
        }

        return new HullAxis(HullAxisQuantity.CorrectedFormationEnergy, $"formation energy (corrections: {setLabel})", AtomNormalisation.PerAtom, [], null, null);
    }

    public override string ToString() => $"{DisplayName} [{Unit}]";
}
