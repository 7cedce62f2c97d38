namespace Hull.Core.Defects;

/// <summary>How free carriers occupy the bands.</summary>
public enum CarrierStatistics
{
    /// <summary>Fermi–Dirac occupation: right also when the Fermi level nears or enters a band.</summary>
    FermiDirac = 0,

    /// <summary>The Boltzmann limit e^{−(E−E_F)/k_BT}: the closed forms of textbooks, wrong within a few k_BT of a band edge.</summary>
    Boltzmann = 1,
}
