using Grpc.Core;
using Hull.Core.Figures;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Uncertainty;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Server.Errors;
using Hull.Server.Mapping;
using Hull.Server.Validation;

namespace Hull.Server.Services;

/// <summary>
/// Stability under energy uncertainty: the system's hull from the cache (the same one the stability calls answer
/// from), the stored σ and groups of the version, the group σ of the request, and Core's sampling. The call's
/// cancellation (the caller's cancel or deadline) stops the sampling between samples, answered CANCELLED or
/// DEADLINE_EXCEEDED.
/// </summary>
public sealed class UncertaintyGrpcService(VersionResolver versions, HullCache cache, SamplingActivity activity) : UncertaintyService.UncertaintyServiceBase
{
    /// <summary>Samples when the request gives neither a count nor a target.</summary>
    public const int DefaultSamples = 1_000;

    public override async Task<SampleStabilityResponse> SampleStability(SampleStabilityRequest request, ServerCallContext context)
    {
        (StabilitySamplingResult result, CachedHull hull, VersionRef resolved) = await SampleAsync(request, "", context);
        var response = new SampleStabilityResponse
        {
            Used = WireMapping.ToWire(resolved),
            ChemicalSystem = result.SystemName,
            MostFrequentStableSetProbability = result.MostFrequentStableSetProbability,
            SampleCount = result.SampleCount,
            Seed = result.Seed,
            Stop = result.StopReason switch
            {
                SamplingStopReason.TargetReached => SamplingStop.TargetReached,
                SamplingStopReason.WorkLimitReached => SamplingStop.WorkLimitReached,
                _ => SamplingStop.SampleCountReached,
            },
            LargestVertexStandardError = result.LargestVertexStandardError,
            MeanPointsRebuilt = result.MeanPointsRebuilt,
            Coverage = WireMapping.ToWire(hull.Hull.Coverage),
        };
        if (result.TargetStandardError is { } target) response.TargetStandardError = target;
        response.Entries.AddRange(result.Entries.Select(ToWire));
        response.ProbableStableSet.AddRange(result.ProbableStableSet);
        response.MostFrequentStableSet.AddRange(result.MostFrequentStableSet);
        response.Groups.AddRange(result.Groups.Select(g => new GroupSigma { Group = g.Name, SigmaEvPerAtom = g.SigmaEvPerAtom }));
        response.References.AddRange(result.References.Select(WireMapping.ToWire));
        return response;
    }

    public override async Task<DrawStabilityOddsFigureResponse> DrawStabilityOddsFigure(DrawStabilityOddsFigureRequest request, ServerCallContext context)
    {
        SampleStabilityRequest sampling = request.Sampling ?? throw RpcErrors.InvalidArgument("sampling", "the figure needs its sampling request");
        IReadOnlyList<string> elements = ChemicalSystemText.Parse(sampling.ChemicalSystem, "sampling.chemical_system");
        if (elements.Count != 3)
        {
            throw RpcErrors.InvalidArgument("sampling.chemical_system",
                $"the stability-odds figure is a ternary; chemical system {string.Join('-', elements)} has {elements.Count} elements");
        }

        (StabilitySamplingResult result, CachedHull hull, VersionRef resolved) = await SampleAsync(sampling, "sampling.", context);
        string svg = StabilityOddsFigure.Draw(hull.Hull, result, FigureSource.Of(resolved));
        return new DrawStabilityOddsFigureResponse
        {
            Used = WireMapping.ToWire(resolved),
            ChemicalSystem = result.SystemName,
            Svg = svg,
            SampleCount = result.SampleCount,
            Seed = result.Seed,
        };
    }

    private async Task<(StabilitySamplingResult, CachedHull, VersionRef)> SampleAsync(SampleStabilityRequest request, string prefix, ServerCallContext context)
    {
        IReadOnlyList<string> elements = ChemicalSystemText.Parse(request.ChemicalSystem, prefix + "chemical_system");
        SamplingPlan plan = Plan(request, prefix);
        CorrelationGroup[] groups = Groups(request, prefix);
        ElementalReferenceList references = ElementalReferenceList.Parse(request.ElementalReferences);
        VersionRef resolved = versions.Resolve(request.Dataset, request.Version);
        VersionSnapshot snapshot = await cache.GetSnapshotAsync(resolved, context.CancellationToken);
        CachedHull hull = await cache.GetHullAsync(snapshot, elements, context.CancellationToken, references);
        try
        {
            StabilitySamplingResult result = await activity.RunAsync(
                token => StabilitySampling.Run(hull.Hull, snapshot.Uncertainties, groups, plan, cancellation: token),
                context.CancellationToken);
            return (result, hull, resolved);
        }
        catch (ThermoInputException e)
        {
            string field = e.Message.StartsWith("samples:", StringComparison.Ordinal) ? prefix + "samples"
                : e.Message.StartsWith("Correlation group", StringComparison.Ordinal) ? prefix + "group_sigmas"
                : prefix + "chemical_system";
            throw RpcErrors.InvalidArgument(field, e.Message);
        }
    }

    private static SamplingPlan Plan(SampleStabilityRequest request, string prefix)
    {
        try
        {
            if (request.HasTargetStandardError)
            {
                if (request.Samples != 0)
                {
                    throw RpcErrors.InvalidArgument(prefix + "samples",
                        $"give either samples ({request.Samples}) or target_standard_error ({request.TargetStandardError}), not both");
                }

                return SamplingPlan.ToTarget(request.TargetStandardError, request.Seed);
            }

            return SamplingPlan.Fixed(request.Samples == 0 ? DefaultSamples : request.Samples, request.Seed);
        }
        catch (ThermoInputException e)
        {
            throw RpcErrors.InvalidArgument(prefix + (request.HasTargetStandardError ? "target_standard_error" : "samples"), e.Message);
        }
    }

    private static CorrelationGroup[] Groups(SampleStabilityRequest request, string prefix)
    {
        var groups = new CorrelationGroup[request.GroupSigmas.Count];
        var seen = new HashSet<string>(StringComparer.Ordinal);
        for (int k = 0; k < groups.Length; k++)
        {
            GroupSigma g = request.GroupSigmas[k];
            try
            {
                groups[k] = new CorrelationGroup(g.Group, g.SigmaEvPerAtom);
            }
            catch (ThermoInputException e)
            {
                throw RpcErrors.InvalidArgument($"{prefix}group_sigmas[{k}]", e.Message);
            }

            if (!seen.Add(g.Group))
            {
                throw RpcErrors.InvalidArgument($"{prefix}group_sigmas[{k}]", $"correlation group '{g.Group}' is given twice");
            }
        }

        return groups;
    }

    private static Protos.V1.EntryStabilityOdds ToWire(Core.Thermo.Uncertainty.EntryStabilityOdds odds)
    {
        var wire = new Protos.V1.EntryStabilityOdds
        {
            EntryId = odds.EntryId,
            Formula = odds.Formula,
            SigmaEvPerAtom = odds.SigmaEvPerAtom,
            CorrelationGroup = odds.Group ?? string.Empty,
            VertexProbability = odds.VertexProbability,
            VertexProbabilityStandardError = odds.VertexProbabilityStandardError,
            MeanEnergyAboveHullEvPerAtom = odds.MeanEnergyAboveHullEvPerAtom,
            MeanEnergyAboveHullStandardErrorEvPerAtom = odds.MeanEnergyAboveHullStandardErrorEvPerAtom,
            EnergyAboveHullP05EvPerAtom = odds.EnergyAboveHullP05EvPerAtom,
            EnergyAboveHullP95EvPerAtom = odds.EnergyAboveHullP95EvPerAtom,
            MostProbableProductsProbability = odds.MostProbableProductsProbability,
            PlainIsHullVertex = odds.PlainIsVertex,
            PlainEnergyAboveHullEvPerAtom = odds.PlainEnergyAboveHullEvPerAtom,
        };
        wire.MostProbableProducts.AddRange(odds.MostProbableProducts);
        return wire;
    }
}
