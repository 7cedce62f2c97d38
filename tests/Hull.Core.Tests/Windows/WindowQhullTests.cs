using Hull.Core.Tests.Generators;
using Hull.Core.Tests.References;
using Hull.Core.Thermo;
using Hull.Core.Windows;
using static Hull.Core.Tests.Windows.WindowReferenceData;

namespace Hull.Core.Tests.Windows;

/// <summary>
/// Windows against Qhull (Debian qhull-bin): vertex sets against <c>qhalf</c> (the compound's equality eliminated,
/// an interior point given), sizes against <c>qconvex FA</c> on the vertices, and windows of compounds inside a
/// face of the hull against the hull's facet planes from <c>qconvex n</c>, on degenerate phase sets.
/// </summary>
public sealed class WindowQhullTests
{
    /// <summary>Vertices agree to 1e-9 eV, the agreed tolerance; both sides compute them to about 1e-13.</summary>
    private const double VertexToleranceEv = 1e-9;

    /// <summary>Sizes agree to 1e-7 relative: qconvex's summary prints volumes to 8 significant digits.</summary>
    private const double RelativeMeasureTolerance = 1e-7;

    [Theory]
    [InlineData(3, 30, 11)]
    [InlineData(4, 40, 12)]
    [InlineData(5, 50, 13)]
    [InlineData(6, 32, 14)]
    public void Full_windows_have_qhalf_vertices_and_qconvex_sizes(int elementCount, int phaseCount, int seed)
    {
        (string[] elements, PhaseEntry[] entries) = WindowDataGenerator.Generate(elementCount, phaseCount, seed);
        int checkedWindows = 0, degenerateVertices = 0;
        foreach ((SystemHull hull, EntryStability compound) in Compounds(elements, entries))
        {
            if (!compound.IsHullVertex) continue;
            StabilityWindow window = StabilityWindows.Of(hull, compound.Id);
            Assert.Equal(WindowKind.Full, window.Kind);
            Assert.True(window.Exists);
            Assert.Equal(elementCount - 1, window.Dimension);

            // Eliminate the omitted element e: μ_e = (E_c − Σ_{i≠e} x_ci μ_i) / x_ce, and write every limit in the others.
            int e = IndexOf(elements, Omitted(window));
            int[] free = Enumerable.Range(0, elementCount).Where(i => i != e).ToArray();
            double[] xc = Fractions(compound.Entry, elements);
            double ec = compound.FormationEnergyEvPerAtom!.Value;
            var halfSpaces = new List<(double[] Normal, double Offset)>();
            foreach ((double[] a, double b) in Limits(WindowReferenceData.Within(entries, elements), compound.Entry, elements))
            {
                double[] normal = free.Select(i => a[i] - a[e] * xc[i] / xc[e]).ToArray();
                double rhs = b - a[e] * ec / xc[e];
                if (normal.All(v => Math.Abs(v) < 1e-14)) continue;
                halfSpaces.Add((normal, -rhs));
            }

            var ours = window.Vertices.Select(v => (IReadOnlyList<double>)free.Select(i => v.ChemicalPotentialsEv[i]).ToArray()).ToArray();
            double[] interior = Enumerable.Range(0, free.Length).Select(k => ours.Average(p => p[k])).ToArray();
            var reference = QhalfRunner.Vertices(halfSpaces, interior).Select(p => (IReadOnlyList<double>)p).ToArray();
            Assert.True(Covers(ours, reference, VertexToleranceEv), $"{compound.Id}: a vertex qhalf lacks.\nours:\n{Show(ours)}\nqhalf:\n{Show(reference)}");
            Assert.True(Covers(reference, ours, VertexToleranceEv), $"{compound.Id}: qhalf has a vertex we lack.\nours:\n{Show(ours)}\nqhalf:\n{Show(reference)}");
            degenerateVertices += window.Vertices.Count(v => v.LimitingPhases.Count + v.ElementsAtReference.Count > elementCount - 1);

            // Sizes: the projection on the free potentials, and the measure in the hyperplane x_c·μ = E_c through an
            // orthonormal frame of it.
            double projected = QconvexMeasure.Volume(ours.Select(p => p.ToArray()).ToArray());
            Assert.Equal(projected, window.Size!.ProjectedMeasureEvPowK, Math.Max(1e-14, RelativeMeasureTolerance * projected));
            double[][] frame = PlaneFrame(xc);
            double inPlane = QconvexMeasure.Volume(window.Vertices.Select(v => frame.Select(f => f.Zip(v.ChemicalPotentialsEv, (s, t) => s * t).Sum()).ToArray()).ToArray());
            Assert.Equal(inPlane, window.Size.MeasureInPlaneEvPowK, Math.Max(1e-14, RelativeMeasureTolerance * inPlane));
            checkedWindows++;
        }

        Assert.True(checkedWindows >= 2, $"only {checkedWindows} windows were checked");
        Assert.True(degenerateVertices > 0, "the data produced no degenerate vertex");
    }

    [Theory]
    [InlineData(3, 40, 21)]
    [InlineData(4, 50, 22)]
    [InlineData(5, 50, 23)]
    public void Windows_inside_hull_faces_match_qconvex_facet_planes(int elementCount, int phaseCount, int seed)
    {
        (string[] elements, PhaseEntry[] entries) = WindowDataGenerator.Generate(elementCount, phaseCount, seed);
        PhaseEntry[] within = WindowReferenceData.Within(entries, elements);

        // qconvex on (x_1 .. x_{N-1}, E): a lower facet n·p + o = 0 (n_E < 0) is the plane E = Σ μ_i x_i with
        // μ_N = −o/n_E and μ_i = μ_N − n_i/n_E; these planes are the vertices of the potential polyhedron.
        var points = within.Select(e => Fractions(e, elements)[..^1].Append(e.EnergyEvPerAtom).ToArray()).ToArray();
        var planes = QconvexMeasure.FacetPlanes(points)
            .Where(f => f.Normal[^1] < -1e-12)
            .Select(f =>
            {
                double last = -f.Offset / f.Normal[^1];
                return elements.Select((_, i) => i == elementCount - 1 ? last : last - f.Normal[i] / f.Normal[^1]).ToArray();
            })
            .ToArray();
        int lowerDimensional = 0;
        foreach ((SystemHull hull, EntryStability compound) in Compounds(elements, entries))
        {
            if (!compound.IsOnHull || compound.IsHullVertex) continue;
            StabilityWindow window = StabilityWindows.Of(hull, compound.Id);
            double[] x = Fractions(compound.Entry, elements);
            var expected = planes
                .Where(mu => Math.Abs(mu.Zip(x, (a, b) => a * b).Sum() - compound.FormationEnergyEvPerAtom!.Value) <= VertexToleranceEv)
                .Select(mu => (IReadOnlyList<double>)mu)
                .ToArray();
            var ours = window.Vertices.Select(v => v.ChemicalPotentialsEv).ToArray();
            Assert.True(Covers(ours, expected, VertexToleranceEv), $"{compound.Id}: a vertex on no facet plane.\nours:\n{Show(ours)}\nqconvex:\n{Show(expected)}");
            Assert.True(Covers(expected, ours, VertexToleranceEv), $"{compound.Id}: a facet plane we lack.\nours:\n{Show(ours)}\nqconvex:\n{Show(expected)}");
            if (window.Kind == WindowKind.LowerDimensional)
            {
                // The smallest hull face holding the compound: the points on every facet plane through it. Its
                // dimension k may exceed what the decomposition shows (a segment lying inside a coplanar facet).
                var face = within
                    .Where(e => expected.All(mu => Math.Abs(mu.Zip(Fractions(e, elements), (a, b) => a * b).Sum() - e.EnergyEvPerAtom) <= VertexToleranceEv))
                    .Select(e => Fractions(e, elements))
                    .ToArray();
                Assert.Equal(elementCount - 1 - AffineRank(face), window.Dimension);
                Assert.All(window.CoexistingPhases, p => Assert.True(window.Vertices.All(v => !v.LimitingPhases.Contains(p))));
                lowerDimensional++;
            }
        }

        Assert.True(lowerDimensional >= 1, "the data put no compound inside a hull face");
    }

    private static int AffineRank(double[][] points)
    {
        var basis = new List<double[]>();
        foreach (double[] p in points.Skip(1))
        {
            double[] v = p.Zip(points[0], (a, b) => a - b).ToArray();
            foreach (double[] b in basis)
            {
                double dot = v.Zip(b, (s, t) => s * t).Sum();
                for (int k = 0; k < v.Length; k++) v[k] -= dot * b[k];
            }

            double norm = Math.Sqrt(v.Sum(t => t * t));
            if (norm > 1e-9) basis.Add(v.Select(t => t / norm).ToArray());
        }

        return basis.Count;
    }

    /// <summary>An orthonormal basis of the plane orthogonal to <paramref name="normal"/> (Gram–Schmidt on the unit vectors).</summary>
    private static double[][] PlaneFrame(double[] normal)
    {
        int n = normal.Length;
        var basis = new List<double[]> { normal.Select(v => v / Math.Sqrt(normal.Sum(t => t * t))).ToArray() };
        for (int i = 0; i < n && basis.Count < n; i++)
        {
            var v = new double[n];
            v[i] = 1;
            foreach (double[] b in basis)
            {
                double dot = v.Zip(b, (s, t) => s * t).Sum();
                for (int k = 0; k < n; k++) v[k] -= dot * b[k];
            }

            double norm = Math.Sqrt(v.Sum(t => t * t));
            if (norm < 1e-6) continue;
            basis.Add(v.Select(t => t / norm).ToArray());
        }

        return basis.Skip(1).ToArray();
    }
}
