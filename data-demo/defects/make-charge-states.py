"""Writes al2o3-charge-states.csv: invented supercell energies for the demo's Al2O3 defect study.

Every number is made up. Each charge state is given a chosen formation energy at E_F = 0 with every Δμ = 0
(corrections left out), and its supercell energy is backed out of
E_f = E(X^q) - E(bulk) - sum_i n_i mu_i + q E_VBM with the demo dataset's invented references.
Standard library only; run from this folder.
"""

BULK_EV = -947.966  # al2o3-study.json host.total_energy_ev (24 Al2O3)
VBM_EV = 3.412      # al2o3-study.json host.vbm_ev
REFERENCES = {"Al": -3.745, "O": -4.948, "Mg": -1.600}  # round1/03-coatings.json, round1/01-...csv, mg-phases.csv

# name, atoms exchanged, [(charge, chosen E_f at E_F = 0 and all Δμ = 0, given ΔV or None)]
DEFECTS = [
    ("V_O", {"O": -1}, [(2, 2.4, 0.031), (1, 4.6, 0.015), (0, 8.0, None)]),
    ("V_Al", {"Al": -1}, [(0, 15.0, None), (-1, 16.0, -0.012), (-2, 17.8, -0.027), (-3, 20.4, -0.044)]),
    ("Mg_Al", {"Mg": 1, "Al": -1}, [(0, 5.0, None), (-1, 5.9, -0.010)]),
    ("Mg_Al+V_O", {"Mg": 1, "Al": -1, "O": -1}, [(1, 7.5, 0.012), (0, 9.5, None)]),
]

lines = ["defect,charge,total_energy_ev,shift_volts"]
for name, atoms, states in DEFECTS:
    reservoir = sum(n * REFERENCES[e] for e, n in atoms.items())
    for q, formation, shift in states:
        energy = formation - q * VBM_EV + BULK_EV + reservoir
        lines.append(f"{name},{q},{energy:.3f},{'' if shift is None else shift}")
with open("al2o3-charge-states.csv", "w", encoding="utf-8") as out:
    out.write("\n".join(lines) + "\n")
