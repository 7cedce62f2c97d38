using Hull.Store.Sqlite;

namespace Hull.Store.Postgres;

/// <summary>
/// The PostgreSQL layout: the same steps, numbered as in <see cref="Schema"/> (SQLite), with the same tables and
/// columns in PostgreSQL's types, so that schema version N means the same layout in both. A released step is never
/// edited. Two things differ on purpose: ids and keys sort and compare by code point (COLLATE "C", which is the order
/// of <see cref="EntryIdOrder"/> and of SQLite's BINARY collation), and step 1 adds <c>store_commits</c>, the one row
/// that every write transaction updates first: its row lock queues writers one at a time (as SQLite's write lock
/// does), and its generation is the change signal of the latest-version memory.
/// </summary>
internal static class PostgresSchema
{
    private const string Bases = "'total_per_formula_unit', 'total_per_atom', 'formation_per_formula_unit', 'formation_per_atom'";

    public static IReadOnlyList<Migration> Migrations { get; } =
    [
        new(1, "datasets, versions with provenance, entry rows with visibility ranges", $"""
            CREATE TABLE schema_version (
                version        integer PRIMARY KEY,
                description    text NOT NULL,
                applied_at_utc text NOT NULL
            );

            CREATE TABLE store_commits (
                only_row   boolean PRIMARY KEY DEFAULT true CHECK (only_row),
                generation bigint NOT NULL
            );
            INSERT INTO store_commits (only_row, generation) VALUES (true, 0);

            -- An identity never gives a deleted dataset's id to a new one.
            CREATE TABLE datasets (
                dataset_id          bigint GENERATED ALWAYS AS IDENTITY PRIMARY KEY,
                name                text COLLATE "C" NOT NULL UNIQUE,
                description         text NOT NULL,
                created_at_utc      text NOT NULL,
                last_version_issued bigint NOT NULL DEFAULT 0
            );

            CREATE TABLE dataset_versions (
                dataset_id        bigint NOT NULL REFERENCES datasets (dataset_id) ON DELETE CASCADE,
                version           bigint NOT NULL CHECK (version >= 1),
                committed_at_utc  text NOT NULL,
                source_label      text NOT NULL,
                note              text NOT NULL,
                batch_entry_count integer NOT NULL,
                inserted          integer NOT NULL,
                replaced          integer NOT NULL,
                entry_count       bigint NOT NULL,
                deleted_at_utc    text NULL,
                PRIMARY KEY (dataset_id, version)
            );

            CREATE TABLE entries (
                row_id                 bigint GENERATED ALWAYS AS IDENTITY PRIMARY KEY,
                dataset_id             bigint NOT NULL REFERENCES datasets (dataset_id) ON DELETE CASCADE,
                entry_id               text COLLATE "C" NOT NULL CHECK (length(entry_id) > 0),
                formula                text NOT NULL,
                energy_ev              double precision NOT NULL CHECK (abs(energy_ev) <= 1.7976931348623157e308),
                energy_basis           text NOT NULL CHECK (energy_basis IN ({Bases})),
                metadata               text NOT NULL,
                first_version          bigint NOT NULL,
                last_version_exclusive bigint NULL,
                CHECK (last_version_exclusive IS NULL OR last_version_exclusive > first_version)
            );

            CREATE UNIQUE INDEX entries_by_id_and_range
                ON entries (dataset_id, entry_id, first_version, last_version_exclusive);

            CREATE UNIQUE INDEX entries_open_by_id
                ON entries (dataset_id, entry_id) WHERE last_version_exclusive IS NULL;
            """),
        new(2, "per-version content fingerprint (SHA-256), filled in on first request", """
            ALTER TABLE dataset_versions ADD COLUMN content_sha256 text NULL;
            """),
        new(3, "import sessions: batches staged apart from the entries, committed together as one version", """
            CREATE TABLE import_sessions (
                session_key       bigint GENERATED ALWAYS AS IDENTITY PRIMARY KEY,
                session_id        text NOT NULL UNIQUE,
                dataset_id        bigint NOT NULL REFERENCES datasets (dataset_id) ON DELETE CASCADE,
                duplicate_policy  text NOT NULL CHECK (duplicate_policy IN ('reject', 'replace')),
                source_label      text NOT NULL,
                note              text NOT NULL,
                started_at_utc    text NOT NULL,
                expires_at_ms     bigint NOT NULL,
                staged_count      bigint NOT NULL DEFAULT 0
            );

            CREATE INDEX import_sessions_by_dataset ON import_sessions (dataset_id);
            """),
        new(4, "defect studies: immutable versions of a study file kept as given, per dataset", """
            CREATE TABLE defect_studies (
                dataset_id        bigint NOT NULL REFERENCES datasets (dataset_id) ON DELETE CASCADE,
                study_name        text COLLATE "C" NOT NULL CHECK (length(study_name) > 0),
                study_version     bigint NOT NULL CHECK (study_version >= 1),
                committed_at_utc  text NOT NULL,
                source_label      text NOT NULL,
                note              text NOT NULL,
                study_json        text NOT NULL,
                charge_states_csv text NOT NULL,
                content_sha256    text NOT NULL,
                PRIMARY KEY (dataset_id, study_name, study_version)
            );
            """),
        new(5, "temperature models of entries: a standard entropy or a G(T) table, versioned with their entry row", """
            -- As in SQLite's step 5: one model per entry row, sharing its visibility range; the points are 16 bytes
            -- each (temperature K, free energy eV; binary64 little-endian).
            CREATE TABLE entry_temperature_models (
                row_id                       bigint PRIMARY KEY REFERENCES entries (row_id) ON DELETE CASCADE,
                formula                      text NOT NULL,
                standard_entropy_j_per_mol_k double precision NULL
                    CHECK (standard_entropy_j_per_mol_k >= 0 AND standard_entropy_j_per_mol_k <= 1.7976931348623157e308),
                free_energy_anchor           text NULL CHECK (free_energy_anchor IN ('computed_0k', 'fitted_298k')),
                free_energy_points           bytea NULL
                    CHECK (length(free_energy_points) >= 32 AND length(free_energy_points) % 16 = 0),
                CHECK ((standard_entropy_j_per_mol_k IS NULL) = (free_energy_anchor IS NOT NULL)),
                CHECK ((free_energy_anchor IS NULL) = (free_energy_points IS NULL))
            );
            """),
        new(6, "energy uncertainty per entry: sigma (eV/atom) and correlation group, versioned with the entry row", """
            -- As in SQLite's step 6: two columns of the entry row, NULL for entries without an error bar.
            ALTER TABLE entries ADD COLUMN energy_sigma_ev_per_atom double precision NULL
                CHECK (energy_sigma_ev_per_atom IS NULL OR energy_sigma_ev_per_atom >= 0);
            ALTER TABLE entries ADD COLUMN correlation_group text NULL
                CHECK (correlation_group IS NULL OR length(correlation_group) > 0);
            """),
        new(7, "energy corrections: an entry's method tag, stored correction sets, and the set each derived version used", """
            -- As in SQLite's step 7.
            ALTER TABLE entries ADD COLUMN method text NULL CHECK (method IS NULL OR length(method) > 0);

            CREATE TABLE correction_sets (
                set_name      text COLLATE "C" NOT NULL CHECK (length(set_name) > 0),
                set_version   bigint NOT NULL CHECK (set_version >= 1),
                stored_at_utc text NOT NULL,
                set_json      text NOT NULL,
                PRIMARY KEY (set_name, set_version)
            );

            CREATE TABLE version_corrections (
                dataset_id     bigint NOT NULL,
                version        bigint NOT NULL,
                set_name       text COLLATE "C" NOT NULL,
                set_version    bigint NOT NULL,
                source_version bigint NOT NULL CHECK (source_version >= 1),
                PRIMARY KEY (dataset_id, version),
                FOREIGN KEY (dataset_id, version) REFERENCES dataset_versions (dataset_id, version) ON DELETE CASCADE,
                FOREIGN KEY (set_name, set_version) REFERENCES correction_sets (set_name, set_version)
            );

            ALTER TABLE import_sessions ADD COLUMN correction_set_name text COLLATE "C" NULL;
            ALTER TABLE import_sessions ADD COLUMN correction_set_version bigint NULL;
            ALTER TABLE import_sessions ADD COLUMN correction_source_version bigint NULL;
            """),
        new(8, "curation records: the recipe a derived version was made by, its source version and per-step counts", """
            -- As in SQLite's step 8: one row per derived version, carried by its import session until the commit.
            CREATE TABLE curation_records (
                dataset_id     bigint NOT NULL,
                version        bigint NOT NULL,
                source_dataset text NOT NULL,
                source_version bigint NOT NULL CHECK (source_version >= 1),
                source_sha256  text NOT NULL,
                recipe_json    text NOT NULL,
                steps_json     text NOT NULL,
                PRIMARY KEY (dataset_id, version),
                FOREIGN KEY (dataset_id, version) REFERENCES dataset_versions (dataset_id, version) ON DELETE CASCADE
            );
            ALTER TABLE import_sessions ADD COLUMN curation_record text NULL;
            """),
    ];

    /// <summary>The newest schema version this build knows.</summary>
    public static int LatestVersion => Migrations[^1].Version;
}
