using Hull.Core.Defects;
using Hull.Core.Tests.References;

namespace Hull.Core.Tests.Defects;

public sealed class FermiDiracIntegralTests
{
    [Fact]
    public void Value_at_zero_is_the_tabulated_one_and_the_closed_form()
    {
        // Tabulated normalised F_1/2(0) = 0.765147 (issue's outside check; common practice). Closed form
        // F_1/2(0) = (1 − 2^{−1/2}) ζ(3/2), ζ(3/2) = 2.612375348685488 (from memory).
        Assert.Equal(0.765147, FermiDiracIntegral.Half(0), 6);
        Assert.Equal((1 - 1 / Math.Sqrt(2)) * 2.612375348685488, FermiDiracIntegral.Half(0), 13);
    }

    [Fact]
    public void Agrees_with_scipy_quad_and_mpmath_polylog_on_every_branch()
    {
        // Both branch ends (series below −1, Sommerfeld above 1000) and the quadrature between.
        double[] eta = [-700, -200, -50, -10, -1.000001, -1, -0.999999, -0.5, 0, 0.3, 1, 2.5, 5, 20, 60, 100, 999.999, 1000, 1000.001, 5000];
        var reference = new CarriersReference();
        int task = reference.FermiDirac(eta);
        var result = reference.Run()[task]!;
        double[] quad = CarriersReference.Values(result["quad"]), polylog = CarriersReference.Values(result["polylog"]);
        for (int i = 0; i < eta.Length; i++)
        {
            double ours = FermiDiracIntegral.Half(eta[i]);
            // mpmath's polylog at 40 digits is the sharper of the two; quad (relative 1e-13 requested) must agree with it.
            Assert.True(Math.Abs(ours - polylog[i]) <= 1e-12 * polylog[i], $"η = {eta[i]}: {ours:R} against polylog {polylog[i]:R}");
            Assert.True(Math.Abs(quad[i] - polylog[i]) <= 1e-10 * polylog[i], $"η = {eta[i]}: the two references disagree");
            Assert.Equal(Math.Log(polylog[i]), FermiDiracIntegral.LogHalf(eta[i]), 11);
        }
    }

    [Fact]
    public void Logarithm_stays_finite_where_the_value_underflows()
    {
        // F_1/2(η) → e^η (1 − e^η/2^{3/2}) as η → −∞ (the series' first two terms, common practice).
        Assert.Equal(0.0, FermiDiracIntegral.Half(-1000));
        Assert.Equal(-1000.0, FermiDiracIntegral.LogHalf(-1000), 12);
        double eta = -30;
        Assert.Equal(eta + Math.Log(1 - Math.Exp(eta) / Math.Pow(2, 1.5)), FermiDiracIntegral.LogHalf(eta), 14);
        Assert.True(double.IsNaN(FermiDiracIntegral.Half(double.NaN)));
    }
}
