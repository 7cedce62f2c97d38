namespace Hull.Core.Defects;

/// <summary>The equilibrium at the growth temperature and the quenched state at the operating temperature.</summary>
/// <param name="Growth">Equilibrium at the growth temperature: the totals that freeze.</param>
/// <param name="Operating">At the operating temperature with those totals fixed (<see cref="FermiLevelSolution.Form"/> is null).</param>
public sealed record QuenchSolution(FermiLevelSolution Growth, FermiLevelSolution Operating)
{
    public bool IsConverged => Growth.IsConverged && Operating.IsConverged;
}
