namespace Hull.Core.Thermo.Uncertainty;

/// <summary>
/// One entry's stability over the samples of its system's energies: how often it was a hull vertex (with the
/// Monte Carlo standard error √(p(1−p)/N)), its energy above hull (mean, standard error of the mean, 5th and 95th
/// percentiles), and the decomposition it took most often with how often. The plain hull's answer (energies
/// without error) is carried beside it. <c>MostProbableProducts</c> are the ids of the phases of the most frequent
/// decomposition, in the hull's id order (the entry's own id alone when it was most often a vertex).
/// </summary>
public sealed record EntryStabilityOdds(
    string EntryId,
    string Formula,
    double SigmaEvPerAtom,
    string? Group,
    double VertexProbability,
    double VertexProbabilityStandardError,
    double MeanEnergyAboveHullEvPerAtom,
    double MeanEnergyAboveHullStandardErrorEvPerAtom,
    double EnergyAboveHullP05EvPerAtom,
    double EnergyAboveHullP95EvPerAtom,
    IReadOnlyList<string> MostProbableProducts,
    double MostProbableProductsProbability,
    bool PlainIsVertex,
    double PlainEnergyAboveHullEvPerAtom);
