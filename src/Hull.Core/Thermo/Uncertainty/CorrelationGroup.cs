using System.Globalization;

namespace Hull.Core.Thermo.Uncertainty;

/// <summary>
/// Entries computed the same way share a systematic error: one Gaussian draw per sample, of standard deviation
/// <see cref="SigmaEvPerAtom"/> (eV/atom), added to the energy per atom of every member.
/// </summary>
public sealed record CorrelationGroup
{
    /// <exception cref="ThermoInputException">An empty name, or σ negative or not finite.</exception>
    public CorrelationGroup(string name, double sigmaEvPerAtom)
    {
        if (string.IsNullOrWhiteSpace(name))
        {
            throw new ThermoInputException("A correlation group needs a non-empty name.");
        }

        if (!double.IsFinite(sigmaEvPerAtom) || sigmaEvPerAtom < 0)
        {
            throw new ThermoInputException(
                string.Create(CultureInfo.InvariantCulture,
                    $"Correlation group '{name}': its shared uncertainty must be a finite, non-negative number of eV/atom; got {sigmaEvPerAtom}."));
        }

        Name = name;
        SigmaEvPerAtom = sigmaEvPerAtom;
    }

    public string Name { get; }

    /// <summary>Standard deviation of the shared error, eV/atom.</summary>
    public double SigmaEvPerAtom { get; }
}
