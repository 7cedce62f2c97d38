using Hull.Core.Chemistry;

namespace Hull.Core.Defects.Conditions;

/// <summary>The host's total energy per formula unit as the dataset has it, for comparison with a study's bulk.</summary>
public static class DatasetHostEnergy
{
    /// <summary>
    /// E_f(entry) per atom × atoms per formula unit + Σ_i n_i μ_i^ref: the total energy per formula unit of
    /// <paramref name="host"/> that the dataset's entry and elemental references imply.
    /// </summary>
    /// <exception cref="DefectInputException">A host element without an elemental reference.</exception>
    public static double PerFormulaUnitEv(Composition host, double formationEnergyEvPerAtom, IReadOnlyDictionary<string, double> referencesEvPerAtom)
    {
        ArgumentNullException.ThrowIfNull(host);
        ArgumentNullException.ThrowIfNull(referencesEvPerAtom);
        double total = formationEnergyEvPerAtom * host.AtomsPerFormulaUnit.ToDouble();
        foreach ((string element, Rational amount) in host.Amounts)
        {
            if (!referencesEvPerAtom.TryGetValue(element, out double reference))
            {
                throw new DefectInputException($"host.atoms.{element}", $"the host element {element} has no elemental reference in the dataset");
            }

            total += amount.ToDouble() * reference;
        }

        return total;
    }
}
