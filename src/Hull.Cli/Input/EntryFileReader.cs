using System.Text;

namespace Hull.Cli.Input;

/// <summary>Reads an entry file, CSV or JSON by its extension (.csv, .json).</summary>
public static class EntryFileReader
{
    public static IReadOnlyList<EntryRecord> Read(string path)
    {
        string extension = Path.GetExtension(path).ToLowerInvariant();
        if (extension is not ".csv" and not ".json")
        {
            throw new InputFileException(path, null, "unknown file type; entry files end in .csv or .json");
        }

        try
        {
            using FileStream stream = File.OpenRead(path);
            if (extension == ".json") return JsonEntryReader.Read(path, stream);
            using var reader = new StreamReader(stream, new UTF8Encoding(false, throwOnInvalidBytes: true), detectEncodingFromByteOrderMarks: true);
            return CsvEntryReader.Read(path, reader);
        }
        catch (Exception e) when (e is FileNotFoundException or DirectoryNotFoundException)
        {
            throw new InputFileException(path, null, "no such file", e);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or DecoderFallbackException)
        {
            throw new InputFileException(path, null, e is DecoderFallbackException ? "not UTF-8 text" : $"cannot be read: {e.Message}", e);
        }
    }

    /// <summary>Where a record came from, for messages: "line 12" (CSV) or "entries[11]" (JSON).</summary>
    public static string Locate(EntryRecord record) => record.Line > 0 ? $"line {record.Line}" : $"entries[{-record.Line - 1}]";
}
