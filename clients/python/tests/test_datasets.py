"""Datasets, single-version imports, versions and export through the client, against the CLI's view of the same
store (consistency) and the content fingerprint the server computes."""

import json

import pandas as pd
import pytest

from conftest import DEMO_DATASET, ROUND1, ROUND2, cli_json, run_cli
from hullclient import read_entries, write_entries


def test_demo_import_makes_one_version_per_file_and_the_cli_sees_them(client, server, demo):
    assert demo == [1, 2, 3, 4]
    versions = client.list_versions(DEMO_DATASET, page_size=1)
    assert list(versions.version) == [1, 2, 3, 4]
    assert list(versions.source_label) == [p.name for p in ROUND1 + [ROUND2]]
    assert list(versions.replaced_count) == [0, 0, 0, 16]
    expected = cli_json(server.url, "versions", "list", DEMO_DATASET)
    assert [int(v["version"]) for v in expected["versions"]] == list(versions.version)
    assert [int(v["entry_count"]) for v in expected["versions"]] == list(versions.entry_count)
    described = client.describe_dataset(DEMO_DATASET)
    assert described.dataset.latest_version == 4
    assert described.dataset.entry_count == sum(len(read_entries(p)) for p in ROUND1)  # round 2 only replaces
    assert DEMO_DATASET in set(client.list_datasets(page_size=1).name)


def test_a_dataframe_import_in_batches_is_one_version_with_the_files_fingerprint(client, demo):
    frame = pd.concat([read_entries(p) for p in ROUND1], ignore_index=True)
    calls = []
    client.create_dataset("from-frame")
    result = client.import_table("from-frame", frame, batch_size=50, progress=lambda done, total: calls.append((done, total)))
    assert result.dataset_version == 1 and result.inserted_count == len(frame)
    assert calls[-1] == (len(frame), len(frame)) and len(calls) == -(-len(frame) // 50)
    # Equal content, equal fingerprint: the frame holds round 1, i.e. the demo dataset's version 3.
    here = client.get_stable_phases("from-frame").attrs["used"].content_sha256
    there = client.get_stable_phases(DEMO_DATASET, version=3).attrs["used"].content_sha256
    assert here == there


def test_export_imports_again_unchanged(client, demo):
    exported = client.export_entries(DEMO_DATASET, page_size=7)
    assert exported.attrs["version"] == 4
    # No entry of the demo dataset has a model or an uncertainty: the plain columns only.
    assert list(exported.columns) == ["id", "formula", "energy_ev", "basis", "note"]
    assert list(exported.id) == sorted(exported.id)
    client.create_dataset("round-trip")
    client.import_entries("round-trip", exported)
    again = client.export_entries("round-trip")
    pd.testing.assert_frame_equal(exported, again)
    assert client.get_stable_phases("round-trip").attrs["used"].content_sha256 == \
        client.get_stable_phases(DEMO_DATASET).attrs["used"].content_sha256


def test_session_calls_and_deletions(client, demo):
    client.create_dataset("sessions", "scratch")
    frame = read_entries(ROUND1[0])
    session = client.begin_import("sessions", source_label="by hand")
    assert session.staged_count == 0 and session.idle_expiry_seconds > 0 and session.expires_at is not None
    session = client.stage_entries(session.session_id, frame.iloc[:10])
    session = client.stage_entries(session.session_id, frame.iloc[10:])
    assert session.staged_count == len(frame)
    assert client.commit_import(session.session_id).dataset_version == 1
    cancelled = client.begin_import("sessions", on_duplicate="replace")
    client.stage_entries(cancelled.session_id, frame.iloc[:3])
    client.cancel_import(cancelled.session_id)
    assert list(client.list_versions("sessions").version) == [1]
    client.import_table("sessions", frame.iloc[:3], on_duplicate="replace")
    client.delete_version("sessions", 1)
    assert list(client.list_versions("sessions").version) == [2]
    client.delete_dataset("sessions")
    assert "sessions" not in set(client.list_datasets().name)


def test_import_table_create_makes_the_dataset(client, demo):
    result = client.import_table("created-on-import", ROUND1[2], create=True)
    assert result.dataset_version == 1
    assert client.describe_dataset("created-on-import").dataset.entry_count == len(read_entries(ROUND1[2]))


def test_limits_cache_counters_and_health(client, demo):
    assert client.health() == "SERVING"
    limits = client.get_server_limits()
    assert limits.max_components_per_system >= 5 and limits.max_compositions_per_request > 0
    before = client.get_cache_statistics()
    client.get_entry_stability(DEMO_DATASET, ["bin-CoO"])
    client.get_entry_stability(DEMO_DATASET, ["bin-CoO"])
    after = client.get_cache_statistics()
    assert after.hull_cache_hits > before.hull_cache_hits
    health = client.get_server_health()  # a lone server: its store usable, no cluster
    assert health.store_usable and health.store_problem == "" and health.store_location
    assert (health.cluster_name, health.active_members, health.member_status) == ("", 0, "")


@pytest.mark.parametrize("bad, where, problem", [
    (pd.DataFrame({"id": ["a"], "formula": ["Li"], "energy_ev": ["x"], "basis": ["total_per_atom"]}), "row 0", "energy_ev"),
    (pd.DataFrame({"id": ["a"], "formula": ["Li"], "energy_ev": [1.0], "basis": ["per_atom"]}), "row 0", "basis"),
    (pd.DataFrame({"id": ["a"], "formula": [""], "energy_ev": [1.0], "basis": ["total_per_atom"]}), "row 0", "formula"),
    (pd.DataFrame({"id": ["a"], "formula": ["Li"], "energy": [1.0], "basis": ["total_per_atom"]}), "DataFrame", "energy"),
    (pd.DataFrame({"id": ["a", None], "formula": ["Li", "O"], "energy_ev": [1.0, 2.0], "basis": ["total_per_atom"] * 2}),
     "row 1", "column 'id' is empty"),
])
def test_local_checks_name_the_row_and_column(client, bad, where, problem):
    from hullclient import EntryInputError
    with pytest.raises(EntryInputError) as caught:
        client.import_table("never-sent", bad)
    assert where in str(caught.value) and problem in str(caught.value)


def test_entry_file_errors_name_file_and_line(tmp_path):
    from hullclient import EntryInputError
    path = tmp_path / "bad.csv"
    path.write_text("# comment\nid,formula,energy_ev,basis\na,Li,-1.9,total_per_atom\nb,Co,oops,total_per_atom\n")
    with pytest.raises(EntryInputError, match=r"bad\.csv:4: column 'energy_ev'"):
        read_entries(path)
    repeated = tmp_path / "repeat.csv"
    repeated.write_text("id,formula,energy_ev,basis\na,Li,-1.9,total_per_atom\na,Li,-1.8,total_per_atom\n")
    from hullclient import HullClient
    with pytest.raises(EntryInputError, match=r"repeat\.csv:3: id 'a' repeats .*repeat\.csv:2"):
        HullClient("http://127.0.0.1:9").import_table("x", repeated)


def test_json_entry_files_in_both_layouts(tmp_path):
    from hullclient import EntryInputError
    rows = [{"id": "a", "formula": "Li", "energy_ev": -1.9, "basis": "total_per_atom", "note": "n"},
            {"id": "b", "formula": "Li2O", "energy_ev": -2.0, "basis": "formation_per_atom"}]
    wrapped, bare = tmp_path / "wrapped.json", tmp_path / "bare.json"
    wrapped.write_text(json.dumps({"entries": rows}))
    bare.write_text(json.dumps(rows))
    pd.testing.assert_frame_equal(read_entries(wrapped), read_entries(bare))
    assert list(read_entries(bare).note) == ["n", ""]
    odd = tmp_path / "odd.json"
    odd.write_text(json.dumps([{"id": "a", "formula": "Li", "energy_ev": 1, "basis": "total_per_atom", "colour": "red"}]))
    with pytest.raises(EntryInputError, match=r"odd\.json entries\[0\]: unknown field\(s\) colour"):
        read_entries(odd)


def test_a_refused_candidate_is_named(client, demo):
    from hullclient import InvalidArgumentError
    candidates = pd.DataFrame({"id": ["fine", "kj-as-ev"], "formula": ["LiCoO2", "LiCoO2"], "energy_ev": [-1.7, -170.0],
                               "basis": ["formation_per_atom"] * 2})
    with pytest.raises(InvalidArgumentError) as caught:
        client.assess_candidates(DEMO_DATASET, candidates)
    assert caught.value.rows == ("DataFrame row 1",)
    assert [v.field for v in caught.value.field_violations] == ["candidates[1].energy_ev"]


def test_an_interrupted_import_cancels_its_session_and_writes_nothing(client, demo):
    frame = read_entries(ROUND1[1])
    before = client.describe_dataset(DEMO_DATASET).dataset

    def interrupt(done, total):
        if done >= 100:
            raise KeyboardInterrupt  # as Ctrl+C in a notebook
    opened = []
    begin = client.begin_import

    def remember(*args, **kwargs):
        opened.append(begin(*args, **kwargs))
        return opened[-1]
    remember.hull_rpc = begin.hull_rpc
    client.begin_import = remember
    try:
        with pytest.raises(KeyboardInterrupt):
            client.import_table(DEMO_DATASET, frame.assign(id=frame.id + "-again"), batch_size=50, progress=interrupt)
    finally:
        del client.begin_import
    assert client.describe_dataset(DEMO_DATASET).dataset == before
    from hullclient import NotFoundError
    with pytest.raises(NotFoundError) as caught:
        client.commit_import(opened[0].session_id)
    assert caught.value.reason == "IMPORT_SESSION_NOT_FOUND"


@pytest.mark.parametrize("suffix", [".csv", ".json"])
def test_an_export_written_as_a_file_equals_the_cli_export_and_imports_again(client, server, demo, tmp_path, suffix):
    exported = client.export_entries(DEMO_DATASET, version=2)
    mine = write_entries(exported, tmp_path / f"mine{suffix}")
    theirs = tmp_path / f"cli{suffix}"
    run_cli(server.url, "export", DEMO_DATASET, "--version", "2", "--" + suffix[1:], "-o", str(theirs))
    # Read back through the same reader: every field, energies to the last bit.
    pd.testing.assert_frame_equal(read_entries(mine), read_entries(theirs))
    pd.testing.assert_frame_equal(read_entries(mine), exported)
    name = f"rewritten{suffix[1:]}"
    client.import_table(name, mine, create=True)
    assert client.get_stable_phases(name).attrs["used"].content_sha256 == \
        client.get_stable_phases(DEMO_DATASET, version=2).attrs["used"].content_sha256


def test_write_entries_refuses_a_bad_row_and_writes_nothing(tmp_path):
    from hullclient import EntryInputError
    bad = pd.DataFrame({"id": ["a"], "formula": ["Li"], "energy_ev": [float("inf")], "basis": ["total_per_atom"]})
    with pytest.raises(EntryInputError, match="row 0: column 'energy_ev'"):
        write_entries(bad, tmp_path / "bad.csv")
    assert not (tmp_path / "bad.csv").exists()
