#!/usr/bin/python3
"""Independent brute-force reference: Earth albedo on the four cells of a
four-quadrant sun sensor, through the sensor's own cell responses.

For every direction d seen from the spacecraft that meets the Earth, the
Lambertian radiance L = rho * S * max(N.s, 0) / pi (Bhanderi & Bak, AIAA GNC
2005, from memory) is weighted by each cell's response to a collimated beam
from d, and integrated over the solid angle:

    E_i = integral of L(d) * cos(theta) * area_i(d) / norm  dOmega

with area_i the lit area of cell i (A top-left, B top-right, C bottom-right,
D bottom-left, sensor x right, y up), from elementary geometry:

  aperture: a square aperture of side w at height h above four cells of side
    c with a cross gap g; the spot of side w is centred at -h*tan(alpha) per
    axis; norm = w^2.
  wall: a cross-shaped wall of height H in the gap, cells' inner edges at a
    distance d from it; the wall's shadow covers [-H*tan(alpha), 0] per axis
    (full length); norm = 4 c^2.

The lit area of a cell is the product of the lit lengths along x and y.
Frame: spacecraft at (0, 0, r), nadir -z, sun along (sin zeta, 0, cos zeta);
the sensor boresight is tilted by tau from nadir toward azimuth psi from the
sun's azimuth, its x axis is turned by kappa about the boresight from the
projection of +z (or +x for the nadir boresight).  Uniform rho = 0.30,
S = 1361 W/m^2.

Quadrature as gen_albedo_ref.py: midpoint rule in azimuth and in s, nadir
angle alpha = eta (1 - s^2), eta = asin(Re/r).  Convergence: n = 1500 and
3000 points per axis; the largest relative change of the cell sum is
printed.  The CSV holds the n = 3000 values.

Run with Debian's interpreter:
    /usr/bin/python3 gen_quadrant_ref.py > gen_quadrant_ref.log
Writes quadrant_albedo_ref.csv next to this script.
"""
import functools
import os
import numpy as np

RE = 6378.137          # km, WGS 84 semi-major axis (NIMA TR8350.2)
S = 1361.0             # W/m^2, Kopp & Lean 2011
RHO = 0.30

SENSORS = [
    # name, geometry, w (aperture) or d (wall), h, c, g
    ("aperture", "aperture", 2.0, 1.2, 2.0, 0.1),
    ("wide", "aperture", 3.0, 1.0, 1.0, 0.0),
    ("wall", "wall", 1.1547005383792515, 2.0, 3.0, 0.0),
]
ALT = 550.0
ZETAS = [20.0, 60.0, 85.0]
TILTS = [0.0, 40.0, 75.0]
PSIS = [0.0, 120.0]
KAPPAS = [0.0, 30.0]


def overlap(a0, a1, b0, b1):
    return np.maximum(0.0, np.minimum(a1, b1) - np.maximum(a0, b0))


def lit_lengths(kind, t, p1, h, c, g):
    """Lit lengths of the negative and positive cells along one axis for a
    sun at tangent t."""
    if kind == "aperture":
        w = p1
        cx = -h * t
        return (overlap(cx - w / 2, cx + w / 2, -g / 2 - c, -g / 2),
                overlap(cx - w / 2, cx + w / 2, g / 2, g / 2 + c))
    d = p1
    b0 = np.minimum(0.0, -h * t)
    b1 = np.maximum(0.0, -h * t)
    return c - overlap(b0, b1, -d - c, -d), c - overlap(b0, b1, d, d + c)


def frame(tau, psi, kappa):
    n = np.array([np.sin(tau) * np.cos(psi), np.sin(tau) * np.sin(psi), -np.cos(tau)])
    ref = np.array([0.0, 0.0, 1.0]) if abs(n[2]) < 0.9 else np.array([1.0, 0.0, 0.0])
    x = ref - np.dot(ref, n) * n
    x /= np.linalg.norm(x)
    y = np.cross(n, x)
    xk = np.cos(kappa) * x + np.sin(kappa) * y
    yk = np.cross(n, xk)
    return xk, yk, n


@functools.lru_cache(maxsize=2)
def grid(n):
    """Directions from the spacecraft to the Earth, their weights (solid
    angle) and the surface points hit."""
    r = RE + ALT
    eta = np.arcsin(RE / r)
    s = (np.arange(n) + 0.5) / n
    alpha = eta * (1.0 - s * s)
    dalpha = 2.0 * eta * s
    phi = (np.arange(n) + 0.5) * 2.0 * np.pi / n
    A, PH = np.meshgrid(alpha, phi, indexing="ij")
    W = np.sin(A) * np.outer(dalpha, np.ones(n)) * (1.0 / n) * (2.0 * np.pi / n)
    dx, dy, dz = np.sin(A) * np.cos(PH), np.sin(A) * np.sin(PH), -np.cos(A)
    t = r * np.cos(A) - np.sqrt(np.maximum(RE * RE - r * r * np.sin(A) ** 2, 0.0))
    px, py, pz = t * dx, t * dy, r + t * dz
    return W, dx, dy, dz, px, pz


def integrate(sensor, zeta, tau, psi, kappa, n):
    _, kind, p1, h, c, g = sensor
    W, dx, dy, dz, px, pz = grid(n)
    cs = (px * np.sin(zeta) + pz * np.cos(zeta)) / RE
    L = RHO * S * np.maximum(cs, 0.0) / np.pi
    x, y, nb = frame(tau, psi, kappa)
    sx = dx * x[0] + dy * x[1] + dz * x[2]
    sy = dx * y[0] + dy * y[1] + dz * y[2]
    sz = dx * nb[0] + dy * nb[1] + dz * nb[2]
    ok = sz > 1e-12
    szs = np.where(ok, sz, 1.0)
    l, rr = lit_lengths(kind, sx / szs, p1, h, c, g)
    b, tp = lit_lengths(kind, sy / szs, p1, h, c, g)
    norm = p1 * p1 if kind == "aperture" else 4 * c * c
    k = np.where(ok, L * sz * W / norm, 0.0)
    return [float(np.sum(k * l * tp)), float(np.sum(k * rr * tp)), float(np.sum(k * rr * b)), float(np.sum(k * l * b))]


def main():
    here = os.path.dirname(os.path.abspath(__file__))
    rows, worst = [], 0.0
    for sn in SENSORS:
        for zeta in ZETAS:
            for tau in TILTS:
                for psi in PSIS:
                    if tau == 0.0 and psi != 0.0:
                        continue
                    for kappa in KAPPAS:
                        args = (sn, np.radians(zeta), np.radians(tau), np.radians(psi), np.radians(kappa))
                        e2 = integrate(*args, 1500)
                        e4 = integrate(*args, 3000)
                        tot = sum(e4)
                        if tot > 0:
                            worst = max(worst, abs(sum(e2) - tot) / tot)
                        rows.append((sn[0], zeta, tau, psi, kappa, *e4))
    print("largest relative change of the cell sum from n = 1500 to 3000: %.2e" % worst)
    with open(os.path.join(here, "quadrant_albedo_ref.csv"), "w") as f:
        f.write("sensor,zeta_deg,tilt_deg,psi_deg,kappa_deg,e_a,e_b,e_c,e_d\n")
        for r in rows:
            f.write("%s,%g,%g,%g,%g,%.10g,%.10g,%.10g,%.10g\n" % r)
    print("%d cases written" % len(rows))


if __name__ == "__main__":
    main()
