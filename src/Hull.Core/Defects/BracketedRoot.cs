namespace Hull.Core.Defects;

/// <summary>
/// Brent's method (inverse quadratic interpolation and secant steps guarded by bisection) for a root of a continuous
/// function with one sign change in a bracket. Never throws for a failed solve: the result says why it stopped.
/// </summary>
internal static class BracketedRoot
{
    private const double MachineEpsilon = 2.220446049250313e-16;

    /// <summary>
    /// A root of <paramref name="f"/> in [a, b], where f(a) and f(b) (given as <paramref name="fa"/>, <paramref name="fb"/>)
    /// have opposite signs or one is zero; the bracket is narrowed to <paramref name="tolerance"/> plus a few units of rounding.
    /// </summary>
    public static (double Root, int Iterations, bool Converged) Brent(Func<double, double> f, double a, double b, double fa, double fb, double tolerance, int maxIterations)
    {
        if (fa == 0) return (a, 0, true);
        if (fb == 0) return (b, 0, true);
        double c = a, fc = fa, d = b - a, e = d;
        for (int iteration = 1; iteration <= maxIterations; iteration++)
        {
            if (Math.Sign(fb) == Math.Sign(fc))
            {
                c = a;
                fc = fa;
                d = e = b - a;
            }

            if (Math.Abs(fc) < Math.Abs(fb))
            {
                (a, b, c) = (b, c, b);
                (fa, fb, fc) = (fb, fc, fb);
            }

            double tol = 2 * MachineEpsilon * Math.Abs(b) + 0.5 * tolerance;
            double m = 0.5 * (c - b);
            if (Math.Abs(m) <= tol || fb == 0) return (b, iteration, true);

            if (Math.Abs(e) >= tol && Math.Abs(fa) > Math.Abs(fb))
            {
                double s = fb / fa, p, q;
                if (a == c)
                {
                    p = 2 * m * s;
                    q = 1 - s;
                }
                else
                {
                    double qa = fa / fc, r = fb / fc;
                    p = s * (2 * m * qa * (qa - r) - (b - a) * (r - 1));
                    q = (qa - 1) * (r - 1) * (s - 1);
                }

                if (p > 0) q = -q;
                else p = -p;
                if (2 * p < Math.Min(3 * m * q - Math.Abs(tol * q), Math.Abs(e * q)))
                {
                    e = d;
                    d = p / q;
                }
                else
                {
                    d = m;
                    e = m;
                }
            }
            else
            {
                d = m;
                e = m;
            }

            a = b;
            fa = fb;
            b += Math.Abs(d) > tol ? d : (m > 0 ? tol : -tol);
            fb = f(b);
        }

        return (b, maxIterations, false);
    }
}
