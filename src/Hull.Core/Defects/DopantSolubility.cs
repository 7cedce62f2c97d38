using Hull.Core.Chemistry;
using Hull.Core.Windows;

namespace Hull.Core.Defects;

/// <summary>
/// How much of a dopant dissolves before a second phase forms: at every vertex of the extended (host + dopant)
/// polytope, where the dopant's Δμ is as high as the competing phases allow, the Fermi level is solved
/// self-consistently and the dopant's total concentration summed over every defect that carries it
/// (n_X c per defect). The most soluble vertex need not be the one with the highest Δμ_X, since the host
/// potentials there also move the native defects and the Fermi level; every vertex is therefore solved.
/// </summary>
public static class DopantSolubility
{
    /// <param name="study">The defect study, with defects that carry the dopant.</param>
    /// <param name="elementalReferencesEvPerAtom">μ_i^ref of every element exchanged.</param>
    /// <param name="limit">The dopant's limits from the host's window (its extended vertices).</param>
    /// <param name="model">Carriers and concentration form (site blocking suits concentrations near the limit).</param>
    /// <param name="temperaturesK">Growth temperatures, each solved at every vertex.</param>
    /// <param name="otherDeltaMuEv">Δμ of elements outside the extended polytope (other dopants of the study); null for none.</param>
    /// <param name="degeneracies">Per (defect, charge) degeneracies that replace the defect's own; null for none.</param>
    public static DopantSolubilityResult Evaluate(
        DefectStudy study,
        IReadOnlyDictionary<string, double> elementalReferencesEvPerAtom,
        DopantLimit limit,
        CarrierModel model,
        IReadOnlyList<double> temperaturesK,
        IReadOnlyDictionary<string, double>? otherDeltaMuEv = null,
        IReadOnlyDictionary<(string Defect, int Charge), double>? degeneracies = null)
    {
        ArgumentNullException.ThrowIfNull(study);
        ArgumentNullException.ThrowIfNull(limit);
        ArgumentNullException.ThrowIfNull(model);
        string dopant = limit.Dopant;
        if (!study.Defects.Any(d => d.AtomsExchanged.GetValueOrDefault(dopant) > 0))
            throw new DefectInputException("dopant", $"no defect of the study adds {dopant}, so its solubility cannot be counted");
        if (!limit.Exists)
            throw new DefectInputException("dopant", $"the host {limit.Host.Compound.Entry.Id} has no stability window, so {dopant} has no solubility limit");
        if (temperaturesK.Count == 0) throw new DefectInputException("temperatures_k", "give at least one temperature");
        foreach (var (element, _) in otherDeltaMuEv ?? new Dictionary<string, double>())
        {
            if (limit.ExtendedElements.Contains(element, StringComparer.Ordinal))
                throw new DefectInputException($"delta_mu.{element}", $"{element} is an element of the extended window; its Δμ comes from each vertex");
        }

        var vertices = new List<SolubilityVertex>();
        var ensembles = new List<DefectEnsemble>();
        for (int v = 0; v < limit.ExtendedVertices.Count; v++)
        {
            var vertex = limit.ExtendedVertices[v];
            var deltaMu = new Dictionary<string, double>(otherDeltaMuEv ?? new Dictionary<string, double>(), StringComparer.Ordinal);
            for (int i = 0; i < limit.ExtendedElements.Count; i++) deltaMu[limit.ExtendedElements[i]] = vertex.ChemicalPotentialsEv[i];
            var point = new ChemicalPotentialPoint($"vertex {v + 1}", deltaMu);
            var calculator = new FormationEnergyCalculator(study, elementalReferencesEvPerAtom, point);
            ensembles.Add(DefectEnsemble.FromCalculator(calculator, degeneracies));
            vertices.Add(new SolubilityVertex(v, point, [.. vertex.LimitingPhases.Select(p => p.Id)]));
        }

        var sweep = new List<SolubilityAtTemperature>(temperaturesK.Count);
        for (int t = 0; t < temperaturesK.Count; t++)
        {
            var perVertex = new VertexSolubility[ensembles.Count];
            for (int v = 0; v < ensembles.Count; v++)
            {
                var solution = ChargeNeutrality.Solve(ensembles[v], model, temperaturesK[t]);
                double total = 0;
                for (int d = 0; d < ensembles[v].Species.Count; d++)
                {
                    int atoms = ensembles[v].Species[d].AtomsExchanged.GetValueOrDefault(dopant);
                    if (atoms > 0) total += atoms * solution.Defects[d].PerCubicCentimetre;
                }

                perVertex[v] = new VertexSolubility(v, solution, total);
            }

            int best = Enumerable.Range(0, perVertex.Length)
                .Where(v => perVertex[v].Solution.IsConverged)
                .OrderByDescending(v => perVertex[v].DopantPerCubicCentimetre)
                .ThenBy(v => v)
                .DefaultIfEmpty(-1)
                .First();
            sweep.Add(new SolubilityAtTemperature(temperaturesK[t], perVertex, best));
        }

        var holders = new Dictionary<string, string>(StringComparer.Ordinal) { [dopant] = $"the dopant {dopant}" };
        foreach (var phase in limit.OverallLimitingPhases)
        {
            foreach (string element in phase.Composition.Amounts.Keys) holders.TryAdd(element, $"the limiting phase {phase.Id}");
        }

        return new DopantSolubilityResult(dopant, limit.OverallMaxEv, [.. limit.OverallLimitingPhases.Select(p => p.Id)],
            vertices, sweep, ElementHazards.Cautions(holders));
    }
}
