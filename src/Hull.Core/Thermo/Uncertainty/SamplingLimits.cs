namespace Hull.Core.Thermo.Uncertainty;

/// <summary>The documented work limits of stability sampling.</summary>
public static class SamplingLimits
{
    /// <summary>At most this many samples (hull rebuilds) per request: 1e5 gives a standard error of 0.0016 at
    /// p = 0.5, finer than any energy error bar justifies.</summary>
    public const int MaxSamples = 100_000;

    /// <summary>At most this many samples × entries: each sample's energy above hull is kept per entry for the
    /// 5–95 % range (8 bytes each, so 2e7 is 160 MB), and the hull work grows with the same product.</summary>
    public const long MaxSampledValues = 20_000_000;
}
