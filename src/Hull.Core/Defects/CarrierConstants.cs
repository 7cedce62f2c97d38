namespace Hull.Core.Defects;

/// <summary>Constants of carrier statistics (CODATA 2018; h and k_B exact since the 2019 SI).</summary>
public static class CarrierConstants
{
    /// <summary>Electron rest mass (kg), CODATA 2018.</summary>
    public const double ElectronMassKg = 9.1093837015e-31;

    /// <summary>Planck constant (J s), exact.</summary>
    public const double PlanckJouleSeconds = 6.62607015e-34;

    /// <summary>Boltzmann constant (J/K), exact.</summary>
    public const double BoltzmannJoulePerK = 1.380649e-23;

    /// <summary>k_B in eV/K, the gas module's value.</summary>
    public const double BoltzmannEvPerK = Thermo.Gases.PhysicalConstants.BoltzmannEvPerK;

    /// <summary>The temperature at which effective densities of states are quoted (K).</summary>
    public const double QuotedTemperatureK = 300.0;

    /// <summary>
    /// N = 2 (2π m k_B T / h²)^{3/2} for m = m_e at 300 K, in cm^-3 (≈ 2.509e19; the effective density of states of a
    /// band with density-of-states mass m scales as (m/m_e)^{3/2} (T/300 K)^{3/2}).
    /// </summary>
    public static readonly double EffectiveStatesPerElectronMass300K =
        2 * Math.Pow(2 * Math.PI * ElectronMassKg * BoltzmannJoulePerK * QuotedTemperatureK / (PlanckJouleSeconds * PlanckJouleSeconds), 1.5) * 1e-6;
}
