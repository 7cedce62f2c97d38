using Hull.Core.Thermo;

namespace Hull.Core.Windows;

/// <summary>
/// Windows in the plane of two chosen potentials (see <see cref="WindowMap"/>): the whole window of a two- or
/// three-element compound, or for more elements its section at fixed values of all but one of the other
/// potentials (that one follows from the compound's equality).
/// </summary>
public static class WindowMaps
{
    /// <summary>Coefficients below this (per eV) leave a constraint constant in the plane: it is no line there.</summary>
    private const double FlatCoefficient = 1e-12;

    /// <param name="hull">The hull over the entry's own elements.</param>
    /// <param name="entryId">The compound's entry id.</param>
    /// <param name="xElement">The potential along x.</param>
    /// <param name="yElement">The potential along y.</param>
    /// <param name="section">
    /// For four or more elements: Δμ (eV) of all elements but x, y and one more; null or empty = at the mean of the
    /// window's vertices, the element with most atoms in the compound left to follow. Must be empty for two or
    /// three elements.
    /// </param>
    /// <param name="options">How to treat a compound that is no hull vertex.</param>
    /// <exception cref="WindowInputException">A bad entry, axis or section (the message says which and why).</exception>
    public static WindowMap Of(
        SystemHull hull, string entryId, string xElement, string yElement, IReadOnlyDictionary<string, double>? section = null,
        WindowOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(hull);
        WindowSetup setup = WindowSetup.Prepare(hull, entryId, options ?? WindowOptions.Default);
        string[] elements = setup.Elements;
        int x = Axis(elements, xElement, "x", hull.SystemName);
        int y = Axis(elements, yElement, "y", hull.SystemName);
        if (x == y) throw new WindowInputException($"Both axes of the map are Δμ({xElement}); choose two different elements.", WindowInputSubject.MapAxis, yElement);
        string[] others = elements.Where((_, i) => i != x && i != y).ToArray();
        section ??= new Dictionary<string, double>();
        if (elements.Length <= 3 && section.Count > 0)
        {
            throw new WindowInputException(
                $"A map of {hull.SystemName} on Δμ({xElement}) and Δμ({yElement}) shows the whole window; it takes no section potentials.",
                WindowInputSubject.Slice, section.Keys.Order(StringComparer.Ordinal).First());
        }

        if (setup.Kind == WindowKind.AboveHull)
        {
            StabilityWindow none = setup.NoWindow();
            return new WindowMap(none, none, xElement, yElement, others.Length == 0 ? null : others[0], section, [], [], false, null);
        }

        StabilityWindow whole = setup.Describe(VertexEnumeration.Enumerate(setup.Definition([], [])));
        bool byDefault = false;
        string? dependent = null;
        var fixedAt = new Dictionary<string, double>(StringComparer.Ordinal);
        if (others.Length == 1)
        {
            dependent = others[0];
        }
        else if (others.Length > 1 && section.Count == 0)
        {
            // The most abundant element follows (as the projected size leaves it out); the rest sit at the vertices' mean.
            dependent = others.OrderBy(e => -(double)setup.Compound.Composition.AmountOf(e)).ThenBy(e => -Array.IndexOf(elements, e)).First();
            foreach (string e in others.Where(e => e != dependent))
            {
                int at = Array.IndexOf(elements, e);
                fixedAt[e] = whole.Vertices.Average(v => v.ChemicalPotentialsEv[at]);
            }

            byDefault = true;
        }
        else if (others.Length > 1)
        {
            foreach (string e in section.Keys.Order(StringComparer.Ordinal))
            {
                if (e == xElement || e == yElement)
                {
                    throw new WindowInputException($"The section fixes Δμ({e}), but {e} is an axis of the map.", WindowInputSubject.Slice, e);
                }

                if (!others.Contains(e, StringComparer.Ordinal))
                {
                    throw new WindowInputException($"The section fixes Δμ({e}), but {e} is not an element of {hull.SystemName}.", WindowInputSubject.Slice, e);
                }
            }

            string[] open = others.Where(e => !section.ContainsKey(e)).ToArray();
            if (open.Length != 1)
            {
                throw new WindowInputException(
                    $"A section of the {hull.SystemName} window on Δμ({xElement}) and Δμ({yElement}) fixes all but one of {string.Join(", ", others)} " +
                    $"({others.Length - 1} values); {section.Count} given{(open.Length > 1 ? $", open: {string.Join(", ", open)}" : string.Empty)}.",
                    WindowInputSubject.Slice);
            }

            dependent = open[0];
            foreach ((string e, double v) in section) fixedAt[e] = v;
        }

        StabilityWindow drawn = whole;
        IReadOnlyList<double>? nearest = null;
        if (fixedAt.Count > 0)
        {
            WindowSlice slice = StabilityWindows.Slice(hull, entryId, fixedAt, allowAboveReference: false, options);
            drawn = slice.Slice;
            nearest = slice.NearestPointEv;
        }

        double[] xc = WindowSetup.Fractions(setup.Compound.Composition, elements);
        // The compound's plane holds at every window point: its energy there, from any vertex.
        double energy = whole.Vertices[0].ChemicalPotentialsEv.Select((v, i) => xc[i] * v).Sum();
        int d = dependent is null ? -1 : Array.IndexOf(elements, dependent);
        var fixedIndex = fixedAt.Select(p => (Index: Array.IndexOf(elements, p.Key), Value: p.Value)).ToArray();
        var lines = new List<WindowMapLine>();
        void Add(WindowMapLineKind kind, string id, string label, double[] m, double e, bool bounds)
        {
            double a = m[x], b = m[y], c = e;
            foreach ((int f, double v) in fixedIndex) c -= m[f] * v;
            if (d >= 0)
            {
                double k = m[d] / xc[d];
                a -= k * xc[x];
                b -= k * xc[y];
                c -= k * (energy - fixedIndex.Sum(p => xc[p.Index] * p.Value));
            }

            if (Math.Abs(a) < FlatCoefficient && Math.Abs(b) < FlatCoefficient) return;
            lines.Add(new WindowMapLine(kind, id, label, a, b, c, bounds));
        }

        var limiting = new HashSet<string>(drawn.Vertices.SelectMany(v => v.LimitingPhases).Select(p => p.Id), StringComparer.Ordinal);
        foreach (HullPhase p in setup.Constraints)
        {
            Add(WindowMapLineKind.CompetingPhase, p.Id, p.Composition.Formula, WindowSetup.Fractions(p.Composition, elements), p.AxisEnergyEvPerAtom, limiting.Contains(p.Id));
        }

        foreach (HullPhase p in whole.CoexistingPhases)
        {
            Add(WindowMapLineKind.Coexisting, p.Id, p.Composition.Formula, WindowSetup.Fractions(p.Composition, elements), p.AxisEnergyEvPerAtom, true);
        }

        if (d < 0) Add(WindowMapLineKind.Coexisting, setup.Compound.Id, setup.Compound.Composition.ReducedFormula, xc, energy, true);
        var atReference = new HashSet<string>(drawn.Vertices.SelectMany(v => v.ElementsAtReference), StringComparer.Ordinal);
        for (int i = 0; i < elements.Length; i++)
        {
            if (fixedAt.ContainsKey(elements[i])) continue;
            var unit = new double[elements.Length];
            unit[i] = 1;
            Add(WindowMapLineKind.ElementReference, elements[i], elements[i], unit, 0, atReference.Contains(elements[i]));
        }

        return new WindowMap(whole, drawn, xElement, yElement, dependent, fixedAt, Ordered(drawn, x, y), lines, byDefault, nearest);
    }

    /// <summary>
    /// The axes a map takes when none are named: the first two elements (in the hull's order) other than the one with
    /// most atoms in the compound (the last such), so an oxide is drawn on its cation potentials; a binary on both.
    /// </summary>
    /// <exception cref="WindowInputException">Unknown entry.</exception>
    public static (string X, string Y) DefaultAxes(SystemHull hull, string entryId)
    {
        ArgumentNullException.ThrowIfNull(hull);
        string[] elements = [.. hull.Components];
        if (elements.Length <= 2) return (elements[0], elements[^1]);
        EntryStability compound;
        try
        {
            compound = hull.GetEntry(entryId);
        }
        catch (KeyNotFoundException)
        {
            throw new WindowInputException($"No entry '{entryId}' in the hull of {hull.SystemName}.", WindowInputSubject.Compound);
        }

        string most = Enumerable.Reverse(elements).MaxBy(e => compound.Composition.AmountOf(e))!;
        string[] rest = elements.Where(e => e != most).ToArray();
        return (rest[0], rest[1]);
    }

    private static int Axis(string[] elements, string element, string which, string system)
    {
        int at = Array.IndexOf(elements, element);
        if (at < 0)
        {
            throw new WindowInputException($"The map's {which} axis is Δμ({element}), but {element} is not an element of {system}.", WindowInputSubject.MapAxis, element);
        }

        return at;
    }

    /// <summary>The drawn vertices around the boundary (a polygon) or along the segment.</summary>
    private static WindowMapVertex[] Ordered(StabilityWindow drawn, int x, int y)
    {
        WindowMapVertex[] points = drawn.Vertices.Select(v => new WindowMapVertex(v.ChemicalPotentialsEv[x], v.ChemicalPotentialsEv[y], v)).ToArray();
        if (points.Length < 3 || drawn.Dimension < 2)
        {
            return points.OrderBy(p => p.X).ThenBy(p => p.Y).ToArray();
        }

        double cx = points.Average(p => p.X), cy = points.Average(p => p.Y);
        return points.OrderBy(p => Math.Atan2(p.Y - cy, p.X - cx)).ToArray();
    }
}
