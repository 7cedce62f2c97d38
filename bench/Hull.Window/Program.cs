using Hull.Window;

// Hull.Window LIMITS: reads a window limits file (see WindowFileSolver), enumerates the compound's window and
// prints its vertex count, then one vertex per line (every element's Δμ, eV).
if (args.Length != 1)
{
    Console.Error.WriteLine("usage: Hull.Window LIMITS");
    return 2;
}
try
{
    // Straight to the standard output stream: the text is ASCII, so no text writer or encoder is needed.
    using Stream output = Console.OpenStandardOutput();
    WindowFileSolver.WriteAscii(WindowFileSolver.SolveFile(args[0]), output);
    return 0;
}
catch (Exception e) when (e is FormatException or IOException or UnauthorizedAccessException or ArgumentException)
{
    // The message names the file and line (or what the polytope refused).
    Console.Error.WriteLine($"Hull.Window: {args[0]}: {e.Message}");
    return 1;
}
