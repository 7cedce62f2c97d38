namespace Hull.Core.Defects;

/// <summary>
/// Planar-averaged potentials of the defect and bulk supercells along one lattice axis, on the same equally spaced
/// grid f = k/n (k = 0 … n−1) of fractional coordinate along that axis.
/// </summary>
/// <param name="Axis">0, 1 or 2: the lattice vector the profile runs along.</param>
/// <param name="DefectCell">Planar average in the defect supercell.</param>
/// <param name="BulkCell">Planar average in the bulk supercell, same grid.</param>
public sealed record PlanarProfile(int Axis, IReadOnlyList<double> DefectCell, IReadOnlyList<double> BulkCell);
