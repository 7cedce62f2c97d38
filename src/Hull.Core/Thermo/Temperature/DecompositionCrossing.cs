namespace Hull.Core.Thermo.Temperature;

/// <summary>
/// One temperature where a phase's signed decomposition energy changes sign: the bracket it was found in, how, and
/// what the phase turns into there (the hull without its composition), with the gas it gives off (molecules per
/// formula unit of the phase as written; negative: it takes gas up).
/// </summary>
public sealed record DecompositionCrossing(
    double TemperatureK,
    CrossingDirection Direction,
    double BracketLowK,
    double BracketHighK,
    CrossingMethod Method,
    int Iterations,
    bool Converged,
    Decomposition Competitors,
    double GasReleasedMoleculesPerFormulaUnit);
