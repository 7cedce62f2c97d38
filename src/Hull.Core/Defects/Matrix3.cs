namespace Hull.Core.Defects;

/// <summary>An immutable real 3×3 matrix, row-major: <c>M[i, j]</c> is row i, column j.</summary>
public sealed class Matrix3
{
    private readonly double[] _m;

    private Matrix3(double[] m) => _m = m;

    /// <summary>A matrix from its rows (three rows of three numbers).</summary>
    public static Matrix3 FromRows(IReadOnlyList<IReadOnlyList<double>> rows)
    {
        if (rows.Count != 3 || rows.Any(r => r.Count != 3))
        {
            throw new ArgumentException("a 3×3 matrix needs three rows of three numbers");
        }

        var m = new double[9];
        for (int i = 0; i < 3; i++)
        {
            for (int j = 0; j < 3; j++) m[3 * i + j] = rows[i][j];
        }

        return new Matrix3(m);
    }

    public static Matrix3 FromRows(Vector3D r0, Vector3D r1, Vector3D r2) =>
        new([r0.X, r0.Y, r0.Z, r1.X, r1.Y, r1.Z, r2.X, r2.Y, r2.Z]);

    public static Matrix3 Diagonal(double a, double b, double c) => new([a, 0, 0, 0, b, 0, 0, 0, c]);

    public static Matrix3 Identity { get; } = Diagonal(1, 1, 1);

    public double this[int i, int j] => _m[3 * i + j];

    public Vector3D Row(int i) => new(_m[3 * i], _m[3 * i + 1], _m[3 * i + 2]);

    public bool IsFinite => _m.All(double.IsFinite);

    public double Determinant =>
        _m[0] * (_m[4] * _m[8] - _m[5] * _m[7])
        - _m[1] * (_m[3] * _m[8] - _m[5] * _m[6])
        + _m[2] * (_m[3] * _m[7] - _m[4] * _m[6]);

    public double Trace => _m[0] + _m[4] + _m[8];

    public Matrix3 Transpose() => new([_m[0], _m[3], _m[6], _m[1], _m[4], _m[7], _m[2], _m[5], _m[8]]);

    /// <summary>The inverse by cofactors; the caller has checked that the matrix is far from singular.</summary>
    public Matrix3 Inverse()
    {
        double det = Determinant;
        double[] c =
        [
            _m[4] * _m[8] - _m[5] * _m[7], _m[2] * _m[7] - _m[1] * _m[8], _m[1] * _m[5] - _m[2] * _m[4],
            _m[5] * _m[6] - _m[3] * _m[8], _m[0] * _m[8] - _m[2] * _m[6], _m[2] * _m[3] - _m[0] * _m[5],
            _m[3] * _m[7] - _m[4] * _m[6], _m[1] * _m[6] - _m[0] * _m[7], _m[0] * _m[4] - _m[1] * _m[3],
        ];
        for (int k = 0; k < 9; k++) c[k] /= det;
        return new Matrix3(c);
    }

    public static Matrix3 operator *(Matrix3 a, Matrix3 b)
    {
        var m = new double[9];
        for (int i = 0; i < 3; i++)
        {
            for (int j = 0; j < 3; j++)
            {
                m[3 * i + j] = a[i, 0] * b[0, j] + a[i, 1] * b[1, j] + a[i, 2] * b[2, j];
            }
        }

        return new Matrix3(m);
    }

    public static Matrix3 operator +(Matrix3 a, Matrix3 b) => new([.. a._m.Zip(b._m, (x, y) => x + y)]);

    public static Matrix3 operator *(double s, Matrix3 a) => new([.. a._m.Select(v => s * v)]);

    public Vector3D Times(Vector3D v) =>
        new(_m[0] * v.X + _m[1] * v.Y + _m[2] * v.Z, _m[3] * v.X + _m[4] * v.Y + _m[5] * v.Z, _m[6] * v.X + _m[7] * v.Y + _m[8] * v.Z);

    /// <summary>vᵀ M v.</summary>
    public double QuadraticForm(Vector3D v) => v.Dot(Times(v));

    /// <summary>Largest |M[i,j] − M[j,i]| relative to the largest entry (0 for a symmetric matrix).</summary>
    public double RelativeAsymmetry()
    {
        double scale = _m.Max(Math.Abs);
        if (scale == 0) return 0;
        double worst = Math.Max(Math.Abs(_m[1] - _m[3]), Math.Max(Math.Abs(_m[2] - _m[6]), Math.Abs(_m[5] - _m[7])));
        return worst / scale;
    }

    /// <summary>
    /// Eigenvalues (ascending) and orthonormal eigenvectors (the columns of the returned matrix) of a symmetric
    /// matrix, by cyclic Jacobi rotations: exact to rounding for 3×3 and free of the closed form's loss of
    /// accuracy at nearly equal eigenvalues.
    /// </summary>
    public (Vector3D Values, Matrix3 Vectors) SymmetricEigen()
    {
        var a = new double[3, 3];
        var v = new double[3, 3];
        for (int i = 0; i < 3; i++)
        {
            for (int j = 0; j < 3; j++)
            {
                a[i, j] = 0.5 * (this[i, j] + this[j, i]);
                v[i, j] = i == j ? 1 : 0;
            }
        }

        for (int sweep = 0; sweep < 50; sweep++)
        {
            double off = a[0, 1] * a[0, 1] + a[0, 2] * a[0, 2] + a[1, 2] * a[1, 2];
            double diag = a[0, 0] * a[0, 0] + a[1, 1] * a[1, 1] + a[2, 2] * a[2, 2];
            if (off <= 1e-32 * diag || off == 0) break;
            for (int p = 0; p < 2; p++)
            {
                for (int q = p + 1; q < 3; q++)
                {
                    if (a[p, q] == 0) continue;
                    double theta = (a[q, q] - a[p, p]) / (2 * a[p, q]);
                    double t = Math.Sign(theta) / (Math.Abs(theta) + Math.Sqrt(theta * theta + 1));
                    if (theta == 0) t = 1;
                    double c = 1 / Math.Sqrt(t * t + 1), s = t * c;
                    for (int k = 0; k < 3; k++)
                    {
                        double akp = a[k, p], akq = a[k, q];
                        a[k, p] = c * akp - s * akq;
                        a[k, q] = s * akp + c * akq;
                    }

                    for (int k = 0; k < 3; k++)
                    {
                        double apk = a[p, k], aqk = a[q, k];
                        a[p, k] = c * apk - s * aqk;
                        a[q, k] = s * apk + c * aqk;
                    }

                    for (int k = 0; k < 3; k++)
                    {
                        double vkp = v[k, p], vkq = v[k, q];
                        v[k, p] = c * vkp - s * vkq;
                        v[k, q] = s * vkp + c * vkq;
                    }
                }
            }
        }

        int[] order = [.. Enumerable.Range(0, 3).OrderBy(i => a[i, i])];
        var values = new Vector3D(a[order[0], order[0]], a[order[1], order[1]], a[order[2], order[2]]);
        var m = new double[9];
        for (int i = 0; i < 3; i++)
        {
            for (int j = 0; j < 3; j++) m[3 * i + j] = v[i, order[j]];
        }

        return (values, new Matrix3(m));
    }

    /// <summary>f(M) = V f(Λ) Vᵀ for a symmetric matrix, e.g. its inverse square root.</summary>
    public Matrix3 SymmetricFunction(Func<double, double> f)
    {
        var (values, vectors) = SymmetricEigen();
        double[] fl = [f(values.X), f(values.Y), f(values.Z)];
        var m = new double[9];
        for (int i = 0; i < 3; i++)
        {
            for (int j = 0; j < 3; j++)
            {
                double sum = 0;
                for (int k = 0; k < 3; k++) sum += vectors[i, k] * fl[k] * vectors[j, k];
                m[3 * i + j] = sum;
            }
        }

        return new Matrix3(m);
    }

    public double[][] ToRows() => [[_m[0], _m[1], _m[2]], [_m[3], _m[4], _m[5]], [_m[6], _m[7], _m[8]]];
}
