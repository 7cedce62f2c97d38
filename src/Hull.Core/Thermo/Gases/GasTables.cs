namespace Hull.Core.Thermo.Gases;

/// <summary>
/// The gases the module knows, with their thermochemical data. Shomate coefficients are the NIST Chemistry WebBook's
/// gas-phase fits (which reproduce NIST-JANAF, 4th ed., 1998); H°(298.15 K) − H°(0) is NIST-JANAF's tabulated value.
/// Every number below was recalled rather than looked up (hence "from memory"); the tests hold them to the tables'
/// H°(T) − H°(298.15 K) and S° and to each other at the shared ends of the ranges.
/// </summary>
public static class GasTables
{
    private const string WebBookShomate = "NIST Chemistry WebBook, gas-phase Shomate coefficients";
    private const string Janaf = "NIST-JANAF Thermochemical Tables, 4th ed. (1998)";

    // NIST Chemistry WebBook, O2 gas Shomate coefficients — from memory.
    public static GasSpecies Oxygen { get; } = new("O2", "O", 2, new ShomateTable($"{WebBookShomate}, O2", [
        new ShomateRange(100, 700, 31.32234, -20.23531, 57.86644, -36.50624, -0.007374, -8.903471, 246.7945, 0.0),
        new ShomateRange(700, 2000, 30.03235, 8.772972, -3.988133, 0.788313, -0.741599, -11.32468, 236.1663, 0.0),
        new ShomateRange(2000, 6000, 20.91111, 10.72071, -2.020498, 0.146449, 9.245722, 5.337651, 237.6185, 0.0),
    ]), 8.683, $"{Janaf}, O2 H°(298.15 K) − H°(0)"); // NIST-JANAF — from memory

    // NIST Chemistry WebBook, N2 gas Shomate coefficients — from memory.
    public static GasSpecies Nitrogen { get; } = new("N2", "N", 2, new ShomateTable($"{WebBookShomate}, N2", [
        new ShomateRange(100, 500, 28.98641, 1.853978, -9.647459, 16.63537, 0.000117, -8.671914, 226.4168, 0.0),
        new ShomateRange(500, 2000, 19.50583, 19.88705, -8.598535, 1.369784, 0.527601, -4.935202, 212.3900, 0.0),
        new ShomateRange(2000, 6000, 35.51872, 1.128728, -0.196103, 0.014662, -4.553760, -18.97091, 224.9810, 0.0),
    ]), 8.670, $"{Janaf}, N2 H°(298.15 K) − H°(0)"); // NIST-JANAF — from memory

    // NIST Chemistry WebBook, H2 gas Shomate coefficients — from memory.
    public static GasSpecies Hydrogen { get; } = new("H2", "H", 2, new ShomateTable($"{WebBookShomate}, H2", [
        new ShomateRange(298, 1000, 33.066178, -11.363417, 11.432816, -2.772874, -0.158558, -9.980797, 172.707974, 0.0),
        new ShomateRange(1000, 2500, 18.563083, 12.257357, -2.859786, 0.268238, 1.977990, -1.147438, 156.288133, 0.0),
        new ShomateRange(2500, 6000, 43.413560, -4.293079, 1.272428, -0.096876, -20.533862, -38.515158, 162.081354, 0.0),
    ]), 8.467, $"{Janaf}, H2 H°(298.15 K) − H°(0)"); // NIST-JANAF — from memory

    // NIST Chemistry WebBook, F2 gas Shomate coefficients (one range) — from memory.
    public static GasSpecies Fluorine { get; } = new("F2", "F", 2, new ShomateTable($"{WebBookShomate}, F2", [
        new ShomateRange(298, 6000, 31.44510, 8.413831, -2.778850, 0.218104, -0.211175, -10.42760, 237.2770, 0.0),
    ]), 8.825, $"{Janaf}, F2 H°(298.15 K) − H°(0)"); // NIST-JANAF — from memory

    // NIST Chemistry WebBook, Cl2 gas Shomate coefficients — from memory.
    public static GasSpecies Chlorine { get; } = new("Cl2", "Cl", 2, new ShomateTable($"{WebBookShomate}, Cl2", [
        new ShomateRange(298, 1000, 33.05060, 12.22940, -12.06510, 4.385330, -0.159494, -10.83480, 259.0290, 0.0),
        new ShomateRange(1000, 3000, 42.67730, -5.009570, 1.904621, -0.165641, -2.098480, -17.28980, 269.8400, 0.0),
        new ShomateRange(3000, 6000, -42.55350, 41.68570, -7.126830, 0.387839, 101.1440, 132.7640, 264.7860, 0.0),
    ]), 9.181, $"{Janaf}, Cl2 H°(298.15 K) − H°(0)"); // NIST-JANAF — from memory

    /// <summary>Every gas the module knows, in a fixed order.</summary>
    public static IReadOnlyList<GasSpecies> All { get; } = [Oxygen, Nitrogen, Hydrogen, Fluorine, Chlorine];

    /// <summary>The gas with this formula (exact, case-sensitive: "O2", "Cl2"), when the module knows it.</summary>
    public static bool TryGet(string? formula, out GasSpecies species)
    {
        species = All.FirstOrDefault(g => string.Equals(g.Formula, formula, StringComparison.Ordinal))!;
        return species is not null;
    }

    /// <summary>The gas with this formula.</summary>
    /// <exception cref="ThermoInputException">The module has no table for that gas.</exception>
    public static GasSpecies Get(string? formula)
    {
        if (TryGet(formula, out GasSpecies species))
        {
            return species;
        }

        throw new ThermoInputException(
            $"No gas table for '{formula}'; known gases: {string.Join(", ", All.Select(g => g.Formula))}.");
    }
}
