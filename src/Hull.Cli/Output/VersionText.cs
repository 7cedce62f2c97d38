using Hull.Protos.V1;

namespace Hull.Cli.Output;

/// <summary>How a heading names the version an answer used: "dataset d, version 2", with the correction set when it has one.</summary>
public static class VersionText
{
    public static string Of(VersionUsed used) => $"dataset {used.Dataset}, version {used.Version}"
        + (used.Corrections is { } k ? $" (corrected with {CorrectedWith(k)})" : string.Empty);

    /// <summary>"set v1 from version 3"; empty for none (a version imported as given).</summary>
    public static string CorrectedWith(CorrectionsUsed? used) =>
        used is null ? string.Empty : $"{used.SetName} v{used.SetVersion} from version {used.SourceVersion}";
}
