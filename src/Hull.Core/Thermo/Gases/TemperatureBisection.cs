namespace Hull.Core.Thermo.Gases;

/// <summary>
/// Root of a continuous function of temperature on [from, to] by scanning for a sign change, then the bisection
/// method on the lowest bracket found. Never throws for a failed solve: the result says why it stopped.
/// </summary>
public static class TemperatureBisection
{
    /// <summary>
    /// Solve f(T) = 0 on [<paramref name="fromK"/>, <paramref name="toK"/>] with <see cref="GasTolerances.ScanIntervals"/>
    /// scan intervals, bracket width <see cref="GasTolerances.TemperatureBracketK"/> and at most
    /// <see cref="GasTolerances.MaximumBisectionSteps"/> steps.
    /// </summary>
    public static TemperatureSolveResult Solve(Func<double, double> function, double fromK, double toK)
    {
        ArgumentNullException.ThrowIfNull(function);
        if (!(double.IsFinite(fromK) && double.IsFinite(toK) && toK > fromK))
        {
            throw new ArgumentException($"A temperature search needs finite ends with from < to; got {fromK} K to {toK} K.");
        }

        int intervals = GasTolerances.ScanIntervals;
        double step = (toK - fromK) / intervals;
        double? lowK = null, highK = null;
        double lowValue = 0;
        int signChanges = 0;
        double previousK = fromK;
        double previousValue = function(fromK);
        if (!double.IsFinite(previousValue))
        {
            return NonFinite(fromK, fromK, toK, 0, 0);
        }

        double? exactRootK = previousValue == 0 ? fromK : null;
        for (int i = 1; i <= intervals; i++)
        {
            double k = i == intervals ? toK : fromK + i * step;
            double value = function(k);
            if (!double.IsFinite(value))
            {
                return NonFinite(k, fromK, toK, 0, signChanges);
            }

            if (value == 0)
            {
                exactRootK ??= k;
            }

            if (Math.Sign(value) * Math.Sign(previousValue) < 0)
            {
                signChanges++;
                if (lowK is null)
                {
                    lowK = previousK;
                    highK = k;
                    lowValue = previousValue;
                }
            }

            previousK = k;
            previousValue = value;
        }

        if (exactRootK is double exact && (lowK is null || exact <= lowK))
        {
            return new TemperatureSolveResult(TemperatureSolveStatus.Converged, exact, exact, exact, 0, signChanges + 1, fromK, toK);
        }

        if (lowK is null || highK is null)
        {
            return new TemperatureSolveResult(TemperatureSolveStatus.NoSignChangeInRange, double.NaN, fromK, toK, 0, 0, fromK, toK);
        }

        double a = lowK.Value, b = highK.Value, fa = lowValue;
        for (int steps = 1; steps <= GasTolerances.MaximumBisectionSteps; steps++)
        {
            double mid = 0.5 * (a + b);
            double fm = function(mid);
            if (!double.IsFinite(fm))
            {
                return NonFinite(mid, fromK, toK, steps, signChanges);
            }

            if (fm == 0 || b - a <= GasTolerances.TemperatureBracketK)
            {
                return new TemperatureSolveResult(TemperatureSolveStatus.Converged, mid, a, b, steps, signChanges, fromK, toK);
            }

            if (Math.Sign(fm) == Math.Sign(fa))
            {
                a = mid;
                fa = fm;
            }
            else
            {
                b = mid;
            }
        }

        return new TemperatureSolveResult(TemperatureSolveStatus.StepLimitReached, 0.5 * (a + b), a, b,
            GasTolerances.MaximumBisectionSteps, signChanges, fromK, toK);
    }

    private static TemperatureSolveResult NonFinite(double atK, double fromK, double toK, int steps, int signChanges) =>
        new(TemperatureSolveStatus.NonFiniteValue, atK, atK, atK, steps, signChanges, fromK, toK);
}
