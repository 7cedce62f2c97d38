namespace Hull.Server.Curation;

/// <summary>Drops every entry whose metadata has the flag word (default "flagged").</summary>
public sealed class DropFlaggedStep(string flag) : DropByMetadataWordStep("flag", flag, flag)
{
    public const string KindName = "drop_flagged";

    public override string Kind => KindName;

    public static DropFlaggedStep Read(StepParameters p) => new(p.Text("flag", "flagged"));
}
