using Hull.Core.Geometry;

namespace Hull.Core.Thermo;

public sealed partial class SystemHull
{
    /// <summary>
    /// Each entry where a figure puts it (component atom fractions, hull-axis energy, energy above hull, vertex
    /// or not), in entry order, without the decompositions and exact reactions of <see cref="Entries"/>: a figure
    /// of 1e4 entries needs only positions, and the reactions would cost more than the hull.
    /// </summary>
    internal IEnumerable<(PhaseEntry Entry, IReadOnlyList<double> Fractions, double EnergyEvPerAtom, double AboveHullEvPerAtom, bool IsVertex)> PlotPoints()
    {
        foreach (int i in Enumerable.Range(0, _points.Length).Where(i => _points[i].Entry is not null).OrderBy(i => _points[i].RowIndex))
        {
            HullPoint point = _points[i];
            // The same rule as an entry's stability: within the tolerance of the hull is on it.
            double above = point.AxisEnergyEvPerAtom - _hull.LocatePoint(i).HullEnergyEvPerAtom;
            if (!(above > HullTolerances.EnergyEvPerAtom)) above = 0.0;
            yield return (point.Entry!, point.Fractions, point.AxisEnergyEvPerAtom, above, _hull.IsVertex(i));
        }
    }
}
