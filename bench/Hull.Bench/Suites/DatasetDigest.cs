#if HAS_THERMO
using System.Globalization;
using System.Security.Cryptography;
using System.Text;
using Hull.Core.Thermo;

namespace Hull.Bench.Suites;

/// <summary>
/// A digest of every answer of a dataset analysis (each entry's energies, vertex status, decomposition with its
/// exact coefficients, and each hull's coverage), printed to the last digit: two builds that print the same digest
/// gave the same answers, not only the same totals.
/// </summary>
public static class DatasetDigest
{
    public static string Of(DatasetStabilityResult result)
    {
        var text = new StringBuilder();
        foreach (EntryStability e in result.Entries)
        {
            text.Append(CultureInfo.InvariantCulture, $"{e.Id}|{e.RowIndex}|{e.HullSystem}|{e.AxisEnergyEvPerAtom:R}|{e.FormationEnergyEvPerAtom:R}|{e.EnergyAboveHullEvPerAtom:R}|{e.IsHullVertex}|{e.DecompositionEnergyEvPerAtom:R}|");
            foreach (double x in e.ComponentAtomFractions) text.Append(CultureInfo.InvariantCulture, $"{x:R},");
            text.Append(CultureInfo.InvariantCulture, $"|{e.Decomposition.HullEnergyEvPerAtom:R}|");
            foreach (DecompositionProduct p in e.Decomposition.Products)
            {
                text.Append(CultureInfo.InvariantCulture, $"{p.Phase.Id}:{p.AtomFraction:R}:{p.FormulaUnits:R}:{p.ExactFormulaUnits};");
            }
            text.Append('\n');
        }
        foreach (SystemCoverage c in result.Coverage)
        {
            text.Append(CultureInfo.InvariantCulture, $"{c.HullSystem}|{c.EntryCount}|{c.CompoundEntryCount}|");
            foreach (ComponentCoverage k in c.Components) text.Append(CultureInfo.InvariantCulture, $"{k.Name}:{k.PureEntryCount}:{k.Reference?.Symbol};");
            text.Append('\n');
        }
        foreach (string h in result.HullSystems) text.Append(h).Append('\n');
        return Convert.ToHexString(SHA256.HashData(Encoding.UTF8.GetBytes(text.ToString())))[..16];
    }
}
#endif
