using Hull.Core.Chemistry;
using Hull.Core.Geometry;
using Hull.Core.Thermo.Lines;

namespace Hull.Core.Thermo;

public sealed partial class SystemHull
{
    // The floating-point pre-selection of facets keeps anything within this much of the path (in formula units of
    // the facet's phases per unit of the path's amounts): generous, since the exact solve decides.
    private const double LinePreselectionSlack = 1e-6;

    /// <summary>The atoms each component contributes to one formula unit of <paramref name="composition"/> (exact).</summary>
    /// <exception cref="ThermoInputException">When the composition lies outside the system.</exception>
    public IReadOnlyList<Rational> ComponentAtomsOf(Composition composition) => Array.AsReadOnly(MapQuery(composition));

    /// <summary>
    /// The hull along the straight path S + s·D of component amounts, s from 0 to <paramref name="maxParameter"/>
    /// (null: without end; the path must then stay in the system for every s ≥ 0): the stretches of the path in
    /// each face of the hull, in path order, with their phases and the slope of the hull energy. Every breakpoint of
    /// the piecewise-linear hull energy along the path is a stretch's end, found exactly (rational arithmetic).
    /// </summary>
    /// <param name="startAtoms">S, amounts per component (non-negative, not all 0).</param>
    /// <param name="directionAtoms">D, amounts per component; S + s·D must stay non-negative on the path.</param>
    /// <param name="maxParameter">The path's end, > 0; null for an open-ended path.</param>
    /// <exception cref="ThermoInputException">Amounts of the wrong length, a path leaving the system, a bad end.</exception>
    public IReadOnlyList<HullLineSegment> SegmentsAlong(
        IReadOnlyList<Rational> startAtoms, IReadOnlyList<Rational> directionAtoms, Rational? maxParameter)
    {
        ArgumentNullException.ThrowIfNull(startAtoms);
        ArgumentNullException.ThrowIfNull(directionAtoms);
        int n = _space.Names.Count;
        if (startAtoms.Count != n || directionAtoms.Count != n)
        {
            throw new ThermoInputException($"A path across the hull of {SystemName} needs {n} amounts for its start and its direction.");
        }

        if (maxParameter is { } end && end.Sign <= 0)
        {
            throw new ThermoInputException($"A path across the hull of {SystemName} needs an end above 0; got {end}.");
        }

        Rational[] start = startAtoms.ToArray();
        Rational[] direction = directionAtoms.ToArray();
        CheckPathInSystem(start, direction, maxParameter);

        var found = new List<HullLineSegment>();
        var seen = new HashSet<(Rational, Rational?)>();
        LowerHull facetHull = _facetHull.Value;
        IReadOnlyList<PhaseFacet> phaseFacets = Facets;
        double maxDouble = maxParameter?.ToDouble() ?? double.PositiveInfinity;
        var matrix = new double[n * n];
        var pivots = new int[n];
        var a = new double[n];
        var b = new double[n];
        for (int f = 0; f < facetHull.Facets.Count; f++)
        {
            IReadOnlyList<int> corners = facetHull.Facets[f].VertexPoints;
            if (corners.Count == n && !MayCross(corners, start, direction, maxDouble, matrix, pivots, a, b))
            {
                continue;
            }

            if (ExactStretch(corners, phaseFacets[f], start, direction, maxParameter) is { } segment
                && seen.Add((segment.From, segment.To)))
            {
                found.Add(segment);
            }
        }

        found.Sort((x, y) => x.From.CompareTo(y.From));
        CheckCovered(found, maxParameter);
        return found;
    }

    private void CheckPathInSystem(Rational[] start, Rational[] direction, Rational? maxParameter)
    {
        bool any = false;
        for (int k = 0; k < start.Length; k++)
        {
            if (start[k].Sign < 0)
            {
                throw new ThermoInputException($"A path across the hull of {SystemName} starts at a negative amount of {_space.Names[k]}.");
            }

            Rational atEnd = maxParameter is { } end ? start[k] + (end * direction[k]) : (direction[k].Sign < 0 ? -Rational.One : start[k]);
            if (atEnd.Sign < 0)
            {
                throw new ThermoInputException($"A path across the hull of {SystemName} leaves the system: the amount of {_space.Names[k]} turns negative.");
            }

            any |= !start[k].IsZero || !direction[k].IsZero;
        }

        if (!any)
        {
            throw new ThermoInputException($"A path across the hull of {SystemName} needs a start or a direction that is not all 0.");
        }
    }

    /// <summary>A quick floating-point test: may the path meet this facet's cone on a stretch of positive length?</summary>
    private bool MayCross(IReadOnlyList<int> corners, Rational[] start, Rational[] direction, double maxParameter,
        double[] matrix, int[] pivots, double[] a, double[] b)
    {
        int n = corners.Count;
        for (int row = 0; row < n; row++)
        {
            for (int col = 0; col < n; col++)
            {
                matrix[(row * n) + col] = _points[corners[col]].ComponentAtoms[row].ToDouble();
            }

            a[row] = start[row].ToDouble();
            b[row] = direction[row].ToDouble();
        }

        double determinant = SmallLinearSolver.Factorize(matrix, n, pivots);
        if (!double.IsFinite(determinant) || Math.Abs(determinant) < 1e-12)
        {
            return true; // let the exact solve decide
        }

        SmallLinearSolver.Solve(matrix, n, pivots, a);
        SmallLinearSolver.Solve(matrix, n, pivots, b);
        double lo = 0.0, hi = maxParameter;
        for (int j = 0; j < n; j++)
        {
            double slack = LinePreselectionSlack * (1.0 + Math.Abs(a[j]) + Math.Abs(b[j]));
            if (b[j] > 0)
            {
                lo = Math.Max(lo, (-a[j] - slack) / b[j]);
            }
            else if (b[j] < 0)
            {
                hi = Math.Min(hi, (-a[j] - slack) / b[j]);
            }
            else if (a[j] < -slack)
            {
                return false;
            }
        }

        return lo <= hi + LinePreselectionSlack;
    }

    /// <summary>The exact stretch of the path inside one facet's cone, or null when it only touches it or misses it.</summary>
    private HullLineSegment? ExactStretch(
        IReadOnlyList<int> corners, PhaseFacet facet, Rational[] start, Rational[] direction, Rational? maxParameter)
    {
        var columns = corners.Select(v => _points[v].ComponentAtoms).ToArray();
        Rational[]? a, b;
        try
        {
            a = ExactLinearAlgebra.Solve(columns, start);
            b = ExactLinearAlgebra.Solve(columns, direction);
        }
        catch (OverflowException)
        {
            return null; // beyond 64-bit fractions; the coverage check reports a path left uncovered
        }

        if (a is null || b is null)
        {
            return null;
        }

        Rational lo = Rational.Zero;
        Rational? hi = maxParameter;
        for (int j = 0; j < corners.Count; j++)
        {
            if (b[j].Sign > 0)
            {
                lo = Rational.Max(lo, -a[j] / b[j]);
            }
            else if (b[j].Sign < 0)
            {
                Rational limit = -a[j] / b[j];
                hi = hi is { } h ? Rational.Min(h, limit) : limit;
            }
            else if (a[j].Sign < 0)
            {
                return null;
            }
        }

        if (hi is { } upper && upper <= lo)
        {
            return null;
        }

        var phases = new List<HullLinePhase>(corners.Count);
        for (int j = 0; j < corners.Count; j++)
        {
            if (a[j].IsZero && b[j].IsZero)
            {
                continue;
            }

            HullPoint point = _points[corners[j]];
            phases.Add(new HullLinePhase(point.Phase, a[j], b[j], point.AtomsPerFormulaUnit));
        }

        phases.Sort((x, y) => string.CompareOrdinal(x.Phase.Id, y.Phase.Id));
        double slope = 0.0;
        for (int k = 0; k < direction.Length; k++)
        {
            slope += facet.ChemicalPotentialsEvPerAtom[k] * direction[k].ToDouble();
        }

        return new HullLineSegment(lo, hi, phases, slope, facet.ChemicalPotentialsEvPerAtom);
    }

    private void CheckCovered(List<HullLineSegment> segments, Rational? maxParameter)
    {
        Rational reached = Rational.Zero;
        bool open = false;
        foreach (HullLineSegment segment in segments)
        {
            if (open || segment.From != reached)
            {
                throw new InvalidOperationException(
                    $"The faces of the hull of {SystemName} do not cover the path at parameter {reached} (exact arithmetic overflowed or the hull is degenerate there).");
            }

            if (segment.To is { } to)
            {
                reached = to;
            }
            else
            {
                open = true;
            }
        }

        bool complete = maxParameter is { } end ? !open && reached == end : open;
        if (!complete)
        {
            throw new InvalidOperationException(
                $"The faces of the hull of {SystemName} do not cover the path beyond parameter {reached}.");
        }
    }
}
