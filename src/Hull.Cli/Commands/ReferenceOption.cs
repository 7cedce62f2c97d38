using System.CommandLine;
using System.Globalization;
using Google.Protobuf.Collections;
using Hull.Protos.V1;

namespace Hull.Cli.Commands;

/// <summary>
/// --reference SYMBOL=EV_PER_ATOM (repeatable): an explicit elemental reference energy for total energies, sent with
/// the stability calls. The server checks the symbol and the value; here only the shape is read.
/// </summary>
public static class ReferenceOption
{
    public static Option<string[]> Create() => new("--reference")
    {
        Description = "elemental reference for total energies, SYMBOL=EV_PER_ATOM (e.g. Zr=-8.55); repeat for more elements; "
                      + "overrides the lowest pure-element entry and is recorded in the answer",
        Arity = ArgumentArity.ZeroOrMore,
        AllowMultipleArgumentsPerToken = false,
        Validators =
        {
            result =>
            {
                foreach (string token in result.Tokens.Select(t => t.Value))
                {
                    if (!TryParse(token, out _, out string? problem)) result.AddError($"--reference {token}: {problem}");
                }
            },
        },
    };

    /// <summary>Adds the parsed references to a request's list.</summary>
    public static void AddTo(RepeatedField<ElementReferenceEnergy> list, string[]? tokens)
    {
        foreach (string token in tokens ?? [])
        {
            if (TryParse(token, out ElementReferenceEnergy? reference, out _)) list.Add(reference!);
        }
    }

    private static bool TryParse(string token, out ElementReferenceEnergy? reference, out string? problem)
    {
        reference = null;
        int equals = token.IndexOf('=');
        if (equals <= 0 || equals == token.Length - 1)
        {
            problem = "write SYMBOL=EV_PER_ATOM, e.g. Zr=-8.55";
            return false;
        }

        string number = token[(equals + 1)..];
        if (!double.TryParse(number, NumberStyles.Float, CultureInfo.InvariantCulture, out double value) || !double.IsFinite(value))
        {
            problem = $"'{number}' is not a finite number of eV/atom";
            return false;
        }

        reference = new ElementReferenceEnergy { Symbol = token[..equals].Trim(), EnergyEvPerAtom = value };
        problem = null;
        return true;
    }
}
