namespace Hull.Cli.Input;

/// <summary>An input file that cannot be used; the message names the file, and the line and column when known.</summary>
public sealed class InputFileException : Exception
{
    public InputFileException(string path, int? line, string problem, Exception? inner = null)
        : base(line is null ? $"{path}: {problem}" : $"{path} line {line}: {problem}", inner)
    {
        Path = path;
        Line = line;
        Problem = problem;
    }

    public string Path { get; }

    /// <summary>1-based line, when the problem is on one line.</summary>
    public int? Line { get; }

    public string Problem { get; }
}
