using Hull.Core.Chemistry;
using Hull.Core.Thermo;

namespace Hull.Core.Tests.Generators;

/// <summary>
/// Degenerate phase sets for window checks: a few "anchor" potential vectors μ^k ≤ 0 (multiples of 0.25 eV) and
/// phases of small integer amounts whose formation energy per atom is max_k μ^k·x (so every anchor satisfies every
/// limit), raised by a gap for some. Every
/// phase without a gap is tight at its anchor, so dozens of constraints pass through one point of the potential
/// space and many phases lie on one hull plane (inside facets, on edges): the degenerate case windows meet in data.
/// Polymorphs at equal energy and pure elements at 0 are added.
/// </summary>
public static class WindowDataGenerator
{
    private static readonly string[] Symbols = ["Li", "Co", "Ni", "Mn", "Al", "Mg", "F", "O", "Ti"];

    public static (string[] Elements, PhaseEntry[] Entries) Generate(int elementCount, int phaseCount, int seed, int anchors = 3)
    {
        var rng = new Random(seed);
        string[] elements = Symbols.OrderBy(_ => rng.Next()).Take(elementCount).Order(StringComparer.Ordinal).ToArray();
        var mu = new double[anchors][];
        for (int k = 0; k < anchors; k++) mu[k] = elements.Select(_ => -0.25 * rng.Next(1, 9)).ToArray();
        var entries = new List<PhaseEntry>();
        foreach (string e in elements) entries.Add(new PhaseEntry($"{e}-ref", Composition.OfElement(e), 0.0, EnergyBasis.FormationPerAtom));
        var seen = new HashSet<string>();
        var onAnchor = new List<(long[] Amounts, int Anchor)>();
        for (int j = 0; entries.Count < phaseCount + elementCount && j < phaseCount * 20; j++)
        {
            // A third of the phases hold every element, a third all but the last (hosts for a dopant that is
            // the last element), the rest a random subset.
            int mode = rng.Next(3);
            var amounts = elements.Select((_, i) =>
                (long)(mode == 0 || (mode == 1 && i < elementCount - 1) ? rng.Next(1, 5) : mode == 1 || rng.Next(3) == 0 ? 0 : rng.Next(1, 5)))
                .ToArray();
            if (amounts.Count(a => a > 0) < 2) continue;
            var composition = Composition.FromAmounts(elements.Zip(amounts).Where(p => p.Second > 0).Select(p => (p.First, (Rational)p.Second)).ToArray());
            if (!seen.Add(composition.Reduced.Formula)) continue;
            double atoms = amounts.Sum();
            double energy = mu.Max(m => m.Select((v, i) => v * amounts[i] / atoms).Sum());
            int gap = rng.Next(4);
            double raised = gap == 0 ? 0.0 : 0.05 * gap * (rng.Next(2) == 0 ? 1 : 0);
            energy += raised;
            if (raised == 0 && mode == 0)
            {
                int anchor = Enumerable.Range(0, anchors).MaxBy(k => mu[k].Select((v, i) => v * amounts[i] / atoms).Sum());
                onAnchor.Add((amounts, anchor));
            }

            entries.Add(new PhaseEntry($"p{j}", composition, energy, EnergyBasis.FormationPerAtom));
            if (rng.Next(8) == 0)
            {
                entries.Add(new PhaseEntry($"p{j}-twin", composition.Scale(2), energy, EnergyBasis.FormationPerAtom));
            }
        }

        // Mixtures of two phases tight at one anchor lie on the hull inside its face there (no vertex): their
        // windows are lower-dimensional.
        for (int t = 0; t < phaseCount / 5 && onAnchor.Count > 1; t++)
        {
            var (a, k) = onAnchor[rng.Next(onAnchor.Count)];
            var partners = onAnchor.Where(p => p.Anchor == k && !ReferenceEquals(p.Amounts, a)).ToArray();
            if (partners.Length == 0) continue;
            long[] b = partners[rng.Next(partners.Length)].Amounts;
            long[] sum = a.Zip(b, (u, v) => u + v).ToArray();
            var composition = Composition.FromAmounts(elements.Zip(sum).Select(p => (p.First, (Rational)p.Second)).ToArray());
            if (!seen.Add(composition.Reduced.Formula)) continue;
            double atoms = sum.Sum();
            double energy = mu[k].Select((v, i) => v * sum[i] / atoms).Sum();
            entries.Add(new PhaseEntry($"mix{t}", composition, energy, EnergyBasis.FormationPerAtom));
        }

        return (elements, entries.ToArray());
    }
}
