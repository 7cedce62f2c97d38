using Hull.Protos.V1;

namespace Hull.Cli.Input;

/// <summary>
/// The documented layout of entry files, shared by CSV and JSON.
/// </summary>
/// <remarks>
/// Fields: <c>id</c> (text, unique), <c>formula</c> (e.g. LiCoO2), <c>energy_ev</c> (a finite number: eV per formula
/// unit or eV/atom as the basis says), <c>basis</c> (one of the <see cref="BasisTokens"/>), <c>note</c> (optional
/// free text), <c>sigma_ev_per_atom</c> (optional: the energy's standard error, eV/atom, finite and ≥ 0; empty for
/// none), <c>correlation_group</c> (optional: entries computed the same way that share a systematic error),
/// <c>method</c> (optional: the computational method's tag that correction sets name; empty for untagged). CSV: a header line naming the columns (any order; <c>note</c> may be left out), then one entry per
/// line; fields may be quoted with double quotes ("" inside quotes is a quote); blank lines and lines starting with
/// '#' are skipped. JSON: an array of objects with these fields, or an object whose "entries" member is one.
/// Temperature models, optional: <c>standard_entropy_j_per_mol_k</c> (S° per formula unit; an empty cell is none)
/// and <c>temperature_model_formula</c> (the formula unit the model's values refer to; empty for the entry's own).
/// A G(T) table comes in JSON as a <c>free_energy_table</c> object (<c>anchor</c>, <c>rows</c>: objects with
/// <c>temperature_k</c> and <c>free_energy_above_anchor_ev</c>), and for any entry file in a table file of its own
/// (<see cref="FreeEnergyTableFile"/>).
/// </remarks>
public static class EntryFileLayout
{
    public const string Id = "id";
    public const string Formula = "formula";
    public const string EnergyEv = "energy_ev";
    public const string Basis = "basis";
    public const string Note = "note";
    public const string StandardEntropy = "standard_entropy_j_per_mol_k";
    public const string ModelFormula = "temperature_model_formula";
    public const string Sigma = "sigma_ev_per_atom";
    public const string CorrelationGroup = "correlation_group";
    public const string Method = "method";

    /// <summary>JSON only: an entry's G(T) table, an object with <see cref="Anchor"/> and <see cref="Rows"/>.</summary>
    public const string FreeEnergyTable = "free_energy_table";
    public const string Anchor = "anchor";
    public const string Rows = "rows";
    public const string TemperatureK = "temperature_k";
    public const string FreeEnergyAboveAnchorEv = "free_energy_above_anchor_ev";

    /// <summary>The columns of entries without temperature models or uncertainties, in the order files are written.</summary>
    public static IReadOnlyList<string> PlainColumns { get; } = [Id, Formula, EnergyEv, Basis, Note];

    /// <summary>The temperature-model columns, written after <see cref="PlainColumns"/> when some entry has a model.</summary>
    public static IReadOnlyList<string> ModelColumns { get; } = [StandardEntropy, ModelFormula];

    /// <summary>The uncertainty columns, written last when some entry has a σ or a correlation group.</summary>
    public static IReadOnlyList<string> UncertaintyColumns { get; } = [Sigma, CorrelationGroup];

    /// <summary>The method-tag column, written after the others when some entry has a tag.</summary>
    public static IReadOnlyList<string> MethodColumns { get; } = [Method];

    /// <summary>Every column an entry file may have, in the order files are written: plain, model, uncertainty, method.</summary>
    public static IReadOnlyList<string> Columns { get; } = [.. PlainColumns, .. ModelColumns, .. UncertaintyColumns, .. MethodColumns];

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

    /// <summary>
    /// Free-energy anchor tokens accepted in files: the contract's value names in lower case without their prefix
    /// (FREE_ENERGY_ANCHOR_FITTED_298K is fitted_298k), the tokens the server stores.
    /// </summary>
    public static IReadOnlyDictionary<string, FreeEnergyAnchor> AnchorTokens { get; } = EntriesReflection.Descriptor.EnumTypes
        .Single(e => e.Name == nameof(FreeEnergyAnchor)).Values
        .Where(v => v.Number != (int)FreeEnergyAnchor.Unspecified)
        .ToDictionary(v => v.Name["FREE_ENERGY_ANCHOR_".Length..].ToLowerInvariant(), v => (FreeEnergyAnchor)v.Number, StringComparer.Ordinal);

    /// <summary>The file token of a wire anchor.</summary>
    public static string TokenOf(FreeEnergyAnchor anchor) =>
        AnchorTokens.FirstOrDefault(pair => pair.Value == anchor).Key ?? "unspecified";

    /// <summary>Parses an anchor token; the error lists the accepted tokens and says what they mean.</summary>
    public static FreeEnergyAnchor ParseAnchor(string token, Func<string, Exception> fail) =>
        AnchorTokens.TryGetValue(token.Trim(), out FreeEnergyAnchor anchor)
            ? anchor
            : throw fail($"anchor '{token}' is not one of {string.Join(", ", AnchorTokens.Keys)} (computed_0k: the entry's energy is a computed energy at 0 K; fitted_298k: it stands for H°(298.15 K))");

    /// <summary>Parses a basis token; the error lists the accepted tokens.</summary>
    public static EnergyBasis ParseBasis(string token, Func<string, Exception> fail) =>
        BasisTokens.TryGetValue(token.Trim(), out EnergyBasis basis)
            ? basis
            : throw fail($"basis '{token}' is not one of {string.Join(", ", BasisTokens.Keys)}");
}
