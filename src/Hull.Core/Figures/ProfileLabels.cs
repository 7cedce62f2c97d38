using System.Text;
using Hull.Core.Thermo;
using static Hull.Core.Figures.SvgText;

namespace Hull.Core.Figures;

/// <summary>Phase lists as one line of formulas with subscripts ("Fe + LiF"), for profile figures.</summary>
internal static class ProfileLabels
{
    public static void Phases(SvgCanvas canvas, double x, double y, IEnumerable<HullPhase> phases, double size, string anchor, string? prefix = null)
    {
        var text = new StringBuilder();
        text.Append($"<text data-kind=\"label\" x=\"{Px(x)}\" y=\"{Px(y)}\" font-size=\"{Px(size)}\" text-anchor=\"{anchor}\" xml:space=\"preserve\" ")
            .Append($"fill=\"{FigurePalette.Text}\" stroke=\"{FigurePalette.Background}\" stroke-width=\"3\" stroke-linejoin=\"round\" paint-order=\"stroke\">");
        bool below = false, first = true;
        if (prefix is not null)
        {
            text.Append(Escape(prefix));
        }

        foreach (HullPhase phase in phases)
        {
            if (!first) text.Append(FormulaText.After(" + ", below, size));
            text.Append(FormulaText.Markup(phase.IsSynthetic ? phase.Id : phase.Composition.Formula, size, out below));
            first = false;
        }

        canvas.Raw(text.Append("</text>\n").ToString());
    }
}
