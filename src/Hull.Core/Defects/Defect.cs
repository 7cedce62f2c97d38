namespace Hull.Core.Defects;

/// <summary>A checked defect of a study: its atoms, sites, degeneracy and corrected charge states (highest q first).</summary>
public sealed class Defect
{
    internal Defect(int index, DefectInput input, IReadOnlyDictionary<string, int> atoms, IReadOnlyList<CorrectedChargeState> states)
    {
        Index = index;
        Name = input.Name;
        Kind = input.Kind;
        AtomsExchanged = atoms;
        SiteSet = input.SiteSet;
        Sites = input.Sites;
        Degeneracy = input.Degeneracy;
        PositionFractional = input.PositionFractional;
        ChargeStates = states;
        Constituents = input.Constituents ?? [];
    }

    /// <summary>Position in the study's defect list.</summary>
    public int Index { get; }

    public string Name { get; }

    public DefectKind Kind { get; }

    /// <summary>n_i per element (added &gt; 0, removed &lt; 0), zero entries dropped, in ordinal element order.</summary>
    public IReadOnlyDictionary<string, int> AtomsExchanged { get; }

    public string SiteSet { get; }

    public SiteDensity Sites { get; }

    public double Degeneracy { get; }

    public Vector3D PositionFractional { get; }

    /// <summary>Charge states, highest charge first.</summary>
    public IReadOnlyList<CorrectedChargeState> ChargeStates { get; }

    /// <summary>Names of the parts of a complex; empty otherwise.</summary>
    public IReadOnlyList<string> Constituents { get; }

    public CorrectedChargeState? State(int charge) => ChargeStates.FirstOrDefault(s => s.Charge == charge);
}
