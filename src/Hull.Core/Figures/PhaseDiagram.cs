using System.Globalization;

namespace Hull.Core.Figures;

/// <summary>
/// Draws the phase diagram of a hull as SVG: a binary as energy against composition, a ternary in its composition
/// triangle, a quaternary as its composition tetrahedron seen from a chosen direction. Pure: the same input gives
/// the same text.
/// </summary>
public static class PhaseDiagram
{
    /// <summary>Most components a figure can show: a tetrahedron is the last simplex that projects readably.</summary>
    public const int MaxComponents = 4;

    /// <exception cref="FigureInputException">Fewer than 2 or more than 4 components, or bad options.</exception>
    public static FigureResult Draw(FigureInput input, FigureOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(input);
        options ??= new FigureOptions();
        options.Check();
        int n = input.Components.Count;
        if (n > MaxComponents)
        {
            throw new FigureInputException(
                $"The hull of {input.SystemName} has {n} components; a figure shows at most {MaxComponents}. " +
                "Choose a sub-system of up to four elements, or up to four end-members.", nameof(input));
        }

        if (n < 2)
        {
            throw new FigureInputException($"The hull of {input.SystemName} has one component; a figure needs 2 to 4.", nameof(input));
        }

        var plan = new FigurePlan(input, options.MaxAboveHullEvPerAtom);
        return n switch
        {
            2 => BinaryFigure.Draw(plan),
            3 => SimplexFigure.DrawTernary(plan),
            _ => SimplexFigure.DrawQuaternary(plan, options.AzimuthDegrees, options.ElevationDegrees),
        };
    }

    /// <summary>
    /// The tooltip of a phase: where it sits against the hull. Unstable entries say only id and distance: there are
    /// thousands of them in a large figure, and the formula would add a tenth to its size.
    /// </summary>
    internal static string TitleOf(FigurePoint p, EnergyAxis axis) => p.IsStable
        ? string.Create(CultureInfo.InvariantCulture, $"{p.Id} ({p.Formula}): stable, on the hull at {p.EnergyEvPerAtom:0.000} {axis.Unit}")
        : string.Create(CultureInfo.InvariantCulture, $"{p.Id}: {p.EnergyAboveHullEvPerAtom:0.000} {axis.Unit} above hull");

    /// <summary>The footer line with the data's provenance.</summary>
    internal static string Provenance(FigureMetadata m)
    {
        string print = m.ContentSha256.Length > 12 ? m.ContentSha256[..12] + "…" : m.ContentSha256;
        return $"dataset {m.Dataset}, version {m.Version}, content sha256 {print}" + (m.Corrections is null ? string.Empty : $", corrected with {m.Corrections}");
    }
}
