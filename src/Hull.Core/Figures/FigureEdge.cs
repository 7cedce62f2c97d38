namespace Hull.Core.Figures;

/// <summary>An edge of the hull between two stable phases (a tie-line), by their ids.</summary>
public sealed record FigureEdge(string FirstId, string SecondId);
