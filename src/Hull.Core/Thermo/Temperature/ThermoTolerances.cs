namespace Hull.Core.Thermo.Temperature;

/// <summary>Tolerances of the temperature solves, with why each has its size.</summary>
public static class ThermoTolerances
{
    /// <summary>
    /// Two competitor lines count as one where they differ by at most this at a temperature, eV per formula unit:
    /// ten times the hull's energy tolerance (1e-10 eV/atom) over a few atoms, far above the rounding of lines built
    /// from energies of order 10 eV and far below any energy that matters.
    /// </summary>
    public const double LineAgreementEv = 1e-9;

    /// <summary>Width to which Brent's method narrows a crossing, K: far below any table's meaning, well above double resolution at 6000 K.</summary>
    public const double CrossingTemperatureK = 1e-9;

    /// <summary>Brent iterations allowed per crossing; it needs a few dozen at most on a continuous function.</summary>
    public const int MaximumBrentIterations = 200;

    /// <summary>Default scan intervals of a range under the tabulated-gas treatment (a hull per point): 1 K steps over 256 K, 7 K over 1800 K.</summary>
    public const int DefaultScanIntervals = 256;

    /// <summary>Most scan intervals a caller may ask for: each is one hull build.</summary>
    public const int MaximumScanIntervals = 20000;

    /// <summary>
    /// Most straight pieces the exact walk follows before it stops: a phase's competitors change a handful of times
    /// over a range; thousands mean something is wrong with the data, and the walk says so.
    /// </summary>
    public const int MaximumPieces = 4096;
}
