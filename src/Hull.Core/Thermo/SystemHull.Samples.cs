using Hull.Core.Geometry;

namespace Hull.Core.Thermo;

// What stability sampling needs of a hull: its points by canonical index, and the hull of a subset of them at other
// energies on another axis (one sample), read without building the per-entry records.
public sealed partial class SystemHull
{
    /// <summary>The point at canonical index <paramref name="i"/>.</summary>
    internal HullPoint PointAt(int i) => _points[i];

    /// <summary>
    /// The hull over the points <paramref name="keptPoints"/> (canonical indices, ascending, every pure-component
    /// point among them) at the energies <paramref name="axisEnergyByPoint"/> (indexed as this hull's points), on
    /// <paramref name="axis"/>. The kept points stay in canonical order, so the new hull's point k is this hull's
    /// point keptPoints[k]. The engine is the one this hull ended up with (a sample moves energies by error bars,
    /// so where this hull's facets exploded a sample's would too).
    /// </summary>
    internal SystemHull Resampled(HullAxis axis, int[] keptPoints, double[] axisEnergyByPoint)
    {
        var points = new HullPoint[keptPoints.Length];
        for (int k = 0; k < points.Length; k++)
        {
            int i = keptPoints[k];
            points[k] = _points[i].WithAxisEnergy(axisEnergyByPoint[i]);
        }

        return new SystemHull(axis, _space, points, References, onDemand: false, engineLike: _hull);
    }

    /// <summary>Whether the point at canonical index <paramref name="i"/> is a hull vertex.</summary>
    internal bool IsVertexPoint(int i) => _hull.IsVertex(i);

    /// <summary>Canonical indices of the hull's vertices, ascending.</summary>
    internal IReadOnlyList<int> VertexPointIndices => _hull.VertexPoints;

    /// <summary>Hull energy and decomposition at the point at canonical index <paramref name="i"/>.</summary>
    internal HullPosition PositionOfPoint(int i) => _hull.LocatePoint(i);

    /// <summary>Hull energy and decomposition at composition fractions in the hull's component order.</summary>
    internal HullPosition PositionAt(double[] fractions) => _hull.Locate(fractions);
}
