namespace Hull.Core.Windows;

/// <summary>Named tolerances of the polytope module, with the reason for each size.</summary>
public static class PolytopeTolerances
{
    /// <summary>
    /// A constraint whose slack (distance of a point from its plane, in the coordinates' unit: eV for chemical
    /// potentials) is within this value is tight there. It equals the hull's energy tolerance, so a phase the hull
    /// calls coplanar with a compound is tight on the compound's window; cuts interpolate along edges and lose about
    /// 1e-15 relative per step, so 1e-10 stays three orders above the rounding of a few thousand cuts.
    /// </summary>
    public const double SlackEv = 1e-10;

    /// <summary>
    /// Rank decisions on unit-length constraint normals (is a set of tight planes independent?). Normals come
    /// from atom fractions of at most a few dozen atoms per formula unit, so genuinely independent sets have pivots
    /// above about 1e-4 and rounding leaves pivots of dependent sets near 1e-15; 1e-9 separates the two widely.
    /// </summary>
    public const double RankPivot = 1e-9;
}
