namespace Hull.Core.Defects;

/// <summary>
/// The self-consistent Fermi level: where defects, extra dopants and free carriers together carry no net charge.
/// Brent's method on h(E_F) = ln(positive charge) − ln(negative charge) in a bracket that starts
/// <see cref="InitialBracketMarginEv"/> beyond both band edges and widens until h changes sign.
/// </summary>
public static class ChargeNeutrality
{
    /// <summary>The first bracket reaches this far beyond each band edge (eV): a neutral level is almost always inside.</summary>
    public const double InitialBracketMarginEv = 1.0;

    /// <summary>The bracket doubles outward up to this far beyond each edge (eV) before the search gives up.</summary>
    public const double BracketReachEv = 64.0;

    /// <summary>
    /// The Fermi level is bracketed to this width (eV): concentrations then agree to ~q·1e-12 eV/k_BT relative
    /// (4e-11 at 300 K, 1.2e-8 at 1 K), and the width stays far above the rounding of E_F (~1e-15 eV).
    /// </summary>
    public const double FermiLevelToleranceEv = 1e-12;

    /// <summary>Brent's method takes ~10–40 iterations here; the limit only guards against a broken function.</summary>
    public const int MaximumIterations = 200;

    /// <summary>Solves at a temperature with every defect at its equilibrium concentration.</summary>
    public static FermiLevelSolution Solve(DefectEnsemble ensemble, CarrierModel model, double temperatureK)
    {
        ArgumentNullException.ThrowIfNull(ensemble);
        ArgumentNullException.ThrowIfNull(model);
        model.Check(ensemble.BandGapEv);
        var edges = model.CheckedEdges(ensemble.BandGapEv, temperatureK, "temperature_k");
        return Run(new NeutralityEquation(ensemble, model, temperatureK, edges, null), frozen: false);
    }

    /// <summary>
    /// Solves with each defect's total concentration fixed (cm^-3, in the ensemble's order) and only its charge
    /// states re-equilibrated: the fractions g_q e^{−E_f,q/k_BT} / Σ_q' g_q' e^{−E_f,q'/k_BT}.
    /// </summary>
    public static FermiLevelSolution SolveWithFixedTotals(DefectEnsemble ensemble, CarrierModel model, double temperatureK, IReadOnlyList<double> totalsPerCubicCentimetre)
    {
        ArgumentNullException.ThrowIfNull(ensemble);
        ArgumentNullException.ThrowIfNull(model);
        model.Check(ensemble.BandGapEv);
        if (totalsPerCubicCentimetre.Count != ensemble.Species.Count)
            throw new DefectInputException("totals", $"{totalsPerCubicCentimetre.Count} totals for {ensemble.Species.Count} defects");
        for (int d = 0; d < totalsPerCubicCentimetre.Count; d++)
        {
            if (!(totalsPerCubicCentimetre[d] >= 0) || !double.IsFinite(totalsPerCubicCentimetre[d]))
                throw new DefectInputException($"totals[{d}]", $"the total of '{ensemble.Species[d].Name}' must be a finite number ≥ 0, not {totalsPerCubicCentimetre[d]}");
        }

        var edges = model.CheckedEdges(ensemble.BandGapEv, temperatureK, "temperature_k");
        return Run(new NeutralityEquation(ensemble, model, temperatureK, edges, totalsPerCubicCentimetre), frozen: true);
    }

    private static FermiLevelSolution Run(NeutralityEquation equation, bool frozen)
    {
        double lo = equation.Edges.ValenceEv - InitialBracketMarginEv, hi = equation.Edges.ConductionEv + InitialBracketMarginEv;
        double flo = equation.Balance(lo), fhi = equation.Balance(hi);
        int evaluations = 2;
        // Positive charge wins at a low Fermi level (holes), negative at a high one (electrons): widen until it does.
        for (double step = InitialBracketMarginEv; flo < 0 && step < BracketReachEv; step *= 2, evaluations++)
        {
            hi = lo;
            fhi = flo;
            lo = equation.Edges.ValenceEv - 2 * step;
            flo = equation.Balance(lo);
        }

        for (double step = InitialBracketMarginEv; fhi > 0 && step < BracketReachEv; step *= 2, evaluations++)
        {
            lo = hi;
            flo = fhi;
            hi = equation.Edges.ConductionEv + 2 * step;
            fhi = equation.Balance(hi);
        }

        if (flo < 0) return equation.Describe(FermiSolveStatus.NoNeutralLevel, lo, evaluations, frozen);
        if (fhi > 0) return equation.Describe(FermiSolveStatus.NoNeutralLevel, hi, evaluations, frozen);
        var (root, iterations, converged) = BracketedRoot.Brent(equation.Balance, lo, hi, flo, fhi, FermiLevelToleranceEv, MaximumIterations);
        return equation.Describe(converged ? FermiSolveStatus.Converged : FermiSolveStatus.IterationLimit, root, iterations, frozen);
    }
}
