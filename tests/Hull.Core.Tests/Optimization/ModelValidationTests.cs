using Hull.Core.Optimization;

namespace Hull.Core.Tests.Optimization;

/// <summary>A defective model is answered with InvalidModel and an issue naming the row or column, before any iteration.</summary>
public sealed class ModelValidationTests
{
    private const double Inf = double.PositiveInfinity;

    private static LinearProgram Make(double[]? c = null, double[,]? a = null, double[]? rl = null, double[]? ru = null, double[]? cl = null, double[]? cu = null) =>
        new(ObjectiveSense.Minimize, c ?? [1, 1, 1], a ?? new double[,] { { 1, 2, 3 }, { 4, 5, 6 } }, rl ?? [0, 0], ru ?? [1, 1], cl ?? [0, 0, 0], cu ?? [1, 1, 1]);

    public static TheoryData<string, LinearProgram, ModelIssueKind, int, int> Cases() => new()
    {
        { "objective too short", Make(c: [1, 1]), ModelIssueKind.DimensionMismatch, -1, -1 },
        { "row bounds too long", Make(rl: [0, 0, 0]), ModelIssueKind.DimensionMismatch, -1, -1 },
        { "column bounds too short", Make(cu: [1, 1]), ModelIssueKind.DimensionMismatch, -1, -1 },
        { "NaN cost", Make(c: [1, double.NaN, 1]), ModelIssueKind.NonFiniteObjective, -1, 1 },
        { "infinite cost", Make(c: [1, 1, -Inf]), ModelIssueKind.NonFiniteObjective, -1, 2 },
        { "NaN coefficient", Make(a: new double[,] { { 1, 2, 3 }, { 4, double.NaN, 6 } }), ModelIssueKind.NonFiniteCoefficient, 1, 1 },
        { "infinite coefficient", Make(a: new double[,] { { Inf, 2, 3 }, { 4, 5, 6 } }), ModelIssueKind.NonFiniteCoefficient, 0, 0 },
        { "NaN row bound", Make(ru: [1, double.NaN]), ModelIssueKind.NaNBound, 1, -1 },
        { "NaN column bound", Make(cl: [0, 0, double.NaN]), ModelIssueKind.NaNBound, -1, 2 },
        { "row lower +inf", Make(rl: [Inf, 0], ru: [Inf, 1]), ModelIssueKind.UnsatisfiableInfiniteBound, 0, -1 },
        { "column upper -inf", Make(cl: [-Inf, 0, 0], cu: [-Inf, 1, 1]), ModelIssueKind.UnsatisfiableInfiniteBound, -1, 0 },
        { "row bounds crossed", Make(rl: [0, 2], ru: [1, 1]), ModelIssueKind.InconsistentRowBounds, 1, -1 },
        { "column bounds crossed", Make(cl: [0, 3, 0], cu: [1, 1, 1]), ModelIssueKind.InconsistentColumnBounds, -1, 1 },
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void Defect_is_reported_with_its_place(string name, LinearProgram program, ModelIssueKind kind, int row, int column)
    {
        var result = DenseSimplex.Solve(program);
        Assert.Equal(LinearProgramStatus.InvalidModel, result.Status);
        Assert.Equal(SimplexStopReason.ModelRejected, result.StopReason);
        var issue = Assert.IsType<ModelIssue>(result.Issue);
        Assert.True(issue.Kind == kind && issue.Row == row && issue.Column == column,
            $"{name}: got {issue.Kind} at row {issue.Row}, column {issue.Column} ({issue.Message})");
        Assert.Equal(issue.Message, result.Message);
        Assert.Equal(0, result.Iterations);
        Assert.Null(result.Basis);
        Assert.False(result.IsPrimalFeasible || result.AreDualsValid);
    }

    [Fact]
    public void Messages_name_the_place_in_words()
    {
        Assert.Contains("row 1, column 1", DenseSimplex.Solve(Make(a: new double[,] { { 1, 2, 3 }, { 4, double.NaN, 6 } })).Message);
        Assert.Contains("column 1 (3) exceeds its upper bound (1)", DenseSimplex.Solve(Make(cl: [0, 3, 0])).Message);
    }

    [Fact]
    public void A_sound_model_has_no_issue()
    {
        Assert.Null(Make().FindIssue());
        Assert.Equal(LinearProgramStatus.Optimal, DenseSimplex.Solve(Make()).Status);
    }

    [Fact]
    public void A_basis_of_another_shape_is_refused_with_both_shapes_named()
    {
        var basis = new LinearProgramBasis(Enumerable.Repeat(BasisStatus.AtLower, 2), [BasisStatus.Basic, BasisStatus.Basic]);
        var e = Assert.Throws<ArgumentException>(() => DenseSimplex.Solve(Make(), basis));
        Assert.Contains("2 rows and 2 columns; the program has 2 rows and 3 columns", e.Message);
    }

    [Fact]
    public void Builder_refuses_a_term_on_a_column_not_added()
    {
        var b = new LinearProgramBuilder(ObjectiveSense.Minimize);
        b.AddColumn(1);
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => b.AddRow([(0, 1.0), (1, 2.0)], 0, 1));
        Assert.Contains("Term 1 of row 0 names column 1; there are 1 columns", e.Message);
    }
}
