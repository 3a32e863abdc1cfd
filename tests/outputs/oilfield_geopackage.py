"""screen.gpkg of an oilfield run against the SI run's (docs/outputs.md, "SI or oilfield"), for
oilfield_units_with_pandas.py, which makes the two runs:

- compare_geopackages (GDAL's python bindings, python3-gdal): the same layers with the same
  features in the same order and the same geometries; each SI field named `<name>_MPa`, `_m`,
  `_m3` in SI is `<name>_psi`, `_ft`, `_bbl` in oilfield units, its alias names that unit
  (`Δp (MPa)` -> `Δp (psi)`) and its values are the SI values times the factor (to 1e-12
  relative: both are doubles computed from the same SI value, no printed rounding); every other
  field keeps its name, alias and values. Aliases are read from gpkg_data_columns, where QGIS reads
  them. Two SI fields that become one name (`volume_m3` and
  `volume_bbl` of the wells) must both agree with it.
- styles_classify_alike (headless QGIS, python3-qgis): every style of layer_styles loads in QGIS
  from both files, a graduated style classifies by the converted field, and every feature falls
  in the same class in both systems (the class limits are converted, not changed).
"""
import os
import sqlite3
import sys
from pathlib import Path

sys.dont_write_bytecode = True

ALIAS_UNITS = {"MPa": "psi", "m": "ft", "m3": "bbl"}
ALIAS_TEXT = {"MPa": "MPa", "m": "m", "m3": "m³"}


def compare_geopackages(si_gpkg, oil_gpkg, expected_name, fail):
    """Returns the number of converted values compared."""
    from osgeo import ogr
    ogr.UseExceptions()
    si, oil = ogr.Open(str(si_gpkg)), ogr.Open(str(oil_gpkg))

    def feature_layers(gpkg):  # not layer_styles, which GDAL lists as a table too
        with sqlite3.connect(gpkg) as db:
            return [r[0] for r in db.execute("SELECT table_name FROM gpkg_contents WHERE data_type = 'features' "
                                             "ORDER BY table_name")]

    names, oil_names = feature_layers(si_gpkg), feature_layers(oil_gpkg)
    if names != oil_names or len(names) < 5:
        fail(f"screen.gpkg layers: SI {names}, oilfield {oil_names}")
    def aliases(gpkg):  # GeoPackage schema extension: the alias is gpkg_data_columns.name
        with sqlite3.connect(gpkg) as db:
            return {(t, c): n for t, c, n in db.execute("SELECT table_name, column_name, name FROM gpkg_data_columns")}

    si_alias, oil_alias_of = aliases(si_gpkg), aliases(oil_gpkg)
    converted = 0
    for name in names:
        a, b = si.GetLayerByName(name), oil.GetLayerByName(name)
        da, db = a.GetLayerDefn(), b.GetLayerDefn()
        si_fields = [da.GetFieldDefn(i) for i in range(da.GetFieldCount())]
        oil_fields = {db.GetFieldDefn(i).GetName(): db.GetFieldDefn(i) for i in range(db.GetFieldCount())}
        plan = []  # (SI field, oilfield field, factor or None)
        expected_order = []
        for f in si_fields:
            oil_name, factor = expected_name(f.GetName())
            if oil_name not in expected_order:
                expected_order.append(oil_name)
            plan.append((f.GetName(), oil_name, factor))
            if oil_name not in oil_fields:
                fail(f"screen.gpkg {name}: no field {oil_name} for SI's {f.GetName()}")
            alias, oil_alias = si_alias.get((name, f.GetName()), ""), oil_alias_of.get((name, oil_name), "")
            if factor is not None:
                si_unit = f.GetName().rsplit("_", 1)[1]
                alias = alias.replace(f"({ALIAS_TEXT[si_unit]})", f"({ALIAS_UNITS[si_unit]})")
                if alias == si_alias.get((name, f.GetName()), ""):
                    fail(f"screen.gpkg {name}.{f.GetName()}: alias '{alias}' names no unit")
            if f.GetName() == oil_name or factor is not None:
                if oil_alias != alias:
                    fail(f"screen.gpkg {name}.{oil_name}: alias '{oil_alias}', expected '{alias}'")
        if expected_order != list(oil_fields):
            fail(f"screen.gpkg {name}: oilfield fields {list(oil_fields)}, expected {expected_order}")
        if a.GetFeatureCount() != b.GetFeatureCount() or a.GetFeatureCount() == 0:
            fail(f"screen.gpkg {name}: {a.GetFeatureCount()} features in SI, {b.GetFeatureCount()} in oilfield")
        for fa, fb in zip(a, b):
            ga, gb = fa.GetGeometryRef(), fb.GetGeometryRef()
            if (ga is None) != (gb is None) or (ga is not None and ga.ExportToWkb() != gb.ExportToWkb()):
                fail(f"screen.gpkg {name} feature {fa.GetFID()}: the geometries differ")
            for si_field, oil_field, factor in plan:
                x, y = fa.GetField(si_field), fb.GetField(oil_field)
                if factor is None and oil_field == si_field or (x is None or y is None):
                    if x != y and not (x != x and y != y):  # NaN equals NaN here
                        fail(f"screen.gpkg {name} feature {fa.GetFID()}: {si_field} = {x!r:.80} in SI, "
                             f"{oil_field} = {y!r:.80} in oilfield")
                    continue
                expected = x * factor if factor is not None else x
                if x != x and y != y:
                    continue
                if abs(y - expected) > 1e-12 * abs(expected):
                    fail(f"screen.gpkg {name} feature {fa.GetFID()}: {oil_field} = {y!r}, but {si_field} = {x!r} "
                         f"gives {expected!r}")
                converted += factor is not None
    return converted


def styles_classify_alike(si_gpkg, oil_gpkg, expected_name, work, fail):
    """Returns the number of styles, of graduated styles, and the fewest classes the features of a
    style by a converted field fall in."""
    runtime = Path(work) / "xdg-runtime"  # Qt wants a private runtime folder
    runtime.mkdir(mode=0o700, exist_ok=True)
    os.environ["XDG_RUNTIME_DIR"] = str(runtime)
    os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
    from qgis.core import QgsApplication, QgsRenderContext, QgsVectorLayer
    from qgis.PyQt.QtXml import QDomDocument

    def styles(gpkg):
        with sqlite3.connect(gpkg) as db:
            return [(t, n, q) for t, n, q in
                    db.execute("SELECT f_table_name, styleName, styleQML FROM layer_styles ORDER BY id")]

    si_styles, oil_styles = styles(si_gpkg), styles(oil_gpkg)
    if [s[:2] for s in si_styles] != [s[:2] for s in oil_styles]:
        fail(f"layer_styles: SI {[s[:2] for s in si_styles]}, oilfield {[s[:2] for s in oil_styles]}")

    def classes(gpkg, table, style, qml):
        options = QgsVectorLayer.LayerOptions()
        options.loadDefaultStyle = False
        layer = QgsVectorLayer(f"{gpkg}|layername={table}", table, "ogr", options)
        # importNamedStyle reads exactly this QML (loadNamedStyle would prefer the layer's default
        # style from layer_styles).
        doc = QDomDocument()
        if not layer.isValid() or not doc.setContent(qml):
            fail(f"{gpkg} layer {table}: QGIS cannot open the layer or parse its style '{style}'")
        loaded, message = layer.importNamedStyle(doc)
        if not loaded:
            fail(f"{gpkg} layer {table}: QGIS does not load the style '{style}' ({message})")
        r = layer.renderer()
        if r.type() != "graduatedSymbol":
            return r.type(), None, None
        index = {item.ruleKey(): i for i, item in enumerate(r.legendSymbolItems())}
        context = QgsRenderContext()
        r.startRender(context, layer.fields())
        per_feature = [tuple(index[k] for k in r.legendKeysForFeature(f, context)) for f in layer.getFeatures()]
        r.stopRender(context)
        return r.type(), r.classAttribute(), per_feature

    app = QgsApplication([], False)
    app.initQgis()
    graduated = 0
    spread = 0  # the fewest classes a converted style's features fall in
    try:
        for (table, style, qml_si), (_, _, qml_oil) in zip(si_styles, oil_styles):
            si_type, si_attr, si_classes = classes(si_gpkg, table, style, qml_si)
            oil_type, oil_attr, oil_classes = classes(oil_gpkg, table, style, qml_oil)
            if si_type != oil_type:
                fail(f"{table} style '{style}': renderer {si_type} in SI, {oil_type} in oilfield")
            if si_classes is None:
                continue
            if oil_attr != expected_name(si_attr)[0]:
                fail(f"{table} style '{style}': graduated by {oil_attr}, expected {expected_name(si_attr)[0]}")
            if not si_classes or len(si_classes) != len(oil_classes):
                fail(f"{table} style '{style}': {len(si_classes)} features in SI, {len(oil_classes)} in oilfield")
            for i, (x, y) in enumerate(zip(si_classes, oil_classes)):
                if x != y:
                    fail(f"{table} style '{style}': feature {i} is in class {x} in SI but {y} in oilfield")
            if si_attr != oil_attr:  # a pressure style: its features must spread over classes to show anything
                spread = min(spread, len(set(si_classes))) if spread else len(set(si_classes))
            graduated += 1
    finally:
        app.exitQgis()
    return len(si_styles), graduated, spread
