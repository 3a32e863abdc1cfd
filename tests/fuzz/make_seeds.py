#!/usr/bin/env python3
"""Writes the seed corpora of the fuzz targets (tests/fuzz/corpus/<target>/, docs/fuzzing.md)
from the repository's test fixtures and the fictional demo data. Run from anywhere:
    python3 tests/fuzz/make_seeds.py
Seeds named regression-* are inputs of fixed findings; they are kept, never rewritten here.
The fixtures and demo data are invented (see their READMEs); so are the few inputs written below."""
import pathlib
import re

ROOT = pathlib.Path(__file__).resolve().parents[2]
CORPUS = ROOT / "tests/fuzz/corpus"
SEP = b"\n%%%%\n"  # fuzz_support.hpp: kPartSeparator

# core/units/units.hpp: the order of units::Dimension (the first byte of a units/distribution input)
DIMENSIONS = ["dimensionless", "length", "time", "pressure", "pressure_gradient", "permeability",
              "viscosity", "compressibility", "volume_rate", "volume", "density", "diffusivity",
              "angle", "inverse_time"]


def read(rel):
    return (ROOT / rel).read_bytes()


def head_lines(data, n):
    return b"".join(data.splitlines(keepends=True)[:n])


def write(target, name, data):
    d = CORPUS / target
    d.mkdir(parents=True, exist_ok=True)
    (d / name).write_bytes(data)


def dim_byte(name):
    return bytes([DIMENSIONS.index(name)])


def units_seeds():
    # One value per unit symbol of the units table, with its dimension.
    text = read("src/core/units/units.cpp").decode()
    for i, (sym, dim) in enumerate(re.findall(r'Unit\{"([^"]+)", D::(\w+),', text)):
        write("units", f"unit-{i:02d}-{dim}", dim_byte(dim) + f"1.5 {sym}".encode())
    extras = [("volume_rate", "2e4 bbl/d"), ("permeability", "10mD"), ("pressure_gradient", "0.7 psi/ft"),
              ("dimensionless", "20 %"), ("dimensionless", "0.6"), ("pressure", "-3 MPa"),
              ("length", "  9500 ft "), ("angle", "60 deg"), ("compressibility", "1e-9 1/Pa")]
    for i, (dim, t) in enumerate(extras):
        write("units", f"example-{i}", dim_byte(dim) + t.encode())


def distribution_seeds():
    # The examples of core/stats/distribution_text.hpp, docs/uncertainty.md and the demo scenario.
    examples = [
        ("permeability", "10 mD"), ("permeability", "fixed(10 mD)"),
        ("pressure_gradient", "uniform(20 MPa/km, 24 MPa/km)"),
        ("pressure_gradient", "uniform(min=20 MPa/km, max=24 MPa/km)"),
        ("dimensionless", "normal(0.6, 0.05)"), ("angle", "normal(mean=0 deg, sd=5 deg)"),
        ("dimensionless", "truncnormal(mean=0.6, sd=0.1, min=0.3, max=0.9)"),
        ("permeability", "lognormal(median=10 mD, sigma_ln=0.8)"),
        ("permeability", "lognormal(p10=2 mD, p90=50 mD)"),
        ("dimensionless", "triangular(min=0.5, mode=0.6, max=0.8)"),
        ("pressure_gradient", "triangular(min=0.9 psi/ft, mode=1.0 psi/ft, max=1.15 psi/ft)"),
        ("dimensionless", "uniform(8 %, 14 %)"), ("dimensionless", "triangular(0.06, 0.1, 0.14)"),
        ("pressure_gradient", "normal(0.44 psi/ft, 0.01 psi/ft)"),
        ("dimensionless", "truncnormal(mean=1, sd=0.1, min=0.5, max=1.5)"),
        ("angle", "truncated_normal(mean=0 deg, sd=5 deg, min=-10 deg)"),
        ("dimensionless", "lognormal(median=1, sigma_ln=0.1)"),
        ("permeability", "lognormal(median=9.869233e-15 m2, sigma_ln=0.8)"),
        ("pressure_gradient", "uniform(24 MPa/km, 20 MPa/km)"),
        ("pressure_gradient", "uniform(20, 24)"),
    ]
    for i, (dim, t) in enumerate(examples):
        write("distribution", f"example-{i:02d}", dim_byte(dim) + t.encode())


def wells_seeds():
    tiny_w, tiny_h = read("tests/data/scenario/tiny/wells.csv"), read("tests/data/scenario/tiny/histories.csv")
    write("wells", "tiny", tiny_w + SEP + tiny_h)
    write("wells", "tiny-wells-only", tiny_w)
    write("wells", "marrowick", read("regions/marrowick/wells.csv") + SEP +
          head_lines(read("regions/marrowick/histories.csv"), 60))
    for bad in ["wells_non_numeric", "wells_unitless", "wells_unknown_crs"]:
        write("wells", f"bad-{bad}", read(f"tests/data/scenario/bad/{bad}.csv") + SEP + tiny_h)
    for bad in ["histories_overlap", "histories_unknown_well"]:
        write("wells", f"bad-{bad}", tiny_w + SEP + read(f"tests/data/scenario/bad/{bad}.csv"))
    # Invented here: wells in lon/lat (no "# crs:" line: WGS 84), histories by start, end and rate.
    write("wells", "lonlat-rates",
          b"# Fictional wells in degrees.\nid,lon,lat,top,bottom,radius,status\n"
          b"L1,-135.01,-35.02,2800 m,2900 m,0.1 m,active\nL2,-134.98,-35.05,9200 ft,9400 ft,4 in,proposed\n"
          + SEP + b"well,start,end,rate\nL1,2020-01-01,2020-07-01,5000 bbl/d\nL1,2020-07-01,2021-01-01,0 m3/d\n")


def catalog_seeds():
    event_id_columns = b"id=event_id;time=origin_time;depth=depth_km"
    for name in ["fixture_catalog", "bad_rows", "empty"]:
        write("catalog_csv", name, event_id_columns + SEP + read(f"tests/data/catalog/{name}.csv"))
    # The rest with the default columns (common header spellings) or, for FDSN text, none.
    for path in sorted((ROOT / "tests/data/catalog").glob("*")):
        if path.suffix in (".csv", ".txt") and path.stem not in ("fixture_catalog", "bad_rows", "empty",
                                                                 "volume_history"):
            write("catalog_csv", path.stem, path.read_bytes())
    write("catalog_csv", "demo-head", head_lines(read("catalogs/demo/demo_catalog.csv"), 40))
    write("catalog_csv", "projected", b"x=x;y=y;crs=EPSG:32708;depth_unit=m" + SEP + PROJECTED_CATALOG)
    write("catalog_csv", "semicolon",
          b"x=easting,y=northing,crs=EPSG:32614,magtype=-,magtype_default=ML,delimiter=semicolon" + SEP +
          b"# Fictional events.\ntime;easting;northing;depth;magnitude\n"
          b"2024-01-03T04:12:09Z;612000;3950000;3.2 km;1.4\n2024-01-04T00:00:00+00:00;612500;3951000;;0.8\n")
    for name in ["fixture_catalog", "quakeml_quirks"]:
        write("quakeml", name, read(f"tests/data/catalog/{name}.xml"))
    demo = read("catalogs/demo/demo_catalog.xml").decode()
    events = [m.end() for m in re.finditer(r"</event>", demo)]
    write("quakeml", "demo-head", (demo[:events[2]] + "\n</eventParameters>\n</q:quakeml>\n").encode())


# Invented events (as in tests/screening/catalog_review_test.cpp), EPSG:32708 metres.
PROJECTED_CATALOG = (b"# invented test events\nid,time,x,y,depth,magnitude,magnitude_type\n"
                     b"E1,2019-06-01T00:00:00Z,497000,6118000,3000,1.2,ML\n"
                     b"E2,2022-01-01T00:00:00Z,500500,6120500,3100,1.5,ML\n"
                     b"E5,2022-13-01T00:00:00Z,500000,6120000,3000,1.0,ML\n")

CATALOG_TABLE = (b'\n[catalog]\nfile = "catalog.csv"\ncolumns = "x=x;y=y;crs=EPSG:32708;depth_unit=m"\n'
                 b'footprint_threshold = "0.05 MPa"\nrt_well = "W1"\n\n[catalog.rate_state]\n'
                 b'background_rate_per_km = "0.01 1/yr"\na_sigma = "1e6 MPa"\naftershock_duration = "100 yr"\n')

# scenario_fuzz.cpp: the files of a scenario input, in order.
SCENARIO_FILES = ["scenario.toml", "region.toml", "faults.geojson", "wells.csv", "histories.csv", "catalog.csv"]


def rename_inputs(toml, names):
    """Points every `file = "..."` of a scenario at the fixed names, by the table it is in."""
    out, table = [], ""
    for line in toml.decode().splitlines(keepends=True):
        m = re.match(r"\s*\[+\s*([^\]]+?)\s*\]", line)
        if m:
            table = m.group(1)
        f = re.match(r'(\s*file\s*=\s*)"([^"]*)"(.*)', line, re.S)
        if f and table in names and names[table] is not None:
            line = f'{f.group(1)}"{names[table]}"{f.group(3)}'
        out.append(line)
    return "".join(out).encode()


def scenario_seed(name, parts):
    write("scenario", name, SEP.join(parts))


def scenario_seeds():
    tiny = {n: read(f"tests/data/scenario/tiny/{n}") for n in SCENARIO_FILES[:5]}
    fixture_csv = read("tests/data/catalog/fixture_catalog.csv")
    parts = [tiny[n] for n in SCENARIO_FILES[:5]]
    scenario_seed("tiny", parts + [fixture_csv])
    scenario_seed("tiny-catalog", [tiny["scenario.toml"] + CATALOG_TABLE] + parts[1:] + [PROJECTED_CATALOG])
    m = "regions/marrowick/"
    base_names = {"region": "region.toml", "wells": "wells.csv", "histories": "histories.csv",
                  "catalog": "catalog.csv"}
    scenario_seed("marrowick", [rename_inputs(read(m + "scenario.toml"), base_names), read(m + "region.toml"),
                                read(m + "faults.geojson"), read(m + "wells.csv"),
                                head_lines(read(m + "histories.csv"), 60),
                                head_lines(read("catalogs/demo/demo_catalog.csv"), 40)])
    bad = ROOT / "tests/data/scenario/bad"
    for toml in sorted(bad.glob("*.toml")):
        text = toml.read_bytes()
        p = {n: tiny.get(n, fixture_csv) for n in SCENARIO_FILES}
        names = dict(base_names, **{"region.override.faults": None})
        for table, key in [("wells", "wells.csv"), ("histories", "histories.csv"), ("region.override.faults", None)]:
            ref = re.search(r"\[" + re.escape(table) + r"\]\s*\n(?:[^\[]*\n)*?\s*file\s*=\s*\"([^\"]+)\"", text.decode())
            if ref and (bad / ref.group(1)).is_file():
                content = (bad / ref.group(1)).read_bytes()
                if table == "region.override.faults":
                    p["faults.geojson"] = content
                    names[table] = "faults.geojson"
                else:
                    p[key] = content
        if b"no-such-region" in text:
            names = dict(names, region=None)
        scenario_seed(f"bad-{toml.stem}", [rename_inputs(text, names)] + [p[n] for n in SCENARIO_FILES[1:]])


if __name__ == "__main__":
    units_seeds()
    distribution_seeds()
    wells_seeds()
    catalog_seeds()
    scenario_seeds()
