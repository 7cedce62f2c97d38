using Hull.Protos.V1;

namespace Hull.Cli.Input;

/// <summary>
/// One entry read from a file, with the line it came from (1-based) so that errors can point at it, its
/// temperature model when the file gives one, and its energy uncertainty (σ in eV/atom, correlation group) where the
/// file gives them, and its method tag (empty for untagged).
/// </summary>
public sealed record EntryRecord(string Id, string Formula, double EnergyEv, EnergyBasis Basis, string Note, int Line,
    EntryTemperatureModel? TemperatureModel = null, double? SigmaEvPerAtom = null, string CorrelationGroup = "", string Method = "")
{
    public Entry ToWire()
    {
        var entry = new Entry { Id = Id, Formula = Formula, EnergyEv = EnergyEv, Basis = Basis, Note = Note, CorrelationGroup = CorrelationGroup, Method = Method };
        if (TemperatureModel is not null) entry.TemperatureModel = TemperatureModel.Clone();
        if (SigmaEvPerAtom is { } sigma) entry.EnergySigmaEvPerAtom = sigma;
        return entry;
    }
}
