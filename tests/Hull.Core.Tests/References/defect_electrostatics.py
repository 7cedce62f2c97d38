"""Independent NumPy/SciPy evaluation of the defect-correction electrostatics, run by Debian's /usr/bin/python3.

Reads one JSON object from the file named by the first argument: {"tasks": [...]} and writes {"results": [...]} with one entry per task.
Everything is computed in the physical frame straight from the definitions, with no change of frame:
  lattice      E_lat = E_isolated - E_periodic of the model charge (eV)
               point charge: Ewald sum with the anisotropic screened Coulomb kernel,
                 (q^2/2)[sum' erfc(g|R|_e)/(sqrt(det e)|R|_e) + (4pi/V) sum' exp(-GeG/4g^2)/GeG
                         - 2g/(sqrt(pi) sqrt(det e)) - pi/(V g^2)],  |R|_e = sqrt(R e^-1 R)
               Gaussian (covariance S): E_per = (q^2/2)(4pi/V) sum' exp(-GSG)/GeG (no splitting),
                 E_iso = (q^2/2)(2/sqrt(pi))/sqrt(det e) int_0^inf det(I + 4 t^2 e^-1 S)^-1/2 dt (scipy quad)
  sites        potential (V) at sites (fractional) of the periodic model charge, zero mean over the cell:
               Gaussian: (4pi q/V) sum' exp(-GSG/2) cos(G.r)/GeG; point: the Ewald form above
  planar       planar average along an axis at f = k/n: (4pi q/V) sum_{m != 0} exp(-m^2 bSb/2) cos(2pi m (f-f0))/(m^2 beb)
  erfc         scipy.special.erfc at the given points
A task with "repeat": n is evaluated n times and answered as {"value": ..., "median_seconds": ...} (bench/).
"""
import json
import sys
import time

import numpy as np
from scipy import integrate, special

COULOMB = 14.399645478  # e^2/(4 pi eps0) in eV*A, CODATA 2018


def reciprocal(cell):
    return 2 * np.pi * np.linalg.inv(cell).T  # rows b_i with a_i . b_j = 2 pi delta_ij


def grid(vectors, cutoff):
    """Every non-zero integer combination of the rows of `vectors` no longer than `cutoff`."""
    volume = abs(np.linalg.det(vectors))
    # |n_i| <= cutoff / (spacing of the planes spanned by the other two rows)
    n = [int(np.ceil(cutoff * np.linalg.norm(np.cross(vectors[(i + 1) % 3], vectors[(i + 2) % 3])) / volume)) for i in range(3)]
    idx = np.array(np.meshgrid(*[np.arange(-k, k + 1) for k in n], indexing="ij")).reshape(3, -1).T
    idx = idx[np.any(idx != 0, axis=1)]
    pts = idx @ vectors
    return pts[np.linalg.norm(pts, axis=1) <= cutoff]


def lattice_point(cell, eps, q, gamma):
    inv = np.linalg.inv(eps)
    det = np.linalg.det(eps)
    vol = abs(np.linalg.det(cell))
    real = grid(cell, 7.0 / gamma * np.sqrt(np.max(np.linalg.eigvalsh(eps))))
    d = np.sqrt(np.einsum("ij,jk,ik->i", real, inv, real))
    s_real = np.sum(special.erfc(gamma * d) / d) / np.sqrt(det)
    rec = grid(reciprocal(cell), 14.0 * gamma / np.sqrt(np.min(np.linalg.eigvalsh(eps))))
    geg = np.einsum("ij,jk,ik->i", rec, eps, rec)
    s_rec = 4 * np.pi / vol * np.sum(np.exp(-geg / (4 * gamma ** 2)) / geg)
    per_minus_iso = 0.5 * q * q * (s_real + s_rec - 2 * gamma / np.sqrt(np.pi) / np.sqrt(det) - np.pi / (vol * gamma ** 2))
    return -COULOMB * per_minus_iso


def lattice_gaussian(cell, eps, cov, q):
    vol = abs(np.linalg.det(cell))
    smin = np.min(np.linalg.eigvalsh(cov))
    rec = grid(reciprocal(cell), np.sqrt(80.0 / smin))
    gsg = np.einsum("ij,jk,ik->i", rec, cov, rec)
    geg = np.einsum("ij,jk,ik->i", rec, eps, rec)
    e_per = 0.5 * q * q * 4 * np.pi / vol * np.sum(np.exp(-gsg) / geg)
    m = np.linalg.inv(eps) @ cov
    f = lambda t: 1.0 / np.sqrt(np.linalg.det(np.eye(3) + 4 * t * t * m))
    integral, _ = integrate.quad(f, 0, np.inf, epsabs=1e-15, epsrel=1e-13, limit=200)
    e_iso = 0.5 * q * q * 2 / np.sqrt(np.pi) / np.sqrt(np.linalg.det(eps)) * integral
    return COULOMB * (e_iso - e_per)


def sites_gaussian(cell, eps, cov, q, defect, sites):
    vol = abs(np.linalg.det(cell))
    smin = np.min(np.linalg.eigvalsh(cov))
    rec = grid(reciprocal(cell), np.sqrt(80.0 / smin))
    gsg = np.einsum("ij,jk,ik->i", rec, cov, rec)
    geg = np.einsum("ij,jk,ik->i", rec, eps, rec)
    w = 4 * np.pi / vol * np.exp(-0.5 * gsg) / geg
    r = (np.asarray(sites) - np.asarray(defect)) @ cell
    return COULOMB * q * (np.cos(r @ rec.T) @ w)


def sites_point(cell, eps, q, defect, sites, gamma):
    inv = np.linalg.inv(eps)
    det = np.linalg.det(eps)
    vol = abs(np.linalg.det(cell))
    frac = np.asarray(sites) - np.asarray(defect)
    frac -= np.round(frac)
    r = frac @ cell
    cut = 7.0 / gamma * np.sqrt(np.max(np.linalg.eigvalsh(eps)))
    lat = np.vstack([grid(cell, cut + np.max(np.linalg.norm(r, axis=1)) + 1e-9), np.zeros((1, 3))])
    rec = grid(reciprocal(cell), 14.0 * gamma / np.sqrt(np.min(np.linalg.eigvalsh(eps))))
    geg = np.einsum("ij,jk,ik->i", rec, eps, rec)
    w = 4 * np.pi / vol * np.exp(-geg / (4 * gamma ** 2)) / geg
    out = []
    for v in r:
        d = v - lat
        dist = np.sqrt(np.einsum("ij,jk,ik->i", d, inv, d))
        out.append(np.sum(special.erfc(gamma * dist) / dist) / np.sqrt(det) + np.sum(w * np.cos(rec @ v)) - np.pi / (vol * gamma ** 2))
    return COULOMB * q * np.array(out)


def planar(cell, eps, cov, q, f0, axis, n):
    vol = abs(np.linalg.det(cell))
    b = reciprocal(cell)[axis]
    beb, bsb = b @ eps @ b, b @ cov @ b
    # a point charge's terms fall as 1/m^2 only: 400,000 of them leave a tail below 2.5e-6 of the sum
    top = 400000 if bsb == 0 else int(np.ceil(np.sqrt(80 / bsb)))
    f = np.arange(n) / n - f0
    total = np.zeros(n)
    for start in range(1, top + 1, 20000):
        m = np.arange(start, min(start + 20000, top + 1), dtype=float)
        terms = np.exp(-0.5 * m ** 2 * bsb)[None, :] * np.cos(2 * np.pi * np.outer(f, m)) / (m ** 2 * beb)[None, :]
        total += terms.sum(axis=1)
    return COULOMB * q * 4 * np.pi / vol * 2 * total


def run(task):
    kind = task["kind"]
    if kind == "erfc":
        return list(special.erfc(np.asarray(task["x"])))
    cell = np.asarray(task["cell"], dtype=float)
    eps = np.asarray(task["eps"], dtype=float)
    cov = np.asarray(task.get("cov", np.zeros((3, 3))), dtype=float)
    q = task["q"]
    point = not np.any(cov)
    gamma = np.sqrt(np.pi) / abs(np.linalg.det(cell)) ** (1 / 3)
    if kind == "lattice":
        return lattice_point(cell, eps, q, gamma) if point else lattice_gaussian(cell, eps, cov, q)
    if kind == "sites":
        if point:
            return list(sites_point(cell, eps, q, task["defect"], task["sites"], gamma))
        return list(sites_gaussian(cell, eps, cov, q, task["defect"], task["sites"]))
    if kind == "planar":
        return list(planar(cell, eps, cov, q, task["f0"], task["axis"], task["n"]))
    raise ValueError("unknown task kind " + kind)


def main():
    with open(sys.argv[1], encoding="utf-8") as f:
        tasks = json.load(f)["tasks"]
    results = []
    for t in tasks:
        repeat = int(t.get("repeat", 0))
        if repeat <= 0:
            results.append(run(t))
            continue
        # Benchmark use: the median wall time of `repeat` evaluations beside the value.
        times = []
        for _ in range(repeat):
            start = time.perf_counter()
            value = run(t)
            times.append(time.perf_counter() - start)
        results.append({"value": value, "median_seconds": float(np.median(times))})
    json.dump({"results": results}, sys.stdout)


if __name__ == "__main__":
    main()
