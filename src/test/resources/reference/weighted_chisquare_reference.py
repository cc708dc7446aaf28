#!/usr/bin/env python3
"""Reference upper-tail probabilities P(sum_j lambda_j z_j^2 >= x) for WeightedChiSquareTest.

Imhof's (1961, Biometrika 48, eq. 3.2) inversion integral in his own variable u,
  P = 1/2 + (1/pi) int_0^inf sin(theta(u)) / (u rho(u)) du,
  theta(u) = 1/2 sum atan(lambda_j u) - x u / 2,  rho(u) = prod (1 + lambda_j^2 u^2)^(1/4),
integrated with SciPy's QUADPACK routines (a general-purpose library, independent of the Java code,
which uses a midpoint series instead): QAGS on [0, 1], and on [1, inf) the two Fourier integrals of
sin(a(u) - w u) = sin(a) cos(w u) - cos(a) sin(w u), w = x/2, by QAWF, which is made for slowly
decaying oscillatory tails.

Run from the project root (Debian: apt-get install python3-numpy python3-scipy):
  python3 src/test/resources/reference/weighted_chisquare_reference.py
It rewrites src/test/resources/reference/weighted_chisquare_reference.csv.
"""
import csv
import math
import os

import numpy as np
from scipy import integrate

CASES = [
    # name, weights, x values
    ("two-unequal", [1.0, 0.25], [0.5, 2.0, 6.0]),
    ("two-far-apart", [3.0, 0.01], [1.0, 9.0]),
    ("three", [2.0, 1.0, 0.5], [1.0, 4.0, 12.0]),
    ("four-spread", [1.0, 0.3, 0.1, 0.02], [0.3, 2.0, 8.0]),
    ("six", [5.0, 4.0, 2.5, 1.0, 0.5, 0.2], [5.0, 13.0, 40.0]),
    ("twelve-decaying", [0.8 ** j for j in range(12)], [1.0, 4.0, 15.0]),
]


def upper_tail(weights, x):
    lam = np.asarray(weights, dtype=float)
    w = x / 2.0

    def amplitude(u):
        return 1.0 / (u * np.prod((1.0 + (lam * u) ** 2) ** 0.25))

    def phase(u):
        return 0.5 * np.sum(np.arctan(lam * u))

    def integrand(u):
        if u == 0.0:
            return 0.5 * (lam.sum() - x)
        return math.sin(phase(u) - w * u) * amplitude(u)

    head, _ = integrate.quad(integrand, 0.0, 1.0, epsabs=1e-14, epsrel=1e-13, limit=500)
    cos_part, _ = integrate.quad(lambda u: math.sin(phase(u)) * amplitude(u), 1.0, np.inf, weight="cos",
                                 wvar=w, epsabs=1e-14, limlst=200, limit=500)
    sin_part, _ = integrate.quad(lambda u: math.cos(phase(u)) * amplitude(u), 1.0, np.inf, weight="sin",
                                 wvar=w, epsabs=1e-14, limlst=200, limit=500)
    return 0.5 + (head + cos_part - sin_part) / math.pi


def main():
    out = os.path.join(os.path.dirname(os.path.abspath(__file__)), "weighted_chisquare_reference.csv")
    with open(out, "w", newline="") as handle:
        writer = csv.writer(handle, lineterminator="\n")
        writer.writerow(["case", "weights", "x", "upper_tail"])
        for name, weights, xs in CASES:
            for x in xs:
                writer.writerow([name, " ".join(repr(float(v)) for v in weights), repr(float(x)),
                                 repr(upper_tail(weights, x))])


if __name__ == "__main__":
    main()
