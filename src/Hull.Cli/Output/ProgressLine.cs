namespace Hull.Cli.Output;

/// <summary>
/// A progress bar on stderr: redrawn in place (carriage return) on a terminal; elsewhere (a log file, a pipe) one
/// plain line per tenth of the work, so that logs hold no control characters and stay short.
/// </summary>
public sealed class ProgressLine(TextWriter writer, bool isTerminal, string label)
{
    private const int Width = 30;
    private int _lastTenth = -1;
    private bool _drawn;

    public void Report(long done, long total)
    {
        int tenth = total == 0 ? 10 : (int)(10 * done / total);
        if (!isTerminal && tenth == _lastTenth) return;
        _lastTenth = tenth;
        int filled = total == 0 ? Width : (int)(done * Width / total);
        string text = $"{label} [{new string('#', filled)}{new string('.', Width - filled)}] {done}/{total} entries ({(total == 0 ? 100 : 100 * done / total)}%)";
        if (isTerminal)
        {
            writer.Write("\r" + text);
            _drawn = true;
        }
        else
        {
            writer.WriteLine(text);
        }
        writer.Flush();
    }

    /// <summary>Ends the redrawn line on a terminal, so that what follows starts on a line of its own.</summary>
    public void Finish()
    {
        if (!_drawn) return;
        writer.WriteLine();
        writer.Flush();
        _drawn = false;
    }
}
