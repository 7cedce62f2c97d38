namespace Hull.Core.Windows;

/// <summary>Sizes and per-element extremes of a window from its vertices.</summary>
internal static class WindowMeasures
{
    public static WindowSize Size(IReadOnlyList<PolytopeVertex> vertices, IReadOnlyList<int> free, IReadOnlyList<string> elements)
    {
        var points = vertices.Select(v => v.Coordinates).ToArray();
        int dimension = PolytopeMeasure.AffineDimension(points);
        var tight = vertices.Select(TightIds).ToArray();
        double inPlane = PolytopeMeasure.Measure(points, tight, dimension);
        double projected = 0;
        IReadOnlyList<string> kept = free.Select(i => elements[i]).ToArray();
        if (dimension == free.Count)
        {
            var projectedPoints = points.Select(p => (IReadOnlyList<double>)free.Select(i => p[i]).ToArray()).ToArray();
            projected = PolytopeMeasure.Measure(projectedPoints, tight, dimension);
        }

        return new WindowSize(dimension, inPlane, projected, kept);
    }

    /// <summary>Inequality labels as they are; bounds as negative ids (−1 − 2·coordinate, −2 − 2·coordinate).</summary>
    public static IReadOnlyList<int> TightIds(PolytopeVertex v) =>
        v.TightLabels
            .Concat(v.TightLowerBounds.Select(i => -1 - 2 * i))
            .Concat(v.TightUpperBounds.Select(i => -2 - 2 * i))
            .ToArray();

    public static IReadOnlyList<ElementExtremes> Extremes(IReadOnlyList<WindowVertex> vertices, IReadOnlyList<string> elements)
    {
        var result = new ElementExtremes[elements.Count];
        for (int i = 0; i < elements.Count; i++)
        {
            double high = vertices.Max(v => v.ChemicalPotentialsEv[i]);
            double low = vertices.Min(v => v.ChemicalPotentialsEv[i]);
            int[] highAt = Enumerable.Range(0, vertices.Count)
                .Where(k => vertices[k].ChemicalPotentialsEv[i] >= high - PolytopeTolerances.SlackEv).ToArray();
            int[] lowAt = Enumerable.Range(0, vertices.Count)
                .Where(k => vertices[k].ChemicalPotentialsEv[i] <= low + PolytopeTolerances.SlackEv).ToArray();
            result[i] = new ElementExtremes(elements[i], high, low, highAt, lowAt);
        }

        return result;
    }
}
