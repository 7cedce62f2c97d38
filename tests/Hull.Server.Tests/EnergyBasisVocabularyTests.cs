using Hull.Core.Thermo;
using Hull.Server.Mapping;
using Hull.Store;
using ThermoBasis = Hull.Core.Thermo.EnergyBasis;
using WireBasis = Hull.Protos.V1.EnergyBasis;

namespace Hull.Server.Tests;

/// <summary>
/// The energy basis has one meaning (the engine's enum) and one spelling (its tokens); the contract's enum and the
/// store's accepted tokens must say the same, or a stored row, a file and a wire value could disagree.
/// </summary>
public sealed class EnergyBasisVocabularyTests
{
    [Fact]
    public void EngineTokensAreExactlyTheStoresAcceptedTokens()
    {
        Assert.Equal(StoredBasisTokens.All, EnergyBasisTokens.All.Select(EnergyBasisTokens.ToToken));
        Assert.Equal(Enum.GetValues<ThermoBasis>(), EnergyBasisTokens.All);
    }

    [Fact]
    public void EveryContractValueMapsToTheBasisItsNameSpells()
    {
        var defined = Hull.Protos.V1.EntriesReflection.Descriptor.EnumTypes.Single(e => e.Name == "EnergyBasis").Values
            .Where(v => v.Number != 0).ToList();
        Assert.Equal(EnergyBasisTokens.All.Count, defined.Count);
        foreach (var value in defined)
        {
            Assert.True(WireMapping.TryFromWire((WireBasis)value.Number, out ThermoBasis basis), value.Name);
            Assert.Equal(value.Name["ENERGY_BASIS_".Length..].ToLowerInvariant(), EnergyBasisTokens.ToToken(basis));
            Assert.Equal((WireBasis)value.Number, WireMapping.ToWire(basis));
        }

        Assert.False(WireMapping.TryFromWire(WireBasis.Unspecified, out _));
        Assert.False(WireMapping.TryFromWire((WireBasis)99, out _));
        Assert.False(EnergyBasisTokens.TryParse("Total_per_atom", out _));
    }
}
