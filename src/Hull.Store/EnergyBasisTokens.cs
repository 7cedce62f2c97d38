namespace Hull.Store;

/// <summary>
/// The text tokens an <see cref="EnergyBasis"/> is stored as. Text rather than the enum's integer so that the
/// database stays readable and a reordering of the enum can never change what stored rows mean.
/// </summary>
public static class EnergyBasisTokens
{
    public const string TotalPerFormulaUnit = "total_per_formula_unit";
    public const string TotalPerAtom = "total_per_atom";
    public const string FormationPerFormulaUnit = "formation_per_formula_unit";
    public const string FormationPerAtom = "formation_per_atom";

    /// <summary>The token for a basis; throws for a value outside the enum.</summary>
    public static string ToToken(EnergyBasis basis) => basis switch
    {
        EnergyBasis.TotalPerFormulaUnit => TotalPerFormulaUnit,
        EnergyBasis.TotalPerAtom => TotalPerAtom,
        EnergyBasis.FormationPerFormulaUnit => FormationPerFormulaUnit,
        EnergyBasis.FormationPerAtom => FormationPerAtom,
        _ => throw new ArgumentOutOfRangeException(nameof(basis), basis, "not a defined energy basis"),
    };

    /// <summary>Parses a token; returns false for anything else (exact, case-sensitive match).</summary>
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

    internal static bool IsDefined(EnergyBasis basis) =>
        basis is EnergyBasis.TotalPerFormulaUnit or EnergyBasis.TotalPerAtom
            or EnergyBasis.FormationPerFormulaUnit or EnergyBasis.FormationPerAtom;
}
