using System.Diagnostics;
using Hull.Core.Geometry;
using Hull.Core.Tests.Generators;
using Hull.Core.Tests.References;
using Xunit.Abstractions;

namespace Hull.Core.Tests.Geometry;

/// <summary>
/// Our lower-hull vertices (both engines) and facets (<see cref="LowerHull"/>) against the full convex hull
/// computed by qconvex (Debian qhull-bin).
/// </summary>
public sealed class QhullVertexTests(ITestOutputHelper output)
{
    /// <summary>
    /// A facet whose unit outward normal has an energy component above -this is vertical (or upper) and not part
    /// of the lower hull. qconvex's normals carry rounding near 1e-15; in general position no facet is truly
    /// vertical (only the pure points lie on faces of the simplex), so any real lower facet tilts far more.
    /// </summary>
    private const double VerticalNormalTolerance = 1e-12;

    /// <summary>
    /// Chemical potentials from a qconvex plane are its unit normal and offset (printed to 16 digits, rounding near
    /// 1e-15) divided by the normal's energy component; 1e-10 eV/atom per unit of that division leaves a wide margin.
    /// </summary>
    private const double ChemicalPotentialTolerance = 1e-10;

    [Theory]
    [InlineData(2, 300, 11)]
    [InlineData(2, 300, 12)]
    [InlineData(3, 300, 21)]
    [InlineData(3, 300, 22)]
    [InlineData(3, 300, 23)]
    [InlineData(4, 300, 31)]
    [InlineData(4, 300, 32)]
    [InlineData(4, 300, 33)]
    [InlineData(5, 300, 41)]
    [InlineData(5, 300, 42)]
    [InlineData(6, 300, 51)]
    [InlineData(6, 300, 52)]
    public void Lower_hull_vertices_match_qconvex_in_general_position(int components, int points, int seed)
    {
        var set = GeneralPositionGenerator.Generate(components, points, seed);
        var engines = BothEngines.Build(set);
        var hull = engines.Facets;

        // Lift each point to (x_1, ..., x_{n-1}, E): the first n-1 fractions are independent coordinates of the
        // composition simplex, the last fraction is 1 minus their sum.
        var lifted = Enumerable.Range(0, set.Count)
            .Select(i => set.Fractions(i).Take(components - 1).Append(set.EnergiesEvPerAtom[i]).ToArray())
            .ToList();
        var clock = Stopwatch.StartNew();
        var facets = QconvexRunner.Facets(lifted);
        var referenceTime = clock.Elapsed;

        // qconvex manual ('n': outward normals): the lower hull consists of the facets whose outward normal points
        // down in energy; their vertices are the lower-hull vertices (the pure points are always among them).
        var lower = facets.Where(f => f.OutwardNormal[^1] < -VerticalNormalTolerance).ToList();
        var reference = lower.SelectMany(f => f.Vertices).ToHashSet();
        output.WriteLine($"{components} components, {set.Count} points: {reference.Count} qconvex lower vertices, {facets.Count} qconvex facets "
            + $"({lower.Count} lower); {engines.Timings}, qconvex {referenceTime.TotalMilliseconds:F0} ms");

        // Both engines' vertices against the same qconvex run.
        var disagreements = new List<string>();
        foreach (var (name, engine) in engines.All)
        {
            var ours = engine.VertexPoints.ToHashSet();
            var missing = reference.Except(ours).Order().Select(set.Describe).ToList();
            var extra = ours.Except(reference).Order().Select(set.Describe).ToList();
            if (missing.Count > 0 || extra.Count > 0)
            {
                disagreements.Add($"{name}: qconvex lower-hull vertices it lacks:\n{string.Join("\n", missing)}\nits vertices qconvex lacks:\n{string.Join("\n", extra)}");
            }
        }
        Assert.True(disagreements.Count == 0, string.Join("\n", disagreements));

        // In general position the lower hull is a unique triangulation, so the facets themselves must agree.
        var ourFacets = hull.Facets.Select(f => FacetKey(f.VertexPoints)).ToHashSet();
        var referenceFacets = lower.Select(f => FacetKey(f.Vertices)).ToHashSet();
        Assert.True(ourFacets.SetEquals(referenceFacets),
            $"{ourFacets.Except(referenceFacets).Count()} of our facets not in qconvex, {referenceFacets.Except(ourFacets).Count()} qconvex lower facets not ours");

        // The facet plane n . (x_1..x_{n-1}, E) + offset = 0 as chemical potentials (qconvex manual, 'n').
        var byKey = hull.Facets.ToDictionary(f => FacetKey(f.VertexPoints));
        foreach (var f in lower)
        {
            var mu = byKey[FacetKey(f.Vertices)].ChemicalPotentialsEvPerAtom;
            double nE = f.OutwardNormal[^1];
            var planeMu = f.ChemicalPotentials();
            for (int k = 0; k < components; k++)
            {
                double fromPlane = planeMu[k];
                Assert.True(Math.Abs(mu[k] - fromPlane) <= ChemicalPotentialTolerance * (1.0 / Math.Abs(nE)),
                    $"facet {FacetKey(f.Vertices)}: mu[{k}] = {mu[k]:R}, qconvex plane gives {fromPlane:R}");
            }
        }

        // Sanity of the reference itself: every pure point is a lower vertex (corners of the simplex).
        for (int i = 0; i < set.Count; i++)
        {
            if (set.Kinds[i] == "pure") Assert.Contains(i, reference);
        }
    }

    private static string FacetKey(IEnumerable<int> vertices) => string.Join(",", vertices.Order());
}
