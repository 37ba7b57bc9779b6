#!/usr/bin/env python3
"""Write calibration/globular_clusters.csv from the Milky Way globular cluster catalogue of
Harris, W. E. 1996, AJ 112, 1487 (2010 edition, arXiv:1012.3224), as distributed in the text file
calibration/reference/harris2010_mwgc.dat (December 2010 revision; free of charge to all users, the
original source to be cited; see calibration/reference/README.md).

Parts I (identification, J2000 position) and II (metallicity, photometry) are fixed-width tables. This
script reads the first columns of each: part I ID, other name, RA, Dec; part II ID, [Fe/H], its weight,
E(B-V), V_HB and (m-M)V. Every cluster with an [Fe/H] becomes one row; numbers are copied as printed,
positions are converted from sexagesimal to decimal degrees with exact decimal arithmetic, so the output
depends only on the input bytes. Anything unexpected in the input stops the script with a message naming
the line (exit code 2) and nothing is written.

Standard library only. Usage (from anywhere):
    python3 calibration/make_globular_clusters.py [--input DAT] [--output CSV|-]
"""

import argparse
import hashlib
import os
import re
import sys
from decimal import Decimal, ROUND_HALF_EVEN

HERE = os.path.dirname(os.path.abspath(__file__))
DEFAULT_INPUT = os.path.join(HERE, "reference", "harris2010_mwgc.dat")
DEFAULT_OUTPUT = os.path.join(HERE, "globular_clusters.csv")

# The catalogue states it lists 157 objects (header of the .dat file).
EXPECTED_CLUSTERS = 157

# Fixed-width fields, [start, end) 0-based character columns, read off the December 2010 file. Each
# boundary column is blank in every data row (checked below), so no value can straddle two fields.
PART1_FIELDS = {"id": (0, 10), "other": (10, 23), "ra": (23, 36), "dec": (36, 49)}
PART2_FIELDS = {"id": (0, 10), "feh": (10, 18), "wt": (18, 21), "ebv": (21, 28), "vhb": (28, 34), "mmv": (34, 40)}

NUMBER = re.compile(r"^[+-]?\d+\.\d+$")
INTEGER = re.compile(r"^\d+$")
RA_RE = re.compile(r"^(\d\d) (\d\d) (\d\d(?:\.\d+)?)$")
DEC_RE = re.compile(r"^([+-])(\d\d) (\d\d) (\d\d(?:\.\d+)?)$")
DEG_STEP = Decimal("0.000001")  # output resolution of ra_deg / dec_deg: 1e-6 deg = 0.0036 arcsec


class InputError(Exception):
    pass


def fail(path, lineno, msg):
    raise InputError(f"{path}: line {lineno}: {msg}")


def section(lines, path, title, first_header_word):
    """Data rows of one part: from the column-header line after the part's title to the next '____' rule."""
    start = next((i for i, l in enumerate(lines) if l.strip().startswith(title)), None)
    if start is None:
        fail(path, 0, f"no line starting with '{title}'")
    header = next((i for i in range(start, len(lines)) if lines[i].split()[:1] == [first_header_word]), None)
    if header is None:
        fail(path, start + 1, f"no column header line after '{title}'")
    rows = []
    for i in range(header + 1, len(lines)):
        l = lines[i].rstrip()
        if l.startswith("___"):
            return lines[header], rows
        if l.strip():
            rows.append((i + 1, l))
    fail(path, header + 1, f"'{title}' does not end with a '____' rule")


def fields(path, lineno, line, spec):
    out = {}
    for key, (a, b) in spec.items():
        if a > 0 and a < len(line) and line[a] != " ":
            fail(path, lineno, f"column {a + 1} should be blank (start of field '{key}'): {line!r}")
        out[key] = " ".join(line[a:b].split())
    last_key, (_, last) = max(spec.items(), key=lambda kv: kv[1][1])
    if last < len(line) and line[last] != " ":
        fail(path, lineno, f"column {last + 1} should be blank (end of field '{last_key}'): {line!r}")
    return out


def number(path, lineno, text, what, optional=True):
    if text == "" and optional:
        return ""
    if not NUMBER.match(text):
        fail(path, lineno, f"{what} '{text}' is not a decimal number")
    return text


def ra_degrees(path, lineno, text):
    m = RA_RE.match(text)
    if not m:
        fail(path, lineno, f"RA '{text}' is not 'hh mm ss[.s]'")
    h, mi, s = (Decimal(g) for g in m.groups())
    if not (h < 24 and mi < 60 and s < 60):
        fail(path, lineno, f"RA '{text}' is out of range")
    return (h * 15 + mi / 4 + s / 240).quantize(DEG_STEP, rounding=ROUND_HALF_EVEN)  # 1 h = 15 deg


def dec_degrees(path, lineno, text):
    m = DEC_RE.match(text)
    if not m:
        fail(path, lineno, f"Dec '{text}' is not '+dd mm ss[.s]'")
    sign, d, mi, s = m.group(1), Decimal(m.group(2)), Decimal(m.group(3)), Decimal(m.group(4))
    if not (d <= 90 and mi < 60 and s < 60):
        fail(path, lineno, f"Dec '{text}' is out of range")
    v = (d + mi / 60 + s / 3600).quantize(DEG_STEP, rounding=ROUND_HALF_EVEN)
    if v > 90:
        fail(path, lineno, f"Dec '{text}' is beyond the pole")
    return -v if sign == "-" else v  # the sign is read from the text: '-00 06 41.8' is south


def fmt_deg(v):
    s = format(v, "f")
    return "0.000000" if s in ("-0.000000",) else s


def no_comma(path, lineno, text, what):
    if "," in text:
        fail(path, lineno, f"{what} '{text}' contains a comma, which the CSV reader does not allow")
    return text


def convert(path):
    with open(path, "rb") as f:
        data = f.read()
    try:
        text = data.decode("ascii")
    except UnicodeDecodeError as e:
        raise InputError(f"{path}: byte {e.start}: not ASCII")
    lines = text.replace("\r\n", "\n").split("\n")

    _, part1 = section(lines, path, "Part I:", "ID")
    _, part2 = section(lines, path, "Part II:", "ID")

    positions = {}
    for lineno, line in part1:
        f = fields(path, lineno, line, PART1_FIELDS)
        if not f["id"]:
            fail(path, lineno, "part I row without an ID")
        if f["id"] in positions:
            fail(path, lineno, f"part I lists '{f['id']}' twice")
        positions[f["id"]] = (lineno, f["other"], ra_degrees(path, lineno, f["ra"]), dec_degrees(path, lineno, f["dec"]))

    rows, seen, without_feh = [], set(), []
    for lineno, line in part2:
        f = fields(path, lineno, line, PART2_FIELDS)
        cid = f["id"]
        if not cid:
            fail(path, lineno, "part II row without an ID")
        if cid in seen:
            fail(path, lineno, f"part II lists '{cid}' twice")
        seen.add(cid)
        if cid not in positions:
            fail(path, lineno, f"'{cid}' is in part II but not in part I")
        feh = number(path, lineno, f["feh"], "[Fe/H]")
        if not INTEGER.match(f["wt"]):
            fail(path, lineno, f"[Fe/H] weight '{f['wt']}' is not an integer")
        ebv = number(path, lineno, f["ebv"], "E(B-V)")
        number(path, lineno, f["vhb"], "V_HB")
        mmv = number(path, lineno, f["mmv"], "(m-M)V")
        if feh == "":
            without_feh.append(cid)
            continue
        _, other, ra, dec = positions[cid]
        note = f"Harris 1996 (2010 edition); [Fe/H] weight {int(f['wt'])}"
        rows.append([no_comma(path, lineno, cid, "ID"), no_comma(path, lineno, other, "other name"),
                     fmt_deg(ra), fmt_deg(dec), feh, ebv, mmv, note])
    missing = [c for c in positions if c not in seen]
    if missing:
        fail(path, positions[missing[0]][0], f"'{missing[0]}' is in part I but not in part II")
    if len(positions) != EXPECTED_CLUSTERS:
        fail(path, 0, f"{len(positions)} clusters, the catalogue states {EXPECTED_CLUSTERS}")

    no_ebv = [r[0] for r in rows if r[5] == ""]
    no_mmv = [r[0] for r in rows if r[6] == ""]
    out = [
        "# Milky Way globular clusters with an [Fe/H]: centre (J2000, degrees), [Fe/H] (dex), E(B-V) (mag) and the",
        "# apparent visual distance modulus (m-M)V (mag).",
        "# Source: Harris, W. E. 1996, AJ 112, 1487 (2010 edition, arXiv:1012.3224): \"Catalog of Parameters for Milky Way",
        "#         Globular Clusters\", December 2010 revision, parts I and II. Cite it as \"Harris 1996 (2010 edition)\".",
        "# Terms of the catalogue: its data are supplied free of charge to all users; anyone who supplies it in turn to",
        "#         other users must refer to the original source and do so without charge.",
        "# Generated by calibration/make_globular_clusters.py from calibration/reference/harris2010_mwgc.dat",
        f"#         (SHA-256 {hashlib.sha256(data).hexdigest()}); do not edit by hand, re-run the script.",
        "# Columns: name (catalogue ID), alias (its 'other name'), ra_deg and dec_deg (from the J2000 sexagesimal RA and",
        "#         Dec, 1 h = 15 deg, rounded to 1e-6 deg), feh, ebv, distance_modulus_v ((m-M)V) as printed in part II,",
        "#         note (the weight of the mean [Fe/H], roughly the number of independent measurements averaged).",
        "#         An empty cell means the catalogue gives no value.",
        f"# {len(rows)} of the catalogue's {len(positions)} clusters; left out for lack of an [Fe/H]: {', '.join(without_feh) or 'none'}.",
        f"# Without E(B-V): {', '.join(no_ebv) or 'none'}. Without (m-M)V: {', '.join(no_mmv) or 'none'}.",
        "name,alias,ra_deg,dec_deg,feh,ebv,distance_modulus_v,note",
    ]
    out += [",".join(r) for r in rows]
    return "\n".join(out) + "\n"


def main(argv):
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    ap.add_argument("--input", default=DEFAULT_INPUT, help="the catalogue text file (default: %(default)s)")
    ap.add_argument("--output", default=DEFAULT_OUTPUT, help="the CSV to write, '-' for standard output (default: %(default)s)")
    a = ap.parse_args(argv)
    try:
        csv = convert(a.input)
    except (InputError, OSError) as e:
        print(f"make_globular_clusters: {e}", file=sys.stderr)
        return 2
    if a.output == "-":
        sys.stdout.write(csv)
        return 0
    tmp = a.output + ".tmp"  # written whole, then renamed: never a half-written table
    with open(tmp, "w", encoding="ascii", newline="\n") as f:
        f.write(csv)
    os.replace(tmp, a.output)
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
