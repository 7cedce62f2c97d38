namespace Hull.Core.Defects;

/// <summary>
/// Parabolic bands: n = N_c F_{1/2}((E_F − E_C)/k_BT), p = N_v F_{1/2}((E_V − E_F)/k_BT), with the effective densities
/// of states scaling as T^{3/2} from their 300 K values.
/// </summary>
public sealed class ParabolicBands : BandStates
{
    private ParabolicBands(double nc, double nv)
    {
        ConductionStates300KPerCubicCentimetre = nc;
        ValenceStates300KPerCubicCentimetre = nv;
    }

    /// <summary>N_c at 300 K (cm^-3).</summary>
    public double ConductionStates300KPerCubicCentimetre { get; }

    /// <summary>N_v at 300 K (cm^-3).</summary>
    public double ValenceStates300KPerCubicCentimetre { get; }

    /// <summary>From N_c and N_v at 300 K (cm^-3).</summary>
    public static ParabolicBands FromEffectiveStates(double conductionStates300KPerCubicCentimetre, double valenceStates300KPerCubicCentimetre) =>
        new(conductionStates300KPerCubicCentimetre, valenceStates300KPerCubicCentimetre);

    /// <summary>From density-of-states effective masses in electron masses (valley degeneracy included).</summary>
    public static ParabolicBands FromEffectiveMasses(double electronMassRatio, double holeMassRatio)
    {
        if (!(electronMassRatio > 0) || !double.IsFinite(electronMassRatio)) throw new DefectInputException("carriers.electron_mass_ratio", $"the electron density-of-states mass must be a positive number of electron masses, not {electronMassRatio}");
        if (!(holeMassRatio > 0) || !double.IsFinite(holeMassRatio)) throw new DefectInputException("carriers.hole_mass_ratio", $"the hole density-of-states mass must be a positive number of electron masses, not {holeMassRatio}");
        double unit = CarrierConstants.EffectiveStatesPerElectronMass300K;
        return new(unit * Math.Pow(electronMassRatio, 1.5), unit * Math.Pow(holeMassRatio, 1.5));
    }

    /// <summary>N_c(T) (cm^-3).</summary>
    public double ConductionStatesPerCubicCentimetre(double temperatureK) => ConductionStates300KPerCubicCentimetre * Scale(temperatureK);

    /// <summary>N_v(T) (cm^-3).</summary>
    public double ValenceStatesPerCubicCentimetre(double temperatureK) => ValenceStates300KPerCubicCentimetre * Scale(temperatureK);

    public override double LogElectrons(double fermiLevelEv, double temperatureK, BandEdges edges, CarrierStatistics statistics) =>
        Math.Log(ConductionStatesPerCubicCentimetre(temperatureK)) + Occupation((fermiLevelEv - edges.ConductionEv) / (CarrierConstants.BoltzmannEvPerK * temperatureK), statistics);

    public override double LogHoles(double fermiLevelEv, double temperatureK, BandEdges edges, CarrierStatistics statistics) =>
        Math.Log(ValenceStatesPerCubicCentimetre(temperatureK)) + Occupation((edges.ValenceEv - fermiLevelEv) / (CarrierConstants.BoltzmannEvPerK * temperatureK), statistics);

    internal override void Check(double bandGapEv, string field)
    {
        if (!(ConductionStates300KPerCubicCentimetre > 0) || !double.IsFinite(ConductionStates300KPerCubicCentimetre))
            throw new DefectInputException($"{field}.conduction_states_300k_per_cm3", $"N_c must be a positive number of states per cm³, not {ConductionStates300KPerCubicCentimetre}");
        if (!(ValenceStates300KPerCubicCentimetre > 0) || !double.IsFinite(ValenceStates300KPerCubicCentimetre))
            throw new DefectInputException($"{field}.valence_states_300k_per_cm3", $"N_v must be a positive number of states per cm³, not {ValenceStates300KPerCubicCentimetre}");
    }

    private static double Scale(double temperatureK) => Math.Pow(temperatureK / CarrierConstants.QuotedTemperatureK, 1.5);

    private static double Occupation(double eta, CarrierStatistics statistics) =>
        statistics == CarrierStatistics.Boltzmann ? eta : FermiDiracIntegral.LogHalf(eta);
}
