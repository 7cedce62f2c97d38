using System.Globalization;
using System.Text.RegularExpressions;

namespace Hull.Core.Tests.References;

/// <summary>qconvex (Debian qhull-bin) as a reference for volumes and for facet planes.</summary>
public static partial class QconvexMeasure
{

    /// <summary>
    /// The volume of the convex hull of the points by <c>qconvex FA</c>: 'FA' adds the total area and volume to
    /// the summary, printed as "Total volume:" (qconvex manual, option FA).
    /// </summary>
    public static double Volume(IReadOnlyList<double[]> points)
    {
        string output = Run(points, ["FA"], out string errors);
        Match m = VolumeLine().Match(output + "\n" + errors);
        if (!m.Success) throw new ReferenceToolException($"qconvex FA printed no total volume:\n{output}\n{errors}");
        return double.Parse(m.Groups[1].Value, CultureInfo.InvariantCulture);
    }

    /// <summary>
    /// The hull's facet planes by <c>qconvex n</c>: the dimension plus one, the count, then per facet the outward
    /// unit normal and the offset (n·p + offset = 0 on the facet); coplanar facets are merged (qconvex manual, 'n').
    /// </summary>
    public static IReadOnlyList<(double[] Normal, double Offset)> FacetPlanes(IReadOnlyList<double[]> points)
    {
        string output = Run(points, ["n"], out _);
        var lines = output.Split('\n', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
        int width = int.Parse(lines[0], CultureInfo.InvariantCulture);
        int count = int.Parse(lines[1], CultureInfo.InvariantCulture);
        return lines.Skip(2).Take(count).Select(l =>
        {
            double[] v = l.Split(' ', StringSplitOptions.RemoveEmptyEntries).Select(t => double.Parse(t, CultureInfo.InvariantCulture)).ToArray();
            if (v.Length != width) throw new ReferenceToolException($"qconvex n printed '{l}', expected {width} numbers.");
            return (v[..^1], v[^1]);
        }).ToArray();
    }

    private static string Run(IReadOnlyList<double[]> points, string[] options, out string errors)
    {
        int dim = points[0].Length;
        using var scratch = new ScratchFolder("qconvex-measure");
        string input = scratch.File("points.txt");
        using (var w = new StreamWriter(input))
        {
            w.WriteLine(dim.ToString(CultureInfo.InvariantCulture));
            w.WriteLine(points.Count.ToString(CultureInfo.InvariantCulture));
            foreach (double[] p in points) w.WriteLine(string.Join(' ', p.Select(v => v.ToString("R", CultureInfo.InvariantCulture))));
        }

        ToolRun run = ToolProcess.Run("qconvex", [.. options, "TI", input], scratch.Path, "qhull-bin");
        errors = run.StandardError;
        return run.StandardOutput;
    }

    [GeneratedRegex(@"(?:Total|Approximate) volume:\s*([-+0-9.eE]+)")]
    private static partial Regex VolumeLine();
}
