#!/usr/bin/python3
"""Live check of the 'extinction' verb against Barbary's 'extinction' package (Debian python3-extinction).

For every shipped filter curve in calibration/filters/, each law, two R_V values and two source spectra, runs
  $PHOTOMETALLICITY extinction --curve FILE --law LAW --rv RV [--teff T] --json
and compares with the same photon-weighted integral done here with numpy on the curve's own grid (trapezoid
rule), the law taken from the package:
  a_over_ebv = R_V * Int S l r f dl / Int S l f dl,  lambda_eff = Int S l f l dl / Int S l f dl.
Tolerances: 0.2% for ccm89 and odonnell94, 1% for fitzpatrick99 (our F99 uses the published Table 4 optical
anchors, the package the updated FM_UNRED ones); lambda_eff to 1e-6 relative (pure integration).
Also checks that bad input exits with code 2. Prints PASS/FAIL lines; exit code 1 if any failed.
"""
import glob
import json
import os
import subprocess
import sys
import tempfile

import numpy as np
import extinction

exe = os.environ.get("PHOTOMETALLICITY")
root = os.environ.get("REPO_ROOT") or os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "..")
if not exe:
    print("FAIL extinction: PHOTOMETALLICITY is not set")
    sys.exit(1)

C2_ANGSTROM_K = 1.438776877e8  # h c / k, CODATA 2018
trapz = getattr(np, "trapezoid", None) or np.trapz
LAWS = {
    "ccm89": (lambda w, rv: extinction.ccm89(w, 1.0, rv), 0.002),
    "odonnell94": (lambda w, rv: extinction.odonnell94(w, 1.0, rv), 0.002),
    "fitzpatrick99": (lambda w, rv: extinction.fitzpatrick99(w, 1.0, rv), 0.01),
}
failed = 0


def report(ok, text):
    global failed
    print(("PASS " if ok else "FAIL ") + text)
    if not ok:
        failed += 1


def load(path):
    rows = []
    for line in open(path):
        s = line.strip()
        if not s or s.startswith("#"):
            continue
        parts = s.replace(";", ",").split(",")
        try:
            rows.append((float(parts[0]), float(parts[1])))
        except ValueError:
            continue  # the header line
    a = np.array(rows, dtype=np.float64)
    return a[:, 0], a[:, 1]


def reference(w, s, law, rv, teff):
    f = np.ones_like(w) if teff is None else w ** -5 / np.expm1(C2_ANGSTROM_K / (w * teff))
    weight = s * w * f
    r = LAWS[law][0](w, rv)
    norm = trapz(weight, w)
    return rv * trapz(weight * r, w) / norm, trapz(weight * w, w) / norm


def run(args):
    p = subprocess.run([exe, "extinction", *args], capture_output=True, text=True)
    return p.returncode, p.stdout, p.stderr


curves = sorted(glob.glob(os.path.join(root, "calibration", "filters", "*.csv")))
report(len(curves) >= 3, f"extinction: {len(curves)} shipped filter curves found")
for path in curves:
    w, s = load(path)
    name = os.path.basename(path)
    for law, (_, tol) in LAWS.items():
        for rv in (3.1, 4.0):
            for teff in (None, 4500.0):
                args = ["--curve", path, "--law", law, "--rv", str(rv), "--json"]
                if teff is not None:
                    args += ["--teff", str(teff)]
                rc, out, err = run(args)
                label = f"extinction {name} {law} R_V={rv} teff={teff or 'flat'}"
                if rc != 0:
                    report(False, f"{label}: exit code {rc}: {err.strip()}")
                    continue
                got = json.loads(out)
                ref_a, ref_l = reference(w, s, law, rv, teff)
                rel = abs(got["a_over_ebv"] / ref_a - 1)
                report(rel <= tol, f"{label}: a_over_ebv {got['a_over_ebv']:.5f} vs extinction {extinction.__version__} "
                                   f"{ref_a:.5f} (rel {rel:.2e}, tol {tol})")
                rel_l = abs(got["lambda_eff_angstrom"] / ref_l - 1)
                report(rel_l <= 1e-6, f"{label}: lambda_eff {got['lambda_eff_angstrom']:.3f} vs numpy {ref_l:.3f} A")
                report(abs(got["a_over_av"] * rv - got["a_over_ebv"]) <= 1e-9 * got["a_over_ebv"],
                       f"{label}: a_over_av * R_V = a_over_ebv")

with tempfile.TemporaryDirectory() as d:
    # Spot checks of the laws themselves across 3000-10000 A: 2 A wide boxcar curves (0.5 A steps) through the CLI
    # against the package's law integrated on the same grid.
    for centre in (3000.0, 3500.0, 4000.0, 5000.0, 6000.0, 7000.0, 8500.0, 10000.0):
        spot = os.path.join(d, f"spot{int(centre)}.csv")
        w = np.arange(centre - 1.0, centre + 1.0001, 0.5)
        with open(spot, "w") as f:
            f.write("# synthetic 2 A boxcar for a spot check\n")
            for x in w:
                f.write(f"{x:.2f},1.0\n")
        for law, (_, tol) in LAWS.items():
            rc, out, err = run(["--curve", spot, "--law", law, "--rv", "3.1", "--json"])
            if rc != 0:
                report(False, f"extinction spot {law} {centre:.0f} A: exit code {rc}: {err.strip()}")
                continue
            got = json.loads(out)["a_over_av"]
            ref = reference(w, np.ones_like(w), law, 3.1, None)[0] / 3.1
            report(abs(got / ref - 1) <= tol, f"extinction spot {law} {centre:.0f} A: A/A_V {got:.5f} vs extinction "
                                              f"{extinction.__version__} {ref:.5f}")
        if centre in (4000.0, 5000.0):
            # Published: CCM89 (Cardelli, Clayton & Mathis 1989, ApJ 345, 245) eq. 3, R_V = 3.1
            published = {4000.0: 1.4646, 5000.0: 1.1223}[centre]
            rc, out, err = run(["--curve", spot, "--law", "ccm89", "--rv", "3.1", "--json"])
            got = json.loads(out)["a_over_av"] if rc == 0 else float("nan")
            report(abs(got - published) <= 1e-4, f"extinction spot ccm89 {centre:.0f} A: {got:.5f} vs published {published}")

    bad = os.path.join(d, "bad.csv")
    with open(bad, "w") as f:
        f.write("# bad\n4000,0.5\n3990,0.6\n4010,0.2\n")
    rc, out, err = run(["--curve", bad])
    report(rc == 2 and "row 2" in err, f"extinction: non-increasing wavelengths exit 2 naming the row ({err.strip()})")
    rc, out, err = run(["--curve", curves[0], "--law", "nosuchlaw"])
    report(rc == 2 and "fitzpatrick99" in err, f"extinction: unknown law exits 2 listing known laws ({err.strip()})")

sys.exit(1 if failed else 0)
