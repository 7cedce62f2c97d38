namespace Hull.Core.Thermo.Electrochemistry;

/// <summary>
/// The electrochemical stability window of a phase against A/A⁺: the range of the ion's potential Δμ_A (relative to
/// A metal) over which the phase stays on the open-element hull with A open, as voltages V = −Δμ_A/z, and what the
/// phase turns into beyond each end.
/// </summary>
/// <param name="Phase">The phase's stability on the closed hull.</param>
/// <param name="Ion">A.</param>
/// <param name="ChargeNumber">z.</param>
/// <param name="HighestIonPotentialEvPerAtom">Δμ_A at the reduction end (the lowest voltage); null when the phase is no stable phase.</param>
/// <param name="LowestIonPotentialEvPerAtom">Δμ_A at the oxidation end (the highest voltage); null when the phase
/// is no stable phase, or holds no A and so stays stable however low Δμ_A goes.</param>
/// <param name="ReductionProducts">What the phase's closed-element composition becomes just above the highest Δμ_A
/// (with A taken from the reservoir); null where there is no such end, or where the window reaches A metal itself (0 V).</param>
/// <param name="OxidationProducts">What it becomes just below the lowest Δμ_A (giving A to the reservoir); null where there is no such end.</param>
public sealed record IonStabilityWindow(
    EntryStability Phase,
    string Ion,
    int ChargeNumber,
    double? HighestIonPotentialEvPerAtom,
    double? LowestIonPotentialEvPerAtom,
    Decomposition? ReductionProducts,
    Decomposition? OxidationProducts)
{
    /// <summary>True when the phase is a stable phase of the closed hull, and so has a window.</summary>
    public bool Exists => HighestIonPotentialEvPerAtom is not null;

    /// <summary>The lowest voltage against A metal at which the phase is stable (V).</summary>
    public double? ReductionLimitVolts => HighestIonPotentialEvPerAtom is { } mu ? 0.0 - (mu / ChargeNumber) : null; // 0.0 − : never −0 V

    /// <summary>The highest voltage against A metal at which the phase is stable (V); null: no upper limit in this system.</summary>
    public double? OxidationLimitVolts => LowestIonPotentialEvPerAtom is { } mu ? -mu / ChargeNumber : null;

    /// <summary>What the values rest on.</summary>
    public string Caveat => ElectrochemicalConstants.ZeroKelvinCaveat;
}
