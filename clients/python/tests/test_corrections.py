"""Energy corrections from Python: a set stored from its file, a corrected version derived from the demo's two-method
mixture, every answer on it naming the set, equal to the CLI's JSON for the same requests; the shifts checked against
values worked in the test from the input files."""

import json

import pandas as pd
import pytest

from conftest import DEMO, cli_json
from hullclient.errors import HullError

MIXTURE = DEMO / "corrections" / "two-methods.csv"
SET_FILE = DEMO / "corrections" / "demo-mix.json"


@pytest.fixture(scope="module")
def mixed(client):
    client.import_table("mixed-py", MIXTURE, create=True)
    return "mixed-py"


def test_a_set_is_stored_listed_and_read_back_as_given(client, server):
    stored = client.put_correction_set(SET_FILE)
    assert (stored.name, stored.version, stored.method_rule_count) == ("demo-mix", 1, 1)
    assert client.get_correction_set("demo-mix", 1).set_json == SET_FILE.read_text(encoding="utf-8")
    listed = client.list_correction_sets()
    assert ("demo-mix", 1) in set(zip(listed.name, listed.version))
    expected = cli_json(server.url, "corrections", "list")
    assert [(s["name"], int(s["version"])) for s in expected["sets"]] == list(zip(listed.name, listed.version))


def test_a_derived_version_names_its_set_and_moves_entries_as_worked_from_the_files(client, server, mixed):
    client.put_correction_set(SET_FILE)
    shifts = client.derive_corrected_version(mixed, stored=("demo-mix", 1))
    used = shifts.attrs["used"]
    assert (used.version, used.corrections.set_name, used.corrections.set_version, used.corrections.source_version) == (2, "demo-mix", 1, 1)

    # Worked from the files: gga+u is aligned on LiCoO2 (4 atoms), so its shift is the two LiCoO2 energies' difference
    # per atom; O2's fitted reference moves it from its own energy per atom to the set's value.
    raw = pd.read_csv(MIXTURE, comment="#").set_index("id")
    document = json.loads(SET_FILE.read_text(encoding="utf-8"))
    align = (raw.loc["LiCoO2", "energy_ev"] - raw.loc["LiCoO2-u", "energy_ev"]) / 4
    fitted_o = document["fitted_references"][0]["energy_ev_per_atom"]
    by_id = shifts.set_index("entry_id")
    assert by_id.loc["CoO-u", "method_shift_ev_per_atom"] == pytest.approx(align, abs=1e-12)
    assert by_id.loc["O2", "reference_shift_ev_per_atom"] == pytest.approx(fitted_o - raw.loc["O2", "energy_ev"] / 2, abs=1e-12)
    # An oxide's oxygen shift per atom of the entry: s x n_O / N, CoO: -0.03 x 1/2.
    assert by_id.loc["CoO-u", "species_shift_ev_per_atom"] == pytest.approx(-0.03 / 2, abs=1e-12)

    corrected = client.get_stable_phases(mixed, "Li-Co-O")
    assert corrected.attrs["used"].corrections.set_name == "demo-mix"
    assert client.get_stable_phases(mixed, "Li-Co-O", version=1).attrs["used"].corrections is None
    expected = cli_json(server.url, "stable", mixed, "--system", "Li-Co-O")
    assert expected["used"]["corrections"]["set_name"] == "demo-mix"
    assert [p["phase_id"] for p in expected["phases"]] == list(corrected.phase_id)
    assert [p.get("formation_energy_ev_per_atom", 0.0) for p in expected["phases"]] == list(corrected.formation_energy_ev_per_atom)
    assert client.export_entries(mixed).set_index("id").loc["CoO-u", "method"] == "gga+u"


def test_a_set_naming_an_absent_element_is_refused_and_nothing_is_written(client, mixed):
    before = client.describe_dataset(mixed)
    bad = {"set_schema": 1, "name": "py-bad", "version": 1, "base_method": "gga",
           "method_rules": [{"method": "gga+u", "shift_ev_per_atom": 0.1}],
           "species_shifts": [{"element": "F", "applies_to": "with_metal", "shift_ev_per_atom": -0.4}]}
    with pytest.raises(HullError) as refused:
        client.derive_corrected_version(mixed, set_json=bad)
    assert "element F" in str(refused.value)
    assert len(client.describe_dataset(mixed).versions) == len(before.versions)
    assert "py-bad" not in set(client.list_correction_sets().name)


def test_version_lists_say_which_versions_hold_corrected_energies_as_the_cli_does(client, server):
    client.import_table("mixed-py-versions", MIXTURE, create=True)
    client.put_correction_set(SET_FILE)
    client.derive_corrected_version("mixed-py-versions", stored=("demo-mix", 1))
    recipe = {"recipe_schema": 1, "steps": [{"kind": "apply_correction_set", "set_name": "demo-mix", "set_version": 1}]}
    curated = client.curate_version("mixed-py-versions", recipe, source_version=1)
    assert (curated.dataset_version, curated.corrections.set_name, curated.corrections.source_version) == (3, "demo-mix", 1)
    # The same set applied to the same source version: the same content, by either road.
    listed = client.list_versions("mixed-py-versions")
    assert list(listed.correction_set_name) == ["", "demo-mix", "demo-mix"]
    assert listed.correction_set_version.isna().tolist() == [True, False, False]
    assert list(listed.corrected_from_version.dropna()) == [1, 1]
    described = client.describe_dataset("mixed-py-versions").versions
    assert described[["correction_set_name", "corrected_from_version"]].equals(listed[["correction_set_name", "corrected_from_version"]])
    expected = cli_json(server.url, "datasets", "show", "mixed-py-versions")
    assert [v.get("corrections", {}).get("set_name", "") for v in expected["versions"]] == list(listed.correction_set_name)
    assert client.get_stable_phases("mixed-py-versions", "Li-Co-O", version=3).attrs["used"].content_sha256 == \
        client.get_stable_phases("mixed-py-versions", "Li-Co-O", version=2).attrs["used"].content_sha256


def test_an_older_version_is_corrected_into_a_version_holding_its_entries_only(client):
    client.import_table("mixed-py-older", MIXTURE, create=True)
    client.put_correction_set(SET_FILE)
    first = client.derive_corrected_version("mixed-py-older", stored=("demo-mix", 1))
    extra = pd.DataFrame([{"id": "Li2O2", "formula": "Li2O2", "energy_ev": -18.6, "basis": "total_per_formula_unit",
                           "note": "peroxide", "method": "gga"}])
    client.import_entries("mixed-py-older", extra, on_duplicate="replace")
    older = client.derive_corrected_version("mixed-py-older", stored=("demo-mix", 1), source_version=1)
    used = older.attrs["used"]
    assert (used.version, used.corrections.source_version) == (4, 1)
    # The set applied to version 1 again: the content of version 2, not of the latest with its peroxide.
    assert used.content_sha256 == first.attrs["used"].content_sha256
    assert "Li2O2" not in set(client.export_entries("mixed-py-older", version=4).id)
    assert client.get_curation_record("mixed-py-older", 4).steps.kind.tolist() == ["apply_correction_set"]
