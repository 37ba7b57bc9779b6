#!/usr/bin/python3
"""Writes the FITS fixtures in tests/fixtures/fits/ with Debian's astropy, and a JSON sidecar holding the values
astropy reads back from them (the reference the C# reader is compared with).

Run:  /usr/bin/python3 tests/reference/make_fits_fixtures.py
All values are invented test numbers. The astropy version is recorded in every table header (keyword ASTROPYV)
and in the sidecar (expected.json).

expected_type is the column type the project's reader must produce, following FITS Standard 4.0
(IAU FITS Working Group 2018), sect. 7.3.2 (table "Usage of TZEROn to represent non-default integer data types"): unsigned integers written with the TZERO convention map to
the next wider signed type (uint16 -> Int32, uint32 -> Int64, uint64 -> Int64 when the values fit), B with
TZERO = -128 is a signed byte (-> Int16), other TSCAL/TZERO scaling gives Double.
"""
import json
import os
import sys
import warnings

import numpy as np
import astropy
from astropy.io import fits
from astropy.table import MaskedColumn, Table

ROOT = os.environ.get("REPO_ROOT") or os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "..")
OUT = os.path.join(ROOT, "tests", "fixtures", "fits")

TYPE_OF_DTYPE = {
    "float64": "Double", "float32": "Float", "int64": "Int64", "int32": "Int32", "int16": "Int16",
    "uint8": "Byte", "uint16": "Int32", "uint32": "Int64", "uint64": "Int64", "int8": "Int16", "bool": "Boolean",
}


def stamp(header):
    header["ASTROPYV"] = (astropy.__version__, "astropy version that wrote this fixture")
    header["HISTORY"] = "Invented test data written by tests/reference/make_fits_fixtures.py"


def types_table():
    t = Table()
    t["gmag"] = np.array([21.25, np.nan, -0.5, 1e300])
    t["gmag"].unit = "mag"
    t["gerr"] = np.array([0.015625, np.nan, 1e-30, 3.5], dtype=np.float32)
    t["gerr"].unit = "mag"
    t["src"] = np.array([9223372036854775807, -9223372036854775807, 0, 42], dtype=np.int64)
    t["n"] = np.array([2147483647, -2147483648, 7, 0], dtype=np.int32)
    t["flag"] = np.array([32767, -32768, 1, 0], dtype=np.int16)
    t["nb"] = np.array([0, 255, 17, 3], dtype=np.uint8)
    t["u16"] = np.array([0, 65535, 32768, 1], dtype=np.uint16)
    t["u32"] = np.array([0, 4294967295, 2147483648, 1], dtype=np.uint32)
    t["u64"] = np.array([0, 9223372036854775807, 1, 2], dtype=np.uint64)
    t["name"] = np.array(["star-1", "it's", "x", "a longer name"])
    t["good"] = np.array([True, False, True, False])
    t.meta["OBJECT"] = "Invented Dwarf I"
    t.meta["EPOCH"] = 2000.0
    t.meta["NSTARS"] = 4
    t.meta["DEMO"] = True
    return t


def masked_table():
    t = Table()
    t["id"] = MaskedColumn(np.array([1, 2, 3], dtype=np.int64), mask=[False, True, False])
    t["count"] = MaskedColumn(np.array([10, 20, 30], dtype=np.int32), mask=[True, False, False])
    t["q"] = MaskedColumn(np.array([-1, 0, 1], dtype=np.int16), mask=[False, False, True])
    t["flux"] = MaskedColumn(np.array([1.5, 2.5, 3.5]), mask=[False, True, False])
    return t


def write_table(t, name):
    hdu = fits.table_to_hdu(t)
    stamp(hdu.header)
    fits.HDUList([fits.PrimaryHDU(), hdu]).writeto(os.path.join(OUT, name), overwrite=True)


def write_scaled(name):
    # astropy 5.2 cannot write a B column with TZERO = -128 or a scaled I column from physical values, so the stored
    # integers are written plain and the header is given TZERO/TSCAL afterwards (same-length placeholder keywords
    # replaced in place). astropy then reads the file back with the scaling applied: that is the reference.
    cols = [
        fits.Column(name="sbyte", format="B", array=np.array([0, 255, 128, 1], dtype=np.uint8)),
        fits.Column(name="scaled", format="I", unit="mag", array=np.array([150, -100, 0, 50], dtype=np.int16)),
    ]
    hdu = fits.BinTableHDU.from_columns(cols)
    hdu.header["XZERO1"] = -128
    hdu.header["XSCAL2"] = 0.01
    hdu.header["XZERO2"] = 20.0
    stamp(hdu.header)
    path = os.path.join(OUT, name)
    fits.HDUList([fits.PrimaryHDU(), hdu]).writeto(path, overwrite=True)
    raw = open(path, "rb").read()
    for placeholder, real in [(b"XZERO1  ", b"TZERO1  "), (b"XSCAL2  ", b"TSCAL2  "), (b"XZERO2  ", b"TZERO2  ")]:
        assert raw.count(placeholder) == 1
        raw = raw.replace(placeholder, real)
    open(path, "wb").write(raw)


def write_two_extensions(name):
    primary = fits.PrimaryHDU(np.arange(6, dtype=np.int16).reshape(2, 3))
    image = fits.ImageHDU(np.linspace(0, 1, 35, dtype=np.float32).reshape(5, 7), name="SCI")
    stars = Table({"ra": [150.125, 150.25], "dec": [-2.5, -2.25]})
    stars["ra"].unit = "deg"
    stars["dec"].unit = "deg"
    standards = Table({"feh": np.array([-1.5, -2.0, -0.75], dtype=np.float32), "star": ["s1", "s2", "s3"]})
    h1 = fits.table_to_hdu(stars)
    h1.header["EXTNAME"] = "STARS"
    h2 = fits.table_to_hdu(standards)
    h2.header["EXTNAME"] = "STANDARDS"
    h2.header["TUNIT1"] = "dex"  # set in the header: astropy's unit parser does not write 'dex' to FITS
    for h in (h1, h2):
        stamp(h.header)
    fits.HDUList([primary, image, h1, h2]).writeto(os.path.join(OUT, name), overwrite=True)


def python_value(v, masked):
    if masked:
        return None
    if isinstance(v, (bytes, np.bytes_)):
        v = v.decode("ascii")
    if isinstance(v, (np.floating, float)):
        return None if np.isnan(v) else float(v)
    if isinstance(v, (np.bool_, bool)):
        return bool(v)
    if isinstance(v, (np.integer, int)):
        return int(v)
    return str(v)


def describe(name, hdu, overrides=None):
    """Reads the fixture back with astropy and records what it finds."""
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")  # the unit 'dex' is unknown to astropy's FITS unit format
        t = Table.read(os.path.join(OUT, name), hdu=hdu)
    raw = fits.getheader(os.path.join(OUT, name), hdu)
    columns = []
    for c in t.columns.values():
        dtype = c.dtype
        kind = "String" if dtype.kind in "SU" else TYPE_OF_DTYPE[dtype.name]
        kind = (overrides or {}).get(c.name, kind)
        mask = getattr(c, "mask", None)
        values = [python_value(v, bool(mask[i]) if mask is not None and np.ndim(mask) else False) for i, v in enumerate(c)]
        if kind == "String":
            values = [None if v == "" else v for v in values]  # astropy reads an all-NUL field as '' (our reader: missing)
        columns.append({"name": c.name, "astropy_dtype": str(dtype), "expected_type": kind,
                        "unit": None if c.unit is None else str(c.unit), "values": values})
    meta = {k: raw[k] for k in ("OBJECT", "EPOCH", "NSTARS", "DEMO") if k in raw}
    return {"file": name, "extension": hdu if isinstance(hdu, str) else None, "rows": len(t), "columns": columns, "keywords": meta}


def main():
    os.makedirs(OUT, exist_ok=True)
    write_table(types_table(), "types.fits")
    write_table(masked_table(), "masked.fits")
    write_scaled("scaled.fits")
    write_two_extensions("two_extensions.fits")
    cases = [
        describe("types.fits", 1),
        describe("masked.fits", 1),
        # astropy reads the signed-byte convention as float64; the standard's TZEROn table (sect. 7.3.2) makes it an 8-bit signed integer.
        describe("scaled.fits", 1, {"sbyte": "Int16", "scaled": "Double"}),
        describe("two_extensions.fits", "STARS"),
        describe("two_extensions.fits", "STANDARDS"),
    ]
    sidecar = {"astropy_version": astropy.__version__, "numpy_version": np.__version__,
               "note": "values as read back by astropy.table.Table.read; null = masked, NaN or empty string", "cases": cases}
    with open(os.path.join(OUT, "expected.json"), "w") as f:
        json.dump(sidecar, f, indent=1, allow_nan=False)
        f.write("\n")
    print("wrote", len(cases), "cases to", OUT, "with astropy", astropy.__version__)


if __name__ == "__main__":
    sys.exit(main())
