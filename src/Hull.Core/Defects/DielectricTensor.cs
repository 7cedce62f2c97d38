namespace Hull.Core.Defects;

/// <summary>
/// The static dielectric tensor (electronic + ionic, relative permittivity), scalar or 3×3 in the Cartesian frame
/// of the lattice vectors. Immutable, symmetric and positive definite by construction.
/// </summary>
public sealed class DielectricTensor
{
    private DielectricTensor(Matrix3 tensor, bool isScalar)
    {
        Tensor = tensor;
        IsScalar = isScalar;
        var (values, _) = tensor.SymmetricEigen();
        Eigenvalues = values;
        Determinant = values.X * values.Y * values.Z;
        InverseSquareRoot = tensor.SymmetricFunction(v => 1 / Math.Sqrt(v));
        Inverse = tensor.SymmetricFunction(v => 1 / v);
    }

    /// <summary>An isotropic medium ε·I.</summary>
    public static DielectricTensor Scalar(double epsilon, string field = "dielectric")
    {
        if (!double.IsFinite(epsilon) || epsilon <= 0)
        {
            throw new DefectInputException(field, $"a scalar dielectric constant must be a positive number, not {epsilon}");
        }

        return new DielectricTensor(Matrix3.Diagonal(epsilon, epsilon, epsilon), isScalar: true);
    }

    /// <summary>A full tensor; nearly symmetric input is symmetrised, anything else that is not positive definite is refused.</summary>
    public static DielectricTensor FromMatrix(Matrix3 tensor, string field = "dielectric")
    {
        if (!tensor.IsFinite) throw new DefectInputException(field, "the dielectric tensor must hold finite numbers");
        double asymmetry = tensor.RelativeAsymmetry();
        if (asymmetry > DefectTolerances.DielectricAsymmetry)
        {
            throw new DefectInputException(field, $"the dielectric tensor is not symmetric (relative asymmetry {asymmetry:G3})");
        }

        var symmetric = 0.5 * (tensor + tensor.Transpose());
        var (values, _) = symmetric.SymmetricEigen();
        if (values.Z <= 0 || values.X <= DefectTolerances.DielectricEigenvalueRatio * values.Z)
        {
            throw new DefectInputException(field,
                $"the dielectric tensor is not positive definite (eigenvalues {values.X:G6}, {values.Y:G6}, {values.Z:G6})");
        }

        bool isotropic = symmetric[0, 1] == 0 && symmetric[0, 2] == 0 && symmetric[1, 2] == 0
            && symmetric[0, 0] == symmetric[1, 1] && symmetric[1, 1] == symmetric[2, 2];
        return new DielectricTensor(symmetric, isotropic);
    }

    public static DielectricTensor Diagonal(double e1, double e2, double e3, string field = "dielectric") =>
        FromMatrix(Matrix3.Diagonal(e1, e2, e3), field);

    /// <summary>The symmetric tensor.</summary>
    public Matrix3 Tensor { get; }

    /// <summary>True for ε·I.</summary>
    public bool IsScalar { get; }

    /// <summary>Eigenvalues in ascending order.</summary>
    public Vector3D Eigenvalues { get; }

    public double Determinant { get; }

    /// <summary>ε^{−1/2} (symmetric): maps the medium onto vacuum (see <see cref="ImageChargeEwald"/>).</summary>
    public Matrix3 InverseSquareRoot { get; }

    public Matrix3 Inverse { get; }

    /// <summary>The value of a scalar medium (the mean of the eigenvalues otherwise, for display).</summary>
    public double ScalarValue => (Eigenvalues.X + Eigenvalues.Y + Eigenvalues.Z) / 3;
}
