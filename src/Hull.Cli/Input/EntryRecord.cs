using Hull.Protos.V1;

namespace Hull.Cli.Input;

/// <summary>One entry read from a file, with the line it came from (1-based) so that errors can point at it.</summary>
public sealed record EntryRecord(string Id, string Formula, double EnergyEv, EnergyBasis Basis, string Note, int Line)
{
    public Entry ToWire() => new() { Id = Id, Formula = Formula, EnergyEv = EnergyEv, Basis = Basis, Note = Note };
}
