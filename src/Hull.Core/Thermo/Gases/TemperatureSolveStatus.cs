namespace Hull.Core.Thermo.Gases;

/// <summary>Why a temperature solve stopped.</summary>
public enum TemperatureSolveStatus
{
    /// <summary>A root was bracketed and the bracket narrowed to the tolerance (or a scan point hit it exactly).</summary>
    Converged,

    /// <summary>The function does not change sign anywhere in the range searched: no temperature there gives the target.</summary>
    NoSignChangeInRange,

    /// <summary>The function gave a non-finite value at <see cref="TemperatureSolveResult.TemperatureK"/>; the solve stopped there.</summary>
    NonFiniteValue,

    /// <summary>The step limit was reached before the bracket narrowed to the tolerance; the midpoint is the best estimate.</summary>
    StepLimitReached,
}
