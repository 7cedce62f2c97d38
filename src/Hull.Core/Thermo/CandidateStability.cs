using Hull.Core.Chemistry;

namespace Hull.Core.Thermo;

/// <summary>
/// How a composition with a given energy on the hull's axis would sit against an existing hull, without adding it.
/// </summary>
public sealed class CandidateStability
{
    internal CandidateStability(
        Composition composition, HullAxis axis, double axisEnergyEvPerAtom, double energyRelativeToHullEvPerAtom, Decomposition decomposition)
    {
        Composition = composition;
        Axis = axis;
        AxisEnergyEvPerAtom = axisEnergyEvPerAtom;
        EnergyRelativeToHullEvPerAtom = energyRelativeToHullEvPerAtom;
        Decomposition = decomposition;
    }

    /// <summary>The candidate's composition.</summary>
    public Composition Composition { get; }

    /// <summary>The energy axis of the hull it was assessed against.</summary>
    public HullAxis Axis { get; }

    /// <summary>The candidate's energy on that axis (<see cref="HullAxis.Unit"/>): its formation energy on the closed hull.</summary>
    public double AxisEnergyEvPerAtom { get; }

    /// <summary>The candidate's formation energy (eV/atom) where the axis is formation energy; null otherwise.</summary>
    public double? FormationEnergyEvPerAtom =>
        Axis.Quantity == HullAxisQuantity.FormationEnergy ? AxisEnergyEvPerAtom : null;

    /// <summary>Axis energy minus the hull energy at the composition; negative when it would lower the hull.</summary>
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
