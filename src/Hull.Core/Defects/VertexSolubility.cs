namespace Hull.Core.Defects;

/// <summary>The self-consistent solve at one vertex and temperature, and the dopant it dissolves.</summary>
/// <param name="VertexIndex">Which extended vertex.</param>
/// <param name="Solution">Fermi level and every concentration there.</param>
/// <param name="DopantPerCubicCentimetre">Σ over defects of n_X × total (cm^-3).</param>
public sealed record VertexSolubility(int VertexIndex, FermiLevelSolution Solution, double DopantPerCubicCentimetre);
