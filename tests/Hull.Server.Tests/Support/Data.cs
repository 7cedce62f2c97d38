using Google.Rpc;
using Grpc.Core;
using Hull.Protos.V1;

namespace Hull.Server.Tests.Support;

/// <summary>Small builders for requests used across the tests.</summary>
public static class Data
{
    public static Entry Formation(string id, string formula, double evPerAtom) =>
        new() { Id = id, Formula = formula, EnergyEv = evPerAtom, Basis = EnergyBasis.FormationPerAtom };

    public static Entry Total(string id, string formula, double evPerFormulaUnit) =>
        new() { Id = id, Formula = formula, EnergyEv = evPerFormulaUnit, Basis = EnergyBasis.TotalPerFormulaUnit };

    public static ImportEntriesRequest Batch(string dataset, DuplicatePolicy policy, params Entry[] entries)
    {
        var request = new ImportEntriesRequest { Dataset = dataset, DuplicatePolicy = policy, SourceLabel = "test" };
        request.Entries.AddRange(entries);
        return request;
    }

    /// <summary>
    /// A small Li–Co–O set in formation energies per atom (invented numbers, as in the demo): elements, two binaries,
    /// LiCoO2 on the hull and a polymorph above it.
    /// </summary>
    public static Entry[] LiCoO() =>
    [
        Formation("Li", "Li", 0), Formation("Co", "Co", 0), Formation("O", "O", 0),
        Formation("Li2O", "Li2O", -2.0), Formation("CoO", "CoO", -1.2), Formation("Co3O4", "Co3O4", -1.3),
        Formation("LiCoO2", "LiCoO2", -1.8), Formation("LiCoO2-b", "LiCoO2", -1.75), Formation("Li2CoO3", "Li2CoO3", -1.5),
    ];

    public static async Task CreateWithAsync(Clients clients, string dataset, params Entry[] entries)
    {
        await clients.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = dataset }, clients.Call());
        if (entries.Length > 0) await clients.Datasets.ImportEntriesAsync(Batch(dataset, DuplicatePolicy.Reject, entries), clients.Call());
    }

    public static IReadOnlyList<BadRequest.Types.FieldViolation> Violations(RpcException e) =>
        e.GetRpcStatus()?.GetDetail<BadRequest>()?.FieldViolations.ToArray() ?? [];
}
