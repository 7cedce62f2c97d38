namespace Hull.Core.Tests.References;

/// <summary>
/// One query's LP optimum: the lower-hull energy there (eV/atom) and the decomposition the solver found, as input
/// point indices with their atom fractions (lambdas). For degenerate data the decomposition need not be unique.
/// </summary>
public sealed record HullLpAnswer(double HullEnergyEvPerAtom, int[] Phases, double[] Weights);
