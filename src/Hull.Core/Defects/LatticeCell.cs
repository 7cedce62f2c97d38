namespace Hull.Core.Defects;

/// <summary>
/// A periodic cell: three lattice vectors (Å, Cartesian), any shape (triclinic included). Immutable; the factory
/// refuses a singular or non-finite lattice.
/// </summary>
public sealed class LatticeCell
{
    private LatticeCell(Vector3D a, Vector3D b, Vector3D c)
    {
        A = a;
        B = b;
        C = c;
        VolumeCubicAngstrom = Math.Abs(a.Dot(b.Cross(c)));
        double scale = 2 * Math.PI / a.Dot(b.Cross(c));
        ReciprocalA = scale * b.Cross(c);
        ReciprocalB = scale * c.Cross(a);
        ReciprocalC = scale * a.Cross(b);
    }

    /// <summary>A cell from three lattice vectors in Å; <paramref name="field"/> names where they came from, for the error message.</summary>
    public static LatticeCell Create(Vector3D a, Vector3D b, Vector3D c, string field = "lattice_vectors_angstrom")
    {
        if (!a.IsFinite || !b.IsFinite || !c.IsFinite)
        {
            throw new DefectInputException(field, "lattice vectors must be finite numbers");
        }

        double product = a.Length * b.Length * c.Length;
        double volume = Math.Abs(a.Dot(b.Cross(c)));
        if (product == 0 || volume <= DefectTolerances.SingularLatticeVolumeRatio * product)
        {
            throw new DefectInputException(field,
                $"the lattice is singular: volume {volume:G6} Å³ for vector lengths {a.Length:G6}, {b.Length:G6}, {c.Length:G6} Å (the vectors are coplanar or zero)");
        }

        return new LatticeCell(a, b, c);
    }

    /// <summary>A cell from a row-major matrix whose rows are the lattice vectors.</summary>
    public static LatticeCell FromRows(Matrix3 rows, string field = "lattice_vectors_angstrom") =>
        Create(rows.Row(0), rows.Row(1), rows.Row(2), field);

    public Vector3D A { get; }

    public Vector3D B { get; }

    public Vector3D C { get; }

    public Vector3D Vector(int axis) => axis switch { 0 => A, 1 => B, 2 => C, _ => throw new ArgumentOutOfRangeException(nameof(axis)) };

    /// <summary>Reciprocal vector b_i with a_i · b_j = 2π δ_ij (Å⁻¹).</summary>
    public Vector3D Reciprocal(int axis) => axis switch { 0 => ReciprocalA, 1 => ReciprocalB, 2 => ReciprocalC, _ => throw new ArgumentOutOfRangeException(nameof(axis)) };

    public Vector3D ReciprocalA { get; }

    public Vector3D ReciprocalB { get; }

    public Vector3D ReciprocalC { get; }

    public double VolumeCubicAngstrom { get; }

    /// <summary>The lattice vectors as the rows of a matrix.</summary>
    public Matrix3 Rows => Matrix3.FromRows(A, B, C);

    /// <summary>Cartesian position (Å) of fractional coordinates.</summary>
    public Vector3D ToCartesian(Vector3D fractional) => fractional.X * A + fractional.Y * B + fractional.Z * C;

    /// <summary>Spacing (Å) between the lattice planes normal to reciprocal axis i.</summary>
    public double PlaneSpacing(int axis) => 2 * Math.PI / Reciprocal(axis).Length;

    /// <summary>This cell with every lattice vector mapped by <paramref name="map"/> (a linear change of frame).</summary>
    public LatticeCell Transformed(Matrix3 map, string field = "lattice_vectors_angstrom") =>
        Create(map.Times(A), map.Times(B), map.Times(C), field);

    /// <summary>The shortest non-zero lattice vector's length (Å), by search over a box that provably holds it.</summary>
    public double ShortestVectorLength()
    {
        double best = Math.Min(A.Length, Math.Min(B.Length, C.Length));
        int na = (int)Math.Ceiling(best / PlaneSpacing(0));
        int nb = (int)Math.Ceiling(best / PlaneSpacing(1));
        int nc = (int)Math.Ceiling(best / PlaneSpacing(2));
        for (int i = -na; i <= na; i++)
        {
            for (int j = -nb; j <= nb; j++)
            {
                for (int k = -nc; k <= nc; k++)
                {
                    if (i == 0 && j == 0 && k == 0) continue;
                    double length = (i * A + j * B + k * C).Length;
                    if (length < best) best = length;
                }
            }
        }

        return best;
    }

    /// <summary>The Cartesian vector from <paramref name="from"/> to the nearest image of <paramref name="to"/> (fractional inputs).</summary>
    public Vector3D MinimumImage(Vector3D from, Vector3D to)
    {
        var d = to - from;
        var wrapped = new Vector3D(d.X - Math.Round(d.X), d.Y - Math.Round(d.Y), d.Z - Math.Round(d.Z));
        Vector3D best = ToCartesian(wrapped);
        double bestLength = best.Length;
        // Rounding fractional components is not always nearest in a skewed cell; the neighbours settle it.
        for (int i = -1; i <= 1; i++)
        {
            for (int j = -1; j <= 1; j++)
            {
                for (int k = -1; k <= 1; k++)
                {
                    var candidate = ToCartesian(new Vector3D(wrapped.X + i, wrapped.Y + j, wrapped.Z + k));
                    double length = candidate.Length;
                    if (length < bestLength)
                    {
                        best = candidate;
                        bestLength = length;
                    }
                }
            }
        }

        return best;
    }
}
