namespace Hull.Store;

/// <summary>
/// One phase entry as stored: an id unique within a dataset version, the formula exactly as given, an energy in eV
/// with the basis it refers to, free-text metadata (empty when none), an optional temperature model and an optional energy uncertainty
/// (σ and correlation group), and an optional method tag. The Store
/// interprets neither the formula, the basis nor the model: the server reads them.
/// </summary>
/// <param name="Id">Entry id, unique within a dataset version; non-empty.</param>
/// <param name="Formula">Formula text as given by the user, e.g. "Fe3O4"; non-empty.</param>
/// <param name="EnergyEv">Energy in eV (per formula unit or per atom, see <paramref name="Basis"/>); finite.</param>
/// <param name="Basis">What the energy refers to, as a token (e.g. "total_per_atom"); kept as given, not interpreted.</param>
/// <param name="Metadata">Free text; empty when none.</param>
/// <param name="TemperatureModel">The entry's temperature model; null when it has none. Versioned with the row.</param>
/// <param name="SigmaEvPerAtom">Standard deviation of the energy's error, eV/atom; null when none is given.</param>
/// <param name="CorrelationGroup">The group of entries sharing a systematic error; null when none.</param>
/// <param name="Method">The computational method the energy came from, as a tag that correction sets name; null when untagged.</param>
public sealed record EntryRow(string Id, string Formula, double EnergyEv, string Basis, string Metadata = "",
    StoredTemperatureModel? TemperatureModel = null, double? SigmaEvPerAtom = null, string? CorrelationGroup = null, string? Method = null);
