using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Gases;
using Hull.Core.Thermo.Solids;

namespace Hull.Core.Tests.Thermo.Solids;

/// <summary>A stored temperature model with its table's anchor: what it accepts, refuses, and pairs with.</summary>
public sealed class AnchoredSolidModelTests
{
    // NBS Tables of Chemical Thermodynamic Properties (Wagman et al., 1982), S°(298.15 K) — from memory:
    // Ag2O(s) 121.3 J/(mol K).
    private const double SilverOxideEntropy = 121.3;

    private static readonly Composition SilverOxide = Composition.Parse("Ag2O");

    /// <summary>G(T) − H°(298.15 K) = −T S° of Ag2O with S° held constant (the Ellingham approximation), eV per formula unit.</summary>
    private static FreeEnergyPoint EllinghamRow(double temperatureK) =>
        new(temperatureK, -temperatureK * SilverOxideEntropy / 1000.0 / PhysicalConstants.KilojoulesPerMolPerEv);

    private static TabulatedFreeEnergyModel Table(params double[] temperaturesK) =>
        new(SilverOxide, [.. temperaturesK.Select(EllinghamRow)]);

    [Fact]
    public void The_worked_rows_are_the_hand_values()
    {
        // −300 K × 121.3 J/(mol K) / 96485.33212 C/mol = −0.377156 eV, by hand (e N_A, CODATA 2018)
        Assert.Equal(-0.377156, EllinghamRow(300).FreeEnergyAboveAnchorEvPerFormulaUnit, 6);
    }

    [Fact]
    public void A_table_keeps_its_anchor_and_an_entropy_needs_none()
    {
        var table = new AnchoredSolidModel(Table(300, 500, 700), FreeEnergyAnchor.Fitted298K);
        Assert.Equal(FreeEnergyAnchor.Fitted298K, table.TableAnchor);
        Assert.IsType<TabulatedFreeEnergyModel>(table.Model);
        var entropy = new AnchoredSolidModel(new StandardEntropyModel(SilverOxide, SilverOxideEntropy), null);
        Assert.Null(entropy.TableAnchor);
        Assert.Equal(new AnchoredSolidModel(entropy.Model, null), entropy);
    }

    [Fact]
    public void A_table_without_an_anchor_or_an_entropy_with_one_is_refused()
    {
        var none = Assert.Throws<ThermoInputException>(() => new AnchoredSolidModel(Table(300, 500), null));
        Assert.Equal("The tabulated free energy of Ag2O needs its anchor, one of computed_0k, fitted_298k.", none.Message);
        Assert.Throws<ThermoInputException>(() => new AnchoredSolidModel(Table(300, 500), (FreeEnergyAnchor)9));
        var extra = Assert.Throws<ThermoInputException>(() =>
            new AnchoredSolidModel(new StandardEntropyModel(SilverOxide, SilverOxideEntropy), FreeEnergyAnchor.Computed0K));
        Assert.Contains("An anchor belongs to a tabulated free energy, not to S° = 121.3 J/(mol K) per Ag2O", extra.Message);
    }

    [Fact]
    public void A_stored_table_starts_above_zero_kelvin()
    {
        var e = Assert.Throws<ThermoInputException>(() => new AnchoredSolidModel(Table(0, 300), FreeEnergyAnchor.Computed0K));
        Assert.Equal("Row 0 of the tabulated free energy of Ag2O is at 0 K; temperatures must be above 0 K.", e.Message);
        Assert.NotNull(new AnchoredSolidModel(Table(1e-3, 300), FreeEnergyAnchor.Computed0K));
    }

    [Fact]
    public void A_table_is_used_only_with_the_gas_mode_of_its_anchor()
    {
        var fitted = new AnchoredSolidModel(Table(300, 500), FreeEnergyAnchor.Fitted298K);
        fitted.RequireAnchorFor(GasReferenceMode.FittedElementalReference, "ag2o");
        var e = Assert.Throws<ThermoInputException>(() => fitted.RequireAnchorFor(GasReferenceMode.ComputedMoleculeEnergy, "ag2o"));
        Assert.Equal("ag2o", e.EntryId);
        Assert.Contains("its G(T) table is on the fitted_298k anchor (298.15 K), but the gas reference in use is anchored at 0 K", e.Message);

        var computed = new AnchoredSolidModel(Table(300, 500), FreeEnergyAnchor.Computed0K);
        computed.RequireAnchorFor(GasReferenceMode.ComputedMoleculeEnergy, "ag2o");
        Assert.Throws<ThermoInputException>(() => computed.RequireAnchorFor(GasReferenceMode.FittedElementalReference, "ag2o"));

        // A standard entropy fits either mode.
        var entropy = new AnchoredSolidModel(new StandardEntropyModel(SilverOxide, SilverOxideEntropy), null);
        entropy.RequireAnchorFor(GasReferenceMode.ComputedMoleculeEnergy, "ag2o");
        entropy.RequireAnchorFor(GasReferenceMode.FittedElementalReference, "ag2o");
    }

    [Fact]
    public void Each_anchor_pairs_with_the_gas_mode_of_the_same_zero_and_has_one_token()
    {
        Assert.Equal(0.0, FreeEnergyAnchor.Computed0K.AnchorTemperatureK());
        Assert.Equal(GasReferenceMode.ComputedMoleculeEnergy, FreeEnergyAnchor.Computed0K.PairedGasMode());
        Assert.Equal(298.15, FreeEnergyAnchor.Fitted298K.AnchorTemperatureK()); // common practice: standard temperature
        Assert.Equal(GasReferenceMode.FittedElementalReference, FreeEnergyAnchor.Fitted298K.PairedGasMode());
        foreach (FreeEnergyAnchor anchor in FreeEnergyAnchorTokens.All)
        {
            Assert.True(FreeEnergyAnchorTokens.TryParse(FreeEnergyAnchorTokens.ToToken(anchor), out FreeEnergyAnchor back));
            Assert.Equal(anchor, back);
        }

        Assert.Equal(Enum.GetValues<FreeEnergyAnchor>(), FreeEnergyAnchorTokens.All);
        Assert.False(FreeEnergyAnchorTokens.TryParse("Fitted_298k", out _));
    }
}
