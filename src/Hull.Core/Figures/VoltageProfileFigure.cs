using System.Globalization;
using Hull.Core.Thermo.Electrochemistry;
using static Hull.Core.Figures.SvgText;

namespace Hull.Core.Figures;

/// <summary>
/// The voltage profile of an insertion as SVG: a step curve of voltage against ions per host formula unit, each
/// plateau numbered on the curve and listed under the plot with its voltage and the phases that coexist on it
/// (a list, not labels on the curve: short plateaus would crowd them), the Δx-weighted mean as a dashed line, and
/// the capacity per host mass along the top edge.
/// </summary>
public static class VoltageProfileFigure
{
    private const double Width = 760, BaseHeight = 500;

    /// <summary>The figure; <paramref name="metadata"/> says where the data came from (footer and metadata), when given.</summary>
    public static string Render(VoltageProfile profile, FigureMetadata? metadata = null)
    {
        ArgumentNullException.ThrowIfNull(profile);
        double x0 = profile.Plateaus[0].IonsPerHostFrom, x1 = profile.Plateaus[^1].IonsPerHostTo;
        double vMax = profile.Plateaus.Max(p => p.VoltsAgainstMetal);
        var chart = new ProfileChart(
            Width, BaseHeight + (profile.Plateaus.Count * ProfileChart.LegendLineHeight), (x0, x1),
            (Math.Min(0, profile.Plateaus.Min(p => p.VoltsAgainstMetal)), vMax * 1.12), profile.Plateaus.Count);
        string host = profile.Host.Formula;
        string ionName = $"{profile.Ion}/{profile.Ion}{(profile.ChargeNumber == 1 ? "⁺" : profile.ChargeNumber + "⁺")}";
        chart.DrawFrame(
            [("Voltage profile: ", false), (profile.Ion, true), (" into ", false), (host, true)],
            [("x, ", false), (profile.Ion, true), (" per formula unit of ", false), (host, true)],
            $"Voltage against {ionName} (V)");

        // Capacity per host mass along the top edge, at the x ticks.
        double perIon = InsertionVoltages.Capacity(profile.ChargeNumber, 1.0, profile.Host);
        for (double v = chart.X.Min; v <= chart.X.Max + (chart.X.Step * 1e-6); v += chart.X.Step)
        {
            double q = (v - x0) * perIon;
            if (q < -1e-9) continue;
            chart.Canvas.Text(chart.PageX(v), chart.BoxTop - 6, q.ToString("0", CultureInfo.InvariantCulture), FigurePalette.SmallFontSize, "middle");
        }

        chart.Sentence(chart.BoxRight, chart.BoxTop - 22, FigurePalette.SmallFontSize, "end", [("mAh/g of ", false), (host, true)]);

        var steps = new List<(double X, double Y)>();
        foreach (VoltagePlateau p in profile.Plateaus)
        {
            steps.Add((p.IonsPerHostFrom, p.VoltsAgainstMetal));
            steps.Add((p.IonsPerHostTo, p.VoltsAgainstMetal));
        }

        double mean = profile.AverageVoltsAgainstMetal;
        chart.Path([(x0, mean), (x1, mean)], FigurePalette.Frame, 1.2, "mean-voltage", "6 4");
        chart.Canvas.Text(chart.BoxRight - 6, chart.PageY(mean) - 6,
            string.Create(CultureInfo.InvariantCulture, $"mean {mean:0.000} V"), FigurePalette.SmallFontSize, "end");
        chart.Path(steps, FigurePalette.StablePhase, 2.6, "voltage-steps");

        for (int k = 0; k < profile.Plateaus.Count; k++)
        {
            VoltagePlateau p = profile.Plateaus[k];
            double px = chart.PageX((p.IonsPerHostFrom + p.IonsPerHostTo) / 2);
            double py = chart.PageY(p.VoltsAgainstMetal);
            chart.Canvas.Raw($"<circle data-kind=\"plateau\" data-volts=\"{Num(p.VoltsAgainstMetal, "0.######")}\" cx=\"{Px(px)}\" cy=\"{Px(py)}\" r=\"3\" fill=\"{FigurePalette.HullEdge}\"/>\n");
            string number = (k + 1).ToString(CultureInfo.InvariantCulture);
            chart.Canvas.Text(px, py - 7, number, FigurePalette.SmallFontSize, "middle", "font-weight=\"bold\"");
            string kind = p.IsConversion ? "conversion" : "two-phase";
            ProfileLabels.Phases(chart.Canvas, chart.BoxLeft, chart.LegendY(k), p.Phases.Select(q => q.Phase), FigurePalette.SmallFontSize, "start",
                string.Create(CultureInfo.InvariantCulture, $"{number}   {p.VoltsAgainstMetal:0.000} V   x {p.IonsPerHostFrom:0.###}–{p.IonsPerHostTo:0.###}   {kind}:   "));
        }

        chart.Footer(
            string.Create(CultureInfo.InvariantCulture,
                $"Q = {profile.CapacityPerHostMassMilliampHoursPerGram:0.0} mAh/g of {host}, {profile.CapacityPerInsertedMassMilliampHoursPerGram:0.0} mAh/g of {profile.FullyInserted.Formula}; {profile.EnergyDensityPerHostMassWattHoursPerKilogram:0} Wh/kg of {host}")
                + (metadata is null ? string.Empty : $" · {metadata.Dataset} v{metadata.Version}"),
            0);
        chart.Footer(profile.Caveat, 1);
        string attributes = $"kind=\"voltage-profile\" system=\"{Escape(profile.ChemicalSystem)}\" host=\"{Escape(host)}\" ion=\"{Escape(profile.Ion)}\""
            + (metadata is null ? string.Empty : " " + metadata.SvgAttributes());
        return chart.Canvas.Finish($"Voltage profile of {profile.Ion} into {host}", attributes);
    }
}
