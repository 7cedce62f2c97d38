namespace Hull.Core.Thermo.Reactions;

/// <summary>
/// The reaction energy of two phases in contact over the whole mixing ratio: the piecewise-linear profile through
/// its breakpoints (the ends are the reactants themselves, at their own energies), and its most negative point.
/// The headline is per atom of mixture, minimised over the atom fraction; the per-formula-unit minimum is reported
/// beside it, as it may fall at another ratio.
/// </summary>
public sealed record ReactionProfile(
    EntryStability First,
    EntryStability Second,
    HullAxis Axis,
    string ChemicalSystem,
    IReadOnlyList<ReactionPoint> Points,
    int MostNegativeIndex,
    int MostNegativePerFormulaUnitIndex)
{
    /// <summary>The most negative reaction energy per atom of mixture, with its ratio and products.</summary>
    public ReactionPoint MostNegative => Points[MostNegativeIndex];

    /// <summary>The most negative reaction energy per formula unit of mixture.</summary>
    public ReactionPoint MostNegativePerFormulaUnit => Points[MostNegativePerFormulaUnitIndex];

    /// <summary>True when the two phases react at some ratio (a negative reaction energy beyond the hull's tolerance).</summary>
    public bool React => MostNegative.ReactionEnergyEvPerAtom < -Geometry.HullTolerances.EnergyEvPerAtom;

    /// <summary>ΔE per atom at any atom fraction x of the first reactant in [0, 1]: linear between breakpoints.</summary>
    /// <exception cref="ArgumentOutOfRangeException">When x is outside [0, 1].</exception>
    public double ReactionEnergyEvPerAtomAt(double atomFractionOfFirst)
    {
        if (!(atomFractionOfFirst >= 0 && atomFractionOfFirst <= 1))
        {
            throw new ArgumentOutOfRangeException(nameof(atomFractionOfFirst), atomFractionOfFirst, "The atom fraction of the first reactant lies in [0, 1].");
        }

        for (int k = 1; k < Points.Count; k++)
        {
            double x1 = Points[k].AtomFractionOfFirst.ToDouble();
            if (atomFractionOfFirst <= x1 || k == Points.Count - 1)
            {
                double x0 = Points[k - 1].AtomFractionOfFirst.ToDouble();
                double w = (atomFractionOfFirst - x0) / (x1 - x0);
                return ((1 - w) * Points[k - 1].ReactionEnergyEvPerAtom) + (w * Points[k].ReactionEnergyEvPerAtom);
            }
        }

        return Points[0].ReactionEnergyEvPerAtom;
    }
}
