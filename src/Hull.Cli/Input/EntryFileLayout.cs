using Hull.Protos.V1;

namespace Hull.Cli.Input;

/// <summary>
/// The documented layout of entry files, shared by CSV and JSON.
/// </summary>
/// <remarks>
/// Fields: <c>id</c> (text, unique), <c>formula</c> (e.g. LiCoO2), <c>energy_ev</c> (a finite number: eV per formula
/// unit or eV/atom as the basis says), <c>basis</c> (one of the <see cref="BasisTokens"/>), <c>note</c> (optional
/// free text). CSV: a header line naming the columns (any order; <c>note</c> may be left out), then one entry per
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

    /// <summary>Every column name, in the order files are written.</summary>
    public static IReadOnlyList<string> Columns { get; } = [Id, Formula, EnergyEv, Basis, Note];

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

    /// <summary>The file token of a wire basis.</summary>
    public static string TokenOf(EnergyBasis basis) =>
        BasisTokens.FirstOrDefault(pair => pair.Value == basis).Key ?? "unspecified";

    /// <summary>Parses a basis token; the error lists the accepted tokens.</summary>
    public static EnergyBasis ParseBasis(string token, Func<string, Exception> fail) =>
        BasisTokens.TryGetValue(token.Trim(), out EnergyBasis basis)
            ? basis
            : throw fail($"basis '{token}' is not one of {string.Join(", ", BasisTokens.Keys)}");
}
