namespace Hull.Core.Thermo.Uncertainty;

/// <summary>
/// One worker's space for its samples, allocated once and reused sample after sample: the draws, the kept points,
/// the row of per-entry readings handed to the tally, the worker's interned keys and its solver. Nothing of one
/// sample's answer depends on what an earlier sample left here (every field is written before it is read).
/// </summary>
internal sealed class SampleScratch
{
    public SampleScratch(SamplingSetup setup)
    {
        int n = setup.Plain.PointCount;
        int entries = setup.EntryPoints.Length;
        GroupShift = new double[setup.Groups.Count];
        Shift = new double[n];
        Energy = new double[n];
        SampleIndex = new int[n];
        IsKept = new bool[n];
        Kept = new int[n];
        Points = new int[n];
        RowVertex = new bool[entries];
        RowAbove = new double[entries];
        RowProducts = new int[entries];
        Solver = setup.Local is null ? null : new SampleSolver(setup.Local);
    }

    /// <summary>Per correlation group, its shared draw (eV/atom).</summary>
    public double[] GroupShift { get; }

    /// <summary>Per point, its energy error (eV/atom).</summary>
    public double[] Shift { get; }

    /// <summary>Per point, its sampled energy (eV/atom).</summary>
    public double[] Energy { get; }

    /// <summary>Per point, its index among the kept points, or -1.</summary>
    public int[] SampleIndex { get; }

    /// <summary>Per point, whether it is kept for the sample's hull.</summary>
    public bool[] IsKept { get; }

    /// <summary>The kept points, ascending (the first <see cref="KeptCount"/>).</summary>
    public int[] Kept { get; }

    /// <summary>How many points are kept.</summary>
    public int KeptCount { get; set; }

    /// <summary>A buffer of points (a decomposition or a stable set being written).</summary>
    public int[] Points { get; }

    /// <summary>The sample's row: per entry, whether it is a vertex.</summary>
    public bool[] RowVertex { get; }

    /// <summary>The sample's row: per entry, its energy above hull (eV/atom).</summary>
    public double[] RowAbove { get; }

    /// <summary>The sample's row: per entry, its decomposition's id in <see cref="Keys"/>.</summary>
    public int[] RowProducts { get; }

    /// <summary>This worker's decompositions and stable sets (ids merged into the tally's own in sample order).</summary>
    public SampleKeys Keys { get; } = new();

    /// <summary>Per id of <see cref="Keys"/>, its id in the tally, or -1 until the tally has met it.</summary>
    public List<int> TallyIds { get; } = [];

    /// <summary>The worker's local-program solver, or null where each sample's hull is built as a hull.</summary>
    public SampleSolver? Solver { get; }
}
