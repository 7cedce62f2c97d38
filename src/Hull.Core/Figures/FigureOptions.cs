namespace Hull.Core.Figures;

/// <summary>How to draw a phase diagram.</summary>
public sealed record FigureOptions
{
    /// <summary>Default cut-off: entries more than 0.2 eV/atom above the hull are rarely made, and crowd the picture.</summary>
    public const double DefaultMaxAboveHullEvPerAtom = 0.2;

    /// <summary>Default view of a tetrahedron, degrees: turned and tilted so that no edge hides behind another.</summary>
    public const double DefaultAzimuthDegrees = 25.0;

    public const double DefaultElevationDegrees = 20.0;

    /// <summary>Entries further above the hull than this (eV/atom, on the hull axis) are left out; must be positive.</summary>
    public double MaxAboveHullEvPerAtom { get; init; } = DefaultMaxAboveHullEvPerAtom;

    /// <summary>Quaternary view: rotation about the tetrahedron's vertical axis, degrees.</summary>
    public double AzimuthDegrees { get; init; } = DefaultAzimuthDegrees;

    /// <summary>Quaternary view: tilt towards the viewer, degrees (-90 to 90).</summary>
    public double ElevationDegrees { get; init; } = DefaultElevationDegrees;

    /// <summary>Checks the values; a bad one is named.</summary>
    /// <exception cref="FigureInputException">A cut-off that is not positive and finite, or a view out of range.</exception>
    public void Check()
    {
        if (!(MaxAboveHullEvPerAtom > 0) || !double.IsFinite(MaxAboveHullEvPerAtom))
        {
            throw new FigureInputException(
                $"The cut-off above the hull is {MaxAboveHullEvPerAtom}; give a positive number of eV/atom.", nameof(MaxAboveHullEvPerAtom));
        }

        if (!double.IsFinite(AzimuthDegrees) || Math.Abs(AzimuthDegrees) > 360)
        {
            throw new FigureInputException($"The azimuth is {AzimuthDegrees}°; give -360 to 360 degrees.", nameof(AzimuthDegrees));
        }

        if (!double.IsFinite(ElevationDegrees) || Math.Abs(ElevationDegrees) > 90)
        {
            throw new FigureInputException($"The elevation is {ElevationDegrees}°; give -90 to 90 degrees.", nameof(ElevationDegrees));
        }
    }
}
