#!/usr/bin/env python3
"""Reads every CSV of a run folder the way users read them (pandas.read_csv with its defaults)
and checks each against the run's manifest: the columns and the number of rows it records, that
columns named with a unit are numbers and date columns dates, that no CSV has a comment line or
the caution, that README.txt lists every file once, that no file but the manifest holds the
build (compiler, git commit), and that every CSV column and JSON key spells its unit the one way
(docs/outputs.md, "Units in names").

    read_outputs_with_pandas.py SLIPSCREEN SOURCE_DIR WORK_DIR

The runs: the reduced demo (reduced_demo.py: the fictional Marrowick Basin with 100
realizations and output times every 5 years, a few seconds), and `slipscreen catalog --out` on
the demo catalog with an r-t view.
"""
import json
import re
import shutil
import sys
from pathlib import Path

import pandas as pd

from reduced_demo import reduced_demo_run, run_checked

# Units as names end in them (docs/outputs.md). A column ending in one holds numbers.
UNIT_SUFFIXES = ("_Pa", "_MPa", "_m", "_km", "_m2", "_m3", "_bbl", "_s", "_days", "_years", "_deg", "_rad",
                 "_m2_per_s", "_per_s", "_per_year", "_N_m", "_kg_per_m3", "_Pa_per_m", "_Pa_s", "_per_Pa")
NUMERIC_NAMES = {"magnitude", "share", "leading_well_share", "friction", "slip_tendency", "dilation_tendency",
                 "p_slip", "p_slip_low", "p_slip_high", "p_slip_ci_low", "p_slip_ci_high", "p_already_critical",
                 "p_never_critical", "p_slip_final", "p_slip_final_ci_low", "p_slip_final_ci_high", "spearman_rho",
                 "rank", "check_point", "segment_index", "median_realization", "wells", "rate_ratio",
                 "expected_events", "background_expected_events", "footprint_area_fraction"}
# Spellings of units that are not the project's one spelling.
ODD_UNIT = re.compile(r"_(pa|mpa|kpa|gpa|nm|n_m|sec|secs|seconds|meters|metres|meter|metre|degrees|degree|day|yr|yrs|"
                      r"hours)$|_m2_s$|_m3_s$|(?<!_per)_year$|^days_|_[a-z]+_per_[a-z0-9]+_s$")


def fail(message):
    print("FAIL: " + message)
    sys.exit(1)


def make_runs(slipscreen, source, work):
    run = reduced_demo_run(slipscreen, source, work, fail)
    run_checked([slipscreen, "catalog", "catalogs/demo/demo_catalog.csv", "--well", "-135.0,-35.3", "--start",
                 "2011-04-01", "--out", "catalog"], work, fail)
    return [run, work / "catalog"]


def check_keys(names, where):
    for name in names:
        if ODD_UNIT.search(name):
            fail(f"{where}: the name '{name}' spells its unit another way (docs/outputs.md)")


def json_keys(value):
    if isinstance(value, dict):
        for k, v in value.items():
            yield k
            yield from json_keys(v)
    elif isinstance(value, list):
        for v in value:
            yield from json_keys(v)


def check_csv(folder, entry):
    path = folder / entry["path"]
    raw = path.read_text(encoding="utf-8")
    if raw.startswith("#"):
        fail(f"{path}: starts with a comment line")
    if "Screening estimate" in raw:
        fail(f"{path}: carries the caution (it belongs in README.txt and the manifest)")
    table = pd.read_csv(path)
    if list(table.columns) != entry["columns"]:
        fail(f"{path}: pandas reads the columns {list(table.columns)}, the manifest says {entry['columns']}")
    if len(table) != entry["rows"]:
        fail(f"{path}: pandas reads {len(table)} rows, the manifest says {entry['rows']}")
    check_keys(table.columns, str(path))
    for col in table.columns:
        series = table[col]
        if col == "date" or col.endswith("_date") or col.startswith("first_date_p_"):
            pd.to_datetime(series.dropna(), format="%Y-%m-%d")  # raises on anything but an ISO date
        elif col.endswith(UNIT_SUFFIXES) or col in NUMERIC_NAMES:
            if not pd.api.types.is_numeric_dtype(series):
                fail(f"{path}: column '{col}' holds a quantity but pandas reads it as {series.dtype}")
        elif col == "time":
            times = pd.to_datetime(series, utc=True)
            if times.isna().any():
                fail(f"{path}: column 'time' has values pandas cannot read as times")
    return len(table)


def check_readme(folder, files):
    readme = (folder / "README.txt").read_text(encoding="utf-8")
    if readme.count("Screening estimate") != 1:
        fail(f"{folder}/README.txt: the caution should appear exactly once")
    listed = [line.split()[0] for line in readme.split("FILES\n", 1)[1].split("\n\n", 1)[0].splitlines()]
    if sorted(listed) != sorted(files):
        fail(f"{folder}/README.txt lists {sorted(listed)}, the folder holds {sorted(files)}")


def check_folder(folder):
    manifest = json.loads((folder / "manifest.json").read_text(encoding="utf-8"))
    for key in ("name", "version", "git_commit", "compiler", "libraries"):
        if key not in manifest["tool"]:
            fail(f"{folder}/manifest.json: tool.{key} is missing")
    all_files = sorted(p.relative_to(folder).as_posix() for p in folder.rglob("*") if p.is_file())
    # The report (report.html, report.pdf, figures/) is built after the manifest from the run's files
    # and listed by name under "report" (docs/report.md); it shows the tool version, as the manifest.
    report = manifest.get("report", {}).get("files", [])
    files = [f for f in all_files if f not in report]
    listed = sorted([e["path"] for e in manifest["outputs"]] + ["manifest.json"])
    if files != listed:
        fail(f"{folder}: the manifest lists {listed}, the folder holds {files}")
    if report and (not set(report) <= set(all_files) or "report.pdf" not in report):
        fail(f"{folder}: the manifest's report files {report} are not all in the folder")
    check_readme(folder, files)
    # The build is recorded in the manifest only: no other output changes with the build.
    build = [manifest["tool"]["compiler"], "slipscreen " + manifest["tool"]["version"]]
    if manifest["tool"]["git_commit"] != "unknown":
        build.append(manifest["tool"]["git_commit"])
    for name in files:
        if name != "manifest.json":
            data = (folder / name).read_bytes()
            for text in build:
                if text.encode() in data:
                    fail(f"{folder}/{name} holds the build-dependent text '{text}' (only the manifest may)")
    check_keys(json_keys(manifest), f"{folder}/manifest.json")
    for extra in folder.glob("*.json"):
        check_keys(json_keys(json.loads(extra.read_text(encoding="utf-8"))), str(extra))
    tables = [e for e in manifest["outputs"] if e["path"].endswith(".csv")]
    rows = sum(check_csv(folder, e) for e in tables)
    if not tables or rows == 0:
        fail(f"{folder}: no CSV rows to check")
    print(f"{folder.name}: {len(tables)} CSV files, {rows} rows read with pandas {pd.__version__}; "
          f"screens {manifest.get('screens')}")


def main():
    if len(sys.argv) != 4:
        fail(__doc__)
    slipscreen, source, work = Path(sys.argv[1]).resolve(), Path(sys.argv[2]).resolve(), Path(sys.argv[3]).resolve()
    for folder in make_runs(slipscreen, source, work):
        check_folder(folder)
    shutil.rmtree(work, ignore_errors=True)


if __name__ == "__main__":
    main()
