using Hull.Core.Geometry;
using Hull.Core.Optimization;
using Hull.Core.Tests.Generators;
using Hull.Core.Tests.References;
using Xunit.Abstractions;

namespace Hull.Core.Tests.Geometry;

/// <summary>
/// The hull program's dual, <see cref="IHullStability.ChemicalPotentialsEvPerAtomAt"/>, on both engines: against the facet
/// planes of qconvex (Debian qhull-bin) in general position, against SciPy HiGHS's equality marginals
/// (<c>res.eqlin.marginals</c>, Debian python3-scipy) where the dual is unique, and always against the conditions
/// that make it a dual optimum (every point on or above the plane, the plane through the hull energy).
/// </summary>
public sealed class ChemicalPotentialTests(ITestOutputHelper output)
{
    /// <summary>
    /// Agreement of potentials (eV/atom) with the references: the planes come from solves over fractions in
    /// [0, 1] on energies of order 1 eV/atom, where rounding stays near 1e-13; qconvex prints 16 digits.
    /// </summary>
    private const double PotentialTolerance = 1e-9;

    /// <summary>
    /// A facet of qconvex holds a composition when its barycentric weights are above −this: in general position
    /// random compositions are far from facet boundaries compared with the 1e-15 rounding of the solve.
    /// </summary>
    private const double InsideFacet = 1e-9;

    /// <summary>A decomposition weight above this is a clear phase (the SciPy dual is unique when all k are clear).</summary>
    private const double ClearWeight = 1e-6;

    /// <summary>As in QhullVertexTests: a lower facet's unit normal points down in energy by more than rounding.</summary>
    private const double VerticalNormalTolerance = 1e-12;

    [Theory]
    [InlineData(3, 200, 61)]
    [InlineData(4, 200, 62)]
    [InlineData(5, 150, 63)]
    public void Potentials_are_the_plane_of_the_qconvex_facet_holding_the_composition(int components, int points, int seed)
    {
        var set = GeneralPositionGenerator.Generate(components, points, seed);
        var engines = BothEngines.Build(set);
        var lifted = Enumerable.Range(0, set.Count).Select(i => set.Fractions(i).Take(components - 1).Append(set.EnergiesEvPerAtom[i]).ToArray()).ToList();
        // qconvex Qt i n (qconvex manual: outward normals; the lower hull is the facets whose normal points down in energy).
        var lower = QconvexRunner.Facets(lifted).Where(f => f.OutwardNormal[^1] < -VerticalNormalTolerance).ToList();
        var queries = RandomCompositions.Generate(components, 120, seed + 3);
        var problems = new List<string>();
        int unique = 0;
        foreach (var x in queries)
        {
            var holding = lower.Where(f => MinBarycentric(set, f.Vertices, x) >= -InsideFacet).Select(f => f.ChemicalPotentials()).ToList();
            if (holding.Count == 0) { problems.Add($"no qconvex facet holds ({string.Join(", ", x)})"); continue; }
            if (holding.Count == 1) unique++;
            foreach (var (name, hull) in engines.All)
            {
                var mu = hull.ChemicalPotentialsEvPerAtomAt(x);
                // Where several facets hold x (on a shared edge, on the simplex boundary) any of them is a valid answer.
                if (!holding.Any(plane => plane.Zip(mu).All(p => Math.Abs(p.First - p.Second) <= PotentialTolerance)))
                {
                    problems.Add($"{name} at ({string.Join(", ", x.Select(v => v.ToString("G4")))}): mu = ({string.Join(", ", mu)}), "
                        + $"qconvex planes holding it: {string.Join(" | ", holding.Select(p => string.Join(", ", p)))}");
                }
            }
        }
        output.WriteLine($"{components} components, {set.Count} points, {lower.Count} qconvex lower facets; {queries.Count} compositions, {unique} in exactly one facet");
        Assert.True(problems.Count == 0, string.Join("\n", problems.Take(20)));
        Assert.True(unique >= queries.Count / 2, $"only {unique} compositions lie in exactly one facet");
    }

    [Theory]
    [InlineData(3, 200, 71)]
    [InlineData(4, 200, 72)]
    [InlineData(6, 250, 73)]
    public void Potentials_match_scipy_highs_duals_where_unique_and_are_dual_optimal_everywhere(int components, int points, int seed)
    {
        var set = DegenerateDataGenerator.Generate(components, points, seed);
        var engines = BothEngines.Build(set);
        var queries = RandomCompositions.Generate(components, 100, seed + 5).Concat(Enumerable.Range(0, set.Count).Where(i => i % 7 == 0).Select(set.Fractions)).ToList();
        // scipy.optimize.linprog(method="highs") on the hull program, duals = res.eqlin.marginals (Debian python3-scipy).
        var answers = ScipyLpRunner.Solve(new HullLpProblem(set.Amounts, set.EnergiesEvPerAtom, queries));
        var problems = new List<string>();
        int compared = 0;
        for (int q = 0; q < queries.Count; q++)
        {
            var x = queries[q];
            var reference = answers[q];
            // Unique dual: the reference optimum uses one clear phase per component (a nondegenerate basis).
            bool unique = reference.Phases.Length == components && reference.Weights.All(w => w > ClearWeight);
            if (unique) compared++;
            foreach (var (name, hull) in engines.All)
            {
                var mu = hull.ChemicalPotentialsEvPerAtomAt(x);
                string where = $"{name}, query {q}";
                double onPlane = mu.Zip(x).Sum(p => p.First * p.Second);
                if (Math.Abs(onPlane - reference.HullEnergyEvPerAtom) > PotentialTolerance) problems.Add($"{where}: mu·x = {onPlane:R}, hull energy {reference.HullEnergyEvPerAtom:R}");
                for (int j = 0; j < set.Count; j++)
                {
                    double plane = mu.Zip(set.Fractions(j)).Sum(p => p.First * p.Second);
                    if (plane > set.EnergiesEvPerAtom[j] + PotentialTolerance) { problems.Add($"{where}: point {j} lies {plane - set.EnergiesEvPerAtom[j]:G3} eV/atom below the plane"); break; }
                }
                if (unique)
                {
                    for (int k = 0; k < components; k++)
                    {
                        if (Math.Abs(mu[k] - reference.Duals![k]) > PotentialTolerance) problems.Add($"{where}: mu[{k}] = {mu[k]:R}, SciPy {reference.Duals[k]:R}");
                    }
                }
            }
        }
        output.WriteLine($"{components} components, {set.Count} points, {queries.Count} compositions, duals compared at {compared} (unique)");
        Assert.True(problems.Count == 0, string.Join("\n", problems.Take(20)));
        Assert.True(compared >= 30, $"only {compared} compositions had a unique dual");
    }

    [Fact]
    public void General_solver_on_the_hull_program_gives_the_same_hull_energy_and_unique_potentials()
    {
        var set = DegenerateDataGenerator.Generate(4, 150, 81);
        var hull = LinearProgramHull.Build(set.Amounts, set.EnergiesEvPerAtom);
        var fractions = Enumerable.Range(0, set.Count).Select(set.Fractions).ToList();
        int compared = 0;
        foreach (var x in RandomCompositions.Generate(4, 40, 82))
        {
            // min Σ w_j E_j subject to Σ w_j x_j = x, w ≥ 0, as a general program.
            var a = new double[4, set.Count];
            for (int k = 0; k < 4; k++) for (int j = 0; j < set.Count; j++) a[k, j] = fractions[j][k];
            var program = new LinearProgram(ObjectiveSense.Minimize, set.EnergiesEvPerAtom.ToArray(), a, x, x, new double[set.Count],
                Enumerable.Repeat(double.PositiveInfinity, set.Count).ToArray());
            var result = DenseSimplex.Solve(program);
            Assert.Equal(LinearProgramStatus.Optimal, result.Status);
            Assert.Equal(hull.Locate(x).HullEnergyEvPerAtom, result.ObjectiveValue, 9);
            var basic = Enumerable.Range(0, set.Count).Where(j => result.Basis!.ColumnStatuses[j] == BasisStatus.Basic).ToList();
            if (basic.Count == 4 && basic.All(j => result.ColumnValues[j] > ClearWeight))
            {
                compared++;
                var mu = hull.ChemicalPotentialsEvPerAtomAt(x);
                for (int k = 0; k < 4; k++) Assert.Equal(mu[k], result.RowDuals[k], 9);
            }
        }
        Assert.True(compared >= 10, $"only {compared} unique duals");
    }

    /// <summary>The smallest barycentric weight of x in the facet with these vertices (the n × n system of their fractions).</summary>
    private static double MinBarycentric(PointSet set, int[] vertices, double[] x)
    {
        int n = vertices.Length;
        var a = new double[n, n];
        for (int r = 0; r < n; r++) for (int c = 0; c < n; c++) a[r, c] = set.Fractions(vertices[c])[r];
        var w = (double[])x.Clone();
        // Gaussian elimination with partial pivoting on the n × n system of fractions.
        for (int k = 0; k < n; k++)
        {
            int p = k;
            for (int r = k + 1; r < n; r++) if (Math.Abs(a[r, k]) > Math.Abs(a[p, k])) p = r;
            for (int c = 0; c < n; c++) (a[k, c], a[p, c]) = (a[p, c], a[k, c]);
            (w[k], w[p]) = (w[p], w[k]);
            for (int r = k + 1; r < n; r++)
            {
                double f = a[r, k] / a[k, k];
                for (int c = k; c < n; c++) a[r, c] -= f * a[k, c];
                w[r] -= f * w[k];
            }
        }
        for (int r = n - 1; r >= 0; r--)
        {
            for (int c = r + 1; c < n; c++) w[r] -= a[r, c] * w[c];
            w[r] /= a[r, r];
        }
        return w.Min();
    }
}
