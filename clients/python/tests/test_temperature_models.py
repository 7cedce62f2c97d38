"""Temperature models of entries through the client: DataFrame columns and G(T) tables go in with the entries,
come back from export_entries in every version as they went in, match the CLI's export of the same store, and bad
models are refused naming the row before anything is written."""

import math
import uuid

import pandas as pd
import pytest

from conftest import cli_json, run_cli
from hullclient import EntryInputError, InvalidArgumentError, read_entries, write_entries, write_free_energy_tables

# NBS Tables of Chemical Thermodynamic Properties (Wagman et al., 1982) — from memory: S°(298.15 K) of Ag2O(s)
# 121.3, Ag(s) 42.55 J/(mol K); ΔfH°(Ag2O) = −31.05 kJ/mol = −0.3218 eV per formula unit (÷ 96.485 kJ/mol per eV).
SILVER_OXIDE_ENTROPY = 121.3
SILVER_ENTROPY = 42.55
FARADAY = 1.602176634e-19 * 6.02214076e23  # J/mol per eV per formula unit: e N_A, CODATA 2018 (exact)


def ellingham_points(temperatures):
    """G(T) − H°(298.15 K) = −T S° of Ag2O with S° held constant (the Ellingham approximation), eV per formula unit."""
    return [{"temperature_k": t, "free_energy_above_anchor_ev": -t * SILVER_OXIDE_ENTROPY / FARADAY} for t in temperatures]


def silver_frame():
    return pd.DataFrame({
        "id": ["ag", "ag2o", "ag2o-table", "o2"],
        "formula": ["Ag", "Ag2O", "Ag2O", "O2"],
        "energy_ev": [0.0, -0.3218, -0.3218, 0.0],
        "basis": ["formation_per_atom", "formation_per_formula_unit", "formation_per_formula_unit", "formation_per_atom"],
        "note": ["", "", "", ""],
        "standard_entropy_j_per_mol_k": [SILVER_ENTROPY, SILVER_OXIDE_ENTROPY, math.nan, math.nan],
        "temperature_model_formula": ["", "Ag2O", "", ""],
        "free_energy_table": [None, None, {"anchor": "fitted_298k", "rows": ellingham_points([300.0, 500.0, 700.0])}, None],
    })


def test_the_ellingham_points_are_the_hand_worked_values():
    # −300 K × 121.3 J/(mol K) / 96485.33212 C/mol = −0.377156 eV, by hand
    assert ellingham_points([300.0])[0]["free_energy_above_anchor_ev"] == pytest.approx(-0.377156, abs=5e-7)


def test_a_frame_with_models_round_trips_through_versions_and_matches_the_cli(client, server):
    client.create_dataset("silver-models")
    frame = silver_frame()
    assert client.import_table("silver-models", frame, batch_size=2).dataset_version == 1
    exported = client.export_entries("silver-models")
    pd.testing.assert_frame_equal(exported, frame)

    # A replace brings the new row's model; the old version keeps the old one.
    replacement = frame.iloc[[1]].copy()
    replacement["standard_entropy_j_per_mol_k"] = math.nan
    replacement["temperature_model_formula"] = ""
    replacement["free_energy_table"] = [{"anchor": "computed_0k", "rows": ellingham_points([250.0, 900.0])}]
    client.import_entries("silver-models", replacement, on_duplicate="replace")
    pd.testing.assert_frame_equal(client.export_entries("silver-models", version=1), frame)
    latest = client.export_entries("silver-models").set_index("id")
    assert math.isnan(latest.loc["ag2o", "standard_entropy_j_per_mol_k"])
    assert latest.loc["ag2o", "free_energy_table"]["anchor"] == "computed_0k"
    assert latest.loc["ag", "standard_entropy_j_per_mol_k"] == SILVER_ENTROPY

    # The CLI reads the same store and says the same, number for number.
    theirs = {e["id"]: e for e in cli_json(server.url, "export", "silver-models", "--version", "1")["entries"]}
    assert theirs["ag"]["standard_entropy_j_per_mol_k"] == SILVER_ENTROPY
    assert theirs["ag2o"]["temperature_model_formula"] == "Ag2O"
    assert theirs["ag2o-table"]["free_energy_table"] == frame.loc[2, "free_energy_table"]
    assert "standard_entropy_j_per_mol_k" not in theirs["o2"] and "free_energy_table" not in theirs["o2"]

    # The export imports again unchanged, to the same content fingerprint.
    client.create_dataset("silver-again")
    client.import_entries("silver-again", client.export_entries("silver-models", version=1))
    pd.testing.assert_frame_equal(client.export_entries("silver-again"), frame)

    def fingerprint(dataset, version=0):
        return client.get_stable_phases(dataset, version=version).attrs["used"].content_sha256

    assert fingerprint("silver-again") == fingerprint("silver-models", 1)
    assert fingerprint("silver-models", 2) != fingerprint("silver-models", 1)


def test_tables_given_apart_are_attached_to_their_entries(client, tmp_path):
    frame = silver_frame().drop(columns=["free_energy_table"])
    tables = pd.DataFrame([{"entry_id": "ag2o-table", "anchor": "fitted_298k", **p} for p in ellingham_points([300.0, 500.0, 700.0])])
    client.create_dataset("silver-apart")
    client.import_table("silver-apart", frame, free_energy_tables=tables)
    pd.testing.assert_frame_equal(client.export_entries("silver-apart"), silver_frame())

    # Files: the JSON entry file nests the tables, the CSV needs a table file beside it; the CLI imports both.
    exported = client.export_entries("silver-apart")
    as_json = write_entries(exported, tmp_path / "silver.json")
    pd.testing.assert_frame_equal(read_entries(as_json), exported)
    with pytest.raises(EntryInputError, match="G\\(T\\) tables do not fit in a CSV entry file"):
        write_entries(exported, tmp_path / "silver.csv")
    assert not (tmp_path / "silver.csv").exists()
    table_csv = write_free_energy_tables(exported, tmp_path / "tables.csv")
    entries_csv = write_entries(exported.drop(columns=["free_energy_table"]), tmp_path / "silver.csv")
    client.create_dataset("silver-files")
    client.import_table("silver-files", entries_csv, free_energy_tables=table_csv)
    pd.testing.assert_frame_equal(client.export_entries("silver-files"), exported)


def test_the_cli_imports_what_the_client_writes(client, server, tmp_path):
    exported = silver_frame()
    as_json = write_entries(exported, tmp_path / "for-cli.json")
    run_cli(server.url, "import", "silver-cli", str(as_json), "--create")
    pd.testing.assert_frame_equal(client.export_entries("silver-cli"), exported)


@pytest.mark.parametrize("column, value, message", [
    ("both", None, "both 'standard_entropy_j_per_mol_k' and 'free_energy_table' are given; an entry has one temperature model"),
    ("standard_entropy_j_per_mol_k", "warm", "'warm' is not a finite number of J/(mol K)"),
    ("free_energy_table", {"anchor": "room", "rows": []}, "anchor 'room' is not one of computed_0k, fitted_298k"),
    ("free_energy_table", {"anchor": "fitted_298k", "rows": [{"temperature_k": "hot", "free_energy_above_anchor_ev": 0}]},
     "'hot' is not a finite number of K"),
    ("temperature_model_formula", "Ag2O", "the temperature-model formula 'Ag2O' is given but the entry has neither"),
])
def test_bad_cells_are_refused_here_naming_the_row(client, column, value, message):
    frame = silver_frame().set_index(pd.Index(["a", "b", "c", "d"]))
    if column == "both":
        frame.at["b", "free_energy_table"] = {"anchor": "fitted_298k", "rows": ellingham_points([300.0, 400.0])}
    else:
        frame.at["d", column] = value
    with pytest.raises(EntryInputError) as caught:
        client.import_table("never-made", frame)
    assert message in str(caught.value)
    assert "DataFrame row" in caught.value.where


@pytest.mark.parametrize("change, field, message", [
    ({"standard_entropy_j_per_mol_k": -1.0}, "temperature_model.standard_entropy_j_per_mol_k",
     "The standard entropy of Ag2O must be finite and not negative"),
    ({"free_energy_table": {"anchor": "fitted_298k", "rows": ellingham_points([300.0])}, "standard_entropy_j_per_mol_k": math.nan},
     "temperature_model.free_energy_table.rows", "needs at least two rows"),
    ({"free_energy_table": {"anchor": "fitted_298k", "rows": ellingham_points([500.0, 300.0])}, "standard_entropy_j_per_mol_k": math.nan},
     "temperature_model.free_energy_table.rows", "Row 1 of the tabulated free energy of Ag2O is at 300 K, not above row 0 (500 K)"),
    ({"free_energy_table": {"anchor": "fitted_298k", "rows": ellingham_points([300.0, 300.0])}, "standard_entropy_j_per_mol_k": math.nan},
     "temperature_model.free_energy_table.rows", "not above row 0 (300 K)"),
    ({"free_energy_table": {"anchor": "computed_0k", "rows": ellingham_points([0.0, 300.0])}, "standard_entropy_j_per_mol_k": math.nan},
     "temperature_model.free_energy_table.rows", "temperatures must be above 0 K"),
    ({"temperature_model_formula": "AgO"}, "temperature_model.formula", "Entry 'ag2o' is Ag2O, but its temperature model"),
])
def test_models_the_server_refuses_name_the_row_and_write_nothing(client, change, field, message):
    name = f"refused-{uuid.uuid4().hex[:12]}"
    client.create_dataset(name)
    frame = silver_frame().set_index(pd.Index(["a", "b", "c", "d"]))
    for column, value in change.items():
        frame.at["b", column] = value
    with pytest.raises(InvalidArgumentError) as caught:
        client.import_table(name, frame, batch_size=3)
    assert caught.value.rows == ("DataFrame row 'b'",)
    assert any(v.field.endswith(field) and message in v.description for v in caught.value.field_violations)
    assert client.describe_dataset(name).dataset.latest_version == 0
