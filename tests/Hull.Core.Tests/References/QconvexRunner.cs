using System.Globalization;

namespace Hull.Core.Tests.References;

/// <summary>
/// Full convex hull of points in any dimension from qconvex (Debian package qhull-bin): facets with their vertices
/// and outward normals.
/// </summary>
public static class QconvexRunner
{

    /// <summary>
    /// Runs <c>qconvex Qt i n</c> on the points: 'Qt' triangulates merged facets so each facet line lists
    /// dimension-many vertices, 'i' prints the vertices of each facet, 'n' the outward normal and offset of each
    /// facet, in the same facet order (qconvex manual, output options 'i' and 'n').
    /// </summary>
    public static IReadOnlyList<QhullFacet> Facets(IReadOnlyList<double[]> points)
    {
        if (points.Count == 0) throw new ArgumentException("No points.", nameof(points));
        int dim = points[0].Length;
        using var scratch = new ScratchFolder("qconvex");
        string input = scratch.File("points.txt");
        using (var w = new StreamWriter(input))
        {
            // qhull input format: dimension, number of points, then one point per line.
            w.WriteLine(dim.ToString(CultureInfo.InvariantCulture));
            w.WriteLine(points.Count.ToString(CultureInfo.InvariantCulture));
            foreach (var p in points)
            {
                if (p.Length != dim) throw new ArgumentException("Points of different dimension.", nameof(points));
                w.WriteLine(string.Join(' ', p.Select(v => v.ToString("R", CultureInfo.InvariantCulture))));
            }
        }
        var run = ToolProcess.Run("qconvex", ["Qt", "i", "n", "TI", input], scratch.Path, "qhull-bin");
        return Parse(run.StandardOutput, dim, points.Count);
    }

    private static IReadOnlyList<QhullFacet> Parse(string output, int dim, int pointCount)
    {
        var lines = output.Split('\n', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
        int at = 0;
        string Next() => at < lines.Length ? lines[at++] : throw new ReferenceToolException($"qconvex output ended early:\n{output}");
        double[] Numbers(string line) => line.Split(' ', StringSplitOptions.RemoveEmptyEntries)
            .Select(t => double.Parse(t, NumberStyles.Float, CultureInfo.InvariantCulture)).ToArray();

        try
        {
            int facetCount = int.Parse(Next(), CultureInfo.InvariantCulture);
            var vertices = new int[facetCount][];
            for (int f = 0; f < facetCount; f++)
            {
                vertices[f] = Next().Split(' ', StringSplitOptions.RemoveEmptyEntries).Select(t => int.Parse(t, CultureInfo.InvariantCulture)).ToArray();
                if (vertices[f].Length != dim || vertices[f].Any(v => v < 0 || v >= pointCount))
                {
                    throw new ReferenceToolException($"qconvex facet {f} lists vertices '{string.Join(' ', vertices[f])}', expected {dim} indices below {pointCount}.");
                }
            }
            int width = int.Parse(Next(), CultureInfo.InvariantCulture);
            int normalCount = int.Parse(Next(), CultureInfo.InvariantCulture);
            if (width != dim + 1 || normalCount != facetCount)
            {
                throw new ReferenceToolException($"qconvex normals header says {width} columns and {normalCount} facets; expected {dim + 1} and {facetCount}.");
            }
            var facets = new QhullFacet[facetCount];
            for (int f = 0; f < facetCount; f++)
            {
                var row = Numbers(Next());
                if (row.Length != dim + 1) throw new ReferenceToolException($"qconvex normal of facet {f} has {row.Length} numbers, expected {dim + 1}.");
                facets[f] = new QhullFacet(vertices[f], row[..dim], row[dim]);
            }
            return facets;
        }
        catch (FormatException e)
        {
            throw new ReferenceToolException($"Could not read qconvex output:\n{output}", e);
        }
    }
}
