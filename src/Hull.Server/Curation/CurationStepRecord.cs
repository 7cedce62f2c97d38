using System.Text.Json.Nodes;

namespace Hull.Server.Curation;

/// <summary>What one step of a run did: its kind and parameters, the entries it saw, removed and changed.</summary>
public sealed record CurationStepRecord(int Number, string Kind, JsonObject Parameters, int EntriesBefore, int Removed, int Changed);
