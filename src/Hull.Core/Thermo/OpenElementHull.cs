using System.Globalization;
using Hull.Core.Chemistry;

namespace Hull.Core.Thermo;

/// <summary>
/// The grand-potential hull of a chemical system with some elements open to a reservoir at fixed chemical
/// potentials: φ = (E_f − Σ_open n_o Δμ_o) / N_closed per formula unit, hulled over the closed elements. Built from
/// the closed formation-energy hull of the whole system, so both hulls rest on the same energies and references.
/// </summary>
public sealed class OpenElementHull
{
    private OpenElementHull(SystemHull closed, SystemHull hull, IReadOnlyList<string> excludedEntryIds)
    {
        Closed = closed;
        Hull = hull;
        ExcludedEntryIds = excludedEntryIds;
    }

    /// <summary>The closed hull it was built from.</summary>
    public SystemHull Closed { get; }

    /// <summary>The grand-potential hull (axis per closed-element atom; the open elements' Δμ on <see cref="SystemHull.Axis"/>).</summary>
    public SystemHull Hull { get; }

    /// <summary>Entries with no closed-element atom (made of open elements only: part of the reservoir), left out.</summary>
    public IReadOnlyList<string> ExcludedEntryIds { get; }

    /// <summary>
    /// Opens <paramref name="potentials"/>' elements of the closed hull <paramref name="closed"/> (a formation-energy
    /// hull over elements).
    /// </summary>
    /// <param name="closed">The closed hull of the whole system.</param>
    /// <param name="potentials">One or more open elements of the system with their chemical potentials.</param>
    /// <param name="allowAboveReference">Accept Δμ above 0 (richer than the element itself: no reservoir of the
    /// pure element can hold it there, so it is refused unless asked for).</param>
    /// <exception cref="ThermoInputException">An element not in the system, given twice or all elements open; an
    /// absolute μ without the element's total-energy reference; Δμ above 0 unasked; a non-finite value.</exception>
    public static OpenElementHull Open(SystemHull closed, IReadOnlyList<ReservoirPotential> potentials, bool allowAboveReference = false) =>
        Open(closed, potentials, allowAboveReference, leaveOut: null);

    /// <summary>As <see cref="Open(SystemHull, IReadOnlyList{ReservoirPotential}, bool)"/>, leaving out the entries
    /// <paramref name="leaveOut"/> picks (a phase's competitors alone, to see what it would turn into).</summary>
    internal static OpenElementHull Open(
        SystemHull closed, IReadOnlyList<ReservoirPotential> potentials, bool allowAboveReference, Func<EntryStability, bool>? leaveOut)
    {
        ArgumentNullException.ThrowIfNull(closed);
        ArgumentNullException.ThrowIfNull(potentials);
        if (closed.Axis.Quantity != HullAxisQuantity.FormationEnergy || closed.EndMembers is not null)
        {
            throw new ThermoInputException($"An open-element hull opens a formation-energy hull over elements; got {closed.Axis.DisplayName} over {closed.SystemName}.");
        }

        if (potentials.Count == 0)
        {
            throw new ThermoInputException("An open-element hull needs at least one open element.");
        }

        var relative = new List<KeyValuePair<string, double>>(potentials.Count);
        foreach (ReservoirPotential potential in potentials)
        {
            relative.Add(KeyValuePair.Create(potential.Symbol, RelativeValue(closed, potential, allowAboveReference)));
        }

        HullAxis axis = HullAxis.GrandPotential(relative);
        string[] closedElements = closed.Components.Where(c => !axis.IsOpen(c)).ToArray();
        if (closedElements.Length == 0)
        {
            throw new ThermoInputException($"Every element of {closed.SystemName} is open; an open-element hull needs at least one closed element.");
        }

        var placed = new List<HullAxisEntry>(closed.Entries.Count);
        var excluded = new List<string>();
        foreach (EntryStability entry in closed.Entries)
        {
            if (leaveOut?.Invoke(entry) == true)
            {
                continue;
            }

            if (GrandPotentialEvPerClosedAtom(entry.Composition, entry.FormationEnergyEvPerAtom!.Value, axis) is { } phi)
            {
                placed.Add(new HullAxisEntry(entry.Entry, phi, entry.FormationEnergyEvPerAtom));
            }
            else
            {
                excluded.Add(entry.Id);
            }
        }

        SystemHull hull = SystemHull.OnAxis(axis, placed, closedElements, closed.References);
        return new OpenElementHull(closed, hull, excluded);
    }

    /// <summary>
    /// φ of one formula unit on <paramref name="axis"/> per closed-element atom, from its formation energy per atom;
    /// null when the composition has no closed-element atom.
    /// </summary>
    public static double? GrandPotentialEvPerClosedAtom(Composition composition, double formationEnergyEvPerAtom, HullAxis axis)
    {
        ArgumentNullException.ThrowIfNull(composition);
        ArgumentNullException.ThrowIfNull(axis);
        double perFormulaUnit = formationEnergyEvPerAtom * composition.AtomsPerFormulaUnit.ToDouble();
        double closedAtoms = 0.0;
        foreach (string symbol in composition.Elements)
        {
            double amount = composition.AmountOf(symbol).ToDouble();
            OpenElement? open = axis.OpenElements.FirstOrDefault(o => string.Equals(o.Symbol, symbol, StringComparison.Ordinal));
            if (open is null)
            {
                closedAtoms += amount;
            }
            else
            {
                perFormulaUnit -= amount * open.ChemicalPotentialEvPerAtom;
            }
        }

        return closedAtoms > 0 ? perFormulaUnit / closedAtoms : null;
    }

    private static double RelativeValue(SystemHull closed, ReservoirPotential potential, bool allowAboveReference)
    {
        ArgumentNullException.ThrowIfNull(potential);
        string symbol = potential.Symbol;
        if (!closed.Components.Contains(symbol, StringComparer.Ordinal))
        {
            throw new ThermoInputException($"Open element '{symbol}' is not an element of the chemical system {closed.SystemName}.", element: symbol);
        }

        if (!double.IsFinite(potential.ValueEvPerAtom))
        {
            throw new ThermoInputException(
                string.Create(CultureInfo.InvariantCulture, $"The chemical potential of open element {symbol} is not finite ({potential.ValueEvPerAtom} eV/atom)."),
                element: symbol);
        }

        double relative = potential.ValueEvPerAtom;
        if (potential.Scale == PotentialScale.Absolute)
        {
            ElementReference reference = closed.References.FirstOrDefault(r => string.Equals(r.Symbol, symbol, StringComparison.Ordinal))
                ?? throw new ThermoInputException(
                    $"An absolute chemical potential for {symbol} needs {symbol}'s total-energy reference, and the hull of {closed.SystemName} has none (its energies are formation energies); give Δμ relative to the reference instead.",
                    element: symbol);
            relative = potential.ValueEvPerAtom - reference.TotalEnergyEvPerAtom;
        }

        if (relative > 0 && !allowAboveReference)
        {
            throw new ThermoInputException(
                string.Create(CultureInfo.InvariantCulture,
                    $"The chemical potential of open element {symbol} is {relative:G6} eV/atom above its reference: richer than the pure element, which no reservoir of it can supply. Say so explicitly to allow it."),
                element: symbol);
        }

        return relative;
    }
}
