using Hull.Core.Chemistry;
using Hull.Core.Thermo;

namespace Hull.Core.Windows;

/// <summary>
/// Dopant chemical-potential limits: the host's window extended by the dopant's potential, with every stable phase
/// of the dopant with the host's elements as a constraint Σ x_ji Δμ_i + x_jX Δμ_X ≤ E_j.
/// </summary>
public static class DopantLimits
{
    /// <summary>
    /// How far below the lowest per-vertex limit the extended polytope is closed (eV): the closing face only has to
    /// lie below every vertex of the upper surface, and 1 eV keeps it clearly apart from them; vertices on it are
    /// artefacts of closing and are not reported.
    /// </summary>
    public const double FloorMarginEv = 1.0;

    /// <param name="host">The hull over the host compound's elements.</param>
    /// <param name="extended">The hull over the host's elements and the dopant, from the same entries.</param>
    /// <param name="entryId">The host compound.</param>
    /// <param name="dopant">The dopant element symbol.</param>
    /// <param name="options">How to treat a host that is no hull vertex.</param>
    /// <exception cref="WindowInputException">Unknown host, a dopant that is no element, is in the host, or has no phase.</exception>
    public static DopantLimit Of(SystemHull host, SystemHull extended, string entryId, string dopant, WindowOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(host);
        ArgumentNullException.ThrowIfNull(extended);
        options ??= WindowOptions.Default;
        if (!ElementTable.IsSymbol(dopant))
        {
            throw new WindowInputException($"Dopant '{dopant}' is not an element symbol.", WindowInputSubject.Dopant, dopant);
        }

        WindowSetup setup = WindowSetup.Prepare(host, entryId, options);
        if (setup.Elements.Contains(dopant, StringComparer.Ordinal))
        {
            throw new WindowInputException(
                $"Dopant {dopant} is already an element of the host {setup.Compound.Composition.Formula}.", WindowInputSubject.Dopant, dopant);
        }

        string[] elements = [.. setup.Elements, dopant];
        if (!extended.Components.OrderBy(c => c, StringComparer.Ordinal).SequenceEqual(elements.Order(StringComparer.Ordinal)))
        {
            throw new ArgumentException($"The extended hull is over {extended.SystemName}, not {string.Join('-', elements.Order(StringComparer.Ordinal))}.", nameof(extended));
        }

        if (!extended.Entries.Any(e => e.Composition.Contains(dopant)))
        {
            throw new WindowInputException(
                $"Dopant {dopant} has no phase in the data: no entry of {string.Join('-', elements.Order(StringComparer.Ordinal))} contains it.",
                WindowInputSubject.Dopant, dopant);
        }

        HullPhase[] dopantPhases = extended.StablePhases
            .Where(p => p.Composition.Contains(dopant) && !WindowSetup.IsBareReference(p))
            .ToArray();
        StabilityWindow window = setup.Kind == WindowKind.AboveHull
            ? setup.NoWindow()
            : setup.Describe(VertexEnumeration.Enumerate(setup.Definition([], [])));
        if (!window.Exists) return new DopantLimit(dopant, window, [], elements, [], dopantPhases.Length);

        int n = setup.Elements.Length;
        double[][] rows = dopantPhases.Select(p => WindowSetup.Fractions(p.Composition, elements)).ToArray();
        var perVertex = new List<HostVertexDopantLimit>();
        for (int v = 0; v < window.Vertices.Count; v++)
        {
            IReadOnlyList<double> mu = window.Vertices[v].ChemicalPotentialsEv;
            var limits = new double[dopantPhases.Length];
            double best = 0;
            for (int j = 0; j < dopantPhases.Length; j++)
            {
                double rest = dopantPhases[j].AxisEnergyEvPerAtom;
                for (int i = 0; i < n; i++) rest -= rows[j][i] * mu[i];
                limits[j] = rest / rows[j][n];
                best = Math.Min(best, limits[j]);
            }

            HullPhase[] limiting = Enumerable.Range(0, dopantPhases.Length)
                .Where(j => limits[j] <= best + PolytopeTolerances.SlackEv)
                .Select(j => dopantPhases[j])
                .OrderBy(p => p.Id, StringComparer.Ordinal)
                .ToArray();
            perVertex.Add(new HostVertexDopantLimit(v, best, limiting, best >= -PolytopeTolerances.SlackEv));
        }

        double floor = perVertex.Min(p => p.MaxDopantPotentialEv) - FloorMarginEv;
        var lower = setup.Lower.Append(floor).ToArray();
        var upper = new double[n + 1];
        var equalities = setup.Equalities.Select(e => new HalfSpace(e.Normal.Append(0.0).ToArray(), e.Bound, e.Label)).ToArray();
        var phases = setup.Constraints.Concat(dopantPhases).ToArray();
        var inequalities = phases.Select((p, k) => new HalfSpace(WindowSetup.Fractions(p.Composition, elements), p.AxisEnergyEvPerAtom, k)).ToArray();
        var definition = new PolytopeDefinition(lower, upper, equalities, inequalities, [setup.ProjectionOmits]);
        PolytopeVertices polytope = VertexEnumeration.Enumerate(definition);
        WindowVertex[] extendedVertices = polytope.Vertices
            .Where(v => !v.TightLowerBounds.Contains(n))
            .OrderByDescending(v => v.Coordinates[n])
            .ThenBy(v => v.Coordinates, LexicographicDescending.Instance)
            .Select(v => new WindowVertex(
                v.Coordinates.ToArray(),
                v.TightLabels.Select(k => phases[k]).OrderBy(p => p.Id, StringComparer.Ordinal).ToArray(),
                v.TightUpperBounds.Select(i => elements[i]).ToArray()))
            .ToArray();
        return new DopantLimit(dopant, window, perVertex, elements, extendedVertices, dopantPhases.Length);
    }
}
