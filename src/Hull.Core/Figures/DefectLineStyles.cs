namespace Hull.Core.Figures;

/// <summary>
/// Line colours and dash patterns of a formation-energy figure: hues spread round the CIE LCh circle at two
/// lightness levels, and a dash pattern per defect too, so that lines stay apart without colour.
/// </summary>
internal static class DefectLineStyles
{
    // Hue (degrees), lightness: neighbours in the list differ in hue by ≥ 100° and alternate in lightness.
    private static readonly (double Hue, double Lightness)[] Tones =
        [(265, 38), (45, 58), (150, 45), (330, 52), (95, 62), (215, 55), (10, 42), (185, 40)];

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
