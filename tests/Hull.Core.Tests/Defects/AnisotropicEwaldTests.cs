using Hull.Core.Defects;
using Hull.Core.Tests.References;

namespace Hull.Core.Tests.Defects;

/// <summary>
/// The anisotropic lattice correction: the scaling identity of a diagonal tensor, invariance under rotating cell and
/// tensor together, independence from the Ewald splitting, and agreement with an independent NumPy evaluation.
/// </summary>
public sealed class AnisotropicEwaldTests
{
    // Both sides are converged to ~1e-13 relative; rounding over a few hundred terms stays below 1e-11.
    private const double IdentityRelative = 1e-10;

    // The NumPy reference integrates the isolated Gaussian with scipy quad (epsrel 1e-13) and truncates its
    // plain reciprocal sum at e^{-40}: ~1e-12 eV; 1e-9 eV leaves room and is far below the 1e-6 eV target.
    private const double ReferenceEv = 1e-9;

    private static double Energy(LatticeCell cell, DielectricTensor eps, ModelCharge model, int q = 2, EwaldSettings? settings = null) =>
        ImageChargeEwald.LatticeCorrection(cell, eps, model, q, settings).CorrectionEv;

    private static void AssertRelative(double expected, double actual, double relative)
    {
        Assert.True(Math.Abs(expected - actual) <= relative * Math.Abs(expected), $"expected {expected:R}, got {actual:R}");
    }

    [Fact]
    public void Diagonal_tensor_equals_scaled_vacuum_cell_for_a_point_charge()
    {
        // common practice: r → ε^{-1/2} r maps ∇·(ε∇φ) onto the vacuum Laplacian, energy × 1/√det ε
        double a = 8.0, b = 10.5, c = 12.0, e1 = 4.0, e2 = 9.0, e3 = 16.0;
        var cell = LatticeCell.Create(new(a, 0, 0), new(0, b, 0), new(0, 0, c));
        var scaled = LatticeCell.Create(new(a / Math.Sqrt(e1), 0, 0), new(0, b / Math.Sqrt(e2), 0), new(0, 0, c / Math.Sqrt(e3)));
        double anisotropic = Energy(cell, DielectricTensor.Diagonal(e1, e2, e3), ModelCharge.Point);
        double vacuum = Energy(scaled, DielectricTensor.Scalar(1), ModelCharge.Point);
        AssertRelative(vacuum / Math.Sqrt(e1 * e2 * e3), anisotropic, IdentityRelative);
    }

    [Fact]
    public void Diagonal_tensor_equals_scaled_vacuum_cell_for_a_gaussian_with_scaled_widths()
    {
        // common practice: the same map takes widths σ to σ ε_i^{-1/2}
        double a = 8.0, b = 10.5, c = 12.0, e1 = 4.0, e2 = 9.0, e3 = 16.0, sigma = 1.3;
        var cell = LatticeCell.Create(new(a, 0, 0), new(0, b, 0), new(0, 0, c));
        var scaled = LatticeCell.Create(new(a / Math.Sqrt(e1), 0, 0), new(0, b / Math.Sqrt(e2), 0), new(0, 0, c / Math.Sqrt(e3)));
        var widths = ModelCharge.GaussianWithCovariance(Matrix3.Diagonal(sigma * sigma / e1, sigma * sigma / e2, sigma * sigma / e3));
        double anisotropic = Energy(cell, DielectricTensor.Diagonal(e1, e2, e3), ModelCharge.Gaussian(sigma));
        double vacuum = Energy(scaled, DielectricTensor.Scalar(1), widths);
        AssertRelative(vacuum / Math.Sqrt(e1 * e2 * e3), anisotropic, IdentityRelative);
    }

    [Theory]
    [InlineData(true)]
    [InlineData(false)]
    public void Rotating_cell_tensor_and_charge_together_changes_nothing(bool point)
    {
        // common practice: the energy is a scalar of the whole arrangement
        var cell = TestCells.Triclinic();
        var eps = TestCells.FullTensor();
        var model = point ? ModelCharge.Point : ModelCharge.GaussianWithCovariance(Matrix3.FromRows([[1.2, 0.1, 0.0], [0.1, 0.9, 0.2], [0.0, 0.2, 1.0]]));
        var rot = TestCells.Rotation(0.7, -1.1, 2.3);
        var rotatedCell = cell.Transformed(rot);
        var rotatedEps = DielectricTensor.FromMatrix(rot * eps.Tensor * rot.Transpose());
        var rotatedModel = point ? model : ModelCharge.GaussianWithCovariance(Symmetrise(rot * model.Covariance * rot.Transpose()));
        AssertRelative(Energy(cell, eps, model), Energy(rotatedCell, rotatedEps, rotatedModel), IdentityRelative);
    }

    [Theory]
    [InlineData(true)]
    [InlineData(false)]
    public void Splitting_parameter_changes_nothing(bool point)
    {
        // common practice: the Ewald split moves work between the sums, never the total
        var cell = TestCells.Triclinic();
        var eps = TestCells.FullTensor();
        var model = point ? ModelCharge.Point : ModelCharge.Default;
        double reference = Energy(cell, eps, model);
        double gamma = ImageChargeEwald.LatticeCorrection(cell, eps, model, 2).SplittingPerAngstrom;
        foreach (double factor in new[] { 0.4, 0.7, 1.6, 3.0 })
        {
            AssertRelative(reference, Energy(cell, eps, model, settings: new EwaldSettings(gamma * factor)), IdentityRelative);
        }
    }

    [Fact]
    public void Quadrature_path_reproduces_the_closed_isotropic_form()
    {
        // The general-covariance kernel integrates over t; an isotropic covariance also has a closed erfc form.
        var cell = TestCells.Triclinic();
        var eps = DielectricTensor.Scalar(7.5);
        double closed = ImageChargeEwald.LatticeCorrection(cell, eps, ModelCharge.Default, -2, EwaldSettings.Default, forceQuadrature: false).CorrectionEv;
        double integrated = ImageChargeEwald.LatticeCorrection(cell, eps, ModelCharge.Default, -2, EwaldSettings.Default, forceQuadrature: true).CorrectionEv;
        AssertRelative(closed, integrated, IdentityRelative);
    }

    [Fact]
    public void Agrees_with_an_independent_numpy_evaluation()
    {
        var reference = new ElectrostaticsReference();
        var cases = new List<(LatticeCell Cell, DielectricTensor Eps, ModelCharge Model, int Q)>
        {
            (TestCells.Triclinic(), TestCells.FullTensor(), ModelCharge.Point, 1),
            (TestCells.Triclinic(), TestCells.FullTensor(), ModelCharge.Default, -2),
            (TestCells.Triclinic(), TestCells.FullTensor(), ModelCharge.Gaussian(1.7), 3),
            (TestCells.Triclinic(), DielectricTensor.Scalar(10.0), ModelCharge.Default, 1),
            (LatticeCell.Create(new(6, 0, 0), new(0, 7, 0), new(0, 0, 15)), DielectricTensor.Diagonal(3, 5, 20), ModelCharge.Point, -1),
        };
        int[] ids = [.. cases.Select(c => reference.Lattice(c.Cell, c.Eps, c.Model, c.Q))];
        var results = reference.Run();
        for (int i = 0; i < cases.Count; i++)
        {
            var c = cases[i];
            // NumPy/SciPy reference, tests/Hull.Core.Tests/References/defect_electrostatics.py (Debian python3-scipy)
            double expected = results[ids[i]]!.GetValue<double>();
            Assert.True(Math.Abs(expected - Energy(c.Cell, c.Eps, c.Model, c.Q)) <= ReferenceEv, $"case {i}: NumPy {expected:R}, ours {Energy(c.Cell, c.Eps, c.Model, c.Q):R}");
        }
    }

    [Fact]
    public void Erfc_agrees_with_scipy()
    {
        double[] x = [0, 1e-3, 0.3, 1.0, 1.4999, 1.5, 1.5001, 2.0, 2.5, 3.3, 4.7, 6.0, 9.0, 15.0, -0.7, -3.0];
        var reference = new ElectrostaticsReference();
        int id = reference.Erfc(x);
        // scipy.special.erfc (Debian python3-scipy)
        double[] expected = ElectrostaticsReference.Numbers(reference.Run()[id]);
        for (int i = 0; i < x.Length; i++)
        {
            Assert.True(Math.Abs(expected[i] - SpecialFunctions.Erfc(x[i])) <= 5e-15 * Math.Max(expected[i], 1e-300) + 1e-300,
                $"erfc({x[i]}): scipy {expected[i]:R}, ours {SpecialFunctions.Erfc(x[i]):R}");
        }
    }

    private static Matrix3 Symmetrise(Matrix3 m) => 0.5 * (m + m.Transpose());
}
