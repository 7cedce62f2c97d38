using Hull.Protos.V1;

namespace Hull.Cli.Input;

/// <summary>
/// One entry read from a file, with the line it came from (1-based) so that errors can point at it, and its
/// temperature model when the file gives one.
/// </summary>
public sealed record EntryRecord(string Id, string Formula, double EnergyEv, EnergyBasis Basis, string Note, int Line,
    EntryTemperatureModel? TemperatureModel = null)
{
    public Entry ToWire()
    {
        var entry = new Entry { Id = Id, Formula = Formula, EnergyEv = EnergyEv, Basis = Basis, Note = Note };
        if (TemperatureModel is not null) entry.TemperatureModel = TemperatureModel.Clone();
        return entry;
    }
}
