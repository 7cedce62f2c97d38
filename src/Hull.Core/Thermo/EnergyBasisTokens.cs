namespace Hull.Core.Thermo;

/// <summary>
/// The text names of the energy bases: what entry files write, what the store keeps in its rows and what the wire
/// enum's value names say in lower case without their prefix. They are persisted, so they never change.
/// </summary>
public static class EnergyBasisTokens
{
    public const string TotalPerFormulaUnit = "total_per_formula_unit";
    public const string TotalPerAtom = "total_per_atom";
    public const string FormationPerFormulaUnit = "formation_per_formula_unit";
    public const string FormationPerAtom = "formation_per_atom";

    /// <summary>Every basis, in declaration order.</summary>
    public static IReadOnlyList<EnergyBasis> All { get; } =
        [EnergyBasis.TotalPerFormulaUnit, EnergyBasis.TotalPerAtom, EnergyBasis.FormationPerFormulaUnit, EnergyBasis.FormationPerAtom];

    /// <summary>The token of a basis.</summary>
    /// <exception cref="ArgumentOutOfRangeException">For a value outside the enum.</exception>
    public static string ToToken(EnergyBasis basis) => basis switch
    {
        EnergyBasis.TotalPerFormulaUnit => TotalPerFormulaUnit,
        EnergyBasis.TotalPerAtom => TotalPerAtom,
        EnergyBasis.FormationPerFormulaUnit => FormationPerFormulaUnit,
        EnergyBasis.FormationPerAtom => FormationPerAtom,
        _ => throw new ArgumentOutOfRangeException(nameof(basis), basis, "not a defined energy basis"),
    };

    /// <summary>Reads a token (exact, case-sensitive); false for anything else.</summary>
    public static bool TryParse(string? token, out EnergyBasis basis)
    {
        switch (token)
        {
            case TotalPerFormulaUnit: basis = EnergyBasis.TotalPerFormulaUnit; return true;
            case TotalPerAtom: basis = EnergyBasis.TotalPerAtom; return true;
            case FormationPerFormulaUnit: basis = EnergyBasis.FormationPerFormulaUnit; return true;
            case FormationPerAtom: basis = EnergyBasis.FormationPerAtom; return true;
            default: basis = default; return false;
        }
    }
}
