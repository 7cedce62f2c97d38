using System.Globalization;
using System.Xml.Linq;
using Hull.Core.Figures;

namespace Hull.Core.Tests.Figures;

/// <summary>
/// The figures' colours, checked with colour science written here from the published formulas: sRGB to CIELAB
/// (IEC 61966-2-1, CIE 15), CIEDE2000 (Sharma, Wu and Dalal 2005) and colour-vision-deficiency simulation
/// (Machado, Oliveira and Fernandes 2009, severity 1.0, applied to linear RGB).
/// </summary>
public sealed class ColourScienceTests
{
    /// <summary>
    /// Least CIEDE2000 difference between any two categorical colours under every simulation: a difference near 1-2
    /// is just noticeable (from memory); 20 keeps marks apart at a glance, also small and anti-aliased.
    /// </summary>
    private const double MinimumCategoricalDifference = 20.0;

    // Machado, Oliveira and Fernandes (2009), severity 1.0 matrices for linear RGB (from memory).
    private static readonly double[,] Protanopia = { { 0.152286, 1.052583, -0.204868 }, { 0.114503, 0.786281, 0.099216 }, { -0.003882, -0.048116, 1.051998 } };
    private static readonly double[,] Deuteranopia = { { 0.367322, 0.860646, -0.227968 }, { 0.280085, 0.672501, 0.047413 }, { -0.011820, 0.042940, 0.968881 } };
    private static readonly double[,] Tritanopia = { { 1.255528, -0.076749, -0.178779 }, { -0.078411, 0.930809, 0.147602 }, { 0.004733, 0.691367, 0.303900 } };
    private static readonly double[,] Normal = { { 1, 0, 0 }, { 0, 1, 0 }, { 0, 0, 1 } };

    [Theory]
    // Sharma, Wu and Dalal (2005) test pairs 1, 8, 19 and 22 (from memory).
    [InlineData(50, 2.6772, -79.7751, 50, 0, -82.7485, 2.0425)]
    [InlineData(50, -1, 2, 50, 0, 0, 2.3669)]
    [InlineData(50, 2.5, 0, 50, 0, -2.5, 4.3065)]
    [InlineData(50, 2.5, 0, 73, 25, -18, 27.1492)]
    public void Ciede2000_matches_published_test_pairs(double l1, double a1, double b1, double l2, double a2, double b2, double expected) =>
        Assert.Equal(expected, Ciede2000((l1, a1, b1), (l2, a2, b2)), 4);

    [Fact]
    public void Machado_matrices_keep_white_white() // each row sums to 1 (the published construction).
    {
        foreach (double[,] m in new[] { Protanopia, Deuteranopia, Tritanopia })
        {
            for (int i = 0; i < 3; i++) Assert.Equal(1.0, m[i, 0] + m[i, 1] + m[i, 2], 5);
        }
    }

    [Fact]
    public void Categorical_colours_stay_apart_under_simulated_colour_vision_deficiencies()
    {
        var simulations = new[] { ("normal", Normal), ("protanopia", Protanopia), ("deuteranopia", Deuteranopia), ("tritanopia", Tritanopia) };
        IReadOnlyList<string> colours = FigurePalette.Categorical;
        foreach ((string name, double[,] matrix) in simulations)
        {
            for (int i = 0; i < colours.Count; i++)
            {
                for (int j = i + 1; j < colours.Count; j++)
                {
                    double d = Ciede2000(Lab(Simulate(colours[i], matrix)), Lab(Simulate(colours[j], matrix)));
                    Assert.True(d >= MinimumCategoricalDifference, $"{colours[i]} and {colours[j]} differ by ΔE00 {d:F1} under {name}");
                }
            }
        }
    }

    /// <summary>
    /// The formation-energy figure's first four line colours (a study's native defects and a dopant, the usual size)
    /// stay apart under every simulation; the dash patterns tell lines apart beyond that.
    /// </summary>
    [Fact]
    public void Defect_line_colours_stay_apart_under_simulated_colour_vision_deficiencies()
    {
        const double minimumLineDifference = 20;
        var simulations = new[] { ("normal", Normal), ("protanopia", Protanopia), ("deuteranopia", Deuteranopia), ("tritanopia", Tritanopia) };
        string[] colours = [.. DefectLineStyles.All.Take(4)];
        foreach ((string name, double[,] matrix) in simulations)
        {
            for (int i = 0; i < colours.Length; i++)
            {
                for (int j = i + 1; j < colours.Length; j++)
                {
                    double d = Ciede2000(Lab(Simulate(colours[i], matrix)), Lab(Simulate(colours[j], matrix)));
                    Assert.True(d >= minimumLineDifference, $"{colours[i]} and {colours[j]} differ by ΔE00 {d:F1} under {name}");
                }
            }
        }

        Assert.Equal(DefectLineStyles.All.Count, DefectLineStyles.All.Distinct().Count());
    }

    [Fact]
    public void Above_hull_scale_lightness_rises_steadily()
    {
        const int steps = 50;
        double[] lightness = Enumerable.Range(0, steps + 1).Select(k => Lab(Linear(AboveHullScale.ColorAt(k / (double)steps))).L).ToArray();
        double rise = (lightness[^1] - lightness[0]) / steps;
        Assert.True(lightness[^1] - lightness[0] > 40, "the scale spans a wide range of lightness");
        for (int k = 1; k <= steps; k++)
        {
            double step = lightness[k] - lightness[k - 1];
            // Steady: each step within a third of the mean rise (8-bit rounding moves L* by up to about 0.3).
            Assert.True(step > 0 && Math.Abs(step - rise) < rise / 3, $"L* step {k}: {step:F2} against a mean of {rise:F2}");
        }
    }

    [Fact]
    public void Legend_gradient_stops_rise_in_lightness()
    {
        (var hull, _) = FigureTestData.Random(["Co", "Li", "O"], 20, 3);
        var svg = new SvgFigure(FigureTestData.Draw(hull).Svg);
        XElement gradient = svg.Elements.Single(e => e.Name.LocalName == "linearGradient");
        var stops = gradient.Elements(SvgFigure.Svg + "stop")
            .Select(s => (Offset: double.Parse((string)s.Attribute("offset")!, CultureInfo.InvariantCulture), L: Lab(Linear((string)s.Attribute("stop-color")!)).L))
            .ToArray();
        Assert.True(stops.Length >= 5);
        for (int k = 1; k < stops.Length; k++)
        {
            Assert.True(stops[k].Offset > stops[k - 1].Offset && stops[k].L > stops[k - 1].L, $"stop {k} does not rise");
        }
    }

    private static double[] Simulate(string hex, double[,] m)
    {
        double[] c = Linear(hex);
        return Enumerable.Range(0, 3).Select(i => Math.Clamp(m[i, 0] * c[0] + m[i, 1] * c[1] + m[i, 2] * c[2], 0, 1)).ToArray();
    }

    /// <summary>Linear RGB of "#rrggbb" (sRGB decoding, IEC 61966-2-1).</summary>
    private static double[] Linear(string hex) => Enumerable.Range(0, 3).Select(k =>
    {
        double c = int.Parse(hex.AsSpan(1 + 2 * k, 2), NumberStyles.HexNumber, CultureInfo.InvariantCulture) / 255.0;
        return c <= 0.04045 ? c / 12.92 : Math.Pow((c + 0.055) / 1.055, 2.4);
    }).ToArray();

    /// <summary>CIELAB (D65) of linear RGB (IEC 61966-2-1 matrix; CIE 15 L*a*b*).</summary>
    private static (double L, double A, double B) Lab(double[] rgb)
    {
        double x = 0.4124 * rgb[0] + 0.3576 * rgb[1] + 0.1805 * rgb[2];
        double y = 0.2126 * rgb[0] + 0.7152 * rgb[1] + 0.0722 * rgb[2];
        double z = 0.0193 * rgb[0] + 0.1192 * rgb[1] + 0.9505 * rgb[2];
        static double F(double t) => t > 216.0 / 24389.0 ? Math.Cbrt(t) : (24389.0 / 27.0 * t + 16) / 116;
        double fx = F(x / 0.95047), fy = F(y), fz = F(z / 1.08883);
        return (116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz));
    }

    private static double Ciede2000((double L, double A, double B) c1, (double L, double A, double B) c2)
    {
        static double Deg(double rad) => rad * 180 / Math.PI;
        static double Rad(double deg) => deg * Math.PI / 180;
        double cBar = (Math.Sqrt(c1.A * c1.A + c1.B * c1.B) + Math.Sqrt(c2.A * c2.A + c2.B * c2.B)) / 2;
        double g = 0.5 * (1 - Math.Sqrt(Math.Pow(cBar, 7) / (Math.Pow(cBar, 7) + Math.Pow(25, 7))));
        double a1 = (1 + g) * c1.A, a2 = (1 + g) * c2.A;
        double ch1 = Math.Sqrt(a1 * a1 + c1.B * c1.B), ch2 = Math.Sqrt(a2 * a2 + c2.B * c2.B);
        double h1 = ch1 == 0 ? 0 : (Deg(Math.Atan2(c1.B, a1)) + 360) % 360;
        double h2 = ch2 == 0 ? 0 : (Deg(Math.Atan2(c2.B, a2)) + 360) % 360;
        double dL = c2.L - c1.L, dC = ch2 - ch1;
        double dh = ch1 * ch2 == 0 ? 0 : h2 - h1 > 180 ? h2 - h1 - 360 : h2 - h1 < -180 ? h2 - h1 + 360 : h2 - h1;
        double dH = 2 * Math.Sqrt(ch1 * ch2) * Math.Sin(Rad(dh / 2));
        double lBar = (c1.L + c2.L) / 2, cpBar = (ch1 + ch2) / 2;
        double hBar = ch1 * ch2 == 0 ? h1 + h2 : Math.Abs(h1 - h2) <= 180 ? (h1 + h2) / 2 : h1 + h2 < 360 ? (h1 + h2 + 360) / 2 : (h1 + h2 - 360) / 2;
        double t = 1 - 0.17 * Math.Cos(Rad(hBar - 30)) + 0.24 * Math.Cos(Rad(2 * hBar)) + 0.32 * Math.Cos(Rad(3 * hBar + 6)) - 0.20 * Math.Cos(Rad(4 * hBar - 63));
        double dTheta = 30 * Math.Exp(-Math.Pow((hBar - 275) / 25, 2));
        double rc = 2 * Math.Sqrt(Math.Pow(cpBar, 7) / (Math.Pow(cpBar, 7) + Math.Pow(25, 7)));
        double sl = 1 + 0.015 * Math.Pow(lBar - 50, 2) / Math.Sqrt(20 + Math.Pow(lBar - 50, 2));
        double sc = 1 + 0.045 * cpBar, sh = 1 + 0.015 * cpBar * t;
        double rt = -Math.Sin(Rad(2 * dTheta)) * rc;
        return Math.Sqrt(Math.Pow(dL / sl, 2) + Math.Pow(dC / sc, 2) + Math.Pow(dH / sh, 2) + rt * (dC / sc) * (dH / sh));
    }
}
