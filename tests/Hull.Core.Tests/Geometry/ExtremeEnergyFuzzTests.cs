using Hull.Core.Geometry;

namespace Hull.Core.Tests.Geometry;

/// <summary>
/// Both engines on random points whose energies span every finite magnitude (1e-300 to 1e300, mixed signs, zeros):
/// each build either refuses clearly (an ArgumentException naming the point and the accepted range) or answers every
/// question, and never fails to converge, loops or returns a non-finite number. Accepted sets must agree between the
/// engines, the independent check that the answers are the hull's and not noise.
/// </summary>
public sealed class ExtremeEnergyFuzzTests
{
    private const int Cases = 120;

    [Fact]
    public void Every_finite_energy_is_answered_or_refused_clearly()
    {
        var random = new Random(20261202);
        int refused = 0, answered = 0;
        for (int c = 0; c < Cases; c++)
        {
            int components = 2 + c % 5;
            // Half the cases stay inside the engine's range (tiny and large magnitudes mixed), half may leave it.
            bool inRange = c % 2 == 0;
            (long[][] amounts, double[] energies) = RandomSet(random, components, 6 + random.Next(25), inRange);
            bool shouldRefuse = energies.Any(e => Math.Abs(e) > HullTolerances.MaxEnergyMagnitudeEvPerAtom);
            var results = new List<(string Engine, IHullStability Hull)>();
            foreach (string engine in new[] { HullEngine.Facets, HullEngine.Programs })
            {
                IHullStability hull;
                try
                {
                    hull = HullEngine.Build(engine, amounts, energies);
                }
                catch (ArgumentException e)
                {
                    Assert.True(shouldRefuse, $"case {c}, {engine}: refused in-range input: {e.Message}");
                    Assert.Matches(@"^Point \d+: energy .* eV/atom is outside ±10000 eV/atom", e.Message);
                    refused++;
                    continue;
                }

                Assert.False(shouldRefuse, $"case {c}, {engine}: accepted an energy beyond the engine's range");
                AnswerEverything(hull, amounts, energies, random, $"case {c}, {engine}");
                results.Add((engine, hull));
                answered++;
            }

            if (results.Count == 2)
            {
                Assert.Equal(results[0].Hull.VertexPoints, results[1].Hull.VertexPoints);
                for (int i = 0; i < energies.Length; i++)
                {
                    Assert.Equal(results[0].Hull.EnergyAboveHullEvPerAtom(i), results[1].Hull.EnergyAboveHullEvPerAtom(i), Tolerance(energies));
                }
            }
        }

        Assert.True(refused > 20 && answered > 20, $"{refused} refused, {answered} answered: the draw must exercise both");
    }

    /// <summary>Rounding in plane evaluations scales with the largest magnitude (common practice: about 1e-15 relative).</summary>
    private static double Tolerance(double[] energies) => Math.Max(1e-9, 1e-11 * energies.Max(Math.Abs));

    private static void AnswerEverything(IHullStability hull, long[][] amounts, double[] energies, Random random, string where)
    {
        for (int i = 0; i < energies.Length; i++)
        {
            double above = hull.EnergyAboveHullEvPerAtom(i);
            Assert.True(double.IsFinite(above) && above >= 0, $"{where}: point {i} above hull {above}");
            HullPosition position = hull.LocatePoint(i);
            Assert.True(double.IsFinite(position.HullEnergyEvPerAtom), $"{where}: point {i} hull energy {position.HullEnergyEvPerAtom}");
            double? without = hull.HullEnergyWithoutCompositionEvPerAtom(i);
            Assert.True(without is null || double.IsFinite(without.Value), $"{where}: point {i} hull without its composition {without}");
            _ = hull.IsVertex(i);
        }

        int n = amounts[0].Length;
        for (int q = 0; q < 5; q++)
        {
            var fractions = new double[n];
            double sum = 0;
            for (int k = 0; k < n; k++) sum += fractions[k] = random.NextDouble();
            for (int k = 0; k < n; k++) fractions[k] /= sum;
            fractions[n - 1] = 1.0 - fractions.Take(n - 1).Sum();
            if (fractions[n - 1] < 0) fractions[n - 1] = 0;
            HullPosition at = hull.Locate(fractions);
            Assert.True(double.IsFinite(at.HullEnergyEvPerAtom), $"{where}: query {q} hull energy {at.HullEnergyEvPerAtom}");
        }
    }

    private static (long[][] Amounts, double[] Energies) RandomSet(Random random, int components, int compounds, bool inRange)
    {
        var amounts = new List<long[]>();
        var energies = new List<double>();
        for (int k = 0; k < components; k++)
        {
            var pure = new long[components];
            pure[k] = 1;
            amounts.Add(pure);
            energies.Add(random.Next(3) == 0 ? Extreme(random, inRange) : 0.0);
        }

        while (amounts.Count < components + compounds)
        {
            var row = new long[components];
            for (int k = 0; k < components; k++) row[k] = random.Next(0, 4);
            if (row.Count(a => a > 0) < 2) continue;
            amounts.Add(row);
            energies.Add(Extreme(random, inRange));
        }

        return (amounts.ToArray(), energies.ToArray());
    }

    /// <summary>±10^u with u uniform over the decades: 1e-300 and 1e300 are as likely as 1.</summary>
    private static double Extreme(Random random, bool inRange)
    {
        if (random.Next(8) == 0) return 0.0;
        double decade = inRange ? -300 + random.NextDouble() * 304 : -300 + random.NextDouble() * 600;
        double magnitude = Math.Pow(10, decade);
        return random.Next(2) == 0 ? -magnitude : magnitude;
    }
}
