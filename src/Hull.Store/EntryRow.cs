namespace Hull.Store;

/// <summary>
/// One phase entry as stored: an id unique within a dataset version, the formula exactly as given, an energy in eV
/// with the basis it refers to, and free-text metadata (empty when none). The Store does not interpret the formula.
/// </summary>
/// <param name="Id">Entry id, unique within a dataset version; non-empty.</param>
/// <param name="Formula">Formula text as given by the user, e.g. "Fe3O4"; non-empty.</param>
/// <param name="EnergyEv">Energy in eV (per formula unit or per atom, see <paramref name="Basis"/>); finite.</param>
/// <param name="Basis">What the energy refers to.</param>
/// <param name="Metadata">Free text; empty when none.</param>
public sealed record EntryRow(string Id, string Formula, double EnergyEv, EnergyBasis Basis, string Metadata = "");
