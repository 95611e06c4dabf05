"""The same vectors inside Pyodide (Python 3.14, WebAssembly) under Node.js: same answers."""

import json
import math
import shutil
import subprocess

import pytest

from build import package_calc, paths
from calc import api
from tests.vectors import all_vectors

PYODIDE_DIR = paths.NODE_MODULES / "pyodide"
RUNNER = paths.ROOT / "tests" / "pyodide" / "run_vectors.mjs"

pytestmark = pytest.mark.skipif(
    shutil.which("node") is None or not PYODIDE_DIR.exists(), reason="needs node and `npm ci`"
)


def _same(a, b, where="result"):
    """Equal structure and text; floats equal to 1e-12 (WebAssembly libm may differ by an ulp)."""
    if isinstance(a, float) or isinstance(b, float):
        assert isinstance(a, (int, float)) and isinstance(b, (int, float)), where
        assert math.isclose(a, b, rel_tol=1e-12, abs_tol=1e-300), f"{where}: {a} != {b}"
    elif isinstance(a, dict):
        assert isinstance(b, dict) and sorted(a) == sorted(b), where
        for key in a:
            _same(a[key], b[key], f"{where}.{key}")
    elif isinstance(a, list):
        assert isinstance(b, list) and len(a) == len(b), where
        for i, (x, y) in enumerate(zip(a, b)):
            _same(x, y, f"{where}[{i}]")
    else:
        assert a == b, f"{where}: {a!r} != {b!r}"


@pytest.fixture(scope="module")
def pyodide_results(tmp_path_factory):
    folder = tmp_path_factory.mktemp("pyodide")
    zip_path = folder / "calc.zip"
    zip_path.write_bytes(package_calc.calc_zip_bytes())  # the very archive the site ships
    cases = all_vectors()
    vectors_path = folder / "vectors.json"
    vectors_path.write_text(json.dumps([[c, v["inputs"]] for c, v in cases]), encoding="utf-8")
    completed = subprocess.run(
        ["node", str(RUNNER), str(PYODIDE_DIR), str(zip_path), str(vectors_path)],
        capture_output=True, text=True, timeout=300, check=False,
    )
    assert completed.returncode == 0, completed.stderr[-2000:]  # Pyodide echoes its whole source
    return cases, json.loads(completed.stdout)


def test_runs_on_python_314(pyodide_results):
    _, payload = pyodide_results
    assert payload["python"].startswith("3.14"), payload["python"]


def test_pyodide_matches_cpython(pyodide_results):
    cases, payload = pyodide_results
    assert len(payload["results"]) == len(cases)
    for (calculator, vector), in_browser in zip(cases, payload["results"]):
        on_cpython = api.run(calculator, vector["inputs"])
        _same(on_cpython, in_browser, f"{calculator}: {vector['name']}")
