using Hull.Core.Chemistry;

namespace Hull.Core.Thermo;

/// <summary>
/// Compound end-members that serve as the components of a pseudo-binary, pseudo-ternary, ... hull (for example
/// LiCoO2, LiNiO2, LiMnO2). Compositions are written exactly as non-negative amounts of end-member formula units
/// and, for the hull, as the fraction of atoms each end-member contributes, so that energies per atom obey the
/// lever rule. The end-members must be linearly independent.
/// </summary>
public sealed class EndMemberBasis
{
    private readonly Rational[][] _elementVectors;
    private readonly Rational[] _atomsPerFormulaUnit;

    /// <param name="endMembers">The end-member compositions; their order is the hull's component order.</param>
    /// <param name="names">Names for the end-members (e.g. "LiCoO2" as usually written, or "cathode"); default: their formulas.</param>
    /// <exception cref="ThermoInputException">No end-members, end-members that are not linearly independent, or
    /// names that are missing, empty or repeated.</exception>
    public EndMemberBasis(IReadOnlyList<Composition> endMembers, IReadOnlyList<string>? names = null)
    {
        ArgumentNullException.ThrowIfNull(endMembers);
        if (endMembers.Count == 0)
        {
            throw new ThermoInputException("An end-member basis needs at least one end-member.");
        }

        for (int j = 0; j < endMembers.Count; j++)
        {
            if (endMembers[j] is null)
            {
                throw new ThermoInputException($"End-member {j} is missing (null).", rowIndex: j);
            }
        }

        EndMembers = endMembers.ToArray();
        Elements = endMembers.SelectMany(c => c.Elements).Distinct().Order(StringComparer.Ordinal).ToArray();
        Names = names?.ToArray() ?? endMembers.Select(c => c.Formula).ToArray();
        if (Names.Count != endMembers.Count)
        {
            throw new ThermoInputException($"{endMembers.Count} end-members but {Names.Count} names.");
        }

        for (int j = 0; j < Names.Count; j++)
        {
            if (string.IsNullOrWhiteSpace(Names[j]))
            {
                throw new ThermoInputException($"End-member {j} has an empty name.", rowIndex: j);
            }

            if (Names.Take(j).Contains(Names[j], StringComparer.Ordinal))
            {
                throw new ThermoInputException($"End-member name '{Names[j]}' is used twice.", rowIndex: j);
            }
        }
        _elementVectors = endMembers.Select(ElementVector).ToArray();
        _atomsPerFormulaUnit = endMembers.Select(c => c.AtomsPerFormulaUnit).ToArray();

        // Add the end-members one by one; the first that does not raise the rank is a combination of earlier ones.
        for (int j = 0; j < _elementVectors.Length; j++)
        {
            if (ExactLinearAlgebra.Rank(_elementVectors.Take(j + 1).ToArray()) != j + 1)
            {
                string earlier = string.Join(", ", Names.Take(j));
                throw new ThermoInputException(
                    $"End-members must be linearly independent: {Names[j]} (end-member {j}) is a combination of {earlier}.",
                    rowIndex: j);
            }
        }
    }

    /// <summary>The end-member compositions, in the order given (this is the component order of the hull).</summary>
    public IReadOnlyList<Composition> EndMembers { get; }

    /// <summary>The end-members' names (their formulas unless named), in order: the hull's component names.</summary>
    public IReadOnlyList<string> Names { get; }

    /// <summary>Every element of the end-members, ordinally sorted.</summary>
    public IReadOnlyList<string> Elements { get; }

    /// <summary>
    /// The amounts of end-member formula units that make one formula unit of <paramref name="composition"/>
    /// (exact; e.g. LiCo0.5Ni0.5O2 = 1/2 LiCoO2 + 1/2 LiNiO2).
    /// </summary>
    /// <exception cref="ThermoInputException">When the composition is not a non-negative combination of the end-members.</exception>
    public IReadOnlyList<Rational> FormulaUnitsOf(Composition composition)
    {
        ArgumentNullException.ThrowIfNull(composition);
        if (!TryExpress(composition, out Rational[]? formulaUnits, out string? failure))
        {
            throw new ThermoInputException($"{composition.Formula} {failure}");
        }

        return formulaUnits;
    }

    /// <summary>
    /// The fraction of the atoms of <paramref name="composition"/> that each end-member contributes (sums to 1).
    /// </summary>
    /// <exception cref="ThermoInputException">When the composition is not a non-negative combination of the end-members.</exception>
    public IReadOnlyList<double> AtomFractionsOf(Composition composition)
    {
        ArgumentNullException.ThrowIfNull(composition);
        if (!TryComponentAtoms(composition, out Rational[]? atoms, out string? failure))
        {
            throw new ThermoInputException($"{composition.Formula} {failure}");
        }

        Rational total = Rational.Zero;
        foreach (Rational a in atoms)
        {
            total += a;
        }

        return atoms.Select(a => (a / total).ToDouble()).ToArray();
    }

    /// <summary>Exact formula-unit amounts, or a failure text that completes "Formula ...".</summary>
    internal bool TryExpress(Composition composition, out Rational[] formulaUnits, out string failure)
    {
        formulaUnits = [];
        string[] outside = composition.Elements.Where(e => !Elements.Contains(e, StringComparer.Ordinal)).ToArray();
        if (outside.Length > 0)
        {
            failure = $"contains {string.Join(", ", outside)}, which no end-member ({string.Join(", ", Names)}) contains.";
            return false;
        }

        Rational[]? solution;
        try
        {
            solution = ExactLinearAlgebra.Solve(_elementVectors, ElementVector(composition));
        }
        catch (OverflowException)
        {
            failure = $"needs amounts of the end-members {string.Join(", ", Names)} that do not fit in 64-bit fractions; write it with smaller numbers.";
            return false;
        }

        if (solution is null)
        {
            failure = $"is not a combination of the end-members {string.Join(", ", Names)} (its element ratios lie outside their span).";
            return false;
        }

        for (int j = 0; j < solution.Length; j++)
        {
            if (solution[j].Sign < 0)
            {
                failure = $"needs a negative amount ({solution[j]}) of end-member {Names[j]}; only non-negative combinations of {string.Join(", ", Names)} lie on this hull.";
                return false;
            }
        }

        formulaUnits = solution;
        failure = string.Empty;
        return true;
    }

    /// <summary>Atoms contributed by each end-member to one formula unit of the composition.</summary>
    internal bool TryComponentAtoms(Composition composition, out Rational[] atoms, out string failure)
    {
        if (!TryExpress(composition, out Rational[] formulaUnits, out failure))
        {
            atoms = [];
            return false;
        }

        atoms = new Rational[formulaUnits.Length];
        try
        {
            for (int j = 0; j < atoms.Length; j++)
            {
                atoms[j] = formulaUnits[j] * _atomsPerFormulaUnit[j];
            }
        }
        catch (OverflowException)
        {
            atoms = [];
            failure = $"needs atoms of the end-members {string.Join(", ", Names)} that do not fit in 64-bit fractions; write it with smaller numbers.";
            return false;
        }

        return true;
    }

    private Rational[] ElementVector(Composition composition) =>
        Elements.Select(e => composition.AmountOf(e)).ToArray();
}
