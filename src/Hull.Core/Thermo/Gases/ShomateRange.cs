using System.Globalization;

namespace Hull.Core.Thermo.Gases;

/// <summary>
/// One temperature range of a Shomate equation fit: with t = T / 1000 K,
/// Cp° = A + B t + C t² + D t³ + E / t² (J/(mol K)),
/// H°(T) − H°(298.15 K) = A t + B t²/2 + C t³/3 + D t⁴/4 − E/t + F − H (kJ/mol),
/// S°(T) = A ln t + B t + C t²/2 + D t³/3 − E/(2 t²) + G (J/(mol K)).
/// Valid from <see cref="MinimumTemperatureK"/> to <see cref="MaximumTemperatureK"/>, both included.
/// </summary>
public sealed record ShomateRange
{
    public ShomateRange(double minimumTemperatureK, double maximumTemperatureK,
        double a, double b, double c, double d, double e, double f, double g, double h)
    {
        double[] all = [minimumTemperatureK, maximumTemperatureK, a, b, c, d, e, f, g, h];
        if (all.Any(v => !double.IsFinite(v)))
        {
            throw new ArgumentException("A Shomate range needs finite bounds and coefficients.");
        }

        if (!(minimumTemperatureK > 0 && maximumTemperatureK > minimumTemperatureK))
        {
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"A Shomate range needs 0 < minimum < maximum; got {minimumTemperatureK} K to {maximumTemperatureK} K."));
        }

        MinimumTemperatureK = minimumTemperatureK;
        MaximumTemperatureK = maximumTemperatureK;
        A = a; B = b; C = c; D = d; E = e; F = f; G = g; H = h;
    }

    public double MinimumTemperatureK { get; }
    public double MaximumTemperatureK { get; }
    public double A { get; }
    public double B { get; }
    public double C { get; }
    public double D { get; }
    public double E { get; }
    public double F { get; }
    public double G { get; }
    public double H { get; }

    /// <summary>True when <paramref name="temperatureK"/> lies in this range, ends included.</summary>
    public bool Covers(double temperatureK) => temperatureK >= MinimumTemperatureK && temperatureK <= MaximumTemperatureK;

    /// <summary>Cp°(T) in J/(mol K). The caller has checked the range.</summary>
    public double HeatCapacityJPerMolK(double temperatureK)
    {
        double t = temperatureK / 1000.0;
        return A + B * t + C * t * t + D * t * t * t + E / (t * t);
    }

    /// <summary>H°(T) − H°(298.15 K) in kJ/mol. The caller has checked the range.</summary>
    public double EnthalpyAboveStandardKjPerMol(double temperatureK)
    {
        double t = temperatureK / 1000.0;
        return A * t + B * t * t / 2 + C * t * t * t / 3 + D * t * t * t * t / 4 - E / t + F - H;
    }

    /// <summary>S°(T) in J/(mol K), at p° = 1 bar. The caller has checked the range.</summary>
    public double EntropyJPerMolK(double temperatureK)
    {
        double t = temperatureK / 1000.0;
        return A * Math.Log(t) + B * t + C * t * t / 2 + D * t * t * t / 3 - E / (2 * t * t) + G;
    }
}
