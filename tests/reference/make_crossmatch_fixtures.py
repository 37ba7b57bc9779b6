#!/usr/bin/python3
"""Makes the committed cross-match fixtures in tests/fixtures/crossmatch/ with Debian's astropy.

Fixtures (all positions invented; no real catalogue):
  separations.csv   pairs of positions (RA wrap, |Dec| > 89 deg, 1-mas and sub-mas pairs, wide pairs,
                    near-antipodal pairs) and astropy's SkyCoord.separation in arcsec.
  fields.json       for each synthetic field: the generator settings, the astropy version, a few
                    generated positions (so the C# test can confirm both generators agree), and the name
                    of its binary answer file.
  <field>.bin       little-endian, per left row: int32 nearest right index (match_coordinates_sky),
                    float64 its separation in arcsec (astropy), int32 the right index of a plain
                    reference one-to-one resolution within the radius (-1 when none).

The field positions are not stored: C# and this script draw them from the same generator, xoshiro256**
seeded by SplitMix64 (Photometallicity.Numerics.Rng), with only +, -, * on doubles so both sides get the
same bits.

Run: /usr/bin/python3 tests/reference/make_crossmatch_fixtures.py
"""
import csv
import json
import os
import struct
import sys

import astropy
import astropy.units as u
import numpy as np
from astropy.coordinates import SkyCoord, match_coordinates_sky, search_around_sky

M64 = (1 << 64) - 1


def _splitmix(x):
    x = (x + 0x9E3779B97F4A7C15) & M64
    z = x
    z = ((z ^ (z >> 30)) * 0xBF58476D1CE4E5B9) & M64
    z = ((z ^ (z >> 27)) * 0x94D049BB133111EB) & M64
    return x, z ^ (z >> 31)


def _rotl(x, k):
    return ((x << k) | (x >> (64 - k))) & M64


class Rng:
    """Port of Photometallicity.Numerics.Rng (xoshiro256**, Blackman & Vigna 2018)."""

    def __init__(self, seed):
        x = seed & M64
        x, self.s0 = _splitmix(x)
        x, self.s1 = _splitmix(x)
        x, self.s2 = _splitmix(x)
        x, self.s3 = _splitmix(x)

    def next_u64(self):
        result = (_rotl((self.s1 * 5) & M64, 7) * 9) & M64
        t = (self.s1 << 17) & M64
        self.s2 ^= self.s0
        self.s3 ^= self.s1
        self.s1 ^= self.s2
        self.s0 ^= self.s3
        self.s2 ^= t
        self.s3 = _rotl(self.s3, 45)
        return result

    def next_double(self):
        return (self.next_u64() >> 11) * (1.0 / 9007199254740992.0)


def wrap(ra):
    if ra >= 360.0:
        ra -= 360.0
    if ra < 0.0:
        ra += 360.0
    return ra


def generate_field(seed, n, ra0, ra_width, dec0, dec_width, keep, jitter_ra, jitter_dec, spurious):
    """Same algorithm as CrossMatchFixtureField.Generate in the C# tests."""
    rng = Rng(seed)
    lra, ldec = [], []
    for _ in range(n):
        lra.append(wrap(ra0 + ra_width * rng.next_double()))
        ldec.append(dec0 + dec_width * rng.next_double())
    rra, rdec = [], []
    for i in range(n):
        if rng.next_double() < keep:
            rra.append(wrap(lra[i] + (rng.next_double() - 0.5) * jitter_ra))
            rdec.append(min(90.0, ldec[i] + (rng.next_double() - 0.5) * jitter_dec))
    for _ in range(spurious):
        rra.append(wrap(ra0 + ra_width * rng.next_double()))
        rdec.append(dec0 + dec_width * rng.next_double())
    return np.array(lra), np.array(ldec), np.array(rra), np.array(rdec)


def reference_one_to_one(left, right, radius_arcsec):
    """All pairs within the radius (astropy search_around_sky), sorted by (separation, left, right),
    accepted greedily when neither side is taken."""
    il, ir, sep, _ = search_around_sky(left, right, radius_arcsec * u.arcsec)
    s = sep.to_value(u.arcsec)
    order = np.lexsort((ir, il, s))
    out = np.full(len(left), -1, dtype=np.int64)
    taken = np.zeros(len(right), dtype=bool)
    for k in order:
        a, b = il[k], ir[k]
        if out[a] < 0 and not taken[b]:
            out[a] = b
            taken[b] = True
    return out


FIELDS = [
    # A 1 x 1 deg field straddling RA = 0/360 with 10^5 broadband and ~10^5 narrow-band sources.
    dict(name="wrap", seed=20261202, n=100_000, ra0=359.5, ra_width=1.0, dec0=-20.5, dec_width=1.0,
         keep=0.8, jitter_ra=2.8e-4, jitter_dec=2.8e-4, spurious=20_000, radius_arcsec=3.0),
    # The cap within 1 deg of the north pole, RA over all 360 deg.
    dict(name="pole", seed=7, n=5_000, ra0=0.0, ra_width=360.0, dec0=89.0, dec_width=1.0,
         keep=0.8, jitter_ra=0.02, jitter_dec=2.8e-4, spurious=1_000, radius_arcsec=3.0),
]


def separation_pairs():
    rs = np.random.RandomState(12345)
    rows = []
    mas = 1.0 / 3.6e6
    # RA wrap: tiny and moderate steps across 0/360.
    for d in [1e-3, 1.0, 60.0, 3600.0]:
        step = d / 3600.0
        rows.append((359.9999999, 10.0, 0.0000001 + step, 10.0))
        rows.append((0.0, -45.0, 360.0 - step, -45.0 + step))
    # Near the poles (|Dec| > 89 deg), including the pole itself and opposite RAs.
    for dec in [89.1, 89.9, 89.999, 89.9999999, 90.0]:
        for sgn in [1.0, -1.0]:
            rows.append((10.0, sgn * dec, 190.0, sgn * dec))
            rows.append((10.0, sgn * dec, 10.5, sgn * min(90.0, dec + 1e-6)))
            rows.append((359.99, sgn * dec, 0.01, sgn * dec))
    # 1-mas and sub-mas pairs at random places and directions.
    for _ in range(40):
        ra, dec = rs.uniform(0, 360), rs.uniform(-89.5, 89.5)
        scale = 10 ** rs.uniform(-1, 1) * mas
        ang = rs.uniform(0, 2 * np.pi)
        rows.append((ra, dec, ra + scale * np.cos(ang) / np.cos(np.radians(dec)), dec + scale * np.sin(ang)))
    # Arcsecond to degree pairs, and near-antipodal pairs.
    for _ in range(40):
        ra, dec = rs.uniform(0, 360), rs.uniform(-90, 90)
        step = 10 ** rs.uniform(-4, 1.5)
        rows.append((ra, dec, (ra + rs.normal() * step) % 360.0, float(np.clip(dec + rs.normal() * step, -90, 90))))
    for _ in range(10):
        ra, dec = rs.uniform(0, 360), rs.uniform(-80, 80)
        rows.append((ra, dec, (ra + 180.0 + rs.normal() * 1e-4) % 360.0, float(-dec + rs.normal() * 1e-4)))
    return rows


def main():
    root = os.environ.get("REPO_ROOT") or os.path.abspath(os.path.join(os.path.dirname(__file__), "..", ".."))
    out = os.path.join(root, "tests", "fixtures", "crossmatch")
    os.makedirs(out, exist_ok=True)

    rows = separation_pairs()
    a = SkyCoord([r[0] for r in rows] * u.deg, [r[1] for r in rows] * u.deg)
    b = SkyCoord([r[2] for r in rows] * u.deg, [r[3] for r in rows] * u.deg)
    sep = a.separation(b).to_value(u.arcsec)
    with open(os.path.join(out, "separations.csv"), "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        f.write(f"# astropy {astropy.__version__} SkyCoord.separation; positions invented\n")
        w.writerow(["ra1_deg", "dec1_deg", "ra2_deg", "dec2_deg", "sep_arcsec"])
        for r, s in zip(rows, sep):
            w.writerow([repr(float(r[0])), repr(float(r[1])), repr(float(r[2])), repr(float(r[3])), repr(float(s))])

    meta = {"astropy": astropy.__version__, "numpy": np.__version__, "fields": []}
    for fdef in FIELDS:
        lra, ldec, rra, rdec = generate_field(fdef["seed"], fdef["n"], fdef["ra0"], fdef["ra_width"], fdef["dec0"],
                                              fdef["dec_width"], fdef["keep"], fdef["jitter_ra"], fdef["jitter_dec"],
                                              fdef["spurious"])
        left = SkyCoord(lra * u.deg, ldec * u.deg)
        right = SkyCoord(rra * u.deg, rdec * u.deg)
        idx, d2d, _ = match_coordinates_sky(left, right)
        one = reference_one_to_one(left, right, fdef["radius_arcsec"])
        nn_sep = d2d.to_value(u.arcsec)
        with open(os.path.join(out, fdef["name"] + ".bin"), "wb") as f:
            for i in range(len(lra)):
                f.write(struct.pack("<idi", int(idx[i]), float(nn_sep[i]), int(one[i])))
        entry = dict(fdef)
        entry.update(file=fdef["name"] + ".bin", right_count=len(rra),
                     probe=[[repr(float(lra[0])), repr(float(ldec[0]))], [repr(float(lra[-1])), repr(float(ldec[-1]))],
                            [repr(float(rra[-1])), repr(float(rdec[-1]))]],
                     matched_one_to_one=int((one >= 0).sum()))
        meta["fields"].append(entry)
        print(f"{fdef['name']}: {len(lra)} left, {len(rra)} right, {int((one >= 0).sum())} matched 1:1", file=sys.stderr)
    with open(os.path.join(out, "fields.json"), "w") as f:
        json.dump(meta, f, indent=1)
        f.write("\n")


if __name__ == "__main__":
    main()
