#!/usr/bin/env python3
"""Runs the demo scenario twice, in SI and with `--units oilfield`, and checks with pandas that the
oilfield tables are the SI tables converted (docs/outputs.md, "Units in names"):

- the same CSV files, each with the same rows and the same columns in the same order, a column
  `<name>_MPa` becoming `<name>_psi`, `<name>_m` becoming `<name>_ft` (but the working-CRS
  coordinates `x_m`, `y_m`, `centre_x_m`, `centre_y_m` stay), `_m3` `_bbl`, `_m3_per_d`
  `_bbl_per_d`, `_MPa_per_km` `_psi_per_ft`, `_m2` `_mD`, and every other column unchanged;
- every value of a converted column equal to the SI value times the factor within the rounding of
  the two printed values (half a unit of the last printed decimal of each), and the oilfield
  column printing no fewer significant decimals than the SI one allows (its step in SI units is
  at most the SI column's step);
- every value of any other column identical as text;
- README.txt and the manifest name the unit system;
- screen.gpkg: the SI file's fields converted, and its styles classing the same features
  (oilfield_geopackage.py, with GDAL and QGIS). The GeoTIFFs stay in SI in both runs.

    oilfield_units_with_pandas.py SLIPSCREEN SOURCE_DIR WORK_DIR

The factors are exact definitions (NIST SP 811, 2008, Appendix B): psi = 6894.757293168361 Pa,
ft = 0.3048 m, bbl = 0.158987294928 m3; mD = 9.869233e-16 m2 (common practice). The demo is
the fictional Marrowick Basin (regions/marrowick), reduced as in read_outputs_with_pandas.py
(100 realizations, output times every 5 years) so that each run takes a few seconds.
"""
import json
import sys
from pathlib import Path

import pandas as pd

sys.dont_write_bytecode = True  # no __pycache__ in the source tree
from read_outputs_with_pandas import fail  # noqa: E402
from reduced_demo import reduced_demo, run_checked  # noqa: E402 (the shared demo copy)
from oilfield_geopackage import compare_geopackages, styles_classify_alike  # noqa: E402

PSI = 6894.757293168361
FT = 0.3048
BBL = 0.158987294928
MD = 9.869233e-16
# SI suffix -> (oilfield suffix, oilfield value per SI value)
CONVERTED = {
    "MPa": ("psi", 1e6 / PSI),
    "m": ("ft", 1 / FT),
    "m3": ("bbl", 1 / BBL),
    "m3_per_d": ("bbl_per_d", 1 / BBL),
    "MPa_per_km": ("psi_per_ft", 1e3 * FT / PSI),
    "m2": ("mD", 1 / MD),
}
CRS_COORDINATES = {"x_m", "y_m", "centre_x_m", "centre_y_m"}
# Figure data drawn from the GeoTIFFs, which stay in SI in both systems (docs/outputs.md): compared
# as identical instead of converted.
FROM_SI_RASTERS = {"figures/catalog_event_map.csv"}


def make_runs(slipscreen, source, work):
    reduced_demo(source, work, fail)
    base = [slipscreen, "run", "regions/marrowick/scenario.toml", "--reproducible"]
    si_out = run_checked(base + ["--out", "si"], work, fail)
    oil_out = run_checked(base + ["--out", "oilfield", "--units", "oilfield"], work, fail)
    if "dp_crit MPa" not in si_out or "dp_crit psi" not in oil_out:
        fail("the console summaries do not name MPa (SI) and psi (oilfield)")
    return work / "si", work / "oilfield"


def expected_name(si_name):
    """The oilfield column of an SI column, and the factor from the SI value (None: unchanged)."""
    if si_name in CRS_COORDINATES:
        return si_name, None
    for suffix in sorted(CONVERTED, key=len, reverse=True):
        if si_name.endswith("_" + suffix):
            new_suffix, factor = CONVERTED[suffix]
            return si_name[: -len(suffix)] + new_suffix, factor
    return si_name, None


def decimals(text):
    return len(text) - text.index(".") - 1 if "." in text else 0


def compare(name, si_csv, oil_csv):
    si = pd.read_csv(si_csv, dtype=str, keep_default_na=False)
    oil = pd.read_csv(oil_csv, dtype=str, keep_default_na=False)
    if len(si) != len(oil):
        fail(f"{name}: {len(si)} rows in SI, {len(oil)} in oilfield")
    expected = [expected_name(c) for c in si.columns]
    if [e[0] for e in expected] != list(oil.columns):
        fail(f"{name}: oilfield columns {list(oil.columns)}, expected {[e[0] for e in expected]}")
    converted = 0
    for si_col, (oil_col, factor) in zip(si.columns, expected):
        a, b = si[si_col], oil[oil_col]
        if factor is None:
            differ = (a != b)
            if differ.any():
                i = differ.idxmax()
                fail(f"{name} row {i + 2}: column {si_col} is '{a[i]}' in SI but '{b[i]}' in oilfield")
            continue
        for i, (x, y) in enumerate(zip(a, b)):
            if (x == "") != (y == ""):
                fail(f"{name} row {i + 2}: {si_col} '{x}' against {oil_col} '{y}'")
            if x == "":
                continue
            dx, dy = decimals(x), decimals(y)
            if name.startswith("figures/"):
                # Figure data prints 10 significant digits of values read from the run's tables,
                # which were rounded in each system: allow the tables' rounding (relative 1e-4,
                # at least 4 significant digits in every table) besides the printed digits.
                tolerance = 1e-4 * abs(float(x) * factor) + 0.5 * 10.0 ** -dy + 0.5 * 10.0 ** -dx * factor
                if abs(float(y) - float(x) * factor) > tolerance:
                    fail(f"{name} row {i + 2}: {oil_col} = {y} is not {si_col} = {x} converted")
                converted += 1
                continue
            # The oilfield column's last digit is never coarser than the SI column's.
            if 10.0 ** -dy / factor > 10.0 ** -dx * (1 + 1e-9):
                fail(f"{name}: {oil_col} prints {dy} decimals, coarser than {si_col}'s {dx}")
            tolerance = 0.5 * 10.0 ** -dy + 0.5 * 10.0 ** -dx * factor
            tolerance *= 1 + 1e-9  # the double arithmetic of the check itself
            if abs(float(y) - float(x) * factor) > tolerance:
                fail(f"{name} row {i + 2}: {oil_col} = {y}, but {si_col} = {x} gives {float(x) * factor!r} "
                     f"(tolerance {tolerance:g})")
            converted += 1
    return converted


def main():
    if len(sys.argv) != 4:
        fail(__doc__)
    slipscreen, source, work = Path(sys.argv[1]), Path(sys.argv[2]), Path(sys.argv[3])
    si_run, oil_run = make_runs(slipscreen, source, work)
    si_files = sorted(p.relative_to(si_run) for p in si_run.rglob("*.csv"))
    oil_files = sorted(p.relative_to(oil_run) for p in oil_run.rglob("*.csv"))
    if si_files != oil_files:
        fail(f"CSV files differ: SI {si_files}, oilfield {oil_files}")
    if len(si_files) < 10:
        fail(f"only {len(si_files)} CSV files in the demo run")
    total = 0
    for rel in si_files:
        if str(rel) in FROM_SI_RASTERS:
            if (si_run / rel).read_bytes() != (oil_run / rel).read_bytes():
                fail(f"{rel}: drawn from an SI raster, yet different in the oilfield run")
            continue
        total += compare(str(rel), si_run / rel, oil_run / rel)
    if total == 0:
        fail("no value was converted")
    for folder, system in ((si_run, "SI"), (oil_run, "oilfield")):
        manifest = json.loads((folder / "manifest.json").read_text())
        if manifest["parameters"]["scenario"]["output"]["units"] != system:
            fail(f"{folder}/manifest.json does not record units = {system}")
        if f"Units: {system} (" not in (folder / "README.txt").read_text():
            fail(f"{folder}/README.txt does not say 'Units: {system}'")
    gpkg_values = compare_geopackages(si_run / "screen.gpkg", oil_run / "screen.gpkg", expected_name, fail)
    if gpkg_values == 0:
        fail("screen.gpkg: no value was converted")
    styles, graduated, spread = styles_classify_alike(si_run / "screen.gpkg", oil_run / "screen.gpkg", expected_name,
                                                      work, fail)
    if spread < 2:
        fail("screen.gpkg: a style by a pressure field puts every feature in one class; the check shows nothing")
    print(f"ok: {len(si_files)} tables, {total} converted values within the rounding of their printed digits; "
          f"screen.gpkg: {gpkg_values} converted values, {styles} styles load in QGIS, the {graduated} graduated "
          f"ones put every feature in the same class in both systems")


if __name__ == "__main__":
    main()
