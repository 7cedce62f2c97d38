using System.Globalization;

namespace Hull.Core.Tests.References;

/// <summary>
/// Half-space intersection by Qhull's <c>qhalf</c> (Debian package qhull-bin): the vertices of
/// {y : A y + c ≤ 0} given an interior point.
/// </summary>
public static class QhalfRunner
{

    /// <summary>
    /// Runs <c>qhalf Fp</c>: the input's first line "dim 1" then the interior point, then "dim+1", the count and one
    /// half-space per line as coefficients then offset (a·y + offset ≤ 0); 'Fp' prints the intersection points, one
    /// per facet of the dual hull, so a degenerate vertex may be printed more than once (qhull manual, qhalf).
    /// </summary>
    public static IReadOnlyList<double[]> Vertices(IReadOnlyList<(double[] Normal, double Offset)> halfSpaces, double[] interior)
    {
        int dim = interior.Length;
        using var scratch = new ScratchFolder("qhalf");
        string input = scratch.File("halfspaces.txt");
        using (var w = new StreamWriter(input))
        {
            w.WriteLine($"{dim} 1");
            w.WriteLine(string.Join(' ', interior.Select(R)));
            w.WriteLine((dim + 1).ToString(CultureInfo.InvariantCulture));
            w.WriteLine(halfSpaces.Count.ToString(CultureInfo.InvariantCulture));
            foreach (var (normal, offset) in halfSpaces) w.WriteLine(string.Join(' ', normal.Append(offset).Select(R)));
        }

        ToolRun run = ToolProcess.Run("qhalf", ["Fp", "TI", input], scratch.Path, "qhull-bin");
        var lines = run.StandardOutput.Split('\n', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
        if (lines.Length < 2 || int.Parse(lines[0], CultureInfo.InvariantCulture) != dim)
        {
            throw new ReferenceToolException($"qhalf printed an unexpected header:\n{run.StandardOutput}");
        }

        int count = int.Parse(lines[1], CultureInfo.InvariantCulture);
        return lines.Skip(2).Take(count)
            .Select(l => l.Split(' ', StringSplitOptions.RemoveEmptyEntries).Select(t => double.Parse(t, CultureInfo.InvariantCulture)).ToArray())
            .ToArray();
    }

    private static string R(double v) => v.ToString("R", CultureInfo.InvariantCulture);
}
