"""Figures as SVG text with save(), and chemical-potential windows: equal to the CLI's answers for the same
requests, and each window vertex on the compound's own formation-energy plane worked here from the export."""

import math
import xml.etree.ElementTree as ET

import pandas as pd
import pytest

from conftest import DEMO_DATASET, cli_json, run_cli
from hullclient import InvalidArgumentError
from reference_hull import formation_energies

CATHODE = "ter-LiCoO2-r3m"
TOLERANCE_EV = 1e-9  # as the hull checks: far above rounding, far below any physical difference (common practice)


def test_a_ternary_figure_is_the_svg_the_cli_writes(client, server, demo, tmp_path):
    figure = client.draw_phase_diagram(DEMO_DATASET, "Li-Co-O", max_above_hull_ev_per_atom=0.1)
    assert figure.kind == "ternary" and set(figure.components) == {"Li", "Co", "O"}
    assert figure.stable_phase_count > 3 and figure.edge_count >= figure.stable_phase_count - 1
    saved = figure.save(tmp_path / "li-co-o.svg")
    root = ET.parse(saved).getroot()
    assert root.tag.endswith("svg")
    cli_file = tmp_path / "cli.svg"
    run_cli(server.url, "figure", DEMO_DATASET, "Li-Co-O", "--max-above-hull", "0.1", "--output", str(cli_file))
    assert cli_file.read_text(encoding="utf-8") == figure.svg


def test_a_quaternary_view_and_an_end_member_figure(client, demo):
    quaternary = client.draw_phase_diagram(DEMO_DATASET, "Co-Li-Ni-O", azimuth_degrees=30, elevation_degrees=15)
    assert quaternary.kind == "quaternary"
    pseudo = client.draw_phase_diagram(DEMO_DATASET, end_members=["LiCoO2", "LiNiO2", "LiMnO2"])
    assert pseudo.kind == "ternary" and pseudo.components == ("LiCoO2", "LiNiO2", "LiMnO2")
    assert pseudo._repr_svg_() == pseudo.svg


def test_the_window_equals_the_cli_json_and_its_vertices_lie_on_the_compound_plane(client, server, demo):
    answer = client.get_stability_window(DEMO_DATASET, f"entry:{CATHODE}")
    window = answer.window
    expected = cli_json(server.url, "window", DEMO_DATASET, CATHODE)["window"]
    assert window.kind == "full" and window.dimension == int(expected["dimension"])
    assert list(window.elements) == expected["elements"]
    for (_, row), want in zip(window.vertices.iterrows(), expected["vertices"]):
        assert [row[f"delta_mu_{e}_ev"] for e in window.elements] == [float(v) for v in want["chemical_potentials_ev"]]
        assert row["limiting_phase_ids"] == tuple(want.get("limiting_phase_ids", []))
        for volt in want.get("voltages", []):
            assert row[f"volts_against_{volt['element']}_metal"] == volt["volts_against_metal"]
    assert len(window.vertices) == len(expected["vertices"])

    comp, per_atom = formation_energies(client.export_entries(DEMO_DATASET))[CATHODE]
    per_formula_unit = per_atom * float(sum(comp.values()))
    for _, row in window.vertices.iterrows():
        # The window's defining equality: Σ n_i Δμ_i = the compound's formation energy per formula unit.
        total = sum(float(comp[e]) * row[f"delta_mu_{e}_ev"] for e in window.elements)
        assert total == pytest.approx(per_formula_unit, abs=TOLERANCE_EV)
        assert all(row[f"delta_mu_{e}_ev"] <= TOLERANCE_EV for e in window.elements)
    assert set(window.extremes.element) == set(window.elements)


def test_a_slice_and_dopant_limits_equal_the_cli_json(client, server, demo):
    sliced = client.slice_stability_window(DEMO_DATASET, f"entry:{CATHODE}", {"O": -1.0})
    expected = cli_json(server.url, "window-slice", DEMO_DATASET, CATHODE, "--fix", "O=-1.0")
    assert sliced.misses == expected.get("misses", False)
    assert list(sliced.nearest_point_ev) == [float(v) for v in expected.get("nearest_point_ev", [])]
    assert len(sliced.slice.vertices) == len(expected["slice"].get("vertices", []))

    limits = client.get_dopant_limits(DEMO_DATASET, f"entry:{CATHODE}", "Al")
    expected = cli_json(server.url, "dopant-limits", DEMO_DATASET, CATHODE, "Al")
    (al,) = limits.limits
    (want,) = expected["limits"]
    assert al.dopant == "Al" and al.overall_max_ev == want["overall_max_ev"]
    assert al.overall_limiting_phase_ids == tuple(want["overall_limiting_phase_ids"])
    assert list(al.per_host_vertex.max_dopant_potential_ev) == [v["max_dopant_potential_ev"] for v in want["per_host_vertex"]]
    assert len(limits.host.vertices) == len(expected["host"]["vertices"])


def test_the_window_figure_is_the_cli_svg_and_draws_the_window_qhull_finds(client, server, demo, tmp_path):
    from scipy.spatial import ConvexHull  # Qhull through Debian's python3-scipy

    figure = client.draw_window_figure(DEMO_DATASET, f"entry:{CATHODE}", x_element="Li", y_element="Co")
    assert (figure.x_element, figure.y_element, figure.dependent_element) == ("Li", "Co", "O")
    assert figure.drawn_dimension == 2 and not figure.section and not figure.section_misses
    cli_file = tmp_path / "cli.svg"
    run_cli(server.url, "window-figure", DEMO_DATASET, CATHODE, "--x", "Li", "--y", "Co", "--output", str(cli_file))
    assert cli_file.read_text(encoding="utf-8") == figure.svg

    # The drawn polygon read back in eV through the plot box and ranges the figure records.
    root = ET.fromstring(figure.svg)
    meta = next(e for e in root.iter() if e.tag.endswith("figure"))
    left, top, width, height = (float(v) for v in meta.get("plot").split())
    x0, x1 = (float(v) for v in meta.get("x-range").split())
    y0, y1 = (float(v) for v in meta.get("y-range").split())
    path = next(e for e in root.iter() if e.get("data-kind") == "window")
    numbers = [float(t) for t in path.get("d").replace("M", " ").replace("L", " ").replace("Z", " ").replace(",", " ").split()]
    drawn = [(x0 + (px - left) / width * (x1 - x0), y0 + (top + height - py) / height * (y1 - y0))
             for px, py in zip(numbers[0::2], numbers[1::2])]

    window = client.get_stability_window(DEMO_DATASET, f"entry:{CATHODE}").window
    points = [(row["delta_mu_Li_ev"], row["delta_mu_Co_ev"]) for _, row in window.vertices.iterrows()]
    hull = ConvexHull(points)
    # Half a written pixel (0.05 px) in eV on each axis.
    tx, ty = 0.051 / width * (x1 - x0), 0.051 / height * (y1 - y0)
    assert len(drawn) == len(hull.vertices) == len(figure.drawn_vertices)
    for i in hull.vertices:
        assert sum(abs(p[0] - points[i][0]) <= tx and abs(p[1] - points[i][1]) <= ty for p in drawn) == 1
    shoelace = abs(sum(drawn[k][0] * drawn[(k + 1) % len(drawn)][1] - drawn[(k + 1) % len(drawn)][0] * drawn[k][1]
                       for k in range(len(drawn)))) / 2
    assert shoelace == pytest.approx(hull.volume, rel=1e-3)  # a 2-D hull's "volume" is its area


def test_a_slice_by_oxygen_in_air_equals_the_cli_and_the_janaf_hand_value(client, server, demo):
    # NIST-JANAF Thermochemical Tables, 4th ed. (1998), O2 at 1000 K: H° − H°(298.15 K) = 22.703 kJ/mol,
    # S° = 243.578 J/(mol K) — from memory; CODATA 2018 k_B and e·N_A; the demo's references taken as fitted.
    k_b = 8.617333262e-5
    hand = ((22.703 - 243.578) / 96.4853321233 + k_b * 1000 * math.log(0.21)) / 2
    sliced = client.slice_stability_window(DEMO_DATASET, f"entry:{CATHODE}", fixed_gases={"O2": (1000, 0.21)},
                                           gas_at_temperature_k=1000)
    assert sliced.fixed_potentials_used["O"] == pytest.approx(hand, abs=1e-4)  # the Shomate fit, a few J/mol off
    expected = cli_json(server.url, "window-slice", DEMO_DATASET, CATHODE, "--fix-gas", "O2=1000,0.21", "--gas-temperature", "1000")
    assert [p["chemical_potential_ev"] for p in expected["fixed_potentials_used"]] == [sliced.fixed_potentials_used["O"]]
    assert len(sliced.slice.vertices) == len(expected["slice"].get("vertices", []))
    for _, row in sliced.slice.vertices.iterrows():
        assert row["log10_p_O2_bar"] == pytest.approx(math.log10(0.21), abs=1e-9)


def test_a_computed_oxygen_molecule_reads_vertices_against_the_datasets_reference(client):
    # An invented Li-Co-O set in total energies per formula unit: references Li −1.9, Co −7.1, O −4.95 eV/atom, each
    # compound's total = Σ references + its formation energy × atoms. An invented computed O2: −9.86 eV at rest,
    # 0.098 eV zero-point energy. NIST-JANAF 4th ed. (1998) O2 at 1000 K, as the gas tables hold it (from memory):
    # H° − H°(298.15 K) = 22.703 kJ/mol, S° = 243.578 J/(mol K), H°(298.15 K) − H°(0) = 8.683 kJ/mol; CODATA 2018.
    # Δμ_O = ½(E + ZPE) − E_ref + ½ Δμ(T, p°) + ½ k_B T ln(p/p°) = −1.030608 eV + ½ k_B·1000·ln(p/p°).
    k_b = 8.617333262e-5
    standard = 0.5 * (-9.86 + 0.098) + 4.95 + (22.703 + 8.683 - 243.578) / 96.4853321233 / 2
    assert standard == pytest.approx(-1.030608, abs=1e-6)
    client.create_dataset("licoo-total")
    client.import_entries("licoo-total", pd.DataFrame({
        "id": ["Li", "Co", "O2", "Li2O", "CoO", "LiCoO2"],
        "formula": ["Li", "Co", "O2", "Li2O", "CoO", "LiCoO2"],
        "energy_ev": [-1.9, -7.1, -9.9, -14.75, -14.45, -26.1],
        "basis": ["total_per_formula_unit"] * 6,
    }))
    molecule = {"O2": (-9.86, 0.098)}
    answer = client.get_stability_window("licoo-total", "entry:LiCoO2", gas_at_temperature_k=1000, gas_molecules=molecule)
    assert len(answer.window.vertices) >= 3
    for _, row in answer.window.vertices.iterrows():
        hand = 2 * (row["delta_mu_O_ev"] - standard) / (k_b * 1000 * math.log(10))
        assert row["log10_p_O2_bar"] == pytest.approx(hand, abs=2e-3)  # the Shomate fit, a few J/mol off the table

    sliced = client.slice_stability_window("licoo-total", "entry:LiCoO2", fixed_gases={"O2": (1000, 0.21)}, gas_molecules=molecule)
    assert sliced.fixed_potentials_used["O"] == pytest.approx(standard + k_b * 1000 * math.log(0.21) / 2, abs=1e-4)

    with pytest.raises(InvalidArgumentError) as bad:
        client.get_stability_window("licoo-total", "entry:LiCoO2", gas_molecules={"Mg": (-1.0, 0.0)})
    assert bad.value.field_violations[0].field == "settings.gas_molecules[0].gas"
    with pytest.raises(InvalidArgumentError, match="N is not an element of this answer"):
        client.get_stability_window("licoo-total", "entry:LiCoO2", gas_molecules={"N2": (-16.6, 0.15)})


def test_dopant_limits_and_the_window_figure_read_gases_through_a_computed_molecule(client):
    # The invented Li-Co-O total-energy set of the test above, with Al (reference −3.75 eV/atom) and Al2O3 (formation
    # −3.4 eV/atom: 2(−3.75) + 3(−4.95) − 5·3.4 = −39.35 eV per formula unit) as the dopant's phase, and the same
    # invented computed O2 (−9.86 eV at rest, 0.098 eV zero-point). Hand value as there, from NIST-JANAF 4th ed. (1998)
    # O2 at 1000 K (from memory): Δμ_O at 1 bar = ½(E + ZPE) − E_ref + ½{[H° − H°(298.15 K)] + [H°(298.15 K) − H°(0)]
    # − T S°}, then log10 p = 2(Δμ_O − that)/(k_B T ln 10).
    k_b = 8.617333262e-5
    standard = 0.5 * (-9.86 + 0.098) + 4.95 + (22.703 + 8.683 - 243.578) / 96.4853321233 / 2
    client.create_dataset("licoal-total")
    client.import_entries("licoal-total", pd.DataFrame({
        "id": ["Li", "Co", "O2", "Al", "Li2O", "CoO", "LiCoO2", "Al2O3"],
        "formula": ["Li", "Co", "O2", "Al", "Li2O", "CoO", "LiCoO2", "Al2O3"],
        "energy_ev": [-1.9, -7.1, -9.9, -3.75, -14.75, -14.45, -26.1, -39.35],
        "basis": ["total_per_formula_unit"] * 8,
    }))
    molecule = {"O2": (-9.86, 0.098)}

    def assert_read_through_the_molecule(vertices):
        assert len(vertices) >= 3
        for _, row in vertices.iterrows():
            hand = 2 * (row["delta_mu_O_ev"] - standard) / (k_b * 1000 * math.log(10))
            assert row["log10_p_O2_bar"] == pytest.approx(hand, abs=2e-3)  # the Shomate fit, a few J/mol off the table

    limits = client.get_dopant_limits("licoal-total", "entry:LiCoO2", "Al", gas_at_temperature_k=1000, gas_molecules=molecule)
    assert_read_through_the_molecule(limits.host.vertices)
    assert_read_through_the_molecule(limits.limits[0].extended_vertices)
    # Without the molecule the same vertices read O against the fitted reference: another pressure.
    fitted = client.get_dopant_limits("licoal-total", "entry:LiCoO2", "Al", gas_at_temperature_k=1000)
    assert (fitted.host.vertices["log10_p_O2_bar"] - limits.host.vertices["log10_p_O2_bar"]).abs().min() > 0.1
    with pytest.raises(InvalidArgumentError) as bad:
        client.get_dopant_limits("licoal-total", "entry:LiCoO2", "Al", gas_molecules={"Mg": (-1.0, 0.0)})
    assert bad.value.field_violations[0].field == "settings.gas_molecules[0].gas"

    figure = client.draw_window_figure("licoal-total", "entry:LiCoO2", x_element="Li", y_element="Co",
                                       projection_omits="Li", gas_at_temperature_k=1000, gas_molecules=molecule)
    assert_read_through_the_molecule(figure.window.vertices)
    assert_read_through_the_molecule(figure.drawn_vertices)
    assert figure.window.size.projection_elements == ("Co", "O")
    with pytest.raises(InvalidArgumentError) as bad:
        client.draw_window_figure("licoal-total", "entry:LiCoO2", gas_molecules={"Mg": (-1.0, 0.0)})
    assert bad.value.field_violations[0].field == "settings.gas_molecules[0].gas"
