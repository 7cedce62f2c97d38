"""An outside reference for the electrochemistry answers: SciPy's HiGHS linear programs (scipy.optimize.linprog,
method="highs", Debian python3-scipy) over formation energies worked from the exported entries.

The hull energy at a composition is min Σ λ_j E_j subject to Σ λ_j x_j = x, λ ≥ 0 (x_j the atom fractions of entry
j, E_j its formation energy per atom); the equality duals are the elements' chemical potentials Δμ there (common
practice). A phase's range of Δμ_A is the LP over μ: μ·n_j ≤ G_j for every entry, μ·n_P = G_P (n per formula unit,
G the formation energy per formula unit), with μ_A maximised or minimised (common practice).
"""

import numpy as np
from scipy.optimize import linprog


def _fractions(comp, elements):
    total = float(sum(comp.values()))
    return [float(comp.get(e, 0)) / total for e in elements]


def members(reference, elements):
    """The ids of `reference` ({id: (composition, E_f per atom)}) whose elements all lie in `elements`."""
    return [i for i, (comp, _) in reference.items() if set(comp) <= set(elements)]


def hull_energy_and_potentials(reference, elements, comp):
    """(hull energy per atom at `comp`, {element: Δμ from the LP's equality duals})."""
    ids = members(reference, elements)
    a_eq = np.array([_fractions(reference[i][0], elements) for i in ids]).T
    cost = np.array([reference[i][1] for i in ids])
    answer = linprog(cost, A_eq=a_eq, b_eq=np.array(_fractions(comp, elements)), bounds=(0, None), method="highs")
    if answer.status != 0:
        raise AssertionError(f"HiGHS found no hull energy at {comp}: {answer.message}")
    return float(answer.fun), dict(zip(elements, (float(y) for y in answer.eqlin.marginals)))


def ion_potential_range(reference, elements, phase_id, ion):
    """(lowest, highest) Δμ of `ion` at which `phase_id` stays on the hull; None for an unbounded end."""
    ids = members(reference, elements)
    amounts = np.array([[float(reference[i][0].get(e, 0)) for e in elements] for i in ids])
    per_unit = np.array([reference[i][1] * float(sum(reference[i][0].values())) for i in ids])
    row = ids.index(phase_id)
    at = elements.index(ion)
    ends = []
    for sign in (1.0, -1.0):
        goal = np.zeros(len(elements))
        goal[at] = sign
        answer = linprog(goal, A_ub=amounts, b_ub=per_unit, A_eq=amounts[row:row + 1], b_eq=per_unit[row:row + 1],
                         bounds=(None, None), method="highs")
        if answer.status == 3:
            ends.append(None)
        elif answer.status != 0:
            raise AssertionError(f"HiGHS found no Δμ_{ion} range for {phase_id}: {answer.message}")
        else:
            ends.append(float(answer.x[at]))
    return ends[0], ends[1]
