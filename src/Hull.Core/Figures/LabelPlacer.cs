namespace Hull.Core.Figures;

/// <summary>
/// Places labels beside their markers without overlapping each other, the fixed boxes (markers, corner labels,
/// legend) or the figure's edge: each label tries eight positions around its marker, then the same at two and three
/// times the distance (joined to its marker by a leader line), and takes the first that is free. A label with no
/// free position is placed at its first position and counted, so that a caller can see the figure is crowded.
/// </summary>
internal sealed class LabelPlacer(LabelBox bounds)
{
    /// <summary>Gap between a marker and its label, px.</summary>
    private const double Gap = 3.0;

    // Right, left, above, below, then the diagonals: the reading order people expect for a point label.
    private static readonly (double Dx, double Dy)[] Directions =
        [(1, 0), (-1, 0), (0, -1), (0, 1), (1, -1), (-1, -1), (1, 1), (-1, 1)];

    private readonly BoxGrid _taken = new();
    private readonly BoxGrid _avoid = new();

    /// <summary>Labels that found no free position.</summary>
    public int Crowded { get; private set; }

    /// <summary>Marks a box as taken (a marker, a fixed label, the legend).</summary>
    public void Block(LabelBox box) => _taken.Add(box);

    /// <summary>Marks a box to keep clear when possible (an unstable entry's marker): used only while a free place exists.</summary>
    public void Avoid(LabelBox box) => _avoid.Add(box);

    /// <summary>The box for a label of the given size beside a marker at (x, y) of radius r, and whether it needs a leader line.</summary>
    public (LabelBox Box, bool Leader) Place(double x, double y, double r, double width, double height)
    {
        // First keeping clear of the soft boxes too, then of the hard ones only.
        foreach (bool soft in new[] { true, false })
        {
            if (TryPlace(x, y, r, width, height, soft, out LabelBox found, out bool leader)) return (found, leader);
        }

        Crowded++;
        LabelBox fallback = Clamp(FirstBox(x, y, r, width, height));
        _taken.Add(fallback);
        return (fallback, false);
    }

    /// <summary>As <see cref="Place"/>, but a label with no free position is not placed (and not counted): false.</summary>
    public bool TryPlace(double x, double y, double r, double width, double height, out LabelBox box, out bool leader) =>
        TryPlace(x, y, r, width, height, true, out box, out leader) || TryPlace(x, y, r, width, height, false, out box, out leader);

    private bool TryPlace(double x, double y, double r, double width, double height, bool soft, out LabelBox found, out bool leader)
    {
        for (int ring = 1; ring <= 3; ring++)
        {
            double d = ring * (r + Gap) + (ring - 1) * 4;
            foreach ((double dx, double dy) in Directions)
            {
                double left = dx > 0 ? x + d : dx < 0 ? x - d - width : x - width / 2;
                double top = dy > 0 ? y + d : dy < 0 ? y - d - height : y - height / 2;
                var box = new LabelBox(left, top, width, height);
                if (box.Inside(bounds) && !_taken.Overlaps(box) && !(soft && _avoid.Overlaps(box)))
                {
                    _taken.Add(box);
                    found = box;
                    leader = ring > 1;
                    return true;
                }
            }
        }

        found = default;
        leader = false;
        return false;
    }

    private static LabelBox FirstBox(double x, double y, double r, double width, double height) =>
        new(x + r + Gap, y - height / 2, width, height);

    private LabelBox Clamp(LabelBox box) => box with
    {
        X = Math.Clamp(box.X, bounds.X, Math.Max(bounds.X, bounds.Right - box.Width)),
        Y = Math.Clamp(box.Y, bounds.Y, Math.Max(bounds.Y, bounds.Bottom - box.Height)),
    };
}
