namespace Hull.Core.Defects;

/// <summary>
/// Formation energies of a study's defects at a chemical-potential point and Fermi level, from the elemental
/// references μ_i^ref (eV/atom, the same ones the dataset's formation energies use).
/// </summary>
public sealed class FormationEnergyCalculator
{
    private readonly DefectStudy _study;
    private readonly IReadOnlyDictionary<string, double> _references;
    private readonly ChemicalPotentialPoint _point;
    // Σ n_i(μ_i^ref + Δμ_i) per defect: the only part that depends on the point.
    private readonly double[] _reservoir;

    /// <summary>
    /// Checks that every element a defect adds or removes has an elemental reference and a Δμ, naming the defect and
    /// element otherwise.
    /// </summary>
    public FormationEnergyCalculator(DefectStudy study, IReadOnlyDictionary<string, double> elementalReferencesEvPerAtom, ChemicalPotentialPoint point)
    {
        _study = study;
        _references = elementalReferencesEvPerAtom;
        _point = point;
        _reservoir = new double[study.Defects.Count];
        foreach (var defect in study.Defects)
        {
            double sum = 0;
            foreach (var (element, n) in defect.AtomsExchanged)
            {
                if (!elementalReferencesEvPerAtom.TryGetValue(element, out double reference) || !double.IsFinite(reference))
                {
                    string role = study.Host.Amounts.ContainsKey(element) ? "host element" : "dopant";
                    throw new DefectInputException($"defects[{defect.Index}].atoms.{element}",
                        $"'{defect.Name}' exchanges {element}, but the {role} {element} has no elemental reference in the dataset");
                }

                if (!point.DeltaMuEv.TryGetValue(element, out double deltaMu) || !double.IsFinite(deltaMu))
                {
                    throw new DefectInputException($"delta_mu.{element}", $"'{defect.Name}' exchanges {element}, but the chemical-potential point '{point.Label}' gives no Δμ for {element}");
                }

                sum += n * (reference + deltaMu);
            }

            _reservoir[defect.Index] = sum;
        }
    }

    public DefectStudy Study => _study;

    public ChemicalPotentialPoint Point => _point;

    /// <summary>E_f of one charge state at E_F (eV above the VBM).</summary>
    public FormationEnergy At(Defect defect, CorrectedChargeState state, double fermiLevelEv)
    {
        if (!double.IsFinite(fermiLevelEv)) throw new DefectInputException("fermi_level_ev", "the Fermi level must be a finite number");
        return new FormationEnergy(
            defect.Name,
            state.Charge,
            fermiLevelEv,
            state.TotalEnergyEv - _study.Bulk.TotalEnergyEv,
            -_reservoir[defect.Index],
            state.Charge * (_study.Bulk.VbmEv + fermiLevelEv),
            state.Correction.ImageChargeEv,
            state.Correction.AlignmentEv);
    }

    /// <summary>Every charge state of every defect at E_F, in study order and highest charge first.</summary>
    public IReadOnlyList<FormationEnergy> All(double fermiLevelEv) =>
        [.. _study.Defects.SelectMany(d => d.ChargeStates.Select(s => At(d, s, fermiLevelEv)))];

    /// <summary>E_f at E_F = 0 of each charge state of a defect (charge → eV): the intercepts of its lines.</summary>
    public IReadOnlyDictionary<int, double> AtValenceBandMaximum(Defect defect) =>
        defect.ChargeStates.ToDictionary(s => s.Charge, s => At(defect, s, 0).TotalEv);

    /// <summary>The lowest-energy charge state of a defect at E_F (the lowest charge among exact ties).</summary>
    public FormationEnergy Lowest(Defect defect, double fermiLevelEv) =>
        defect.ChargeStates.Select(s => At(defect, s, fermiLevelEv)).OrderBy(f => f.TotalEv).ThenBy(f => f.Charge).First();
}
