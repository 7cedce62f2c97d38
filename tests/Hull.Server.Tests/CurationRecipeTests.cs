using Hull.Server.Curation;
using Hull.Server.Tests.Support;
using Hull.Store;

namespace Hull.Server.Tests;

/// <summary>
/// Curation recipes: each step kind on a small hand-worked set, the per-step record, reproducibility by content
/// fingerprint, the recipe file read back, and refusals that name the step and field.
/// </summary>
public sealed class CurationRecipeTests
{
    private const string Formation = "formation_per_atom";

    // A Li-O binary on the formation-energy axis. Hand-worked (common practice: the lower hull of formation energy
    // per atom against the O fraction x): Li (0), Li2O at x = 1/3 with -2.0, O (0). Li2O2 at x = 1/2 lies -1.2, and
    // the tie-line Li2O-O there is -2.0 * (1 - 1/2) / (1 - 1/3) = -1.5, so it is 0.3 eV/atom above the hull; LiO3 at
    // x = 3/4 lies -0.4 against the tie-line's -2.0 * (1/4) / (2/3) = -0.75, so 0.35 above.
    private static readonly EntryRow[] Rows =
    [
        new("li", "Li", 0.0, Formation),
        new("o", "O2", 0.0, Formation),
        new("li2o-a", "Li2O", -2.0, Formation, "source=lab-a"),
        new("li2o-b", "Li4O2", -1.9, Formation, "source=lab-b"),
        new("li2o2", "Li2O2", -1.2, Formation, "source=lab-b"),
        new("lio3", "LiO3", -0.4, Formation, "flagged, source=lab-a"),
        new("bad", "LiO", 40.0, Formation),
        new("fe", "Fe", 0.0, Formation),
    ];

    private static CurationRun Run(string steps) =>
        CurationRun.Apply(CurationRecipe.Parse($$"""{"recipe_schema": 1, "steps": [{{steps}}]}"""), Rows);

    private static string[] Ids(CurationRun run) => run.Rows.Select(r => r.Id).ToArray();

    [Fact]
    public void Each_step_kind_removes_what_it_names()
    {
        Assert.DoesNotContain("lio3", Ids(Run("""{"kind": "drop_flagged"}""")));
        Assert.Equal(7, Run("""{"kind": "drop_flagged", "flag": "flagged"}""").Rows.Count);
        Assert.DoesNotContain("bad", Ids(Run("""{"kind": "drop_energy_outside", "max_ev_per_atom": 5}""")));
        Assert.Equal(["bad"], Ids(Run("""{"kind": "drop_energy_outside", "min_ev_per_atom": 5}""")));
        // Li2O and Li4O2 reduce to one composition: the lower per atom (-2.0) stays.
        string[] lowest = Ids(Run("""{"kind": "keep_lowest_duplicate"}"""));
        Assert.Contains("li2o-a", lowest);
        Assert.DoesNotContain("li2o-b", lowest);
        Assert.Equal(["li", "o", "li2o-b", "li2o2", "bad", "fe"], Ids(Run("""{"kind": "drop_source", "source": "lab-a"}""")));
        Assert.DoesNotContain("fe", Ids(Run("""{"kind": "keep_elements", "elements": ["O", "Li"]}""")));
        Assert.Equal(["fe"], Ids(Run("""{"kind": "keep_elements", "elements": ["Fe"]}""")));
    }

    [Fact]
    public void Above_hull_step_matches_the_hand_worked_binary()
    {
        // 0.3 (Li2O2) <= 0.32 < 0.35 (LiO3): only LiO3 and the far-off LiO go; Li4O2 (0.1 above) stays.
        string[] kept = Ids(Run("""{"kind": "drop_above_hull", "max_ev_per_atom": 0.32}"""));
        Assert.Equal(["li", "o", "li2o-a", "li2o-b", "li2o2", "fe"], kept);
        string[] tight = Ids(Run("""{"kind": "drop_above_hull", "max_ev_per_atom": 0.29}"""));
        Assert.DoesNotContain("li2o2", tight);
        Assert.Contains("li2o-b", tight);
    }

    [Fact]
    public void Above_hull_step_measures_total_energies_from_the_source_versions_references()
    {
        // Total energies per formula unit; hand-worked in CurationServiceTests (common practice): with mu_Li = -1.9
        // and mu_O = -4.9 eV/atom, Li2O2 lies 0.3 eV/atom above the Li2O-O tie-line.
        EntryRow[] source =
        [
            new("li-a", "Li", -1.9, "total_per_formula_unit", "flagged"),
            new("o2", "O2", -9.8, "total_per_formula_unit"),
            new("li2o", "Li2O", -15.0, "total_per_formula_unit"),
            new("li2o2", "Li2O2", -18.7, "total_per_formula_unit"),
        ];
        CurationRecipe recipe = CurationRecipe.Parse("""
            {"recipe_schema": 1, "steps": [{"kind": "drop_flagged"}, {"kind": "drop_above_hull", "max_ev_per_atom": 0.1}]}
            """);
        Assert.Equal(["o2", "li2o"], CurationRun.Apply(recipe, source).Rows.Select(r => r.Id));

        // A source without any pure-Li total energy gives Li no reference: nothing of Li can be placed, so nothing is dropped.
        CurationRun unplaced = CurationRun.Apply(recipe, source[1..]);
        Assert.Equal(["o2", "li2o", "li2o2"], unplaced.Rows.Select(r => r.Id));
        Assert.Equal(0, unplaced.Records[1].Removed);
    }

    [Fact]
    public void Records_count_each_step_and_a_rerun_gives_the_same_fingerprint()
    {
        const string steps = """
            {"kind": "drop_flagged"}, {"kind": "drop_energy_outside", "min_ev_per_atom": -10, "max_ev_per_atom": 10},
            {"kind": "keep_lowest_duplicate"}, {"kind": "keep_elements", "elements": ["Li", "O"]}
            """;
        CurationRun first = Run(steps);
        Assert.Equal([1, 1, 1, 1], first.Records.Select(r => r.Removed));
        Assert.Equal([8, 7, 6, 5], first.Records.Select(r => r.EntriesBefore));
        Assert.Equal(4, first.Rows.Count);

        // The recipe written out and read back runs to the same content.
        string written = CurationRecipe.Parse($$"""{"recipe_schema": 1, "steps": [{{steps}}]}""").ToJson();
        CurationRun again = CurationRun.Apply(CurationRecipe.Parse(written), Rows);
        Assert.Equal(ContentFingerprint.Compute(first.Rows), ContentFingerprint.Compute(again.Rows));
        Assert.Equal(written, CurationRecipe.Parse(written).ToJson());
    }

    [Fact]
    public void A_derived_version_written_twice_from_its_recipe_has_one_fingerprint()
    {
        // Both derivations read the stored source version back (not the rows above), as a re-run from a record would.
        using var folder = new TempFolder();
        using var store = DatasetStore.Open(folder.Path);
        store.CreateDataset("raw");
        store.ImportBatch("raw", Rows, DuplicatePolicy.Reject, BatchProvenance.None);
        CurationRecipe recipe = CurationRecipe.Parse("""
            {"recipe_schema": 1, "steps": [{"kind": "drop_source", "source": "lab-a"}, {"kind": "drop_above_hull", "max_ev_per_atom": 0.05}]}
            """);
        string[] fingerprints = new string[2];
        for (int i = 0; i < 2; i++)
        {
            string name = $"curated-{i}";
            store.CreateDataset(name);
            CurationRun run = CurationRun.Apply(CurationRecipe.Parse(recipe.ToJson()), store.GetEntries("raw", 1));
            store.ImportBatch(name, run.Rows, DuplicatePolicy.Reject, new BatchProvenance("raw@1", recipe.ToString()));
            fingerprints[i] = store.GetFingerprint(name, 1);
        }
        Assert.Equal(fingerprints[0], fingerprints[1]);
        Assert.NotEqual(store.GetFingerprint("raw", 1), fingerprints[0]);
        // Without lab-a, Li4O2 (-1.9) is the Li-O hull's only compound, so Li2O2 (-1.2 against -1.425) goes.
        Assert.Equal(["fe", "li", "li2o-b", "o"], store.GetEntries("curated-0", 1).Select(r => r.Id).Order(StringComparer.Ordinal));
    }

    [Theory]
    [InlineData("""{"kind": "drop_flagged", "flg": "x"}""", 1, "flg")]
    [InlineData("""{"kind": "drop_flagged"}, {"kind": "drop_sauce", "source": "a"}""", 2, "kind")]
    [InlineData("""{"kind": "drop_flagged"}, {"kind": "drop_energy_outside"}""", 2, "min_ev_per_atom")]
    [InlineData("""{"kind": "drop_energy_outside", "min_ev_per_atom": 1, "max_ev_per_atom": 0}""", 1, "max_ev_per_atom")]
    [InlineData("""{"kind": "drop_above_hull", "max_ev_per_atom": -0.1}""", 1, "max_ev_per_atom")]
    [InlineData("""{"kind": "drop_above_hull", "max_ev_per_atom": "0.1"}""", 1, "max_ev_per_atom")]
    [InlineData("""{"kind": "keep_elements", "elements": ["Li", "Xx"]}""", 1, "elements[1]")]
    [InlineData("""{"kind": "drop_source"}""", 1, "source")]
    [InlineData("""{"kind": "drop_above_hull", "max_ev_per_atm": 0.1}""", 1, "max_ev_per_atm")]
    [InlineData("""{"kind": "keep_lowest_duplicate", "by": "formula"}""", 1, "by")]
    public void A_faulty_step_names_its_number_and_field(string steps, int number, string field)
    {
        var e = Assert.Throws<CurationRecipeException>(() => Run(steps));
        Assert.Equal(number, e.StepNumber);
        Assert.Equal(field, e.Field);
        Assert.Contains($"step {number}", e.Message);
    }

    [Theory]
    [InlineData("""{"recipe_schema": 2, "steps": [{"kind": "drop_flagged"}]}""", "recipe_schema")]
    [InlineData("""{"recipe_schema": 1, "steps": []}""", "steps")]
    [InlineData("""{"recipe_schema": 1, "steps": [{"kind": "drop_flagged"}], "extra": 1}""", "extra")]
    [InlineData("""not json""", "(file)")]
    public void A_faulty_recipe_names_its_field(string text, string field)
    {
        var e = Assert.Throws<CurationRecipeException>(() => CurationRecipe.Parse(text));
        Assert.Equal(0, e.StepNumber);
        Assert.Equal(field, e.Field);
    }
}
