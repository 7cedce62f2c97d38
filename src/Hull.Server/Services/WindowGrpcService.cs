using Grpc.Core;
using Hull.Core.Chemistry;
using Hull.Core.Figures;
using Hull.Core.Thermo.Gases;
using Hull.Core.Thermo;
using Hull.Core.Windows;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Server.Errors;
using Hull.Server.Mapping;
using CoreWindow = Hull.Core.Windows.StabilityWindow;

namespace Hull.Server.Services;

/// <summary>
/// The window service: resolves the compound in the dataset version, takes its system's hull (and for dopants the
/// extended system's) from the cache and translates the science layer's windows, slices and dopant limits.
/// </summary>
public sealed class WindowGrpcService(CompoundResolution compounds) : WindowService.WindowServiceBase
{
    public override async Task<GetStabilityWindowResponse> GetStabilityWindow(GetStabilityWindowRequest request, ServerCallContext context)
    {
        WindowOptions options = Options(request.Settings);
        WindowGasMapping.Display gas = WindowGasMapping.DisplayOf(request.Settings);
        (VersionSnapshot snapshot, CachedHull hull, string id, int row) = await ResolveAsync(request.Dataset, request.Version, request.Compound, context);
        gas = Against(gas, snapshot, hull);
        CoreWindow window = Answer(() => StabilityWindows.Of(hull.Hull, id, options));
        return new GetStabilityWindowResponse
        {
            Used = WireMapping.ToWire(snapshot.Version),
            Window = WindowWireMapping.ToWire(window, snapshot.FormulasAsStored[row], hull.Hull.SystemName, gas),
        };
    }

    public override async Task<SliceStabilityWindowResponse> SliceStabilityWindow(SliceStabilityWindowRequest request, ServerCallContext context)
    {
        WindowOptions options = Options(request.Settings);
        WindowGasMapping.Display gas = WindowGasMapping.DisplayOf(request.Settings);
        if (request.FixedPotentials.Count == 0 && request.FixedGases.Count == 0)
        {
            throw RpcErrors.InvalidArgument("fixed_potentials", "no fixed potential given; a slice fixes the Δμ of at least one element (or a gas's T and p)");
        }

        var fixedPotentials = new Dictionary<string, double>(StringComparer.Ordinal);
        for (int i = 0; i < request.FixedPotentials.Count; i++)
        {
            FixedPotential p = request.FixedPotentials[i];
            if (!ElementTable.IsSymbol(p.Element))
            {
                throw RpcErrors.InvalidArgument($"fixed_potentials[{i}].element", $"'{p.Element}' is not an element symbol");
            }

            if (!fixedPotentials.TryAdd(p.Element, p.ChemicalPotentialEv))
            {
                throw RpcErrors.InvalidArgument($"fixed_potentials[{i}].element", $"{p.Element} is fixed twice");
            }
        }

        (VersionSnapshot snapshot, CachedHull hull, string id, int row) = await ResolveAsync(request.Dataset, request.Version, request.Compound, context);
        gas = Against(gas, snapshot, hull);
        WindowGasMapping.AddFixed(request.FixedGases, "fixed_gases", fixedPotentials, gas);
        WindowSlice slice = Answer(
            () => StabilityWindows.Slice(hull.Hull, id, fixedPotentials, request.AllowAboveReference, options),
            element => FixedField(request.FixedPotentials, request.FixedGases, "fixed_potentials", "fixed_gases", element));
        string formula = snapshot.FormulasAsStored[row];
        var response = new SliceStabilityWindowResponse
        {
            Used = WireMapping.ToWire(snapshot.Version),
            Whole = WindowWireMapping.ToWire(slice.Whole, formula, hull.Hull.SystemName, gas),
            Slice = WindowWireMapping.ToWire(slice.Slice, formula, hull.Hull.SystemName, gas),
            Misses = slice.Misses,
        };
        response.FixedPotentialsUsed.AddRange(slice.FixedElements.Select((e, k) => new FixedPotential { Element = e, ChemicalPotentialEv = slice.FixedPotentialsEv[k] }));
        if (slice.NearestPointEv is { } nearest) response.NearestPointEv.AddRange(nearest);
        if (slice.DistanceEv is double distance) response.DistanceEv = distance;
        return response;
    }

    public override async Task<GetDopantLimitsResponse> GetDopantLimits(GetDopantLimitsRequest request, ServerCallContext context)
    {
        WindowOptions options = Options(request.Settings);
        WindowGasMapping.Display gas = WindowGasMapping.DisplayOf(request.Settings);
        if (request.Dopants.Count == 0) throw RpcErrors.InvalidArgument("dopants", "no dopant given; name at least one element");
        for (int i = 0; i < request.Dopants.Count; i++)
        {
            if (!ElementTable.IsSymbol(request.Dopants[i]))
            {
                throw RpcErrors.InvalidArgument($"dopants[{i}]", $"'{request.Dopants[i]}' is not an element symbol (symbols are case-sensitive, e.g. 'Al')");
            }
        }

        (VersionSnapshot snapshot, CachedHull hull, string id, int row) = await ResolveAsync(request.Dataset, request.Version, request.Compound, context);
        var limits = new List<Core.Windows.DopantLimit>();
        var references = new List<Core.Thermo.ElementReference>(hull.Hull.References);
        for (int i = 0; i < request.Dopants.Count; i++)
        {
            string dopant = request.Dopants[i];
            string field = $"dopants[{i}]";
            if (hull.Hull.Components.Contains(dopant, StringComparer.Ordinal))
            {
                throw RpcErrors.InvalidArgument(field, $"dopant {dopant} is already an element of the host {snapshot.FormulasAsStored[row]}");
            }

            string[] extendedSystem = [.. hull.Hull.Components.Append(dopant).Order(StringComparer.Ordinal)];
            CachedHull extended = await HullAsync(snapshot, extendedSystem, context);
            limits.Add(Answer(() => DopantLimits.Of(hull.Hull, extended.Hull, id, dopant, options), _ => field));
            references.AddRange(extended.Hull.References);
        }

        gas = gas.Against(references, [.. hull.Hull.Components, .. request.Dopants], Where(snapshot));
        var response = new GetDopantLimitsResponse
        {
            Used = WireMapping.ToWire(snapshot.Version),
            Host = WindowWireMapping.ToWire(limits[0].Host, snapshot.FormulasAsStored[row], hull.Hull.SystemName, gas),
        };
        response.Limits.AddRange(limits.Select(limit => WindowWireMapping.ToWire(limit, gas)));
        return response;
    }

    public override async Task<DrawWindowFigureResponse> DrawWindowFigure(DrawWindowFigureRequest request, ServerCallContext context)
    {
        WindowOptions options = Options(request.Settings);
        if (request.XElement.Length > 0 != request.YElement.Length > 0)
        {
            throw RpcErrors.InvalidArgument(request.XElement.Length == 0 ? "x_element" : "y_element", "name both axes' elements, or neither for the default pair");
        }

        foreach ((string field, string element) in new[] { ("x_element", request.XElement), ("y_element", request.YElement) })
        {
            if (element.Length > 0 && !ElementTable.IsSymbol(element)) throw RpcErrors.InvalidArgument(field, $"'{element}' is not an element symbol");
        }

        if (request.XElement.Length > 0 && request.XElement == request.YElement)
        {
            throw RpcErrors.InvalidArgument("y_element", $"both axes are Δμ({request.XElement}); choose two different elements");
        }

        var section = new Dictionary<string, double>(StringComparer.Ordinal);
        for (int i = 0; i < request.Section.Count; i++)
        {
            FixedPotential p = request.Section[i];
            if (!ElementTable.IsSymbol(p.Element)) throw RpcErrors.InvalidArgument($"section[{i}].element", $"'{p.Element}' is not an element symbol");
            if (!section.TryAdd(p.Element, p.ChemicalPotentialEv)) throw RpcErrors.InvalidArgument($"section[{i}].element", $"{p.Element} is fixed twice");
        }

        WindowGasMapping.Display gas = WindowGasMapping.DisplayOf(request.Settings);
        (VersionSnapshot snapshot, CachedHull hull, string id, int row) = await ResolveAsync(request.Dataset, request.Version, request.Compound, context);
        gas = Against(gas, snapshot, hull);
        WindowGasMapping.AddFixed(request.SectionGases, "section_gases", section, gas);
        (string x, string y) = request.XElement.Length > 0 ? (request.XElement, request.YElement) : Answer(() => WindowMaps.DefaultAxes(hull.Hull, id));
        string SectionField(string? element)
        {
            string field = FixedField(request.Section, request.SectionGases, "section", "section_gases", element);
            return field != "section" ? field : element == x ? "x_element" : element == y ? "y_element" : field;
        }

        WindowMap map = Answer(() => WindowMaps.Of(hull.Hull, id, x, y, section, options), SectionField);
        WindowFigureResult figure = WindowFigure.Render(map, FigureSource.Of(snapshot.Version));
        string formula = snapshot.FormulasAsStored[row];
        var response = new DrawWindowFigureResponse
        {
            Used = WireMapping.ToWire(snapshot.Version),
            Window = WindowWireMapping.ToWire(map.Window, formula, hull.Hull.SystemName, gas),
            Svg = figure.Svg,
            DrawnDimension = figure.Dimension,
            XElement = map.XElement,
            YElement = map.YElement,
            DependentElement = map.DependentElement ?? string.Empty,
            SectionChosenByDefault = map.SectionChosenByDefault,
            SectionMisses = map.SectionMisses,
            LinesLeftOut = figure.LinesLeftOut,
        };
        response.DrawnVertices.AddRange(map.Vertices.Select(v => WindowWireMapping.ToWire(v.Vertex, map.Window.Elements, gas)));
        response.Section.AddRange(map.FixedPotentialsEv.OrderBy(p => p.Key, StringComparer.Ordinal).Select(p => new FixedPotential { Element = p.Key, ChemicalPotentialEv = p.Value }));
        response.DrawnLineIds.AddRange(figure.DrawnLineIds);
        return response;
    }

    /// <summary>The display with its computed molecules measured from the system hull's elemental references.</summary>
    private static WindowGasMapping.Display Against(WindowGasMapping.Display gas, VersionSnapshot snapshot, CachedHull hull) =>
        gas.Against(hull.Hull.References, hull.Hull.Components, Where(snapshot));

    private static string Where(VersionSnapshot snapshot) => $"dataset '{snapshot.Version.Dataset}' version {snapshot.Version.Version}";

    /// <summary>The request field that fixed an element: a potential by index, else a gas by index, else the list.</summary>
    private static string FixedField(IReadOnlyList<FixedPotential> potentials, IReadOnlyList<GasPotential> gases, string potentialsField, string gasesField, string? element)
    {
        int at = potentials.Select(p => p.Element).ToList().IndexOf(element ?? string.Empty);
        if (at >= 0) return $"{potentialsField}[{at}]";
        int gas = gases.Select(g => GasTables.TryGet(g.Gas, out var s) ? s.Element : string.Empty).ToList().IndexOf(element ?? string.Empty);
        return gas >= 0 ? $"{gasesField}[{gas}]" : potentialsField;
    }

    private static WindowOptions Options(WindowSettings? settings)
    {
        if (settings is null) return WindowOptions.Default;
        try
        {
            return new WindowOptions(
                settings.HasAboveHullToleranceEvPerAtom ? settings.AboveHullToleranceEvPerAtom : null,
                settings.HasLoweringEvPerAtom ? settings.LoweringEvPerAtom : null,
                settings.ProjectionOmits);
        }
        catch (WindowInputException e)
        {
            throw RpcErrors.InvalidArgument("settings", e.Message);
        }
    }

    /// <summary>The version, the hull of the compound's elements, the entry id and its row.</summary>
    private async Task<(VersionSnapshot, CachedHull, string, int)> ResolveAsync(string dataset, long version, CompoundRef? compound, ServerCallContext context)
    {
        VersionSnapshot snapshot = await compounds.SnapshotAsync(dataset, version, context);
        (CachedHull hull, string id, int row) = await compounds.ResolveAsync(snapshot, compound, "compound", context);
        return (snapshot, hull, id, row);
    }

    private Task<CachedHull> HullAsync(VersionSnapshot snapshot, IReadOnlyList<string> elements, ServerCallContext context) =>
        compounds.HullAsync(snapshot, elements, context);

    /// <summary>Runs the science layer's call and turns its input errors into INVALID_ARGUMENT or NOT_FOUND naming the field.</summary>
    private static T Answer<T>(Func<T> call, Func<string?, string>? fieldOf = null)
    {
        try
        {
            return call();
        }
        catch (WindowInputException e)
        {
            string field = e.Subject switch
            {
                WindowInputSubject.Compound => "compound",
                WindowInputSubject.Option => "settings",
                _ => fieldOf?.Invoke(e.Element) ?? "request",
            };
            if (e.Subject == WindowInputSubject.Dopant && e.Message.Contains("has no phase", StringComparison.Ordinal))
            {
                throw RpcErrors.NotFound(e.Message, field);
            }

            throw RpcErrors.InvalidArgument(field, e.Message);
        }
    }
}
