namespace Hull.Core.Defects;

/// <summary>
/// The image-charge (lattice) correction of one charge state: E_lat = E_isolated − E_periodic of the model
/// charge in the medium, to be added to the supercell energy; +q²α/(2εL) for a point charge in a cubic cell.
/// </summary>
/// <param name="CorrectionEv">E_lat (eV).</param>
/// <param name="SplittingPerAngstrom">The Ewald splitting parameter used (vacuum frame, Å⁻¹).</param>
/// <param name="RealSpaceTerms">Lattice vectors summed in real space.</param>
/// <param name="ReciprocalTerms">Reciprocal vectors summed.</param>
public sealed record ImageChargeEnergy(double CorrectionEv, double SplittingPerAngstrom, int RealSpaceTerms, int ReciprocalTerms);
