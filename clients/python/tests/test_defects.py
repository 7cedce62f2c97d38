"""Defect studies through the client: stored and exported byte for byte, formation energies equal to the CLI's
JSON for the same request and to the formula worked here from the study file and the dataset's references, the
levels, the figure, and the server's warnings and refusals."""

import csv
import io
import json
import warnings
import xml.etree.ElementTree as ET

import pytest

from conftest import DEMO, cli_json
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
