using Hull.Core.Chemistry;

namespace Hull.Core.Thermo;

/// <summary>
/// The components of a hull (elements, or compound end-members) and the exact map from a composition to the atoms
/// each component contributes to one formula unit of it. Hull coordinates are those atoms, so the lever rule holds
/// for energies per atom.
/// </summary>
internal abstract class ComponentSpace
{
    protected ComponentSpace(IReadOnlyList<string> names) => Names = names;

    /// <summary>Component names in hull order.</summary>
    public IReadOnlyList<string> Names { get; }

    /// <summary>The components joined by '-'.</summary>
    public string SystemName => string.Join("-", Names);

    /// <summary>Atoms per component in one formula unit, or a failure text that completes "Formula ...".</summary>
    public abstract bool TryMap(Composition composition, out BigFraction[] componentAtoms, out string failure);

    /// <summary>Components over chemical elements, in ordinal symbol order.</summary>
    public sealed class OverElements(IReadOnlyList<string> symbols) : ComponentSpace(symbols)
    {
        public override bool TryMap(Composition composition, out BigFraction[] componentAtoms, out string failure)
        {
            foreach (string element in composition.Elements)
            {
                if (!Names.Contains(element, StringComparer.Ordinal))
                {
                    componentAtoms = [];
                    failure = $"contains {element}, which is not in the chemical system {SystemName}.";
                    return false;
                }
            }

            componentAtoms = Names.Select(e => BigFraction.FromRational(composition.AmountOf(e))).ToArray();
            failure = string.Empty;
            return true;
        }
    }

    /// <summary>Components over compound end-members, in the basis order.</summary>
    public sealed class OverEndMembers(EndMemberBasis basis) : ComponentSpace(basis.Names)
    {
        public EndMemberBasis Basis { get; } = basis;

        public override bool TryMap(Composition composition, out BigFraction[] componentAtoms, out string failure) =>
            Basis.TryComponentAtoms(composition, out componentAtoms, out failure);
    }
}
