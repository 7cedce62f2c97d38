using System.Globalization;

namespace Hull.Bench;

/// <summary>Command-line options shared by the suites; each suite picks its own defaults where one is not given.</summary>
public sealed class BenchOptions
{
    public int? InProcessReps { get; private set; }
    public int? ProcessReps { get; private set; }
    public int? QconvexCapSeconds { get; private set; }
    public int? LpSample { get; private set; }
    public int Seed { get; private set; } = 20240611;
    /// <summary>Divides entry counts by 10 and uses one repetition: a smoke run of the harness, not a result.</summary>
    public bool Quick { get; private set; }

    public string CommandLine { get; private set; } = "";

    public static BenchOptions Parse(string suite, string[] args)
    {
        var o = new BenchOptions { CommandLine = $"dotnet run -c Release --project bench/Hull.Bench -- {suite} {string.Join(' ', args)}".TrimEnd() };
        for (int i = 0; i < args.Length; i++)
        {
            string Next() => i + 1 < args.Length ? args[++i] : throw new ArgumentException($"option {args[i]} needs a value");
            int NextInt()
            {
                string name = args[i];
                string v = Next();
                return int.TryParse(v, NumberStyles.Integer, CultureInfo.InvariantCulture, out int n)
                    ? n : throw new ArgumentException($"option {name}: '{v}' is not an integer");
            }
            switch (args[i])
            {
                case "--reps": o.InProcessReps = NextInt(); break;
                case "--proc-reps": o.ProcessReps = NextInt(); break;
                case "--qconvex-cap": o.QconvexCapSeconds = NextInt(); break;
                case "--lp-sample": o.LpSample = NextInt(); break;
                case "--seed": o.Seed = NextInt(); break;
                case "--quick": o.Quick = true; break;
                default: throw new ArgumentException($"unknown option '{args[i]}' (options: --reps N, --proc-reps N, --qconvex-cap SECONDS, --lp-sample N (-1 = all), --seed N, --quick)");
            }
        }
        return o;
    }

    public int Scale(int entries) => Quick ? Math.Max(100, entries / 10) : entries;
}
