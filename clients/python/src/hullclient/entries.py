"""Entries as the user holds them (a DataFrame, a CSV or JSON file) turned into wire entries, row by row.

The file layouts are the CLI's (src/Hull.Cli/README.md, "Entry files"): columns `id, formula, energy_ev, basis,
note, sigma_ev_per_atom, correlation_group` (the last three optional; sigma empty or NaN for none); CSV with a header line, RFC 4180 quotes, blank lines and lines starting with `#`
skipped; JSON as `{"entries": [...]}` or a bare array of objects. Basis tokens come from the contract's enum names
(`ENERGY_BASIS_TOTAL_PER_ATOM` is `total_per_atom`), as the CLI derives them.
"""

import csv
import json
import math
from dataclasses import dataclass
from pathlib import Path
from typing import List

import pandas as pd

from hullclient._stubs import entries_pb2
from hullclient.errors import EntryInputError

COLUMNS = ("id", "formula", "energy_ev", "basis", "note", "sigma_ev_per_atom", "correlation_group")
REQUIRED_COLUMNS = ("id", "formula", "energy_ev", "basis")
_ENUM_PREFIX = "ENERGY_BASIS_"


def basis_tokens():
    """The basis tokens, from the contract: {token: enum value}, UNSPECIFIED left out."""
    return {name[len(_ENUM_PREFIX):].lower(): value
            for name, value in entries_pb2.EnergyBasis.items() if value != entries_pb2.ENERGY_BASIS_UNSPECIFIED}


def basis_token(value: int) -> str:
    name = entries_pb2.EnergyBasis.Name(value)
    return name[len(_ENUM_PREFIX):].lower() if value else ""


@dataclass(frozen=True)
class PreparedEntries:
    """Wire entries with, for each, where it came from (a file line or a DataFrame index label)."""

    entries: List[entries_pb2.Entry]
    origins: List[str]

    def __len__(self):
        return len(self.entries)


def _text(record, column):
    """A text cell; a missing one (None, or NaN as pandas fills gaps) is empty, never the text 'nan'."""
    value = record.get(column)
    if value is None or (isinstance(value, float) and math.isnan(value)):
        return ""
    return str(value)


def _entry(where, record):
    ident = _text(record, "id").strip()
    formula = _text(record, "formula").strip()
    if not ident:
        raise EntryInputError(where, "column 'id' is empty")
    if not formula:
        raise EntryInputError(where, "column 'formula' is empty")
    energy = record.get("energy_ev")
    try:
        value = float(energy.strip()) if isinstance(energy, str) else float(energy)
    except (TypeError, ValueError):
        value = math.nan
    if isinstance(energy, bool) or not math.isfinite(value):
        raise EntryInputError(where, f"column 'energy_ev': '{energy}' is not a finite number (use a '.' decimal point, e.g. -2.345)")
    token = _text(record, "basis").strip()
    tokens = basis_tokens()
    if token not in tokens:
        raise EntryInputError(where, f"column 'basis': '{token}' is not one of {', '.join(tokens)}")
    note = _text(record, "note")
    entry = entries_pb2.Entry(id=ident, formula=formula, energy_ev=value, basis=tokens[token], note=note,
                              correlation_group=_text(record, "correlation_group").strip())
    sigma = _sigma(where, record.get("sigma_ev_per_atom"))
    if sigma is not None:
        entry.energy_sigma_ev_per_atom = sigma
    return entry


def _sigma(where, cell):
    """An energy uncertainty cell: None (also empty text or NaN) for none, else a finite number >= 0 of eV/atom."""
    if cell is None or (isinstance(cell, str) and not cell.strip()) or (isinstance(cell, float) and math.isnan(cell)):
        return None
    try:
        value = float(cell.strip()) if isinstance(cell, str) else float(cell)
    except (TypeError, ValueError):
        value = math.nan
    if isinstance(cell, bool) or not math.isfinite(value) or value < 0:
        raise EntryInputError(where, f"column 'sigma_ev_per_atom': '{cell}' is not an energy uncertainty: "
                                     "give a finite number >= 0 of eV/atom, or leave it empty")
    return value


def from_frame(frame: pd.DataFrame, name: str = "DataFrame") -> PreparedEntries:
    """Wire entries from a DataFrame with the entry columns; a bad row is named by its index label."""
    if not isinstance(frame, pd.DataFrame):
        raise TypeError(f"expected a pandas DataFrame of entries, got {type(frame).__name__}")
    unknown = [c for c in frame.columns if c not in COLUMNS]
    if unknown:
        raise EntryInputError(name, f"unknown column(s) {', '.join(map(str, unknown))}; the columns are {', '.join(COLUMNS)}")
    missing = [c for c in REQUIRED_COLUMNS if c not in frame.columns]
    if missing:
        raise EntryInputError(name, f"no column {', '.join(repr(c) for c in missing)}; the columns are {', '.join(COLUMNS)}")
    entries, origins = [], []
    for label, row in zip(frame.index, frame.to_dict("records")):
        where = f"{name} row {label!r}"
        entries.append(_entry(where, row))
        origins.append(where)
    return PreparedEntries(entries, origins)


def _read_csv(path: Path):
    records = []
    columns = None
    with path.open(newline="", encoding="utf-8-sig") as handle:
        reader = csv.reader(handle)
        for fields in reader:
            line = reader.line_num
            if len(fields) == 0 or (len(fields) == 1 and not fields[0].strip()):
                continue
            if fields[0].lstrip().startswith("#"):
                continue
            if columns is None:
                columns = [f.strip() for f in fields]
                for c in columns:
                    if c not in COLUMNS:
                        raise EntryInputError(f"{path}:{line}", f"unknown column '{c}' in the header; the columns are {', '.join(COLUMNS)}")
                    if columns.count(c) > 1:
                        raise EntryInputError(f"{path}:{line}", f"column '{c}' appears twice in the header")
                for c in REQUIRED_COLUMNS:
                    if c not in columns:
                        raise EntryInputError(f"{path}:{line}", f"the header has no '{c}' column")
                continue
            if len(fields) != len(columns):
                raise EntryInputError(f"{path}:{line}", f"{len(fields)} fields, but the header has {len(columns)} ({','.join(columns)})")
            records.append((f"{path}:{line}", dict(zip(columns, fields))))
    if columns is None:
        raise EntryInputError(str(path), f"no header line; the first line must name the columns, e.g. {','.join(COLUMNS)}")
    return records


def _read_json(path: Path):
    try:
        document = json.loads(path.read_text(encoding="utf-8-sig"))
    except json.JSONDecodeError as e:
        raise EntryInputError(f"{path}:{e.lineno}", f"not valid JSON: {e.msg} at column {e.colno}") from e
    items = document.get("entries") if isinstance(document, dict) else document
    if not isinstance(items, list):
        raise EntryInputError(str(path), 'expected {"entries": [...]} or a bare array of entry objects')
    records = []
    for i, item in enumerate(items):
        where = f"{path} entries[{i}]"
        if not isinstance(item, dict):
            raise EntryInputError(where, "not an object with the fields id, formula, energy_ev, basis, note")
        unknown = [k for k in item if k not in COLUMNS]
        if unknown:
            raise EntryInputError(where, f"unknown field(s) {', '.join(unknown)}; the fields are {', '.join(COLUMNS)}")
        records.append((where, item))
    return records


def _records(path):
    path = Path(path)
    if not path.is_file():
        raise EntryInputError(str(path), "no such file")
    if path.suffix.lower() == ".json":
        return _read_json(path)
    if path.suffix.lower() == ".csv":
        return _read_csv(path)
    raise EntryInputError(str(path), "unknown file type: an entry file ends in .csv or .json")


def from_file(path) -> PreparedEntries:
    """Wire entries from a CSV or JSON entry file; a bad row is named by file and line (CSV) or index (JSON)."""
    entries, origins = [], []
    for where, record in _records(path):
        entries.append(_entry(where, record))
        origins.append(where)
    return PreparedEntries(entries, origins)


def read_entries(path) -> pd.DataFrame:
    """An entry file as a DataFrame with the columns id, formula, energy_ev, basis, note (checked row by row)."""
    prepared = from_file(path)
    return to_frame(prepared.entries)


def to_frame(entries) -> pd.DataFrame:
    """Wire entries as a DataFrame with the file columns (basis as its token)."""
    return pd.DataFrame({
        "id": [e.id for e in entries],
        "formula": [e.formula for e in entries],
        "energy_ev": pd.Series([e.energy_ev for e in entries], dtype="float64"),
        "basis": [basis_token(e.basis) for e in entries],
        "note": [e.note for e in entries],
        "sigma_ev_per_atom": pd.Series([e.energy_sigma_ev_per_atom if e.HasField("energy_sigma_ev_per_atom") else math.nan
                                        for e in entries], dtype="float64"),
        "correlation_group": [e.correlation_group for e in entries],
    }, columns=list(COLUMNS))


def write_entries(frame: pd.DataFrame, path) -> Path:
    """Writes entries (an export, or any frame with the entry columns) as a CSV or JSON entry file, by the path's
    suffix, in the layouts `read_entries`, `import_table` and `hull import` read; every row is checked first, so a
    bad row is refused naming it and no file is written. Energies keep every digit (shortest round-trip text)."""
    target = Path(path)
    suffix = target.suffix.lower()
    if suffix not in (".csv", ".json"):
        raise EntryInputError(str(target), "unknown file type: an entry file ends in .csv or .json")
    checked = to_frame(from_frame(frame).entries)
    records = checked.to_dict("records")
    if suffix == ".json":
        for record in records:
            if math.isnan(record["sigma_ev_per_atom"]):
                del record["sigma_ev_per_atom"]
            if not record["correlation_group"]:
                del record["correlation_group"]
        target.write_text(json.dumps({"entries": records}, indent=1, ensure_ascii=False) + "\n", encoding="utf-8")
        return target
    with target.open("w", newline="", encoding="utf-8") as handle:
        writer = csv.writer(handle, lineterminator="\n")
        writer.writerow(COLUMNS)
        for r in records:
            sigma = "" if math.isnan(r["sigma_ev_per_atom"]) else repr(float(r["sigma_ev_per_atom"]))
            writer.writerow([r["id"], r["formula"], repr(float(r["energy_ev"])), r["basis"], r["note"], sigma, r["correlation_group"]])
    return target


def prepare(source, name=None) -> PreparedEntries:
    """A DataFrame, a path to an entry file, or already prepared entries."""
    if isinstance(source, PreparedEntries):
        return source
    if isinstance(source, pd.DataFrame):
        return from_frame(source, name or "DataFrame")
    if isinstance(source, (str, Path)):
        return from_file(source)
    raise TypeError(f"entries must be a pandas DataFrame or the path of a .csv/.json entry file, not {type(source).__name__}")
