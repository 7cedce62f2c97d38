using Hull.Core.Thermo;

namespace Hull.Core.Windows;

/// <summary>Stability windows of compounds and slices through them (see <see cref="StabilityWindow"/>).</summary>
public static class StabilityWindows
{
    /// <summary>The window of the entry <paramref name="entryId"/> of a hull over the entry's own elements.</summary>
    /// <exception cref="WindowInputException">Unknown entry, an entry lacking some of the hull's elements, a bad option.</exception>
    public static StabilityWindow Of(SystemHull hull, string entryId, WindowOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(hull);
        WindowSetup setup = WindowSetup.Prepare(hull, entryId, options ?? WindowOptions.Default);
        if (setup.Kind == WindowKind.AboveHull) return setup.NoWindow();
        return setup.Describe(VertexEnumeration.Enumerate(setup.Definition([], [])));
    }

    /// <summary>
    /// The window with some potentials held fixed. When the slice misses the window, the answer says so and gives
    /// the window's point nearest to it (Euclidean distance over the fixed potentials, eV).
    /// </summary>
    /// <param name="hull">The hull over the entry's own elements.</param>
    /// <param name="entryId">The compound's entry id.</param>
    /// <param name="fixedPotentialsEv">Element → Δμ (eV); at least one, each an element of the hull.</param>
    /// <param name="allowAboveReference">Accept fixed values above 0 (they always miss; the nearest point is then the answer).</param>
    /// <param name="options">How to treat a compound that is no hull vertex.</param>
    /// <exception cref="WindowInputException">Bad entry, an element outside the system, a non-finite value or one above 0 unasked.</exception>
    public static WindowSlice Slice(
        SystemHull hull, string entryId, IReadOnlyDictionary<string, double> fixedPotentialsEv, bool allowAboveReference = false,
        WindowOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(hull);
        ArgumentNullException.ThrowIfNull(fixedPotentialsEv);
        WindowSetup setup = WindowSetup.Prepare(hull, entryId, options ?? WindowOptions.Default);
        if (fixedPotentialsEv.Count == 0) throw new WindowInputException("A slice needs at least one fixed potential.", WindowInputSubject.Slice);
        var fixedAt = new List<int>();
        var values = new List<double>();
        var equalities = new List<HalfSpace>();
        foreach ((string element, double value) in fixedPotentialsEv.OrderBy(p => p.Key, StringComparer.Ordinal))
        {
            int at = Array.IndexOf(setup.Elements, element);
            if (at < 0)
            {
                throw new WindowInputException(
                    $"The slice fixes Δμ({element}), but {element} is not an element of {hull.SystemName}.", WindowInputSubject.Slice, element);
            }

            if (!double.IsFinite(value))
            {
                throw new WindowInputException($"The slice fixes Δμ({element}) = {value}; values must be finite numbers of eV.", WindowInputSubject.Slice, element);
            }

            if (value > 0 && !allowAboveReference)
            {
                throw new WindowInputException(
                    $"The slice fixes Δμ({element}) = {value} eV, above the element's reference (0); such a slice never meets a window. " +
                    "Say so explicitly to get the nearest window point instead.",
                    WindowInputSubject.Slice, element);
            }

            var normal = new double[setup.Elements.Length];
            normal[at] = 1;
            equalities.Add(new HalfSpace(normal, value, -1));
            fixedAt.Add(at);
            values.Add(value);
        }

        if (setup.Kind == WindowKind.AboveHull) return new WindowSlice(setup.NoWindow(), setup.NoWindow(), fixedAt.Select(i => setup.Elements[i]).ToArray(), values, null, null);
        StabilityWindow whole = setup.Describe(VertexEnumeration.Enumerate(setup.Definition([], [])));
        StabilityWindow slice = setup.Describe(VertexEnumeration.Enumerate(setup.Definition(equalities, fixedAt)));
        string[] names = fixedAt.Select(i => setup.Elements[i]).ToArray();
        if (slice.Exists || !whole.Exists) return new WindowSlice(whole, slice, names, values, null, null);

        var shifted = whole.Vertices
            .Select(v => (IReadOnlyList<double>)fixedAt.Select((i, k) => v.ChemicalPotentialsEv[i] - values[k]).ToArray())
            .ToArray();
        double[] weights = NearestPoint.WeightsNearestOrigin(shifted);
        var nearest = new double[setup.Elements.Length];
        for (int v = 0; v < weights.Length; v++)
        {
            for (int i = 0; i < nearest.Length; i++) nearest[i] += weights[v] * whole.Vertices[v].ChemicalPotentialsEv[i];
        }

        double distance = Math.Sqrt(fixedAt.Select((i, k) => (nearest[i] - values[k]) * (nearest[i] - values[k])).Sum());
        return new WindowSlice(whole, slice, names, values, nearest, distance);
    }
}
