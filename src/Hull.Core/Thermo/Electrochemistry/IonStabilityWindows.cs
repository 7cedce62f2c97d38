namespace Hull.Core.Thermo.Electrochemistry;

/// <summary>
/// Electrochemical stability windows. A phase stays on the grand-potential hull with A open exactly while Δμ_A lies
/// in the projection of its chemical-potential window on μ_A; the ends of that projection are the largest and
/// smallest μ_A over the closed hull's facets at the phase (the window's vertices), and an A-free phase's window
/// runs on without end towards low Δμ_A.
/// </summary>
public static class IonStabilityWindows
{
    /// <param name="hull">The closed hull (formation energies over elements) holding the phase and the ion.</param>
    /// <param name="entryId">The phase's entry id.</param>
    /// <param name="ion">A, an element of the system.</param>
    /// <param name="chargeNumber">z; default the ion's usual charge.</param>
    /// <exception cref="ThermoInputException">An unknown entry, or an ion not in the system.</exception>
    public static IonStabilityWindow Of(SystemHull hull, string entryId, string ion, int? chargeNumber = null)
    {
        ArgumentNullException.ThrowIfNull(hull);
        int z = InsertionVoltages.CheckIon(hull, ion, chargeNumber);
        if (!hull.Entries.Any(e => string.Equals(e.Id, entryId, StringComparison.Ordinal)))
        {
            throw new ThermoInputException($"No entry '{entryId}' in the hull of {hull.SystemName}.", entryId: entryId);
        }

        EntryStability phase = hull.GetEntry(entryId);
        if (!phase.IsHullVertex)
        {
            return new IonStabilityWindow(phase, ion, z, null, null, null, null);
        }

        double highest = double.NegativeInfinity, lowest = double.PositiveInfinity;
        foreach (PhaseFacet facet in hull.Facets)
        {
            if (!facet.Phases.Any(p => string.Equals(p.Id, entryId, StringComparison.Ordinal)))
            {
                continue;
            }

            double mu = facet.ChemicalPotentialOf(ion);
            highest = Math.Max(highest, mu);
            lowest = Math.Min(lowest, mu);
        }

        bool holdsIon = phase.Composition.Contains(ion);
        double? low = holdsIon ? lowest : null;
        bool hasClosedAtoms = phase.Composition.Elements.Any(e => !string.Equals(e, ion, StringComparison.Ordinal));
        // A window that reaches Δμ_A = 0 ends at the ion's own metal (0 V), not at a reaction of the phase.
        bool toMetal = highest >= -Geometry.HullTolerances.EnergyEvPerAtom;
        if (toMetal)
        {
            highest = 0.0;
        }
        Decomposition? reduced = hasClosedAtoms && !toMetal ? Beyond(hull, phase, ion, highest) : null;
        Decomposition? oxidised = hasClosedAtoms && low is { } l ? Beyond(hull, phase, ion, l) : null;
        return new IonStabilityWindow(phase, ion, z, highest, low, reduced, oxidised);
    }

    /// <summary>The phase's closed-element composition on the open hull at <paramref name="ionPotential"/> without its own composition.</summary>
    private static Decomposition Beyond(SystemHull hull, EntryStability phase, string ion, double ionPotential)
    {
        OpenElementHull open = OpenElementHull.Open(
            hull, [new ReservoirPotential(ion, ionPotential)], allowAboveReference: true,
            leaveOut: e => e.Composition.HasSameProportions(phase.Composition));
        return open.Hull.DecompositionAt(phase.Composition);
    }
}
