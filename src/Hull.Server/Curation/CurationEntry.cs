using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using Hull.Store;

namespace Hull.Server.Curation;

/// <summary>A stored row with its formula and basis read once, so that steps can ask about composition and energy.</summary>
public sealed class CurationEntry
{
    private CurationEntry(EntryRow row, PhaseEntry phase)
    {
        Row = row;
        Phase = phase;
    }

    /// <summary>The row exactly as stored; what a derived version writes.</summary>
    public EntryRow Row { get; }

    /// <summary>The row read as a phase entry.</summary>
    public PhaseEntry Phase { get; }

    /// <summary>The energy per atom on the row's own basis (eV/atom).</summary>
    public double EnergyEvPerAtom => Phase.EnergyEvPerAtom;

    /// <summary>Words of the metadata text, split on white space, commas and semicolons: how flags and tags are written.</summary>
    public IReadOnlyList<string> MetadataWords =>
        Row.Metadata.Split([' ', '\t', '\n', '\r', ',', ';'], StringSplitOptions.RemoveEmptyEntries);

    /// <exception cref="CurationRecipeException">The formula or basis of the row cannot be read (field names the entry).</exception>
    public static CurationEntry Read(EntryRow row)
    {
        if (!Composition.TryParse(row.Formula, out Composition? composition))
        {
            throw new CurationRecipeException(0, $"entries[{row.Id}].formula", $"the formula '{row.Formula}' cannot be read");
        }
        if (!EnergyBasisTokens.TryParse(row.Basis, out EnergyBasis basis))
        {
            throw new CurationRecipeException(0, $"entries[{row.Id}].basis", $"the energy basis '{row.Basis}' is not known");
        }
        return new CurationEntry(row, new PhaseEntry(row.Id, composition, row.EnergyEv, basis));
    }
}
