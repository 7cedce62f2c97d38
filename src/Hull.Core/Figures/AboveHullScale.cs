namespace Hull.Core.Figures;

/// <summary>
/// The shade of an unstable entry by its energy above the hull: dark teal just above the hull, through olive, to
/// pale sand at the cut-off. Lightness (CIE L*) rises linearly with the energy, so that "lighter" reads as "further
/// from stable" in print, in greyscale and for every colour-vision type; hue and chroma only add separation.
/// </summary>
public static class AboveHullScale
{
    /// <summary>L* at the hull: dark enough to stand out on white.</summary>
    public const double LightnessAtHull = 30.0;

    /// <summary>L* at the cut-off: still visible against the white background (with the marker's outline).</summary>
    public const double LightnessAtCutoff = 88.0;

    private const double HueAtHullDegrees = 205.0;
    private const double HueAtCutoffDegrees = 85.0;
    private const double ChromaAtHull = 28.0;
    private const double ChromaMiddle = 38.0;
    private const double ChromaAtCutoff = 22.0;

    /// <summary>The colour ("#rrggbb") at <paramref name="fraction"/> of the cut-off (clamped to 0..1).</summary>
    public static string ColorAt(double fraction)
    {
        double t = double.IsFinite(fraction) ? Math.Clamp(fraction, 0.0, 1.0) : 1.0;
        double lightness = LightnessAtHull + t * (LightnessAtCutoff - LightnessAtHull);
        double hue = HueAtHullDegrees + t * (HueAtCutoffDegrees - HueAtHullDegrees);
        // A gentle arch in chroma keeps the middle colourful and both ends inside the sRGB gamut.
        double chroma = t < 0.5
            ? ChromaAtHull + 2 * t * (ChromaMiddle - ChromaAtHull)
            : ChromaMiddle + (2 * t - 1) * (ChromaAtCutoff - ChromaMiddle);
        return CieLab.FromLch(lightness, chroma, hue).ToHex();
    }
}
