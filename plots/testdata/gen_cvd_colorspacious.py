#!/usr/bin/python3
"""Reference colour-vision simulation of the sky-map classes.

For each colour of the sky-map palette (plots/skymap.go: coverageColours and
blindHatch) writes its CIELAB (D65) and its appearance under full
deuteranopia and protanopia (Machado, Oliveira and Fernandes 2009, severity
100) with the colorspacious library (Debian python3-colorspacious), as sRGB
in 0..1 before clipping.

Run: /usr/bin/python3 plots/testdata/gen_cvd_colorspacious.py > plots/testdata/cvd_colorspacious.csv
"""
import numpy as np
from colorspacious import cspace_convert

palette = [(38, 12, 8), (59, 82, 139), (33, 145, 140), (94, 201, 98), (253, 231, 37), (230, 97, 40)]
print("r,g,b,L,a,b_star,deut_r,deut_g,deut_b,prot_r,prot_g,prot_b")
for c in palette:
    s = np.array(c, dtype=float) / 255
    lab = cspace_convert(s, "sRGB1", "CIELab")
    d = cspace_convert(s, {"name": "sRGB1+CVD", "cvd_type": "deuteranomaly", "severity": 100}, "sRGB1")
    p = cspace_convert(s, {"name": "sRGB1+CVD", "cvd_type": "protanomaly", "severity": 100}, "sRGB1")
    print(",".join(str(v) for v in list(c) + ["%.6f" % v for v in list(lab) + list(d) + list(p)]))
