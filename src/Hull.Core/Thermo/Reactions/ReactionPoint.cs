using Hull.Core.Chemistry;

namespace Hull.Core.Thermo.Reactions;

/// <summary>
/// One breakpoint of a two-phase reaction profile: a mixing ratio where the products change, the reaction energy
/// there and the products.
/// </summary>
/// <param name="AtomFractionOfFirst">x, the share of the mixture's atoms (as the hull's axis counts them) from the
/// first reactant, exact.</param>
/// <param name="FormulaUnitFractionOfFirst">The same mixture as a share of formula units (as written) of the first reactant.</param>
/// <param name="ReactionEnergyEvPerAtom">Hull energy of the mixture minus the reactants' own energies, per atom of mixture (axis unit).</param>
/// <param name="ReactionEnergyEvPerFormulaUnit">The same per formula unit of mixture (f units of the first and 1 − f of the second).</param>
/// <param name="Products">The hull phases the mixture turns into, with formula units per atom of mixture, sorted by id.</param>
public sealed record ReactionPoint(
    Rational AtomFractionOfFirst,
    double FormulaUnitFractionOfFirst,
    double ReactionEnergyEvPerAtom,
    double ReactionEnergyEvPerFormulaUnit,
    IReadOnlyList<ReactionProduct> Products);
