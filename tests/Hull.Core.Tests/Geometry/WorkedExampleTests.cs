using Hull.Core.Geometry;

namespace Hull.Core.Tests.Geometry;

/// <summary>
/// Small hulls worked out by hand; the arithmetic is in the comments. Energies in eV/atom, compositions as atom
/// fractions. The lever rule and "energy above hull = E - hull energy at the same composition" are common practice.
/// </summary>
public sealed class WorkedExampleTests
{
    /// <summary>Exact decimal results are compared to this many digits: far above rounding, far below the values.</summary>
    private const int Digits = 12;

    /// <summary>Components A, B. A and B at 0; AB (amounts 2:2, x_B = 1/2) at -0.4; AB2 (x_B = 2/3) at -0.2.</summary>
    private static readonly long[][] BinaryAmounts = [[1, 0], [0, 1], [2, 2], [1, 2]];
    private static readonly double[] BinaryEnergies = [0.0, 0.0, -0.4, -0.2];

    [Theory]
    [InlineData(HullEngine.Facets)]
    [InlineData(HullEngine.Programs)]
    public void Binary_with_a_stable_and_a_metastable_compound(string engine)
    {
        var hull = HullEngine.Build(engine, BinaryAmounts, BinaryEnergies);

        // Lower hull: A (0, 0) - AB (1/2, -0.4) - B (1, 0); AB2 is above it.
        Assert.Equal([0, 1, 2], hull.VertexPoints);
        // Hull at x_B = 2/3, on AB-B: -0.4 + (2/3 - 1/2) / (1 - 1/2) * (0 - -0.4) = -0.4 + 0.4/3 = -4/15 = -0.26667;
        // AB2 lies -0.2 - (-4/15) = 1/15 = 0.066667 eV/atom above.
        Assert.Equal(1.0 / 15.0, hull.EnergyAboveHullEvPerAtom(3), Digits);
        var ab2 = hull.LocatePoint(3);
        Assert.Equal(-4.0 / 15.0, ab2.HullEnergyEvPerAtom, Digits);
        // Lever rule: fraction of atoms in AB = (1 - 2/3) / (1 - 1/2) = 2/3, in B = 1/3.
        AssertDecomposition(ab2, (2, 2.0 / 3.0), (1, 1.0 / 3.0));
        Assert.Equal(0.0, hull.EnergyAboveHullEvPerAtom(2));

        // At x_B = 1/4, between A and AB: hull energy -0.4 * (1/4) / (1/2) = -0.2; half the atoms in A, half in AB.
        var quarter = hull.Locate([0.75, 0.25]);
        Assert.Equal(-0.2, quarter.HullEnergyEvPerAtom, Digits);
        AssertDecomposition(quarter, (0, 0.5), (2, 0.5));
    }

    [Fact]
    public void Binary_facets_carry_the_chemical_potentials()
    {
        var hull = LowerHull.Build(BinaryAmounts, BinaryEnergies);
        // Two facets. Chemical potentials: on A-AB, mu_A = E(A) = 0 and mu_A/2 + mu_B/2 = -0.4, so mu_B = -0.8;
        // on AB-B, mu_B = 0 and mu_A = -0.8.
        Assert.Equal(2, hull.Facets.Count);
        var left = hull.Facets.Single(f => f.VertexPoints.Contains(0));
        var right = hull.Facets.Single(f => f.VertexPoints.Contains(1));
        Assert.Equal(0.0, left.ChemicalPotentialsEvPerAtom[0], Digits);
        Assert.Equal(-0.8, left.ChemicalPotentialsEvPerAtom[1], Digits);
        Assert.Equal(-0.8, right.ChemicalPotentialsEvPerAtom[0], Digits);
        Assert.Equal(0.0, right.ChemicalPotentialsEvPerAtom[1], Digits);
    }

    [Theory]
    [InlineData(HullEngine.Facets)]
    [InlineData(HullEngine.Programs)]
    public void Equal_energy_polymorphs_give_one_vertex(string engine)
    {
        // AB written as 1:1 (point 2) and 3:3 (point 3), both at -0.4: one composition, one hull vertex (the lower
        // index); the twin is 0 above the hull and decomposes entirely into point 2.
        long[][] amounts = [[1, 0], [0, 1], [1, 1], [3, 3]];
        double[] energies = [0.0, 0.0, -0.4, -0.4];
        var hull = HullEngine.Build(engine, amounts, energies);
        Assert.Equal([0, 1, 2], hull.VertexPoints);
        Assert.Equal(0.0, hull.EnergyAboveHullEvPerAtom(3));
        AssertDecomposition(hull.LocatePoint(3), (2, 1.0));

        // The same with the twins listed in the other order: the vertex is again the lower index.
        long[][] swapped = [[1, 0], [0, 1], [3, 3], [1, 1]];
        var other = HullEngine.Build(engine, swapped, energies);
        Assert.Equal([0, 1, 2], other.VertexPoints);
        AssertDecomposition(other.LocatePoint(3), (2, 1.0));
    }

    /// <summary>
    /// Components A, B, C at 0; AB (1:1:0) at -0.4. The lower hull has the facets A-AB-C and AB-B-C (AB lies on
    /// the A-B edge), which share the tie-line AB-C.
    /// P = A3B3C2, x = (3/8, 3/8, 1/4) = 3/4 of the atoms in AB + 1/4 in C; on the tie-line the hull energy is
    /// 3/4 * -0.4 + 1/4 * 0 = -0.3, so P at -0.3 lies on the hull without being a vertex.
    /// </summary>
    private static readonly long[][] TernaryAmounts = [[1, 0, 0], [0, 1, 0], [0, 0, 1], [1, 1, 0], [3, 3, 2]];
    private static readonly double[] TernaryEnergies = [0.0, 0.0, 0.0, -0.4, -0.3];

    [Theory]
    [InlineData(HullEngine.Facets)]
    [InlineData(HullEngine.Programs)]
    public void Ternary_point_exactly_on_a_tie_line(string engine)
    {
        var hull = HullEngine.Build(engine, TernaryAmounts, TernaryEnergies);
        Assert.Equal([0, 1, 2, 3], hull.VertexPoints);
        Assert.Equal(0.0, hull.EnergyAboveHullEvPerAtom(4));
        var p = hull.LocatePoint(4);
        Assert.Equal(-0.3, p.HullEnergyEvPerAtom, Digits);
        AssertDecomposition(p, (3, 0.75), (2, 0.25));
    }

    [Fact]
    public void Ternary_tie_line_is_shared_by_two_facets()
    {
        // The two facets A-AB-C and AB-B-C of the example above.
        var hull = LowerHull.Build(TernaryAmounts, TernaryEnergies);
        Assert.Equal(["0,2,3", "1,2,3"], hull.Facets.Select(f => string.Join(",", f.VertexPoints.Order())).Order());
    }

    [Theory]
    [InlineData(HullEngine.Facets)]
    [InlineData(HullEngine.Programs)]
    public void Point_on_a_hull_edge_is_no_decomposition_product(string engine)
    {
        // Components A, B at 0; AB (x_B = 1/2) at -0.4; A3B (x_B = 1/4) at -0.2, which lies exactly on the edge
        // A-AB (-0.4 * (1/4) / (1/2) = -0.2): on the hull, not a vertex. A2B (x_B = 1/3) at -0.1 lies above the edge,
        // whose energy there is -0.4 * (1/3) / (1/2) = -4/15; so A2B is -0.1 + 4/15 = 1/6 above the hull and, by the
        // lever rule, decomposes into the vertices A and AB with (1/2 - 1/3) / (1/2) = 1/3 and 2/3 of the atoms.
        // A3B at the same energy would also balance it (2/3 A3B + 1/3 AB), but a decomposition names stable phases,
        // the hull vertices (common practice).
        long[][] amounts = [[1, 0], [0, 1], [3, 1], [1, 1], [2, 1]];
        double[] energies = [0.0, 0.0, -0.2, -0.4, -0.1];
        var hull = HullEngine.Build(engine, amounts, energies);
        Assert.Equal([0, 1, 3], hull.VertexPoints);
        Assert.Equal(0.0, hull.EnergyAboveHullEvPerAtom(2));
        AssertDecomposition(hull.LocatePoint(2), (0, 0.5), (3, 0.5));
        Assert.Equal(1.0 / 6.0, hull.EnergyAboveHullEvPerAtom(4), Digits);
        var a2b = hull.LocatePoint(4);
        Assert.Equal(-4.0 / 15.0, a2b.HullEnergyEvPerAtom, Digits);
        AssertDecomposition(a2b, (0, 1.0 / 3.0), (3, 2.0 / 3.0));
        AssertDecomposition(hull.Locate([2.0 / 3.0, 1.0 / 3.0]), (0, 1.0 / 3.0), (3, 2.0 / 3.0));
    }

    [Theory]
    [InlineData(HullEngine.Facets)]
    [InlineData(HullEngine.Programs)]
    public void Point_between_two_hull_points_at_their_mixed_energy_is_no_vertex(string engine)
    {
        // Ternary A, B, C (from generated degenerate data, reduced to ten points). P = A13B8C2 is 8/23 of its atoms
        // in Q = A2BC (point 4, 4 atoms written as 6:3:3) and 15/23 in R = A3B2 (point 5):
        // 8/23 * (1/2, 1/4, 1/4) + 15/23 * (3/5, 2/5, 0) = (4 + 9, 2 + 6, 2) / 23 = (13, 8, 2) / 23, and its energy is
        // the same mixture, (8 * -0.4521 + 15 * -0.3802) / 23 = -0.40520870 eV/atom. A mixture of two other points at
        // their mixed energy is no extreme point of the hull, so P is not a vertex (common practice: the lower
        // hull's vertices are its extreme points). The hull at P is at most that mixture, and no lower: in the
        // generated set these ten come from, SciPy's LP puts P on the hull (EngineCrossCheckTests, 3 components,
        // seed 401), and leaving points out can only raise the hull. Q and R are vertices there too.
        long[][] amounts =
        [
            [1, 0, 0], [0, 1, 0], [0, 0, 1],
            [2, 4, 4], [6, 3, 3], [3, 2, 0], [13, 8, 2], [1, 1, 0], [1, 0, 9], [0, 1, 5],
        ];
        double pEnergy = (8 * -0.4521 + 15 * -0.3802) / 23;
        double[] energies = [0, 0, 0, -0.5151, -0.4521, -0.3802, pEnergy, -0.3961, -0.3264333519412636, -0.3186732684733653];
        var hull = HullEngine.Build(engine, amounts, energies);
        Assert.DoesNotContain(6, hull.VertexPoints);
        Assert.Equal(0.0, hull.EnergyAboveHullEvPerAtom(6));
        Assert.Equal(pEnergy, hull.LocatePoint(6).HullEnergyEvPerAtom, Digits);
        Assert.Contains(4, hull.VertexPoints);
        Assert.Contains(5, hull.VertexPoints);
    }

    [Theory]
    [InlineData(HullEngine.Facets)]
    [InlineData(HullEngine.Programs)]
    public void One_component_hull_is_the_lowest_energy(string engine)
    {
        // One component, four polymorphs at 0.3, -0.2, -0.2, 0.1 (amounts 1, 2, 5, 1: scale does not matter). The
        // hull is the lowest energy, -0.2; of the two at -0.2 the lower index (1) is the vertex. Energies above
        // hull: 0.3 + 0.2 = 0.5, 0, 0, 0.1 + 0.2 = 0.3.
        long[][] amounts = [[1], [2], [5], [1]];
        double[] energies = [0.3, -0.2, -0.2, 0.1];
        var hull = HullEngine.Build(engine, amounts, energies);
        Assert.Equal([1], hull.VertexPoints);
        Assert.Equal(0.5, hull.EnergyAboveHullEvPerAtom(0), Digits);
        Assert.Equal(0.0, hull.EnergyAboveHullEvPerAtom(1));
        Assert.Equal(0.0, hull.EnergyAboveHullEvPerAtom(2));
        Assert.Equal(0.3, hull.EnergyAboveHullEvPerAtom(3), Digits);
        AssertDecomposition(hull.LocatePoint(2), (1, 1.0));
        Assert.Equal(-0.2, hull.Locate([1.0]).HullEnergyEvPerAtom, Digits);
    }

    private static void AssertDecomposition(HullPosition position, params (int Point, double Fraction)[] expected)
    {
        var actual = position.VertexPoints.Zip(position.AtomFractions).OrderBy(p => p.First).ToList();
        var wanted = expected.OrderBy(e => e.Point).ToList();
        Assert.Equal(wanted.Select(w => w.Point), actual.Select(a => a.First));
        for (int i = 0; i < wanted.Count; i++) Assert.Equal(wanted[i].Fraction, actual[i].Second, Digits);
    }
}
