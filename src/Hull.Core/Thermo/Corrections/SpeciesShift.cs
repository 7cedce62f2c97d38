using System.Globalization;
using Hull.Core.Chemistry;

namespace Hull.Core.Thermo.Corrections;

/// <summary>An energy shift per atom of element <see cref="Symbol"/> in the entries of a class (eV per X atom).</summary>
public sealed record SpeciesShift
{
    /// <exception cref="ThermoInputException">An unknown symbol, an unknown class or a non-finite shift.</exception>
    public SpeciesShift(string symbol, SpeciesClass kind, double shiftEvPerAtom)
    {
        if (!ElementTable.IsSymbol(symbol))
        {
            throw new ThermoInputException($"Species shift: '{symbol}' is not an element symbol.", element: symbol);
        }

        if (!Enum.IsDefined(kind))
        {
            throw new ThermoInputException($"Species shift of {symbol}: unknown class ({(int)kind}).", element: symbol);
        }

        if (!double.IsFinite(shiftEvPerAtom))
        {
            throw new ThermoInputException(
                string.Create(CultureInfo.InvariantCulture, $"Species shift of {symbol} ({SpeciesClassTokens.Of(kind)}): the shift is not finite ({shiftEvPerAtom} eV/atom)."),
                element: symbol);
        }

        Symbol = symbol;
        Kind = kind;
        ShiftEvPerAtom = shiftEvPerAtom;
    }

    public string Symbol { get; }

    public SpeciesClass Kind { get; }

    /// <summary>Added per atom of the element in a matching entry, eV.</summary>
    public double ShiftEvPerAtom { get; }

    /// <summary>Whether the shift applies to an entry of this composition.</summary>
    public bool AppliesTo(Composition composition) =>
        composition.Contains(Symbol) && !composition.IsSingleElement && Kind switch
        {
            SpeciesClass.InCompound => true,
            SpeciesClass.WithMetal => composition.Elements.Any(e => !string.Equals(e, Symbol, StringComparison.Ordinal) && MetalElements.IsMetal(e)),
            _ => false,
        };
}
