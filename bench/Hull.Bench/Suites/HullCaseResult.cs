namespace Hull.Bench.Suites;

/// <summary>Everything measured for one hull case; NaN / null where a measurement was not taken.</summary>
public sealed class HullCaseResult
{
    public required string Name { get; init; }
    public required int Entries { get; init; }
    public required int Components { get; init; }
    public required int DistinctCompositions { get; init; }
    public double InProcessMedianMs { get; set; } = double.NaN;
    public int InProcessReps { get; set; }
    public double ProcessMedianMs { get; set; } = double.NaN;
    public int ProcessReps { get; set; }
    public double QconvexMedianMs { get; set; } = double.NaN;
    /// <summary>Medians of the whole processes' CPU time (user + system, ms): ours summed over its threads.</summary>
    public double ProcessCpuMedianMs { get; set; } = double.NaN;
    public double QconvexCpuMedianMs { get; set; } = double.NaN;
    public int QconvexReps { get; set; }
    /// <summary>"ok", or why qconvex has no time (e.g. "no finish in 120 s", "exit 2").</summary>
    public string QconvexStatus { get; set; } = "not run";
    public int? QconvexFacets { get; set; }
    /// <summary>The cap (ms) qconvex ran into, NaN if it finished.</summary>
    public double QconvexCapMs { get; set; } = double.NaN;
    public int Vertices { get; set; }
    /// <summary>Lower facets, null where the engine builds none (the program engine).</summary>
    public int? Facets { get; set; }
    /// <summary>"hull" (incremental lower hull) or "programs" (one linear program per composition).</summary>
    public string Engine { get; set; } = "";
    public int OnHull { get; set; }
    public double PeakInProcessMb { get; set; } = double.NaN;
    public double PeakProcessMb { get; set; } = double.NaN;
    public double PeakQconvexMb { get; set; } = double.NaN;
    public double LpMaxAbsDiff { get; set; } = double.NaN;
    public int LpChecked { get; set; }
    public double LpSeconds { get; set; } = double.NaN;
    public List<string> Notes { get; } = [];

    public double RatioToProcess => QconvexMedianMs / ProcessMedianMs;
    public double RatioToInProcess => QconvexMedianMs / InProcessMedianMs;
    public double CpuRatioToProcess => QconvexCpuMedianMs / ProcessCpuMedianMs;
}
