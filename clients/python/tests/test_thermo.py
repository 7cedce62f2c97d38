"""Temperature and oxygen pressure through the client: the demo cathode's oxygen-release temperature equal to the
C# CLI's JSON, and checked against the closed form T_d = ΔH / (ΔS − ν R ln(p/p°)) worked here from the export's
formation energies and the demo's invented entropies (the Ellingham approximation, common practice); the tabulated
path against the hull at (T, p) on both sides of its crossing; O2's Δμ against a NIST-JANAF row; refusals naming
the field. Released oxygen and hot cathodes are a fire hazard: these are estimates, not safety advice."""

import math

import pandas as pd
import pytest

from conftest import DEMO, DEMO_DATASET, cli_json
from hullclient import InvalidArgumentError
from hullclient.thermo import Gas
from reference_hull import formation_energies

MODELS = DEMO / "thermo" / "li-co-o-entropies.csv"
CATHODE = "ter-LiCo2O4-delithiated"
# CODATA 2018: R = 8.314462618 J/(mol K), e N_A = 96.48533212 kJ/mol per eV, k_B = 8.617333262e-5 eV/K — from memory
R = 8.314462618
KJ_PER_MOL_PER_EV = 96.48533212
K_B = 8.617333262e-5
# NIST-JANAF Thermochemical Tables, 4th ed. (1998), O2 S°(298.15 K) = 205.147 J/(mol K) — from memory
O2_ENTROPY = 205.147


@pytest.fixture(scope="module")
def reference(client, demo):
    return formation_energies(client.export_entries(DEMO_DATASET))


def test_the_cathode_gives_off_oxygen_where_the_closed_form_says(client, server, reference):
    oxygen = Gas("O2", 0.21, standard_entropy_j_per_mol_k=O2_ENTROPY)
    found = client.find_decomposition_temperatures(DEMO_DATASET, f"entry:{CATHODE}", 300, 1500, gas=oxygen, models=MODELS,
                                                   treatment="ellingham", chemical_system="Li-Co-O")
    expected = cli_json(server.url, "thermo", "decompose", DEMO_DATASET, CATHODE, "--pressure", "0.21", "--from", "300",
                        "--to", "1500", "--models", str(MODELS), "--treatment", "ellingham", "--standard-entropy",
                        str(O2_ENTROPY), "--system", "Li-Co-O")
    assert len(found.crossings) == len(expected["crossings"]) == 1
    crossing = found.crossings.iloc[0]
    assert crossing.temperature_k == expected["crossings"][0]["temperature_k"]
    assert crossing.direction == "decomposes above"
    assert found.stable_at_from and not found.stable_at_to
    assert found.models_from == "request" and "fire hazard" in found.caution
    assert sorted(p.phase_id for p in crossing.products) == ["bin-Co3O4", "ter-LiCoO2-r3m"]
    assert crossing.gas_released_molecules_per_formula_unit == pytest.approx(1 / 3, abs=1e-12)

    # LiCo2O4 → LiCoO2 + 1/3 Co3O4 + 1/3 O2, worked here: ΔH from the export's formation energies (per formula unit),
    # ΔS from the models file and O2's S°, held constant (the Ellingham approximation).
    entropy = pd.read_csv(MODELS, comment="#").set_index("entry_id").standard_entropy_j_per_mol_k
    def per_fu(ident):
        comp, e = reference[ident]
        return e * float(sum(comp.values()))
    delta_h = (per_fu("ter-LiCoO2-r3m") + per_fu("bin-Co3O4") / 3 - per_fu(CATHODE)) * KJ_PER_MOL_PER_EV * 1000
    delta_s = entropy["ter-LiCoO2-r3m"] + entropy["bin-Co3O4"] / 3 + O2_ENTROPY / 3 - entropy[CATHODE]
    assert crossing.temperature_k == pytest.approx(delta_h / (delta_s - R * math.log(0.21) / 3), abs=1e-6)
    # Lower oxygen pressure, lower release temperature.
    purged = client.find_decomposition_temperatures(DEMO_DATASET, f"entry:{CATHODE}", 300, 1500, gas=Gas("O2", 1e-3, standard_entropy_j_per_mol_k=O2_ENTROPY),
                                                    models=MODELS, treatment="ellingham", chemical_system="Li-Co-O")
    assert purged.crossings.temperature_k.iloc[0] == pytest.approx(delta_h / (delta_s - R * math.log(1e-3) / 3), abs=1e-6)


def test_the_tabulated_crossing_separates_stable_from_unstable_on_the_hull_at_conditions(client, demo):
    found = client.find_decomposition_temperatures(DEMO_DATASET, f"entry:{CATHODE}", 300, 1500, pressure_bar=0.21,
                                                   models=MODELS, chemical_system="Li-Co-O")
    t = found.crossings.temperature_k.iloc[0]
    assert found.crossings.method.iloc[0] == "Brent in scan bracket" and found.crossings.converged.iloc[0]
    below = client.get_hull_at_conditions(DEMO_DATASET, "Li-Co-O", t - 0.5, pressure_bar=0.21, models=MODELS)
    above = client.get_hull_at_conditions(DEMO_DATASET, "Li-Co-O", t + 0.5, pressure_bar=0.21, models=MODELS)
    assert CATHODE in below.attrs["stable_phase_ids"]
    assert CATHODE not in above.attrs["stable_phase_ids"]
    assert above.set_index("entry_id").energy_above_hull_ev_per_closed_atom[CATHODE] > 0
    assert below.attrs["references"]["Co"] == "el-Co-fcc" and "Co" in below.attrs["changed_references"]
    assert below.attrs["reservoir_entry_ids"] == ("el-O-gs",)


def test_oxygen_delta_mu_against_the_janaf_row_and_back(client, demo, reference):
    mu = client.get_gas_potential("O2", 1000, pressure_bar=0.21, dataset=DEMO_DATASET, delta_mu_ev_per_atom=-1.2)
    # NIST-JANAF Thermochemical Tables, 4th ed. (1998), O2 at 1000 K: H − H(298.15) = 22.703 kJ/mol, S° = 243.578 J/(mol K) — from memory
    expected = 0.5 * ((22.703 - 1000 * 0.243578) / KJ_PER_MOL_PER_EV + K_B * 1000 * math.log(0.21))
    assert mu.point.delta_mu_ev_per_atom == pytest.approx(expected, abs=1e-4)
    assert mu.point.dataset_reference_entry_id == "el-O-gs" and mu.anchor_temperature_k == 298.15
    back = client.get_gas_potential("O2", 1000, pressure_bar=mu.pressure_for_delta_mu_bar, dataset=DEMO_DATASET)
    assert back.point.delta_mu_ev_per_atom == pytest.approx(-1.2, abs=1e-9)
    at_t = client.get_gas_potential("O2", mu.temperature_for_delta_mu_k, pressure_bar=0.21, dataset=DEMO_DATASET)
    assert at_t.point.delta_mu_ev_per_atom == pytest.approx(-1.2, abs=1e-9)


def test_the_figure_and_refusals(client, demo, tmp_path):
    figure = client.draw_temperature_figure(DEMO_DATASET, [f"entry:{CATHODE}", "entry:bin-Co3O4"], 300, 1500,
                                            pressure_bar=0.21, models=MODELS, chemical_system="Li-Co-O")
    assert figure.svg.count('data-kind="crossing"') == sum(len(p.crossings) for p in figure.phases) >= 2
    figure.save(tmp_path / "thermo.svg")
    with pytest.raises(InvalidArgumentError) as caught:
        client.find_decomposition_temperatures(DEMO_DATASET, f"entry:{CATHODE}", 300, 1500, gas="Ar", pressure_bar=1, models=MODELS)
    assert [v.field for v in caught.value.field_violations] == ["gas.gas"]
    with pytest.raises(InvalidArgumentError) as caught:
        client.find_decomposition_temperatures(DEMO_DATASET, f"entry:{CATHODE}", 300, 1500, pressure_bar=-1, models=MODELS)
    assert [v.field for v in caught.value.field_violations] == ["gas.pressure_bar"]
    bad = [{"entry_id": CATHODE, "formula": "CoO2", "standard_entropy_j_per_mol_k": 50.0}]
    with pytest.raises(InvalidArgumentError) as caught:
        client.find_decomposition_temperatures(DEMO_DATASET, f"entry:{CATHODE}", 300, 1500, pressure_bar=0.21, models=bad)
    assert [v.field for v in caught.value.field_violations] == ["models[0].model.formula"]
