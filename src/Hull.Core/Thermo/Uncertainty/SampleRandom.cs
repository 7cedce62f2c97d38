namespace Hull.Core.Thermo.Uncertainty;

/// <summary>
/// The random stream of one sample: xoshiro256** (D. Blackman and S. Vigna, "Scrambled linear pseudorandom number
/// generators", ACM TOMS 47, 2021) seeded through SplitMix64 from the plan's seed and the sample's index, so that
/// each sample's draws depend on nothing else (not on threads, nor on the other samples); standard normal draws by
/// the Box–Muller transform.
/// </summary>
internal struct SampleRandom
{
    private ulong _s0, _s1, _s2, _s3;
    private double _spare;
    private bool _hasSpare;

    public SampleRandom(ulong seed, long sampleIndex)
    {
        ulong x = seed ^ (0x9E3779B97F4A7C15UL * (ulong)(sampleIndex + 1));
        _s0 = SplitMix(ref x);
        _s1 = SplitMix(ref x);
        _s2 = SplitMix(ref x);
        _s3 = SplitMix(ref x);
        _spare = 0;
        _hasSpare = false;
    }

    /// <summary>A standard normal draw.</summary>
    public double NextGaussian()
    {
        if (_hasSpare)
        {
            _hasSpare = false;
            return _spare;
        }

        // u1 in (0, 1] keeps the logarithm finite.
        double u1 = ((NextUInt64() >> 11) + 1) * (1.0 / (1UL << 53));
        double u2 = (NextUInt64() >> 11) * (1.0 / (1UL << 53));
        double radius = Math.Sqrt(-2.0 * Math.Log(u1));
        double angle = 2.0 * Math.PI * u2;
        _spare = radius * Math.Sin(angle);
        _hasSpare = true;
        return radius * Math.Cos(angle);
    }

    private ulong NextUInt64()
    {
        ulong result = ulong.RotateLeft(_s1 * 5, 7) * 9;
        ulong t = _s1 << 17;
        _s2 ^= _s0;
        _s3 ^= _s1;
        _s1 ^= _s2;
        _s0 ^= _s3;
        _s2 ^= t;
        _s3 = ulong.RotateLeft(_s3, 45);
        return result;
    }

    private static ulong SplitMix(ref ulong x)
    {
        ulong z = x += 0x9E3779B97F4A7C15UL;
        z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9UL;
        z = (z ^ (z >> 27)) * 0x94D049BB133111EBUL;
        return z ^ (z >> 31);
    }
}
