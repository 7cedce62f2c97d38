using Grpc.Core;
using Grpc.Health.V1;
using Hull.Cli.Client;
using Hull.Cli.Commands;
using Hull.Cli.Input;
using Hull.Cli.Output;
using Hull.Protos.V1;
using Hull.Server.Hosting;
using Microsoft.Extensions.Logging;

namespace Hull.Cli.Demo;

/// <summary>
/// `hull demo`: starts a server in this process on a free loopback port with a temporary store, imports the demo
/// data through gRPC exactly as `hull import` would, runs every analysis the service offers, and prints a report.
/// </summary>
public sealed class DemoRunner(TextWriter output, TextWriter error)
{
    public const string DatasetName = "cathode-screen";

    /// <summary>The folder the demo writes its figures into (relative to the current folder unless rooted).</summary>
    public string FiguresFolder { get; init; } = DemoFigures.DefaultFolder;

    public async Task<int> RunAsync(string? dataFolder, bool keepStore, CancellationToken cancellation)
    {
        string? data = DemoDataLocator.Find(dataFolder);
        if (data is null)
        {
            error.WriteLine(dataFolder is null
                ? "hull demo: cannot find the data-demo/ folder; run from the repository, or give --data FOLDER"
                : $"hull demo: no such folder '{dataFolder}'");
            return ExitCodes.InputFile;
        }

        string store = Path.Combine(Path.GetTempPath(), "hull-demo-" + Guid.NewGuid().ToString("N")[..12]);
        HullServer server = await HullServer.StartAsync(new HullServerOptions
        {
            DataDirectory = store,
            Port = 0,
            MinimumLogLevel = LogLevel.Warning,
        }, cancellation);
        try
        {
            using var connection = new HullConnection(server.Address, token: null, TimeSpan.FromMinutes(5));
            await RunReportAsync(connection, server.Address, data, cancellation);
        }
        finally
        {
            await server.StopAsync();
            if (keepStore)
            {
                output.WriteLine($"The store is kept in {store}.");
            }
            else
            {
                TryDelete(store);
            }
        }

        return ExitCodes.Ok;
    }

    private async Task RunReportAsync(HullConnection hull, Uri address, string data, CancellationToken t)
    {
        Heading("hull demo: an invented cathode-screening dataset (all numbers invented; see data-demo/README.md)");
        output.WriteLine($"Server started in this process at {address} with a temporary store; every step below is a gRPC call.");

        HealthCheckResponse health = await hull.Health.CheckAsync(new HealthCheckRequest(), hull.Call(t));
        output.WriteLine($"Standard gRPC health check: {health.Status.ToString().ToUpperInvariant()}");

        // 1. Datasets and versioned imports.
        Heading("1. Import: one all-or-nothing batch per file, each a new dataset version");
        await hull.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = DatasetName, Description = "layered Li-TM oxides and alumina coatings (invented)" }, hull.Call(t));
        var importer = new ImportRunner(hull, error, showProgress: false);
        foreach (string file in Directory.GetFiles(Path.Combine(data, "round1")).Order(StringComparer.Ordinal))
        {
            IReadOnlyList<EntryRecord> records = EntryFileReader.Read(file);
            await importer.ImportAsync(DatasetName, file, records, DuplicatePolicy.Reject, ImportRunner.DefaultBatchSize, "round 1", t);
        }

        long roundOne = (await hull.Datasets.DescribeDatasetAsync(new DescribeDatasetRequest { Name = DatasetName }, hull.Call(t))).Dataset.LatestVersion;

        // A bad row is refused whole, naming the row and field; nothing is written.
        var bad = new ImportEntriesRequest { Dataset = DatasetName, DuplicatePolicy = DuplicatePolicy.Reject, SourceLabel = "typo test" };
        bad.Entries.Add(new Entry { Id = "typo-1", Formula = "LiCoO2", EnergyEv = -1.8, Basis = EnergyBasis.FormationPerAtom });
        bad.Entries.Add(new Entry { Id = "typo-2", Formula = "LiCoQ2", EnergyEv = -1.8, Basis = EnergyBasis.FormationPerAtom });
        try
        {
            await hull.Datasets.ImportEntriesAsync(bad, hull.Call(t));
            output.WriteLine("unexpected: the batch with a typo was accepted");
        }
        catch (RpcException e)
        {
            var violation = RpcFailure.ViolationsOf(e).FirstOrDefault();
            output.WriteLine($"A batch with a typo (LiCoQ2) is refused: {e.StatusCode}, {violation?.Field}: {violation?.Description}");
        }

        DescribeDatasetResponse described = await hull.Datasets.DescribeDatasetAsync(new DescribeDatasetRequest { Name = DatasetName }, hull.Call(t));
        output.WriteLine($"Dataset {DatasetName}: {described.Dataset.EntryCount} entries at version {described.Dataset.LatestVersion}.");
        TableRenderer.WriteAligned(output, CommandTree.VersionsTable(described.Versions), "  ");

        // 2. Whole-dataset analysis.
        Heading("2. Stability of every entry (each from the smallest maximal chemical system that contains it)");
        var all = new List<Protos.V1.EntryStability>();
        AnalyzeDatasetResponse? head = null;
        using (var call = hull.Stability.AnalyzeDataset(new AnalyzeDatasetRequest { Dataset = DatasetName }, hull.Call(t)))
        {
            await foreach (AnalyzeDatasetResponse page in call.ResponseStream.ReadAllAsync(t))
            {
                head ??= page;
                all.AddRange(page.Results);
            }
        }

        output.WriteLine($"Version {head!.Used.Version} (content sha256 {head.Used.ContentSha256[..16]}...): {head.EntryCount} entries; hulls of {string.Join(", ", head.HullSystems)}.");
        output.WriteLine("Elemental references for total energies: " +
                         string.Join(", ", head.References.Select(r => $"{r.Symbol} {r.TotalEnergyEvPerAtom:F3} eV/atom ({r.SourceEntryId})")));
        int stable = all.Count(r => r.IsHullVertex);
        int near = all.Count(r => !r.IsOnHull && r.EnergyAboveHullEvPerAtom <= 0.025);
        output.WriteLine($"{stable} stable phases; {near} more within 25 meV/atom of the hull; {all.Count - stable - near} further above.");
        output.WriteLine("The ten entries furthest above the hull:");
        TableRenderer.WriteAligned(output, CommandTree.StabilityTable(all.OrderByDescending(r => r.EnergyAboveHullEvPerAtom).Take(10), head.Used), "  ");

        // 3. Stable set.
        Heading("3. Stable phases of the whole dataset");
        GetStablePhasesResponse stableSet = await hull.Stability.GetStablePhasesAsync(new GetStablePhasesRequest { Dataset = DatasetName }, hull.Call(t));
        TableRenderer.WriteAligned(output, CommandTree.PhasesTable(stableSet.Phases), "  ");

        // 4. Stored entries by id.
        Heading("4. Energy above hull and decomposition of stored entries, by id");
        var ids = new GetEntryStabilityRequest { Dataset = DatasetName };
        ids.EntryIds.AddRange(["ter-LiCoO2-r3m", "ter-LiCoO2-cubic", "nmc-n04m04c04-A", "nmc-n06m06c00-B", "bin-Co2O3", "dop-Al03-LiCoO2"]);
        GetEntryStabilityResponse byId = await hull.Stability.GetEntryStabilityAsync(ids, hull.Call(t));
        TableRenderer.WriteAligned(output, CommandTree.StabilityTable(byId.Results, byId.Used), "  ");

        // 5. Ad-hoc candidates.
        Heading("5. Ad-hoc candidates placed against the hull (not stored): data-demo/candidates.csv");
        var assess = new AssessCandidatesRequest { Dataset = DatasetName };
        foreach (EntryRecord r in EntryFileReader.Read(Path.Combine(data, "candidates.csv")))
        {
            assess.Candidates.Add(new Candidate { Label = r.Id, Formula = r.Formula, EnergyEv = r.EnergyEv, Basis = r.Basis });
        }

        AssessCandidatesResponse assessed = await hull.Stability.AssessCandidatesAsync(assess, hull.Call(t));
        var candidateTable = new Table("label", "formula", "system", "formation_ev_per_atom", "relative_to_hull_ev_per_atom", "on_or_below_hull", "competing phases");
        foreach (CandidateAssessment a in assessed.Results)
        {
            candidateTable.Add(a.Label, a.Formula, a.ChemicalSystem, a.FormationEnergyEvPerAtom, a.EnergyRelativeToHullEvPerAtom, a.IsOnOrBelowHull, a.Decomposition.Reaction);
        }

        TableRenderer.WriteAligned(output, candidateTable, "  ");

        // 6. Hull energies.
        Heading("6. Hull energy and decomposition at compositions");
        var energies = new GetHullEnergiesRequest { Dataset = DatasetName };
        energies.Formulas.AddRange(["Li2CoO3", "LiNi0.5Mn0.5O2", "Li2Mn0.5Ni0.5O3", "LiAl2Co2O7"]);
        GetHullEnergiesResponse atCompositions = await hull.Stability.GetHullEnergiesAsync(energies, hull.Call(t));
        var energyTable = new Table("formula", "system", "hull_energy_ev_per_atom", "decomposition");
        foreach (HullEnergyResult r in atCompositions.Results) energyTable.Add(r.Formula, r.ChemicalSystem, r.HullEnergyEvPerAtom, r.Decomposition.Reaction);
        TableRenderer.WriteAligned(output, energyTable, "  ");

        // 7. Facets and tie-lines.
        foreach (string system in new[] { "Li-Co-O", "Li-Al-O" })
        {
            Heading($"7. The {system} hull: facets with chemical potentials, and tie-lines");
            GetHullFacetsResponse facets = await hull.Stability.GetHullFacetsAsync(new GetHullFacetsRequest { Dataset = DatasetName, ChemicalSystem = system }, hull.Call(t));
            output.WriteLine($"  {facets.StablePhases.Count} stable phases, {facets.Facets.Count} facets, {facets.TieLines.Count} tie-lines");
            TableRenderer.WriteAligned(output, CommandTree.FacetsTable(facets), "  ");
            output.WriteLine("  tie-lines: " + string.Join("; ", facets.TieLines.Select(l => $"{l.FirstPhaseId} - {l.SecondPhaseId}")));
        }

        await new DemoFigures(output).RunEndMembersAsync(hull, DatasetName, t);
        await WindowDemoStep.RunAsync(hull, output, DatasetName, FiguresFolder, t);
        await ElectrochemistryDemoStep.RunAsync(hull, output, DatasetName, FiguresFolder, t);
        await UncertaintyDemoStep.RunAsync(hull, output, error, data, FiguresFolder, t);
        await CorrectionDemoStep.RunAsync(hull, output, error, data, t);

        // 8. Versioning: a replacement makes a new version; the old one answers exactly as before.
        Heading("8. Versions: round 2 replaces 16 entries; the earlier version is unchanged");
        foreach (string file in Directory.GetFiles(Path.Combine(data, "round2")).Order(StringComparer.Ordinal))
        {
            var outcomes = await importer.ImportAsync(DatasetName, file, EntryFileReader.Read(file), DuplicatePolicy.Replace, ImportRunner.DefaultBatchSize, "round 2: re-relaxed", t);
            foreach (var o in outcomes)
            {
                output.WriteLine($"  {Path.GetFileName(file)} -> version {o.Response.DatasetVersion}: {o.Response.InsertedCount} inserted, {o.Response.ReplacedCount} replaced");
            }
        }

        string probe = "nmc-n00m01c11-A";
        var atOld = new GetEntryStabilityRequest { Dataset = DatasetName, Version = roundOne };
        atOld.EntryIds.Add(probe);
        var atNew = new GetEntryStabilityRequest { Dataset = DatasetName };
        atNew.EntryIds.Add(probe);
        GetEntryStabilityResponse before = await hull.Stability.GetEntryStabilityAsync(atOld, hull.Call(t));
        GetEntryStabilityResponse after = await hull.Stability.GetEntryStabilityAsync(atNew, hull.Call(t));
        GetEntryStabilityResponse again = await hull.Stability.GetEntryStabilityAsync(atOld, hull.Call(t));
        var versionTable = new Table("query", "version", "above_hull_ev_per_atom", "formation_ev_per_atom");
        versionTable.Add($"{probe} at version {roundOne}", before.Used.Version, before.Results[0].EnergyAboveHullEvPerAtom, before.Results[0].FormationEnergyEvPerAtom);
        versionTable.Add($"{probe} at latest", after.Used.Version, after.Results[0].EnergyAboveHullEvPerAtom, after.Results[0].FormationEnergyEvPerAtom);
        versionTable.Add($"{probe} at version {roundOne} again", again.Used.Version, again.Results[0].EnergyAboveHullEvPerAtom, again.Results[0].FormationEnergyEvPerAtom);
        TableRenderer.WriteAligned(output, versionTable, "  ");
        bool unchanged = before.Results[0].Equals(again.Results[0]) && before.Used.ContentSha256 == again.Used.ContentSha256;
        output.WriteLine($"  Version {roundOne} answers exactly as before the replacement: {(unchanged ? "yes" : "NO")}");

        // 9. Export and diagnostics.
        Heading("9. Export and server counters");
        int exported = 0;
        using (var call = hull.Datasets.ExportEntries(new ExportEntriesRequest { Dataset = DatasetName }, hull.Call(t)))
        {
            await foreach (ExportEntriesResponse page in call.ResponseStream.ReadAllAsync(t)) exported += page.Entries.Count;
        }

        output.WriteLine($"  Exported {exported} entries of the latest version (stream of pages, id order).");
        CacheStatistics stats = await hull.Diagnostics.GetCacheStatisticsAsync(new GetCacheStatisticsRequest(), hull.Call(t));
        ServerLimits limits = await hull.Diagnostics.GetServerLimitsAsync(new GetServerLimitsRequest(), hull.Call(t));
        output.WriteLine($"  Hull cache: {stats.HullBuilds} hulls built, {stats.HullCacheHits} answers from the cache, {stats.VersionLoads} versions loaded, {stats.DatasetAnalyses} whole-dataset analyses.");
        ServerHealth report = await hull.Diagnostics.GetServerHealthAsync(new GetServerHealthRequest(), hull.Call(t));
        output.WriteLine($"  Health: store {(report.StoreUsable ? "usable" : "NOT usable: " + report.StoreProblem)}; " +
                         (report.ClusterName.Length == 0 ? "no cluster (this server works alone)." : $"cluster {report.ClusterName}, {report.ActiveMembers} active members, this one {report.MemberStatus}."));
        output.WriteLine($"  Limits: {limits.MaxComponentsPerSystem} components and {limits.MaxEntriesPerSystem} entries per chemical system, " +
                         $"{limits.MaxCompositionsPerRequest} compositions per request, {limits.MaxReceiveMessageBytes} bytes per request message.");
        await new DemoFigures(output).RunFiguresAsync(hull, DatasetName, FiguresFolder, t);
        await DefectDemoStep.RunAsync(hull, output, error, DatasetName, data, FiguresFolder, t);
        await ThermoDemoStep.RunAsync(hull, output, DatasetName, data, FiguresFolder, t);
        await CurationDemoStep.RunAsync(hull, output, error, data, FiguresFolder, t);
        output.WriteLine();
        // Results like these are read as "this compound can be made"; say plainly that they are not a safety assessment.
        output.WriteLine("Caution: these are computed energies for screening only. A phase marked stable says nothing about how to");
        output.WriteLine("make or handle it: lithium metal reacts violently with water and can ignite, and cobalt and nickel oxide dusts");
        output.WriteLine("are toxic. Follow your institution's safety rules, the safety data sheets and licensed laboratory practice.");
        output.WriteLine();
        output.WriteLine("Demo finished. The same calls are available as `hull` commands against a running `hull serve`.");
    }

    private void Heading(string text)
    {
        output.WriteLine();
        output.WriteLine(text);
        output.WriteLine(new string('=', Math.Min(text.Length, 100)));
    }

    private void TryDelete(string folder)
    {
        try
        {
            Directory.Delete(folder, recursive: true);
        }
        catch (IOException e)
        {
            error.WriteLine($"hull demo: could not remove the temporary store {folder}: {e.Message}");
        }
    }
}
