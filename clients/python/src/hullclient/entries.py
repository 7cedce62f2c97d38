"""Entries as the user holds them (a DataFrame, a CSV or JSON file) turned into wire entries, row by row.

The file layouts are the CLI's (src/Hull.Cli/README.md, "Entry files"): columns `id, formula, energy_ev, basis,
note, sigma_ev_per_atom, correlation_group, method` (the last four optional; sigma empty or NaN for none; method the
computational method's tag that correction sets name, empty for untagged); CSV with a header line, RFC 4180 quotes, blank lines and lines starting with `#`
skipped; JSON as `{"entries": [...]}` or a bare array of objects. Basis tokens come from the contract's enum names
(`ENERGY_BASIS_TOTAL_PER_ATOM` is `total_per_atom`), as the CLI derives them.

Temperature models (optional): `standard_entropy_j_per_mol_k` (S° per formula unit; empty/NaN for none) and
`temperature_model_formula` (the formula unit the model's values refer to; empty for the entry's own). A G(T) table
is a `free_energy_table` cell (JSON files and DataFrames): `{"anchor": "fitted_298k", "rows": [{"temperature_k":
300, "free_energy_above_anchor_ev": -0.377}, ...]}` (G(T) − H(anchor) per formula unit, eV); or, for any entries, a separate table in the CLI's table-file layout
(`entry_id, anchor, temperature_k, free_energy_above_anchor_ev`, one point per row) given as `free_energy_tables=`.
Anchor tokens come from the contract's FreeEnergyAnchor names (`FREE_ENERGY_ANCHOR_FITTED_298K` is `fitted_298k`).
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

PLAIN_COLUMNS = ("id", "formula", "energy_ev", "basis", "note")
ENTROPY = "standard_entropy_j_per_mol_k"
MODEL_FORMULA = "temperature_model_formula"
TABLE = "free_energy_table"
SIGMA = "sigma_ev_per_atom"
GROUP = "correlation_group"
METHOD = "method"
MODEL_COLUMNS = (ENTROPY, MODEL_FORMULA, TABLE)
UNCERTAINTY_COLUMNS = (SIGMA, GROUP)
METHOD_COLUMNS = (METHOD,)
# Every column an entry file or frame may have, in this order: an export has the model columns only when some entry
# has a model, the uncertainty columns only when some entry has a sigma or a correlation group, and the method
# column (last) only when some entry has a tag.
COLUMNS = PLAIN_COLUMNS + MODEL_COLUMNS + UNCERTAINTY_COLUMNS + METHOD_COLUMNS
REQUIRED_COLUMNS = ("id", "formula", "energy_ev", "basis")
TABLE_FILE_COLUMNS = ("entry_id", "anchor", "temperature_k", "free_energy_above_anchor_ev")
_ENUM_PREFIX = "ENERGY_BASIS_"
_ANCHOR_PREFIX = "FREE_ENERGY_ANCHOR_"


def _tokens(enum, prefix):
    """A contract enum's values by token (the name in lower case without its prefix), UNSPECIFIED (0) left out."""
    return {name[len(prefix):].lower(): value for name, value in enum.items() if value != 0}


def _token(enum, prefix, value):
    return enum.Name(value)[len(prefix):].lower() if value else ""


def basis_tokens():
    """The basis tokens, from the contract: {token: enum value}, UNSPECIFIED left out."""
    return _tokens(entries_pb2.EnergyBasis, _ENUM_PREFIX)


def basis_token(value: int) -> str:
    return _token(entries_pb2.EnergyBasis, _ENUM_PREFIX, value)


def anchor_tokens():
    """The free-energy anchor tokens, from the contract: {token: enum value}, UNSPECIFIED left out."""
    return _tokens(entries_pb2.FreeEnergyAnchor, _ANCHOR_PREFIX)


def anchor_token(value: int) -> str:
    return _token(entries_pb2.FreeEnergyAnchor, _ANCHOR_PREFIX, value)


def _anchor(where, token):
    tokens = anchor_tokens()
    if not isinstance(token, str) or token.strip() not in tokens:
        raise EntryInputError(where, f"anchor '{token}' is not one of {', '.join(tokens)} (computed_0k: the entry's energy "
                                     "is a computed energy at 0 K; fitted_298k: it stands for H°(298.15 K))")
    return tokens[token.strip()]


def _number(where, column, value, unit):
    try:
        number = float(value.strip()) if isinstance(value, str) else float(value)
    except (TypeError, ValueError):
        number = math.nan
    if isinstance(value, bool) or not math.isfinite(number):
        raise EntryInputError(where, f"column '{column}': '{value}' is not a finite number of {unit}")
    return number


def _missing(value):
    return value is None or (isinstance(value, float) and math.isnan(value)) or (isinstance(value, str) and not value.strip())


def _table_cell(where, cell):
    """A `free_energy_table` cell (the JSON layout) as the wire's table."""
    if not isinstance(cell, dict) or set(cell) - {"anchor", "rows"}:
        raise EntryInputError(where, f"column '{TABLE}': expected {{\"anchor\": ..., \"points\": [...]}}, not {cell!r}")
    table = entries_pb2.EntryFreeEnergyTable(anchor=_anchor(f"{where}, {TABLE}", cell.get("anchor")))
    rows = cell.get("rows")
    if not isinstance(rows, (list, tuple)):
        raise EntryInputError(where, f"column '{TABLE}': 'rows' must be a list of {{temperature_k, free_energy_above_anchor_ev}}")
    for k, point in enumerate(rows):
        at = f"{where}, {TABLE} rows[{k}]"
        if not isinstance(point, dict) or set(point) != {"temperature_k", "free_energy_above_anchor_ev"}:
            raise EntryInputError(at, "expected {\"temperature_k\": ..., \"free_energy_above_anchor_ev\": ...}")
        table.rows.add(temperature_k=_number(at, "temperature_k", point["temperature_k"], "K"),
                         free_energy_above_anchor_ev=_number(at, "free_energy_above_anchor_ev", point["free_energy_above_anchor_ev"], "eV"))
    return table


def _model(where, record):
    """The entry's temperature model from its cells, or None; both kinds on one entry are refused."""
    entropy, table = record.get(ENTROPY), record.get(TABLE)
    formula = _text(record, MODEL_FORMULA).strip()
    has_entropy, has_table = not _missing(entropy), not (table is None or (isinstance(table, float) and math.isnan(table)))
    if has_entropy and has_table:
        raise EntryInputError(where, f"both '{ENTROPY}' and '{TABLE}' are given; an entry has one temperature model")
    if not (has_entropy or has_table or formula):
        return None
    model = entries_pb2.EntryTemperatureModel(formula=formula)
    if has_entropy:
        model.standard_entropy_j_per_mol_k = _number(where, ENTROPY, entropy, "J/(mol K)")
    if has_table:
        model.free_energy_table.CopyFrom(_table_cell(where, table))
    return model


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
                              correlation_group=_text(record, GROUP).strip(), method=_text(record, METHOD).strip())
    sigma = _sigma(where, record.get(SIGMA))
    if sigma is not None:
        entry.energy_sigma_ev_per_atom = sigma
    model = _model(where, record)
    if model is not None:
        entry.temperature_model.CopyFrom(model)
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
                    if c not in COLUMNS or c == TABLE:
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
        raise EntryInputError(str(path), f"no header line; the first line must name the columns, e.g. {','.join(PLAIN_COLUMNS)}")
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
        unknown = [k for k in item if k not in COLUMNS]  # free_energy_table included: JSON nests a table
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
    """An entry file as a DataFrame with the columns id, formula, energy_ev, basis, note, the temperature-model
    columns when an entry has a model, and the uncertainty columns when an entry has a sigma or a correlation group
    (checked row by row)."""
    prepared = from_file(path)
    return to_frame(prepared.entries)


def _table_dict(table):
    return {"anchor": anchor_token(table.anchor),
            "rows": [{"temperature_k": p.temperature_k, "free_energy_above_anchor_ev": p.free_energy_above_anchor_ev} for p in table.rows]}


def to_frame(entries) -> pd.DataFrame:
    """Wire entries as a DataFrame with the file columns (basis as its token); with the temperature-model columns
    (S° or NaN, the model's formula, the G(T) table as a dict or None) only when some entry has a model, then the
    uncertainty columns (sigma_ev_per_atom or NaN, correlation_group or "") only when some entry has either, then the
    method column (the tag or "") only when some entry has one."""
    frame = pd.DataFrame({
        "id": [e.id for e in entries],
        "formula": [e.formula for e in entries],
        "energy_ev": pd.Series([e.energy_ev for e in entries], dtype="float64"),
        "basis": [basis_token(e.basis) for e in entries],
        "note": [e.note for e in entries],
    }, columns=list(PLAIN_COLUMNS))
    if any(e.HasField("temperature_model") for e in entries):
        models = [e.temperature_model if e.HasField("temperature_model") else None for e in entries]
        frame[ENTROPY] = pd.Series([m.standard_entropy_j_per_mol_k if m is not None and m.WhichOneof("kind") == ENTROPY
                                    else math.nan for m in models], dtype="float64")
        frame[MODEL_FORMULA] = [m.formula if m is not None else "" for m in models]
        frame[TABLE] = pd.Series([_table_dict(m.free_energy_table) if m is not None and m.WhichOneof("kind") == TABLE
                                  else None for m in models], dtype="object")
    if any(e.HasField("energy_sigma_ev_per_atom") or e.correlation_group for e in entries):
        frame[SIGMA] = pd.Series([e.energy_sigma_ev_per_atom if e.HasField("energy_sigma_ev_per_atom") else math.nan
                                  for e in entries], dtype="float64")
        frame[GROUP] = [e.correlation_group for e in entries]
    if any(e.method for e in entries):
        frame[METHOD] = [e.method for e in entries]
    return frame


def tables_from_frame(tables, name="free_energy_tables"):
    """A G(T) table frame (or the path of a table CSV) in the table-file layout as {entry id: (table, where)}."""
    if isinstance(tables, (str, Path)):
        name = str(tables)
        tables = pd.read_csv(tables, comment="#", dtype={"entry_id": str, "anchor": str}, keep_default_na=False,
                             skipinitialspace=True)
        rows = [(f"{name}:{i + 2}", record) for i, record in enumerate(tables.to_dict("records"))]
    elif isinstance(tables, pd.DataFrame):
        rows = [(f"{name} row {label!r}", record) for label, record in zip(tables.index, tables.to_dict("records"))]
    else:
        raise TypeError(f"free_energy_tables must be a pandas DataFrame or the path of a table CSV, not {type(tables).__name__}")
    if list(tables.columns) != list(TABLE_FILE_COLUMNS) and set(tables.columns) != set(TABLE_FILE_COLUMNS):
        raise EntryInputError(name, f"columns {', '.join(map(str, tables.columns))}; a G(T) table has the columns {', '.join(TABLE_FILE_COLUMNS)}")
    found = {}
    for where, record in rows:
        ident = _text(record, "entry_id").strip()
        if not ident:
            raise EntryInputError(where, "column 'entry_id' is empty")
        anchor = _anchor(where, record["anchor"])
        if ident in found:
            table, first, first_anchor_text = found[ident]
            if table.anchor != anchor:
                raise EntryInputError(where, f"entry '{ident}': anchor '{record['anchor']}' differs from '{first_anchor_text}' "
                                             f"at {first}; one table has one anchor")
        else:
            table = entries_pb2.EntryFreeEnergyTable(anchor=anchor)
            found[ident] = (table, where, record["anchor"])
        table.rows.add(temperature_k=_number(where, "temperature_k", record["temperature_k"], "K"),
                         free_energy_above_anchor_ev=_number(where, "free_energy_above_anchor_ev", record["free_energy_above_anchor_ev"], "eV"))
    if not found:
        raise EntryInputError(name, "no rows")
    return {ident: (table, where) for ident, (table, where, _) in found.items()}


def attach_tables(prepared: PreparedEntries, tables, name="free_energy_tables") -> PreparedEntries:
    """The entries with G(T) tables from a table frame attached; an id without an entry, or an entry that already
    has a model (S° or a table), is refused naming both places."""
    by_id = {e.id: i for i, e in enumerate(prepared.entries)}
    entries = list(prepared.entries)
    for ident, (table, where) in tables_from_frame(tables, name).items():
        if ident not in by_id:
            raise EntryInputError(where, f"entry '{ident}' is not among the entries imported with it")
        i = by_id[ident]
        entry = entries_pb2.Entry()
        entry.CopyFrom(entries[i])
        if entry.HasField("temperature_model") and entry.temperature_model.WhichOneof("kind"):
            kind = "a standard entropy" if entry.temperature_model.WhichOneof("kind") == ENTROPY else "a G(T) table"
            raise EntryInputError(where, f"entry '{ident}' already has {kind} ({prepared.origins[i]}); an entry has one temperature model")
        entry.temperature_model.free_energy_table.CopyFrom(table)
        entries[i] = entry
    return PreparedEntries(entries, list(prepared.origins))


def _require_kinds(prepared: PreparedEntries) -> PreparedEntries:
    for entry, where in zip(prepared.entries, prepared.origins):
        if entry.HasField("temperature_model") and not entry.temperature_model.WhichOneof("kind"):
            raise EntryInputError(where, f"the temperature-model formula '{entry.temperature_model.formula}' is given but the "
                                         f"entry has neither '{ENTROPY}' nor a G(T) table")
    return prepared


def write_entries(frame: pd.DataFrame, path) -> Path:
    """Writes entries (an export, or any frame with the entry columns) as a CSV or JSON entry file, by the path's
    suffix, in the layouts `read_entries`, `import_table` and `hull import` read; every row is checked first, so a
    bad row is refused naming it and no file is written. Energies keep every digit (shortest round-trip text)."""
    target = Path(path)
    suffix = target.suffix.lower()
    if suffix not in (".csv", ".json"):
        raise EntryInputError(str(target), "unknown file type: an entry file ends in .csv or .json")
    checked = to_frame(_require_kinds(from_frame(frame)).entries)
    records = checked.to_dict("records")
    models = ENTROPY in checked.columns
    uncertainties = SIGMA in checked.columns
    if suffix == ".json":
        # The CLI's JSON layout: a model's and an uncertainty's fields only on the entries that have them.
        for r in records:
            for column in (ENTROPY, MODEL_FORMULA, SIGMA, GROUP):
                if column in r and _missing(r[column]):
                    del r[column]
            if TABLE in r and r[TABLE] is None:
                del r[TABLE]
        target.write_text(json.dumps({"entries": records}, indent=1, ensure_ascii=False) + "\n", encoding="utf-8")
        return target
    if models and checked[TABLE].notna().any():
        raise EntryInputError(str(target), "G(T) tables do not fit in a CSV entry file: write a .json file, or the tables "
                                           "with write_free_energy_tables and the entries without them")
    with target.open("w", newline="", encoding="utf-8") as handle:
        writer = csv.writer(handle, lineterminator="\n")
        writer.writerow(PLAIN_COLUMNS + ((ENTROPY, MODEL_FORMULA) if models else ()) + (UNCERTAINTY_COLUMNS if uncertainties else ()))
        for r in records:
            row = [r["id"], r["formula"], repr(float(r["energy_ev"])), r["basis"], r["note"]]
            if models:
                row += ["" if math.isnan(r[ENTROPY]) else repr(float(r[ENTROPY])), r[MODEL_FORMULA]]
            if uncertainties:
                row += ["" if math.isnan(r[SIGMA]) else repr(float(r[SIGMA])), r[GROUP]]
            writer.writerow(row)
    return target


def write_free_energy_tables(frame: pd.DataFrame, path) -> Path:
    """Writes the G(T) tables of an entry frame (its `free_energy_table` cells) as a table CSV in the layout
    `hull import --free-energy-tables` and `free_energy_tables=` read; every digit kept."""
    target = Path(path)
    checked = from_frame(frame)
    with target.open("w", newline="", encoding="utf-8") as handle:
        writer = csv.writer(handle, lineterminator="\n")
        writer.writerow(TABLE_FILE_COLUMNS)
        for e in checked.entries:
            if e.HasField("temperature_model") and e.temperature_model.WhichOneof("kind") == TABLE:
                for p in e.temperature_model.free_energy_table.rows:
                    writer.writerow([e.id, anchor_token(e.temperature_model.free_energy_table.anchor), repr(p.temperature_k),
                                     repr(p.free_energy_above_anchor_ev)])
    return target


def prepare(source, name=None, free_energy_tables=None) -> PreparedEntries:
    """A DataFrame, a path to an entry file, or already prepared entries; with `free_energy_tables` (a frame or the
    path of a table CSV) their G(T) tables attached."""
    if isinstance(source, PreparedEntries):
        prepared = source
    elif isinstance(source, pd.DataFrame):
        prepared = from_frame(source, name or "DataFrame")
    elif isinstance(source, (str, Path)):
        prepared = from_file(source)
    else:
        raise TypeError(f"entries must be a pandas DataFrame or the path of a .csv/.json entry file, not {type(source).__name__}")
    if free_energy_tables is not None:
        prepared = attach_tables(prepared, free_energy_tables)
    return _require_kinds(prepared)
