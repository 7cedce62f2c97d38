namespace Hull.Core.Defects;

/// <summary>Every vertex solved at one growth temperature.</summary>
/// <param name="TemperatureK">T (K).</param>
/// <param name="PerVertex">One per extended vertex, in vertex order.</param>
/// <param name="MostSolubleVertex">The converged vertex with the highest dopant total (lowest index on ties); −1 when none converged.</param>
public sealed record SolubilityAtTemperature(double TemperatureK, IReadOnlyList<VertexSolubility> PerVertex, int MostSolubleVertex)
{
    /// <summary>The highest dopant total (cm^-3), NaN when no vertex converged.</summary>
    public double MaxDopantPerCubicCentimetre => MostSolubleVertex < 0 ? double.NaN : PerVertex[MostSolubleVertex].DopantPerCubicCentimetre;
}
