namespace Hull.Core.Defects;

/// <summary>
/// How carriers and defect concentrations are counted in a charge-neutrality solve: the bands' states, the
/// occupation statistics, the concentration form, fully ionised extra donors and acceptors, and the gap's
/// temperature dependence (the gap itself is the study's).
/// </summary>
/// <param name="Bands">Parabolic bands or a tabulated density of states.</param>
/// <param name="Statistics">Fermi–Dirac or Boltzmann carriers.</param>
/// <param name="Form">Dilute or site-blocking defect concentrations.</param>
/// <param name="ExtraDonorsPerCubicCentimetre">Fully ionised donors outside the study (cm^-3, ≥ 0).</param>
/// <param name="ExtraAcceptorsPerCubicCentimetre">Fully ionised acceptors outside the study (cm^-3, ≥ 0).</param>
/// <param name="GapTemperature">How the gap moves with temperature; null for a fixed gap.</param>
public sealed record CarrierModel(
    BandStates Bands,
    CarrierStatistics Statistics = CarrierStatistics.FermiDirac,
    ConcentrationForm Form = ConcentrationForm.Dilute,
    double ExtraDonorsPerCubicCentimetre = 0,
    double ExtraAcceptorsPerCubicCentimetre = 0,
    GapTemperatureDependence? GapTemperature = null)
{
    /// <summary>The band edges at a temperature, from the study's gap.</summary>
    public BandEdges EdgesAt(double bandGapEv, double temperatureK)
    {
        if (GapTemperature is not { } dependence) return new BandEdges(0, bandGapEv);
        double change = dependence.GapChangeEv(temperatureK);
        return new BandEdges(-dependence.ValenceBandShare * change, bandGapEv + (1 - dependence.ValenceBandShare) * change);
    }

    /// <summary>Refuses a model that cannot be used with a gap, naming the field.</summary>
    public void Check(double bandGapEv)
    {
        ArgumentNullException.ThrowIfNull(Bands);
        Bands.Check(bandGapEv, "carriers");
        if (!Enum.IsDefined(Statistics)) throw new DefectInputException("carriers.statistics", $"unknown carrier statistics {(int)Statistics}");
        if (!Enum.IsDefined(Form)) throw new DefectInputException("carriers.form", $"unknown concentration form {(int)Form}");
        if (!(ExtraDonorsPerCubicCentimetre >= 0) || !double.IsFinite(ExtraDonorsPerCubicCentimetre))
            throw new DefectInputException("carriers.extra_donors_per_cm3", $"must be a finite number ≥ 0, not {ExtraDonorsPerCubicCentimetre}");
        if (!(ExtraAcceptorsPerCubicCentimetre >= 0) || !double.IsFinite(ExtraAcceptorsPerCubicCentimetre))
            throw new DefectInputException("carriers.extra_acceptors_per_cm3", $"must be a finite number ≥ 0, not {ExtraAcceptorsPerCubicCentimetre}");
        if (GapTemperature is { } g)
        {
            if (Bands is TabulatedBands)
                throw new DefectInputException("carriers.gap_temperature", "a tabulated density of states fixes its own band edges; give the table at the temperature wanted instead of a gap temperature dependence");
            if (!double.IsFinite(g.AlphaEvPerK)) throw new DefectInputException("carriers.gap_temperature.alpha_ev_per_k", "must be a finite number");
            if (!(g.BetaK >= 0) || !double.IsFinite(g.BetaK)) throw new DefectInputException("carriers.gap_temperature.beta_k", $"must be a finite number ≥ 0, not {g.BetaK}");
            if (!(g.ReferenceTemperatureK >= 0) || !double.IsFinite(g.ReferenceTemperatureK)) throw new DefectInputException("carriers.gap_temperature.reference_temperature_k", $"must be a finite number ≥ 0, not {g.ReferenceTemperatureK}");
            if (!(g.ValenceBandShare >= 0 && g.ValenceBandShare <= 1)) throw new DefectInputException("carriers.gap_temperature.valence_band_share", $"must lie in [0, 1], not {g.ValenceBandShare}");
        }
    }

    /// <summary>Refuses a temperature at which the gap closes, or that is not positive and finite.</summary>
    internal BandEdges CheckedEdges(double bandGapEv, double temperatureK, string field)
    {
        if (!(temperatureK > 0) || !double.IsFinite(temperatureK)) throw new DefectInputException(field, $"the temperature must be a positive number of kelvin, not {temperatureK}");
        var edges = EdgesAt(bandGapEv, temperatureK);
        if (!(edges.GapEv > 0)) throw new DefectInputException(field, $"the gap closes at {temperatureK} K ({edges.GapEv:G4} eV from the gap's temperature dependence)");
        return edges;
    }
}
