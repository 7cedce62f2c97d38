namespace Hull.Core.Figures;

/// <summary>A drawn figure: the SVG text and what it shows.</summary>
/// <param name="Svg">The SVG document (UTF-8 text).</param>
/// <param name="Kind">Binary, ternary or quaternary.</param>
/// <param name="StablePhaseCount">Stable phases drawn.</param>
/// <param name="EdgeCount">Hull edges (tie-lines) drawn.</param>
/// <param name="UnstableShownCount">Unstable entries drawn (within the cut-off).</param>
/// <param name="HiddenAboveCutoffCount">Unstable entries left out above the cut-off.</param>
public sealed record FigureResult(string Svg, FigureKind Kind, int StablePhaseCount, int EdgeCount, int UnstableShownCount, int HiddenAboveCutoffCount);
