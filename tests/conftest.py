"""Shared by the suite: calculator helpers (run, values, checks, errors), a built site and a
local server for it. Test modules import the helpers: `from tests.conftest import run, values`.
"""

import contextlib
import os
import subprocess
import sys
import threading
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parent.parent
if str(ROOT) not in sys.path:
    sys.path.insert(0, str(ROOT))

from build import serve  # noqa: E402
from calc import api  # noqa: E402


def run(calculator, **inputs):
    """A calculator's result for these inputs; fails the test unless it computed."""
    result = api.run(calculator, inputs)
    assert result["ok"], result
    return result


def values(result):
    """{output name: value (SI)} of a result."""
    return {name: out["value"] for name, out in result["outputs"].items()}


def checks(result):
    """{check name: status} of a result."""
    return {check["name"]: check["status"] for check in result["checks"]}


def check_message(result, name):
    """The message of the one check called `name`."""
    (message,) = [c["message"] for c in result["checks"] if c["name"] == name]
    return message


def errors(calculator, **inputs):
    """{field: message} of a refused calculation; fails the test if it computed."""
    result = api.run(calculator, inputs)
    assert result["ok"] is False, result
    return {error["field"]: error["message"] for error in result["errors"]}


def build_site(site_dir, team_file=None):
    """Build the site into site_dir exactly as a release build does (strict)."""
    env = dict(os.environ, NO_MKDOCS_2_WARNING="1")
    if team_file:
        env["FLUXBOOK_TEAM_FILE"] = str(team_file)
    completed = subprocess.run(
        [sys.executable, "-m", "mkdocs", "build", "--strict", "--quiet", "-f", str(ROOT / "mkdocs.yml"),
         "-d", str(site_dir)],
        cwd=ROOT, env=env, capture_output=True, text=True, check=False,
    )
    return completed


@pytest.fixture(scope="session")
def built_site(tmp_path_factory):
    site_dir = tmp_path_factory.mktemp("site") / "site"
    completed = build_site(site_dir)
    assert completed.returncode == 0, completed.stderr[-3000:]
    return site_dir


@contextlib.contextmanager
def serving(site_dir, prefix="/"):
    """Serve site_dir on a free 127.0.0.1 port; yields the base URL. Stops on exit."""
    server = serve.make_server(site_dir, port=0, prefix=prefix)
    thread = threading.Thread(target=server.serve_forever, daemon=True)
    thread.start()
    try:
        yield server.base_url, server
    finally:
        server.shutdown()
        server.server_close()
