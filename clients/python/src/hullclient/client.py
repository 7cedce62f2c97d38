"""HullClient: one Python method per gRPC call of hull.v1, plus the single-version import of a table or file.

Each method that makes a call is marked with the call it makes (`@_calls`); `HullClient.calls()` lists them, and a
test holds that list against the services declared in protos/hull/v1, so a call added to the contract without its
Python method fails the tests.
"""

import copy
import json
import os
import re
import ssl
import urllib.parse
import warnings
from pathlib import Path
from typing import Callable, Dict, Iterable, Mapping, Optional, Sequence, Tuple, Union

import grpc
import pandas as pd

from hullclient import defects as d
from hullclient import electrochemistry as ec
from hullclient import entries as entry_input
from hullclient import results as r
from hullclient import thermo as th
from hullclient import _stubs as wire
from hullclient.errors import EntryInputError, HullError, NotFoundError, from_rpc_error

DEFAULT_ADDRESS = "http://127.0.0.1:50551"
# Seconds per call, as the CLI's --timeout default.
DEFAULT_TIMEOUT_SECONDS = 120.0
# Rows per StageEntries call, as the CLI's --batch-size default.
DEFAULT_BATCH_SIZE = 1000
# Largest response accepted: the server's default send limit (the CLI accepts the same).
MAX_RECEIVE_MESSAGE_BYTES = 64 * 1024 * 1024
ENTRY_PREFIX = "entry:"

_ROW_FIELD = re.compile(r"^(entries|staged|candidates)\[(\d+)\]")
_DUPLICATE_POLICIES = {"reject": wire.datasets_pb2.DUPLICATE_POLICY_REJECT, "replace": wire.datasets_pb2.DUPLICATE_POLICY_REPLACE}


class CoverageWarning(UserWarning):
    """An answer from a chemical system with an element at 0 by definition or no competing phase."""


class SystemProblemWarning(UserWarning):
    """A chemical system the server could not analyse (no elemental reference, or an energy out of range)."""


def _calls(service: str, method: str):
    def mark(function):
        function.hull_rpc = f"hull.v1.{service}/{method}"
        return function
    return mark


def _field_row(origins, offset=0):
    """Maps a server field name (`entries[i].x`, `staged[k].x`, `candidates[i].x`) to the row it came from:
    `entries[i]` and `candidates[i]` count within the call's batch (from `offset`), `staged[k]` within the session."""

    def label(field):
        match = _ROW_FIELD.match(field or "")
        if not match:
            return None
        index = int(match.group(2)) + (0 if match.group(1) == "staged" else offset)
        return origins[index] if 0 <= index < len(origins) else None
    return label


def _references(references: Optional[Mapping[str, float]]):
    if not references:
        return []
    if not isinstance(references, Mapping):
        raise TypeError("references must be a mapping of element symbol to total energy per atom, e.g. {'O': -4.95}")
    return [wire.stability_pb2.ElementReferenceEnergy(symbol=s, energy_ev_per_atom=float(e)) for s, e in references.items()]


def _end_members(end_members: Optional[Sequence[str]]):
    if end_members is None:
        return []
    if isinstance(end_members, str):
        end_members = [p.strip() for p in end_members.split(",") if p.strip()]
    members = []
    for member in end_members:
        if member.startswith(ENTRY_PREFIX):
            members.append(wire.stability_pb2.EndMember(entry_id=member[len(ENTRY_PREFIX):]))
        else:
            members.append(wire.stability_pb2.EndMember(formula=member))
    return members


def _compound(compound: str):
    if not isinstance(compound, str) or not compound:
        raise ValueError("compound must be a formula, or 'entry:ID' for a stored entry")
    if compound.startswith(ENTRY_PREFIX):
        return wire.windows_pb2.CompoundRef(entry_id=compound[len(ENTRY_PREFIX):])
    return wire.windows_pb2.CompoundRef(formula=compound)


def _window_settings(above_hull_tolerance_ev_per_atom, lowering_ev_per_atom, projection_omits,
                     gas_at_temperature_k=None, gas_at_pressure_bar=None, gas_molecules=None):
    settings = wire.windows_pb2.WindowSettings(projection_omits=projection_omits or "")
    # {"O2": (molecule_energy_ev, zero_point_energy_ev)}: gases read through a computed molecule.
    for gas, (energy, zero_point) in dict(gas_molecules or {}).items():
        settings.gas_molecules.add(gas=gas, molecule_energy_ev=float(energy), zero_point_energy_ev=float(zero_point))
    if gas_at_temperature_k is not None:
        settings.gas_at_temperature_k = gas_at_temperature_k
    if gas_at_pressure_bar is not None:
        settings.gas_at_pressure_bar = gas_at_pressure_bar
    if above_hull_tolerance_ev_per_atom is not None:
        settings.above_hull_tolerance_ev_per_atom = above_hull_tolerance_ev_per_atom
    if lowering_ev_per_atom is not None:
        settings.lowering_ev_per_atom = lowering_ev_per_atom
    return settings


def _gas_potentials(gases):
    """{"O2": (temperature_k, pressure_bar)} as the wire's gas potentials."""
    return [wire.windows_pb2.GasPotential(gas=g, temperature_k=float(tp[0]), pressure_bar=float(tp[1]))
            for g, tp in dict(gases or {}).items()]


def _system_roots() -> bytes:
    paths = ssl.get_default_verify_paths()
    for candidate in (paths.cafile, "/etc/ssl/certs/ca-certificates.crt"):
        if candidate and Path(candidate).is_file():
            return Path(candidate).read_bytes()
    return b""


def _read_ca_file(ca_file) -> bytes:
    path = Path(ca_file)
    try:
        data = path.read_bytes()
    except OSError as e:
        raise ValueError(f"ca_file '{ca_file}': cannot read the certificate file: {e.strerror or e}") from e
    if b"-----BEGIN CERTIFICATE-----" not in data:
        raise ValueError(f"ca_file '{ca_file}': holds no PEM certificate (-----BEGIN CERTIFICATE-----)")
    return data


def _is_file(text: str) -> bool:
    """Whether a one-line text names an existing file (a text too long for a path name is not one)."""
    try:
        return Path(text).is_file()
    except OSError:
        return False


class HullClient:
    """A connection to one hull server.

    address:  http://HOST:PORT (plaintext) or https://HOST:PORT (TLS); default $HULL_SERVER or
              http://127.0.0.1:50551.
    token:    bearer token sent with every call (write calls need it when the server has one); default $HULL_TOKEN.
    ca_file:  PEM certificates trusted for an https:// server besides the system's (a private authority or the
              server's self-signed certificate); the server's name is still checked; default $HULL_CA_FILE.
    timeout:  deadline of each call, seconds (default 120); the `timeout` attribute may be changed between calls,
              and `with_timeout(seconds)` gives a view with its own deadline for one call or a few.
    warn_coverage: emit CoverageWarning / SystemProblemWarning where the CLI prints its warnings.

    Use as a context manager, or call close().
    """

    def __init__(self, address: Optional[str] = None, *, token: Optional[str] = None, ca_file=None,
                 timeout: float = DEFAULT_TIMEOUT_SECONDS, warn_coverage: bool = True):
        address = address or os.environ.get("HULL_SERVER") or DEFAULT_ADDRESS
        token = token if token is not None else (os.environ.get("HULL_TOKEN") or None)
        ca_file = ca_file if ca_file is not None else (os.environ.get("HULL_CA_FILE") or None)
        if not (isinstance(timeout, (int, float)) and timeout > 0):
            raise ValueError(f"timeout must be a positive number of seconds, not {timeout!r}")
        parts = urllib.parse.urlsplit(address)
        if parts.scheme not in ("http", "https") or not parts.hostname:
            raise ValueError(f"address '{address}' is not a server URL: use http://HOST:PORT or https://HOST:PORT")
        try:
            port = parts.port or (443 if parts.scheme == "https" else 80)
        except ValueError as e:
            raise ValueError(f"address '{address}': {e}") from e
        host = f"[{parts.hostname}]" if ":" in parts.hostname else parts.hostname
        target = f"{host}:{port}"
        options = [("grpc.max_receive_message_length", MAX_RECEIVE_MESSAGE_BYTES)]
        if parts.scheme == "https":
            roots = _system_roots() + (b"\n" + _read_ca_file(ca_file) if ca_file else b"")
            self._channel = grpc.secure_channel(target, grpc.ssl_channel_credentials(root_certificates=roots or None), options)
        else:
            if ca_file:
                raise ValueError(f"ca_file applies to https:// servers only; '{address}' is plaintext")
            self._channel = grpc.insecure_channel(target, options)
        self.address = address
        self.timeout = float(timeout)
        self.warn_coverage = warn_coverage
        self._metadata = (("authorization", f"Bearer {token}"),) if token else ()
        self._datasets = wire.datasets_pb2_grpc.DatasetServiceStub(self._channel)
        self._stability = wire.stability_pb2_grpc.StabilityServiceStub(self._channel)
        self._figures = wire.figures_pb2_grpc.FigureServiceStub(self._channel)
        self._diagnostics = wire.diagnostics_pb2_grpc.DiagnosticsServiceStub(self._channel)
        self._windows = wire.windows_pb2_grpc.WindowServiceStub(self._channel)
        self._defects = wire.defects_pb2_grpc.DefectServiceStub(self._channel)
        self._electrochemistry = wire.electrochemistry_pb2_grpc.ElectrochemistryServiceStub(self._channel)
        self._thermo = wire.thermo_pb2_grpc.ThermoServiceStub(self._channel)
        self._uncertainty = wire.uncertainty_pb2_grpc.UncertaintyServiceStub(self._channel)
        self._corrections = wire.corrections_pb2_grpc.CorrectionServiceStub(self._channel)
        self._curation = wire.curation_pb2_grpc.CurationServiceStub(self._channel)

    # --- plumbing -----------------------------------------------------------------------------------------------

    def close(self):
        # A view made by with_timeout shares its parent's connection: only the parent closes it.
        if not getattr(self, "_shares_channel", False):
            self._channel.close()

    def with_timeout(self, seconds: float) -> "HullClient":
        """This client with another deadline (seconds), sharing the connection: `hull.with_timeout(5).stable_phases(...)`.

        The original keeps its own `timeout`; closing the view leaves the connection open.
        """
        if not (isinstance(seconds, (int, float)) and not isinstance(seconds, bool) and seconds > 0):
            raise ValueError(f"timeout must be a positive number of seconds, not {seconds!r}")
        view = copy.copy(self)
        view.timeout = float(seconds)
        view._shares_channel = True
        return view

    def __enter__(self):
        return self

    def __exit__(self, *exc):
        self.close()

    def __repr__(self):
        return f"HullClient({self.address!r}, timeout={self.timeout})"

    @classmethod
    def calls(cls) -> Dict[str, str]:
        """{'hull.v1.Service/Method': python method name} for every call this client makes."""
        return {getattr(cls, name).hull_rpc: name for name in dir(cls) if hasattr(getattr(cls, name), "hull_rpc")}

    def _call(self, stub_method, name, request, timeout=None):
        try:
            return stub_method(request, timeout=timeout or self.timeout, metadata=self._metadata)
        except grpc.RpcError as e:
            raise from_rpc_error(e, name, self.address) from None

    def _stream(self, stub_method, name, request, timeout=None):
        try:
            for message in stub_method(request, timeout=timeout or self.timeout, metadata=self._metadata):
                yield message
        except grpc.RpcError as e:
            raise from_rpc_error(e, name, self.address) from None

    def _warn(self, coverage=(), problems=()):
        if not self.warn_coverage:
            return
        for system in coverage:
            missing = [e.symbol for e in system.elements if e.zero_by_definition]
            if missing:
                warnings.warn(CoverageWarning(
                    f"{system.chemical_system}: the dataset has no entry of {', '.join(missing)}; its formation energy is "
                    f"set to 0 by definition and no computed phase of it was compared"), stacklevel=3)
            elif system.competing_phase_count == 0:
                warnings.warn(CoverageWarning(
                    f"{system.chemical_system}: no competing phase (no other compound entry); the answer only compares "
                    f"with the elements"), stacklevel=3)
        for problem in problems:
            warnings.warn(SystemProblemWarning(problem.message), stacklevel=3)

    # --- the standard health service (grpc.health.v1, not part of hull.v1) ---------------------------------------

    def health(self) -> str:
        """The server's standard gRPC health status: 'SERVING' while its store answers, else 'NOT_SERVING' (or
        'UNKNOWN'); raises UnavailableError when the server cannot be reached."""
        name = "grpc.health.v1.Health/Check"
        # HealthCheckRequest with the empty service name is the empty message; the reply's only field is
        # `status = 1` (an enum, a varint), read here without a generated module of its own.
        check = self._channel.unary_unary("/" + name, request_serializer=lambda _: b"", response_deserializer=bytes)
        reply = self._call(check, name, None)
        status = 0
        if reply[:1] == b"\x08":
            shift = 0
            for byte in reply[1:]:
                status |= (byte & 0x7F) << shift
                shift += 7
                if byte < 0x80:
                    break
        return {1: "SERVING", 2: "NOT_SERVING", 3: "SERVICE_UNKNOWN"}.get(status, "UNKNOWN")

    # --- DatasetService -----------------------------------------------------------------------------------------

    @_calls("DatasetService", "CreateDataset")
    def create_dataset(self, name: str, description: str = "") -> r.Dataset:
        """Creates an empty dataset (no version until the first import)."""
        reply = self._call(self._datasets.CreateDataset, self.create_dataset.hull_rpc,
                           wire.datasets_pb2.CreateDatasetRequest(name=name, description=description))
        return r.dataset(reply)

    @_calls("DatasetService", "ListDatasets")
    def list_datasets(self, page_size: int = 0) -> pd.DataFrame:
        """Every dataset, by name (all pages): name, description, created_at, latest_version, entry_count."""
        items, token = [], ""
        while True:
            reply = self._call(self._datasets.ListDatasets, self.list_datasets.hull_rpc,
                               wire.datasets_pb2.ListDatasetsRequest(page_size=page_size, page_token=token))
            items.extend(reply.datasets)
            token = reply.next_page_token
            if not token:
                return r.datasets_frame(items)

    @_calls("DatasetService", "DescribeDataset")
    def describe_dataset(self, name: str) -> r.DatasetDescription:
        reply = self._call(self._datasets.DescribeDataset, self.describe_dataset.hull_rpc,
                           wire.datasets_pb2.DescribeDatasetRequest(name=name))
        return r.DatasetDescription(r.dataset(reply.dataset), r.versions_frame(reply.versions))

    @_calls("DatasetService", "DeleteDataset")
    def delete_dataset(self, name: str) -> None:
        """Deletes a dataset with all its versions."""
        self._call(self._datasets.DeleteDataset, self.delete_dataset.hull_rpc, wire.datasets_pb2.DeleteDatasetRequest(name=name))

    @_calls("DatasetService", "ImportEntries")
    def import_entries(self, dataset: str, entries, *, on_duplicate: str = "reject", source_label: str = "",
                       note: str = "", free_energy_tables=None) -> r.ImportResult:
        """One batch (a DataFrame or an entry file) in one call, as one new version. For large tables use
        import_table, which sends many batches and still makes one version. Temperature models come in the entry
        columns (standard_entropy_j_per_mol_k, temperature_model_formula, free_energy_table) or, for G(T) tables,
        as `free_energy_tables` (a frame or table CSV: entry_id, anchor, temperature_k, thermal_free_energy_ev)."""
        prepared = entry_input.prepare(entries, free_energy_tables=free_energy_tables)
        request = wire.datasets_pb2.ImportEntriesRequest(dataset=dataset, entries=prepared.entries,
                                                    duplicate_policy=self._policy(on_duplicate),
                                                    source_label=source_label or self._label(entries), note=note)
        try:
            reply = self._call(self._datasets.ImportEntries, self.import_entries.hull_rpc, request)
        except HullError as e:
            raise e.with_rows(_field_row(prepared.origins)) from None
        return r.ImportResult(reply.dataset_version, reply.inserted_count, reply.replaced_count)

    @_calls("DatasetService", "BeginImport")
    def begin_import(self, dataset: str, *, on_duplicate: str = "reject", source_label: str = "",
                     note: str = "") -> r.ImportSession:
        """Opens an import session (see import_table, which runs a whole session)."""
        reply = self._call(self._datasets.BeginImport, self.begin_import.hull_rpc,
                           wire.datasets_pb2.BeginImportRequest(dataset=dataset, duplicate_policy=self._policy(on_duplicate),
                                                           source_label=source_label, note=note))
        return r.import_session(reply)

    @_calls("DatasetService", "StageEntries")
    def stage_entries(self, session_id: str, entries, *, free_energy_tables=None) -> r.ImportSession:
        """Adds one batch to an open session, all or nothing (temperature models as for import_entries)."""
        prepared = entry_input.prepare(entries, free_energy_tables=free_energy_tables)
        try:
            reply = self._call(self._datasets.StageEntries, self.stage_entries.hull_rpc,
                               wire.datasets_pb2.StageEntriesRequest(session_id=session_id, entries=prepared.entries))
        except HullError as e:
            raise e.with_rows(_field_row(prepared.origins)) from None
        return r.import_session(reply)

    @_calls("DatasetService", "CommitImport")
    def commit_import(self, session_id: str) -> r.ImportResult:
        """Writes every staged row as one new version and closes the session."""
        reply = self._call(self._datasets.CommitImport, self.commit_import.hull_rpc,
                           wire.datasets_pb2.CommitImportRequest(session_id=session_id))
        return r.ImportResult(reply.dataset_version, reply.inserted_count, reply.replaced_count)

    @_calls("DatasetService", "CancelImport")
    def cancel_import(self, session_id: str) -> None:
        self._call(self._datasets.CancelImport, self.cancel_import.hull_rpc,
                   wire.datasets_pb2.CancelImportRequest(session_id=session_id))

    @_calls("DatasetService", "ExportEntries")
    def export_entries(self, dataset: str, version: int = 0, page_size: int = 0) -> pd.DataFrame:
        """Every entry of a version in id order, with the file columns (id, formula, energy_ev, basis, note, and
        standard_entropy_j_per_mol_k, temperature_model_formula, free_energy_table when some entry has a temperature
        model); the frame imports again unchanged. attrs['version'] is the version read."""
        rows, version_read = [], 0
        for message in self._stream(self._datasets.ExportEntries, self.export_entries.hull_rpc,
                                    wire.datasets_pb2.ExportEntriesRequest(dataset=dataset, version=version, page_size=page_size)):
            version_read = message.dataset_version
            rows.extend(message.entries)
        table = entry_input.to_frame(rows)
        table.attrs["version"] = version_read
        return table

    @_calls("DatasetService", "ListVersions")
    def list_versions(self, dataset: str, page_size: int = 0) -> pd.DataFrame:
        """The live versions with their provenance, oldest first (all pages)."""
        items, token = [], ""
        while True:
            reply = self._call(self._datasets.ListVersions, self.list_versions.hull_rpc,
                               wire.datasets_pb2.ListVersionsRequest(dataset=dataset, page_size=page_size, page_token=token))
            items.extend(reply.versions)
            token = reply.next_page_token
            if not token:
                return r.versions_frame(items)

    @_calls("DatasetService", "DeleteVersion")
    def delete_version(self, dataset: str, version: int) -> None:
        self._call(self._datasets.DeleteVersion, self.delete_version.hull_rpc,
                   wire.datasets_pb2.DeleteVersionRequest(dataset=dataset, version=version))

    def import_table(self, dataset: str, entries, *, on_duplicate: str = "reject", create: bool = False,
                     batch_size: int = DEFAULT_BATCH_SIZE, source_label: str = "", note: str = "",
                     progress: Optional[Callable[[int, int], None]] = None, free_energy_tables=None) -> r.ImportResult:
        """Imports a DataFrame or an entry file (CSV/JSON) as ONE new version, in batches of `batch_size` rows
        through an import session: every row is checked here first, then each batch by the server; a refused row,
        an exception or Ctrl+C cancels the session and nothing is written. `progress(staged, total)` is called
        after each batch. A refused row is named by its DataFrame index label or file line (HullError.rows).
        With create=True a missing dataset is created first. Temperature models as for import_entries."""
        if not (isinstance(batch_size, int) and batch_size > 0):
            raise ValueError(f"batch_size must be a positive integer, not {batch_size!r}")
        prepared = entry_input.prepare(entries, free_energy_tables=free_energy_tables)
        if len(prepared) == 0:
            raise EntryInputError(self._label(entries) or "entries", "no entries to import")
        first_row = {}
        for entry, origin in zip(prepared.entries, prepared.origins):
            if entry.id in first_row:
                raise EntryInputError(origin, f"id '{entry.id}' repeats {first_row[entry.id]}")
            first_row[entry.id] = origin
        self._policy(on_duplicate)
        if create:
            try:
                self.describe_dataset(dataset)
            except NotFoundError:
                self.create_dataset(dataset)
        session = self.begin_import(dataset, on_duplicate=on_duplicate, source_label=source_label or self._label(entries),
                                    note=note)
        done = False
        try:
            total = len(prepared)
            for start in range(0, total, batch_size):
                batch = entry_input.PreparedEntries(prepared.entries[start:start + batch_size],
                                                    prepared.origins[start:start + batch_size])
                try:
                    self.stage_entries(session.session_id, batch)
                except HullError as e:
                    raise e.with_rows(_field_row(prepared.origins, offset=start)) from None
                if progress is not None:
                    progress(min(start + batch_size, total), total)
            try:
                result = self.commit_import(session.session_id)
            except HullError as e:
                raise e.with_rows(_field_row(prepared.origins)) from None
            done = True
            return result
        finally:
            if not done:
                try:
                    self.cancel_import(session.session_id)
                except HullError:
                    pass  # the session lapses on the server by itself; the first error is the one to see

    @staticmethod
    def _policy(on_duplicate: str) -> int:
        if on_duplicate not in _DUPLICATE_POLICIES:
            raise ValueError(f"on_duplicate must be 'reject' or 'replace', not {on_duplicate!r}")
        return _DUPLICATE_POLICIES[on_duplicate]

    @staticmethod
    def _label(entries) -> str:
        if isinstance(entries, (str, Path)):
            return Path(entries).name
        return "pandas DataFrame" if isinstance(entries, pd.DataFrame) else ""

    # --- StabilityService ---------------------------------------------------------------------------------------

    @_calls("StabilityService", "GetEntryStability")
    def get_entry_stability(self, dataset: str, entry_ids: Union[str, Iterable[str]], *, version: int = 0,
                            references: Optional[Mapping[str, float]] = None,
                            end_members: Optional[Sequence[str]] = None) -> pd.DataFrame:
        """Energy above hull, decomposition and decomposition energy of stored entries, in request order.
        end_members: formulas or 'entry:ID' for a hull over compound end-members."""
        ids = [entry_ids] if isinstance(entry_ids, str) else list(entry_ids)
        reply = self._call(self._stability.GetEntryStability, self.get_entry_stability.hull_rpc,
                           wire.stability_pb2.GetEntryStabilityRequest(dataset=dataset, version=version, entry_ids=ids,
                                                                  elemental_references=_references(references),
                                                                  end_members=_end_members(end_members)))
        table = r.frame([r.entry_stability_row(m) for m in reply.results], r.ENTRY_STABILITY_COLUMNS, **r.answer_attrs(reply))
        self._warn(table.attrs["coverage"])
        return table

    @_calls("StabilityService", "AssessCandidates")
    def assess_candidates(self, dataset: str, candidates, *, version: int = 0,
                          references: Optional[Mapping[str, float]] = None) -> pd.DataFrame:
        """Places ad-hoc compositions with an energy against the hull, without storing them. candidates: a
        DataFrame (or entry file) with the entry columns (`id` becomes the label), or (formula, energy_ev, basis)
        tuples."""
        if isinstance(candidates, (pd.DataFrame, str, Path)):
            prepared = entry_input.prepare(candidates)
            sent = [wire.stability_pb2.Candidate(label=e.id, formula=e.formula, energy_ev=e.energy_ev, basis=e.basis)
                    for e in prepared.entries]
            origins = prepared.origins
        else:
            tokens = entry_input.basis_tokens()
            sent, origins = [], []
            for i, item in enumerate(candidates):
                formula, energy, basis = item
                if basis not in tokens:
                    raise EntryInputError(f"candidates[{i}]", f"basis '{basis}' is not one of {', '.join(tokens)}")
                sent.append(wire.stability_pb2.Candidate(label=formula, formula=formula, energy_ev=float(energy), basis=tokens[basis]))
                origins.append(f"candidates[{i}] {formula}")
        try:
            reply = self._call(self._stability.AssessCandidates, self.assess_candidates.hull_rpc,
                               wire.stability_pb2.AssessCandidatesRequest(dataset=dataset, version=version, candidates=sent,
                                                                     elemental_references=_references(references)))
        except HullError as e:
            raise e.with_rows(_field_row(origins)) from None
        table = r.frame([r.candidate_row(m) for m in reply.results], r.CANDIDATE_COLUMNS, **r.answer_attrs(reply))
        self._warn(table.attrs["coverage"])
        return table

    @_calls("StabilityService", "GetHullEnergies")
    def get_hull_energies(self, dataset: str, formulas: Union[str, Iterable[str]], *, version: int = 0,
                          references: Optional[Mapping[str, float]] = None) -> pd.DataFrame:
        """Hull energy and decomposition at compositions (no energy needed)."""
        formulas = [formulas] if isinstance(formulas, str) else list(formulas)
        reply = self._call(self._stability.GetHullEnergies, self.get_hull_energies.hull_rpc,
                           wire.stability_pb2.GetHullEnergiesRequest(dataset=dataset, version=version, formulas=formulas,
                                                                elemental_references=_references(references)))
        table = r.frame([r.hull_energy_row(m) for m in reply.results], r.HULL_ENERGY_COLUMNS, **r.answer_attrs(reply))
        self._warn(table.attrs["coverage"])
        return table

    @_calls("StabilityService", "GetStablePhases")
    def get_stable_phases(self, dataset: str, chemical_system: str = "", *, version: int = 0,
                          references: Optional[Mapping[str, float]] = None,
                          end_members: Optional[Sequence[str]] = None) -> pd.DataFrame:
        """The stable phases (hull vertices) of one chemical system ("Li-Co-O"), of end-members, or of the whole
        dataset (no system): phase_id, formula, formation_energy_ev_per_atom, is_elemental_reference.
        attrs['system_problems'] lists systems the whole-dataset answer could not analyse."""
        reply = self._call(self._stability.GetStablePhases, self.get_stable_phases.hull_rpc,
                           wire.stability_pb2.GetStablePhasesRequest(dataset=dataset, version=version,
                                                                chemical_system=chemical_system or "",
                                                                elemental_references=_references(references),
                                                                end_members=_end_members(end_members)))
        table = r.stable_phases_frame(reply.phases)
        table.attrs.update(r.answer_attrs(reply), chemical_system=reply.chemical_system,
                           system_problems=tuple(r.system_problem(p) for p in reply.system_problems))
        self._warn(table.attrs["coverage"], table.attrs["system_problems"])
        return table

    @_calls("StabilityService", "GetHullFacets")
    def get_hull_facets(self, dataset: str, chemical_system: str = "", *, version: int = 0,
                        references: Optional[Mapping[str, float]] = None,
                        end_members: Optional[Sequence[str]] = None) -> r.HullFacets:
        """Facets with the chemical potentials at which their phases coexist, tie-lines and stable phases."""
        reply = self._call(self._stability.GetHullFacets, self.get_hull_facets.hull_rpc,
                           wire.stability_pb2.GetHullFacetsRequest(dataset=dataset, version=version,
                                                              chemical_system=chemical_system or "",
                                                              elemental_references=_references(references),
                                                              end_members=_end_members(end_members)))
        components = tuple(reply.components)
        facets = r.facets_frame(components, reply.facets)
        ties = pd.DataFrame([{"first_phase_id": t.first_phase_id, "second_phase_id": t.second_phase_id} for t in reply.tie_lines],
                            columns=["first_phase_id", "second_phase_id"])
        attrs = r.answer_attrs(reply)
        self._warn(attrs["coverage"])
        return r.HullFacets(attrs["used"], reply.chemical_system, components, facets, ties,
                            r.stable_phases_frame(reply.stable_phases), attrs["coverage"], attrs["references"])

    @_calls("StabilityService", "AnalyzeDataset")
    def analyze_dataset(self, dataset: str, *, version: int = 0, page_size: int = 0,
                        references: Optional[Mapping[str, float]] = None,
                        progress: Optional[Callable[[int, int], None]] = None) -> pd.DataFrame:
        """Stability of every entry of the version, streamed into one DataFrame in entry id order (columns as
        get_entry_stability). attrs: used, hull_systems, references, coverage, system_problems,
        unanswered_entry_count. progress(received, total) after each streamed message."""
        rows, attrs = [], {}
        coverage = []
        for message in self._stream(self._stability.AnalyzeDataset, self.analyze_dataset.hull_rpc,
                                    wire.stability_pb2.AnalyzeDatasetRequest(dataset=dataset, version=version, page_size=page_size,
                                                                        elemental_references=_references(references))):
            if not attrs:
                attrs = {"used": r.version_used(message.used), "hull_systems": tuple(message.hull_systems),
                         "references": tuple(r.element_reference(x) for x in message.references),
                         "system_problems": tuple(r.system_problem(p) for p in message.system_problems),
                         "unanswered_entry_count": message.unanswered_entry_count}
            coverage.extend(r.system_coverage(c) for c in message.coverage)
            rows.extend(r.entry_stability_row(m) for m in message.results)
            if progress is not None:
                progress(len(rows), message.entry_count)
        table = r.frame(rows, r.ENTRY_STABILITY_COLUMNS, **attrs)
        table.attrs["coverage"] = tuple(coverage)
        self._warn(table.attrs["coverage"], table.attrs.get("system_problems", ()))
        return table

    # --- FigureService ------------------------------------------------------------------------------------------

    @_calls("FigureService", "DrawPhaseDiagram")
    def draw_phase_diagram(self, dataset: str, chemical_system: str = "", *, version: int = 0,
                           end_members: Optional[Sequence[str]] = None,
                           max_above_hull_ev_per_atom: Optional[float] = None,
                           azimuth_degrees: Optional[float] = None,
                           elevation_degrees: Optional[float] = None) -> r.Figure:
        """A phase diagram of 2 to 4 elements ("Li-Co-O") or end-members, drawn by the server; Figure.svg is the
        SVG text, Figure.save(path) writes it. Quaternaries take a view (azimuth, elevation)."""
        request = wire.figures_pb2.DrawPhaseDiagramRequest(dataset=dataset, version=version, chemical_system=chemical_system or "",
                                                      end_members=_end_members(end_members))
        if max_above_hull_ev_per_atom is not None:
            request.max_above_hull_ev_per_atom = max_above_hull_ev_per_atom
        if azimuth_degrees is not None:
            request.view_azimuth_degrees = azimuth_degrees
        if elevation_degrees is not None:
            request.view_elevation_degrees = elevation_degrees
        reply = self._call(self._figures.DrawPhaseDiagram, self.draw_phase_diagram.hull_rpc, request)
        return r.Figure(r.version_used(reply.used), reply.chemical_system, tuple(reply.components),
                        r.enum_token(wire.figures_pb2.FigureKind, reply.kind, "FIGURE_KIND_"), reply.svg,
                        reply.stable_phase_count, reply.edge_count, reply.unstable_shown_count,
                        reply.hidden_above_cutoff_count, reply.max_above_hull_ev_per_atom)

    # --- UncertaintyService ------------------------------------------------------------------------------------

    @staticmethod
    def _sampling_request(dataset, chemical_system, version, samples, target_standard_error, seed, group_sigmas, references):
        request = wire.uncertainty_pb2.SampleStabilityRequest(
            dataset=dataset, version=version, chemical_system=chemical_system, samples=int(samples or 0), seed=int(seed),
            elemental_references=_references(references),
            group_sigmas=[wire.uncertainty_pb2.GroupSigma(group=g, sigma_ev_per_atom=float(s)) for g, s in dict(group_sigmas or {}).items()])
        if target_standard_error is not None:
            request.target_standard_error = float(target_standard_error)
        return request

    @_calls("UncertaintyService", "SampleStability")
    def sample_stability(self, dataset: str, chemical_system: str, *, version: int = 0, samples: Optional[int] = None,
                         target_standard_error: Optional[float] = None, seed: int = 0,
                         group_sigmas: Optional[Mapping[str, float]] = None,
                         references: Optional[Mapping[str, float]] = None) -> pd.DataFrame:
        """Stability under the entries' stored energy uncertainty (sigma, correlation group): one row per entry with
        its probability of being a hull vertex and standard error, energy above hull (mean, 5th/95th percentile),
        likeliest decomposition and its probability, and the plain hull's answer. `samples` (default 1000) or
        `target_standard_error`; `group_sigmas` {'ml-model': 0.02} gives each correlation group's shared sigma
        (eV/atom). attrs: used, coverage, references, probable_stable_set, most_frequent_stable_set(_probability),
        sample_count, seed, stop, largest_vertex_standard_error, groups, mean_points_rebuilt."""
        request = self._sampling_request(dataset, chemical_system, version, samples, target_standard_error, seed, group_sigmas, references)
        reply = self._call(self._uncertainty.SampleStability, self.sample_stability.hull_rpc, request)
        table = r.odds_frame(reply.entries)
        table.attrs.update(
            used=r.version_used(reply.used), coverage=(r.system_coverage(reply.coverage),),
            references=tuple(r.element_reference(x) for x in reply.references), chemical_system=reply.chemical_system,
            probable_stable_set=tuple(reply.probable_stable_set), most_frequent_stable_set=tuple(reply.most_frequent_stable_set),
            most_frequent_stable_set_probability=reply.most_frequent_stable_set_probability, sample_count=reply.sample_count,
            seed=reply.seed, stop=r.enum_token(wire.uncertainty_pb2.SamplingStop, reply.stop, "SAMPLING_STOP_"),
            target_standard_error=reply.target_standard_error if reply.HasField("target_standard_error") else None,
            largest_vertex_standard_error=reply.largest_vertex_standard_error,
            groups={g.group: g.sigma_ev_per_atom for g in reply.groups}, mean_points_rebuilt=reply.mean_points_rebuilt)
        self._warn(table.attrs["coverage"])
        return table

    @_calls("UncertaintyService", "DrawStabilityOddsFigure")
    def draw_stability_odds_figure(self, dataset: str, chemical_system: str, *, version: int = 0, samples: Optional[int] = None,
                                   target_standard_error: Optional[float] = None, seed: int = 0,
                                   group_sigmas: Optional[Mapping[str, float]] = None,
                                   references: Optional[Mapping[str, float]] = None) -> r.OddsFigure:
        """The ternary ("Li-Co-O") with each phase's probability of being a hull vertex, drawn by the server from the
        same sampling as sample_stability with the same arguments; OddsFigure.save(path) writes the SVG."""
        request = self._sampling_request(dataset, chemical_system, version, samples, target_standard_error, seed, group_sigmas, references)
        reply = self._call(self._uncertainty.DrawStabilityOddsFigure, self.draw_stability_odds_figure.hull_rpc,
                           wire.uncertainty_pb2.DrawStabilityOddsFigureRequest(sampling=request))
        return r.OddsFigure(r.version_used(reply.used), reply.chemical_system, reply.svg, reply.sample_count, reply.seed)

    # --- CorrectionService --------------------------------------------------------------------------------------

    @staticmethod
    def _set_text(set_json) -> str:
        """A set document given as text, a dict, or the path of its file."""
        if isinstance(set_json, Mapping):
            return json.dumps(set_json)
        if isinstance(set_json, Path) or (isinstance(set_json, str) and "{" not in set_json and _is_file(set_json)):
            with open(set_json, encoding="utf-8", newline="") as f:
                return f.read()
        return str(set_json)

    @_calls("CorrectionService", "PutCorrectionSet")
    def put_correction_set(self, set_json) -> r.CorrectionSet:
        """Stores a correction set (its JSON document as text, a dict or a file path) under the name and version the
        document gives; the same document again changes nothing, another one under a stored name and version is refused."""
        reply = self._call(self._corrections.PutCorrectionSet, self.put_correction_set.hull_rpc,
                           wire.corrections_pb2.PutCorrectionSetRequest(set_json=self._set_text(set_json)))
        return r.correction_set(reply)

    @_calls("CorrectionService", "ListCorrectionSets")
    def list_correction_sets(self) -> pd.DataFrame:
        """Every stored set, by name and version (the documents in `set_json`)."""
        reply = self._call(self._corrections.ListCorrectionSets, self.list_correction_sets.hull_rpc,
                           wire.corrections_pb2.ListCorrectionSetsRequest())
        columns = ["name", "version", "base_method", "fitted_reference_count", "species_shift_count", "method_rule_count",
                   "stored_at", "set_json"]
        return pd.DataFrame([{c: getattr(r.correction_set(m), c) for c in columns} for m in reply.sets], columns=columns)

    @_calls("CorrectionService", "GetCorrectionSet")
    def get_correction_set(self, name: str, version: int) -> r.CorrectionSet:
        """One stored set with its document exactly as stored."""
        reply = self._call(self._corrections.GetCorrectionSet, self.get_correction_set.hull_rpc,
                           wire.corrections_pb2.GetCorrectionSetRequest(name=name, version=int(version)))
        return r.correction_set(reply)

    @_calls("CorrectionService", "DeriveCorrectedVersion")
    def derive_corrected_version(self, dataset: str, *, stored: Optional[Tuple[str, int]] = None, set_json=None,
                                 source_version: int = 0, note: str = "") -> pd.DataFrame:
        """Writes a version's entries (`source_version`, 0 = the latest) with corrected energies as the dataset's next
        version, with a stored set (`stored=("name", version)`) or a document (`set_json`, stored with it); the new
        version holds exactly the source version's entries, and its curation record is the one-step recipe that makes
        it again. One row per moved entry with its shift in three parts (eV/atom); attrs: used (the new version, naming
        its set), entry_count, changed_count."""
        if (stored is None) == (set_json is None):
            raise ValueError("give one of stored=(name, version) and set_json")
        request = wire.corrections_pb2.DeriveCorrectedVersionRequest(dataset=dataset, source_version=int(source_version), note=note)
        if stored is not None:
            request.stored.name, request.stored.version = stored[0], int(stored[1])
        else:
            request.inline_set_json = self._set_text(set_json)
        reply = self._call(self._corrections.DeriveCorrectedVersion, self.derive_corrected_version.hull_rpc, request)
        table = r.shifts_frame(reply.shifts)
        table.attrs.update(used=r.version_used(reply.derived), entry_count=reply.entry_count, changed_count=reply.changed_count)
        return table

    # --- DiagnosticsService -------------------------------------------------------------------------------------

    @_calls("DiagnosticsService", "GetServerLimits")
    def get_server_limits(self) -> r.ServerLimits:
        m = self._call(self._diagnostics.GetServerLimits, self.get_server_limits.hull_rpc, wire.diagnostics_pb2.GetServerLimitsRequest())
        return r.ServerLimits(m.max_components_per_system, m.max_entries_per_system, m.max_compositions_per_request,
                              m.max_receive_message_bytes, m.max_send_message_bytes)

    @_calls("DiagnosticsService", "GetCacheStatistics")
    def get_cache_statistics(self) -> r.CacheStatistics:
        m = self._call(self._diagnostics.GetCacheStatistics, self.get_cache_statistics.hull_rpc,
                       wire.diagnostics_pb2.GetCacheStatisticsRequest())
        return r.CacheStatistics(m.hull_builds, m.hull_cache_hits, m.version_loads, m.dataset_analyses, m.cached_hulls)

    @_calls("DiagnosticsService", "GetServerHealth")
    def get_server_health(self) -> r.ServerHealth:
        """The store (usable now, or why not) and this server's part in a cluster (empty cluster_name: it works alone)."""
        m = self._call(self._diagnostics.GetServerHealth, self.get_server_health.hull_rpc, wire.diagnostics_pb2.GetServerHealthRequest())
        return r.ServerHealth(m.store_location, m.store_usable, m.store_problem, m.cluster_name, m.active_members, m.member_status,
                              m.grain_hull_builds)

    # --- WindowService ------------------------------------------------------------------------------------------

    @_calls("WindowService", "GetStabilityWindow")
    def get_stability_window(self, dataset: str, compound: str, *, version: int = 0,
                             above_hull_tolerance_ev_per_atom: Optional[float] = None,
                             lowering_ev_per_atom: Optional[float] = None, projection_omits: str = "",
                             gas_at_temperature_k: Optional[float] = None,
                             gas_at_pressure_bar: Optional[float] = None,
                             gas_molecules: Optional[Mapping[str, Tuple[float, float]]] = None) -> r.WindowAnswer:
        """The chemical-potential window of a compound (a formula, or 'entry:ID'). With gas_at_temperature_k (or
        gas_at_pressure_bar) each gas element's Δμ is also given as its gas's pressure at that temperature (or the
        temperature at that pressure): columns log10_p_O2_bar, p_O2_bar, T_O2_k. By default the dataset's references
        are taken as fitted; gas_molecules={'O2': (molecule_energy_ev, zero_point_energy_ev)} reads a gas through its
        computed molecule against the dataset's total-energy reference instead."""
        reply = self._call(self._windows.GetStabilityWindow, self.get_stability_window.hull_rpc,
                           wire.windows_pb2.GetStabilityWindowRequest(
                               dataset=dataset, version=version, compound=_compound(compound),
                               settings=_window_settings(above_hull_tolerance_ev_per_atom, lowering_ev_per_atom, projection_omits,
                                                         gas_at_temperature_k, gas_at_pressure_bar, gas_molecules)))
        return r.WindowAnswer(r.version_used(reply.used), r.stability_window(reply.window, wire.windows_pb2))

    @_calls("WindowService", "SliceStabilityWindow")
    def slice_stability_window(self, dataset: str, compound: str, fixed_potentials: Optional[Mapping[str, float]] = None, *,
                               fixed_gases: Optional[Mapping[str, Tuple[float, float]]] = None,
                               version: int = 0, allow_above_reference: bool = False,
                               above_hull_tolerance_ev_per_atom: Optional[float] = None,
                               lowering_ev_per_atom: Optional[float] = None, projection_omits: str = "",
                               gas_at_temperature_k: Optional[float] = None,
                               gas_at_pressure_bar: Optional[float] = None,
                               gas_molecules: Optional[Mapping[str, Tuple[float, float]]] = None) -> r.WindowSlice:
        """The window with some Δμ held fixed ({'O': -1.0}, eV), or gas elements by their gas at (T, p)
        (fixed_gases={'O2': (1273, 0.21)}, K and bar), through gas_molecules as get_stability_window reads them;
        when it misses, the nearest window point."""
        fixed = [wire.windows_pb2.FixedPotential(element=e, chemical_potential_ev=float(v)) for e, v in dict(fixed_potentials or {}).items()]
        reply = self._call(self._windows.SliceStabilityWindow, self.slice_stability_window.hull_rpc,
                           wire.windows_pb2.SliceStabilityWindowRequest(
                               dataset=dataset, version=version, compound=_compound(compound),
                               settings=_window_settings(above_hull_tolerance_ev_per_atom, lowering_ev_per_atom, projection_omits,
                                                         gas_at_temperature_k, gas_at_pressure_bar, gas_molecules),
                               fixed_potentials=fixed, allow_above_reference=allow_above_reference,
                               fixed_gases=_gas_potentials(fixed_gases)))
        return r.WindowSlice(r.version_used(reply.used), r.stability_window(reply.whole, wire.windows_pb2),
                             r.stability_window(reply.slice, wire.windows_pb2), reply.misses, tuple(reply.nearest_point_ev),
                             reply.distance_ev if reply.HasField("distance_ev") else None,
                             {p.element: p.chemical_potential_ev for p in reply.fixed_potentials_used})

    @_calls("WindowService", "GetDopantLimits")
    def get_dopant_limits(self, dataset: str, compound: str, dopants: Union[str, Iterable[str]], *, version: int = 0,
                          above_hull_tolerance_ev_per_atom: Optional[float] = None,
                          lowering_ev_per_atom: Optional[float] = None, projection_omits: str = "",
                          gas_at_temperature_k: Optional[float] = None,
                          gas_at_pressure_bar: Optional[float] = None,
                          gas_molecules: Optional[Mapping[str, Tuple[float, float]]] = None) -> r.DopantLimits:
        """The highest Δμ of each dopant that the host's window allows, per host vertex and overall. The gas
        arguments read gas elements on the host's and the extended vertices (a gas dopant too) as
        get_stability_window reads them."""
        dopants = [dopants] if isinstance(dopants, str) else list(dopants)
        reply = self._call(self._windows.GetDopantLimits, self.get_dopant_limits.hull_rpc,
                           wire.windows_pb2.GetDopantLimitsRequest(
                               dataset=dataset, version=version, compound=_compound(compound),
                               settings=_window_settings(above_hull_tolerance_ev_per_atom, lowering_ev_per_atom, projection_omits,
                                                         gas_at_temperature_k, gas_at_pressure_bar, gas_molecules),
                               dopants=dopants))
        return r.DopantLimits(r.version_used(reply.used), r.stability_window(reply.host, wire.windows_pb2),
                              tuple(r.dopant_limit(m) for m in reply.limits))

    @_calls("WindowService", "DrawWindowFigure")
    def draw_window_figure(self, dataset: str, compound: str, *, x_element: str = "", y_element: str = "",
                           section: Optional[Mapping[str, float]] = None,
                           section_gases: Optional[Mapping[str, Tuple[float, float]]] = None, version: int = 0,
                           above_hull_tolerance_ev_per_atom: Optional[float] = None,
                           lowering_ev_per_atom: Optional[float] = None, projection_omits: str = "",
                           gas_at_temperature_k: Optional[float] = None,
                           gas_at_pressure_bar: Optional[float] = None,
                           gas_molecules: Optional[Mapping[str, Tuple[float, float]]] = None) -> r.WindowFigure:
        """The window of a compound (a formula, or 'entry:ID') drawn on Δμ of x_element and y_element (both or
        neither: the default pair); for four or more elements a section at `section` ({'Mn': -1.2}, eV; all but one
        of the other elements; default the vertices' mean), or at gases' (T, p) by `section_gases`
        ({'O2': (1000, 0.21)}). The gas arguments read section gases and the vertices' gas columns as
        get_stability_window reads them. WindowFigure.save(path) writes the SVG."""
        fixed = [wire.windows_pb2.FixedPotential(element=e, chemical_potential_ev=float(v)) for e, v in dict(section or {}).items()]
        reply = self._call(self._windows.DrawWindowFigure, self.draw_window_figure.hull_rpc,
                           wire.windows_pb2.DrawWindowFigureRequest(
                               dataset=dataset, version=version, compound=_compound(compound),
                               settings=_window_settings(above_hull_tolerance_ev_per_atom, lowering_ev_per_atom, projection_omits,
                                                         gas_at_temperature_k, gas_at_pressure_bar, gas_molecules),
                               x_element=x_element, y_element=y_element, section=fixed,
                               section_gases=_gas_potentials(section_gases)))
        window = r.stability_window(reply.window, wire.windows_pb2)
        return r.WindowFigure(r.version_used(reply.used), window, reply.svg, reply.drawn_dimension,
                              r.vertices_frame(reply.drawn_vertices, window.elements), reply.x_element, reply.y_element,
                              reply.dependent_element, {p.element: p.chemical_potential_ev for p in reply.section},
                              reply.section_chosen_by_default, reply.section_misses, tuple(reply.drawn_line_ids),
                              reply.lines_left_out)

    # --- DefectService ------------------------------------------------------------------------------------------

    def _defect_warnings(self, texts):
        for text in texts:
            warnings.warn(d.DefectWarning(text), stacklevel=3)

    @_calls("DefectService", "ImportDefectStudy")
    def import_defect_study(self, dataset: str, study_name: str, study_json, charge_states_csv, *,
                            source_label: str = "", note: str = "") -> d.DefectStudyImport:
        """Stores a study file (the JSON document and the charge-state CSV, as text or as paths) as the next version
        of `study_name`, checked first against the dataset's latest version."""
        texts = []
        for given in (study_json, charge_states_csv):
            if isinstance(given, Path) or (isinstance(given, str) and "\n" not in given and _is_file(given)):
                with open(given, encoding="utf-8", newline="") as f:
                    texts.append(f.read())
            else:
                texts.append(str(given))
        reply = self._call(self._defects.ImportDefectStudy, self.import_defect_study.hull_rpc,
                           wire.defects_pb2.ImportDefectStudyRequest(dataset=dataset, study_name=study_name, study_json=texts[0],
                                                                     charge_states_csv=texts[1], source_label=source_label, note=note))
        self._defect_warnings(reply.warnings)
        return d.DefectStudyImport(d.study_info(reply.study), d.defects_frame(reply.defects), tuple(reply.warnings))

    @_calls("DefectService", "ListDefectStudies")
    def list_defect_studies(self, dataset: str) -> pd.DataFrame:
        """The dataset's study names with their latest versions."""
        reply = self._call(self._defects.ListDefectStudies, self.list_defect_studies.hull_rpc,
                           wire.defects_pb2.ListDefectStudiesRequest(dataset=dataset))
        return pd.DataFrame([{"study_name": s.study_name, "latest_version": s.latest_version} for s in reply.studies],
                            columns=["study_name", "latest_version"])

    @_calls("DefectService", "ExportDefectStudy")
    def export_defect_study(self, dataset: str, study_name: str, study_version: int = 0) -> d.DefectStudyExport:
        """A study version's texts exactly as imported (0 = the latest)."""
        reply = self._call(self._defects.ExportDefectStudy, self.export_defect_study.hull_rpc,
                           wire.defects_pb2.ExportDefectStudyRequest(dataset=dataset, study_name=study_name, study_version=study_version))
        return d.DefectStudyExport(d.study_info(reply.study), reply.study_json, reply.charge_states_csv)

    @_calls("DefectService", "GetDefectFormationEnergies")
    def get_defect_formation_energies(self, dataset: str, study_name: str, *, version: int = 0, study_version: int = 0,
                                      vertex=None, point: Optional[Mapping[str, float]] = None, gas: Optional[Mapping] = None,
                                      fermi_levels_ev: Iterable[float] = (), defects: Iterable[str] = (),
                                      host_entry_id: str = "") -> pd.DataFrame:
        """Formation energies of every charge state, one row per point, defect, charge and Fermi level (eV above the
        VBM; default 0), every term in its own column. Points: every vertex of the host's window (default), one
        `vertex` (number or name), a `point` {'Al': ..., 'O': ...}, or a `gas` {'gas': 'O2', 'temperature_k': ...,
        'pressure_bar': ...}. attrs: used, study, host_entry_id, points, corrections (a DataFrame), gas, warnings."""
        request = wire.defects_pb2.GetDefectFormationEnergiesRequest(
            dataset=dataset, version=version, study_name=study_name, study_version=study_version,
            fermi_levels_ev=[float(x) for x in fermi_levels_ev], defects=list(defects), host_entry_id=host_entry_id)
        chosen = d.conditions(vertex, point, gas)
        if chosen is not None:
            request.conditions.CopyFrom(chosen)
        reply = self._call(self._defects.GetDefectFormationEnergies, self.get_defect_formation_energies.hull_rpc, request)
        self._defect_warnings(reply.warnings)
        return d.energies_frame(reply)

    @_calls("DefectService", "GetChargeTransitionLevels")
    def get_charge_transition_levels(self, dataset: str, study_name: str, *, version: int = 0, study_version: int = 0,
                                     vertex=None, point: Optional[Mapping[str, float]] = None, gas: Optional[Mapping] = None,
                                     defects: Iterable[str] = (), host_entry_id: str = "") -> d.TransitionLevels:
        """Transition levels (thermodynamic and between non-ground states), effective U and complex binding energies;
        the formation energy at each level is at one point (default: the window's first vertex)."""
        request = wire.defects_pb2.GetChargeTransitionLevelsRequest(
            dataset=dataset, version=version, study_name=study_name, study_version=study_version, defects=list(defects),
            host_entry_id=host_entry_id)
        chosen = d.conditions(vertex, point, gas)
        if chosen is not None:
            request.conditions.CopyFrom(chosen)
        reply = self._call(self._defects.GetChargeTransitionLevels, self.get_charge_transition_levels.hull_rpc, request)
        self._defect_warnings(reply.warnings)
        return d.levels(reply)

    @_calls("DefectService", "DrawDefectFormationFigure")
    def draw_defect_formation_figure(self, dataset: str, study_name: str, *, version: int = 0, study_version: int = 0,
                                     vertex=None, point: Optional[Mapping[str, float]] = None, gas: Optional[Mapping] = None,
                                     defects: Iterable[str] = (), host_entry_id: str = "",
                                     fermi_min_ev: Optional[float] = None, fermi_max_ev: Optional[float] = None) -> d.DefectFigure:
        """Formation energy against Fermi level at one point (default: the window's first vertex), as SVG."""
        request = wire.defects_pb2.DrawDefectFormationFigureRequest(
            dataset=dataset, version=version, study_name=study_name, study_version=study_version, defects=list(defects),
            host_entry_id=host_entry_id)
        chosen = d.conditions(vertex, point, gas)
        if chosen is not None:
            request.conditions.CopyFrom(chosen)
        if fermi_min_ev is not None:
            request.fermi_min_ev = fermi_min_ev
        if fermi_max_ev is not None:
            request.fermi_max_ev = fermi_max_ev
        reply = self._call(self._defects.DrawDefectFormationFigure, self.draw_defect_formation_figure.hull_rpc, request)
        self._defect_warnings(reply.warnings)
        return d.DefectFigure(r.version_used(reply.used), d.study_info(reply.study), d.point(reply.point), reply.svg,
                              reply.defect_count, reply.marked_level_count, tuple(reply.warnings))

    @_calls("DefectService", "SolveFermiLevel")
    def solve_fermi_level(self, dataset: str, study_name: str, *, temperature_k: float = 0.0,
                          operating_temperature_k: Optional[float] = None, statistics: str = "fermi_dirac",
                          form: str = "dilute", version: int = 0, study_version: int = 0, vertex=None,
                          point: Optional[Mapping[str, float]] = None, gas: Optional[Mapping] = None,
                          host_entry_id: str = "") -> pd.DataFrame:
        """The self-consistent Fermi level (eV above the VBM) and carriers (cm^-3) at the same points as
        get_defect_formation_energies, at `temperature_k` (0 with a gas: the gas's temperature). With
        `operating_temperature_k` the totals freeze at temperature_k (rows 'growth') and charge states and carriers
        re-solve there (rows 'quenched'). Needs the study file's carriers block. attrs['charge_states'] and
        attrs['defects'] hold every concentration; see defects.fermi_frame."""
        statistics_code, form_code = d.counting(statistics, form)
        request = wire.defects_pb2.FermiLevelRequest(
            dataset=dataset, version=version, study_name=study_name, study_version=study_version,
            temperature_k=float(temperature_k), statistics=statistics_code, form=form_code, host_entry_id=host_entry_id)
        if operating_temperature_k is not None:
            request.operating_temperature_k = float(operating_temperature_k)
        chosen = d.conditions(vertex, point, gas)
        if chosen is not None:
            request.conditions.CopyFrom(chosen)
        reply = self._call(self._defects.SolveFermiLevel, self.solve_fermi_level.hull_rpc, request)
        self._defect_warnings(reply.warnings)
        return d.fermi_frame(reply)

    @_calls("DefectService", "GetDopantSolubility")
    def get_dopant_solubility(self, dataset: str, study_name: str, temperatures_k: Iterable[float], *, dopant: str = "",
                              statistics: str = "fermi_dirac", form: str = "dilute",
                              other_potentials: Optional[Mapping[str, float]] = None, version: int = 0,
                              study_version: int = 0, host_entry_id: str = "") -> d.DopantSolubility:
        """How much dopant dissolves at each vertex of the host + dopant window per growth temperature (K), the Fermi
        level solved at each. The hazard cautions come as DefectWarning too (follow local safety rules)."""
        statistics_code, form_code = d.counting(statistics, form)
        request = wire.defects_pb2.DefectSolubilityRequest(
            dataset=dataset, version=version, study_name=study_name, study_version=study_version, dopant=dopant,
            temperatures_k=[float(t) for t in temperatures_k], statistics=statistics_code, form=form_code,
            host_entry_id=host_entry_id,
            other_potentials=[wire.defects_pb2.DefectElementPotential(element=e, delta_mu_ev=float(v))
                              for e, v in dict(other_potentials or {}).items()])
        reply = self._call(self._defects.GetDopantSolubility, self.get_dopant_solubility.hull_rpc, request)
        self._defect_warnings(list(reply.warnings) + list(reply.cautions))
        return d.solubility(reply)

    @_calls("DefectService", "DrawCarrierFigure")
    def draw_carrier_figure(self, dataset: str, study_name: str, temperatures_k: Iterable[float], *,
                            operating_temperature_k: Optional[float] = None, statistics: str = "fermi_dirac",
                            form: str = "dilute", version: int = 0, study_version: int = 0, vertex=None,
                            point: Optional[Mapping[str, float]] = None, gas: Optional[Mapping] = None,
                            host_entry_id: str = "", path_to=None, path_points: int = 0) -> d.CarrierFigure:
        """Defect and carrier concentrations and the Fermi level against two or more rising temperatures (K) at one
        point (default: the window's first vertex), as SVG; quenched to operating_temperature_k when given. With
        `path_to` (a window vertex, number or name) the figure sweeps instead along the straight Δμ path from the
        point to that vertex at the one temperature in `temperatures_k` (`path_points` points, 0 = 41)."""
        statistics_code, form_code = d.counting(statistics, form)
        request = wire.defects_pb2.DefectCarrierFigureRequest(
            dataset=dataset, version=version, study_name=study_name, study_version=study_version,
            temperatures_k=[float(t) for t in temperatures_k], statistics=statistics_code, form=form_code,
            host_entry_id=host_entry_id, path_points=int(path_points))
        if operating_temperature_k is not None:
            request.operating_temperature_k = float(operating_temperature_k)
        chosen = d.conditions(vertex, point, gas)
        if chosen is not None:
            request.conditions.CopyFrom(chosen)
        if path_to is not None:
            request.path_to.CopyFrom(d.conditions(path_to, None, None))
        reply = self._call(self._defects.DrawCarrierFigure, self.draw_carrier_figure.hull_rpc, request)
        self._defect_warnings(reply.warnings)
        return d.CarrierFigure(r.version_used(reply.used), d.study_info(reply.study), d.point(reply.point), reply.svg,
                               tuple(reply.warnings))

    # --- ElectrochemistryService --------------------------------------------------------------------------------

    @_calls("ElectrochemistryService", "GetOpenElementHull")
    def get_open_element_hull(self, dataset: str, chemical_system: str, open_elements: Mapping[str, float], *,
                              version: int = 0, absolute: bool = False,
                              allow_above_reference: bool = False) -> pd.DataFrame:
        """The hull of `chemical_system` (every element, open ones included: "Li-Co-O") with elements open to a
        reservoir ({'O': -1.5}: Δμ relative to the element's reference, eV/atom; with `absolute`, μ on the total
        energies' scale). One row per entry in id order: grand potential and energy above the open hull per
        closed-element atom, decomposition (balancing the closed elements only). attrs: used, chemical_system,
        components (the closed elements), energy_axis, energy_unit, open_elements ({element: Δμ}), stable_phase_ids,
        facets (closed elements' chemical potentials), excluded_entry_ids (open elements only: the reservoir)."""
        reply = self._call(self._electrochemistry.GetOpenElementHull, self.get_open_element_hull.hull_rpc,
                           wire.electrochemistry_pb2.GetOpenElementHullRequest(
                               dataset=dataset, version=version, chemical_system=chemical_system,
                               open_elements=ec.open_elements(open_elements, absolute),
                               allow_above_reference=allow_above_reference))
        return ec.open_hull_frame(reply)

    @_calls("ElectrochemistryService", "GetVoltageProfile")
    def get_voltage_profile(self, dataset: str, host_formula: str, ion: str, *, version: int = 0,
                            charge_number: Optional[int] = None, inserted_end_formula: str = "",
                            include_figure: bool = False) -> ec.VoltageProfile:
        """The voltage profile of inserting `ion` ("Li") into the ion-poorest end-member `host_formula` ("CoO2"), up
        to `inserted_end_formula` ("LiCoO2"; default: until the ion's metal comes in): plateaus (a DataFrame: x
        range in ions per host formula unit, volts against the metal, phases), mean voltage, capacity and energy
        density. charge_number: z (default 1 for Li, Na, K; 2 for Mg, Ca, Zn). include_figure: also the step-curve
        figure (VoltageProfile.figure, SVG)."""
        reply = self._call(self._electrochemistry.GetVoltageProfile, self.get_voltage_profile.hull_rpc,
                           wire.electrochemistry_pb2.GetVoltageProfileRequest(
                               dataset=dataset, version=version, host_formula=host_formula, ion=ion,
                               inserted_end_formula=inserted_end_formula or "", include_figure=include_figure,
                               **ec.charge_number(charge_number)))
        return ec.voltage_profile(reply)

    @_calls("ElectrochemistryService", "GetReactionProfile")
    def get_reaction_profile(self, dataset: str, first: str, second: str, *, version: int = 0,
                             open_elements: Optional[Mapping[str, float]] = None, absolute: bool = False,
                             allow_above_reference: bool = False, include_figure: bool = False) -> ec.ReactionProfile:
        """The reaction energy of two phases in contact (each a formula, its lowest-energy entry, or 'entry:ID')
        over the whole mixing ratio: every breakpoint (a DataFrame, x = share of the mixture's atoms from `first`),
        the most negative and its products. open_elements as get_open_element_hull (energies then per
        closed-element atom). include_figure: also the profile figure (ReactionProfile.figure, SVG)."""
        reply = self._call(self._electrochemistry.GetReactionProfile, self.get_reaction_profile.hull_rpc,
                           wire.electrochemistry_pb2.GetReactionProfileRequest(
                               dataset=dataset, version=version, first=_compound(first), second=_compound(second),
                               open_elements=ec.open_elements(open_elements, absolute),
                               allow_above_reference=allow_above_reference, include_figure=include_figure))
        return ec.reaction_profile(reply)

    @_calls("ElectrochemistryService", "GetElectrochemicalWindow")
    def get_electrochemical_window(self, dataset: str, phase: str, ion: str, *, version: int = 0,
                                   charge_number: Optional[int] = None) -> ec.ElectrochemicalWindow:
        """The voltages against ion/ion+ ("Li": against Li/Li+) between which `phase` (a formula or 'entry:ID') is
        stable, Δμ of the ion at each end, and what the phase turns into beyond each."""
        reply = self._call(self._electrochemistry.GetElectrochemicalWindow, self.get_electrochemical_window.hull_rpc,
                           wire.electrochemistry_pb2.GetElectrochemicalWindowRequest(
                               dataset=dataset, version=version, phase=_compound(phase), ion=ion,
                               **ec.charge_number(charge_number)))
        return ec.electrochemical_window(reply)

    # --- ThermoService ------------------------------------------------------------------------------------------
    # Released oxygen and hot oxides or cathodes are a fire hazard: these are estimates, and real thermal and
    # thermal-runaway safety work follows local rules and licensed practice.

    @_calls("ThermoService", "GetGasPotential")
    def get_gas_potential(self, gas: Union[str, th.Gas], temperature_k: float, *, pressure_bar: Optional[float] = None,
                          dataset: str = "", version: int = 0, treatment: str = "tabulated",
                          reference_ev_per_atom: float = 0.0,
                          delta_mu_ev_per_atom: Optional[float] = None) -> th.GasPotential:
        """μ(T, p) of `gas` ("O2", or th.Gas(...) for a computed reference) per molecule and per atom with its parts,
        and Δμ against `dataset`'s reference for the element (without a dataset: reference_ev_per_atom). With
        delta_mu_ev_per_atom: the pressure at temperature_k and the temperature at pressure_bar that give it.
        treatment: "tabulated" (the gas's tabulated H(T), S(T)) or "ellingham" (H, S at 298.15 K)."""
        request = wire.thermo_pb2.GetGasPotentialRequest(
            dataset=dataset, version=version, gas=th.gas_conditions(gas, pressure_bar), temperature_k=temperature_k,
            treatment=th.treatment(treatment), reference_ev_per_atom=reference_ev_per_atom)
        if delta_mu_ev_per_atom is not None:
            request.delta_mu_ev_per_atom = delta_mu_ev_per_atom
        return th.gas_potential(self._call(self._thermo.GetGasPotential, self.get_gas_potential.hull_rpc, request))

    @_calls("ThermoService", "GetHullAtConditions")
    def get_hull_at_conditions(self, dataset: str, chemical_system: str, temperature_k: float, *,
                               gas: Union[str, th.Gas, None] = "O2", pressure_bar: Optional[float] = None,
                               models=None, treatment: str = "tabulated", version: int = 0) -> pd.DataFrame:
        """The hull of `chemical_system` ("Li-Co-O") at temperature_k with the gas's element open at Δμ(T, p) (gas=None:
        none open), the solids' free energies from `models` (see hullclient.thermo; default: the stored ones). One
        row per modelled entry (HULL_COLUMNS), energies per closed-element atom. attrs: used, chemical_system,
        components, energy_axis, energy_unit, temperature_k, treatment, gas (GasPoint), references ({element: entry
        id at T}), changed_references, stable_phase_ids, reservoir_entry_ids, unmodelled_entry_ids, models_from, caution."""
        request = wire.thermo_pb2.GetHullAtConditionsRequest(
            dataset=dataset, version=version, chemical_system=chemical_system, temperature_k=temperature_k,
            treatment=th.treatment(treatment), models=th.models(models))
        conditions = th.gas_conditions(gas, pressure_bar)
        if conditions is not None:
            request.gas.CopyFrom(conditions)
        return th.hull_frame(self._call(self._thermo.GetHullAtConditions, self.get_hull_at_conditions.hull_rpc, request))

    @_calls("ThermoService", "FindDecompositionTemperatures")
    def find_decomposition_temperatures(self, dataset: str, phase: str, from_k: float, to_k: float, *,
                                        gas: Union[str, th.Gas, None] = "O2", pressure_bar: Optional[float] = None,
                                        models=None, treatment: str = "tabulated", scan_intervals: int = 0,
                                        chemical_system: str = "", version: int = 0) -> th.DecompositionTemperatures:
        """Every temperature in [from_k, to_k] where `phase` (a formula, or 'entry:ID') decomposes or forms at the gas's
        pressure: sign changes of its signed decomposition energy (the phase minus the hull without its composition),
        exact under treatment="ellingham", root-solved on a scan (scan_intervals, default 256) otherwise; with what it
        turns into and the gas it gives off."""
        request = wire.thermo_pb2.FindDecompositionTemperaturesRequest(
            dataset=dataset, version=version, phase=_compound(phase), from_k=from_k, to_k=to_k,
            treatment=th.treatment(treatment), models=th.models(models), scan_intervals=scan_intervals,
            chemical_system=chemical_system)
        conditions = th.gas_conditions(gas, pressure_bar)
        if conditions is not None:
            request.gas.CopyFrom(conditions)
        return th.decomposition_temperatures(
            self._call(self._thermo.FindDecompositionTemperatures, self.find_decomposition_temperatures.hull_rpc, request))

    @_calls("ThermoService", "DrawTemperatureFigure")
    def draw_temperature_figure(self, dataset: str, phases: Sequence[str], from_k: float, to_k: float, *,
                                gas: Union[str, th.Gas, None] = "O2", pressure_bar: Optional[float] = None,
                                models=None, treatment: str = "tabulated", samples: int = 0,
                                chemical_system: str = "", version: int = 0) -> th.TemperatureFigure:
        """The signed decomposition energies of one to eight `phases` (formulas or 'entry:ID') against temperature at
        the gas's pressure, as SVG (TemperatureFigure.svg, .save(path)), with each phase's crossings."""
        request = wire.thermo_pb2.DrawTemperatureFigureRequest(
            dataset=dataset, version=version, phases=[_compound(p) for p in phases], from_k=from_k, to_k=to_k,
            treatment=th.treatment(treatment), models=th.models(models), samples=samples, chemical_system=chemical_system)
        conditions = th.gas_conditions(gas, pressure_bar)
        if conditions is not None:
            request.gas.CopyFrom(conditions)
        return th.temperature_figure(self._call(self._thermo.DrawTemperatureFigure, self.draw_temperature_figure.hull_rpc, request))

    # --- CurationService ----------------------------------------------------------------------------------------

    @_calls("CurationService", "CurateVersion")
    def curate_version(self, dataset: str, recipe, *, source_version: int = 0, note: str = "") -> r.CuratedVersion:
        """Runs a recipe (a recipe file's path, its JSON text, or the same as a dict) on a version (0 = the latest) and
        writes what is left as the dataset's next version, with its curation record; all or nothing."""
        if isinstance(recipe, Mapping):
            text = json.dumps(recipe)
        elif isinstance(recipe, Path) or (isinstance(recipe, str) and "\n" not in recipe and _is_file(recipe)):
            text = Path(recipe).read_text(encoding="utf-8")
        else:
            text = recipe
        reply = self._call(self._curation.CurateVersion, self.curate_version.hull_rpc,
                           wire.curation_pb2.CurateVersionRequest(dataset=dataset, source_version=source_version,
                                                                  recipe_json=text, note=note))
        return r.CuratedVersion(reply.dataset_version, reply.entry_count, reply.content_sha256, r.curation_record(reply.record),
                                r.corrections_used(reply))

    @_calls("CurationService", "GetCurationRecord")
    def get_curation_record(self, dataset: str, version: int) -> r.CurationRecord:
        """How a version was derived: source version and fingerprint, the recipe (CurationRecord.recipe_json, which
        curate_version takes again; .save_recipe(path)) and one row per step with its counts."""
        reply = self._call(self._curation.GetCurationRecord, self.get_curation_record.hull_rpc,
                           wire.curation_pb2.GetCurationRecordRequest(dataset=dataset, version=version))
        return r.curation_record(reply)
