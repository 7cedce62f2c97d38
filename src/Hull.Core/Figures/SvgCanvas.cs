using System.Text;
using static Hull.Core.Figures.SvgText;

namespace Hull.Core.Figures;

/// <summary>
/// Writes one figure's SVG: the document frame with its metadata, then layers of elements. Every element that
/// stands for a phase or an edge carries data-kind and the ids it stands for, so that programs can find it.
/// </summary>
internal sealed class SvgCanvas
{
    private readonly StringBuilder _body = new(4096);

    public SvgCanvas(double width, double height)
    {
        Width = width;
        Height = height;
    }

    public double Width { get; }

    public double Height { get; }

    public StringBuilder Body => _body;

    public void Line(double x1, double y1, double x2, double y2, string color, double width, string? extra = null) =>
        _body.Append($"<line x1=\"{Px(x1)}\" y1=\"{Px(y1)}\" x2=\"{Px(x2)}\" y2=\"{Px(y2)}\" stroke=\"{color}\" stroke-width=\"{Px(width)}\"{Extra(extra)}/>\n");

    public void Edge(FigureEdge edge, double x1, double y1, double x2, double y2, double opacity)
    {
        _body.Append($"<line data-kind=\"edge\" data-from=\"{Escape(edge.FirstId)}\" data-to=\"{Escape(edge.SecondId)}\" ")
            .Append($"x1=\"{Px(x1)}\" y1=\"{Px(y1)}\" x2=\"{Px(x2)}\" y2=\"{Px(y2)}\"");
        if (opacity < 1) _body.Append($" stroke-opacity=\"{Num(opacity, "0.##")}\"");
        _body.Append("/>\n");
    }

    /// <summary>A stable phase: a diamond with a white rim.</summary>
    public void StableMarker(FigurePoint point, double x, double y, string title)
    {
        double r = FigurePalette.StableMarkerRadius * 1.25;
        _body.Append($"<path data-kind=\"phase\" data-id=\"{Escape(point.Id)}\" d=\"M{Px(x)} {Px(y - r)}L{Px(x + r)} {Px(y)}L{Px(x)} {Px(y + r)}L{Px(x - r)} {Px(y)}Z\" ")
            .Append($"><title>{Escape(title)}</title></path>\n");
    }

    /// <summary>An unstable entry: a small shaded circle with its energy above hull in its title; its group says data-kind="phase".</summary>
    public void UnstableMarker(FigurePoint point, double x, double y, string fill, string title) =>
        _body.Append($"<circle data-id=\"{Escape(point.Id)}\" cx=\"{Px(x)}\" cy=\"{Px(y)}\" r=\"{Px(FigurePalette.UnstableMarkerRadius)}\" ")
            .Append($"fill=\"{fill}\"><title>{Escape(title)}</title></circle>\n");

    /// <summary>Opens the group of the edges: their shared stroke is written once, which keeps large figures small.</summary>
    public void BeginEdges() =>
        _body.Append($"<g stroke=\"{FigurePalette.HullEdge}\" stroke-width=\"1.8\" stroke-linecap=\"round\">\n");

    /// <summary>
    /// Opens the group of the unstable markers, with their shared outline; data-kind is written once on the group
    /// (each marker still names its entry), which keeps a 1e4-entry figure under 2 MB.
    /// </summary>
    public void BeginUnstable() =>
        _body.Append($"<g data-kind=\"phase\" stroke=\"{FigurePalette.UnstableOutline}\" stroke-width=\"0.6\">\n");

    /// <summary>Opens the group of the stable markers: indigo with a white rim.</summary>
    public void BeginStable() =>
        _body.Append($"<g fill=\"{FigurePalette.StablePhase}\" stroke=\"{FigurePalette.Background}\" stroke-width=\"1.2\">\n");

    /// <summary>Opens the group of the formula labels: text colour, and a white halo that keeps them readable over lines.</summary>
    public void BeginLabels() =>
        _body.Append($"<g fill=\"{FigurePalette.Text}\" stroke=\"{FigurePalette.Background}\" stroke-width=\"3\" stroke-linejoin=\"round\" paint-order=\"stroke\">\n");

    public void EndGroup() => _body.Append("</g>\n");

    /// <summary>Plain text; <paramref name="anchor"/> is start, middle or end.</summary>
    public void Text(double x, double y, string text, double size, string anchor = "start", string? extra = null) =>
        _body.Append($"<text x=\"{Px(x)}\" y=\"{Px(y)}\" font-size=\"{Px(size)}\" text-anchor=\"{anchor}\" fill=\"{FigurePalette.Text}\"{Extra(extra)}>{Escape(text)}</text>\n");

    /// <summary>A formula with subscripts whose top-left box corner is (x, top); drawn inside <see cref="BeginLabels"/>.</summary>
    public void FormulaLabel(string formula, LabelBox box, double size, string? phaseId)
    {
        double baseline = box.Y + LabelMetrics.Ascent * size;
        string data = phaseId is null ? string.Empty : $" data-kind=\"label\" data-id=\"{Escape(phaseId)}\"";
        _body.Append($"<text{data} x=\"{Px(box.X)}\" y=\"{Px(baseline)}\" font-size=\"{Px(size)}\">")
            .Append(FormulaText.Markup(formula, size)).Append("</text>\n");
    }

    /// <summary>The figure's heading: its components as formulas (with subscripts), then what kind of hull.</summary>
    public void Title(FigurePlan plan)
    {
        double size = FigurePalette.TitleFontSize;
        // xml:space="preserve": the space before the kind words starts a tspan (after a subscript), and renderers
        // drop a tspan's leading white space otherwise, joining the last formula to "pseudo-ternary".
        _body.Append($"<text x=\"20\" y=\"30\" xml:space=\"preserve\" font-size=\"{Px(size)}\" font-weight=\"bold\" fill=\"{FigurePalette.Text}\">");
        bool below = false;
        for (int k = 0; k < plan.Input.Components.Count; k++)
        {
            if (k > 0) _body.Append(FormulaText.After("–", below, size));
            _body.Append(FormulaText.Markup(plan.Input.Components[k], size, out below));
        }

        _body.Append(FormulaText.After("\u00a0" + plan.KindName, below, size)).Append("</text>\n");
    }

    public void Raw(string markup) => _body.Append(markup);

    /// <summary>The whole document: root, title, metadata, background, then the body.</summary>
    public string Finish(FigureKind kind, FigureInput input, string title) => Finish(title,
        $"kind=\"{kind.ToString().ToLowerInvariant()}\" system=\"{Escape(input.SystemName)}\" " +
        $"components=\"{Escape(string.Join(' ', input.Components))}\" over-end-members=\"{(input.OverEndMembers ? "true" : "false")}\" " +
        input.Metadata.SvgAttributes() + " " +
        $"energy-axis=\"{Escape(input.Axis.Name)}\" energy-unit=\"{Escape(input.Axis.Unit)}\"");

    /// <summary>The whole document with the metadata element's attributes given (already escaped).</summary>
    public string Finish(string title, string metadataAttributes)
    {
        var b = new StringBuilder(_body.Length + 1024);
        b.Append("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n");
        b.Append($"<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{Px(Width)}\" height=\"{Px(Height)}\" viewBox=\"0 0 {Px(Width)} {Px(Height)}\" ")
            .Append($"font-family=\"{FigurePalette.FontFamily}\">\n");
        b.Append($"<title>{Escape(title)}</title>\n");
        b.Append("<metadata>\n");
        b.Append($"<hull:figure xmlns:hull=\"{FigureMetadataNames.Namespace}\" {metadataAttributes}/>\n");
        b.Append("</metadata>\n");
        b.Append($"<rect x=\"0\" y=\"0\" width=\"{Px(Width)}\" height=\"{Px(Height)}\" fill=\"{FigurePalette.Background}\"/>\n");
        b.Append(_body);
        b.Append("</svg>\n");
        return b.ToString();
    }

    private static string Extra(string? extra) => extra is null ? string.Empty : " " + extra;
}
