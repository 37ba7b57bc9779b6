#!/usr/bin/python3
"""Benchmark: the 'match' verb on 10^6 x 10^6 FITS tables against astropy and scipy on the same files.

Env: PHOTOMETALLICITY (the built CLI, Release). Usage: bench_crossmatch.py [N] [RUNS] (default 10^6 sources, 3 runs
of the verb; the median run is compared, since other work on a shared machine makes single runs noisy).
Invented field: uniform in a 2 x 2 deg box at (150, +2) deg; 80% of the sources have a narrow-band
counterpart displaced by (+1.0, -0.5) arcsec plus 0.15 arcsec noise; the rest of the narrow-band table is
unrelated sources. Times:
  - the whole process `photometallicity match a.fits b.fits --radius 1 --out m.fits` (reading, offset solution,
    1:1 match, false-match tests, writing), with its peak resident memory (from wait4 rusage);
  - astropy match_coordinates_sky (one thread) on the same positions, reading included;
  - scipy cKDTree query with workers=-1 and distance_upper_bound, reading included.
astropy and scipy are given only the nearest-neighbour query (no offset solution, no 1:1), so the ratio
understates the verb's share of work.
"""
import os
import sys
import tempfile
import time

import numpy as np
import astropy.units as u
from astropy.coordinates import SkyCoord, match_coordinates_sky
from astropy.io import fits
from astropy.table import Table
from scipy.spatial import cKDTree


def make(n, seed=42):
    rs = np.random.RandomState(seed)
    cosd = np.cos(np.radians(2.0))
    ldec = 1.0 + 2.0 * rs.uniform(size=n)
    lra = 150.0 + (rs.uniform(size=n) - 0.5) * 2.0 / cosd
    k = rs.uniform(size=n) < 0.8
    rdec = np.where(k, ldec + (-0.5 + rs.normal(0, 0.15, n)) / 3600, 1.0 + 2.0 * rs.uniform(size=n))
    rra = np.where(k, lra + (1.0 + rs.normal(0, 0.15, n)) / 3600 / np.cos(np.radians(ldec)),
                   150.0 + (rs.uniform(size=n) - 0.5) * 2.0 / cosd)
    return lra, ldec, rra, rdec


def main():
    n = int(sys.argv[1]) if len(sys.argv) > 1 else 1_000_000
    exe = os.environ["PHOTOMETALLICITY"]
    tmp = tempfile.mkdtemp(prefix="pm-xm-bench-")
    a, b, m = (os.path.join(tmp, x) for x in ("a.fits", "b.fits", "m.fits"))
    lra, ldec, rra, rdec = make(n)
    Table({"id": np.arange(n), "ra": lra, "dec": ldec, "g": np.full(n, 20.0)}).write(a, overwrite=True)
    Table({"nid": np.arange(n), "ra": rra, "dec": rdec, "hk": np.full(n, 21.0)}).write(b, overwrite=True)
    print(f"crossmatch benchmark: {n} x {n} sources, radius 1 arcsec, {os.cpu_count()} CPUs, load average {os.getloadavg()[0]:.1f}")

    runs = int(sys.argv[2]) if len(sys.argv) > 2 else 3
    results = []
    for _ in range(runs):
        t0 = time.perf_counter()
        pid = os.fork()
        if pid == 0:
            fd = os.open(os.devnull, os.O_WRONLY)
            os.dup2(fd, 1)
            os.dup2(fd, 2)
            os.execv(exe, [exe, "match", a, b, "--radius", "1", "--out", m])
        _, status, ru = os.wait4(pid, 0)
        results.append((time.perf_counter() - t0, ru.ru_utime + ru.ru_stime, ru.ru_maxrss * 1024, os.waitstatus_to_exitcode(status)))
        print(f"  run: {results[-1][0]:.2f} s wall, {results[-1][1]:.2f} s CPU, exit {results[-1][3]}")
    t_cli, cpu_cli, peak, code = sorted(results)[len(results) // 2]
    print(f"photometallicity match (whole process, median of {runs}): {t_cli:.2f} s wall, {cpu_cli:.2f} s CPU, exit {code}, "
          f"peak RSS {peak / 1e6:.0f} MB = {peak / (2 * n):.0f} bytes/source")
    h = fits.open(m)[1].header
    print(f"  matched {h['XMNMATCH']}, offset {h['XMDRA']:+.4f}, {h['XMDDEC']:+.4f} arcsec")

    t0, c0 = time.perf_counter(), time.process_time()
    ta, tb = fits.open(a)[1].data, fits.open(b)[1].data
    left = SkyCoord(ta["ra"] * u.deg, ta["dec"] * u.deg)
    right = SkyCoord(tb["ra"] * u.deg, tb["dec"] * u.deg)
    idx, d2d, _ = match_coordinates_sky(left, right)
    ok = d2d < 1 * u.arcsec
    t_astropy, cpu_astropy = time.perf_counter() - t0, time.process_time() - c0
    print(f"astropy match_coordinates_sky (1 thread, reading included): {t_astropy:.2f} s wall, {cpu_astropy:.2f} s CPU ({int(ok.sum())} within 1 arcsec, no offset solution)")

    t0, c0 = time.perf_counter(), time.process_time()
    ta, tb = fits.open(a)[1].data, fits.open(b)[1].data

    def vec(ra, dec):
        ra, dec = np.radians(ra), np.radians(dec)
        return np.stack([np.cos(dec) * np.cos(ra), np.cos(dec) * np.sin(ra), np.sin(dec)], axis=1)

    tree = cKDTree(vec(tb["ra"], tb["dec"]))
    dist, j = tree.query(vec(ta["ra"], ta["dec"]), k=1, distance_upper_bound=2 * np.sin(np.radians(1 / 3600) / 2), workers=-1)
    t_scipy, cpu_scipy = time.perf_counter() - t0, time.process_time() - c0
    print(f"scipy cKDTree workers=-1 (reading included): {t_scipy:.2f} s wall, {cpu_scipy:.2f} s CPU ({int(np.isfinite(dist).sum())} within 1 arcsec)")
    print(f"wall-time ratio astropy / photometallicity = {t_astropy / t_cli:.2f}; scipy / photometallicity = {t_scipy / t_cli:.2f}")
    print(f"CPU-time ratio astropy / photometallicity = {cpu_astropy / cpu_cli:.2f} (on a shared machine the wall times mostly measure the load)")
    for f in (a, b, m):
        os.remove(f)
    os.rmdir(tmp)


if __name__ == "__main__":
    main()
