using System.Globalization;
using System.Xml.Linq;

namespace Hull.Core.Tests.Figures;

/// <summary>
/// A drawn figure read back as XML (System.Xml.Linq): its viewBox, phase markers, edges, labels and the
/// geometry of every element, for checks that do not trust the code that wrote it.
/// </summary>
public sealed class SvgFigure
{
    public static readonly XNamespace Svg = "http://www.w3.org/2000/svg";

    public SvgFigure(string text)
    {
        Text = text;
        Document = XDocument.Parse(text);
        double[] box = Numbers(Document.Root!.Attribute("viewBox")!.Value);
        (Width, Height) = (box[2], box[3]);
        Assert.Equal(0, box[0]);
        Assert.Equal(0, box[1]);
    }

    public string Text { get; }

    public XDocument Document { get; }

    public double Width { get; }

    public double Height { get; }

    public IEnumerable<XElement> Elements => Document.Descendants();

    /// <summary>Elements of a data-kind, written on the element or on the group around it, that name an id or edge.</summary>
    public IEnumerable<XElement> OfKind(string kind) => Elements.Where(e =>
        (e.Attribute("data-id") is not null || e.Attribute("data-from") is not null)
        && (string?)e.AncestorsAndSelf().Select(a => a.Attribute("data-kind")).FirstOrDefault(a => a is not null) == kind);

    /// <summary>The marker of each phase, by id.</summary>
    public Dictionary<string, XElement> Markers => OfKind("phase").ToDictionary(e => (string)e.Attribute("data-id")!, StringComparer.Ordinal);

    /// <summary>Drawn edges as (first, second) ids.</summary>
    public IReadOnlyList<(string First, string Second, XElement Element)> Edges =>
        OfKind("edge").Select(e => ((string)e.Attribute("data-from")!, (string)e.Attribute("data-to")!, e)).ToArray();

    /// <summary>Centre of a phase marker: a circle's centre, or the mean of a diamond path's four corners.</summary>
    public (double X, double Y) CentreOf(XElement marker)
    {
        if (marker.Name.LocalName == "circle") return (Attr(marker, "cx"), Attr(marker, "cy"));
        double[] v = Numbers(marker.Attribute("d")!.Value);
        Assert.Equal(8, v.Length);
        return ((v[0] + v[2] + v[4] + v[6]) / 4, (v[1] + v[3] + v[5] + v[7]) / 4);
    }

    /// <summary>Every coordinate pair an element puts on the canvas (lines, circles with radius, paths, rects, texts).</summary>
    public IEnumerable<(double X, double Y, string What)> Extents()
    {
        foreach (XElement e in Elements)
        {
            string n = e.Name.LocalName;
            switch (n)
            {
                case "line":
                    yield return (Attr(e, "x1"), Attr(e, "y1"), n);
                    yield return (Attr(e, "x2"), Attr(e, "y2"), n);
                    break;
                case "circle":
                    double r = Attr(e, "r");
                    yield return (Attr(e, "cx") - r, Attr(e, "cy") - r, n);
                    yield return (Attr(e, "cx") + r, Attr(e, "cy") + r, n);
                    break;
                case "rect":
                    yield return (Attr(e, "x"), Attr(e, "y"), n);
                    yield return (Attr(e, "x") + Attr(e, "width"), Attr(e, "y") + Attr(e, "height"), n);
                    break;
                case "path":
                    double[] v = Numbers(e.Attribute("d")!.Value);
                    for (int k = 0; k + 1 < v.Length; k += 2) yield return (v[k], v[k + 1], n);
                    break;
                case "text" when e.Attribute("transform") is null:
                    yield return (Attr(e, "x"), Attr(e, "y"), n);
                    break;
            }
        }
    }

    public static double Attr(XElement e, string name) =>
        double.Parse(e.Attribute(name)?.Value ?? throw new InvalidOperationException($"<{e.Name.LocalName}> has no {name}"), NumberStyles.Float, CultureInfo.InvariantCulture);

    /// <summary>The numbers of a path or viewBox (letters and commas are separators).</summary>
    public static double[] Numbers(string text) =>
        text.Split([' ', ',', 'M', 'L', 'Z', 'm', 'l', 'z'], StringSplitOptions.RemoveEmptyEntries)
            .Select(t => double.Parse(t, NumberStyles.Float, CultureInfo.InvariantCulture)).ToArray();
}
