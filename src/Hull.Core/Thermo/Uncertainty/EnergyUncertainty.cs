using System.Globalization;

namespace Hull.Core.Thermo.Uncertainty;

/// <summary>
/// The uncertainty of one entry's formation energy: an independent Gaussian error of standard deviation
/// <see cref="SigmaEvPerAtom"/> (eV/atom), and optionally the correlation group whose shared systematic error
/// (its own σ, <see cref="CorrelationGroup"/>) every member takes in full.
/// </summary>
public sealed record EnergyUncertainty
{
    /// <exception cref="ThermoInputException">σ negative or not finite, or an empty group name.</exception>
    public EnergyUncertainty(string entryId, double sigmaEvPerAtom, string? group = null)
    {
        if (!double.IsFinite(sigmaEvPerAtom) || sigmaEvPerAtom < 0)
        {
            throw new ThermoInputException(
                string.Create(CultureInfo.InvariantCulture,
                    $"Entry '{entryId}': the energy uncertainty must be a finite, non-negative number of eV/atom; got {sigmaEvPerAtom}."),
                entryId: entryId);
        }

        if (group is not null && string.IsNullOrWhiteSpace(group))
        {
            throw new ThermoInputException($"Entry '{entryId}': a correlation group needs a non-empty name.", entryId: entryId);
        }

        EntryId = entryId;
        SigmaEvPerAtom = sigmaEvPerAtom;
        Group = group;
    }

    public string EntryId { get; }

    /// <summary>Standard deviation of the entry's own error, eV/atom.</summary>
    public double SigmaEvPerAtom { get; }

    /// <summary>The correlation group, or null.</summary>
    public string? Group { get; }
}
