#!/usr/bin/python3
"""Live check of the 'match' verb against astropy and scipy (Debian packages), on invented catalogues.

Env: PHOTOMETALLICITY (the built CLI), REPO_ROOT. Prints one PASS/FAIL line per check; exits 1 if any failed.

Fields (all invented): a 0.3 x 0.3 deg field straddling RA = 0/360 at Dec +40 with 30 000 broadband sources,
70% of which have a narrow-band counterpart displaced by (+0.7, -0.5) arcsec [dRA cos Dec, dDec] plus
0.1 arcsec noise, and 4 000 unrelated narrow-band sources; and a field within 0.3 deg of the south pole.
References:
  - one-to-one: astropy search_around_sky pairs within the radius (after applying the verb's solved offset to
    the narrow-band catalogue in the tangent plane), sorted by separation then indices, accepted greedily;
  - separations: astropy SkyCoord.separation;
  - nearest neighbours: scipy cKDTree on unit vectors (for rows with one candidate the 1:1 partner is the NN);
  - false-match rate: the Poisson chance probability 1 - exp(-pi rho r^2) with rho the narrow-band density.
"""
import os
import shutil
import subprocess
import sys
import tempfile

import numpy as np
import astropy
import astropy.units as u
from astropy.coordinates import SkyCoord, search_around_sky
from astropy.io import fits
from astropy.table import Table
from scipy.spatial import cKDTree

EXE = os.environ.get("PHOTOMETALLICITY")
failures = 0


def check(ok, text):
    global failures
    print(("PASS " if ok else "FAIL ") + text)
    if not ok:
        failures += 1


def unit(ra, dec):
    ra, dec = np.radians(ra), np.radians(dec)
    return np.stack([np.cos(dec) * np.cos(ra), np.cos(dec) * np.sin(ra), np.sin(dec)], axis=1)


def plane(left_vec):
    c = left_vec.sum(axis=0)
    c /= np.linalg.norm(c)
    e = np.array([-c[1], c[0], 0.0])
    if np.linalg.norm(e) < 1e-12:
        e = np.array([0.0, 1.0, 0.0])
    e /= np.linalg.norm(e)
    n = np.cross(c, e)
    return c, e, n


def project(v, c, e, n):
    w = v @ c
    return (v @ e) / w, (v @ n) / w


def deproject(xi, eta, c, e, n):
    v = c[None, :] + xi[:, None] * e[None, :] + eta[:, None] * n[None, :]
    v /= np.linalg.norm(v, axis=1)[:, None]
    return np.degrees(np.arctan2(v[:, 1], v[:, 0])) % 360.0, np.degrees(np.arcsin(np.clip(v[:, 2], -1, 1)))


def make_field(rs, n, c_ra, c_dec, half_deg, off, noise, keep, spurious):
    lvec0 = unit(np.array([c_ra]), np.array([c_dec]))
    c, e, nn = plane(lvec0)
    w = np.radians(half_deg)
    xi, eta = rs.uniform(-w, w, n), rs.uniform(-w, w, n)
    lra, ldec = deproject(xi, eta, c, e, nn)
    k = rs.uniform(size=n) < keep
    as2rad = np.radians(1 / 3600)
    rxi = xi[k] + (off[0] + rs.normal(0, noise, k.sum())) * as2rad
    reta = eta[k] + (off[1] + rs.normal(0, noise, k.sum())) * as2rad
    sxi, seta = rs.uniform(-w, w, spurious), rs.uniform(-w, w, spurious)
    rra, rdec = deproject(np.concatenate([rxi, sxi]), np.concatenate([reta, seta]), c, e, nn)
    perm = rs.permutation(len(rra))
    return lra, ldec, rra[perm], rdec[perm]


def write_fits(path, idname, ids, ra, dec, mag):
    Table({idname: ids, "ra": ra, "dec": dec, "mag": mag}).write(path, overwrite=True)


def reference_1to1(lra, ldec, rra, rdec, radius):
    left, right = SkyCoord(lra * u.deg, ldec * u.deg), SkyCoord(rra * u.deg, rdec * u.deg)
    il, ir, sep, _ = search_around_sky(left, right, radius * u.arcsec)
    order = np.lexsort((ir, il, sep.to_value(u.arcsec)))
    out = np.full(len(lra), -1)
    taken = np.zeros(len(rra), bool)
    for kk in order:
        if out[il[kk]] < 0 and not taken[ir[kk]]:
            out[il[kk]] = ir[kk]
            taken[ir[kk]] = True
    counts = np.bincount(il, minlength=len(lra))
    return out, counts


def run(args):
    p = subprocess.run([EXE, "match"] + args, capture_output=True, text=True)
    return p.returncode, p.stdout, p.stderr


def main():
    if not EXE or not os.path.exists(EXE):
        check(False, f"PHOTOMETALLICITY not set or missing ({EXE})")
        return
    print(f"# astropy {astropy.__version__}, numpy {np.__version__}")
    rs = np.random.RandomState(20261202)
    tmp = tempfile.mkdtemp(prefix="pm-xm-")
    off = (0.7, -0.5)
    lra, ldec, rra, rdec = make_field(rs, 30_000, 0.0, 40.0, 0.15, off, 0.1, 0.7, 4_000)
    a, b, m = os.path.join(tmp, "broad.fits"), os.path.join(tmp, "narrow.fits"), os.path.join(tmp, "m.fits")
    write_fits(a, "src", np.arange(len(lra)), lra, ldec, rs.uniform(18, 22, len(lra)))
    write_fits(b, "nid", np.arange(len(rra)) + 500_000, rra, rdec, rs.uniform(19, 23, len(rra)))
    rc, _, err = run([a, b, "--radius", "1", "--out", m])
    check(rc == 0, f"match exits 0 on the RA-wrap field (stderr: {err.strip().splitlines()[-1] if err.strip() else ''})")
    if rc != 0:
        print(err)
        return
    hdu = fits.open(m)[1]
    t, h = hdu.data, hdu.header
    check(len(t) == len(lra) and np.array_equal(t["src"], np.arange(len(lra))), "every LEFT row once, in input order")
    cols = [c.name for c in hdu.columns]
    check(cols == ["src", "ra", "dec", "mag", "r_nid", "r_ra", "r_dec", "r_mag", "sep_arcsec", "match_flag"], f"output columns {cols}")
    dx, dy = h["XMDRA"], h["XMDDEC"]
    ex, ey = h["XMDRAERR"], h["XMDDCERR"]
    check(abs(dx - off[0]) < max(5 * ex, 0.003) and abs(dy - off[1]) < max(5 * ey, 0.003),
          f"offset {dx:+.4f}, {dy:+.4f} arcsec (+/- {ex:.4f}, {ey:.4f}) recovers injected {off[0]:+.2f}, {off[1]:+.2f}")

    # Reference 1:1 after applying the verb's offset in the tangent plane about the mean of the left vectors.
    lv = unit(lra, ldec)
    c, e, n = plane(lv)
    rxi, reta = project(unit(rra, rdec), c, e, n)
    as2rad = np.radians(1 / 3600)
    cra, cdec = deproject(rxi - dx * as2rad, reta - dy * as2rad, c, e, n)
    ref, counts = reference_1to1(lra, ldec, cra, cdec, 1.0)
    got = np.where(t["match_flag"] > 0, t["r_nid"] - 500_000, -1)
    same = np.mean(got == ref)
    check(same >= 0.999, f"1:1 partners equal to the astropy reference resolution for {same * 100:.3f}% of rows ({int((got != ref).sum())} differ)")
    mm = (got >= 0) & (got == ref)
    sep_ref = SkyCoord(lra[mm] * u.deg, ldec[mm] * u.deg).separation(SkyCoord(cra[ref[mm]] * u.deg, cdec[ref[mm]] * u.deg)).to_value(u.arcsec)
    dsep = np.max(np.abs(t["sep_arcsec"][mm] - sep_ref))
    check(dsep < 1e-6, f"sep_arcsec equals astropy separation from the corrected position (max diff {dsep:.2e} arcsec)")
    blend_ref = counts >= 2
    check(np.array_equal((t["match_flag"] == 2), blend_ref & (got >= 0)), "match_flag 2 exactly where a matched row has two or more candidates")
    single = (counts == 1) & (got >= 0)
    tree = cKDTree(unit(cra, cdec))
    _, nn = tree.query(lv[single], workers=-1)
    check(np.array_equal(nn, got[single]), f"single-candidate partners equal scipy cKDTree nearest neighbours ({int(single.sum())} rows)")
    area = (2 * 0.15 * 60) ** 2
    rho = len(rra) / area
    p = 1 - np.exp(-np.pi * rho * (1 / 60) ** 2)
    check(abs(h["XMFALMEA"] - p) < 0.2 * p + 0.002 and abs(h["XMFALEXP"] - p) < 0.2 * p + 0.002,
          f"false-match rates measured {h['XMFALMEA']:.4f}, expected {h['XMFALEXP']:.4f} vs Poisson {p:.4f} (edges lower them a little)")

    # Auto radius: the chosen radius and its reason are reported.
    rc, _, err = run([a, b, "--radius", "auto", "--out", os.path.join(tmp, "auto.csv")])
    ok = rc == 0 and "auto:" in err
    check(ok, "auto radius reports its choice: " + next((l for l in err.splitlines() if "radius" in l), "(no line)"))

    # No offset solution on the south-pole field: must equal the plain reference exactly.
    lra2, ldec2, rra2, rdec2 = make_field(rs, 8_000, 0.0, -89.8, 0.3, (0.0, 0.0), 0.2, 0.8, 1_000)
    a2, b2, m2 = os.path.join(tmp, "pa.fits"), os.path.join(tmp, "pb.fits"), os.path.join(tmp, "pm.fits")
    write_fits(a2, "src", np.arange(len(lra2)), lra2, ldec2, np.zeros(len(lra2)))
    write_fits(b2, "nid", np.arange(len(rra2)), rra2, rdec2, np.zeros(len(rra2)))
    rc, _, err = run([a2, b2, "--radius", "0.8", "--no-offset", "--out", m2])
    check(rc == 0, "match exits 0 on the south-pole field")
    if rc == 0:
        t2 = fits.open(m2)[1].data
        ref2, _ = reference_1to1(lra2, ldec2, rra2, rdec2, 0.8)
        got2 = np.where(t2["match_flag"] > 0, t2["r_nid"], -1)
        check(np.array_equal(got2, ref2), f"pole field (--no-offset): 1:1 identical to the astropy reference ({int((got2 >= 0).sum())} matched)")

    # Bad input: a NaN declination is exit code 2 with file, row and column.
    lbad = ldec2.copy()
    lbad[41] = np.nan
    bad = os.path.join(tmp, "bad.fits")
    write_fits(bad, "src", np.arange(len(lra2)), lra2, lbad, np.zeros(len(lra2)))
    rc, _, err = run([bad, b2, "--radius", "1", "--out", os.path.join(tmp, "never.fits")])
    check(rc == 2 and "bad.fits" in err and "row 42" in err and "'dec'" in err and not os.path.exists(os.path.join(tmp, "never.fits")),
          f"NaN Dec -> exit 2 naming file, row and column ({err.strip()})")
    shutil.rmtree(tmp, ignore_errors=True)


if __name__ == "__main__":
    main()
    sys.exit(1 if failures else 0)
