"""Independent SciPy/mpmath evaluation of carrier statistics and charge neutrality, run by Debian's /usr/bin/python3.

Reads one JSON object from the file named by the first argument, {"tasks": [...]}, and writes {"results": [...]}.
Every formula is written here from its textbook definition, not from the library:
  fd_half      F_1/2(eta) = (2/sqrt(pi)) int_0^inf sqrt(x)/(1+exp(x-eta)) dx by scipy quad, and -Li_3/2(-e^eta) by mpmath
  neutrality   E_F where p - n + N_D - N_A + sum_q q c_q = 0, by scipy brentq, with
                 n = N_c(T) F_1/2((E_F - E_C)/kT) (Fermi-Dirac) or N_c(T) exp((E_F - E_C)/kT) (Boltzmann),
                 p = N_v(T) F_1/2((E_V - E_F)/kT) or N_v(T) exp((E_V - E_F)/kT), N(T) = N(300 K) (T/300)^1.5,
                 c_q = N g_q exp(-E_q/kT) (dilute),
                 c_q = N g_q exp(-E_q/kT) / (1 + sum over the site set of g_j exp(-E_j/kT)) (site blocking),
                 c_q = C g_q exp(-E_q/kT) / sum over the defect of g_j exp(-E_j/kT) (fixed total C),
               E_q = a_q + q E_F, E_V = 0 and E_C = gap unless edges are given.
  sweep        neutrality at each of "temperatures", the whole sweep timed "repeat" times (median seconds; bench/)
  quartic      the positive root y of a y^4 + b y^3 + c y^2 + d y + e = 0 by mpmath polyroots at 50 digits
"""
import json
import math
import statistics
import sys
import time

import mpmath
from scipy import integrate, optimize

K_B = 1.380649e-23 / 1.602176634e-19  # eV/K, CODATA 2018 (exact)


def fd_quad(eta):
    # F = e^eta (2/sqrt(pi)) int sqrt(x) e^-x / (1 + e^(eta - x)) dx keeps the integrand O(1) for eta < 0.
    if eta < 0:
        f = lambda x: math.sqrt(x) * math.exp(-x) / (1 + math.exp(eta - x))
        val, _ = integrate.quad(f, 0, math.inf, epsabs=0, epsrel=1e-13, limit=400)
        return math.exp(eta) * 2 / math.sqrt(math.pi) * val
    f = lambda x: math.sqrt(x) / (1 + math.exp(x - eta)) if x - eta < 700 else 0.0
    top = eta + 80
    val1, _ = integrate.quad(f, 0, eta, epsabs=0, epsrel=1e-13, limit=400) if eta > 0 else (0.0, 0)
    val2, _ = integrate.quad(f, eta, top, epsabs=0, epsrel=1e-13, limit=400)
    return 2 / math.sqrt(math.pi) * (val1 + val2)


def fd_polylog(eta):
    mpmath.mp.dps = 40
    return float(mpmath.re(-mpmath.polylog(1.5, -mpmath.exp(eta))))


def neutrality(task):
    t = task["T"]
    kt = K_B * t
    gap = task["gap"]
    ev, ec = task.get("edges", [0.0, gap])
    scale = (t / 300.0) ** 1.5
    nc, nv = task["nc300"] * scale, task["nv300"] * scale
    fd = task["stats"] == "fd"
    blocking = task.get("form") == "blocking"
    frozen = task.get("frozen")
    defects = task["defects"]
    nd, na = task.get("donors", 0.0), task.get("acceptors", 0.0)

    def carriers(ef):
        eta_n, eta_p = (ef - ec) / kt, (ev - ef) / kt
        if fd:
            return nc * fd_quad(eta_n), nv * fd_quad(eta_p)
        return nc * math.exp(eta_n), nv * math.exp(eta_p)

    def concentrations(ef):
        out = []
        site_sums = {}
        for d in defects:
            w = [g * math.exp(-(a + q * ef) / kt) for q, a, g in d["states"]]
            d["_w"] = w
            site_sums[d["site_set"]] = site_sums.get(d["site_set"], 0.0) + sum(w)
        for i, d in enumerate(defects):
            w = d["_w"]
            if frozen is not None:
                c = [frozen[i] * x / sum(w) for x in w]
            elif blocking:
                c = [d["sites"] * x / (1 + site_sums[d["site_set"]]) for x in w]
            else:
                c = [d["sites"] * x for x in w]
            out.append(c)
        return out

    def scaled_net(ef):
        n, p = carriers(ef)
        cs = concentrations(ef)
        net = p - n + nd - na
        gross = p + n + nd + na
        for d, c in zip(defects, cs):
            for (q, _, _), x in zip(d["states"], c):
                net += q * x
                gross += abs(q) * x
        return net / gross

    lo, hi = ev - 3.0, ec + 3.0
    ef = optimize.brentq(scaled_net, lo, hi, xtol=1e-14, rtol=1e-15, maxiter=500)
    n, p = carriers(ef)
    cs = concentrations(ef)
    return {"fermi": ef, "n": n, "p": p, "states": cs, "totals": [sum(c) for c in cs]}


def quartic(task):
    mpmath.mp.dps = 50
    coeffs = [mpmath.mpf(c) for c in task["coefficients"]]
    roots = mpmath.polyroots(coeffs, maxsteps=500, extraprec=200)
    positive = [float(mpmath.re(r)) for r in roots if abs(mpmath.im(r)) < 1e-30 * abs(r) and mpmath.re(r) > 0]
    return positive


def sweep(task):
    times, levels = [], []
    for _ in range(task.get("repeat", 1)):
        start = time.perf_counter()
        levels = [neutrality(dict(task, T=t))["fermi"] for t in task["temperatures"]]
        times.append(time.perf_counter() - start)
    return {"fermi": levels, "median_seconds": statistics.median(times)}


def main():
    with open(sys.argv[1]) as f:
        tasks = json.load(f)["tasks"]
    results = []
    for task in tasks:
        kind = task["kind"]
        if kind == "fd_half":
            results.append({"quad": [fd_quad(e) for e in task["eta"]], "polylog": [fd_polylog(e) for e in task["eta"]]})
        elif kind == "neutrality":
            results.append(neutrality(task))
        elif kind == "sweep":
            results.append(sweep(task))
        elif kind == "quartic":
            results.append(quartic(task))
        else:
            raise ValueError("unknown task kind " + kind)
    json.dump({"results": results}, sys.stdout)


if __name__ == "__main__":
    main()
