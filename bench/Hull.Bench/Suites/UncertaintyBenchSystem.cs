using System.Globalization;
using System.Security.Cryptography;
using System.Text;
using Hull.Bench.Data;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Uncertainty;

namespace Hull.Bench.Suites;

/// <summary>
/// The sampling benchmarks' system: a generated five-component lattice (Co, Li, Mn, Ni, O) with σ = 0.02 eV/atom on
/// every compound and a quarter of the compounds also in the correlation group "method-b" (σ 0.01).
/// </summary>
public sealed record UncertaintyBenchSystem(
    PhaseEntry[] Rows, SystemHull Plain, EnergyUncertainty[] Sigma, CorrelationGroup[] Groups)
{
    public const int Entries = 2_000;
    private static readonly string[] Elements = ["Co", "Li", "Mn", "Ni", "O"];

    public static UncertaintyBenchSystem Generate(EnergyDistribution distribution, int entries, int seed)
    {
        PointSet points = LatticeGenerator.Generate(Elements.Length, entries, LatticeGenerator.SmallCellMaxAtoms, distribution, seed);
        PhaseEntry[] rows = points.Amounts.Select((a, i) => new PhaseEntry(
            $"e{i:00000}", FiguresSuite.Formula(Elements, a), points.EnergiesEvPerAtom[i], EnergyBasis.FormationPerAtom)).ToArray();
        SystemHull plain = SystemHull.OverElements(rows);
        EnergyUncertainty[] sigma = rows.Select((r, i) => new EnergyUncertainty(
            r.Id, r.Composition.Elements.Count > 1 ? 0.02 : 0.0, r.Composition.Elements.Count > 1 && i % 4 == 0 ? "method-b" : null)).ToArray();
        return new UncertaintyBenchSystem(rows, plain, sigma, [new("method-b", 0.01)]);
    }

    /// <summary>
    /// A digest of every reading of a result (each number to the last bit, products, stable sets), so that two
    /// builds or thread counts can be shown to give the same answer.
    /// </summary>
    public static string Fingerprint(StabilitySamplingResult result)
    {
        var text = new StringBuilder();
        foreach (EntryStabilityOdds o in result.Entries)
        {
            text.Append(CultureInfo.InvariantCulture, $"{o.EntryId} {o.VertexProbability:R} {o.VertexProbabilityStandardError:R} ")
                .Append(CultureInfo.InvariantCulture, $"{o.MeanEnergyAboveHullEvPerAtom:R} {o.MeanEnergyAboveHullStandardErrorEvPerAtom:R} ")
                .Append(CultureInfo.InvariantCulture, $"{o.EnergyAboveHullP05EvPerAtom:R} {o.EnergyAboveHullP95EvPerAtom:R} ")
                .Append(string.Join(',', o.MostProbableProducts))
                .Append(CultureInfo.InvariantCulture, $" {o.MostProbableProductsProbability:R}\n");
        }

        text.Append(string.Join(',', result.ProbableStableSet)).Append('\n')
            .Append(string.Join(',', result.MostFrequentStableSet))
            .Append(CultureInfo.InvariantCulture, $" {result.MostFrequentStableSetProbability:R} {result.LargestVertexStandardError:R} {result.MeanPointsRebuilt:R}");
        return Convert.ToHexString(SHA256.HashData(Encoding.UTF8.GetBytes(text.ToString())))[..16].ToLowerInvariant();
    }
}
