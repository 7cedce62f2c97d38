namespace Hull.Server.Curation;

/// <summary>Drops every entry whose metadata tags it with the source, written as the word <c>source=NAME</c>.</summary>
public sealed class DropSourceStep(string source) : DropByMetadataWordStep("source", source, "source=" + source)
{
    public const string KindName = "drop_source";

    public override string Kind => KindName;

    public static DropSourceStep Read(StepParameters p) => new(p.Text("source"));
}
