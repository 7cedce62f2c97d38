namespace Hull.Core.Thermo.Temperature;

/// <summary>
/// A phase's signed decomposition energy against temperature (eV per closed-element atom), as points to draw through,
/// with the crossings of its <see cref="DecompositionTemperatureResult"/>.
/// </summary>
public sealed record TemperatureCurve(DecompositionTemperatureResult Result, IReadOnlyList<(double TemperatureK, double EnergyEvPerClosedAtom)> Points)
{
    /// <summary>
    /// The curve of <paramref name="result"/>: under the Ellingham treatment through its ends, breakpoints and
    /// crossings (exact, the curve being straight between them); otherwise <paramref name="samples"/> even points.
    /// </summary>
    /// <exception cref="ThermoInputException">Fewer than 2 or more than 5000 samples.</exception>
    public static TemperatureCurve Of(ThermoSystem system, DecompositionTemperatureResult result, int samples)
    {
        ArgumentNullException.ThrowIfNull(system);
        ArgumentNullException.ThrowIfNull(result);
        if (samples < 2 || samples > 5000)
        {
            throw new ThermoInputException($"A temperature curve needs 2 to 5000 samples; got {samples}.");
        }

        IEnumerable<double> at = result.Treatment == FreeEnergyTreatment.Ellingham
            ? [result.FromK, .. result.Breakpoints.Select(b => b.TemperatureK), .. result.Crossings.Select(c => c.TemperatureK), result.ToK]
            : Enumerable.Range(0, samples).Select(k => k == samples - 1 ? result.ToK : result.FromK + (k * (result.ToK - result.FromK) / (samples - 1)));
        (double, double)[] points = at.Distinct().Order()
            .Select(t => (t, system.SignedDecompositionEnergyAt(result.PhaseId, t).EnergyEvPerClosedAtom))
            .ToArray();
        return new TemperatureCurve(result, points);
    }
}
