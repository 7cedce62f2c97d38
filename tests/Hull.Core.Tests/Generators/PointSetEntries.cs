using Hull.Core.Chemistry;
using Hull.Core.Thermo;

namespace Hull.Core.Tests.Generators;

/// <summary>A generated point set as thermodynamic entries: components named by element symbols, energies as formation energies per atom.</summary>
public static class PointSetEntries
{
    /// <summary>Entry i has the id <paramref name="id"/>(i) and point i's amounts of <paramref name="symbols"/>.</summary>
    public static PhaseEntry[] AsFormationEntries(this PointSet set, IReadOnlyList<string> symbols, Func<int, string> id) =>
        Enumerable.Range(0, set.Count).Select(i => new PhaseEntry(
            id(i),
            Composition.FromAmounts(symbols.Zip(set.Amounts[i]).Where(z => z.Second > 0).Select(z => (z.First, new Rational(z.Second, 1))).ToArray()),
            set.EnergiesEvPerAtom[i],
            EnergyBasis.FormationPerAtom)).ToArray();
}
