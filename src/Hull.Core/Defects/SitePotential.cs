namespace Hull.Core.Defects;

/// <summary>
/// The potential at one atom of the defect supercell and at the same atom of the bulk supercell (the caller pairs
/// them; the defect's own atoms have no partner and are left out).
/// </summary>
/// <param name="Fractional">The atom's position in the defect supercell, fractional coordinates.</param>
/// <param name="DefectCell">Potential at the atom in the defect supercell.</param>
/// <param name="BulkCell">Potential at the paired atom in the bulk supercell.</param>
public sealed record SitePotential(Vector3D Fractional, double DefectCell, double BulkCell);
