using System.Globalization;
using Hull.Core.Chemistry;
using Hull.Core.Thermo.Gases;
using Hull.Core.Thermo.Solids;

namespace Hull.Core.Thermo.Temperature;

/// <summary>
/// One chemical system made ready for questions at (T, p): the entries of its closed formation-energy hull with their
/// temperature models, the gas whose element is open, and the treatment. Each entry's free energy at T is its
/// formation energy (standing for H at the anchor) plus its model's G(T) − H(anchor); a closed element's reference
/// at T is its pure entry of lowest free energy there (which may change with T); the gas's element takes its Δμ(T, p)
/// from the gas reservoir. The hull at T is then the open-element hull of those free energies
/// (<see cref="OpenElementHull.GrandPotentialEvPerClosedAtom"/> on a <see cref="HullAxis.GrandPotentialAt"/> axis).
/// Immutable.
/// </summary>
public sealed class ThermoSystem
{
    private readonly Member[] _members;
    private readonly string[] _closedElements;
    private readonly double _gasReferenceEvPerAtom;

    private ThermoSystem(SystemHull closed, FreeEnergyTreatment treatment, ThermoGas? gas, Member[] members,
        string[] closedElements, double gasReferenceEvPerAtom, string[] reservoir, string[] unmodelled)
    {
        Closed = closed;
        Treatment = treatment;
        Gas = gas;
        _members = members;
        _closedElements = closedElements;
        _gasReferenceEvPerAtom = gasReferenceEvPerAtom;
        ReservoirEntryIds = reservoir;
        UnmodelledEntryIds = unmodelled;
    }

    /// <summary>The closed formation-energy hull the system was made from.</summary>
    public SystemHull Closed { get; }

    public FreeEnergyTreatment Treatment { get; }

    /// <summary>The gas the open element is exchanged with; null when no element is open.</summary>
    public ThermoGas? Gas { get; }

    /// <summary>Entries made of the gas's element only: the reservoir, never hulled.</summary>
    public IReadOnlyList<string> ReservoirEntryIds { get; }

    /// <summary>Entries without a temperature model, left out of every hull at T (each answer lists them).</summary>
    public IReadOnlyList<string> UnmodelledEntryIds { get; }

    /// <summary>The closed elements (the hull's components at T).</summary>
    public IReadOnlyList<string> ClosedElements => _closedElements;

    /// <summary>The ids of the entries that take part (with a model), in the closed hull's order.</summary>
    public IReadOnlyList<string> ModelledEntryIds => _members.Select(m => m.Entry.Id).ToArray();

    /// <summary>The dataset's reference for the gas's element, eV/atom (0 on a formation-energy scale).</summary>
    public double GasReferenceEvPerAtom => _gasReferenceEvPerAtom;

    /// <summary>
    /// Prepares <paramref name="closed"/> (a formation-energy hull over elements) with <paramref name="models"/>.
    /// </summary>
    /// <exception cref="ThermoInputException">A model on an entry of another composition; a tabulated model under the
    /// Ellingham treatment; a gas whose element is not in the system; a closed element with no modelled pure entry;
    /// a computed-molecule gas on a dataset without a total-energy reference for the gas's element.</exception>
    public static ThermoSystem Prepare(SystemHull closed, TemperatureModelSet models, FreeEnergyTreatment treatment, ThermoGas? gas)
    {
        ArgumentNullException.ThrowIfNull(closed);
        ArgumentNullException.ThrowIfNull(models);
        if (closed.Axis.Quantity != HullAxisQuantity.FormationEnergy || closed.EndMembers is not null)
        {
            throw new ThermoInputException($"Free energies at a temperature start from a formation-energy hull over elements; got {closed.Axis.DisplayName} over {closed.SystemName}.");
        }

        if (!Enum.IsDefined(treatment))
        {
            throw new ThermoInputException($"Unknown free-energy treatment ({(int)treatment}).");
        }

        string? gasElement = gas?.Species.Element;
        double gasReference = 0.0;
        if (gas is not null)
        {
            if (!closed.Components.Contains(gasElement, StringComparer.Ordinal))
            {
                throw new ThermoInputException($"The gas {gas.Species.Formula} exchanges {gasElement}, which is not an element of {closed.SystemName}.", element: gasElement);
            }

            ElementReference? reference = closed.References.FirstOrDefault(r => string.Equals(r.Symbol, gasElement, StringComparison.Ordinal));
            if (reference is null && gas.Mode == GasReferenceMode.ComputedMoleculeEnergy)
            {
                throw new ThermoInputException(
                    $"A computed {gas.Species.Formula} molecule needs the dataset's total-energy reference for {gasElement}, and {closed.SystemName} has none (its energies are formation energies); use the fitted reference.",
                    element: gasElement);
            }

            gasReference = reference?.TotalEnergyEvPerAtom ?? 0.0;
        }

        string[] closedElements = closed.Components.Where(c => !string.Equals(c, gasElement, StringComparison.Ordinal)).ToArray();
        if (closedElements.Length == 0)
        {
            throw new ThermoInputException($"Every element of {closed.SystemName} is the gas's; a hull at (T, p) needs a closed element.");
        }

        var members = new List<Member>();
        var reservoir = new List<string>();
        var unmodelled = new List<string>();
        foreach (EntryStability stability in closed.Entries)
        {
            PhaseEntry entry = stability.Entry;
            if (gasElement is not null && entry.Composition.IsSingleElement && entry.Composition.Contains(gasElement))
            {
                reservoir.Add(entry.Id);
                continue;
            }

            SolidTemperatureModel? model = models.For(entry);
            if (model is null)
            {
                unmodelled.Add(entry.Id);
                continue;
            }

            if (treatment == FreeEnergyTreatment.Ellingham && !model.IsLinearInTemperature)
            {
                throw new ThermoInputException(
                    $"Entry '{entry.Id}' has a tabulated free energy ({model.Describe()}); the Ellingham approximation needs a standard entropy (constant H and S) for every solid. Use the tabulated-gas treatment for tabulated G(T).",
                    entryId: entry.Id);
            }

            members.Add(new Member(entry, stability.FormationEnergyEvPerAtom!.Value, model, gasElement));
        }

        foreach (string element in closedElements)
        {
            if (!members.Any(m => m.PureElement == element))
            {
                throw new ThermoInputException(
                    $"Element {element} of {closed.SystemName} has no pure entry with a temperature model, so its free energy at T, and every formation free energy with {element}, is unknown; give a model (e.g. its standard entropy) for a pure-{element} entry.",
                    element: element);
            }
        }

        return new ThermoSystem(closed, treatment, gas, [.. members], closedElements, gasReference, [.. reservoir], [.. unmodelled]);
    }

    /// <summary>This system with the gas at another pressure (same entries and models).</summary>
    public ThermoSystem AtPressure(double pressureBar)
    {
        ThermoGas gas = Gas ?? throw new ThermoInputException("No gas is open in this system, so it has no pressure to change.");
        return new ThermoSystem(Closed, Treatment, gas.AtPressure(pressureBar), _members, _closedElements, _gasReferenceEvPerAtom,
            [.. ReservoirEntryIds], [.. UnmodelledEntryIds]);
    }

    /// <summary>Δμ of the gas's element at T, by the treatment's gas model; null without gas.</summary>
    /// <exception cref="ThermoInputException">A temperature outside the gas table (tabulated treatment) or not positive.</exception>
    public ChemicalPotentialShift? GasShiftAt(double temperatureK)
    {
        RequireTemperature(temperatureK);
        if (Gas is null) return null;
        GasReservoir reservoir = Gas.Reservoir(_gasReferenceEvPerAtom);
        return Treatment == FreeEnergyTreatment.Ellingham
            ? reservoir.StandardStateShift(temperatureK, Gas.PressureBar, _gasReferenceEvPerAtom, Gas.StandardEntropyJPerMolK)
            : reservoir.Shift(temperatureK, Gas.PressureBar, _gasReferenceEvPerAtom);
    }

    /// <summary>The reference of each closed element at T: its pure entry of lowest free energy per atom there.</summary>
    public IReadOnlyList<ReferenceAtTemperature> ReferencesAt(double temperatureK)
    {
        RequireTemperature(temperatureK);
        var result = new List<ReferenceAtTemperature>(_closedElements.Length);
        foreach (string element in _closedElements)
        {
            Member[] pure = _members.Where(m => m.PureElement == element).ToArray();
            Member best = Lowest(pure, m => m.FreeEnergyEvPerAtom(temperatureK));
            Member anchor = Lowest(pure, m => m.FormationEnergyEvPerAtom);
            result.Add(new ReferenceAtTemperature(element, temperatureK, best.Entry.Id, best.FreeEnergyEvPerAtom(temperatureK), anchor.Entry.Id));
        }

        return result;
    }

    /// <summary>The hull at T (and the gas's pressure).</summary>
    /// <exception cref="ThermoInputException">A temperature that is not positive, or outside the gas table or a tabulated model.</exception>
    public ThermoHull HullAt(double temperatureK)
    {
        State state = StateAt(temperatureK);
        SystemHull hull = SystemHull.OnAxis(state.Axis, state.Placed, _closedElements, Closed.References);
        return new ThermoHull(temperatureK, Treatment, Gas, state.Shift, hull, state.References, ReservoirEntryIds, UnmodelledEntryIds);
    }

    /// <summary>
    /// The signed decomposition energy of <paramref name="phaseId"/> at T: its energy minus the hull built without
    /// every entry of its reduced composition, at its composition (eV per closed-element atom; negative: stable by
    /// that margin; positive: it decomposes), with that hull's decomposition (what it turns into, or forms from).
    /// </summary>
    /// <exception cref="ThermoInputException">An unknown, unmodelled or pure-element phase; bad temperature.</exception>
    public (double EnergyEvPerClosedAtom, Decomposition Competitors) SignedDecompositionEnergyAt(string phaseId, double temperatureK)
    {
        Member phase = Phase(phaseId);
        State state = StateAt(temperatureK);
        return SignedAt(phase, state);
    }

    internal Member Phase(string phaseId)
    {
        Member? phase = _members.FirstOrDefault(m => string.Equals(m.Entry.Id, phaseId, StringComparison.Ordinal));
        if (phase is null)
        {
            string why = ReservoirEntryIds.Contains(phaseId) ? "it is made of the gas's element only (part of the reservoir)"
                : UnmodelledEntryIds.Contains(phaseId) ? "it has no temperature model"
                : $"no entry of {Closed.SystemName} has that id";
            throw new ThermoInputException($"Phase '{phaseId}' cannot be followed in temperature: {why}.", entryId: phaseId);
        }

        if (phase.PureElement is not null)
        {
            throw new ThermoInputException(
                $"Phase '{phaseId}' is a pure element ({phase.Entry.Composition.Formula}): it is a reference, and has no decomposition energy.", entryId: phaseId);
        }

        return phase;
    }

    internal (double EnergyEvPerClosedAtom, Decomposition Competitors) SignedAt(Member phase, State state)
    {
        Composition reduced = phase.Entry.Composition.Reduced;
        HullAxisEntry[] others = state.Placed.Where(p => p.Entry.Composition.Reduced != reduced).ToArray();
        SystemHull without = SystemHull.OnAxis(state.Axis, others, _closedElements, Closed.References);
        Decomposition competitors = without.DecompositionAt(phase.Entry.Composition);
        double own = state.Placed.First(p => ReferenceEquals(p.Entry, phase.Entry)).AxisEnergyEvPerAtom;
        return (own - competitors.HullEnergyEvPerAtom, competitors);
    }

    /// <summary>
    /// Ψ(T) = N G(T) − n_gas Δμ_gas(T) per formula unit of <paramref name="member"/>, with no temperature-dependent
    /// reference subtracted: the quantity whose differences between a phase and its competitors are its decomposition
    /// energy times its closed atoms. A straight line in T under the Ellingham treatment.
    /// </summary>
    internal double UnreferencedEv(Member member, double temperatureK, double gasShiftEvPerAtom) =>
        (member.Atoms * member.FreeEnergyEvPerAtom(temperatureK)) - (member.GasAtoms * gasShiftEvPerAtom);

    internal Member MemberOf(string id) => _members.First(m => string.Equals(m.Entry.Id, id, StringComparison.Ordinal));

    internal IEnumerable<Member> PureMembers(string element) => _members.Where(m => m.PureElement == element);

    internal State StateAt(double temperatureK)
    {
        RequireTemperature(temperatureK);
        ChemicalPotentialShift? shift = GasShiftAt(temperatureK);
        IReadOnlyList<ReferenceAtTemperature> references = ReferencesAt(temperatureK);
        var referenceByElement = references.ToDictionary(r => r.Element, r => r.FreeEnergyEvPerAtom, StringComparer.Ordinal);
        HullAxis axis = shift is null
            ? HullAxis.FreeEnergy(temperatureK)
            : HullAxis.GrandPotentialAt(temperatureK, [KeyValuePair.Create(shift.Element, shift.DeltaMuEvPerAtom)]);
        var placed = new HullAxisEntry[_members.Length];
        for (int i = 0; i < _members.Length; i++)
        {
            Member m = _members[i];
            double free = m.FreeEnergyEvPerAtom(temperatureK);
            foreach (string element in m.Entry.Composition.Elements)
            {
                if (referenceByElement.TryGetValue(element, out double reference))
                {
                    free -= m.Entry.Composition.AtomicFraction(element) * reference;
                }
            }

            double axisEnergy = shift is null ? free : OpenElementHull.GrandPotentialEvPerClosedAtom(m.Entry.Composition, free, axis)!.Value;
            placed[i] = new HullAxisEntry(m.Entry, axisEnergy, m.FormationEnergyEvPerAtom);
        }

        return new State(temperatureK, axis, shift, references, placed);
    }

    private static Member Lowest(IEnumerable<Member> members, Func<Member, double> value) =>
        members.OrderBy(value).ThenBy(m => m.Entry.Id, StringComparer.Ordinal).First();

    private static void RequireTemperature(double temperatureK)
    {
        if (!double.IsFinite(temperatureK) || temperatureK <= 0)
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"Temperature must be positive and finite; got {temperatureK} K."));
        }
    }

    /// <summary>One modelled entry and what its free energy needs.</summary>
    internal sealed class Member(PhaseEntry entry, double formationEnergyEvPerAtom, SolidTemperatureModel model, string? gasElement)
    {
        public PhaseEntry Entry { get; } = entry;

        public double FormationEnergyEvPerAtom { get; } = formationEnergyEvPerAtom;

        public SolidTemperatureModel Model { get; } = model;

        public double Atoms { get; } = entry.Composition.AtomsPerFormulaUnit.ToDouble();

        public double GasAtoms { get; } = gasElement is null ? 0.0 : entry.Composition.AmountOf(gasElement).ToDouble();

        public double ClosedAtoms => Atoms - GasAtoms;

        /// <summary>The element when the entry is a pure closed element; null otherwise.</summary>
        public string? PureElement { get; } = entry.Composition.IsSingleElement && !entry.Composition.Contains(gasElement ?? string.Empty)
            ? entry.Composition.Elements[0] : null;

        /// <summary>G(T) per atom on the dataset's formation-energy scale: formation energy + G(T) − H(anchor).</summary>
        public double FreeEnergyEvPerAtom(double temperatureK) =>
            FormationEnergyEvPerAtom + Model.FreeEnergyAboveAnchorEvPerAtom(temperatureK, Entry.Id);
    }

    /// <summary>Everything placed at one temperature.</summary>
    internal sealed record State(
        double TemperatureK, HullAxis Axis, ChemicalPotentialShift? Shift, IReadOnlyList<ReferenceAtTemperature> References, HullAxisEntry[] Placed);
}
