using System.Globalization;

namespace Hull.Core.Thermo.Gases;

/// <summary>
/// A gas's Shomate fit over consecutive temperature ranges that meet end to end, with the source of the
/// coefficients. At a shared end the lower range is used; the fits agree there to the table's rounding.
/// </summary>
public sealed class ShomateTable
{
    private readonly ShomateRange[] _ranges;

    /// <exception cref="ArgumentException">No ranges, or ranges that do not meet end to end in rising order.</exception>
    public ShomateTable(string source, IEnumerable<ShomateRange> ranges)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(source);
        ArgumentNullException.ThrowIfNull(ranges);
        _ranges = ranges.ToArray();
        if (_ranges.Length == 0)
        {
            throw new ArgumentException("A Shomate table needs at least one range.", nameof(ranges));
        }

        for (int i = 1; i < _ranges.Length; i++)
        {
            if (_ranges[i].MinimumTemperatureK != _ranges[i - 1].MaximumTemperatureK)
            {
                throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                    $"Shomate range {i} starts at {_ranges[i].MinimumTemperatureK} K, not where range {i - 1} ends ({_ranges[i - 1].MaximumTemperatureK} K)."),
                    nameof(ranges));
            }
        }

        Source = source;
    }

    /// <summary>Where the coefficients come from.</summary>
    public string Source { get; }

    /// <summary>The ranges in rising temperature.</summary>
    public IReadOnlyList<ShomateRange> Ranges => _ranges;

    /// <summary>Lowest temperature the table covers, K.</summary>
    public double MinimumTemperatureK => _ranges[0].MinimumTemperatureK;

    /// <summary>Highest temperature the table covers, K.</summary>
    public double MaximumTemperatureK => _ranges[^1].MaximumTemperatureK;

    /// <summary>True when <paramref name="temperatureK"/> lies within the table, ends included.</summary>
    public bool Covers(double temperatureK) => temperatureK >= MinimumTemperatureK && temperatureK <= MaximumTemperatureK;

    /// <summary>The range that holds <paramref name="temperatureK"/> (the lower one at a shared end).</summary>
    /// <exception cref="ThermoInputException">The temperature is not finite or lies outside the table.</exception>
    public ShomateRange RangeAt(double temperatureK, string gasFormula)
    {
        if (!double.IsFinite(temperatureK) || !Covers(temperatureK))
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"Temperature {temperatureK} K is outside the {gasFormula} table ({MinimumTemperatureK} K to {MaximumTemperatureK} K, {Source})."));
        }

        foreach (ShomateRange range in _ranges)
        {
            if (range.Covers(temperatureK))
            {
                return range;
            }
        }

        throw new InvalidOperationException("Unreachable: a covered temperature lies in some range.");
    }
}
