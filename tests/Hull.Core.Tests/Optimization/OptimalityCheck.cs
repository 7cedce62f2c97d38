using Hull.Core.Optimization;

namespace Hull.Core.Tests.Optimization;

/// <summary>
/// Checks a result against the program itself, without trusting the solver's own bookkeeping: the primal values
/// satisfy every bound, the duals satisfy the dual constraints (a dual may be non-zero only on a side with a
/// finite bound, with the sign that side requires), complementary slackness holds (a non-zero dual only where the
/// activity sits on that bound), the reported reduced costs are c − Aᵀy, and the dual objective equals the primal
/// one (common practice: the optimality conditions of linear programming).
/// </summary>
internal static class OptimalityCheck
{
    /// <summary>The brief's accuracy for feasibility, slackness and objectives, on data of order 1–10.</summary>
    public const double Tolerance = 1e-9;

    /// <summary>Problems found, empty when the result is a verified optimum.</summary>
    public static List<string> Problems(LinearProgram p, LinearProgramResult r)
    {
        var problems = new List<string>();
        int m = p.RowCount, n = p.ColumnCount;
        if (r.Status != LinearProgramStatus.Optimal) { problems.Add($"status {r.Status}: {r.Message}"); return problems; }
        if (!r.IsPrimalFeasible || !r.AreDualsValid) problems.Add("an optimum must flag primal values and duals valid");
        double s = p.Sense == ObjectiveSense.Minimize ? 1 : -1;
        var x = r.ColumnValues;
        double objective = 0;
        for (int j = 0; j < n; j++) objective += p.Objective[j] * x[j];
        if (Math.Abs(objective - r.ObjectiveValue) > Tolerance * (1 + Math.Abs(objective))) problems.Add($"objective {r.ObjectiveValue:R} but c·x = {objective:R}");
        double dualObjective = 0;
        for (int i = 0; i < m; i++)
        {
            double activity = 0;
            var row = p.Row(i);
            for (int j = 0; j < n; j++) activity += row[j] * x[j];
            CheckSide(problems, $"row {i}", activity, p.RowLower[i], p.RowUpper[i], s * r.RowDuals[i], ref dualObjective, r.RowDuals[i]);
        }
        for (int j = 0; j < n; j++)
        {
            double d = p.Objective[j];
            for (int i = 0; i < m; i++) d -= r.RowDuals[i] * p.Coefficient(i, j);
            if (Math.Abs(d - r.ReducedCosts[j]) > Tolerance) problems.Add($"column {j}: reduced cost {r.ReducedCosts[j]:R} but c − Aᵀy = {d:R}");
            CheckSide(problems, $"column {j}", x[j], p.ColumnLower[j], p.ColumnUpper[j], s * d, ref dualObjective, d);
        }
        if (Math.Abs(dualObjective - objective) > Tolerance * (1 + Math.Abs(objective)))
        {
            problems.Add($"dual objective {dualObjective:R} differs from the primal {objective:R}");
        }
        return problems;
    }

    /// <param name="minDual">The dual in minimisation form: positive pushes against the lower bound, negative against the upper.</param>
    private static void CheckSide(List<string> problems, string where, double value, double lower, double upper, double minDual,
        ref double dualObjective, double dual)
    {
        if (value < lower - Tolerance || value > upper + Tolerance) problems.Add($"{where}: value {value:R} outside [{lower:R}, {upper:R}]");
        if (minDual > Tolerance)
        {
            if (!double.IsFinite(lower)) problems.Add($"{where}: dual {dual:R} needs a lower bound there is not (dual infeasible)");
            else if (Math.Abs(value - lower) > Tolerance) problems.Add($"{where}: dual {dual:R} but value {value:R} is off its lower bound {lower:R} (slackness)");
            else dualObjective += dual * lower;
        }
        else if (minDual < -Tolerance)
        {
            if (!double.IsFinite(upper)) problems.Add($"{where}: dual {dual:R} needs an upper bound there is not (dual infeasible)");
            else if (Math.Abs(value - upper) > Tolerance) problems.Add($"{where}: dual {dual:R} but value {value:R} is off its upper bound {upper:R} (slackness)");
            else dualObjective += dual * upper;
        }
        else
        {
            // A dual within the tolerance of zero: its bound does not matter to the dual objective beyond rounding.
            dualObjective += dual * value;
        }
    }
}
