namespace Hull.Server.Validation;

/// <summary>What the service accepts in an entry's text fields.</summary>
public static class EntryRules
{
    /// <summary>Longest entry id, in characters: room for structured ids ("screen3/LiCoO2/R-3m/relax2") with margin.</summary>
    public const int MaxIdLength = 256;

    /// <summary>Null when the id is acceptable, else what is wrong with it.</summary>
    public static string? CheckId(string id)
    {
        if (string.IsNullOrWhiteSpace(id)) return "the id is empty; every entry needs an id";
        if (id.Length > MaxIdLength) return $"the id has {id.Length} characters; at most {MaxIdLength} are allowed";
        return CheckText(id, "id");
    }

    /// <summary>Longest method tag, in characters: a functional with its settings ("r2scan+u/pbe-pseudos") fits.</summary>
    public const int MaxMethodLength = 100;

    /// <summary>Null when the method tag is acceptable (empty means untagged), else what is wrong with it.</summary>
    public static string? CheckMethod(string method)
    {
        if (method.Length == 0) return null;
        if (string.IsNullOrWhiteSpace(method) || method.Trim().Length != method.Length)
        {
            return $"the method tag '{method}' begins or ends with spaces; give the tag alone, or leave it empty for none";
        }
        if (method.Length > MaxMethodLength) return $"the method tag has {method.Length} characters; at most {MaxMethodLength} are allowed";
        return CheckText(method, "method tag");
    }

    /// <summary>Null when the text has no control characters or broken UTF-16, else what is wrong and where.</summary>
    public static string? CheckText(string text, string what, bool allowLineBreaks = false)
    {
        for (int k = 0; k < text.Length; k++)
        {
            char c = text[k];
            if (char.IsHighSurrogate(c) && k + 1 < text.Length && char.IsLowSurrogate(text[k + 1]))
            {
                k++;
                continue;
            }

            if (char.IsSurrogate(c)) return $"the {what} has a broken character (unpaired surrogate U+{(int)c:X4}) at character {k + 1}";
            if (char.IsControl(c) && !(allowLineBreaks && c is '\n' or '\r' or '\t'))
            {
                return $"the {what} has a control character U+{(int)c:X4} at character {k + 1}";
            }
        }

        return null;
    }
}
