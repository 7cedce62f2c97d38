using Hull.Core.Optimization;
using Hull.Core.Tests.References;

namespace Hull.Core.Tests.Optimization;

/// <summary>
/// Our result against a reference answer: the same verdict; at an optimum the same objective to 1e-9 and our own
/// optimality conditions (<see cref="OptimalityCheck"/>); solution vectors only where the program's solution is
/// provably unique, read off our final basis: no nonbasic reduced cost near zero means the primal optimum is
/// unique, no basic variable near a bound means the dual optimum is unique (common practice: a dual- or
/// primal-nondegenerate optimal basis).
/// </summary>
internal sealed class ReferenceComparison
{
    /// <summary>
    /// A reduced cost or bound distance above this marks the basis nondegenerate for the uniqueness test: far above
    /// the 1e-10 solver tolerances, so rounding cannot fake it.
    /// </summary>
    private const double NondegenerateMargin = 1e-6;

    /// <summary>
    /// Unique solution vectors agree to this: they come from two different factorisations of bases whose condition
    /// numbers on random data reach about 1e3, so 1e-9 on the objective becomes about 1e-8 on components.
    /// </summary>
    private const double VectorTolerance = 1e-8;

    public List<string> Problems { get; } = [];

    public int Optimal { get; private set; }

    public int UniquePrimalCompared { get; private set; }

    public int UniqueDualCompared { get; private set; }

    public void Compare(string name, LinearProgram p, LinearProgramResult ours, GeneralLpAnswer reference, string source)
    {
        string expected = reference.Status;
        string actual = ours.Status switch
        {
            LinearProgramStatus.Optimal => "optimal",
            LinearProgramStatus.Infeasible => "infeasible",
            LinearProgramStatus.Unbounded => "unbounded",
            _ => ours.Status.ToString(),
        };
        if (actual != expected) { Problems.Add($"{name}: {source} says {expected}, we say {actual} ({ours.Message})"); return; }
        if (ours.Status == LinearProgramStatus.Unbounded) { CheckRay(name, p, ours); return; }
        if (ours.Status != LinearProgramStatus.Optimal) return;
        Optimal++;
        if (Math.Abs(ours.ObjectiveValue - reference.Objective) > OptimalityCheck.Tolerance * Math.Max(1, Math.Abs(reference.Objective)))
        {
            Problems.Add($"{name}: objective {ours.ObjectiveValue:R}, {source} {reference.Objective:R}");
        }
        foreach (var problem in OptimalityCheck.Problems(p, ours)) Problems.Add($"{name}: {problem}");

        var basis = ours.Basis!;
        if (PrimalUnique(p, ours, basis))
        {
            UniquePrimalCompared++;
            for (int j = 0; j < p.ColumnCount; j++)
            {
                if (Math.Abs(ours.ColumnValues[j] - reference.X[j]) > VectorTolerance * (1 + Math.Abs(reference.X[j])))
                {
                    Problems.Add($"{name}: unique optimum, x[{j}] = {ours.ColumnValues[j]:R}, {source} {reference.X[j]:R}");
                }
            }
        }
        if (DualUnique(p, ours, basis))
        {
            UniqueDualCompared++;
            for (int i = 0; i < p.RowCount; i++)
            {
                if (Math.Abs(ours.RowDuals[i] - reference.RowDuals[i]) > VectorTolerance * (1 + Math.Abs(reference.RowDuals[i])))
                {
                    Problems.Add($"{name}: unique dual, y[{i}] = {ours.RowDuals[i]:R}, {source} {reference.RowDuals[i]:R}");
                }
            }
            for (int j = 0; j < p.ColumnCount; j++)
            {
                if (Math.Abs(ours.ReducedCosts[j] - reference.ReducedCosts[j]) > VectorTolerance * (1 + Math.Abs(reference.ReducedCosts[j])))
                {
                    Problems.Add($"{name}: unique dual, reduced cost [{j}] = {ours.ReducedCosts[j]:R}, {source} {reference.ReducedCosts[j]:R}");
                }
            }
        }
    }

    /// <summary>Every nonbasic, non-fixed variable (column or row logical) has a reduced cost clearly away from zero.</summary>
    private static bool PrimalUnique(LinearProgram p, LinearProgramResult r, LinearProgramBasis basis)
    {
        for (int j = 0; j < p.ColumnCount; j++)
        {
            if (basis.ColumnStatuses[j] == BasisStatus.Basic || p.ColumnLower[j] == p.ColumnUpper[j]) continue;
            if (Math.Abs(r.ReducedCosts[j]) <= NondegenerateMargin) return false;
        }
        for (int i = 0; i < p.RowCount; i++)
        {
            if (basis.RowStatuses[i] == BasisStatus.Basic || p.RowLower[i] == p.RowUpper[i]) continue;
            if (Math.Abs(r.RowDuals[i]) <= NondegenerateMargin) return false;
        }
        return true;
    }

    /// <summary>Every basic variable lies clearly inside its bounds.</summary>
    private static bool DualUnique(LinearProgram p, LinearProgramResult r, LinearProgramBasis basis)
    {
        for (int j = 0; j < p.ColumnCount; j++)
        {
            if (basis.ColumnStatuses[j] != BasisStatus.Basic) continue;
            double v = r.ColumnValues[j];
            if (v - p.ColumnLower[j] <= NondegenerateMargin || p.ColumnUpper[j] - v <= NondegenerateMargin) return false;
        }
        for (int i = 0; i < p.RowCount; i++)
        {
            if (basis.RowStatuses[i] != BasisStatus.Basic) continue;
            double v = r.RowActivities[i];
            if (v - p.RowLower[i] <= NondegenerateMargin || p.RowUpper[i] - v <= NondegenerateMargin) return false;
        }
        return true;
    }

    /// <summary>An unbounded verdict's ray must keep every row and column feasible and improve the objective.</summary>
    private void CheckRay(string name, LinearProgram p, LinearProgramResult r)
    {
        var d = r.UnboundedRay;
        if (d.Length != p.ColumnCount) { Problems.Add($"{name}: unbounded without a ray"); return; }
        double gain = 0;
        for (int j = 0; j < p.ColumnCount; j++)
        {
            gain += p.Objective[j] * d[j];
            if ((d[j] < -OptimalityCheck.Tolerance && double.IsFinite(p.ColumnLower[j])) || (d[j] > OptimalityCheck.Tolerance && double.IsFinite(p.ColumnUpper[j])))
            {
                Problems.Add($"{name}: the ray moves column {j} towards a finite bound");
            }
        }
        for (int i = 0; i < p.RowCount; i++)
        {
            double change = 0;
            for (int j = 0; j < p.ColumnCount; j++) change += p.Coefficient(i, j) * d[j];
            if ((change < -OptimalityCheck.Tolerance && double.IsFinite(p.RowLower[i])) || (change > OptimalityCheck.Tolerance && double.IsFinite(p.RowUpper[i])))
            {
                Problems.Add($"{name}: the ray moves row {i} towards a finite bound");
            }
        }
        bool improves = p.Sense == ObjectiveSense.Minimize ? gain < -OptimalityCheck.Tolerance : gain > OptimalityCheck.Tolerance;
        if (!improves) Problems.Add($"{name}: the ray changes the objective by {gain:R} per unit, not an improvement");
        if (!r.IsPrimalFeasible) Problems.Add($"{name}: unbounded, but the reported point is not feasible");
    }
}
