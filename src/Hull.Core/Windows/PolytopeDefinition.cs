namespace Hull.Core.Windows;

/// <summary>
/// A bounded polytope <c>{x ∈ R^n : E x = f, A x ≤ b, lower ≤ x ≤ upper}</c>. The bounds must be finite; where the
/// caller knows bounds that the other constraints imply, giving them costs nothing, and artificial bounds show up
/// as tight bounds on the vertices they create. Immutable; checked on construction.
/// </summary>
public sealed class PolytopeDefinition
{
    /// <param name="lowerBounds">Finite lower bound per coordinate.</param>
    /// <param name="upperBounds">Finite upper bound per coordinate, not below the lower one.</param>
    /// <param name="equalities">Hyperplanes the polytope lies in (their labels are not reported).</param>
    /// <param name="inequalities">Half-spaces; labels are reported on the vertices where they are tight.</param>
    /// <param name="eliminationOrder">Coordinates to express through the others first when equalities are
    /// eliminated (the rest of the coordinates stay free, so the projection on them is the one reported).</param>
    /// <exception cref="ArgumentException">Mismatched lengths, non-finite or crossed bounds.</exception>
    public PolytopeDefinition(
        IReadOnlyList<double> lowerBounds,
        IReadOnlyList<double> upperBounds,
        IReadOnlyList<HalfSpace> equalities,
        IReadOnlyList<HalfSpace> inequalities,
        IReadOnlyList<int>? eliminationOrder = null)
    {
        ArgumentNullException.ThrowIfNull(lowerBounds);
        ArgumentNullException.ThrowIfNull(upperBounds);
        ArgumentNullException.ThrowIfNull(equalities);
        ArgumentNullException.ThrowIfNull(inequalities);
        int n = lowerBounds.Count;
        if (n == 0) throw new ArgumentException("A polytope needs at least one coordinate.", nameof(lowerBounds));
        if (upperBounds.Count != n) throw new ArgumentException($"{n} lower bounds but {upperBounds.Count} upper bounds.", nameof(upperBounds));
        for (int i = 0; i < n; i++)
        {
            if (!double.IsFinite(lowerBounds[i]) || !double.IsFinite(upperBounds[i]) || lowerBounds[i] > upperBounds[i])
            {
                throw new ArgumentException(
                    $"Coordinate {i} has bounds [{lowerBounds[i]}, {upperBounds[i]}]; bounds must be finite and ordered.", nameof(lowerBounds));
            }
        }

        foreach (HalfSpace h in equalities.Concat(inequalities))
        {
            if (h.Normal.Count != n)
            {
                throw new ArgumentException($"Constraint {h.Label} has {h.Normal.Count} coefficients for {n} coordinates.", nameof(inequalities));
            }
        }

        int[] order = eliminationOrder?.ToArray() ?? [];
        if (order.Any(i => i < 0 || i >= n)) throw new ArgumentException("An elimination coordinate is out of range.", nameof(eliminationOrder));
        Dimension = n;
        LowerBounds = lowerBounds.ToArray();
        UpperBounds = upperBounds.ToArray();
        Equalities = equalities.ToArray();
        Inequalities = inequalities.ToArray();
        EliminationOrder = order;
    }

    /// <summary>Number of coordinates n.</summary>
    public int Dimension { get; }

    public IReadOnlyList<double> LowerBounds { get; }

    public IReadOnlyList<double> UpperBounds { get; }

    public IReadOnlyList<HalfSpace> Equalities { get; }

    public IReadOnlyList<HalfSpace> Inequalities { get; }

    public IReadOnlyList<int> EliminationOrder { get; }
}
