"""Reads the Lumen demo data the way the power-utility model file asks: monthly net portfolio returns
compounded to quarterly gross returns, and quarterly gross consumption growth on the same quarters.
Shared by the reference scripts of this folder; numpy only, no code of Orthogon's."""
import csv
import os

import numpy as np

ROOT = os.path.join(os.path.dirname(__file__), "..", "..", "..", "..", "..", "demo-data")


def _read(name):
    with open(os.path.join(ROOT, name)) as handle:
        rows = list(csv.reader(handle))
    return rows[0], rows[1:]


def power_utility_data():
    """(gross quarterly returns T x 12, gross consumption growth T, first quarter, last quarter)."""
    _, monthly = _read("lumen-portfolios-monthly.csv")
    net = np.array([[float(x) for x in row[1:]] for row in monthly])
    months = [row[0] for row in monthly]
    assert months[0].endswith("-01") and len(months) % 3 == 0
    quarters = len(months) // 3
    gross = np.prod(1.0 + net.reshape(quarters, 3, -1), axis=1)
    _, consumption = _read("lumen-consumption-quarterly.csv")
    labels = [row[0] for row in consumption]
    growth = np.array([float(row[1]) for row in consumption])
    first = months[0][:4] + "Q1"
    start = labels.index(first)
    growth = growth[start:start + quarters]
    assert len(growth) == quarters
    return gross, growth, labels[start], labels[start + quarters - 1]


def bartlett_s(u, lags):
    """Centered Newey-West S: Γ_0 + Σ_{j=1..L} (1 - j/(L+1)) (Γ_j + Γ_j'), Γ_j divided by T."""
    u = u - u.mean(axis=0)
    t = len(u)
    s = u.T @ u / t
    for j in range(1, lags + 1):
        gamma = u[j:].T @ u[:-j] / t
        s = s + (1.0 - j / (lags + 1.0)) * (gamma + gamma.T)
    return s
