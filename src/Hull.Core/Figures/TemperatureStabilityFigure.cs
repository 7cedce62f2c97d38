using System.Globalization;
using Hull.Core.Thermo.Temperature;
using static Hull.Core.Figures.SvgText;

namespace Hull.Core.Figures;

/// <summary>
/// Stability against temperature as SVG: each phase's signed decomposition energy (the phase minus the hull without
/// its composition; below zero it is stable by that margin) against T at one gas pressure, the stable side shaded,
/// every crossing marked with its temperature, one colour and dash per phase with a legend.
/// </summary>
public static class TemperatureStabilityFigure
{
    private const double Width = 760, BaseHeight = 500;

    /// <summary>Most curves on one figure: beyond eight, colours and dashes no longer tell them apart.</summary>
    public const int MaximumCurves = 8;

    /// <summary>The figure; <paramref name="metadata"/> says where the data came from, when given.</summary>
    /// <exception cref="FigureInputException">No curve, more than <see cref="MaximumCurves"/>, or curves over different ranges.</exception>
    public static string Render(IReadOnlyList<TemperatureCurve> curves, FigureMetadata? metadata = null)
    {
        ArgumentNullException.ThrowIfNull(curves);
        if (curves.Count == 0 || curves.Count > MaximumCurves)
        {
            throw new FigureInputException($"A temperature figure draws 1 to {MaximumCurves} phases; got {curves.Count}.", "phases");
        }

        DecompositionTemperatureResult first = curves[0].Result;
        if (curves.Any(c => c.Result.FromK != first.FromK || c.Result.ToK != first.ToK))
        {
            throw new FigureInputException("The phases of one temperature figure share one temperature range.", "phases");
        }

        double low = Math.Min(0, curves.Min(c => c.Points.Min(p => p.EnergyEvPerClosedAtom)));
        double high = Math.Max(0, curves.Max(c => c.Points.Max(p => p.EnergyEvPerClosedAtom)));
        double pad = Math.Max(0.02, 0.08 * (high - low));
        var chart = new ProfileChart(Width, BaseHeight + (curves.Count * ProfileChart.LegendLineHeight),
            (first.FromK, first.ToK), (low - pad, high + pad), curves.Count);
        string gas = first.Gas is null ? "no gas open"
            : string.Create(CultureInfo.InvariantCulture, $"{first.Gas.Species.Formula} at {first.Gas.PressureBar:G4} bar");
        chart.DrawFrame(
            [("Stability against temperature, ", false), .. GasParts(first)],
            [("temperature (K)", false)],
            "signed decomposition energy (eV per closed-element atom)");

        // The stable side (below zero), shaded lightly and named.
        double zeroY = chart.PageY(0);
        chart.Canvas.Raw($"<rect data-kind=\"stable-side\" x=\"{Px(chart.BoxLeft)}\" y=\"{Px(zeroY)}\" width=\"{Px(chart.BoxRight - chart.BoxLeft)}\" height=\"{Px(chart.BoxBottom - zeroY)}\" fill=\"{FigurePalette.StablePhase}\" fill-opacity=\"0.07\"/>\n");
        chart.Path([(chart.X.Min, 0), (chart.X.Max, 0)], FigurePalette.Frame, 1.2, "zero", "4 3");
        // Named at the left edge, where the range's low end leaves room when the ticks round it down.
        chart.Canvas.Text(chart.BoxLeft + 6, zeroY + 15, "stable below 0", FigurePalette.SmallFontSize, "start");
        chart.Canvas.Text(chart.BoxLeft + 6, zeroY - 7, "decomposes above 0", FigurePalette.SmallFontSize, "start");

        for (int i = 0; i < curves.Count; i++)
        {
            TemperatureCurve curve = curves[i];
            string colour = DefectLineStyles.Colour(i);
            chart.Path(curve.Points, colour, 2.4, "signed-energy", i == 0 ? null : DefectLineStyles.Dash(i));
            foreach (DecompositionCrossing crossing in curve.Result.Crossings)
            {
                double cx = chart.PageX(crossing.TemperatureK);
                chart.Canvas.Raw($"<circle data-kind=\"crossing\" data-phase=\"{Escape(curve.Result.PhaseId)}\" data-temperature-k=\"{crossing.TemperatureK.ToString("R", CultureInfo.InvariantCulture)}\" cx=\"{Px(cx)}\" cy=\"{Px(zeroY)}\" r=\"5\" fill=\"{FigurePalette.Background}\" stroke=\"{colour}\" stroke-width=\"2.2\"/>\n");
                string label = string.Create(CultureInfo.InvariantCulture, $"{crossing.TemperatureK:0} K");
                double labelY = zeroY + (crossing.Direction == CrossingDirection.DecomposesAbove ? 22 + (12 * i) : -14 - (12 * i));
                chart.Canvas.Raw($"<text data-kind=\"label\" x=\"{Px(cx)}\" y=\"{Px(labelY)}\" font-size=\"{Px(FigurePalette.SmallFontSize)}\" text-anchor=\"middle\" fill=\"{colour}\" font-weight=\"bold\">{Escape(label)}</text>\n");
            }

            double ly = chart.LegendY(i);
            chart.Canvas.Raw($"<line x1=\"{Px(chart.BoxLeft)}\" y1=\"{Px(ly - 4)}\" x2=\"{Px(chart.BoxLeft + 28)}\" y2=\"{Px(ly - 4)}\" stroke=\"{colour}\" stroke-width=\"2.4\"{(i == 0 ? string.Empty : $" stroke-dasharray=\"{DefectLineStyles.Dash(i)}\"")}/>\n");
            chart.Sentence(chart.BoxLeft + 36, ly, FigurePalette.SmallFontSize, "start",
                [(curve.Result.Formula, true), ($" ({curve.Result.PhaseId}): {Summary(curve.Result)}", false)]);
        }

        string treatment = first.Treatment == FreeEnergyTreatment.Ellingham
            ? "Ellingham approximation (H, S at 298.15 K)" : "tabulated gas μ(T, p), solids from their models";
        chart.Footer($"{treatment}; {gas}" + (metadata is null ? string.Empty : $" · {metadata.Dataset} v{metadata.Version}"), 0);
        chart.Footer("Estimates from computed energies. Released oxygen and hot cathodes are a fire hazard: follow local rules and licensed practice.", 1);
        string attributes = $"kind=\"temperature-stability\" gas=\"{Escape(gas)}\" from-k=\"{Px(first.FromK)}\" to-k=\"{Px(first.ToK)}\""
            + (metadata is null ? string.Empty : " " + metadata.SvgAttributes());
        return chart.Canvas.Finish($"Stability against temperature ({gas})", attributes);
    }

    private static (string Text, bool IsFormula)[] GasParts(DecompositionTemperatureResult result) => result.Gas is null
        ? [("no gas open", false)]
        : [(result.Gas.Species.Formula, true), (string.Create(CultureInfo.InvariantCulture, $" at {result.Gas.PressureBar:G4} bar"), false)];

    private static string Summary(DecompositionTemperatureResult result)
    {
        if (result.Crossings.Count == 0)
        {
            return result.StableAtFrom ? "stable over the whole range" : "unstable over the whole range";
        }

        return string.Join("; ", result.Crossings.Select(c => string.Create(CultureInfo.InvariantCulture,
            $"{(c.Direction == CrossingDirection.DecomposesAbove ? "decomposes above" : "forms above")} {c.TemperatureK:0.#} K")));
    }
}
