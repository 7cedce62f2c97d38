using System.Buffers.Binary;
using Microsoft.Data.Sqlite;

namespace Hull.Store.Sqlite;

/// <summary>
/// How an entry's temperature model sits in the file (migration 5): one row of entry_temperature_models per entry
/// row that has a model, keyed by the entry's row_id, so the model shares the row's visibility range. A G(T) table
/// is one BLOB of 16 bytes per point, the temperature's and then the free energy's IEEE 754 binary64 bits,
/// little-endian, in the order given: exact, and one row per model however long the table. The PostgreSQL store keeps
/// the same columns (bytea for the points) and shares <see cref="Read"/>, <see cref="Encode"/> and <see cref="Decode"/>.
/// </summary>
internal static class TemperatureModelColumns
{
    /// <summary>The model's columns in a read over entries joined with <see cref="Join"/>.</summary>
    public const string Select = "m.formula, m.standard_entropy_j_per_mol_k, m.free_energy_anchor, m.free_energy_points";

    public const string Join = "LEFT JOIN entry_temperature_models AS m ON m.row_id = entries.row_id";

    /// <summary>The model columns of a staging table (all NULL for an entry without a model).</summary>
    public const string StagingDefinitions = """
        model_formula                TEXT NULL,
        standard_entropy_j_per_mol_k REAL NULL,
        free_energy_anchor           TEXT NULL,
        free_energy_points           BLOB NULL
        """;

    /// <summary>The staging columns, in the order of <see cref="StagingDefinitions"/>.</summary>
    public const string StagingNames = "model_formula, standard_entropy_j_per_mol_k, free_energy_anchor, free_energy_points";

    private const int BytesPerPoint = 16;

    /// <summary>The model in the four columns from <paramref name="first"/> on, or null when they are all NULL.</summary>
    public static StoredTemperatureModel? Read(System.Data.Common.DbDataReader reader, int first)
    {
        if (reader.IsDBNull(first)) return null;
        string formula = reader.GetString(first);
        if (!reader.IsDBNull(first + 1)) return StoredTemperatureModel.StandardEntropy(reader.GetDouble(first + 1), formula);
        return StoredTemperatureModel.FreeEnergyTable(reader.GetString(first + 2), Decode((byte[])reader.GetValue(first + 3)), formula);
    }

    /// <summary>Sets the four staging parameters from a model (all NULL for none).</summary>
    public static void Bind(StoredTemperatureModel? model, SqliteParameter formula, SqliteParameter entropy, SqliteParameter anchor, SqliteParameter points)
    {
        formula.Value = model is null ? DBNull.Value : model.Formula;
        // SQLite reads -0.0 back as 0.0; store the +0 it will return so the model reads back exactly.
        entropy.Value = model?.StandardEntropyJPerMolK is double s ? s + 0.0 : DBNull.Value;
        anchor.Value = model?.FreeEnergyAnchor is string a ? a : DBNull.Value;
        points.Value = model is { IsFreeEnergyTable: true } ? Encode(model.FreeEnergyPoints) : DBNull.Value;
    }

    /// <summary>Adds the four parameters a model insert or staging insert binds; returns them in column order.</summary>
    public static (SqliteParameter Formula, SqliteParameter Entropy, SqliteParameter Anchor, SqliteParameter Points) AddParameters(SqliteCommand command) =>
        (command.Parameters.Add("$model_formula", SqliteType.Text), command.Parameters.Add("$entropy", SqliteType.Real),
         command.Parameters.Add("$anchor", SqliteType.Text), command.Parameters.Add("$points", SqliteType.Blob));

    /// <summary>The insert of one model row for the entry row this connection inserted last (run it right after that insert).</summary>
    public static SqliteCommand InsertForLastEntry(SqliteConnection connection, SqliteTransaction transaction) =>
        connection.Command(transaction, """
            INSERT INTO entry_temperature_models (row_id, formula, standard_entropy_j_per_mol_k, free_energy_anchor, free_energy_points)
            VALUES (last_insert_rowid(), $model_formula, $entropy, $anchor, $points)
            """);

    /// <summary>
    /// Whether a staging table has the model columns: a session begun before migration 5 staged into a table
    /// without them, and its rows have no models.
    /// </summary>
    public static bool StagingHasModelColumns(SqliteConnection connection, SqliteTransaction transaction, string stagingTable) =>
        StagingColumns.Has(connection, transaction, stagingTable, "free_energy_points");

    /// <summary>Gives a staging table of a session begun before migration 5 the model columns (its rows get NULLs).</summary>
    public static void EnsureStagingColumns(SqliteConnection connection, SqliteTransaction transaction, string stagingTable) =>
        StagingColumns.Ensure(connection, transaction, stagingTable, StagingDefinitions, "free_energy_points");

    public static byte[] Encode(IReadOnlyList<StoredFreeEnergyPoint> points)
    {
        var bytes = new byte[points.Count * BytesPerPoint];
        for (int i = 0; i < points.Count; i++)
        {
            BinaryPrimitives.WriteDoubleLittleEndian(bytes.AsSpan(i * BytesPerPoint), points[i].TemperatureK);
            BinaryPrimitives.WriteDoubleLittleEndian(bytes.AsSpan(i * BytesPerPoint + 8), points[i].FreeEnergyAboveAnchorEv);
        }
        return bytes;
    }

    public static StoredFreeEnergyPoint[] Decode(byte[] bytes)
    {
        var points = new StoredFreeEnergyPoint[bytes.Length / BytesPerPoint];
        for (int i = 0; i < points.Length; i++)
        {
            points[i] = new StoredFreeEnergyPoint(
                BinaryPrimitives.ReadDoubleLittleEndian(bytes.AsSpan(i * BytesPerPoint)),
                BinaryPrimitives.ReadDoubleLittleEndian(bytes.AsSpan(i * BytesPerPoint + 8)));
        }
        return points;
    }
}
