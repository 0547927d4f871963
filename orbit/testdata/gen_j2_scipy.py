#!/usr/bin/python3
"""Independent reference for orbit.J2Numeric.

Integrates point mass + J2 (the equations written out again here, not taken
from the Go code) with scipy.integrate.solve_ivp, method DOP853, rtol 1e-12,
atol 1e-12, from the initial osculating states in j2_initial.csv, for 3 days,
and writes the position every 10 minutes to j2_scipy.csv.

Constants: mu = 398600.4418 km^3/s^2 and R = 6378.137 km (WGS 84, NIMA
TR8350.2 3rd ed.), J2 = 1.08262668e-3 (EGM96 tide-free, from memory).
Run with Debian's interpreter: /usr/bin/python3 orbit/testdata/gen_j2_scipy.py
"""
import csv
import os

import numpy as np
import scipy
from scipy.integrate import solve_ivp

MU = 398600.4418
RE = 6378.137
J2 = 1.08262668e-3
HERE = os.path.dirname(os.path.abspath(__file__))


def rhs(_t, y):
    x, yy, z = y[0], y[1], y[2]
    r2 = x * x + yy * yy + z * z
    r = np.sqrt(r2)
    # a = -mu r/r^3 + 1.5 J2 mu R^2 / r^5 (x(5z^2/r^2-1), y(5z^2/r^2-1), z(5z^2/r^2-3))
    k = 1.5 * J2 * MU * RE * RE / r ** 5
    f = 5 * z * z / r2
    return [y[3], y[4], y[5],
            -MU * x / r ** 3 + k * x * (f - 1),
            -MU * yy / r ** 3 + k * yy * (f - 1),
            -MU * z / r ** 3 + k * z * (f - 3)]


def main():
    with open(os.path.join(HERE, "j2_initial.csv")) as f:
        rows = [r for r in csv.reader(f) if r and not r[0].startswith("#")][1:]
    times = np.arange(0, 3 * 86400 + 1, 600.0)
    out = os.path.join(HERE, "j2_scipy.csv")
    with open(out + ".tmp", "w") as f:
        f.write("# scipy %s solve_ivp DOP853 rtol=1e-12 atol=1e-12; point mass + J2; written by gen_j2_scipy.py\n" % scipy.__version__)
        f.write("case,t_s,x_km,y_km,z_km\n")
        for row in rows:
            y0 = [float(v) for v in row[1:7]]
            sol = solve_ivp(rhs, (0, times[-1]), y0, method="DOP853", t_eval=times, rtol=1e-12, atol=1e-12)
            assert sol.success, sol.message
            for i, t in enumerate(sol.t):
                f.write("%s,%.1f,%.12f,%.12f,%.12f\n" % (row[0], t, sol.y[0, i], sol.y[1, i], sol.y[2, i]))
    os.replace(out + ".tmp", out)


if __name__ == "__main__":
    main()
