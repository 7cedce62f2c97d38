using Google.Protobuf;

namespace Hull.Cli.Output;

/// <summary>--json output: the server's messages in protobuf's JSON mapping, with the .proto field names.</summary>
public static class ProtoJson
{
    private static readonly JsonFormatter Formatter = new(
        JsonFormatter.Settings.Default.WithFormatDefaultValues(true).WithPreserveProtoFieldNames(true).WithIndentation());

    public static string Format(IMessage message) => Formatter.Format(message);

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
