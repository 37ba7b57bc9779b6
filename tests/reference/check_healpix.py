#!/usr/bin/env python3
"""Live check of our HEALPix nested indexing against Debian's python3-healpy, through the `healpix` verb.

Random positions plus the poles, RA = 0/360 and the polar-cap boundary, at several orders.
Prints one PASS/FAIL line per order; exits non-zero on any failure.
"""
import csv, os, subprocess, sys, tempfile
import numpy as np
import healpy as hp

cli = os.environ["PHOTOMETALLICITY"]
rng = np.random.default_rng(7)
n = 20000
ra = np.concatenate([rng.uniform(0, 360, n), [0.0, 359.999999999, 180.0, 45.0, 90.0, 0.0, 0.0]])
dec = np.concatenate([np.degrees(np.arcsin(rng.uniform(-1, 1, n))),
                      [0.0, 0.0, 90.0, -90.0, np.degrees(np.arcsin(2 / 3)), 89.99999, -89.99999]])
failed = 0
with tempfile.TemporaryDirectory() as d:
    src = os.path.join(d, "pos.csv")
    with open(src, "w", newline="") as f:
        w = csv.writer(f)
        w.writerow(["ra", "dec"])
        for a, b in zip(ra, dec):
            w.writerow([repr(float(a)), repr(float(b))])
    for order in [0, 3, 8, 13, 20, 29]:
        out = os.path.join(d, f"pix{order}.csv")
        r = subprocess.run([cli, "healpix", src, "--order", str(order), "--out", out], capture_output=True, text=True)
        if r.returncode != 0:
            print(f"FAIL healpix order {order}: exit {r.returncode}: {r.stderr.strip()}")
            failed += 1
            continue
        with open(out) as f:
            ours = np.array([int(row["healpix_nested"]) for row in csv.DictReader(f)])
        ref = hp.ang2pix(2 ** order, ra, dec, nest=True, lonlat=True)
        bad = int(np.sum(ours != ref))
        if bad == 0:
            print(f"PASS healpix order {order}: {len(ref)} positions equal to healpy {hp.__version__} ang2pix(nest=True)")
        else:
            print(f"FAIL healpix order {order}: {bad} of {len(ref)} positions differ from healpy")
            failed += 1
sys.exit(1 if failed else 0)
