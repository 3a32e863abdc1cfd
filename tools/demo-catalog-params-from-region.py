#!/usr/bin/python3
"""Build the parameter file of tools/make-demo-catalog.py from a slipscreen region folder.

Reads the region's wells.csv (CRS from its '# crs:' header comment), histories.csv (monthly
volumes with a unit in the header, e.g. 'volume [bbl]') and faults.geojson (CRS from its 'crs'
member), converts the coordinates to WGS 84 longitude/latitude with GDAL's `gdaltransform`
(gdal-bin, in tools/debian-packages.txt), turns the monthly volumes into cumulative m3 samples at
month boundaries, and writes a JSON parameter file. The statistical model parameters (b, Sigma,
detection, depths, seed...) come from --template (an existing parameter file) and can be
overridden on the command line. Standard library only, apart from the gdaltransform program.

Usage:
  tools/demo-catalog-params-from-region.py --region regions/marrowick \
      --template catalogs/demo/params.json --out catalogs/demo/params.json [--sigma -5.0]
"""
import argparse
import csv
import datetime as dt
import json
import os
import re
import subprocess
import sys

BARREL_M3 = 0.158987294928  # 42 US gallons (exact definition)
UNIT_TO_M3 = {"m3": 1.0, "bbl": BARREL_M3, "Mbbl": 1e3 * BARREL_M3, "MMbbl": 1e6 * BARREL_M3, "L": 1e-3}


def to_lonlat(points, crs):
    """[(x, y)] in `crs` -> [(lon, lat)] via gdaltransform (traditional GIS axis order)."""
    if crs in ("EPSG:4326", "OGC:CRS84"):
        return list(points)
    text = "".join("%.6f %.6f\n" % p for p in points)
    out = subprocess.run(["gdaltransform", "-s_srs", crs, "-t_srs", "EPSG:4326", "-output_xy"],
                         input=text, capture_output=True, text=True, check=True).stdout.split("\n")
    res = []
    for line in out[:len(points)]:
        lon, lat = map(float, line.split()[:2])
        if not (-180.0 <= lon <= 360.0 and -90.0 <= lat <= 90.0):
            sys.exit("gdaltransform gave an impossible lon/lat: %s" % line)
        res.append((lon, lat))
    return res


def read_wells(path):
    crs, rows = None, []
    with open(path, encoding="utf-8") as f:
        lines = []
        for line in f:
            m = re.match(r"#\s*crs:\s*(\S+)", line)
            if m:
                crs = m.group(1)
            if not line.startswith("#"):
                lines.append(line)
    for r in csv.DictReader(lines):
        rows.append((r["id"], float(r["x"]), float(r["y"])))
    if crs is None:
        sys.exit("%s: no '# crs:' header comment" % path)
    return crs, rows


def read_histories(path):
    """{well: [(month 'YYYY-MM', volume m3)]} from a 'well,month,volume [unit]' CSV."""
    with open(path, encoding="utf-8") as f:
        lines = [l for l in f if not l.startswith("#")]
    reader = csv.reader(lines)
    header = next(reader)
    m = re.match(r"volume \[(.+)\]", header[2].strip())
    if not m or m.group(1) not in UNIT_TO_M3:
        sys.exit("%s: third column should be 'volume [unit]' with unit one of %s" % (path, sorted(UNIT_TO_M3)))
    k = UNIT_TO_M3[m.group(1)]
    out = {}
    for row in reader:
        if row:
            out.setdefault(row[0].strip(), []).append((row[1].strip(), float(row[2]) * k))
    return out


def month_bounds(month):
    y, m = map(int, month.split("-"))
    start = dt.datetime(y, m, 1, tzinfo=dt.timezone.utc)
    end = dt.datetime(y + (m == 12), m % 12 + 1, 1, tzinfo=dt.timezone.utc)
    return start, end


def iso(t):
    return t.strftime("%Y-%m-%dT%H:%M:%SZ")


def cumulative(months):
    """Cumulative volume samples at month boundaries (a gap keeps the volume constant)."""
    samples, total = [], 0.0
    for month, vol in sorted(months):
        start, end = month_bounds(month)
        if not samples or samples[-1][0] != iso(start):
            samples.append((iso(start), total))
        total += vol
        samples.append((iso(end), total))
    return samples


def main():
    ap = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    ap.add_argument("--region", required=True)
    ap.add_argument("--template", required=True, help="parameter file whose model settings are kept")
    ap.add_argument("--out", required=True)
    ap.add_argument("--sigma", type=float, help="seismogenic index to use")
    ap.add_argument("--seed", type=int)
    args = ap.parse_args()
    with open(args.template, encoding="utf-8") as f:
        p = json.load(f)
    crs, wells = read_wells(os.path.join(args.region, "wells.csv"))
    hist = read_histories(os.path.join(args.region, "histories.csv"))
    lonlat = to_lonlat([(x, y) for _, x, y in wells], crs)
    p["wells"] = []
    first, last = None, None
    for (wid, _, _), (lon, lat) in zip(wells, lonlat):
        if wid not in hist:
            continue
        samples = cumulative(hist[wid])
        first = min(first or samples[0][0], samples[0][0])
        last = max(last or samples[-1][0], samples[-1][0])
        p["wells"].append({"name": wid, "lon": round(lon, 6), "lat": round(lat, 6),
                           "cumulative_volume_m3": [[t, round(v, 1)] for t, v in samples]})
    with open(os.path.join(args.region, "faults.geojson"), encoding="utf-8") as f:
        gj = json.load(f)
    fcrs = gj.get("crs", {}).get("properties", {}).get("name", "EPSG:4326")
    m = re.match(r"urn:ogc:def:crs:(\w+)::(\w+)", fcrs)
    if m:
        fcrs = "%s:%s" % (m.group(1), m.group(2))
    p["faults"] = []
    for feat in gj["features"]:
        g = feat["geometry"]
        lines = [g["coordinates"]] if g["type"] == "LineString" else g["coordinates"]
        for line in lines:
            pts = to_lonlat([(c[0], c[1]) for c in line], fcrs)
            p["faults"].append({"name": feat["properties"].get("fault_id", "fault"),
                                "points": [[round(a, 6), round(b, 6)] for a, b in pts]})
    region = os.path.basename(os.path.normpath(args.region))
    p["region_name"] = "%s (fictional demo region, regions/%s)" % (region.capitalize(), region)
    p["comment"] = ("FICTIONAL parameters for the SYNTHETIC slipscreen demo catalog, built by "
                    "tools/demo-catalog-params-from-region.py from regions/%s (invented wells, volumes and faults; "
                    "coordinates converted from %s to WGS 84 lon/lat by gdaltransform)." % (region, crs))
    p["period"] = [first, last]
    if args.sigma is not None:
        p["seismogenic_index"] = args.sigma
    if args.seed is not None:
        p["seed"] = args.seed
    with open(args.out, "w", encoding="utf-8") as f:
        json.dump(p, f, indent=1)
        f.write("\n")
    total = sum(w["cumulative_volume_m3"][-1][1] for w in p["wells"])
    print("%d wells (%.3g m3 in all), %d fault lines, %s to %s -> %s" %
          (len(p["wells"]), total, len(p["faults"]), first, last, args.out))


if __name__ == "__main__":
    main()
