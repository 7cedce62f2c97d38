"""Stability under energy uncertainty: entries with sigma imported from a DataFrame, sampled by the server, equal
to the CLI's JSON for the same request, and a binary against the normal closed form computed here by SciPy."""

import math

import pandas as pd
import pytest
from scipy.stats import norm

from conftest import DEMO, cli_json, run_cli


@pytest.fixture(scope="module")
def binary(client):
    # Invented: AB lies 0.01 eV/atom above the A-B tie-line with an error bar of 0.02 eV/atom; A2B, an ML
    # prediction in a correlation group, lies 0.2 eV/atom above it (ten of its sigma: never on the hull).
    frame = pd.DataFrame({
        "id": ["A", "B", "AB", "A2B"],
        "formula": ["Li", "Co", "LiCo", "Li2Co"],
        "energy_ev": [0.0, 0.0, 0.01, 0.2],
        "basis": ["formation_per_atom"] * 4,
        "note": [""] * 4,
        "sigma_ev_per_atom": [math.nan, math.nan, 0.02, 0.01],
        "correlation_group": ["", "", "", "ml"],
    })
    client.import_table("odds-binary", frame, create=True)
    return "odds-binary"


def test_sigma_and_group_round_trip_through_import_and_export(client, binary):
    exported = client.export_entries(binary).set_index("id")
    assert exported.loc["AB", "sigma_ev_per_atom"] == 0.02
    assert math.isnan(exported.loc["A", "sigma_ev_per_atom"])
    assert exported.loc["A2B", "correlation_group"] == "ml"


def test_a_binary_compound_is_stable_with_the_normal_probability(client, binary):
    table = client.sample_stability(binary, "Li-Co", samples=6000, seed=11, group_sigmas={"ml": 0.01})
    ab = table.set_index("entry_id").loc["AB"]
    # AB is a vertex exactly when its sampled energy falls below the A-B tie-line: P = Phi(-dE/sigma) (common practice).
    p = norm.cdf(-0.01 / 0.02)
    assert abs(ab.vertex_probability - p) <= 3 * math.sqrt(p * (1 - p) / 6000)
    assert table.attrs["sample_count"] == 6000 and table.attrs["stop"] == "sample_count_reached"
    assert table.attrs["groups"] == {"ml": 0.01}
    assert "AB" not in table.attrs["probable_stable_set"]


def test_the_answer_and_the_figure_equal_the_cli(client, server, binary, tmp_path):
    table = client.sample_stability(binary, "Li-Co", samples=500, seed=3, group_sigmas={"ml": 0.01})
    expected = cli_json(server.url, "odds", binary, "Li-Co", "--samples", "500", "--seed", "3", "--group-sigma", "ml=0.01")
    assert expected["sample_count"] == table.attrs["sample_count"]
    for (_, row), want in zip(table.iterrows(), expected["entries"]):
        assert row.entry_id == want["entry_id"]
        assert row.vertex_probability == want.get("vertex_probability", 0.0)
        assert row.mean_energy_above_hull_ev_per_atom == want.get("mean_energy_above_hull_ev_per_atom", 0.0)
        assert row.most_probable_products == tuple(want["most_probable_products"])

    with pytest.raises(Exception) as refused:
        client.draw_stability_odds_figure(binary, "Li-Co", samples=100, group_sigmas={"ml": 0.01})
    assert "ternary" in str(refused.value)


def test_a_ternary_odds_figure_equals_the_cli_file(client, server, tmp_path):
    client.import_table("odds-ternary", DEMO / "uncertainty" / "ml-li-co-o.csv", create=True)
    figure = client.draw_stability_odds_figure("odds-ternary", "Li-Co-O", samples=300, seed=9, group_sigmas={"ml-model": 0.02})
    assert figure.sample_count == 300 and figure.seed == 9
    cli_file = tmp_path / "odds.svg"
    run_cli(server.url, "odds", "odds-ternary", "Li-Co-O", "--samples", "300", "--seed", "9", "--group-sigma", "ml-model=0.02",
            "--figure", str(cli_file))
    assert cli_file.read_text(encoding="utf-8") == figure.svg
