using System.Numerics;

namespace Hull.Core.Geometry;

/// <summary>
/// The points a composition can decompose into: every representative point whose components are a subset of a
/// given set (a support mask), with their fractions restricted to that set, stored one component row after another
/// so that pricing all of them against a plane is a run of vector multiply-adds.
/// </summary>
internal sealed class ColumnBlock
{
    private ColumnBlock(ulong mask, int[] components, int[] points, double[] rows, double[] energies, int[] cornerColumns)
    {
        Mask = mask;
        Components = components;
        Points = points;
        Rows = rows;
        Energies = energies;
        CornerColumns = cornerColumns;
        _count = points.Length;
    }

    // Columns in use: all of Points, except in a scratch block (see Scratch), whose arrays are sized for the most.
    private int _count;

    // A scratch block's component and corner arrays, one pair per number of rows (the solver reads their lengths).
    private int[][]? _componentsOfRows;
    private int[][]? _cornersOfRows;

    /// <summary>The components of this block as a bit set.</summary>
    public ulong Mask { get; private set; }

    /// <summary>The component index of each row, ascending.</summary>
    public int[] Components { get; private set; }

    /// <summary>The input point of each column (in a scratch block, the first <see cref="Count"/> entries).</summary>
    public int[] Points { get; }

    /// <summary>Number of columns.</summary>
    public int Count => _count;

    /// <summary>Row r's fractions are [r * Stride, r * Stride + Count).</summary>
    public int Stride => _count;

    /// <summary>Fractions, row-major by component.</summary>
    public double[] Rows { get; }

    /// <summary>Energy per atom of each column.</summary>
    public double[] Energies { get; }

    /// <summary>For each row, the column of the pure point of that component.</summary>
    public int[] CornerColumns { get; private set; }

    /// <summary>The first column of the points whose mask is exactly <see cref="Mask"/> (they are consecutive, in group order), or -1.</summary>
    public int OwnGroupStart { get; private init; } = -1;

    /// <summary>
    /// An empty block to be filled again and again by <see cref="Refill"/>, with up to <paramref name="capacity"/>
    /// columns of up to <paramref name="maxRows"/> rows: one per thread, so that many small programs (one per
    /// composition and sample of uncertain energies) allocate nothing.
    /// </summary>
    public static ColumnBlock Scratch(int maxRows, int capacity)
    {
        var block = new ColumnBlock(0, [], new int[capacity], new double[maxRows * capacity], new double[capacity], [])
        {
            _componentsOfRows = new int[maxRows + 1][],
            _cornersOfRows = new int[maxRows + 1][],
        };
        block._count = 0;
        for (int k = 0; k <= maxRows; k++)
        {
            block._componentsOfRows[k] = new int[k];
            block._cornersOfRows[k] = new int[k];
        }
        return block;
    }

    /// <summary>
    /// Makes this scratch block the columns <paramref name="points"/> over the rows <paramref name="components"/>
    /// (ascending), at the energies <paramref name="energyByPoint"/> (indexed by input point); exactly one of the
    /// points must be the pure point of each row's component.
    /// </summary>
    public void Refill(ReadOnlySpan<int> components, ReadOnlySpan<int> points, HullInput input, ReadOnlySpan<double> energyByPoint)
    {
        if (_componentsOfRows is null || _cornersOfRows is null) throw new InvalidOperationException("Only a scratch block is filled again.");
        int k = components.Length;
        int count = points.Length;
        if (k >= _componentsOfRows.Length || count > Points.Length) throw new ArgumentException("The columns do not fit the scratch block.");
        int[] rowComponents = _componentsOfRows[k];
        int[] corners = _cornersOfRows[k];
        components.CopyTo(rowComponents);
        Array.Fill(corners, -1);
        ulong mask = 0;
        foreach (int c in components) mask |= c < 64 ? 1UL << c : 0;
        for (int j = 0; j < count; j++)
        {
            int p = points[j];
            Points[j] = p;
            Energies[j] = energyByPoint[p];
            var x = input.FractionsOf(p);
            for (int r = 0; r < k; r++)
            {
                double fraction = x[rowComponents[r]];
                Rows[r * count + j] = fraction;
                if (fraction == 1.0) corners[r] = j;
            }
        }
        for (int r = 0; r < k; r++)
        {
            if (corners[r] < 0) throw new ArgumentException($"The columns hold no pure point of component {rowComponents[r]}.", nameof(points));
        }
        Mask = mask;
        Components = rowComponents;
        CornerColumns = corners;
        _count = count;
    }

    /// <summary>A composition's fractions (one per component of the whole space) restricted to this block's rows.</summary>
    public void Restrict(ReadOnlySpan<double> fractions, Span<double> x)
    {
        for (int r = 0; r < Components.Length; r++) x[r] = fractions[Components[r]];
    }

    /// <summary>
    /// Gathers the columns of <paramref name="mask"/> from the representative points grouped by their own masks.
    /// </summary>
    public static ColumnBlock Gather(ulong mask, IReadOnlyList<(ulong Mask, int[] Points)> groups, HullInput input)
    {
        var points = new List<int>();
        int ownStart = -1;
        foreach (var (m, groupPoints) in groups)
        {
            if ((m & ~mask) != 0) continue;
            if (m == mask) ownStart = points.Count;
            points.AddRange(groupPoints);
        }
        var components = new int[BitOperations.PopCount(mask)];
        for (int r = 0, c = 0; r < components.Length; c++)
        {
            if ((mask & (1UL << c)) != 0) components[r++] = c;
        }
        return Make(mask, components, points, input, ownStart,
            c => new ArgumentException($"No point consists of component {c} alone; every component needs a pure end point to anchor the hull."));
    }

    /// <summary>
    /// A block over an explicit list of points, all made of <paramref name="components"/> only (ascending); the
    /// list must hold the pure point of each of them. <see cref="Mask"/> is 0 when a component index is 64 or more.
    /// </summary>
    public static ColumnBlock FromPoints(int[] components, IReadOnlyList<int> points, HullInput input)
    {
        ulong mask = 0;
        bool wide = false;
        foreach (int c in components)
        {
            if (c < 64) mask |= 1UL << c;
            else wide = true;
        }
        return Make(wide ? 0 : mask, components, points, input, ownStart: -1,
            c => new ArgumentException($"The block's points hold no pure point of component {c}.", nameof(points)));
    }

    private static ColumnBlock Make(ulong mask, int[] components, IReadOnlyList<int> points, HullInput input, int ownStart,
        Func<int, ArgumentException> missingCorner)
    {
        int n = input.ComponentCount;
        int k = components.Length;
        int count = points.Count;
        var rows = new double[k * count];
        var energies = new double[count];
        var columnPoints = new int[count];
        var corners = new int[k];
        Array.Fill(corners, -1);
        for (int j = 0; j < count; j++)
        {
            int p = points[j];
            columnPoints[j] = p;
            energies[j] = input.Energies[p];
            var amounts = input.Row(p);
            int nonzero = -1, nonzeroCount = 0;
            for (int c = 0; c < n; c++)
            {
                if (amounts[c] != 0) { nonzero = c; nonzeroCount++; }
            }
            var x = input.FractionsOf(p);
            for (int r = 0; r < k; r++) rows[r * count + j] = x[components[r]];
            if (nonzeroCount == 1)
            {
                int r = Array.BinarySearch(components, nonzero);
                if (r < 0) throw new ArgumentException($"Point {p} consists of component {nonzero}, which is not in the block.", "points");
                corners[r] = j;
            }
        }
        for (int r = 0; r < k; r++)
        {
            if (corners[r] < 0) throw missingCorner(components[r]);
        }
        return new ColumnBlock(mask, components, columnPoints, rows, energies, corners) { OwnGroupStart = ownStart };
    }
}
