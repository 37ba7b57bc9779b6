#!/usr/bin/python3
"""Live check of the FITS reader and writer against Debian's astropy.

astropy writes a FITS table (every supported column type, units, masked integers, NaN, strings, booleans, header
keywords, unsigned integers with the TZERO convention), the CLI converts it FITS -> FITS
($PHOTOMETALLICITY convert in.fits out.fits), and astropy reads our output back: same values, dtypes and units.
astropy also verifies our file against the standard (HDUList.verify('exception')). Invented test values only.
Prints one PASS/FAIL line per check; exits non-zero if any failed.
"""
import os
import subprocess
import sys
import tempfile
import warnings

import numpy as np
import astropy
from astropy.io import fits
from astropy.table import MaskedColumn, Table

CLI = os.environ.get("PHOTOMETALLICITY")
failures = 0


def check(ok, name, detail=""):
    global failures
    print(("PASS " if ok else "FAIL ") + name + ("" if ok or not detail else ": " + detail))
    if not ok:
        failures += 1


def run(*args):
    return subprocess.run([CLI, *args], capture_output=True, text=True)


def source_table():
    n = 1000
    rng = np.random.default_rng(7)
    t = Table()
    t["ra"] = rng.uniform(150, 151, n)
    t["ra"].unit = "deg"
    t["gmag"] = rng.uniform(18, 24, n)
    t["gmag"][5] = np.nan
    t["gmag"].unit = "mag"
    t["gerr"] = rng.uniform(0.01, 0.2, n).astype(np.float32)
    t["gerr"].unit = "mag"
    t["src"] = np.arange(n, dtype=np.int64) * 1_000_000_007
    t["nobs"] = MaskedColumn(rng.integers(1, 50, n, dtype=np.int32), mask=np.arange(n) % 7 == 0)
    t["flag"] = rng.integers(-300, 300, n).astype(np.int16)
    t["nb"] = rng.integers(0, 256, n).astype(np.uint8)
    t["u16"] = rng.integers(0, 65536, n).astype(np.uint16)
    t["u32"] = rng.integers(0, 2**32, n, dtype=np.uint64).astype(np.uint32)
    t["name"] = np.array([f"star-{i:04d}" for i in range(n)])
    t["good"] = rng.random(n) < 0.5
    t.meta["OBJECT"] = "Invented Dwarf I"
    t.meta["NSTARS"] = n
    t.meta["EPOCH"] = 2000.0
    t.meta["LONGNOTE"] = "An invented note that is far too long for one header card, so it needs the CONTINUE convention; it's quoted too."
    t.meta["HIERARCH invented.pipeline.version"] = "0.1.0"
    return t


# The project's documented mapping of astropy dtypes after a FITS -> FITS round trip: native types stay the same;
# unsigned integers (TZERO convention, FITS Standard 4.0, sect. 7.3.2) come back as the next wider signed type.
EXPECTED_DTYPE = {"uint16": "int32", "uint32": "int64"}


def same_values(a, b):
    ma = np.ma.getmaskarray(a)
    mb = np.ma.getmaskarray(b)
    if a.dtype.kind == "f":
        ma = ma | np.isnan(np.ma.getdata(a))
        mb = mb | np.isnan(np.ma.getdata(b))
    if not np.array_equal(ma, mb):
        return False, f"masks differ at rows {np.nonzero(ma != mb)[0][:5]}"
    da, db = np.ma.getdata(a)[~ma], np.ma.getdata(b)[~mb]
    if a.dtype.kind in "SU":
        da, db = da.astype(str), db.astype(str)
    if not np.array_equal(da, db):
        bad = np.nonzero(da != db)[0][:3]
        return False, f"values differ, e.g. {da[bad]} vs {db[bad]}"
    return True, ""


def main():
    if not CLI or not os.path.exists(CLI):
        check(False, "PHOTOMETALLICITY points to the CLI executable", str(CLI))
        return 1
    print(f"astropy {astropy.__version__}, numpy {np.__version__}")
    with tempfile.TemporaryDirectory() as tmp:
        src_path = os.path.join(tmp, "in.fits")
        out_path = os.path.join(tmp, "out.fits")
        src = source_table()
        src.write(src_path)
        r = run("convert", src_path, out_path)
        check(r.returncode == 0, "convert in.fits out.fits exits 0", r.stderr.strip())
        if r.returncode != 0:
            return 1

        with fits.open(out_path) as hdul:
            try:
                hdul.verify("exception")
                check(True, "astropy verify('exception') accepts our FITS file")
            except Exception as e:  # noqa: BLE001 - any verification failure is a FAIL line
                check(False, "astropy verify('exception') accepts our FITS file", str(e))
            check(len(hdul) == 2 and hdul[0].header["NAXIS"] == 0 and hdul[1].header["XTENSION"] == "BINTABLE",
                  "our file: empty primary HDU + one BINTABLE")
            check(os.path.getsize(out_path) % 2880 == 0, "our file is a whole number of 2880-byte blocks")
            hdr = hdul[1].header
            check(hdr.get("OBJECT") == "Invented Dwarf I" and hdr.get("NSTARS") == 1000 and hdr.get("EPOCH") == 2000.0,
                  "header keywords carried with their types (string, integer, float)")
            check(hdr.get("LONGNOTE") == source_table().meta["LONGNOTE"], "long string keyword (CONTINUE convention) carried", repr(hdr.get("LONGNOTE")))
            check(hdr.get("invented.pipeline.version") == "0.1.0", "HIERARCH keyword carried", repr(hdr.get("invented.pipeline.version")))

        # The reference is what astropy reads from its own file (for a masked table astropy 5.2 writes a TNULL on
        # every integer column, so its in-memory table and its file can differ).
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            out = Table.read(out_path)
            src = Table.read(src_path)
        check(out.colnames == src.colnames, "column names and order", f"{out.colnames}")
        for name in src.colnames:
            a, b = src[name], out[name]
            want = EXPECTED_DTYPE.get(a.dtype.name, a.dtype.name)
            got = b.dtype.name
            if a.dtype.kind in "SU":
                want = f"text of {a.dtype.itemsize // (4 if a.dtype.kind == 'U' else 1)} characters"
                ok_dtype = b.dtype.kind in "SU" and b.dtype.itemsize // (4 if b.dtype.kind == "U" else 1) == a.dtype.itemsize // (4 if a.dtype.kind == "U" else 1)
            else:
                ok_dtype = got == want
            check(ok_dtype, f"column {name}: dtype {a.dtype} -> {b.dtype} (expected {want})")
            check(str(a.unit) == str(b.unit), f"column {name}: unit {a.unit}", f"got {b.unit}")
            ok, detail = same_values(a, b)
            check(ok, f"column {name}: same values and missing rows", detail)

        # Extension selection by EXTNAME, and a skipped image HDU before the tables.
        two = os.path.join(tmp, "two.fits")
        h1 = fits.table_to_hdu(Table({"x": [1.5, 2.5]}))
        h1.header["EXTNAME"] = "FIRST"
        h2 = fits.table_to_hdu(Table({"y": np.array([3, 4, 5], dtype=np.int32)}))
        h2.header["EXTNAME"] = "SECOND"
        fits.HDUList([fits.PrimaryHDU(np.zeros((3, 5), dtype=np.float32)), fits.ImageHDU(np.ones(17, dtype=np.int16), name="SCI"), h1, h2]).writeto(two)
        sel = os.path.join(tmp, "sel.fits")
        r = run("convert", two, sel, "--extension", "second")
        ok = r.returncode == 0 and list(Table.read(sel)["y"]) == [3, 4, 5]
        check(ok, "convert --extension second picks the EXTNAME 'SECOND' table past an image HDU", r.stderr.strip())
        r = run("convert", two, sel + ".2.fits")
        ok = r.returncode == 0 and list(Table.read(sel + ".2.fits")["x"]) == [1.5, 2.5]
        check(ok, "convert without --extension reads the first BINTABLE", r.stderr.strip())
        r = run("convert", two, sel + ".3.fits", "--extension", "NOPE")
        check(r.returncode == 2 and "'FIRST' (BINTABLE), 'SECOND' (BINTABLE)" in r.stderr,
              "unknown --extension: exit 2 and the EXTNAMEs found are listed", r.stderr.strip())

        # A truncated copy of an astropy file: exit code 2, no output written.
        cut = os.path.join(tmp, "cut.fits")
        with open(src_path, "rb") as f:
            data = f.read()
        with open(cut, "wb") as f:
            f.write(data[: len(data) // 2])
        bad_out = os.path.join(tmp, "bad_out.fits")
        r = run("convert", cut, bad_out)
        check(r.returncode == 2 and "truncated" in r.stderr and not os.path.exists(bad_out),
              "truncated astropy file: exit 2, message says truncated, no output file", r.stderr.strip())
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
