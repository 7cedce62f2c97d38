namespace Hull.Server.Hosting;

/// <summary>Completes when <see cref="StartupHullWarming"/> has finished, stopped early, or had nothing to do.</summary>
public sealed class StartupWarmingProgress
{
    private readonly TaskCompletionSource _finished = new(TaskCreationOptions.RunContinuationsAsynchronously);

    public Task Finished => _finished.Task;

    internal void Finish() => _finished.TrySetResult();
}
