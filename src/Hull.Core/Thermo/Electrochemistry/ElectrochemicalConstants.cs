using Hull.Core.Thermo.Gases;

namespace Hull.Core.Thermo.Electrochemistry;

/// <summary>The constants that turn energies per ion into cell voltages and charge per mass.</summary>
public static class ElectrochemicalConstants
{
    /// <summary>Faraday constant F = e N_A, C/mol (CODATA 2018, exact: 96 485.332 12... C/mol).</summary>
    public const double FaradayCoulombsPerMol = PhysicalConstants.KilojoulesPerMolPerEv * 1000.0;

    /// <summary>
    /// Charge of one mole of electrons per gram of a substance of molar mass 1 g/mol, in mAh/g: F / 3.6
    /// (1 mAh = 3.6 C), ≈ 26 801.48.
    /// </summary>
    public const double MilliampHoursPerGramPerElectronPerGramPerMol = FaradayCoulombsPerMol / 3.6;

    /// <summary>The standing caveat of every voltage this module reports.</summary>
    public const string ZeroKelvinCaveat =
        "0 K energies stand in for Gibbs energies (no entropy, no zero-point or thermal terms): voltages are estimates at 0 K.";
}
