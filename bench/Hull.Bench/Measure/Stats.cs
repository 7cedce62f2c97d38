namespace Hull.Bench.Measure;

public static class Stats
{
    public static double Median(IReadOnlyList<double> values)
    {
        if (values.Count == 0) return double.NaN;
        var s = values.Order().ToArray();
        int m = s.Length / 2;
        return s.Length % 2 == 1 ? s[m] : 0.5 * (s[m - 1] + s[m]);
    }
}
