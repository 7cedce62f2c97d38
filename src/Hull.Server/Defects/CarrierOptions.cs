using System.Globalization;
using Hull.Core.Defects;
using Hull.Protos.V1;
using Hull.Server.Errors;

namespace Hull.Server.Defects;

/// <summary>A carrier request's choices read from the wire: statistics, concentration form, temperatures.</summary>
public static class CarrierOptions
{
    public static CarrierStatistics Statistics(FermiStatistics statistics, string field = "statistics") => statistics switch
    {
        FermiStatistics.Unspecified or FermiStatistics.FermiDirac => CarrierStatistics.FermiDirac,
        FermiStatistics.Boltzmann => CarrierStatistics.Boltzmann,
        _ => throw RpcErrors.InvalidArgument(field, $"unknown carrier statistics {(int)statistics}; FERMI_STATISTICS_FERMI_DIRAC or FERMI_STATISTICS_BOLTZMANN"),
    };

    public static ConcentrationForm Form(DefectConcentrationForm form, string field = "form") => form switch
    {
        DefectConcentrationForm.Unspecified or DefectConcentrationForm.Dilute => ConcentrationForm.Dilute,
        DefectConcentrationForm.SiteBlocking => ConcentrationForm.SiteBlocking,
        _ => throw RpcErrors.InvalidArgument(field, $"unknown concentration form {(int)form}; DEFECT_CONCENTRATION_FORM_DILUTE or DEFECT_CONCENTRATION_FORM_SITE_BLOCKING"),
    };

    /// <summary>A temperature the model can solve at (positive, finite, the gap still open there); INVALID_ARGUMENT on <paramref name="field"/>.</summary>
    public static double Temperature(CarrierModel model, double bandGapEv, double temperatureK, string field)
    {
        if (!(temperatureK > 0) || !double.IsFinite(temperatureK))
        {
            throw RpcErrors.InvalidArgument(field, string.Create(CultureInfo.InvariantCulture, $"the temperature must be a positive number of kelvin, not {temperatureK}"));
        }

        double gap = model.EdgesAt(bandGapEv, temperatureK).GapEv;
        if (!(gap > 0))
        {
            throw RpcErrors.InvalidArgument(field, string.Create(CultureInfo.InvariantCulture,
                $"the gap closes at {temperatureK} K ({gap:G4} eV from the study's gap temperature dependence)"));
        }

        return temperatureK;
    }

    /// <summary>The doubts a solution raises: no neutral level, the iteration limit, a dilute form near site saturation.</summary>
    public static IEnumerable<string> Doubts(FermiLevelSolution solution, string where)
    {
        string t = solution.TemperatureK.ToString("0.##", CultureInfo.InvariantCulture);
        if (solution.Status == FermiSolveStatus.NoNeutralLevel)
        {
            yield return $"{where} at {t} K: no Fermi level balances the charge (the density of states holds too few states for the fixed charge); the level given is the search's edge";
        }
        else if (solution.Status == FermiSolveStatus.IterationLimit)
        {
            yield return $"{where} at {t} K: the Fermi-level solve stopped at its iteration limit; the level given is the best estimate";
        }

        if (solution.Form == ConcentrationForm.Dilute)
        {
            foreach (DefectTotal d in solution.Defects.Where(d => d.SiteFraction > DiluteSiteFractionLimit))
            {
                yield return string.Create(CultureInfo.InvariantCulture,
                    $"{where} at {t} K: {d.Defect} fills {d.SiteFraction:P1} of its sites, where the dilute form overcounts; ask for the site-blocking form");
            }
        }
    }

    /// <summary>Above this site fraction the dilute form's neglect of occupied sites changes totals by a percent or more.</summary>
    public const double DiluteSiteFractionLimit = 0.01;
}
