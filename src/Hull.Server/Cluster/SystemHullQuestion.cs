namespace Hull.Server.Cluster;

/// <summary>The stability calls a system's grain answers, each for the part of a request that lies in its system.</summary>
[GenerateSerializer]
public enum SystemHullQuestion
{
    /// <summary>GetHullEnergiesRequest to GetHullEnergiesResponse.</summary>
    HullEnergies,

    /// <summary>GetEntryStabilityRequest (no end-members) to GetEntryStabilityResponse.</summary>
    EntryStability,

    /// <summary>AssessCandidatesRequest to AssessCandidatesResponse.</summary>
    AssessCandidates,

    /// <summary>GetStablePhasesRequest of one chemical system to GetStablePhasesResponse.</summary>
    StablePhases,

    /// <summary>GetHullFacetsRequest of one chemical system to GetHullFacetsResponse.</summary>
    HullFacets,
}
