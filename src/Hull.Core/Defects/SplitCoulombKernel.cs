namespace Hull.Core.Defects;

/// <summary>
/// The Coulomb interaction 1/|r| averaged over a Gaussian offset d ~ N(0, C) (C = 2S between two Gaussian charges
/// of covariance S, C = S between a charge and a point probe), in vacuum, split Ewald-fashion at γ (Å⁻¹).
/// </summary>
/// <remarks>
/// From 1/|x| = (2/√π) ∫₀^∞ e^{−t²x²} dt and ⟨e^{−t²|r+d|²}⟩ = det(I + 2t²C)^{−1/2} e^{−t² rᵀ(I+2t²C)⁻¹r}: the
/// part t ≥ γ is short-ranged (the real-space sum), the part t &lt; γ has the Fourier transform
/// 4π e^{−GᵀCG/2} e^{−G²/4γ²} / G² (the reciprocal sum). A point (C = 0) and an isotropic C = cI have closed
/// forms with erfc; any other C is integrated over t.
/// </remarks>
internal sealed class SplitCoulombKernel
{
    private const double TwoOverSqrtPi = 1.1283791670955126;

    // Relative accuracy asked of each t integral; its error adds over a few hundred terms at most.
    private const double QuadratureRelativeTolerance = 1e-14;

    private readonly double _gamma;
    private readonly double _c0, _c1, _c2;     // eigenvalues of C
    private readonly Matrix3 _axes;             // eigenvectors of C (columns)
    private readonly bool _isPoint;
    private readonly bool _isIsotropic;

    public SplitCoulombKernel(Matrix3 covariance, double gamma, bool forceQuadrature = false)
    {
        _gamma = gamma;
        var (values, vectors) = covariance.SymmetricEigen();
        _c0 = Math.Max(values.X, 0);
        _c1 = Math.Max(values.Y, 0);
        _c2 = Math.Max(values.Z, 0);
        _axes = vectors;
        _isPoint = _c2 == 0;
        // Relative spread of the eigenvalues at which the closed isotropic form is exact to rounding.
        _isIsotropic = !forceQuadrature && !_isPoint && (_c2 - _c0) <= 1e-15 * _c2;
        LargestVariance = _c2;
        SmallestVariance = _c0;
        // Terms of the sums are compared with the unscreened Coulomb value at the real-space cutoff distance.
        _termScale = 1 / RealSpaceCutoff(1);
    }

    private readonly double _termScale;

    public double SmallestVariance { get; }

    /// <summary>
    /// Reciprocal-space cutoff (Å⁻¹) where the damping falls below e^{−x²}: from the split, or sooner from the
    /// Gaussian's own transform e^{−GᵀCG/2} ≤ e^{−c_min G²/2}.
    /// </summary>
    public double ReciprocalCutoff(double x) =>
        SmallestVariance > 0 ? x * Math.Min(2 * _gamma, Math.Sqrt(2 / SmallestVariance)) : 2 * _gamma * x;

    public double Gamma => _gamma;

    public double LargestVariance { get; }

    public bool IsPoint => _isPoint;

    /// <summary>Distance (Å) beyond which the short-range part is below e^{−x²} of the unscreened value.</summary>
    public double RealSpaceCutoff(double x) => x * Math.Sqrt(2 * LargestVariance + 1 / (_gamma * _gamma));

    /// <summary>The short-range part at r ≠ 0 (Å⁻¹); finite at r = 0 only for a Gaussian.</summary>
    public double ShortRange(Vector3D r)
    {
        double distance = r.Length;
        if (_isPoint) return SpecialFunctions.Erfc(_gamma * distance) / distance;
        if (_isIsotropic)
        {
            double c = _c0;
            double screened = Math.Sqrt(2 * c + 1 / (_gamma * _gamma));
            if (distance < 1e-8 * Math.Sqrt(c))
            {
                // limit r → 0 of (erf(r/√(2c)) − erf(r/s))/r
                return TwoOverSqrtPi * (1 / Math.Sqrt(2 * c) - 1 / screened);
            }

            return (SpecialFunctions.Erfc(distance / screened) - SpecialFunctions.Erfc(distance / Math.Sqrt(2 * c))) / distance;
        }

        // y = Qᵀ r in the eigenframe of C; t = γ/u maps [γ, ∞) onto (0, 1].
        double y0 = _axes[0, 0] * r.X + _axes[1, 0] * r.Y + _axes[2, 0] * r.Z;
        double y1 = _axes[0, 1] * r.X + _axes[1, 1] * r.Y + _axes[2, 1] * r.Z;
        double y2 = _axes[0, 2] * r.X + _axes[1, 2] * r.Y + _axes[2, 2] * r.Z;
        double a0 = y0 * y0, a1 = y1 * y1, a2 = y2 * y2;
        double gamma = _gamma, c0 = _c0, c1 = _c1, c2 = _c2;
        double Integrand(double u)
        {
            if (u <= 0) return 0;
            double t = gamma / u, t2 = t * t;
            double d0 = 1 + 2 * t2 * c0, d1 = 1 + 2 * t2 * c1, d2 = 1 + 2 * t2 * c2;
            double exponent = t2 * (a0 / d0 + a1 / d1 + a2 / d2);
            return Math.Exp(-exponent) / Math.Sqrt(d0 * d1 * d2) * gamma / (u * u);
        }

        // The exponent grows with t, so the integrand is at most e^{−γ² Σ a_k/(1+2γ²c_k)} det(I+2t²C)^{−1/2}, whose
        // integral is closed with the smallest eigenvalue: terms below the tolerance need no quadrature.
        double g2 = gamma * gamma;
        double bound = Math.Exp(-g2 * (a0 / (1 + 2 * g2 * c0) + a1 / (1 + 2 * g2 * c1) + a2 / (1 + 2 * g2 * c2)))
            * (c0 > 0 ? 1 / Math.Sqrt(2 * c0) - gamma / Math.Sqrt(1 + 2 * c0 * g2) : double.PositiveInfinity);
        double tolerance = QuadratureRelativeTolerance * _termScale;
        if (TwoOverSqrtPi * bound <= tolerance) return 0;
        return TwoOverSqrtPi * SpecialFunctions.Integrate(Integrand, 0, 1, tolerance);
    }

    /// <summary>The long-range part at r = 0 (Å⁻¹): the self term removed from the reciprocal sum.</summary>
    public double LongRangeAtOrigin()
    {
        if (_isPoint) return TwoOverSqrtPi * _gamma;
        if (_isIsotropic) return TwoOverSqrtPi / Math.Sqrt(2 * _c0 + 1 / (_gamma * _gamma));
        double c0 = _c0, c1 = _c1, c2 = _c2;
        double Integrand(double t)
        {
            double t2 = t * t;
            return 1 / Math.Sqrt((1 + 2 * t2 * c0) * (1 + 2 * t2 * c1) * (1 + 2 * t2 * c2));
        }

        return TwoOverSqrtPi * SpecialFunctions.Integrate(Integrand, 0, _gamma, QuadratureRelativeTolerance * _gamma);
    }

    /// <summary>The Fourier factor of the long-range part without 4π/G²: e^{−GᵀCG/2 − G²/4γ²}.</summary>
    public double ReciprocalDamping(Vector3D g)
    {
        double g2 = g.Dot(g);
        double y0 = _axes[0, 0] * g.X + _axes[1, 0] * g.Y + _axes[2, 0] * g.Z;
        double y1 = _axes[0, 1] * g.X + _axes[1, 1] * g.Y + _axes[2, 1] * g.Z;
        double y2 = _axes[0, 2] * g.X + _axes[1, 2] * g.Y + _axes[2, 2] * g.Z;
        double gcg = _c0 * y0 * y0 + _c1 * y1 * y1 + _c2 * y2 * y2;
        return Math.Exp(-0.5 * gcg - g2 / (4 * _gamma * _gamma));
    }

    /// <summary>The uniform-background term π/(Vγ²): the G → 0 limit the compensating background removes.</summary>
    public double BackgroundTerm(double volume) => Math.PI / (volume * _gamma * _gamma);
}
