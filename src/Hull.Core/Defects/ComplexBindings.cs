namespace Hull.Core.Defects;

/// <summary>Binding energies of a study's complexes against their isolated parts.</summary>
public static class ComplexBindings
{
    // Parts' charge combinations tried per complex state; real complexes have 2–3 parts of ≤ 7 states each.
    private const int MaxCombinations = 100_000;

    /// <summary>
    /// For each charge state of each complex, the binding energy against the parts' charge states that sum to its
    /// charge and cost least; a state no combination of the parts' charges reaches is left out.
    /// </summary>
    public static IReadOnlyList<ComplexBinding> All(FormationEnergyCalculator energies)
    {
        var result = new List<ComplexBinding>();
        var study = energies.Study;
        foreach (var complex in study.Defects.Where(d => d.Kind == DefectKind.Complex))
        {
            var parts = complex.Constituents.Select(n => study.Find(n)!).ToList();
            var intercepts = parts.Select(energies.AtValenceBandMaximum).ToList();
            long combinations = intercepts.Aggregate(1L, (n, p) => n * p.Count);
            if (combinations > MaxCombinations)
            {
                throw new DefectInputException($"defects[{complex.Index}].constituents", $"the parts of '{complex.Name}' have {combinations} charge combinations, more than {MaxCombinations}");
            }

            var own = energies.AtValenceBandMaximum(complex);
            foreach (var (q, complexEnergy) in own.OrderByDescending(p => p.Key))
            {
                double best = double.PositiveInfinity;
                int[]? bestCharges = null;
                var choice = new int[parts.Count];
                Search(0, 0, 0.0);
                if (bestCharges is null) continue;
                result.Add(new ComplexBinding(complex.Name, q, [.. parts.Select((p, i) => (p.Name, bestCharges[i]))], best - complexEnergy));

                void Search(int index, int charge, double energy)
                {
                    if (index == parts.Count)
                    {
                        if (charge == q && energy < best)
                        {
                            best = energy;
                            bestCharges = (int[])choice.Clone();
                        }

                        return;
                    }

                    foreach (var (partCharge, partEnergy) in intercepts[index].OrderByDescending(p => p.Key))
                    {
                        choice[index] = partCharge;
                        Search(index + 1, charge + partCharge, energy + partEnergy);
                    }
                }
            }
        }

        return result;
    }
}
