namespace Hull.Core.Figures;

/// <summary>The box a formula label takes, from its font size: height covers capitals and the dropped subscripts.</summary>
internal static class LabelMetrics
{
    /// <summary>Baseline below the box top, as a fraction of the font size (capital height plus a little).</summary>
    public const double Ascent = 0.82;

    /// <summary>Box height as a fraction of the font size: ascent, subscript drop and the subscripts' descent.</summary>
    public const double Height = 1.25;

    public static (double Width, double Height) Of(string formula, double size) =>
        (FormulaText.Width(formula, size) + 2, Height * size);
}
