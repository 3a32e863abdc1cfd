#!/usr/bin/env python3
"""Opens a run's GIS outputs in QGIS (headless, Debian's python3-qgis) as QGIS Desktop opens them
and checks that each opens styled (docs/gis.md, "How the layers open"):

- every layer of screen.gpkg loads its default style from layer_styles: fault_segments graduated
  by P(slip) at the last output time, segment_times graduated by P(slip) and time-aware (QGIS
  temporal properties active, start and end from its DateTime fields, one feature per segment
  at any instant of the animation), wells categorized by status with the proposed wells,
  earthquakes graduated in size by magnitude, dp_footprint time-aware; none falls back to QGIS's
  single-symbol default with a random colour;
- the fields carry their aliases with units, times are DateTime and yes/no fields Boolean;
- every GeoTIFF renders as one band in pseudocolour (its sidecar .qml), the last output time's.

    open_outputs_in_qgis.py SLIPSCREEN SOURCE_DIR WORK_DIR

The run: the reduced demo (reduced_demo.py: the fictional Marrowick Basin with 100 realizations
and output times every 5 years, a few seconds).

Layers are made as QGIS Desktop makes them (QgsAppLayerHandling::postProcessAddedLayer in QGIS's
source): without the default style, which is then loaded with loadDefaultStyle(). A layer made
with the default style in its constructor gets its temporal settings reset from the provider
afterwards, so that path would not show what a user sees.
"""
import os
import shutil
import sqlite3
import sys
from pathlib import Path

from reduced_demo import reduced_demo_run

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

from qgis.core import (QgsApplication, QgsDateTimeRange, QgsExpression, QgsFeatureRequest,  # noqa: E402
                       QgsGraduatedSymbolRenderer, QgsRasterLayer, QgsVectorLayer,
                       QgsVectorLayerTemporalContext, QgsVectorLayerTemporalProperties, QgsColorRampShader)
from qgis.PyQt.QtCore import QDate, QDateTime, QTime, Qt  # noqa: E402


def fail(message):
    print("FAIL: " + message)
    sys.exit(1)


def vector_layer(gpkg, name):
    options = QgsVectorLayer.LayerOptions()
    options.loadDefaultStyle = False
    layer = QgsVectorLayer(f"{gpkg}|layername={name}", name, "ogr", options)
    if not layer.isValid():
        fail(f"QGIS cannot open layer '{name}' of {gpkg}")
    message, loaded = layer.loadDefaultStyle()
    if not loaded:
        fail(f"layer '{name}': QGIS loaded no default style ({message})")
    return layer


def utc(y, m, d):
    return QDateTime(QDate(y, m, d), QTime(0, 0), Qt.UTC)


def check_time_aware(layer, per_instant):
    props = layer.temporalProperties()
    if not props.isActive():
        fail(f"layer '{layer.name()}': temporal properties are not active")
    if props.mode() != QgsVectorLayerTemporalProperties.ModeFeatureDateTimeStartAndEndFromFields:
        fail(f"layer '{layer.name()}': temporal mode {props.mode()}, expected start and end from fields")
    if (props.startField(), props.endField()) != ("date", "valid_until"):
        fail(f"layer '{layer.name()}': temporal fields {props.startField()}, {props.endField()}")
    context = QgsVectorLayerTemporalContext()
    context.setLayer(layer)
    dates = sorted({f["date"] for f in layer.getFeatures()})
    # At one instant inside each output interval (and after the last time) the time slider shows
    # exactly one feature per segment (or per time, for the footprint).
    for start in dates:
        instant = start.addDays(1)
        expression = props.createFilterString(context, QgsDateTimeRange(instant, instant.addSecs(3600)))
        shown = sum(1 for _ in layer.getFeatures(QgsFeatureRequest(QgsExpression(expression))))
        if shown != per_instant:
            fail(f"layer '{layer.name()}' at {instant.toString(Qt.ISODate)}: the time filter shows {shown} "
                 f"features, expected {per_instant}")
    before = props.createFilterString(context, QgsDateTimeRange(utc(1900, 1, 1), utc(1900, 1, 2)))
    if any(True for _ in layer.getFeatures(QgsFeatureRequest(QgsExpression(before)))):
        fail(f"layer '{layer.name()}': features shown before the first output time")
    return len(dates)


def check_field(layer, name, type_name, alias=None):
    field = layer.fields().field(name)
    if field.typeName() != type_name:
        fail(f"layer '{layer.name()}' field '{name}': QGIS reads it as {field.typeName()}, expected {type_name}")
    if alias is not None and layer.attributeAlias(layer.fields().indexOf(name)) != alias:
        fail(f"layer '{layer.name()}' field '{name}': alias "
             f"'{layer.attributeAlias(layer.fields().indexOf(name))}', expected '{alias}'")


def check_graduated(layer, attribute, method):
    r = layer.renderer()
    if r.type() != "graduatedSymbol":
        fail(f"layer '{layer.name()}': renderer {r.type()}, expected graduatedSymbol")
    if r.classAttribute() != attribute:
        fail(f"layer '{layer.name()}': graduated by '{r.classAttribute()}', expected '{attribute}'")
    if r.graduatedMethod() != method:
        fail(f"layer '{layer.name()}': graduated method {r.graduatedMethod()}, expected {method}")
    return r


def check_in_qgis(run, gpkg, last_date, segments):
    """Every check that holds QGIS objects (they must be gone before exitQgis); returns the rasters' count."""
    seg = vector_layer(gpkg, "fault_segments")
    ranges = check_graduated(seg, "p_slip_" + last_date.replace("-", "_"), QgsGraduatedSymbolRenderer.GraduatedColor)
    # The line's colour is its top symbol layer's (a dark casing is drawn below it).
    colours = {r.symbol().symbolLayer(r.symbol().symbolLayerCount() - 1).color().name() for r in ranges.ranges()}
    if len(colours) != len(ranges.ranges()):
        fail("fault_segments: two P(slip) classes share a colour")
    check_field(seg, "dp_crit_MPa", "Real", "Δp_crit (MPa)")
    check_field(seg, "first_crossing", "Date")

    st = vector_layer(gpkg, "segment_times")
    check_graduated(st, "p_slip", QgsGraduatedSymbolRenderer.GraduatedColor)
    check_field(st, "date", "DateTime", "output time (UTC)")
    check_field(st, "dp_reaches_dp_crit", "Boolean")
    check_field(st, "dp_MPa", "Real", "Δp (MPa)")
    times = check_time_aware(st, segments)
    if st.featureCount() != segments * times:
        fail(f"segment_times: {st.featureCount()} features, expected {segments} segments x {times} times")

    wells = vector_layer(gpkg, "wells")
    r = wells.renderer()
    if r.type() != "categorizedSymbol" or r.classAttribute() != "status":
        fail(f"wells: renderer {r.type()} by '{r.classAttribute()}', expected categorizedSymbol by 'status'")
    categories = {c.value(): c for c in r.categories()}
    if "proposed" not in categories or "active" not in categories:
        fail(f"wells: categories {sorted(categories)} lack 'proposed' or 'active'")
    if not categories["proposed"].symbol().size() > 1.5 * categories["active"].symbol().size():
        fail("wells: the proposed wells' symbol is not clearly larger than the active wells'")
    check_field(wells, "proposed", "Boolean", "proposed")

    quakes = vector_layer(gpkg, "earthquakes")
    r = check_graduated(quakes, "magnitude", QgsGraduatedSymbolRenderer.GraduatedSize)
    sizes = [c.symbol().size() for c in r.ranges()]
    if sizes != sorted(sizes) or len(set(sizes)) != len(sizes):
        fail(f"earthquakes: symbol sizes {sizes} do not grow with magnitude")
    check_field(quakes, "time_utc", "DateTime", "time (UTC)")
    check_field(quakes, "in_footprint", "Boolean")

    footprint = vector_layer(gpkg, "dp_footprint")
    symbol = footprint.renderer().symbol() if footprint.renderer().type() == "singleSymbol" else None
    if symbol is None or symbol.color().alpha() != 70:
        fail("dp_footprint: not the translucent footprint fill of its style")
    if check_time_aware(footprint, 1) != footprint.featureCount():
        fail("dp_footprint: not one feature per output time")

    rasters = sorted(run.glob("*.tif"))
    if len(rasters) != 3:
        fail(f"expected 3 GeoTIFFs, found {[p.name for p in rasters]}")
    for tif in rasters:
        layer = QgsRasterLayer(str(tif), tif.stem)
        message, loaded = layer.loadDefaultStyle()
        if not layer.isValid() or not loaded:
            fail(f"{tif.name}: no default style loaded ({message})")
        r = layer.renderer()
        if r.type() != "singlebandpseudocolor":
            fail(f"{tif.name}: renders as {r.type()}, expected singlebandpseudocolor")
        if r.band() != layer.bandCount():
            fail(f"{tif.name}: shows band {r.band()}, expected the last output time's ({layer.bandCount()})")
        if r.shader().rasterShaderFunction().colorRampType() != QgsColorRampShader.Discrete:
            fail(f"{tif.name}: the colour ramp is not the classes of the line styles")
    return len(rasters)


def main():
    if len(sys.argv) != 4:
        fail("usage: open_outputs_in_qgis.py SLIPSCREEN SOURCE_DIR WORK_DIR")
    slipscreen, source, work = (Path(a).resolve() for a in sys.argv[1:])
    run = reduced_demo_run(slipscreen, source, work, fail)
    runtime = work / "xdg-runtime"  # Qt wants a private runtime folder
    runtime.mkdir(mode=0o700, exist_ok=True)
    os.environ["XDG_RUNTIME_DIR"] = str(runtime)
    gpkg = run / "screen.gpkg"
    with sqlite3.connect(gpkg) as db:
        layers = [r[0] for r in db.execute("SELECT table_name FROM gpkg_contents WHERE data_type = 'features'")]
        styled = {r[0] for r in db.execute("SELECT f_table_name FROM layer_styles WHERE useAsDefault")}
        last_date = db.execute("SELECT max(date) FROM segment_times").fetchone()[0][:10]
        segments = db.execute("SELECT count(*) FROM fault_segments").fetchone()[0]
    expected = {"fault_segments", "segment_times", "wells", "dp_footprint", "earthquakes"}
    if set(layers) != expected:
        fail(f"screen.gpkg holds the layers {sorted(layers)}, expected {sorted(expected)}")
    if styled != expected:
        fail(f"layer_styles has default styles for {sorted(styled)}, expected {sorted(expected)}")

    app = QgsApplication([], False)
    app.initQgis()
    try:
        rasters = check_in_qgis(run, gpkg, last_date, segments)
    finally:
        app.exitQgis()
    shutil.rmtree(work, ignore_errors=True)
    print(f"QGIS opened {len(layers)} styled layers and {rasters} rasters as designed")


if __name__ == "__main__":
    main()
