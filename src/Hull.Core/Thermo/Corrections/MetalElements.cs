using Hull.Core.Chemistry;

namespace Hull.Core.Thermo.Corrections;

/// <summary>
/// The metals of the species rule <see cref="SpeciesClass.WithMetal"/>: every element except the non-metals and
/// the metalloids B, Si, Ge, As, Sb and Te, which are counted with the non-metals here (common practice for
/// anion corrections, where those elements are not the cation of an oxide or a fluoride in the usual sense).
/// </summary>
public static class MetalElements
{
    private static readonly HashSet<string> NonMetals = new(StringComparer.Ordinal)
    {
        "H", "He", "B", "C", "N", "O", "F", "Ne", "Si", "P", "S", "Cl", "Ar", "Ge", "As", "Se", "Br", "Kr",
        "Sb", "Te", "I", "Xe", "At", "Rn", "Ts", "Og",
    };

    /// <summary>True for an element symbol that the rule counts as a metal.</summary>
    public static bool IsMetal(string symbol) => ElementTable.IsSymbol(symbol) && !NonMetals.Contains(symbol);
}
