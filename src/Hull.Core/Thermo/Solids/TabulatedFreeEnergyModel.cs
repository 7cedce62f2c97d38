using System.Globalization;
using Hull.Core.Chemistry;

namespace Hull.Core.Thermo.Solids;

/// <summary>
/// A solid's free energy tabulated against temperature, G(T) − H(anchor) per formula unit (eV), on the same anchor as
/// the gas reference in use (0 K for a computed molecule energy, the zero-point energy included when the entry's
/// energy lacks it; 298.15 K for a fitted reference). Linear between rows; outside the rows is an error, never an
/// extrapolation.
/// </summary>
public sealed record TabulatedFreeEnergyModel : SolidTemperatureModel
{
    private readonly FreeEnergyPoint[] _points;

    /// <exception cref="ThermoInputException">Fewer than two rows, a non-finite value, or temperatures not rising.</exception>
    public TabulatedFreeEnergyModel(Composition formula, IReadOnlyList<FreeEnergyPoint> points, string? source = null)
        : base(formula, source)
    {
        if (points is null || points.Count < 2)
        {
            throw new ThermoInputException($"A tabulated free energy of {formula.Formula} needs at least two rows (temperature, G − H).");
        }

        for (int i = 0; i < points.Count; i++)
        {
            FreeEnergyPoint p = points[i] ?? throw new ThermoInputException($"Row {i} of the tabulated free energy of {formula.Formula} is empty.");
            if (!double.IsFinite(p.TemperatureK) || p.TemperatureK < 0 || !double.IsFinite(p.FreeEnergyAboveAnchorEvPerFormulaUnit))
            {
                throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                    $"Row {i} of the tabulated free energy of {formula.Formula} needs a finite temperature ≥ 0 K and a finite G − H; got {p.TemperatureK} K, {p.FreeEnergyAboveAnchorEvPerFormulaUnit} eV."));
            }

            if (i > 0 && !(p.TemperatureK > points[i - 1].TemperatureK))
            {
                throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                    $"Row {i} of the tabulated free energy of {formula.Formula} is at {p.TemperatureK} K, not above row {i - 1} ({points[i - 1].TemperatureK} K): temperatures must rise."));
            }
        }

        _points = [.. points];
    }

    /// <summary>The rows, in rising temperature.</summary>
    public IReadOnlyList<FreeEnergyPoint> Points => _points;

    public override bool IsLinearInTemperature => false;

    public override (double FromK, double ToK) TemperatureRangeK => (_points[0].TemperatureK, _points[^1].TemperatureK);

    public override double FreeEnergyAboveAnchorEvPerAtom(double temperatureK, string entryId)
    {
        if (!(temperatureK >= _points[0].TemperatureK && temperatureK <= _points[^1].TemperatureK))
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"Temperature {temperatureK} K is outside the tabulated free energy of entry '{entryId}' ({Formula.Formula}, {_points[0].TemperatureK} K to {_points[^1].TemperatureK} K)."),
                entryId: entryId);
        }

        int high = 1;
        while (high < _points.Length - 1 && _points[high].TemperatureK < temperatureK)
        {
            high++;
        }

        FreeEnergyPoint a = _points[high - 1], b = _points[high];
        double w = (temperatureK - a.TemperatureK) / (b.TemperatureK - a.TemperatureK);
        double perFormulaUnit = a.FreeEnergyAboveAnchorEvPerFormulaUnit + (w * (b.FreeEnergyAboveAnchorEvPerFormulaUnit - a.FreeEnergyAboveAnchorEvPerFormulaUnit));
        return perFormulaUnit / Formula.AtomsPerFormulaUnit.ToDouble();
    }

    public override string Describe() =>
        string.Create(CultureInfo.InvariantCulture, $"G(T) − H tabulated per {Formula.Formula}, {_points.Length} rows {_points[0].TemperatureK} K to {_points[^1].TemperatureK} K");
}
