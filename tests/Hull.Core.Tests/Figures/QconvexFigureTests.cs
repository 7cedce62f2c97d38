using Hull.Core.Tests.Thermo;
using System.Globalization;
using Hull.Core.Tests.References;
using Hull.Core.Thermo;

namespace Hull.Core.Tests.Figures;

/// <summary>
/// The drawn edges against Qhull's qconvex (Debian qhull-bin) on the same points, with its default merged facets
/// (coplanar facets merged into one polygon or polytope): every edge of its lower facets is drawn, and every drawn
/// edge joins two corners of one lower facet.
/// </summary>
public sealed class QconvexFigureTests
{
    /// <summary>A facet is lower when its outward normal points down the energy axis by more than rounding.</summary>
    private const double LowerNormal = 1e-9;

    [Fact]
    public void Binary_hull_edges_match_qconvex() => Check(["Fe", "O"], 25, 31, coplanarSquare: false);

    [Fact]
    public void Ternary_tie_lines_match_qconvex_with_a_coplanar_face() => Check(["Co", "Li", "O"], 70, 32, coplanarSquare: true);

    [Fact]
    public void Quaternary_edges_match_qconvex() => Check(["Co", "Li", "Ni", "O"], 90, 33, coplanarSquare: false);

    private static void Check(string[] elements, int count, int seed, bool coplanarSquare)
    {
        (SystemHull randomHull, var points) = FigureTestData.Random(elements, count, seed);
        SystemHull hull = randomHull;
        if (coplanarSquare)
        {
            // Four compositions forming a convex quadrilateral, all at -1.6 eV/atom, below every random entry
            // (which lie above -1.5): the hull's lowest face has four corners, so both diagonals are tie-lines.
            long[][] square = [[1, 1, 2], [2, 1, 1], [1, 2, 1], [2, 2, 1]];
            foreach (long[] a in square)
            {
                string formula = string.Concat(elements.Select((e, k) => $"{e}{a[k]}"));
                points.RemoveAll(p => p.Entry.Composition.HasSameProportions(Hull.Core.Chemistry.Composition.Parse(formula)));
                points.Add((ThermoTestData.Formation($"sq-{formula}", formula, -1.6), a));
            }

            hull = SystemHull.OverElements(points.Select(p => p.Entry).ToArray());
        }

        var svg = new SvgFigure(FigureTestData.Draw(hull, new Core.Figures.FigureOptions { MaxAboveHullEvPerAtom = 5 }).Svg);
        var drawn = svg.Edges.Select(e => Key(e.First, e.Second)).ToHashSet(StringComparer.Ordinal);

        // qconvex on (all but the last fraction, energy): the last fraction is implied by the others.
        var coordinates = points.Select(p => FigureTestData.Fractions(p.Amounts)[..^1].Append(p.Entry.EnergyEv).ToArray()).ToArray();
        IReadOnlyList<(int[] Vertices, double[] Normal)> facets = MergedFacets(coordinates);
        var lower = facets.Where(f => f.Normal[^1] < -LowerNormal).ToArray();
        Assert.NotEmpty(lower);
        if (coplanarSquare) Assert.Contains(lower, f => f.Vertices.Length == 4);

        string IdOf(int i) => points[i].Entry.Id;
        var facetEdges = new HashSet<string>(StringComparer.Ordinal);
        var facetPairs = new HashSet<string>(StringComparer.Ordinal);
        foreach ((int[] vertices, _) in lower)
        {
            for (int a = 0; a < vertices.Length; a++)
            {
                for (int b = a + 1; b < vertices.Length; b++)
                {
                    string key = Key(IdOf(vertices[a]), IdOf(vertices[b]));
                    facetPairs.Add(key);
                    if (IsEdge(coordinates, vertices, a, b)) facetEdges.Add(key);
                }
            }
        }

        foreach (string edge in facetEdges) Assert.True(drawn.Contains(edge), $"qconvex lower-facet edge {edge} is not drawn");
        foreach (string edge in drawn) Assert.True(facetPairs.Contains(edge), $"drawn tie-line {edge} joins no two corners of one qconvex lower facet");
        if (coplanarSquare)
        {
            Assert.Contains(Key("sq-Co1Li1O2", "sq-Co2Li2O1"), drawn);
            Assert.Contains(Key("sq-Co2Li1O1", "sq-Co1Li2O1"), drawn);
        }
    }

    /// <summary>
    /// Whether corners a and b of a facet are joined by an edge of it. In the facet's composition projection (the
    /// energy dropped), a and b span an edge exactly when no other corner lies in the segment's relative interior
    /// of the facet: for a polygon, all others on one side of the line; for a simplex (all a qconvex facet in 4-d
    /// has here), every pair.
    /// </summary>
    private static bool IsEdge(double[][] points, int[] vertices, int a, int b)
    {
        int dim = points[0].Length;
        if (vertices.Length == dim) return true;
        Assert.Equal(3, dim);
        double[] p = points[vertices[a]], q = points[vertices[b]];
        int sign = 0;
        foreach (int v in vertices)
        {
            if (v == vertices[a] || v == vertices[b]) continue;
            double cross = (q[0] - p[0]) * (points[v][1] - p[1]) - (q[1] - p[1]) * (points[v][0] - p[0]);
            int s = Math.Sign(cross);
            if (sign != 0 && s != sign) return false;
            sign = s;
        }

        return true;
    }

    private static string Key(string a, string b) => string.CompareOrdinal(a, b) < 0 ? $"{a} | {b}" : $"{b} | {a}";

    /// <summary>qconvex Fv n: every vertex of each (merged) facet, and each facet's outward normal, in one facet order (qconvex manual).</summary>
    private static IReadOnlyList<(int[] Vertices, double[] Normal)> MergedFacets(double[][] points)
    {
        using var scratch = new ScratchFolder("qconvex-figure");
        string input = scratch.File("points.txt");
        File.WriteAllLines(input, new[] { points[0].Length.ToString(CultureInfo.InvariantCulture), points.Length.ToString(CultureInfo.InvariantCulture) }
            .Concat(points.Select(p => string.Join(' ', p.Select(v => v.ToString("R", CultureInfo.InvariantCulture))))));
        ToolRun run = ToolProcess.Run("qconvex", ["Fv", "n", "TI", input], scratch.Path, "qhull-bin");
        string[] lines = run.StandardOutput.Split('\n', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
        int facets = int.Parse(lines[0], CultureInfo.InvariantCulture);
        var vertices = new int[facets][];
        for (int f = 0; f < facets; f++)
        {
            int[] row = lines[1 + f].Split(' ', StringSplitOptions.RemoveEmptyEntries).Select(t => int.Parse(t, CultureInfo.InvariantCulture)).ToArray();
            Assert.Equal(row[0], row.Length - 1);
            vertices[f] = row[1..];
        }

        Assert.Equal(points[0].Length + 1, int.Parse(lines[1 + facets], CultureInfo.InvariantCulture));
        Assert.Equal(facets, int.Parse(lines[2 + facets], CultureInfo.InvariantCulture));
        return Enumerable.Range(0, facets).Select(f =>
        {
            double[] n = lines[3 + facets + f].Split(' ', StringSplitOptions.RemoveEmptyEntries)
                .Select(t => double.Parse(t, NumberStyles.Float, CultureInfo.InvariantCulture)).ToArray();
            return (vertices[f], n[..^1]);
        }).ToArray();
    }
}
