using System.CommandLine;
using System.CommandLine.Parsing;
using System.Globalization;

namespace Hull.Cli.Commands;

/// <summary>
/// Options and arguments whose values are numbers or one of a few words, parsed here rather than by the command-line
/// library, so that a malformed value is a usage error (exit 2) that names the option and the value in our words,
/// never an exception or a .NET type name.
/// </summary>
public static class ValueOptions
{
    /// <summary>
    /// A whole-number option in [min, max]; <paramref name="fallback"/> when not given. Help shows a non-zero fallback as
    /// the default; a zero fallback (meaning "not given") is left for the description to explain, so no default is shown twice.
    /// </summary>
    public static Option<long> WholeNumber(string name, string description, long min, long max, long fallback, string meaning)
    {
        var option = new Option<long>(name)
        {
            Description = description,
            CustomParser = result => ParseWhole(result, name, min, max, fallback, meaning),
        };
        if (fallback != 0) option.DefaultValueFactory = _ => fallback;
        return option;
    }

    /// <summary>A whole-number argument in [min, max].</summary>
    public static Argument<long> WholeNumberArgument(string name, string description, long min, long max, string meaning) =>
        new(name)
        {
            Description = description,
            CustomParser = result => ParseWhole(result, name.ToUpperInvariant(), min, max, 0, meaning),
        };

    /// <summary>A finite real-number option, null when not given.</summary>
    public static Option<double?> OptionalNumber(string name, string description, string meaning) =>
        new(name) { Description = description, CustomParser = result => ParseReal(result, name, meaning) };

    /// <summary>A finite real-number argument that may be left out.</summary>
    public static Argument<double?> OptionalNumberArgument(string name, string description, string meaning) =>
        new(name)
        {
            Description = description,
            Arity = ArgumentArity.ZeroOrOne,
            CustomParser = result => ParseReal(result, name.ToUpperInvariant(), meaning),
        };

    /// <summary>An option that takes one of <paramref name="choices"/>; <paramref name="fallback"/> when not given.</summary>
    public static Option<string> Choice(string name, string description, string fallback, params string[] choices)
    {
        var option = new Option<string>(name)
        {
            Description = description,
            DefaultValueFactory = _ => fallback,
            CustomParser = result =>
            {
                if (result.Tokens.Count == 0) return fallback;
                string text = result.Tokens[0].Value;
                if (choices.Contains(text, StringComparer.Ordinal)) return text;
                result.AddError($"{name} '{text}' is not one of: {string.Join(", ", choices)}");
                return fallback;
            },
        };
        option.CompletionSources.Add(choices);
        return option;
    }

    private static long ParseWhole(ArgumentResult result, string name, long min, long max, long fallback, string meaning)
    {
        if (result.Tokens.Count == 0) return fallback;
        string text = result.Tokens[0].Value;
        if (!long.TryParse(text, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out long value) || value < min || value > max)
        {
            string range = max == long.MaxValue ? $"{min} or more" : $"{min} to {max}";
            result.AddError($"{name} '{text}' is not {meaning} (a whole number, {range})");
            return fallback;
        }

        return value;
    }

    private static double? ParseReal(ArgumentResult result, string name, string meaning)
    {
        if (result.Tokens.Count == 0) return null;
        string text = result.Tokens[0].Value;
        if (!double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out double value) || !double.IsFinite(value))
        {
            result.AddError($"{name} '{text}' is not {meaning} (a finite number such as -1.25 or 2e-3)");
            return null;
        }

        return value;
    }
}
