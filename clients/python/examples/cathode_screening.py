# %% [markdown]
# # Cathode screening with hullclient
#
# The invented demo scenario of `data-demo/` (every number in it is made up): layered lithium transition-metal
# oxides and alumina coatings. This walk-through imports the files as versions, reads the whole-dataset stability
# as a DataFrame, places candidates against the hull, reads windows, voltages and a coating's defects, and saves
# the server's figures as SVG files.
#
# Run it as a script (`/usr/bin/python3 clients/python/examples/cathode_screening.py`) or as the notebook
# `cathode_screening.ipynb` beside it; both have the same cells. It talks to the server at `$HULL_SERVER`
# (default http://127.0.0.1:50551), started for instance with
# `dotnet run --project src/Hull.Server -- --data-dir ./hull-data --port 50551`.
#
# Safety: "stable" here says nothing about how to make or handle a phase. Lithium metal reacts violently with
# water; cobalt and nickel oxide dusts are toxic and sensitising. Follow your institution's safety rules, the
# safety data sheets and licensed laboratory practice.

# %%
import os
from pathlib import Path

import pandas as pd

from hullclient import HullClient, NotFoundError, decomposition_products

try:
    from IPython.display import display  # a notebook draws DataFrames as tables; a script prints them
except ImportError:
    display = print
pd.set_option("display.width", 160, "display.max_columns", 12, "display.max_colwidth", 60)

# The repository's data-demo/ folder: $HULL_DEMO_DATA, else found above this file (or the notebook's folder).
here = Path(globals().get("__file__", Path.cwd() / "cathode_screening.py")).resolve().parent
found = [p / "data-demo" for p in [here, *here.parents] if (p / "data-demo").is_dir()]
demo = Path(os.environ.get("HULL_DEMO_DATA") or (found[0] if found else "data-demo"))
if not demo.is_dir():
    raise SystemExit(f"no data-demo folder at {demo}: set HULL_DEMO_DATA to the repository's data-demo/")
dataset = os.environ.get("HULL_DEMO_DATASET", "cathodes")
figures = Path(os.environ.get("HULL_FIGURES_DIR", "hull-figures"))
hull = HullClient()  # $HULL_SERVER, $HULL_TOKEN and $HULL_CA_FILE, as the CLI reads them
print(hull)

# %% [markdown]
# ## Import: one version per file, then a re-relaxation that replaces 16 entries

# %%
try:
    hull.delete_dataset(dataset)  # start afresh: this walk-through owns its dataset
except NotFoundError:
    pass
hull.create_dataset(dataset, "invented cathode-screening scenario (data-demo/)")
for path in sorted((demo / "round1").iterdir()):
    result = hull.import_table(dataset, path, progress=lambda done, total: None)
    print(f"{path.name}: version {result.dataset_version}, {result.inserted_count} new entries")
result = hull.import_table(dataset, demo / "round2" / "04-rerelaxed-layered.csv", on_duplicate="replace")
print(f"round 2: version {result.dataset_version}, {result.replaced_count} entries replaced")
display(hull.list_versions(dataset))

# %% [markdown]
# ## Whole-dataset stability as a DataFrame

# %%
stability = hull.analyze_dataset(dataset)
print(f"{len(stability)} entries, version {stability.attrs['used'].version}, hull systems {stability.attrs['hull_systems']}")
near_hull = stability[stability.energy_above_hull_ev_per_atom <= 0.025]
display(near_hull[["entry_id", "formula", "energy_above_hull_ev_per_atom", "is_hull_vertex", "reaction"]])

# %%
layered = stability[stability.entry_id.str.startswith("nmc-")]
display(layered.groupby("is_on_hull").energy_above_hull_ev_per_atom.describe())

# %% [markdown]
# ## Stable phases, candidates and what the unstable ones decompose into

# %%
stable = hull.get_stable_phases(dataset, "Li-Co-O")
display(stable)

# %%
candidates = hull.assess_candidates(dataset, demo / "candidates.csv")
display(candidates[["label", "formula", "energy_above_hull_ev_per_atom", "is_on_or_below_hull", "reaction"]])

# %%
display(decomposition_products(candidates)[["label", "phase_id", "formula", "atom_fraction", "formula_units_exact"]])

# %%
facets = hull.get_hull_facets(dataset, "Li-Co-O")
display(facets.facets)

# %% [markdown]
# ## The layered cathode's chemical-potential window, and how much Al it tolerates

# %%
window = hull.get_stability_window(dataset, "entry:ter-LiCoO2-r3m").window
print(f"{window.formula}: {window.kind} window of dimension {window.dimension}")
display(window.vertices)

# %%
limits = hull.get_dopant_limits(dataset, "entry:ter-LiCoO2-r3m", ["Al"])
al = limits.limits[0]
print(f"highest Δμ_Al in the window: {al.overall_max_ev:.4f} eV, limited by {', '.join(al.overall_limiting_phase_ids)}")

# %% [markdown]
# ## Lithium into CoO2: the voltage profile, and whether an alumina coating reacts with the spinel
# 0 K energies stand in for Gibbs energies: these are estimates, and no guide to handling lithium metal or charged
# cells (follow your site's safety rules and licensed practice).

# %%
profile = hull.get_voltage_profile(dataset, "CoO2", "Li", inserted_end_formula="LiCoO2", include_figure=True)
display(profile.plateaus)
print(f"mean {profile.average_volts_against_metal:.3f} V, {profile.capacity_per_host_mass_mah_per_g:.1f} mAh/g of CoO2")

# %%
reaction = hull.get_reaction_profile(dataset, "entry:coat-Al2O3-corundum", "entry:ter-LiMn2O4-spinel")
display(reaction.most_negative)

# %% [markdown]
# ## Stability with error bars: Li-Co-O from DFT and an ML model
# A second dataset whose entries carry an energy uncertainty (`sigma_ev_per_atom`) and, for the ML predictions, a
# correlation group sharing the model's systematic error; each phase's probability of being stable over 2,000
# seeded samples, and the ternary of those probabilities.

# %%
odds_dataset = f"{dataset}-ml"
try:
    hull.delete_dataset(odds_dataset)
except NotFoundError:
    pass
hull.import_table(odds_dataset, demo / "uncertainty" / "ml-li-co-o.csv", create=True)
odds = hull.sample_stability(odds_dataset, "Li-Co-O", samples=2000, seed=2026, group_sigmas={"ml-model": 0.02})
display(odds[["entry_id", "formula", "vertex_probability", "vertex_probability_standard_error",
              "energy_above_hull_p95_ev_per_atom", "most_probable_products"]])
print("probable stable set:", ", ".join(odds.attrs["probable_stable_set"]))
figures.mkdir(parents=True, exist_ok=True)
hull.draw_stability_odds_figure(odds_dataset, "Li-Co-O", samples=2000, seed=2026,
                                group_sigmas={"ml-model": 0.02}).save(figures / "odds-Li-Co-O.svg")

# %% [markdown]
# ## When does the delithiated cathode give off oxygen?
# Invented standard entropies (data-demo/thermo) make each entry's free energy at T; oxygen is open at its μ(T, p).
# Released oxygen and hot cathodes are a fire hazard: these are estimates, and real thermal-runaway safety work
# follows local rules and licensed practice.

# %%
entropies = demo / "thermo" / "li-co-o-entropies.csv"
release = hull.find_decomposition_temperatures(dataset, "entry:ter-LiCo2O4-delithiated", 300, 1500, pressure_bar=0.21,
                                               models=entropies, chemical_system="Li-Co-O")
display(release.crossings[["temperature_k", "direction", "reaction", "gas_released_molecules_per_formula_unit"]])
stability_in_air = hull.draw_temperature_figure(dataset, ["entry:ter-LiCo2O4-delithiated", "entry:bin-Co3O4"], 300, 1500,
                                                pressure_bar=0.21, models=entropies, chemical_system="Li-Co-O")

# %% [markdown]
# ## Native defects and a Mg dopant in the alumina coating
# A defect study of Al2O3 (invented supercell energies in `data-demo/defects/`) is checked against a dataset of the
# coatings, the elements and the Mg phases, then read at the window's O-rich vertex: the transition levels, the
# formation-energy figure, and the Fermi level of a coating grown at 1600 K and quenched to room temperature.
# The hazard reminders the server gives with the Mg phases come as DefectWarning; follow your site's safety rules.

# %%
coatings = f"{dataset}-coatings"
try:
    hull.delete_dataset(coatings)
except NotFoundError:
    pass
hull.create_dataset(coatings, "the demo's coatings with the Mg phases (invented)")
for path in (demo / "round1" / "01-elements-binaries-ternaries.csv", demo / "round1" / "03-coatings.json",
             demo / "defects" / "mg-phases.csv"):
    hull.import_table(coatings, path)
study = hull.import_defect_study(coatings, "al2o3", demo / "defects" / "al2o3-study.json",
                                 demo / "defects" / "al2o3-charge-states.csv", source_label="data-demo/defects")
display(study.defects)

# %%
levels = hull.get_charge_transition_levels(coatings, "al2o3", vertex="O")
display(levels.levels[levels.levels.thermodynamic])
defect_figure = hull.draw_defect_formation_figure(coatings, "al2o3", vertex="O")

# %%
fermi = hull.solve_fermi_level(coatings, "al2o3", temperature_k=1600, operating_temperature_k=300, vertex="O")
display(fermi)
mg = hull.get_dopant_solubility(coatings, "al2o3", [1400, 1800])
print(f"highest Δμ_Mg {mg.max_delta_mu_ev:.4f} eV, limited by {', '.join(mg.limiting_phase_ids)}")

# %% [markdown]
# ## Phase diagrams drawn by the server, saved as SVG

# %%
figures.mkdir(parents=True, exist_ok=True)
ternary = hull.draw_phase_diagram(dataset, "Li-Co-O")
display(ternary)  # a notebook draws the SVG inline
saved = [
    ternary.save(figures / "ternary-Li-Co-O.svg"),
    hull.draw_phase_diagram(dataset, end_members=["LiCoO2", "LiNiO2", "LiMnO2"]).save(figures / "pseudo-ternary-layered.svg"),
    hull.draw_phase_diagram(dataset, "Co-Li-Ni-O", azimuth_degrees=30, elevation_degrees=15).save(figures / "quaternary-Co-Li-Ni-O.svg"),
    profile.figure.save(figures / "voltage-Li-into-CoO2.svg"),
    stability_in_air.save(figures / "thermo-Li-Co-O-in-air.svg"),
    defect_figure.save(figures / "defects-Al2O3-O-rich.svg"),
]
for path in saved:
    print(path, path.stat().st_size, "bytes")

# %%
hull.close()
