namespace Hull.Core.Defects;

/// <summary>Transition levels and effective-U values of a defect's charge states.</summary>
public static class ChargeTransitions
{
    /// <summary>
    /// Every transition level of a defect whose intercepts are <paramref name="formationAtVbm"/> (charge → E_f at
    /// E_F = 0): the thermodynamic ones (breaks of the lowest-energy line over all E_F, so levels beyond the band
    /// edges are found and flagged too) first in rising E_F, then every other pair of charges, labelled not-ground.
    /// </summary>
    public static IReadOnlyList<TransitionLevel> Levels(string defect, IReadOnlyDictionary<int, double> formationAtVbm, double bandGapEv)
    {
        int[] charges = [.. formationAtVbm.Keys.OrderByDescending(q => q)];
        var thermodynamic = new List<TransitionLevel>();
        var pairs = new HashSet<(int, int)>();
        // Walk the lower envelope of the lines E_f = a_q + q E_F from E_F = −∞ (highest q lowest) to +∞.
        int current = charges[0];
        while (true)
        {
            double bestLevel = double.PositiveInfinity;
            int next = current;
            foreach (int q in charges.Where(c => c < current))
            {
                double level = Level(formationAtVbm, current, q);
                // On a tie several lines meet in one point; the lowest charge continues the envelope.
                if (level < bestLevel || (level == bestLevel && q < next))
                {
                    bestLevel = level;
                    next = q;
                }
            }

            if (next == current) break;
            thermodynamic.Add(Make(defect, formationAtVbm, current, next, TransitionLevelKind.Thermodynamic, bandGapEv));
            pairs.Add((current, next));
            current = next;
        }

        var others = new List<TransitionLevel>();
        for (int i = 0; i < charges.Length; i++)
        {
            for (int j = i + 1; j < charges.Length; j++)
            {
                if (!pairs.Contains((charges[i], charges[j])))
                {
                    others.Add(Make(defect, formationAtVbm, charges[i], charges[j], TransitionLevelKind.NotGround, bandGapEv));
                }
            }
        }

        return [.. thermodynamic, .. others];
    }

    /// <summary>U = E_f(q+1) + E_f(q−1) − 2E_f(q) for every q whose neighbours q ± 1 were both calculated.</summary>
    public static IReadOnlyList<NegativeU> EffectiveU(string defect, IReadOnlyDictionary<int, double> formationAtVbm) =>
        [.. formationAtVbm.Keys.OrderByDescending(q => q)
            .Where(q => formationAtVbm.ContainsKey(q + 1) && formationAtVbm.ContainsKey(q - 1))
            .Select(q => new NegativeU(defect, q, formationAtVbm[q + 1] + formationAtVbm[q - 1] - 2 * formationAtVbm[q]))];

    private static double Level(IReadOnlyDictionary<int, double> a, int q, int qOther) => (a[q] - a[qOther]) / (qOther - q);

    private static TransitionLevel Make(string defect, IReadOnlyDictionary<int, double> a, int q, int qOther, TransitionLevelKind kind, double gap)
    {
        double level = Level(a, q, qOther);
        return new TransitionLevel(defect, q, qOther, level, kind, level >= 0 && level <= gap, a[q] + q * level);
    }
}
