"""Closed forms of one compound with a Gaussian energy error between two fixed end-members (SciPy, Debian's
/usr/bin/python3), the outside check of stability sampling.

Reads {"tasks": [...]} from the file named by the first argument and writes {"results": [...]}.
A compound with formation energy E ~ N(dE, sigma) relative to the end-member tie-line at 0 is a hull vertex exactly
when E < 0, and its energy above the hull is max(E, 0) (common practice). So, written from those definitions:
  p_vertex   = Phi(-dE/sigma)                                  scipy.stats.norm.cdf
  mean_above = E[max(E, 0)] = dE Phi(dE/sigma) + sigma phi(dE/sigma)   (norm.cdf, norm.pdf)
  q_above(q) = max(0, dE + sigma Phi^-1(q))                    scipy.stats.norm.ppf, for q = 0.05 and 0.95
"""
import json
import sys

from scipy.stats import norm


def binary(task):
    d, s = task["dE"], task["sigma"]
    return {
        "p_vertex": float(norm.cdf(-d / s)),
        "mean_above": float(d * norm.cdf(d / s) + s * norm.pdf(d / s)),
        "p05": max(0.0, float(d + s * norm.ppf(0.05))),
        "p95": max(0.0, float(d + s * norm.ppf(0.95))),
    }


def main():
    with open(sys.argv[1]) as f:
        tasks = json.load(f)["tasks"]
    print(json.dumps({"results": [binary(t) for t in tasks]}))


if __name__ == "__main__":
    main()
