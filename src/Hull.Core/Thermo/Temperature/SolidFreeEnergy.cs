using System.Globalization;
using Hull.Core.Chemistry;
using Hull.Core.Thermo.Gases;
using Hull.Core.Thermo.Solids;

namespace Hull.Core.Thermo.Temperature;

/// <summary>
/// Evaluates an entry's temperature model: G(T) − H(anchor) per atom. A standard entropy gives −T S° (H and S
/// constant: the Ellingham approximation, a straight line in T); a table is read linearly between its points and
/// refused outside them, never extrapolated. Values are per formula unit of the model's formula (the entry's own when
/// it names none), so a model shared by every entry of one reduced formula is divided by its own atoms.
/// </summary>
public static class SolidFreeEnergy
{
    /// <summary>G(T) − H(anchor) per atom, eV/atom, of the entry <paramref name="entryId"/> of <paramref name="entryComposition"/>.</summary>
    /// <exception cref="ThermoInputException">A temperature outside a table.</exception>
    public static double AboveAnchorEvPerAtom(SolidTemperatureModel model, string entryId, Composition entryComposition, double temperatureK)
    {
        ArgumentNullException.ThrowIfNull(model);
        double atoms = (model.FormulaUnit ?? entryComposition).AtomsPerFormulaUnit.ToDouble();
        switch (model)
        {
            case StandardEntropyModel entropy:
                return -temperatureK * entropy.EntropyJPerMolK / 1000.0 / PhysicalConstants.KilojoulesPerMolPerEv / atoms;
            case FreeEnergyTableModel table:
                if (!(temperatureK >= table.MinimumTemperatureK && temperatureK <= table.MaximumTemperatureK))
                {
                    throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                        $"Temperature {temperatureK} K is outside the tabulated free energy of entry '{entryId}' ({table.MinimumTemperatureK} K to {table.MaximumTemperatureK} K)."),
                        entryId: entryId);
                }

                int high = 1;
                while (high < table.Points.Length - 1 && table.Points[high].TemperatureK < temperatureK) high++;
                FreeEnergyPoint a = table.Points[high - 1], b = table.Points[high];
                double w = (temperatureK - a.TemperatureK) / (b.TemperatureK - a.TemperatureK);
                return (a.ThermalFreeEnergyEvPerFormulaUnit + (w * (b.ThermalFreeEnergyEvPerFormulaUnit - a.ThermalFreeEnergyEvPerFormulaUnit))) / atoms;
            default:
                throw new ThermoInputException($"Entry '{entryId}' has a temperature model of an unknown kind ({model.GetType().Name}).", entryId: entryId);
        }
    }

    /// <summary>True when the model's G(T) is a straight line in T (a standard entropy).</summary>
    public static bool IsLinearInTemperature(SolidTemperatureModel model) => model is StandardEntropyModel;

    /// <summary>A short description for answers, e.g. "S° = 121.3 J/(mol K) per Ag2O".</summary>
    public static string Describe(SolidTemperatureModel model, Composition entryComposition)
    {
        ArgumentNullException.ThrowIfNull(model);
        string formula = (model.FormulaUnit ?? entryComposition).Formula;
        return model switch
        {
            StandardEntropyModel s => string.Create(CultureInfo.InvariantCulture, $"S° = {s.EntropyJPerMolK:G6} J/(mol K) per {formula}"),
            FreeEnergyTableModel t => string.Create(CultureInfo.InvariantCulture,
                $"G(T) − E tabulated per {formula} ({FreeEnergyAnchorTokens.ToToken(t.Anchor)}), {t.Points.Length} points {t.MinimumTemperatureK} K to {t.MaximumTemperatureK} K"),
            _ => model.GetType().Name,
        };
    }
}
