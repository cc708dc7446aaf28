"""Independent reference values for the finite-sample corrected two-step GMM covariance of
Windmeijer (2005, Journal of Econometrics 126, 25-51), written from the paper's formula:

    V_c = V2 + D V2 + V2 D' + D V1 D',
    column j of D = A2^{-1} G2' W2 (dS/dtheta_j at theta1) W2 g(theta2),  A2 = G2' W2 G2,  W2 = S(theta1)^{-1},
    V2 = A2^{-1}/T,  V1 = (G1'W0G1)^{-1} G1'W0 S(theta1) W0 G1 (G1'W0G1)^{-1}/T,

with dS/dtheta_j taken lag by lag from the per-observation derivatives (bandwidth fixed):
dGamma_j = (1/T) sum_t (du_t u_{t-j}' + u_t du_{t-j}'), u centered. Two cases:

  iv:     a linear instrumental-variable regression on seeded data written to iv_data.csv
          (f_t = z_t (y_t - x_t'theta), first step 2SLS, W0 = (Z'Z/T)^{-1}, HC S);
  lumen:  power utility on the Lumen demo data (f_t = beta g_t^{-gamma} R_t - 1, first step W0 = I,
          Bartlett S with 4 lags), as models/lumen-power-utility.toml asks.

Run from the project root:  python3 src/test/resources/reference/robust/windmeijer_reference.py
(numpy 2.4, scipy 1.17). It rewrites iv_data.csv and windmeijer_values.csv beside itself.
"""
import os
import sys

import numpy as np
from scipy.optimize import least_squares

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, HERE)
import lumen_data  # noqa: E402


def long_run(u, lags):
    return lumen_data.bartlett_s(u, lags)


def long_run_derivative(u, du, lags):
    u = u - u.mean(axis=0)
    du = du - du.mean(axis=0)
    t = len(u)
    ds = (du.T @ u + u.T @ du) / t
    for j in range(1, lags + 1):
        d_gamma = (du[j:].T @ u[:-j] + u[j:].T @ du[:-j]) / t
        ds = ds + (1.0 - j / (lags + 1.0)) * (d_gamma + d_gamma.T)
    return ds


def minimise(moments, weight, start):
    """argmin g' W g by least squares on L' g, W = L L'; tolerances at machine precision."""
    chol = np.linalg.cholesky(weight)
    result = least_squares(lambda th: chol.T @ moments(th).mean(axis=0), start, xtol=1e-15, ftol=1e-15,
                           gtol=1e-15, method="lm", max_nfev=100000)
    return result.x


def correction(contrib, jac_rows, theta1, theta2, w0, lags):
    """Windmeijer's V_c; jac_rows(theta) is T x K x P."""
    f1 = contrib(theta1)
    t, k = f1.shape
    s1 = long_run(f1, lags)
    w2 = np.linalg.inv(s1)
    g2 = contrib(theta2).mean(axis=0)
    big_g2 = jac_rows(theta2).mean(axis=0)
    big_g1 = jac_rows(theta1).mean(axis=0)
    a2_inv = np.linalg.inv(big_g2.T @ w2 @ big_g2)
    v2 = a2_inv / t
    bread = np.linalg.inv(big_g1.T @ w0 @ big_g1)
    v1 = bread @ big_g1.T @ w0 @ s1 @ w0 @ big_g1 @ bread / t
    rows1 = jac_rows(theta1)
    p = len(theta1)
    d = np.zeros((p, p))
    for j in range(p):
        ds = long_run_derivative(f1, rows1[:, :, j], lags)
        d[:, j] = a2_inv @ big_g2.T @ w2 @ ds @ w2 @ g2
        # the same derivative by central differences of S along theta_j, as a check of the formula
        h = 1e-6 * max(1.0, abs(theta1[j]))
        up, down = theta1.copy(), theta1.copy()
        up[j] += h
        down[j] -= h
        numeric = (long_run(contrib(up), lags) - long_run(contrib(down), lags)) / (2 * h)
        assert np.max(np.abs(numeric - ds)) < 1e-6 * max(1.0, np.max(np.abs(ds))), "dS/dtheta check failed"
    vc = v2 + d @ v2 + v2 @ d.T + d @ v1 @ d.T
    usual = np.linalg.inv(big_g2.T @ np.linalg.inv(long_run(contrib(theta2), lags)) @ big_g2) / t
    return vc, usual, d


def iv_case():
    rng = np.random.default_rng(20050101)
    t = 200
    z = np.column_stack([np.ones(t), rng.normal(size=(t, 3))])
    common = rng.normal(size=t)
    x2 = z[:, 1:] @ np.array([0.6, 0.3, 0.2]) + common + 0.5 * rng.normal(size=t)
    heteroskedastic = 1.0 + 0.5 * np.abs(z[:, 1])
    u = heteroskedastic * (0.8 * common + 0.6 * rng.normal(size=t))
    y = 0.5 + 1.0 * x2 + u
    x = np.column_stack([np.ones(t), x2])
    y = np.round(y, 10)
    x = np.round(x, 10)
    z = np.round(z, 10)
    with open(os.path.join(HERE, "iv_data.csv"), "w") as out:
        out.write("y,x1,x2,z1,z2,z3,z4\n")
        for r in range(t):
            out.write(",".join(repr(float(v)) for v in [y[r], *x[r], *z[r]]) + "\n")

    def contrib(theta):
        return z * (y - x @ theta)[:, None]

    def jac_rows(theta):
        return -z[:, :, None] * x[:, None, :]

    w0 = np.linalg.inv(z.T @ z / t)
    theta1 = minimise(contrib, w0, np.zeros(2))
    w2 = np.linalg.inv(long_run(contrib(theta1), 0))
    theta2 = minimise(contrib, w2, theta1)
    vc, usual, d = correction(contrib, jac_rows, theta1, theta2, w0, 0)
    return "iv", theta1, theta2, usual, vc, d


def lumen_case():
    gross, growth, _, _ = lumen_data.power_utility_data()
    log_growth = np.log(growth)

    def contrib(theta):
        return theta[0] * np.exp(-theta[1] * log_growth)[:, None] * gross - 1.0

    def jac_rows(theta):
        discounted = np.exp(-theta[1] * log_growth)[:, None] * gross
        return np.stack([discounted, -theta[0] * log_growth[:, None] * discounted], axis=2)

    k = gross.shape[1]
    w0 = np.eye(k)
    theta1 = minimise(contrib, w0, np.array([0.99, 2.0]))
    w2 = np.linalg.inv(long_run(contrib(theta1), 4))
    theta2 = minimise(contrib, w2, theta1)
    vc, usual, d = correction(contrib, jac_rows, theta1, theta2, w0, 4)
    return "lumen", theta1, theta2, usual, vc, d


def main():
    with open(os.path.join(HERE, "windmeijer_values.csv"), "w") as out:
        out.write("case,parameter,first_step,estimate,std_error,std_error_windmeijer,d_row\n")
        for case, theta1, theta2, usual, vc, d in (iv_case(), lumen_case()):
            for i in range(len(theta2)):
                out.write("%s,%d,%r,%r,%r,%r,%s\n" % (case, i, float(theta1[i]), float(theta2[i]),
                                                      float(np.sqrt(usual[i, i])), float(np.sqrt(vc[i, i])),
                                                      " ".join(repr(float(v)) for v in d[i])))


if __name__ == "__main__":
    main()
