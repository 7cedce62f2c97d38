using Hull.Core.Chemistry;

namespace Hull.Core.Thermo.Solids;

/// <summary>
/// Temperature models of a set of entries: per entry id, and per reduced formula for every entry of that composition
/// without a model of its own (an id's model wins). Immutable.
/// </summary>
public sealed class TemperatureModelSet
{
    private readonly Dictionary<string, SolidTemperatureModel> _byId;
    private readonly Dictionary<Composition, SolidTemperatureModel> _byReducedFormula;

    /// <exception cref="ThermoInputException">An id or a reduced formula given twice, or an empty id.</exception>
    public TemperatureModelSet(
        IEnumerable<KeyValuePair<string, SolidTemperatureModel>> byEntryId,
        IEnumerable<SolidTemperatureModel> byFormula)
    {
        ArgumentNullException.ThrowIfNull(byEntryId);
        ArgumentNullException.ThrowIfNull(byFormula);
        _byId = new Dictionary<string, SolidTemperatureModel>(StringComparer.Ordinal);
        foreach ((string id, SolidTemperatureModel model) in byEntryId)
        {
            if (string.IsNullOrWhiteSpace(id))
            {
                throw new ThermoInputException("A temperature model given per entry needs the entry's id.");
            }

            ArgumentNullException.ThrowIfNull(model);
            if (!_byId.TryAdd(id, model))
            {
                throw new ThermoInputException($"Entry '{id}' is given two temperature models.", entryId: id);
            }
        }

        _byReducedFormula = [];
        foreach (SolidTemperatureModel model in byFormula)
        {
            ArgumentNullException.ThrowIfNull(model);
            if (!_byReducedFormula.TryAdd(model.Formula.Reduced, model))
            {
                throw new ThermoInputException($"Two temperature models are given for the formula {model.Formula.ReducedFormula}.");
            }
        }
    }

    /// <summary>No models.</summary>
    public static TemperatureModelSet None { get; } = new([], []);

    /// <summary>The ids that have a model of their own.</summary>
    public IReadOnlyCollection<string> EntryIds => _byId.Keys;

    /// <summary>How many models the set holds.</summary>
    public int Count => _byId.Count + _byReducedFormula.Count;

    /// <summary>This set with <paramref name="fallback"/>'s models for ids and formulas it lacks (a request's inline models over stored ones).</summary>
    public TemperatureModelSet Over(TemperatureModelSet fallback)
    {
        ArgumentNullException.ThrowIfNull(fallback);
        var ids = new Dictionary<string, SolidTemperatureModel>(fallback._byId, StringComparer.Ordinal);
        foreach ((string id, SolidTemperatureModel model) in _byId) ids[id] = model;
        var formulas = new Dictionary<Composition, SolidTemperatureModel>(fallback._byReducedFormula);
        foreach ((Composition formula, SolidTemperatureModel model) in _byReducedFormula) formulas[formula] = model;
        return new TemperatureModelSet(ids, formulas.Values);
    }

    /// <summary>The entry's model (its own, else its formula's), checked against its composition; null when it has none.</summary>
    /// <exception cref="ThermoInputException">The model is for another composition.</exception>
    public SolidTemperatureModel? For(PhaseEntry entry)
    {
        ArgumentNullException.ThrowIfNull(entry);
        if (_byId.TryGetValue(entry.Id, out SolidTemperatureModel? own))
        {
            own.RequireMatches(entry);
            return own;
        }

        return _byReducedFormula.TryGetValue(entry.Composition.Reduced, out SolidTemperatureModel? shared) ? shared : null;
    }
}
