"""Temperature and gas pressure: request pieces and results of the ThermoService calls.

Gas potentials are a frozen dataclass; the hull at (T, p) is a DataFrame of entries on the grand-free-energy axis
(eV per closed-element atom); decomposition temperatures are a dataclass holding the crossings as a DataFrame.
Temperature models go with each request (`models`: a CSV path in the CLI's layout, a DataFrame or dicts with
entry_id / formula / standard_entropy_j_per_mol_k, or free_energy_table [(T, G − H(anchor)) ...] with its anchor
("computed_0k" or "fitted_298k") / source), over the models stored with the entries. Every number is the server's.

Caution: released oxygen and hot oxides or cathodes are a fire hazard. These are thermodynamic estimates from
computed energies; real thermal and thermal-runaway safety work follows local rules and licensed practice.
"""

import math
from dataclasses import dataclass, field
from pathlib import Path
from typing import Optional, Tuple, Union

import pandas as pd

from hullclient import _stubs as wire
from hullclient import results as r

MODEL_COLUMNS = ("entry_id", "formula", "standard_entropy_j_per_mol_k", "source")
HULL_COLUMNS = ("entry_id", "formula", "free_energy_ev_per_closed_atom", "formation_energy_ev_per_atom",
                "energy_above_hull_ev_per_closed_atom", "is_hull_vertex", "reaction", "decomposition", "model")
CROSSING_COLUMNS = ("temperature_k", "direction", "bracket_low_k", "bracket_high_k", "method", "converged",
                    "reaction", "products", "gas_released_molecules_per_formula_unit")
_TREATMENTS = {"tabulated": 2, "ellingham": 1}
_DIRECTIONS = {1: "decomposes above", 2: "forms above"}
# The anchor tokens of an entry's free-energy table (the store's and the CLI's spelling).
_ANCHORS = {"computed_0k": 1, "fitted_298k": 2}


@dataclass(frozen=True)
class Gas:
    """The gas a thermo call opens its element to: formula, partial pressure (bar), what the dataset's reference for
    its element stands for ("fitted", or "computed" with the molecule's energy at rest and zero-point energy, eV per
    molecule), and for the Ellingham treatment the gas's S°(298.15 K) when it should come from the solids' handbook."""

    formula: str = "O2"
    pressure_bar: Optional[float] = None
    reference: str = "fitted"
    molecule_energy_ev: float = 0.0
    zero_point_energy_ev: float = 0.0
    standard_entropy_j_per_mol_k: Optional[float] = None


@dataclass(frozen=True)
class GasPoint:
    gas: str
    element: str
    temperature_k: float
    pressure_bar: float
    mu_ev_per_molecule: float
    mu_ev_per_atom: float
    dataset_reference_ev_per_atom: float
    dataset_reference_entry_id: str
    delta_mu_ev_per_atom: float
    # The part of Δμ that is the molecule's zero-point energy per atom (computed reference; 0 when fitted).
    zero_point_offset_ev_per_atom: float


@dataclass(frozen=True)
class GasPotential:
    used: Optional[r.VersionUsed]
    treatment: str
    anchor_temperature_k: float
    # None when only a conversion was asked (no pressure given).
    point: Optional[GasPoint]
    reference_energy_ev_per_molecule: float
    enthalpy_above_anchor_ev_per_molecule: float
    entropy_term_ev_per_molecule: float
    pressure_term_ev_per_molecule: float
    # With delta_mu_ev_per_atom: the pressure at the temperature, and the temperature at the pressure, that give it.
    pressure_for_delta_mu_bar: Optional[float]
    log10_pressure_for_delta_mu_bar: Optional[float]
    temperature_for_delta_mu_k: Optional[float]
    temperature_solve_status: str
    table_source: str


@dataclass(frozen=True)
class DecompositionTemperatures:
    """Every temperature in [from_k, to_k] where the phase's signed decomposition energy changes sign."""

    used: r.VersionUsed
    phase_id: str
    formula: str
    chemical_system: str
    treatment: str
    gas: Optional[GasPoint]
    from_k: float
    to_k: float
    energy_at_from_ev_per_closed_atom: float
    energy_at_to_ev_per_closed_atom: float
    stable_at_from: bool
    stable_at_to: bool
    # One row per crossing (CROSSING_COLUMNS).
    crossings: pd.DataFrame = field(compare=False)
    # (temperature_k, energy_ev_per_closed_atom, competitor ids below, competitor ids above), Ellingham treatment.
    breakpoints: Tuple[Tuple[float, float, Tuple[str, ...], Tuple[str, ...]], ...]
    # (element, temperature_k, from_entry_id, to_entry_id): where an element's lowest free-energy entry changes.
    reference_changes: Tuple[Tuple[str, float, str, str], ...]
    unmodelled_entry_ids: Tuple[str, ...]
    scan_intervals: int
    energy_unit: str
    models_from: str
    caution: str


@dataclass(frozen=True)
class TemperatureFigure(r.SvgText):
    used: r.VersionUsed
    phases: Tuple[DecompositionTemperatures, ...]
    svg: str = field(repr=False)


def treatment(name: str) -> int:
    if name not in _TREATMENTS:
        raise ValueError(f"treatment must be one of {', '.join(_TREATMENTS)}; got {name!r}")
    return _TREATMENTS[name]


def gas_conditions(gas: Union[str, Gas, None], pressure_bar: Optional[float]):
    if gas is None:
        return None
    if isinstance(gas, str):
        gas = Gas(gas, pressure_bar)
    elif pressure_bar is not None:
        raise ValueError("give the pressure once: in Gas(pressure_bar=...) or as pressure_bar=")
    if gas.reference not in ("fitted", "computed"):
        raise ValueError(f"gas reference must be 'fitted' or 'computed'; got {gas.reference!r}")
    return wire.thermo_pb2.ThermoGasConditions(
        gas=gas.formula, pressure_bar=gas.pressure_bar or 0.0, reference=2 if gas.reference == "computed" else 1,
        molecule_energy_ev=gas.molecule_energy_ev, zero_point_energy_ev=gas.zero_point_energy_ev,
        standard_entropy_j_per_mol_k=gas.standard_entropy_j_per_mol_k or 0.0)


def models(given) -> list:
    """The request's models from a CSV path (the CLI's layout, '#' comments), a DataFrame or an iterable of dicts."""
    if given is None:
        return []
    if isinstance(given, (str, Path)):
        given = pd.read_csv(given, comment="#", dtype={"entry_id": str, "formula": str, "source": str}, keep_default_na=False)
    rows = given.to_dict("records") if isinstance(given, pd.DataFrame) else list(given)
    result = []
    for row in rows:
        entry_id = str(row.get("entry_id") or "")
        formula = str(row.get("formula") or "")
        message = wire.thermo_pb2.ThermoSolidModel(source=str(row.get("source") or ""))
        message.model.formula = formula
        if entry_id:
            message.entry_id = entry_id
        else:
            message.formula = formula
        table = row.get("free_energy_table")
        entropy = row.get("standard_entropy_j_per_mol_k")
        if table is not None and len(table) > 0:
            anchor = str(row.get("anchor") or "")
            if anchor not in _ANCHORS:
                raise ValueError(f"a free_energy_table needs its anchor: one of {', '.join(_ANCHORS)}; got {anchor!r}")
            message.model.free_energy_table.anchor = _ANCHORS[anchor]
            message.model.free_energy_table.rows.extend(
                wire.entries_pb2.EntryFreeEnergyRow(temperature_k=float(t), free_energy_above_anchor_ev=float(g)) for t, g in table)
        elif entropy is not None and not (isinstance(entropy, float) and math.isnan(entropy)):
            message.model.standard_entropy_j_per_mol_k = float(entropy)
        result.append(message)
    return result


def _treatment_name(value: int) -> str:
    return "ellingham" if value == 1 else "tabulated"


def gas_point(m) -> GasPoint:
    return GasPoint(m.gas, m.element, m.temperature_k, m.pressure_bar, m.mu_ev_per_molecule, m.mu_ev_per_atom,
                    m.dataset_reference_ev_per_atom, m.dataset_reference_entry_id, m.delta_mu_ev_per_atom,
                    m.zero_point_offset_ev_per_atom)


def gas_potential(reply) -> GasPotential:
    return GasPotential(
        r.version_used(reply.used) if reply.HasField("used") else None, _treatment_name(reply.treatment),
        reply.anchor_temperature_k, gas_point(reply.point) if reply.HasField("point") else None,
        reply.reference_energy_ev_per_molecule, reply.enthalpy_above_anchor_ev_per_molecule,
        reply.entropy_term_ev_per_molecule, reply.pressure_term_ev_per_molecule,
        reply.pressure_for_delta_mu_bar if reply.has_conversion else None,
        reply.log10_pressure_for_delta_mu_bar if reply.has_conversion else None,
        reply.temperature_for_delta_mu_k if reply.temperature_found else None,
        reply.temperature_solve_status, reply.table_source)


def hull_frame(reply) -> pd.DataFrame:
    rows = [(e.entry_id, e.formula, e.free_energy_ev_per_closed_atom, e.formation_energy_ev_per_atom,
             e.energy_above_hull_ev_per_closed_atom, e.is_hull_vertex, e.decomposition.reaction,
             r.products(e.decomposition), e.model) for e in reply.entries]
    frame = pd.DataFrame(rows, columns=list(HULL_COLUMNS))
    frame.attrs.update(
        used=r.version_used(reply.used), chemical_system=reply.chemical_system, components=tuple(reply.components),
        energy_axis=reply.energy_axis, energy_unit=reply.energy_unit, temperature_k=reply.temperature_k,
        treatment=_treatment_name(reply.treatment), gas=gas_point(reply.gas) if reply.HasField("gas") else None,
        references={x.element: x.entry_id for x in reply.references},
        changed_references={x.element: (x.anchor_entry_id, x.entry_id) for x in reply.references if x.changed_from_anchor},
        stable_phase_ids=tuple(reply.stable_phase_ids), reservoir_entry_ids=tuple(reply.reservoir_entry_ids),
        unmodelled_entry_ids=tuple(reply.unmodelled_entry_ids), models_from=reply.models_from, caution=reply.caution)
    return frame


def decomposition_temperatures(reply) -> DecompositionTemperatures:
    crossings = pd.DataFrame(
        [(c.temperature_k, _DIRECTIONS.get(c.direction, ""), c.bracket_low_k, c.bracket_high_k, c.method, c.converged,
          c.competitors.reaction, r.products(c.competitors), c.gas_released_molecules_per_formula_unit)
         for c in reply.crossings], columns=list(CROSSING_COLUMNS))
    return DecompositionTemperatures(
        r.version_used(reply.used), reply.phase_id, reply.formula, reply.chemical_system,
        _treatment_name(reply.treatment), gas_point(reply.gas) if reply.HasField("gas") else None, reply.from_k,
        reply.to_k, reply.energy_at_from_ev_per_closed_atom, reply.energy_at_to_ev_per_closed_atom,
        reply.stable_at_from, reply.stable_at_to, crossings,
        tuple((b.temperature_k, b.energy_ev_per_closed_atom, tuple(b.competitor_ids_below), tuple(b.competitor_ids_above))
              for b in reply.breakpoints),
        tuple((c.element, c.temperature_k, c.from_entry_id, c.to_entry_id) for c in reply.reference_changes),
        tuple(reply.unmodelled_entry_ids), reply.scan_intervals, reply.energy_unit, reply.models_from, reply.caution)


def temperature_figure(reply) -> TemperatureFigure:
    return TemperatureFigure(r.version_used(reply.used), tuple(decomposition_temperatures(p) for p in reply.phases), reply.svg)
