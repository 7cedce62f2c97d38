namespace Hull.Core.Thermo;

/// <summary>Which atoms the per-atom energies and the composition fractions of a hull count.</summary>
public enum AtomNormalisation
{
    /// <summary>Every atom of the formula unit.</summary>
    PerAtom,

    /// <summary>Only the atoms of the closed elements (an open-element hull: the open elements are exchanged with a reservoir).</summary>
    PerClosedElementAtom,
}
