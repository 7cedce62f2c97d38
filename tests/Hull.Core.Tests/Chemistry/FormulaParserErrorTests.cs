using Hull.Core.Chemistry;

namespace Hull.Core.Tests.Chemistry;

public class FormulaParserErrorTests
{
    [Theory]
    [InlineData("", 0, "empty formula")]
    [InlineData("   ", 0, "empty formula")]
    [InlineData("LiXx2", 2, "unknown element 'Xx'")]
    [InlineData("Nacl", 0, "unknown element 'Nacl'")]
    [InlineData("co", 0, "capital letter, found 'co'")]
    [InlineData("Li2co3", 3, "capital letter, found 'co'")]
    [InlineData("Ca(OH2", 2, "'(' is never closed")]
    [InlineData("K4[Fe(CN)6", 2, "'[' is never closed")]
    [InlineData("CaOH)2", 4, "')' has no matching opening bracket")]
    [InlineData("Ca(OH]2", 5, "']' does not match '(' opened at character 3")]
    [InlineData("Ca()2", 2, "empty group '()'")]
    [InlineData("H0O", 1, "amount '0' is zero")]
    [InlineData("H2O0.00", 3, "amount '0.00' is zero")]
    [InlineData("H1/0", 1, "amount '1/0' has a zero denominator")]
    [InlineData("H-2O", 1, "negative amount '-2'")]
    [InlineData("H2.O", 1, "malformed amount '2.'")]
    [InlineData("H.5", 1, "malformed amount '.5'")]
    [InlineData("H1.2.3", 1, "malformed amount '1.2.3'")]
    [InlineData("Li1/", 2, "malformed amount '1/'")]
    [InlineData("Li1/2/3", 2, "malformed amount '1/2/3'")]
    [InlineData("LiCo02", 4, "amount '02' has a leading zero")] // the letter O typed as a zero
    [InlineData("Fe2O007", 4, "amount '007' has a leading zero")]
    [InlineData("Li0.5/2", 2, "a fraction takes whole numbers")]
    [InlineData("H99999999999999999999", 1, "too large")]
    [InlineData("H2O#", 3, "unexpected character '#'")]
    [InlineData("H2O)", 3, "')' has no matching opening bracket")]
    [InlineData("H2O-", 3, "unexpected character '-'")]
    [InlineData("2H2O", 0, "unexpected number '2'")]
    [InlineData("Li2 3", 4, "unexpected number '3'")]
    [InlineData("CuSO4·", 6, "expected an element or a bracket after '·'")]
    [InlineData("CuSO4·5", 7, "after the multiplier '5'")]
    [InlineData("·H2O", 0, "expected an element or a bracket before '·'")]
    [InlineData("CuSO4··H2O", 6, "after '·'")]
    [InlineData("CuSO4·0H2O", 6, "amount '0' is zero")]
    [InlineData("CuSO4·-5H2O", 6, "negative amount '-5'")]
    [InlineData("CuSO4·)", 6, "')' has no matching opening bracket")]
    [InlineData("(CuSO4·H2O)2", 6, "'·' inside brackets")]
    [InlineData("Fe2O3 x", 6, "capital letter, found 'x'")]
    [InlineData("Fé", 1, "unexpected character 'é'")]
    public void Bad_formulas_are_refused_with_the_problem_and_its_position(string formula, int position, string problem)
    {
        FormulaParseException error = Assert.Throws<FormulaParseException>(() => FormulaParser.Parse(formula));
        Assert.Equal(position, error.Position);
        Assert.Equal(formula, error.Formula);
        Assert.Contains(problem, error.Message);
        Assert.Contains(problem, error.Problem);
        Assert.Contains($"in '{formula}'", error.Message);
        Assert.IsAssignableFrom<FormatException>(error);
    }

    [Fact]
    public void Message_names_the_problem_and_counts_characters_from_one()
    {
        FormulaParseException error = Assert.Throws<FormulaParseException>(() => FormulaParser.Parse("LiXx2"));
        Assert.Equal("unknown element 'Xx' at character 3 in 'LiXx2'", error.Message);
        Assert.Equal(2, error.Position);

        FormulaParseException end = Assert.Throws<FormulaParseException>(() => FormulaParser.Parse("CuSO4·"));
        Assert.Equal("expected an element or a bracket after '·' at the end (character 7) in 'CuSO4·'", end.Message);
    }

    [Fact]
    public void Nesting_deeper_than_the_limit_is_refused_at_the_first_bracket_too_deep()
    {
        string deepest = new string('(', FormulaParser.MaxGroupDepth) + "H" + new string(')', FormulaParser.MaxGroupDepth);
        Assert.Equal(Composition.OfElement("H"), FormulaParser.Parse(deepest));

        string tooDeep = "(" + deepest + ")";
        FormulaParseException error = Assert.Throws<FormulaParseException>(() => FormulaParser.Parse(tooDeep));
        Assert.Equal(FormulaParser.MaxGroupDepth, error.Position);
        Assert.Contains("nested deeper", error.Message);
    }

    [Fact]
    public void Summed_amounts_beyond_64_bits_are_refused_where_they_overflow()
    {
        const string formula = "H9223372036854775807H1";
        FormulaParseException error = Assert.Throws<FormulaParseException>(() => FormulaParser.Parse(formula));
        Assert.Equal(20, error.Position);
        Assert.Contains("too large", error.Message);
    }

    [Fact]
    public void Lower_case_formulas_are_never_guessed()
    {
        foreach (string formula in new[] { "co", "h2o", "nacl", "fe2o3" })
        {
            Assert.False(Composition.TryParse(formula, out _, out FormulaParseException? error));
            Assert.Equal(0, error.Position);
        }
    }
}
