"""An outside reference for the demo's numbers: formation energies worked here from the exported entries, and lower
convex hulls from SciPy's ConvexHull (Qhull, Debian python3-scipy)."""

import re
from fractions import Fraction

import numpy as np
from scipy.spatial import ConvexHull

_TOKEN = re.compile(r"([A-Z][a-z]?)(\d+(?:\.\d+)?)?")
# Lower facets have an outward normal pointing down in energy; walls (vertical facets) have a normal energy
# component of ~0, which rounding can make slightly negative: far below any real facet's (normals are unit vectors).
LOWER_FACET_NORMAL = -1e-6


def composition(formula):
    """{element: amount} of a formula without groups (the demo's formulas have none)."""
    if not re.fullmatch(r"(?:[A-Z][a-z]?(?:\d+(?:\.\d+)?)?)+", formula):
        raise ValueError(f"reference parser cannot read {formula!r}")
    amounts = {}
    for symbol, count in _TOKEN.findall(formula):
        amounts[symbol] = amounts.get(symbol, Fraction(0)) + Fraction(count or "1")
    return amounts


def formation_energies(entries):
    """{id: (composition, formation energy per atom)} from an export frame (id, formula, energy_ev, basis).
    Elemental references: the lowest total energy per atom among each element's pure entries (the rule the
    README states); formation energy per atom = (E_total - Σ n_i ref_i) / N."""
    per_atom, comps = {}, {}
    for row in entries.itertuples():
        comp = composition(row.formula)
        atoms = float(sum(comp.values()))
        energy = row.energy_ev / atoms if row.basis.endswith("per_formula_unit") else row.energy_ev
        comps[row.id] = comp
        per_atom[row.id] = (energy, row.basis.startswith("formation"))
    refs = {}
    for ident, comp in comps.items():
        energy, is_formation = per_atom[ident]
        if len(comp) == 1 and not is_formation:
            (symbol,) = comp
            refs[symbol] = min(refs.get(symbol, np.inf), energy)
    result = {}
    for ident, comp in comps.items():
        energy, is_formation = per_atom[ident]
        atoms = float(sum(comp.values()))
        if is_formation:
            result[ident] = (comp, energy)
        else:
            result[ident] = (comp, energy - sum(float(n) * refs[s] for s, n in comp.items()) / atoms)
    return result


class LowerHull:
    """The lower convex hull of (composition fractions, energy) points of one chemical system, by Qhull."""

    def __init__(self, elements, points):
        self.elements = list(elements)
        self.coords = np.array([[float(c.get(e, 0)) / float(sum(c.values())) for e in self.elements[:-1]] + [energy]
                                for c, energy in points])
        hull = ConvexHull(self.coords)
        lower = hull.equations[hull.equations[:, -2] < LOWER_FACET_NORMAL]
        self.planes = lower
        self.simplices = hull.simplices[hull.equations[:, -2] < LOWER_FACET_NORMAL]

    def fractions(self, comp):
        total = float(sum(comp.values()))
        return np.array([float(comp.get(e, 0)) / total for e in self.elements[:-1]])

    def energy_at(self, x):
        # A convex piecewise-linear function is the maximum of its pieces' planes.
        normal, energy_part, offset = self.planes[:, :-2], self.planes[:, -2], self.planes[:, -1]
        return float(np.max(-(normal @ x + offset) / energy_part))

    def edges(self):
        """Index pairs of the points joined by an edge of a lower facet."""
        pairs = set()
        for simplex in self.simplices:
            for i in range(len(simplex)):
                for j in range(i + 1, len(simplex)):
                    pairs.add(tuple(sorted((int(simplex[i]), int(simplex[j])))))
        return pairs
