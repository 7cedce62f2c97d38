using System.Globalization;
using Hull.Bench.Measure;

namespace Hull.Bench.References;

/// <summary>One whole-process qconvex run and the sizes it reports for the full (upper and lower) hull.</summary>
public sealed record QconvexRun(ExternalRunResult Process, int? Vertices, int? Facets, double? HullCpuSeconds);

/// <summary>
/// Debian's qhull-bin qconvex (/usr/bin/qconvex) on the lifted points: the full convex hull, triangulated (Qt),
/// with its summary (s) and every facet's vertex indices (i) written to a file (TO), reading the points file (TI).
/// Parsing and output are part of its time, as they are of our whole-process run.
/// </summary>
public static class QconvexReference
{
    public const string Program = "/usr/bin/qconvex";

    public static readonly string[] Options = ["Qt", "s", "i"];

    public static string CommandLine(string input, string output) => $"{Program} {string.Join(' ', Options)} TI {input} TO {output}";

    public static QconvexRun Run(string qhullInput, string outputFile, TimeSpan timeout)
    {
        if (!File.Exists(Program))
        {
            throw new InvalidOperationException($"{Program} is missing; install Debian's qhull-bin.");
        }
        var args = new List<string>(Options) { "TI", qhullInput, "TO", outputFile };
        var run = ExternalRun.Run(Program, args, timeout);
        int? vertices = null, facets = null;
        double? cpu = null;
        if (run.Succeeded)
        {
            // The summary (option s) goes to standard error; the facet list (option i) to the TO file.
            foreach (var line in run.StandardError.Split('\n'))
            {
                var t = line.Trim();
                if (t.StartsWith("Number of vertices:", StringComparison.Ordinal)) vertices = ParseInt(t);
                else if (t.StartsWith("Number of facets:", StringComparison.Ordinal)) facets = ParseInt(t);
                else if (t.StartsWith("CPU seconds to compute hull (after input):", StringComparison.Ordinal))
                {
                    cpu = double.Parse(t[(t.LastIndexOf(':') + 1)..].Trim(), CultureInfo.InvariantCulture);
                }
            }
        }
        if (File.Exists(outputFile)) File.Delete(outputFile);
        return new QconvexRun(run, vertices, facets, cpu);
    }

    private static int ParseInt(string line) => int.Parse(line[(line.LastIndexOf(':') + 1)..].Trim(), CultureInfo.InvariantCulture);
}
