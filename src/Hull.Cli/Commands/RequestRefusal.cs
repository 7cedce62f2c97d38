using Grpc.Core;
using Hull.Cli.Client;
using Hull.Cli.Input;

namespace Hull.Cli.Commands;

/// <summary>
/// A refused request whose rows came from a file: the server's "candidates[i].field" becomes the file's line and id,
/// as import refusals do, so the user finds the row without counting from 0.
/// </summary>
public static class RequestRefusal
{
    /// <summary>A refusal already described with file lines; the exit code follows the server's status.</summary>
    public sealed class RefusedException(string message, RpcException cause) : Exception(message, cause)
    {
        public RpcException Cause { get; } = cause;
    }

    /// <summary>True when a field violation names a row of <paramref name="list"/> ("candidates[3].energy_ev").</summary>
    public static bool NamesRows(RpcException error, string list) =>
        RpcFailure.ViolationsOf(error).Any(v => v.Field.StartsWith(list + "[", StringComparison.Ordinal));

    /// <summary>The server's message, then one line per violation with the file line and id where it names a row.</summary>
    public static string Describe(RpcException error, string list, string path, IReadOnlyList<EntryRecord> records)
    {
        var lines = new List<string> { $"{path}: the server refused the request ({error.StatusCode}): {error.Status.Detail}" };
        foreach (var violation in RpcFailure.ViolationsOf(error))
        {
            lines.Add("  " + Locate(violation.Field, list, path, records) + violation.Description);
        }

        return string.Join(Environment.NewLine, lines);
    }

    private static string Locate(string field, string list, string path, IReadOnlyList<EntryRecord> records)
    {
        string prefix = list + "[";
        int close = field.IndexOf(']');
        if (field.StartsWith(prefix, StringComparison.Ordinal) && close > prefix.Length
            && int.TryParse(field.AsSpan(prefix.Length, close - prefix.Length), out int index) && index < records.Count)
        {
            EntryRecord record = records[index];
            string column = close + 2 <= field.Length ? field[(close + 2)..] : string.Empty;
            return $"{Path.GetFileName(path)} {EntryFileReader.Locate(record)} (id '{record.Id}'){(column.Length > 0 ? ", " + column : string.Empty)}: ";
        }

        return field + ": ";
    }
}
