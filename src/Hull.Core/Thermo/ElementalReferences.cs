using System.Globalization;
using Hull.Core.Chemistry;

namespace Hull.Core.Thermo;

/// <summary>
/// Explicit elemental reference energies (eV/atom, same scale as the total energies they are subtracted from), by
/// element symbol. They override the default reference (the lowest-energy pure-element entry). Immutable.
/// </summary>
public sealed class ElementalReferences
{
    private readonly SortedDictionary<string, double> _evPerAtom;

    /// <exception cref="ThermoInputException">Unknown symbol, repeated symbol or non-finite energy.</exception>
    public ElementalReferences(IEnumerable<KeyValuePair<string, double>> evPerAtomBySymbol)
    {
        ArgumentNullException.ThrowIfNull(evPerAtomBySymbol);
        _evPerAtom = new SortedDictionary<string, double>(StringComparer.Ordinal);
        foreach ((string symbol, double evPerAtom) in evPerAtomBySymbol)
        {
            if (!ElementTable.IsSymbol(symbol))
            {
                throw new ThermoInputException(
                    $"Elemental reference '{symbol}' is not an element symbol.", element: symbol);
            }

            if (!double.IsFinite(evPerAtom))
            {
                throw new ThermoInputException(
                    string.Create(CultureInfo.InvariantCulture, $"Elemental reference for {symbol} is not finite ({evPerAtom} eV/atom)."),
                    element: symbol);
            }

            if (!_evPerAtom.TryAdd(symbol, evPerAtom))
            {
                throw new ThermoInputException($"Elemental reference for {symbol} is given twice.", element: symbol);
            }
        }
    }

    /// <summary>No explicit references: every reference comes from the entries.</summary>
    public static ElementalReferences None { get; } = new([]);

    /// <summary>The symbols that have an explicit reference, ordinally sorted.</summary>
    public IReadOnlyList<string> Symbols => _evPerAtom.Keys.ToArray();

    /// <summary>The reference energy of an element (eV/atom), when one was given.</summary>
    public bool TryGetEvPerAtom(string symbol, out double evPerAtom) => _evPerAtom.TryGetValue(symbol, out evPerAtom);
}
