using Grpc.Core;
using Hull.Core.Figures;
using Hull.Core.Thermo;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Server.Errors;
using Hull.Server.Mapping;
using Hull.Server.Validation;
using WireFigureKind = Hull.Protos.V1.FigureKind;

namespace Hull.Server.Services;

/// <summary>
/// The figure service: takes the hull the stability service would answer from, and returns Core's drawing of it.
/// </summary>
public sealed class FigureGrpcService(VersionResolver versions, HullCache cache) : FigureService.FigureServiceBase
{
    public override async Task<DrawPhaseDiagramResponse> DrawPhaseDiagram(DrawPhaseDiagramRequest request, ServerCallContext context)
    {
        var options = new FigureOptions
        {
            MaxAboveHullEvPerAtom = request.HasMaxAboveHullEvPerAtom ? request.MaxAboveHullEvPerAtom : FigureOptions.DefaultMaxAboveHullEvPerAtom,
            AzimuthDegrees = request.HasViewAzimuthDegrees ? request.ViewAzimuthDegrees : FigureOptions.DefaultAzimuthDegrees,
            ElevationDegrees = request.HasViewElevationDegrees ? request.ViewElevationDegrees : FigureOptions.DefaultElevationDegrees,
        };
        try
        {
            options.Check();
        }
        catch (FigureInputException e)
        {
            throw RpcErrors.InvalidArgument(OptionField(e.ParamName), e.Message);
        }

        bool byEndMembers = request.EndMembers.Count > 0;
        if (byEndMembers && request.ChemicalSystem.Length > 0)
        {
            throw RpcErrors.InvalidArgument("chemical_system",
                $"give either chemical_system ('{request.ChemicalSystem}') or end_members, not both: the end-members define the figure's components");
        }

        IReadOnlyList<string>? elements = byEndMembers ? null : ChemicalSystemText.Parse(request.ChemicalSystem, "chemical_system");
        int components = elements?.Count ?? request.EndMembers.Count;
        if (components > PhaseDiagram.MaxComponents)
        {
            string what = byEndMembers ? $"{components} end-members" : $"chemical system {string.Join('-', elements!)} has {components} elements";
            throw RpcErrors.InvalidArgument(byEndMembers ? "end_members" : "chemical_system",
                $"{what}; a phase diagram shows at most {PhaseDiagram.MaxComponents} components: choose a sub-system of up to four elements, or up to four end-members");
        }

        if (components < 2)
        {
            throw RpcErrors.InvalidArgument(byEndMembers ? "end_members" : "chemical_system",
                "a phase diagram needs 2 to 4 components (a single element has no diagram)");
        }

        VersionRef resolved = versions.Resolve(request.Dataset, request.Version);
        VersionSnapshot snapshot = await cache.GetSnapshotAsync(resolved, context.CancellationToken);
        CachedHull hull = byEndMembers
            ? await cache.GetEndMemberHullAsync(snapshot, EndMemberList.Read(request.EndMembers, snapshot, "end_members")!, context.CancellationToken)
            : await cache.GetHullAsync(snapshot, elements!, context.CancellationToken);

        var metadata = FigureSource.Of(resolved);
        FigureInput input = FigureInput.FromHull(hull.Hull, metadata);
        FigureResult figure = PhaseDiagram.Draw(input, options);
        var response = new DrawPhaseDiagramResponse
        {
            Used = WireMapping.ToWire(resolved),
            ChemicalSystem = hull.Hull.SystemName,
            Kind = figure.Kind switch
            {
                Core.Figures.FigureKind.Binary => WireFigureKind.Binary,
                Core.Figures.FigureKind.Ternary => WireFigureKind.Ternary,
                _ => WireFigureKind.Quaternary,
            },
            Svg = figure.Svg,
            StablePhaseCount = figure.StablePhaseCount,
            EdgeCount = figure.EdgeCount,
            UnstableShownCount = figure.UnstableShownCount,
            HiddenAboveCutoffCount = figure.HiddenAboveCutoffCount,
            MaxAboveHullEvPerAtom = options.MaxAboveHullEvPerAtom,
        };
        response.Components.AddRange(hull.Hull.Components);
        return response;
    }

    private static string OptionField(string? parameter) => parameter switch
    {
        nameof(FigureOptions.AzimuthDegrees) => "view_azimuth_degrees",
        nameof(FigureOptions.ElevationDegrees) => "view_elevation_degrees",
        _ => "max_above_hull_ev_per_atom",
    };
}
