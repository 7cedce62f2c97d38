namespace Hull.Core.Defects;

/// <summary>
/// Binding energy of a complex in charge state q against its isolated parts: Σ E_f(part_i^{q_i}) − E_f(complex^q)
/// with Σ q_i = q, for the parts' charges that cost least; positive when the complex is bound. Charge and atoms are
/// conserved, so it depends neither on E_F nor on Δμ.
/// </summary>
/// <param name="Complex">The complex's name.</param>
/// <param name="Charge">q of the complex.</param>
/// <param name="Parts">The parts and the charge chosen for each.</param>
/// <param name="BindingEnergyEv">Σ E_f(parts) − E_f(complex) (eV).</param>
public sealed record ComplexBinding(string Complex, int Charge, IReadOnlyList<(string Defect, int Charge)> Parts, double BindingEnergyEv);
