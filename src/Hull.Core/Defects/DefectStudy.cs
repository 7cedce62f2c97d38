using Hull.Core.Chemistry;

namespace Hull.Core.Defects;

/// <summary>
/// A checked defect study of one host: the bulk supercell, its defects and every charge state with its finite-size
/// correction. Immutable; <see cref="Create"/> refuses inconsistent input, naming the field.
/// </summary>
public sealed class DefectStudy
{
    private readonly Dictionary<string, Defect> _byName;

    private DefectStudy(BulkSupercell bulk, Composition host, ModelCharge model, IReadOnlyList<Defect> defects, IReadOnlyList<string> warnings)
    {
        Bulk = bulk;
        Host = host;
        ModelCharge = model;
        Defects = defects;
        Warnings = warnings;
        _byName = defects.ToDictionary(d => d.Name, StringComparer.Ordinal);
    }

    public BulkSupercell Bulk { get; }

    /// <summary>The host's composition per formula unit.</summary>
    public Composition Host { get; }

    /// <summary>The model charge of every correction.</summary>
    public ModelCharge ModelCharge { get; }

    public IReadOnlyList<Defect> Defects { get; }

    /// <summary>Doubts about the input that do not stop the study (e.g. planar alignment with an anisotropic tensor).</summary>
    public IReadOnlyList<string> Warnings { get; }

    public Defect? Find(string name) => _byName.GetValueOrDefault(name);

    /// <summary>Bulk energy per formula unit (eV).</summary>
    public double BulkEnergyPerFormulaUnitEv => Bulk.TotalEnergyEv / Bulk.FormulaUnits;

    /// <summary>
    /// A warning when the host's energy per formula unit in the dataset differs from the study's bulk by more than
    /// <see cref="DefectTolerances.BulkEnergyPerFormulaUnitEv"/> (different calculation settings); null otherwise.
    /// </summary>
    public string? CompareWithDatasetHost(double datasetEnergyPerFormulaUnitEv)
    {
        double difference = BulkEnergyPerFormulaUnitEv - datasetEnergyPerFormulaUnitEv;
        if (Math.Abs(difference) <= DefectTolerances.BulkEnergyPerFormulaUnitEv) return null;
        return $"the study's bulk {Host.Formula} is {difference:+0.0000;-0.0000} eV per formula unit from the dataset's entry "
            + $"(tolerance {DefectTolerances.BulkEnergyPerFormulaUnitEv} eV): the calculations were probably run with different settings";
    }

    /// <summary>Checks the input and works out every charge state's correction.</summary>
    /// <param name="bulk">The host's supercell.</param>
    /// <param name="defects">The defects, each name once.</param>
    /// <param name="model">The model charge; null for <see cref="Defects.ModelCharge.Default"/>.</param>
    /// <param name="ewald">Ewald settings; null for the defaults.</param>
    public static DefectStudy Create(BulkSupercell bulk, IReadOnlyList<DefectInput> defects, ModelCharge? model = null, EwaldSettings? ewald = null)
    {
        model ??= ModelCharge.Default;
        var warnings = new List<string>();
        Composition host = CheckBulk(bulk);
        if (defects.Count == 0) throw new DefectInputException("defects", "a study needs at least one defect");

        var names = new HashSet<string>(StringComparer.Ordinal);
        for (int d = 0; d < defects.Count; d++)
        {
            string name = defects[d].Name;
            if (string.IsNullOrWhiteSpace(name)) throw new DefectInputException($"defects[{d}].name", "a defect needs a name");
            if (!names.Add(name)) throw new DefectInputException($"defects[{d}].name", $"the name '{name}' is used by two defects");
        }

        var checkedAtoms = new Dictionary<string, IReadOnlyDictionary<string, int>>(StringComparer.Ordinal);
        for (int d = 0; d < defects.Count; d++)
        {
            checkedAtoms[defects[d].Name] = CheckAtoms(defects[d], $"defects[{d}]", bulk, host);
        }

        var result = new List<Defect>(defects.Count);
        for (int d = 0; d < defects.Count; d++)
        {
            var input = defects[d];
            string field = $"defects[{d}]";
            CheckSitesAndPosition(input, field);
            if (input.Kind == DefectKind.Complex) CheckComplex(input, field, defects, checkedAtoms);
            else if (input.Constituents is { Count: > 0 }) throw new DefectInputException($"{field}.constituents", $"only a complex has constituents, and '{input.Name}' is a {input.Kind.ToString().ToLowerInvariant()}");
            var states = CheckChargeStates(input, field, bulk, checkedAtoms[input.Name], model, ewald, warnings);
            result.Add(new Defect(d, input, checkedAtoms[input.Name], states));
        }

        return new DefectStudy(bulk, host, model, result, warnings);
    }

    private static Composition CheckBulk(BulkSupercell bulk)
    {
        Composition host;
        try
        {
            host = FormulaParser.Parse(bulk.HostFormula);
        }
        catch (FormulaParseException e)
        {
            throw new DefectInputException("bulk.host_formula", e.Message);
        }

        if (bulk.FormulaUnits <= 0) throw new DefectInputException("bulk.formula_units", $"the supercell needs a positive number of formula units, not {bulk.FormulaUnits}");
        if (!double.IsFinite(bulk.TotalEnergyEv)) throw new DefectInputException("bulk.total_energy_ev", "the bulk energy must be a finite number");
        if (!double.IsFinite(bulk.VbmEv)) throw new DefectInputException("bulk.vbm_ev", "the VBM must be a finite number");
        if (!(bulk.BandGapEv > 0) || !double.IsFinite(bulk.BandGapEv)) throw new DefectInputException("bulk.band_gap_ev", $"the band gap must be a positive number, not {bulk.BandGapEv}");

        foreach (var (element, amount) in host.Amounts)
        {
            Rational expected = amount * bulk.FormulaUnits;
            bulk.Atoms.TryGetValue(element, out int given);
            if (!expected.IsInteger || expected.Numerator != given)
            {
                throw new DefectInputException($"bulk.atoms.{element}",
                    $"{bulk.FormulaUnits} formula units of {host.Formula} hold {expected} {element} atoms, but the supercell lists {given}");
            }
        }

        foreach (var (element, count) in bulk.Atoms)
        {
            if (!host.Amounts.ContainsKey(element) && count != 0)
            {
                throw new DefectInputException($"bulk.atoms.{element}", $"the bulk supercell lists {count} {element} atoms, but {host.Formula} has no {element}");
            }
        }

        return host;
    }

    private static IReadOnlyDictionary<string, int> CheckAtoms(DefectInput input, string field, BulkSupercell bulk, Composition host)
    {
        var atoms = new SortedDictionary<string, int>(StringComparer.Ordinal);
        foreach (var (element, n) in input.AtomsExchanged)
        {
            if (!ElementTable.IsSymbol(element)) throw new DefectInputException($"{field}.atoms.{element}", $"'{element}' is not an element symbol");
            if (n == 0) continue;
            if (n < 0)
            {
                bulk.Atoms.TryGetValue(element, out int present);
                if (-n > present) throw new DefectInputException($"{field}.atoms.{element}", $"removes {-n} {element} atoms but the bulk supercell holds {present}");
            }

            atoms[element] = n;
        }

        int added = atoms.Values.Where(n => n > 0).Sum(), removed = -atoms.Values.Where(n => n < 0).Sum();
        string kind = input.Kind.ToString().ToLowerInvariant();
        string? problem = input.Kind switch
        {
            DefectKind.Vacancy when added > 0 || removed == 0 => "a vacancy removes atoms and adds none",
            DefectKind.Interstitial when removed > 0 || added == 0 => "an interstitial adds atoms and removes none",
            DefectKind.Antisite when added != removed || added == 0 || atoms.Keys.Any(e => !host.Amounts.ContainsKey(e)) =>
                "an antisite exchanges host atoms only, as many added as removed",
            DefectKind.Substitution when added != removed || added == 0 || atoms.Where(p => p.Value > 0).All(p => host.Amounts.ContainsKey(p.Key)) =>
                "a substitution replaces host atoms by as many atoms of an element the host does not have",
            _ => null,
        };
        if (problem is not null)
        {
            throw new DefectInputException($"{field}.atoms", $"'{input.Name}' is a {kind} but its atoms are {Describe(atoms)}: {problem}");
        }

        return atoms;
    }

    private static void CheckSitesAndPosition(DefectInput input, string field)
    {
        if (!input.PositionFractional.IsFinite) throw new DefectInputException($"{field}.position", "the defect position must be finite numbers");
        if (string.IsNullOrWhiteSpace(input.SiteSet)) throw new DefectInputException($"{field}.site_set", "a defect needs a site set");
        if (!(input.Sites.Value > 0) || !double.IsFinite(input.Sites.Value)) throw new DefectInputException($"{field}.sites", $"the number of sites must be positive, not {input.Sites.Value}");
        if (!(input.Degeneracy > 0) || !double.IsFinite(input.Degeneracy)) throw new DefectInputException($"{field}.degeneracy", $"the degeneracy must be a positive number, not {input.Degeneracy}");
    }

    private static void CheckComplex(DefectInput input, string field, IReadOnlyList<DefectInput> all, Dictionary<string, IReadOnlyDictionary<string, int>> atoms)
    {
        var parts = input.Constituents ?? [];
        if (parts.Count < 2) throw new DefectInputException($"{field}.constituents", $"the complex '{input.Name}' needs at least two constituents");
        var sum = new SortedDictionary<string, int>(StringComparer.Ordinal);
        for (int p = 0; p < parts.Count; p++)
        {
            var part = all.FirstOrDefault(d => d.Name == parts[p])
                ?? throw new DefectInputException($"{field}.constituents[{p}]", $"the complex '{input.Name}' names '{parts[p]}', which is not a defect of this study");
            if (part.Kind == DefectKind.Complex) throw new DefectInputException($"{field}.constituents[{p}]", $"'{parts[p]}' is itself a complex; name its parts instead");
            foreach (var (element, n) in atoms[part.Name]) sum[element] = sum.GetValueOrDefault(element) + n;
        }

        foreach (var key in sum.Where(p => p.Value == 0).Select(p => p.Key).ToList()) sum.Remove(key);
        if (!sum.SequenceEqual(atoms[input.Name]))
        {
            throw new DefectInputException($"{field}.atoms",
                $"the complex '{input.Name}' exchanges {Describe(atoms[input.Name])}, but its constituents together exchange {Describe(sum)}");
        }
    }

    private static IReadOnlyList<CorrectedChargeState> CheckChargeStates(DefectInput input, string field, BulkSupercell bulk,
        IReadOnlyDictionary<string, int> atoms, ModelCharge model, EwaldSettings? ewald, List<string> warnings)
    {
        if (input.ChargeStates.Count == 0) throw new DefectInputException($"{field}.charge_states", $"'{input.Name}' has no charge state");
        var seen = new HashSet<int>();
        var states = new List<CorrectedChargeState>();
        for (int s = 0; s < input.ChargeStates.Count; s++)
        {
            var state = input.ChargeStates[s];
            string where = $"{field}.charge_states[{s}]";
            if (!seen.Add(state.Charge)) throw new DefectInputException($"{where}.charge", $"'{input.Name}' lists charge {state.Charge:+0;-0;0} twice");
            if (!double.IsFinite(state.TotalEnergyEv)) throw new DefectInputException($"{where}.total_energy_ev", "the supercell energy must be a finite number");
            if (state.SupercellAtoms is { } counts) CheckSupercellAtoms(counts, bulk, atoms, input.Name, state.Charge, where);
            if (state.Alignment is AlignmentInput.PlanarAverages && !bulk.Dielectric.IsScalar)
            {
                warnings.Add($"{input.Name} {state.Charge:+0;-0;0}: planar-average alignment with an anisotropic dielectric tensor; site potentials suit it better");
            }

            var correction = FiniteSizeCorrector.Correct(bulk.Lattice, bulk.Dielectric, model, state.Charge, input.PositionFractional, state.Alignment, ewald, $"{where}.alignment");
            foreach (var w in correction.Alignment?.Warnings ?? []) warnings.Add($"{input.Name} {state.Charge:+0;-0;0}: {w}");
            states.Add(new CorrectedChargeState(state.Charge, state.TotalEnergyEv, correction));
        }

        return [.. states.OrderByDescending(s => s.Charge)];
    }

    private static void CheckSupercellAtoms(IReadOnlyDictionary<string, int> counts, BulkSupercell bulk, IReadOnlyDictionary<string, int> atoms, string name, int charge, string where)
    {
        var elements = counts.Keys.Concat(bulk.Atoms.Keys).Concat(atoms.Keys).Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal);
        foreach (string element in elements)
        {
            int expected = bulk.Atoms.GetValueOrDefault(element) + atoms.GetValueOrDefault(element);
            int given = counts.GetValueOrDefault(element);
            if (given != expected)
            {
                throw new DefectInputException($"{where}.supercell_atoms.{element}",
                    $"{name} {charge:+0;-0;0}: the supercell lists {given} {element} atoms, but the bulk's {bulk.Atoms.GetValueOrDefault(element)} with the defect's {atoms.GetValueOrDefault(element):+0;-0;0} make {expected}");
            }
        }
    }

    private static string Describe(IReadOnlyDictionary<string, int> atoms) =>
        atoms.Count == 0 ? "none" : string.Join(", ", atoms.Select(p => $"{p.Value:+0;-0} {p.Key}"));
}
