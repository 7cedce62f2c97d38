using Hull.Protos.V1;

namespace Hull.Cli.Input;

/// <summary>
/// The documented layout of entry files, shared by CSV and JSON.
/// </summary>
/// <remarks>
/// Fields: <c>id</c> (text, unique), <c>formula</c> (e.g. LiCoO2), <c>energy_ev</c> (a finite number: eV per formula
/// unit or eV/atom as the basis says), <c>basis</c> (one of the <see cref="BasisTokens"/>), <c>note</c> (optional
/// free text), <c>sigma_ev_per_atom</c> (optional: the energy's standard error, eV/atom, finite and ≥ 0; empty for
/// none), <c>correlation_group</c> (optional: entries computed the same way that share a systematic error). CSV: a header line naming the columns (any order; <c>note</c> may be left out), then one entry per
/// line; fields may be quoted with double quotes ("" inside quotes is a quote); blank lines and lines starting with
/// '#' are skipped. JSON: an array of objects with these fields, or an object whose "entries" member is one.
/// </remarks>
public static class EntryFileLayout
{
    public const string Id = "id";
    public const string Formula = "formula";
    public const string EnergyEv = "energy_ev";
    public const string Basis = "basis";
    public const string Note = "note";
    public const string Sigma = "sigma_ev_per_atom";
    public const string CorrelationGroup = "correlation_group";

    /// <summary>Every column name, in the order files are written.</summary>
    public static IReadOnlyList<string> Columns { get; } = [Id, Formula, EnergyEv, Basis, Note, Sigma, CorrelationGroup];

    /// <summary>The columns a file must have.</summary>
    public static IReadOnlyList<string> RequiredColumns { get; } = [Id, Formula, EnergyEv, Basis];

    /// <summary>
    /// Basis tokens accepted in files, and what each means: the contract's value names in lower case without their
    /// prefix (ENERGY_BASIS_TOTAL_PER_ATOM is total_per_atom), so a basis the contract adds is readable at once and
    /// the file tokens are the tokens the server stores.
    /// </summary>
    public static IReadOnlyDictionary<string, EnergyBasis> BasisTokens { get; } = EntriesReflection.Descriptor.EnumTypes
        .Single(e => e.Name == nameof(EnergyBasis)).Values
        .Where(v => v.Number != (int)EnergyBasis.Unspecified)
        .ToDictionary(v => v.Name["ENERGY_BASIS_".Length..].ToLowerInvariant(), v => (EnergyBasis)v.Number, StringComparer.Ordinal);

    /// <summary>An energy uncertainty as written in a file: empty for none, else a finite number ≥ 0 (eV/atom).</summary>
    public static double? ParseSigma(string text, Func<string, Exception> fail)
    {
        string trimmed = text.Trim();
        if (trimmed.Length == 0) return null;
        if (!double.TryParse(trimmed, System.Globalization.NumberStyles.Float, System.Globalization.CultureInfo.InvariantCulture, out double sigma)
            || !double.IsFinite(sigma) || sigma < 0)
        {
            throw fail($"'{trimmed}' is not an energy uncertainty: give a finite number >= 0 of eV/atom, or leave it empty");
        }

        return sigma;
    }

    /// <summary>The file token of a wire basis.</summary>
    public static string TokenOf(EnergyBasis basis) =>
        BasisTokens.FirstOrDefault(pair => pair.Value == basis).Key ?? "unspecified";

    /// <summary>Parses a basis token; the error lists the accepted tokens.</summary>
    public static EnergyBasis ParseBasis(string token, Func<string, Exception> fail) =>
        BasisTokens.TryGetValue(token.Trim(), out EnergyBasis basis)
            ? basis
            : throw fail($"basis '{token}' is not one of {string.Join(", ", BasisTokens.Keys)}");
}
