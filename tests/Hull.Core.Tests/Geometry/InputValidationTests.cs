using Hull.Core.Geometry;

namespace Hull.Core.Tests.Geometry;

/// <summary>
/// Bad input is refused with a message that says what is wrong and where (project rule: row and field named).
/// Both hull engines refuse the same input with the same message and parameter name.
/// </summary>
public sealed class InputValidationTests
{
    /// <summary>What <see cref="LowerHull.Build"/> throws, after checking that <see cref="LinearProgramHull.Build"/> throws the same.</summary>
    private static ArgumentException Refused(long[][] amounts, double[] energies)
    {
        var facets = Assert.Throws<ArgumentException>(() => LowerHull.Build(amounts, energies));
        var programs = Assert.Throws<ArgumentException>(() => LinearProgramHull.Build(amounts, energies));
        Assert.Equal(facets.Message, programs.Message);
        Assert.Equal(facets.ParamName, programs.ParamName);
        return facets;
    }

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
    public void More_components_than_the_program_engine_takes_are_refused()
    {
        // 65 components, one pure point each: fine input, but component sets are 64-bit masks in that engine.
        const int n = LinearProgramHull.MaxComponents + 1;
        var amounts = Enumerable.Range(0, n).Select(k => { var a = new long[n]; a[k] = 1; return a; }).ToArray();
        var e = Assert.Throws<ArgumentException>(() => LinearProgramHull.Build(amounts, new double[n]));
        Assert.StartsWith("65 components; this engine takes at most 64.", e.Message);
        Assert.Equal("amounts", e.ParamName);
        // Exactly 64 is still taken.
        var at64 = Enumerable.Range(0, n - 1).Select(k => { var a = new long[n - 1]; a[k] = 1; return a; }).ToArray();
        Assert.Equal(n - 1, LinearProgramHull.Build(at64, new double[n - 1]).VertexPoints.Count);
    }

    [Theory]
    [InlineData(HullEngine.Facets)]
    [InlineData(HullEngine.Programs)]
    public void Locate_refuses_compositions_off_the_simplex(string engine)
    {
        var hull = HullEngine.Build(engine, [[1, 0], [0, 1]], [0, 0]);
        Assert.StartsWith("Expected 2 fractions, got 3.", Assert.Throws<ArgumentException>(() => hull.Locate([0.2, 0.3, 0.5])).Message);
        Assert.StartsWith("Fraction 0 is -0.1", Assert.Throws<ArgumentException>(() => hull.Locate([-0.1, 1.1])).Message);
        Assert.StartsWith("Fractions sum to 0.9", Assert.Throws<ArgumentException>(() => hull.Locate([0.4, 0.5])).Message);
        Assert.Throws<ArgumentOutOfRangeException>(() => hull.LocatePoint(2));
        Assert.Throws<ArgumentOutOfRangeException>(() => hull.LocatePoint(-1));
        Assert.Throws<ArgumentOutOfRangeException>(() => hull.EnergyAboveHullEvPerAtom(2));
    }
}
