namespace Hull.Core.Defects;

/// <summary>
/// The charge balance at one temperature as h(E_F) = ln(positive charge) − ln(negative charge): positive charge is
/// p, the extra donors and q c_q of every q &gt; 0 state, negative charge n, the extra acceptors and |q| c_q of every
/// q &lt; 0 state. The net charge is non-increasing in E_F, so h changes sign once, at neutrality; in logarithms
/// nothing underflows however deep in the gap the Fermi level is or however low the temperature.
/// </summary>
/// <remarks>
/// ln c_i = ln A_G + ln g_i − E_i/k_BT − ln D_G over the group G of state i: dilute, each state alone with
/// A = N_sites and D = 1; site blocking, a site set with A = N_sites and D = 1 + Σ_G g_j e^{−E_j/k_BT}; frozen, a
/// defect with A = its fixed total and D = Σ_G g_j e^{−E_j/k_BT} (charge-state fractions).
/// </remarks>
internal sealed class NeutralityEquation
{
    private readonly DefectEnsemble _ensemble;
    private readonly CarrierModel _model;
    private readonly BandEdges _edges;
    private readonly double _temperatureK, _kt;
    private readonly int[] _charge, _group, _species;
    private readonly double[] _logWeight, _intercept;
    private readonly double[] _groupLogPrefactor;
    private readonly bool[] _groupNormalised, _groupHasEmptySite;
    private readonly double[] _x, _denominator, _logMagnitude;
    private readonly double _logDonors, _logAcceptors;
    // Dilute equilibrium only: Σ over states of charge q of |q| N g e^{−a/k_BT}, in logs, so that each evaluation
    // costs one exponential per distinct charge instead of one per state.
    private readonly (int Charge, double LogAmplitude)[]? _byCharge;
    private readonly List<double> _positive = [], _negative = [];

    public NeutralityEquation(DefectEnsemble ensemble, CarrierModel model, double temperatureK, BandEdges edges, IReadOnlyList<double>? frozenTotals)
    {
        _ensemble = ensemble;
        _model = model;
        _edges = edges;
        _temperatureK = temperatureK;
        _kt = CarrierConstants.BoltzmannEvPerK * temperatureK;
        _logDonors = Math.Log(model.ExtraDonorsPerCubicCentimetre);
        _logAcceptors = Math.Log(model.ExtraAcceptorsPerCubicCentimetre);
        int count = ensemble.Species.Sum(s => s.ChargeStates.Count);
        _charge = new int[count];
        _group = new int[count];
        _species = new int[count];
        _logWeight = new double[count];
        _intercept = new double[count];
        _x = new double[count];
        var prefactors = new List<double>();
        var normalised = new List<bool>();
        var emptySite = new List<bool>();
        var siteGroups = new Dictionary<string, (int Group, double Sites, string Defect)>(StringComparer.Ordinal);
        int k = 0;
        for (int d = 0; d < ensemble.Species.Count; d++)
        {
            var species = ensemble.Species[d];
            int speciesGroup = -1;
            if (frozenTotals is not null)
            {
                speciesGroup = prefactors.Count;
                prefactors.Add(Math.Log(frozenTotals[d]));
                normalised.Add(true);
                emptySite.Add(false);
            }
            else if (model.Form == ConcentrationForm.SiteBlocking)
            {
                if (siteGroups.TryGetValue(species.SiteSet, out var known))
                {
                    if (Math.Abs(known.Sites - species.SitesPerCubicCentimetre) > SiteDensityAgreement * known.Sites)
                    {
                        throw new DefectInputException($"defects[{d}].sites",
                            $"'{species.Name}' and '{known.Defect}' share the site set '{species.SiteSet}' but give {species.SitesPerCubicCentimetre:G6} and {known.Sites:G6} sites per cm³; site blocking needs one site density per set");
                    }

                    speciesGroup = known.Group;
                }
                else
                {
                    speciesGroup = prefactors.Count;
                    siteGroups[species.SiteSet] = (speciesGroup, species.SitesPerCubicCentimetre, species.Name);
                    prefactors.Add(Math.Log(species.SitesPerCubicCentimetre));
                    normalised.Add(true);
                    emptySite.Add(true);
                }
            }

            foreach (var state in species.ChargeStates)
            {
                _charge[k] = state.Charge;
                _species[k] = d;
                _logWeight[k] = Math.Log(state.Degeneracy);
                _intercept[k] = state.FormationEnergyAtVbmEv;
                if (speciesGroup >= 0) _group[k] = speciesGroup;
                else
                {
                    _group[k] = prefactors.Count;
                    prefactors.Add(Math.Log(species.SitesPerCubicCentimetre));
                    normalised.Add(false);
                    emptySite.Add(false);
                }

                k++;
            }
        }

        _groupLogPrefactor = [.. prefactors];
        _groupNormalised = [.. normalised];
        _groupHasEmptySite = [.. emptySite];
        _denominator = new double[_groupLogPrefactor.Length];
        _logMagnitude = [.. _charge.Select(q => Math.Log(Math.Abs(q)))];
        if (!_groupNormalised.Any(n => n))
        {
            _byCharge = [.. Enumerable.Range(0, count)
                .Where(i => _charge[i] != 0)
                .GroupBy(i => _charge[i])
                .Select(g => (g.Key, LogSum.Of([.. g.Select(i => _groupLogPrefactor[_group[i]] + _logWeight[i] - _intercept[i] / _kt + _logMagnitude[i])])))];
        }
    }

    /// <summary>Site densities of one set may differ by rounding of the inputs (typed to ~6 digits) and no more.</summary>
    public const double SiteDensityAgreement = 1e-6;

    public BandEdges Edges => _edges;

    public double TemperatureK => _temperatureK;

    /// <summary>h(E_F) = ln(positive charge) − ln(negative charge).</summary>
    public double Balance(double fermiLevelEv)
    {
        _positive.Clear();
        _negative.Clear();
        _positive.Add(_model.Bands.LogHoles(fermiLevelEv, _temperatureK, _edges, _model.Statistics));
        _negative.Add(_model.Bands.LogElectrons(fermiLevelEv, _temperatureK, _edges, _model.Statistics));
        _positive.Add(_logDonors);
        _negative.Add(_logAcceptors);
        if (_byCharge is not null)
        {
            foreach (var (q, amplitude) in _byCharge) (q > 0 ? _positive : _negative).Add(amplitude - q * fermiLevelEv / _kt);
        }
        else
        {
            Fill(fermiLevelEv);
            for (int i = 0; i < _charge.Length; i++)
            {
                if (_charge[i] != 0) (_charge[i] > 0 ? _positive : _negative).Add(LogConcentration(i) + _logMagnitude[i]);
            }
        }

        return LogSum.Of(_positive) - LogSum.Of(_negative);
    }

    /// <summary>Every concentration at E_F, for the answer.</summary>
    public FermiLevelSolution Describe(FermiSolveStatus status, double fermiLevelEv, int iterations, bool frozen)
    {
        Fill(fermiLevelEv);
        double n = Math.Exp(_model.Bands.LogElectrons(fermiLevelEv, _temperatureK, _edges, _model.Statistics));
        double p = Math.Exp(_model.Bands.LogHoles(fermiLevelEv, _temperatureK, _edges, _model.Statistics));
        var states = new List<ChargeStateConcentration>(_charge.Length);
        var totals = new double[_ensemble.Species.Count];
        double net = p - n + _model.ExtraDonorsPerCubicCentimetre - _model.ExtraAcceptorsPerCubicCentimetre;
        double gross = p + n + _model.ExtraDonorsPerCubicCentimetre + _model.ExtraAcceptorsPerCubicCentimetre;
        for (int i = 0; i < _charge.Length; i++)
        {
            double c = Math.Exp(LogConcentration(i));
            var species = _ensemble.Species[_species[i]];
            states.Add(new ChargeStateConcentration(species.Name, _charge[i], _intercept[i] + _charge[i] * fermiLevelEv, c));
            totals[_species[i]] += c;
            net += _charge[i] * c;
            gross += Math.Abs(_charge[i]) * c;
        }

        var defects = _ensemble.Species.Select((s, d) => new DefectTotal(s.Name, s.SiteSet, totals[d], totals[d] / s.SitesPerCubicCentimetre)).ToArray();
        return new FermiLevelSolution(status, _temperatureK, fermiLevelEv, _edges, iterations, n, p,
            _model.ExtraDonorsPerCubicCentimetre, _model.ExtraAcceptorsPerCubicCentimetre, states, defects,
            _model.Statistics, frozen ? null : _model.Form, net, gross > 0 ? Math.Abs(net) / gross : 0);
    }

    private double LogConcentration(int i)
    {
        int g = _group[i];
        return _groupLogPrefactor[g] + _x[i] - (_groupNormalised[g] ? _denominator[g] : 0);
    }

    private void Fill(double fermiLevelEv)
    {
        for (int g = 0; g < _denominator.Length; g++) _denominator[g] = _groupHasEmptySite[g] ? 0 : double.NegativeInfinity;
        for (int i = 0; i < _charge.Length; i++)
        {
            _x[i] = _logWeight[i] - (_intercept[i] + _charge[i] * fermiLevelEv) / _kt;
            int g = _group[i];
            if (_groupNormalised[g]) _denominator[g] = LogSum.Of(_denominator[g], _x[i]);
        }
    }
}
