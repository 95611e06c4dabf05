"""ngspice in batch mode for the tests: write a netlist, run it, read the table it writes.

The circuits are the same ones calc/ solves in closed form, simulated by an independent program
(Debian's ngspice). Transient runs integrate with ngspice's default trapezoidal method; the
step limit and tolerances below are tighter than ngspice's defaults so that its own truncation
error stays well inside the tests' tolerances.
"""

import shutil
import subprocess
import tempfile
from pathlib import Path

import numpy as np
import pytest

NGSPICE = shutil.which("ngspice")

# Simulator accuracy, tighter than the defaults (reltol 1e-3): reltol bounds the local
# truncation error of each step relative to the signal; abstol/vntol are the absolute floors.
OPTIONS = ".options reltol=1e-6 abstol=1e-15 vntol=1e-9 chgtol=1e-18"

# Transient step limit as a fraction of the simulated span (the ngspice `tmax` argument).
STEPS_PER_SPAN = 20000


def require_ngspice():
    """Skip the calling test cleanly when ngspice is not installed (tests/run.sh installs it)."""
    if NGSPICE is None:
        pytest.skip("ngspice is not installed; tests/run.sh installs it from the system packages")


def _run(title, elements, analysis, expressions, scale):
    require_ngspice()
    with tempfile.TemporaryDirectory(prefix="fluxbook-spice-") as folder:
        table = Path(folder) / "out.txt"
        netlist = "\n".join([
            title,
            *elements,
            analysis,
            OPTIONS,
            ".control",
            "set wr_singlescale",
            "set wr_vecnames",
            "option numdgt=15",
            "run",
            f"wrdata {table} " + " ".join(expressions),
            "quit",
            ".endc",
            ".end",
            "",
        ])
        path = Path(folder) / "circuit.cir"
        path.write_text(netlist, encoding="ascii")
        completed = subprocess.run([NGSPICE, "-b", str(path)], capture_output=True, text=True,
                                   timeout=120, check=False, cwd=folder)
        if completed.returncode != 0 or not table.exists():
            raise AssertionError(f"ngspice failed:\n{netlist}\n{completed.stdout[-2000:]}"
                                 f"\n{completed.stderr[-2000:]}")
        data = np.loadtxt(table, skiprows=1, ndmin=2)
    columns = {scale: data[:, 0]}
    for index, expression in enumerate(expressions, start=1):
        columns[expression] = data[:, index]
    return columns


def transient(elements, stop, expressions, step=None):
    """A transient run from the elements' initial conditions (uic) to `stop` seconds.

    Parameters
    ----------
    elements : list of str
        Netlist lines; inductors and capacitors carry IC=... for their state at t = 0.
    stop : float
        End of the run [s].
    step : float, optional
        Largest time step [s]; default stop / STEPS_PER_SPAN.
    expressions : list of str
        Real vectors to write, e.g. "v(3)", "i(L1)".

    Returns
    -------
    dict
        {"time": array, expression: array}.
    """
    step = step or stop / STEPS_PER_SPAN
    analysis = f".tran {step:.6e} {stop:.6e} 0 {step:.6e} uic"
    return _run("fluxbook transient", elements, analysis, expressions, "time")


def ac(elements, start, stop, points_per_decade, expressions):
    """A small-signal AC sweep, log-spaced; complex results via real(...) and imag(...)."""
    analysis = f".ac dec {points_per_decade} {start:.6e} {stop:.6e}"
    wanted = [f"{part}({e})" for e in expressions for part in ("real", "imag")]
    columns = _run("fluxbook ac", elements, analysis, wanted, "frequency")
    result = {"frequency": columns["frequency"]}
    for e in expressions:
        result[e] = columns[f"real({e})"] + 1j * columns[f"imag({e})"]
    return result
