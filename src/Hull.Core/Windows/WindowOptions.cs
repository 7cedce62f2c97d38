namespace Hull.Core.Windows;

/// <summary>How to treat a compound that is not a hull vertex, and which potential the projected size leaves out.</summary>
public sealed class WindowOptions
{
    /// <summary>
    /// δ used when a tolerance is given without one (eV/atom): 1 meV/atom is below the usual noise of computed
    /// formation energies, so the lowered compound changes no other conclusion, yet far above the hull tolerance.
    /// </summary>
    public const double DefaultLoweringEvPerAtom = 1e-3;

    /// <exception cref="WindowInputException">A negative or non-finite tolerance or lowering.</exception>
    public WindowOptions(double? aboveHullToleranceEvPerAtom = null, double? loweringEvPerAtom = null, string? projectionOmits = null)
    {
        if (aboveHullToleranceEvPerAtom is { } t && (!double.IsFinite(t) || t < 0))
        {
            throw new WindowInputException($"The above-hull tolerance is {t} eV/atom; it must be a finite number ≥ 0.", WindowInputSubject.Option);
        }

        if (loweringEvPerAtom is { } l && (!double.IsFinite(l) || l <= 0))
        {
            throw new WindowInputException($"The lowering δ is {l} eV/atom; it must be a finite number > 0.", WindowInputSubject.Option);
        }

        AboveHullToleranceEvPerAtom = aboveHullToleranceEvPerAtom;
        LoweringEvPerAtom = loweringEvPerAtom ?? DefaultLoweringEvPerAtom;
        ProjectionOmits = string.IsNullOrEmpty(projectionOmits) ? null : projectionOmits;
    }

    public static WindowOptions Default { get; } = new();

    /// <summary>
    /// When set, a compound that is no hull vertex and lies at most this far above the hull (eV/atom) is treated as
    /// lowered to <see cref="LoweringEvPerAtom"/> below the hull, so that it has a full window.
    /// </summary>
    public double? AboveHullToleranceEvPerAtom { get; }

    /// <summary>δ, eV/atom below the hull, for a compound treated as lowered.</summary>
    public double LoweringEvPerAtom { get; }

    /// <summary>The element whose potential the projected size leaves out; null: the one with most atoms in the compound.</summary>
    public string? ProjectionOmits { get; }
}
