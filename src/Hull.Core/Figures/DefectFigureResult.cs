namespace Hull.Core.Figures;

/// <summary>A drawn formation-energy figure.</summary>
/// <param name="Svg">The SVG document.</param>
/// <param name="DefectCount">Defects drawn.</param>
/// <param name="MarkedLevelCount">Thermodynamic transition levels marked inside the drawn range.</param>
public sealed record DefectFigureResult(string Svg, int DefectCount, int MarkedLevelCount);
