"""Stability answers of the demo: against an outside reference (SciPy ConvexHull / Qhull) and, as a consistency
check, equal to the C# CLI's JSON for the same requests exactly after parsing."""

import math

import pytest

from conftest import DEMO, DEMO_DATASET, cli_json
from hullclient import CoverageWarning, decomposition_products
from reference_hull import LowerHull, formation_energies

# Both hulls and the reference work in double precision on energies of a few eV/atom; 1e-9 eV/atom is far below
# any physical difference and far above rounding (common practice for comparing hull energies).
TOLERANCE_EV_PER_ATOM = 1e-9


def test_analysis_energies_above_hull_match_scipy_convex_hull(client, demo):
    table = client.analyze_dataset(DEMO_DATASET)
    exported = client.export_entries(DEMO_DATASET)
    assert len(table) == len(exported)
    reference = formation_energies(exported)
    for system in table.attrs["hull_systems"]:
        elements = system.split("-")
        members = [i for i, (comp, _) in reference.items() if set(comp) <= set(elements)]
        hull = LowerHull(elements, [reference[i] for i in members])
        answered = table[table.chemical_system == system]
        assert len(answered) > 10
        for row in answered.itertuples():
            comp, formation = reference[row.entry_id]
            # Formation energies worked from the exported totals and the lowest pure-element references.
            assert row.formation_energy_ev_per_atom == pytest.approx(formation, abs=TOLERANCE_EV_PER_ATOM)
            # SciPy ConvexHull (Qhull), Debian python3-scipy: the lower hull's energy at the composition.
            above = formation - hull.energy_at(hull.fractions(comp))
            assert row.energy_above_hull_ev_per_atom == pytest.approx(max(above, 0.0), abs=TOLERANCE_EV_PER_ATOM), row.entry_id
            assert row.is_on_hull == (row.energy_above_hull_ev_per_atom == 0.0)
            assert sum(row.decomposition_atom_fractions) == pytest.approx(1.0, abs=1e-12)


def test_analysis_equals_cli_json(client, server, demo):
    seen = []
    table = client.analyze_dataset(DEMO_DATASET, page_size=50, progress=lambda done, total: seen.append((done, total)))
    assert seen[-1] == (len(table), len(table)) and len(seen) == -(-len(table) // 50)
    expected = cli_json(server.url, "analyze", DEMO_DATASET)
    assert table.attrs["used"].content_sha256 == expected["used"]["content_sha256"]
    assert table.attrs["used"].version == int(expected["used"]["version"])
    assert list(table.attrs["hull_systems"]) == expected["hull_systems"]
    assert [r.symbol for r in table.attrs["references"]] == [r["symbol"] for r in expected["references"]]
    assert len(table) == len(expected["results"]) == int(expected["entry_count"])
    for row, want in zip(table.to_dict("records"), expected["results"]):
        assert_stability_row(row, want)


def assert_stability_row(row, want):
    for name in ("entry_id", "formula", "chemical_system", "formation_energy_ev_per_atom",
                 "energy_above_hull_ev_per_atom"):
        assert row[name] == want[name], (row["entry_id"], name)
    assert row["is_on_hull"] == want.get("is_on_hull", False)
    assert row["is_hull_vertex"] == want.get("is_hull_vertex", False)
    if "decomposition_energy_ev_per_atom" in want:
        assert row["decomposition_energy_ev_per_atom"] == want["decomposition_energy_ev_per_atom"]
    else:
        assert math.isnan(row["decomposition_energy_ev_per_atom"])
    assert_decomposition(row, want["decomposition"])


def assert_decomposition(row, want):
    assert row["hull_energy_ev_per_atom"] == want["hull_energy_ev_per_atom"]
    assert row["reaction"] == want["reaction"]
    assert [p.phase_id for p in row["decomposition"]] == [p["phase_id"] for p in want["products"]]
    assert [p.atom_fraction for p in row["decomposition"]] == [p["atom_fraction"] for p in want["products"]]
    assert [p.formula_units for p in row["decomposition"]] == [p["formula_units"] for p in want["products"]]
    assert [p.formula_units_exact for p in row["decomposition"]] == [p.get("formula_units_exact", "") for p in want["products"]]


@pytest.mark.filterwarnings("ignore::hullclient.CoverageWarning")  # el-Li-fcc: Li alone has no competing phase
def test_entry_stability_equals_cli_json_and_unfolds_decompositions(client, server, demo):
    ids = ["nmc-n04m04c04-A", "bin-Co2O3", "el-Li-fcc"]
    table = client.get_entry_stability(DEMO_DATASET, ids, version=2)
    expected = cli_json(server.url, "stability", DEMO_DATASET, *ids, "--version", "2")
    assert list(table.entry_id) == ids
    assert table.attrs["used"].version == 2
    for row, want in zip(table.to_dict("records"), expected["results"]):
        assert_stability_row(row, want)
    long = decomposition_products(table)
    assert len(long) == sum(len(p) for p in table.decomposition)
    assert set(long.entry_id) == set(ids)


def test_end_member_stability_equals_cli_json(client, server, demo):
    members = ["LiCoO2", "LiNiO2", "LiMnO2"]
    stable = client.get_stable_phases(DEMO_DATASET, end_members=members)
    expected = cli_json(server.url, "stable", DEMO_DATASET, "--end-members", ",".join(members))
    assert list(stable.phase_id) == [p["phase_id"] for p in expected["phases"]]
    assert list(stable.formation_energy_ev_per_atom) == [p["formation_energy_ev_per_atom"] for p in expected["phases"]]


def test_candidates_from_the_demo_file_equal_cli_json(client, server, demo):
    table = client.assess_candidates(DEMO_DATASET, DEMO / "candidates.csv")
    expected = cli_json(server.url, "assess", DEMO_DATASET, "--file", str(DEMO / "candidates.csv"))
    assert list(table.label) == [r["label"] for r in expected["results"]]
    for row, want in zip(table.to_dict("records"), expected["results"]):
        for name in ("formula", "chemical_system", "formation_energy_ev_per_atom", "energy_relative_to_hull_ev_per_atom",
                     "energy_above_hull_ev_per_atom"):
            assert row[name] == want[name], (row["label"], name)
        assert row["is_on_or_below_hull"] == want.get("is_on_or_below_hull", False)
        assert_decomposition(row, want["decomposition"])
    one = client.assess_candidates(DEMO_DATASET, [("LiNi0.8Mn0.1Co0.1O2", -1.541, "formation_per_atom")])
    assert one.energy_above_hull_ev_per_atom[0] == table.energy_above_hull_ev_per_atom[0]


def test_hull_energies_equal_cli_json(client, server, demo):
    formulas = ["LiNi0.5Mn0.5O2", "Li2CoO2", "CoO"]
    table = client.get_hull_energies(DEMO_DATASET, formulas)
    expected = cli_json(server.url, "hull-energy", DEMO_DATASET, *formulas)
    for row, want in zip(table.to_dict("records"), expected["results"]):
        assert row["formula"] == want["formula"] and row["chemical_system"] == want["chemical_system"]
        assert_decomposition(row, want["decomposition"])


def test_stable_phases_of_the_whole_dataset_equal_cli_json(client, server, demo):
    table = client.get_stable_phases(DEMO_DATASET)
    expected = cli_json(server.url, "stable", DEMO_DATASET)
    assert list(table.phase_id) == [p["phase_id"] for p in expected["phases"]]
    assert table.attrs["system_problems"] == ()


def test_facets_and_tie_lines_match_scipy_and_cli_json(client, server, demo):
    facets = client.get_hull_facets(DEMO_DATASET, "Li-Co-O")
    expected = cli_json(server.url, "facets", DEMO_DATASET, "Li-Co-O")
    assert list(facets.components) == expected["components"]
    assert [tuple(f["phase_ids"]) for f in expected["facets"]] == list(facets.facets.phase_ids)
    for row, want in zip(facets.facets.to_dict("records"), expected["facets"]):
        for p in want["chemical_potentials"]:
            assert row[f"chemical_potential_{p['component']}_ev_per_atom"] == p.get("chemical_potential_ev_per_atom", 0.0)
    assert [(t["first_phase_id"], t["second_phase_id"]) for t in expected["tie_lines"]] == \
        list(zip(facets.tie_lines.first_phase_id, facets.tie_lines.second_phase_id))

    reference = formation_energies(client.export_entries(DEMO_DATASET))
    elements = list(facets.components)
    members = [i for i, (comp, _) in reference.items() if set(comp) <= set(elements)]
    hull = LowerHull(elements, [reference[i] for i in members])
    for row in facets.facets.to_dict("records"):
        # A facet's potentials are its plane, E(x) = Σ μ_i x_i: through every corner phase and, SciPy's lower hull
        # being the maximum of such planes, equal to the reference hull at the corners.
        for phase in row["phase_ids"]:
            comp, energy = reference[phase]
            plane = sum(row[f"chemical_potential_{e}_ev_per_atom"] * float(comp.get(e, 0)) / float(sum(comp.values()))
                        for e in elements)
            assert plane == pytest.approx(energy, abs=TOLERANCE_EV_PER_ATOM)
            assert hull.energy_at(hull.fractions(comp)) == pytest.approx(energy, abs=TOLERANCE_EV_PER_ATOM)
    ties = set(zip(facets.tie_lines.first_phase_id, facets.tie_lines.second_phase_id))
    stable = set(facets.stable_phases.phase_id)
    for a, b in ties:
        # Every tie-line's mid-composition lies on the reference hull.
        (ca, ea), (cb, eb) = reference[a], reference[b]
        mid = (hull.fractions(ca) + hull.fractions(cb)) / 2
        assert hull.energy_at(mid) == pytest.approx((ea + eb) / 2, abs=TOLERANCE_EV_PER_ATOM), (a, b)
    for i, j in hull.edges():
        # Every edge of Qhull's lower facets between stable phases is a tie-line.
        a, b = sorted((members[i], members[j]))
        if a in stable and b in stable:
            assert (a, b) in ties, (a, b)


def test_a_system_without_competing_phases_warns(client):
    client.create_dataset("lonely")
    import pandas as pd
    client.import_table("lonely", pd.DataFrame({"id": ["li", "o"], "formula": ["Li", "O"], "energy_ev": [0.0, 0.0],
                                                "basis": ["formation_per_atom"] * 2}))
    with pytest.warns(CoverageWarning, match="no competing phase"):
        client.get_hull_energies("lonely", ["Li2O"])


def test_explicit_references_equal_the_cli_and_are_reported(client, server, demo):
    ids = ["bin-CoO", "ter-LiCoO2-r3m"]
    table = client.get_entry_stability(DEMO_DATASET, ids, references={"O": -5.1})
    default = client.get_entry_stability(DEMO_DATASET, ids)
    expected = cli_json(server.url, "stability", DEMO_DATASET, *ids, "--reference", "O=-5.1")
    for row, want in zip(table.to_dict("records"), expected["results"]):
        assert_stability_row(row, want)
    (oxygen,) = [r for r in table.attrs["references"] if r.symbol == "O"]
    assert oxygen.given_by_caller and oxygen.total_energy_ev_per_atom == -5.1 and oxygen.source_entry_id == ""
    # A lower O reference makes an oxide's formation energy less negative by the difference per O atom (E_f is
    # measured from the references; common practice): CoO has one O in two atoms.
    (stored,) = [r for r in default.attrs["references"] if r.symbol == "O"]
    assert not stored.given_by_caller and stored.source_entry_id
    shift = (stored.total_energy_ev_per_atom - -5.1) * (1 / 2)
    assert table.formation_energy_ev_per_atom[0] == pytest.approx(default.formation_energy_ev_per_atom[0] + shift, abs=1e-12)
