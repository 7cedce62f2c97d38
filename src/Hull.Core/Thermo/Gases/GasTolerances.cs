namespace Hull.Core.Thermo.Gases;

/// <summary>Tolerances of the gas module's solves, with why each has its size.</summary>
public static class GasTolerances
{
    /// <summary>
    /// Width at which a temperature bracket counts as solved, K: far below any table's meaning (tables give 0.1 K
    /// steps at best) and well above double resolution at 6000 K (about 1e-12 K), so bisection always reaches it.
    /// </summary>
    public const double TemperatureBracketK = 1e-9;

    /// <summary>
    /// Bisection steps allowed: halving the widest table (100 K to 6000 K) down to <see cref="TemperatureBracketK"/>
    /// takes 43; 200 leaves room and still ends quickly if something is wrong.
    /// </summary>
    public const int MaximumBisectionSteps = 200;

    /// <summary>
    /// Sub-intervals per table scanned for sign changes before bisecting: the scan step (under 100 K) is far below
    /// the curvature scale of μ(T) at pressures up to 1e10 bar, where μ is monotonic in T anyway.
    /// </summary>
    public const int ScanIntervals = 64;
}
