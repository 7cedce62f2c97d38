"""Defect studies: request pieces and results of the DefectService calls.

Formation energies come as one DataFrame row per (point, defect, charge, Fermi level) with every term of
E_f = [E(X^q) − E(bulk)] − Σ n_i (μ_i^ref + Δμ_i) + q (E_VBM + E_F) + E_lat − q ΔV in its own column; the points'
Δμ are columns `delta_mu_<El>_ev`. The server's warnings (a bulk unlike the dataset's host, alignment doubts, a
point off the window, negative-U) are emitted as DefectWarning and kept in `attrs['warnings']`.
"""

import math
from dataclasses import dataclass, field
from datetime import datetime
from pathlib import Path
from typing import Mapping, Optional, Tuple

import pandas as pd

from hullclient import _stubs as wire
from hullclient.results import SvgText, VersionUsed, timestamp


class DefectWarning(UserWarning):
    """A doubt the server states beside a defect answer."""


ENERGY_COLUMNS = ("point", "vertex_number", "defect", "charge", "fermi_level_ev", "formation_energy_ev",
                  "supercell_difference_ev", "chemical_potential_ev", "electron_reservoir_ev", "image_charge_ev",
                  "alignment_ev", "correction_ev", "lowest")
CORRECTION_COLUMNS = ("defect", "charge", "image_charge_ev", "alignment_ev", "alignment_method", "shift_volts",
                      "spread_volts", "points_used", "sign_correlation", "sampling_radius_angstrom")
LEVEL_COLUMNS = ("defect", "charge", "other_charge", "level_ev", "thermodynamic", "inside_gap", "formation_energy_ev")


@dataclass(frozen=True)
class DefectStudyInfo:
    study_name: str
    study_version: int
    committed_at: Optional[datetime]
    source_label: str
    note: str
    content_sha256: str
    host_formula: str
    band_gap_ev: float
    vbm_ev: float


@dataclass(frozen=True)
class DefectStudyImport:
    """A stored study version: its provenance, one row per defect, and the warnings of the check."""

    study: DefectStudyInfo
    defects: pd.DataFrame = field(repr=False)
    warnings: Tuple[str, ...]


@dataclass(frozen=True)
class DefectStudyExport:
    """A study version's two texts exactly as imported."""

    study: DefectStudyInfo
    study_json: str = field(repr=False)
    charge_states_csv: str = field(repr=False)

    def save(self, json_path, csv_path) -> Tuple[Path, Path]:
        """Writes both texts (UTF-8, unchanged) and returns the paths."""
        paths = Path(json_path), Path(csv_path)
        with open(paths[0], "w", encoding="utf-8", newline="") as f:
            f.write(self.study_json)
        with open(paths[1], "w", encoding="utf-8", newline="") as f:
            f.write(self.charge_states_csv)
        return paths


@dataclass(frozen=True)
class DefectPoint:
    """A chemical-potential point: its label (vertex name, gas condition or 'given'), Δμ per element (eV), the
    host's coexisting phases there, and where each dopant's Δμ came from."""

    label: str
    vertex_number: int
    delta_mu_ev: Mapping[str, float]
    coexisting_phase_ids: Tuple[str, ...]
    dopants: pd.DataFrame = field(repr=False)


@dataclass(frozen=True)
class DefectGas:
    """A gas condition resolved: Δμ of its element at (T, p), and the zero-point part of it (computed mode)."""

    element: str
    temperature_k: float
    pressure_bar: float
    delta_mu_ev: float
    zero_point_offset_ev: float


@dataclass(frozen=True)
class TransitionLevels:
    used: VersionUsed
    study: DefectStudyInfo
    host_entry_id: str
    point: DefectPoint
    levels: pd.DataFrame = field(repr=False)
    effective_u: pd.DataFrame = field(repr=False)
    bindings: pd.DataFrame = field(repr=False)
    gas: Optional[DefectGas]
    warnings: Tuple[str, ...]


@dataclass(frozen=True)
class DefectFigure(SvgText):
    """Formation energy against Fermi level at one point, drawn by the server."""

    used: VersionUsed
    study: DefectStudyInfo
    point: DefectPoint
    svg: str = field(repr=False)
    defect_count: int
    marked_level_count: int
    warnings: Tuple[str, ...]


@dataclass(frozen=True)
class DopantSolubility:
    """A dopant's solubility: its highest Δμ and the phases that limit it, the host + dopant window's vertices (one
    row each, Δμ columns `delta_mu_<El>_ev`), and one row per growth temperature and vertex with the dopant total
    (cm^-3) and the self-consistent Fermi level there; `cautions` are the hazard reminders for dopant and phases."""

    used: VersionUsed
    study: DefectStudyInfo
    host_entry_id: str
    dopant: str
    max_delta_mu_ev: float
    limiting_phase_ids: Tuple[str, ...]
    vertices: pd.DataFrame = field(repr=False)
    table: pd.DataFrame = field(repr=False)
    cautions: Tuple[str, ...]
    warnings: Tuple[str, ...]

    @property
    def most_soluble(self) -> pd.DataFrame:
        """The most soluble vertex's row per temperature."""
        return self.table[self.table.most_soluble].reset_index(drop=True)


@dataclass(frozen=True)
class CarrierFigure(SvgText):
    """Concentrations and the Fermi level against temperature at one point, drawn by the server."""

    used: VersionUsed
    study: DefectStudyInfo
    point: DefectPoint
    svg: str = field(repr=False)
    warnings: Tuple[str, ...]


_GAS_REFERENCES = {"fitted": 1, "computed": 2}
_STATISTICS = {"fermi_dirac": 1, "boltzmann": 2}
_FORMS = {"dilute": 1, "site_blocking": 2}

FERMI_COLUMNS = ("point", "vertex_number", "state", "temperature_k", "fermi_level_ev", "valence_edge_ev",
                 "conduction_edge_ev", "electrons_per_cm3", "holes_per_cm3", "extra_donors_per_cm3",
                 "extra_acceptors_per_cm3", "status", "form", "statistics", "net_charge_per_cm3",
                 "relative_charge_imbalance", "iterations")
CHARGE_STATE_COLUMNS = ("point", "state", "temperature_k", "defect", "charge", "formation_energy_ev", "per_cm3")
TOTAL_COLUMNS = ("point", "state", "temperature_k", "defect", "site_set", "per_cm3", "site_fraction")


def counting(statistics: str, form: str):
    """The wire enums of carrier statistics ('fermi_dirac' | 'boltzmann') and form ('dilute' | 'site_blocking')."""
    if statistics not in _STATISTICS:
        raise ValueError(f"statistics '{statistics}' is not one of: {', '.join(_STATISTICS)}")
    if form not in _FORMS:
        raise ValueError(f"form '{form}' is not one of: {', '.join(_FORMS)}")
    return _STATISTICS[statistics], _FORMS[form]


def _solution_row(s) -> dict:
    return {"temperature_k": s.temperature_k, "fermi_level_ev": s.fermi_level_ev, "valence_edge_ev": s.valence_edge_ev,
            "conduction_edge_ev": s.conduction_edge_ev, "electrons_per_cm3": s.electrons_per_cm3,
            "holes_per_cm3": s.holes_per_cm3, "extra_donors_per_cm3": s.extra_donors_per_cm3,
            "extra_acceptors_per_cm3": s.extra_acceptors_per_cm3, "status": s.status, "form": s.form,
            "statistics": s.statistics, "net_charge_per_cm3": s.net_charge_per_cm3,
            "relative_charge_imbalance": s.relative_charge_imbalance, "iterations": s.iterations}


def fermi_frame(reply) -> pd.DataFrame:
    """One row per point and state ('equilibrium', or 'growth' and 'quenched'); attrs: charge_states and defects
    (DataFrames of every charge state and every total, cm^-3), used, study, host_entry_id, points, gas, warnings."""
    points = [point(p.point) for p in reply.points]
    rows, states, totals = [], [], []
    for p, message in zip(points, reply.points):
        solved = ([("growth", message.equilibrium), ("quenched", message.quenched)] if message.HasField("quenched")
                  else [("equilibrium", message.equilibrium)])
        for state, s in solved:
            rows.append({"point": p.label, "vertex_number": p.vertex_number, "state": state, **_solution_row(s)})
            states += [{"point": p.label, "state": state, "temperature_k": s.temperature_k, "defect": c.defect,
                        "charge": c.charge, "formation_energy_ev": c.formation_energy_ev, "per_cm3": c.per_cm3}
                       for c in s.charge_states]
            totals += [{"point": p.label, "state": state, "temperature_k": s.temperature_k, "defect": t.defect,
                        "site_set": t.site_set, "per_cm3": t.per_cm3, "site_fraction": t.site_fraction} for t in s.defects]
    table = pd.DataFrame(rows, columns=list(FERMI_COLUMNS))
    table.attrs.update({"charge_states": pd.DataFrame(states, columns=list(CHARGE_STATE_COLUMNS)),
                        "defects": pd.DataFrame(totals, columns=list(TOTAL_COLUMNS)),
                        "used": VersionUsed(reply.used.dataset, reply.used.version, reply.used.content_sha256),
                        "study": study_info(reply.study), "host_entry_id": reply.host_entry_id, "points": tuple(points),
                        "gas": gas(reply.gas, reply.HasField("gas")), "warnings": tuple(reply.warnings)})
    return table


def solubility(reply) -> DopantSolubility:
    elements = list(dict.fromkeys(p.element for v in reply.vertices for p in v.potentials))
    vertices = pd.DataFrame(
        [{"vertex_number": v.vertex_number, "limiting_phase_ids": tuple(v.limiting_phase_ids),
          **{f"delta_mu_{p.element}_ev": p.delta_mu_ev for p in v.potentials}} for v in reply.vertices],
        columns=["vertex_number", "limiting_phase_ids"] + [f"delta_mu_{e}_ev" for e in elements])
    rows = [{"temperature_k": t.temperature_k, "vertex_number": v.vertex_number, "dopant_per_cm3": v.dopant_per_cm3,
             "most_soluble": v.vertex_number == t.most_soluble_vertex, "fermi_level_ev": v.solution.fermi_level_ev,
             "electrons_per_cm3": v.solution.electrons_per_cm3, "holes_per_cm3": v.solution.holes_per_cm3,
             "status": v.solution.status, "form": v.solution.form}
            for t in reply.temperatures for v in t.vertices]
    table = pd.DataFrame(rows, columns=["temperature_k", "vertex_number", "dopant_per_cm3", "most_soluble", "fermi_level_ev",
                                        "electrons_per_cm3", "holes_per_cm3", "status", "form"])
    return DopantSolubility(VersionUsed(reply.used.dataset, reply.used.version, reply.used.content_sha256),
                            study_info(reply.study), reply.host_entry_id, reply.dopant, reply.max_delta_mu_ev,
                            tuple(reply.limiting_phase_ids), vertices, table, tuple(reply.cautions), tuple(reply.warnings))


def conditions(vertex=None, point: Optional[Mapping[str, float]] = None, gas: Optional[Mapping] = None):
    """The DefectConditions message: at most one of a vertex (number or name), a point {'Al': -8.6, 'O': 0.0} or a
    gas {'gas': 'O2', 'temperature_k': 1273, 'pressure_bar': 0.21, 'reference': 'fitted'|'computed',
    'molecule_energy_ev': ..., 'zero_point_energy_ev': ...}; None for every vertex of the host's window."""
    given = [x for x in (vertex, point, gas) if x is not None]
    if len(given) > 1:
        raise ValueError("give one of vertex, point or gas")
    pb = wire.defects_pb2
    if vertex is not None:
        return pb.DefectConditions(vertex=str(vertex))
    if point is not None:
        return pb.DefectConditions(point=pb.DefectGivenPoint(
            potentials=[pb.DefectElementPotential(element=e, delta_mu_ev=float(v)) for e, v in dict(point).items()]))
    if gas is not None:
        g = dict(gas)
        unknown = set(g) - {"gas", "temperature_k", "pressure_bar", "reference", "molecule_energy_ev", "zero_point_energy_ev"}
        if unknown:
            raise ValueError(f"unknown gas fields: {sorted(unknown)}")
        reference = g.get("reference", "fitted")
        if reference not in _GAS_REFERENCES:
            raise ValueError(f"gas reference '{reference}' is not one of: fitted, computed")
        return pb.DefectConditions(gas=pb.DefectGasConditions(
            gas=g.get("gas", ""), temperature_k=float(g.get("temperature_k", 0)), pressure_bar=float(g.get("pressure_bar", 0)),
            reference=_GAS_REFERENCES[reference], molecule_energy_ev=float(g.get("molecule_energy_ev", 0)),
            zero_point_energy_ev=float(g.get("zero_point_energy_ev", 0))))
    return None


def study_info(m) -> DefectStudyInfo:
    return DefectStudyInfo(m.study_name, m.study_version, timestamp(m.committed_at), m.source_label, m.note,
                           m.content_sha256, m.host_formula, m.band_gap_ev, m.vbm_ev)


def defects_frame(messages) -> pd.DataFrame:
    rows = [{"defect": d.name, "kind": d.kind, "atoms": {a.element: a.count for a in d.atoms}, "site_set": d.site_set,
             "degeneracy": d.degeneracy, "charges": tuple(d.charges), "constituents": tuple(d.constituents)} for d in messages]
    return pd.DataFrame(rows, columns=["defect", "kind", "atoms", "site_set", "degeneracy", "charges", "constituents"])


def point(m) -> DefectPoint:
    dopants = pd.DataFrame(
        [{"element": d.element, "delta_mu_ev": d.delta_mu_ev, "limiting_phase_ids": tuple(d.limiting_phase_ids),
          "at_reference": d.at_reference, "given": d.given} for d in m.dopants],
        columns=["element", "delta_mu_ev", "limiting_phase_ids", "at_reference", "given"])
    return DefectPoint(m.label, m.vertex_number, {p.element: p.delta_mu_ev for p in m.potentials},
                       tuple(m.coexisting_phase_ids), dopants)


def gas(m, present: bool) -> Optional[DefectGas]:
    return DefectGas(m.element, m.temperature_k, m.pressure_bar, m.delta_mu_ev, m.zero_point_offset_ev) if present else None


def energies_frame(reply) -> pd.DataFrame:
    points = [point(p.point) for p in reply.points]
    elements = list(dict.fromkeys(e for p in points for e in p.delta_mu_ev))
    rows = []
    for p, message in zip(points, reply.points):
        for e in message.energies:
            row = {"point": p.label, "vertex_number": p.vertex_number, "defect": e.defect, "charge": e.charge,
                   "fermi_level_ev": e.fermi_level_ev, "formation_energy_ev": e.formation_energy_ev,
                   "supercell_difference_ev": e.supercell_difference_ev, "chemical_potential_ev": e.chemical_potential_ev,
                   "electron_reservoir_ev": e.electron_reservoir_ev, "image_charge_ev": e.image_charge_ev,
                   "alignment_ev": e.alignment_ev, "correction_ev": e.correction_ev, "lowest": e.lowest}
            row.update({f"delta_mu_{el}_ev": p.delta_mu_ev.get(el, math.nan) for el in elements})
            rows.append(row)
    table = pd.DataFrame(rows, columns=list(ENERGY_COLUMNS) + [f"delta_mu_{el}_ev" for el in elements])
    corrections = pd.DataFrame(
        [{"defect": c.defect, "charge": c.charge, "image_charge_ev": c.image_charge_ev, "alignment_ev": c.alignment_ev,
          "alignment_method": c.alignment_method, "shift_volts": c.shift_volts, "spread_volts": c.spread_volts,
          "points_used": c.points_used, "sign_correlation": c.sign_correlation,
          "sampling_radius_angstrom": c.sampling_radius_angstrom} for c in reply.corrections],
        columns=list(CORRECTION_COLUMNS))
    table.attrs.update({"used": VersionUsed(reply.used.dataset, reply.used.version, reply.used.content_sha256),
                        "study": study_info(reply.study), "host_entry_id": reply.host_entry_id, "points": tuple(points),
                        "corrections": corrections, "gas": gas(reply.gas, reply.HasField("gas")),
                        "warnings": tuple(reply.warnings)})
    return table


def levels(reply) -> TransitionLevels:
    table = pd.DataFrame(
        [{"defect": l.defect, "charge": l.charge, "other_charge": l.other_charge, "level_ev": l.level_ev,
          "thermodynamic": l.thermodynamic, "inside_gap": l.inside_gap, "formation_energy_ev": l.formation_energy_ev}
         for l in reply.levels], columns=list(LEVEL_COLUMNS))
    effective_u = pd.DataFrame([{"defect": u.defect, "charge": u.charge, "u_ev": u.u_ev, "negative": u.negative} for u in reply.effective_u],
                               columns=["defect", "charge", "u_ev", "negative"])
    bindings = pd.DataFrame(
        [{"complex": b.complex, "charge": b.charge, "parts": tuple((p.defect, p.charge) for p in b.parts),
          "binding_energy_ev": b.binding_energy_ev} for b in reply.bindings],
        columns=["complex", "charge", "parts", "binding_energy_ev"])
    return TransitionLevels(VersionUsed(reply.used.dataset, reply.used.version, reply.used.content_sha256), study_info(reply.study),
                            reply.host_entry_id, point(reply.point), table, effective_u, bindings,
                            gas(reply.gas, reply.HasField("gas")), tuple(reply.warnings))
