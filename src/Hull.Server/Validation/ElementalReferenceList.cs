using System.Globalization;
using Google.Protobuf.Collections;
using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using Hull.Protos.V1;
using Hull.Server.Errors;

namespace Hull.Server.Validation;

/// <summary>
/// The explicit elemental references of a stability request, checked, with a key that tells hulls built with
/// different references apart in the cache.
/// </summary>
public sealed class ElementalReferenceList
{
    private readonly SortedDictionary<string, double> _evPerAtom;

    private ElementalReferenceList(SortedDictionary<string, double> evPerAtom)
    {
        _evPerAtom = evPerAtom;
        References = new ElementalReferences(evPerAtom);
    }

    /// <summary>No explicit references.</summary>
    public static ElementalReferenceList None { get; } = new(new SortedDictionary<string, double>(StringComparer.Ordinal));

    /// <summary>The references for the science layer.</summary>
    public ElementalReferences References { get; }

    /// <summary>True when the caller gave none.</summary>
    public bool IsEmpty => _evPerAtom.Count == 0;

    /// <summary>The checked list.</summary>
    /// <exception cref="Grpc.Core.RpcException">INVALID_ARGUMENT naming "elemental_references[i]" for an unknown or
    /// repeated symbol or a non-finite energy.</exception>
    public static ElementalReferenceList Parse(RepeatedField<ElementReferenceEnergy> given)
    {
        if (given.Count == 0) return None;
        var violations = new List<FieldViolation>();
        var evPerAtom = new SortedDictionary<string, double>(StringComparer.Ordinal);
        for (int i = 0; i < given.Count; i++)
        {
            ElementReferenceEnergy reference = given[i];
            string at = $"elemental_references[{i}]";
            if (!ElementTable.IsSymbol(reference.Symbol))
            {
                violations.Add(new($"{at}.symbol", $"'{reference.Symbol}' is not an element symbol (symbols are case-sensitive, e.g. 'Zr')"));
            }
            else if (!double.IsFinite(reference.EnergyEvPerAtom))
            {
                violations.Add(new($"{at}.energy_ev_per_atom",
                    string.Create(CultureInfo.InvariantCulture, $"the reference for {reference.Symbol} is {reference.EnergyEvPerAtom}; it must be a finite number of eV/atom")));
            }
            else if (!evPerAtom.TryAdd(reference.Symbol, reference.EnergyEvPerAtom))
            {
                violations.Add(new($"{at}.symbol", $"element {reference.Symbol} is given twice; give each reference once"));
            }
        }

        if (violations.Count > 0)
        {
            throw RpcErrors.InvalidArgument(BatchValidation.Summarize("the elemental references were refused", violations), violations);
        }

        return new ElementalReferenceList(evPerAtom);
    }

    /// <summary>
    /// "Zr=-8.5;" style key of the references among <paramref name="elements"/> (round-trip numbers), empty when none:
    /// a hull depends only on the references of its own elements, so other references do not split the cache.
    /// </summary>
    public string KeyFor(IReadOnlyList<string>? elements)
    {
        if (IsEmpty) return string.Empty;
        var key = new System.Text.StringBuilder();
        foreach ((string symbol, double value) in _evPerAtom)
        {
            if (elements is not null && !elements.Contains(symbol, StringComparer.Ordinal)) continue;
            key.Append(symbol).Append('=').Append(value.ToString("R", CultureInfo.InvariantCulture)).Append(';');
        }

        return key.ToString();
    }

    /// <summary>The reference given for <paramref name="symbol"/>, if any.</summary>
    public bool TryGet(string symbol, out double evPerAtom) => _evPerAtom.TryGetValue(symbol, out evPerAtom);
}
