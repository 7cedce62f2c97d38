namespace Hull.ServiceBench;

/// <summary>The median every report of this benchmark gives (the mean of the middle two for an even count).</summary>
public static class Medians
{
    public static double Of(IEnumerable<double> values)
    {
        double[] sorted = values.Order().ToArray();
        if (sorted.Length == 0) return double.NaN;
        return sorted.Length % 2 == 1 ? sorted[sorted.Length / 2] : (sorted[sorted.Length / 2 - 1] + sorted[sorted.Length / 2]) / 2;
    }

    /// <summary>Two table cells: the median, then "min–max", each in <paramref name="format"/>.</summary>
    public static string Cells(IEnumerable<double> values, string format)
    {
        double[] v = values.ToArray();
        IFormatProvider invariant = System.Globalization.CultureInfo.InvariantCulture;
        return $"{Of(v).ToString(format, invariant)} | {v.Min().ToString(format, invariant)}–{v.Max().ToString(format, invariant)}";
    }
}
