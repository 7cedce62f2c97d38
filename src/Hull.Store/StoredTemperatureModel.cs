using System.Collections.Immutable;

namespace Hull.Store;

/// <summary>
/// An entry's temperature model as stored: exactly one of a standard entropy S° (J/(mol K) per formula unit) or a
/// table of G(T) − H(anchor) (eV per formula unit) with the token of the anchor it is counted on, and
/// the formula unit the values refer to as given (empty for the entry's own). The Store keeps it as given and does
/// not interpret it; the server checks it (and that its formula matches the entry's) before a batch gets here.
/// Build one with <see cref="StandardEntropy"/> or <see cref="FreeEnergyTable"/>.
/// </summary>
public sealed record StoredTemperatureModel
{
    private StoredTemperatureModel(string formula, double? entropy, string? anchor, ImmutableArray<StoredFreeEnergyPoint> points)
    {
        Formula = formula;
        StandardEntropyJPerMolK = entropy;
        FreeEnergyAnchor = anchor;
        FreeEnergyPoints = points;
    }

    /// <summary>The formula unit the values refer to, as given; empty when the model names none.</summary>
    public string Formula { get; }

    /// <summary>S° per formula unit, J/(mol K); null for a table.</summary>
    public double? StandardEntropyJPerMolK { get; }

    /// <summary>The table's anchor token (one of <see cref="StoredFreeEnergyAnchorTokens.All"/>); null for S°.</summary>
    public string? FreeEnergyAnchor { get; }

    /// <summary>The table's points in the order given; empty for S°.</summary>
    public ImmutableArray<StoredFreeEnergyPoint> FreeEnergyPoints { get; }

    /// <summary>True for a table, false for a standard entropy.</summary>
    public bool IsFreeEnergyTable => FreeEnergyAnchor is not null;

    public static StoredTemperatureModel StandardEntropy(double entropyJPerMolK, string? formula = null) =>
        new(formula ?? string.Empty, entropyJPerMolK, null, []);

    public static StoredTemperatureModel FreeEnergyTable(string anchor, IEnumerable<StoredFreeEnergyPoint> points, string? formula = null)
    {
        ArgumentNullException.ThrowIfNull(anchor);
        ArgumentNullException.ThrowIfNull(points);
        return new(formula ?? string.Empty, null, anchor, [.. points]);
    }

    public bool Equals(StoredTemperatureModel? other) =>
        other is not null && Formula == other.Formula && StandardEntropyJPerMolK == other.StandardEntropyJPerMolK &&
        FreeEnergyAnchor == other.FreeEnergyAnchor && FreeEnergyPoints.AsSpan().SequenceEqual(other.FreeEnergyPoints.AsSpan());

    public override int GetHashCode()
    {
        var hash = new HashCode();
        hash.Add(Formula);
        hash.Add(StandardEntropyJPerMolK);
        hash.Add(FreeEnergyAnchor);
        foreach (StoredFreeEnergyPoint point in FreeEnergyPoints) hash.Add(point);
        return hash.ToHashCode();
    }

    public override string ToString() => IsFreeEnergyTable
        ? $"G(T) table on {FreeEnergyAnchor}, {FreeEnergyPoints.Length} points{FormulaNote}"
        : $"S° {StandardEntropyJPerMolK:R} J/(mol K){FormulaNote}";

    private string FormulaNote => Formula.Length == 0 ? string.Empty : $" of {Formula}";
}
