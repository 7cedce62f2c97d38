namespace Hull.Core.Thermo.Temperature;

/// <summary>Which way a phase's signed decomposition energy crosses zero as the temperature rises.</summary>
public enum CrossingDirection
{
    /// <summary>From negative to positive: stable below, decomposes above (an oxide giving off oxygen, say).</summary>
    DecomposesAbove,

    /// <summary>From positive to negative: decomposes below, stable above (it forms from its competitors on heating).</summary>
    FormsAbove,
}
