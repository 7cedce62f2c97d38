namespace Hull.Core.Figures;

/// <summary>One defect of a formation-energy figure: its charge states' formation energies at E_F = 0 (the VBM).</summary>
/// <param name="Defect">The defect's name.</param>
/// <param name="InterceptsEv">Charge q → E_f(q; E_F = 0), eV at the figure's chemical-potential point.</param>
public sealed record DefectFigureLine(string Defect, IReadOnlyDictionary<int, double> InterceptsEv);
