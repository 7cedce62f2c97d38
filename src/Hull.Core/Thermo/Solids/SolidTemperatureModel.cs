using Hull.Core.Chemistry;

namespace Hull.Core.Thermo.Solids;

/// <summary>
/// How a solid's free energy changes with temperature, given per formula unit of <see cref="Formula"/>: its energy
/// (the entry's, standing for H at the gas mode's anchor temperature) plus <see cref="FreeEnergyAboveAnchorEvPerAtom"/>.
/// The formula says which composition the numbers belong to; a model applied to an entry of another reduced
/// composition is refused (<see cref="RequireMatches"/>).
/// </summary>
public abstract record SolidTemperatureModel
{
    private protected SolidTemperatureModel(Composition formula, string? source)
    {
        Formula = formula ?? throw new ThermoInputException("A temperature model needs the formula its numbers are per formula unit of.");
        Source = string.IsNullOrWhiteSpace(source) ? null : source;
    }

    /// <summary>The formula whose formula unit the model's numbers are given per.</summary>
    public Composition Formula { get; }

    /// <summary>Where the numbers come from, as the caller said (a table, a calculation); null when not said.</summary>
    public string? Source { get; }

    /// <summary>G(T) − H(anchor) per atom, eV/atom.</summary>
    /// <exception cref="ThermoInputException">A temperature outside what the model covers.</exception>
    public abstract double FreeEnergyAboveAnchorEvPerAtom(double temperatureK, string entryId);

    /// <summary>True when G(T) − H(anchor) is a straight line in T (constant H and S: the Ellingham approximation).</summary>
    public abstract bool IsLinearInTemperature { get; }

    /// <summary>The lowest and highest temperature the model covers, K.</summary>
    public abstract (double FromK, double ToK) TemperatureRangeK { get; }

    /// <summary>A short description for answers, e.g. "S° = 121.3 J/(mol K) per Ag2O".</summary>
    public abstract string Describe();

    /// <summary>Refuses the model on an entry whose reduced composition differs from the model's.</summary>
    /// <exception cref="ThermoInputException">The formulas do not match; names the entry, both formulas and the model.</exception>
    public void RequireMatches(PhaseEntry entry)
    {
        ArgumentNullException.ThrowIfNull(entry);
        if (!entry.Composition.HasSameProportions(Formula))
        {
            throw new ThermoInputException(
                $"Entry '{entry.Id}' is {entry.Composition.Formula}, but its temperature model ({Describe()}) is for {Formula.Formula}: "
                + "a model's formula must have the entry's composition (any multiple of it).",
                entryId: entry.Id);
        }
    }
}
