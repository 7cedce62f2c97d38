"""Defect studies through the client: stored and exported byte for byte, formation energies equal to the CLI's
JSON for the same request and to the formula worked here from the study file and the dataset's references, the
levels, the figure, and the server's warnings and refusals."""

import csv
import io
import json
import warnings
import xml.etree.ElementTree as ET

import pytest

from conftest import DEMO, cli_json, run_cli
from hullclient import DefectWarning, FailedPreconditionError, InvalidArgumentError, NotFoundError

DATASET = "coating-defects"
STUDY = "al2o3"
FILES = DEMO / "defects"
TOLERANCE_EV = 1e-9  # far above rounding, far below any physical difference (common practice)


@pytest.fixture(scope="module")
def study(client):
    client.create_dataset(DATASET, "the demo's coatings and Mg phases (invented)")
    for path in (DEMO / "round1" / "01-elements-binaries-ternaries.csv", DEMO / "round1" / "03-coatings.json", FILES / "mg-phases.csv"):
        client.import_table(DATASET, path)
    return client.import_defect_study(DATASET, STUDY, FILES / "al2o3-study.json", FILES / "al2o3-charge-states.csv",
                                      source_label="data-demo/defects")


def test_the_study_is_stored_and_exported_byte_for_byte(client, study, tmp_path):
    assert study.study.host_formula == "Al2O3" and study.study.study_version == 1
    assert list(study.defects.defect) == ["V_O", "V_Al", "Mg_Al", "Mg_Al+V_O"]
    assert study.warnings == ()  # the demo's bulk matches the dataset's corundum entry
    exported = client.export_defect_study(DATASET, STUDY)
    json_path, csv_path = exported.save(tmp_path / "s.json", tmp_path / "s.csv")
    assert json_path.read_bytes() == (FILES / "al2o3-study.json").read_bytes()
    assert csv_path.read_bytes() == (FILES / "al2o3-charge-states.csv").read_bytes()
    assert exported.study.content_sha256 == study.study.content_sha256
    listed = client.list_defect_studies(DATASET)
    assert listed.set_index("study_name").latest_version[STUDY] == 1


def test_formation_energies_equal_the_cli_and_the_formula(client, server, study):
    table = client.get_defect_formation_energies(DATASET, STUDY, fermi_levels_ev=[0.0, 3.0])
    expected = cli_json(server.url, "defects", "energies", DATASET, STUDY, "--fermi", "0", "--fermi", "3")
    cli_rows = [e for p in expected["points"] for e in p["energies"]]
    assert len(table) == len(cli_rows)
    for (_, row), want in zip(table.iterrows(), cli_rows):
        assert row.defect == want["defect"] and row.formation_energy_ev == want["formation_energy_ev"]

    # The terms add up, and the neutral oxygen vacancy at the O-rich vertex is the formula worked from the files:
    # E_f = [E(V_O) − E(bulk)] − (−1)(μ_O^ref + Δμ_O), μ_O^ref the dataset's O reference (el-O-gs, total per atom).
    terms = table.supercell_difference_ev + table.chemical_potential_ev + table.electron_reservoir_ev + table.correction_ev
    assert (abs(terms - table.formation_energy_ev) < 1e-9).all()
    bulk = json.loads((FILES / "al2o3-study.json").read_text())["host"]["total_energy_ev"]
    rows = list(csv.DictReader(io.StringIO((FILES / "al2o3-charge-states.csv").read_text())))
    neutral = float(next(r for r in rows if r["defect"] == "V_O" and r["charge"] == "0")["total_energy_ev"])
    o_reference = next(float(r.split(",")[2]) for r in (DEMO / "round1" / "01-elements-binaries-ternaries.csv").read_text().splitlines()
                       if r.startswith("el-O-gs,"))
    o_rich = table[(table.point == "O") & (table.defect == "V_O") & (table.charge == 0) & (table.fermi_level_ev == 0)].iloc[0]
    assert o_rich.delta_mu_O_ev == 0.0
    assert o_rich.formation_energy_ev == pytest.approx(neutral - bulk + o_reference, abs=1e-6)
    # E_F moves a state of charge q by q per eV.
    v2 = table[(table.point == "O") & (table.defect == "V_O") & (table.charge == 2)].set_index("fermi_level_ev").formation_energy_ev
    assert v2[3.0] - v2[0.0] == pytest.approx(6.0, abs=1e-9)
    assert set(table.attrs["corrections"].alignment_method) <= {"given", "none"}


def test_levels_figure_and_gas_conditions(client, study, tmp_path):
    levels = client.get_charge_transition_levels(DATASET, STUDY, vertex="O")
    assert levels.point.label == "O"
    thermodynamic = levels.levels[levels.levels.thermodynamic]
    assert set(thermodynamic.defect) == {"V_O", "V_Al", "Mg_Al", "Mg_Al+V_O"}
    assert len(levels.bindings) == 2

    figure = client.draw_defect_formation_figure(DATASET, STUDY, vertex="O")
    root = ET.fromstring(figure.svg)
    assert root.tag.endswith("svg") and figure.defect_count == 4
    assert figure.marked_level_count == int(thermodynamic.inside_gap.sum())

    air = client.get_defect_formation_energies(DATASET, STUDY, gas={"gas": "O2", "temperature_k": 1273.15, "pressure_bar": 0.21})
    assert air.attrs["gas"].element == "O"
    assert (air.delta_mu_O_ev == air.attrs["gas"].delta_mu_ev).all()


def test_warnings_and_refusals(client, study):
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("always")
        client.get_defect_formation_energies(DATASET, STUDY, point={"Al": -8.0, "O": -3.0})
    assert any(issubclass(w.category, DefectWarning) and "off the host's formation energy" in str(w.message) for w in caught)
    with pytest.raises(InvalidArgumentError) as bad_vertex:
        client.get_defect_formation_energies(DATASET, STUDY, vertex="Zn")
    assert "conditions.vertex" in [v.field for v in bad_vertex.value.field_violations]
    with pytest.raises(NotFoundError):
        client.export_defect_study(DATASET, "no-such-study")
    with pytest.raises(FailedPreconditionError):
        client.get_defect_formation_energies(DATASET, STUDY, gas={"gas": "O2", "temperature_k": 3000, "pressure_bar": 1e-20})
    with pytest.raises(ValueError):
        client.get_defect_formation_energies(DATASET, STUDY, vertex="O", gas={"gas": "O2"})


# CODATA 2018 (exact SI values, and m_e): k_B in J/K and eV/K, h in J s, m_e in kg.
K_B_J, K_B_EV, PLANCK, ELECTRON_MASS = 1.380649e-23, 1.380649e-23 / 1.602176634e-19, 6.62607015e-34, 9.1093837015e-31


def _normalised_fermi_half(eta):
    """F_{1/2}(η) = (2/√π) ∫_0^∞ √x / (1 + e^{x−η}) dx (the normalised Fermi–Dirac integral), by SciPy quad."""
    import math
    from scipy.integrate import quad
    value, _ = quad(lambda x: math.sqrt(x) / (1.0 + math.exp(min(x - eta, 700.0))), 0, max(eta, 0) + 60, limit=200)
    return 2 / math.sqrt(math.pi) * value


def test_fermi_level_equals_the_cli_and_scipy_brentq_on_the_neutrality_written_here(client, server, study):
    import math
    import numpy as np
    from scipy.optimize import brentq

    table = client.solve_fermi_level(DATASET, STUDY, temperature_k=1600, operating_temperature_k=300)
    expected = cli_json(server.url, "defects", "fermi", DATASET, STUDY, "--solve-at", "1600", "--quench-to", "300")
    assert list(table.state) == ["growth", "quenched"] * len(expected["points"])
    for (_, row), want in zip(table.iterrows(), [s for p in expected["points"] for s in (p["equilibrium"], p["quenched"])]):
        assert row.fermi_level_ev == want["fermi_level_ev"] and row.electrons_per_cm3 == want["electrons_per_cm3"]
        assert row.status == "converged"
    totals = table.attrs["defects"]
    grown, quenched = totals[totals.state == "growth"], totals[totals.state == "quenched"]
    assert list(grown.per_cm3) == pytest.approx(list(quenched.per_cm3), rel=1e-12)  # a quench keeps the totals

    # The outside check: neutrality at the O-rich vertex, 1600 K, written from the formulas (issue 17) with the study
    # file's inputs and the formation energies at E_F = 0 from get_defect_formation_energies, solved by SciPy brentq.
    t = 1600.0
    solved = client.solve_fermi_level(DATASET, STUDY, temperature_k=t, vertex="O").iloc[0]
    doc = json.loads((FILES / "al2o3-study.json").read_text())
    host, carriers = doc["host"], doc["carriers"]
    volume_cm3 = abs(np.linalg.det(np.array(host["lattice_vectors_angstrom"]))) * 1e-24
    kt = K_B_EV * t

    def effective_states(mass_ratio):  # N = 2 (2π m* k_B T / h²)^{3/2}, m^-3 → cm^-3
        return 2 * (2 * math.pi * mass_ratio * ELECTRON_MASS * K_B_J * t / PLANCK ** 2) ** 1.5 * 1e-6

    nc, nv = effective_states(carriers["electron_mass_ratio"]), effective_states(carriers["hole_mass_ratio"])
    g = carriers["gap_temperature"]  # Varshni: ΔE_g = −α [T²/(T+β) − T_ref²/(T_ref+β)], a share at the VBM
    varshni = lambda x: x * x / (x + g["beta_k"]) if x > 0 else 0.0  # noqa: E731
    change = -g["alpha_ev_per_k"] * (varshni(t) - varshni(g["reference_temperature_k"]))
    valence, conduction = -g["valence_band_share"] * change, host["band_gap_ev"] + (1 - g["valence_band_share"]) * change
    at_vbm = client.get_defect_formation_energies(DATASET, STUDY, vertex="O", fermi_levels_ev=[0.0])
    sites = {x["name"]: x["sites_per_formula_unit"] * host["formula_units"] / volume_cm3 for x in doc["defects"]}
    degeneracy = {x["name"]: x.get("degeneracy", 1) for x in doc["defects"]}
    states = [(row.defect, row.charge, row.formation_energy_ev) for _, row in at_vbm.iterrows()]

    def net_charge(fermi):
        p = nv * _normalised_fermi_half((valence - fermi) / kt)
        n = nc * _normalised_fermi_half((fermi - conduction) / kt)
        defects = sum(q * sites[name] * degeneracy[name] * math.exp(-(a + q * fermi) / kt) for name, q, a in states)
        return p - n + carriers.get("extra_donors_per_cm3", 0) - carriers.get("extra_acceptors_per_cm3", 0) + defects

    reference = brentq(net_charge, valence - 1, conduction + 1, xtol=1e-13, rtol=1e-15, maxiter=500)
    assert solved.fermi_level_ev == pytest.approx(reference, abs=1e-7)
    assert solved.valence_edge_ev == pytest.approx(valence, abs=1e-12)
    assert solved.holes_per_cm3 == pytest.approx(nv * _normalised_fermi_half((valence - reference) / kt), rel=1e-5)


def test_solubility_and_carrier_figure_equal_the_cli(client, server, study):
    result = client.get_dopant_solubility(DATASET, STUDY, [1400, 1800], form="site_blocking")
    expected = cli_json(server.url, "defects", "solubility", DATASET, STUDY, "--growth", "1400", "--growth", "1800", "--form", "site-blocking")
    assert result.dopant == expected["dopant"] == "Mg"
    assert result.max_delta_mu_ev == expected["max_delta_mu_ev"]
    assert result.limiting_phase_ids == tuple(expected["limiting_phase_ids"])
    assert result.cautions == ()  # Mg is no listed hazard; the demo says its own caution
    rows = [v for t in expected["temperatures"] for v in t["vertices"]]
    assert list(result.table.dopant_per_cm3) == [v["dopant_per_cm3"] for v in rows]
    assert list(result.most_soluble.vertex_number) == [t["most_soluble_vertex"] for t in expected["temperatures"]]
    assert (result.table.form == "site_blocking").all()
    assert result.most_soluble.dopant_per_cm3.is_monotonic_increasing  # more dissolves hotter

    figure = client.draw_carrier_figure(DATASET, STUDY, [900, 1300, 1700], vertex="O")
    root = ET.fromstring(figure.svg)
    assert root.tag.endswith("svg") and figure.point.label == "O"


def test_carrier_figure_along_a_path_equals_the_cli_file(client, server, study, tmp_path):
    # The sweep along the window from the O-rich to the Al-rich vertex at one temperature: the client's SVG equals
    # the file the C# CLI writes for the same request (a consistency check; the server's own test checks the levels).
    figure = client.draw_carrier_figure(DATASET, STUDY, [1600], vertex="O", path_to="Al", path_points=11)
    target = tmp_path / "path.svg"
    run_cli(server.url, "defects", "carrier-figure", DATASET, STUDY, "--vertex", "O", "--path-to", "Al",
            "--path-points", "11", "--sweep", "1600", "--output", str(target))
    assert target.read_text(encoding="utf-8") == figure.svg
    assert "from window vertex" in figure.svg
    with pytest.raises(InvalidArgumentError) as two:
        client.draw_carrier_figure(DATASET, STUDY, [1400, 1600], vertex="O", path_to="Al")
    assert "temperatures_k" in str(two.value)


def test_carrier_calls_refuse_a_study_without_carriers(client, study):
    doc = json.loads((FILES / "al2o3-study.json").read_text())
    del doc["carriers"]
    client.import_defect_study(DATASET, "no-carriers", json.dumps(doc), (FILES / "al2o3-charge-states.csv").read_text())
    with pytest.raises(FailedPreconditionError) as missing:
        client.solve_fermi_level(DATASET, "no-carriers", temperature_k=1000)
    assert "carriers" in str(missing.value)
    with pytest.raises(ValueError):
        client.solve_fermi_level(DATASET, STUDY, temperature_k=1000, statistics="classical")
