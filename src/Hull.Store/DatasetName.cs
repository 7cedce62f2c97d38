namespace Hull.Store;

/// <summary>
/// The rules for dataset names: 1 to 64 characters from a-z, 0-9, '.', '_' and '-', starting with a letter or
/// digit. Lowercase only, so that names are safe in paths, URLs and resource names and never differ by case alone.
/// </summary>
public static class DatasetName
{
    /// <summary>Longest allowed name, in characters.</summary>
    public const int MaxLength = 64;

    /// <summary>Null when <paramref name="name"/> follows the rules, else a message saying what is wrong and where.</summary>
    public static string? Check(string? name)
    {
        const string Rule = "use 1-64 characters from a-z, 0-9, '.', '_', '-', starting with a letter or digit";
        if (name is null || name.Length == 0) return $"dataset name is empty; {Rule}";
        if (name.Length > MaxLength) return $"dataset name '{name}' has {name.Length} characters; {Rule}";
        for (int i = 0; i < name.Length; i++)
        {
            char c = name[i];
            bool alphanumeric = c is >= 'a' and <= 'z' or >= '0' and <= '9';
            if (i == 0 && !alphanumeric)
            {
                return $"dataset name '{name}' starts with {Describe(c)}; {Rule}";
            }
            if (!alphanumeric && c is not ('.' or '_' or '-'))
            {
                return $"dataset name '{name}' has {Describe(c)} at position {i + 1}, which is not allowed; {Rule}";
            }
        }
        return null;
    }

    /// <summary>Throws <see cref="InvalidDatasetNameException"/> unless <paramref name="name"/> follows the rules.</summary>
    public static void Validate(string? name)
    {
        string? problem = Check(name);
        if (problem is not null) throw new InvalidDatasetNameException(name ?? string.Empty, problem);
    }

    // Invisible characters are named by code point, visible ones shown in quotes.
    private static string Describe(char c) => char.IsControl(c) || char.IsWhiteSpace(c) || char.IsSurrogate(c) ? $"U+{(int)c:X4}" : $"'{c}'";
}
