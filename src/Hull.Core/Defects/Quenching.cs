namespace Hull.Core.Defects;

/// <summary>
/// Quenching: defects form at the growth temperature and their totals freeze on cooling; at the operating
/// temperature only their charge states and the free carriers re-equilibrate, with the Fermi level re-solved.
/// </summary>
public static class Quenching
{
    public static QuenchSolution Solve(DefectEnsemble ensemble, CarrierModel model, double growthTemperatureK, double operatingTemperatureK)
    {
        var growth = ChargeNeutrality.Solve(ensemble, model, growthTemperatureK);
        var totals = growth.Defects.Select(d => d.PerCubicCentimetre).ToArray();
        var operating = ChargeNeutrality.SolveWithFixedTotals(ensemble, model, operatingTemperatureK, totals);
        return new QuenchSolution(growth, operating);
    }
}
