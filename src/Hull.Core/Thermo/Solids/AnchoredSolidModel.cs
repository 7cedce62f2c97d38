using System.Globalization;
using Hull.Core.Thermo.Gases;

namespace Hull.Core.Thermo.Solids;

/// <summary>
/// An entry's temperature model as a dataset keeps it: the model, and for a tabulated G(T) the anchor the table is
/// counted on (what the entry's energy stands for), which a standard entropy does not need. A stored table starts
/// above 0 K: the issue's input rules refuse T ≤ 0 in files and imports.
/// </summary>
public sealed record AnchoredSolidModel
{
    /// <exception cref="ThermoInputException">A table without an anchor, an anchor on a standard entropy, an undefined
    /// anchor, or a table that does not start above 0 K.</exception>
    public AnchoredSolidModel(SolidTemperatureModel model, FreeEnergyAnchor? tableAnchor)
    {
        ArgumentNullException.ThrowIfNull(model);
        if (model is TabulatedFreeEnergyModel table)
        {
            if (tableAnchor is not { } anchor || !Enum.IsDefined(anchor))
            {
                throw new ThermoInputException($"The tabulated free energy of {model.Formula.Formula} needs its anchor, one of {string.Join(", ", FreeEnergyAnchorTokens.All.Select(FreeEnergyAnchorTokens.ToToken))}.");
            }

            if (!(table.Points[0].TemperatureK > 0))
            {
                throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                    $"Row 0 of the tabulated free energy of {model.Formula.Formula} is at {table.Points[0].TemperatureK} K; temperatures must be above 0 K."));
            }
        }
        else if (tableAnchor is not null)
        {
            throw new ThermoInputException($"An anchor belongs to a tabulated free energy, not to {model.Describe()}.");
        }

        Model = model;
        TableAnchor = tableAnchor;
    }

    public SolidTemperatureModel Model { get; }

    /// <summary>The anchor of a tabulated model; null for a standard entropy.</summary>
    public FreeEnergyAnchor? TableAnchor { get; }

    /// <summary>Refuses a table counted on another zero than the gas reference in use (a standard entropy fits either).</summary>
    /// <exception cref="ThermoInputException">The table's anchor pairs with the other gas mode; names the entry.</exception>
    public void RequireAnchorFor(GasReferenceMode gasMode, string entryId)
    {
        if (TableAnchor is { } anchor && anchor.PairedGasMode() != gasMode)
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"Entry '{entryId}': its G(T) table is on the {FreeEnergyAnchorTokens.ToToken(anchor)} anchor ({anchor.AnchorTemperatureK()} K), but the gas reference in use is anchored at {(gasMode == GasReferenceMode.ComputedMoleculeEnergy ? 0.0 : PhysicalConstants.StandardTemperatureK)} K; use the gas reference mode of the table's anchor."),
                entryId: entryId);
        }
    }
}
