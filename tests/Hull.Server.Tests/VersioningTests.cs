using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>Querying version k after later imports and replacements returns exactly what it returned before.</summary>
public sealed class VersioningTests
{
    [Fact]
    public async Task Version_k_answers_the_same_after_later_imports_and_replacements()
    {
        await using var s = await RunningServer.StartAsync();
        var c = s.Clients;
        await Data.CreateWithAsync(c, "d", Data.LiCoO());
        Snapshot v1Before = await TakeAsync(c, 1);

        // Version 2 adds phases; version 3 replaces LiCoO2 and Li2O; version 4 deletes nothing but adds more.
        await c.Datasets.ImportEntriesAsync(Data.Batch("d", DuplicatePolicy.Reject, Data.Formation("Li2O2", "Li2O2", -1.7), Data.Formation("CoO2", "CoO2", -1.0)), c.Call());
        await c.Datasets.ImportEntriesAsync(Data.Batch("d", DuplicatePolicy.Replace, Data.Formation("LiCoO2", "LiCoO2", -2.1), Data.Formation("Li2O", "Li2O", -2.2)), c.Call());
        await c.Datasets.ImportEntriesAsync(Data.Batch("d", DuplicatePolicy.Reject, Data.Formation("Li6CoO4", "Li6CoO4", -2.05)), c.Call());

        Snapshot v1After = await TakeAsync(c, 1);
        Snapshot latest = await TakeAsync(c, 0);
        Assert.Equal(v1Before, v1After);
        Assert.Equal(4, latest.Version);
        Assert.NotEqual(v1Before.Analysis, latest.Analysis);
        // In version 3 the replaced LiCoO2 (-2.1 eV/atom) is on the hull and LiCoO2-b far above it.
        var b = latest.Analysis.Single(r => r.EntryId == "LiCoO2-b");
        Assert.Equal(0.35, b.EnergyAboveHullEvPerAtom, 9);
    }

    private sealed record Snapshot(long Version, string Fingerprint, IReadOnlyList<EntryStability> Analysis, GetHullFacetsResponse Facets, GetHullEnergiesResponse Energies)
    {
        public bool Equals(Snapshot? other) =>
            other is not null && Version == other.Version && Fingerprint == other.Fingerprint && Analysis.SequenceEqual(other.Analysis)
            && Facets.Equals(other.Facets) && Energies.Equals(other.Energies);

        public override int GetHashCode() => HashCode.Combine(Version, Fingerprint);
    }

    private static async Task<Snapshot> TakeAsync(Clients c, long version)
    {
        var results = new List<EntryStability>();
        VersionUsed? used = null;
        using (var call = c.Stability.AnalyzeDataset(new AnalyzeDatasetRequest { Dataset = "d", Version = version, PageSize = 4 }, c.Call()))
        {
            await foreach (var page in call.ResponseStream.ReadAllAsync())
            {
                used = page.Used;
                results.AddRange(page.Results);
            }
        }

        var facets = await c.Stability.GetHullFacetsAsync(new GetHullFacetsRequest { Dataset = "d", Version = version, ChemicalSystem = "Li-Co-O" }, c.Call());
        var energies = await c.Stability.GetHullEnergiesAsync(new GetHullEnergiesRequest { Dataset = "d", Version = version, Formulas = { "Li3CoO4", "LiCo2O3" } }, c.Call());
        Assert.Equal(used!.Version, facets.Used.Version);
        return new Snapshot(used.Version, used.ContentSha256, results, facets, energies);
    }
}
