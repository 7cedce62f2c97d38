using System.Globalization;
using System.Text;
using Hull.Protos.V1;

namespace Hull.ServiceBench;

/// <summary>One cation of an invented oxide family: its symbol, the valences it may take, and how strongly it binds oxygen.</summary>
/// <param name="Symbol">Element symbol.</param>
/// <param name="Valences">Oxidation states the generator picks from when it balances oxygen.</param>
/// <param name="OxideStrengthEvPerAtom">Depth of the invented formation-energy curve at half oxygen, eV/atom.</param>
public sealed record Cation(string Symbol, int[] Valences, double OxideStrengthEvPerAtom);

/// <summary>A quaternary oxide family: three cations and oxygen.</summary>
public sealed record OxideFamily(string Tag, Cation[] Cations)
{
    public IEnumerable<string> Elements => Cations.Select(c => c.Symbol).Append("O");
}

/// <summary>
/// Invented but plausible phase entries for load tests: elements with a few polymorphs, binary, ternary and
/// quaternary oxides with roughly charge-balanced oxygen, and a few cation-only alloys. Formation energies follow a
/// smooth curve in the oxygen fraction, deepened slightly by cation mixing, plus a positive scatter so that most
/// entries sit above the hull and some on it. The numbers are made up for the benchmark; they describe no real
/// material. Deterministic for a given seed.
/// </summary>
public sealed class SyntheticOxides
{
    /// <summary>The five families of the warm dataset; they share only oxygen.</summary>
    public static readonly OxideFamily[] Families =
    [
        new("LMN", [new("Li", [1], 2.1), new("Mn", [2, 3, 4], 2.0), new("Ni", [2, 3], 1.3)]),
        new("NFP", [new("Na", [1], 1.4), new("Fe", [2, 3], 1.7), new("P", [5], 1.6)]),
        new("MAS", [new("Mg", [2], 3.1), new("Al", [3], 3.4), new("Si", [4], 3.0)]),
        new("CTZ", [new("Ca", [2], 3.3), new("Ti", [3, 4], 3.3), new("Zr", [4], 3.8)]),
        new("KVW", [new("K", [1], 1.3), new("V", [3, 4, 5], 2.2), new("W", [4, 6], 2.1)]),
    ];

    private const string Note = "invented for the service benchmark";
    private readonly Random _random;

    public SyntheticOxides(int seed) => _random = new Random(seed);

    /// <summary>
    /// <paramref name="count"/> entries spread evenly over the families, ids "<paramref name="idPrefix"/>-FAMILY-NNNNNN".
    /// Each family starts with its elements (a ground state at 0 and one polymorph above it).
    /// </summary>
    public List<Entry> Entries(int count, string idPrefix)
    {
        var entries = new List<Entry>(count);
        int perFamily = count / Families.Length;
        for (int f = 0; f < Families.Length; f++)
        {
            OxideFamily family = Families[f];
            int inFamily = f == Families.Length - 1 ? count - perFamily * (Families.Length - 1) : perFamily;
            int serial = 0;
            string Id() => $"{idPrefix}-{family.Tag}-{serial++:D6}";
            foreach (string element in family.Elements)
            {
                if (serial >= inFamily) break;
                entries.Add(Formation(Id(), element, 0.0));
                if (serial >= inFamily) break;
                entries.Add(Formation(Id(), element, 0.02 + 0.28 * _random.NextDouble()));
            }

            while (serial < inFamily)
            {
                (string formula, double evPerAtom, int atoms) = Compound(family);
                // A third of the rows give the energy per formula unit, as many codes report it.
                entries.Add(serial % 3 == 0
                    ? new Entry { Id = Id(), Formula = formula, EnergyEv = evPerAtom * atoms, Basis = EnergyBasis.FormationPerFormulaUnit, Note = Note }
                    : Formation(Id(), formula, evPerAtom));
            }
        }

        return entries;
    }

    /// <summary>Ad-hoc compositions with an energy, labelled "cand-NNNNNN", drawn like the stored compounds.</summary>
    public List<Candidate> Candidates(int count)
    {
        var candidates = new List<Candidate>(count);
        for (int i = 0; i < count; i++)
        {
            (string formula, double evPerAtom, _) = Compound(Families[i % Families.Length]);
            candidates.Add(new Candidate
            {
                Label = $"cand-{i:D6}",
                Formula = formula,
                EnergyEv = evPerAtom,
                Basis = EnergyBasis.FormationPerAtom,
            });
        }

        return candidates;
    }

    private static Entry Formation(string id, string formula, double evPerAtom) =>
        new() { Id = id, Formula = formula, EnergyEv = evPerAtom, Basis = EnergyBasis.FormationPerAtom, Note = Note };

    /// <summary>A random compound of the family: its formula, formation energy (eV/atom) and atoms per formula unit.</summary>
    private (string Formula, double EvPerAtom, int Atoms) Compound(OxideFamily family)
    {
        double kind = _random.NextDouble();
        // 5 % cation-only alloys, 15 % binary, 35 % ternary and 45 % quaternary oxides.
        bool alloy = kind < 0.05;
        int cationCount = alloy ? 2 : kind < 0.20 ? 1 : kind < 0.55 ? 2 : 3;
        Cation[] chosen = family.Cations.OrderBy(_ => _random.Next()).Take(cationCount)
            .OrderBy(c => Array.IndexOf(family.Cations, c)).ToArray();
        int[] amounts = chosen.Select(_ => 1 + _random.Next(4)).ToArray();
        int cationAtoms = amounts.Sum();
        double strength = chosen.Select((c, i) => c.OxideStrengthEvPerAtom * amounts[i]).Sum() / cationAtoms;

        var formula = new StringBuilder();
        for (int i = 0; i < chosen.Length; i++) Append(formula, chosen[i].Symbol, amounts[i]);
        if (alloy)
        {
            double x = (double)amounts[0] / cationAtoms;
            double energy = -0.3 * _random.NextDouble() * 4 * x * (1 - x) + Math.Abs(Gaussian(0.05));
            return (formula.ToString(), energy, cationAtoms);
        }

        int charge = chosen.Select((c, i) => c.Valences[_random.Next(c.Valences.Length)] * amounts[i]).Sum();
        int balanced = Math.Max(1, (charge + 1) / 2);
        // Most compounds balance their charge; some carry one oxygen too few or too many and pay for it.
        int offset = _random.Next(10) switch { 0 => -1, 1 => 1, _ => 0 };
        int oxygen = Math.Max(1, balanced + offset);
        Append(formula, "O", oxygen);
        int atoms = cationAtoms + oxygen;
        double xO = (double)oxygen / atoms;
        double evPerAtom = -strength * 4 * xO * (1 - xO)
            - 0.04 * (cationCount - 1) * _random.NextDouble()
            + 0.4 * Math.Abs(oxygen - balanced) / atoms
            + (_random.Next(10) == 0 ? -0.03 * _random.NextDouble() : Math.Abs(Gaussian(0.12)));
        return (formula.ToString(), Math.Round(evPerAtom, 6), atoms);
    }

    private static void Append(StringBuilder formula, string symbol, int amount)
    {
        formula.Append(symbol);
        if (amount != 1) formula.Append(amount.ToString(CultureInfo.InvariantCulture));
    }

    private double Gaussian(double sigma)
    {
        // Box–Muller; 1 - NextDouble() keeps the logarithm's argument in (0, 1].
        double u = 1 - _random.NextDouble();
        double v = _random.NextDouble();
        return sigma * Math.Sqrt(-2 * Math.Log(u)) * Math.Cos(2 * Math.PI * v);
    }
}
