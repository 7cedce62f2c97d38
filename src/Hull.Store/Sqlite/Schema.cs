namespace Hull.Store.Sqlite;

/// <summary>
/// The database layout, as the ordered list of steps that build it. A released step is never edited: a change is
/// a new step at the end. Entry rows carry the range of versions they are visible in, so a version costs only its
/// batch: a row is visible at version k iff first_version &lt;= k &lt; last_version_exclusive (or that is NULL), and a
/// replace closes the old row at the new version and inserts the new row from it.
/// </summary>
internal static class Schema
{
    public static IReadOnlyList<Migration> Migrations { get; } =
    [
        new(1, "datasets, versions with provenance, entry rows with visibility ranges", """
            CREATE TABLE schema_version (
                version        INTEGER PRIMARY KEY,
                description    TEXT NOT NULL,
                applied_at_utc TEXT NOT NULL
            );

            -- AUTOINCREMENT: a deleted dataset's id is never given to a new one, so nothing keyed on an id can
            -- ever mix two datasets that had the same name at different times.
            CREATE TABLE datasets (
                dataset_id          INTEGER PRIMARY KEY AUTOINCREMENT,
                name                TEXT NOT NULL UNIQUE,
                description         TEXT NOT NULL,
                created_at_utc      TEXT NOT NULL,
                last_version_issued INTEGER NOT NULL DEFAULT 0
            );

            -- A deleted version keeps its row (deleted_at_utc set) so that errors can say it was deleted.
            CREATE TABLE dataset_versions (
                dataset_id        INTEGER NOT NULL REFERENCES datasets (dataset_id) ON DELETE CASCADE,
                version           INTEGER NOT NULL CHECK (version >= 1),
                committed_at_utc  TEXT NOT NULL,
                source_label      TEXT NOT NULL,
                note              TEXT NOT NULL,
                batch_entry_count INTEGER NOT NULL,
                inserted          INTEGER NOT NULL,
                replaced          INTEGER NOT NULL,
                entry_count       INTEGER NOT NULL,
                deleted_at_utc    TEXT NULL,
                PRIMARY KEY (dataset_id, version)
            ) WITHOUT ROWID;

            CREATE TABLE entries (
                row_id                 INTEGER PRIMARY KEY,
                dataset_id             INTEGER NOT NULL REFERENCES datasets (dataset_id) ON DELETE CASCADE,
                entry_id               TEXT NOT NULL CHECK (length(entry_id) > 0),
                formula                TEXT NOT NULL,
                energy_ev              REAL NOT NULL CHECK (abs(energy_ev) <= 1.7976931348623157e308),
                energy_basis           TEXT NOT NULL CHECK (energy_basis IN ('total_per_formula_unit', 'total_per_atom',
                                           'formation_per_formula_unit', 'formation_per_atom')),
                metadata               TEXT NOT NULL,
                first_version          INTEGER NOT NULL,
                last_version_exclusive INTEGER NULL,
                CHECK (last_version_exclusive IS NULL OR last_version_exclusive > first_version)
            );

            -- Serves reads of one version in id order (and pages after an id): the scan follows entry_id within the
            -- dataset and tests visibility from the index alone, touching the table only for visible rows.
            CREATE UNIQUE INDEX entries_by_id_and_range
                ON entries (dataset_id, entry_id, first_version, last_version_exclusive);

            -- The open rows are the latest version: at most one per id, and the lookup a replace needs.
            CREATE UNIQUE INDEX entries_open_by_id
                ON entries (dataset_id, entry_id) WHERE last_version_exclusive IS NULL;
            """),
        new(2, "per-version content fingerprint (SHA-256), filled in on first request", """
            ALTER TABLE dataset_versions ADD COLUMN content_sha256 TEXT NULL;
            """),
        new(3, "import sessions: batches staged apart from the entries, committed together as one version", """
            -- An open import: its batches wait in a table of its own, staged_<session_key>, invisible to every read,
            -- until the commit moves them into entries as one version and drops the table. A table per session keeps
            -- staging to plain appends (no index to maintain) and makes removal one DROP. Expired sessions are removed
            -- with their tables (times in Unix milliseconds, compared as numbers).
            CREATE TABLE import_sessions (
                session_key       INTEGER PRIMARY KEY AUTOINCREMENT,
                session_id        TEXT NOT NULL UNIQUE,
                dataset_id        INTEGER NOT NULL REFERENCES datasets (dataset_id) ON DELETE CASCADE,
                duplicate_policy  TEXT NOT NULL CHECK (duplicate_policy IN ('reject', 'replace')),
                source_label      TEXT NOT NULL,
                note              TEXT NOT NULL,
                started_at_utc    TEXT NOT NULL,
                expires_at_ms     INTEGER NOT NULL,
                staged_count      INTEGER NOT NULL DEFAULT 0
            );

            CREATE INDEX import_sessions_by_dataset ON import_sessions (dataset_id);
            """),
        new(4, "defect studies: immutable versions of a study file kept as given, per dataset", """
            -- Each import of a study name adds a version; a version is never changed, so old versions answer as
            -- before. The study file's texts are kept exactly as given so that an export returns the same bytes.
            CREATE TABLE defect_studies (
                dataset_id        INTEGER NOT NULL REFERENCES datasets (dataset_id) ON DELETE CASCADE,
                study_name        TEXT NOT NULL CHECK (length(study_name) > 0),
                study_version     INTEGER NOT NULL CHECK (study_version >= 1),
                committed_at_utc  TEXT NOT NULL,
                source_label      TEXT NOT NULL,
                note              TEXT NOT NULL,
                study_json        TEXT NOT NULL,
                charge_states_csv TEXT NOT NULL,
                content_sha256    TEXT NOT NULL,
                PRIMARY KEY (dataset_id, study_name, study_version)
            ) WITHOUT ROWID;
            """),
        new(5, "temperature models of entries: a standard entropy or a G(T) table, versioned with their entry row", """
            -- A model belongs to one entry row and shares its visibility range: a replace closes the old row with its
            -- model and the new row brings its own (or none); rows deleted with a version take their models along.
            -- Exactly one kind per row: S° (J/(mol K) per formula unit), or a G(T) − H(anchor) table (eV per formula unit) with
            -- the anchor it is counted on, as 16-byte points (temperature K, free energy eV; binary64 little-endian).
            -- formula is the formula unit the values refer to as given ('' for the entry's own).
            CREATE TABLE entry_temperature_models (
                row_id                       INTEGER PRIMARY KEY REFERENCES entries (row_id) ON DELETE CASCADE,
                formula                      TEXT NOT NULL,
                standard_entropy_j_per_mol_k REAL NULL
                    CHECK (standard_entropy_j_per_mol_k >= 0 AND standard_entropy_j_per_mol_k <= 1.7976931348623157e308),
                free_energy_anchor           TEXT NULL CHECK (free_energy_anchor IN ('computed_0k', 'fitted_298k')),
                free_energy_points           BLOB NULL
                    CHECK (length(free_energy_points) >= 32 AND length(free_energy_points) % 16 = 0),
                CHECK ((standard_entropy_j_per_mol_k IS NULL) = (free_energy_anchor IS NOT NULL)),
                CHECK ((free_energy_anchor IS NULL) = (free_energy_points IS NULL))
            );
            """),
        new(6, "energy uncertainty per entry: sigma (eV/atom) and correlation group, versioned with the entry row", """
            -- NULL for entries without an error bar; rows keep their visibility ranges, so each version keeps its own.
            ALTER TABLE entries ADD COLUMN energy_sigma_ev_per_atom REAL NULL
                CHECK (energy_sigma_ev_per_atom IS NULL OR energy_sigma_ev_per_atom >= 0);
            ALTER TABLE entries ADD COLUMN correlation_group TEXT NULL
                CHECK (correlation_group IS NULL OR length(correlation_group) > 0);
            """),
        new(7, "energy corrections: an entry's method tag, stored correction sets, and the set each derived version used", """
            -- NULL for an untagged entry (the base method of any set); versioned with the entry row like sigma.
            ALTER TABLE entries ADD COLUMN method TEXT NULL CHECK (method IS NULL OR length(method) > 0);

            -- A correction set is kept as the JSON body it was given; (name, version) names it once and for all.
            CREATE TABLE correction_sets (
                set_name      TEXT NOT NULL CHECK (length(set_name) > 0),
                set_version   INTEGER NOT NULL CHECK (set_version >= 1),
                stored_at_utc TEXT NOT NULL,
                set_json      TEXT NOT NULL,
                PRIMARY KEY (set_name, set_version)
            ) WITHOUT ROWID;

            -- Which set a version was derived with, and from which version of the same dataset; written in the
            -- commit that issues the version, so a version has its record from the start or never.
            CREATE TABLE version_corrections (
                dataset_id     INTEGER NOT NULL,
                version        INTEGER NOT NULL,
                set_name       TEXT NOT NULL,
                set_version    INTEGER NOT NULL,
                source_version INTEGER NOT NULL CHECK (source_version >= 1),
                PRIMARY KEY (dataset_id, version),
                FOREIGN KEY (dataset_id, version) REFERENCES dataset_versions (dataset_id, version) ON DELETE CASCADE,
                FOREIGN KEY (set_name, set_version) REFERENCES correction_sets (set_name, set_version)
            ) WITHOUT ROWID;

            -- An import session that derives a corrected version carries its record until the commit moves it.
            ALTER TABLE import_sessions ADD COLUMN correction_set_name TEXT NULL;
            ALTER TABLE import_sessions ADD COLUMN correction_set_version INTEGER NULL;
            ALTER TABLE import_sessions ADD COLUMN correction_source_version INTEGER NULL;
            """),
        new(8, "curation records: the recipe a derived version was made by, its source version and per-step counts", """
            -- One row per derived version, written in the transaction that commits it: the session carries the record
            -- until then (curation_record), so a failed or cancelled derivation leaves neither version nor record.
            -- recipe_json is the recipe file's text; steps_json the per-step kinds, parameters and counts.
            CREATE TABLE curation_records (
                dataset_id     INTEGER NOT NULL,
                version        INTEGER NOT NULL,
                source_dataset TEXT NOT NULL,
                source_version INTEGER NOT NULL CHECK (source_version >= 1),
                source_sha256  TEXT NOT NULL,
                recipe_json    TEXT NOT NULL,
                steps_json     TEXT NOT NULL,
                PRIMARY KEY (dataset_id, version),
                FOREIGN KEY (dataset_id, version) REFERENCES dataset_versions (dataset_id, version) ON DELETE CASCADE
            ) WITHOUT ROWID;
            ALTER TABLE import_sessions ADD COLUMN curation_record TEXT NULL;
            """),
    ];

    /// <summary>The newest schema version this build knows.</summary>
    public static int LatestVersion => Migrations[^1].Version;
}
