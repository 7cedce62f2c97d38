namespace Hull.Core.Figures;

/// <summary>
/// Boxes filed by the grid cells they cover, so that "does this box overlap any?" looks at a few neighbours
/// instead of every box: a 1e4-entry figure has thousands of markers to keep labels off.
/// </summary>
internal sealed class BoxGrid
{
    /// <summary>Cell side, px: about one label's height, so a box covers a handful of cells.</summary>
    private const double Cell = 24.0;

    private readonly Dictionary<(int, int), List<LabelBox>> _cells = [];

    public void Add(LabelBox box)
    {
        foreach ((int, int) key in CellsOf(box))
        {
            if (!_cells.TryGetValue(key, out List<LabelBox>? list)) _cells[key] = list = [];
            list.Add(box);
        }
    }

    public bool Overlaps(LabelBox box)
    {
        foreach ((int, int) key in CellsOf(box))
        {
            if (_cells.TryGetValue(key, out List<LabelBox>? list) && list.Exists(b => b.Overlaps(box))) return true;
        }

        return false;
    }

    private static IEnumerable<(int, int)> CellsOf(LabelBox box)
    {
        int x0 = (int)Math.Floor(box.X / Cell), x1 = (int)Math.Floor(box.Right / Cell);
        int y0 = (int)Math.Floor(box.Y / Cell), y1 = (int)Math.Floor(box.Bottom / Cell);
        for (int x = x0; x <= x1; x++)
        {
            for (int y = y0; y <= y1; y++) yield return (x, y);
        }
    }
}
