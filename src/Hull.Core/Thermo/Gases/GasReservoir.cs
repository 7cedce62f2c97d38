using System.Globalization;

namespace Hull.Core.Thermo.Gases;

/// <summary>
/// An ideal-gas reservoir of one element: a gas from <see cref="GasTables"/> and the reference energy of its
/// molecule. The one place μ(T, p) is computed:
/// μ(T, p) = E_ref + [H°(T) − H°(T_anchor)] − T S°(T) + k_B T ln(p/p°), p° = 1 bar, per molecule; per atom is the
/// molecule's divided by its atoms. Δμ, and the pressure or temperature that gives a chosen Δμ, come from here too.
/// </summary>
public sealed class GasReservoir
{
    public GasReservoir(GasSpecies species, GasReference reference)
    {
        ArgumentNullException.ThrowIfNull(species);
        ArgumentNullException.ThrowIfNull(reference);
        Species = species;
        Reference = reference;
    }

    public GasSpecies Species { get; }

    public GasReference Reference { get; }

    /// <summary>μ(T, p) of the gas and its parts.</summary>
    /// <exception cref="ThermoInputException">Temperature outside the gas's table; pressure zero, negative or not finite.</exception>
    public GasChemicalPotential ChemicalPotential(double temperatureK, double pressureBar)
    {
        RequirePressure(pressureBar);
        double enthalpyKjPerMol = Species.EnthalpyAboveStandardKjPerMol(temperatureK);
        if (Reference.Mode == GasReferenceMode.ComputedMoleculeEnergy)
        {
            enthalpyKjPerMol += Species.EnthalpyStandardAboveZeroKjPerMol;
        }

        return Potential(temperatureK, pressureBar, enthalpyKjPerMol, Species.EntropyJPerMolK(temperatureK));
    }

    /// <summary>
    /// μ(T, p) in the Ellingham approximation: H and S held at their 298.15 K values, so
    /// μ = E_ref + [H°(298.15 K) − H°(T_anchor)] − T S°(298.15 K) + k_B T ln(p/p°), a straight line in T at fixed p.
    /// S°(298.15 K) is the table's unless <paramref name="standardEntropyJPerMolK"/> gives the value of the handbook
    /// the solids' data come from (so that every species of a reaction comes from one table).
    /// </summary>
    /// <exception cref="ThermoInputException">A temperature that is not positive and finite; a bad pressure or entropy.</exception>
    public GasChemicalPotential StandardStateChemicalPotential(double temperatureK, double pressureBar, double? standardEntropyJPerMolK = null)
    {
        RequirePressure(pressureBar);
        if (!double.IsFinite(temperatureK) || temperatureK <= 0)
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"Temperature must be positive and finite; got {temperatureK} K."), element: Species.Element);
        }

        double entropyJPerMolK = standardEntropyJPerMolK ?? Species.EntropyJPerMolK(PhysicalConstants.StandardTemperatureK);
        if (!double.IsFinite(entropyJPerMolK) || entropyJPerMolK <= 0)
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"The standard entropy of {Species.Formula} must be positive and finite; got {entropyJPerMolK} J/(mol K)."), element: Species.Element);
        }

        double enthalpyKjPerMol = Reference.Mode == GasReferenceMode.ComputedMoleculeEnergy ? Species.EnthalpyStandardAboveZeroKjPerMol : 0.0;
        return Potential(temperatureK, pressureBar, enthalpyKjPerMol, entropyJPerMolK);
    }

    /// <summary>μ's parts from H(T) − H(T_anchor) (kJ/mol) and S (J/(mol K)), both per mol of molecules.</summary>
    private GasChemicalPotential Potential(double temperatureK, double pressureBar, double enthalpyKjPerMol, double entropyJPerMolK) => new(
        Species.Formula,
        Reference.Mode,
        temperatureK,
        pressureBar,
        Species.AtomsPerMolecule,
        Reference.EnergyEvPerMolecule,
        enthalpyKjPerMol / PhysicalConstants.KilojoulesPerMolPerEv,
        temperatureK * entropyJPerMolK / 1000.0 / PhysicalConstants.KilojoulesPerMolPerEv,
        PhysicalConstants.BoltzmannEvPerK * temperatureK * Math.Log(pressureBar / PhysicalConstants.StandardPressureBar));

    /// <summary>Δμ in the Ellingham approximation (<see cref="StandardStateChemicalPotential"/>) against the dataset's reference, eV/atom.</summary>
    /// <exception cref="ThermoInputException">Bad temperature, pressure, entropy or reference.</exception>
    public ChemicalPotentialShift StandardStateShift(double temperatureK, double pressureBar, double datasetReferenceEvPerAtom, double? standardEntropyJPerMolK = null)
    {
        RequireFiniteReference(datasetReferenceEvPerAtom);
        return new ChemicalPotentialShift(Species.Element, StandardStateChemicalPotential(temperatureK, pressureBar, standardEntropyJPerMolK),
            datasetReferenceEvPerAtom, Reference.ZeroPointEnergyEvPerMolecule / Species.AtomsPerMolecule);
    }

    /// <summary>
    /// The pressure at which the element has Δμ = <paramref name="deltaMuEvPerAtom"/> at T in the Ellingham
    /// approximation: the same ideal-gas inversion as <see cref="PressureAt"/>, from the standard-state μ at p°.
    /// </summary>
    /// <exception cref="ThermoInputException">A bad temperature, entropy, Δμ or reference.</exception>
    public PressureForShift StandardStatePressureAt(double deltaMuEvPerAtom, double temperatureK, double datasetReferenceEvPerAtom, double? standardEntropyJPerMolK = null)
    {
        RequireFiniteShift(deltaMuEvPerAtom);
        ChemicalPotentialShift standard = StandardStateShift(temperatureK, PhysicalConstants.StandardPressureBar, datasetReferenceEvPerAtom, standardEntropyJPerMolK);
        return PressureFrom(deltaMuEvPerAtom, temperatureK, standard.DeltaMuEvPerAtom);
    }

    /// <summary>
    /// The temperature at which the element has Δμ = <paramref name="deltaMuEvPerAtom"/> at p in the Ellingham
    /// approximation, where Δμ is a straight line in T: solved in closed form; not converged (NaN) when the line
    /// never reaches it at a positive temperature.
    /// </summary>
    /// <exception cref="ThermoInputException">A bad pressure, entropy, Δμ or reference.</exception>
    public TemperatureSolveResult StandardStateTemperatureAt(double deltaMuEvPerAtom, double pressureBar, double datasetReferenceEvPerAtom, double? standardEntropyJPerMolK = null)
    {
        RequireFiniteShift(deltaMuEvPerAtom);
        const double low = 1.0, high = 1001.0;
        double atLow = StandardStateShift(low, pressureBar, datasetReferenceEvPerAtom, standardEntropyJPerMolK).DeltaMuEvPerAtom;
        double atHigh = StandardStateShift(high, pressureBar, datasetReferenceEvPerAtom, standardEntropyJPerMolK).DeltaMuEvPerAtom;
        double slope = (atHigh - atLow) / (high - low);
        double t = low + ((deltaMuEvPerAtom - atLow) / slope);
        return double.IsFinite(t) && t > 0
            ? new TemperatureSolveResult(TemperatureSolveStatus.Converged, t, t, t, 0, 1, 0, double.PositiveInfinity)
            : new TemperatureSolveResult(TemperatureSolveStatus.NoSignChangeInRange, double.NaN, 0, double.PositiveInfinity, 0, 0, 0, double.PositiveInfinity);
    }

    /// <summary>Δμ of the gas's element at (T, p) against the dataset's reference for it, eV/atom.</summary>
    /// <exception cref="ThermoInputException">Bad temperature or pressure, or a non-finite reference.</exception>
    public ChemicalPotentialShift Shift(double temperatureK, double pressureBar, double datasetReferenceEvPerAtom)
    {
        RequireFiniteReference(datasetReferenceEvPerAtom);
        return new ChemicalPotentialShift(Species.Element, ChemicalPotential(temperatureK, pressureBar),
            datasetReferenceEvPerAtom, Reference.ZeroPointEnergyEvPerMolecule / Species.AtomsPerMolecule);
    }

    /// <summary>Δμ against the dataset's reference entry for the gas's element.</summary>
    /// <exception cref="ThermoInputException">The reference is for another element; bad temperature or pressure.</exception>
    public ChemicalPotentialShift Shift(double temperatureK, double pressureBar, ElementReference datasetReference)
    {
        ArgumentNullException.ThrowIfNull(datasetReference);
        if (!string.Equals(datasetReference.Symbol, Species.Element, StringComparison.Ordinal))
        {
            throw new ThermoInputException(
                $"The {Species.Formula} reservoir needs the dataset's reference for {Species.Element}, not for {datasetReference.Symbol}.",
                element: datasetReference.Symbol);
        }

        return Shift(temperatureK, pressureBar, datasetReference.TotalEnergyEvPerAtom);
    }

    /// <summary>
    /// The pressure at which the element has Δμ = <paramref name="deltaMuEvPerAtom"/> at <paramref name="temperatureK"/>:
    /// ln(p/p°) = n (Δμ − Δμ(T, p°)) / (k_B T) for n atoms per molecule, in closed form.
    /// </summary>
    /// <exception cref="ThermoInputException">Temperature outside the table; a non-finite Δμ or reference.</exception>
    public PressureForShift PressureAt(double deltaMuEvPerAtom, double temperatureK, double datasetReferenceEvPerAtom)
    {
        RequireFiniteShift(deltaMuEvPerAtom);
        ChemicalPotentialShift standard = Shift(temperatureK, PhysicalConstants.StandardPressureBar, datasetReferenceEvPerAtom);
        return PressureFrom(deltaMuEvPerAtom, temperatureK, standard.DeltaMuEvPerAtom);
    }

    private PressureForShift PressureFrom(double deltaMuEvPerAtom, double temperatureK, double standardDeltaMuEvPerAtom)
    {
        double lnRatio = Species.AtomsPerMolecule * (deltaMuEvPerAtom - standardDeltaMuEvPerAtom)
            / (PhysicalConstants.BoltzmannEvPerK * temperatureK);
        double log10Bar = Math.Log10(PhysicalConstants.StandardPressureBar) + lnRatio / Math.Log(10.0);
        return new PressureForShift(Species.Formula, temperatureK, deltaMuEvPerAtom, log10Bar);
    }

    /// <summary>
    /// The temperature at which the element has Δμ = <paramref name="deltaMuEvPerAtom"/> at <paramref name="pressureBar"/>,
    /// searched over the gas's whole table: a bracketed bisection solve (<see cref="TemperatureBisection"/>) whose
    /// result says why it stopped; it never throws for a solve that finds nothing.
    /// </summary>
    /// <exception cref="ThermoInputException">Pressure zero, negative or not finite; a non-finite Δμ or reference.</exception>
    public TemperatureSolveResult TemperatureAt(double deltaMuEvPerAtom, double pressureBar, double datasetReferenceEvPerAtom) =>
        TemperatureAt(deltaMuEvPerAtom, pressureBar, datasetReferenceEvPerAtom,
            Species.Table.MinimumTemperatureK, Species.Table.MaximumTemperatureK);

    /// <summary>As above, searched over [<paramref name="fromK"/>, <paramref name="toK"/>] within the gas's table.</summary>
    /// <exception cref="ThermoInputException">A search range outside the table or empty; bad pressure, Δμ or reference.</exception>
    public TemperatureSolveResult TemperatureAt(double deltaMuEvPerAtom, double pressureBar, double datasetReferenceEvPerAtom,
        double fromK, double toK)
    {
        RequireFiniteShift(deltaMuEvPerAtom);
        RequirePressure(pressureBar);
        RequireFiniteReference(datasetReferenceEvPerAtom);
        if (!(Species.Table.Covers(fromK) && Species.Table.Covers(toK) && toK > fromK))
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"Temperature search {fromK} K to {toK} K is not a range within the {Species.Formula} table ({Species.Table.MinimumTemperatureK} K to {Species.Table.MaximumTemperatureK} K)."));
        }

        return TemperatureBisection.Solve(
            t => Shift(t, pressureBar, datasetReferenceEvPerAtom).DeltaMuEvPerAtom - deltaMuEvPerAtom, fromK, toK);
    }

    private void RequirePressure(double pressureBar)
    {
        if (!double.IsFinite(pressureBar) || pressureBar <= 0)
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"Pressure of {Species.Formula} must be positive and finite; got {pressureBar} bar."), element: Species.Element);
        }
    }

    private void RequireFiniteReference(double evPerAtom)
    {
        if (!double.IsFinite(evPerAtom))
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"The dataset's reference for {Species.Element} is not finite ({evPerAtom} eV/atom)."), element: Species.Element);
        }
    }

    private void RequireFiniteShift(double deltaMuEvPerAtom)
    {
        if (!double.IsFinite(deltaMuEvPerAtom))
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"Δμ of {Species.Element} is not finite ({deltaMuEvPerAtom} eV/atom)."), element: Species.Element);
        }
    }
}
