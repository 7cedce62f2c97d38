using System.Globalization;

namespace Hull.Core.Thermo;

/// <summary>
/// The physical range a formation energy per atom must lie in before it reaches a hull, stated once for the import,
/// the candidates and the analyses.
/// </summary>
public static class FormationEnergyRange
{
    /// <summary>
    /// Largest accepted magnitude of a formation energy, eV/atom. The most negative formation energies of real
    /// compounds are a few eV/atom (fluorides and oxides, about -4 eV/atom; common practice), so twenty-five times
    /// that refuses no real compound, while the usual slips land far outside it: a per-cell energy typed as per atom,
    /// kJ/mol typed as eV (-500 for -5.2 eV), a total energy marked as a formation energy, or a corrupted number.
    /// </summary>
    public const double MaxMagnitudeEvPerAtom = 100.0;

    /// <summary>True for a finite value within ±<see cref="MaxMagnitudeEvPerAtom"/>.</summary>
    public static bool Contains(double formationEvPerAtom) =>
        double.IsFinite(formationEvPerAtom) && Math.Abs(formationEvPerAtom) <= MaxMagnitudeEvPerAtom;

    /// <summary>"formation energy -1E+300 eV/atom is outside ±100 eV/atom", for messages; short for huge values.</summary>
    public static string Describe(double formationEvPerAtom) =>
        string.Create(
            CultureInfo.InvariantCulture,
            $"formation energy {Show(formationEvPerAtom)} eV/atom is outside the accepted ±{MaxMagnitudeEvPerAtom:0} eV/atom");

    /// <summary>A number in at most a dozen characters (round-trip precision only where that is short).</summary>
    public static string Show(double value) =>
        double.IsNaN(value) ? "NaN"
        : double.IsInfinity(value) ? (value > 0 ? "+Infinity" : "-Infinity")
        : Math.Abs(value) >= 1e6 || (value != 0 && Math.Abs(value) < 1e-4)
            ? value.ToString("0.####E+0", CultureInfo.InvariantCulture)
            : value.ToString("0.######", CultureInfo.InvariantCulture);
}
