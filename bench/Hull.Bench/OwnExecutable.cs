using System.Globalization;
using Hull.Bench.Data;
using Hull.Core.Geometry;

namespace Hull.Bench;

/// <summary>
/// This benchmark program run as a whole process in "solve-file" mode: read a points file, build the hull, compute
/// every point's energy above hull, print a one-line summary (nothing big), so that parsing and start-up count as
/// they do for qconvex.
/// </summary>
public static class OwnExecutable
{
    public const string SolveFileMode = "solve-file";

    /// <summary>The apphost next to this assembly (built by 'dotnet run -c Release').</summary>
    public static string Path
    {
        get
        {
            string host = System.IO.Path.Combine(AppContext.BaseDirectory, "Hull.Bench");
            if (!File.Exists(host)) throw new InvalidOperationException($"{host} not found; build the bench project first.");
            return host;
        }
    }

    public static IReadOnlyList<string> SolveFileArguments(string pointsFile) => [SolveFileMode, pointsFile];

    public static int SolveFile(string path)
    {
        var pts = PointSet.ReadAmountsFile(path);
        var hull = LowerHull.Build(pts.Amounts, pts.EnergiesEvPerAtom);
        double sum = 0;
        int onHull = 0;
        for (int i = 0; i < pts.Count; i++)
        {
            double e = hull.EnergyAboveHull(i);
            sum += e;
            if (e == 0.0) onHull++;
        }
        Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"vertices={hull.VertexPoints.Count} facets={hull.Facets.Count} on_hull={onHull} sum_eah={sum:R}"));
        return 0;
    }
}
