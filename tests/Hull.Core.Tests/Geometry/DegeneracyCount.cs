using Hull.Core.Geometry;
using Hull.Core.Tests.Generators;

namespace Hull.Core.Tests.Geometry;

/// <summary>
/// How degenerate a generated data set turned out against its hull: points on the hull that are not vertices
/// (on facets, on edges, equal-energy twins). Checks use it to make sure the data exercise those cases at all.
/// </summary>
internal sealed record DegeneracyCount(int Vertices, int OnHullNotVertex, int TwinsOnHull, int CoplanarOnHull)
{
    public static DegeneracyCount Of(PointSet set, IHullStability hull)
    {
        var vertices = hull.VertexPoints.ToHashSet();
        int onHull = 0, twins = 0, coplanar = 0;
        for (int i = 0; i < set.Count; i++)
        {
            if (vertices.Contains(i) || hull.EnergyAboveHullEvPerAtom(i) != 0.0) continue;
            onHull++;
            if (set.Kinds[i] == "equal-energy twin") twins++;
            if (set.Kinds[i] == "coplanar") coplanar++;
        }
        return new DegeneracyCount(vertices.Count, onHull, twins, coplanar);
    }

    public override string ToString() =>
        $"{Vertices} vertices; {OnHullNotVertex} points on the hull but not vertices ({TwinsOnHull} equal-energy twins, {CoplanarOnHull} coplanar)";
}
