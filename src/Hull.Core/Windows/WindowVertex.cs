using Hull.Core.Thermo;

namespace Hull.Core.Windows;

/// <summary>A vertex of a stability window: the potentials there and what bounds it. Immutable.</summary>
public sealed class WindowVertex
{
    internal WindowVertex(IReadOnlyList<double> potentials, IReadOnlyList<HullPhase> limitingPhases, IReadOnlyList<string> elementsAtReference)
    {
        ChemicalPotentialsEv = potentials;
        LimitingPhases = limitingPhases;
        ElementsAtReference = elementsAtReference;
    }

    /// <summary>Δμ of each element relative to its reference (eV per atom of the element), in the window's element order.</summary>
    public IReadOnlyList<double> ChemicalPotentialsEv { get; }

    /// <summary>Competing phases whose formation limit is reached here, sorted by id.</summary>
    public IReadOnlyList<HullPhase> LimitingPhases { get; }

    /// <summary>Elements at their reference (Δμ = 0) here, in element order.</summary>
    public IReadOnlyList<string> ElementsAtReference { get; }
}
