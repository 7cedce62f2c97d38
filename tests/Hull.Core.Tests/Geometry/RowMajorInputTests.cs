using Hull.Core.Geometry;
using Hull.Core.Tests.Generators;

namespace Hull.Core.Tests.Geometry;

/// <summary>
/// Amounts given row after row in one array are the same input as one array per point: the same engine, vertices,
/// energies and decompositions, and the same refusals with the point named.
/// </summary>
public sealed class RowMajorInputTests
{
    [Theory]
    [InlineData(3, 300, 701)]
    [InlineData(6, 200, 702)]
    public void Row_major_amounts_give_the_same_hull(int components, int points, int seed)
    {
        var set = DegenerateDataGenerator.Generate(components, points, seed);
        var flat = set.Amounts.SelectMany(r => r).ToArray();
        var fromRows = HullStability.Build(set.Amounts, set.EnergiesEvPerAtom);
        var fromFlat = HullStability.Build(flat, components, set.EnergiesEvPerAtom);
        Assert.Equal(fromRows.GetType(), fromFlat.GetType());
        Assert.Equal(fromRows.VertexPoints, fromFlat.VertexPoints);
        for (int i = 0; i < set.Count; i++)
        {
            Assert.Equal(fromRows.EnergyAboveHullEvPerAtom(i), fromFlat.EnergyAboveHullEvPerAtom(i));
            var a = fromRows.LocatePoint(i);
            var b = fromFlat.LocatePoint(i);
            Assert.Equal(a.VertexPoints, b.VertexPoints);
            Assert.Equal(a.AtomFractions, b.AtomFractions);
        }
    }

    [Fact]
    public void Bad_row_major_input_is_refused_with_what_and_where()
    {
        // Two components: rows {1,0}, {-1,2}, {0,1}.
        var negative = Assert.Throws<ArgumentException>(() => HullStability.Build([1, 0, -1, 2, 0, 1], 2, [0.0, 0.0, 0.0]));
        Assert.StartsWith("Point 1: amount of component 0 is negative (-1).", negative.Message);
        var ragged = Assert.Throws<ArgumentException>(() => HullStability.Build([1, 0, 0], 2, [0.0, 0.0]));
        Assert.StartsWith("3 amounts are not whole rows of 2 components.", ragged.Message);
        var counts = Assert.Throws<ArgumentException>(() => HullStability.Build([1, 0, 0, 1], 2, [0.0]));
        Assert.StartsWith("2 amount rows but 1 energies.", counts.Message);
        var noComponents = Assert.Throws<ArgumentException>(() => HullStability.Build([1, 0], 0, [0.0]));
        Assert.StartsWith("0 components; at least one is needed.", noComponents.Message);
    }
}
