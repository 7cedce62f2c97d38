"""Hull energy and chemical potentials at query compositions by linear programming (SciPy HiGHS under Debian's
/usr/bin/python3): the outside reference for the electrochemistry benchmarks.

For a query x_q: minimise sum_j w_j E_j subject to sum_j w_j x_j = x_q (every component), w >= 0; the equality
duals are the chemical potentials of a hull facet holding x_q.

Usage: /usr/bin/python3 lp_hull_at.py POINTS QUERIES OUT
  POINTS:  one point per line: n atom fractions then the energy per atom
  QUERIES: one query per line: n atom fractions
  OUT:     written: one line per query "hull_energy dual_1 ... dual_n status", then "solve_seconds S"
"""
import sys
import time

import numpy as np
from scipy.optimize import linprog

OPTIONS = {"primal_feasibility_tolerance": 1e-10, "dual_feasibility_tolerance": 1e-10}


def main():
    points = np.loadtxt(sys.argv[1], ndmin=2)
    queries = np.loadtxt(sys.argv[2], ndmin=2)
    a_eq = points[:, :-1].T
    energies = points[:, -1]
    start = time.perf_counter()
    lines = []
    for q in queries:
        r = linprog(energies, A_eq=a_eq, b_eq=q, bounds=(0, None), method="highs", options=OPTIONS)
        duals = r.eqlin.marginals if r.status == 0 else np.full(len(q), np.nan)
        value = float(energies @ r.x) if r.status == 0 else float("nan")
        lines.append(" ".join([repr(value)] + [repr(float(d)) for d in duals] + [str(r.status)]))
    elapsed = time.perf_counter() - start
    with open(sys.argv[3], "w") as f:
        f.write("\n".join(lines) + "\n")
        f.write(f"solve_seconds {elapsed!r}\n")


if __name__ == "__main__":
    main()
