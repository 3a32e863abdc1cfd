"""The demo scenario (the fictional Marrowick Basin, regions/marrowick, with the demo catalog)
copied into a work folder with 100 realizations and output times every 5 years, so that a test
run takes a few seconds. Shared by the Python checks of tests/outputs."""
import shutil
from pathlib import Path


def copy_small_demo(source: Path, work: Path, fail) -> Path:
    """Copies the demo into `work` (emptied first) and returns the path of its scenario file;
    `fail(message)` is called when the demo scenario no longer has the lines to patch."""
    shutil.rmtree(work, ignore_errors=True)
    shutil.copytree(source / "regions" / "marrowick", work / "regions" / "marrowick")
    shutil.copytree(source / "catalogs" / "demo", work / "catalogs" / "demo")
    scenario = work / "regions" / "marrowick" / "scenario.toml"
    text = scenario.read_text()
    for old, new in (("realizations = 2000", "realizations = 100"), ('step = "1 year"', 'step = "5 years"')):
        if text.count(old) != 1:
            fail(f"the demo scenario no longer has exactly one '{old}'")
        text = text.replace(old, new)
    scenario.write_text(text)
    return scenario
