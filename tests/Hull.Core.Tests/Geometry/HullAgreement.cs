using Hull.Core.Geometry;
using Hull.Core.Tests.Generators;
using Hull.Core.Tests.References;

namespace Hull.Core.Tests.Geometry;

/// <summary>
/// Compares a built hull with LP reference answers (hull energy at each query) and checks each decomposition on its
/// own terms; collects every disagreement so that one failing run shows them all.
/// </summary>
internal sealed class HullAgreement(PointSet set, IHullStability hull)
{
    /// <summary>
    /// Agreement required between our energies and the LP references (eV/atom): the LPs are solved to 1e-10
    /// feasibility (or exactly), our facet arithmetic and simplex bases lose about 1e-15 relative, so 1e-9 leaves margin for both
    /// while staying far below any physical energy difference.
    /// </summary>
    public const double EnergyToleranceEvPerAtom = 1e-9;

    /// <summary>Composition and weight sums must be reproduced to this (dimensionless fractions), for the same reasons.</summary>
    public const double FractionTolerance = 1e-9;

    /// <summary>LP lambdas above this are taken as real phases of the LP's decomposition (noise sits near 1e-12).</summary>
    private const double LpPhaseWeight = 1e-6;

    private readonly List<string> _failures = [];
    private readonly HashSet<int> _vertices = hull.VertexPoints.ToHashSet();

    public IReadOnlyList<string> Failures => _failures;

    /// <summary>Checks point i: energy above hull against the LP, its decomposition, and the LP's phases.</summary>
    public void CheckPoint(int i, HullLpAnswer lp, string source)
    {
        double e = set.EnergiesEvPerAtom[i];
        // Energy above hull = E - (LP minimum of sum lambda_j E_j at the point's composition) — the definition of the
        // lower hull as the LP optimum; common practice.
        double expected = Math.Max(0.0, e - lp.HullEnergyEvPerAtom);
        double ours = hull.EnergyAboveHullEvPerAtom(i);
        if (!(Math.Abs(ours - expected) <= EnergyToleranceEvPerAtom))
        {
            Fail($"{set.Describe(i)}: energy above hull {ours:R}, {source} gives {expected:R} (hull energy {lp.HullEnergyEvPerAtom:R})");
        }
        CheckPosition(hull.LocatePoint(i), set.Fractions(i), lp, source, set.Describe(i));
    }

    /// <summary>Checks the hull at an arbitrary composition against the LP.</summary>
    public void CheckComposition(double[] fractions, HullLpAnswer lp, string source)
    {
        string where = $"composition {{{string.Join(", ", fractions.Select(f => f.ToString("R")))}}}";
        HullPosition position;
        try
        {
            position = hull.Locate(fractions);
        }
        catch (Exception ex)
        {
            Fail($"{where}: Locate threw {ex.GetType().Name}: {ex.Message}");
            return;
        }
        CheckPosition(position, fractions, lp, source, where);
    }

    private void CheckPosition(HullPosition position, double[] x, HullLpAnswer lp, string source, string where)
    {
        int n = x.Length;
        // The hull energy there is the LP optimum (common practice: the lower hull is the LP value function).
        if (!(Math.Abs(position.HullEnergyEvPerAtom - lp.HullEnergyEvPerAtom) <= EnergyToleranceEvPerAtom))
        {
            Fail($"{where}: hull energy {position.HullEnergyEvPerAtom:R}, {source} gives {lp.HullEnergyEvPerAtom:R}");
        }
        if (position.VertexPoints.Count != position.AtomFractions.Count || position.VertexPoints.Count == 0 || position.VertexPoints.Count > n)
        {
            Fail($"{where}: decomposition has {position.VertexPoints.Count} points and {position.AtomFractions.Count} fractions");
            return;
        }
        // A decomposition is a mixture of hull points: atom fractions >= 0 summing to 1, whose mean composition is
        // the composition and whose mean energy is the hull energy (lever rule; common practice).
        double sum = 0, energy = 0;
        var mixed = new double[n];
        for (int v = 0; v < position.VertexPoints.Count; v++)
        {
            int p = position.VertexPoints[v];
            double wgt = position.AtomFractions[v];
            if (!(wgt >= 0)) Fail($"{where}: negative atom fraction {wgt:R} for point #{p}");
            if (!_vertices.Contains(p)) Fail($"{where}: decomposes into #{p}, which is not a hull vertex");
            sum += wgt;
            energy += wgt * set.EnergiesEvPerAtom[p];
            var xp = set.Fractions(p);
            for (int k = 0; k < n; k++) mixed[k] += wgt * xp[k];
        }
        if (!(Math.Abs(sum - 1.0) <= FractionTolerance)) Fail($"{where}: atom fractions sum to {sum:R}");
        for (int k = 0; k < n; k++)
        {
            if (!(Math.Abs(mixed[k] - x[k]) <= FractionTolerance))
            {
                Fail($"{where}: decomposition {Decomposition(position)} gives fraction {mixed[k]:R} of component {k}, expected {x[k]:R}");
                break;
            }
        }
        if (!(Math.Abs(energy - position.HullEnergyEvPerAtom) <= EnergyToleranceEvPerAtom))
        {
            Fail($"{where}: decomposition {Decomposition(position)} has energy {energy:R}, hull energy {position.HullEnergyEvPerAtom:R}");
        }
        // Every phase the LP uses with positive weight lies on the hull (complementary slackness of the LP optimum;
        // common practice), so our energy above hull for it is zero.
        for (int j = 0; j < lp.Phases.Length; j++)
        {
            if (lp.Weights[j] <= LpPhaseWeight) continue;
            double above = hull.EnergyAboveHullEvPerAtom(lp.Phases[j]);
            if (!(above <= EnergyToleranceEvPerAtom))
            {
                Fail($"{where}: {source} decomposes into {set.Describe(lp.Phases[j])} (weight {lp.Weights[j]:R}), which we place {above:R} above the hull");
            }
        }
    }

    public void AssertNone(string context)
    {
        if (_failures.Count == 0) return;
        Assert.Fail($"{context}: {_failures.Count} disagreement(s):\n" + string.Join("\n", _failures.Take(25)));
    }

    /// <summary>Fails when any engine's check found a disagreement, naming each engine that disagreed.</summary>
    public static void AssertNone(string context, params (string Engine, HullAgreement Check)[] checks)
    {
        var failing = checks.Where(c => c.Check._failures.Count > 0).ToList();
        if (failing.Count == 0) return;
        Assert.Fail($"{context}: " + string.Join("\n", failing.Select(c =>
            $"{c.Engine} disagreed {c.Check._failures.Count} time(s):\n  " + string.Join("\n  ", c.Check._failures.Take(25)))));
    }

    private static string Decomposition(HullPosition p) =>
        string.Join(" + ", p.VertexPoints.Select((v, i) => $"{p.AtomFractions[i]:R}*#{v}"));

    private void Fail(string message) => _failures.Add(message);
}
