using Google.Protobuf;

namespace Hull.Cli.Output;

/// <summary>--json output: the server's messages in protobuf's JSON mapping, with the .proto field names.</summary>
public static class ProtoJson
{
    private static readonly JsonFormatter Formatter = new(
        JsonFormatter.Settings.Default.WithFormatDefaultValues(true).WithPreserveProtoFieldNames(true).WithIndentation());

    /// <summary>The message as indented JSON. The protobuf formatter escapes HTML-sensitive characters ("->" becomes
    /// "-\u003e"), which is right inside a web page and unreadable in a terminal or a file; the text is rewritten with
    /// only JSON's own escapes. Numbers keep the formatter's exact text.</summary>
    public static string Format(IMessage message) => Unescaped(Formatter.Format(message));

    /// <summary>Options for JSON that people and programs read, not HTML: only the escapes JSON itself requires.</summary>
    public static readonly System.Text.Json.JsonWriterOptions PlainWriting = new()
    {
        Indented = true,
        Encoder = System.Text.Encodings.Web.JavaScriptEncoder.UnsafeRelaxedJsonEscaping,
    };

    private static string Unescaped(string json)
    {
        using var document = System.Text.Json.JsonDocument.Parse(json);
        using var buffer = new MemoryStream();
        using (var writer = new System.Text.Json.Utf8JsonWriter(buffer, PlainWriting))
        {
            document.WriteTo(writer);
        }

        return System.Text.Encoding.UTF8.GetString(buffer.ToArray());
    }

    /// <summary>Several messages as one JSON array.</summary>
    public static void WriteArray(TextWriter writer, IEnumerable<IMessage> messages)
    {
        writer.WriteLine("[");
        bool first = true;
        foreach (IMessage message in messages)
        {
            if (!first) writer.WriteLine(",");
            writer.Write(Format(message));
            first = false;
        }

        writer.WriteLine();
        writer.WriteLine("]");
    }
}
