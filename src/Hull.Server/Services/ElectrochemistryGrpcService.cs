using Grpc.Core;
using Hull.Core.Chemistry;
using Hull.Core.Figures;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Electrochemistry;
using Hull.Core.Thermo.Reactions;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Server.Errors;
using Hull.Server.Mapping;
using Hull.Server.Validation;

namespace Hull.Server.Services;

/// <summary>
/// The electrochemistry service: takes the closed hull of the system a request names from the cache, opens
/// elements on it where asked, and translates the science layer's open hulls, voltage profiles, reaction profiles
/// and ion windows.
/// </summary>
public sealed class ElectrochemistryGrpcService(CompoundResolution compounds) : ElectrochemistryService.ElectrochemistryServiceBase
{
    public override async Task<GetOpenElementHullResponse> GetOpenElementHull(GetOpenElementHullRequest request, ServerCallContext context)
    {
        IReadOnlyList<string> elements = ChemicalSystemText.Parse(request.ChemicalSystem, "chemical_system");
        ReservoirPotential[] potentials = Potentials(request.OpenElements, required: true);
        VersionSnapshot snapshot = await compounds.SnapshotAsync(request.Dataset, request.Version, context);
        CachedHull closed = await compounds.HullAsync(snapshot, elements, context);
        OpenElementHull open = Answer(() => OpenElementHull.Open(closed.Hull, potentials, request.AllowAboveReference), "open_elements", request.OpenElements);
        var response = new GetOpenElementHullResponse
        {
            Used = WireMapping.ToWire(snapshot.Version),
            ChemicalSystem = open.Hull.SystemName,
            EnergyAxis = open.Hull.Axis.DisplayName,
            EnergyUnit = open.Hull.Axis.Unit,
        };
        response.Components.AddRange(open.Hull.Components);
        response.OpenElements.AddRange(open.Hull.Axis.OpenElements.Select(o => new OpenElementPotential { Element = o.Symbol, ChemicalPotentialEvPerAtom = o.ChemicalPotentialEvPerAtom }));
        response.Entries.AddRange(open.Hull.Entries.Select(e => ElectrochemistryWireMapping.ToOpenHullEntry(e, FormulaOf(snapshot, e.Id))));
        response.StablePhaseIds.AddRange(open.Hull.StablePhases.Select(p => p.Id));
        response.Facets.AddRange(open.Hull.Facets.Select(WireMapping.ToWire));
        response.ExcludedEntryIds.AddRange(open.ExcludedEntryIds);
        return response;
    }

    public override async Task<GetVoltageProfileResponse> GetVoltageProfile(GetVoltageProfileRequest request, ServerCallContext context)
    {
        Composition host = ParseFormula(request.HostFormula, "host_formula");
        Composition? end = request.InsertedEndFormula.Length == 0 ? null : ParseFormula(request.InsertedEndFormula, "inserted_end_formula");
        string ion = Ion(request.Ion);
        VersionSnapshot snapshot = await compounds.SnapshotAsync(request.Dataset, request.Version, context);
        CachedHull hull = await compounds.HullAsync(snapshot, [.. host.Elements, .. end?.Elements ?? [], ion], context);
        Core.Thermo.Electrochemistry.VoltageProfile profile = Answer(
            () => InsertionVoltages.Profile(hull.Hull, host, ion, request.HasChargeNumber ? request.ChargeNumber : null, end),
            e => e.Message.Contains("end-member", StringComparison.Ordinal) ? "inserted_end_formula"
                : e.Message.Contains("charge number", StringComparison.Ordinal) ? "charge_number"
                : e.Message.Contains("host", StringComparison.Ordinal) ? "host_formula" : "ion");
        var response = new GetVoltageProfileResponse
        {
            Used = WireMapping.ToWire(snapshot.Version),
            Profile = ElectrochemistryWireMapping.ToWire(profile),
        };
        if (request.IncludeFigure) response.FigureSvg = VoltageProfileFigure.Render(profile, FigureSource.Of(snapshot.Version));
        return response;
    }

    public override async Task<GetReactionProfileResponse> GetReactionProfile(GetReactionProfileRequest request, ServerCallContext context)
    {
        ReservoirPotential[] potentials = Potentials(request.OpenElements, required: false);
        VersionSnapshot snapshot = await compounds.SnapshotAsync(request.Dataset, request.Version, context);
        string[] openSymbols = [.. potentials.Select(p => p.Symbol)];
        (CachedHull firstHull, string firstId, int firstRow) = await compounds.ResolveAsync(snapshot, request.First, "first", context, openSymbols);
        (CachedHull secondHull, string secondId, int secondRow) = await compounds.ResolveAsync(snapshot, request.Second, "second", context, openSymbols);
        CachedHull closed = await compounds.HullAsync(snapshot, [.. firstHull.Hull.Components, .. secondHull.Hull.Components], context);
        SystemHull hull = potentials.Length == 0
            ? closed.Hull
            : Answer(() => OpenElementHull.Open(closed.Hull, potentials, request.AllowAboveReference), "open_elements", request.OpenElements).Hull;
        ReactionProfile profile = Answer(() => PhaseReactions.Profile(hull, firstId, secondId), _ => "second");
        var response = new GetReactionProfileResponse
        {
            Used = WireMapping.ToWire(snapshot.Version),
            ChemicalSystem = profile.ChemicalSystem,
            EnergyAxis = profile.Axis.DisplayName,
            EnergyUnit = profile.Axis.Unit,
            First = ElectrochemistryWireMapping.ToReactant(profile.First, snapshot.FormulasAsStored[firstRow]),
            Second = ElectrochemistryWireMapping.ToReactant(profile.Second, snapshot.FormulasAsStored[secondRow]),
            MostNegativeIndex = profile.MostNegativeIndex,
            MostNegativePerFormulaUnitIndex = profile.MostNegativePerFormulaUnitIndex,
            Reacts = profile.React,
        };
        response.Points.AddRange(profile.Points.Select(ElectrochemistryWireMapping.ToWire));
        if (request.IncludeFigure) response.FigureSvg = ReactionProfileFigure.Render(profile, FigureSource.Of(snapshot.Version));
        return response;
    }

    public override async Task<GetElectrochemicalWindowResponse> GetElectrochemicalWindow(GetElectrochemicalWindowRequest request, ServerCallContext context)
    {
        string ion = Ion(request.Ion);
        VersionSnapshot snapshot = await compounds.SnapshotAsync(request.Dataset, request.Version, context);
        (CachedHull hull, string id, int row) = await compounds.ResolveAsync(snapshot, request.Phase, "phase", context, [ion]);
        IonStabilityWindow window = Answer(
            () => IonStabilityWindows.Of(hull.Hull, id, ion, request.HasChargeNumber ? request.ChargeNumber : null),
            e => e.Message.Contains("charge number", StringComparison.Ordinal) ? "charge_number" : "ion");
        GetElectrochemicalWindowResponse response = ElectrochemistryWireMapping.ToWire(window, snapshot.FormulasAsStored[row], hull.Hull.SystemName);
        response.Used = WireMapping.ToWire(snapshot.Version);
        return response;
    }

    private static string FormulaOf(VersionSnapshot snapshot, string id) =>
        snapshot.TryFind(id, out int row) ? snapshot.FormulasAsStored[row] : id;

    private static Composition ParseFormula(string text, string field)
    {
        if (string.IsNullOrWhiteSpace(text)) throw RpcErrors.InvalidArgument(field, "no formula given");
        return Composition.TryParse(text, out Composition? parsed, out FormulaParseException? error)
            ? parsed
            : throw RpcErrors.InvalidArgument(field, error.Message);
    }

    private static string Ion(string ion) =>
        ElementTable.IsSymbol(ion) ? ion : throw RpcErrors.InvalidArgument("ion", $"'{ion}' is not an element symbol (symbols are case-sensitive, e.g. 'Li')");

    private static ReservoirPotential[] Potentials(IReadOnlyList<OpenElementPotential> potentials, bool required)
    {
        if (required && potentials.Count == 0)
        {
            throw RpcErrors.InvalidArgument("open_elements", "no open element given; name at least one element and its chemical potential");
        }

        var seen = new HashSet<string>(StringComparer.Ordinal);
        var result = new ReservoirPotential[potentials.Count];
        for (int i = 0; i < potentials.Count; i++)
        {
            OpenElementPotential p = potentials[i];
            if (!ElementTable.IsSymbol(p.Element))
            {
                throw RpcErrors.InvalidArgument($"open_elements[{i}].element", $"'{p.Element}' is not an element symbol");
            }

            if (!seen.Add(p.Element))
            {
                throw RpcErrors.InvalidArgument($"open_elements[{i}].element", $"{p.Element} is open twice");
            }

            result[i] = new ReservoirPotential(p.Element, p.ChemicalPotentialEvPerAtom, p.Absolute ? PotentialScale.Absolute : PotentialScale.RelativeToReference);
        }

        return result;
    }

    /// <summary>Runs an open-element call; an input error names the open element's entry in the request.</summary>
    private static T Answer<T>(Func<T> call, string field, IReadOnlyList<OpenElementPotential> potentials) =>
        Answer(call, e =>
        {
            int at = potentials.Select(p => p.Element).ToList().IndexOf(e.Element ?? string.Empty);
            return at >= 0 ? $"{field}[{at}]" : field;
        });

    private static T Answer<T>(Func<T> call, Func<ThermoInputException, string> fieldOf) => ScienceAnswer.Of(call, fieldOf);
}
