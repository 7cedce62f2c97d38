using System.Globalization;
using Hull.Core.Thermo.Reactions;
using static Hull.Core.Figures.SvgText;

namespace Hull.Core.Figures;

/// <summary>
/// A two-phase reaction profile as SVG: reaction energy against the atom fraction of the first reactant, through
/// every breakpoint, the most negative point marked and labelled with its products, the reactants at the ends.
/// </summary>
public static class ReactionProfileFigure
{
    private const double Width = 760, Height = 480;

    /// <summary>The figure; <paramref name="metadata"/> says where the data came from, when given.</summary>
    public static string Render(ReactionProfile profile, FigureMetadata? metadata = null)
    {
        ArgumentNullException.ThrowIfNull(profile);
        double low = Math.Min(0, profile.Points.Min(p => p.ReactionEnergyEvPerAtom));
        var chart = new ProfileChart(Width, Height, (0, 1), (low * 1.15, Math.Max(0, -low * 0.08)));
        string a = profile.First.Composition.Formula, b = profile.Second.Composition.Formula;
        chart.DrawFrame(
            [("Reaction of ", false), (a, true), (" with ", false), (b, true)],
            [("atom fraction of ", false), (a, true), (" in the mixture", false)],
            $"reaction energy ({profile.Axis.Unit})");
        chart.Path([(0, 0), (1, 0)], FigurePalette.Frame, 1, "zero", "3 3");
        chart.Path(profile.Points.Select(p => (p.AtomFractionOfFirst.ToDouble(), p.ReactionEnergyEvPerAtom)).ToArray(), FigurePalette.HullEdge, 2.4, "reaction-energy");
        foreach (ReactionPoint p in profile.Points)
        {
            chart.Canvas.Raw($"<circle data-kind=\"breakpoint\" cx=\"{Px(chart.PageX(p.AtomFractionOfFirst.ToDouble()))}\" cy=\"{Px(chart.PageY(p.ReactionEnergyEvPerAtom))}\" r=\"3.2\" fill=\"{FigurePalette.StablePhase}\"/>\n");
        }

        ReactionPoint best = profile.MostNegative;
        double bx = chart.PageX(best.AtomFractionOfFirst.ToDouble()), by = chart.PageY(best.ReactionEnergyEvPerAtom);
        chart.Canvas.Raw($"<circle data-kind=\"most-negative\" cx=\"{Px(bx)}\" cy=\"{Px(by)}\" r=\"6\" fill=\"none\" stroke=\"{FigurePalette.StablePhase}\" stroke-width=\"2\"/>\n");
        string anchor = best.AtomFractionOfFirst.ToDouble() < 0.3 ? "start" : best.AtomFractionOfFirst.ToDouble() > 0.7 ? "end" : "middle";
        ProfileLabels.Phases(chart.Canvas, bx, by + 22, best.Products.Select(p => p.Phase), FigurePalette.SmallFontSize, anchor, "→ ");
        chart.Canvas.Text(bx, by + 38,
            string.Create(CultureInfo.InvariantCulture, $"{best.ReactionEnergyEvPerAtom:0.000} eV at x = {best.AtomFractionOfFirst.ToDouble():0.###}"),
            FigurePalette.SmallFontSize, anchor);
        chart.Sentence(chart.BoxLeft + 4, chart.BoxTop + 16, FigurePalette.SmallFontSize, "start", [(b, true), (Above(profile.Second.EnergyAboveHullEvPerAtom), false)]);
        chart.Sentence(chart.BoxRight - 4, chart.BoxTop + 16, FigurePalette.SmallFontSize, "end", [(a, true), (Above(profile.First.EnergyAboveHullEvPerAtom), false)]);
        chart.Footer(
            $"{profile.Axis.DisplayName}; system {profile.ChemicalSystem}; ends at the reactants' own energies"
            + (metadata is null ? string.Empty : $" · {metadata.Dataset} v{metadata.Version}"), 0);
        chart.Footer("0 K energies stand in for Gibbs energies; kinetics may keep a reactive interface from reacting.", 1);
        string attributes = $"kind=\"reaction-profile\" system=\"{Escape(profile.ChemicalSystem)}\" first=\"{Escape(profile.First.Id)}\" second=\"{Escape(profile.Second.Id)}\""
            + $" energy-axis=\"{Escape(profile.Axis.DisplayName)}\" energy-unit=\"{Escape(profile.Axis.Unit)}\""
            + (metadata is null ? string.Empty : " " + metadata.SvgAttributes());
        return chart.Canvas.Finish($"Reaction of {a} with {b}", attributes);
    }

    private static string Above(double evPerAtom) =>
        evPerAtom > 0 ? string.Create(CultureInfo.InvariantCulture, $" ({evPerAtom:0.000} above hull)") : string.Empty;
}
