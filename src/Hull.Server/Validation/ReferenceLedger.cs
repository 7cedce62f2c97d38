using Hull.Core.Thermo;

namespace Hull.Server.Validation;

/// <summary>
/// The pure-element total-energy entries of one dataset version, by element: enough to know every element's default
/// reference (the lowest total energy per atom, ties to the smaller id) without reading the whole version. Immutable;
/// <see cref="With"/> gives the ledger of the next version.
/// </summary>
public sealed class ReferenceLedger
{
    private readonly Dictionary<string, Dictionary<string, double>> _byElement;
    private readonly Dictionary<string, string> _elementOfId;
    private readonly System.Collections.Concurrent.ConcurrentDictionary<string, ElementReference?> _references = new(StringComparer.Ordinal);

    private ReferenceLedger(Dictionary<string, Dictionary<string, double>> byElement, Dictionary<string, string> elementOfId)
    {
        _byElement = byElement;
        _elementOfId = elementOfId;
    }

    /// <summary>A dataset without versions.</summary>
    public static ReferenceLedger Empty { get; } = new(new(StringComparer.Ordinal), new(StringComparer.Ordinal));

    /// <summary>The ledger of a version's entries.</summary>
    public static ReferenceLedger Of(IEnumerable<PhaseEntry> entries) => Empty.With(entries, replaced: []);

    /// <summary>The elements that have a pure-element total-energy entry.</summary>
    public IEnumerable<string> Elements => _byElement.Keys;

    /// <summary>True when <paramref name="id"/> is one of the pure-element total-energy entries.</summary>
    public bool Holds(string id) => _elementOfId.ContainsKey(id);

    /// <summary>The default reference of <paramref name="element"/>, or null when it has no pure total-energy entry.</summary>
    public ElementReference? ReferenceOf(string element) => _references.GetOrAdd(element, LowestOf);

    private ElementReference? LowestOf(string element)
    {
        if (!_byElement.TryGetValue(element, out Dictionary<string, double>? entries) || entries.Count == 0) return null;
        (string id, double value) = entries
            .OrderBy(e => e.Value)
            .ThenBy(e => e.Key, StringComparer.Ordinal)
            .Select(e => (e.Key, e.Value))
            .First();
        return new ElementReference(element, value, id);
    }

    /// <summary>The ledger after the ids in <paramref name="replaced"/> are superseded and <paramref name="added"/> are stored.</summary>
    public ReferenceLedger With(IEnumerable<PhaseEntry> added, IReadOnlyCollection<string> replaced)
    {
        var byElement = _byElement.ToDictionary(p => p.Key, p => new Dictionary<string, double>(p.Value, StringComparer.Ordinal), StringComparer.Ordinal);
        var elementOfId = new Dictionary<string, string>(_elementOfId, StringComparer.Ordinal);
        foreach (string id in replaced)
        {
            if (elementOfId.Remove(id, out string? element)) byElement[element].Remove(id);
        }

        foreach (PhaseEntry entry in added)
        {
            if (!entry.IsTotalEnergy || entry.Composition.Elements.Count != 1) continue;
            string element = entry.Composition.Elements[0];
            if (!byElement.TryGetValue(element, out Dictionary<string, double>? entries))
            {
                byElement[element] = entries = new Dictionary<string, double>(StringComparer.Ordinal);
            }

            entries[entry.Id] = entry.EnergyEvPerAtom;
            elementOfId[entry.Id] = element;
        }

        return new ReferenceLedger(byElement, elementOfId);
    }
}
