#!/usr/bin/env python3
"""Makes tests/fixtures/healpix/*.csv with Debian's python3-healpy (the reference for our HEALPix code).

Positions: random on the sphere, the poles, RA = 0/360, Dec = 0, the polar-cap boundary (|z| = 2/3), and
pixel centres and boundaries. Run: /usr/bin/python3 tests/reference/make_healpix_fixtures.py
"""
import os
import numpy as np
import healpy as hp

root = os.environ.get("REPO_ROOT", os.path.join(os.path.dirname(__file__), "..", ".."))
out = os.path.join(root, "tests", "fixtures", "healpix")
os.makedirs(out, exist_ok=True)
rng = np.random.default_rng(20261202)


def positions():
    n = 400
    ra = rng.uniform(0, 360, n)
    dec = np.degrees(np.arcsin(rng.uniform(-1, 1, n)))
    zc = np.degrees(np.arcsin(2.0 / 3.0))
    edge_ra = [0.0, 359.9999999, 360.0 - 1e-12, 45.0, 90.0, 180.0, 270.0, 0.0, 0.0, 123.4, 211.0, 1e-9]
    edge_dec = [0.0, 0.0, 12.0, zc, -zc, 90.0, -90.0, 89.9999, -89.9999, zc + 1e-9, -zc - 1e-9, 41.8103148957786]
    return np.concatenate([ra, edge_ra]), np.concatenate([dec, edge_dec])


with open(os.path.join(out, "ang2pix.csv"), "w") as f:
    f.write(f"# made by make_healpix_fixtures.py with healpy {hp.__version__}, numpy {np.__version__}\n")
    f.write("order,ra,dec,pixel\n")
    ra, dec = positions()
    for order in [0, 1, 2, 5, 8, 12, 20, 29]:
        nside = 2 ** order
        pix = hp.ang2pix(nside, ra, dec, nest=True, lonlat=True)
        for a, d, p in zip(ra, dec, pix):
            f.write(f"{order},{a!r},{d!r},{p}\n")

with open(os.path.join(out, "pix2ang_neighbours.csv"), "w") as f:
    f.write(f"# made by make_healpix_fixtures.py with healpy {hp.__version__}, numpy {np.__version__}\n")
    f.write("order,pixel,ra,dec,n_sw,n_w,n_nw,n_n,n_ne,n_e,n_se,n_s\n")
    for order in [0, 1, 2, 3, 6, 10]:
        nside = 2 ** order
        npix = 12 * nside * nside
        pix = np.unique(np.concatenate([np.arange(min(npix, 200)), rng.integers(0, npix, 150), [npix - 1]]))
        ra, dec = hp.pix2ang(nside, pix, nest=True, lonlat=True)
        nb = hp.get_all_neighbours(nside, pix, nest=True)
        for k, p in enumerate(pix):
            f.write(f"{order},{p},{ra[k]!r},{dec[k]!r}," + ",".join(str(int(x)) for x in nb[:, k]) + "\n")
print("wrote", out)
