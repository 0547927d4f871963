#!/usr/bin/python3
"""Reference SGP4/SDP4 states for the verification element sets of
Vallado, Crawford, Hujsak & Kelso (2006), "Revisiting Spacetrack Report #3",
AIAA 2006-6753, computed with Debian's python3-sgp4 (the general-purpose
implementation of that paper's code), WGS 72 constants, "improved" mode.

Reads SGP4-VER.TLE as shipped with python3-sgp4 (the paper's verification
file: each line 2 carries start, stop and step in minutes) and writes:

  sgp4_elements.csv  catalog, line1, line2, epoch_days_1950, no_kozai_rad_min,
                     ecco, inclo_rad, nodeo_rad, argpo_rad, mo_rad, bstar
  sgp4_states.csv    catalog, tsince_min, error, x_km, y_km, z_km,
                     vx_km_s, vy_km_s, vz_km_s   (TEME of date)

Run: apt-get install -y python3-sgp4; /usr/bin/python3 gen_sgp4_ref.py
"""
import os
import sgp4
from sgp4.api import Satrec, WGS72

here = os.path.dirname(os.path.abspath(__file__))
src = os.path.join(os.path.dirname(sgp4.__file__), "SGP4-VER.TLE")
lines = [l.rstrip("\n") for l in open(src) if not l.startswith("#") and l.strip()]
el = open(os.path.join(here, "sgp4_elements.csv"), "w")
st = open(os.path.join(here, "sgp4_states.csv"), "w")
el.write("catalog,line1,line2,epoch_days_1950,no_kozai_rad_min,ecco,inclo_rad,nodeo_rad,argpo_rad,mo_rad,bstar\n")
st.write("catalog,tsince_min,error,x_km,y_km,z_km,vx_km_s,vy_km_s,vz_km_s\n")
for i in range(0, len(lines), 2):
    l1, l2full = lines[i], lines[i + 1]
    l2 = l2full[:69]
    start, stop, step = (float(x) for x in l2full[69:].split()[:3])
    sat = Satrec.twoline2rv(l1, l2, WGS72)
    cat = l1[2:7].strip()
    epoch = (sat.jdsatepoch - 2433281.5) + sat.jdsatepochF
    el.write("%s,%s,%s,%.12f,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g\n" % (
        cat, l1.replace(",", " "), l2, epoch, sat.no_kozai, sat.ecco, sat.inclo,
        sat.nodeo, sat.argpo, sat.mo, sat.bstar))
    ts = []
    t = start
    while (step > 0 and t <= stop + 1e-9) or (step < 0 and t >= stop - 1e-9):
        ts.append(t)
        t += step
    if ts[-1] != stop:
        ts.append(stop)
    for t in ts:
        e, r, v = sat.sgp4_tsince(t)
        st.write("%s,%.8f,%d,%.9f,%.9f,%.9f,%.12f,%.12f,%.12f\n" % ((cat, t, e) + tuple(r) + tuple(v)))
        if e != 0:
            break

# EME2000 states of two sets (near-Earth 06251, 12 h Molniya 09880) every
# 6 h over 2 days from the element epoch: TEME rotated by ERFA's
# pmat76^T . numat^T . R3(-dpsi cos epsa) at the sample's TT date.
import erfa
import numpy as np
with open(os.path.join(here, "sgp4_eme2000.csv"), "w") as f:
    f.write("catalog,tsince_min,x_km,y_km,z_km,vx_km_s,vy_km_s,vz_km_s\n")
    for i in range(0, len(lines), 2):
        l1, l2 = lines[i], lines[i + 1][:69]
        cat = l1[2:7].strip()
        if cat not in ("06251", "09880"):
            continue
        sat = Satrec.twoline2rv(l1, l2, WGS72)
        for k in range(9):
            t = k * 360.0
            e, r, v = sat.sgp4_tsince(t)
            jd1, jd2 = sat.jdsatepoch, sat.jdsatepochF + t / 1440.0
            tai1, tai2 = erfa.utctai(jd1, jd2)
            tt1, tt2 = erfa.taitt(tai1, tai2)
            p = erfa.pmat76(tt1, tt2)
            dpsi, deps = erfa.nut80(tt1, tt2)
            epsa = erfa.obl80(tt1, tt2)
            n = erfa.numat(epsa, dpsi, deps)
            m = p.T @ n.T @ erfa.rz(-(dpsi * np.cos(epsa)), np.identity(3))
            R, V = m @ np.array(r), m @ np.array(v)
            f.write("%s,%.1f,%.9f,%.9f,%.9f,%.12f,%.12f,%.12f\n" % ((cat, t) + tuple(R) + tuple(V)))
