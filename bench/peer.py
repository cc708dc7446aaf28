#!/usr/bin/env python3
"""A straightforward NumPy implementation of the GMM estimators that Orthogon runs on the peer workloads
(bench/compare.py), written from the published formulas, so that both the numbers and the time can be
compared. It shares no code with Orthogon.

Model: linear SDF on excess returns, m_t = 1 - b'F_t, moments f_t(b) = R_t m_t (Cochrane 2005, "Asset
Pricing", ch. 13), g(b) = mean f_t(b) = d - C b, closed form b = -(D'WD)^{-1} D'W g(0), D = -C.

Conventions: S centred, Gamma_j = (1/T) sum_{t>j} u_t u_{t-j}' (divided by T), Bartlett weights 1 - j/b
with b = L + 1 for L lags (Newey and West 1987); automatic bandwidth of Newey and West (1994) for
Bartlett: h_t = sum of the moment columns, m = floor(4 (T/100)^(2/9)), sigma_j = (1/T) sum h_t h_{t-j},
b = 1.1447 ((s1/s0)^2)^(1/3) T^(1/3), re-selected at every evaluation of S. Two-step GMM: W2 = S(b1)^-1,
covariance (D'S^-1 D)^-1/T with S at the final estimate, J = T g' W2 g. Fixed weight: W = I, sandwich
covariance. Pricing errors: Var(g) = (1/T) A S A', A = I - D(D'WD)^-1 D'W, joint test over the K - P
largest eigenvalues. Hansen-Jagannathan distance with the p-value of Jagannathan and Wang (1996) by
Imhof's (1961) inversion integral (SciPy quad). sup-Wald of Andrews (1993) with Andrews-Fair Wald
statistics, critical values from a seeded simulation of its limit (10,000 draws, 2000 steps).

Usage:  peer.py fit MODEL_DIR/fit.toml [--json OUT] [--repeat N]
        peer.py supwald MODEL_DIR/supwald.toml [--json OUT]
The model files are the ones PeerWorkloads writes; only the data paths and the bandwidth are read.
NumPy and SciPy come from Debian as python3-numpy and python3-scipy.
"""
import json
import math
import os
import sys
import time

try:
    import numpy as np
    from scipy import integrate, stats
except ImportError:  # pragma: no cover - a message instead of a stack trace
    sys.exit("bench/peer.py needs NumPy and SciPy; on Debian: apt-get install python3-numpy python3-scipy")


def read_model(path):
    """The few keys of a PeerWorkloads model file: data paths and the bandwidth choice."""
    keys = {}
    for line in open(path, encoding="utf-8"):
        line = line.split("#", 1)[0].strip()
        if "=" in line:
            key, value = (part.strip() for part in line.split("=", 1))
            keys[key] = value.strip('"')
    folder = os.path.dirname(os.path.abspath(path))
    lags = int(keys["lags"]) if "lags" in keys else None
    return os.path.join(folder, keys["returns"]), os.path.join(folder, keys["factors"]), lags


def read_csv(path):
    with open(path, encoding="utf-8") as handle:
        header = handle.readline().strip().split(",")
    values = np.loadtxt(path, delimiter=",", skiprows=1, usecols=range(1, len(header)))
    dates = np.loadtxt(path, delimiter=",", skiprows=1, usecols=0, dtype=str)
    return list(dates), header[1:], np.atleast_2d(values)


def newey_west_bandwidth(u):
    t = u.shape[0]
    h = u.sum(axis=1)
    m = min(int(math.floor(4.0 * (t / 100.0) ** (2.0 / 9.0))), t - 1)
    sigma = np.array([h[j:] @ h[:t - j] / t for j in range(m + 1)])
    s0 = sigma[0] + 2.0 * sigma[1:].sum()
    s1 = 2.0 * (np.arange(1, m + 1) * sigma[1:]).sum()
    return 1.1447 * ((s1 / s0) ** 2) ** (1.0 / 3.0) * t ** (1.0 / 3.0)


def long_run(f, lags):
    """Centred Bartlett S of the rows of f; lags None means the Newey-West (1994) bandwidth."""
    t = f.shape[0]
    u = f - f.mean(axis=0)
    bandwidth = lags + 1.0 if lags is not None else newey_west_bandwidth(u)
    s = u.T @ u / t
    j = 1
    while j < bandwidth and j < t:
        gamma = u[j:].T @ u[:t - j] / t
        s += (1.0 - j / bandwidth) * (gamma + gamma.T)
        j += 1
    return s, bandwidth


def closed_form(g0, d, w):
    dw = d.T @ w
    return np.linalg.solve(dw @ d, -dw @ g0)


def moments(r, f, b):
    return r * (1.0 - f @ b)[:, None]


def estimate(r, f, lags, two_step):
    """b and its covariance; with full=True also what a fit reports."""
    t = r.shape[0]
    g0 = r.mean(axis=0)
    d = -(r.T @ f) / t
    k = r.shape[1]
    b1 = closed_form(g0, d, np.eye(k))
    s1, _ = long_run(moments(r, f, b1), lags)
    if not two_step:
        bread = np.linalg.inv(d.T @ d)
        return b1, bread @ d.T @ s1 @ d @ bread / t, None
    w2 = np.linalg.inv(s1)
    b2 = closed_form(g0, d, w2)
    s2, bandwidth = long_run(moments(r, f, b2), lags)
    cov = np.linalg.inv(d.T @ np.linalg.solve(s2, d)) / t
    return b2, cov, (g0, d, w2, s2, bandwidth)


def imhof_upper_tail(x, weights):
    """P(sum lambda_j z_j^2 >= x): Imhof (1961), equation 3.2, by adaptive quadrature."""
    lam = np.asarray(weights)

    def integrand(u):
        if u == 0.0:
            return 0.5 * (lam.sum() - x)
        theta = 0.5 * np.arctan(lam * u).sum() - 0.5 * x * u
        rho = np.exp(0.25 * np.log1p((lam * u) ** 2).sum())
        return math.sin(theta) / (u * rho)

    value, _ = integrate.quad(integrand, 0.0, np.inf, limit=500, epsabs=1e-10)
    return min(1.0, max(0.0, 0.5 + value / math.pi))


def fit(r, f, lags):
    """The full two-step fit: estimates, standard errors, J, pricing errors, joint test, HJ distance."""
    t, k = r.shape
    p = f.shape[1]
    b, cov, (g0, d, w2, s2, bandwidth) = estimate(r, f, lags, two_step=True)
    se = np.sqrt(np.diag(cov))
    g = g0 + d @ b
    j_stat = t * g @ w2 @ g
    a = np.eye(k) - d @ np.linalg.solve(d.T @ w2 @ d, d.T @ w2)
    var_g = a @ s2 @ a.T / t
    values, vectors = np.linalg.eigh(var_g)
    top = np.argsort(values)[::-1][:k - p]
    joint = float(sum((vectors[:, i] @ g) ** 2 / values[i] for i in top))
    second = r.T @ r / t
    g_inv = np.linalg.inv(second)
    b_hj = closed_form(g0, d, g_inv)
    g_hj = g0 + d @ b_hj
    delta2 = max(g_hj @ g_inv @ g_hj, 0.0)
    s_hj, _ = long_run(moments(r, f, b_hj), lags)
    gd = g_inv @ d
    middle = g_inv - gd @ np.linalg.solve(d.T @ gd, gd.T)
    chol = np.linalg.cholesky(s_hj)
    limit = np.sort(np.linalg.eigvalsh(chol.T @ middle @ chol))[::-1][:k - p]
    hj_p = imhof_upper_tail(t * delta2, np.clip(limit, 0.0, None))
    return {
        "bandwidth": bandwidth,
        "estimates": b.tolist(), "std_errors": se.tolist(),
        "p_values": (2 * stats.norm.sf(np.abs(b / se))).tolist(),
        "j": {"statistic": j_stat, "df": k - p, "p_value": stats.chi2.sf(j_stat, k - p)},
        "pricing_errors": g.tolist(), "pricing_error_std_errors": np.sqrt(np.clip(np.diag(var_g), 0, None)).tolist(),
        "joint": {"statistic": joint, "p_value": stats.chi2.sf(joint, k - p)},
        "hj": {"value": math.sqrt(delta2), "p_value": hj_p},
    }


def andrews_limit(parameters, trimming, draws=10_000, steps=2000, seed=19930701):
    """Sorted suprema of sum_k B_k(l)^2 / (l (1 - l)) over the trimmed grid, B_k Brownian bridges."""
    rng = np.random.default_rng(seed)
    first, last = int(math.ceil(trimming * steps)), int(math.floor((1 - trimming) * steps))
    grid = np.arange(first, last + 1) / steps
    suprema = np.empty(draws)
    chunk = 250
    for start in range(0, draws, chunk):
        n = min(chunk, draws - start)
        walk = np.cumsum(rng.standard_normal((n, parameters, steps)) * math.sqrt(1.0 / steps), axis=2)
        bridge = walk[:, :, first - 1:last] - grid * walk[:, :, -1:]
        suprema[start:start + n] = ((bridge ** 2).sum(axis=1) / (grid * (1 - grid))).max(axis=1)
    return np.sort(suprema)


def sup_wald(r, f, lags, two_step, dates, trimming=0.15):
    t = r.shape[0]
    edge = int(math.ceil(trimming * t))
    best, best_date, sequence = -math.inf, None, []
    for i in range(edge, t - edge + 1):
        b1, v1, _ = estimate(r[:i], f[:i], lags, two_step)
        b2, v2, _ = estimate(r[i:], f[i:], lags, two_step)
        diff = b2 - b1
        wald = float(diff @ np.linalg.solve(v1 + v2, diff))
        sequence.append(wald)
        if wald > best:
            best, best_date = wald, dates[i]
    return best, best_date, sequence


def main(argv):
    verb, model = argv[0], argv[1]
    out = argv[argv.index("--json") + 1] if "--json" in argv else None
    repeat = int(argv[argv.index("--repeat") + 1]) if "--repeat" in argv else 1
    returns_path, factors_path, lags = read_model(model)
    dates, _, r = read_csv(returns_path)
    _, _, f = read_csv(factors_path)
    if verb == "fit":
        times = []
        for _ in range(repeat):
            started = time.perf_counter()
            result = fit(r, f, lags)
            times.append(time.perf_counter() - started)
        result["fit_seconds"] = sorted(times)[len(times) // 2]
    elif verb == "supwald":
        limit = andrews_limit(f.shape[1], 0.15)
        result = {}
        for name, two_step in (("two_step", True), ("fixed_weight", False)):
            statistic, date, sequence = sup_wald(r, f, lags, two_step, dates)
            result[name] = {"statistic": statistic, "break_date": date, "sequence": sequence,
                            "critical_values": {level: float(limit[int(math.ceil((1 - float(level)) * limit.size)) - 1])
                                                for level in ("0.10", "0.05", "0.01")},
                            "p_value": float((limit >= statistic).mean())}
    else:
        sys.exit("usage: peer.py fit|supwald MODEL.toml [--json OUT] [--repeat N]")
    text = json.dumps(result, indent=1)
    if out:
        with open(out, "w", encoding="utf-8") as handle:
            handle.write(text + "\n")
    else:
        print(text)


if __name__ == "__main__":
    main(sys.argv[1:])
