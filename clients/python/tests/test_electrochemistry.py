"""Electrochemistry through the client: open-element hulls, voltage profiles, reaction profiles and electrochemical
windows of the demo, every number equal to the C# CLI's JSON for the same question, each checked against an outside
reference worked here from the export (SciPy ConvexHull / Qhull and SciPy's HiGHS linear programs), the figures
equal to the CLI's files, and refusals naming the field."""

import xml.etree.ElementTree as ET

import pytest

from conftest import DEMO_DATASET, cli_json
from hullclient import InvalidArgumentError
from reference_hull import LowerHull, formation_energies
from reference_lp import hull_energy_and_potentials, ion_potential_range, members

TOLERANCE_EV = 1e-9  # as the hull checks: far above rounding, far below any physical difference (common practice)
# The LP answers to HiGHS's default feasibility tolerance (1e-7), which bounds how closely its duals agree.
DUAL_TOLERANCE_EV = 1e-7
O_OPEN_EV = -1.5


@pytest.fixture(scope="module")
def reference(client, demo):
    return formation_energies(client.export_entries(DEMO_DATASET))


def _products(parts):
    return [(p.phase_id, p.formula_units_exact, p.formula_units) for p in parts]


def _cli_products(decomposition):
    return [(p["phase_id"], p["formula_units_exact"], p["formula_units"]) for p in decomposition["products"]]


def test_the_open_hull_equals_the_cli_json_and_qhull_on_grand_potentials(client, server, reference):
    table = client.get_open_element_hull(DEMO_DATASET, "Li-Co-O", {"O": O_OPEN_EV})
    expected = cli_json(server.url, "open-hull", DEMO_DATASET, "Li-Co-O", "--open", f"O={O_OPEN_EV}")
    assert table.attrs["used"].version == int(expected["used"]["version"])
    assert table.attrs["components"] == tuple(expected["components"]) == ("Co", "Li")
    assert table.attrs["energy_unit"] == expected["energy_unit"] == "eV per closed-element atom"
    assert table.attrs["open_elements"] == {"O": O_OPEN_EV}
    assert table.attrs["stable_phase_ids"] == tuple(expected["stable_phase_ids"])
    assert table.attrs["excluded_entry_ids"] == tuple(expected["excluded_entry_ids"]) == ("el-O-gs",)
    assert len(table.attrs["facets"]) == len(expected["facets"])
    assert len(table) == len(expected["entries"])
    for row, want in zip(table.itertuples(), expected["entries"]):
        assert row.entry_id == want["entry_id"] and row.formula == want["formula"]
        assert row.grand_potential_ev_per_closed_atom == want["grand_potential_ev_per_closed_atom"]
        assert row.formation_energy_ev_per_atom == want["formation_energy_ev_per_atom"]
        assert row.energy_above_hull_ev_per_closed_atom == want["energy_above_hull_ev_per_closed_atom"]
        assert row.is_hull_vertex == want["is_hull_vertex"]
        assert row.hull_grand_potential_ev_per_closed_atom == want["decomposition"]["hull_energy_ev_per_atom"]
        assert row.reaction == want["decomposition"]["reaction"]
        assert _products(row.decomposition) == _cli_products(want["decomposition"])

    # The grand potential worked from the export: φ = (E_f per formula unit − n_O Δμ_O) / N_closed (common practice);
    # the open hull is the lower hull of φ over the closed elements, by SciPy ConvexHull (Qhull).
    ids = [i for i in members(reference, ["Li", "Co", "O"]) if set(reference[i][0]) != {"O"}]
    assert sorted(ids) == sorted(table.entry_id)
    closed, phi = {}, {}
    for i in ids:
        comp, per_atom = reference[i]
        closed[i] = {e: n for e, n in comp.items() if e != "O"}
        phi[i] = (per_atom * float(sum(comp.values())) - float(comp.get("O", 0)) * O_OPEN_EV) / float(sum(closed[i].values()))
    hull = LowerHull(["Co", "Li"], [(closed[i], phi[i]) for i in ids])
    for row in table.itertuples():
        assert row.grand_potential_ev_per_closed_atom == pytest.approx(phi[row.entry_id], abs=TOLERANCE_EV)
        above = phi[row.entry_id] - hull.energy_at(hull.fractions(closed[row.entry_id]))
        assert row.energy_above_hull_ev_per_closed_atom == pytest.approx(max(above, 0.0), abs=TOLERANCE_EV), row.entry_id


def test_the_voltage_profile_equals_the_cli_json_and_minus_the_highs_dual_for_lithium(client, server, reference, tmp_path):
    profile = client.get_voltage_profile(DEMO_DATASET, "CoO2", "Li", inserted_end_formula="LiCoO2", include_figure=True)
    cli_figure = tmp_path / "cli-voltage.svg"
    expected = cli_json(server.url, "voltage", DEMO_DATASET, "CoO2", "--ion", "Li", "--to", "LiCoO2",
                        "--figure", str(cli_figure))
    want = expected["profile"]
    assert (profile.ion, profile.charge_number, profile.host_formula, profile.fully_inserted_formula) == \
        (want["ion"], want["charge_number"], want["host_formula"], want["fully_inserted_formula"])
    for name in ("average_volts_against_metal", "ions_per_host_inserted", "capacity_per_host_mass_mah_per_g",
                 "capacity_per_inserted_mass_mah_per_g", "energy_density_per_host_mass_wh_per_kg",
                 "energy_density_per_inserted_mass_wh_per_kg", "ends_at_ion_metal", "caveat", "chemical_system"):
        assert getattr(profile, name) == want[name], name
    plateaus = profile.plateaus
    assert plateaus.attrs["used"] == profile.used and profile.used.version == int(expected["used"]["version"])
    assert len(plateaus) == len(want["plateaus"]) >= 2
    for row, cli in zip(plateaus.itertuples(), want["plateaus"]):
        assert (row.ions_per_host_from, row.ions_per_host_to) == (cli["ions_per_host_from"], cli["ions_per_host_to"])
        assert row.volts_against_metal == cli["volts_against_metal"]
        assert row.ion_chemical_potential_ev_per_atom == cli["ion_chemical_potential_ev_per_atom"]
        assert row.is_conversion == cli["is_conversion"]
        assert row.phase_ids == tuple(p["phase_id"] for p in cli["phases"])
    # The figure is the file the CLI writes for the same question.
    assert profile.figure is not None and cli_figure.read_text(encoding="utf-8") == profile.figure.svg
    assert ET.fromstring(profile.figure.svg).tag.endswith("svg")
    assert client.get_voltage_profile(DEMO_DATASET, "CoO2", "Li", inserted_end_formula="LiCoO2").figure is None

    # Each plateau's voltage is −Δμ_Li / z, Δμ_Li the equality dual of SciPy's HiGHS hull LP at the plateau's
    # middle composition CoO2 + x Li (common practice: V = −(μ_Li − E_Li)/(z e), z = 1).
    elements = ["Co", "Li", "O"]
    for row in plateaus.itertuples():
        middle = (row.ions_per_host_from + row.ions_per_host_to) / 2
        _, potentials = hull_energy_and_potentials(reference, elements, {"Co": 1, "O": 2, "Li": middle})
        assert row.volts_against_metal == pytest.approx(-potentials["Li"] / 1, abs=DUAL_TOLERANCE_EV)
    # Mean voltage: the Δx-weighted mean of the plateaus (common practice).
    widths = plateaus.ions_per_host_to - plateaus.ions_per_host_from
    assert profile.average_volts_against_metal == pytest.approx(float((widths * plateaus.volts_against_metal).sum() / widths.sum()), abs=1e-12)
    # LiCoO2's theoretical capacity at Δx = 1, Q = F / (3.6 M): 294.7 mAh/g of CoO2 and 273.8 mAh/g of LiCoO2
    # (common practice; worked from IUPAC standard atomic weights Li 6.94, Co 58.933, O 15.999, from memory).
    assert profile.capacity_per_host_mass_mah_per_g == pytest.approx(294.7, abs=0.05)
    assert profile.capacity_per_inserted_mass_mah_per_g == pytest.approx(273.8, abs=0.05)
    assert profile.energy_density_per_inserted_mass_wh_per_kg == pytest.approx(
        profile.capacity_per_inserted_mass_mah_per_g * profile.average_volts_against_metal, rel=1e-12)


def test_the_reaction_profile_equals_the_cli_json_and_the_highs_hull_at_every_breakpoint(client, server, reference, tmp_path):
    first, second = "coat-Al2O3-corundum", "ter-LiMn2O4-spinel"
    profile = client.get_reaction_profile(DEMO_DATASET, f"entry:{first}", f"entry:{second}", include_figure=True)
    cli_figure = tmp_path / "cli-reaction.svg"
    expected = cli_json(server.url, "react", DEMO_DATASET, first, second, "--figure", str(cli_figure))
    assert profile.reacts and expected["reacts"]
    assert profile.energy_unit == expected["energy_unit"] == "eV/atom"
    assert profile.energy_column == "reaction_energy_ev_per_atom"
    assert (profile.first.entry_id, profile.second.entry_id) == (expected["first"]["entry_id"], expected["second"]["entry_id"])
    assert profile.first.energy_above_hull_ev_per_atom == expected["first"]["energy_above_hull_ev_per_atom"]
    assert profile.most_negative_index == expected["most_negative_index"]
    assert profile.most_negative_per_formula_unit_index == expected["most_negative_per_formula_unit_index"]
    points = profile.points
    assert points.attrs["used"] == profile.used and len(points) == len(expected["points"]) > 2
    for row, want in zip(points.itertuples(), expected["points"]):
        assert row.atom_fraction_of_first == want["atom_fraction_of_first"]
        assert row.atom_fraction_exact == want["atom_fraction_exact"]
        assert row.formula_unit_fraction_of_first == want["formula_unit_fraction_of_first"]
        assert row.reaction_energy_ev_per_atom == want["reaction_energy_ev_per_atom"]
        assert row.reaction_energy_ev_per_formula_unit == want["reaction_energy_ev_per_formula_unit"]
        assert row.product_phase_ids == tuple(p["phase"]["phase_id"] for p in want["products"])
        assert row.product_formula_units_per_mixture_atom == tuple(p["formula_units_per_mixture_atom"] for p in want["products"])
    assert profile.figure is not None and cli_figure.read_text(encoding="utf-8") == profile.figure.svg
    assert profile.most_negative.reaction_energy_ev_per_atom == points.reaction_energy_ev_per_atom.min() < 0

    # ΔE(x) = E_hull(x·c_first + (1 − x)·c_second) − x·E_first − (1 − x)·E_second per atom of mixture, the hull
    # energy by SciPy's HiGHS LP over the exported formation energies (common practice); per formula unit of
    # mixture, times f·N_first + (1 − f)·N_second atoms.
    elements = sorted(set(reference[first][0]) | set(reference[second][0]))
    (c1, e1), (c2, e2) = reference[first], reference[second]
    n1, n2 = float(sum(c1.values())), float(sum(c2.values()))
    for row in points.itertuples():
        x = row.atom_fraction_of_first
        mixture = {e: x * float(c1.get(e, 0)) / n1 + (1 - x) * float(c2.get(e, 0)) / n2 for e in elements}
        hull, _ = hull_energy_and_potentials(reference, elements, mixture)
        assert row.reaction_energy_ev_per_atom == pytest.approx(hull - x * e1 - (1 - x) * e2, abs=TOLERANCE_EV)
        f = row.formula_unit_fraction_of_first
        assert row.reaction_energy_ev_per_formula_unit == pytest.approx(
            row.reaction_energy_ev_per_atom * (f * n1 + (1 - f) * n2), abs=TOLERANCE_EV)


def test_an_open_element_reaction_profile_is_per_closed_atom(client, server):
    profile = client.get_reaction_profile(DEMO_DATASET, "Li", "CoO2", open_elements={"O": -1.0})
    expected = cli_json(server.url, "react", DEMO_DATASET, "Li", "CoO2", "--by-formula", "--open", "O=-1.0")
    assert profile.energy_unit == expected["energy_unit"] == "eV per closed-element atom"
    assert "reaction_energy_ev_per_closed_atom" in profile.points.columns
    assert list(profile.points.reaction_energy_ev_per_closed_atom) == [p["reaction_energy_ev_per_atom"] for p in expected["points"]]
    assert profile.figure is None


@pytest.mark.parametrize("coating", ["coat-LiAlO2-gamma", "coat-LiAl5O8-spinel", "coat-Al2O3-corundum", "coat-Li5AlO4-beta"])
def test_the_electrochemical_window_equals_the_cli_json_and_the_highs_range_of_lithium(client, server, reference, coating):
    window = client.get_electrochemical_window(DEMO_DATASET, f"entry:{coating}", "Li")
    expected = cli_json(server.url, "ion-window", DEMO_DATASET, coating, "--ion", "Li")
    assert window.exists and expected["exists"] and window.chemical_system == expected["chemical_system"] == "Al-Li-O"
    assert (window.entry_id, window.formula, window.ion, window.charge_number) == \
        (expected["entry_id"], expected["formula"], expected["ion"], expected["charge_number"])
    for name in ("reduction_limit_volts", "highest_ion_potential_ev_per_atom", "oxidation_limit_volts",
                 "lowest_ion_potential_ev_per_atom"):
        assert getattr(window, name) == expected.get(name), name
    for end in ("reduction", "oxidation"):
        cli = expected.get(f"{end}_products")
        assert getattr(window, f"{end}_reaction") == (cli["reaction"] if cli else None)
        assert _products(getattr(window, f"{end}_products")) == (_cli_products(cli) if cli else [])
        assert getattr(window, f"{end}_hull_grand_potential_ev_per_closed_atom") == (cli["hull_energy_ev_per_atom"] if cli else None)
    assert window.caveat == expected["caveat"]

    # The ends are SciPy's HiGHS bounds on Δμ_Li with the coating on the hull, V = −Δμ_Li / z (common practice).
    lowest, highest = ion_potential_range(reference, ["Al", "Li", "O"], coating, "Li")
    assert window.highest_ion_potential_ev_per_atom == pytest.approx(highest, abs=TOLERANCE_EV)
    assert window.reduction_limit_volts == pytest.approx(-highest, abs=TOLERANCE_EV)
    if "Li" in reference[coating][0]:
        assert window.oxidation_limit_volts == pytest.approx(-lowest, abs=TOLERANCE_EV)
    else:
        # Without lithium the phase stays stable however low Δμ_Li goes: no oxidation limit against Li/Li+.
        assert lowest is None and window.oxidation_limit_volts is None


def test_bad_input_names_the_field(client, demo):
    with pytest.raises(InvalidArgumentError) as caught:
        client.get_voltage_profile(DEMO_DATASET, "CoO2", "Xx")
    assert [v.field for v in caught.value.field_violations] == ["ion"] and "Xx" in caught.value.message
    with pytest.raises(InvalidArgumentError) as caught:
        client.get_electrochemical_window(DEMO_DATASET, "entry:coat-LiAlO2-gamma", "li")
    assert [v.field for v in caught.value.field_violations] == ["ion"]
    with pytest.raises(InvalidArgumentError) as caught:
        client.get_open_element_hull(DEMO_DATASET, "Li-Co-O", {"O": -1.0, "Qq": -1.0})
    assert [v.field for v in caught.value.field_violations] == ["open_elements[1].element"] and "Qq" in caught.value.message
    with pytest.raises(InvalidArgumentError) as caught:
        client.get_open_element_hull(DEMO_DATASET, "Li-Co-O", {"Ni": -1.0})
    assert [v.field for v in caught.value.field_violations] == ["open_elements[0]"] and "Ni" in caught.value.message
    with pytest.raises(InvalidArgumentError) as caught:
        client.get_voltage_profile(DEMO_DATASET, "CoO2(", "Li")
    assert [v.field for v in caught.value.field_violations] == ["host_formula"]
    # Refused before anything is sent.
    with pytest.raises(ValueError, match="charge_number must be a positive integer"):
        client.get_voltage_profile(DEMO_DATASET, "CoO2", "Li", charge_number=0)
    with pytest.raises(ValueError, match=r"open_elements\['O'\] must be a finite"):
        client.get_open_element_hull(DEMO_DATASET, "Li-Co-O", {"O": "low"})
    with pytest.raises(TypeError, match="open_elements must be a mapping"):
        client.get_reaction_profile(DEMO_DATASET, "Li", "CoO2", open_elements=[("O", -1.0)])
