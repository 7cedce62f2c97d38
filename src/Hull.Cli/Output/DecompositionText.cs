using System.Globalization;
using Hull.Protos.V1;

namespace Hull.Cli.Output;

/// <summary>
/// The decomposition column of the tables: the server's balanced reaction, with each product's entry id added where
/// formulas alone would not say which phase is meant ("MgO -> MgO [mgo-rocksalt]" for a polymorph above the hull).
/// </summary>
public static class DecompositionText
{
    public static string Describe(Decomposition? decomposition)
    {
        if (decomposition is null || decomposition.Products.Count == 0) return decomposition?.Reaction ?? string.Empty;
        string reaction = decomposition.Reaction;
        int arrow = reaction.IndexOf(" -> ", StringComparison.Ordinal);
        string left = arrow >= 0 ? reaction[..arrow] : string.Empty;
        var names = decomposition.Products.Select(p => p.IsElementalReference ? p.PhaseId : p.Formula).ToArray();
        bool repeats = names.Contains(left, StringComparer.Ordinal) || names.Distinct(StringComparer.Ordinal).Count() < names.Length;
        if (!repeats || arrow < 0) return reaction;

        var parts = new List<string>();
        for (int i = 0; i < names.Length; i++)
        {
            DecompositionProduct product = decomposition.Products[i];
            string coefficient = product.FormulaUnitsExact.Length > 0
                ? product.FormulaUnitsExact
                : product.FormulaUnits.ToString("G6", CultureInfo.InvariantCulture);
            string name = product.IsElementalReference || product.PhaseId == names[i] ? names[i] : $"{names[i]} [{product.PhaseId}]";
            parts.Add(coefficient == "1" ? name : $"{coefficient} {name}");
        }

        return $"{left} -> {string.Join(" + ", parts)}";
    }
}
