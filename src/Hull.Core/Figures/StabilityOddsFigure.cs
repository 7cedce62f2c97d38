using System.Globalization;
using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Uncertainty;
using static Hull.Core.Figures.SvgText;

namespace Hull.Core.Figures;

/// <summary>
/// A ternary with each phase's probability of being a hull vertex under its energy uncertainty: the triangle and
/// corner names of the phase-diagram ternary, the plain hull's tie-lines thin behind, every entry a disc whose
/// area and shade (<see cref="StabilityOddsScale"/>) grow with the probability, phases with a probability of at
/// least <see cref="LabelFromProbability"/> named with it in percent. Pure: the same input gives the same text.
/// </summary>
public static class StabilityOddsFigure
{
    /// <summary>Phases this likely or more to be vertices are labelled.</summary>
    public const double LabelFromProbability = 0.05;

    private const double MinRadius = 2.6, MaxRadius = 8.5;

    // Between a formula and its percentage (a leading space would be dropped by SVG's white-space rules).
    private const double PercentGap = 3.0;

    /// <exception cref="FigureInputException">A hull without three components, or a result of another system.</exception>
    public static string Draw(SystemHull hull, StabilitySamplingResult odds, FigureMetadata metadata)
    {
        ArgumentNullException.ThrowIfNull(hull);
        ArgumentNullException.ThrowIfNull(odds);
        ArgumentNullException.ThrowIfNull(metadata);
        if (hull.Components.Count != 3)
        {
            throw new FigureInputException($"The stability-odds figure is a ternary; the hull of {hull.SystemName} has {hull.Components.Count} components.", nameof(hull));
        }

        if (!string.Equals(odds.SystemName, hull.SystemName, StringComparison.Ordinal))
        {
            throw new FigureInputException($"The sampling is of {odds.SystemName}, the hull of {hull.SystemName}.", nameof(odds));
        }

        var canvas = new SvgCanvas(SimplexFigure.Width, SimplexFigure.Height);
        (double X, double Y)[] corners = SimplexFigure.TernaryCorners;
        string system = string.Join('–', hull.Components);
        canvas.Text(20, 30, $"{system}: probability of being stable", FigurePalette.TitleFontSize, extra: "font-weight=\"bold\"");
        canvas.Text(20, 48, string.Create(CultureInfo.InvariantCulture,
            $"{odds.SampleCount:N0} samples of the formation energies (seed {odds.Seed}); disc area and shade: probability of being a hull vertex; lines: plain hull"),
            FigurePalette.SmallFontSize);
        for (int k = 0; k < 3; k++)
        {
            (double X, double Y) a = corners[k], b = corners[(k + 1) % 3];
            canvas.Line(a.X, a.Y, b.X, b.Y, FigurePalette.Frame, 1.2);
        }

        var byId = hull.Entries.ToDictionary(e => e.Id, StringComparer.Ordinal);
        var positions = new Dictionary<string, (double X, double Y)>(StringComparer.Ordinal);
        foreach (HullPhase phase in hull.StablePhases)
        {
            positions[phase.Id] = phase.IsSynthetic ? corners[hull.Components.ToList().IndexOf(phase.Id)] : SimplexFigure.TernaryPosition(byId[phase.Id].ComponentAtomFractions);
        }

        canvas.Raw($"<g stroke=\"{FigurePalette.HullEdge}\" stroke-width=\"1\" stroke-opacity=\"0.55\" stroke-dasharray=\"5 3\">\n");
        foreach (TieLine line in hull.TieLines)
        {
            (double X, double Y) a = positions[line.First.Id], b = positions[line.Second.Id];
            canvas.Edge(new FigureEdge(line.First.Id, line.Second.Id), a.X, a.Y, b.X, b.Y, 1.0);
        }

        canvas.EndGroup();
        var placer = new LabelPlacer(new LabelBox(4, 56, SimplexFigure.LegendLeft - 12, SimplexFigure.Height - 56 - 26));
        var ordered = odds.Entries.OrderBy(o => o.VertexProbability).ThenBy(o => o.EntryId, StringComparer.Ordinal).ToArray();
        var discs = new List<(EntryStabilityOdds Odds, double X, double Y, double R)>();
        canvas.Raw($"<g data-kind=\"phase\" stroke=\"{FigurePalette.UnstableOutline}\" stroke-width=\"0.7\">\n");
        foreach (EntryStabilityOdds o in ordered)
        {
            (double x, double y) = SimplexFigure.TernaryPosition(byId[o.EntryId].ComponentAtomFractions);
            double r = RadiusAt(o.VertexProbability);
            string title = string.Create(CultureInfo.InvariantCulture,
                $"{o.EntryId} ({o.Formula}): stable in {o.VertexProbability:P1} ± {o.VertexProbabilityStandardError:P1} of samples; above hull {o.MeanEnergyAboveHullEvPerAtom:0.000} eV/atom (5–95 %: {o.EnergyAboveHullP05EvPerAtom:0.000}–{o.EnergyAboveHullP95EvPerAtom:0.000})");
            canvas.Raw(string.Create(CultureInfo.InvariantCulture,
                $"<circle data-id=\"{Escape(o.EntryId)}\" data-probability=\"{o.VertexProbability:0.####}\" cx=\"{Px(x)}\" cy=\"{Px(y)}\" r=\"{Px(r)}\" fill=\"{StabilityOddsScale.ColorAt(o.VertexProbability)}\"><title>{Escape(title)}</title></circle>\n"));
            discs.Add((o, x, y, r));
            placer.Avoid(LabelBox.Around(x, y, r));
        }

        canvas.EndGroup();
        canvas.BeginLabels();
        SimplexFigure.CornerLabels(canvas, placer, hull.Components, corners, SimplexFigure.TernaryCentre, _ => null);
        foreach (var (o, x, y, r) in discs.Where(d => d.Odds.VertexProbability >= LabelFromProbability && !IsCorner(byId[d.Odds.EntryId]))
                     .OrderByDescending(d => d.Odds.VertexProbability).ThenBy(d => d.Odds.EntryId, StringComparer.Ordinal))
        {
            string percent = string.Create(CultureInfo.InvariantCulture, $"{o.VertexProbability * 100:0}%");
            (double wf, double h) = LabelMetrics.Of(o.Formula, FigurePalette.LabelFontSize);
            double wp = FormulaText.PlainWidth(percent, FigurePalette.SmallFontSize);
            (LabelBox box, bool leader) = placer.Place(x, y, r + 1.5, wf + PercentGap + wp, h);
            if (leader) canvas.Line(x, y, Math.Clamp(x, box.X, box.Right), Math.Clamp(y, box.Y, box.Bottom), FigurePalette.Frame, 0.6);
            canvas.FormulaLabel(o.Formula, new LabelBox(box.X, box.Y, wf, h), FigurePalette.LabelFontSize, o.EntryId);
            canvas.Text(box.X + wf + PercentGap, box.Y + LabelMetrics.Ascent * FigurePalette.LabelFontSize, percent, FigurePalette.SmallFontSize);
        }

        canvas.EndGroup();
        Legend(canvas, odds);
        canvas.Text(20, SimplexFigure.Height - 12, PhaseDiagram.Provenance(metadata), FigurePalette.SmallFontSize, extra: "fill-opacity=\"0.8\"");
        return canvas.Finish($"{system}: probability of being stable",
            $"kind=\"stability-odds\" system=\"{Escape(hull.SystemName)}\" components=\"{Escape(string.Join(' ', hull.Components))}\" " +
            metadata.SvgAttributes() + " " +
            string.Create(CultureInfo.InvariantCulture, $"samples=\"{odds.SampleCount}\" seed=\"{odds.Seed}\""));
    }

    /// <summary>Disc radius: its area grows linearly with the probability.</summary>
    internal static double RadiusAt(double p) =>
        Math.Sqrt(MinRadius * MinRadius + Math.Clamp(p, 0, 1) * (MaxRadius * MaxRadius - MinRadius * MinRadius));

    private static bool IsCorner(EntryStability e) => e.Composition.Elements.Count == 1;

    private static void Legend(SvgCanvas canvas, StabilitySamplingResult odds)
    {
        double left = SimplexFigure.LegendLeft, top = SimplexFigure.LegendTop;
        canvas.Text(left, top, "probability of", FigurePalette.SmallFontSize);
        canvas.Text(left, top + 14, "being a hull vertex", FigurePalette.SmallFontSize);
        double y = top + 34;
        foreach (double p in new[] { 1.0, 0.75, 0.5, 0.25, 0.0 })
        {
            double r = RadiusAt(p);
            canvas.Raw(string.Create(CultureInfo.InvariantCulture,
                $"<circle data-kind=\"legend\" cx=\"{Px(left + MaxRadius)}\" cy=\"{Px(y)}\" r=\"{Px(r)}\" fill=\"{StabilityOddsScale.ColorAt(p)}\" stroke=\"{FigurePalette.UnstableOutline}\" stroke-width=\"0.7\"/>\n"));
            canvas.Text(left + 2 * MaxRadius + 8, y + 4, string.Create(CultureInfo.InvariantCulture, $"{p * 100:0}%"), FigurePalette.SmallFontSize);
            y += 2 * MaxRadius + 8;
        }

        canvas.Line(left, y + 4, left + 26, y + 4, FigurePalette.HullEdge, 1, "stroke-opacity=\"0.55\" stroke-dasharray=\"5 3\"");
        canvas.Text(left + 32, y + 8, "plain-hull tie-line", FigurePalette.SmallFontSize);
        y += 30;
        canvas.Text(left, y, "probable stable set", FigurePalette.SmallFontSize, extra: "font-weight=\"bold\"");
        canvas.Text(left, y + 14, "(≥ 50 % of samples):", FigurePalette.SmallFontSize);
        y += 30;
        // The compounds only: the elements are always there.
        var compounds = odds.ProbableStableSet.Select(id => odds.Entries.First(o => o.EntryId == id))
            .Where(o => Composition.Parse(o.Formula).Elements.Count > 1);
        foreach (EntryStabilityOdds o in compounds.Take(16))
        {
            (double w, double h) = LabelMetrics.Of(o.Formula, FigurePalette.SmallFontSize);
            canvas.FormulaLabel(o.Formula, new LabelBox(left, y - LabelMetrics.Ascent * FigurePalette.SmallFontSize, w, h), FigurePalette.SmallFontSize, null);
            y += 15;
        }
    }
}
