using Hull.Core.Chemistry;

namespace Hull.Core.Thermo;

/// <summary>
/// The components of a hull (elements, or compound end-members) and the exact map from a composition to the atoms
/// each component contributes to one formula unit of it. Hull coordinates are those atoms, so the lever rule holds
/// for energies per atom.
/// </summary>
internal abstract class ComponentSpace
{
    protected ComponentSpace(IReadOnlyList<string> names)
    {
        Names = names;
        SystemName = string.Join("-", names);
    }

    /// <summary>Component names in hull order.</summary>
    public IReadOnlyList<string> Names { get; }

    /// <summary>The components joined by '-'.</summary>
    public string SystemName { get; }

    /// <summary>Atoms per component in one formula unit, or a failure text that completes "Formula ...".</summary>
    public abstract bool TryMap(Composition composition, out Rational[] componentAtoms, out string failure);

    /// <summary>Components over chemical elements, in ordinal symbol order.</summary>
    public sealed class OverElements(IReadOnlyList<string> symbols) : ComponentSpace(symbols)
    {
        public override bool TryMap(Composition composition, out Rational[] componentAtoms, out string failure)
        {
            foreach (string element in composition.Elements)
            {
                if (IndexOf(element) < 0)
                {
                    componentAtoms = [];
                    failure = $"contains {element}, which is not in the chemical system {SystemName}.";
                    return false;
                }
            }

            return TryMapWithin(composition, out componentAtoms, out failure);
        }

        /// <summary>The atoms of the system's elements, ignoring any other element of the composition.</summary>
        internal bool TryMapWithin(Composition composition, out Rational[] componentAtoms, out string failure)
        {
            componentAtoms = new Rational[Names.Count];
            for (int k = 0; k < componentAtoms.Length; k++)
            {
                componentAtoms[k] = composition.AmountOf(Names[k]);
            }

            failure = string.Empty;
            return true;
        }

        private int IndexOf(string element)
        {
            for (int k = 0; k < Names.Count; k++)
            {
                if (string.Equals(Names[k], element, StringComparison.Ordinal))
                {
                    return k;
                }
            }

            return -1;
        }
    }

    /// <summary>
    /// Components over the closed elements of an open-element hull, in ordinal symbol order: the open elements are
    /// exchanged with a reservoir, so they are dropped from the coordinates (atoms count closed elements only).
    /// </summary>
    public sealed class OverClosedElements(IReadOnlyList<string> closed, IReadOnlyList<OpenElement> open) : ComponentSpace(closed)
    {
        private readonly OverElements _closed = new(closed);

        public override bool TryMap(Composition composition, out Rational[] componentAtoms, out string failure)
        {
            bool anyClosed = false;
            foreach (string element in composition.Elements)
            {
                bool isOpen = open.Any(o => string.Equals(o.Symbol, element, StringComparison.Ordinal));
                if (!isOpen && !Names.Contains(element, StringComparer.Ordinal))
                {
                    componentAtoms = [];
                    failure = $"contains {element}, which is neither a closed element of {SystemName} nor open.";
                    return false;
                }

                anyClosed |= !isOpen;
            }

            if (!anyClosed)
            {
                componentAtoms = [];
                failure = $"has no closed element of {SystemName}: made of open elements only, it is part of the reservoir.";
                return false;
            }

            return _closed.TryMapWithin(composition, out componentAtoms, out failure);
        }
    }

    /// <summary>Components over compound end-members, in the basis order.</summary>
    public sealed class OverEndMembers(EndMemberBasis basis) : ComponentSpace(basis.Names)
    {
        public EndMemberBasis Basis { get; } = basis;

        public override bool TryMap(Composition composition, out Rational[] componentAtoms, out string failure) =>
            Basis.TryComponentAtoms(composition, out componentAtoms, out failure);
    }
}
