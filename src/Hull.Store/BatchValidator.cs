namespace Hull.Store;

/// <summary>
/// The Store's last line of defence on import: the server validates rows first, but nothing that would store a
/// row the rest of the service cannot read (empty id, non-finite energy, broken text) gets past here.
/// </summary>
internal static class BatchValidator
{
    /// <summary>Throws <see cref="InvalidBatchException"/> for the first faulty row; checks repeats inside the batch.</summary>
    public static void Validate(IReadOnlyList<EntryRow> rows)
    {
        ArgumentNullException.ThrowIfNull(rows);
        if (rows.Count == 0) throw new InvalidBatchException("the batch is empty; an import needs at least one row");

        var firstIndexById = new Dictionary<string, int>(rows.Count, StringComparer.Ordinal);
        for (int i = 0; i < rows.Count; i++)
        {
            EntryRow? row = rows[i];
            if (row is null) throw new InvalidBatchException($"row {i} is null", i);

            if (string.IsNullOrWhiteSpace(row.Id))
            {
                throw new InvalidBatchException($"row {i}: Id is empty; every entry needs an id", i, row.Id, nameof(EntryRow.Id));
            }
            CheckText(i, row.Id, nameof(EntryRow.Id), row.Id);
            if (string.IsNullOrWhiteSpace(row.Formula))
            {
                throw new InvalidBatchException($"row {i} (id '{row.Id}'): Formula is empty", i, row.Id, nameof(EntryRow.Formula));
            }
            CheckText(i, row.Id, nameof(EntryRow.Formula), row.Formula);
            if (!double.IsFinite(row.EnergyEv))
            {
                throw new InvalidBatchException(
                    $"row {i} (id '{row.Id}'): EnergyEv is {row.EnergyEv}; energies must be finite numbers of eV",
                    i, row.Id, nameof(EntryRow.EnergyEv));
            }
            if (!StoredBasisTokens.IsAccepted(row.Basis))
            {
                throw new InvalidBatchException(
                    $"row {i} (id '{row.Id}'): Basis '{row.Basis}' is not one of {string.Join(", ", StoredBasisTokens.All)}",
                    i, row.Id, nameof(EntryRow.Basis));
            }
            if (row.Metadata is not null) CheckText(i, row.Id, nameof(EntryRow.Metadata), row.Metadata);
            if (row.TemperatureModel is { } model) CheckModel(i, row.Id, model);
            if (row.SigmaEvPerAtom is { } sigma && !(double.IsFinite(sigma) && sigma >= 0))
            {
                throw new InvalidBatchException(
                    $"row {i} (id '{row.Id}'): SigmaEvPerAtom is {sigma}; an energy uncertainty must be a finite, non-negative number of eV/atom",
                    i, row.Id, nameof(EntryRow.SigmaEvPerAtom));
            }
            if (row.CorrelationGroup is not null)
            {
                if (string.IsNullOrWhiteSpace(row.CorrelationGroup))
                {
                    throw new InvalidBatchException($"row {i} (id '{row.Id}'): CorrelationGroup is blank; leave it out or name the group", i, row.Id, nameof(EntryRow.CorrelationGroup));
                }
                CheckText(i, row.Id, nameof(EntryRow.CorrelationGroup), row.CorrelationGroup);
            }
            if (row.Method is not null)
            {
                if (string.IsNullOrWhiteSpace(row.Method))
                {
                    throw new InvalidBatchException($"row {i} (id '{row.Id}'): Method is blank; leave it out or name the method", i, row.Id, nameof(EntryRow.Method));
                }
                CheckText(i, row.Id, nameof(EntryRow.Method), row.Method);
            }

            if (!firstIndexById.TryAdd(row.Id, i))
            {
                int first = firstIndexById[row.Id];
                throw new DuplicateEntryException(
                    $"row {i}: id '{row.Id}' repeats row {first} of the same batch; ids must be unique within a batch",
                    i, row.Id, first, existingVersion: null);
            }
        }
    }

    // What the file could not hold or the server could not read back: the server's own checks come first.
    private static void CheckModel(int i, string id, StoredTemperatureModel model)
    {
        const string field = nameof(EntryRow.TemperatureModel);
        CheckText(i, id, field, model.Formula);
        if (model.StandardEntropyJPerMolK is double entropy)
        {
            if (!double.IsFinite(entropy) || entropy < 0)
            {
                throw new InvalidBatchException($"row {i} (id '{id}'): the standard entropy is {entropy} J/(mol K); it must be finite and not negative", i, id, field);
            }
            return;
        }
        if (!StoredFreeEnergyAnchorTokens.IsAccepted(model.FreeEnergyAnchor))
        {
            throw new InvalidBatchException(
                $"row {i} (id '{id}'): free-energy anchor '{model.FreeEnergyAnchor}' is not one of {string.Join(", ", StoredFreeEnergyAnchorTokens.All)}", i, id, field);
        }
        var points = model.FreeEnergyPoints;
        if (points.Length < 2)
        {
            throw new InvalidBatchException($"row {i} (id '{id}'): the G(T) table has {points.Length} point{(points.Length == 1 ? "" : "s")}; it needs at least 2", i, id, field);
        }
        for (int k = 0; k < points.Length; k++)
        {
            StoredFreeEnergyPoint point = points[k];
            bool ordered = k == 0 || point.TemperatureK > points[k - 1].TemperatureK;
            if (!double.IsFinite(point.TemperatureK) || point.TemperatureK <= 0 || !double.IsFinite(point.FreeEnergyAboveAnchorEv) || !ordered)
            {
                throw new InvalidBatchException(
                    $"row {i} (id '{id}'): G(T) point {k + 1} ({point.TemperatureK} K, {point.FreeEnergyAboveAnchorEv} eV) must have a finite temperature above 0 K, above the point before it, and a finite energy",
                    i, id, field);
            }
        }
    }

    // A lone UTF-16 surrogate cannot be encoded as UTF-8: SQLite would store U+FFFD instead, silently changing the text.
    // U+0000 cannot be held by PostgreSQL's text (see StoreArguments.CheckStoredText).
    private static void CheckText(int rowIndex, string id, string field, string text)
    {
        for (int k = 0; k < text.Length; k++)
        {
            char c = text[k];
            if (c == '\0')
            {
                throw new InvalidBatchException(
                    $"row {rowIndex} (id '{id}'): {field} holds the character U+0000 at character {k + 1}; it cannot be stored",
                    rowIndex, id, field);
            }
            if (char.IsHighSurrogate(c) && k + 1 < text.Length && char.IsLowSurrogate(text[k + 1]))
            {
                k++;
                continue;
            }
            if (char.IsSurrogate(c))
            {
                throw new InvalidBatchException(
                    $"row {rowIndex} (id '{id}'): {field} has an unpaired UTF-16 surrogate U+{(int)c:X4} at character {k + 1}",
                    rowIndex, id, field);
            }
        }
    }
}
