using Hull.Core.Chemistry;
using Hull.Core.Geometry;
using Hull.Core.Thermo.Lines;

namespace Hull.Core.Thermo.Reactions;

/// <summary>
/// Reaction energies between two phases. A mixture of atom fraction x of the first reactant a and 1 − x of the
/// second b reacts to the hull at its composition: ΔE(x) = E_hull(x·c_a + (1 − x)·c_b) − x E_a − (1 − x) E_b per
/// atom. E_hull is convex and piecewise linear along the mixing line, so ΔE is too and its minimum lies at one of
/// the breakpoints, which the hull gives exactly (the ends of the line's stretches in each face). Works on any
/// hull: on an open-element hull, atoms count the closed elements and energies are grand potentials.
/// </summary>
public static class PhaseReactions
{
    /// <param name="hull">The hull of a system holding both reactants.</param>
    /// <param name="firstEntryId">Reactant a (x counts its share).</param>
    /// <param name="secondEntryId">Reactant b.</param>
    /// <exception cref="ThermoInputException">An unknown reactant, the same phase twice, or two reactants of one composition.</exception>
    public static ReactionProfile Profile(SystemHull hull, string firstEntryId, string secondEntryId)
    {
        ArgumentNullException.ThrowIfNull(hull);
        EntryStability a = Reactant(hull, firstEntryId);
        EntryStability b = Reactant(hull, secondEntryId);
        if (string.Equals(a.Id, b.Id, StringComparison.Ordinal))
        {
            throw new ThermoInputException($"The two reactants are the same phase '{a.Id}'; a reaction needs two different phases.", entryId: a.Id);
        }

        Rational[] atomsA = [.. hull.ComponentAtomsOf(a.Composition)];
        Rational[] atomsB = [.. hull.ComponentAtomsOf(b.Composition)];
        Rational totalA = Sum(atomsA), totalB = Sum(atomsB);
        var perAtomA = atomsA.Select(v => v / totalA).ToArray();
        var perAtomB = atomsB.Select(v => v / totalB).ToArray();
        if (perAtomA.SequenceEqual(perAtomB))
        {
            throw new ThermoInputException(
                $"The reactants '{a.Id}' and '{b.Id}' have one composition ({a.Composition.ReducedFormula}) on this hull; mixing them changes nothing.", entryId: b.Id);
        }

        var direction = perAtomA.Zip(perAtomB, (x, y) => x - y).ToArray();
        IReadOnlyList<HullLineSegment> segments = hull.SegmentsAlong(perAtomB, direction, Rational.One);

        var points = new List<ReactionPoint>(segments.Count + 1);
        for (int k = 0; k <= segments.Count; k++)
        {
            HullLineSegment segment = k < segments.Count ? segments[k] : segments[^1];
            Rational x = k < segments.Count ? segment.From : Rational.One;
            points.Add(PointAt(x, segment, a, b, totalA.ToDouble(), totalB.ToDouble()));
        }

        int best = 0, bestPerUnit = 0;
        for (int k = 1; k < points.Count; k++)
        {
            if (points[k].ReactionEnergyEvPerAtom < points[best].ReactionEnergyEvPerAtom) best = k;
            if (points[k].ReactionEnergyEvPerFormulaUnit < points[bestPerUnit].ReactionEnergyEvPerFormulaUnit) bestPerUnit = k;
        }

        return new ReactionProfile(a, b, hull.Axis, hull.SystemName, points, best, bestPerUnit);
    }

    private static ReactionPoint PointAt(Rational x, HullLineSegment segment, EntryStability a, EntryStability b, double atomsA, double atomsB)
    {
        double xd = x.ToDouble();
        double energy = segment.HullEnergyEvAt(x) - (xd * a.AxisEnergyEvPerAtom) - ((1 - xd) * b.AxisEnergyEvPerAtom);
        if (Math.Abs(energy) <= HullTolerances.EnergyEvPerAtom)
        {
            energy = 0.0;
        }

        // x of the atoms from a is f·N_a / (f·N_a + (1 − f)·N_b) for f formula units of a.
        double unitsA = xd / atomsA, unitsB = (1 - xd) / atomsB;
        double f = unitsA / (unitsA + unitsB);
        double atomsPerMixedUnit = (f * atomsA) + ((1 - f) * atomsB);
        var products = segment.Phases
            .Select(p => new ReactionProduct(p.Phase, p.UnitsAt(x)))
            .Where(p => p.FormulaUnitsPerMixtureAtom.Sign > 0)
            .ToArray();
        return new ReactionPoint(x, f, energy, energy * atomsPerMixedUnit, products);
    }

    private static EntryStability Reactant(SystemHull hull, string id)
    {
        if (string.IsNullOrEmpty(id) || !hull.Entries.Any(e => string.Equals(e.Id, id, StringComparison.Ordinal)))
        {
            throw new ThermoInputException($"No entry '{id}' in the hull of {hull.SystemName}.", entryId: id);
        }

        return hull.GetEntry(id);
    }

    private static Rational Sum(Rational[] values)
    {
        Rational total = Rational.Zero;
        foreach (Rational v in values) total += v;
        return total;
    }
}
