using Hull.Store.Sqlite;
using Npgsql;
using NpgsqlTypes;

namespace Hull.Store.Postgres;

// Importing a batch: one transaction, one new version.
public sealed partial class PostgresDatasetStore
{
    /// <inheritdoc />
    public ImportResult ImportBatch(string datasetName, IReadOnlyList<EntryRow> rows, DuplicatePolicy policy, BatchProvenance provenance, long? basedOn = null)
    {
        DatasetName.Validate(datasetName);
        StoreArguments.CheckProvenance(provenance);
        StoreArguments.CheckPolicy(policy);
        ArgumentNullException.ThrowIfNull(rows);
        // A private copy: what was validated is exactly what gets written, whatever the caller does with its list.
        EntryRow[] batch = [.. rows];
        BatchValidator.Validate(batch);
        DateTimeOffset now = _clock.GetUtcNow();

        return Write((connection, transaction) =>
        {
            DatasetRecord dataset = FindDataset(connection, transaction, datasetName);
            LiveVersion? previous = FindLatestLive(connection, transaction, dataset.DatasetId);
            StoreArguments.CheckBase(datasetName, basedOn, previous?.Version);
            long newVersion = dataset.LastVersionIssued + 1;
            string[] ids = [.. batch.Select(r => r.Id)];

            int replaced = 0;
            if (policy == DuplicatePolicy.Replace)
            {
                using NpgsqlCommand close = connection.Command(transaction, """
                    UPDATE entries SET last_version_exclusive = @v
                    WHERE dataset_id = @d AND last_version_exclusive IS NULL AND entry_id = ANY(@ids)
                    """).With("@v", newVersion).With("@d", dataset.DatasetId).With("@ids", ids);
                replaced = close.ExecuteNonQuery();
            }
            else
            {
                // The open-row index would refuse a stored id too, but only after the copy; finding it first names the row.
                using NpgsqlCommand stored = connection.Command(transaction, """
                    SELECT entry_id FROM entries
                    WHERE dataset_id = @d AND last_version_exclusive IS NULL AND entry_id = ANY(@ids)
                    """).With("@d", dataset.DatasetId).With("@ids", ids);
                var taken = new HashSet<string>(StringComparer.Ordinal);
                using (NpgsqlDataReader reader = stored.ExecuteReader())
                {
                    while (reader.Read()) taken.Add(reader.GetString(0));
                }
                int first = Array.FindIndex(batch, r => taken.Contains(r.Id));
                if (first >= 0) throw StoreArguments.AlreadyStored(first, batch[first].Id, datasetName, previous?.Version, rowPrefix: true);
            }

            CopyEntries(connection, dataset.DatasetId, newVersion, batch);
            InsertModels(connection, transaction, dataset.DatasetId, newVersion, batch);
            int inserted = batch.Length - replaced;
            IssueVersion(connection, transaction, dataset.DatasetId, newVersion, now, provenance, batch.Length, inserted, replaced,
                (previous?.EntryCount ?? 0) + inserted);
            return new ImportResult(newVersion, inserted, replaced);
        });
    }

    /// <summary>Writes the rows as entries from <paramref name="version"/> on, by binary COPY (one stream, no per-row round trip).</summary>
    private static void CopyEntries(NpgsqlConnection connection, long datasetId, long version, IEnumerable<EntryRow> rows)
    {
        using NpgsqlBinaryImporter copy = connection.BeginBinaryImport(
            "COPY entries (dataset_id, entry_id, formula, energy_ev, energy_basis, metadata, energy_sigma_ev_per_atom, correlation_group, method, first_version) FROM STDIN (FORMAT BINARY)");
        foreach (EntryRow row in rows)
        {
            copy.StartRow();
            copy.Write(datasetId, NpgsqlDbType.Bigint);
            copy.Write(row.Id, NpgsqlDbType.Text);
            copy.Write(row.Formula, NpgsqlDbType.Text);
            // SQLite reads -0.0 back as 0.0; both stores keep the +0 so that a row reads back the same from either.
            copy.Write(row.EnergyEv + 0.0, NpgsqlDbType.Double);
            copy.Write(row.Basis, NpgsqlDbType.Text);
            copy.Write(row.Metadata ?? string.Empty, NpgsqlDbType.Text);
            WriteUncertainty(copy, row);
            WriteMethod(copy, row);
            copy.Write(version, NpgsqlDbType.Bigint);
        }
        copy.Complete();
    }

    /// <summary>Writes a row's σ and correlation group to a COPY (NULL where it has none; +0 for -0, as SQLite reads it back).</summary>
    private static void WriteUncertainty(NpgsqlBinaryImporter copy, EntryRow row)
    {
        if (row.SigmaEvPerAtom is double sigma) copy.Write(sigma + 0.0, NpgsqlDbType.Double);
        else copy.WriteNull();
        if (row.CorrelationGroup is string group) copy.Write(group, NpgsqlDbType.Text);
        else copy.WriteNull();
    }

    /// <summary>Writes a row's method tag to a COPY (NULL when untagged).</summary>
    private static void WriteMethod(NpgsqlBinaryImporter copy, EntryRow row)
    {
        if (row.Method is string method) copy.Write(method, NpgsqlDbType.Text);
        else copy.WriteNull();
    }

    /// <summary>The temperature models of rows just written at <paramref name="version"/> (ids are unique in a batch, so (id, version) finds each row).</summary>
    private static void InsertModels(NpgsqlConnection connection, NpgsqlTransaction transaction, long datasetId, long version, EntryRow[] batch)
    {
        EntryRow[] modelled = [.. batch.Where(r => r.TemperatureModel is not null)];
        if (modelled.Length == 0) return;
        using NpgsqlCommand insert = connection.Command(transaction, """
            INSERT INTO entry_temperature_models (row_id, formula, standard_entropy_j_per_mol_k, free_energy_anchor, free_energy_points)
            SELECT e.row_id, m.formula, m.entropy, m.anchor, m.points
            FROM unnest(@ids, @formulas, @entropies, @anchors, @points) AS m (entry_id, formula, entropy, anchor, points)
            JOIN entries AS e ON e.dataset_id = @d AND e.entry_id = m.entry_id AND e.first_version = @v
            """).With("@d", datasetId).With("@v", version)
            .With("@ids", modelled.Select(r => r.Id).ToArray())
            .With("@formulas", modelled.Select(r => r.TemperatureModel!.Formula).ToArray());
        // SQLite reads -0.0 back as 0.0; both stores keep the +0.
        insert.Parameters.Add(new NpgsqlParameter("@entropies", NpgsqlDbType.Array | NpgsqlDbType.Double)
        {
            Value = modelled.Select(r => r.TemperatureModel!.StandardEntropyJPerMolK is double s ? (object)(s + 0.0) : DBNull.Value).ToArray(),
        });
        insert.Parameters.Add(new NpgsqlParameter("@anchors", NpgsqlDbType.Array | NpgsqlDbType.Text)
        {
            Value = modelled.Select(r => (object?)r.TemperatureModel!.FreeEnergyAnchor ?? DBNull.Value).ToArray(),
        });
        insert.Parameters.Add(new NpgsqlParameter("@points", NpgsqlDbType.Array | NpgsqlDbType.Bytea)
        {
            Value = modelled.Select(r => r.TemperatureModel!.IsFreeEnergyTable ? (object)TemperatureModelColumns.Encode(r.TemperatureModel.FreeEnergyPoints) : DBNull.Value).ToArray(),
        });
        insert.ExecuteNonQuery();
    }

    /// <summary>Records a new version with its provenance and counts, and marks its number as issued.</summary>
    private static void IssueVersion(
        NpgsqlConnection connection, NpgsqlTransaction transaction, long datasetId, long newVersion, DateTimeOffset now,
        BatchProvenance provenance, int batchCount, int inserted, int replaced, long entryCount)
    {
        connection.Execute(transaction, """
            INSERT INTO dataset_versions (dataset_id, version, committed_at_utc, source_label, note,
                                          batch_entry_count, inserted, replaced, entry_count)
            VALUES (@d, @v, @t, @source, @note, @count, @inserted, @replaced, @entries)
            """,
            ("@d", datasetId), ("@v", newVersion), ("@t", UtcText.Write(now)),
            ("@source", provenance.SourceLabel ?? string.Empty), ("@note", provenance.Note ?? string.Empty),
            ("@count", batchCount), ("@inserted", inserted), ("@replaced", replaced), ("@entries", entryCount));
        connection.Execute(transaction, "UPDATE datasets SET last_version_issued = @v WHERE dataset_id = @d",
            ("@v", newVersion), ("@d", datasetId));
    }
}
