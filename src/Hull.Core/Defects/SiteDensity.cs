namespace Hull.Core.Defects;

/// <summary>How many sites a defect can occupy: per formula unit of the host, or per cm³.</summary>
public sealed record SiteDensity
{
    private SiteDensity(double value, bool perFormulaUnit)
    {
        Value = value;
        IsPerFormulaUnit = perFormulaUnit;
    }

    /// <summary>Sites per formula unit (e.g. 1 for the O site of ZnO, 3 for the O sites of Al2O3).</summary>
    public static SiteDensity PerFormulaUnit(double sites) => new(sites, perFormulaUnit: true);

    /// <summary>Sites per cm³.</summary>
    public static SiteDensity PerCubicCentimetre(double sites) => new(sites, perFormulaUnit: false);

    public double Value { get; }

    public bool IsPerFormulaUnit { get; }

    /// <summary>Sites per cm³, given the host's formula units per bulk supercell and its volume (Å³).</summary>
    public double SitesPerCubicCentimetre(int formulaUnitsPerCell, double cellVolumeCubicAngstrom) =>
        IsPerFormulaUnit ? Value * formulaUnitsPerCell / (cellVolumeCubicAngstrom * 1e-24) : Value;
}
