"""Solve the bench's stiff ODE problems with SciPy's solve_ivp (Radau and BDF)
and print one JSON object per run on stdout. Called by bench/scipy.ts; run by
hand as: python3 bench/scipy_compare.py RTOL ATOL REPEATS [PROBLEM...]

Equations: Mazzia and Magherini, Test Set for IVP Solvers, release 2.4
(ROBER, VDPOL, HIRES, RINGMOD), the same as test/solver/fixtures/test-set.ts.
"""
import json
import math
import sys
import time

import numpy as np
from scipy.integrate import solve_ivp


def rober(t, y):
    return [-0.04 * y[0] + 1e4 * y[1] * y[2],
            0.04 * y[0] - 1e4 * y[1] * y[2] - 3e7 * y[1] ** 2,
            3e7 * y[1] ** 2]


def rober_jac(t, y):
    return [[-0.04, 1e4 * y[2], 1e4 * y[1]],
            [0.04, -1e4 * y[2] - 6e7 * y[1], -1e4 * y[1]],
            [0, 6e7 * y[1], 0]]


MU = 1000.0


def vdpol(t, y):
    return [y[1], MU * (1 - y[0] ** 2) * y[1] - y[0]]


def vdpol_jac(t, y):
    return [[0, 1], [-2 * MU * y[0] * y[1] - 1, MU * (1 - y[0] ** 2)]]


def hires(t, y):
    y1, y2, y3, y4, y5, y6, y7, y8 = y
    return [-1.71 * y1 + 0.43 * y2 + 8.32 * y3 + 0.0007,
            1.71 * y1 - 8.75 * y2,
            -10.03 * y3 + 0.43 * y4 + 0.035 * y5,
            8.32 * y2 + 1.71 * y3 - 1.12 * y4,
            -1.745 * y5 + 0.43 * y6 + 0.43 * y7,
            -280 * y6 * y8 + 0.69 * y4 + 1.71 * y5 - 0.43 * y6 + 0.69 * y7,
            280 * y6 * y8 - 1.81 * y7,
            -280 * y6 * y8 + 1.81 * y7]


def hires_jac(t, y):
    J = np.zeros((8, 8))
    J[0, 0:3] = [-1.71, 0.43, 8.32]
    J[1, 0:2] = [1.71, -8.75]
    J[2, 2:5] = [-10.03, 0.43, 0.035]
    J[3, 1:4] = [8.32, 1.71, -1.12]
    J[4, 4:7] = [-1.745, 0.43, 0.43]
    J[5, 3:8] = [0.69, 1.71, -280 * y[7] - 0.43, 0.69, -280 * y[5]]
    J[6, 5:8] = [280 * y[7], -1.81, 280 * y[5]]
    J[7, 5:8] = [-280 * y[7], 1.81, -280 * y[5]]
    return J


C, Cs, Cp, R, Rp, Lh = 1.6e-8, 2e-12, 1e-8, 25e3, 50.0, 4.45
Ls1, Ls2, Ls3, Rg1, Rg2, Rg3, Ri, Rc = 2e-3, 5e-4, 5e-4, 36.3, 17.3, 17.3, 50.0, 600.0
GAMMA, DELTA = 40.67286402e-9, 17.7493332


def ringmod(t, y):
    q = lambda u: GAMMA * (math.exp(min(DELTA * u, 700.0)) - 1)
    uin1 = 0.5 * math.sin(2e3 * math.pi * t)
    uin2 = 2 * math.sin(2e4 * math.pi * t)
    y1, y2, y3, y4, y5, y6, y7, y8, y9, y10, y11, y12, y13, y14, y15 = y
    q1 = q(y3 - y5 - y7 - uin2)
    q2 = q(-y4 + y6 - y7 - uin2)
    q3 = q(y4 + y5 + y7 + uin2)
    q4 = q(-y3 - y6 + y7 + uin2)
    return [(y8 - 0.5 * y10 + 0.5 * y11 + y14 - y1 / R) / C,
            (y9 - 0.5 * y12 + 0.5 * y13 + y15 - y2 / R) / C,
            (y10 - q1 + q4) / Cs,
            (-y11 + q2 - q3) / Cs,
            (y12 + q1 - q3) / Cs,
            (-y13 - q2 + q4) / Cs,
            (-y7 / Rp + q1 + q2 - q3 - q4) / Cp,
            -y1 / Lh, -y2 / Lh,
            (0.5 * y1 - y3 - Rg2 * y10) / Ls2,
            (-0.5 * y1 + y4 - Rg3 * y11) / Ls3,
            (0.5 * y2 - y5 - Rg2 * y12) / Ls2,
            (-0.5 * y2 + y6 - Rg3 * y13) / Ls3,
            (-y1 + uin1 - (Ri + Rg1) * y14) / Ls1,
            (-y2 - (Rc + Rg1) * y15) / Ls1]


PROBLEMS = {
    'ROBER': (rober, rober_jac, [1.0, 0.0, 0.0], 1e11),
    'VDPOL': (vdpol, vdpol_jac, [2.0, 0.0], 2000.0),
    'HIRES': (hires, hires_jac, [1, 0, 0, 0, 0, 0, 0, 0.0057], 321.8122),
    'RINGMOD': (ringmod, None, [0.0] * 15, 1e-3),
}


def main():
    rtol = float(sys.argv[1])
    atol = float(sys.argv[2])
    repeats = int(sys.argv[3])
    names = sys.argv[4:] or list(PROBLEMS)
    for name in names:
        fun, jac, y0, t_end = PROBLEMS[name]
        for method in ('Radau', 'BDF'):
            times = []
            sol = None
            for _ in range(repeats):
                t0 = time.perf_counter()
                kw = {'jac': jac} if jac is not None else {}
                sol = solve_ivp(fun, (0.0, t_end), y0, method=method, rtol=rtol, atol=atol, **kw)
                times.append((time.perf_counter() - t0) * 1000)
            times.sort()
            print(json.dumps({
                'problem': name, 'method': method, 'status': int(sol.status),
                'steps': int(len(sol.t) - 1), 'nfev': int(sol.nfev), 'njev': int(sol.njev), 'nlu': int(sol.nlu),
                'ms': times[len(times) // 2], 'y': [float(v) for v in sol.y[:, -1]],
            }), flush=True)


if __name__ == '__main__':
    main()
