namespace Hull.Core.Defects;

/// <summary>Constants of nature used by the defect module.</summary>
public static class PhysicalConstants
{
    /// <summary>e²/(4πε₀) in eV·Å (CODATA 2018: 14.399 645 478 eV·Å).</summary>
    public const double CoulombEvAngstrom = 14.399645478;
}
