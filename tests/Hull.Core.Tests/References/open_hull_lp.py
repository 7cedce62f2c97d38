"""Open-element (grand-potential) hull reference, run by Debian's system python (/usr/bin/python3) with SciPy's HiGHS.

From the raw entries (element amounts per formula unit, total energy per formula unit) and the elemental
references (total energy per atom), this script computes each entry's formation energy per formula unit
E_f = E - sum_e n_e E_ref,e, and with elements open at Delta mu_o (relative to their references) its grand potential
per closed-element atom phi = (E_f - sum_open n_o Delta mu_o) / N_closed; entries without closed atoms are left out.
For each query (closed-element amounts) it solves: minimise sum_j lambda_j phi_j subject to
sum_j lambda_j x_j = x_q, lambda >= 0, with x_j the closed-element fractions of entry j. Closed elements without a
pure entry stand at 0 (their reference), as one more point each.

usage: python3 open_hull_lp.py problem.json answers.json
problem.json: {"elements": [..], "open": {"O": mu, ..}, "references": {"Li": e, ..},
               "entries": [{"amounts": {"Li": 1, ..}, "energy_per_formula_unit": e}, ..],
               "queries": [{"Li": 1, ..}, ..]}
answers.json: {"scipy": version, "phi": [float|null per entry], "answers": [{"hull_energy": float, "duals": [..]}]}
"""
import json
import sys

import numpy as np
import scipy
from scipy.optimize import linprog

TOLERANCE = 1e-10


def main():
    with open(sys.argv[1]) as f:
        p = json.load(f)
    opened = p["open"]
    closed = [e for e in p["elements"] if e not in opened]
    refs = p["references"]
    phis, points, energies = [], [], []
    for entry in p["entries"]:
        amounts = entry["amounts"]
        formation = entry["energy_per_formula_unit"] - sum(n * refs[e] for e, n in amounts.items())
        closed_atoms = sum(n for e, n in amounts.items() if e not in opened)
        if closed_atoms <= 0:
            phis.append(None)
            continue
        phi = (formation - sum(n * opened[e] for e, n in amounts.items() if e in opened)) / closed_atoms
        phis.append(phi)
        points.append([amounts.get(e, 0) / closed_atoms for e in closed])
        energies.append(phi)
    for k, e in enumerate(closed):
        corner = [0.0] * len(closed)
        corner[k] = 1.0
        points.append(corner)
        energies.append(0.0)
    a_eq = np.array(points, dtype=np.float64).T
    c = np.array(energies, dtype=np.float64)
    options = {"primal_feasibility_tolerance": TOLERANCE, "dual_feasibility_tolerance": TOLERANCE}
    answers = []
    for q in p["queries"]:
        total = sum(q.get(e, 0) for e in closed)
        b = np.array([q.get(e, 0) / total for e in closed], dtype=np.float64)
        r = linprog(c, A_eq=a_eq, b_eq=b, bounds=[(0, None)] * len(c), method="highs", options=options)
        if r.status != 0:
            sys.exit(f"linprog status {r.status}: {r.message}")
        answers.append({"hull_energy": float(c @ r.x), "duals": [float(v) for v in r.eqlin.marginals]})
    with open(sys.argv[2], "w") as f:
        json.dump({"scipy": scipy.__version__, "phi": phis, "answers": answers}, f)


if __name__ == "__main__":
    main()
