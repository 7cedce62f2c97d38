using System.Numerics;

namespace Hull.Core.Geometry;

/// <summary>
/// The exact sign of the determinant of a small integer matrix (fraction-free Bareiss elimination), used where
/// floating point cannot decide whether points of the composition simplex are affinely independent.
/// </summary>
internal static class ExactDeterminant
{
    /// <summary>Sign (-1, 0, 1) of det(m) for a row-major size x size matrix.</summary>
    public static int Sign(ReadOnlySpan<long> matrix, int size)
    {
        try
        {
            var a = new Int128[size * size];
            for (int i = 0; i < a.Length; i++) a[i] = matrix[i];
            return Bareiss(a, size, Int128.Zero, Int128.One);
        }
        catch (OverflowException)
        {
            var b = new BigInteger[size * size];
            for (int i = 0; i < b.Length; i++) b[i] = matrix[i];
            return Bareiss(b, size, BigInteger.Zero, BigInteger.One);
        }
    }

    private static int Bareiss<T>(T[] a, int n, T zero, T one) where T : INumber<T>
    {
        int sign = 1;
        T previousPivot = one;
        for (int k = 0; k < n; k++)
        {
            int pivotRow = -1;
            for (int r = k; r < n; r++)
            {
                if (a[r * n + k] != zero) { pivotRow = r; break; }
            }
            if (pivotRow < 0) return 0;
            if (pivotRow != k)
            {
                for (int c = 0; c < n; c++) (a[k * n + c], a[pivotRow * n + c]) = (a[pivotRow * n + c], a[k * n + c]);
                sign = -sign;
            }
            T pivot = a[k * n + k];
            for (int i = k + 1; i < n; i++)
            {
                for (int j = k + 1; j < n; j++)
                {
                    // Exact division: Bareiss guarantees previousPivot divides this product difference.
                    a[i * n + j] = checked(a[i * n + j] * pivot - a[i * n + k] * a[k * n + j]) / previousPivot;
                }
                a[i * n + k] = zero;
            }
            previousPivot = pivot;
        }
        return sign * T.Sign(a[(n - 1) * n + (n - 1)]);
    }
}
