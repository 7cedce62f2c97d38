using System.Globalization;
using Google.Protobuf;
using Hull.Protos.V1;

namespace Hull.Cli.Input;

/// <summary>
/// Temperature models for a thermo request, from a file. CSV (lines starting with '#' are comments) with the header
/// <c>entry_id,formula,standard_entropy_j_per_mol_k,source</c>: a row with an entry id is that entry's model (the
/// formula is the formula unit S° is per, and must be the entry's: the server checks it); a row without one applies
/// to every entry of that formula. JSON: <c>{"models": [{"entryId": ..., "model": {...}}]}</c> in the wire's JSON
/// names (ThermoSolidModel, whose model is an entry's EntryTemperatureModel), which also holds free-energy tables.
/// </summary>
public static class ThermoModelFile
{
    private static readonly string[] Header = ["entry_id", "formula", "standard_entropy_j_per_mol_k", "source"];

    /// <exception cref="InputFileException">A file that cannot be read, a wrong header, or a bad row (line named).</exception>
    public static IReadOnlyList<ThermoSolidModel> Read(string path)
    {
        string text;
        try
        {
            text = File.ReadAllText(path);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new InputFileException(path, null, $"cannot be read: {e.Message}", e);
        }

        return path.EndsWith(".json", StringComparison.OrdinalIgnoreCase) ? FromJson(path, text) : FromCsv(path, text);
    }

    private static IReadOnlyList<ThermoSolidModel> FromJson(string path, string text)
    {
        try
        {
            return [.. JsonParser.Default.Parse<GetHullAtConditionsRequest>(text).Models];
        }
        catch (InvalidProtocolBufferException e)
        {
            throw new InputFileException(path, null, $"is not a models document ({{\"models\": [...]}}): {e.Message}", e);
        }
    }

    private static IReadOnlyList<ThermoSolidModel> FromCsv(string path, string text)
    {
        var models = new List<ThermoSolidModel>();
        bool headerSeen = false;
        string[] lines = text.Split('\n');
        for (int i = 0; i < lines.Length; i++)
        {
            string line = lines[i].TrimEnd('\r');
            if (line.Trim().Length == 0 || line.TrimStart().StartsWith('#')) continue;
            string[] cells = line.Split(',').Select(c => c.Trim()).ToArray();
            if (!headerSeen)
            {
                if (!cells.SequenceEqual(Header, StringComparer.Ordinal))
                {
                    throw new InputFileException(path, i + 1, $"the header must be {string.Join(",", Header)}; got {line}");
                }

                headerSeen = true;
                continue;
            }

            if (cells.Length != Header.Length)
            {
                throw new InputFileException(path, i + 1, $"expected {Header.Length} columns ({string.Join(",", Header)}), got {cells.Length}");
            }

            if (cells[1].Length == 0)
            {
                throw new InputFileException(path, i + 1, "formula is empty: say per which formula unit the entropy is given");
            }

            if (!double.TryParse(cells[2], NumberStyles.Float, CultureInfo.InvariantCulture, out double entropy) || !double.IsFinite(entropy))
            {
                throw new InputFileException(path, i + 1, $"standard_entropy_j_per_mol_k '{cells[2]}' is not a number");
            }

            var model = new ThermoSolidModel { Model = new EntryTemperatureModel { Formula = cells[1], StandardEntropyJPerMolK = entropy }, Source = cells[3] };
            if (cells[0].Length > 0) model.EntryId = cells[0];
            else model.Formula = cells[1];
            models.Add(model);
        }

        if (!headerSeen)
        {
            throw new InputFileException(path, null, $"holds no header; the first line must be {string.Join(",", Header)}");
        }

        return models;
    }
}
