namespace Hull.Core.Defects;

/// <summary>The band edges at one temperature, in eV above the study's VBM (they differ from 0 and E_g when the gap moves with T).</summary>
public sealed record BandEdges(double ValenceEv, double ConductionEv)
{
    public double GapEv => ConductionEv - ValenceEv;
}
