"""Independent reference values for the weak-identification-robust statistics and sets of the Lumen
power-utility model (models/lumen-power-utility.toml: f_t = beta g_t^{-gamma} R_t - 1 on 12 quarterly
gross portfolio returns, centered Bartlett S with 4 lags re-estimated at every theta), written from the
published definitions:

  S(theta) = T g' S(theta)^{-1} g                          (Stock and Wright 2000, Econometrica 68)
  K(theta) = T g'S^{-1} Dt (Dt'S^{-1}Dt)^{-1} Dt'S^{-1} g  (Kleibergen 2005, Econometrica 73)
      Dt_j = qbar_j - V_{q_j f} S^{-1} g, q_t = df_t/dtheta_j, V_{qf} the Bartlett cross long-run
      covariance, lag by lag: sum_{|j|<=L} (1 - |j|/(L+1)) Gamma^{qf}_j, Gamma^{qf}_j = (1/T) sum_t q_t u_{t-j}'
  concentrated S-set of theta_i:  {x : min over the other parameter of S <= chi2_{K-P+1}(0.95)}
  concentrated K-set of theta_i:  {x : K_i <= chi2_1(0.95)} at the S-minimising other parameter, with
      K_i = T (a_i - M_io M_oo^{-1} a_o)^2 / (M_ii - M_io M_oo^{-1} M_oi),  a = Dt'S^{-1}g, M = Dt'S^{-1}Dt

Sets are found by scanning a grid of 2001 points over a fixed search range and locating every crossing
with brentq. Run from the project root (numpy 2.4, scipy 1.17):
    python3 src/test/resources/reference/robust/s_sets_reference.py
It rewrites s_sets_values.csv beside itself.
"""
import os
import sys

import numpy as np
from scipy.optimize import brentq, minimize_scalar
from scipy.stats import chi2

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, HERE)
import lumen_data  # noqa: E402

LAGS = 4
LEVEL = 0.95
RANGES = {"beta": (0.84, 1.11), "gamma": (-30.0, 50.0)}

GROSS, GROWTH, _, _ = lumen_data.power_utility_data()
LOG_GROWTH = np.log(GROWTH)
T, K = GROSS.shape
P = 2


def contributions(theta):
    return theta[0] * np.exp(-theta[1] * LOG_GROWTH)[:, None] * GROSS - 1.0


def row_derivatives(theta):
    discounted = np.exp(-theta[1] * LOG_GROWTH)[:, None] * GROSS
    return [discounted, -theta[0] * LOG_GROWTH[:, None] * discounted]


def cross_long_run(q, u):
    q = q - q.mean(axis=0)
    u = u - u.mean(axis=0)
    v = q.T @ u / T
    for j in range(1, LAGS + 1):
        w = 1.0 - j / (LAGS + 1.0)
        v = v + w * (q[j:].T @ u[:-j] + q[:-j].T @ u[j:]) / T
    return v


def statistics(theta):
    """S, the joint K, the score a and M at theta."""
    f = contributions(theta)
    g = f.mean(axis=0)
    s = lumen_data.bartlett_s(f, LAGS)
    s_inv_g = np.linalg.solve(s, g)
    stat_s = T * g @ s_inv_g
    tilde = np.column_stack([q.mean(axis=0) - cross_long_run(q, f) @ s_inv_g for q in row_derivatives(theta)])
    s_inv_tilde = np.linalg.solve(s, tilde)
    a = tilde.T @ s_inv_g
    m = tilde.T @ s_inv_tilde
    stat_k = T * a @ np.linalg.solve(m, a)
    return stat_s, stat_k, a, m


def k_for(i, a, m):
    o = 1 - i
    adjusted = a[i] - m[i, o] / m[o, o] * a[o]
    schur = m[i, i] - m[i, o] ** 2 / m[o, o]
    return T * adjusted ** 2 / schur


def other_minimum(i, x, guess):
    """min over the other parameter of S with theta_i = x, Brent from a bracket around the guess."""
    def objective(y):
        theta = np.empty(2)
        theta[i] = x
        theta[1 - i] = y
        return statistics(theta)[0]
    scale = 0.01 if i == 1 else 2.0
    result = minimize_scalar(objective, bracket=(guess - scale, guess + scale), method="brent",
                             options={"xtol": 1e-12, "maxiter": 1000})
    theta = np.empty(2)
    theta[i] = x
    theta[1 - i] = result.x
    return theta, result.fun


class Profile:
    def __init__(self, i, start_other):
        self.i = i
        self.cache = {}
        self.start_other = start_other

    def at(self, x, guess=None):
        theta, s = other_minimum(self.i, x, self.start_other if guess is None else guess)
        _, _, a, m = statistics(theta)
        return theta, s, k_for(self.i, a, m)


def sets_of(i, name, start_other):
    low, high = RANGES[name]
    grid = np.linspace(low, high, 2001)
    profile = Profile(i, start_other)
    centre = int(np.argmin(np.abs(grid - (7.87 if i == 1 else 0.974))))
    thetas = [None] * len(grid)
    values = np.zeros((len(grid), 2))
    order = list(range(centre, len(grid))) + list(range(centre - 1, -1, -1))
    for m in order:
        neighbour = thetas[m - 1] if m > centre else (thetas[m + 1] if m < centre else None)
        guess = None if neighbour is None else neighbour[1 - i]
        theta, s, k = profile.at(grid[m], guess)
        thetas[m] = theta
        values[m] = (s, k)
    out = []
    for column, method, df in ((0, "S", K - P + 1), (1, "K", 1)):
        critical = chi2.ppf(LEVEL, df)
        inside = values[:, column] <= critical
        ends = []
        for m in range(len(grid) - 1):
            if inside[m] != inside[m + 1]:
                guess = thetas[m][1 - i]
                root = brentq(lambda x: profile.at(x, guess)[1 + column] - critical, grid[m], grid[m + 1],
                              xtol=1e-13, rtol=1e-13)
                ends.append(root)
        bounds = []
        if inside[0]:
            ends.insert(0, None)
        if inside[-1]:
            ends.append(None)
        for a, b in zip(ends[0::2], ends[1::2]):
            bounds.append((a, b))
        out.append((name, method, df, critical, bounds))
    return out


def main():
    rows = []
    for point in ((0.974023376, 7.868424590), (0.97, 5.0), (0.99, 15.0), (0.95, 25.0), (1.0, -3.0)):
        s, k, _, _ = statistics(np.array(point))
        rows.append("point,%r,%r,%r,%r" % (point[0], point[1], float(s), float(k)))
    for x in (3.0, 8.0, 12.0, 30.0):
        theta, s, k = Profile(1, 0.975).at(x)
        rows.append("profile_gamma,%r,%r,%r,%r" % (float(theta[0]), x, float(s), float(k)))
    for x in (0.95, 0.975, 1.0):
        theta, s, k = Profile(0, 7.9).at(x)
        rows.append("profile_beta,%r,%r,%r,%r" % (x, float(theta[1]), float(s), float(k)))
    for name, method, df, critical, bounds in sets_of(1, "gamma", 0.975) + sets_of(0, "beta", 7.9):
        text = " ".join("%s:%s" % ("open" if a is None else repr(float(a)), "open" if b is None else repr(float(b)))
                        for a, b in bounds)
        rows.append("set_%s_%s,%d,%r,%s," % (name, method, df, float(critical), text or "empty"))
    with open(os.path.join(HERE, "s_sets_values.csv"), "w") as out:
        out.write("kind,a,b,c,d\n")
        out.write("\n".join(rows) + "\n")


if __name__ == "__main__":
    main()
