"""The worked example in both forms users run: the plain script and the notebook, executed headless by Debian's
jupyter-nbconvert (python3-ipykernel), against the test server; the committed notebook is the script's cells
without outputs."""

import json
import os
import shutil
import subprocess
import sys

import pytest

from conftest import CLIENT_DIR

EXAMPLES = CLIENT_DIR / "examples"
FIGURES = ("ternary-Li-Co-O.svg", "pseudo-ternary-layered.svg", "quaternary-Co-Li-Ni-O.svg", "voltage-Li-into-CoO2.svg",
           "odds-Li-Co-O.svg", "thermo-Li-Co-O-in-air.svg", "defects-Al2O3-O-rich.svg")


def example_environment(server, dataset, figures):
    env = dict(os.environ, HULL_SERVER=server.url, HULL_DEMO_DATASET=dataset, HULL_FIGURES_DIR=str(figures))
    env["PYTHONPATH"] = os.pathsep.join(filter(None, [str(CLIENT_DIR / "src"), env.get("PYTHONPATH")]))
    env.pop("HULL_TOKEN", None)
    env.pop("HULL_CA_FILE", None)
    return env


def assert_figures(folder):
    for name in FIGURES:
        text = (folder / name).read_text(encoding="utf-8")
        assert text.lstrip().startswith("<") and "<svg" in text, name


def test_the_notebook_is_the_script_without_outputs():
    run = subprocess.run([sys.executable, str(EXAMPLES / "sync_notebook.py"), "--check"], capture_output=True, text=True)
    assert run.returncode == 0, run.stderr
    book = json.loads((EXAMPLES / "cathode_screening.ipynb").read_text(encoding="utf-8"))
    assert all(not c.get("outputs") and c.get("execution_count") is None for c in book["cells"] if c["cell_type"] == "code")


def test_the_script_runs_against_the_server(server, client, demo, tmp_path):
    run = subprocess.run([sys.executable, str(EXAMPLES / "cathode_screening.py")], capture_output=True, text=True,
                         env=example_environment(server, "script-cathodes", tmp_path), timeout=600)
    assert run.returncode == 0, run.stderr
    assert "round 2: version 4, 16 entries replaced" in run.stdout
    assert_figures(tmp_path)
    # The same files, the same content: the script's dataset answers with the demo fixture's fingerprint.
    mine = client.get_stable_phases("script-cathodes").attrs["used"]
    fixture = client.get_stable_phases("cathodes").attrs["used"]
    assert (mine.version, mine.content_sha256) == (fixture.version, fixture.content_sha256)


def test_the_notebook_executes_headless(server, demo, tmp_path):
    nbconvert = shutil.which("jupyter-nbconvert")
    if nbconvert is None:
        pytest.fail("jupyter-nbconvert not found: install Debian's jupyter-nbconvert and python3-ipykernel", pytrace=False)
    figures = tmp_path / "figures"
    # The kernel runs in the notebook's folder (as a user's would); the executed copy is written to tmp_path.
    run = subprocess.run([nbconvert, "--to", "notebook", "--execute", "--ExecutePreprocessor.timeout=600",
                          "--output-dir", str(tmp_path), "--output", "executed.ipynb",
                          str(EXAMPLES / "cathode_screening.ipynb")],
                         capture_output=True, text=True, env=example_environment(server, "notebook-cathodes", figures),
                         timeout=900)
    assert run.returncode == 0, run.stderr[-3000:]
    executed = json.loads((tmp_path / "executed.ipynb").read_text(encoding="utf-8"))
    outputs = [o for c in executed["cells"] if c["cell_type"] == "code" for o in c["outputs"]]
    assert not [o for o in outputs if o["output_type"] == "error"]
    # The stability table is shown as a DataFrame (an HTML table), the figures are written.
    assert any("text/html" in o.get("data", {}) and "energy_above_hull_ev_per_atom" in "".join(o["data"]["text/html"])
               for o in outputs)
    # The ternary is drawn inline (Figure._repr_svg_).
    assert any("<svg" in "".join(o.get("data", {}).get("image/svg+xml", "")) for o in outputs)
    assert_figures(figures)
