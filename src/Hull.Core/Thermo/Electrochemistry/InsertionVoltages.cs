using System.Globalization;
using Hull.Core.Chemistry;
using Hull.Core.Thermo.Lines;
using Hull.Core.Windows;

namespace Hull.Core.Thermo.Electrochemistry;

/// <summary>
/// Voltage profiles of inserting an ion A (charge number z) into a host H along the composition line H + x A, on the
/// closed formation-energy hull of the system: each stretch of the line in one hull face is a plateau at
/// V = −(μ_A − E_A)/(z e), μ_A − E_A being that face's chemical potential of A relative to A's reference (the slope
/// of the hull energy per host formula unit along x). Plateaus are found exactly; the profile ends at the
/// A-richer end-member when one is given, else where A metal itself comes in (V = 0).
/// </summary>
public static class InsertionVoltages
{
    /// <summary>Neighbouring stretches whose voltages differ by less than this are one plateau (V; the hull's energy
    /// tolerance, 1e-10 eV, per ion).</summary>
    public const double SamePlateauVolts = 1e-9;

    /// <param name="hull">The closed hull (formation energies over elements) of a system holding host and ion.</param>
    /// <param name="host">The A-poorest end-member, as written: x counts ions per this formula unit.</param>
    /// <param name="ion">The inserted element.</param>
    /// <param name="chargeNumber">z; default the usual charge of Li, Na, K (1) and Mg, Ca, Zn (2).</param>
    /// <param name="insertedEnd">The A-richest end-member (the host plus some A, any multiple); default: on to A metal.</param>
    /// <exception cref="ThermoInputException">An ion or host not in the system, no A-containing phase, a bad z or end-member.</exception>
    public static VoltageProfile Profile(
        SystemHull hull, Composition host, string ion, int? chargeNumber = null, Composition? insertedEnd = null)
    {
        ArgumentNullException.ThrowIfNull(hull);
        ArgumentNullException.ThrowIfNull(host);
        int z = CheckIon(hull, ion, chargeNumber);
        if (host.Elements.All(e => string.Equals(e, ion, StringComparison.Ordinal)))
        {
            throw new ThermoInputException($"The host {host.Formula} is the ion {ion} itself; a host needs another element.", element: ion);
        }

        if (!hull.Entries.Any(e => e.Composition.Contains(ion) && !e.Composition.IsSingleElement))
        {
            throw new ThermoInputException(
                $"The system {hull.SystemName} has no phase containing {ion} besides the metal: there is nothing for {ion} to insert into.", element: ion);
        }

        IReadOnlyList<Rational> start = hull.ComponentAtomsOf(host);
        var direction = hull.Components.Select(c => string.Equals(c, ion, StringComparison.Ordinal) ? Rational.One : Rational.Zero).ToArray();
        Rational? end = insertedEnd is null ? null : IonsToEnd(host, insertedEnd, ion);
        IReadOnlyList<HullLineSegment> segments = hull.SegmentsAlong(start, direction, end);

        double x0 = host.AmountOf(ion).ToDouble();
        var plateaus = new List<VoltagePlateau>();
        bool reachesMetal = false;
        Rational insertedExact = Rational.Zero;
        foreach (HullLineSegment segment in segments)
        {
            double mu = segment.SlopeEvPerParameter;
            if (end is null && (mu >= -Geometry.HullTolerances.EnergyEvPerAtom || segment.To is null))
            {
                reachesMetal = true; // the ion's own metal coexists from here on: V = 0
                break;
            }

            double volts = IonVoltage.VoltsAgainstMetal(mu, z);
            double from = x0 + segment.From.ToDouble();
            insertedExact = segment.To!.Value;
            double to = x0 + insertedExact.ToDouble();
            if (plateaus.Count > 0 && Math.Abs(plateaus[^1].VoltsAgainstMetal - volts) <= SamePlateauVolts)
            {
                VoltagePlateau last = plateaus[^1];
                var phases = last.Phases.Concat(segment.Phases)
                    .GroupBy(p => p.Phase.Id, StringComparer.Ordinal).Select(g => g.First())
                    .OrderBy(p => p.Phase.Id, StringComparer.Ordinal).ToArray();
                plateaus[^1] = last with { IonsPerHostTo = to, Phases = phases };
            }
            else
            {
                plateaus.Add(new VoltagePlateau(from, to, volts, segment.Phases, mu));
            }
        }

        if (plateaus.Count == 0)
        {
            throw new ThermoInputException(
                $"{ion} metal coexists with {host.Formula} from the start in {hull.SystemName}: the host takes up no {ion} below 0 V.", element: ion);
        }

        double inserted = plateaus[^1].IonsPerHostTo - x0;
        double average = plateaus.Sum(p => p.VoltsAgainstMetal * p.IonsPerHostWidth) / plateaus.Sum(p => p.IonsPerHostWidth);
        // The ion first, as the trade writes inserted hosts (Li0.5CoO2).
        Composition full = Composition.FromAmounts((ion, insertedExact)) + host;
        double perHost = Capacity(z, inserted, host);
        double perFull = Capacity(z, inserted, full);
        return new VoltageProfile(
            ion, z, host, full, hull.SystemName, plateaus, average, inserted,
            perHost, perFull, perHost * average, perFull * average, reachesMetal);
    }

    /// <summary>Theoretical capacity Q = z Δx F / (3.6 M), mAh/g, per mass of <paramref name="basis"/> (common practice).</summary>
    public static double Capacity(int chargeNumber, double ionsPerFormulaUnit, Composition basis)
    {
        ArgumentNullException.ThrowIfNull(basis);
        return ElectrochemicalConstants.MilliampHoursPerGramPerElectronPerGramPerMol * chargeNumber * ionsPerFormulaUnit / basis.MolarMassGramsPerMole;
    }

    /// <summary>The charge number of <paramref name="ion"/>, checked against the hull.</summary>
    internal static int CheckIon(SystemHull hull, string ion, int? chargeNumber)
    {
        if (hull.Axis.Quantity != HullAxisQuantity.FormationEnergy || hull.EndMembers is not null)
        {
            throw new ThermoInputException($"Voltages are read from a formation-energy hull over elements; got {hull.Axis.DisplayName} over {hull.SystemName}.");
        }

        if (string.IsNullOrEmpty(ion) || !hull.Components.Contains(ion, StringComparer.Ordinal))
        {
            throw new ThermoInputException($"The ion '{ion}' is not an element of the chemical system {hull.SystemName}.", element: ion);
        }

        if (chargeNumber is { } given)
        {
            return given > 0
                ? given
                : throw new ThermoInputException(
                    string.Create(CultureInfo.InvariantCulture, $"The charge number of {ion} must be a positive integer; got {given}."), element: ion);
        }

        return IonVoltage.TryGetChargeNumber(ion, out int z)
            ? z
            : throw new ThermoInputException($"{ion} has no usual ion charge here; give its charge number.", element: ion);
    }

    /// <summary>Ions added per host formula unit to reach <paramref name="insertedEnd"/> (scaled to the host's other elements).</summary>
    private static Rational IonsToEnd(Composition host, Composition insertedEnd, string ion)
    {
        Rational? scale = null;
        foreach (string element in host.Elements.Union(insertedEnd.Elements))
        {
            if (string.Equals(element, ion, StringComparison.Ordinal))
            {
                continue;
            }

            Rational hostAmount = host.AmountOf(element);
            if (hostAmount.IsZero || insertedEnd.AmountOf(element).IsZero)
            {
                throw new ThermoInputException(
                    $"The end-member {insertedEnd.Formula} is not the host {host.Formula} plus {ion}: {element} is in only one of them.", element: element);
            }

            Rational ratio = insertedEnd.AmountOf(element) / hostAmount;
            if (scale is { } s && s != ratio)
            {
                throw new ThermoInputException(
                    $"The end-member {insertedEnd.Formula} is not the host {host.Formula} plus {ion}: its other elements are in other proportions.");
            }

            scale = ratio;
        }

        Rational added = (insertedEnd.AmountOf(ion) / scale!.Value) - host.AmountOf(ion);
        if (added.Sign <= 0)
        {
            throw new ThermoInputException(
                $"The end-member {insertedEnd.Formula} holds no more {ion} per host formula unit than the host {host.Formula}.", element: ion);
        }

        return added;
    }
}
