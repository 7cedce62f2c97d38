namespace Hull.Core.Defects;

/// <summary>
/// The change of frame r' = ε^{−1/2} r that turns Poisson's equation ∇·(ε∇φ) = −4πρ into the vacuum one: the cell
/// and the model charge's covariance are mapped (S' = ε^{−1/2} S ε^{−1/2}), energies and potentials are the
/// vacuum ones divided by √det ε.
/// </summary>
internal sealed class VacuumFrame
{
    public VacuumFrame(LatticeCell cell, DielectricTensor dielectric, ModelCharge charge)
    {
        Map = dielectric.InverseSquareRoot;
        Cell = cell.Transformed(Map);
        Covariance = Map * charge.Covariance * Map;
        ScreeningFactor = 1 / Math.Sqrt(dielectric.Determinant);
    }

    public Matrix3 Map { get; }

    public LatticeCell Cell { get; }

    public Matrix3 Covariance { get; }

    /// <summary>1 / √det ε.</summary>
    public double ScreeningFactor { get; }

    public double DefaultSplitting => Math.Sqrt(Math.PI) / Math.Cbrt(Cell.VolumeCubicAngstrom);

    /// <summary>Lattice vectors of the mapped cell within <paramref name="cutoff"/> (Å), the origin excluded.</summary>
    public List<Vector3D> RealVectors(double cutoff) => Enumerate(Cell.A, Cell.B, Cell.C,
        [(int)Math.Ceiling(cutoff / Cell.PlaneSpacing(0)), (int)Math.Ceiling(cutoff / Cell.PlaneSpacing(1)), (int)Math.Ceiling(cutoff / Cell.PlaneSpacing(2))],
        cutoff, includeOrigin: false);

    /// <summary>Reciprocal vectors of the mapped cell within <paramref name="cutoff"/> (Å⁻¹), the origin excluded.</summary>
    public List<Vector3D> ReciprocalVectors(double cutoff)
    {
        int[] bounds = [.. Enumerable.Range(0, 3).Select(i => (int)Math.Ceiling(cutoff * Cell.Vector(i).Length / (2 * Math.PI)))];
        return Enumerate(Cell.ReciprocalA, Cell.ReciprocalB, Cell.ReciprocalC, bounds, cutoff, includeOrigin: false);
    }

    private static List<Vector3D> Enumerate(Vector3D a, Vector3D b, Vector3D c, int[] bounds, double cutoff, bool includeOrigin)
    {
        var result = new List<Vector3D>();
        double cutoff2 = cutoff * cutoff;
        for (int i = -bounds[0]; i <= bounds[0]; i++)
        {
            for (int j = -bounds[1]; j <= bounds[1]; j++)
            {
                for (int k = -bounds[2]; k <= bounds[2]; k++)
                {
                    if (!includeOrigin && i == 0 && j == 0 && k == 0) continue;
                    var v = i * a + j * b + k * c;
                    if (v.Dot(v) <= cutoff2) result.Add(v);
                }
            }
        }

        return result;
    }
}
