using Hull.Cli.Output;

namespace Hull.Cli.Tests;

public sealed class TableRendererTests
{
    [Fact]
    public void Aligns_text_left_and_numbers_right()
    {
        var table = new Table("id", "energy").Add("a", -1.5).Add("long-id", 0.25);
        var text = new StringWriter();
        TableRenderer.WriteAligned(text, table);
        Assert.Equal(
            "id        energy" + Environment.NewLine +
            "-------  -------" + Environment.NewLine +
            "a        -1.5000" + Environment.NewLine +
            "long-id   0.2500" + Environment.NewLine,
            text.ToString());
    }

    [Fact]
    public void Csv_quotes_what_needs_it_and_keeps_full_precision()
    {
        var table = new Table("id", "note", "energy").Add("a,b", "say \"hi\"", 0.1 + 0.2).Add("c", null, true);
        var text = new StringWriter();
        TableRenderer.WriteCsv(text, table);
        Assert.Equal(
            "id,note,energy" + Environment.NewLine +
            "\"a,b\",\"say \"\"hi\"\"\",0.30000000000000004" + Environment.NewLine +
            "c,,true" + Environment.NewLine,
            text.ToString());
    }
}
