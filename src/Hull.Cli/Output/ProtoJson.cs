using System.Buffers;
using System.Collections;
using System.Collections.Concurrent;
using System.Globalization;
using System.Text;
using System.Text.Json;
using Google.Protobuf;
using Google.Protobuf.Reflection;

namespace Hull.Cli.Output;

/// <summary>
/// --json output: the server's messages in protobuf's JSON mapping, with the .proto field names, every field written
/// (defaults too; unset optional and message fields left out), fields in number order, 64-bit integers as strings,
/// enums by their .proto names, NaN and infinities as strings, doubles in their shortest round-trip text. Written
/// straight to a <see cref="Utf8JsonWriter"/> from the message descriptors: a whole-dataset analysis is about 10 MB
/// of JSON, and formatting it to text, parsing that and writing it again cost more than the call itself. Only JSON's
/// own escapes are used (no HTML escapes such as "-\u003e" for "->", which are unreadable in a terminal or a file).
/// </summary>
public static class ProtoJson
{
    /// <summary>Options for JSON that people and programs read, not HTML: only the escapes JSON itself requires.</summary>
    public static readonly JsonWriterOptions PlainWriting = new()
    {
        Indented = true,
        Encoder = System.Text.Encodings.Web.JavaScriptEncoder.UnsafeRelaxedJsonEscaping,
        // The writer's checks cost a stack of nesting states per value; what is written here is well formed by construction.
        SkipValidation = true,
    };

    /// <summary>Well-known types (timestamps) have JSON forms of their own; protobuf's formatter writes those few.</summary>
    private static readonly JsonFormatter WellKnownFormatter = new(JsonFormatter.Settings.Default);

    /// <summary>The package of protobuf's well-known types.</summary>
    private const string WellKnownPackage = "google.protobuf";

    private static readonly ConcurrentDictionary<MessageDescriptor, FieldPlan[]> Plans = new();

    /// <summary>The message as indented JSON.</summary>
    public static string Format(IMessage message)
    {
        using MemoryStream buffer = Written(message);
        return Encoding.UTF8.GetString(buffer.GetBuffer(), 0, (int)buffer.Length);
    }

    /// <summary>The message as indented JSON and a line end, to <paramref name="output"/> in pieces (no whole-output string).</summary>
    public static void WriteLine(TextWriter output, IMessage message)
    {
        using MemoryStream buffer = Written(message);
        WriteUtf8(output, buffer.GetBuffer().AsSpan(0, (int)buffer.Length));
        output.WriteLine();
    }

    /// <summary>The message as indented JSON and a line end, to <paramref name="output"/> as UTF-8 bytes, flushed.</summary>
    public static void WriteLine(Stream output, IMessage message)
    {
        using MemoryStream buffer = Written(message);
        output.Write(buffer.GetBuffer(), 0, (int)buffer.Length);
        output.Write(Encoding.UTF8.GetBytes(Environment.NewLine));
        output.Flush();
    }

    private static MemoryStream Written(IMessage message)
    {
        var buffer = new MemoryStream(64 * 1024);
        using (var writer = new Utf8JsonWriter(buffer, PlainWriting))
        {
            WriteMessage(writer, message);
        }

        LowerCaseExponents(buffer.GetBuffer().AsSpan(0, (int)buffer.Length));
        return buffer;
    }

    /// <summary>
    /// The writer gives a number's exponent as "E+307"; protobuf's JSON mapping writes "e+307". Outside strings the
    /// only capital letter JSON text can hold is a number's exponent mark, so one pass over the text that skips
    /// strings (and the escapes inside them) changes exactly those.
    /// </summary>
    private static void LowerCaseExponents(Span<byte> json)
    {
        bool inString = false, escaped = false;
        for (int i = 0; i < json.Length; i++)
        {
            byte b = json[i];
            if (inString)
            {
                if (escaped) escaped = false;
                else if (b == (byte)'\\') escaped = true;
                else if (b == (byte)'"') inString = false;
            }
            else if (b == (byte)'"')
            {
                inString = true;
            }
            else if (b == (byte)'E')
            {
                json[i] = (byte)'e';
            }
        }
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

    /// <summary>Writes <paramref name="message"/> as one JSON value.</summary>
    public static void WriteMessage(Utf8JsonWriter writer, IMessage message)
    {
        MessageDescriptor descriptor = message.Descriptor;
        if (descriptor.File.Package == WellKnownPackage)
        {
            using JsonDocument document = JsonDocument.Parse(WellKnownFormatter.Format(message));
            document.WriteTo(writer);
            return;
        }

        writer.WriteStartObject();
        foreach (FieldPlan field in Plans.GetOrAdd(descriptor, PlanOf))
        {
            if (field.HasPresence && !field.Accessor.HasValue(message)) continue;
            writer.WritePropertyName(field.Name);
            object value = field.Accessor.GetValue(message);
            switch (field.Shape)
            {
                case FieldShape.Map:
                    WriteMap(writer, (IDictionary)value);
                    break;
                case FieldShape.Repeated:
                    writer.WriteStartArray();
                    foreach (object? item in (IList)value) WriteValue(writer, field.Descriptor, item);
                    writer.WriteEndArray();
                    break;
                default:
                    WriteValue(writer, field.Descriptor, value);
                    break;
            }
        }

        writer.WriteEndObject();
    }

    /// <summary>What writing a message type's fields needs, worked out once per type: the descriptor's properties
    /// (presence, map, repeated) are computed on every read, and a 10,000-entry answer reads them 400,000 times.</summary>
    private static FieldPlan[] PlanOf(MessageDescriptor descriptor) =>
        descriptor.Fields.InFieldNumberOrder()
            .Select(f => new FieldPlan(
                f, f.Accessor, JsonEncodedText.Encode(f.Name, PlainWriting.Encoder), f.HasPresence,
                f.IsMap ? FieldShape.Map : f.IsRepeated ? FieldShape.Repeated : FieldShape.Single))
            .ToArray();

    private enum FieldShape
    {
        Single,
        Repeated,
        Map,
    }

    private sealed record FieldPlan(FieldDescriptor Descriptor, IFieldAccessor Accessor, JsonEncodedText Name, bool HasPresence, FieldShape Shape);

    private static void WriteMap(Utf8JsonWriter writer, IDictionary map)
    {
        writer.WriteStartObject();
        foreach (DictionaryEntry pair in map)
        {
            writer.WritePropertyName(pair.Key switch
            {
                string s => s,
                bool b => b ? "true" : "false",
                IFormattable number => number.ToString("d", CultureInfo.InvariantCulture),
                _ => throw new ArgumentException($"a map key of type {pair.Key.GetType()} has no JSON form"),
            });
            WriteValue(writer, field: null, pair.Value);
        }

        writer.WriteEndObject();
    }

    /// <summary>One singular value; <paramref name="field"/> names an enum's type (null inside maps, where the value's
    /// own type says it).</summary>
    private static void WriteValue(Utf8JsonWriter writer, FieldDescriptor? field, object? value)
    {
        switch (value)
        {
            case null:
                writer.WriteNullValue();
                break;
            case double d:
                WriteFloating(writer, d, isDouble: true);
                break;
            case float f:
                WriteFloating(writer, f, isDouble: false);
                break;
            case string s:
                writer.WriteStringValue(s);
                break;
            case bool b:
                writer.WriteBooleanValue(b);
                break;
            case int i:
                writer.WriteNumberValue(i);
                break;
            case uint u:
                writer.WriteNumberValue(u);
                break;
            case long l:
                writer.WriteStringValue(l.ToString(CultureInfo.InvariantCulture));
                break;
            case ulong ul:
                writer.WriteStringValue(ul.ToString(CultureInfo.InvariantCulture));
                break;
            case ByteString bytes:
                writer.WriteStringValue(bytes.ToBase64());
                break;
            case Enum e:
                WriteEnum(writer, field, e);
                break;
            case IMessage message:
                WriteMessage(writer, message);
                break;
            default:
                throw new ArgumentException($"a value of type {value.GetType()} has no JSON form");
        }
    }

    private static void WriteEnum(Utf8JsonWriter writer, FieldDescriptor? field, Enum value)
    {
        int number = Convert.ToInt32(value, CultureInfo.InvariantCulture);
        EnumDescriptor? type = field?.FieldType == FieldType.Enum ? field.EnumType : null;
        string? name = type is not null ? type.FindValueByNumber(number)?.Name : Enum.GetName(value.GetType(), value);
        if (name is null) writer.WriteNumberValue(number);
        else writer.WriteStringValue(name);
    }

    /// <summary>NaN and the infinities as strings (JSON has no such numbers), any other value in its shortest
    /// round-trip text (the writer's; its exponent mark is lower-cased afterwards).</summary>
    private static void WriteFloating(Utf8JsonWriter writer, double value, bool isDouble)
    {
        if (double.IsNaN(value)) writer.WriteStringValue("NaN");
        else if (double.IsInfinity(value)) writer.WriteStringValue(value > 0 ? "Infinity" : "-Infinity");
        else if (isDouble) writer.WriteNumberValue(value);
        else writer.WriteNumberValue((float)value);
    }

    /// <summary>UTF-8 bytes to a text writer in pieces of a few thousand characters.</summary>
    private static void WriteUtf8(TextWriter output, ReadOnlySpan<byte> utf8)
    {
        Decoder decoder = Encoding.UTF8.GetDecoder();
        char[] chars = ArrayPool<char>.Shared.Rent(16 * 1024);
        try
        {
            bool completed = false;
            while (!completed)
            {
                decoder.Convert(utf8, chars, flush: true, out int bytesUsed, out int charsUsed, out completed);
                output.Write(chars, 0, charsUsed);
                utf8 = utf8[bytesUsed..];
            }
        }
        finally
        {
            ArrayPool<char>.Shared.Return(chars);
        }
    }
}
