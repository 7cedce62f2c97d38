namespace Hull.Core.Figures;

/// <summary>An axis-aligned box in figure pixels (y down): top-left corner and size.</summary>
internal readonly record struct LabelBox(double X, double Y, double Width, double Height)
{
    public double Right => X + Width;

    public double Bottom => Y + Height;

    public bool Overlaps(LabelBox other) =>
        X < other.Right && other.X < Right && Y < other.Bottom && other.Y < Bottom;

    public bool Inside(LabelBox bounds) =>
        X >= bounds.X && Y >= bounds.Y && Right <= bounds.Right && Bottom <= bounds.Bottom;

    /// <summary>The square box around a marker of radius <paramref name="r"/>.</summary>
    public static LabelBox Around(double x, double y, double r) => new(x - r, y - r, 2 * r, 2 * r);
}
