namespace Hull.Core.Windows;

/// <summary>A vertex of the drawn window (or section): its map coordinates and its full point. Immutable.</summary>
/// <param name="X">Δμ of the map's x element, eV.</param>
/// <param name="Y">Δμ of the map's y element, eV.</param>
/// <param name="Vertex">The vertex with every potential and its limiting phases.</param>
public sealed record WindowMapVertex(double X, double Y, WindowVertex Vertex);
