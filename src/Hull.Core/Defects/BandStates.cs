namespace Hull.Core.Defects;

/// <summary>
/// Where the free carriers' states are: a parabolic-band model (<see cref="ParabolicBands"/>) or a tabulated density
/// of states (<see cref="TabulatedBands"/>). Densities come out as logarithms (ln cm^-3) so that a Fermi level deep
/// in the gap at a low temperature still gives a finite, comparable number.
/// </summary>
public abstract class BandStates
{
    private protected BandStates()
    {
    }

    /// <summary>ln n (n in cm^-3) at Fermi level <paramref name="fermiLevelEv"/> (eV above the study's VBM).</summary>
    public abstract double LogElectrons(double fermiLevelEv, double temperatureK, BandEdges edges, CarrierStatistics statistics);

    /// <summary>ln p (p in cm^-3).</summary>
    public abstract double LogHoles(double fermiLevelEv, double temperatureK, BandEdges edges, CarrierStatistics statistics);

    /// <summary>Checks the model against the study's gap; throws <see cref="DefectInputException"/> naming the field.</summary>
    internal abstract void Check(double bandGapEv, string field);
}
