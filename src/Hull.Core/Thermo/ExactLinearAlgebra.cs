namespace Hull.Core.Thermo;

/// <summary>
/// Exact Gaussian elimination on small dense systems of <see cref="BigFraction"/>: ranks of composition vectors and
/// the unique coefficients that write a composition as a combination of others. Exact, so a balanced reaction or an
/// end-member expansion is decided without a tolerance.
/// </summary>
internal static class ExactLinearAlgebra
{
    /// <summary>Rank of the given vectors (all of the same length).</summary>
    public static int Rank(IReadOnlyList<BigFraction[]> vectors)
    {
        if (vectors.Count == 0)
        {
            return 0;
        }

        int length = vectors[0].Length;
        var rows = new BigFraction[vectors.Count][];
        for (int i = 0; i < vectors.Count; i++)
        {
            rows[i] = (BigFraction[])vectors[i].Clone();
        }

        int rank = 0;
        for (int column = 0; column < length && rank < rows.Length; column++)
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
            for (int r = rank + 1; r < rows.Length; r++)
            {
                if (rows[r][column].IsZero)
                {
                    continue;
                }

                BigFraction factor = rows[r][column] / rows[rank][column];
                for (int c = column; c < length; c++)
                {
                    rows[r][c] -= factor * rows[rank][c];
                }
            }

            rank++;
        }

        return rank;
    }

    private static BigFraction[]? SolveOne(BigFraction[] column, BigFraction[] target)
    {
        int pivot = Array.FindIndex(column, v => !v.IsZero);
        if (pivot < 0) return null;
        BigFraction c = target[pivot] / column[pivot];
        for (int e = 0; e < target.Length; e++)
        {
            if (column[e] * c != target[e]) return null;
        }
        return [c];
    }

    /// <summary>
    /// The coefficients c with sum_j c_j columns[j] = target, or null when the target is not in the span of the
    /// columns, or when the columns are linearly dependent (the answer would not be unique).
    /// </summary>
    public static BigFraction[]? Solve(IReadOnlyList<BigFraction[]> columns, BigFraction[] target)
    {
        int unknowns = columns.Count;
        if (unknowns == 1)
        {
            // One column (a phase decomposing into itself, the most common case): a ratio, checked on every row.
            return SolveOne(columns[0], target);
        }

        int equations = target.Length;
        var matrix = new BigFraction[equations][];
        for (int e = 0; e < equations; e++)
        {
            matrix[e] = new BigFraction[unknowns + 1];
            for (int j = 0; j < unknowns; j++)
            {
                matrix[e][j] = columns[j][e];
            }

            matrix[e][unknowns] = target[e];
        }

        var pivotRowOfColumn = new int[unknowns];
        int row = 0;
        for (int j = 0; j < unknowns; j++)
        {
            int pivot = -1;
            for (int r = row; r < equations; r++)
            {
                if (!matrix[r][j].IsZero)
                {
                    pivot = r;
                    break;
                }
            }

            if (pivot < 0)
            {
                return null;
            }

            (matrix[row], matrix[pivot]) = (matrix[pivot], matrix[row]);
            for (int r = 0; r < equations; r++)
            {
                if (r == row || matrix[r][j].IsZero)
                {
                    continue;
                }

                BigFraction factor = matrix[r][j] / matrix[row][j];
                for (int c = j; c <= unknowns; c++)
                {
                    matrix[r][c] -= factor * matrix[row][c];
                }
            }

            pivotRowOfColumn[j] = row;
            row++;
        }

        // Rows left without a pivot must read 0 = 0, otherwise the target lies outside the span.
        for (int r = row; r < equations; r++)
        {
            if (!matrix[r][unknowns].IsZero)
            {
                return null;
            }
        }

        var solution = new BigFraction[unknowns];
        for (int j = 0; j < unknowns; j++)
        {
            int r = pivotRowOfColumn[j];
            solution[j] = matrix[r][unknowns] / matrix[r][j];
        }

        return solution;
    }
}
