namespace Hull.Core.Thermo.Uncertainty;

/// <summary>
/// Stability of one chemical system's entries under their energy uncertainty: per entry odds, the probable stable
/// set (entries that are vertices in at least half the samples) and the stable set seen most often with its
/// frequency, with how many samples were drawn, from which seed, and why sampling stopped; and how many points
/// (entries and reference corners) each sample's hull was rebuilt over, on average (the rest could not be vertices).
/// </summary>
public sealed record StabilitySamplingResult(
    string SystemName,
    HullAxis Axis,
    IReadOnlyList<ElementReference> References,
    IReadOnlyList<EntryStabilityOdds> Entries,
    IReadOnlyList<string> ProbableStableSet,
    IReadOnlyList<string> MostFrequentStableSet,
    double MostFrequentStableSetProbability,
    int SampleCount,
    ulong Seed,
    SamplingStopReason StopReason,
    double? TargetStandardError,
    double LargestVertexStandardError,
    IReadOnlyList<CorrelationGroup> Groups,
    double MeanPointsRebuilt);
