namespace Hull.Core.Geometry;

/// <summary>
/// Finds the facet corners of a finished lower hull that are no vertices: corners whose energy is not below the
/// hull built without them by more than <see cref="HullTolerances.EnergyEvPerAtom"/> (a point on the hull that is
/// a mixture of other points at their mixed energy, which the construction keeps as a corner when it was added
/// before the points it mixes).
/// </summary>
/// <remarks>
/// Removing a corner v changes the hull only inside its star (the facets that contain v): elsewhere every facet
/// still supports all remaining points, and a new facet over x_v reaching a point outside the star would coincide
/// there with an old facet plane, which passes at or below v. So the hull energy at x_v without v is the optimum
/// of a small linear program over the star's other corners, the points located in the star and the pure points,
/// of which only those made of v's components can take part (amounts are non-negative). v is the only candidate of
/// its composition, so leaving v out leaves its composition out.
/// </remarks>
internal static class ExtremeCornerCheck
{
    /// <summary>Corners checked in sequence by one worker; large hulls spread their chunks over the cores.</summary>
    private const int Chunk = 1024;

    /// <summary>
    /// Checks every corner that is not a pure point and not yet in <paramref name="knownVertex"/>; marks those that
    /// are vertices there and returns the others, ascending.
    /// </summary>
    /// <param name="input">The hull's input.</param>
    /// <param name="facetVertices">Corners of the lower facets, n per facet.</param>
    /// <param name="facetLu">Each facet's factorised corner matrix (row r: fractions of corner r), n × n per facet.</param>
    /// <param name="facetPivots">The factorisations' pivots, n per facet.</param>
    /// <param name="facetMu">Each facet's plane (chemical potentials), n per facet.</param>
    /// <param name="compositionFacet">For each composition (by id), the facet its representative was located in.</param>
    /// <param name="isCorner">Whether each composition's representative is a corner of some facet.</param>
    /// <param name="candidates">The representative points.</param>
    /// <param name="pure">The pure point of each component.</param>
    /// <param name="knownVertex">Compositions whose representative corner is already shown a vertex (updated).</param>
    public static List<int> FindNonVertexCorners(
        HullInput input, int[] facetVertices, double[] facetLu, int[] facetPivots, double[] facetMu,
        int[] compositionFacet, bool[] isCorner, int[] candidates, int[] pure, bool[] knownVertex)
    {
        int[] compositionOf = input.CompositionOf;

        var toCheck = new List<int>();
        foreach (int p in candidates)
        {
            int c = compositionOf[p];
            if (isCorner[c] && !knownVertex[c] && Array.IndexOf(pure, p) < 0) toCheck.Add(p);
        }
        if (toCheck.Count == 0) return [];

        var facets = new FacetTable(facetVertices, facetLu, facetPivots, facetMu);
        var star = IndexStars(input, facetVertices, compositionFacet, isCorner, candidates, pure);
        int chunks = (toCheck.Count + Chunk - 1) / Chunk;
        var found = new List<int>[chunks];
        if (chunks == 1)
        {
            found[0] = CheckChunk(input, toCheck, 0, toCheck.Count, facets, star, knownVertex, new Scratch(input));
        }
        else
        {
            Parallel.For(0, chunks, () => new Scratch(input), (c, _, scratch) =>
            {
                found[c] = CheckChunk(input, toCheck, c * Chunk, Math.Min(toCheck.Count, (c + 1) * Chunk), facets, star, knownVertex, scratch);
                return scratch;
            }, _ => { });
        }
        var result = found.SelectMany(f => f).ToList();
        result.Sort();
        return result;
    }

    private static List<int> CheckChunk(HullInput input, List<int> toCheck, int begin, int end, FacetTable facets,
        StarIndex star, bool[] knownVertex, Scratch scratch)
    {
        var nonVertices = new List<int>();
        for (int t = begin; t < end; t++)
        {
            int v = toCheck[t];
            int c = input.CompositionOf[v];
            GatherStarColumns(input, v, facets.Vertices, star, scratch);
            if (TiltedPlaneSeparates(input, v, star.Facets[star.Start[c]], facets, scratch.Columns, scratch))
            {
                knownVertex[c] = true;
                continue;
            }
            if (input.Energies[v] < SolveWithout(input, v, scratch) - HullTolerances.EnergyEvPerAtom) knownVertex[c] = true;
            else nonVertices.Add(v);
        }
        return nonVertices;
    }

    /// <summary>
    /// The hull energy at corner v's composition without v (eV/atom), from the finished hull's stars: the optimum of
    /// the program over the columns the class comment names.
    /// </summary>
    public static double HullEnergyWithout(HullInput input, int v, int[] facetVertices, StarIndex star, Scratch scratch)
    {
        GatherStarColumns(input, v, facetVertices, star, scratch);
        return SolveWithout(input, v, scratch);
    }

    /// <summary>
    /// Fills the scratch's columns with the points that can make x_v without v: the pure points of v's components,
    /// the other corners of v's star and the points located in it, each once and only if made of v's components.
    /// </summary>
    private static void GatherStarColumns(HullInput input, int v, int[] facetVertices, StarIndex star, Scratch scratch)
    {
        int n = input.ComponentCount;
        var columns = scratch.Columns;
        var support = scratch.Support;
        var outside = scratch.Outside;
        int[] listedFor = scratch.ListedFor;
        var own = input.Row(v);
        int[] compositionOf = input.CompositionOf;
        support.Clear();
        outside.Clear();
        for (int c = 0; c < n; c++) (own[c] != 0 ? support : outside).Add(c);

        columns.Clear();
        foreach (int c in support) Include(star.Pure[c]);
        int vc = compositionOf[v];
        for (int s = star.Start[vc]; s < star.Start[vc + 1]; s++)
        {
            int f = star.Facets[s];
            for (int i = 0; i < n; i++) Include(facetVertices[f * n + i]);
            for (int q = star.Located[f]; q < star.Located[f + 1]; q++) Include(star.LocatedPoints[q]);
        }
        // A later gathering for the same corner must list its columns again.
        foreach (int p in columns) listedFor[compositionOf[p]] = -1;

        void Include(int p)
        {
            int composition = compositionOf[p];
            if (p == v || listedFor[composition] == v) return;
            listedFor[composition] = v;
            // Made of v's components only (a fraction is exactly 0 where the amount is).
            var x = input.FractionsOf(p);
            foreach (int c in outside) if (x[c] != 0) return;
            columns.Add(p);
        }
    }

    /// <summary>The program's optimum over the gathered columns at x_v.</summary>
    private static double SolveWithout(HullInput input, int v, Scratch scratch)
    {
        int n = input.ComponentCount;
        int k = scratch.Support.Count;
        var block = ColumnBlock.FromPoints(scratch.Support.ToArray(), scratch.Columns, input);
        var x = scratch.X.AsSpan(0, k);
        block.Restrict(input.FractionsOf(v), x);
        return scratch.Solver.Solve(block, x, excluded: -1, scratch.Basis.AsSpan(0, k), scratch.Weights.AsSpan(0, k), warm: false);
    }

    /// <summary>
    /// Margin (eV/atom) for the rounding of the tilted plane's value at v: it comes from a few dot products of
    /// fractions with energies of order 1–10 eV/atom, exact to about 1e-14; 1e-12 is far above that and far below
    /// the tolerance, so a corner this test passes would pass the linear program as well.
    /// </summary>
    private const double TiltRounding = 1e-12;

    /// <summary>
    /// Tries to show v a vertex without a linear program: tilts the plane of facet f (which contains v) up at v,
    /// along λ_v (v's barycentric weight in f, an affine function that is 1 at v and 0 on f's other corners), as far
    /// as the columns allow. When no column lies more than δ below a plane, the hull energy at x_v without v is at
    /// least the plane's value there less δ (weak duality of the program), here E_v + t − δ. Almost every vertex
    /// passes; only a nearly coplanar neighbourhood (t within the tolerance) needs the program.
    /// </summary>
    private static bool TiltedPlaneSeparates(HullInput input, int v, int f, FacetTable facets, List<int> columns, Scratch scratch)
    {
        int n = input.ComponentCount;
        int slot = Array.IndexOf(facets.Vertices, v, f * n, n) - f * n;
        // λ_v(x) = a · x with X a = e_v, X the corner matrix (λ = X^-T x).
        var a = scratch.Tilt;
        Array.Clear(a);
        a[slot] = 1.0;
        SmallLinearSolver.Solve(facets.Lu.AsSpan(f * n * n, n * n), n, facets.Pivots.AsSpan(f * n, n), a);
        var mu = facets.Mu.AsSpan(f * n, n);
        if (scratch.Lambda.Length < columns.Count)
        {
            scratch.Lambda = new double[2 * columns.Count];
            scratch.Gap = new double[2 * columns.Count];
        }
        double[] lambdas = scratch.Lambda, gaps = scratch.Gap;
        // Largest tilt t that keeps every column clearly on v's side on or above the plane.
        double t = double.PositiveInfinity;
        for (int i = 0; i < columns.Count; i++)
        {
            int j = columns[i];
            double lambda = 0, gap = input.Energies[j];
            var xj = input.FractionsOf(j);
            for (int k = 0; k < n; k++)
            {
                double x = xj[k];
                lambda += a[k] * x;
                gap -= mu[k] * x;
            }
            lambdas[i] = lambda;
            gaps[i] = gap;
            if (lambda > HullTolerances.BarycentricWeight) t = Math.Min(t, gap / lambda);
        }
        if (double.IsPositiveInfinity(t)) t = 1.0;
        // The rest (on the ridge opposite v, or beyond it) may still dip below the tilted plane within rounding.
        double violation = 0;
        for (int i = 0; i < columns.Count; i++) violation = Math.Max(violation, t * lambdas[i] - gaps[i]);
        double atV = -input.Energies[v];
        var xv = input.FractionsOf(v);
        for (int k = 0; k < n; k++) atV += mu[k] * xv[k];
        // The plane's value at x_v less E_v: (mu·x_v − E_v) + t λ_v(x_v), with λ_v(x_v) = 1.
        return atV + t - violation > HullTolerances.EnergyEvPerAtom + TiltRounding;
    }

    /// <summary>
    /// The facets that contain each corner (compressed rows over composition ids), the candidates located in each
    /// facet (compressed rows over facets), and the pure point of each component.
    /// </summary>
    public sealed record StarIndex(int[] Start, int[] Facets, int[] Located, int[] LocatedPoints, int[] Pure);

    /// <summary>Indexes the stars of a finished hull and the non-corner candidates located in each facet.</summary>
    public static StarIndex IndexStars(HullInput input, int[] facetVertices, int[] compositionFacet, bool[] isCorner, int[] candidates, int[] pure)
    {
        int n = input.ComponentCount;
        int compositions = input.CompositionCount;
        int[] compositionOf = input.CompositionOf;
        int facetCount = facetVertices.Length / n;
        var starStart = new int[compositions + 1];
        foreach (int v in facetVertices) starStart[compositionOf[v] + 1]++;
        for (int c = 0; c < compositions; c++) starStart[c + 1] += starStart[c];
        var starFacets = new int[facetVertices.Length];
        var fill = (int[])starStart.Clone();
        for (int f = 0; f < facetCount; f++)
        {
            for (int i = 0; i < n; i++) starFacets[fill[compositionOf[facetVertices[f * n + i]]]++] = f;
        }

        var located = new int[facetCount + 1];
        foreach (int p in candidates)
        {
            int c = compositionOf[p];
            if (!isCorner[c]) located[compositionFacet[c] + 1]++;
        }
        for (int f = 0; f < facetCount; f++) located[f + 1] += located[f];
        var locatedPoints = new int[located[facetCount]];
        var locatedFill = (int[])located.Clone();
        foreach (int p in candidates)
        {
            int c = compositionOf[p];
            if (!isCorner[c]) locatedPoints[locatedFill[compositionFacet[c]]++] = p;
        }
        return new StarIndex(starStart, starFacets, located, locatedPoints, pure);
    }

    /// <summary>One worker's buffers.</summary>
    public sealed class Scratch(HullInput input)
    {
        public BlockSimplex Solver { get; } = new(input.ComponentCount);
        public int[] Basis { get; } = new int[input.ComponentCount];
        public double[] Weights { get; } = new double[input.ComponentCount];
        public double[] X { get; } = new double[input.ComponentCount];
        public double[] Tilt { get; } = new double[input.ComponentCount];
        public List<int> Columns { get; } = [];
        public double[] Lambda { get; set; } = [];
        public double[] Gap { get; set; } = [];
        public List<int> Support { get; } = new(input.ComponentCount);
        public List<int> Outside { get; } = new(input.ComponentCount);

        /// <summary>For each composition, the corner whose column list last took it (-1: none), so each is listed once.</summary>
        public int[] ListedFor { get; } = NoneListed(input.CompositionCount);

        private static int[] NoneListed(int compositions)
        {
            var listed = new int[compositions];
            Array.Fill(listed, -1);
            return listed;
        }
    }

    /// <summary>The finished hull's facets: corners, factorised corner matrices and planes, n (or n × n) per facet.</summary>
    private readonly record struct FacetTable(int[] Vertices, double[] Lu, int[] Pivots, double[] Mu);
}
