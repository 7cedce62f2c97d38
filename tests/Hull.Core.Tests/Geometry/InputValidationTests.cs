using Hull.Core.Geometry;

namespace Hull.Core.Tests.Geometry;

/// <summary>
/// Bad input is refused with a message that says what is wrong and where (project rule: row and field named).
/// </summary>
public sealed class InputValidationTests
{
    private static ArgumentException Refused(long[][] amounts, double[] energies) =>
        Assert.Throws<ArgumentException>(() => LowerHull.Build(amounts, energies));

    [Fact]
    public void Negative_amount_names_point_and_component()
    {
        var e = Refused([[1, 0], [-1, 2], [0, 1]], [0, 0, 0]);
        Assert.StartsWith("Point 1: amount of component 0 is negative (-1).", e.Message);
        Assert.Equal("amounts", e.ParamName);
    }

    [Fact]
    public void All_zero_row_names_the_point()
    {
        var e = Refused([[1, 0], [0, 1], [0, 0]], [0, 0, 0]);
        Assert.StartsWith("Point 2: every amount is zero.", e.Message);
    }

    [Fact]
    public void Amounts_past_the_integer_range_name_the_point()
    {
        var e = Refused([[1, 0], [0, 1], [long.MaxValue, 1]], [0, 0, 0]);
        Assert.StartsWith("Point 2: the amounts add up past the 64-bit integer range", e.Message);
    }

    [Fact]
    public void Non_finite_energy_names_the_point()
    {
        var e = Refused([[1, 0], [1, 1], [0, 1]], [0, double.NaN, 0]);
        Assert.StartsWith("Point 1: energy is not a finite number (NaN).", e.Message);
        Assert.Equal("energiesEvPerAtom", e.ParamName);
        var inf = Refused([[1, 0], [1, 1], [0, 1]], [0, 0, double.NegativeInfinity]);
        Assert.StartsWith("Point 2: energy is not a finite number", inf.Message);
    }

    [Fact]
    public void Missing_pure_component_names_the_component()
    {
        var e = Refused([[1, 0, 0], [0, 1, 0], [1, 1, 1]], [0, 0, -0.1]);
        Assert.StartsWith("No point consists of component 2 alone", e.Message);
    }

    [Fact]
    public void Ragged_rows_name_the_point_and_lengths()
    {
        var e = Refused([[1, 0], [0, 1], [1, 1, 1]], [0, 0, 0]);
        Assert.StartsWith("Point 2 has 3 components; point 0 has 2.", e.Message);
    }

    [Fact]
    public void Count_mismatch_and_empty_input_are_refused()
    {
        Assert.StartsWith("3 amount rows but 2 energies.", Refused([[1, 0], [0, 1], [1, 1]], [0, 0]).Message);
        Assert.StartsWith("The hull needs at least one point.", Refused([], []).Message);
    }

    [Fact]
    public void Locate_refuses_compositions_off_the_simplex()
    {
        var hull = LowerHull.Build([[1, 0], [0, 1]], [0, 0]);
        Assert.StartsWith("Expected 2 fractions, got 3.", Assert.Throws<ArgumentException>(() => hull.Locate([0.2, 0.3, 0.5])).Message);
        Assert.StartsWith("Fraction 0 is -0.1", Assert.Throws<ArgumentException>(() => hull.Locate([-0.1, 1.1])).Message);
        Assert.StartsWith("Fractions sum to 0.9", Assert.Throws<ArgumentException>(() => hull.Locate([0.4, 0.5])).Message);
        Assert.Throws<ArgumentOutOfRangeException>(() => hull.LocatePoint(2));
    }
}
