"""General LP reference, run by Debian's system python (/usr/bin/python3) with SciPy's HiGHS.

Each program: minimise or maximise c.x subject to row_lower <= A x <= row_upper, col_lower <= x <= col_upper
(infinite bounds given as null). Rows with equal bounds go to A_eq, every finite one-sided bound to A_ub (a lower
bound as -A_i x <= -l_i). Duals are returned as the rate of change of the optimal objective per unit increase of
the row's (column's) active bound, in the program's own sense: the sum of the marginals of the row's
inequalities (the lower-side one negated) or its equality marginal; for columns, lower + upper marginals.

usage: python3 general_lp.py programs.json answers.json
programs.json: {"programs": [{"maximize": bool, "c": [..], "a": [[..], ..], "row_lower": [..], "row_upper": [..],
                              "col_lower": [..], "col_upper": [..]}, ..]}
answers.json:  {"scipy": version, "answers": [{"status": "optimal"|"infeasible"|"unbounded", "objective": float,
                 "x": [..], "row_duals": [..], "reduced_costs": [..]}, ..]}
"""
import json
import sys

import numpy as np
import scipy
from scipy.optimize import linprog

# HiGHS defaults to 1e-7; the checks compare objectives to 1e-9, so the references are solved well below that.
TOLERANCE = 1e-10


def bound(v, default):
    return default if v is None else float(v)


def solve(p):
    c = np.array(p["c"], dtype=np.float64)
    n = len(c)
    a = np.array(p["a"], dtype=np.float64).reshape(-1, n)
    m = a.shape[0]
    sign = -1.0 if p["maximize"] else 1.0
    rl = [bound(v, -np.inf) for v in p["row_lower"]]
    ru = [bound(v, np.inf) for v in p["row_upper"]]
    eq_rows, ub_rows = [], []  # ub_rows: (row, +1 for A_i x <= u, -1 for -A_i x <= -l)
    for i in range(m):
        if rl[i] == ru[i]:
            eq_rows.append(i)
            continue
        if np.isfinite(ru[i]):
            ub_rows.append((i, 1.0))
        if np.isfinite(rl[i]):
            ub_rows.append((i, -1.0))
    a_eq = a[eq_rows] if eq_rows else None
    b_eq = np.array([rl[i] for i in eq_rows]) if eq_rows else None
    a_ub = np.array([s * a[i] for i, s in ub_rows]) if ub_rows else None
    b_ub = np.array([s * (ru[i] if s > 0 else rl[i]) for i, s in ub_rows]) if ub_rows else None
    bounds = [(p["col_lower"][j], p["col_upper"][j]) for j in range(n)]
    options = {"primal_feasibility_tolerance": TOLERANCE, "dual_feasibility_tolerance": TOLERANCE}
    r = linprog(sign * c, A_ub=a_ub, b_ub=b_ub, A_eq=a_eq, b_eq=b_eq, bounds=bounds, method="highs", options=options)
    if r.status == 2:
        return {"status": "infeasible"}
    if r.status == 3:
        return {"status": "unbounded"}
    if r.status != 0:
        sys.exit(f"linprog status {r.status}: {r.message}")
    row_duals = np.zeros(m)
    for k, i in enumerate(eq_rows):
        row_duals[i] += r.eqlin.marginals[k]
    for k, (i, s) in enumerate(ub_rows):
        row_duals[i] += s * r.ineqlin.marginals[k]
    reduced = np.array(r.lower.marginals) + np.array(r.upper.marginals)
    return {
        "status": "optimal",
        "objective": float(c @ r.x),
        "x": [float(v) for v in r.x],
        "row_duals": [float(sign * v) for v in row_duals],
        "reduced_costs": [float(sign * v) for v in reduced],
    }


def main():
    with open(sys.argv[1]) as f:
        programs = json.load(f)["programs"]
    answers = [solve(p) for p in programs]
    with open(sys.argv[2], "w") as f:
        json.dump({"scipy": scipy.__version__, "answers": answers}, f)


if __name__ == "__main__":
    main()
