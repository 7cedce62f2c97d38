namespace Hull.Core.Tests.References;

/// <summary>
/// A reference solver's answer to a general linear program: "optimal", "infeasible" or "unbounded"; at an optimum
/// the objective, a primal solution and a dual solution (signs as <c>LinearProgramResult</c> documents: the rate
/// of change of the optimum per unit increase of the active bound, in the program's own sense). Degenerate
/// programs have many optimal primal and dual solutions: the vectors are one of them.
/// </summary>
public sealed record GeneralLpAnswer(string Status, double Objective, double[] X, double[] RowDuals, double[] ReducedCosts);
