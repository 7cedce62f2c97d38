namespace Hull.Core.Figures;

/// <summary>A drawn window map.</summary>
/// <param name="Svg">The SVG document.</param>
/// <param name="Dimension">The drawn region's dimension: 2 a polygon, 1 a segment, 0 a point, −1 nothing (no window, or a section that misses).</param>
/// <param name="DrawnLineIds">Ids of the phases (and element symbols) whose lines are drawn, in drawing order.</param>
/// <param name="LinesLeftOut">Competing phases whose lines cross the plot but were left out (the nearest ones are drawn).</param>
/// <param name="CrowdedLabels">Labels that found no free place (drawn at their first place anyway).</param>
public sealed record WindowFigureResult(string Svg, int Dimension, IReadOnlyList<string> DrawnLineIds, int LinesLeftOut, int CrowdedLabels);
