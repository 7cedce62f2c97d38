using Hull.Core.Defects;

namespace Hull.Core.Tests.Defects;

/// <summary>
/// A constructed study worked by hand (see <see cref="FormationEnergyTests"/>): a rock-salt host Mg32O32 in a
/// 10 Å cubic cell, ε = 10, point model charge, so E_lat(q) = q²·c with c = α e²/(4πε₀)/(2εL) and the published
/// simple-cubic α = 2.8373 (Leslie &amp; Gillan 1985). Supercell energies are chosen so the intercepts
/// a_q = E_f(q; E_F = 0) come out as round numbers.
/// </summary>
internal static class WorkedDefectStudy
{
    public const double L = 10.0, Epsilon = 10.0, BulkEnergy = -400.0, Vbm = 2.0, Gap = 6.0;

    // Leslie & Gillan 1985: simple cubic Madelung constant 2.8373
    public static readonly double C = 2.8373 * PhysicalConstants.CoulombEvAngstrom / (2 * Epsilon * L);

    public static readonly Dictionary<string, double> References = new() { ["O"] = -4.9, ["Mg"] = -1.5, ["Li"] = -1.9 };

    public static readonly ChemicalPotentialPoint Point = new("hand", new Dictionary<string, double> { ["O"] = -1.0, ["Mg"] = -5.0, ["Li"] = -2.5 });

    // Target intercepts a_q (eV).
    public static readonly Dictionary<int, double> VacancyIntercepts = new() { [2] = 1.0, [1] = 3.5, [0] = 5.0 };
    public static readonly Dictionary<int, double> DopantIntercepts = new() { [0] = 2.0, [-1] = 8.5 };
    public static readonly Dictionary<int, double> ComplexIntercepts = new() { [1] = 5.0, [0] = 6.2 };

    public static BulkSupercell Bulk(DielectricTensor? dielectric = null, LatticeCell? lattice = null) => new(
        "MgO", 32, new Dictionary<string, int> { ["Mg"] = 32, ["O"] = 32 }, BulkEnergy,
        lattice ?? LatticeCell.Create(new(L, 0, 0), new(0, L, 0), new(0, 0, L)), Vbm, Gap, dielectric ?? DielectricTensor.Scalar(Epsilon));

    /// <summary>E(X^q) that gives intercept a: a = E − E_bulk − Σn(μ_ref + Δμ) + q E_VBM + q²c.</summary>
    public static double Energy(double a, int q, IReadOnlyDictionary<string, int> atoms)
    {
        double reservoir = atoms.Sum(p => p.Value * (References[p.Key] + Point.DeltaMuEv[p.Key]));
        return a + BulkEnergy + reservoir - q * Vbm - q * q * C;
    }

    public static readonly Dictionary<string, int> VacancyAtoms = new() { ["O"] = -1 };
    public static readonly Dictionary<string, int> DopantAtoms = new() { ["Li"] = 1, ["Mg"] = -1 };
    public static readonly Dictionary<string, int> ComplexAtoms = new() { ["Li"] = 1, ["Mg"] = -1, ["O"] = -1 };

    public static DefectInput Defect(string name, DefectKind kind, Dictionary<string, int> atoms, Dictionary<int, double> intercepts, IReadOnlyList<string>? parts = null) =>
        new(name, kind, atoms, kind == DefectKind.Vacancy ? "O" : "Mg", SiteDensity.PerFormulaUnit(1), 1, new(0.5, 0.5, 0.5),
            [.. intercepts.Select(p => new ChargeStateInput(p.Key, Energy(p.Value, p.Key, atoms)))], parts);

    public static List<DefectInput> Defects() =>
    [
        Defect("V_O", DefectKind.Vacancy, VacancyAtoms, VacancyIntercepts),
        Defect("Li_Mg", DefectKind.Substitution, DopantAtoms, DopantIntercepts),
        Defect("V_O+Li_Mg", DefectKind.Complex, ComplexAtoms, ComplexIntercepts, ["V_O", "Li_Mg"]),
    ];

    public static DefectStudy Study() => DefectStudy.Create(Bulk(), Defects(), ModelCharge.Point);

    /// <summary>1 site per formula unit, 32 formula units in (10 Å)³: 3.2e22 cm^-3.</summary>
    public const double SitesPerCubicCentimetre = 32 / (L * L * L * 1e-24);

    /// <summary>
    /// The study's defects at another point, by hand from the target intercepts: a_q − Σ n_i (Δμ_i − Δμ_i^hand),
    /// degeneracy 1, for references that must not go through the formation-energy code.
    /// </summary>
    public static DefectEnsemble HandEnsemble(IReadOnlyDictionary<string, double> deltaMu)
    {
        SpeciesChargeState[] Shift(Dictionary<int, double> a, Dictionary<string, int> atoms) =>
            [.. a.OrderByDescending(p => p.Key).Select(p => new SpeciesChargeState(p.Key, p.Value - atoms.Sum(n => n.Value * (deltaMu[n.Key] - Point.DeltaMuEv[n.Key])), 1))];
        return DefectEnsemble.Create(Gap,
        [
            new("V_O", "O", SitesPerCubicCentimetre, Shift(VacancyIntercepts, VacancyAtoms), VacancyAtoms),
            new("Li_Mg", "Mg", SitesPerCubicCentimetre, Shift(DopantIntercepts, DopantAtoms), DopantAtoms),
            new("V_O+Li_Mg", "Mg", SitesPerCubicCentimetre, Shift(ComplexIntercepts, ComplexAtoms), ComplexAtoms),
        ]);
    }
}
