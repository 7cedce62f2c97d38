namespace Hull.Core.Defects;

/// <summary>
/// A tabulated density of states g(E) (states per eV per cm³, linear between points; energies in eV above the study's
/// VBM): states at or below the VBM are valence states, at or above the CBM (E_g) conduction states, and the table
/// must be empty inside the gap. n = ∫_{E_C} g f dE and p = ∫^{E_V} g (1 − f) dE by Gauss–Legendre panels no wider
/// than k_BT/2, over the range where the occupation is above e^{−60} of its largest value.
/// </summary>
public sealed class TabulatedBands : BandStates
{
    // Beyond 60 k_BT from the Fermi level (or the edge, whichever is further in) occupations fall below e^{-60} ≈ 1e-26.
    private const double TailWidthKt = 60;

    // 4-point Gauss–Legendre on panels ≤ k_BT/2 wide integrates e^{-E/k_BT} times a line to ~1e-9 relative.
    private const double PanelWidthKt = 0.5;

    // Above this many panels per band (a degenerate band at a very low temperature) panels widen instead.
    private const int MaximumPanels = 200_000;

    private static readonly double[] Nodes = [-0.8611363115940526, -0.3399810435848563, 0.3399810435848563, 0.8611363115940526];
    private static readonly double[] Weights = [0.3478548451374538, 0.6521451548625461, 0.6521451548625461, 0.3478548451374538];

    private readonly double[] _energies;
    private readonly double[] _densities;

    private TabulatedBands(double[] energies, double[] densities)
    {
        _energies = energies;
        _densities = densities;
    }

    /// <summary>Energies (eV above the VBM, rising) and g at each (states per eV per cm³, ≥ 0).</summary>
    public static TabulatedBands Create(IReadOnlyList<double> energiesEv, IReadOnlyList<double> statesPerEvPerCubicCentimetre, string field = "carriers.density_of_states")
    {
        if (energiesEv.Count != statesPerEvPerCubicCentimetre.Count)
            throw new DefectInputException(field, $"{energiesEv.Count} energies but {statesPerEvPerCubicCentimetre.Count} densities");
        if (energiesEv.Count < 4) throw new DefectInputException(field, "a density of states needs at least two points in each band");
        for (int i = 0; i < energiesEv.Count; i++)
        {
            if (!double.IsFinite(energiesEv[i])) throw new DefectInputException($"{field}[{i}].energy_ev", "must be a finite number");
            if (i > 0 && !(energiesEv[i] > energiesEv[i - 1])) throw new DefectInputException($"{field}[{i}].energy_ev", $"energies must rise: {energiesEv[i]} follows {energiesEv[i - 1]}");
            double g = statesPerEvPerCubicCentimetre[i];
            if (!(g >= 0) || !double.IsFinite(g)) throw new DefectInputException($"{field}[{i}].states_per_ev_cm3", $"must be a finite number ≥ 0, not {g}");
        }

        return new([.. energiesEv], [.. statesPerEvPerCubicCentimetre]);
    }

    public IReadOnlyList<double> EnergiesEv => _energies;

    public IReadOnlyList<double> StatesPerEvPerCubicCentimetre => _densities;

    public override double LogElectrons(double fermiLevelEv, double temperatureK, BandEdges edges, CarrierStatistics statistics)
    {
        double kt = CarrierConstants.BoltzmannEvPerK * temperatureK;
        double from = edges.ConductionEv, to = Math.Max(fermiLevelEv, from) + TailWidthKt * kt;
        return LogIntegral(from, to, kt, e => LogOccupied((e - fermiLevelEv) / kt, statistics));
    }

    public override double LogHoles(double fermiLevelEv, double temperatureK, BandEdges edges, CarrierStatistics statistics)
    {
        double kt = CarrierConstants.BoltzmannEvPerK * temperatureK;
        double to = edges.ValenceEv, from = Math.Min(fermiLevelEv, to) - TailWidthKt * kt;
        return LogIntegral(from, to, kt, e => LogOccupied((fermiLevelEv - e) / kt, statistics));
    }

    internal override void Check(double bandGapEv, string field)
    {
        for (int i = 0; i < _energies.Length; i++)
        {
            if (_energies[i] > 0 && _energies[i] < bandGapEv && _densities[i] > 0)
                throw new DefectInputException($"{field}.density_of_states[{i}]", $"{_densities[i]:G4} states/eV/cm³ at {_energies[i]} eV, inside the {bandGapEv} eV gap; the table must be empty between the VBM (0) and the CBM");
        }

        if (double.IsNegativeInfinity(LogIntegral(_energies[0], 0, double.PositiveInfinity, _ => 0)))
            throw new DefectInputException($"{field}.density_of_states", "the table has no valence states (none at or below the VBM, 0 eV)");
        if (double.IsNegativeInfinity(LogIntegral(bandGapEv, _energies[^1], double.PositiveInfinity, _ => 0)))
            throw new DefectInputException($"{field}.density_of_states", $"the table has no conduction states (none at or above the CBM, {bandGapEv} eV)");
    }

    // ln(occupation) of a state u = (E − E_F)/k_BT above the Fermi level (electrons) or below it (holes).
    private static double LogOccupied(double u, CarrierStatistics statistics)
    {
        if (statistics == CarrierStatistics.Boltzmann) return -u;
        return u > 0 ? -u - Math.Log(1 + Math.Exp(-u)) : -Math.Log(1 + Math.Exp(u));
    }

    private double LogDensity(int segment, double e)
    {
        double t = (e - _energies[segment]) / (_energies[segment + 1] - _energies[segment]);
        double g = _densities[segment] + t * (_densities[segment + 1] - _densities[segment]);
        return g > 0 ? Math.Log(g) : double.NegativeInfinity;
    }

    // ln ∫_from^to g(E) e^{logOccupation(E)} dE, summed in the log domain so nothing underflows.
    private double LogIntegral(double from, double to, double kt, Func<double, double> logOccupation)
    {
        from = Math.Max(from, _energies[0]);
        to = Math.Min(to, _energies[^1]);
        if (!(to > from)) return double.NegativeInfinity;
        double width = double.IsPositiveInfinity(kt) ? double.PositiveInfinity : Math.Max(PanelWidthKt * kt, (to - from) / MaximumPanels);
        var terms = new List<double>();
        int first = Array.BinarySearch(_energies, from);
        first = first >= 0 ? first : Math.Max(~first - 1, 0);
        for (int s = first; s + 1 < _energies.Length && _energies[s] < to; s++)
        {
            double lo = Math.Max(from, _energies[s]), hi = Math.Min(to, _energies[s + 1]);
            if (!(hi > lo) || (_densities[s] == 0 && _densities[s + 1] == 0)) continue;
            int panels = double.IsPositiveInfinity(width) ? 1 : (int)Math.Ceiling((hi - lo) / width);
            double h = (hi - lo) / panels;
            for (int k = 0; k < panels; k++)
            {
                double centre = lo + (k + 0.5) * h;
                for (int j = 0; j < Nodes.Length; j++)
                {
                    double e = centre + 0.5 * h * Nodes[j];
                    double log = LogDensity(s, e);
                    if (double.IsNegativeInfinity(log)) continue;
                    terms.Add(Math.Log(0.5 * h * Weights[j]) + log + logOccupation(e));
                }
            }
        }

        return LogSum.Of(terms);
    }
}
