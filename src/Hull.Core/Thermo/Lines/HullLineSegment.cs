using Hull.Core.Chemistry;

namespace Hull.Core.Thermo.Lines;

/// <summary>
/// A stretch of a straight path S + s·D (s from <see cref="From"/> to <see cref="To"/>) that lies in one face of
/// the hull: the phases there and the slope of the hull energy along the path.
/// </summary>
/// <param name="From">Where the stretch starts (exact path parameter).</param>
/// <param name="To">Where it ends; null when it runs on without end.</param>
/// <param name="Phases">The phases with a share somewhere on the stretch, sorted by id.</param>
/// <param name="SlopeEvPerParameter">dG/ds of the hull energy G (axis eV, per the path's amounts) along the path:
/// Σ_k μ_k D_k with the facet's chemical potentials μ.</param>
/// <param name="ChemicalPotentialsEvPerAtom">One facet's chemical potentials (component order) on the stretch.</param>
public sealed record HullLineSegment(
    Rational From,
    Rational? To,
    IReadOnlyList<HullLinePhase> Phases,
    double SlopeEvPerParameter,
    IReadOnlyList<double> ChemicalPotentialsEvPerAtom)
{
    /// <summary>The hull energy (axis eV for the path's amounts) at parameter <paramref name="s"/> of the stretch.</summary>
    public double HullEnergyEvAt(Rational s)
    {
        double total = 0.0;
        foreach (HullLinePhase phase in Phases)
        {
            total += phase.UnitsAt(s).ToDouble() * phase.AxisAtomsPerFormulaUnit.ToDouble() * phase.Phase.AxisEnergyEvPerAtom;
        }

        return total;
    }
}
