using Hull.Core.Thermo.Lines;

namespace Hull.Core.Thermo.Electrochemistry;

/// <summary>
/// One step of a voltage profile: the ion content range (ions per formula unit of the host) over which the same
/// phases coexist with the ion reservoir, and its constant voltage against the ion's metal.
/// </summary>
/// <param name="IonsPerHostFrom">x at the plateau's start (ions per formula unit of the host as written).</param>
/// <param name="IonsPerHostTo">x at its end.</param>
/// <param name="VoltsAgainstMetal">V = −(μ_A − E_A)/(z e): the facet's chemical potential of the ion relative to its metal, over −z.</param>
/// <param name="Phases">The phases that hold the composition on the plateau (two on an insertion plateau, three or more across a conversion region).</param>
/// <param name="IonChemicalPotentialEvPerAtom">μ_A − E_A, eV per ion atom (the facet's dual for the ion).</param>
public sealed record VoltagePlateau(
    double IonsPerHostFrom,
    double IonsPerHostTo,
    double VoltsAgainstMetal,
    IReadOnlyList<HullLinePhase> Phases,
    double IonChemicalPotentialEvPerAtom)
{
    /// <summary>Δx of the plateau.</summary>
    public double IonsPerHostWidth => IonsPerHostTo - IonsPerHostFrom;

    /// <summary>True when three or more phases coexist (the path crosses a conversion region).</summary>
    public bool IsConversion => Phases.Count >= 3;
}
