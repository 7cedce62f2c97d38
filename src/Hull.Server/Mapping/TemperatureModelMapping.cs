using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Solids;
using Hull.Store;
using WireAnchor = Hull.Protos.V1.FreeEnergyAnchor;
using WireModel = Hull.Protos.V1.EntryTemperatureModel;

namespace Hull.Server.Mapping;

/// <summary>
/// Translations of an entry's stored temperature model between the wire, Core's <see cref="AnchoredSolidModel"/> and
/// the store's <see cref="StoredTemperatureModel"/>. Core decides what a valid model is; the store keeps Core's tokens.
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
    /// Checks a wire model against its entry through Core and gives the row to store, or the field (relative to the
    /// model, e.g. "free_energy_table.rows"; empty for the model itself) and what is wrong with it.
    /// </summary>
    public static bool TryFromWire(WireModel model, string entryId, Composition entryComposition,
        out StoredTemperatureModel? stored, out (string Field, string Problem) fault)
    {
        stored = null;
        fault = default;
        Composition formula = entryComposition;
        if (model.Formula.Length > 0 && !Composition.TryParse(model.Formula, out formula!, out FormulaParseException? parseError))
        {
            fault = ("formula", $"the temperature model's formula does not parse: {parseError.Message}");
            return false;
        }

        SolidTemperatureModel core;
        FreeEnergyAnchor? anchor = null;
        string valueField = string.Empty;
        try
        {
            switch (model.KindCase)
            {
                case WireModel.KindOneofCase.StandardEntropyJPerMolK:
                    valueField = "standard_entropy_j_per_mol_k";
                    core = new StandardEntropyModel(formula, model.StandardEntropyJPerMolK);
                    break;
                case WireModel.KindOneofCase.FreeEnergyTable:
                    if (!TryFromWire(model.FreeEnergyTable.Anchor, out FreeEnergyAnchor tableAnchor))
                    {
                        fault = ("free_energy_table.anchor", AnchorProblem(model.FreeEnergyTable.Anchor));
                        return false;
                    }

                    anchor = tableAnchor;
                    valueField = "free_energy_table.rows";
                    core = new TabulatedFreeEnergyModel(formula,
                        [.. model.FreeEnergyTable.Rows.Select(p => new FreeEnergyPoint(p.TemperatureK, p.FreeEnergyAboveAnchorEv))]);
                    break;
                default:
                    fault = (string.Empty, "the temperature model has neither a standard entropy nor a free-energy table; give one, or leave the model out");
                    return false;
            }

            _ = new AnchoredSolidModel(core, anchor);
        }
        catch (ThermoInputException e)
        {
            fault = (valueField, e.Message);
            return false;
        }

        try
        {
            // RequireMatches reads only the id and the composition; the energy and basis are checked on their own fields.
            core.RequireMatches(new PhaseEntry(entryId, entryComposition, 0.0, EnergyBasis.FormationPerAtom));
        }
        catch (ThermoInputException e)
        {
            fault = ("formula", e.Message);
            return false;
        }

        stored = model.KindCase == WireModel.KindOneofCase.StandardEntropyJPerMolK
            ? StoredTemperatureModel.StandardEntropy(model.StandardEntropyJPerMolK, model.Formula)
            : StoredTemperatureModel.FreeEnergyTable(FreeEnergyAnchorTokens.ToToken(anchor!.Value),
                model.FreeEnergyTable.Rows.Select(p => new StoredFreeEnergyPoint(p.TemperatureK, p.FreeEnergyAboveAnchorEv)), model.Formula);
        return true;
    }

    public static string AnchorProblem(WireAnchor anchor) => anchor == WireAnchor.Unspecified
        ? "the free-energy table's anchor is not given; say whether the entry's energy is a computed energy at 0 K (FREE_ENERGY_ANCHOR_COMPUTED_0K) or stands for H°(298.15 K) (FREE_ENERGY_ANCHOR_FITTED_298K)"
        : $"{(int)anchor} is not a defined free-energy anchor";

    /// <summary>
    /// Core's model of a stored row (its formula, or the entry's when it names none). The server checked it before it
    /// was stored, so a model Core refuses is a fault of the file, not of the caller.
    /// </summary>
    /// <exception cref="InvalidDataException">When the stored model cannot be read.</exception>
    public static AnchoredSolidModel ToCore(string entryId, Composition entryComposition, StoredTemperatureModel stored)
    {
        try
        {
            Composition formula = stored.Formula.Length == 0 ? entryComposition : Composition.Parse(stored.Formula);
            if (stored.StandardEntropyJPerMolK is double entropy) return new AnchoredSolidModel(new StandardEntropyModel(formula, entropy), null);
            if (!FreeEnergyAnchorTokens.TryParse(stored.FreeEnergyAnchor, out FreeEnergyAnchor anchor))
            {
                throw new InvalidDataException($"stored entry '{entryId}' has the unknown free-energy anchor '{stored.FreeEnergyAnchor}'");
            }

            return new AnchoredSolidModel(new TabulatedFreeEnergyModel(formula,
                [.. stored.FreeEnergyPoints.Select(p => new FreeEnergyPoint(p.TemperatureK, p.FreeEnergyAboveAnchorEv))]), anchor);
        }
        catch (Exception e) when (e is ThermoInputException or FormulaParseException)
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

        var table = new Protos.V1.EntryFreeEnergyTable
        {
            Anchor = FreeEnergyAnchorTokens.TryParse(stored.FreeEnergyAnchor, out FreeEnergyAnchor anchor)
                ? ToWire(anchor)
                : throw new InvalidDataException($"a stored temperature model has the unknown free-energy anchor '{stored.FreeEnergyAnchor}'"),
        };
        table.Rows.AddRange(stored.FreeEnergyPoints.Select(p => new Protos.V1.EntryFreeEnergyRow
        {
            TemperatureK = p.TemperatureK,
            FreeEnergyAboveAnchorEv = p.FreeEnergyAboveAnchorEv,
        }));
        wire.FreeEnergyTable = table;
        return wire;
    }
}
