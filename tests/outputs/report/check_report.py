#!/usr/bin/env python3
"""Checks the report of a run against the run's own tables, with general-purpose tools as the
reference (docs/report.md):

- report.pdf with poppler: `pdfinfo` gives the pages and the page size (A4; Letter after
  `report --page Letter`), `pdftotext` shows the screening caution and the top segment's P(slip)
  exactly as segment_probability_summary.csv holds it, and every word inside the page's margins;
- every figure SVG parses as XML (Python's xml.etree), and the area map holds one path of the
  segment stroke width per fault segment of segments.csv;
- every figure CSV equals the rows of the run table it came from, and segment_pressure_history.csv
  equals well_shares.csv at the output dates (both are exact Theis sums);
- report.html loads in headless Chromium with no console message and no request from the page
  (Chromium's net log: a request whose initiator is an origin; a control page with an image from
  the network and a console.error must be caught, so the check can fail), and a screenshot of it
  is not blank (pixel standard deviation with Pillow);
- the models section names the run's pressure model and stress path (pdftotext): Theis and pore
  pressure only for the demo; Hantush-Jacob with its B and the poroelastic path with its kappa for
  the physics fixture (tests/data/scenario/physics_paths.toml, the tiny region);
- the sections "Allowable rate" and "What-if rate changes" show each threshold's allowed factor
  and binding segment as the manifest's capacity block holds them and each what-if variant
  (pdftotext), and figures/capacity_curve.csv equals capacity_curve.csv;
- the conditioning figures: pdftotext shows the caption of each observation point's figure and of
  the prior-against-posterior figure, and their CSVs equal observation_fit.csv and
  posterior_inputs.csv;
- the report is byte-identical when rebuilt with `slipscreen report --reproducible`, and equal to
  the one `run --reproducible` wrote; a folder that is not a run is refused and left as it was.

    check_report.py SLIPSCREEN SOURCE_DIR WORK_DIR

The run: the demo scenario (the fictional Marrowick Basin) copied into WORK_DIR with 100
realizations and output times every 5 years, so that it runs in a few seconds.
"""
import hashlib
import json
import re
import shutil
import subprocess
import sys
import xml.etree.ElementTree as ET
from pathlib import Path

import pandas as pd
from PIL import Image, ImageStat

sys.dont_write_bytecode = True  # no __pycache__ in the source tree
sys.path.insert(0, str(Path(__file__).resolve().parents[1]))
from reduced_demo import reduced_demo  # noqa: E402 (the demo copy shared by the checks in tests/outputs)

CAUTION_START = "Screening estimate from simplified physics and uncertain inputs."
SEGMENT_STROKE = "2.25"  # outputs/report/area_map.hpp, kSegmentStroke


def fail(message):
    print("FAIL: " + message)
    sys.exit(1)


def run(cmd, cwd, expect=0):
    done = subprocess.run([str(c) for c in cmd], cwd=cwd, capture_output=True, text=True)
    if done.returncode != expect:
        fail(f"{' '.join(map(str, cmd))} exited {done.returncode} (expected {expect}):\n{done.stdout}\n{done.stderr}")
    return done


def hashes(folder, names):
    return {n: hashlib.sha256((folder / n).read_bytes()).hexdigest() for n in names}


def check_pdf(folder, page, summary):
    info = run(["pdfinfo", folder / "report.pdf"], folder).stdout
    pages = int(re.search(r"^Pages:\s+(\d+)", info, re.M).group(1))
    size = re.search(r"^Page size:\s+([\d.]+) x ([\d.]+) pts", info, re.M)
    w, h = float(size.group(1)), float(size.group(2))
    # A4 is 210 x 297 mm = 595.276 x 841.890 pt, Letter 8.5 x 11 in = 612 x 792 pt (ISO 216; ANSI).
    expected = {"A4": (595.276, 841.890), "Letter": (612.0, 792.0)}[page]
    if abs(w - expected[0]) > 0.01 or abs(h - expected[1]) > 0.01:
        fail(f"report.pdf: page size {w} x {h} pt, expected {page} {expected}")
    if pages < 3:
        fail(f"report.pdf: {pages} pages; the demo's report needs at least 3 (text, tables, figures)")
    # Every word lies inside the page's margins (a figure laid out at the page's size instead of
    # its own would run off the page).
    boxes = run(["pdftotext", "-bbox", folder / "report.pdf", "-"], folder).stdout
    words = re.findall(r'<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)"', boxes)
    outside = [wd for wd in words if float(wd[0]) < 20 or float(wd[2]) > w - 20 or float(wd[3]) > h - 10]
    if not words or outside:
        fail(f"report.pdf: {len(outside)} of {len(words)} words lie outside the page's margins")
    text = run(["pdftotext", folder / "report.pdf", "-"], folder).stdout
    flat = " ".join(text.split())
    if CAUTION_START not in flat:
        fail("report.pdf: pdftotext does not show the screening caution")
    if flat.find(CAUTION_START) > flat.find("Segments closest to failure"):
        fail("report.pdf: the caution is not at the top of page one")
    top = summary.sort_values("p_slip_final", ascending=False, kind="stable").iloc[0]
    raw = pd.read_csv(folder / "segment_probability_summary.csv", dtype=str)
    p_text = raw.loc[raw["segment_id"] == top["segment_id"], "p_slip_final"].iloc[0]
    row = re.search(re.escape(top["segment_id"]) + r" .*", flat)
    if not row or p_text not in row.group(0).split()[:12]:
        fail(f"report.pdf: the top segment {top['segment_id']} is not shown with P(slip) {p_text}")
    return pages


def pdf_words(folder):
    return " ".join(run(["pdftotext", folder / "report.pdf", "-"], folder).stdout.split())


def check_models(flat, expected, where):
    """Each expected phrase appears in the report's "Pressure and stress models" section."""
    start = flat.find("Pressure and stress models")
    section = flat[start:flat.find("Stress at the reference depth", start)] if start >= 0 else ""
    missing = [e for e in expected if e not in section]
    if missing:
        fail(f"{where}: the report's models section does not show {missing}:\n{section}")


def check_physics_report(slipscreen, source, work):
    """The tiny region with a leaky formation and the poroelastic path: the report says so."""
    folder = work / "physics"
    run([slipscreen, "run", source / "tests/data/scenario/physics_paths.toml", "--out", folder, "--reproducible"], work)
    # B = sqrt(k h b'/k') = sqrt(100 mD x 100 m x 20 m / 0.001 mD) = sqrt(2e8) m = 14142 m, and
    # kappa = alpha(1 - 2 nu)/(1 - nu) = 0.8 x 0.5 / 0.75 = 0.533 (Engelder & Fischer 1994): arithmetic,
    # the fixture's values.
    check_models(pdf_words(folder), ["Hantush & Jacob (1955) leaky formation", "14142 m, B = √(k h b′/k′)", "poroelastic (Engelder & Fischer 1994)",
                                     "= 0.533 for Biot's α = 0.8 and Poisson's ratio ν = 0.25"], "physics fixture")
    if "Theis (1935)" in pdf_words(folder):
        fail("physics fixture: the report of a leaky run names the Theis model")
    # No [capacity], no [[what_if]]: neither section nor the figure.
    if "Allowable rate" in pdf_words(folder) or "What-if rate changes" in pdf_words(folder) or \
            (folder / "figures" / "capacity_curve.csv").exists():
        fail("physics fixture: a run without [capacity] and [[what_if]] has their sections or figure")
    # The same with a probabilistic screen and an uncertain Biot coefficient: kappa per realization.
    fixture = source / "tests/data/scenario/physics_paths.toml"
    text = fixture.read_text().replace('file = "tiny/', f'file = "{(fixture.parent / "tiny").as_posix()}/')
    text += '\n[uncertainty]\nrealizations = 50\nthresholds = [0.05]\n\n[uncertainty.stress]\nbiot = "uniform(0.6, 0.9)"\n'
    (work / "physics_uncertain.toml").write_text(text)
    folder = work / "physics-uncertain"
    run([slipscreen, "run", work / "physics_uncertain.toml", "--out", folder, "--reproducible"], work)
    check_models(pdf_words(folder), ["κ from each realization's α (uniform(0.6, 0.9)) and ν (fixed)",
                                     "the leakage rate D/B² is the same in every realization"], "uncertain physics")


def check_svgs(folder, segments):
    svgs = sorted((folder / "figures").glob("*.svg"))
    if len(svgs) < 3:
        fail(f"figures/: {len(svgs)} SVG files, expected the map, the P(slip) curves and the pressure history")
    for svg in svgs:
        root = ET.parse(svg).getroot()  # raises on anything that is not XML
        if not root.tag.endswith("svg"):
            fail(f"{svg}: the root element is {root.tag}")
    root = ET.parse(folder / "figures" / "area_map.svg").getroot()
    strokes = [p for p in root.iter() if p.tag.endswith("path") and
               re.search(r"stroke-width:\s*" + re.escape(SEGMENT_STROKE) + r"\b", p.get("style", "") +
                         ";stroke-width:" + p.get("stroke-width", ""))]
    if len(strokes) != len(segments):
        fail(f"area_map.svg: {len(strokes)} segment paths, segments.csv has {len(segments)} segments")
    return len(svgs)


def check_figure_data(folder):
    text = lambda name: pd.read_csv(folder / name, dtype=str, keep_default_na=False)
    prob = text("segment_probability.csv")
    last = prob["date"].max()
    area = text("figures/area_map.csv")
    expected = prob.loc[prob["date"] == last, ["segment_id", "date", "p_slip"]].sort_values("segment_id")
    if not area.sort_values("segment_id").reset_index(drop=True).equals(expected.reset_index(drop=True)):
        fail("figures/area_map.csv differs from segment_probability.csv at the last date")
    curves = text("figures/slip_probability.csv")
    cols = ["segment_id", "date", "p_slip", "p_slip_ci_low", "p_slip_ci_high"]
    want = prob[prob["segment_id"].isin(curves["segment_id"].unique())][cols]
    if not curves.sort_values(["segment_id", "date"]).reset_index(drop=True).equals(
            want.sort_values(["segment_id", "date"]).reset_index(drop=True)):
        fail("figures/slip_probability.csv differs from segment_probability.csv")
    summary = pd.read_csv(folder / "segment_probability_summary.csv")
    top = list(summary.sort_values("p_slip_final", ascending=False, kind="stable")["segment_id"][:5])
    if list(curves["segment_id"].unique()) != top:
        fail(f"figures/slip_probability.csv shows {list(curves['segment_id'].unique())}, the top five are {top}")
    history = text("segment_pressure_history.csv")
    shown = 0
    for csv in sorted((folder / "figures").glob("pressure_history_*.csv")):
        rank = csv.stem.rsplit("_", 1)[1]
        got = text(f"figures/{csv.name}")
        want = history[history["rank"] == rank][["rank", "segment_id", "date", "well_id", "dp_MPa"]]
        if not got.reset_index(drop=True).equals(want.reset_index(drop=True)):
            fail(f"figures/{csv.name} differs from segment_pressure_history.csv rank {rank}")
        shown += 1
    if shown == 0:
        fail("figures/: no pressure_history_*.csv")
    # The monthly series equals well_shares.csv at the output dates (6 decimals of MPa in both).
    h = pd.read_csv(folder / "segment_pressure_history.csv")
    shares = pd.read_csv(folder / "well_shares.csv")
    both = h.merge(shares, on=["segment_id", "date", "well_id"], suffixes=("", "_shares"))
    if both.empty or both["date"].nunique() != shares["date"].nunique():
        fail("segment_pressure_history.csv does not hold every output date of well_shares.csv")
    worst = (both["dp_MPa"] - both["dp_MPa_shares"]).abs().max()
    if worst > 1.5e-6:  # the two tables round to 1e-6 MPa (docs/outputs.md)
        fail(f"segment_pressure_history.csv differs from well_shares.csv by {worst} MPa at an output date")
    return shown, len(both)


def check_conditioning_figures(folder, flat):
    """The conditioning figures (docs/report.md): pdftotext finds each one's caption, one per
    observation point of observation_fit.csv and the prior-against-posterior figure, and each
    figure's CSV holds the table's values as text."""
    fit = pd.read_csv(folder / "observation_fit.csv", dtype=str, keep_default_na=False)
    ids = list(dict.fromkeys(fit["observation_id"]))
    if not ids:
        fail("observation_fit.csv: no observations in the demo run")
    for obs in ids:
        if f"Observed and modelled pressure change at {obs}" not in flat:
            fail(f"report.pdf: pdftotext does not show the observation figure of {obs}")
        name = "observation_fit_" + re.sub(r"[^a-z0-9-]", "_", obs.lower())
        got = pd.read_csv(folder / "figures" / f"{name}.csv", dtype=str, keep_default_na=False)
        want = fit[fit["observation_id"] == obs].drop(columns=["x", "y"]).sort_values("date", kind="stable")
        if not got.reset_index(drop=True).equals(want.reset_index(drop=True)):
            fail(f"figures/{name}.csv differs from observation_fit.csv for {obs}")
    if "Prior and posterior of the uncertain inputs" not in flat:
        fail("report.pdf: pdftotext does not show the prior-against-posterior figure")
    post = pd.read_csv(folder / "posterior_inputs.csv", dtype=str, keep_default_na=False)
    got = pd.read_csv(folder / "figures" / "posterior_inputs.csv", dtype=str, keep_default_na=False)
    if not got[list(post.columns[:8])].equals(post[list(post.columns[:8])]):
        fail("figures/posterior_inputs.csv differs from posterior_inputs.csv")
    return len(ids)


def check_decisions(folder, flat):
    """The allowable-rate and what-if sections: their titles in pdftotext, the binding segment of
    each threshold with the manifest's allowed factor (3 significant digits, as the report rounds
    it), and figures/capacity_curve.csv equal to capacity_curve.csv, column for column."""
    cap = manifest_block(folder, "capacity")
    for title in ("Allowable rate", "What-if rate changes"):
        if title not in flat:
            fail(f"report.pdf: no section '{title}' in a run with [capacity] and [[what_if]]")
    section = flat[flat.find("Allowable rate"):flat.find("What-if rate changes")]
    checked = 0
    for th in cap["thresholds"]:
        w = th["wilson_upper"]
        if not w["exceeded_up_to_f_max"]:
            continue
        # The row: "P(slip) ≤ <threshold>", the allowed factor, the binding segment (the table's order).
        start = section.find(f"P(slip) ≤ {th['threshold']:.6g} ")
        cells = section[start:].split()[3:5] if start >= 0 else []
        if cells != [f"{w['f_allowed']:.3g}", w["binding_segment"]]:
            fail(f"report.pdf: the answer for P <= {th['threshold']} reads {cells}, the manifest holds "
                 f"f_allowed {w['f_allowed']} bound by {w['binding_segment']}")
        checked += 1
    if checked == 0:
        fail("the demo's capacity block has no threshold answer to check")
    text = lambda name: pd.read_csv(folder / name, dtype=str, keep_default_na=False)
    if not text("figures/capacity_curve.csv").equals(text("capacity_curve.csv")):
        fail("figures/capacity_curve.csv differs from capacity_curve.csv")
    variants = manifest_block(folder, "what_if")["variants"]
    for v in variants:
        if v["name"] not in flat[flat.find("What-if rate changes"):]:
            fail(f"report.pdf: the what-if variant {v['name']} is not shown")
    return checked, len(variants)


def manifest_block(folder, key):
    block = json.loads((folder / "manifest.json").read_text())["parameters"].get(key)
    if not isinstance(block, dict):
        fail(f"manifest.json: no parameters.{key} block (the demo has [capacity] and [[what_if]])")
    return block


CHROMIUM = ["chromium", "--headless", "--no-sandbox", "--disable-gpu", "--no-first-run",
            "--disable-background-networking", "--enable-logging=stderr", "--v=0"]


def load_in_chromium(page, work, tag):
    profile, netlog = work / f"chromium-{tag}", work / f"netlog-{tag}.json"
    shutil.rmtree(profile, ignore_errors=True)
    shot = work / f"screenshot-{tag}.png"
    done = subprocess.run(CHROMIUM + [f"--user-data-dir={profile}", f"--log-net-log={netlog}",
                                      f"--screenshot={shot}", "--window-size=1000,1400", page.as_uri()],
                          capture_output=True, text=True, timeout=120)
    if done.returncode != 0:
        fail(f"chromium exited {done.returncode} on {page}:\n{done.stderr[-2000:]}")
    console = [line for line in done.stderr.splitlines() if ":CONSOLE" in line]
    log = json.loads(netlog.read_text())
    names = {v: k for k, v in log["constants"]["logEventTypes"].items()}
    # Requests of the browser itself carry no origin; a page's requests carry its origin ("null" for a file).
    requests = [e["params"]["url"] for e in log["events"]
                if names.get(e["type"]) == "URL_REQUEST_START_JOB"
                and e.get("params", {}).get("initiator", "not an origin") != "not an origin"]
    return console, requests, shot


def check_html(folder, work):
    html = (folder / "report.html").read_text(encoding="utf-8")
    if "<script" in html.lower():
        fail("report.html holds a script")
    if re.search(r"""(src|href)\s*=\s*["'](?!#|data:)""", html):
        fail("report.html refers to a file or address outside itself")
    control = work / "control.html"
    control.write_text('<!DOCTYPE html><html><head><title>control</title></head><body>'
                       '<img src="http://example.invalid/control.png"><script>console.error("control")</script>'
                       '</body></html>')
    console, requests, _ = load_in_chromium(control, work, "control")
    if not console or not requests:
        fail(f"the Chromium check does not see a control page's console message ({console}) or request ({requests})")
    console, requests, shot = load_in_chromium(folder / "report.html", work, "report")
    if console:
        fail(f"report.html: console messages in Chromium: {console}")
    if requests:
        fail(f"report.html: Chromium made network requests: {requests}")
    image = Image.open(shot).convert("L")
    spread = ImageStat.Stat(image).stddev[0]
    if spread < 10:  # a blank page has none; text, tables and the caution box give tens of grey levels
        fail(f"report.html: the screenshot is nearly blank (grey-level standard deviation {spread:.1f})")
    return spread


def main():
    if len(sys.argv) != 4:
        fail(__doc__)
    slipscreen, source, work = (Path(a).resolve() for a in sys.argv[1:])
    reduced_demo(source, work, fail)
    run([slipscreen, "run", "regions/marrowick/scenario.toml", "--out", "run", "--reproducible"], work)
    folder = work / "run"
    manifest = json.loads((folder / "manifest.json").read_text())
    report = manifest["report"]["files"]
    written = sorted(p.relative_to(folder).as_posix() for p in folder.rglob("*") if p.is_file()
                     and (p.name.startswith("report.") or p.parent.name == "figures"))
    if written != report:
        fail(f"the manifest lists the report files {report}, the run wrote {written}")

    segments = pd.read_csv(folder / "segments.csv")
    summary = pd.read_csv(folder / "segment_probability_summary.csv")
    pages = check_pdf(folder, "A4", summary)
    check_models(pdf_words(folder), ["Theis (1935)", "pore pressure only: the total stresses stay as they were",
                                     "Hydraulic diffusivity D"], "demo")
    answers, variants = check_decisions(folder, pdf_words(folder))
    conditioned = check_conditioning_figures(folder, pdf_words(folder))
    check_physics_report(slipscreen, source, work)
    svgs = check_svgs(folder, segments)
    histories, matched = check_figure_data(folder)
    spread = check_html(folder, work)

    # Rebuilt from the folder: the same bytes as the run wrote, twice.
    before = hashes(folder, report)
    for _ in range(2):
        run([slipscreen, "report", folder, "--reproducible"], work)
        if hashes(folder, report) != before:
            changed = [n for n in report if hashes(folder, [n]) != {n: before[n]}]
            fail(f"`slipscreen report --reproducible` changed {changed}")
    if sorted(p.name for p in folder.iterdir() if p.name.startswith(".report-staging")):
        fail("a staging folder of the report is left in the run folder")
    # Letter pages on request; the run stays a run (a forced rerun may replace it).
    run([slipscreen, "report", folder, "--reproducible", "--page", "Letter"], work)
    check_pdf(folder, "Letter", summary)
    run([slipscreen, "run", "regions/marrowick/scenario.toml", "--out", "run", "--reproducible", "--force"], work)
    if hashes(folder, report) != before:
        fail("a forced rerun did not give the report of the first run")
    # Not a run: refused, nothing written.
    other = work / "not-a-run"
    other.mkdir()
    (other / "notes.txt").write_text("mine\n")
    done = run([slipscreen, "report", other], work, expect=5)
    if "not a run folder of slipscreen" not in done.stderr or sorted(p.name for p in other.iterdir()) != ["notes.txt"]:
        fail(f"`slipscreen report` on a folder that is not a run: {done.stderr}")
    print(f"report: {pages} PDF pages (A4, then Letter), {svgs} SVG figures, {histories} pressure histories, "
          f"{matched} monthly values equal to well_shares.csv, screenshot grey-level sd {spread:.1f}, "
          f"rebuilt byte-identical ({len(report)} files), {answers} allowable-rate answers and {variants} "
          f"what-if variants shown, {conditioned} observation figures")
    shutil.rmtree(work, ignore_errors=True)


if __name__ == "__main__":
    main()
