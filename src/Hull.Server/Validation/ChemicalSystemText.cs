using Hull.Core.Chemistry;
using Hull.Server.Errors;

namespace Hull.Server.Validation;

/// <summary>Reads a chemical system written as element symbols joined by '-' ("Li-Co-O", any order).</summary>
public static class ChemicalSystemText
{
    /// <summary>The distinct symbols in ordinal order.</summary>
    /// <exception cref="Grpc.Core.RpcException">INVALID_ARGUMENT naming <paramref name="field"/> and the bad part.</exception>
    public static IReadOnlyList<string> Parse(string text, string field)
    {
        if (string.IsNullOrWhiteSpace(text))
        {
            throw RpcErrors.InvalidArgument(field, "the chemical system is empty; write element symbols joined by '-', e.g. 'Li-Co-O'");
        }

        string[] parts = text.Split('-');
        var symbols = new SortedSet<string>(StringComparer.Ordinal);
        int position = 0;
        foreach (string raw in parts)
        {
            string symbol = raw.Trim();
            if (!ElementTable.IsSymbol(symbol))
            {
                string shown = symbol.Length == 0 ? "an empty part" : $"'{symbol}'";
                throw RpcErrors.InvalidArgument(field,
                    $"{shown} at character {position + 1} of '{text}' is not an element symbol (symbols are case-sensitive, e.g. 'Co')");
            }

            if (!symbols.Add(symbol))
            {
                throw RpcErrors.InvalidArgument(field, $"element {symbol} appears twice in '{text}'");
            }

            position += raw.Length + 1;
        }

        return symbols.ToArray();
    }
}
