using Hull.Core.Chemistry;
using Hull.Core.Thermo;

namespace Hull.Core.Tests.Thermo;

/// <summary>
/// The exact solver behind balanced reactions and end-member expansions, on systems built from a known solution:
/// entries with denominators near 2^31 make the elimination's intermediates far wider than 64 bits while the
/// answer stays a small fraction.
/// </summary>
public sealed class ExactLinearAlgebraTests
{
    [Fact]
    public void Wide_intermediates_give_the_exact_small_solution()
    {
        long[] denominators = [2_147_483_647, 2_147_483_629, 2_147_483_587, 2_147_483_579];
        long[,] numerators =
        {
            { 1_999_999_973, 3, 1_234_567_891 },
            { 7, 2_000_000_011, 5 },
            { 1_500_000_001, 1_700_000_003, 11 },
            { 13, 17, 1_900_000_043 },
        };
        Rational[] known = [new(1, 2), new(1, 3), new(1, 6)];
        var columns = new Rational[3][];
        var target = new Rational[4];
        for (int j = 0; j < 3; j++)
        {
            columns[j] = new Rational[4];
        }

        for (int e = 0; e < 4; e++)
        {
            // b_e = (Σ_j n_ej x_j) / d_e, formed without overflow: the numerators share the denominator 6.
            long sixTimes = 0;
            for (int j = 0; j < 3; j++)
            {
                columns[j][e] = new Rational(numerators[e, j], denominators[e]);
                sixTimes += numerators[e, j] * (6 / known[j].Denominator) * known[j].Numerator;
            }

            target[e] = new Rational(sixTimes, 6 * denominators[e]);
        }

        Assert.Equal(known, ExactLinearAlgebra.Solve(columns, target)!);
        Assert.Equal(3, ExactLinearAlgebra.Rank(columns));

        // Off the span by one unit in the last place of one equation: no solution.
        target[3] += new Rational(1, denominators[3]);
        Assert.Null(ExactLinearAlgebra.Solve(columns, target));

        // A column that is a combination of the others: not unique, so no answer.
        Rational[] dependent = columns[0].Zip(columns[1], (a, b) => a + b).ToArray();
        Assert.Equal(2, ExactLinearAlgebra.Rank([columns[0], columns[1], dependent]));
        Assert.Null(ExactLinearAlgebra.Solve([columns[0], columns[1], dependent], columns[2]));
    }

    [Fact]
    public void One_column_is_a_checked_ratio()
    {
        Rational[] column = [new(2, 3), Rational.Zero, new(4, 5)];
        Assert.Equal([new Rational(3, 2)], ExactLinearAlgebra.Solve([column], [Rational.One, Rational.Zero, new(6, 5)])!);
        Assert.Null(ExactLinearAlgebra.Solve([column], [Rational.One, new(1, 7), new(6, 5)]));
        Assert.Null(ExactLinearAlgebra.Solve([[Rational.Zero, Rational.Zero]], [Rational.One, Rational.Zero]));
    }
}
