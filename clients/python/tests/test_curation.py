"""Curated versions through the client: a recipe file run on a version, the above-hull step against Qhull's lower
hull of the same entries, the recorded recipe run again to the same fingerprint, the CLI's view of the record, and
refusals that name the step and field with the version list unchanged."""

import json

import pytest

from conftest import DEMO, cli_json
from hullclient import read_entries
from hullclient.errors import InvalidArgumentError, NotFoundError
from reference_hull import LowerHull, formation_energies

RAW = DEMO / "curation" / "raw-li-co-o.csv"
RECIPE = DEMO / "curation" / "clean.recipe.json"


@pytest.fixture(scope="module")
def raw(client):
    client.import_table("curation-raw", RAW, create=True)
    return "curation-raw"


def test_above_hull_step_drops_what_qhull_puts_above_the_threshold(client, raw):
    recipe = {"recipe_schema": 1, "steps": [{"kind": "drop_energy_outside", "min_ev_per_atom": -5, "max_ev_per_atom": 5},
                                            {"kind": "drop_above_hull", "max_ev_per_atom": 0.1}]}
    curated = client.curate_version(raw, recipe, source_version=1)
    kept = set(client.export_entries(raw, version=curated.dataset_version).id)

    # The reference: the entries within the energy range (none lies within 0.04 eV/atom of the threshold), hulled by Qhull over Li-Co-O (scipy.spatial.ConvexHull).
    entries = read_entries(RAW)
    in_range = entries[entries.energy_ev.between(-5, 5)]
    formation = formation_energies(in_range)
    hull = LowerHull(["Li", "Co", "O"], list(formation.values()))
    above = {i: e - hull.energy_at(hull.fractions(c)) for i, (c, e) in formation.items()}
    assert kept == {i for i, a in above.items() if a <= 0.1}
    assert len(kept) < len(in_range)  # the threshold removes something
    steps = curated.record.steps
    assert list(steps.removed_count) == [len(entries) - len(in_range), len(in_range) - len(kept)]


def test_the_recorded_recipe_reproduces_the_version_and_the_cli_shows_the_same_record(client, server, raw, tmp_path):
    first = client.curate_version(raw, str(RECIPE), source_version=1, note="clean")
    record = client.get_curation_record(raw, first.dataset_version)
    assert (record.source_dataset, record.source_version) == (raw, 1)
    assert record.source_sha256 == client.get_stable_phases(raw, version=1).attrs["used"].content_sha256
    assert list(record.steps.kind) == [s["kind"] for s in json.loads(RECIPE.read_text())["steps"]]
    assert record.steps.parameters[0] == {"flag": "flagged"}

    saved = tmp_path / "recipe.json"
    record.save_recipe(saved)
    again = client.curate_version(raw, saved, source_version=1)
    assert again.dataset_version == first.dataset_version + 1
    assert again.content_sha256 == first.content_sha256
    assert again.content_sha256 == client.get_stable_phases(raw, version=again.dataset_version).attrs["used"].content_sha256

    shown = cli_json(server.url, "curate", raw, "--version", str(first.dataset_version), "--save-recipe", str(tmp_path / "cli.json"))
    assert [int(s.get("removed_count", 0)) for s in shown["steps"]] == list(record.steps.removed_count)
    assert (tmp_path / "cli.json").read_text() == saved.read_text()
    described = client.describe_dataset(raw)
    assert described.dataset.latest_version == again.dataset_version


def test_refusals_name_step_and_field_and_store_nothing(client, raw):
    before = list(client.list_versions(raw).version)
    with pytest.raises(InvalidArgumentError) as typo:
        client.curate_version(raw, {"recipe_schema": 1, "steps": [{"kind": "drop_flagged"}, {"kind": "drop_above_hull", "max_ev_per_atm": 0.1}]})
    assert typo.value.field_violations[0].field == "recipe_json.steps[1].max_ev_per_atm"
    assert "recipe step 2" in typo.value.message
    with pytest.raises(InvalidArgumentError) as kind:
        client.curate_version(raw, {"recipe_schema": 1, "steps": [{"kind": "drop_everything"}]})
    assert kind.value.field_violations[0].field == "recipe_json.steps[0].kind"
    with pytest.raises(NotFoundError):
        client.curate_version(raw, str(RECIPE), source_version=99)
    with pytest.raises(NotFoundError):
        client.get_curation_record(raw, 1)
    assert list(client.list_versions(raw).version) == before
