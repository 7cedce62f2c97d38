using Hull.Core.Thermo;

namespace Hull.Core.Figures;

/// <summary>
/// The quantity a figure plots on its energy axis: the energy the hull was built over (a formation energy, a grand
/// potential, a free energy at a temperature), named and with its unit, so that every kind of hull draws the same way.
/// </summary>
/// <param name="Name">What the energy is, e.g. "Formation energy".</param>
/// <param name="Unit">Its unit, e.g. "eV/atom".</param>
public sealed record EnergyAxis(string Name, string Unit)
{
    /// <summary>
    /// The energy axis of <paramref name="axis"/>: its display name with a capital first letter, and its unit, so a
    /// grand-potential or free-energy hull is labelled as what it plots.
    /// </summary>
    public static EnergyAxis Of(HullAxis axis)
    {
        ArgumentNullException.ThrowIfNull(axis);
        string name = axis.DisplayName.Length == 0 ? axis.DisplayName : char.ToUpperInvariant(axis.DisplayName[0]) + axis.DisplayName[1..];
        return new EnergyAxis(name, axis.Unit);
    }

    /// <summary>"Name (unit)".</summary>
    public string Title => $"{Name} ({Unit})";
}
