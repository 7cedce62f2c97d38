"""LP reference for the lower hull, run by Debian's system python (/usr/bin/python3) with SciPy's HiGHS.

For each query composition x_q: minimise sum_j lambda_j E_j subject to sum_j lambda_j x_j = x_q, lambda >= 0,
where x_j = amounts_j / sum(amounts_j) are the points' composition fractions and E_j their energies per atom.
The optimum is the lower-hull energy at x_q and the lambdas with positive value are a decomposition into points.

usage: python3 hull_lp.py problem.json answers.json
problem.json: {"amounts": [[int, ...], ...], "energies": [float, ...], "queries": [[float, ...], ...],
               "excluded": [[int, ...], ...]}   (optional; per query, points whose lambda is held at 0)
answers.json: {"scipy": version, "answers": [{"hull_energy": float, "phases": [int], "weights": [float],
               "residual": float, "duals": [float]}, ...]}   (one answer per query, in order; duals are HiGHS's
               eqlin.marginals, d hull_energy / d x_q per component: the chemical potentials of a facet holding x_q)
"""
import json
import sys

import numpy as np
import scipy
from scipy.optimize import linprog

# HiGHS defaults to 1e-7 feasibility tolerances; the checks compare energies to 1e-9 eV/atom, so the LP must be
# solved well below that.
FEASIBILITY_TOLERANCE = 1e-10
# Lambdas below this are solver noise, not a phase of the decomposition.
REPORTED_WEIGHT = 1e-12


def main():
    with open(sys.argv[1]) as f:
        problem = json.load(f)
    amounts = np.array(problem["amounts"], dtype=np.float64)  # integers below 2**53 convert exactly
    if amounts.ndim != 2 or np.any(amounts < 0) or np.any(amounts.sum(axis=1) <= 0):
        sys.exit("bad amounts")
    fractions = amounts / amounts.sum(axis=1, keepdims=True)
    energies = np.array(problem["energies"], dtype=np.float64)
    a_eq = fractions.T
    options = {
        "primal_feasibility_tolerance": FEASIBILITY_TOLERANCE,
        "dual_feasibility_tolerance": FEASIBILITY_TOLERANCE,
    }
    excluded = problem.get("excluded") or [[] for _ in problem["queries"]]
    if len(excluded) != len(problem["queries"]):
        sys.exit("one exclusion list per query expected")
    answers = []
    for index, query in enumerate(problem["queries"]):
        b_eq = np.array(query, dtype=np.float64)
        # An excluded point keeps its column with upper bound 0, so indices and the residual stay those of all points.
        bounds = [(0, None)] * len(energies)
        for p in excluded[index]:
            bounds[p] = (0, 0)
        result = linprog(energies, A_eq=a_eq, b_eq=b_eq, bounds=bounds, method="highs", options=options)
        if result.status != 0:
            sys.exit(f"query {index}: linprog status {result.status}: {result.message}")
        lam = result.x
        phases = np.nonzero(lam > REPORTED_WEIGHT)[0]
        answers.append({
            "hull_energy": float(energies @ lam),
            "phases": [int(p) for p in phases],
            "weights": [float(lam[p]) for p in phases],
            "residual": float(np.max(np.abs(a_eq @ lam - b_eq))),
            "duals": [float(v) for v in result.eqlin.marginals],
        })
    with open(sys.argv[2], "w") as f:
        json.dump({"scipy": scipy.__version__, "answers": answers}, f)


if __name__ == "__main__":
    main()
