using Hull.Protos.V1;

namespace Hull.Cli.Input;

/// <summary>An entry's temperature model as files give it, put together for the wire (the server checks the values).</summary>
public static class TemperatureModelText
{
    /// <summary>
    /// The model of an entry line: S° when given, else only the formula (a G(T) table may still come for it), else none.
    /// </summary>
    public static EntryTemperatureModel? FromEntropy(double? entropyJPerMolK, string modelFormula)
    {
        string formula = modelFormula.Trim();
        if (entropyJPerMolK is null && formula.Length == 0) return null;
        var model = new EntryTemperatureModel { Formula = formula };
        if (entropyJPerMolK is double entropy) model.StandardEntropyJPerMolK = entropy;
        return model;
    }

    /// <summary>
    /// Refuses an entry whose file names a model formula but gives neither S° nor a G(T) table for it, so nothing
    /// reaches the server that it would have to refuse for the file's sake.
    /// </summary>
    public static void RequireKinds(string path, IEnumerable<EntryRecord> records)
    {
        foreach (EntryRecord record in records)
        {
            if (record.TemperatureModel is { KindCase: EntryTemperatureModel.KindOneofCase.None } model)
            {
                throw new InputFileException(path, record.Line > 0 ? record.Line : null,
                    $"{(record.Line > 0 ? string.Empty : EntryFileReader.Locate(record) + ": ")}entry '{record.Id}' names the temperature-model formula '{model.Formula}' but has neither a {EntryFileLayout.StandardEntropy} nor a G(T) table");
            }
        }
    }
}
