namespace Hull.Core.Optimization;

/// <summary>
/// Named tolerances of <see cref="DenseSimplex"/>, with the reason for each size. They are absolute: the programs
/// of this project (formation energies of order 0.01–10 eV/atom, atom fractions in [0, 1], amounts of a few dozen
/// atoms) have coefficients within a few orders of magnitude of 1, where double rounding is near 1e-15 relative.
/// </summary>
public static class SimplexTolerances
{
    /// <summary>
    /// A basic variable may lie this far outside its bounds and still count as feasible. Values are recomputed from
    /// a fresh factorisation before a result is reported, so rounding leaves them within about 1e-14 of exact on
    /// well-conditioned bases; 1e-10 is far above that and ten times below the 1e-9 to which results are checked.
    /// </summary>
    public const double PrimalFeasibility = 1e-10;

    /// <summary>
    /// A reduced cost of this size with the wrong sign still counts as optimal. Below
    /// <c>Geometry.HullTolerances.EnergyEvPerAtom</c> (1e-10 eV/atom) for the same reason: a column skipped at
    /// this size changes the optimum by at most 1e-10 times its value.
    /// </summary>
    public const double DualFeasibility = 1e-10;

    /// <summary>
    /// Entries of the entering column (in the basis's coordinates) at or below this are zero in the ratio test: a
    /// pivot on a smaller entry would multiply rounding by more than 1e9 and could make the basis singular.
    /// </summary>
    public const double PivotEntry = 1e-9;

    /// <summary>
    /// The smallest pivot, relative to the largest entry of its column, that a fresh LU factorisation accepts
    /// before it calls the basis singular. Fractions and stoichiometric coefficients give bases whose true pivots
    /// are far larger; rounding on a singular basis leaves about 1e-16 relative.
    /// </summary>
    public const double SingularPivot = 1e-12;

    /// <summary>
    /// Updates of the basis inverse between fresh factorisations. Each update adds rounding of order 1e-16 times
    /// the growth of its pivot; 50 keeps the drift far below <see cref="PrimalFeasibility"/> while the O(m³)
    /// refactorisation stays a small part of the O(m·n) work per iteration.
    /// </summary>
    public const int RefactorInterval = 50;

    /// <summary>
    /// Consecutive degenerate iterations (step length zero: the vertex is shared by several bases) after which
    /// entering and leaving variables are chosen by Bland's smallest-index rule, which cannot cycle, until a step
    /// makes progress again. Short stretches are common in thermodynamic data and resolve quickly under the
    /// largest-reduced-cost rule, which is why it is kept for them.
    /// </summary>
    public const int DegenerateStepsBeforeBland = 20;

    /// <summary>The iteration budget when none is given: generous next to the few times (m + n) iterations a solve takes in practice.</summary>
    public static int DefaultIterationLimit(int rowCount, int columnCount) => 1000 + 50 * (rowCount + columnCount);
}
