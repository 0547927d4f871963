#!/usr/bin/python3
"""Demo reflectivity grid for sunsight/illum/albedo (demo data, not measured).

Derived from the zonal model of Knocke, Ries & Tapley 1988 (AIAA 88-4292) as
reproduced in ECSS-E-ST-10-04C Annex F.5 (coefficients from memory):
rho = a0 + a1(t) P1(sin lat) + a2 P2(sin lat), a0 = 0.34, a2 = 0.29,
a1 = 0.10 cos(2 pi (JD - 2444960.5) / 365.25), evaluated on the 15th of each
month of 2025 at 0h, on a 15 deg x 30 deg grid of cell centres.  An invented
longitude ripple of +-0.03 (cos 2 lon) is added so that the longitude
lookup is exercised; it is not geography.

Run:  /usr/bin/python3 gen_demo_grid.py   (writes demo_grid.csv)
"""
import math
import os

JD_JAN0_2025 = 2460676.5  # 2025-01-01 00:00


def day_of_year_15th(month):
    days = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31]
    return sum(days[: month - 1]) + 14


def main():
    lats = [-90 + 7.5 + 15 * i for i in range(12)]
    lons = [-180 + 15 + 30 * j for j in range(12)]
    path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "demo_grid.csv")
    with open(path, "w") as f:
        f.write("# demo reflectivity grid written by gen_demo_grid.py: zonal model + invented ripple, not measured data\n")
        f.write("month,lat_deg," + ",".join("%g" % x for x in lons) + "\n")
        for m in range(1, 13):
            jd = JD_JAN0_2025 + day_of_year_15th(m)
            a1 = 0.10 * math.cos(2 * math.pi * (jd - 2444960.5) / 365.25)
            for lat in lats:
                x = math.sin(math.radians(lat))
                base = 0.34 + a1 * x + 0.29 * 0.5 * (3 * x * x - 1)
                vals = [min(1, max(0, base + 0.03 * math.cos(2 * math.radians(lon)))) for lon in lons]
                f.write("%d,%g," % (m, lat) + ",".join("%.4f" % v for v in vals) + "\n")
    print("wrote", path)


if __name__ == "__main__":
    main()
