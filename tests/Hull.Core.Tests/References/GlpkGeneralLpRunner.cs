using System.Globalization;
using System.Text;
using Hull.Core.Optimization;

namespace Hull.Core.Tests.References;

/// <summary>
/// General LP reference through glpsol (Debian glpk-utils, GLPK 5.0): each program is written as a MathProg model
/// and solved by <c>glpsol --math MODEL -w SOLUTION --xcheck --nopresol</c> (no presolver, whose "no dual feasible
/// solution" would not say whether the program is infeasible or unbounded), the final basis re-solved in exact rational
/// arithmetic. The verdict is read from glpsol's console lines, the values from its plain-text solution file
/// ("i ROW STATUS PRIMAL DUAL" / "j COLUMN STATUS PRIMAL DUAL", the objective as row 1).
/// </summary>
public static class GlpkGeneralLpRunner
{

    public static GeneralLpAnswer Solve(LinearProgram program)
    {
        using var scratch = new ScratchFolder("glpk-general");
        string model = scratch.File("program.mod");
        string solution = scratch.File("solution.txt");
        var emittedRows = new List<int>();
        File.WriteAllText(model, Model(program, emittedRows));
        var run = ToolProcess.Run("glpsol", ["--math", model, "-w", solution, "--xcheck", "--nopresol"], scratch.Path, "glpk-utils");
        var lines = run.StandardOutput.Split('\n', StringSplitOptions.TrimEntries);
        // glpsol 5.0 console verdicts: "LP HAS NO PRIMAL FEASIBLE SOLUTION" (presolver) or "PROBLEM HAS NO PRIMAL
        // FEASIBLE SOLUTION" (simplex); likewise "... UNBOUNDED ..."; "OPTIMAL LP SOLUTION FOUND", and with
        // --xcheck "OPTIMAL SOLUTION FOUND" after the exact re-solve.
        if (lines.Any(l => l.Contains("NO PRIMAL FEASIBLE SOLUTION", StringComparison.Ordinal))) return new GeneralLpAnswer("infeasible", double.NaN, [], [], []);
        if (lines.Any(l => l.Contains("UNBOUNDED", StringComparison.Ordinal))) return new GeneralLpAnswer("unbounded", double.NaN, [], [], []);
        if (!lines.Contains("OPTIMAL LP SOLUTION FOUND") || !lines.Contains("OPTIMAL SOLUTION FOUND"))
        {
            throw new ReferenceToolException($"glpsol gave no verdict we know:\n{run.StandardOutput}");
        }
        return Parse(File.ReadAllLines(solution), program, emittedRows);
    }

    private static string N(double v) => v.ToString("R", CultureInfo.InvariantCulture);

    private static string Model(LinearProgram p, List<int> emittedRows)
    {
        var s = new StringBuilder();
        for (int j = 0; j < p.ColumnCount; j++)
        {
            double l = p.ColumnLower[j], u = p.ColumnUpper[j];
            s.Append("var x").Append(j);
            if (l == u) s.Append(" = ").Append(N(l));
            else
            {
                if (double.IsFinite(l)) s.Append(" >= ").Append(N(l));
                if (double.IsFinite(l) && double.IsFinite(u)) s.Append(',');
                if (double.IsFinite(u)) s.Append(" <= ").Append(N(u));
            }
            s.AppendLine(";");
        }
        string Form(ReadOnlySpan<double> row)
        {
            var t = new StringBuilder();
            for (int j = 0; j < row.Length; j++) t.Append(j == 0 ? "" : " + ").Append('(').Append(N(row[j])).Append(")*x").Append(j);
            return t.Length == 0 ? "0" : t.ToString();
        }
        s.Append(p.Sense == ObjectiveSense.Maximize ? "maximize" : "minimize").Append(" obj: ").Append(Form(p.Objective)).AppendLine(";");
        for (int i = 0; i < p.RowCount; i++)
        {
            double l = p.RowLower[i], u = p.RowUpper[i];
            // A free row constrains nothing; MathProg has no way to write it, so it is left out (its dual is 0).
            if (!double.IsFinite(l) && !double.IsFinite(u)) continue;
            emittedRows.Add(i);
            string form = Form(p.Row(i));
            s.Append("s.t. r").Append(i).Append(": ");
            if (l == u) s.Append(form).Append(" = ").Append(N(l));
            else if (double.IsFinite(l) && double.IsFinite(u)) s.Append(N(l)).Append(" <= ").Append(form).Append(" <= ").Append(N(u));
            else if (double.IsFinite(u)) s.Append(form).Append(" <= ").Append(N(u));
            else s.Append(form).Append(" >= ").Append(N(l));
            s.AppendLine(";");
        }
        s.AppendLine("solve;");
        s.AppendLine("end;");
        return s.ToString();
    }

    private static GeneralLpAnswer Parse(string[] lines, LinearProgram p, List<int> emittedRows)
    {
        var x = new double[p.ColumnCount];
        var reduced = new double[p.ColumnCount];
        var rowDuals = new double[p.RowCount];
        double objective = double.NaN;
        static double D(string t) => double.Parse(t, NumberStyles.Float, CultureInfo.InvariantCulture);
        try
        {
            foreach (var line in lines)
            {
                var t = line.Split(' ', StringSplitOptions.RemoveEmptyEntries);
                if (t.Length == 0) continue;
                switch (t[0])
                {
                    case "s" when t.Length == 7:
                        objective = D(t[6]);
                        break;
                    case "i" when t.Length == 5:
                        int row = int.Parse(t[1], CultureInfo.InvariantCulture) - 2; // row 1 is the objective
                        if (row >= 0) rowDuals[emittedRows[row]] = D(t[4]);
                        break;
                    case "j" when t.Length == 5:
                        int column = int.Parse(t[1], CultureInfo.InvariantCulture) - 1;
                        x[column] = D(t[3]);
                        reduced[column] = D(t[4]);
                        break;
                    case "c" or "e":
                        break;
                    default:
                        throw new ReferenceToolException($"Unexpected glpsol solution line '{line}'.");
                }
            }
        }
        catch (Exception e) when (e is FormatException or ArgumentOutOfRangeException or IndexOutOfRangeException)
        {
            throw new ReferenceToolException("Unreadable glpsol solution file.", e);
        }
        if (double.IsNaN(objective)) throw new ReferenceToolException("glpsol's solution file has no status line.");
        return new GeneralLpAnswer("optimal", objective, x, rowDuals, reduced);
    }
}
