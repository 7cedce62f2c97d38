using Hull.Core.Defects;

namespace Hull.Core.Tests.Defects;

/// <summary>
/// The point-charge lattice correction against published Madelung constants of a point charge in a compensating
/// background: E_lat = q²α/(2εL) (Leslie & Gillan 1985; Makov & Payne 1995).
/// </summary>
public sealed class MadelungTests
{
    // The published constants are given to 4 decimals; half a unit of the last digit.
    private const double PublishedRounding = 5e-5;

    private static double Madelung(LatticeCell cell, double length, double epsilon = 1, int charge = 1)
    {
        var energy = ImageChargeEwald.LatticeCorrection(cell, DielectricTensor.Scalar(epsilon), ModelCharge.Point, charge);
        return 2 * epsilon * length * energy.CorrectionEv / (charge * charge * PhysicalConstants.CoulombEvAngstrom);
    }

    [Fact]
    public void Simple_cubic()
    {
        double l = 7.3;
        var cell = LatticeCell.Create(new(l, 0, 0), new(0, l, 0), new(0, 0, l));
        // Leslie & Gillan 1985 / Makov & Payne 1995: simple cubic 2.8373
        Assert.Equal(2.8373, Madelung(cell, l), PublishedRounding);
        // same constant whatever the charge state and medium: q² and 1/ε scaling
        Assert.Equal(2.8373, Madelung(cell, l, epsilon: 9.5, charge: -3), PublishedRounding);
    }

    [Fact]
    public void Body_centred_cubic()
    {
        double a = 10.0;
        double h = a / 2;
        var cell = LatticeCell.Create(new(-h, h, h), new(h, -h, h), new(h, h, -h));
        // Leslie & Gillan 1985 / Makov & Payne 1995: bcc 3.6392 per cube edge, 2.8885 per Ω^{1/3}
        Assert.Equal(3.6392, Madelung(cell, a), PublishedRounding);
        Assert.Equal(2.8885, Madelung(cell, Math.Cbrt(cell.VolumeCubicAngstrom)), PublishedRounding);
    }

    [Fact]
    public void Face_centred_cubic()
    {
        double a = 8.0;
        double h = a / 2;
        var cell = LatticeCell.Create(new(0, h, h), new(h, 0, h), new(h, h, 0));
        // Leslie & Gillan 1985 / Makov & Payne 1995: fcc 4.5849 per cube edge, 2.8883 per Ω^{1/3}
        Assert.Equal(4.5849, Madelung(cell, a), PublishedRounding);
        Assert.Equal(2.8883, Madelung(cell, Math.Cbrt(cell.VolumeCubicAngstrom)), PublishedRounding);
    }

    [Fact]
    public void Neutral_state_has_no_correction()
    {
        var cell = LatticeCell.Create(new(5, 0, 0), new(0, 5, 0), new(0, 0, 5));
        Assert.Equal(0.0, ImageChargeEwald.LatticeCorrection(cell, DielectricTensor.Scalar(4), ModelCharge.Default, 0).CorrectionEv);
    }
}
