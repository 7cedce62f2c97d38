using System.Globalization;
using Hull.Core.Thermo.Gases;

namespace Hull.Core.Thermo.Solids;

/// <summary>
/// The Ellingham approximation's decomposition temperature: with ΔH and ΔS constant in T, a reaction releasing
/// ν mol of gas at partial pressure p has ΔG = ΔH − T [ΔS − ν R ln(p/p°)], which changes sign at
/// T_d = ΔH / (ΔS − ν R ln(p/p°)), p° = 1 bar, R from CODATA 2018.
/// </summary>
public static class EllinghamDecomposition
{
    /// <summary>ΔS − ν R ln(p/p°), J/(mol K): the entropy change with the released gas at p instead of p°.</summary>
    /// <exception cref="ThermoInputException">A pressure that is zero, negative or not finite; a non-finite ΔS or ν.</exception>
    public static double EffectiveEntropyChangeJPerMolK(double entropyChangeJPerMolK, double gasReleasedMolPerMol, double gasPressureBar)
    {
        if (!double.IsFinite(gasPressureBar) || gasPressureBar <= 0)
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"The released gas's pressure must be positive and finite; got {gasPressureBar} bar."));
        }

        if (!double.IsFinite(entropyChangeJPerMolK) || !double.IsFinite(gasReleasedMolPerMol))
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"ΔS and ν must be finite; got {entropyChangeJPerMolK} J/(mol K) and {gasReleasedMolPerMol}."));
        }

        return entropyChangeJPerMolK - gasReleasedMolPerMol * PhysicalConstants.GasConstantJPerMolK
            * Math.Log(gasPressureBar / PhysicalConstants.StandardPressureBar);
    }

    /// <summary>
    /// T_d = ΔH / (ΔS − ν R ln(p/p°)) when it is a positive finite temperature; false when ΔG keeps one sign at
    /// every positive temperature (ΔH and the effective ΔS of opposite signs, or the effective ΔS zero).
    /// </summary>
    /// <exception cref="ThermoInputException">A non-finite ΔH, ΔS or ν; a bad pressure.</exception>
    public static bool TryFindTemperatureK(double enthalpyChangeJPerMol, double entropyChangeJPerMolK,
        double gasReleasedMolPerMol, double gasPressureBar, out double temperatureK)
    {
        if (!double.IsFinite(enthalpyChangeJPerMol))
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture, $"ΔH must be finite; got {enthalpyChangeJPerMol} J/mol."));
        }

        double effective = EffectiveEntropyChangeJPerMolK(entropyChangeJPerMolK, gasReleasedMolPerMol, gasPressureBar);
        temperatureK = enthalpyChangeJPerMol / effective;
        if (double.IsFinite(temperatureK) && temperatureK > 0)
        {
            return true;
        }

        temperatureK = double.NaN;
        return false;
    }

    /// <summary>As <see cref="TryFindTemperatureK"/>, but no crossing is an error that says why.</summary>
    /// <exception cref="ThermoInputException">No positive decomposition temperature, or bad input.</exception>
    public static double FindTemperatureK(double enthalpyChangeJPerMol, double entropyChangeJPerMolK,
        double gasReleasedMolPerMol, double gasPressureBar)
    {
        if (TryFindTemperatureK(enthalpyChangeJPerMol, entropyChangeJPerMolK, gasReleasedMolPerMol, gasPressureBar, out double t))
        {
            return t;
        }

        throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
            $"ΔG = {enthalpyChangeJPerMol} J/mol − T × {EffectiveEntropyChangeJPerMolK(entropyChangeJPerMolK, gasReleasedMolPerMol, gasPressureBar)} J/(mol K) keeps one sign at every positive temperature at {gasPressureBar} bar."));
    }

    internal static void RequireTemperature(double temperatureK)
    {
        if (!double.IsFinite(temperatureK) || temperatureK <= 0)
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"Temperature must be positive and finite; got {temperatureK} K."));
        }
    }
}
