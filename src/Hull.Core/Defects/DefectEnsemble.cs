namespace Hull.Core.Defects;

/// <summary>
/// The defects of a study at one chemical-potential point, reduced to what charge neutrality needs: site densities,
/// degeneracies and formation-energy lines. Immutable; the factories refuse unusable input, naming the field.
/// </summary>
public sealed class DefectEnsemble
{
    private DefectEnsemble(double bandGapEv, IReadOnlyList<DefectSpecies> species)
    {
        BandGapEv = bandGapEv;
        Species = species;
    }

    /// <summary>The study's gap (eV).</summary>
    public double BandGapEv { get; }

    public IReadOnlyList<DefectSpecies> Species { get; }

    /// <summary>
    /// Every defect of the calculator's study at its chemical-potential point; site densities per formula unit become
    /// per cm³ through the bulk supercell's volume and formula units.
    /// </summary>
    /// <param name="calculator">Formation energies at the point.</param>
    /// <param name="degeneracies">Per (defect, charge) degeneracies that replace the defect's own; null for none.</param>
    public static DefectEnsemble FromCalculator(FormationEnergyCalculator calculator, IReadOnlyDictionary<(string Defect, int Charge), double>? degeneracies = null)
    {
        var study = calculator.Study;
        foreach (var ((name, charge), g) in degeneracies ?? new Dictionary<(string, int), double>())
        {
            var defect = study.Find(name) ?? throw new DefectInputException($"degeneracies.{name}", $"'{name}' is not a defect of this study");
            if (defect.State(charge) is null) throw new DefectInputException($"degeneracies.{name}.{charge}", $"'{name}' has no charge state {charge:+0;-0;0}");
            if (!(g > 0) || !double.IsFinite(g)) throw new DefectInputException($"degeneracies.{name}.{charge}", $"the degeneracy must be a positive number, not {g}");
        }

        var species = new List<DefectSpecies>(study.Defects.Count);
        foreach (var defect in study.Defects)
        {
            double sites = defect.Sites.SitesPerCubicCentimetre(study.Bulk.FormulaUnits, study.Bulk.Lattice.VolumeCubicAngstrom);
            var intercepts = calculator.AtValenceBandMaximum(defect);
            var states = defect.ChargeStates
                .Select(s => new SpeciesChargeState(s.Charge, intercepts[s.Charge],
                    degeneracies is not null && degeneracies.TryGetValue((defect.Name, s.Charge), out double g) ? g : defect.Degeneracy))
                .ToArray();
            species.Add(new DefectSpecies(defect.Name, defect.SiteSet, sites, states, defect.AtomsExchanged));
        }

        return new DefectEnsemble(study.Bulk.BandGapEv, species);
    }

    /// <summary>An ensemble given directly (e.g. no defects at all: a pure host's carriers).</summary>
    public static DefectEnsemble Create(double bandGapEv, IReadOnlyList<DefectSpecies> species)
    {
        if (!(bandGapEv > 0) || !double.IsFinite(bandGapEv)) throw new DefectInputException("band_gap_ev", $"the band gap must be a positive number, not {bandGapEv}");
        var names = new HashSet<string>(StringComparer.Ordinal);
        for (int d = 0; d < species.Count; d++)
        {
            var s = species[d];
            string field = $"defects[{d}]";
            if (string.IsNullOrWhiteSpace(s.Name) || !names.Add(s.Name)) throw new DefectInputException($"{field}.name", $"each defect needs a name of its own ('{s.Name}')");
            if (!(s.SitesPerCubicCentimetre > 0) || !double.IsFinite(s.SitesPerCubicCentimetre)) throw new DefectInputException($"{field}.sites", $"the site density must be positive, not {s.SitesPerCubicCentimetre}");
            if (s.ChargeStates.Count == 0) throw new DefectInputException($"{field}.charge_states", $"'{s.Name}' has no charge state");
            if (s.ChargeStates.Select(c => c.Charge).Distinct().Count() != s.ChargeStates.Count) throw new DefectInputException($"{field}.charge_states", $"'{s.Name}' lists a charge twice");
            for (int c = 0; c < s.ChargeStates.Count; c++)
            {
                var state = s.ChargeStates[c];
                if (!double.IsFinite(state.FormationEnergyAtVbmEv)) throw new DefectInputException($"{field}.charge_states[{c}].formation_energy_ev", "must be a finite number");
                if (!(state.Degeneracy > 0) || !double.IsFinite(state.Degeneracy)) throw new DefectInputException($"{field}.charge_states[{c}].degeneracy", $"must be a positive number, not {state.Degeneracy}");
            }
        }

        return new DefectEnsemble(bandGapEv, species);
    }
}
