namespace Hull.Core.Thermo.Uncertainty;

/// <summary>Why sampling stopped.</summary>
public enum SamplingStopReason
{
    /// <summary>The number of samples the caller asked for was drawn.</summary>
    SampleCountReached,

    /// <summary>Every entry's vertex probability reached the target standard error.</summary>
    TargetReached,

    /// <summary>The work limit was reached before the target standard error (the estimates are those of the limit).</summary>
    WorkLimitReached,
}
