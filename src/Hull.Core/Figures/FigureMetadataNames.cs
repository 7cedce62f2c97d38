namespace Hull.Core.Figures;

/// <summary>The XML namespace of the figure metadata element, for programs that read it back.</summary>
public static class FigureMetadataNames
{
    public const string Namespace = "urn:hull:figure:1";
}
