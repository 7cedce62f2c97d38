using System.Globalization;

namespace Hull.Core.Figures;

/// <summary>An axis range rounded out to a step of 1, 2, 2.5 or 5 times a power of ten, with about five steps.</summary>
internal static class AxisTicks
{
    public static (double Min, double Max, double Step) Range(double low, double high)
    {
        double span = high - low;
        if (!(span > 1e-12)) span = Math.Max(1e-3, Math.Abs(high) * 0.1);
        double raw = span / 5.0;
        double power = Math.Pow(10, Math.Floor(Math.Log10(raw)));
        double step = new[] { 1.0, 2.0, 2.5, 5.0, 10.0 }.Select(m => m * power).First(s => s >= raw * (1 - 1e-9));
        double min = Math.Floor(low / step + 1e-9) * step;
        double max = Math.Ceiling(high / step - 1e-9) * step;
        if (max - min < step) max = min + step;
        return (min, max, step);
    }

    public static string Format(double value, double step)
    {
        int decimals = Math.Max(0, (int)Math.Ceiling(-Math.Log10(step) - 1e-9) + (step * Math.Pow(10, Math.Ceiling(-Math.Log10(step) - 1e-9)) % 1 > 1e-6 ? 1 : 0));
        double shown = Math.Abs(value) < step * 1e-6 ? 0.0 : value;
        return shown.ToString("F" + decimals, CultureInfo.InvariantCulture);
    }
}
