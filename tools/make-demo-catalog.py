#!/usr/bin/python3
"""Make the SYNTHETIC demo earthquake catalog for slipscreen (standard library only).

Writes the same events as CSV and QuakeML 1.2 into an output folder, both labelled synthetic,
plus the summed cumulative injected-volume history the events were drawn from.

Model (all parameters come from a JSON file, see catalogs/demo/params.json):
  * Induced events follow the seismogenic-index model (Shapiro et al. 2010): the number of
    events at or above magnitude m caused by injecting the volume V is V * 10**(sigma - b*m).
    Each well's cumulative volume V(t) is piecewise linear between the given samples, so its
    events form a non-homogeneous Poisson process with cumulative intensity
    Lambda(t) = V(t) * 10**(sigma - b*m_floor); arrival times are drawn exactly by mapping
    unit-rate Poisson arrivals through the inverse of Lambda.
  * Background (tectonic) events: a homogeneous Poisson process of `background_rate_per_year`
    events at or above m_floor, epicentres uniform in the bounding box of wells and faults.
  * Magnitudes: Gutenberg-Richter, m = m_floor + Exp(rate = b ln 10), i.e. b-value `b`,
    continuous above m_floor. Detection: an event is kept with probability
    1 / (1 + exp(-(m - m_detect) / detect_width)) (a logistic detection curve; events well
    above m_detect are all recorded), then magnitudes are rounded to 0.1.
  * Locations of induced events: with probability `on_fault_fraction` on a mapped fault
    (a point drawn uniformly along the fault polyline inside the triggering front
    r = sqrt(4 pi D t) of the well, Shapiro et al. 1997, if any part is inside), else near the
    well (Gaussian scatter of `scatter_m` metres, also clipped to the front radius by
    rejection). Coordinates are longitude/latitude in degrees (WGS 84); distances use a local
    equirectangular approximation (adequate over a few tens of km).
  * Depth: normal with the given mean and standard deviation (km), truncated to >= 0.5 km.

Everything is drawn from random.Random(seed): the same parameters and seed give the same files.

Usage: tools/make-demo-catalog.py --params catalogs/demo/params.json --out catalogs/demo [--seed N]
"""
import argparse
import bisect
import datetime as dt
import json
import math
import os
import random
import sys

EARTH_RADIUS = 6371008.8  # m, IUGG mean radius


def parse_time(text):
    t = dt.datetime.fromisoformat(text.replace("Z", "+00:00"))
    if t.tzinfo is None:
        t = t.replace(tzinfo=dt.timezone.utc)
    return t.timestamp()


def iso(seconds):
    ms = int(round(seconds * 1000.0))
    t = dt.datetime.fromtimestamp(ms // 1000, tz=dt.timezone.utc)
    frac = ms % 1000
    base = t.strftime("%Y-%m-%dT%H:%M:%S")
    return base + ("" if frac == 0 else ".%03d" % frac) + "Z"


def local_xy(lon, lat, lon0, lat0):
    """Metres east/north of (lon0, lat0), equirectangular."""
    k = math.pi / 180.0 * EARTH_RADIUS
    return (lon - lon0) * k * math.cos(math.radians(lat0)), (lat - lat0) * k


def local_lonlat(x, y, lon0, lat0):
    k = math.pi / 180.0 * EARTH_RADIUS
    return lon0 + x / (k * math.cos(math.radians(lat0))), lat0 + y / k


class Well:
    def __init__(self, spec):
        self.name = spec["name"]
        self.lon, self.lat = float(spec["lon"]), float(spec["lat"])
        samples = [(parse_time(t), float(v)) for t, v in spec["cumulative_volume_m3"]]
        self.t = [s[0] for s in samples]
        self.v = [s[1] for s in samples]
        if any(b <= a for a, b in zip(self.t, self.t[1:])) or any(b < a for a, b in zip(self.v, self.v[1:])):
            sys.exit("well %s: times must increase and cumulative volumes must not decrease" % self.name)
        self.start = self.t[0]

    def volume(self, t):
        if t <= self.t[0]:
            return self.v[0]
        if t >= self.t[-1]:
            return self.v[-1]
        j = bisect.bisect_right(self.t, t)
        w = (t - self.t[j - 1]) / (self.t[j] - self.t[j - 1])
        return self.v[j - 1] + w * (self.v[j] - self.v[j - 1])

    def time_at_volume(self, vol):
        """Inverse of V(t) (first time the cumulative volume reaches vol)."""
        j = bisect.bisect_left(self.v, vol)
        if j == 0:
            return self.t[0]
        if j >= len(self.v):
            return None
        v0, v1 = self.v[j - 1], self.v[j]
        return self.t[j - 1] + (vol - v0) / (v1 - v0) * (self.t[j] - self.t[j - 1])


def point_on_faults_within(rng, faults, x0, y0, radius, lon0, lat0):
    """A point drawn uniformly along the parts of the fault polylines within radius of (x0, y0)."""
    pieces = []
    for f in faults:
        pts = [local_xy(lon, lat, lon0, lat0) for lon, lat in f["points"]]
        for (ax, ay), (bx, by) in zip(pts, pts[1:]):
            n = max(2, int(math.hypot(bx - ax, by - ay) / 50.0))  # 50 m pieces
            for k in range(n):
                u0, u1 = k / n, (k + 1) / n
                px, py = ax + (u0 + u1) / 2 * (bx - ax), ay + (u0 + u1) / 2 * (by - ay)
                if math.hypot(px - x0, py - y0) <= radius:
                    pieces.append((ax + u0 * (bx - ax), ay + u0 * (by - ay), ax + u1 * (bx - ax), ay + u1 * (by - ay)))
    if not pieces:
        return None
    lengths = [math.hypot(c - a, d - b) for a, b, c, d in pieces]
    a, b, c, d = rng.choices(pieces, weights=lengths)[0]
    u = rng.random()
    return a + u * (c - a), b + u * (d - b)


def main():
    ap = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    ap.add_argument("--params", required=True, help="JSON file with the model parameters")
    ap.add_argument("--out", required=True, help="output folder")
    ap.add_argument("--seed", type=int, help="override the seed in the parameters")
    args = ap.parse_args()
    with open(args.params, encoding="utf-8") as fh:
        p = json.load(fh)
    seed = args.seed if args.seed is not None else int(p["seed"])
    rng = random.Random(seed)
    b, sigma = float(p["b_value"]), float(p["seismogenic_index"])
    m_floor, m_detect, detect_width = float(p["m_floor"]), float(p["m_detect"]), float(p["detect_width"])
    diffusivity = float(p["diffusivity_m2_per_s"])
    wells = [Well(w) for w in p["wells"]]
    faults = p.get("faults", [])
    t_start, t_end = parse_time(p["period"][0]), parse_time(p["period"][1])
    lon0 = sum(w.lon for w in wells) / len(wells)
    lat0 = sum(w.lat for w in wells) / len(wells)

    raw = []  # (time, lon, lat, kind)
    # Induced events: exact non-homogeneous Poisson arrivals through V(t).
    per_volume = 10.0 ** (sigma - b * m_floor)  # events >= m_floor per m3
    for w in wells:
        s = 0.0
        while True:
            s += rng.expovariate(1.0)
            t = w.time_at_volume(w.v[0] + s / per_volume)
            if t is None or t >= t_end:
                break
            if t < t_start:
                continue
            x0, y0 = local_xy(w.lon, w.lat, lon0, lat0)
            radius = math.sqrt(4.0 * math.pi * diffusivity * max(t - w.start, 1.0))
            xy = None
            if faults and rng.random() < float(p["on_fault_fraction"]):
                xy = point_on_faults_within(rng, faults, x0, y0, radius, lon0, lat0)
            if xy is None:
                for _ in range(100):
                    dx, dy = rng.gauss(0.0, float(p["scatter_m"])), rng.gauss(0.0, float(p["scatter_m"]))
                    if math.hypot(dx, dy) <= radius:
                        break
                else:
                    dx, dy = 0.0, 0.0
                xy = (x0 + dx, y0 + dy)
            lon, lat = local_lonlat(xy[0], xy[1], lon0, lat0)
            raw.append((t, lon, lat, "induced or triggered event"))
    # Background events.
    lons = [w.lon for w in wells] + [q[0] for f in faults for q in f["points"]]
    lats = [w.lat for w in wells] + [q[1] for f in faults for q in f["points"]]
    pad = 0.05
    years = (t_end - t_start) / (365.25 * 86400.0)
    t = t_start
    rate = float(p["background_rate_per_year"]) / (365.25 * 86400.0)
    while rate > 0.0:
        t += rng.expovariate(rate)
        if t >= t_end:
            break
        raw.append((t, rng.uniform(min(lons) - pad, max(lons) + pad), rng.uniform(min(lats) - pad, max(lats) + pad),
                    "earthquake"))
    raw.sort()

    events = []
    for t, lon, lat, kind in raw:
        m = m_floor + rng.expovariate(b * math.log(10.0))
        keep = 1.0 / (1.0 + math.exp(-(m - m_detect) / detect_width))
        if rng.random() >= keep:
            continue
        depth_m = round(max(500.0, rng.gauss(float(p["depth_km"]["mean"]), float(p["depth_km"]["sd"])) * 1000.0))
        events.append({
            "id": "smi:slipscreen.demo/event/%04d" % (len(events) + 1),
            "time": iso(round(t, 3)),
            "lat": round(lat, 5), "lon": round(lon, 5),
            "depth_m": depth_m,
            "mag": round(m, 1) + 0.0,  # + 0.0 turns -0.0 into 0.0
            "type": p.get("magnitude_type", "ML"),
            "kind": kind,
        })

    label = ("SYNTHETIC catalog for the fictional slipscreen demo region '%s': invented events drawn by "
             "tools/make-demo-catalog.py (seismogenic-index model, Gutenberg-Richter b = %g, m_floor = %g, "
             "logistic detection around M %g, seed %d). Not real earthquakes." %
             (p.get("region_name", "demo"), b, m_floor, m_detect, seed))
    os.makedirs(args.out, exist_ok=True)
    with open(os.path.join(args.out, "demo_catalog.csv"), "w", encoding="utf-8", newline="\n") as f:
        f.write("# " + label + "\n")
        f.write("# Same events as demo_catalog.xml (QuakeML 1.2). Depth in km, times UTC, WGS 84 lon/lat.\n")
        f.write("id,time,latitude,longitude,depth,magnitude,magnitude_type,event_kind\n")
        for e in events:
            f.write("%s,%s,%.5f,%.5f,%.3f,%.1f,%s,%s\n" % (e["id"], e["time"], e["lat"], e["lon"], e["depth_m"] / 1000.0,
                                                          e["mag"], e["type"], e["kind"]))
    x = ['<?xml version="1.0" encoding="UTF-8"?>',
         '<q:quakeml xmlns="http://quakeml.org/xmlns/bed/1.2" xmlns:q="http://quakeml.org/xmlns/quakeml/1.2">',
         '  <eventParameters publicID="smi:slipscreen.demo/catalog">',
         '    <description>%s</description>' % label,
         '    <comment><text>SYNTHETIC: fictional data for the slipscreen demo; see catalogs/demo/README.md.</text></comment>']
    for e in events:
        pid = e["id"]
        x += ['    <event publicID="%s">' % pid,
              '      <description><text>synthetic</text></description>',
              '      <preferredOriginID>%s/origin</preferredOriginID>' % pid,
              '      <preferredMagnitudeID>%s/magnitude</preferredMagnitudeID>' % pid,
              '      <type>%s</type>' % e["kind"],
              '      <origin publicID="%s/origin">' % pid,
              '        <time><value>%s</value></time>' % e["time"],
              '        <latitude><value>%.5f</value></latitude>' % e["lat"],
              '        <longitude><value>%.5f</value></longitude>' % e["lon"],
              '        <depth><value>%d</value></depth>' % e["depth_m"],
              '      </origin>',
              '      <magnitude publicID="%s/magnitude">' % pid,
              '        <mag><value>%.1f</value></mag>' % e["mag"],
              '        <type>%s</type>' % e["type"],
              '        <originID>%s/origin</originID>' % pid,
              '      </magnitude>',
              '    </event>']
    x += ['  </eventParameters>', '</q:quakeml>']
    with open(os.path.join(args.out, "demo_catalog.xml"), "w", encoding="utf-8", newline="\n") as f:
        f.write("\n".join(x) + "\n")
    # Summed cumulative volume of all wells at every sample time (for the seismogenic index).
    times = sorted({t for w in wells for t in w.t})
    with open(os.path.join(args.out, "demo_volume_history.csv"), "w", encoding="utf-8", newline="\n") as f:
        f.write("# SYNTHETIC: summed cumulative injected volume of the fictional demo wells (%s).\n" %
                ", ".join(w.name for w in wells))
        f.write("time,cumulative_volume\n")
        for t in times:
            f.write("%s,%.1f m3\n" % (iso(t), sum(w.volume(t) - w.v[0] for w in wells)))
    n_induced = sum(1 for e in events if e["kind"] != "earthquake")
    print("%d events (%d induced, %d background) over %.1f years written to %s" %
          (len(events), n_induced, len(events) - n_induced, years, args.out))


if __name__ == "__main__":
    main()
