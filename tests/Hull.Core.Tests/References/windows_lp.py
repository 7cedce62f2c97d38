"""LP reference for window extremes, run by Debian's system python (/usr/bin/python3) with SciPy's HiGHS.

For each problem: over the chemical potentials mu (one per element, each <= 0), subject to A_ub mu <= b_ub and
A_eq mu = b_eq, the maximum and the minimum of each objective c.mu.

usage: python3 windows_lp.py problems.json answers.json
problems.json: {"problems": [{"a_ub": [[float]], "b_ub": [float], "a_eq": [[float]], "b_eq": [float],
                              "objectives": [[float]], "max_only": bool}, ...]}
(max_only: the minimum is not asked for, e.g. a dopant potential that is unbounded below; reported as 0)
answers.json: {"scipy": version, "answers": [{"max": [float], "min": [float], "status": [int]}, ...]}
"""
import json
import sys

import numpy as np
import scipy
from scipy.optimize import linprog

# The checks compare to 1e-9 eV; HiGHS' default 1e-7 feasibility is too loose for that.
OPTIONS = {"primal_feasibility_tolerance": 1e-10, "dual_feasibility_tolerance": 1e-10}


def solve(c, a_ub, b_ub, a_eq, b_eq):
    bounds = [(None, 0.0)] * len(c)
    r = linprog(c, A_ub=a_ub, b_ub=b_ub, A_eq=a_eq if len(a_eq) else None, b_eq=b_eq if len(b_eq) else None,
                bounds=bounds, method="highs", options=OPTIONS)
    return r.status, (r.fun if r.status == 0 else float("nan"))


def main():
    with open(sys.argv[1]) as f:
        problems = json.load(f)["problems"]
    answers = []
    for p in problems:
        a_ub = np.array(p["a_ub"], dtype=np.float64)
        b_ub = np.array(p["b_ub"], dtype=np.float64)
        a_eq = np.array(p["a_eq"], dtype=np.float64)
        b_eq = np.array(p["b_eq"], dtype=np.float64)
        highs, lows, statuses = [], [], []
        for c in p["objectives"]:
            c = np.array(c, dtype=np.float64)
            s1, v1 = solve(-c, a_ub, b_ub, a_eq, b_eq)
            s2, v2 = (0, 0.0) if p.get("max_only") else solve(c, a_ub, b_ub, a_eq, b_eq)
            highs.append(-v1)
            lows.append(v2)
            statuses.append(max(s1, s2))
        answers.append({"max": highs, "min": lows, "status": statuses})
    with open(sys.argv[2], "w") as f:
        json.dump({"scipy": scipy.__version__, "answers": answers}, f)


if __name__ == "__main__":
    main()
