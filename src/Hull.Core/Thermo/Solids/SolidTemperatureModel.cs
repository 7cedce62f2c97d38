using Hull.Core.Chemistry;

namespace Hull.Core.Thermo.Solids;

/// <summary>
/// How a solid entry's free energy changes with temperature: a standard entropy (<see cref="StandardEntropyModel"/>,
/// the Ellingham approximation of constant ΔH and ΔS) or a tabulated G(T) (<see cref="FreeEnergyTableModel"/>).
/// An entry carries at most one. Values are per formula unit of the entry's formula as written; a model may name the
/// formula unit its values refer to, which must then be that same formula unit (<see cref="CheckFormulaOf"/>).
/// A gas's entropy never belongs here: it enters through the gas's μ(T, p) alone.
/// </summary>
public abstract record SolidTemperatureModel
{
    private protected SolidTemperatureModel(Composition? formulaUnit)
    {
        FormulaUnit = formulaUnit;
    }

    /// <summary>The formula unit the values refer to when the model names one; null means the entry's own.</summary>
    public Composition? FormulaUnit { get; }

    /// <summary>
    /// Refuses a model whose named formula unit is not the entry's: a different composition, or the same
    /// proportions in another amount (per-formula-unit values would then be off by that factor).
    /// </summary>
    /// <exception cref="ThermoInputException">The formulas differ; names the entry and both formulas.</exception>
    public void CheckFormulaOf(string entryId, Composition entryComposition)
    {
        ArgumentNullException.ThrowIfNull(entryComposition);
        if (FormulaUnit is null || FormulaUnit == entryComposition) return;
        string why = FormulaUnit.HasSameProportions(entryComposition)
            ? $"it has the same proportions but {FormulaUnit.AtomsPerFormulaUnit} atoms per formula unit instead of {entryComposition.AtomsPerFormulaUnit}, so its per-formula-unit values would be off by that factor"
            : "it is another composition";
        throw new ThermoInputException(
            $"Entry '{entryId}': the temperature model is for {FormulaUnit.Formula}, not the entry's {entryComposition.Formula}: {why}; give the values per formula unit of {entryComposition.Formula}.",
            entryId: entryId);
    }

    /// <summary>Reads an optional formula; null or blank means none.</summary>
    private protected static Composition? ParseFormula(string? formula, string what)
    {
        if (string.IsNullOrWhiteSpace(formula)) return null;
        if (!Composition.TryParse(formula, out Composition? composition, out FormulaParseException? error))
        {
            throw new ThermoInputException($"{what}: formula '{formula}' does not parse: {error.Message}");
        }

        return composition;
    }
}
