namespace Hull.Core.Thermo.Gases;

/// <summary>
/// The physical constants the gas module uses, CODATA 2018 recommended values; since the 2019 SI redefinition the
/// Boltzmann constant, the elementary charge and the Avogadro constant are exact, so every value here is exact or
/// follows from exact ones.
/// </summary>
public static class PhysicalConstants
{
    /// <summary>Boltzmann constant in eV/K: 1.380649e-23 J/K divided by 1.602176634e-19 J/eV (CODATA 2018).</summary>
    public const double BoltzmannEvPerK = 1.380649e-23 / 1.602176634e-19;

    /// <summary>Avogadro constant, 1/mol (CODATA 2018, exact).</summary>
    public const double AvogadroPerMol = 6.02214076e23;

    /// <summary>Molar gas constant R = N_A k_B in J/(mol K) (CODATA 2018: 8.314462618... J/(mol K)).</summary>
    public const double GasConstantJPerMolK = 6.02214076e23 * 1.380649e-23;

    /// <summary>One eV per particle expressed in kJ/mol: e N_A / 1000 (CODATA 2018: 96.485 332 12... kJ/mol).</summary>
    public const double KilojoulesPerMolPerEv = 1.602176634e-19 * 6.02214076e23 / 1000.0;

    /// <summary>Standard pressure p° in bar (IUPAC standard state since 1982).</summary>
    public const double StandardPressureBar = 1.0;

    /// <summary>The standard reference temperature of thermochemical tables, K.</summary>
    public const double StandardTemperatureK = 298.15;
}
