namespace Hull.Core.Figures;

/// <summary>
/// Line colours and dash patterns of a formation-energy figure: CIE LCh colours at one chroma, hue and lightness
/// chosen together so that the first four (a study's usual native defects and a dopant) stay apart under simulated
/// protanopia, deuteranopia and tritanopia, and all lie inside the sRGB gamut at lightness ≤ 60, dark enough on
/// white. Each defect has its own dash pattern too, so lines stay apart without colour.
/// </summary>
internal static class DefectLineStyles
{
    // Hue (degrees), lightness: dark green, dark violet, rose, sky blue, then olive, wine, mid blue, ochre.
    private static readonly (double Hue, double Lightness)[] Tones =
        [(135, 30), (315, 30), (15, 54), (255, 60), (90, 48), (0, 36), (270, 48), (90, 60)];

    private static readonly string[] Dashes = ["", "7 3", "2 2.5", "9 3 2 3", "4 4", "1.5 3.5"];

    /// <summary>Chroma of every line colour: strong enough to read on white, inside the sRGB gamut at these lightnesses.</summary>
    private const double Chroma = 42;

    public static string Colour(int index)
    {
        (double hue, double lightness) = Tones[index % Tones.Length];
        return CieLab.FromLch(lightness, Chroma, hue).ToHex();
    }

    public static string Dash(int index) => Dashes[index % Dashes.Length];

    /// <summary>Colours in use, for the distinguishability tests.</summary>
    public static IReadOnlyList<string> All => [.. Enumerable.Range(0, Tones.Length).Select(Colour)];
}
