#!/usr/bin/env python3
"""Live check of the survey tiling against Debian's python3-healpy and python3-astropy, through the `split` verb.

On the committed invented field (samples/), at two HEALPix orders:
- every broadband row is owned (ring 0) by exactly one tile;
- the owning tile's pixel is healpy's ang2pix(nest=True) of the row's position at the plan's order;
- every narrow-band source within the plan's margin of an owned row (astropy search_around_sky) is in the tile.
The tile tables are read with astropy.io.fits. One PASS/FAIL line per check.
"""
import json, os, subprocess, sys, tempfile
import numpy as np
import healpy as hp
from astropy.io import fits
from astropy.coordinates import SkyCoord, search_around_sky
import astropy.units as u

cli = os.environ["PHOTOMETALLICITY"]
root = os.environ.get("REPO_ROOT", os.path.join(os.path.dirname(__file__), "..", ".."))
config = os.path.join(root, "samples", "config.json")
failed = 0
narrow = np.genfromtxt(os.path.join(root, "samples", "narrow.csv"), delimiter=",", names=True, dtype=None, encoding="utf-8")
all_narrow = (np.asarray(narrow["ra"], float), np.asarray(narrow["dec"], float))


def report(ok, text):
    global failed
    print(("PASS " if ok else "FAIL ") + text)
    failed += 0 if ok else 1


for order in [6, 8]:
    with tempfile.TemporaryDirectory() as d:
        work = os.path.join(d, "work")
        r = subprocess.run([cli, "split", config, "--order", str(order), "--out", work], capture_output=True, text=True)
        if r.returncode != 0:
            report(False, f"split order {order}: exit {r.returncode}: {r.stderr.strip()[-400:]}")
            continue
        plan = json.load(open(os.path.join(work, "plan.json")))
        margin = plan["margin_arcsec"]
        owners = np.zeros(plan["broadband_rows"], dtype=int)
        wrong_pixel = 0
        missing = 0
        for t in plan["tiles"]:
            tdir = os.path.join(work, "tiles", f"{t['index']:05d}")
            b = fits.getdata(os.path.join(tdir, "broadband.fits"), 1)
            n = fits.getdata(os.path.join(tdir, "narrowband.fits"), 1)
            own = b["pm_tile_ring"] == 0
            owners[b["pm_tile_row"][own]] += 1
            pix = hp.ang2pix(2 ** order, b["ra"][own], b["dec"][own], nest=True, lonlat=True)
            wrong_pixel += int(np.sum(pix != t["pixel"]))
            if len(n) == 0 or not np.any(own):
                continue
            # every narrow source of the whole field within the margin of an owned row must be in the tile
            in_tile = set(n["pm_tile_row"].tolist())
            whole_ra, whole_dec = all_narrow
            c1 = SkyCoord(b["ra"][own] * u.deg, b["dec"][own] * u.deg)
            c2 = SkyCoord(whole_ra * u.deg, whole_dec * u.deg)
            _, j, _, _ = search_around_sky(c1, c2, margin * u.arcsec)
            missing += sum(1 for k in set(j.tolist()) if k not in in_tile)
        report(np.all(owners == 1), f"tiling order {order}: every one of {len(owners)} broadband rows owned by exactly one of {len(plan['tiles'])} tiles")
        report(wrong_pixel == 0, f"tiling order {order}: owned rows lie in their tile's pixel by healpy {hp.__version__} ang2pix(nest=True) ({wrong_pixel} do not)")
        report(missing == 0, f"tiling order {order}: every narrow-band source within the {margin:.2f} arcsec margin of an owned row is in its tile by astropy search_around_sky ({missing} missing)")
sys.exit(1 if failed else 0)
