namespace Hull.Core.Windows;

/// <summary>
/// One linear constraint <c>Σ Normal[i]·x[i] ≤ Bound</c> (or <c>=</c> when used as an equality), with a caller's
/// label that vertices report back when the constraint is tight there. Immutable.
/// </summary>
public sealed class HalfSpace
{
    /// <exception cref="ArgumentException">Empty or non-finite coefficients, or a non-finite bound.</exception>
    public HalfSpace(IReadOnlyList<double> normal, double bound, int label)
    {
        ArgumentNullException.ThrowIfNull(normal);
        // Copied first (an array without going through the list interface), then checked on the copy.
        double[] copy = normal is double[] array ? array.AsSpan().ToArray() : normal.ToArray();
        if (copy.Length == 0) throw new ArgumentException("A half-space needs at least one coefficient.", nameof(normal));
        for (int i = 0; i < copy.Length; i++)
        {
            if (!double.IsFinite(copy[i]))
            {
                throw new ArgumentException($"Coefficient {i} of half-space {label} is not finite ({copy[i]}).", nameof(normal));
            }
        }

        if (!double.IsFinite(bound)) throw new ArgumentException($"The bound of half-space {label} is not finite ({bound}).", nameof(bound));
        _normal = copy;
        Bound = bound;
        Label = label;
    }

    private readonly double[] _normal;

    /// <summary>The coefficients as a span, for the enumeration's inner loops.</summary>
    internal ReadOnlySpan<double> Coefficients => _normal;

    /// <summary>The coefficients, one per coordinate.</summary>
    public IReadOnlyList<double> Normal => _normal;

    /// <summary>The right-hand side.</summary>
    public double Bound { get; }

    /// <summary>The caller's label (an index into the caller's own list of phases, say).</summary>
    public int Label { get; }
}
