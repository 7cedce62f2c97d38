namespace Hull.Core.Defects;

/// <summary>
/// The normalised complete Fermi–Dirac integral of order 1/2,
/// F_{1/2}(η) = (2/√π) ∫_0^∞ √x / (1 + e^{x−η}) dx, which tends to e^η as η → −∞; and its logarithm, which stays
/// finite where F_{1/2} itself underflows (a Fermi level hundreds of k_BT inside the gap).
/// </summary>
public static class FermiDiracIntegral
{
    // Below this η the alternating series Σ (−1)^{k+1} e^{kη} / k^{3/2} converges to double rounding in under 40 terms.
    private const double SeriesBelowEta = -1.0;

    // Above this η the Sommerfeld expansion's first omitted term (~η^{-6}) is below 1e-18 relative.
    private const double SommerfeldAboveEta = 1000.0;

    // Beyond x = η + 60 the integrand is below e^{-60} ≈ 1e-26 of its peak.
    private const double TailWidth = 60.0;

    // Relative target of the quadrature: well below the 1e-10 the carrier densities need, above rounding.
    private const double RelativeTolerance = 1e-13;

    private const double FourOverSqrtPi = 2.2567583341910251;

    /// <summary>F_{1/2}(η); 0 where e^η underflows.</summary>
    public static double Half(double eta)
    {
        if (double.IsNaN(eta)) return double.NaN;
        if (eta <= SeriesBelowEta) return Math.Exp(eta) * SeriesRatio(eta);
        if (eta >= SommerfeldAboveEta) return Sommerfeld(eta);
        return Quadrature(eta);
    }

    /// <summary>ln F_{1/2}(η), finite for every finite η.</summary>
    public static double LogHalf(double eta)
    {
        if (double.IsNaN(eta)) return double.NaN;
        if (eta <= SeriesBelowEta) return eta + Math.Log(SeriesRatio(eta));
        return Math.Log(Half(eta));
    }

    // F_{1/2}(η)/e^η = Σ_{k≥1} (−1)^{k+1} e^{(k−1)η} / k^{3/2} for η ≤ −1.
    private static double SeriesRatio(double eta)
    {
        double z = Math.Exp(eta), power = 1, sum = 0;
        for (int k = 1; k < 60; k++)
        {
            double term = power / (k * Math.Sqrt(k));
            sum += (k % 2 == 1) ? term : -term;
            if (term < 1e-17 * sum) break;
            power *= z;
        }

        return sum;
    }

    // (4/(3√π)) η^{3/2} (1 + π²/(8η²) + 7π⁴/(640η⁴)) for η ≫ 1; the exponentially small remainder is lost.
    private static double Sommerfeld(double eta)
    {
        double inv2 = 1 / (eta * eta);
        return FourOverSqrtPi / 3 * eta * Math.Sqrt(eta) * (1 + Math.PI * Math.PI / 8 * inv2 + 7 * Math.Pow(Math.PI, 4) / 640 * inv2 * inv2);
    }

    // With x = t², F = (4/√π) ∫_0^∞ t² / (1 + e^{t²−η}) dt: smooth at t = 0. Split where the occupation falls (t = √η).
    private static double Quadrature(double eta)
    {
        double Integrand(double t)
        {
            double u = t * t - eta;
            double occupation = u > 0 ? Math.Exp(-u) / (1 + Math.Exp(-u)) : 1 / (1 + Math.Exp(u));
            return t * t * occupation;
        }

        double estimate = eta > 0 ? eta * Math.Sqrt(eta) / 1.5 + 1 : Math.Exp(eta) * Math.Sqrt(Math.PI) / 4;
        double tolerance = RelativeTolerance * estimate;
        double split = Math.Sqrt(Math.Max(eta, 0));
        double end = Math.Sqrt(Math.Max(eta, 0) + TailWidth);
        double sum = SpecialFunctions.Integrate(Integrand, split, end, tolerance);
        if (split > 0) sum += SpecialFunctions.Integrate(Integrand, 0, split, tolerance);
        return FourOverSqrtPi * sum;
    }
}
