using Hull.Solve;

// Hull.Solve POINTS: reads a points file ("components count" header, then integer amounts and an energy per atom
// per line), builds the lower hull, computes every entry's energy above hull, and prints one summary line.
if (args.Length != 1)
{
    Console.Error.WriteLine("usage: Hull.Solve POINTS");
    return 2;
}
try
{
    Console.WriteLine(PointsFileSolver.SolveFile(args[0]).Summary.Format());
    return 0;
}
catch (ArgumentException e)
{
    // Input the parser accepts but the engine refuses: the engine counts points from 0 after the header line.
    Console.Error.WriteLine($"Hull.Solve: {args[0]}: {e.Message} (point i is on line i + 2 of the file)");
    return 1;
}
catch (Exception e) when (e is FormatException or IOException or UnauthorizedAccessException)
{
    // Bad input or an unreadable file: the message names the file, line and field.
    Console.Error.WriteLine($"Hull.Solve: {e.Message}");
    return 1;
}
