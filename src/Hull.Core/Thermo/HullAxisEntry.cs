using System.Globalization;

namespace Hull.Core.Thermo;

/// <summary>
/// An entry placed on a hull's axis: the entry (id and composition) and its energy on that axis, per atom as the
/// axis counts atoms. The formation energy is carried beside it only where it is known; it is never needed to build
/// the hull.
/// </summary>
public sealed class HullAxisEntry
{
    /// <exception cref="ThermoInputException">A missing entry or a non-finite energy.</exception>
    public HullAxisEntry(PhaseEntry entry, double axisEnergyEvPerAtom, double? formationEnergyEvPerAtom = null)
    {
        if (entry is null)
        {
            throw new ThermoInputException("A hull-axis entry needs an entry.");
        }

        if (!double.IsFinite(axisEnergyEvPerAtom))
        {
            throw new ThermoInputException(
                string.Create(CultureInfo.InvariantCulture, $"Entry '{entry.Id}' has a non-finite energy on the hull axis ({axisEnergyEvPerAtom} eV/atom)."),
                entryId: entry.Id);
        }

        if (formationEnergyEvPerAtom is { } formation && !double.IsFinite(formation))
        {
            throw new ThermoInputException(
                string.Create(CultureInfo.InvariantCulture, $"Entry '{entry.Id}' has a non-finite formation energy ({formation} eV/atom)."),
                entryId: entry.Id);
        }

        Entry = entry;
        AxisEnergyEvPerAtom = axisEnergyEvPerAtom;
        FormationEnergyEvPerAtom = formationEnergyEvPerAtom;
    }

    public PhaseEntry Entry { get; }

    /// <summary>The energy hulled over (eV per atom as the axis counts atoms).</summary>
    public double AxisEnergyEvPerAtom { get; }

    /// <summary>The formation energy from the elements (eV/atom), when known.</summary>
    public double? FormationEnergyEvPerAtom { get; }
}
