namespace Hull.Core.Defects;

/// <summary>How the Ewald sums are split and cut off. The answer does not depend on the split, only the cost.</summary>
/// <param name="SplittingPerAngstrom">The splitting parameter γ (Å⁻¹) in the vacuum frame; null for √π / V^{1/3},
/// which balances the real- and reciprocal-space work for one charge per cell.</param>
/// <param name="RelativeTail">Each left-out tail is below this fraction of its sum's leading term.</param>
public sealed record EwaldSettings(double? SplittingPerAngstrom = null, double RelativeTail = DefectTolerances.EwaldRelativeTail)
{
    public static EwaldSettings Default { get; } = new();

    internal double CutoffArgument => Math.Sqrt(-Math.Log(RelativeTail));

    internal void Validate()
    {
        if (SplittingPerAngstrom is { } g && (!double.IsFinite(g) || g <= 0))
        {
            throw new DefectInputException("ewald.splitting_per_angstrom", $"the splitting parameter must be a positive number, not {g}");
        }

        if (!(RelativeTail > 0 && RelativeTail < 1e-3))
        {
            throw new DefectInputException("ewald.relative_tail", $"the relative tail must lie in (0, 1e-3), not {RelativeTail}");
        }
    }
}
