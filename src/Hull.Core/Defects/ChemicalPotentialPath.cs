namespace Hull.Core.Defects;

/// <summary>
/// Evenly spaced points on the straight segment between two chemical-potential points (e.g. two window vertices;
/// a window is convex, so every point between two of its vertices is in it), for sweeps along Δμ.
/// </summary>
public static class ChemicalPotentialPath
{
    /// <summary>
    /// <paramref name="points"/> points from <paramref name="from"/> to <paramref name="to"/> inclusive, each labelled
    /// with its fraction of the way; both ends must give Δμ for the same elements.
    /// </summary>
    public static IReadOnlyList<(double Fraction, ChemicalPotentialPoint Point)> Between(ChemicalPotentialPoint from, ChemicalPotentialPoint to, int points)
    {
        if (points < 2) throw new DefectInputException("points", $"a path needs at least its two ends, not {points} points");
        var elements = from.DeltaMuEv.Keys.Order(StringComparer.Ordinal).ToArray();
        if (!elements.SequenceEqual(to.DeltaMuEv.Keys.Order(StringComparer.Ordinal)))
        {
            throw new DefectInputException("to", $"the ends give Δμ for different elements ({string.Join(", ", elements)} against {string.Join(", ", to.DeltaMuEv.Keys.Order(StringComparer.Ordinal))})");
        }

        var path = new List<(double, ChemicalPotentialPoint)>(points);
        for (int k = 0; k < points; k++)
        {
            double f = (double)k / (points - 1);
            var deltaMu = elements.ToDictionary(e => e, e => k == points - 1 ? to.DeltaMuEv[e] : from.DeltaMuEv[e] + f * (to.DeltaMuEv[e] - from.DeltaMuEv[e]), StringComparer.Ordinal);
            path.Add((f, new ChemicalPotentialPoint($"{from.Label} → {to.Label} at {f:0.###}", deltaMu)));
        }

        return path;
    }
}
