"""Results as small frozen dataclasses and DataFrames with unit-bearing column names.

Tabular answers are DataFrames whose `attrs` carry what the answer was computed from: `used` (VersionUsed),
`references` and `coverage` (tuples of the dataclasses below) and, where the call has them, `system_problems` and
`hull_systems`. Decompositions are structured columns: `decomposition` holds a tuple of DecompositionProduct,
`reaction` the balanced reaction text; `decomposition_products(frame)` unfolds them into one row per product.
"""

import json
import math
from dataclasses import dataclass, field
from datetime import datetime, timezone
from pathlib import Path
from typing import Dict, Optional, Tuple

import pandas as pd


@dataclass(frozen=True)
class CorrectionsUsed:
    """The correction set a version was derived with, and the version of the same dataset it corrected."""
    set_name: str
    set_version: int
    source_version: int


@dataclass(frozen=True)
class VersionUsed:
    dataset: str
    version: int
    content_sha256: str
    # None for a version imported as given.
    corrections: Optional[CorrectionsUsed] = None


@dataclass(frozen=True)
class ElementReference:
    symbol: str
    total_energy_ev_per_atom: float
    # The pure-element entry that set it; empty when the caller gave it.
    source_entry_id: str
    given_by_caller: bool


@dataclass(frozen=True)
class ElementCoverage:
    symbol: str
    pure_entry_count: int
    # No entry of the element: its corner is at formation energy 0 by definition.
    zero_by_definition: bool
    reference: Optional[ElementReference]


@dataclass(frozen=True)
class SystemCoverage:
    chemical_system: str
    elements: Tuple[ElementCoverage, ...]
    entry_count: int
    competing_phase_count: int

    @property
    def is_screening_result(self) -> bool:
        """False when an element stands at 0 by definition or the system holds no competing phase."""
        return self.competing_phase_count > 0 and not any(e.zero_by_definition for e in self.elements)


@dataclass(frozen=True)
class SystemProblem:
    chemical_system: str
    elements_without_reference: Tuple[str, ...]
    cause_entry_ids: Tuple[str, ...]
    unanswered_entry_ids: Tuple[str, ...]
    unanswered_entry_count: int
    message: str


@dataclass(frozen=True)
class DecompositionProduct:
    phase_id: str
    is_elemental_reference: bool
    formula: str
    atom_fraction: float
    # Formula units of the phase from one formula unit of the decomposed composition as written.
    formula_units: float
    # The same as an exact fraction ("1/4") when the reaction was balanced exactly; empty otherwise.
    formula_units_exact: str
    formation_energy_ev_per_atom: float


@dataclass(frozen=True)
class Dataset:
    name: str
    description: str
    created_at: Optional[datetime]
    latest_version: int
    entry_count: int


@dataclass(frozen=True)
class DatasetDescription:
    dataset: Dataset
    # One row per live version, oldest first (columns as list_versions).
    versions: pd.DataFrame = field(compare=False)


@dataclass(frozen=True)
class ImportResult:
    dataset_version: int
    inserted_count: int
    replaced_count: int


@dataclass(frozen=True)
class ImportSession:
    session_id: str
    dataset: str
    staged_count: int
    expires_at: Optional[datetime]
    idle_expiry_seconds: int


@dataclass(frozen=True)
class ServerLimits:
    max_components_per_system: int
    max_entries_per_system: int
    max_compositions_per_request: int
    max_receive_message_bytes: int
    max_send_message_bytes: int


@dataclass(frozen=True)
class CacheStatistics:
    hull_builds: int
    hull_cache_hits: int
    version_loads: int
    dataset_analyses: int
    cached_hulls: int


@dataclass(frozen=True)
class ServerHealth:
    store_location: str
    store_usable: bool
    store_problem: str
    cluster_name: str
    active_members: int
    member_status: str
    grain_hull_builds: int


class SvgText:
    """A figure drawn by the server, for dataclasses with an `svg` field (the SVG text): save() writes it, and
    notebooks draw it inline."""

    def save(self, path) -> Path:
        """Writes the SVG (UTF-8) and returns the path."""
        target = Path(path)
        target.write_text(self.svg, encoding="utf-8")
        return target

    def _repr_svg_(self):
        return self.svg


@dataclass(frozen=True)
class Figure(SvgText):
    """A phase diagram drawn by the server: SVG text and what it shows."""

    used: VersionUsed
    chemical_system: str
    components: Tuple[str, ...]
    kind: str
    svg: str = field(repr=False)
    stable_phase_count: int
    edge_count: int
    unstable_shown_count: int
    hidden_above_cutoff_count: int
    max_above_hull_ev_per_atom: float


@dataclass(frozen=True)
class OddsFigure(SvgText):
    """The ternary of vertex probabilities drawn by the server: SVG text, and the sampling behind it."""

    used: VersionUsed
    chemical_system: str
    svg: str = field(repr=False)
    sample_count: int
    seed: int


@dataclass(frozen=True)
class HullFacets:
    used: VersionUsed
    chemical_system: str
    components: Tuple[str, ...]
    # One row per facet: `phase_ids` (tuple) and `chemical_potential_<component>_ev_per_atom` per component.
    facets: pd.DataFrame = field(compare=False)
    # first_phase_id, second_phase_id.
    tie_lines: pd.DataFrame = field(compare=False)
    # As get_stable_phases.
    stable_phases: pd.DataFrame = field(compare=False)
    coverage: Tuple[SystemCoverage, ...] = ()
    references: Tuple[ElementReference, ...] = ()


@dataclass(frozen=True)
class WindowSize:
    dimension: int
    measure_in_plane_ev_pow_k: float
    projected_measure_ev_pow_k: float
    projection_elements: Tuple[str, ...]


@dataclass(frozen=True)
class StabilityWindow:
    """A compound's chemical-potential window; Δμ of each element relative to its reference, eV."""

    entry_id: str
    formula: str
    chemical_system: str
    elements: Tuple[str, ...]
    kind: str
    # -1 when there is no window.
    dimension: int
    energy_above_hull_ev_per_atom: float
    reaction: str
    decomposition: Tuple[DecompositionProduct, ...]
    lowered_by_ev_per_atom: Optional[float]
    coexisting_phase_ids: Tuple[str, ...]
    # One row per vertex: `delta_mu_<element>_ev` per element, limiting_phase_ids, elements_at_reference and
    # `volts_against_<element>_metal` for ion-conducting elements.
    vertices: pd.DataFrame = field(compare=False)
    size: Optional[WindowSize] = None
    # One row per element: element, highest_ev, lowest_ev, highest_at_vertices, lowest_at_vertices.
    extremes: pd.DataFrame = field(default_factory=pd.DataFrame, compare=False)


@dataclass(frozen=True)
class WindowAnswer:
    used: VersionUsed
    window: StabilityWindow


@dataclass(frozen=True)
class WindowSlice:
    used: VersionUsed
    whole: StabilityWindow
    slice: StabilityWindow
    # True when the compound has a window that the slice does not meet.
    misses: bool
    # When it misses: the window's point nearest to the slice, in `whole.elements` order, eV.
    nearest_point_ev: Tuple[float, ...]
    distance_ev: Optional[float]
    # The fixed potentials as used, gases' Δμ included, eV.
    fixed_potentials_used: Dict[str, float] = field(default_factory=dict)


@dataclass(frozen=True)
class WindowFigure(SvgText):
    """A window (or a section of it) drawn in the plane of two potentials: SVG text and what it shows."""

    used: VersionUsed
    window: StabilityWindow
    svg: str = field(repr=False)
    # 2 a polygon, 1 a segment, 0 a point, -1 nothing (no window, or a section that misses it).
    drawn_dimension: int
    # The drawn vertices (every element's Δμ, eV, in `window.elements` order), in drawing order.
    drawn_vertices: pd.DataFrame = field(repr=False)
    x_element: str
    y_element: str
    # Follows from the compound's formation energy; "" for a two-element compound.
    dependent_element: str
    # The section's fixed Δμ (eV), as given or chosen at the vertices' mean.
    section: Dict[str, float]
    section_chosen_by_default: bool
    section_misses: bool
    drawn_line_ids: Tuple[str, ...]
    lines_left_out: int


@dataclass(frozen=True)
class DopantLimit:
    dopant: str
    extended_elements: Tuple[str, ...]
    # Absent (None) when the host has no window.
    overall_max_ev: Optional[float]
    overall_limiting_phase_ids: Tuple[str, ...]
    # host_vertex, max_dopant_potential_ev, limiting_phase_ids, dopant_at_reference.
    per_host_vertex: pd.DataFrame = field(compare=False)
    # As StabilityWindow.vertices, over extended_elements.
    extended_vertices: pd.DataFrame = field(compare=False)
    dopant_phase_count: int = 0


@dataclass(frozen=True)
class DopantLimits:
    used: VersionUsed
    host: StabilityWindow
    limits: Tuple[DopantLimit, ...]


# --- from the wire -------------------------------------------------------------------------------------------

def timestamp(message) -> Optional[datetime]:
    if message.seconds == 0 and message.nanos == 0:
        return None
    return message.ToDatetime().replace(tzinfo=timezone.utc)


def version_used(m) -> VersionUsed:
    return VersionUsed(m.dataset, m.version, m.content_sha256, corrections_used(m))


@dataclass(frozen=True)
class CorrectionSet:
    """A stored correction set: its document exactly as stored (`set_json`) and what it holds."""
    name: str
    version: int
    set_json: str
    stored_at: Optional[datetime]
    base_method: str
    fitted_reference_count: int
    species_shift_count: int
    method_rule_count: int


def correction_set(m) -> CorrectionSet:
    return CorrectionSet(m.name, m.version, m.set_json, timestamp(m.stored_at), m.base_method, m.fitted_reference_count,
                         m.species_shift_count, m.method_rule_count)


SHIFT_COLUMNS = ["entry_id", "method", "method_shift_ev_per_atom", "species_shift_ev_per_atom",
                 "reference_shift_ev_per_atom", "total_shift_ev_per_atom"]


def shifts_frame(shifts) -> pd.DataFrame:
    return pd.DataFrame([{c: getattr(s, c) for c in SHIFT_COLUMNS} for s in shifts], columns=SHIFT_COLUMNS)


def element_reference(m) -> ElementReference:
    return ElementReference(m.symbol, m.total_energy_ev_per_atom, m.source_entry_id, m.given_by_caller)


def system_coverage(m) -> SystemCoverage:
    elements = tuple(ElementCoverage(e.symbol, e.pure_entry_count, e.zero_by_definition,
                                     element_reference(e.reference) if e.HasField("reference") else None)
                     for e in m.elements)
    return SystemCoverage(m.chemical_system, elements, m.entry_count, m.competing_phase_count)


def system_problem(m) -> SystemProblem:
    return SystemProblem(m.chemical_system, tuple(m.elements_without_reference), tuple(m.cause_entry_ids),
                         tuple(m.unanswered_entry_ids), m.unanswered_entry_count, m.message)


def products(decomposition) -> Tuple[DecompositionProduct, ...]:
    return tuple(DecompositionProduct(p.phase_id, p.is_elemental_reference, p.formula, p.atom_fraction, p.formula_units,
                                      p.formula_units_exact, p.formation_energy_ev_per_atom)
                 for p in decomposition.products)


def decomposition_columns(decomposition) -> dict:
    parts = products(decomposition)
    return {
        "hull_energy_ev_per_atom": decomposition.hull_energy_ev_per_atom,
        "reaction": decomposition.reaction,
        "decomposition": parts,
        "decomposition_phase_ids": tuple(p.phase_id for p in parts),
        "decomposition_atom_fractions": tuple(p.atom_fraction for p in parts),
    }


def dataset(m) -> Dataset:
    return Dataset(m.name, m.description, timestamp(m.created_at), m.latest_version, m.entry_count)


DATASET_COLUMNS = ("name", "description", "created_at", "latest_version", "entry_count")
VERSION_COLUMNS = ("version", "committed_at", "source_label", "note", "batch_entry_count", "inserted_count",
                   "replaced_count", "entry_count", "correction_set_name", "correction_set_version",
                   "corrected_from_version")


def datasets_frame(messages) -> pd.DataFrame:
    rows = [vars(dataset(m)) for m in messages]
    return pd.DataFrame(rows, columns=list(DATASET_COLUMNS))


def versions_frame(messages) -> pd.DataFrame:
    rows = [{"version": m.version, "committed_at": timestamp(m.committed_at), "source_label": m.source_label,
             "note": m.note, "batch_entry_count": m.batch_entry_count, "inserted_count": m.inserted_count,
             "replaced_count": m.replaced_count, "entry_count": m.entry_count, **_corrected_columns(m)} for m in messages]
    frame = pd.DataFrame(rows, columns=list(VERSION_COLUMNS))
    # Versions imported as given have no set: empty name, and <NA> (not 0, which is no version) in the numbers.
    for column in ("correction_set_version", "corrected_from_version"):
        frame[column] = frame[column].astype("Int64")
    return frame


def _corrected_columns(m) -> dict:
    if not m.HasField("corrections"):
        return {"correction_set_name": "", "correction_set_version": None, "corrected_from_version": None}
    return {"correction_set_name": m.corrections.set_name, "correction_set_version": m.corrections.set_version,
            "corrected_from_version": m.corrections.source_version}


def corrections_used(m) -> Optional[CorrectionsUsed]:
    """The message's corrections field, or None when it is unset (a version imported as given)."""
    return (CorrectionsUsed(m.corrections.set_name, m.corrections.set_version, m.corrections.source_version)
            if m.HasField("corrections") else None)


def import_session(m) -> ImportSession:
    return ImportSession(m.session_id, m.dataset, m.staged_count, timestamp(m.expires_at), m.idle_expiry_seconds)


ENTRY_STABILITY_COLUMNS = ("entry_id", "formula", "chemical_system", "formation_energy_ev_per_atom",
                           "energy_above_hull_ev_per_atom", "is_on_hull", "is_hull_vertex",
                           "decomposition_energy_ev_per_atom", "hull_energy_ev_per_atom", "reaction", "decomposition",
                           "decomposition_phase_ids", "decomposition_atom_fractions")


def entry_stability_row(m) -> dict:
    row = {"entry_id": m.entry_id, "formula": m.formula, "chemical_system": m.chemical_system,
           "formation_energy_ev_per_atom": m.formation_energy_ev_per_atom,
           "energy_above_hull_ev_per_atom": m.energy_above_hull_ev_per_atom,
           "is_on_hull": m.is_on_hull, "is_hull_vertex": m.is_hull_vertex,
           # NaN where the server sends none: above the hull and for pure elements.
           "decomposition_energy_ev_per_atom": m.decomposition_energy_ev_per_atom
           if m.HasField("decomposition_energy_ev_per_atom") else math.nan}
    row.update(decomposition_columns(m.decomposition))
    return row


CANDIDATE_COLUMNS = ("label", "formula", "chemical_system", "formation_energy_ev_per_atom",
                     "energy_relative_to_hull_ev_per_atom", "energy_above_hull_ev_per_atom", "is_on_or_below_hull",
                     "hull_energy_ev_per_atom", "reaction", "decomposition", "decomposition_phase_ids",
                     "decomposition_atom_fractions")


def candidate_row(m) -> dict:
    row = {"label": m.label, "formula": m.formula, "chemical_system": m.chemical_system,
           "formation_energy_ev_per_atom": m.formation_energy_ev_per_atom,
           "energy_relative_to_hull_ev_per_atom": m.energy_relative_to_hull_ev_per_atom,
           "energy_above_hull_ev_per_atom": m.energy_above_hull_ev_per_atom,
           "is_on_or_below_hull": m.is_on_or_below_hull}
    row.update(decomposition_columns(m.decomposition))
    return row


HULL_ENERGY_COLUMNS = ("formula", "chemical_system", "hull_energy_ev_per_atom", "reaction", "decomposition",
                       "decomposition_phase_ids", "decomposition_atom_fractions")


def hull_energy_row(m) -> dict:
    row = {"formula": m.formula, "chemical_system": m.chemical_system}
    row.update(decomposition_columns(m.decomposition))
    row["hull_energy_ev_per_atom"] = m.hull_energy_ev_per_atom
    return row


STABLE_PHASE_COLUMNS = ("phase_id", "formula", "formation_energy_ev_per_atom", "is_elemental_reference")


def facets_frame(components, facets) -> pd.DataFrame:
    """One row per facet: `phase_ids` and `chemical_potential_<component>_ev_per_atom` per component."""
    mu_columns = [f"chemical_potential_{c}_ev_per_atom" for c in components]
    return pd.DataFrame(
        [{"phase_ids": tuple(f.phase_ids),
          **{f"chemical_potential_{p.component}_ev_per_atom": p.chemical_potential_ev_per_atom for p in f.chemical_potentials}}
         for f in facets], columns=["phase_ids"] + mu_columns)


def stable_phases_frame(messages) -> pd.DataFrame:
    rows = [{"phase_id": p.phase_id, "formula": p.formula, "formation_energy_ev_per_atom": p.formation_energy_ev_per_atom,
             "is_elemental_reference": p.is_elemental_reference} for p in messages]
    return pd.DataFrame(rows, columns=list(STABLE_PHASE_COLUMNS))


ODDS_COLUMNS = ("entry_id", "formula", "sigma_ev_per_atom", "correlation_group", "vertex_probability",
                "vertex_probability_standard_error", "mean_energy_above_hull_ev_per_atom",
                "mean_energy_above_hull_standard_error_ev_per_atom", "energy_above_hull_p05_ev_per_atom",
                "energy_above_hull_p95_ev_per_atom", "most_probable_products", "most_probable_products_probability",
                "plain_is_hull_vertex", "plain_energy_above_hull_ev_per_atom")


def odds_frame(messages) -> pd.DataFrame:
    """One row per entry of a SampleStability answer; most_probable_products as a tuple of phase ids."""
    rows = [{c: (tuple(m.most_probable_products) if c == "most_probable_products" else getattr(m, c)) for c in ODDS_COLUMNS}
            for m in messages]
    return pd.DataFrame(rows, columns=list(ODDS_COLUMNS))


def frame(rows, columns, **attrs) -> pd.DataFrame:
    table = pd.DataFrame(rows, columns=list(columns))
    table.attrs.update(attrs)
    return table


def answer_attrs(response, coverage_field="coverage") -> dict:
    """used, coverage and references of a stability answer, for DataFrame.attrs."""
    return {"used": version_used(response.used),
            "coverage": tuple(system_coverage(c) for c in getattr(response, coverage_field)),
            "references": tuple(element_reference(r) for r in response.references)}


def decomposition_products(table: pd.DataFrame, key: Optional[str] = None) -> pd.DataFrame:
    """One row per decomposition product of every row: the key column, then the product's fields."""
    if "decomposition" not in table.columns:
        raise ValueError("the table has no 'decomposition' column")
    key = key or next(c for c in ("entry_id", "label", "formula") if c in table.columns)
    rows = []
    for owner, parts in zip(table[key], table["decomposition"]):
        for p in parts:
            rows.append({key: owner, **vars(p)})
    columns = [key] + list(DecompositionProduct.__dataclass_fields__)
    return pd.DataFrame(rows, columns=columns)


def coverage_frame(coverage) -> pd.DataFrame:
    """A tuple of SystemCoverage (an answer's attrs['coverage']) as one row per system and element."""
    rows = []
    for system in coverage:
        for e in system.elements:
            rows.append({"chemical_system": system.chemical_system, "element": e.symbol,
                         "pure_entry_count": e.pure_entry_count, "zero_by_definition": e.zero_by_definition,
                         "reference_total_energy_ev_per_atom": e.reference.total_energy_ev_per_atom if e.reference else math.nan,
                         "entry_count": system.entry_count, "competing_phase_count": system.competing_phase_count})
    return pd.DataFrame(rows, columns=["chemical_system", "element", "pure_entry_count", "zero_by_definition",
                                       "reference_total_energy_ev_per_atom", "entry_count", "competing_phase_count"])


def enum_token(enum_type, value, prefix) -> str:
    return enum_type.Name(value)[len(prefix):].lower()


def vertices_frame(vertices, elements) -> pd.DataFrame:
    rows = []
    for v in vertices:
        row = {f"delta_mu_{e}_ev": mu for e, mu in zip(elements, v.chemical_potentials_ev)}
        row["limiting_phase_ids"] = tuple(v.limiting_phase_ids)
        row["elements_at_reference"] = tuple(v.elements_at_reference)
        for volt in v.voltages:
            row[f"volts_against_{volt.element}_metal"] = volt.volts_against_metal
        for gas in v.gas_conditions:
            if gas.HasField("log10_pressure_bar"):
                row[f"log10_p_{gas.gas}_bar"] = gas.log10_pressure_bar
                row[f"p_{gas.gas}_bar"] = gas.pressure_bar
            if gas.temperature_status:
                row[f"T_{gas.gas}_k"] = gas.temperature_k if gas.HasField("temperature_k") else math.nan
        rows.append(row)
    columns = [f"delta_mu_{e}_ev" for e in elements] + ["limiting_phase_ids", "elements_at_reference"]
    extra = sorted({k for r in rows for k in r if k not in columns})
    return pd.DataFrame(rows, columns=columns + extra)


def stability_window(m, windows_pb2) -> StabilityWindow:
    elements = tuple(m.elements)
    extremes = pd.DataFrame(
        [{"element": x.element, "highest_ev": x.highest_ev, "lowest_ev": x.lowest_ev,
          "highest_at_vertices": tuple(x.highest_at_vertices), "lowest_at_vertices": tuple(x.lowest_at_vertices)}
         for x in m.extremes],
        columns=["element", "highest_ev", "lowest_ev", "highest_at_vertices", "lowest_at_vertices"])
    size = (WindowSize(m.size.dimension, m.size.measure_in_plane_ev_pow_k, m.size.projected_measure_ev_pow_k,
                       tuple(m.size.projection_elements)) if m.HasField("size") else None)
    return StabilityWindow(
        entry_id=m.entry_id, formula=m.formula, chemical_system=m.chemical_system, elements=elements,
        kind=enum_token(windows_pb2.WindowKind, m.kind, "WINDOW_KIND_"), dimension=m.dimension,
        energy_above_hull_ev_per_atom=m.energy_above_hull_ev_per_atom, reaction=m.decomposition.reaction,
        decomposition=products(m.decomposition),
        lowered_by_ev_per_atom=m.lowered_by_ev_per_atom if m.HasField("lowered_by_ev_per_atom") else None,
        coexisting_phase_ids=tuple(m.coexisting_phase_ids), vertices=vertices_frame(m.vertices, elements),
        size=size, extremes=extremes)


def dopant_limit(m) -> DopantLimit:
    per_vertex = pd.DataFrame(
        [{"host_vertex": v.host_vertex, "max_dopant_potential_ev": v.max_dopant_potential_ev,
          "limiting_phase_ids": tuple(v.limiting_phase_ids), "dopant_at_reference": v.dopant_at_reference}
         for v in m.per_host_vertex],
        columns=["host_vertex", "max_dopant_potential_ev", "limiting_phase_ids", "dopant_at_reference"])
    return DopantLimit(
        dopant=m.dopant, extended_elements=tuple(m.extended_elements),
        overall_max_ev=m.overall_max_ev if m.HasField("overall_max_ev") else None,
        overall_limiting_phase_ids=tuple(m.overall_limiting_phase_ids), per_host_vertex=per_vertex,
        extended_vertices=vertices_frame(m.extended_vertices, tuple(m.extended_elements)),
        dopant_phase_count=m.dopant_phase_count)


CURATION_STEP_COLUMNS = ("number", "kind", "parameters", "entries_before", "removed_count", "changed_count")


@dataclass(frozen=True)
class CurationRecord:
    dataset: str
    version: int
    source_dataset: str
    source_version: int
    source_sha256: str
    # The recipe file's text: curate_version runs it again (on this source, to the same content; or elsewhere).
    recipe_json: str
    # One row per step: number, kind, parameters (a dict), entries_before, removed_count, changed_count.
    steps: pd.DataFrame = field(compare=False)

    def save_recipe(self, path) -> None:
        with open(path, "w", encoding="utf-8") as f:
            f.write(self.recipe_json + "\n")


@dataclass(frozen=True)
class CuratedVersion:
    dataset_version: int
    entry_count: int
    # The new version's content fingerprint: equal for equal content.
    content_sha256: str
    record: CurationRecord
    # The correction set the version carries when the recipe applied one (apply_correction_set); None otherwise.
    corrections: Optional[CorrectionsUsed] = None


def curation_record(m) -> CurationRecord:
    rows = [{"number": s.number, "kind": s.kind, "parameters": json.loads(s.parameters_json), "entries_before": s.entries_before,
             "removed_count": s.removed_count, "changed_count": s.changed_count} for s in m.steps]
    return CurationRecord(m.dataset, m.version, m.source_dataset, m.source_version, m.source_sha256, m.recipe_json,
                          pd.DataFrame(rows, columns=list(CURATION_STEP_COLUMNS)))
