using System.Globalization;

namespace Hull.ServiceBench;

/// <summary>The benchmark's settings; the defaults are the recorded run, --quick a short smoke run.</summary>
public sealed record BenchOptions
{
    public bool Quick { get; init; }

    /// <summary>Entries of the warm dataset that the queries read.</summary>
    public int WarmEntries { get; init; } = 10_000;

    /// <summary>Ad-hoc candidates the composition queries draw from.</summary>
    public int CandidatePool { get; init; } = 2_000;

    public int[] ClientCounts { get; init; } = [1, 8, 64];

    public TimeSpan WarmUp { get; init; } = TimeSpan.FromSeconds(2);

    /// <summary>Unrecorded load of each query kind before the first measured run, so that the JIT has settled.</summary>
    public TimeSpan JitWarmUp { get; init; } = TimeSpan.FromSeconds(5);

    public TimeSpan Window { get; init; } = TimeSpan.FromSeconds(10);

    /// <summary>Repetitions of every (query, clients) run; the report gives medians over them.</summary>
    public int Repetitions { get; init; } = 3;

    /// <summary>gRPC channels the clients share (client i uses channel i mod N).</summary>
    public int Channels { get; init; } = 1;

    /// <summary>Entries and batches of the import measurement.</summary>
    public int ImportEntries { get; init; } = 100_000;

    public int ImportBatches { get; init; } = 100;

    /// <summary>Also run the queries with the version pinned (no "latest version" lookup), to see that lookup's cost.</summary>
    public bool PinnedVersionRuns { get; init; } = true;

    /// <summary>Only compare the two ways to import (a call per batch, one session), repetitions interleaved; prints only.</summary>
    public bool ImportOnly { get; init; }

    /// <summary>Only time `hull analyze` of the warm dataset as JSON and as CSV (--reps times, interleaved); prints only.</summary>
    public bool OutputFormatsOnly { get; init; }

    /// <summary>Only measure fresh servers' first second against their warm rate (--reps fresh servers per case); prints only.</summary>
    public bool ColdStartOnly { get; init; }

    /// <summary>Only the cluster screening run (lone server, one member, three members over one PostgreSQL); prints only.</summary>
    public bool ClusterScreeningOnly { get; init; }

    /// <summary>The PostgreSQL the screening uses (Npgsql connection string); null = a throwaway one it starts and stops.</summary>
    public string? PostgresConnection { get; init; }

    /// <summary>The screening's setups by members (0 = the lone server); null = all three.</summary>
    public int[]? ScreeningSetups { get; init; }

    /// <summary>Compositions the screening asks (default 1e5; 1e4 with --quick).</summary>
    public int? ScreeningQueries { get; init; }

    /// <summary>The arguments of --cold-start's second kind of server (default: no startup warming).</summary>
    public string[] ColdVariantArgs { get; init; } = ["--warm-hulls", "0"];

    /// <summary>Another server build to run side by side with this one (--reps fresh servers of each); prints only.</summary>
    public string? CompareServerDll { get; init; }

    /// <summary>The server and CLI builds to measure; null = this checkout's.</summary>
    public string? ServerDll { get; init; }

    public string? CliDll { get; init; }

    /// <summary>Other CLI builds that --output-formats runs beside this one (e.g. the published CLI).</summary>
    public string[] CompareCliDlls { get; init; } = [];

    /// <summary>Extra arguments for every server the run starts (e.g. "--warm-hulls 0").</summary>
    public string[] ServerArgs { get; init; } = [];

    /// <summary>Folder for server traces (dotnet-trace) under 64-client load; null = no trace.</summary>
    public string? TraceDirectory { get; init; }

    /// <summary>Markdown file the results go to; null = print only.</summary>
    public string? OutputPath { get; init; }

    public const string Usage = """
        usage: dotnet run -c Release --project bench/Hull.ServiceBench -- [options]

          --quick              short smoke run (1 repetition, 0.5 s warm-up, 2 s windows, 2e4-entry import); prints only
          --summarize-trace F  only print the busy-time frame summary of a speedscope file F and exit
          --reps N             repetitions per run (default 3)
          --window S           measured seconds per run (default 10)
          --warmup S           warm-up seconds per run (default 2)
          --channels N         gRPC channels shared by the clients (default 1)
          --clients A,B,C      client counts (default 1,8,64)
          --no-pinned          skip the pinned-version runs
          --import-only        only the import, per-batch calls against one session side by side (--reps times, interleaved); prints only
          --output-formats     only `hull analyze` of the warm dataset, --json against --csv (--reps times, interleaved); prints only
          --cold-start         only fresh servers' first second against their warm rate (--reps servers per case); prints only;
                               with --compare-server, this build's fresh servers against the other's, interleaved
          --cluster-screening  only the screening run: 1e5 compositions of the 60-element dataset on a lone server, one cluster
                               member and three members over one PostgreSQL (--reps interleaved); prints only
          --postgres CONN      the screening's PostgreSQL (default: a throwaway one, scripts/postgres-throwaway.sh)
          --queries N          compositions the screening asks (default 100000)
          --setups 0,1,3       the screening's setups: 0 = lone server, 1 and 3 = cluster members (default all)
          --cold-variant "A B" the arguments of --cold-start's second kind of server (default "--warm-hulls 0")
          --compare-server DLL only this server against another build's Hull.Server.dll (--reps fresh servers each, interleaved); prints only
          --server-dll DLL     the server build to measure (default: this checkout's)
          --server-args "A B"  extra arguments for every server started (e.g. "--warm-hulls 0")
          --cli-dll DLL        the CLI build --output-formats runs (default: this checkout's hull.dll)
          --compare-cli A,B    with --output-formats, also these other CLI builds' hull.dll, all taken in turn in every repetition
          --trace DIR          after the measurements, trace the server for 10 s under 64 clients of each query kind
          --output FILE        write the results (default bench/SERVICE.md for a full run; nothing for --quick)
        """;

    /// <summary>Parses the command line; throws <see cref="FormatException"/> naming the bad option.</summary>
    public static BenchOptions Parse(string[] args, string repositoryRoot)
    {
        bool quick = args.Contains("--quick");
        BenchOptions options = quick
            ? new BenchOptions
            {
                Quick = true, Repetitions = 1, WarmUp = TimeSpan.FromSeconds(0.5), Window = TimeSpan.FromSeconds(2), JitWarmUp = TimeSpan.FromSeconds(1),
                ImportEntries = 20_000, ImportBatches = 20,
            }
            : new BenchOptions { OutputPath = Path.Combine(repositoryRoot, "bench", "SERVICE.md") };
        for (int i = 0; i < args.Length; i++)
        {
            string Value() => i + 1 < args.Length ? args[++i] : throw new FormatException($"option {args[i]} needs a value");
            options = args[i] switch
            {
                "--quick" => options,
                "--reps" => options with { Repetitions = Positive(Value(), "--reps") },
                "--window" => options with { Window = TimeSpan.FromSeconds(Seconds(Value(), "--window")) },
                "--warmup" => options with { WarmUp = TimeSpan.FromSeconds(Seconds(Value(), "--warmup")) },
                "--channels" => options with { Channels = Positive(Value(), "--channels") },
                "--clients" => options with { ClientCounts = Value().Split(',').Select(c => Positive(c, "--clients")).ToArray() },
                "--no-pinned" => options with { PinnedVersionRuns = false },
                "--import-only" => options with { ImportOnly = true, OutputPath = null },
                "--output-formats" => options with { OutputFormatsOnly = true, OutputPath = null },
                "--cold-start" => options with { ColdStartOnly = true, OutputPath = null },
                "--cluster-screening" => options with { ClusterScreeningOnly = true, OutputPath = null },
                "--postgres" => options with { PostgresConnection = Value() },
                "--setups" => options with { ScreeningSetups = Value().Split(',').Select(c => int.Parse(c, CultureInfo.InvariantCulture)).ToArray() },
                "--queries" => options with { ScreeningQueries = Positive(Value(), "--queries") },
                "--cold-variant" => options with { ColdVariantArgs = Value().Split(' ', StringSplitOptions.RemoveEmptyEntries) },
                "--compare-server" => options with { CompareServerDll = Path.GetFullPath(Value()), OutputPath = null },
                "--server-dll" => options with { ServerDll = Path.GetFullPath(Value()) },
                "--server-args" => options with { ServerArgs = Value().Split(' ', StringSplitOptions.RemoveEmptyEntries) },
                "--cli-dll" => options with { CliDll = Path.GetFullPath(Value()) },
                "--compare-cli" => options with { CompareCliDlls = Value().Split(',').Select(Path.GetFullPath).ToArray() },
                "--trace" => options with { TraceDirectory = Path.GetFullPath(Value()) },
                "--output" => options with { OutputPath = Path.GetFullPath(Value()) },
                _ => throw new FormatException($"unknown option '{args[i]}'"),
            };
        }

        return options;
    }

    private static int Positive(string text, string option) =>
        int.TryParse(text, NumberStyles.None, CultureInfo.InvariantCulture, out int n) && n > 0
            ? n
            : throw new FormatException($"{option} '{text}' is not a positive whole number");

    private static double Seconds(string text, string option) =>
        double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out double s) && s > 0 && s <= 120
            ? s
            : throw new FormatException($"{option} '{text}' is not a number of seconds in (0, 120]");
}
