namespace Hull.Core.Thermo.Gases;

/// <summary>
/// The outcome of a bracketed temperature solve: why it stopped, the root (NaN when none was bracketed), the final
/// bracket, the bisection steps taken and how many sign changes the scan found (more than one means the reported
/// root is the lowest).
/// </summary>
public sealed record TemperatureSolveResult(
    TemperatureSolveStatus Status,
    double TemperatureK,
    double BracketLowK,
    double BracketHighK,
    int Steps,
    int SignChangesFound,
    double SearchedFromK,
    double SearchedToK)
{
    public bool IsConverged => Status == TemperatureSolveStatus.Converged;
}
