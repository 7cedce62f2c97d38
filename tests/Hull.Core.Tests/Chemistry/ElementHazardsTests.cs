using Hull.Core.Chemistry;

namespace Hull.Core.Tests.Chemistry;

public sealed class ElementHazardsTests
{
    [Fact]
    public void Listed_elements_get_a_caution_naming_what_holds_them()
    {
        // common practice: arsenic compounds are toxic, caesium metal is pyrophoric; magnesium oxide is no listed hazard.
        var cautions = ElementHazards.Cautions(new Dictionary<string, string> { ["Mg"] = "the host", ["As"] = "the dopant As", ["Cs"] = "the limiting phase CsAsO3" });
        Assert.Equal(2, cautions.Count);
        Assert.StartsWith("Caution: the dopant As contains As, toxic", cautions[0]);
        Assert.Contains("the limiting phase CsAsO3 contains Cs, pyrophoric", cautions[1]);
        Assert.All(cautions, c => Assert.Contains("local safety rules and licensed practice", c));
        Assert.Null(ElementHazards.Of("Mg"));
        Assert.Empty(ElementHazards.Cautions(new Dictionary<string, string> { ["O"] = "the host" }));
    }
}
