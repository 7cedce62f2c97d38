"""Electrochemistry: request pieces and results of the ElectrochemistryService calls.

Open-element hulls are DataFrames of entries on the grand-potential axis (eV per closed-element atom); voltage and
reaction profiles are small frozen dataclasses holding their plateaus or breakpoints as DataFrames, with the
server's figure (SVG) when asked for; electrochemical windows are dataclasses. Every number is the server's: 0 K
energies standing in for Gibbs energies, so voltages and reaction energies are estimates (see `caveat`).
"""

import math
from dataclasses import dataclass, field
from typing import Mapping, Optional, Tuple

import pandas as pd

from hullclient import _stubs as wire
from hullclient import results as r

OPEN_HULL_COLUMNS = ("entry_id", "formula", "grand_potential_ev_per_closed_atom", "formation_energy_ev_per_atom",
                     "energy_above_hull_ev_per_closed_atom", "is_hull_vertex", "hull_grand_potential_ev_per_closed_atom",
                     "reaction", "decomposition", "decomposition_phase_ids", "decomposition_atom_fractions")
PLATEAU_COLUMNS = ("plateau", "ions_per_host_from", "ions_per_host_to", "volts_against_metal",
                   "ion_chemical_potential_ev_per_atom", "is_conversion", "phase_ids", "phase_formulas", "phases")
# The per-atom energy column is named after the answer's unit: per atom, or per closed-element atom with open elements.
_ENERGY_COLUMN = {"eV/atom": "reaction_energy_ev_per_atom", "eV per closed-element atom": "reaction_energy_ev_per_closed_atom"}
POINT_COLUMNS = ("atom_fraction_of_first", "atom_fraction_exact", "formula_unit_fraction_of_first", "{energy}",
                 "reaction_energy_ev_per_formula_unit", "products", "product_phase_ids",
                 "product_formula_units_per_mixture_atom")


@dataclass(frozen=True)
class ProfilePhase:
    phase_id: str
    formula: str
    # A synthetic elemental reference (an element without entries).
    is_elemental_reference: bool


@dataclass(frozen=True)
class ProfileFigure(r.SvgText):
    """A voltage-profile or reaction-profile figure drawn by the server."""

    kind: str
    svg: str = field(repr=False)


@dataclass(frozen=True)
class VoltageProfile:
    """Inserting `ion` into `host_formula`: x counts ions per formula unit of the host as written."""

    used: r.VersionUsed
    ion: str
    charge_number: int
    host_formula: str
    fully_inserted_formula: str
    chemical_system: str
    # One row per plateau (PLATEAU_COLUMNS); attrs: used, ion, charge_number, host_formula, chemical_system.
    plateaus: pd.DataFrame = field(compare=False)
    average_volts_against_metal: float
    ions_per_host_inserted: float
    capacity_per_host_mass_mah_per_g: float
    capacity_per_inserted_mass_mah_per_g: float
    energy_density_per_host_mass_wh_per_kg: float
    energy_density_per_inserted_mass_wh_per_kg: float
    # No end-member given: the profile runs on until the ion's own metal comes in.
    ends_at_ion_metal: bool
    caveat: str
    # Only when asked for (include_figure=True).
    figure: Optional[ProfileFigure] = None


@dataclass(frozen=True)
class Reactant:
    entry_id: str
    formula: str
    # On the profile's axis; > 0: the reactant lies above the hull (its end of the profile is below 0).
    energy_above_hull_ev_per_atom: float
    is_hull_vertex: bool


@dataclass(frozen=True)
class ReactionProduct:
    phase: ProfilePhase
    formula_units_per_mixture_atom: float
    # The same as an exact fraction.
    formula_units_exact: str


@dataclass(frozen=True)
class ReactionProfile:
    """The reaction energy of two phases over their mixing ratio x (share of the mixture's atoms from `first`)."""

    used: r.VersionUsed
    chemical_system: str
    energy_axis: str
    energy_unit: str
    first: Reactant
    second: Reactant
    # Every breakpoint from x = 0 (the second reactant) to x = 1 (the first), POINT_COLUMNS with the energy column
    # `reaction_energy_ev_per_atom` (or `..._per_closed_atom` with open elements); attrs as the dataclass.
    points: pd.DataFrame = field(compare=False)
    # Row of `points` with the most negative energy per atom of mixture (the headline), and per formula unit.
    most_negative_index: int
    most_negative_per_formula_unit_index: int
    reacts: bool
    figure: Optional[ProfileFigure] = None

    @property
    def energy_column(self) -> str:
        return energy_column(self.energy_unit)

    @property
    def most_negative(self) -> pd.Series:
        """The headline breakpoint: the most negative reaction energy per atom of mixture."""
        return self.points.iloc[self.most_negative_index]


@dataclass(frozen=True)
class ElectrochemicalWindow:
    """The voltages against ion/ion+ between which a phase is stable, and what it turns into beyond each end."""

    used: r.VersionUsed
    chemical_system: str
    entry_id: str
    formula: str
    ion: str
    charge_number: int
    # False when the phase is no stable phase of the closed hull: no window at all (the limits are None).
    exists: bool
    energy_above_hull_ev_per_atom: float
    # The lowest voltage at which the phase is stable, and Δμ of the ion there (eV per atom).
    reduction_limit_volts: Optional[float]
    highest_ion_potential_ev_per_atom: Optional[float]
    # The highest voltage; None when the system has none (the phase holds no ion).
    oxidation_limit_volts: Optional[float]
    lowest_ion_potential_ev_per_atom: Optional[float]
    # Just past each end on the ion-open hull; None where there is no reaction (the window reaches the ion's metal,
    # or has no upper end).
    reduction_reaction: Optional[str]
    reduction_products: Tuple[r.DecompositionProduct, ...]
    # The grand potential of those products on the ion-open hull, eV per closed-element atom.
    reduction_hull_grand_potential_ev_per_closed_atom: Optional[float]
    oxidation_reaction: Optional[str]
    oxidation_products: Tuple[r.DecompositionProduct, ...]
    oxidation_hull_grand_potential_ev_per_closed_atom: Optional[float]
    caveat: str


# --- to the wire ---------------------------------------------------------------------------------------------

def open_elements(potentials: Optional[Mapping[str, float]], absolute: bool):
    """OpenElementPotential messages from {'O': -1.5} (Δμ relative to the element's reference, eV/atom; with
    `absolute`, μ on the scale of the total energies)."""
    if not potentials:
        return []
    if not isinstance(potentials, Mapping):
        raise TypeError("open_elements must be a mapping of element symbol to chemical potential in eV/atom, e.g. {'O': -1.5}")
    messages = []
    for element, value in potentials.items():
        try:
            number = float(value)
        except (TypeError, ValueError):
            number = math.nan
        if not math.isfinite(number):
            raise ValueError(f"open_elements['{element}'] must be a finite chemical potential in eV/atom, not {value!r}")
        messages.append(wire.electrochemistry_pb2.OpenElementPotential(
            element=element, chemical_potential_ev_per_atom=number, absolute=bool(absolute)))
    return messages


def charge_number(value) -> dict:
    """The optional charge-number field: {} for the server's default (1 for Li, Na, K; 2 for Mg, Ca, Zn)."""
    if value is None:
        return {}
    if isinstance(value, bool) or not isinstance(value, int) or value < 1:
        raise ValueError(f"charge_number must be a positive integer (the ion's charge z), not {value!r}")
    return {"charge_number": value}


# --- from the wire -------------------------------------------------------------------------------------------

def _optional(m, name):
    return getattr(m, name) if m.HasField(name) else None


def energy_column(unit: str) -> str:
    """The points' per-atom reaction-energy column for the answer's energy unit."""
    return _ENERGY_COLUMN.get(unit, "reaction_energy_ev_per_atom")


def profile_phase(m) -> ProfilePhase:
    return ProfilePhase(m.phase_id, m.formula, m.is_elemental_reference)


def figure(kind: str, svg: str) -> Optional[ProfileFigure]:
    return ProfileFigure(kind, svg) if svg else None


def open_hull_frame(reply) -> pd.DataFrame:
    rows = []
    for e in reply.entries:
        row = {"entry_id": e.entry_id, "formula": e.formula,
               "grand_potential_ev_per_closed_atom": e.grand_potential_ev_per_closed_atom,
               "formation_energy_ev_per_atom": e.formation_energy_ev_per_atom,
               "energy_above_hull_ev_per_closed_atom": e.energy_above_hull_ev_per_closed_atom,
               "is_hull_vertex": e.is_hull_vertex}
        row.update(r.decomposition_columns(e.decomposition))
        # On the open hull the decomposition's hull energy is a grand potential per closed-element atom.
        row["hull_grand_potential_ev_per_closed_atom"] = row.pop("hull_energy_ev_per_atom")
        rows.append(row)
    components = tuple(reply.components)
    return r.frame(rows, OPEN_HULL_COLUMNS, used=r.version_used(reply.used), chemical_system=reply.chemical_system,
                   components=components, energy_axis=reply.energy_axis, energy_unit=reply.energy_unit,
                   open_elements={o.element: o.chemical_potential_ev_per_atom for o in reply.open_elements},
                   stable_phase_ids=tuple(reply.stable_phase_ids), facets=r.facets_frame(components, reply.facets),
                   excluded_entry_ids=tuple(reply.excluded_entry_ids))


def voltage_profile(reply) -> VoltageProfile:
    p = reply.profile
    used = r.version_used(reply.used)
    rows = []
    for number, q in enumerate(p.plateaus, start=1):
        phases = tuple(profile_phase(x) for x in q.phases)
        rows.append({"plateau": number, "ions_per_host_from": q.ions_per_host_from, "ions_per_host_to": q.ions_per_host_to,
                     "volts_against_metal": q.volts_against_metal,
                     "ion_chemical_potential_ev_per_atom": q.ion_chemical_potential_ev_per_atom,
                     "is_conversion": q.is_conversion, "phase_ids": tuple(x.phase_id for x in phases),
                     "phase_formulas": tuple(x.formula for x in phases), "phases": phases})
    plateaus = r.frame(rows, PLATEAU_COLUMNS, used=used, ion=p.ion, charge_number=p.charge_number,
                       host_formula=p.host_formula, chemical_system=p.chemical_system)
    return VoltageProfile(
        used=used, ion=p.ion, charge_number=p.charge_number, host_formula=p.host_formula,
        fully_inserted_formula=p.fully_inserted_formula, chemical_system=p.chemical_system, plateaus=plateaus,
        average_volts_against_metal=p.average_volts_against_metal, ions_per_host_inserted=p.ions_per_host_inserted,
        capacity_per_host_mass_mah_per_g=p.capacity_per_host_mass_mah_per_g,
        capacity_per_inserted_mass_mah_per_g=p.capacity_per_inserted_mass_mah_per_g,
        energy_density_per_host_mass_wh_per_kg=p.energy_density_per_host_mass_wh_per_kg,
        energy_density_per_inserted_mass_wh_per_kg=p.energy_density_per_inserted_mass_wh_per_kg,
        ends_at_ion_metal=p.ends_at_ion_metal, caveat=p.caveat, figure=figure("voltage-profile", reply.figure_svg))


def reactant(m) -> Reactant:
    return Reactant(m.entry_id, m.formula, m.energy_above_hull_ev_per_atom, m.is_hull_vertex)


def reaction_profile(reply) -> ReactionProfile:
    energy = energy_column(reply.energy_unit)
    rows = []
    for p in reply.points:
        products = tuple(ReactionProduct(profile_phase(x.phase), x.formula_units_per_mixture_atom, x.formula_units_exact)
                         for x in p.products)
        rows.append({"atom_fraction_of_first": p.atom_fraction_of_first, "atom_fraction_exact": p.atom_fraction_exact,
                     "formula_unit_fraction_of_first": p.formula_unit_fraction_of_first,
                     energy: p.reaction_energy_ev_per_atom,
                     "reaction_energy_ev_per_formula_unit": p.reaction_energy_ev_per_formula_unit, "products": products,
                     "product_phase_ids": tuple(x.phase.phase_id for x in products),
                     "product_formula_units_per_mixture_atom": tuple(x.formula_units_per_mixture_atom for x in products)})
    used = r.version_used(reply.used)
    first, second = reactant(reply.first), reactant(reply.second)
    points = r.frame(rows, [c.format(energy=energy) for c in POINT_COLUMNS], used=used,
                     chemical_system=reply.chemical_system, energy_axis=reply.energy_axis, energy_unit=reply.energy_unit,
                     first=first, second=second)
    return ReactionProfile(used, reply.chemical_system, reply.energy_axis, reply.energy_unit, first, second, points,
                           reply.most_negative_index, reply.most_negative_per_formula_unit_index, reply.reacts,
                           figure("reaction-profile", reply.figure_svg))


def _reaction(reply, name):
    """(reaction, products, grand potential) of one end of a window; (None, (), None) where nothing reacts."""
    if not reply.HasField(name):
        return None, (), None
    decomposition = getattr(reply, name)
    return decomposition.reaction, r.products(decomposition), decomposition.hull_energy_ev_per_atom


def electrochemical_window(reply) -> ElectrochemicalWindow:
    reduction_reaction, reduction_products, reduction_hull = _reaction(reply, "reduction_products")
    oxidation_reaction, oxidation_products, oxidation_hull = _reaction(reply, "oxidation_products")
    return ElectrochemicalWindow(
        used=r.version_used(reply.used), chemical_system=reply.chemical_system, entry_id=reply.entry_id,
        formula=reply.formula, ion=reply.ion, charge_number=reply.charge_number, exists=reply.exists,
        energy_above_hull_ev_per_atom=reply.energy_above_hull_ev_per_atom,
        reduction_limit_volts=_optional(reply, "reduction_limit_volts"),
        highest_ion_potential_ev_per_atom=_optional(reply, "highest_ion_potential_ev_per_atom"),
        oxidation_limit_volts=_optional(reply, "oxidation_limit_volts"),
        lowest_ion_potential_ev_per_atom=_optional(reply, "lowest_ion_potential_ev_per_atom"),
        reduction_reaction=reduction_reaction, reduction_products=reduction_products,
        reduction_hull_grand_potential_ev_per_closed_atom=reduction_hull,
        oxidation_reaction=oxidation_reaction, oxidation_products=oxidation_products,
        oxidation_hull_grand_potential_ev_per_closed_atom=oxidation_hull, caveat=reply.caveat)
