"""Energy above hull of sampled dataset entries by linear programming, each within its own chemical system.

Input blocks, one per query:
    q k m                      entry index, number of elements of its system, number of competing points
    x_1 .. x_(k-1) E_q         the query's atom fractions (first k-1 of its system's elements) and formation energy
    m lines: x_1 .. x_(k-1) E  every entry (and pure element) whose elements lie in the system, same coordinates
Output: one line per query "q energy_above_hull_ev_per_atom status".

Usage: /usr/bin/python3 lp_dataset_check.py BLOCKS OUT
"""
import sys

import numpy as np
from scipy.optimize import linprog

# HiGHS' default feasibility tolerances are 1e-7; the comparison is at 1e-9 eV/atom, so both go to 1e-10.
OPTIONS = {"primal_feasibility_tolerance": 1e-10, "dual_feasibility_tolerance": 1e-10}


def main() -> int:
    with open(sys.argv[1]) as f, open(sys.argv[2], "w") as out:
        while True:
            head = f.readline().split()
            if not head:
                break
            q, k, m = int(head[0]), int(head[1]), int(head[2])
            query = np.array(f.readline().split(), dtype=float)
            pts = np.array([f.readline().split() for _ in range(m)], dtype=float).reshape(m, k)
            a_eq = np.vstack([pts[:, :-1].T, np.ones(m)])
            b_eq = np.append(query[:-1], 1.0)
            res = None
            for method in ("highs", "highs-ds", "highs-ipm"):
                res = linprog(pts[:, -1], A_eq=a_eq, b_eq=b_eq, bounds=(0, None), method=method, options=OPTIONS)
                if res.status == 0:
                    break
            above = query[-1] - res.fun if res.status == 0 else float("nan")
            out.write(f"{q} {above!r} {res.status}\n")
    return 0


if __name__ == "__main__":
    sys.exit(main())
