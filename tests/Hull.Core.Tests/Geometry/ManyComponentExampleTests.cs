using Hull.Core.Geometry;

namespace Hull.Core.Tests.Geometry;

/// <summary>Hand-worked hulls with many components, small enough to check by inspection.</summary>
public sealed class ManyComponentExampleTests
{
    private static long[] Pure(int n, int k) { var a = new long[n]; a[k] = 1; return a; }

    [Theory]
    [InlineData(2, HullEngine.Facets)]
    [InlineData(5, HullEngine.Facets)]
    [InlineData(8, HullEngine.Facets)]
    [InlineData(10, HullEngine.Facets)]
    [InlineData(2, HullEngine.Programs)]
    [InlineData(5, HullEngine.Programs)]
    [InlineData(8, HullEngine.Programs)]
    [InlineData(10, HullEngine.Programs)]
    public void Pure_points_alone_give_the_flat_hull_at_zero(int n, string engine)
    {
        // Only the n pure points at 0 eV/atom: the hull is the single plane E = 0, every pure point a vertex, and
        // the equimolar composition decomposes into all n with 1/n of the atoms each (worked by hand).
        var amounts = Enumerable.Range(0, n).Select(k => Pure(n, k)).ToList();
        var hull = HullEngine.Build(engine, amounts, new double[n]);
        Assert.Equal(Enumerable.Range(0, n), hull.VertexPoints);
        var x = Enumerable.Repeat(1.0 / n, n).ToArray();
        var at = hull.Locate(x);
        Assert.Equal(0.0, at.HullEnergyEvPerAtom, 12);
        Assert.Equal(n, at.VertexPoints.Count);
        foreach (double w in at.AtomFractions) Assert.Equal(1.0 / n, w, 12);
    }

    [Theory]
    [InlineData(3, HullEngine.Facets)]
    [InlineData(5, HullEngine.Facets)]
    [InlineData(6, HullEngine.Facets)]
    [InlineData(8, HullEngine.Facets)]
    [InlineData(10, HullEngine.Facets)]
    [InlineData(3, HullEngine.Programs)]
    [InlineData(5, HullEngine.Programs)]
    [InlineData(6, HullEngine.Programs)]
    [InlineData(8, HullEngine.Programs)]
    [InlineData(10, HullEngine.Programs)]
    public void One_equimolar_compound_below_the_pure_points(int n, string engine)
    {
        // n pure points at 0 and the equimolar compound (1, 1, ..., 1) at -1 eV/atom (worked by hand): the compound
        // is a vertex, the hull energy at the equimolar composition is -1, and at a composition halfway between the
        // compound and pure component 0 it is -1/2, decomposing into half compound and half pure component 0.
        var amounts = Enumerable.Range(0, n).Select(k => Pure(n, k)).Append(Enumerable.Repeat(1L, n).ToArray()).ToList();
        var energies = new double[n + 1];
        energies[n] = -1.0;
        var hull = HullEngine.Build(engine, amounts, energies);
        Assert.Equal(Enumerable.Range(0, n + 1), hull.VertexPoints);
        Assert.Equal(0.0, hull.EnergyAboveHullEvPerAtom(n));
        Assert.Equal(-1.0, hull.Locate(Enumerable.Repeat(1.0 / n, n).ToArray()).HullEnergyEvPerAtom, 12);
        // x = 1/2 * (1/n, ..., 1/n) + 1/2 * (1, 0, ..., 0)
        var half = Enumerable.Repeat(0.5 / n, n).ToArray();
        half[0] += 0.5;
        var at = hull.Locate(half);
        Assert.Equal(-0.5, at.HullEnergyEvPerAtom, 12);
        var parts = at.VertexPoints.Zip(at.AtomFractions).OrderBy(p => p.First).ToList();
        Assert.Equal([0, n], parts.Select(p => p.First));
        Assert.Equal(0.5, parts[0].Second, 12);
        Assert.Equal(0.5, parts[1].Second, 12);
    }
}
