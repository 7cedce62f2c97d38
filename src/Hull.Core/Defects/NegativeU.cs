namespace Hull.Core.Defects;

/// <summary>
/// U = E_f(q+1) + E_f(q−1) − 2E_f(q) (independent of E_F and Δμ); negative when the defect gains by giving one
/// state's electron to another, so q is never the lowest state and ε(q+1/q−1) is a two-electron level.
/// </summary>
/// <param name="Defect">The defect's name.</param>
/// <param name="Charge">The middle charge q.</param>
/// <param name="UEv">U (eV).</param>
public sealed record NegativeU(string Defect, int Charge, double UEv)
{
    public bool IsNegative => UEv < 0;
}
