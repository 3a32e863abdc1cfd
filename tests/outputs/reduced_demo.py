"""The demo scenario (the fictional Marrowick Basin, regions/marrowick, with the demo catalog)
copied into a work folder with 100 realizations and output times every 5 years, so that a run
takes a few seconds; shared by the output checks in this folder."""
import shutil
import subprocess


def run_checked(cmd, cwd, fail):
    done = subprocess.run(cmd, cwd=cwd, capture_output=True, text=True)
    if done.returncode != 0:
        fail(f"{' '.join(map(str, cmd))} exited {done.returncode}:\n{done.stderr}")
    return done.stdout


def reduced_demo(source, work, fail):
    """Copies the demo scenario and catalog into WORK (emptied first), reduced; runs start in WORK
    with regions/marrowick/scenario.toml."""
    shutil.rmtree(work, ignore_errors=True)
    shutil.copytree(source / "regions" / "marrowick", work / "regions" / "marrowick")
    shutil.copytree(source / "catalogs" / "demo", work / "catalogs" / "demo")
    scenario = work / "regions" / "marrowick" / "scenario.toml"
    text = scenario.read_text()
    for old, new in (("realizations = 2000", "realizations = 100"), ('step = "1 year"', 'step = "5 years"')):
        if text.count(old) != 1:
            fail(f"the demo scenario no longer has exactly one line '{old}'")
        text = text.replace(old, new)
    scenario.write_text(text)


def reduced_demo_run(slipscreen, source, work, fail):
    """Runs the reduced demo into WORK/run (--reproducible) and returns that folder."""
    reduced_demo(source, work, fail)
    run_checked([slipscreen, "run", "regions/marrowick/scenario.toml", "--out", "run", "--reproducible"], work, fail)
    return work / "run"
