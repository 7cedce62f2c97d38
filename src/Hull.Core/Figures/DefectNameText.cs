namespace Hull.Core.Figures;

/// <summary>Point-defect names in figure text.</summary>
public static class DefectNameText
{
    /// <summary>
    /// A defect name with the site after each '_' as a subscript (V_O as V with subscript O, Mg_Al+V_O likewise),
    /// the usual way of writing point defects; other names are plain text.
    /// </summary>
    public static string Markup(string name, double size)
    {
        var b = new System.Text.StringBuilder();
        string drop = SvgText.Px(FormulaText.SubscriptDrop * size), rise = SvgText.Px(-FormulaText.SubscriptDrop * size), small = SvgText.Px(FormulaText.SubscriptScale * size);
        int i = 0;
        while (i < name.Length)
        {
            int mark = name.IndexOf('_', i);
            int end = mark < 0 ? -1 : name.IndexOfAny(['+', ' ', ',', '(', ')', '_'], mark + 1);
            if (mark < 0 || mark + 1 == name.Length || end == mark + 1)
            {
                b.Append(SvgText.Escape(name[i..]));
                break;
            }

            end = end < 0 ? name.Length : end;
            b.Append(SvgText.Escape(name[i..mark]));
            b.Append($"<tspan dy=\"{drop}\" font-size=\"{small}\">{SvgText.Escape(name[(mark + 1)..end])}</tspan>");
            b.Append($"<tspan dy=\"{rise}\">\u200b</tspan>");
            i = end;
        }

        return b.ToString();
    }
}
