using Grpc.Core;
using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Server.Errors;

namespace Hull.Server.Services;

/// <summary>
/// Finds a compound named by a <see cref="CompoundRef"/> in a dataset version (an entry id, or a formula: then its
/// lowest-energy entry, ties to the smaller id) and takes hulls from the cache, for every service that names compounds.
/// </summary>
public sealed class CompoundResolution(VersionResolver versions, HullCache cache)
{
    /// <summary>The version snapshot a request names.</summary>
    public Task<VersionSnapshot> SnapshotAsync(string dataset, long version, ServerCallContext context) =>
        cache.GetSnapshotAsync(versions.Resolve(dataset, version), context.CancellationToken);

    /// <summary>
    /// The entry id and row of the compound, and the hull of its elements plus <paramref name="extraElements"/>;
    /// <paramref name="field"/> is the request field that holds the compound, named in errors.
    /// </summary>
    public async Task<(CachedHull Hull, string Id, int Row)> ResolveAsync(
        VersionSnapshot snapshot, CompoundRef? compound, string field, ServerCallContext context, IReadOnlyList<string>? extraElements = null)
    {
        if (compound is null || compound.WhichCase == CompoundRef.WhichOneofCase.None)
        {
            throw RpcErrors.InvalidArgument(field, "no compound given; name an entry id or a formula");
        }

        Composition? parsed = null;
        if (compound.WhichCase == CompoundRef.WhichOneofCase.Formula
            && !Composition.TryParse(compound.Formula, out parsed, out FormulaParseException? error))
        {
            throw RpcErrors.InvalidArgument($"{field}.formula", error.Message);
        }

        string where = $"dataset '{snapshot.Version.Dataset}' version {snapshot.Version.Version}";
        extraElements ??= [];
        if (compound.WhichCase == CompoundRef.WhichOneofCase.EntryId)
        {
            if (!snapshot.TryFind(compound.EntryId, out int row))
            {
                throw RpcErrors.NotFound($"entry '{compound.EntryId}' is not in {where}", $"{field}.entry_id");
            }

            CachedHull hull = await HullAsync(snapshot, [.. snapshot.Entries[row].Composition.Elements, .. extraElements], context);
            return (hull, compound.EntryId, row);
        }

        CachedHull byFormula = await HullAsync(snapshot, [.. parsed!.Elements, .. extraElements], context);
        Core.Thermo.EntryStability? lowest = byFormula.Hull.Entries
            .Where(e => e.Composition.HasSameProportions(parsed))
            .OrderBy(e => e.FormationEnergyEvPerAtom)
            .ThenBy(e => e.Id, StringComparer.Ordinal)
            .FirstOrDefault();
        if (lowest is null || !snapshot.TryFind(lowest.Id, out int found))
        {
            throw RpcErrors.NotFound($"no entry of composition {parsed.Formula} in {where}", $"{field}.formula");
        }

        return (byFormula, lowest.Id, found);
    }

    /// <summary>The closed hull of <paramref name="elements"/> (any order, repeats allowed) from the cache.</summary>
    public async Task<CachedHull> HullAsync(VersionSnapshot snapshot, IEnumerable<string> elements, ServerCallContext context)
    {
        string[] system = elements.Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal).ToArray();
        try
        {
            return await cache.GetHullAsync(snapshot, system, context.CancellationToken);
        }
        catch (ThermoInputException e) when (e.Element is not null)
        {
            throw RpcErrors.FailedPrecondition(
                $"the hull of {string.Join('-', system)} cannot be built (missing elemental reference for {e.Element}): {e.Message}");
        }
    }
}
