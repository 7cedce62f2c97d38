using System.Text.Json.Nodes;

namespace Hull.Server.Curation;

/// <summary>
/// Keeps entries whose energy per atom (on their own basis) lies within [min, max] eV/atom; either bound may be
/// left out, not both. Catches energies that are plainly wrong (a unit slip, a failed calculation).
/// </summary>
public sealed class EnergyRangeStep : ICurationStep
{
    public const string KindName = "drop_energy_outside";

    public EnergyRangeStep(double? minEvPerAtom, double? maxEvPerAtom)
    {
        MinEvPerAtom = minEvPerAtom;
        MaxEvPerAtom = maxEvPerAtom;
    }

    public double? MinEvPerAtom { get; }

    public double? MaxEvPerAtom { get; }

    public string Kind => KindName;

    public static EnergyRangeStep Read(StepParameters p)
    {
        double? min = p.OptionalNumber("min_ev_per_atom");
        double? max = p.OptionalNumber("max_ev_per_atom");
        if (min is null && max is null) throw p.Error("min_ev_per_atom", "give min_ev_per_atom, max_ev_per_atom or both");
        if (min > max) throw p.Error("max_ev_per_atom", $"is below min_ev_per_atom ({max} < {min})");
        return new EnergyRangeStep(min, max);
    }

    public JsonObject Parameters()
    {
        var o = new JsonObject();
        if (MinEvPerAtom is double min) o["min_ev_per_atom"] = min;
        if (MaxEvPerAtom is double max) o["max_ev_per_atom"] = max;
        return o;
    }

    public CurationStepOutcome Apply(IReadOnlyList<CurationEntry> entries, CurationContext context) =>
        new(entries.Where(e => !(e.EnergyEvPerAtom < MinEvPerAtom) && !(e.EnergyEvPerAtom > MaxEvPerAtom)).ToList());
}
