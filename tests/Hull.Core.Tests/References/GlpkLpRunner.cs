using System.Globalization;
using System.Text;

namespace Hull.Core.Tests.References;

/// <summary>
/// LP reference through glpsol (Debian package glpk-utils): the MathProg model hull_lp.mod with a data file written
/// per problem. All queries are independent blocks of one LP, so one glpsol run answers them all.
/// </summary>
public static class GlpkLpRunner
{
    private const string ModelName = "hull_lp.mod";

    /// <param name="exactCheck">
    /// Adds glpsol's <c>--xcheck</c>: the final basis of the floating-point simplex is re-solved in exact rational
    /// arithmetic, so the answer carries no solver tolerance (glpsol's floating-point tolerances are about 1e-7).
    /// </param>
    public static IReadOnlyList<HullLpAnswer> Solve(HullLpProblem problem, bool exactCheck = true)
    {
        // The MathProg model has no per-query exclusions; a problem that needs them goes to SciPy.
        if (problem.HasExclusions) throw new ArgumentException("The GLPK reference does not take excluded points.", nameof(problem));
        string model = Path.Combine(AppContext.BaseDirectory, "References", ModelName);
        if (!File.Exists(model)) throw new ReferenceToolException($"The LP model {model} was not copied to the test output.");
        using var scratch = new ScratchFolder("glpk");
        string data = scratch.File("problem.dat");
        File.WriteAllText(data, DataFile(problem));
        var arguments = new List<string> { "--math", model, "--data", data };
        if (exactCheck) arguments.Add("--xcheck");
        var run = ToolProcess.Run("glpsol", arguments, scratch.Path, "glpk-utils");
        // glpsol reports "OPTIMAL LP SOLUTION FOUND" after the floating-point simplex and, with --xcheck, "OPTIMAL
        // SOLUTION FOUND" after the exact re-solve (glpsol output, GLPK 5.0); anything else is not an optimum.
        var lines = run.StandardOutput.Split('\n', StringSplitOptions.TrimEntries);
        bool optimal = lines.Contains("OPTIMAL LP SOLUTION FOUND") && (!exactCheck || lines.Contains("OPTIMAL SOLUTION FOUND"));
        if (!optimal) throw new ReferenceToolException($"glpsol found no optimal solution:\n{run.StandardOutput}");
        string answers = scratch.File("answers.txt");
        if (!File.Exists(answers)) throw new ReferenceToolException($"glpsol wrote no answers.\n{run.StandardOutput}");
        return Parse(File.ReadAllLines(answers), problem.Queries.Count);
    }

    private static string DataFile(HullLpProblem problem)
    {
        static string N(double v) => v.ToString("R", CultureInfo.InvariantCulture);
        int n = problem.ComponentCount;
        var s = new StringBuilder();
        s.AppendLine("data;");
        s.Append("set P :=").AppendJoin(' ', Enumerable.Range(0, problem.Amounts.Count)).AppendLine(";");
        s.Append("set K :=").AppendJoin(' ', Enumerable.Range(0, n)).AppendLine(";");
        s.Append("set Q :=").AppendJoin(' ', Enumerable.Range(0, problem.Queries.Count)).AppendLine(";");
        s.Append("param amount :").AppendJoin(' ', Enumerable.Range(0, n)).AppendLine(" :=");
        for (int j = 0; j < problem.Amounts.Count; j++)
        {
            s.Append(j).Append(' ').AppendJoin(' ', problem.Amounts[j].Select(a => a.ToString(CultureInfo.InvariantCulture))).AppendLine();
        }
        s.AppendLine(";");
        s.AppendLine("param E :=");
        for (int j = 0; j < problem.EnergiesEvPerAtom.Count; j++) s.Append(j).Append(' ').AppendLine(N(problem.EnergiesEvPerAtom[j]));
        s.AppendLine(";");
        s.Append("param xq :").AppendJoin(' ', Enumerable.Range(0, n)).AppendLine(" :=");
        for (int q = 0; q < problem.Queries.Count; q++)
        {
            s.Append(q).Append(' ').AppendJoin(' ', problem.Queries[q].Select(N)).AppendLine();
        }
        s.AppendLine(";");
        s.AppendLine("end;");
        return s.ToString();
    }

    private static IReadOnlyList<HullLpAnswer> Parse(string[] lines, int queryCount)
    {
        var energy = new double?[queryCount];
        var phases = Enumerable.Range(0, queryCount).Select(_ => new List<(int Point, double Weight)>()).ToArray();
        foreach (var line in lines)
        {
            var t = line.Split(' ', StringSplitOptions.RemoveEmptyEntries);
            if (t.Length == 0) continue;
            try
            {
                if (t[0] == "H" && t.Length == 3)
                {
                    energy[int.Parse(t[1], CultureInfo.InvariantCulture)] = double.Parse(t[2], NumberStyles.Float, CultureInfo.InvariantCulture);
                    continue;
                }
                if (t[0] == "W" && t.Length == 4)
                {
                    phases[int.Parse(t[1], CultureInfo.InvariantCulture)].Add((int.Parse(t[2], CultureInfo.InvariantCulture),
                        double.Parse(t[3], NumberStyles.Float, CultureInfo.InvariantCulture)));
                    continue;
                }
            }
            catch (Exception e) when (e is FormatException or IndexOutOfRangeException)
            {
                throw new ReferenceToolException($"Unreadable glpsol answer line '{line}'.", e);
            }
            throw new ReferenceToolException($"Unexpected glpsol answer line '{line}'.");
        }
        var result = new HullLpAnswer[queryCount];
        for (int q = 0; q < queryCount; q++)
        {
            if (energy[q] is not double e) throw new ReferenceToolException($"glpsol gave no hull energy for query {q}.");
            result[q] = new HullLpAnswer(e, phases[q].Select(p => p.Point).ToArray(), phases[q].Select(p => p.Weight).ToArray());
        }
        return result;
    }
}
