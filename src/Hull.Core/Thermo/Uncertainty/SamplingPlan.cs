using System.Globalization;

namespace Hull.Core.Thermo.Uncertainty;

/// <summary>
/// How many samples to draw and from which seed: a fixed <see cref="SampleCount"/>, or batches of
/// <see cref="BatchSize"/> until every vertex probability has a Monte Carlo standard error at most
/// <see cref="TargetStandardError"/>, within the work limits of <see cref="SamplingLimits"/>.
/// </summary>
public sealed record SamplingPlan
{
    /// <summary>Samples per batch when sampling to a target: the estimate is judged only between batches, so the
    /// count drawn never depends on thread scheduling; 250 keeps the first judgement above the small-sample regime.</summary>
    public const int BatchSize = 250;

    private SamplingPlan(ulong seed, int? sampleCount, double? targetStandardError)
    {
        Seed = seed;
        SampleCount = sampleCount;
        TargetStandardError = targetStandardError;
    }

    /// <summary>The seed every draw follows from; the same seed and data give the same answer on any number of threads.</summary>
    public ulong Seed { get; }

    /// <summary>The fixed number of samples, or null when sampling to a target.</summary>
    public int? SampleCount { get; }

    /// <summary>The target standard error of every vertex probability, or null for a fixed count.</summary>
    public double? TargetStandardError { get; }

    /// <summary>Exactly <paramref name="sampleCount"/> samples.</summary>
    /// <exception cref="ThermoInputException">Fewer than 2 samples, or more than <see cref="SamplingLimits.MaxSamples"/>.</exception>
    public static SamplingPlan Fixed(int sampleCount, ulong seed)
    {
        if (sampleCount < 2 || sampleCount > SamplingLimits.MaxSamples)
        {
            throw new ThermoInputException(
                string.Create(CultureInfo.InvariantCulture,
                    $"samples: {sampleCount} samples asked; give between 2 and {SamplingLimits.MaxSamples} (the work limit)."));
        }

        return new SamplingPlan(seed, sampleCount, null);
    }

    /// <summary>Batches until every vertex probability's standard error is at most <paramref name="standardError"/>.</summary>
    /// <exception cref="ThermoInputException">A target outside (0, 0.5).</exception>
    public static SamplingPlan ToTarget(double standardError, ulong seed)
    {
        if (!double.IsFinite(standardError) || standardError <= 0 || standardError >= 0.5)
        {
            throw new ThermoInputException(
                string.Create(CultureInfo.InvariantCulture,
                    $"target standard error: {standardError} is not a probability's standard error; give a number in (0, 0.5)."));
        }

        return new SamplingPlan(seed, null, standardError);
    }
}
