"""Energy above hull by linear programming, the outside reference for the hull benchmarks.

For a query point q with composition x_q and energy E_q (eV/atom) the hull energy is
    min sum_j w_j E_j   s.t.   sum_j w_j x_j[k] = x_q[k] (k < n-1),   sum_j w_j = 1,   w >= 0
over every point j of the set, solved with SciPy's HiGHS (method="highs") at tight tolerances.

Usage: /usr/bin/python3 lp_energy_above_hull.py POINTS QUERIES OUT
  POINTS:  text, one point per line: n-1 atom fractions then the energy per atom
  QUERIES: text, one point index (0-based) per line
  OUT:     written: one line per query "index energy_above_hull_ev_per_atom status"
"""
import sys
import time

import numpy as np
from scipy.optimize import linprog

# HiGHS' default feasibility tolerances are 1e-7; the comparison is at 1e-9 eV/atom, so both go to 1e-10.
OPTIONS = {"primal_feasibility_tolerance": 1e-10, "dual_feasibility_tolerance": 1e-10}


def solve(energies, a_eq, b_eq):
    # method="highs" first; if it reports numerical trouble (status 4), the dual simplex and then the interior
    # point method get a try at the same tolerances before the query counts as failed.
    res = None
    for method in ("highs", "highs-ds", "highs-ipm"):
        res = linprog(energies, A_eq=a_eq, b_eq=b_eq, bounds=(0, None), method=method, options=OPTIONS)
        if res.status == 0:
            if method != "highs":
                sys.stderr.write(f"lp: query needed method {method}\n")
            return res
    return res


def main() -> int:
    points = np.loadtxt(sys.argv[1], ndmin=2)
    queries = np.loadtxt(sys.argv[2], dtype=np.int64, ndmin=1)
    fractions = points[:, :-1]
    energies = points[:, -1]
    a_eq = np.vstack([fractions.T, np.ones(len(points))])
    start = time.perf_counter()
    with open(sys.argv[3], "w") as out:
        for q in queries:
            b_eq = np.append(fractions[q], 1.0)
            res = solve(energies, a_eq, b_eq)
            above = energies[q] - res.fun if res.status == 0 else float("nan")
            out.write(f"{q} {above!r} {res.status}\n")
    sys.stderr.write(f"lp: {len(queries)} queries over {len(points)} points in {time.perf_counter() - start:.1f} s\n")
    return 0


if __name__ == "__main__":
    sys.exit(main())
