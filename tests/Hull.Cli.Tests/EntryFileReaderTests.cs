using Hull.Cli.Input;
using Hull.Protos.V1;

namespace Hull.Cli.Tests;

/// <summary>The documented CSV and JSON entry layouts: what is read, and what is refused with file and line.</summary>
public sealed class EntryFileReaderTests : IDisposable
{
    private readonly string _folder = Path.Combine(Path.GetTempPath(), "hull-cli-files-" + Guid.NewGuid().ToString("N"));

    public EntryFileReaderTests() => Directory.CreateDirectory(_folder);

    public void Dispose() => Directory.Delete(_folder, recursive: true);

    private string Write(string name, string text)
    {
        string path = Path.Combine(_folder, name);
        File.WriteAllText(path, text);
        return path;
    }

    [Fact]
    public void Reads_csv_with_comments_quotes_any_column_order_and_optional_note()
    {
        string path = Write("a.csv", """
            # a comment line
            formula,id,basis,energy_ev,note

            LiCoO2,lco,formation_per_atom,-1.8,"layered, R-3m"
            Li2O,"li""2o",total_per_formula_unit,-14.5e0,
            Co,co,total_per_atom,  -7.1  ,"multi
            line"
            """);
        var records = EntryFileReader.Read(path);
        Assert.Equal(3, records.Count);
        Assert.Equal(new EntryRecord("lco", "LiCoO2", -1.8, EnergyBasis.FormationPerAtom, "layered, R-3m", 4), records[0]);
        Assert.Equal(new EntryRecord("li\"2o", "Li2O", -14.5, EnergyBasis.TotalPerFormulaUnit, string.Empty, 5), records[1]);
        Assert.Equal("multi\nline", records[2].Note);
        Assert.Equal(-7.1, records[2].EnergyEv);

        var noNote = EntryFileReader.Read(Write("b.csv", "id,formula,energy_ev,basis\nx,Li,0,total_per_atom\n"));
        Assert.Equal(string.Empty, Assert.Single(noNote).Note);
    }

    [Theory]
    [InlineData("id,formula,energy_ev,basis\nx,Li,abc,total_per_atom\n", 2, "column 'energy_ev': 'abc' is not a finite number")]
    [InlineData("id,formula,energy_ev,basis\nx,Li,NaN,total_per_atom\n", 2, "'NaN' is not a finite number")]
    [InlineData("id,formula,energy_ev,basis\nx,Li,1e400,total_per_atom\n", 2, "'1e400' is not a finite number")]
    [InlineData("id,formula,energy_ev,basis\nx,Li,-1,per_atom\n", 2, "basis 'per_atom' is not one of")]
    [InlineData("id,formula,energy_ev,basis\n,Li,-1,total_per_atom\n", 2, "column 'id' is empty")]
    [InlineData("id,formula,energy_ev,basis\nx,Li,-1\n", 2, "3 fields, but the header has 4")]
    [InlineData("id,formula,energy,basis\n", 1, "unknown column 'energy'")]
    [InlineData("id,formula,basis\n", 1, "the header has no 'energy_ev' column")]
    [InlineData("id,id,formula,energy_ev,basis\n", 1, "column 'id' appears twice")]
    [InlineData("id,formula,energy_ev,basis\nx,\"Li,-1,total_per_atom\n", 2, "a quoted field is never closed")]
    public void Refuses_bad_csv_naming_the_line(string text, int line, string expected)
    {
        var e = Assert.Throws<InputFileException>(() => EntryFileReader.Read(Write("bad.csv", text)));
        Assert.Equal(line, e.Line);
        Assert.Contains(expected, e.Message);
        Assert.Contains("bad.csv", e.Message);
    }

    [Fact]
    public void Reads_json_as_object_or_array()
    {
        string entries = """[{"id": "a", "formula": "LiCoO2", "energy_ev": -1.8, "basis": "formation_per_atom", "note": "n"}, {"id": "b", "formula": "Co", "energy_ev": -7, "basis": "total_per_atom"}]""";
        var fromArray = EntryFileReader.Read(Write("a.json", entries));
        var fromObject = EntryFileReader.Read(Write("b.json", $$"""{"entries": {{entries}} }"""));
        Assert.Equal(fromArray, fromObject);
        Assert.Equal(2, fromArray.Count);
        Assert.Equal(EnergyBasis.TotalPerAtom, fromArray[1].Basis);
        Assert.Equal("entries[1]", EntryFileReader.Locate(fromArray[1]));
    }

    [Theory]
    [InlineData("""[{"id": "a", "formula": "Li", "energy_ev": "1", "basis": "total_per_atom"}]""", "entries[0]: field \"energy_ev\" must be a finite number")]
    [InlineData("""[{"id": "a", "formula": "Li", "basis": "total_per_atom"}]""", "entries[0]: field \"energy_ev\" is missing")]
    [InlineData("""[{"id": "a", "formula": "Li", "energy_ev": 1, "basis": "total_per_atom", "colour": 1}]""", "unknown field \"colour\"")]
    [InlineData("""{"rows": []}""", "expected an array of entries")]
    [InlineData("""[{"id": "a", """, "not valid JSON")]
    public void Refuses_bad_json_naming_the_entry(string text, string expected)
    {
        var e = Assert.Throws<InputFileException>(() => EntryFileReader.Read(Write("bad.json", text)));
        Assert.Contains(expected, e.Message);
    }

    [Fact]
    public void Missing_files_and_unknown_types_are_input_errors()
    {
        Assert.Contains("no such file", Assert.Throws<InputFileException>(() => EntryFileReader.Read(Path.Combine(_folder, "none.csv"))).Message);
        Assert.Contains("entry files end in .csv or .json", Assert.Throws<InputFileException>(() => EntryFileReader.Read(Write("x.txt", "id"))).Message);
    }
}
