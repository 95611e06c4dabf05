"""A DC motor's run-up as an ngspice transient: the independent reference for
calc.dc_motors.run_up.

The equivalent circuit, one node per equation:

    armature   V ── R ── L ── Vsense ── E,  E a voltage source = k·ω  (series: k_s·i·ω)
    shaft      node w: a capacitor C = J to ground, so its voltage is ω [rad/s] and
               C dV/dt = Σ currents in is J dω/dt = Σ torques; the motor torque k·i (series:
               k_s·i²) is a current source into w, the load and friction B·ω a current out.

A rotor that the load holds at standstill (static friction) is modelled by letting the load
current never exceed the motor's own torque while ω ≤ 0, as calc.dc_motors does.
"""

import shutil
import subprocess
import tempfile
from pathlib import Path

NGSPICE = shutil.which("ngspice") or "/usr/bin/ngspice"


def available():
    return Path(NGSPICE).exists()


def _load_expression(motor):
    """The load torque plus friction as an ngspice B-source current expression."""
    if motor.load == "fan":
        load = f"{motor.load_torque!r}*(V(w)/{motor.load_speed!r})^2"
    elif motor.load == "constant":
        load = f"{motor.load_torque!r}"
    else:
        load = "0"
    return f"{load}+{motor.damping!r}*V(w)"


def run_up_netlist(motor, resistance, t_stop, t_max_step):
    """The netlist text of one run-up with `resistance` in the armature circuit."""
    series = motor.motor_type == "series"
    k = repr(motor.constant)
    emf = f"{k}*I(Vsense)*V(w)" if series else f"{k}*V(w)"
    torque = f"{k}*I(Vsense)*I(Vsense)" if series else f"{k}*I(Vsense)"
    load = _load_expression(motor)
    # While the rotor stands, the load holds it: never more than the motor's torque.
    held = f"(V(w) > 1e-9 ? ({load}) : min({load}, max({torque}, 0)))"
    return "\n".join([
        "* DC motor run-up (calc.dc_motors cross-check)",
        f"Vsupply a 0 DC {motor.voltage!r}",
        f"Rarm a b {resistance!r}",
        f"Larm b c {motor.inductance!r} IC=0",
        "Vsense c d DC 0",
        f"Bemf d 0 V={emf}",
        f"Cshaft w 0 {motor.inertia!r} IC=0",
        f"Btorque 0 w I={torque}",
        f"Bload w 0 I={held}",
        ".options reltol=1e-6 abstol=1e-9 vntol=1e-9 method=gear maxord=2",
        f".tran {t_max_step!r} {t_stop!r} 0 {t_max_step!r} uic",
        ".control",
        "run",
        "wrdata {out} I(Vsense) V(w)",
        "quit",
        ".endc",
        ".end",
    ])


def run_up(motor, resistance, t_stop, t_max_step):
    """Run ngspice in batch mode; return (times [s], current [A], speed [rad/s])."""
    with tempfile.TemporaryDirectory() as folder:
        out = Path(folder) / "out.txt"
        deck = Path(folder) / "motor.cir"
        deck.write_text(run_up_netlist(motor, resistance, t_stop, t_max_step)
                        .replace("{out}", str(out)), encoding="ascii")
        completed = subprocess.run([NGSPICE, "-b", str(deck)], capture_output=True, text=True,
                                   timeout=120, check=False)
        if completed.returncode != 0 or not out.exists():
            raise RuntimeError(f"ngspice failed: {completed.stdout[-1500:]}{completed.stderr[-1500:]}")
        times, currents, speeds = [], [], []
        for line in out.read_text().split("\n"):
            parts = line.split()
            if len(parts) == 4:  # wrdata writes (time, value) for each vector
                times.append(float(parts[0]))
                currents.append(float(parts[1]))
                speeds.append(float(parts[3]))
        return times, currents, speeds
