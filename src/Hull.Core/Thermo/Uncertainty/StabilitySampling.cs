using System.Globalization;
using Hull.Core.Geometry;

namespace Hull.Core.Thermo.Uncertainty;

/// <summary>
/// Stability of a chemical system's entries when their formation energies carry errors, by Monte Carlo sampling:
/// each sample draws every entry's error (its own Gaussian σ plus its correlation group's shared draw), places the
/// entries at the sampled energies on a sampled-energy axis (<see cref="HullAxis.SampledEnergy"/>) and rebuilds
/// the hull there; the tallies over the samples give each entry's vertex probability, energy above hull and most
/// frequent decomposition.
/// </summary>
/// <remarks>
/// <para>Work reused between samples: the plain hull's decomposition of every entry bounds its sampled hull energy
/// from above (the same mixture of the same phases at their sampled energies), so an entry whose sampled energy
/// stays above that bound by more than <see cref="CandidateMarginEvPerAtom"/> cannot be a vertex of the sample and
/// is left out of the rebuild; it is placed on the sampled hull afterwards. The hull of the entries kept is the hull
/// of all, since every vertex is kept, so only the hull near the perturbed entries is rebuilt.</para>
/// <para>The hull of the kept entries is not built as a hull: each composition's program is solved over the points
/// nearest its plain plane, starting from the plain optimum, with a bound from the plain reduced costs that shows
/// when no other point can lie below the sample's plane (<see cref="LocalPrograms"/>, <see cref="SampleSolver"/>);
/// the few programs the bound leaves open are solved over their whole face. The readings are those of the hull
/// built over the kept entries (tested sample by sample).</para>
/// <para>Samples run in parallel, each worker with its own scratch space allocated once; each sample's draws follow
/// from the seed and its index alone, its readings go to the tally as one row, and every tally is summed in sample
/// order afterwards, so the answer does not depend on the number of threads (to the last bit).</para>
/// </remarks>
public static class StabilitySampling
{
    /// <summary>
    /// An entry is rebuilt with its sample's hull unless its sampled energy lies more than this above the bound
    /// from its plain decomposition (eV/atom). Ten times the hull's energy tolerance: the bound is a sum of a few
    /// products of rounded weights and energies, whose rounding stays near 1e-15 eV/atom.
    /// </summary>
    public const double CandidateMarginEvPerAtom = 10 * HullTolerances.EnergyEvPerAtom;

    /// <summary>Samples the stability of every entry of <paramref name="plain"/>.</summary>
    /// <param name="plain">The formation-energy hull of the system (the energies without error).</param>
    /// <param name="uncertainties">Per entry σ and group; entries of the hull without one have no error. Entries of other systems are ignored.</param>
    /// <param name="groups">σ of every correlation group an entry names.</param>
    /// <param name="plan">Seed and number of samples.</param>
    /// <param name="maxThreads">Threads to use; 0 for every core.</param>
    /// <param name="cancellation">Checked before every sample: once it is cancelled no new sample starts, the
    /// samples under way finish, and the call throws.</param>
    /// <exception cref="ThermoInputException">A hull on another axis, an entry's uncertainty given twice, a group
    /// without σ, or a request past the work limits (<see cref="SamplingLimits"/>).</exception>
    /// <exception cref="OperationCanceledException"><paramref name="cancellation"/> was cancelled; no thread of the
    /// call is still sampling when this is thrown.</exception>
    public static StabilitySamplingResult Run(
        SystemHull plain,
        IReadOnlyList<EnergyUncertainty> uncertainties,
        IReadOnlyList<CorrelationGroup> groups,
        SamplingPlan plan,
        int maxThreads = 0,
        CancellationToken cancellation = default) =>
        Run(plain, uncertainties, groups, plan, maxThreads, rebuildAll: false, localPrograms: true, cancellation);

    /// <summary>As the public overload; <paramref name="rebuildAll"/> rebuilds every sample's hull over every entry
    /// (no reuse of the plain hull's decompositions), the check on the reuse; without
    /// <paramref name="localPrograms"/> each sample's hull is built as a hull of its own (<see cref="SystemHull"/>
    /// over the kept points) and read, the plain way the local programs are checked against.</summary>
    internal static StabilitySamplingResult Run(
        SystemHull plain,
        IReadOnlyList<EnergyUncertainty> uncertainties,
        IReadOnlyList<CorrelationGroup> groups,
        SamplingPlan plan,
        int maxThreads,
        bool rebuildAll,
        bool localPrograms = true,
        CancellationToken cancellation = default)
    {
        ArgumentNullException.ThrowIfNull(plain);
        ArgumentNullException.ThrowIfNull(uncertainties);
        ArgumentNullException.ThrowIfNull(groups);
        ArgumentNullException.ThrowIfNull(plan);
        if (plain.Axis.Quantity != HullAxisQuantity.FormationEnergy)
        {
            throw new ThermoInputException(
                $"Stability sampling draws formation energies; the hull of {plain.SystemName} is over {plain.Axis.DisplayName}.");
        }

        cancellation.ThrowIfCancellationRequested();
        var setup = SamplingSetup.Prepare(plain, uncertainties, groups, rebuildAll, localPrograms, maxThreads > 0 ? maxThreads : Environment.ProcessorCount);
        int entryCount = setup.EntryPoints.Length;
        long perSample = Math.Max(1, entryCount);
        int limit = (int)Math.Min(SamplingLimits.MaxSamples, SamplingLimits.MaxSampledValues / perSample);
        if (plan.SampleCount is { } fixedCount && fixedCount > limit)
        {
            throw new ThermoInputException(
                string.Create(CultureInfo.InvariantCulture,
                    $"samples: {fixedCount} samples of the {entryCount} entries of {plain.SystemName} pass the work limit of "
                    + $"{SamplingLimits.MaxSampledValues:N0} sampled values ({limit} samples here, at most {SamplingLimits.MaxSamples:N0} in any system)."));
        }

        var tally = new SampleTally(entryCount);
        int threads = maxThreads > 0 ? maxThreads : Environment.ProcessorCount;
        SamplingStopReason reason;
        if (plan.SampleCount is { } count)
        {
            tally.Run(setup, plan.Seed, 0, count, threads, cancellation);
            reason = SamplingStopReason.SampleCountReached;
        }
        else
        {
            double target = plan.TargetStandardError!.Value;
            reason = SamplingStopReason.WorkLimitReached;
            while (tally.Count < limit)
            {
                int batch = Math.Min(SamplingPlan.BatchSize, limit - tally.Count);
                tally.Run(setup, plan.Seed, tally.Count, batch, threads, cancellation);
                if (tally.Count >= 2 && tally.LargestVertexStandardError() <= target)
                {
                    reason = SamplingStopReason.TargetReached;
                    break;
                }
            }
        }

        return tally.Summarise(setup, plan, reason);
    }

    /// <summary>
    /// The per-sample work: draw, keep the entries that may be vertices, read the hull of those at every entry,
    /// by the local programs when the worker has a solver (see <see cref="LocalPrograms"/>), else by building that
    /// hull; the readings go to the tally as one row.
    /// </summary>
    internal static void SampleOne(SamplingSetup setup, ulong seed, int sample, SampleTally tally, SampleScratch scratch)
    {
        int n = setup.Plain.PointCount;
        double[] shift = scratch.Shift;
        double[] energy = scratch.Energy;
        DrawInto(setup, seed, sample, scratch.GroupShift, shift, energy);

        if (Array.TrueForAll(shift, d => d == 0.0))
        {
            // No energy moved: the sample is the plain hull itself, read as it reads.
            RecordPlain(setup, tally, sample, scratch);
            return;
        }

        int[] sampleIndex = scratch.SampleIndex;
        bool[] isKept = scratch.IsKept;
        int[] kept = scratch.Kept;
        int keptCount = 0;
        for (int i = 0; i < n; i++)
        {
            sampleIndex[i] = -1;
            isKept[i] = false;
            if (setup.RebuildAll || setup.AlwaysKept[i] || LowerBoundAboveHull(setup, i, shift) <= CandidateMarginEvPerAtom)
            {
                sampleIndex[i] = keptCount;
                isKept[i] = true;
                kept[keptCount++] = i;
            }
        }

        scratch.KeptCount = keptCount;
        if (scratch.Solver is { } solver)
        {
            ReadByLocalPrograms(setup, solver, scratch, tally, sample);
            return;
        }

        int[] keptPoints = kept[..keptCount];
        SystemHull hull = setup.Plain.Resampled(HullAxis.SampledEnergy(sample), keptPoints, energy);
        int[] points = scratch.Points;
        int vertexCount = hull.VertexPointIndices.Count;
        for (int k = 0; k < vertexCount; k++)
        {
            points[k] = keptPoints[hull.VertexPointIndices[k]];
        }

        int stableSet = scratch.Keys.Intern(points.AsSpan(0, vertexCount));
        for (int e = 0; e < setup.EntryPoints.Length; e++)
        {
            int i = setup.EntryPoints[e];
            int k = sampleIndex[i];
            bool isVertex = k >= 0 && hull.IsVertexPoint(k);
            HullPosition position = k >= 0 ? hull.PositionOfPoint(k) : hull.PositionAt(setup.Fractions[i]);
            double above = energy[i] - position.HullEnergyEvPerAtom;
            if (!(above > HullTolerances.EnergyEvPerAtom))
            {
                above = 0.0;
            }

            int count;
            if (isVertex)
            {
                points[0] = i;
                count = 1;
            }
            else
            {
                count = position.VertexPoints.Count;
                for (int p = 0; p < count; p++)
                {
                    points[p] = keptPoints[position.VertexPoints[p]];
                }

                Array.Sort(points, 0, count);
            }

            scratch.RowVertex[e] = isVertex;
            scratch.RowAbove[e] = above;
            scratch.RowProducts[e] = scratch.Keys.Intern(points.AsSpan(0, count));
        }

        tally.RecordRow(sample, scratch, stableSet, keptCount);
    }

    /// <summary>
    /// One sample's draws: each point's energy error (eV/atom; zero for points without an entry) and its sampled
    /// energy, by canonical point index. They depend on the seed and the sample index alone.
    /// </summary>
    internal static (double[] Shift, double[] Energy) Draw(SamplingSetup setup, ulong seed, int sample)
    {
        int n = setup.Plain.PointCount;
        var shift = new double[n];
        var energy = new double[n];
        DrawInto(setup, seed, sample, new double[setup.Groups.Count], shift, energy);
        return (shift, energy);
    }

    /// <summary>As <see cref="Draw"/>, into the given arrays (every element written).</summary>
    private static void DrawInto(SamplingSetup setup, ulong seed, int sample, double[] groupShift, double[] shift, double[] energy)
    {
        int n = setup.Plain.PointCount;
        var random = new SampleRandom(seed, sample);
        for (int g = 0; g < groupShift.Length; g++)
        {
            groupShift[g] = setup.Groups[g].SigmaEvPerAtom * random.NextGaussian();
        }

        for (int i = 0; i < n; i++)
        {
            shift[i] = 0.0;
            if (setup.IsEntry[i])
            {
                // One draw per entry whatever its σ, so an entry's σ never moves another entry's stream.
                double z = random.NextGaussian();
                shift[i] = setup.Sigma[i] * z + (setup.GroupOf[i] >= 0 ? groupShift[setup.GroupOf[i]] : 0.0);
            }

            energy[i] = setup.PlainEnergy[i] + shift[i];
        }
    }

    /// <summary>The readings of one sample from the local programs: the same fields as the hull built over the kept points.</summary>
    private static void ReadByLocalPrograms(SamplingSetup setup, SampleSolver solver, SampleScratch scratch, SampleTally tally, int sample)
    {
        double[] energy = scratch.Energy;
        solver.Solve(energy, scratch.Shift, scratch.IsKept);
        int[] compositionOf = setup.Local!.CompositionOf;
        int[] points = scratch.Points;
        int vertexCount = 0;
        for (int i = 0; i < energy.Length; i++) if (solver.IsVertexPoint(i)) points[vertexCount++] = i;
        int stableSet = scratch.Keys.Intern(points.AsSpan(0, vertexCount));
        for (int e = 0; e < setup.EntryPoints.Length; e++)
        {
            int i = setup.EntryPoints[e];
            int c = compositionOf[i];
            double above = energy[i] - solver.HullEnergy[c];
            if (!(above > HullTolerances.EnergyEvPerAtom))
            {
                above = 0.0;
            }

            scratch.RowVertex[e] = solver.IsVertexPoint(i);
            scratch.RowAbove[e] = above;
            scratch.RowProducts[e] = solver.IsVertexComposition[c]
                ? scratch.Keys.Intern(new ReadOnlySpan<int>(in solver.Representative[c]))
                : scratch.Keys.Intern(solver.DecompositionOf(c));
        }

        tally.RecordRow(sample, scratch, stableSet, scratch.KeptCount);
    }

    private static void RecordPlain(SamplingSetup setup, SampleTally tally, int sample, SampleScratch scratch)
    {
        SystemHull plain = setup.Plain;
        int[] points = scratch.Points;
        int vertexCount = plain.VertexPointIndices.Count;
        for (int k = 0; k < vertexCount; k++) points[k] = plain.VertexPointIndices[k];
        int stableSet = scratch.Keys.Intern(points.AsSpan(0, vertexCount));
        for (int e = 0; e < setup.EntryPoints.Length; e++)
        {
            int i = setup.EntryPoints[e];
            bool isVertex = plain.IsVertexPoint(i);
            int count;
            if (isVertex)
            {
                points[0] = i;
                count = 1;
            }
            else
            {
                count = setup.PlainProducts[i].Length;
                setup.PlainProducts[i].CopyTo(points, 0);
                Array.Sort(points, 0, count);
            }

            scratch.RowVertex[e] = isVertex;
            scratch.RowAbove[e] = setup.PlainAbove[i];
            scratch.RowProducts[e] = scratch.Keys.Intern(points.AsSpan(0, count));
        }

        tally.RecordRow(sample, scratch, stableSet, 0);
    }

    // above_s ≥ (E_i − H(x_i)) + δ_i − Σ_j w_ij δ_j: the plain decomposition at sampled energies is a mixture at x_i,
    // so the sampled hull lies at or below it.
    private static double LowerBoundAboveHull(SamplingSetup setup, int i, double[] shift)
    {
        double bound = setup.PlainAboveRaw[i] + shift[i];
        int[] phases = setup.PlainProducts[i];
        double[] weights = setup.PlainWeights[i];
        for (int p = 0; p < phases.Length; p++)
        {
            bound -= weights[p] * shift[phases[p]];
        }

        return bound;
    }
}

/// <summary>What every sample shares: the plain hull's energies, decompositions, σ and groups per canonical point.</summary>
internal sealed class SamplingSetup
{
    private SamplingSetup(SystemHull plain) => Plain = plain;

    public SystemHull Plain { get; }
    public bool RebuildAll { get; private init; }

    /// <summary>The local programs of every composition, or null where each sample's hull is built as a hull.</summary>
    public LocalPrograms? Local { get; private init; }
    public int[] EntryPoints { get; private init; } = [];
    public bool[] IsEntry { get; private init; } = [];
    public bool[] AlwaysKept { get; private init; } = [];
    public double[] Sigma { get; private init; } = [];
    public int[] GroupOf { get; private init; } = [];
    public IReadOnlyList<CorrelationGroup> Groups { get; private init; } = [];
    public double[] PlainEnergy { get; private init; } = [];
    public double[] PlainAboveRaw { get; private init; } = [];
    public double[] PlainAbove { get; private init; } = [];
    public int[][] PlainProducts { get; private init; } = [];
    public double[][] PlainWeights { get; private init; } = [];
    public double[][] Fractions { get; private init; } = [];

    public static SamplingSetup Prepare(
        SystemHull plain, IReadOnlyList<EnergyUncertainty> uncertainties, IReadOnlyList<CorrelationGroup> groups, bool rebuildAll, bool localPrograms, int threads = 1)
    {
        var byId = new Dictionary<string, EnergyUncertainty>(StringComparer.Ordinal);
        for (int row = 0; row < uncertainties.Count; row++)
        {
            EnergyUncertainty u = uncertainties[row] ?? throw new ThermoInputException($"Uncertainty row {row} is empty.", rowIndex: row);
            if (!byId.TryAdd(u.EntryId, u))
            {
                throw new ThermoInputException($"Entry '{u.EntryId}' has its uncertainty given twice.", entryId: u.EntryId, rowIndex: row);
            }
        }

        var groupByName = new Dictionary<string, CorrelationGroup>(StringComparer.Ordinal);
        foreach (CorrelationGroup g in groups)
        {
            if (!groupByName.TryAdd(g.Name, g))
            {
                throw new ThermoInputException($"Correlation group '{g.Name}' is given twice.");
            }
        }

        int n = plain.PointCount;
        var entries = new List<int>(n);
        var isEntry = new bool[n];
        var alwaysKept = new bool[n];
        var sigma = new double[n];
        var groupOf = new int[n];
        var energy = new double[n];
        var aboveRaw = new double[n];
        var above = new double[n];
        var products = new int[n][];
        var weights = new double[n][];
        var fractions = new double[n][];
        var members = new SortedDictionary<string, List<string>>(StringComparer.Ordinal);
        for (int i = 0; i < n; i++)
        {
            HullPoint point = plain.PointAt(i);
            energy[i] = point.AxisEnergyEvPerAtom;
            fractions[i] = point.Fractions;
            groupOf[i] = -1;
            alwaysKept[i] = point.Entry is null || point.IsPureComponent;
            if (point.Entry is null)
            {
                products[i] = [];
                weights[i] = [];
                continue;
            }

            isEntry[i] = true;
            entries.Add(i);
            HullPosition position = plain.PositionOfPoint(i);
            aboveRaw[i] = energy[i] - position.HullEnergyEvPerAtom;
            above[i] = plain.GetEntry(point.Phase.Id).EnergyAboveHullEvPerAtom;
            products[i] = [.. position.VertexPoints];
            weights[i] = [.. position.AtomFractions];
            if (byId.TryGetValue(point.Phase.Id, out EnergyUncertainty? u))
            {
                sigma[i] = u.SigmaEvPerAtom;
                if (u.Group is { } name)
                {
                    if (!members.TryGetValue(name, out List<string>? list))
                    {
                        members[name] = list = [];
                    }

                    list.Add(point.Phase.Id);
                }
            }
        }

        var used = new List<CorrelationGroup>(members.Count);
        foreach ((string name, List<string> ids) in members)
        {
            if (!groupByName.TryGetValue(name, out CorrelationGroup? group))
            {
                string who = ids.Count == 1 ? $"its one member, entry '{ids[0]}'," : $"its {ids.Count} members (first '{ids[0]}')";
                throw new ThermoInputException(
                    $"Correlation group '{name}' has no shared uncertainty (σ_group): {who} cannot be sampled; give the group's σ or drop the group.",
                    entryId: ids[0]);
            }

            used.Add(group);
        }

        var groupIndex = used.Select((g, k) => (g.Name, k)).ToDictionary(p => p.Name, p => p.k, StringComparer.Ordinal);
        foreach (int i in entries)
        {
            if (byId.TryGetValue(plain.PointAt(i).Phase.Id, out EnergyUncertainty? u) && u.Group is { } name)
            {
                groupOf[i] = groupIndex[name];
            }
        }

        LocalPrograms? local = null;
        if (localPrograms && LocalPrograms.Takes(plain.Components.Count, n))
        {
            var amounts = new long[n][];
            for (int i = 0; i < n; i++) amounts[i] = plain.PointAt(i).Amounts;
            local = LocalPrograms.Prepare(amounts, energy, threads);
        }

        return new SamplingSetup(plain)
        {
            RebuildAll = rebuildAll,
            Local = local,
            EntryPoints = entries.ToArray(),
            IsEntry = isEntry,
            AlwaysKept = alwaysKept,
            Sigma = sigma,
            GroupOf = groupOf,
            Groups = used,
            PlainEnergy = energy,
            PlainAboveRaw = aboveRaw,
            PlainAbove = above,
            PlainProducts = products,
            PlainWeights = weights,
            Fractions = fractions,
        };
    }
}
