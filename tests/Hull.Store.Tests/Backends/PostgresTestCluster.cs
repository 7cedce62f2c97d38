using System.Diagnostics;
using Npgsql;

namespace Hull.Store.Tests.Backends;

/// <summary>
/// The PostgreSQL the tests use: the one scripts/test.sh started (its connection string in
/// <see cref="ConnectionVariable"/>), else a throwaway cluster this test process starts with the same script on
/// first use and stops when it exits. Each test gets a schema of its own, so tests never see each other's data.
/// Never skipped: no PostgreSQL is a failure that says how to get one.
/// </summary>
public static class PostgresTestCluster
{
    /// <summary>Set by scripts/test.sh to the cluster it started.</summary>
    public const string ConnectionVariable = "HULL_TEST_POSTGRES";

    private static readonly Lazy<string> Connection = new(StartOrFind, LazyThreadSafetyMode.ExecutionAndPublication);

    /// <summary>The cluster's connection string (database postgres, no schema).</summary>
    public static string ConnectionString => Connection.Value;

    /// <summary>A connection string for a new, empty schema of its own.</summary>
    public static string NewSchema(string purpose)
    {
        // Identifiers hold up to 63 bytes: keep the purpose short.
        string schema = $"t_{purpose}_{Guid.NewGuid():N}".ToLowerInvariant();
        return new NpgsqlConnectionStringBuilder(ConnectionString) { SearchPath = schema }.ToString();
    }

    private static string StartOrFind()
    {
        string? given = Environment.GetEnvironmentVariable(ConnectionVariable);
        if (!string.IsNullOrWhiteSpace(given)) return given;

        string script = Path.Combine(RepositoryRoot(), "scripts", "postgres-throwaway.sh");
        string directory = Path.Combine("/tmp", $"hull-test-postgres-{Guid.NewGuid():N}");
        string connection = RunScript(script, "start", directory).Trim();
        AppDomain.CurrentDomain.ProcessExit += (_, _) =>
        {
            try
            {
                RunScript(script, "stop", directory);
                Directory.Delete(directory, recursive: true);
            }
            catch (Exception e) when (e is IOException or InvalidOperationException or UnauthorizedAccessException)
            {
                Console.Error.WriteLine($"could not stop the test PostgreSQL in {directory}: {e.Message}");
            }
        };
        return connection;
    }

    private static string RunScript(string script, string action, string directory)
    {
        var start = new ProcessStartInfo("bash") { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        foreach (string argument in new[] { script, action, directory }) start.ArgumentList.Add(argument);
        using Process process = Process.Start(start)!;
        Task<string> errors = process.StandardError.ReadToEndAsync();
        string output = process.StandardOutput.ReadToEnd();
        process.WaitForExit();
        if (process.ExitCode != 0)
        {
            throw new InvalidOperationException(
                $"{script} {action} failed ({process.ExitCode}): {errors.Result.Trim()} -- install Debian's postgresql package " +
                $"(scripts/test.sh does), or set {ConnectionVariable} to a PostgreSQL connection string");
        }
        return output;
    }

    private static string RepositoryRoot()
    {
        for (var directory = new DirectoryInfo(AppContext.BaseDirectory); directory is not null; directory = directory.Parent)
        {
            if (File.Exists(Path.Combine(directory.FullName, "Hull.sln"))) return directory.FullName;
        }
        throw new InvalidOperationException($"no Hull.sln above {AppContext.BaseDirectory}");
    }
}
