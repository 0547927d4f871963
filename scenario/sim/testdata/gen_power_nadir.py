#!/usr/bin/python3
"""Reference orbit-average power of body-fixed panels in nadir pointing.

Run with Debian's interpreter:  /usr/bin/python3 scenario/sim/testdata/gen_power_nadir.py
Writes power_nadir.json next to this script.

An independent integration over one orbital period, written without any of
sunsight's code:

  orbit      two-body Kepler orbit from classical elements (Newton iteration
             on Kepler's equation, perifocal frame rotated by R3(-RAAN)
             R1(-i) R3(-w); Vallado, Fundamentals of Astrodynamics, 4th ed.,
             eq. 3-31), GM = 398600.4418 km^3/s^2 (WGS 84)
  time       UTC epoch -> TT with ERFA (eraDtf2d, eraUtctai, eraTaitt)
  sun        ERFA eraEpv00 heliocentric Earth (geometric distance), the
             astrometric direction with light time, annual aberration (eraAb)
             and the ICRS -> J2000 frame bias (eraBp00)
  shadow     conical: visible share of the solar disc behind the Earth's disc
             (area of the overlap of two circles of angular radii
             asin(R_sun/d_sun) and asin(R_E/r) at separation angle c),
             R_E = 6378.137 km, R_sun = 696000 km
  attitude   nadir: body +Z toward -r, +X along the velocity component
             perpendicular to +Z, +Y = Z x X
  power      P = S0 (1 au/d)^2 * lit * A * eta * f * max(0, n . s_body),
             S0 = 1361 W/m^2, 1 au = 149597870.7 km
  integral   composite Simpson rule on a 0.05 s grid over one period
             (scipy.integrate.simpson)

For each case and panel it writes the mean power over the period (W).
"""
import json
import os

import erfa
import numpy as np
from scipy.integrate import simpson

HERE = os.path.dirname(os.path.abspath(__file__))
MU = 398600.4418
RE = 6378.137
RSUN = 696000.0
S0 = 1361.0
AU = 149597870.7
C_AU_PER_DAY = erfa.DC

PANELS = [
    {"name": "along-track", "normal": [1, 0, 0]},
    {"name": "anti-track", "normal": [-1, 0, 0]},
    {"name": "orbit-normal", "normal": [0, 1, 0]},
    {"name": "anti-normal", "normal": [0, -1, 0]},
    {"name": "zenith", "normal": [0, 0, -1]},
    {"name": "nadir", "normal": [0, 0, 1]},
    {"name": "canted", "normal": [0.6, 0.0, -0.8]},
]
AREA, ETA, PACK = 0.0828, 0.295, 0.85

CASES = [
    {"name": "sso-550-march", "epoch": [2027, 3, 20, 6, 0, 0.0], "a_km": RE + 550.0, "e": 0.0015,
     "i_deg": 97.59, "raan_deg": 20.0, "argp_deg": 90.0, "m_deg": 10.0},
    {"name": "iss-like-july", "epoch": [2027, 7, 1, 12, 30, 0.0], "a_km": RE + 420.0, "e": 0.008,
     "i_deg": 51.6, "raan_deg": 250.0, "argp_deg": 30.0, "m_deg": 200.0},
    {"name": "high-beta-june", "epoch": [2027, 6, 21, 0, 0, 0.0], "a_km": RE + 700.0, "e": 0.0,
     "i_deg": 98.2, "raan_deg": 0.0, "argp_deg": 0.0, "m_deg": 0.0},
]


def kepler_states(c, t):
    a, e = c["a_km"], c["e"]
    i, O, w = (np.radians(c[k]) for k in ("i_deg", "raan_deg", "argp_deg"))
    n = np.sqrt(MU / a**3)
    M = np.radians(c["m_deg"]) + n * t
    E = M.copy()
    for _ in range(30):
        E -= (E - e * np.sin(E) - M) / (1 - e * np.cos(E))
    cE, sE = np.cos(E), np.sin(E)
    b = np.sqrt(1 - e * e)
    xp, yp = a * (cE - e), a * b * sE
    rr = a * (1 - e * cE)
    vxp, vyp = -np.sqrt(MU * a) / rr * sE, np.sqrt(MU * a) / rr * b * cE
    cO, sO, ci, si, cw, sw = np.cos(O), np.sin(O), np.cos(i), np.sin(i), np.cos(w), np.sin(w)
    P = np.array([cO * cw - sO * sw * ci, sO * cw + cO * sw * ci, sw * si])
    Q = np.array([-cO * sw - sO * cw * ci, -sO * sw + cO * cw * ci, cw * si])
    r = np.outer(xp, P) + np.outer(yp, Q)
    v = np.outer(vxp, P) + np.outer(vyp, Q)
    return r, v


def sun(jd_tt):
    pvh, pvb = erfa.epv00(jd_tt, 0.0)
    ph, pb, vb = pvh["p"], pvb["p"], pvb["v"]
    dist = np.linalg.norm(ph)
    tau = dist / C_AU_PER_DAY
    pvh2, pvb2 = erfa.epv00(jd_tt - tau, 0.0)
    p = (pvb2["p"] - pvh2["p"]) - pb
    pnat = p / np.linalg.norm(p)
    v = vb / C_AU_PER_DAY
    app = erfa.bp00(jd_tt, 0.0)[0] @ erfa.ab(pnat, v, dist, np.sqrt(1 - v @ v))
    return app / np.linalg.norm(app), dist * AU


def overlap_visible(a, b, c):
    """Visible share of a disc of radius a behind a disc of radius b, centres c apart (angles, rad)."""
    lit = np.ones_like(c)
    full = c <= b - a  # sun wholly behind the Earth
    lit[full] = 0.0
    annular = c <= a - b  # Earth wholly inside the sun's disc
    lit[annular] = 1 - (b[annular] / a[annular]) ** 2 if np.ndim(a) else 1 - (b[annular] / a) ** 2
    part = (c < a + b) & ~full & ~annular
    cp, bp = c[part], b[part]
    ap = a[part] if np.ndim(a) else a
    x = (cp**2 + ap**2 - bp**2) / (2 * cp)
    y = np.sqrt(np.maximum(ap**2 - x**2, 0))
    area = ap**2 * np.arccos(np.clip(x / ap, -1, 1)) + bp**2 * np.arccos(np.clip((cp - x) / bp, -1, 1)) - cp * y
    lit[part] = 1 - area / (np.pi * ap**2)
    return lit


def case_power(c):
    y, mo, d, h, mi, s = c["epoch"]
    u1, u2 = erfa.dtf2d("UTC", y, mo, d, h, mi, s)
    t1, t2 = erfa.taitt(*erfa.utctai(u1, u2))
    jd_tt0 = t1 + t2
    period = 2 * np.pi * np.sqrt(c["a_km"] ** 3 / MU)
    n = int(np.ceil(period / 0.05)) | 1  # odd count for Simpson
    t = np.linspace(0.0, period, n)
    r, v = kepler_states(c, t)
    # The sun moves 0.07 deg over an orbit: evaluate it every 10 s and
    # interpolate the unit vector and distance linearly.
    tk = np.arange(0.0, period + 10.0, 10.0)
    su = np.array([sun(jd_tt0 + x / 86400.0)[0] for x in tk])
    sd = np.array([sun(jd_tt0 + x / 86400.0)[1] for x in tk])
    s_dir = np.stack([np.interp(t, tk, su[:, k]) for k in range(3)], axis=1)
    s_dir /= np.linalg.norm(s_dir, axis=1)[:, None]
    s_dist = np.interp(t, tk, sd)
    # shadow
    rs = s_dir * s_dist[:, None]
    to_sun = rs - r
    dsun = np.linalg.norm(to_sun, axis=1)
    rn = np.linalg.norm(r, axis=1)
    a_ang = np.arcsin(RSUN / dsun)
    b_ang = np.arcsin(RE / rn)
    cosc = np.einsum("ij,ij->i", to_sun, -r) / (dsun * rn)
    c_ang = np.arccos(np.clip(cosc, -1, 1))
    lit = overlap_visible(a_ang, b_ang, c_ang)
    # nadir attitude
    z = -r / rn[:, None]
    vperp = v - np.einsum("ij,ij->i", v, z)[:, None] * z
    x = vperp / np.linalg.norm(vperp, axis=1)[:, None]
    yb = np.cross(z, x)
    sb = np.stack([np.einsum("ij,ij->i", x, s_dir), np.einsum("ij,ij->i", yb, s_dir),
                   np.einsum("ij,ij->i", z, s_dir)], axis=1)
    irr = S0 * (AU / s_dist) ** 2 * lit
    out = []
    for p in PANELS:
        nrm = np.array(p["normal"], float)
        nrm /= np.linalg.norm(nrm)
        pw = irr * AREA * ETA * PACK * np.maximum(0.0, sb @ nrm)
        out.append({"name": p["name"], "normal": p["normal"], "mean_w": simpson(pw, x=t) / period})
    return period, float(np.mean(lit < 1e-12)), out


cases = []
for c in CASES:
    period, umbra, panels = case_power(c)
    cases.append(dict(c, period_s=period, umbra_share=umbra, panels=panels))
    print(c["name"], "period %.3f s, umbra share %.4f" % (period, umbra),
          ", ".join("%s %.5f W" % (p["name"], p["mean_w"]) for p in panels))

with open(os.path.join(HERE, "power_nadir.json"), "w") as f:
    json.dump({"generator": "gen_power_nadir.py", "erfa": erfa.__version__, "numpy": np.__version__,
               "area_m2": AREA, "efficiency": ETA, "packing_factor": PACK, "cases": cases}, f, indent=1)
    f.write("\n")
