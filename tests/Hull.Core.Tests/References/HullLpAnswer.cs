namespace Hull.Core.Tests.References;

/// <summary>
/// One query's LP optimum: the lower-hull energy there (eV/atom) and the decomposition the solver found, as input
/// point indices with their atom fractions (lambdas). For degenerate data the decomposition need not be unique.
/// <paramref name="Duals"/> (SciPy only): the solver's dual of each composition row, the chemical potentials of a
/// facet holding the query (eV/atom per component); unique only where the decomposition has one phase per component.
/// </summary>
public sealed record HullLpAnswer(double HullEnergyEvPerAtom, int[] Phases, double[] Weights, double[]? Duals = null);
