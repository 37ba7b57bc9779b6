#!/usr/bin/python3
"""Writes tests/fixtures/extinction/laws.csv: A(lambda)/A_V of the three laws at tabulated wavelengths and R_V
values, from Barbary's 'extinction' package (Debian python3-extinction). Run with /usr/bin/python3.

Conventions of the package (compared like with like in the C# tests):
  ccm89, odonnell94: A_V monochromatic at x = 1.82 per micron, so a_over_av = ccm89(w, 1.0, r_v).
  fitzpatrick99: A_V = R_V E(B-V) with E(B-V) as Fitzpatrick (1999) defines it (Johnson bands), so
  fitzpatrick99(w, 1.0, r_v) is (k + R_V)/R_V and is 0.979 at 5495 A for R_V = 3.1.
"""
import os
import sys

import numpy as np
import extinction

root = os.environ.get("REPO_ROOT") or os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "..")
out = os.path.join(root, "tests", "fixtures", "extinction", "laws.csv")

waves = np.array([1250.0, 1500.0, 1800.0, 2175.0, 2500.0, 2650.0, 2800.0, 3000.0, 3300.0, 3500.0, 3700.0, 3933.7,
                  3968.5, 4000.0, 4400.0, 4800.0, 5000.0, 5495.0, 5500.0, 6000.0, 6500.0, 7000.0, 7700.0, 8000.0,
                  9000.0, 10000.0, 12200.0, 16000.0, 22000.0, 30000.0], dtype=np.float64)
rvs = [2.5, 3.1, 4.0, 5.0]
laws = {
    "ccm89": lambda w, rv: extinction.ccm89(w, 1.0, rv),
    "odonnell94": lambda w, rv: extinction.odonnell94(w, 1.0, rv),
    "fitzpatrick99": lambda w, rv: extinction.fitzpatrick99(w, 1.0, rv),
}

os.makedirs(os.path.dirname(out), exist_ok=True)
tmp = out + ".tmp"
with open(tmp, "w") as f:
    f.write(f"# made by tests/reference/make_extinction_fixtures.py with python3-extinction {extinction.__version__}, "
            f"numpy {np.__version__}\n")
    f.write("# a_over_av = A(lambda)/A_V from the package with a_v = 1 (see the script for each law's A_V convention)\n")
    f.write("law,rv,wavelength_angstrom,a_over_av\n")
    for name, fn in laws.items():
        for rv in rvs:
            vals = fn(waves, rv)
            for w, v in zip(waves, vals):
                f.write(f"{name},{rv},{w},{v:.10f}\n")
os.replace(tmp, out)
print(f"wrote {out}", file=sys.stderr)
