namespace Hull.Core.Figures;

/// <summary>
/// The figures' categorical colours, fonts and marker sizes. The categorical colours (stable phases, hull edges,
/// frame) were chosen to stay apart under simulated protanopia, deuteranopia and tritanopia; the tests hold them
/// to it.
/// </summary>
public static class FigurePalette
{
    /// <summary>Stable phases (hull vertices): deep indigo.</summary>
    public const string StablePhase = "#23378a";

    /// <summary>Hull edges and tie-lines: burnt orange.</summary>
    public const string HullEdge = "#c4572a";

    /// <summary>Frame, axes and ticks: mid grey, lighter than the data so it recedes.</summary>
    public const string Frame = "#7a7a7a";

    /// <summary>The background.</summary>
    public const string Background = "#ffffff";

    /// <summary>Every categorical colour, for the distinguishability tests.</summary>
    public static IReadOnlyList<string> Categorical { get; } = [StablePhase, HullEdge, Frame, Background];

    /// <summary>Text: near black.</summary>
    public const string Text = "#1e1e1e";

    /// <summary>Outline of unstable markers, so that the palest shades still show on white.</summary>
    public const string UnstableOutline = "#5c5c5c";

    public const string FontFamily = "DejaVu Sans, Verdana, Arial, sans-serif";

    public const double LabelFontSize = 13.0;

    public const double TitleFontSize = 16.0;

    public const double SmallFontSize = 11.0;

    public const double StableMarkerRadius = 5.0;

    public const double UnstableMarkerRadius = 3.4;
}
