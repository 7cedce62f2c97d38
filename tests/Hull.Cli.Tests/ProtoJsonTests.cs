using System.Collections;
using System.Reflection;
using System.Text.Json;
using Google.Protobuf;
using Google.Protobuf.Reflection;
using Google.Protobuf.WellKnownTypes;
using Hull.Cli.Output;
using Hull.Protos.V1;
using Xunit;

namespace Hull.Cli.Tests;

/// <summary>
/// The CLI's JSON writer against Google.Protobuf's own JSON formatter (the protobuf JSON mapping's reference
/// implementation for .NET, with the .proto field names and default values written), its text re-written with only
/// JSON's escapes: byte for byte the same on every message of the contract, filled with awkward values.
/// </summary>
public sealed class ProtoJsonTests
{
    private static readonly JsonFormatter Reference = new(
        JsonFormatter.Settings.Default.WithFormatDefaultValues(true).WithPreserveProtoFieldNames(true).WithIndentation());

    private static readonly double[] Doubles =
    [
        0.0, -0.0, 1.0, -2.5e-7, 0.1, 1.0 / 3.0, 1e21, 1e-5, 123456789012345680.0, 5e-324, double.MaxValue, -double.MaxValue,
        2.2250738585072014E-308, double.NaN, double.PositiveInfinity, double.NegativeInfinity, -3.9174312, 4.4e15,
    ];

    private static readonly string[] Texts =
    [
        "", "Li2O -> Li + O", "<&>'\"\\/", "tab\tline\nreturn\r\u0001\u001f", "é∆✓ Ω µ", "\U0001F600 emoji", "\u007f\u0085\u00a0\u2028\u2029",
        "LiCoO2", "+/= base64-looking", "a\u0000b",
    ];

    public static IEnumerable<object[]> ContractMessages() =>
        typeof(Entry).Assembly.GetTypes()
            .Where(t => typeof(IMessage).IsAssignableFrom(t) && !t.IsAbstract && t.GetConstructor(System.Type.EmptyTypes) is not null)
            .OrderBy(t => t.FullName, StringComparer.Ordinal)
            .Select(t => new object[] { t.FullName! });

    [Theory]
    [MemberData(nameof(ContractMessages))]
    public void Every_message_of_the_contract_is_written_as_the_reference_formatter_writes_it(string typeName)
    {
        System.Type type = typeof(Entry).Assembly.GetType(typeName)!;
        var random = new Random(typeName.Length * 7919 + typeName[^1]);
        for (int sample = 0; sample < 12; sample++)
        {
            var message = (IMessage)Activator.CreateInstance(type)!;
            // The first sample is the empty message: every default written, every unset message left out.
            if (sample > 0) Fill(message, random, depth: 0);
            Assert.Equal(ReferenceText(message), ProtoJson.Format(message));
        }
    }

    [Fact]
    public void A_whole_analysis_answer_written_in_pieces_equals_the_reference_text()
    {
        AnalyzeDatasetResponse response = RandomAnswer(3_000, seed: 11);
        var output = new StringWriter();
        ProtoJson.WriteLine(output, response);

        Assert.True(output.ToString().Length > 16 * 1024 * 4, "the answer is long enough to be written in several pieces");
        Assert.Equal(ReferenceText(response) + Environment.NewLine, output.ToString());
    }

    [Fact]
    public void The_bytes_written_to_a_redirected_output_are_the_text_written_to_a_terminal()
    {
        AnalyzeDatasetResponse response = RandomAnswer(200, seed: 5);
        var text = new StringWriter();
        ProtoJson.WriteLine(text, response);
        using var bytes = new MemoryStream();
        ProtoJson.WriteLine(bytes, response);

        Assert.Equal(text.ToString(), System.Text.Encoding.UTF8.GetString(bytes.ToArray()));
        Assert.Equal(ReferenceText(response) + Environment.NewLine, text.ToString());
    }

    [Fact]
    public void Special_values_and_empty_fields_are_written_as_the_reference_writes_them()
    {
        var result = new EntryStability
        {
            EntryId = "a\"b\u0001<é>", EnergyAboveHullEvPerAtom = double.NaN, FormationEnergyEvPerAtom = double.NegativeInfinity,
            // Set, empty and at its default: written, as an empty object and as -0 (a field with presence keeps its -0).
            Decomposition = new Decomposition(), DecompositionEnergyEvPerAtom = -0.0,
        };
        var response = new AnalyzeDatasetResponse { EntryCount = long.MinValue, Results = { result, new EntryStability(), new EntryStability { EnergyAboveHullEvPerAtom = double.PositiveInfinity } } };
        response.Coverage.Add(new SystemCoverage());
        foreach (IMessage message in new IMessage[] { response, new AnalyzeDatasetResponse(), result })
        {
            Assert.Equal(ReferenceText(message), ProtoJson.Format(message));
        }

        string text = ProtoJson.Format(response);
        Assert.Contains("\"NaN\"", text);
        Assert.Contains("\"-Infinity\"", text);
        Assert.Contains("\"-9223372036854775808\"", text);
        Assert.Contains("\"decomposition_energy_ev_per_atom\": -0", text);
    }

    /// <summary>An analysis answer of <paramref name="count"/> results filled with awkward values.</summary>
    private static AnalyzeDatasetResponse RandomAnswer(int count, int seed)
    {
        var response = new AnalyzeDatasetResponse { EntryCount = count };
        var random = new Random(seed);
        for (int i = 0; i < count; i++)
        {
            var result = new EntryStability();
            Fill(result, random, depth: 0);
            response.Results.Add(result);
        }

        return response;
    }

    /// <summary>What the CLI wrote before: the reference formatter's text with only JSON's own escapes.</summary>
    private static string ReferenceText(IMessage message)
    {
        using JsonDocument document = JsonDocument.Parse(Reference.Format(message));
        using var buffer = new MemoryStream();
        using (var writer = new Utf8JsonWriter(buffer, new JsonWriterOptions
               {
                   Indented = true, Encoder = System.Text.Encodings.Web.JavaScriptEncoder.UnsafeRelaxedJsonEscaping,
               }))
        {
            document.WriteTo(writer);
        }

        return System.Text.Encoding.UTF8.GetString(buffer.ToArray());
    }

    private static void Fill(IMessage message, Random random, int depth)
    {
        MessageDescriptor descriptor = message.Descriptor;
        if (descriptor.FullName == Timestamp.Descriptor.FullName)
        {
            var stamp = (Timestamp)message;
            stamp.Seconds = random.NextInt64(0, 4_000_000_000);
            stamp.Nanos = random.Next(3) switch { 0 => 0, 1 => random.Next(1000) * 1_000_000, _ => random.Next(1_000_000_000) };
            return;
        }

        foreach (OneofDescriptor oneof in descriptor.Oneofs)
        {
            // One member of each oneof (or none), as a real message has.
            int pick = random.Next(oneof.Fields.Count + 1);
            if (pick < oneof.Fields.Count) Set(message, oneof.Fields[pick], random, depth);
        }

        foreach (FieldDescriptor field in descriptor.Fields.InDeclarationOrder())
        {
            if (field.ContainingOneof is not null && !field.ContainingOneof.IsSynthetic) continue;
            if (random.Next(5) == 0) continue; // left at its default (or unset)
            Set(message, field, random, depth);
        }
    }

    private static void Set(IMessage message, FieldDescriptor field, Random random, int depth)
    {
        if (field.FieldType == FieldType.Message && depth >= 3 && !field.IsMap) return;
        if (field.IsMap)
        {
            var map = (IDictionary)field.Accessor.GetValue(message);
            FieldDescriptor keyField = field.MessageType.FindFieldByNumber(1), valueField = field.MessageType.FindFieldByNumber(2);
            int count = random.Next(4);
            for (int i = 0; i < count; i++) map[Value(keyField, random, depth + 1)] = Value(valueField, random, depth + 1);
        }
        else if (field.IsRepeated)
        {
            var list = (IList)field.Accessor.GetValue(message);
            int count = random.Next(4);
            for (int i = 0; i < count; i++) list.Add(Value(field, random, depth + 1));
        }
        else
        {
            field.Accessor.SetValue(message, Value(field, random, depth + 1));
        }
    }

    private static object Value(FieldDescriptor field, Random random, int depth)
    {
        switch (field.FieldType)
        {
            case FieldType.Double:
                return random.Next(3) switch
                {
                    0 => Doubles[random.Next(Doubles.Length)],
                    1 => Doubles[random.Next(Doubles.Length)] * random.NextDouble(),
                    _ => BitConverter.Int64BitsToDouble(random.NextInt64(long.MinValue, long.MaxValue)), // any bit pattern
                };
            case FieldType.Float: return (float)Doubles[random.Next(Doubles.Length)];
            case FieldType.String: return Texts[random.Next(Texts.Length)] + (random.Next(2) == 0 ? random.Next(100).ToString() : "");
            case FieldType.Bool: return random.Next(2) == 0;
            case FieldType.Int32: case FieldType.SInt32: case FieldType.SFixed32:
                return random.Next(4) switch { 0 => int.MinValue, 1 => int.MaxValue, 2 => 0, _ => random.Next(-1000, 1000) };
            case FieldType.UInt32: case FieldType.Fixed32: return random.Next(2) == 0 ? uint.MaxValue : (uint)random.Next(1000);
            case FieldType.Int64: case FieldType.SInt64: case FieldType.SFixed64:
                return random.Next(4) switch { 0 => long.MinValue, 1 => long.MaxValue, 2 => 0L, _ => random.NextInt64(-1_000_000, 1_000_000) };
            case FieldType.UInt64: case FieldType.Fixed64: return random.Next(2) == 0 ? ulong.MaxValue : (ulong)random.Next(1000);
            case FieldType.Bytes:
                byte[] bytes = new byte[random.Next(9)];
                random.NextBytes(bytes);
                return ByteString.CopyFrom(bytes);
            case FieldType.Enum:
                IList<EnumValueDescriptor> values = field.EnumType.Values;
                // Now and then a number the contract does not name (a newer server's value): written as a number.
                int number = random.Next(6) == 0 ? 97 : values[random.Next(values.Count)].Number;
                return System.Enum.ToObject(field.EnumType.ClrType, number);
            case FieldType.Message:
                var nested = (IMessage)Activator.CreateInstance(field.MessageType.ClrType)!;
                Fill(nested, random, depth);
                return nested;
            default:
                throw new InvalidOperationException($"field {field.FullName} has type {field.FieldType}, which the test does not fill");
        }
    }
}
