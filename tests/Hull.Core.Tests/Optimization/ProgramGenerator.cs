using Hull.Core.Optimization;

namespace Hull.Core.Tests.Optimization;

/// <summary>
/// Seeded linear programs for the solver checks: random ones in general position, deliberately degenerate ones
/// (integer data with many ties, redundant and duplicated equalities, rows tight at the construction point),
/// infeasible and unbounded ones. Feasible programs are built around a point x0 inside every bound, so their
/// feasibility is known by construction.
/// </summary>
internal static class ProgramGenerator
{
    private const double Inf = double.PositiveInfinity;

    /// <summary>Real coefficients in [-3, 3], every kind of row and column bound; optimal or unbounded.</summary>
    public static LinearProgram Random(int rows, int columns, int seed)
    {
        var rng = new Random(seed);
        var a = new double[rows, columns];
        for (int i = 0; i < rows; i++) for (int j = 0; j < columns; j++) a[i, j] = rng.NextDouble() * 6 - 3;
        var x0 = Enumerable.Range(0, columns).Select(_ => rng.NextDouble() * 4 - 2).ToArray();
        var (cl, cu) = ColumnBounds(rng, x0);
        var (rl, ru) = RowBounds(rng, a, x0);
        var c = Enumerable.Range(0, columns).Select(_ => rng.NextDouble() * 4 - 2).ToArray();
        return new LinearProgram(rng.Next(2) == 0 ? ObjectiveSense.Minimize : ObjectiveSense.Maximize, c, a, rl, ru, cl, cu);
    }

    /// <summary>
    /// Integer coefficients in {-2..2} (many zeros), an integer construction point at its bounds, most rows tight
    /// there (a degenerate vertex), some rows duplicated or the sum of two others (redundant equalities), and an
    /// objective of small integers (ties between many optimal vertices).
    /// </summary>
    public static LinearProgram Degenerate(int rows, int columns, int seed)
    {
        var rng = new Random(seed);
        int baseRows = Math.Max(1, rows * 2 / 3);
        var a = new double[rows, columns];
        for (int i = 0; i < baseRows; i++)
        {
            for (int j = 0; j < columns; j++) a[i, j] = rng.Next(5) < 2 ? 0 : rng.Next(-2, 3);
        }
        // Redundant rows: copies and sums of earlier rows.
        for (int i = baseRows; i < rows; i++)
        {
            int p = rng.Next(baseRows), q = rng.Next(baseRows);
            for (int j = 0; j < columns; j++) a[i, j] = rng.Next(2) == 0 ? a[p, j] : a[p, j] + a[q, j];
        }
        var x0 = Enumerable.Range(0, columns).Select(_ => (double)rng.Next(3)).ToArray();
        var cl = new double[columns];
        var cu = new double[columns];
        for (int j = 0; j < columns; j++)
        {
            cl[j] = 0;
            cu[j] = rng.Next(3) == 0 ? Inf : 2;
        }
        var rl = new double[rows];
        var ru = new double[rows];
        for (int i = 0; i < rows; i++)
        {
            double activity = 0;
            for (int j = 0; j < columns; j++) activity += a[i, j] * x0[j];
            switch (rng.Next(4))
            {
                case 0: rl[i] = ru[i] = activity; break;
                case 1: rl[i] = -Inf; ru[i] = activity; break;
                case 2: rl[i] = activity; ru[i] = Inf; break;
                default: rl[i] = activity; ru[i] = activity + rng.Next(1, 3); break;
            }
        }
        var c = Enumerable.Range(0, columns).Select(_ => (double)rng.Next(-1, 3)).ToArray();
        return new LinearProgram(rng.Next(2) == 0 ? ObjectiveSense.Minimize : ObjectiveSense.Maximize, c, a, rl, ru, cl, cu);
    }

    /// <summary>
    /// A balanced transportation problem (supplies = demands, integers; costs from a few values): the classic
    /// degenerate program, with one redundant equality and many optimal solutions.
    /// </summary>
    public static LinearProgram Transportation(int sources, int sinks, int seed)
    {
        var rng = new Random(seed);
        var supply = Enumerable.Range(0, sources).Select(_ => (double)rng.Next(1, 4)).ToArray();
        var demand = new double[sinks];
        // Equal totals; demands split the same total into integers, so partial sums coincide often (degeneracy).
        double remaining = supply.Sum();
        for (int k = 0; k < sinks - 1; k++)
        {
            demand[k] = Math.Min(remaining, rng.Next(0, 4));
            remaining -= demand[k];
        }
        demand[^1] = remaining;
        int n = sources * sinks;
        var a = new double[sources + sinks, n];
        var b = new double[sources + sinks];
        for (int s = 0; s < sources; s++)
        {
            for (int t = 0; t < sinks; t++)
            {
                a[s, s * sinks + t] = 1;
                a[sources + t, s * sinks + t] = 1;
            }
            b[s] = supply[s];
        }
        for (int t = 0; t < sinks; t++) b[sources + t] = demand[t];
        var c = Enumerable.Range(0, n).Select(_ => (double)rng.Next(1, 4)).ToArray();
        return new LinearProgram(ObjectiveSense.Minimize, c, a, b, b, new double[n], Enumerable.Repeat(Inf, n).ToArray());
    }

    /// <summary>A random program made infeasible in one of three ways (conflicting rows, a row beyond what the boxes allow, crossing equalities).</summary>
    public static LinearProgram Infeasible(int rows, int columns, int seed)
    {
        var p = Degenerate(rows, columns, seed);
        var row = new double[columns];
        switch (seed % 3)
        {
            case 0:
            {
                // A row required to exceed an existing one's upper bound by 1: a copy of row 0 shifted.
                p.Row(0).CopyTo(row);
                double top = double.IsFinite(p.RowUpper[0]) ? p.RowUpper[0] : p.RowLower[0];
                p = p.WithRowAppended(row, -Inf, top - 1).WithRowAppended(row, top, Inf);
                break;
            }
            case 1:
            {
                // Every column boxed in [0, 2]; their sum must reach more than twice the column count.
                for (int j = 0; j < columns; j++) p = p.WithColumnBounds(j, 0, 2);
                Array.Fill(row, 1.0);
                p = p.WithRowAppended(row, 2 * columns + 0.5, Inf);
                break;
            }
            default:
            {
                // x_0 − x_1 = 1 and x_1 − x_0 = 1.
                row[0] = 1; row[1 % columns] = -1;
                p = p.WithRowAppended(row, 1, 1);
                row[0] = -1; row[1 % columns] = 1;
                p = p.WithRowAppended(row, 1, 1);
                break;
            }
        }
        return p;
    }

    /// <summary>A feasible program with an improving ray: a column that no row limits (or limits one way only), unbounded in the improving direction.</summary>
    public static LinearProgram Unbounded(int rows, int columns, int seed)
    {
        var rng = new Random(seed);
        var p = Random(rows, columns, seed);
        int j = rng.Next(columns);
        // Column j appears only in rows whose other side is open in the direction it pushes them, and its cost
        // improves as it grows: drop it from every row, open its upper bound, make it attractive.
        var a = new double[rows, columns];
        for (int i = 0; i < rows; i++) for (int k = 0; k < columns; k++) a[i, k] = k == j ? 0 : p.Coefficient(i, k);
        var c = p.Objective.ToArray();
        c[j] = p.Sense == ObjectiveSense.Minimize ? -1.5 : 1.5;
        var cl = p.ColumnLower.ToArray();
        var cu = p.ColumnUpper.ToArray();
        // Rows may have been feasible only with column j's old contribution: rebuild their bounds around x0 = 0 for j.
        cl[j] = 0;
        cu[j] = Inf;
        var x0 = Enumerable.Range(0, columns).Select(k => Mid(cl[k], cu[k])).ToArray();
        var (rl, ru) = RowBounds(rng, a, x0);
        return new LinearProgram(p.Sense, c, a, rl, ru, cl, cu);
    }

    /// <summary>
    /// Many homogeneous inequalities through the origin (integer coefficients in {-1..1}, a·x ≤ 0) with boxed
    /// columns x in [0, 1] and a profit for every column: the start x = 0 is a vertex where every row is tight, so
    /// the simplex method takes long runs of degenerate pivots there before it can move.
    /// </summary>
    public static LinearProgram Stalling(int rows, int columns, int seed)
    {
        var rng = new Random(seed);
        var a = new double[rows, columns];
        for (int i = 0; i < rows; i++) for (int j = 0; j < columns; j++) a[i, j] = rng.Next(-1, 2);
        var c = Enumerable.Range(0, columns).Select(_ => (double)rng.Next(1, 3)).ToArray();
        return new LinearProgram(ObjectiveSense.Maximize, c, a, Enumerable.Repeat(-Inf, rows).ToArray(), new double[rows],
            new double[columns], Enumerable.Repeat(1.0, columns).ToArray());
    }

    /// <summary>
    /// Beale's example, on which the largest-coefficient rule with a lowest-index ratio tie-break cycles (from
    /// memory): min −3/4 x0 + 20 x1 − 1/2 x2 + 6 x3 subject to 1/4 x0 − 8 x1 − x2 + 9 x3 ≤ 0,
    /// 1/2 x0 − 12 x1 − 1/2 x2 + 3 x3 ≤ 0, x2 ≤ 1, x ≥ 0; optimum −5/4 at x = (1, 0, 1, 0).
    /// </summary>
    public static LinearProgram BealeCycling() => new(ObjectiveSense.Minimize, [-0.75, 20, -0.5, 6],
        new double[,] { { 0.25, -8, -1, 9 }, { 0.5, -12, -0.5, 3 }, { 0, 0, 1, 0 } },
        [-Inf, -Inf, -Inf], [0, 0, 1], [0, 0, 0, 0], [Inf, Inf, Inf, Inf]);

    private static double Mid(double l, double u) =>
        double.IsFinite(l) && double.IsFinite(u) ? (l + u) / 2 : double.IsFinite(l) ? l + 0.5 : double.IsFinite(u) ? u - 0.5 : 0.0;

    private static (double[] Lower, double[] Upper) ColumnBounds(Random rng, double[] x0)
    {
        int n = x0.Length;
        var l = new double[n];
        var u = new double[n];
        for (int j = 0; j < n; j++)
        {
            double below = 0.2 + rng.NextDouble() * 2, above = 0.2 + rng.NextDouble() * 2;
            switch (rng.Next(20))
            {
                case < 12: l[j] = x0[j] - below; u[j] = x0[j] + above; break; // boxed
                case < 15: l[j] = x0[j] - below; u[j] = Inf; break; // lower only
                case < 17: l[j] = -Inf; u[j] = x0[j] + above; break; // upper only
                case < 19: l[j] = -Inf; u[j] = Inf; break; // free
                default: l[j] = u[j] = x0[j]; break; // fixed
            }
        }
        return (l, u);
    }

    private static (double[] Lower, double[] Upper) RowBounds(Random rng, double[,] a, double[] x0)
    {
        int m = a.GetLength(0), n = a.GetLength(1);
        var l = new double[m];
        var u = new double[m];
        for (int i = 0; i < m; i++)
        {
            double activity = 0;
            for (int j = 0; j < n; j++) activity += a[i, j] * x0[j];
            double slackBelow = 0.1 + rng.NextDouble(), slackAbove = 0.1 + rng.NextDouble();
            switch (rng.Next(20))
            {
                case < 6: l[i] = u[i] = activity; break; // equality
                case < 11: l[i] = -Inf; u[i] = activity + slackAbove; break; // ≤
                case < 16: l[i] = activity - slackBelow; u[i] = Inf; break; // ≥
                case < 19: l[i] = activity - slackBelow; u[i] = activity + slackAbove; break; // ranged
                default: l[i] = -Inf; u[i] = Inf; break; // free row
            }
        }
        return (l, u);
    }
}
