namespace Hull.Store.Tests;

/// <summary>Row makers and exact comparisons for the tests.</summary>
internal static class Rows
{
    public static EntryRow Make(string id, double energyEv = -1.25, string formula = "Fe3O4",
        string basis = "total_per_formula_unit", string metadata = "") =>
        new(id, formula, energyEv, basis, metadata);

    public static IReadOnlyList<EntryRow> Many(string prefix, int count, double offsetEv = 0) =>
        Enumerable.Range(0, count).Select(i => Make($"{prefix}{i:D6}", -1.0 - i * 0.001 + offsetEv)).ToList();

    /// <summary>Equal row by row, with energies compared bit for bit (record equality would let 0.0 equal -0.0).</summary>
    public static void AssertSame(IReadOnlyList<EntryRow> expected, IReadOnlyList<EntryRow> actual, string context = "")
    {
        if (expected.Count != actual.Count) Assert.Fail($"{context}: expected {expected.Count} rows, got {actual.Count}");
        for (int i = 0; i < expected.Count; i++)
        {
            EntryRow e = expected[i], a = actual[i];
            // Messages are built only on failure: these loops run over millions of rows.
            if (e != a) Assert.Fail($"{context}: row {i} differs: expected {e}, got {a}");
            if (BitConverter.DoubleToInt64Bits(e.EnergyEv) != BitConverter.DoubleToInt64Bits(a.EnergyEv))
            {
                Assert.Fail($"{context}: row {i} ('{e.Id}') energy bits differ: {e.EnergyEv:R} vs {a.EnergyEv:R}");
            }
        }
    }

    /// <summary>Rows sorted the way the store returns them.</summary>
    public static List<EntryRow> Sorted(IEnumerable<EntryRow> rows)
    {
        var list = rows.ToList();
        list.Sort((a, b) => EntryIdOrder.Comparer.Compare(a.Id, b.Id));
        return list;
    }
}
