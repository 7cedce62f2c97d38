#!/usr/bin/env python3
"""Writes the invented demo entries of data-demo/ (standard library only; deterministic).

Every number here is invented for the demo: a chosen elemental reference energy per element, a chosen formation
energy per atom per phase, a simple mixing rule for the layered oxides, and seeded noise. None of it comes from a
database or a publication. Run: /usr/bin/python3 data-demo/generate.py
"""
import csv, json, os, random
from fractions import Fraction

HERE = os.path.dirname(os.path.abspath(__file__))
rng = random.Random(20261201)

# Invented elemental reference energies, eV/atom (the scale of a made-up total-energy method).
MU = {"Li": -1.909, "Co": -7.108, "Ni": -5.780, "Mn": -9.162, "O": -4.948, "Al": -3.745}


def parse(formula):
    """Tiny parser for the plain formulas written below (no brackets)."""
    out, i = {}, 0
    while i < len(formula):
        j = i + 1
        while j < len(formula) and formula[j].islower():
            j += 1
        el = formula[i:j]
        k = j
        while k < len(formula) and (formula[k].isdigit() or formula[k] == "."):
            k += 1
        out[el] = out.get(el, 0) + (Fraction(formula[j:k]) if k > j else 1)
        i = k
    return out


def total_per_fu(formula, formation_per_atom):
    comp = parse(formula)
    atoms = sum(comp.values())
    return float(atoms) * formation_per_atom + sum(float(n) * MU[el] for el, n in comp.items())


def row(id_, formula, formation_per_atom, basis, note):
    comp = parse(formula)
    atoms = float(sum(comp.values()))
    if basis == "total_per_atom":
        e = total_per_fu(formula, formation_per_atom) / atoms
    elif basis == "total_per_formula_unit":
        e = total_per_fu(formula, formation_per_atom)
    elif basis == "formation_per_atom":
        e = formation_per_atom
    else:
        e = formation_per_atom * atoms
    return {"id": id_, "formula": formula, "energy_ev": round(e, 5), "basis": basis, "note": note}


def noise(scale=0.004):
    return rng.uniform(-scale, scale)


rows1 = []
# Elements: ground states at formation 0 (they set the references) and a few higher polymorphs.
for el, extra in [("Li", [("fcc", 0.002)]), ("Co", [("fcc", 0.011)]), ("Ni", [("hcp", 0.027)]),
                  ("Mn", [("fcc", 0.063)]), ("O", [])]:
    rows1.append(row(f"el-{el}-gs", el, 0.0, "total_per_atom", "ground-state reference"))
    for name, de in extra:
        rows1.append(row(f"el-{el}-{name}", el, de, "total_per_atom", f"{name} polymorph"))

binaries = [
    ("Li2O", -2.071), ("Li2O2", -1.642), ("LiO2", -0.985), ("CoO", -1.231), ("Co3O4", -1.318), ("Co2O3", -1.180),
    ("CoO2", -1.052), ("NiO", -1.242), ("Ni2O3", -0.951), ("NiO2", -0.824), ("Ni3O4", -1.020), ("MnO", -2.003),
    ("Mn3O4", -2.121), ("Mn2O3", -2.074), ("MnO2", -1.934), ("Mn5O8", -2.021),
]
for f, e in binaries:
    rows1.append(row(f"bin-{f}", f, e + noise(0.002), "total_per_formula_unit", "binary oxide, relaxed"))

ternaries = [
    ("LiCoO2", -1.802, "layered R-3m"), ("LiCoO2", -1.781, "cubic spinel-like"), ("LiCo2O4", -1.560, "delithiated spinel"),
    ("Li6CoO4", -1.921, "antifluorite"), ("Li2CoO2", -1.712, "Immm"), ("LiNiO2", -1.478, "layered C2/m"),
    ("LiNiO2", -1.471, "layered R-3m"), ("Li2NiO2", -1.601, "P-3m1"), ("Li2NiO3", -1.302, "C2/m"),
    ("LiNi2O4", -1.205, "spinel"), ("LiMnO2", -2.053, "orthorhombic Pmmn"), ("LiMnO2", -2.021, "layered C2/m"),
    ("LiMn2O4", -1.984, "spinel Fd-3m"), ("Li2MnO3", -2.030, "C2/m"), ("Li4Mn5O12", -2.031, "spinel"),
    ("Li5Mn2O8", -1.990, "hypothetical"), ("Li2Mn2O4", -2.040, "tetragonal"),
]
for f, e, note in ternaries:
    slug = note.split()[-1].lower().replace("-", "") if note.split()[0] == "layered" else note.split()[0].lower().replace("-", "")
    rows1.append(row(f"ter-{f}-{slug}", f, e + noise(0.002), "total_per_formula_unit", note))

# Layered LiNi(a)Mn(b)Co(c)O2 in 12-formula-unit cells: Li12 Ni_a Mn_b Co_c O24 with a + b + c = 12.
# Invented rule: linear between the layered end members, a favourable Ni-Mn pairing term, small Ni-Co and Mn-Co
# penalties, two cation orderings per composition (the second a little higher), and seeded noise.
E_END = {"Ni": -1.471, "Mn": -2.021, "Co": -1.802}
OMEGA = {("Ni", "Mn"): -0.400, ("Ni", "Co"): 0.021, ("Mn", "Co"): 0.038}
rows3 = []
for a in range(13):
    for b in range(13 - a):
        c = 12 - a - b
        if 12 in (a, b, c):
            continue  # the end members are in the ternary file
        x = {"Ni": a / 12, "Mn": b / 12, "Co": c / 12}
        e = sum(x[m] * E_END[m] for m in x)
        e += sum(w * x[p] * x[q] for (p, q), w in OMEGA.items())
        parts = "".join(f"{m}{n}" for m, n in (("Ni", a), ("Mn", b), ("Co", c)) if n)
        formula = f"Li12{parts}O24"
        tag = f"n{a:02d}m{b:02d}c{c:02d}"
        rows3.append(row(f"nmc-{tag}-A", formula, e + noise(), "total_per_formula_unit", "ordering A, 12 f.u. cell"))
        rows3.append(row(f"nmc-{tag}-B", formula, e + rng.uniform(0.006, 0.030) + noise(), "total_per_formula_unit", "ordering B, 12 f.u. cell"))

# Partly delithiated layered phases: Li(x)CoO2 and Li(x)NiO2 in 12 f.u. cells.
for n in (3, 6, 9):
    for m, base in (("Co", -1.802), ("Ni", -1.471)):
        # Between LiMO2 and MO2 in formation energy per atom, a little above the line joining them.
        frac = n / 12
        empty = {"Co": -1.052, "Ni": -0.824}[m]
        e = (frac * 4 * base + (1 - frac) * 3 * empty) / (frac * 4 + (1 - frac) * 3) + rng.uniform(0.008, 0.030)
        rows3.append(row(f"delith-Li{n:02d}{m}12O24", f"Li{n}{m}12O24", e, "total_per_formula_unit", "delithiated, 12 f.u. cell"))

rows4 = []
rows4.append(row("el-Al-gs", "Al", 0.0, "total_per_atom", "ground-state reference"))
for f, e, note in [("Al2O3", -3.431, "corundum"), ("Al2O3", -3.402, "gamma"), ("LiAlO2", -3.021, "gamma"),
                   ("LiAlO2", -3.004, "alpha"), ("Li5AlO4", -2.503, "beta"), ("LiAl5O8", -3.334, "spinel"),
                   ("Li3AlO3", -2.620, "hypothetical")]:
    rows4.append(row(f"coat-{f}-{note}", f, e + noise(0.002), "formation_per_formula_unit", note))
# Al-doped LiCoO2 (Li12 Co(12-k) Al(k) O24): small positive mixing against LiCoO2 + LiAlO2.
for k in (1, 2, 3, 4, 6):
    x = k / 12
    e = (1 - x) * -1.802 + x * -3.021 + 0.09 * x * (1 - x) + noise()
    rows4.append(row(f"dop-Al{k:02d}-LiCoO2", f"Li12Co{12 - k}Al{k}O24", e, "formation_per_atom", "Al-doped LiCoO2, 12 f.u. cell"))

# Round 2: a re-relaxation (tighter settings) of some layered cells, shifting each by a few meV/atom.
rows_r2 = []
for r in rows3[::12]:
    comp = parse(r["formula"])
    atoms = float(sum(comp.values()))
    shifted = dict(r)
    shifted["energy_ev"] = round(r["energy_ev"] + atoms * rng.uniform(-0.012, 0.004), 5)
    shifted["note"] = r["note"] + "; re-relaxed, tighter settings"
    rows_r2.append(shifted)

# Candidates a student wants to place against the hull (formation energies per atom, invented).
candidates = [
    {"id": "cand-NMC811", "formula": "LiNi0.8Mn0.1Co0.1O2", "energy_ev": -1.541, "basis": "formation_per_atom", "note": "guess from a cheaper method"},
    {"id": "cand-LNMO", "formula": "LiNi0.5Mn1.5O4", "energy_ev": -1.905, "basis": "formation_per_atom", "note": "high-voltage spinel"},
    {"id": "cand-Li3AlO3", "formula": "Li3AlO3", "energy_ev": -2.700, "basis": "formation_per_atom", "note": "coating idea"},
    {"id": "cand-LiCoO2-Al", "formula": "LiCo0.75Al0.25O2", "energy_ev": -2.060, "basis": "formation_per_atom", "note": "heavily doped"},
]


def write_csv(path, rows):
    with open(path, "w", newline="") as f:
        f.write("# Invented demo data: not from any database or publication. Columns: id,formula,energy_ev,basis,note\n")
        w = csv.DictWriter(f, fieldnames=["id", "formula", "energy_ev", "basis", "note"], lineterminator="\n")
        w.writeheader()
        w.writerows(rows)


write_csv(os.path.join(HERE, "round1", "01-elements-binaries-ternaries.csv"), rows1)
write_csv(os.path.join(HERE, "round1", "02-layered-oxides.csv"), rows3)
with open(os.path.join(HERE, "round1", "03-coatings.json"), "w") as f:
    json.dump({"entries": rows4}, f, indent=1)
    f.write("\n")
write_csv(os.path.join(HERE, "round2", "04-rerelaxed-layered.csv"), rows_r2)
write_csv(os.path.join(HERE, "candidates.csv"), candidates)
print(len(rows1), len(rows3), len(rows4), len(rows_r2), len(candidates))
