#!/usr/bin/env python3
"""`slipscreen compare` on the reduced demo (the fictional Marrowick Basin, regions/marrowick),
checked with pandas and scipy (docs/compare.md):

- a run compared with itself reports no change: comparison.json says so, every P(slip) change and
  z is 0, nothing exceeds the noise, nothing is flagged or cleared, no well or input changed;
- the demo against the demo with one well (MW-03) removed from wells.csv and histories.csv names
  exactly that well as removed (no well added or changed), the wells and histories files as the
  changed inputs, and as "moved" exactly the segments whose change exceeds the noise by scipy's
  Pearson chi-square of each 2x2 table (scipy.stats.chi2_contingency, correction=False; z² = χ²,
  the same test): at least one; the flagged and cleared segments per threshold at the last common
  date are those of the two runs' segment_probability.csv;
- an SI run against an oilfield run of the same scenario: the same P(slip) (no change anywhere)
  and the median dp columns equal after conversion (psi = 6894.757293168361 Pa, NIST SP 811
  App. B) within the rounding of the printed values;
- an earlier review (histories to April 2026, catalog to 2026-01-01) against the later one: each
  well's volume between the two histories' ends is the sum of the later histories' rows for those
  months, nothing earlier is revised, and the new events are the later catalog's kept events after
  the earlier review's last one;
- refusals, each with a non-zero exit and both values or the file named: runs of different
  regions or working CRSs (a copy of the run with its manifest edited), a run missing
  segment_probability.csv, a folder that is not a run; an output folder that is a run (even with
  --force); an existing comparison without --force. The caution is printed once.

    compare_with_pandas.py SLIPSCREEN SOURCE_DIR WORK_DIR

The demo is reduced as in reduced_demo.py, here with 400 realizations (so that removing one well
moves some segments beyond the noise), 100 bootstrap resamples of the b-value, and no rasters,
GeoPackage or report, so that each run takes about 2 s.
"""
import json
import math
import shutil
import subprocess
import sys
from pathlib import Path

import pandas as pd
from scipy.stats import chi2_contingency

sys.dont_write_bytecode = True  # no __pycache__ in the source tree
from read_outputs_with_pandas import fail  # noqa: E402
from reduced_demo import reduced_demo, run_checked  # noqa: E402 (the shared demo copy)

PSI = 6894.757293168361
REMOVED = "MW-03"
CAUTION = "Screening estimate from simplified physics"


def prepare(source, work):
    reduced_demo(source, work, fail)
    scenario = work / "regions" / "marrowick" / "scenario.toml"
    text = scenario.read_text()
    for old, new in (("realizations = 100", "realizations = 400"), ("rasters = true", "rasters = false"),
                     ("geopackage = true", "geopackage = false"), ("bootstrap = 500", "bootstrap = 100"),
                     ("[output]\n", "[output]\nreport = false\n")):
        if text.count(old) != 1:
            fail(f"the reduced demo scenario no longer has exactly one '{old.strip()}'")
        text = text.replace(old, new)
    scenario.write_text(text)


def remove_well(work, well):
    for name in ("wells.csv", "histories.csv"):
        path = work / "regions" / "marrowick" / name
        lines = path.read_text().splitlines(keepends=True)
        kept = [line for line in lines if not line.startswith(well + ",")]
        if len(kept) == len(lines):
            fail(f"{name} of the demo has no row of {well}")
        path.write_text("".join(kept))


def compare(slipscreen, work, old, new, out, *extra, expect=0):
    cmd = [slipscreen, "compare", str(old), str(new), "--out", str(out), "--reproducible", *extra]
    done = subprocess.run(cmd, cwd=work, capture_output=True, text=True)
    if done.returncode != expect:
        fail(f"{' '.join(cmd)} exited {done.returncode}, expected {expect}:\n{done.stdout}\n{done.stderr}")
    if expect == 0:
        if done.stdout.count(CAUTION) != 1:
            fail(f"the summary of {out} carries the caution {done.stdout.count(CAUTION)} times, not once")
        table = pd.read_csv(work / out / "comparison.csv", keep_default_na=False)
        summary = json.loads((work / out / "comparison.json").read_text())
        if not summary["caution"].startswith(CAUTION):
            fail(f"{out}/comparison.json has no caution")
        return table, summary, done.stdout
    return done.stderr


def check_no_change(table, summary, stdout, what):
    if summary["any_change"]:
        fail(f"{what}: comparison.json says something changed")
    if "No change" not in stdout:
        fail(f"{what}: the summary does not say 'No change'")
    for col in ("p_slip_change", "z"):
        if (table[col].astype(float) != 0).any():
            fail(f"{what}: {col} is not 0 everywhere")
    if (table["exceeds_noise"] != "no").any() or (table["newly_flagged"] != "").any() or (table["cleared"] != "").any():
        fail(f"{what}: a segment exceeds the noise or crosses a threshold")
    if any(w["change"] != "unchanged" for w in summary["wells"]["wells"]) or summary["parameters"]:
        fail(f"{what}: a well or a parameter changed")


def pooled_z(p_old, n_old, p_new, n_new):
    """|z| from scipy's Pearson chi-square of the 2x2 table of counts (None when a column is empty)."""
    x_old, x_new = round(p_old * n_old), round(p_new * n_new)
    if x_old + x_new in (0, n_old + n_new):
        return 0.0
    chi2 = chi2_contingency([[x_old, n_old - x_old], [x_new, n_new - x_new]], correction=False)[0]
    return math.sqrt(chi2)


def check_well_removed(work, table, summary):
    wells = summary["wells"]["wells"]
    removed = [w["well_id"] for w in wells if w["change"] == "removed"]
    others = [w["well_id"] for w in wells if w["change"] not in ("removed", "unchanged")]
    if removed != [REMOVED] or others:
        fail(f"the comparison names removed {removed} and changed or added {others}, expected only {REMOVED} removed")
    changed = sorted(i["role"] for i in summary["inputs"] if i["change"] != "unchanged")
    if changed != ["histories", "wells"]:
        fail(f"changed inputs {changed}, expected histories and wells")
    n_old, n_new = summary["probabilities"]["realizations_old"], summary["probabilities"]["realizations_new"]
    if (n_old, n_new) != (400, 400):
        fail(f"realizations {n_old}, {n_new}: expected 400 in both runs")
    keep = ["segment_id", "date", "p_slip"]
    old = pd.read_csv(work / "a" / "run" / "segment_probability.csv")[keep].rename(columns={"p_slip": "p_run_old"})
    new = pd.read_csv(work / "b" / "run" / "segment_probability.csv")[keep].rename(columns={"p_slip": "p_run_new"})
    both = old.merge(new, on=["segment_id", "date"])
    if len(both) != len(table):
        fail(f"comparison.csv has {len(table)} rows, the two runs share {len(both)} segment-dates")
    merged = table.merge(both, on=["segment_id", "date"])
    if len(merged) != len(table):
        fail("comparison.csv has segment-dates that are not in both runs")
    moved_reference = set()
    for _, r in merged.iterrows():
        if abs(r.p_slip_old - r.p_run_old) > 1e-12 or abs(r.p_slip_new - r.p_run_new) > 1e-12:
            fail(f"{r.segment_id} {r.date}: P(slip) is not that of the two runs' tables")
        z = pooled_z(r.p_run_old, n_old, r.p_run_new, n_new)
        if abs(abs(r.z) - z) > 0.0005 + 1e-9:  # z printed with 3 decimals
            fail(f"{r.segment_id} {r.date}: |z| {abs(r.z)} differs from scipy's {z}")
        if z > 1.959963984540054:  # scipy.stats.norm.ppf(0.975)
            moved_reference.add(r.segment_id)
    moved = set(table.loc[table.exceeds_noise == "yes", "segment_id"])
    if moved != moved_reference or moved != set(summary["probabilities"]["segments_exceeding_noise"]):
        fail(f"segments beyond the noise {sorted(moved)}, scipy's {sorted(moved_reference)}")
    if not moved:
        fail(f"removing {REMOVED} moves no segment beyond the noise: the test would not show a difference")
    last = max(table.date)
    at_last = merged[merged.date == last]
    for f in summary["thresholds"]:
        t = f["threshold"]
        flagged = sorted(at_last.loc[(at_last.p_run_new >= t) & (at_last.p_run_old < t), "segment_id"])
        cleared = sorted(at_last.loc[(at_last.p_run_new < t) & (at_last.p_run_old >= t), "segment_id"])
        if sorted(f["newly_flagged"]) != flagged or sorted(f["cleared"]) != cleared or f["date"] != last:
            fail(f"threshold {t}: flagged {f['newly_flagged']}, cleared {f['cleared']}; expected {flagged}, {cleared}")
    return sorted(moved)


def check_units(table, summary):
    changed = [p["key"] for p in summary["parameters"]]
    if changed != ["scenario.output.units"]:
        fail(f"SI against oilfield: parameters changed {changed}, expected only scenario.output.units")
    if (table.p_slip_change.astype(float) != 0).any() or (table.exceeds_noise != "no").any():
        fail("SI against oilfield: P(slip) differs")
    # Both medians in MPa here (the later run's units are oilfield; --units SI asked for MPa).
    bad = (table.dp_p50_old_MPa - table.dp_p50_new_MPa).abs() > 0.5e-4 * PSI / 1e6 + 0.5e-4 + 0.5e-4 + 1e-9
    if bad.any():
        fail(f"SI against oilfield: median dp differs beyond rounding at {table[bad].segment_id.tolist()[:3]}")


def make_earlier_review(work):
    """WORK/early: the scenario of WORK/a as an earlier review would have run it: the histories up to
    April 2026 (the later months assumed, as continue_active_until does) and the catalog up to
    2026-01-01."""
    shutil.rmtree(work / "early", ignore_errors=True)
    shutil.copytree(work / "a" / "regions", work / "early" / "regions")
    shutil.copytree(work / "a" / "catalogs", work / "early" / "catalogs")
    histories = work / "early" / "regions" / "marrowick" / "histories.csv"
    lines = histories.read_text().splitlines(keepends=True)
    kept = [line for line in lines if not any(f",2026-{m:02d}," in line for m in range(5, 13))]
    if len(kept) == len(lines):
        fail("the demo histories have no month after April 2026")
    histories.write_text("".join(kept))
    scenario = work / "early" / "regions" / "marrowick" / "scenario.toml"
    text = scenario.read_text()
    if text.count("[catalog]\n") != 1:
        fail("the demo scenario no longer has one [catalog] table")
    scenario.write_text(text.replace("[catalog]\n", '[catalog]\nto = "2026-01-01"\n'))


def check_later_review(work, summary):
    """The earlier review against the later one: volumes between the histories' ends are the
    later histories' rows of May to October 2026 (bbl = 0.158987294928 m3, NIST SP 811 App. B),
    nothing of the earlier history is revised, and the new events are the later review's kept
    events after the earlier review's last one."""
    interval = summary["wells"]["volume_interval"]
    if interval != {"from": "2026-05-01T00:00:00Z", "to": "2026-11-01T00:00:00Z"}:
        fail(f"the histories' ends {interval}: expected 2026-05-01 to 2026-11-01")
    h = pd.read_csv(work / "a" / "regions" / "marrowick" / "histories.csv", comment="#")
    h = h[(h.month >= "2026-05") & (h.month <= "2026-10")]
    expected = (h.groupby("well")["volume [bbl]"].sum() * 0.158987294928).to_dict()
    if not expected:
        fail("the demo histories report nothing from May to October 2026")
    for w in summary["wells"]["wells"]:
        want = expected.get(w["well_id"], 0.0)
        if abs(w["volume_reported_new_m3"] - want) > 1e-9 * max(want, 1.0) or w["volume_revised_before_old_end_m3"] != 0:
            fail(f"{w['well_id']}: reported {w['volume_reported_new_m3']} m3 between the ends (expected {want}), "
                 f"revised {w['volume_revised_before_old_end_m3']}")
        if w["change"] != "unchanged":
            fail(f"{w['well_id']} is {w['change']} between two reviews of the same wells")
        if want > 0 and not w["volume_expected_old_m3"] > 0:
            fail(f"{w['well_id']}: the earlier run assumed no volume after its history although the well was active")
    changed = sorted(i["role"] for i in summary["inputs"] if i["change"] != "unchanged")
    if changed != ["histories", "scenario"]:
        fail(f"changed inputs {changed}, expected histories and scenario")
    catalog = summary["catalog"]
    events = pd.read_csv(work / "a" / "run" / "catalog_events.csv")
    later = sorted(events.loc[pd.to_datetime(events.time) > pd.to_datetime(catalog["old"]["last_event"]), "event_id"])
    found = sorted(e["event_id"] for e in catalog["events_after_old_last_event"])
    if not later or found != later:
        fail(f"{len(found)} events after the earlier review's last event; the later catalog has {len(later)}")
    if catalog["old"]["last_event"] >= "2026-01-01" or catalog["change"]["sigma"] is None:
        fail(f"the earlier review's catalog: {catalog['old']}, change {catalog['change']}")
    return len(found)


def edited_copy(run, copy, edit):
    shutil.rmtree(copy, ignore_errors=True)
    shutil.copytree(run, copy)
    manifest = json.loads((copy / "manifest.json").read_text())
    edit(manifest)
    (copy / "manifest.json").write_text(json.dumps(manifest, indent=2))


def check_refusals(slipscreen, work):
    run = work / "a" / "run"
    edited_copy(run, work / "other-region", lambda m: m["parameters"]["scenario"]["region"].update(name="Elsewhere"))
    err = compare(slipscreen, work, "a/run", "other-region", "x1", expect=3)
    if "Marrowick Basin (fictional)" not in err or "Elsewhere" not in err:
        fail(f"different regions: the message does not name both: {err}")
    edited_copy(run, work / "other-crs", lambda m: m["parameters"]["scenario"]["region"].update(crs="EPSG:32614"))
    err = compare(slipscreen, work, "a/run", "other-crs", "x2", expect=3)
    if "EPSG:32708" not in err or "EPSG:32614" not in err:
        fail(f"different working CRSs: the message does not name both: {err}")
    edited_copy(run, work / "no-table", lambda m: None)
    (work / "no-table" / "segment_probability.csv").unlink()
    err = compare(slipscreen, work, "no-table", "a/run", "x3", expect=3)
    if "segment_probability.csv" not in err or "no-table" not in err:
        fail(f"a run without its P(slip) table: the message names neither: {err}")
    err = compare(slipscreen, work, "a/run", "regions", "x4", expect=5)
    if "not a run folder" not in err:
        fail(f"a folder that is not a run: {err}")
    for out, extra in (("b/run", ["--force"]), ("same", [])):
        err = compare(slipscreen, work, "a/run", "a/run", out, *extra, expect=5)
    if any((work / x).exists() for x in ("x1", "x2", "x3", "x4")):
        fail("a refused comparison left a folder")
    compare(slipscreen, work, "a/run", "a/run", "same", "--force")  # an earlier comparison is replaced


def main():
    slipscreen, source, work = Path(sys.argv[1]).resolve(), Path(sys.argv[2]), Path(sys.argv[3])
    prepare(source, work / "a")
    shutil.rmtree(work / "b", ignore_errors=True)
    shutil.copytree(work / "a", work / "b")
    remove_well(work / "b", REMOVED)
    scenario = ["run", "regions/marrowick/scenario.toml", "--reproducible", "--out"]
    run_checked([slipscreen, *scenario, "run"], work / "a", fail)
    run_checked([slipscreen, *scenario, "run-oilfield", "--units", "oilfield"], work / "a", fail)
    run_checked([slipscreen, *scenario, "run"], work / "b", fail)
    make_earlier_review(work)
    run_checked([slipscreen, *scenario, "run"], work / "early", fail)
    for old in ("same", "removed", "units", "review"):
        shutil.rmtree(work / old, ignore_errors=True)

    table, summary, stdout = compare(slipscreen, work, "a/run", "a/run", "same")
    check_no_change(table, summary, stdout, "a run against itself")
    table, summary, stdout = compare(slipscreen, work, "a/run", "b/run", "removed")
    moved = check_well_removed(work, table, summary)
    last = json.loads((work / "b" / "run" / "catalog_summary.json").read_text())["last_time"]
    if summary["catalog"]["new"]["last_event"] != last or summary["catalog"]["old"]["last_event"] != last:
        fail(f"the catalog's last events {summary['catalog']['old']}, {summary['catalog']['new']}: expected {last}")
    for name in [REMOVED, *moved]:
        if name not in stdout:
            fail(f"the summary does not name {name}")
    table, summary, _ = compare(slipscreen, work, "a/run", "a/run-oilfield", "units", "--units", "SI")
    check_units(table, summary)
    _, summary, stdout = compare(slipscreen, work, "early/run", "a/run", "review")
    new_events = check_later_review(work, summary)
    if f"Catalog: {new_events} events after" not in stdout:
        fail("the summary does not count the new events")
    check_refusals(slipscreen, work)
    print(f"OK: itself: no change; {REMOVED} removed: moved {', '.join(moved)}; SI against oilfield: same P(slip); "
          f"earlier review: {new_events} new events, volumes from the histories")


if __name__ == "__main__":
    main()
