using Hull.Core.Figures;
using Hull.Core.Tests.Thermo;
using Hull.Core.Thermo;

namespace Hull.Core.Tests.Figures;

/// <summary>A figure labels its energy axis with the hull's own axis (name and unit), not a fixed formation energy.</summary>
public sealed class FigureEnergyAxisTests
{
    [Fact]
    public void Grand_potential_hull_figure_is_labelled_with_its_axis_and_unit()
    {
        PhaseEntry[] entries = DecompositionEnergyReferenceTests.RandomQuaternary(seed: 13, compounds: 40);
        HullAxis axis = HullAxis.GrandPotential([KeyValuePair.Create("O", -1.1)]);
        SystemHull hull = SystemHull.OnAxis(axis, GrandPotentialEntries.Of(entries, axis));
        string svg = PhaseDiagram.Draw(FigureInput.FromHull(hull, FigureTestData.Metadata)).Svg;
        _ = new SvgFigure(svg);
        Assert.Contains("Grand potential (O open at -1.1 eV)", svg, StringComparison.Ordinal);
        Assert.DoesNotContain("Formation energy", svg, StringComparison.Ordinal);
        Assert.Contains("eV per closed-element atom", svg, StringComparison.Ordinal);
    }

    [Fact]
    public void Free_energy_binary_figure_axis_title_names_the_temperature()
    {
        (SystemHull closed, _) = FigureTestData.Random(["Fe", "O"], 10, 2);
        HullAxis axis = HullAxis.FreeEnergy(900);
        SystemHull hull = SystemHull.OnAxis(axis, closed.Entries.Select(e => new HullAxisEntry(e.Entry, e.AxisEnergyEvPerAtom)).ToArray());
        string svg = PhaseDiagram.Draw(FigureInput.FromHull(hull, FigureTestData.Metadata)).Svg;
        Assert.Contains(">Formation free energy at 900 K (eV/atom)<", svg, StringComparison.Ordinal);
    }
}
