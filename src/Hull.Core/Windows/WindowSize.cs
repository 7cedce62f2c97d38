namespace Hull.Core.Windows;

/// <summary>
/// The size of a window of dimension k: its k-dimensional measure in its own affine hull (the equality hyperplane
/// for a full window), in eV^k, and the measure of its projection on k of the potentials, named.
/// </summary>
public sealed class WindowSize
{
    internal WindowSize(int dimension, double inPlane, double projected, IReadOnlyList<string> projectionElements)
    {
        Dimension = dimension;
        MeasureInPlaneEvPowK = inPlane;
        ProjectedMeasureEvPowK = projected;
        ProjectionElements = projectionElements;
    }

    /// <summary>k, the affine dimension of the window's vertices.</summary>
    public int Dimension { get; }

    /// <summary>k-dimensional measure within the window's own affine hull (eV^k).</summary>
    public double MeasureInPlaneEvPowK { get; }

    /// <summary>Measure of the projection on <see cref="ProjectionElements"/>' potentials (eV^k).</summary>
    public double ProjectedMeasureEvPowK { get; }

    /// <summary>The k potentials the projection keeps.</summary>
    public IReadOnlyList<string> ProjectionElements { get; }
}
