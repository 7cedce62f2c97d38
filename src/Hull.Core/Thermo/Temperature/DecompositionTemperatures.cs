using System.Globalization;
using Hull.Core.Defects;

namespace Hull.Core.Thermo.Temperature;

/// <summary>
/// The temperatures at which a phase decomposes, or forms, at one gas pressure: every sign change, in a stated range,
/// of its signed decomposition energy d(T) (its energy minus the hull built without its composition; the energy above
/// hull is never negative and has no sign change to find).
/// <list type="bullet">
/// <item>Ellingham treatment: every free energy is a straight line in T, the competitors' hull is the lowest of
/// straight lines (concave) and d(T) is piecewise linear (convex). Its breakpoints are walked exactly by
/// intersecting the lines active at the two ends of an interval and checking the hull there (the method of Eisner
/// and Severance for parametric programs): a breakpoint is confirmed when no competitor lies below both lines where
/// they meet, and otherwise the interval is split there. Each piece's zero is solved in closed form.</item>
/// <item>Tabulated-gas treatment: d(T) is scanned on a grid, and every bracket where it changes sign is solved by
/// Brent's method; two crossings closer than one scan step can be missed, so the step is part of the answer.</item>
/// </list>
/// </summary>
public static class DecompositionTemperatures
{
    /// <summary>Every crossing of <paramref name="phaseId"/>'s signed decomposition energy in [<paramref name="fromK"/>, <paramref name="toK"/>].</summary>
    /// <param name="system">The prepared system (its gas at the pressure asked).</param>
    /// <param name="phaseId">A modelled compound of the system.</param>
    /// <param name="fromK">Low end of the range, K (positive).</param>
    /// <param name="toK">High end, K (above <paramref name="fromK"/>).</param>
    /// <param name="scanIntervals">Scan intervals under the tabulated-gas treatment (default
    /// <see cref="ThermoTolerances.DefaultScanIntervals"/>); unused by the exact walk.</param>
    /// <exception cref="ThermoInputException">A bad range or interval count, a phase that cannot be followed, or a
    /// temperature outside the gas table or a tabulated model.</exception>
    public static DecompositionTemperatureResult Find(ThermoSystem system, string phaseId, double fromK, double toK,
        int scanIntervals = ThermoTolerances.DefaultScanIntervals)
    {
        ArgumentNullException.ThrowIfNull(system);
        if (!(double.IsFinite(fromK) && double.IsFinite(toK) && fromK > 0 && toK > fromK))
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"A temperature range needs 0 K < from < to, both finite; got {fromK} K to {toK} K."));
        }

        if (scanIntervals < 1 || scanIntervals > ThermoTolerances.MaximumScanIntervals)
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"Scan intervals must lie between 1 and {ThermoTolerances.MaximumScanIntervals}; got {scanIntervals}."));
        }

        ThermoSystem.Member phase = system.Phase(phaseId);
        double atFrom = system.SignedAt(phase, system.StateAt(fromK)).EnergyEvPerClosedAtom;
        double atTo = system.SignedAt(phase, system.StateAt(toK)).EnergyEvPerClosedAtom;
        var crossings = new List<DecompositionCrossing>();
        var breakpoints = new List<SignedEnergyBreakpoint>();
        if (system.Treatment == FreeEnergyTreatment.Ellingham)
        {
            new ExactWalk(system, phase).Run(fromK, toK, crossings, breakpoints);
        }
        else
        {
            Scan(system, phase, fromK, toK, scanIntervals, crossings);
        }

        return new DecompositionTemperatureResult(
            phaseId, phase.Entry.Composition.Formula, system.Treatment, system.Gas, fromK, toK, atFrom, atTo,
            crossings, breakpoints, ReferenceChanges(system, fromK, toK, scanIntervals),
            system.Treatment == FreeEnergyTreatment.Ellingham ? 0 : scanIntervals, system.UnmodelledEntryIds);
    }

    /// <summary>Where each closed element's lowest free-energy pure entry changes within the range.</summary>
    public static IReadOnlyList<ReferenceChange> ReferenceChanges(ThermoSystem system, double fromK, double toK, int scanIntervals)
    {
        ArgumentNullException.ThrowIfNull(system);
        var changes = new List<ReferenceChange>();
        foreach (string element in system.ClosedElements)
        {
            ThermoSystem.Member[] pure = [.. system.PureMembers(element)];
            if (pure.Length < 2) continue;
            double t = fromK;
            ThermoSystem.Member current = LowestAt(pure, t);
            if (pure.All(m => m.Model.IsLinearInTemperature))
            {
                // Straight lines: the lowest one is left only for a line of smaller slope, where they meet.
                while (true)
                {
                    (double A, double B) c = LineOf(current);
                    ThermoSystem.Member? next = null;
                    double nextK = double.PositiveInfinity;
                    foreach (ThermoSystem.Member other in pure.Where(m => !ReferenceEquals(m, current)))
                    {
                        (double A, double B) o = LineOf(other);
                        if (o.B >= c.B) continue;
                        double meet = (o.A - c.A) / (c.B - o.B);
                        if (meet > t && meet < nextK) (next, nextK) = (other, meet);
                    }

                    if (next is null || nextK >= toK) break;
                    changes.Add(new ReferenceChange(element, nextK, current.Entry.Id, next.Entry.Id));
                    (current, t) = (next, nextK);
                }

                continue;
            }

            double step = (toK - fromK) / scanIntervals;
            for (int k = 1; k <= scanIntervals; k++)
            {
                double high = k == scanIntervals ? toK : fromK + (k * step);
                ThermoSystem.Member lowest = LowestAt(pure, high);
                if (ReferenceEquals(lowest, current)) continue;
                ThermoSystem.Member was = current;
                double F(double x) => was.FreeEnergyEvPerAtom(x) - lowest.FreeEnergyEvPerAtom(x);
                double low = high - step;
                (double root, _, _) = BracketedRoot.Brent(F, low, high, F(low), F(high), ThermoTolerances.CrossingTemperatureK, ThermoTolerances.MaximumBrentIterations);
                changes.Add(new ReferenceChange(element, root, was.Entry.Id, lowest.Entry.Id));
                current = lowest;
            }
        }

        return changes;
    }

    private static (double A, double B) LineOf(ThermoSystem.Member member)
    {
        // G per atom of a standard-entropy model: formation energy − T S, exactly a line.
        double slope = member.FreeEnergyEvPerAtom(1001.0) - member.FreeEnergyEvPerAtom(1.0);
        return (member.FreeEnergyEvPerAtom(1.0) - (slope / 1000.0), slope / 1000.0);
    }

    private static ThermoSystem.Member LowestAt(IEnumerable<ThermoSystem.Member> members, double temperatureK) =>
        members.OrderBy(m => m.FreeEnergyEvPerAtom(temperatureK)).ThenBy(m => m.Entry.Id, StringComparer.Ordinal).First();

    private static void Scan(ThermoSystem system, ThermoSystem.Member phase, double fromK, double toK, int intervals, List<DecompositionCrossing> crossings)
    {
        double F(double t) => system.SignedAt(phase, system.StateAt(t)).EnergyEvPerClosedAtom;
        double step = (toK - fromK) / intervals;
        double previousK = fromK, previous = F(fromK);
        for (int k = 1; k <= intervals; k++)
        {
            double t = k == intervals ? toK : fromK + (k * step);
            double value = F(t);
            if (previous != 0 && value != 0 && Math.Sign(previous) != Math.Sign(value))
            {
                (double root, int iterations, bool converged) = BracketedRoot.Brent(
                    F, previousK, t, previous, value, ThermoTolerances.CrossingTemperatureK, ThermoTolerances.MaximumBrentIterations);
                crossings.Add(CrossingAt(system, phase, root, previousK, t,
                    value > previous ? CrossingDirection.DecomposesAbove : CrossingDirection.FormsAbove,
                    CrossingMethod.BrentInScanBracket, iterations, converged));
            }
            else if (value == 0 && k < intervals)
            {
                // Exactly on zero at a scan point: a crossing there when the neighbours' signs differ.
                double nextK = fromK + ((k + 1) * step), next = F(Math.Min(nextK, toK));
                if (previous != 0 && next != 0 && Math.Sign(previous) != Math.Sign(next))
                {
                    crossings.Add(CrossingAt(system, phase, t, t, t,
                        next > previous ? CrossingDirection.DecomposesAbove : CrossingDirection.FormsAbove,
                        CrossingMethod.BrentInScanBracket, 0, true));
                }
            }

            if (value != 0)
            {
                previousK = t;
                previous = value;
            }
        }
    }

    private static DecompositionCrossing CrossingAt(ThermoSystem system, ThermoSystem.Member phase, double temperatureK,
        double lowK, double highK, CrossingDirection direction, CrossingMethod method, int iterations, bool converged)
    {
        Decomposition competitors = system.SignedAt(phase, system.StateAt(temperatureK)).Competitors;
        double gasReleased = 0.0;
        if (system.Gas is not null)
        {
            double gasAtoms = phase.GasAtoms;
            foreach (DecompositionProduct product in competitors.Products)
            {
                gasAtoms -= product.FormulaUnits * system.MemberOf(product.Phase.Id).GasAtoms;
            }

            gasReleased = gasAtoms / system.Gas.Species.AtomsPerMolecule;
        }

        return new DecompositionCrossing(temperatureK, direction, lowK, highK, method, iterations, converged, competitors, gasReleased);
    }

    /// <summary>The exact walk over the straight pieces of d(T) under the Ellingham treatment.</summary>
    private sealed class ExactWalk(ThermoSystem system, ThermoSystem.Member phase)
    {
        private readonly Dictionary<string, (double A, double B)> _lines = new(StringComparer.Ordinal);
        private readonly List<(double From, double To, Piece Line)> _pieces = [];

        public void Run(double fromK, double toK, List<DecompositionCrossing> crossings, List<SignedEnergyBreakpoint> breakpoints)
        {
            Walk(fromK, PieceAt(fromK), toK, PieceAt(toK));
            for (int i = 0; i < _pieces.Count; i++)
            {
                (double a, double b, Piece line) = _pieces[i];
                if (i > 0)
                {
                    breakpoints.Add(new SignedEnergyBreakpoint(a, line.At(a), _pieces[i - 1].Line.CompetitorIds, line.CompetitorIds));
                }

                double da = line.At(a), db = line.At(b);
                if (da != 0 && db != 0 && Math.Sign(da) != Math.Sign(db))
                {
                    double root = Math.Clamp(-line.A / line.B, a, b);
                    crossings.Add(CrossingAt(system, phase, root, a, b,
                        line.B > 0 ? CrossingDirection.DecomposesAbove : CrossingDirection.FormsAbove, CrossingMethod.ExactLinearPiece, 0, true));
                }
                else if (db == 0 && i + 1 < _pieces.Count)
                {
                    // Zero exactly at a breakpoint: a crossing when the pieces on both sides have opposite signs.
                    double next = _pieces[i + 1].Line.At(_pieces[i + 1].To);
                    if (da != 0 && next != 0 && Math.Sign(da) != Math.Sign(next))
                    {
                        crossings.Add(CrossingAt(system, phase, b, b, b,
                            next > da ? CrossingDirection.DecomposesAbove : CrossingDirection.FormsAbove, CrossingMethod.ExactLinearPiece, 0, true));
                    }
                }
            }
        }

        private void Walk(double a, Piece la, double b, Piece lb)
        {
            if (la.SameAs(lb, a, b) || b - a <= ThermoTolerances.CrossingTemperatureK || _pieces.Count >= ThermoTolerances.MaximumPieces)
            {
                Add(a, b, la);
                return;
            }

            // d is the highest of its pieces' lines (convex): la is active at a and lb at b, so they meet inside.
            double meet = Math.Clamp((lb.A - la.A) / (la.B - lb.B), a, b);
            if (!double.IsFinite(meet)) meet = 0.5 * (a + b);
            Piece lm = PieceAt(meet);
            if (lm.At(meet) <= Math.Max(la.At(meet), lb.At(meet)) + ThermoTolerances.LineAgreementEv || lm.SameAs(la, a, b) || lm.SameAs(lb, a, b))
            {
                Add(a, meet, la);
                Add(meet, b, lb);
                return;
            }

            Walk(a, la, meet, lm);
            Walk(meet, lm, b, lb);
        }

        private void Add(double from, double to, Piece line)
        {
            if (to <= from) return;
            if (_pieces.Count > 0 && _pieces[^1].Line.SameAs(line, from, to))
            {
                _pieces[^1] = (_pieces[^1].From, to, _pieces[^1].Line);
                return;
            }

            _pieces.Add((from, to, line));
        }

        private Piece PieceAt(double temperatureK)
        {
            Decomposition competitors = system.SignedAt(phase, system.StateAt(temperatureK)).Competitors;
            (double a, double b) = Line(phase);
            foreach (DecompositionProduct product in competitors.Products)
            {
                if (product.Phase.IsSynthetic)
                {
                    throw new InvalidOperationException($"Unreachable: every closed element of {system.Closed.SystemName} has a modelled pure entry.");
                }

                (double pa, double pb) = Line(system.MemberOf(product.Phase.Id));
                a -= product.FormulaUnits * pa;
                b -= product.FormulaUnits * pb;
            }

            double closedAtoms = phase.ClosedAtoms;
            return new Piece(a / closedAtoms, b / closedAtoms, [.. competitors.Products.Select(p => p.Phase.Id).Order(StringComparer.Ordinal)]);
        }

        /// <summary>Ψ(T) = A + B T of one member: exact for straight-line free energies and a straight-line Δμ.</summary>
        private (double A, double B) Line(ThermoSystem.Member member)
        {
            if (_lines.TryGetValue(member.Entry.Id, out (double A, double B) known)) return known;
            const double low = 1.0, high = 1001.0;
            double shiftLow = system.GasShiftAt(low)?.DeltaMuEvPerAtom ?? 0.0;
            double shiftHigh = system.GasShiftAt(high)?.DeltaMuEvPerAtom ?? 0.0;
            double psiLow = system.UnreferencedEv(member, low, shiftLow);
            double psiHigh = system.UnreferencedEv(member, high, shiftHigh);
            double slope = (psiHigh - psiLow) / (high - low);
            var line = (psiLow - (slope * low), slope);
            _lines[member.Entry.Id] = line;
            return line;
        }
    }

    /// <summary>One straight piece of d(T) = A + B T (eV per closed-element atom) and the competitors that give it.</summary>
    private sealed record Piece(double A, double B, IReadOnlyList<string> CompetitorIds)
    {
        public double At(double temperatureK) => A + (B * temperatureK);

        public bool SameAs(Piece other, double fromK, double toK) =>
            CompetitorIds.SequenceEqual(other.CompetitorIds, StringComparer.Ordinal)
            || (Math.Abs(At(fromK) - other.At(fromK)) <= ThermoTolerances.LineAgreementEv && Math.Abs(At(toK) - other.At(toK)) <= ThermoTolerances.LineAgreementEv);
    }
}
