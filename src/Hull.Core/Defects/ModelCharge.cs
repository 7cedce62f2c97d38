namespace Hull.Core.Defects;

/// <summary>
/// The shape of the model charge that stands for a defect's localised charge in the finite-size correction: a
/// point, or a normalised Gaussian exp(−½ rᵀS⁻¹r) with covariance S (Å²); an isotropic Gaussian of width σ has
/// S = σ²I. The same shape gives the lattice energy and the model potential, so the two are consistent.
/// </summary>
public sealed class ModelCharge
{
    /// <summary>
    /// Default Gaussian width σ (Å): narrower than the ~2 Å nearest-neighbour distance of oxides, so the model
    /// charge sits on the defect site, and wide enough that its planar-averaged potential is smooth on a DFT grid.
    /// </summary>
    public const double DefaultGaussianWidthAngstrom = 1.0;

    private ModelCharge(Matrix3 covariance, bool isPoint)
    {
        Covariance = covariance;
        IsPoint = isPoint;
    }

    /// <summary>A point charge (the σ → 0 limit).</summary>
    public static ModelCharge Point { get; } = new(Matrix3.Diagonal(0, 0, 0), isPoint: true);

    /// <summary>An isotropic Gaussian of width σ (Å).</summary>
    public static ModelCharge Gaussian(double widthAngstrom, string field = "model_charge_width_angstrom")
    {
        if (!double.IsFinite(widthAngstrom) || widthAngstrom <= 0)
        {
            throw new DefectInputException(field, $"a Gaussian width must be a positive number of Å, not {widthAngstrom}");
        }

        double s = widthAngstrom * widthAngstrom;
        return new ModelCharge(Matrix3.Diagonal(s, s, s), isPoint: false);
    }

    /// <summary>A Gaussian of any shape: covariance S (Å²), symmetric positive definite.</summary>
    public static ModelCharge GaussianWithCovariance(Matrix3 covariance, string field = "model_charge_covariance")
    {
        if (!covariance.IsFinite || covariance.RelativeAsymmetry() > 1e-12)
        {
            throw new DefectInputException(field, "a Gaussian covariance must be a finite symmetric matrix");
        }

        var (values, _) = covariance.SymmetricEigen();
        if (values.X <= 0) throw new DefectInputException(field, "a Gaussian covariance must be positive definite");
        return new ModelCharge(covariance, isPoint: false);
    }

    /// <summary>The default model charge: an isotropic Gaussian of <see cref="DefaultGaussianWidthAngstrom"/>.</summary>
    public static ModelCharge Default { get; } = Gaussian(DefaultGaussianWidthAngstrom);

    /// <summary>Covariance S (Å²); zero for a point.</summary>
    public Matrix3 Covariance { get; }

    public bool IsPoint { get; }

    /// <summary>The width σ of an isotropic Gaussian (0 for a point, NaN for an anisotropic one).</summary>
    public double IsotropicWidthAngstrom
    {
        get
        {
            if (IsPoint) return 0;
            bool isotropic = Covariance[0, 1] == 0 && Covariance[0, 2] == 0 && Covariance[1, 2] == 0
                && Covariance[0, 0] == Covariance[1, 1] && Covariance[1, 1] == Covariance[2, 2];
            return isotropic ? Math.Sqrt(Covariance[0, 0]) : double.NaN;
        }
    }
}
