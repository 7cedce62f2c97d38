using System.Globalization;
using Hull.Core.Thermo;
using Hull.Core.Windows;

namespace Hull.Core.Defects.Conditions;

/// <summary>
/// The chemical-potential points a defect study is evaluated at: the vertices of the host's stability window (or of
/// a slice through it), named by the phases the host coexists with there, or a point given outright. Elements a
/// defect exchanges that the host lacks (dopants) sit at the highest Δμ the host allows at each point unless given.
/// </summary>
public static class DefectConditionPoints
{
    /// <summary>The label of a point given outright.</summary>
    public const string GivenLabel = "given";

    /// <summary>The name of a vertex no phase bounds (a slice's point fixed by its equalities alone).</summary>
    public const string InteriorName = "interior";

    /// <summary>
    /// A vertex's name: the formulas of the phases the host coexists with there (its limiting phases, and each
    /// element at its reference by its symbol), in ordinal order, joined by '+'.
    /// </summary>
    public static string VertexName(WindowVertex vertex)
    {
        ArgumentNullException.ThrowIfNull(vertex);
        var names = new SortedSet<string>(StringComparer.Ordinal);
        foreach (HullPhase phase in vertex.LimitingPhases) names.Add(phase.Composition.ReducedFormula);
        foreach (string element in vertex.ElementsAtReference) names.Add(element);
        return names.Count == 0 ? InteriorName : string.Join('+', names);
    }

    /// <summary>
    /// One point per vertex of <paramref name="window"/> (a window or a slice's window), in its vertex order, each with
    /// every dopant of <paramref name="dopantHulls"/> at its limit there and <paramref name="fixedOutside"/> (Δμ of
    /// elements outside the host fixed by the caller, e.g. a gas) as given.
    /// </summary>
    /// <param name="window">The host's window; it must have vertices.</param>
    /// <param name="dopantHulls">Per dopant element, the hull over the host's elements and it.</param>
    /// <param name="fixedOutside">Δμ of elements that are not the host's and are not dopants at a limit; may be empty.</param>
    /// <param name="conditionText">What fixed the slice (e.g. "O2 at 1000 K, 0.21 bar"), added to each vertex name; null for a whole window.</param>
    public static IReadOnlyList<DefectConditionPoint> AtVertices(
        StabilityWindow window, IReadOnlyDictionary<string, SystemHull> dopantHulls,
        IReadOnlyDictionary<string, double>? fixedOutside = null, string? conditionText = null)
    {
        ArgumentNullException.ThrowIfNull(window);
        ArgumentNullException.ThrowIfNull(dopantHulls);
        var points = new List<DefectConditionPoint>(window.Vertices.Count);
        for (int v = 0; v < window.Vertices.Count; v++)
        {
            WindowVertex vertex = window.Vertices[v];
            var mu = new Dictionary<string, double>(StringComparer.Ordinal);
            for (int i = 0; i < window.Elements.Count; i++) mu[window.Elements[i]] = vertex.ChemicalPotentialsEv[i];
            var dopants = new List<DopantPotential>();
            foreach ((string element, double value) in (fixedOutside ?? new Dictionary<string, double>()).OrderBy(p => p.Key, StringComparer.Ordinal))
            {
                mu[element] = value;
                dopants.Add(new DopantPotential(element, value, [], value >= 0, Given: true));
            }

            foreach ((string dopant, SystemHull extended) in dopantHulls.OrderBy(p => p.Key, StringComparer.Ordinal))
            {
                if (mu.ContainsKey(dopant)) continue;
                DopantPotential limit = DopantCeiling(extended, window.Elements, vertex.ChemicalPotentialsEv, dopant);
                mu[dopant] = limit.DeltaMuEv;
                dopants.Add(limit);
            }

            string name = VertexName(vertex);
            string label = conditionText is null ? name : name == InteriorName ? conditionText : $"{name}, {conditionText}";
            points.Add(new DefectConditionPoint(new ChemicalPotentialPoint(label, mu), v + 1,
                [.. vertex.LimitingPhases.Select(p => p.Id).Order(StringComparer.Ordinal)], dopants));
        }

        return points;
    }

    /// <summary>
    /// The highest Δμ of <paramref name="dopant"/> at host potentials <paramref name="hostPotentialsEv"/> (in
    /// <paramref name="hostElements"/> order) before a phase of the dopant with the host's elements forms:
    /// min(0, min_j [E_j − Σ_i x_ji Δμ_i] / x_jX) over the stable phases j of <paramref name="extended"/> that
    /// contain the dopant, per atom on the formation-energy axis.
    /// </summary>
    public static DopantPotential DopantCeiling(SystemHull extended, IReadOnlyList<string> hostElements, IReadOnlyList<double> hostPotentialsEv, string dopant)
    {
        ArgumentNullException.ThrowIfNull(extended);
        var limits = new List<(HullPhase Phase, double Limit)>();
        foreach (HullPhase phase in extended.StablePhases)
        {
            if (!phase.Composition.Contains(dopant) || WindowSetup.IsBareReference(phase)) continue;
            double rest = phase.AxisEnergyEvPerAtom;
            for (int i = 0; i < hostElements.Count; i++) rest -= phase.Composition.AtomicFraction(hostElements[i]) * hostPotentialsEv[i];
            limits.Add((phase, rest / phase.Composition.AtomicFraction(dopant)));
        }

        double best = limits.Count == 0 ? 0 : Math.Min(0, limits.Min(l => l.Limit));
        string[] limiting = [.. limits.Where(l => l.Limit <= best + PolytopeTolerances.SlackEv).Select(l => l.Phase.Id).Order(StringComparer.Ordinal)];
        return new DopantPotential(dopant, best, limiting, best >= -PolytopeTolerances.SlackEv, Given: false);
    }

    /// <summary>
    /// A point given outright, with doubts in <paramref name="warnings"/>: a host that is not at its formation
    /// energy there, a competing phase of the host's system or a dopant phase that would form, a Δμ above 0.
    /// Dopants of <paramref name="dopantHulls"/> that the point does not give are put at their limit.
    /// </summary>
    /// <param name="window">The host's window (for its elements, the host and the hull's stable phases).</param>
    /// <param name="hostHull">The hull over the host's elements.</param>
    /// <param name="givenEv">Δμ per element.</param>
    /// <param name="dopantHulls">Per dopant element, the hull over the host's elements and it.</param>
    /// <param name="warnings">Receives the doubts.</param>
    public static DefectConditionPoint Given(
        StabilityWindow window, SystemHull hostHull, IReadOnlyDictionary<string, double> givenEv,
        IReadOnlyDictionary<string, SystemHull> dopantHulls, List<string> warnings)
    {
        ArgumentNullException.ThrowIfNull(window);
        ArgumentNullException.ThrowIfNull(hostHull);
        ArgumentNullException.ThrowIfNull(givenEv);
        ArgumentNullException.ThrowIfNull(warnings);
        foreach ((string element, double value) in givenEv)
        {
            if (!double.IsFinite(value)) throw new DefectInputException($"conditions.point.{element}", $"Δμ of {element} must be a finite number of eV, not {value}");
            if (value > PolytopeTolerances.SlackEv) warnings.Add(Invariant($"Δμ({element}) = {value:0.####} eV is above the element's reference: {element} itself would form"));
        }

        var missing = window.Elements.Where(e => !givenEv.ContainsKey(e)).ToArray();
        if (missing.Length > 0)
        {
            throw new DefectInputException($"conditions.point.{missing[0]}", $"the point gives no Δμ for the host element {missing[0]}; give every host element ({string.Join(", ", window.Elements)})");
        }

        double[] host = [.. window.Elements.Select(e => givenEv[e])];
        Thermo.EntryStability compound = window.Compound;
        double onPlane = Dot(compound.Composition, window.Elements, host) - compound.AxisEnergyEvPerAtom;
        if (Math.Abs(onPlane) > DefectTolerances.GivenPointOffPlaneEvPerAtom)
        {
            warnings.Add(Invariant($"the given point is {onPlane:+0.####;-0.####} eV/atom off the host's formation energy (Σ x_i Δμ_i = {compound.AxisEnergyEvPerAtom:0.####} eV/atom for {compound.Composition.Formula}): the host is not in equilibrium with this reservoir"));
        }

        foreach (HullPhase phase in hostHull.StablePhases)
        {
            if (phase.Id == compound.Id || WindowSetup.IsBareReference(phase)) continue;
            double excess = Dot(phase.Composition, window.Elements, host) - phase.AxisEnergyEvPerAtom;
            if (excess > DefectTolerances.GivenPointOffPlaneEvPerAtom)
            {
                warnings.Add(Invariant($"at the given point {phase.Composition.ReducedFormula} ({phase.Id}) would form: the point is {excess:0.####} eV/atom outside the host's window"));
            }
        }

        var mu = new Dictionary<string, double>(givenEv, StringComparer.Ordinal);
        var dopants = new List<DopantPotential>();
        foreach ((string dopant, SystemHull extended) in dopantHulls.OrderBy(p => p.Key, StringComparer.Ordinal))
        {
            DopantPotential ceiling = DopantCeiling(extended, window.Elements, host, dopant);
            if (givenEv.TryGetValue(dopant, out double value))
            {
                if (value > ceiling.DeltaMuEv + DefectTolerances.GivenPointOffPlaneEvPerAtom && ceiling.LimitingPhaseIds.Count > 0)
                {
                    warnings.Add(Invariant($"Δμ({dopant}) = {value:0.####} eV is above its solubility limit {ceiling.DeltaMuEv:0.####} eV there: {string.Join(", ", ceiling.LimitingPhaseIds)} would form"));
                }

                dopants.Add(new DopantPotential(dopant, value, [], value >= 0, Given: true));
            }
            else
            {
                mu[dopant] = ceiling.DeltaMuEv;
                dopants.Add(ceiling);
            }
        }

        return new DefectConditionPoint(new ChemicalPotentialPoint(GivenLabel, mu), 0, [], dopants);
    }

    /// <summary>The point named by <paramref name="selector"/>: a 1-based vertex number or a vertex name.</summary>
    public static DefectConditionPoint Select(IReadOnlyList<DefectConditionPoint> points, string selector, string field = "conditions.vertex")
    {
        ArgumentNullException.ThrowIfNull(points);
        string text = (selector ?? string.Empty).Trim();
        if (int.TryParse(text, NumberStyles.None, CultureInfo.InvariantCulture, out int number) && number >= 1 && number <= points.Count)
        {
            return points[number - 1];
        }

        DefectConditionPoint? named = points.FirstOrDefault(p => string.Equals(p.Label, text, StringComparison.Ordinal));
        return named ?? throw new DefectInputException(field,
            $"'{selector}' is neither a vertex number (1 to {points.Count}) nor a vertex name; the vertices are {string.Join(", ", points.Select(p => $"{p.VertexNumber} ({p.Label})"))}");
    }

    private static double Dot(Chemistry.Composition composition, IReadOnlyList<string> elements, IReadOnlyList<double> mu)
    {
        double sum = 0;
        for (int i = 0; i < elements.Count; i++) sum += composition.AtomicFraction(elements[i]) * mu[i];
        return sum;
    }

    private static string Invariant(FormattableString text) => text.ToString(CultureInfo.InvariantCulture);
}
