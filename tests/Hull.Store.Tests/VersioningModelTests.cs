using Hull.Store.Tests.Backends;
namespace Hull.Store.Tests;

/// <summary>
/// Random imports (reject and replace), version deletions and reads, checked step by step against a plain in-memory
/// model of what every version must hold. Seeded, so a failure replays exactly.
/// </summary>
public abstract class VersioningModelTests(StoreBackend backend)
{
    private const string Dataset = "model";

    // Ids chosen so that batches often hit existing ids, plus ids whose order is easy to get wrong: an accented
    // capital, U+E000 (sorts before a surrogate pair in UTF-16, after it by code point), a character beyond U+FFFF.
    private static readonly string[] IdPool =
    [
        .. Enumerable.Range(0, 40).Select(i => $"e{i:D3}"),
        "É-1", "e\uE000", "e\U0001D518", "Z", "a b", "mp/1234", "e0", "e",
    ];

    private static readonly string[] Formulas = ["Fe3O4", "Fe2O3", "FeO", "O2", "Li7La3Zr2O12", "NaCl"];
    private static readonly string[] Notes = ["", "relaxed", "Δ = 0.1 eV, k-mesh 8×8×8", "tab\tinside"];

    [Theory]
    [InlineData(1)]
    [InlineData(2)]
    [InlineData(3)]
    [InlineData(4)]
    public void RandomOperationsMatchTheModel(int seed)
    {
        var random = new Random(seed);
        using var directory = backend.NewLocation();
        var model = new Model();
        IDatasetStore store = directory.Open();
        try
        {
            store.CreateDataset(Dataset, "random operations");
            for (int step = 0; step < 250; step++)
            {
                double p = random.NextDouble();
                string context = $"seed {seed}, step {step}";
                if (p < 0.55) Import(store, model, random, context);
                else if (p < 0.67) DeleteLiveVersion(store, model, random);
                else if (p < 0.73) AskForMissingVersion(store, model, random, context);
                else CheckOneVersion(store, model, random, context);

                Assert.Equal(model.Latest, store.GetLatestVersion(Dataset));
                IReadOnlyList<DatasetVersionInfo> versions = store.ListVersions(Dataset);
                Assert.Equal(model.Snapshots.Keys, versions.Select(v => v.Version));
                Assert.Equal(model.Snapshots.Values.Select(s => (long)s.Count), versions.Select(v => v.EntryCount));
            }
            Assert.True(model.LastIssued > 60, $"seed {seed}: too few versions made ({model.LastIssued}) to test much");

            CheckEveryVersion(store, model, $"seed {seed}, end");
            store.Dispose();
            store = directory.Open();
            CheckEveryVersion(store, model, $"seed {seed}, after reopening");
        }
        finally
        {
            store.Dispose();
        }
    }

    private static void Import(IDatasetStore store, Model model, Random random, string context)
    {
        int count = random.Next(1, 13);
        List<EntryRow> batch = IdPool.OrderBy(_ => random.Next()).Take(count).Select(id => new EntryRow(
            id,
            Formulas[random.Next(Formulas.Length)],
            random.NextDouble() * 20 - 15,
            StoredBasisTokens.All[random.Next(4)],
            Notes[random.Next(Notes.Length)])).ToList();
        if (count > 1 && random.NextDouble() < 0.1)
        {
            int later = random.Next(1, count);
            batch[later] = batch[later] with { Id = batch[random.Next(later)].Id };
        }
        DuplicatePolicy policy = random.NextDouble() < 0.5 ? DuplicatePolicy.Reject : DuplicatePolicy.Replace;
        var provenance = new BatchProvenance($"source-{random.Next(5)}", $"step {context}");

        int? repeatInBatch = FirstRepeat(batch);
        int? clashWithLatest = policy == DuplicatePolicy.Reject
            ? batch.FindIndex(r => model.Current.ContainsKey(r.Id)) is var i and >= 0 ? i : null
            : null;

        if (repeatInBatch is int repeat)
        {
            var e = Assert.Throws<DuplicateEntryException>(() => store.ImportBatch(Dataset, batch, policy, provenance));
            Assert.Equal(repeat, e.RowIndex);
            Assert.Equal(batch[repeat].Id, e.EntryId);
            Assert.Equal(batch.FindIndex(r => r.Id == batch[repeat].Id), e.FirstRowIndex);
            return;
        }
        if (clashWithLatest is int clash)
        {
            var e = Assert.Throws<DuplicateEntryException>(() => store.ImportBatch(Dataset, batch, policy, provenance));
            Assert.Equal(clash, e.RowIndex);
            Assert.Equal(batch[clash].Id, e.EntryId);
            Assert.Equal(model.Latest, e.ExistingVersion);
            Assert.Contains($"row {clash}", e.Message);
            return;
        }

        int replaced = batch.Count(r => model.Current.ContainsKey(r.Id));
        ImportResult result = store.ImportBatch(Dataset, batch, policy, provenance);
        Assert.Equal(new ImportResult(model.LastIssued + 1, batch.Count - replaced, replaced), result);
        model.Commit(batch);
    }

    private static void DeleteLiveVersion(IDatasetStore store, Model model, Random random)
    {
        if (model.Snapshots.Count == 0) return;
        long version = random.NextDouble() < 0.4
            ? model.Latest
            : model.Snapshots.Keys.ElementAt(random.Next(model.Snapshots.Count));
        store.DeleteVersion(Dataset, version);
        model.Delete(version);
    }

    private static void AskForMissingVersion(IDatasetStore store, Model model, Random random, string context)
    {
        var missing = new List<long> { 0, -1, model.LastIssued + 1, model.LastIssued + 7 };
        missing.AddRange(model.Deleted);
        long version = missing[random.Next(missing.Count)];
        var e = Assert.Throws<VersionNotFoundException>(() => store.GetEntries(Dataset, version));
        Assert.Equal(version, e.Version);
        Assert.Contains($"{version}", e.Message);
        Assert.Throws<VersionNotFoundException>(() => store.GetEntry(Dataset, IdPool[0], version));
        Assert.Throws<VersionNotFoundException>(() => store.GetFingerprint(Dataset, version));
        Assert.Throws<VersionNotFoundException>(() => store.DeleteVersion(Dataset, version));
        if (model.Deleted.Contains(version)) Assert.Contains("deleted", e.Message);
        _ = context;
    }

    private static void CheckOneVersion(IDatasetStore store, Model model, Random random, string context)
    {
        if (model.Snapshots.Count == 0)
        {
            Assert.Throws<VersionNotFoundException>(() => store.GetEntries(Dataset));
            return;
        }
        Rows.AssertSame(model.Snapshots[model.Latest], store.GetEntries(Dataset), $"{context}, latest");

        long version = model.Snapshots.Keys.ElementAt(random.Next(model.Snapshots.Count));
        IReadOnlyList<EntryRow> expected = model.Snapshots[version];
        IReadOnlyList<EntryRow> actual = store.GetEntries(Dataset, version);
        Rows.AssertSame(expected, actual, $"{context}, version {version}");
        if (model.FirstReads.TryGetValue(version, out IReadOnlyList<EntryRow>? first))
        {
            Rows.AssertSame(first, actual, $"{context}, version {version} read again");
        }
        else
        {
            model.FirstReads[version] = actual;
        }

        string id = IdPool[random.Next(IdPool.Length)];
        Assert.Equal(expected.FirstOrDefault(r => r.Id == id), store.GetEntry(Dataset, id, version));

        int limit = random.Next(1, 8);
        var paged = new List<EntryRow>();
        string? after = null;
        do
        {
            EntryPage page = store.GetEntries(Dataset, version, after, limit);
            Assert.Equal(version, page.Version);
            Assert.True(page.Entries.Count <= limit);
            paged.AddRange(page.Entries);
            after = page.NextAfterId;
        }
        while (after is not null);
        Rows.AssertSame(expected, paged, $"{context}, version {version} paged by {limit}");

        CheckFingerprint(store, model, version, context);
    }

    private static void CheckEveryVersion(IDatasetStore store, Model model, string context)
    {
        for (long version = 1; version <= model.LastIssued; version++)
        {
            if (model.Snapshots.TryGetValue(version, out IReadOnlyList<EntryRow>? expected))
            {
                IReadOnlyList<EntryRow> actual = store.GetEntries(Dataset, version);
                Rows.AssertSame(expected, actual, $"{context}, version {version}");
                if (model.FirstReads.TryGetValue(version, out IReadOnlyList<EntryRow>? first))
                {
                    Rows.AssertSame(first, actual, $"{context}, version {version} against its first read");
                }
                CheckFingerprint(store, model, version, context);
            }
            else
            {
                var e = Assert.Throws<VersionNotFoundException>(() => store.GetEntries(Dataset, version));
                Assert.Contains("deleted", e.Message);
            }
        }
    }

    private static void CheckFingerprint(IDatasetStore store, Model model, long version, string context)
    {
        string fingerprint = store.GetFingerprint(Dataset, version);
        Assert.True(ContentFingerprint.Compute(model.Snapshots[version]) == fingerprint, $"{context}: fingerprint of version {version}");
        if (model.Fingerprints.TryGetValue(version, out string? earlier)) Assert.Equal(earlier, fingerprint);
        else model.Fingerprints[version] = fingerprint;
    }

    private static int? FirstRepeat(IReadOnlyList<EntryRow> batch)
    {
        var seen = new HashSet<string>(StringComparer.Ordinal);
        for (int i = 0; i < batch.Count; i++)
        {
            if (!seen.Add(batch[i].Id)) return i;
        }
        return null;
    }

    /// <summary>What the store should hold: the rows of every live version, and the open state imports build on.</summary>
    private sealed class Model
    {
        public SortedDictionary<long, IReadOnlyList<EntryRow>> Snapshots { get; } = new();

        public Dictionary<string, EntryRow> Current { get; private set; } = new(StringComparer.Ordinal);

        public HashSet<long> Deleted { get; } = new();

        public Dictionary<long, IReadOnlyList<EntryRow>> FirstReads { get; } = new();

        public Dictionary<long, string> Fingerprints { get; } = new();

        public long LastIssued { get; private set; }

        public long Latest => Snapshots.Count == 0 ? IDatasetStore.NoVersion : Snapshots.Keys.Last();

        public void Commit(IEnumerable<EntryRow> batch)
        {
            foreach (EntryRow row in batch) Current[row.Id] = row;
            LastIssued++;
            Snapshots[LastIssued] = Rows.Sorted(Current.Values);
        }

        public void Delete(long version)
        {
            bool wasLatest = version == Latest;
            Snapshots.Remove(version);
            Deleted.Add(version);
            if (wasLatest)
            {
                Current = Snapshots.Count == 0
                    ? new Dictionary<string, EntryRow>(StringComparer.Ordinal)
                    : Snapshots[Latest].ToDictionary(r => r.Id, StringComparer.Ordinal);
            }
        }
    }
}

public sealed class VersioningModelTestsOnSqlite() : VersioningModelTests(StoreBackend.Sqlite)
{
}

public sealed class VersioningModelTestsOnPostgres() : VersioningModelTests(StoreBackend.Postgres)
{
}
