#!/usr/bin/python3
"""Sky share of one sensor on a box-shaped bus, by Monte Carlo (numpy).

Independent of sunsight's code: directions are drawn uniformly on the sphere
(normalised Gaussian triples), and a direction counts as seen when it lies in
the sensor's circular field of view, in front of the plane of the surface the
sensor sits on, and the ray from the sensor's position does not meet the bus,
a solid axis-aligned box centred on the body origin (slab test, t > 1e-9).

Writes occlusion_mc.csv: the geometry of each case (body axes, metres) and
the fraction seen with its 1-sigma sampling error. Run from this folder:
    /usr/bin/python3 gen_occlusion_mc.py
"""
import numpy as np

N = 4_000_000
rng = np.random.default_rng(20261202)

def unit(v):
    v = np.asarray(v, float)
    return v / np.linalg.norm(v)

def tilt(normal, toward, deg):
    # Boresight tilted from the face normal toward another axis.
    a = np.radians(deg)
    return np.cos(a) * np.asarray(normal, float) + np.sin(a) * np.asarray(toward, float)

SIZE_3U = (0.1, 0.1, 0.3405)
SIZE_6U = (0.2263, 0.1, 0.366)
CASES = [
    # name, size, position, boresight, mounting-plane normal (zero: none), half-angle
    ("tilted-px-3u", SIZE_3U, (0.05, 0, 0), tilt((1, 0, 0), (0, 0, 1), 45), (1, 0, 0), 80),
    ("tilted-pz-6u-offcentre", SIZE_6U, (0.08, -0.03, 0.183), tilt((0, 0, 1), (1, 0, 0), 60), (0, 0, 1), 70),
    ("boom-facing-bus-6u", SIZE_6U, (0.25, 0, 0.1), unit((-1, 0, 0.3)), unit((-1, 0, 0.3)), 80),
]

def seen(d, size, pos, bore, normal, half):
    h = 0.5 * np.asarray(size)
    p = np.asarray(pos, float)
    ok = d @ unit(bore) >= np.cos(np.radians(half))
    n = np.asarray(normal, float)
    if np.any(n != 0):
        ok &= d @ n > 0
    lo = np.full(len(d), 1e-9)
    hi = np.full(len(d), np.inf)
    hit = np.ones(len(d), bool)
    for k in range(3):
        v = d[:, k]
        with np.errstate(divide="ignore", invalid="ignore"):
            t1 = (-h[k] - p[k]) / v
            t2 = (h[k] - p[k]) / v
        par = v == 0
        inside = (p[k] >= -h[k]) & (p[k] <= h[k])
        hit &= ~par | inside
        a = np.where(par, -np.inf, np.minimum(t1, t2))
        b = np.where(par, np.inf, np.maximum(t1, t2))
        lo = np.maximum(lo, a)
        hi = np.minimum(hi, b)
    hit &= lo <= hi
    return ok & ~hit

with open("occlusion_mc.csv", "w") as out:
    out.write("# sky share seen by one sensor on a box bus; numpy Monte Carlo, N = %d uniform directions\n" % N)
    out.write("case,size_x_m,size_y_m,size_z_m,pos_x_m,pos_y_m,pos_z_m,bore_x,bore_y,bore_z,plane_x,plane_y,plane_z,half_angle_deg,fraction,sigma\n")
    for name, size, pos, bore, normal, half in CASES:
        g = rng.standard_normal((N, 3))
        d = g / np.linalg.norm(g, axis=1)[:, None]
        f = seen(d, size, pos, bore, normal, half).mean()
        b = unit(bore)
        row = [name, *size, *pos, *b, *normal, half, f, np.sqrt(f * (1 - f) / N)]
        out.write(",".join(str(x) if isinstance(x, str) else "%.10g" % x for x in row) + "\n")
        print(name, f)
