using Hull.Store.Sqlite;
using Microsoft.Data.Sqlite;

namespace Hull.Store;

// Importing a batch: one transaction, one new version.
public sealed partial class DatasetStore
{
    // SQLite extended result code for a UNIQUE constraint violation.
    private const int SqliteConstraintUnique = 2067;

    /// <summary>
    /// Writes <paramref name="rows"/> as a new version of the dataset (latest issued version + 1), all or nothing.
    /// The new version holds the latest live version's entries plus the batch. Under <see cref="DuplicatePolicy.Reject"/>
    /// an id already in the latest version fails the batch; under <see cref="DuplicatePolicy.Replace"/> the batch's row
    /// supersedes it from the new version on. An id repeated inside the batch always fails it.
    /// </summary>
    /// <exception cref="InvalidBatchException">Empty batch or a faulty row (index, id and field named); nothing written.</exception>
    /// <exception cref="DuplicateEntryException">A repeated id, as above; nothing written.</exception>
    /// <exception cref="DatasetNotFoundException">No such dataset.</exception>
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

            using SqliteCommand close = connection.Command(transaction, """
                UPDATE entries SET last_version_exclusive = $v
                WHERE dataset_id = $d AND entry_id = $id AND last_version_exclusive IS NULL
                """);
            close.With("$v", newVersion).With("$d", dataset.DatasetId);
            SqliteParameter closeId = close.Parameters.Add("$id", SqliteType.Text);
            close.Prepare();

            using SqliteCommand insert = connection.Command(transaction, """
                INSERT INTO entries (dataset_id, entry_id, formula, energy_ev, energy_basis, metadata, energy_sigma_ev_per_atom, correlation_group, method, first_version)
                VALUES ($d, $id, $formula, $energy, $basis, $metadata, $sigma, $group, $method, $v)
                """);
            insert.With("$d", dataset.DatasetId).With("$v", newVersion);
            SqliteParameter id = insert.Parameters.Add("$id", SqliteType.Text);
            SqliteParameter formula = insert.Parameters.Add("$formula", SqliteType.Text);
            SqliteParameter energy = insert.Parameters.Add("$energy", SqliteType.Real);
            SqliteParameter basis = insert.Parameters.Add("$basis", SqliteType.Text);
            SqliteParameter metadata = insert.Parameters.Add("$metadata", SqliteType.Text);
            var (sigma, group) = UncertaintyColumns.AddParameters(insert);
            SqliteParameter method = MethodColumn.AddParameter(insert);
            insert.Prepare();

            using SqliteCommand insertModel = TemperatureModelColumns.InsertForLastEntry(connection, transaction);
            var (modelFormula, entropy, anchor, points) = TemperatureModelColumns.AddParameters(insertModel);

            int inserted = 0, replaced = 0;
            for (int i = 0; i < batch.Length; i++)
            {
                EntryRow row = batch[i];
                if (policy == DuplicatePolicy.Replace)
                {
                    closeId.Value = row.Id;
                    if (close.ExecuteNonQuery() == 1) replaced++;
                    else inserted++;
                }
                else
                {
                    inserted++;
                }

                id.Value = row.Id;
                formula.Value = row.Formula;
                // SQLite reads -0.0 back as 0.0; store the +0 it will return so the row reads back exactly.
                energy.Value = row.EnergyEv + 0.0;
                basis.Value = row.Basis;
                metadata.Value = row.Metadata ?? string.Empty;
                UncertaintyColumns.Bind(row, sigma, group);
                MethodColumn.Bind(row, method);
                try
                {
                    insert.ExecuteNonQuery();
                    if (row.TemperatureModel is not null)
                    {
                        TemperatureModelColumns.Bind(row.TemperatureModel, modelFormula, entropy, anchor, points);
                        insertModel.ExecuteNonQuery();
                    }
                }
                catch (SqliteException e) when (e.SqliteExtendedErrorCode == SqliteConstraintUnique && policy == DuplicatePolicy.Reject)
                {
                    // Only an open row of the same id can collide: repeats inside the batch were refused before.
                    throw StoreArguments.AlreadyStored(i, row.Id, datasetName, previous?.Version, rowPrefix: true);
                }
            }

            IssueVersion(connection, transaction, dataset.DatasetId, newVersion, now, provenance, batch.Length, inserted, replaced,
                (previous?.EntryCount ?? 0) + inserted);
            return new ImportResult(newVersion, inserted, replaced);
        });
    }

    /// <summary>Records a new version with its provenance and counts, and marks its number as issued.</summary>
    private static void IssueVersion(
        SqliteConnection connection, SqliteTransaction transaction, long datasetId, long newVersion, DateTimeOffset now,
        BatchProvenance provenance, int batchCount, int inserted, int replaced, long entryCount)
    {
        using (SqliteCommand version = connection.Command(transaction, """
                   INSERT INTO dataset_versions (dataset_id, version, committed_at_utc, source_label, note,
                                                 batch_entry_count, inserted, replaced, entry_count)
                   VALUES ($d, $v, $t, $source, $note, $count, $inserted, $replaced, $entries)
                   """))
        {
            version.With("$d", datasetId).With("$v", newVersion).With("$t", UtcText.Write(now))
                .With("$source", provenance.SourceLabel ?? string.Empty).With("$note", provenance.Note ?? string.Empty)
                .With("$count", batchCount).With("$inserted", inserted).With("$replaced", replaced)
                .With("$entries", entryCount);
            version.ExecuteNonQuery();
        }
        using (SqliteCommand issue = connection.Command(transaction,
                   "UPDATE datasets SET last_version_issued = $v WHERE dataset_id = $d"))
        {
            issue.With("$v", newVersion).With("$d", datasetId).ExecuteNonQuery();
        }
    }
}
