using System.Numerics;
using Hull.Core.Chemistry;

namespace Hull.Core.Thermo;

/// <summary>
/// Exact elimination on small dense systems of fractions: ranks of composition vectors and the unique coefficients
/// that write a composition as a combination of others. Exact, so a balanced reaction or an end-member expansion is
/// decided without a tolerance.
/// </summary>
/// <remarks>
/// Each equation is scaled to integers first (that changes neither rank nor solution), and elimination is
/// fraction-free (each step divides exactly by the previous pivot), in arbitrary-size integers: intermediates can
/// outgrow 64 bits even when the answer fits a <see cref="Rational"/>.
/// </remarks>
internal static class ExactLinearAlgebra
{
    /// <summary>Rank of the given vectors (all of the same length).</summary>
    public static int Rank(IReadOnlyList<Rational[]> vectors)
    {
        if (vectors.Count == 0)
        {
            return 0;
        }

        BigInteger[][] rows = vectors.Select(IntegerRow).ToArray();
        return Eliminate(rows, rows[0].Length, out _);
    }

    /// <summary>
    /// The coefficients c with sum_j c_j columns[j] = target, or null when the target is not in the span of the
    /// columns, or when the columns are linearly dependent (the answer would not be unique).
    /// </summary>
    /// <exception cref="OverflowException">When a coefficient does not fit in a 64-bit <see cref="Rational"/>.</exception>
    public static Rational[]? Solve(IReadOnlyList<Rational[]> columns, Rational[] target)
    {
        int unknowns = columns.Count;
        if (unknowns == 1)
        {
            // One column (a phase decomposing into itself, the most common case): a ratio, checked on every row.
            return SolveOne(columns[0], target);
        }

        int equations = target.Length;
        var rows = new BigInteger[equations][];
        var augmented = new Rational[unknowns + 1];
        for (int e = 0; e < equations; e++)
        {
            for (int j = 0; j < unknowns; j++)
            {
                augmented[j] = columns[j][e];
            }

            augmented[unknowns] = target[e];
            rows[e] = IntegerRow(augmented);
        }

        int rank = Eliminate(rows, unknowns, out int[] pivotColumns);
        if (rank < unknowns)
        {
            return null;
        }

        // Rows left without a pivot read 0 = b: the target lies in the span only when every such b is 0.
        for (int r = rank; r < equations; r++)
        {
            if (!rows[r][unknowns].IsZero)
            {
                return null;
            }
        }

        // Every column has a pivot, in order, so rows 0..n-1 are upper triangular. By Cramer's rule the solution
        // times the last pivot (the determinant of the pivot rows) is integral: back-substitute in integers.
        BigInteger determinant = rows[unknowns - 1][unknowns - 1];
        var scaled = new BigInteger[unknowns];
        for (int j = unknowns - 1; j >= 0; j--)
        {
            BigInteger sum = rows[j][unknowns] * determinant;
            for (int k = j + 1; k < unknowns; k++)
            {
                sum -= rows[j][k] * scaled[k];
            }

            scaled[j] = sum / rows[j][pivotColumns[j]];
        }

        var solution = new Rational[unknowns];
        for (int j = 0; j < unknowns; j++)
        {
            solution[j] = ToRational(scaled[j], determinant);
        }

        return solution;
    }

    private static Rational[]? SolveOne(Rational[] column, Rational[] target)
    {
        int pivot = Array.FindIndex(column, v => !v.IsZero);
        if (pivot < 0) return null;

        // c = t_p / a_p; the check a_e c = t_e is made on cross products, which need more than 64 bits.
        BigInteger numerator = (BigInteger)target[pivot].Numerator * column[pivot].Denominator;
        BigInteger denominator = (BigInteger)target[pivot].Denominator * column[pivot].Numerator;
        for (int e = 0; e < target.Length; e++)
        {
            BigInteger left = (BigInteger)column[e].Numerator * numerator * target[e].Denominator;
            BigInteger right = (BigInteger)target[e].Numerator * column[e].Denominator * denominator;
            if (left != right) return null;
        }

        return [ToRational(numerator, denominator)];
    }

    /// <summary>
    /// Fraction-free forward elimination over the first <paramref name="pivotColumnCount"/> columns (the others
    /// follow along); returns the rank and, per pivot row, its pivot column.
    /// </summary>
    private static int Eliminate(BigInteger[][] rows, int pivotColumnCount, out int[] pivotColumns)
    {
        int width = rows[0].Length;
        var pivots = new List<int>();
        BigInteger previous = BigInteger.One;
        int rank = 0;
        for (int column = 0; column < pivotColumnCount && rank < rows.Length; column++)
        {
            int pivot = -1;
            for (int r = rank; r < rows.Length; r++)
            {
                if (!rows[r][column].IsZero)
                {
                    pivot = r;
                    break;
                }
            }

            if (pivot < 0)
            {
                continue;
            }

            (rows[rank], rows[pivot]) = (rows[pivot], rows[rank]);
            BigInteger[] pivotRow = rows[rank];
            for (int r = rank + 1; r < rows.Length; r++)
            {
                BigInteger[] row = rows[r];
                BigInteger factor = row[column];
                for (int c = column + 1; c < width; c++)
                {
                    // Exact: every entry is a minor of the original integer rows.
                    row[c] = (pivotRow[column] * row[c] - factor * pivotRow[c]) / previous;
                }

                row[column] = BigInteger.Zero;
            }

            previous = pivotRow[column];
            pivots.Add(column);
            rank++;
        }

        pivotColumns = pivots.ToArray();
        return rank;
    }

    /// <summary>The row times the least common multiple of its denominators: integers in the same ratios.</summary>
    private static BigInteger[] IntegerRow(Rational[] values)
    {
        BigInteger lcm = BigInteger.One;
        foreach (Rational v in values)
        {
            lcm = lcm / BigInteger.GreatestCommonDivisor(lcm, v.Denominator) * v.Denominator;
        }

        var row = new BigInteger[values.Length];
        for (int k = 0; k < row.Length; k++)
        {
            row[k] = values[k].Numerator * (lcm / values[k].Denominator);
        }

        return row;
    }

    /// <exception cref="OverflowException">When the reduced fraction does not fit in 64 bits.</exception>
    private static Rational ToRational(BigInteger numerator, BigInteger denominator)
    {
        if (denominator.Sign < 0)
        {
            numerator = -numerator;
            denominator = -denominator;
        }

        BigInteger gcd = BigInteger.GreatestCommonDivisor(numerator, denominator);
        if (!gcd.IsZero && !gcd.IsOne)
        {
            numerator /= gcd;
            denominator /= gcd;
        }

        if (BigInteger.Abs(numerator) > long.MaxValue || denominator > long.MaxValue)
        {
            throw new OverflowException($"The exact coefficient {numerator}/{denominator} does not fit in a 64-bit fraction.");
        }

        return new Rational((long)numerator, (long)denominator);
    }
}
