namespace Hull.Cli.Output;

/// <summary>Rows of cells under named columns; cells are text, whole numbers, real numbers, booleans or empty.</summary>
public sealed class Table(params string[] columns)
{
    private readonly List<object?[]> _rows = [];

    public IReadOnlyList<string> Columns { get; } = columns;

    public IReadOnlyList<object?[]> Rows => _rows;

    public Table Add(params object?[] cells)
    {
        if (cells.Length != Columns.Count) throw new ArgumentException($"{cells.Length} cells for {Columns.Count} columns");
        _rows.Add(cells);
        return this;
    }
}
