using System.Collections.Immutable;
using System.Globalization;

namespace Hull.Core.Thermo.Solids;

/// <summary>
/// A solid's tabulated thermal free energy per formula unit, G(T) − E, at increasing temperatures, on one
/// <see cref="FreeEnergyAnchor"/> (which says what the entry's energy E stands for). The table is the solid's own:
/// no gas term belongs in it. Between points it is read by whoever evaluates it; outside them it says nothing.
/// </summary>
public sealed record FreeEnergyTableModel : SolidTemperatureModel
{
    /// <summary>Fewest points a table needs: two bound an interval.</summary>
    public const int MinimumPoints = 2;

    /// <param name="anchor">What the entry's energy stands for (0 K computed, or H°(298.15 K) fitted).</param>
    /// <param name="points">At least <see cref="MinimumPoints"/>, temperatures finite, positive and strictly increasing;
    /// values finite.</param>
    /// <param name="formula">The formula unit the values refer to; null or blank for the entry's own.</param>
    /// <exception cref="ThermoInputException">An unknown anchor, too few points, a temperature not above 0 K, not
    /// increasing or repeated, a non-finite value, or a formula that does not parse; the point is named.</exception>
    public FreeEnergyTableModel(FreeEnergyAnchor anchor, IEnumerable<FreeEnergyPoint> points, string? formula = null)
        : base(ParseFormula(formula, "Free-energy table"))
    {
        ArgumentNullException.ThrowIfNull(points);
        if (!Enum.IsDefined(anchor))
        {
            throw new ThermoInputException($"Free-energy table: anchor {(int)anchor} is not one of {string.Join(", ", FreeEnergyAnchorTokens.All.Select(FreeEnergyAnchorTokens.ToToken))}.");
        }

        ImmutableArray<FreeEnergyPoint> table = [.. points];
        if (table.Length < MinimumPoints)
        {
            throw new ThermoInputException(
                $"Free-energy table has {table.Length} point{(table.Length == 1 ? "" : "s")}; it needs at least {MinimumPoints} temperatures.");
        }

        for (int i = 0; i < table.Length; i++)
        {
            FreeEnergyPoint point = table[i];
            string at = string.Create(CultureInfo.InvariantCulture, $"Free-energy table point {i + 1} (T = {point.TemperatureK} K)");
            if (!double.IsFinite(point.TemperatureK) || point.TemperatureK <= 0)
            {
                throw new ThermoInputException($"{at}: temperatures must be finite and above 0 K.");
            }

            if (!double.IsFinite(point.ThermalFreeEnergyEvPerFormulaUnit))
            {
                throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                    $"{at}: the free energy is {point.ThermalFreeEnergyEvPerFormulaUnit}; it must be a finite number of eV."));
            }

            if (i > 0 && point.TemperatureK <= table[i - 1].TemperatureK)
            {
                string how = point.TemperatureK == table[i - 1].TemperatureK ? "repeats" : "is below";
                throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                    $"{at} {how} point {i} (T = {table[i - 1].TemperatureK} K); temperatures must strictly increase."));
            }
        }

        Anchor = anchor;
        Points = table;
    }

    public FreeEnergyAnchor Anchor { get; }

    /// <summary>The points in increasing temperature.</summary>
    public ImmutableArray<FreeEnergyPoint> Points { get; }

    /// <summary>Lowest tabulated temperature, K.</summary>
    public double MinimumTemperatureK => Points[0].TemperatureK;

    /// <summary>Highest tabulated temperature, K.</summary>
    public double MaximumTemperatureK => Points[^1].TemperatureK;

    public bool Equals(FreeEnergyTableModel? other) =>
        other is not null && base.Equals(other) && Anchor == other.Anchor && Points.AsSpan().SequenceEqual(other.Points.AsSpan());

    public override int GetHashCode()
    {
        var hash = new HashCode();
        hash.Add(base.GetHashCode());
        hash.Add(Anchor);
        foreach (FreeEnergyPoint point in Points) hash.Add(point);
        return hash.ToHashCode();
    }
}
