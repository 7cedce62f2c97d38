using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Solids;
using Hull.Server.Errors;
using Hull.Store;
using WireAnchor = Hull.Protos.V1.FreeEnergyAnchor;
using WireModel = Hull.Protos.V1.SolidTemperatureModel;

namespace Hull.Server.Mapping;

/// <summary>
/// Translations of an entry's temperature model between the wire, Core's <see cref="SolidTemperatureModel"/> and the
/// store's <see cref="StoredTemperatureModel"/>. Core decides what a valid model is; the store keeps Core's tokens.
/// </summary>
public static class TemperatureModelMapping
{
    /// <summary>The wire's anchor as Core's; false for UNSPECIFIED or a number the contract does not define.</summary>
    public static bool TryFromWire(WireAnchor anchor, out FreeEnergyAnchor mapped)
    {
        switch (anchor)
        {
            case WireAnchor.Computed0K: mapped = FreeEnergyAnchor.Computed0K; return true;
            case WireAnchor.Fitted298K: mapped = FreeEnergyAnchor.Fitted298K; return true;
            default: mapped = default; return false;
        }
    }

    public static WireAnchor ToWire(FreeEnergyAnchor anchor) => anchor switch
    {
        FreeEnergyAnchor.Computed0K => WireAnchor.Computed0K,
        FreeEnergyAnchor.Fitted298K => WireAnchor.Fitted298K,
        _ => throw new ArgumentOutOfRangeException(nameof(anchor), anchor, "not a defined free-energy anchor"),
    };

    /// <summary>
    /// Checks a wire model against its entry's composition through Core and gives the row to store, or the field
    /// (relative to the model, e.g. "free_energy_table.points") and what is wrong with it.
    /// </summary>
    public static bool TryFromWire(WireModel model, string entryId, Composition entryComposition,
        out StoredTemperatureModel? stored, out (string Field, string Problem) fault)
    {
        stored = null;
        fault = default;
        if (model.Formula.Length > 0 && !Composition.TryParse(model.Formula, out _, out FormulaParseException? parseError))
        {
            fault = ("formula", $"the temperature model's formula does not parse: {parseError.Message}");
            return false;
        }

        SolidTemperatureModel core;
        string valueField = string.Empty;
        try
        {
            switch (model.KindCase)
            {
                case WireModel.KindOneofCase.StandardEntropyJPerMolK:
                    valueField = "standard_entropy_j_per_mol_k";
                    core = new StandardEntropyModel(model.StandardEntropyJPerMolK, model.Formula);
                    break;
                case WireModel.KindOneofCase.FreeEnergyTable:
                    if (!TryFromWire(model.FreeEnergyTable.Anchor, out FreeEnergyAnchor anchor))
                    {
                        fault = ("free_energy_table.anchor", AnchorProblem(model.FreeEnergyTable.Anchor));
                        return false;
                    }

                    valueField = "free_energy_table.points";
                    core = new FreeEnergyTableModel(anchor,
                        model.FreeEnergyTable.Points.Select(p => new FreeEnergyPoint(p.TemperatureK, p.ThermalFreeEnergyEv)), model.Formula);
                    break;
                default:
                    fault = (string.Empty, "the temperature model has neither a standard entropy nor a free-energy table; give one, or leave the model out");
                    return false;
            }
        }
        catch (ThermoInputException e)
        {
            fault = (valueField, e.Message);
            return false;
        }

        try
        {
            core.CheckFormulaOf(entryId, entryComposition);
        }
        catch (ThermoInputException e)
        {
            fault = ("formula", e.Message);
            return false;
        }

        stored = ToStored(core, model.Formula);
        return true;
    }

    public static string AnchorProblem(WireAnchor anchor) => anchor == WireAnchor.Unspecified
        ? "the free-energy table's anchor is not given; say whether the entry's energy is a computed energy at 0 K (FREE_ENERGY_ANCHOR_COMPUTED_0K) or stands for H°(298.15 K) (FREE_ENERGY_ANCHOR_FITTED_298K)"
        : $"{(int)anchor} is not a defined free-energy anchor";

    /// <summary>The store's row of a Core model; the formula text is kept as given.</summary>
    public static StoredTemperatureModel ToStored(SolidTemperatureModel model, string formulaAsGiven) => model switch
    {
        StandardEntropyModel entropy => StoredTemperatureModel.StandardEntropy(entropy.EntropyJPerMolK, formulaAsGiven),
        FreeEnergyTableModel table => StoredTemperatureModel.FreeEnergyTable(FreeEnergyAnchorTokens.ToToken(table.Anchor),
            table.Points.Select(p => new StoredFreeEnergyPoint(p.TemperatureK, p.ThermalFreeEnergyEvPerFormulaUnit)), formulaAsGiven),
        _ => throw new ArgumentOutOfRangeException(nameof(model), model, "not a known temperature model"),
    };

    /// <summary>
    /// Core's model of a stored row. The server checked it before it was stored, so a model Core refuses is a fault
    /// of the file, not of the caller.
    /// </summary>
    /// <exception cref="InvalidDataException">When the stored model cannot be read.</exception>
    public static SolidTemperatureModel ToCore(string entryId, StoredTemperatureModel stored)
    {
        try
        {
            if (stored.StandardEntropyJPerMolK is double entropy) return new StandardEntropyModel(entropy, stored.Formula);
            if (!FreeEnergyAnchorTokens.TryParse(stored.FreeEnergyAnchor, out FreeEnergyAnchor anchor))
            {
                throw new InvalidDataException($"stored entry '{entryId}' has the unknown free-energy anchor '{stored.FreeEnergyAnchor}'");
            }

            return new FreeEnergyTableModel(anchor,
                stored.FreeEnergyPoints.Select(p => new FreeEnergyPoint(p.TemperatureK, p.ThermalFreeEnergyEv)), stored.Formula);
        }
        catch (ThermoInputException e)
        {
            throw new InvalidDataException($"stored entry '{entryId}' has a temperature model the service cannot read: {e.Message}", e);
        }
    }

    public static WireModel ToWire(StoredTemperatureModel stored)
    {
        var wire = new WireModel { Formula = stored.Formula };
        if (stored.StandardEntropyJPerMolK is double entropy)
        {
            wire.StandardEntropyJPerMolK = entropy;
            return wire;
        }

        var table = new Protos.V1.FreeEnergyTable
        {
            Anchor = FreeEnergyAnchorTokens.TryParse(stored.FreeEnergyAnchor, out FreeEnergyAnchor anchor)
                ? ToWire(anchor)
                : throw new InvalidDataException($"a stored temperature model has the unknown free-energy anchor '{stored.FreeEnergyAnchor}'"),
        };
        table.Points.AddRange(stored.FreeEnergyPoints.Select(p => new Protos.V1.FreeEnergyPoint
        {
            TemperatureK = p.TemperatureK,
            ThermalFreeEnergyEv = p.ThermalFreeEnergyEv,
        }));
        wire.FreeEnergyTable = table;
        return wire;
    }
}
