namespace Hull.Core.Figures;

/// <summary>
/// The shade of a phase by its probability of being a hull vertex: pale lilac-grey at 0 to deep violet at 1.
/// Lightness (CIE L*) falls linearly with the probability, so "darker" reads as "more likely stable" in greyscale
/// and for every colour-vision type; the hue stays fixed and the chroma grows, so no second meaning is suggested.
/// </summary>
public static class StabilityOddsScale
{
    /// <summary>L* at probability 0: light, yet visible on white with the marker's outline.</summary>
    public const double LightnessAtZero = 92.0;

    /// <summary>L* at probability 1.</summary>
    public const double LightnessAtOne = 26.0;

    private const double HueDegrees = 300.0;
    private const double ChromaAtZero = 6.0;
    private const double ChromaAtOne = 48.0;

    /// <summary>The colour ("#rrggbb") at probability <paramref name="p"/> (clamped to 0..1).</summary>
    public static string ColorAt(double p)
    {
        double t = double.IsFinite(p) ? Math.Clamp(p, 0.0, 1.0) : 0.0;
        return CieLab.FromLch(LightnessAtZero + t * (LightnessAtOne - LightnessAtZero), ChromaAtZero + t * (ChromaAtOne - ChromaAtZero), HueDegrees).ToHex();
    }
}
