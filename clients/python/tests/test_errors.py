"""Refusals arrive as the documented exceptions, with the server's reason code, message and field violations, and
with bad rows named as the user knows them (DataFrame index label, file line)."""

import socket

import pandas as pd
import pytest

from conftest import DEMO_DATASET, RunningServer, self_signed
from hullclient import (
    AlreadyExistsError,
    DeadlineExceededError,
    FailedPreconditionError,
    HullClient,
    InvalidArgumentError,
    NotFoundError,
    PermissionDeniedError,
    ResourceExhaustedError,
    UnavailableError,
)


def free_port():
    with socket.socket() as s:
        s.bind(("127.0.0.1", 0))
        return s.getsockname()[1]


def test_server_down_is_unavailable_naming_the_address():
    address = f"http://127.0.0.1:{free_port()}"
    with HullClient(address, timeout=10) as hull, pytest.raises(UnavailableError) as caught:
        hull.list_datasets()
    assert caught.value.address == address and address in str(caught.value)
    assert caught.value.method == "hull.v1.DatasetService/ListDatasets"
    with HullClient(address, timeout=10) as hull, pytest.raises(UnavailableError):
        hull.health()


def test_unknown_dataset_is_not_found_with_reason_and_resource(client, demo):
    with pytest.raises(NotFoundError) as caught:
        client.analyze_dataset("no-such-dataset")
    error = caught.value
    assert error.reason == "DATASET_NOT_FOUND" and error.domain == "hull.v1"
    assert error.metadata["dataset"] == "no-such-dataset" and error.resource_name == "no-such-dataset"
    assert "no-such-dataset" in error.message and "DATASET_NOT_FOUND" in str(error)


def test_unknown_entry_names_the_field(client, demo):
    with pytest.raises(NotFoundError) as caught:
        client.get_entry_stability(DEMO_DATASET, ["bin-CoO", "missing-id"])
    assert caught.value.reason == "ENTRY_NOT_FOUND"
    assert [v.field for v in caught.value.field_violations] == ["entry_ids[1]"]


def test_a_bad_dataframe_row_is_named_by_its_index_label_and_nothing_is_written(client, demo):
    frame = pd.DataFrame({"id": ["ok-1", "ok-2", "bad"], "formula": ["Li2O", "CoO", "LiXx2"],
                          "energy_ev": [-1.0, -1.0, -1.0], "basis": ["formation_per_atom"] * 3},
                         index=["first", "second", "third"])
    before = client.describe_dataset(DEMO_DATASET).dataset.latest_version
    with pytest.raises(InvalidArgumentError) as caught:
        client.import_table(DEMO_DATASET, frame, batch_size=2)
    error = caught.value
    assert error.reason == "INVALID_ENTRY"
    # The bad row is the first of the second batch (entries[0] of that call): named by its own label.
    assert error.rows == ("DataFrame row 'third'",)
    assert any(v.field.endswith(".formula") and "Xx" in v.description for v in error.field_violations)
    assert "row 'third'" in str(error)
    assert client.describe_dataset(DEMO_DATASET).dataset.latest_version == before


def test_a_bad_file_row_is_named_by_its_line(client, demo, tmp_path):
    path = tmp_path / "bad-row.csv"
    path.write_text("id,formula,energy_ev,basis\nx-1,Li2O,-2.0,formation_per_atom\nx-2,Li2O,-900,formation_per_atom\n")
    with pytest.raises(InvalidArgumentError) as caught:
        client.import_table(DEMO_DATASET, path)
    assert caught.value.rows == (f"{path}:3",)
    assert any("energy_ev" in v.field for v in caught.value.field_violations)


def test_an_existing_id_under_reject_is_already_exists(client, demo):
    frame = pd.DataFrame({"id": ["bin-CoO"], "formula": ["CoO"], "energy_ev": [-1.0], "basis": ["formation_per_atom"]})
    with pytest.raises(AlreadyExistsError) as caught:
        client.import_table(DEMO_DATASET, frame)
    assert caught.value.reason == "ENTRY_ID_EXISTS" and caught.value.rows == ("DataFrame row 0",)
    with pytest.raises(AlreadyExistsError, match="DATASET_EXISTS"):
        client.create_dataset(DEMO_DATASET)


def test_a_bad_dataset_name_is_invalid_argument(client):
    with pytest.raises(InvalidArgumentError) as caught:
        client.create_dataset("Not A Name!")
    assert caught.value.reason == "INVALID_DATASET_NAME" and caught.value.field_violations


def test_a_missing_elemental_reference_is_failed_precondition(client):
    client.create_dataset("no-reference")
    client.import_table("no-reference", pd.DataFrame({"id": ["fe2o3"], "formula": ["Fe2O3"], "energy_ev": [-38.0],
                                                      "basis": ["total_per_formula_unit"]}))
    with pytest.raises(FailedPreconditionError) as caught:
        client.get_entry_stability("no-reference", ["fe2o3"])
    assert caught.value.reason == "MISSING_ELEMENTAL_REFERENCE"
    assert caught.value.precondition_violations[0].subject.startswith("element:")


def test_a_deadline_is_deadline_exceeded(server, demo):
    with HullClient(server.url, timeout=1e-4) as hull, pytest.raises(DeadlineExceededError) as caught:
        hull.analyze_dataset(DEMO_DATASET)
    assert "Deadline" in caught.value.message


def test_a_view_with_its_own_deadline_shares_the_connection(client, demo):
    short = client.with_timeout(1e-4)
    assert short.timeout == 1e-4 and client.timeout == 60
    with pytest.raises(DeadlineExceededError):
        short.analyze_dataset(DEMO_DATASET)
    short.close()
    # The parent's deadline and connection are untouched: the same call completes.
    assert len(client.analyze_dataset(DEMO_DATASET)) > 0
    with pytest.raises(ValueError, match="timeout"):
        client.with_timeout(0)


def test_limits_are_resource_exhausted(tmp_path, demo):
    limited = RunningServer(tmp_path / "store", "--max-compositions-per-request", "2")
    try:
        with HullClient(limited.url) as hull:
            hull.create_dataset("small")
            hull.import_table("small", pd.DataFrame({"id": ["li", "o"], "formula": ["Li", "O"], "energy_ev": [0.0, 0.0],
                                                     "basis": ["formation_per_atom"] * 2}))
            with pytest.raises(ResourceExhaustedError) as caught:
                hull.get_hull_energies("small", ["Li2O", "LiO", "Li2O2"])
            assert caught.value.reason == "LIMIT_EXCEEDED"
            assert caught.value.metadata["limit"] == "max_compositions_per_request" and caught.value.metadata["limit_value"] == "2"
    finally:
        limited.stop()


@pytest.fixture(scope="module")
def secured(tmp_path_factory, openssl):
    folder = tmp_path_factory.mktemp("tls")
    cert, key = self_signed(openssl, folder, "hull-test")
    running = RunningServer(folder / "store", "--tls-cert", str(cert), "--tls-key", str(key), "--write-token", "s3cret")
    yield running, cert
    running.stop()


def test_tls_with_the_ca_file_and_the_token_works(secured):
    running, cert = secured
    assert running.url.startswith("https://")
    with HullClient(running.url, ca_file=cert, token="s3cret") as hull:
        assert hull.create_dataset("over-tls").name == "over-tls"
        assert "over-tls" in set(hull.list_datasets().name)


def test_tls_with_an_untrusted_certificate_is_unavailable(secured):
    running, _ = secured
    with HullClient(running.url, timeout=20) as hull, pytest.raises(UnavailableError) as caught:
        hull.list_datasets()
    assert "ca_file" in str(caught.value)


def test_tls_against_a_plaintext_client_setting_is_refused_before_any_call(secured):
    running, cert = secured
    with pytest.raises(ValueError, match="https:// servers only"):
        HullClient(running.url.replace("https://", "http://"), ca_file=cert)
    with pytest.raises(ValueError, match="no PEM certificate"):
        HullClient(running.url, ca_file=__file__)


def test_a_wrong_or_missing_token_is_permission_denied(secured):
    running, cert = secured
    with HullClient(running.url, ca_file=cert, token="wrong") as hull, pytest.raises(PermissionDeniedError) as caught:
        hull.create_dataset("refused")
    assert caught.value.reason == "WRITE_TOKEN_REJECTED"
    with HullClient(running.url, ca_file=cert) as hull, pytest.raises(PermissionDeniedError) as caught:
        hull.create_dataset("refused")
    assert caught.value.reason == "WRITE_TOKEN_REQUIRED"


def test_bad_addresses_are_refused_with_the_address():
    with pytest.raises(ValueError, match="'127.0.0.1:50551' is not a server URL"):
        HullClient("127.0.0.1:50551")
    with pytest.raises(ValueError, match="timeout"):
        HullClient("http://127.0.0.1:50551", timeout=0)


def test_errors_survive_pickling_for_worker_processes(client, demo):
    import pickle
    from hullclient import EntryInputError
    with pytest.raises(NotFoundError) as caught:
        client.get_entry_stability(DEMO_DATASET, ["missing-id"])
    again = pickle.loads(pickle.dumps(caught.value))
    assert type(again) is NotFoundError and str(again) == str(caught.value)
    assert again.reason == "ENTRY_NOT_FOUND" and again.field_violations == caught.value.field_violations
    local = pickle.loads(pickle.dumps(EntryInputError("f.csv:3", "column 'id' is empty")))
    assert str(local) == "f.csv:3: column 'id' is empty" and local.where == "f.csv:3"
