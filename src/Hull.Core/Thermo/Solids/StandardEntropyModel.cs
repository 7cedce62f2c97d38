using System.Globalization;
using Hull.Core.Chemistry;
using Hull.Core.Thermo.Gases;

namespace Hull.Core.Thermo.Solids;

/// <summary>
/// The Ellingham approximation for one solid: a standard entropy S° per formula unit (J/(mol K)), with H and S held
/// constant in T, so G(T) = H(anchor) − T S°. The entropy is the solid's own (solid elements carry theirs too); the
/// gas an oxide gives off enters only through its μ(T, p).
/// </summary>
public sealed record StandardEntropyModel : SolidTemperatureModel
{
    /// <exception cref="ThermoInputException">An entropy that is negative or not finite.</exception>
    public StandardEntropyModel(Composition formula, double entropyJPerMolK, string? source = null)
        : base(formula, source)
    {
        if (!double.IsFinite(entropyJPerMolK) || entropyJPerMolK < 0)
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"The standard entropy of {formula.Formula} must be finite and not negative; got {entropyJPerMolK} J/(mol K)."));
        }

        EntropyJPerMolK = entropyJPerMolK;
    }

    /// <summary>S° per formula unit of <see cref="SolidTemperatureModel.Formula"/>, J/(mol K).</summary>
    public double EntropyJPerMolK { get; }

    /// <summary>S° per atom, eV/K.</summary>
    public double EntropyEvPerKPerAtom =>
        EntropyJPerMolK / 1000.0 / PhysicalConstants.KilojoulesPerMolPerEv / Formula.AtomsPerFormulaUnit.ToDouble();

    public override bool IsLinearInTemperature => true;

    public override (double FromK, double ToK) TemperatureRangeK => (0.0, double.PositiveInfinity);

    public override double FreeEnergyAboveAnchorEvPerAtom(double temperatureK, string entryId) => -temperatureK * EntropyEvPerKPerAtom;

    public override string Describe() =>
        string.Create(CultureInfo.InvariantCulture, $"S° = {EntropyJPerMolK:G6} J/(mol K) per {Formula.Formula}");
}
