using System.Globalization;

namespace Hull.Core.Figures;

/// <summary>A CIE L*a*b* colour (D65 white) and its sRGB form, for scales whose lightness is planned.</summary>
internal readonly record struct CieLab(double L, double A, double B)
{
    // D65 white point and the sRGB matrices of IEC 61966-2-1 (common practice).
    private const double Xn = 0.95047, Yn = 1.0, Zn = 1.08883;

    public static CieLab FromLch(double lightness, double chroma, double hueDegrees)
    {
        double h = hueDegrees * Math.PI / 180.0;
        return new CieLab(lightness, chroma * Math.Cos(h), chroma * Math.Sin(h));
    }

    /// <summary>sRGB as "#rrggbb"; out-of-gamut channels are clipped, so the chosen values must stay inside.</summary>
    public string ToHex()
    {
        double fy = (L + 16) / 116.0;
        double fx = fy + A / 500.0;
        double fz = fy - B / 200.0;
        double x = Xn * Inverse(fx), y = Yn * Inverse(fy), z = Zn * Inverse(fz);
        double r = 3.2404542 * x - 1.5371385 * y - 0.4985314 * z;
        double g = -0.9692660 * x + 1.8760108 * y + 0.0415560 * z;
        double b = 0.0556434 * x - 0.2040259 * y + 1.0572252 * z;
        return string.Create(CultureInfo.InvariantCulture, $"#{Channel(r):x2}{Channel(g):x2}{Channel(b):x2}");
    }

    private static double Inverse(double f)
    {
        const double delta = 6.0 / 29.0;
        return f > delta ? f * f * f : 3 * delta * delta * (f - 4.0 / 29.0);
    }

    private static int Channel(double linear)
    {
        double c = Math.Clamp(linear, 0.0, 1.0);
        double encoded = c <= 0.0031308 ? 12.92 * c : 1.055 * Math.Pow(c, 1 / 2.4) - 0.055;
        return (int)Math.Round(encoded * 255.0);
    }
}
