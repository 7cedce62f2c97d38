using System.Globalization;
using System.Xml.Linq;

namespace Hull.Cli.Tests;

/// <summary>`hull demo` runs end to end over real gRPC on the repository's data-demo/.</summary>
public sealed class DemoTests
{
    [Fact]
    public async Task Demo_runs_every_analysis_and_reports()
    {
        string data = CliRun.RepositoryFile("data-demo");
        string figures = Path.Combine(Path.GetTempPath(), "hull-demo-figures-" + Guid.NewGuid().ToString("N")[..8]);
        var run = await CliRun.RunAsync("demo", "--data", data, "--figures", figures);
        Assert.True(run.ExitCode == 0, run.Err);
        Assert.Contains("Standard gRPC health check: SERVING", run.Out);
        Assert.Contains("A batch with a typo (LiCoQ2) is refused: InvalidArgument, entries[1].formula: unknown element 'Q' at character 5", run.Out);
        Assert.Contains("Dataset cathode-screen: 237 entries at version 3.", run.Out);
        Assert.Contains("hulls of Al-Co-Li-O, Co-Li-Mn-Ni-O", run.Out);
        Assert.Contains("04-rerelaxed-layered.csv -> version 4: 0 inserted, 16 replaced", run.Out);
        Assert.Contains("Version 3 answers exactly as before the replacement: yes", run.Out);
        Assert.Contains("Exported 237 entries", run.Out);
        Assert.Contains("Highest dmu_Al anywhere in the window", run.Out);
        foreach (string section in new[] { "7d. The Li-Co-O hull with oxygen open", "7e. Voltage profile", "7f. The coating question", "7g. Electrochemical windows", "7h. Stability with error bars" })
        {
            Assert.Contains(section, run.Out);
        }

        // LiCoO2's theoretical capacity at Δx = 1: 294.7 mAh/g of CoO2, 273.8 of LiCoO2 (common practice, from the molar masses).
        Assert.Contains("294.7 mAh/g of CoO2, 273.8 mAh/g of LiCoO2", run.Out);
        Assert.Contains("dataset cathodes-ml, version 1, system Co-Li-O: 4000 samples, seed 2026", run.Out);
        Assert.Contains("7i. Energy corrections", run.Out);
        Assert.Contains("dataset cathodes-mixed: version 2 derived from version 1 with correction set demo-mix v1; 7 of 9 entries moved", run.Out);
        Assert.Contains("Stable phases corrected (version 2, correction set demo-mix v1): Co, Co3O4-u, CoO-u, Li, Li2O, LiCo2O4-u, LiCoO2, O2", run.Out);
        foreach (string section in new[] { "1. Import", "2. Stability", "3. Stable phases", "4. Energy above hull", "5. Ad-hoc", "6. Hull energy", "7. The Li-Co-O hull", "7b. The layered-oxide triangle", "7c. Chemical-potential window", "8. Versions", "9. Export", "10. Phase diagrams" })
        {
            Assert.Contains(section, run.Out);
        }

        Assert.Contains("on the LiCoO2-LiNiO2-LiMnO2 hull", run.Out);
        Assert.Contains("Li-Co-Ni-Mn-O is refused: InvalidArgument", run.Out);
        Assert.Contains("11. Defects in the Al2O3 coating", run.Out);
        Assert.Contains("(host entry coat-Al2O3-corundum)", run.Out);
        Assert.Contains("Mg at its limit, set by dop-MgAl2O4-spinel", run.Out);
        Assert.Contains("The study exports byte for byte as imported: yes", run.Out);
        Assert.DoesNotContain("warning: the study's bulk", run.Out);
        Assert.True(File.Exists(Path.Combine(figures, "defects", "Al2O3-formation-energies-O-rich.svg")));
        Assert.Contains("grown at 1600 K and quenched to 300 K", run.Out);
        Assert.Contains("Mg solubility (site blocking)", run.Out);
        Assert.True(File.Exists(Path.Combine(figures, "defects", "Al2O3-carriers-O-rich.svg")));
        Assert.True(File.Exists(Path.Combine(figures, "defects", "Al2O3-carriers-O-rich-to-Al-rich.svg")));
        Assert.Contains("along the window from the O-rich to the Al-rich vertex", run.Out);
        Assert.Contains("12. Temperature and oxygen pressure: when does the delithiated cathode give off oxygen?", run.Out);
        Assert.Contains("decomposes above  LiCo2O4 -> 1/3 Co3O4 + LiCoO2", run.Out);
        Assert.Contains("released oxygen and hot cathodes are a fire hazard", run.Out);
        Assert.Contains("13. Curated versions", run.Out);
        Assert.Contains("version 2: curated from li-co-o-raw@1", run.Out);
        Assert.Contains("  1. drop_flagged {\"flag\":\"flagged\"}: 14 entries, 1 removed, 0 changed", run.Out);
        Assert.Contains("makes version 3 with the same content fingerprint: yes", run.Out);
        Assert.Contains("A misspelt field is refused: InvalidArgument, recipe step 2, field 'max_ev_per_atm'", run.Out);
        // A recipe applying step 7i's set: the version names it, in the record, the versions table and the answers.
        Assert.Contains("correct-then-clean.recipe.json on cathodes-mixed@1 (step 7i's mixture): version 3 holds 9 entries, corrected with demo-mix v1 from version 1.", run.Out);
        Assert.Contains("  1. apply_correction_set {\"set_name\":\"demo-mix\",\"set_version\":1}: 9 entries, 0 removed, 7 changed", run.Out);
        Assert.Contains("The same steps reversed are refused: InvalidArgument, recipe step 2, field 'set_name'", run.Out);
        Assert.Matches(@"\n +3 +[0-9: -]+ +9 +0 +9 +9 +curated from cathodes-mixed@1 +correct-then-clean\.recipe\.json +demo-mix v1 from version 1\r?\n", run.Out);
        Assert.Contains("Stable phases of version 3 (correction set demo-mix v1): Co, Co3O4-u, CoO-u, Li, Li2O, LiCo2O4-u, LiCoO2, O2", run.Out);
        try
        {
            string[] files = Directory.GetFiles(figures, "*.svg").Order(StringComparer.Ordinal).ToArray();
            Assert.Equal(
                ["binary-Li-O.svg", "odds-Li-Co-O.svg", "pseudo-ternary-layered-oxides.svg", "quaternary-Li-Co-Ni-O.svg",
                 "reaction-coat-Al2O3-corundum-ter-LiMn2O4-spinel.svg", "ternary-Li-Co-O.svg", "thermo-Li-Co-O-in-air.svg", "voltage-Li-into-CoO2.svg",
                 "window-ter-LiCoO2-r3m.svg"],
                files.Select(Path.GetFileName));
            // Profile figures (voltage, reaction) label only their plateaus or minimum; phase diagrams label every stable phase.
            foreach (string file in files)
            {
                string name = Path.GetFileName(file);
                AssertNoLabelOverlaps(XDocument.Load(file), name, name.StartsWith("voltage-", StringComparison.Ordinal) || name.StartsWith("reaction-", StringComparison.Ordinal) || name.StartsWith("thermo-", StringComparison.Ordinal) ? 1 : 3);
            }
        }
        finally
        {
            Directory.Delete(figures, recursive: true);
        }
    }

    /// <summary>
    /// No two labels of a figure overlap. A label's box is estimated from its text: 0.6 em per character (0.72 of
    /// that in subscripts), the capital height above the baseline and the subscript drop below (common practice
    /// for a sans-serif font).
    /// </summary>
    private static void AssertNoLabelOverlaps(XDocument svg, string name, int minimumLabels)
    {
        var boxes = svg.Descendants().Where(e => e.Name.LocalName == "text" && (string?)e.Attribute("data-kind") == "label").Select(e =>
        {
            double size = double.Parse((string)e.Attribute("font-size")!, CultureInfo.InvariantCulture);
            double x = double.Parse((string)e.Attribute("x")!, CultureInfo.InvariantCulture);
            double y = double.Parse((string)e.Attribute("y")!, CultureInfo.InvariantCulture);
            double width = e.Nodes().Sum(n => n is XText t ? t.Value.Length * 0.6 * size
                : n is XElement tspan ? tspan.Value.Length * 0.6 * size * (tspan.Attribute("font-size") is null ? 1 : 0.72) : 0);
            return (Id: (string)e.Attribute("data-id")!, Left: x, Top: y - 0.75 * size, Right: x + width, Bottom: y + 0.4 * size);
        }).ToArray();
        Assert.True(boxes.Length >= minimumLabels, $"{name} has {boxes.Length} labels");
        for (int i = 0; i < boxes.Length; i++)
        {
            for (int j = i + 1; j < boxes.Length; j++)
            {
                var (a, b) = (boxes[i], boxes[j]);
                bool overlap = a.Left < b.Right && b.Left < a.Right && a.Top < b.Bottom && b.Top < a.Bottom;
                Assert.False(overlap, $"{name}: the labels of {a.Id} and {b.Id} overlap");
            }
        }
    }
}
