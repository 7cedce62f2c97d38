namespace Hull.Core.Defects;

/// <summary>ln Σ e^{x_i} without overflow or underflow: the largest term is factored out.</summary>
internal static class LogSum
{
    public static double Of(IReadOnlyList<double> logs)
    {
        double max = double.NegativeInfinity;
        for (int i = 0; i < logs.Count; i++) max = Math.Max(max, logs[i]);
        if (double.IsNegativeInfinity(max)) return max;
        double sum = 0;
        for (int i = 0; i < logs.Count; i++) sum += Math.Exp(logs[i] - max);
        return max + Math.Log(sum);
    }

    public static double Of(double a, double b)
    {
        double max = Math.Max(a, b);
        if (double.IsNegativeInfinity(max)) return max;
        return max + Math.Log(Math.Exp(a - max) + Math.Exp(b - max));
    }
}
