using Hull.Core.Chemistry;

namespace Hull.Core.Thermo;

/// <summary>
/// How a composition with a given formation energy would sit against an existing hull, without adding it.
/// </summary>
public sealed class CandidateStability
{
    internal CandidateStability(Composition composition, double formationEnergyEvPerAtom, double energyRelativeToHullEvPerAtom, Decomposition decomposition)
    {
        Composition = composition;
        FormationEnergyEvPerAtom = formationEnergyEvPerAtom;
        EnergyRelativeToHullEvPerAtom = energyRelativeToHullEvPerAtom;
        Decomposition = decomposition;
    }

    /// <summary>The candidate's composition.</summary>
    public Composition Composition { get; }

    /// <summary>The candidate's formation energy (eV/atom).</summary>
    public double FormationEnergyEvPerAtom { get; }

    /// <summary>Formation energy minus the hull energy at the composition (eV/atom); negative when it would lower the hull.</summary>
    public double EnergyRelativeToHullEvPerAtom { get; }

    /// <summary>max(0, <see cref="EnergyRelativeToHullEvPerAtom"/>) (eV/atom).</summary>
    public double EnergyAboveHullEvPerAtom => Math.Max(0.0, EnergyRelativeToHullEvPerAtom);

    /// <summary>
    /// True when the candidate would lie on the hull (within the hull tolerance) or below it. Only a candidate
    /// strictly below (<see cref="IsBelowHull"/>) would become a stable phase, i.e. a hull vertex.
    /// </summary>
    public bool IsOnOrBelowHull => EnergyRelativeToHullEvPerAtom <= 0.0;

    /// <summary>True when the candidate would lie strictly below the hull and so change it.</summary>
    public bool IsBelowHull => EnergyRelativeToHullEvPerAtom < 0.0;

    /// <summary>The competing hull phases at the candidate's composition.</summary>
    public Decomposition Decomposition { get; }
}
