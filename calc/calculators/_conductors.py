"""View helpers the run calculators share (voltage-drop, wire-size, max-length, line-loss): their
common inputs, the reading of the load, one run solved with its field errors, the method steps,
the drop-limit check and the drop chart, and the texts they cite.
"""

import contextlib
import dataclasses
import math
from typing import NamedTuple

from calc import cautions, conductors, voltage_drop
from calc.calculators import _inputs
from calc.errors import InputError, ParameterError, VoltageCollapse
from calc.spec import Input
from calc.units import format_quantity as fq

SYSTEMS = (
    ("1ph", "Single-phase two-wire"),
    ("1ph3w", "Single-phase three-wire (120/240 V)"),
    ("3ph", "Three-phase (three- or four-wire, balanced)"),
    ("dc", "DC two-wire"),
)
SIZE_SYSTEMS = (("awg", "AWG and kcmil"), ("metric", "Metric (mm²)"))

# The approximation agrees with the exact drop when they differ by no more than this share of
# the exact drop (a margin chosen here: closer than a drop limit is ever read).
APPROXIMATION_TOLERANCE = 0.02

LIMIT_SOURCE = (
    "Drop limits are recommendations: NEC 210.19(A) Informational Note No. 4 and 215.2(A) "
    "suggest 3 % for a branch circuit and 5 % for feeder plus branch (not enforceable, 90.5(C)); "
    "IEC 60364-5-52 Annex G, Table G.52.1 gives 3 % lighting and 5 % other uses from a public "
    "LV supply (6 % / 8 % from a private supply). Local code may set others."
)
FORMULA_SOURCE = (
    "Exact: phasor solution of a series R + jX with the sending-end voltage held (short-line "
    "model, no shunt admittance). Approximate: VD = k I L (R cos θ + X sin θ), k = 2 "
    "single-phase and DC, √3 three-phase — IEEE Std 141 (Red Book) ch. 3 (from memory) and NEC "
    "Chapter 9 Table 9 note 2."
)
CONDUCTOR_DATA_SOURCE = (
    "Conductor data: see the conductor calculator (NEC Chapter 9 Tables 8 and 9, IEC 60228, "
    "IEC 60287-1-1)."
)
K_TEXT = {"3ph": "√3", "dc": "2", "1ph": "2", "1ph3w": "2"}  # the approximation's k, as shown
CHART_POINTS = 40  # segments of the drop-against-length chart


@contextlib.contextmanager
def conductor_fields(**renames):
    """Re-raise a calc.conductors ParameterError as an InputError on the form field of the same
    name as the parameter (size, material, method), or the one `renames` gives
    (`size="alt_size"`, `spacing="spacing_m"`)."""
    try:
        yield
    except ParameterError as error:
        field = renames.get(error.parameter, error.parameter)
        raise InputError(field, error.value, error.message) from None


def conductor_impedance(inputs, size, field="size"):
    """calc.conductors.impedance for `size` with the run's inputs; a size error names `field`."""
    frequency = 0.0 if inputs["system"] == "dc" else inputs["frequency_hz"]
    with conductor_fields(size=field):
        return conductors.impedance(size, inputs["material"], inputs["conductor_temp_c"],
                                    frequency, inputs["raceway"], None, inputs["method"])


def whole_number(inputs, name):
    """The input `name` as an int, refused on its field unless it is a whole number."""
    value = inputs[name]
    if not float(value).is_integer():
        raise InputError(name, value, f"{value:g} is not a whole number; enter 1, 2, 3 …")
    return int(value)


def _load_current(inputs, system, voltage, power_factor):
    """The load current per line [A] from the current, or the kW or kVA given, at nominal volts,
    and the name of the field it came from (None for the current itself)."""
    given = [name for name in ("current", "power", "kva") if inputs.get(name) is not None]
    if not given:
        raise InputError("current", None, "give the load current, or its power (kW) or "
                         "apparent power (kVA) in the other load field")
    if len(given) > 1:
        raise InputError(given[1], inputs[given[1]], f"give only one of current, power and kVA "
                         f"(both {given[0]} and {given[1]} are filled in)")
    name = given[0]
    if name == "current":
        return inputs["current"], None
    if name == "kva":  # apparent power: the current of a unity-pf load of that many watts
        return voltage_drop.load_current(system, inputs["kva"], voltage, 1.0), name
    return voltage_drop.load_current(system, inputs["power"], voltage, power_factor), name


class RunReading(NamedTuple):
    """The run inputs as every run calculator reads them (pf is 1 on DC)."""

    system: str
    voltage: float  # [V]
    power_factor: float
    sets: int
    current: float  # per line [A]
    current_from: str | None  # "power" or "kva" when the current was found from it
    neutral_current: float  # [A]


def read_run(inputs):
    """The run's inputs read and cross-checked, as a RunReading."""
    system = inputs["system"]
    voltage = inputs["voltage"]
    power_factor = 1.0 if system == "dc" else inputs["pf"]
    sets = whole_number(inputs, "sets")
    neutral = inputs.get("neutral_a")
    if neutral is not None and system != "1ph3w":
        raise InputError("neutral_a", neutral, "a neutral current applies only to the 120/240 V "
                         "three-wire system (1ph3w); leave it blank")
    current, current_from = _load_current(inputs, system, voltage, power_factor)
    return RunReading(system, voltage, power_factor, sets, current, current_from, neutral or 0.0)


def solve_length(reading, z, length):
    """calc.voltage_drop.solve_run for one length of the run read (VoltageCollapse passes)."""
    r = reading
    return voltage_drop.solve_run(r.system, r.voltage, length, z.r_ac, z.x, r.power_factor,
                                  r.sets, current=r.current, neutral_current=r.neutral_current)


def solve(inputs, size, length):
    """(impedance, solution) of the run with `size`; a collapse is an error on `length`."""
    z = conductor_impedance(inputs, size)
    try:
        return z, solve_length(read_run(inputs), z, length)
    except VoltageCollapse as error:
        raise InputError("length", length, f"{error}; shorten the run, use a larger size or "
                         "parallel sets, or a higher voltage") from None


def conductor_step(result, inputs, size, z):
    """The method step that names the conductor and its impedance per metre."""
    result.step(f"Conductor: {size.label} {conductors.MATERIAL_NAMES[inputs['material']]} at "
                f"{inputs['conductor_temp_c']:g} °C, {inputs['raceway']} raceway "
                f"(method {inputs['method']}; see the conductor calculator)",
                "r_ac, x per metre of one conductor",
                f"= {z.r_ac * 1e3:.4g} Ω/km, {z.x * 1e3:.4g} Ω/km")


def drop_limit_check(result, name, drop_pct, limit, subject="The drop"):
    """pass when the drop [%] is within the limit [%], else fail; `subject` opens the message."""
    ok = drop_pct <= limit
    result.check(name, "pass" if ok else "fail",
                 f"{subject} is {drop_pct:.3g} %, {'within' if ok else 'over'} the {limit:g} % "
                 "limit (a recommendation; local code may differ).")


def describe_run(result, inputs, size, length, z, run):
    """Steps, checks, assumptions, sources and cautions shared by the three drop calculators."""
    r = read_run(inputs)
    system, voltage, pf, current = r.system, r.voltage, r.power_factor, r.current
    conductor_step(result, inputs, size, z)
    result.step(f"One conductor of the run ({fq(length, 'm')}"
                + (f", {r.sets} sets in parallel)" if r.sets > 1 else ")"),
                "R = r_ac L / n, X = x L / n",
                f"= {run.resistance:.4g} Ω, {run.reactance:.4g} Ω")
    if r.current_from:
        power = r.current_from == "power"
        given = fq(inputs[r.current_from], "W" if power else "VA")
        k = "√3 × " if system == "3ph" else ""
        pf_text = f" / {pf:g}" if power else ""
        result.step(f"Load current from the {'power' if power else 'apparent power'} at "
                    "nominal voltage", f"I = S / ({k}V)",
                    f"= {given}{pf_text} / ({k}{fq(voltage, 'V')}) = {fq(current, 'A')}")
    path = {"3ph": "per phase, V/√3", "1ph3w": "per leg, V/2"}.get(system, "around the loop")
    result.step(f"Exact phasor solution ({path}; sending end held at nominal)",
                "V_s² = (V_r + I R cos φ + I X sin φ)² + (I X cos φ − I R sin φ)²",
                f"V_r = {fq(run.end_v, 'V')}; drop = {fq(voltage, 'V')} − {fq(run.end_v, 'V')} = "
                f"{fq(run.drop_v, 'V')} = {run.drop_pct:.3g} %")
    k_text = K_TEXT[system]
    result.step("The usual approximation", "VD = k I (R cos θ + X sin θ), k = " + k_text,
                f"= {k_text} × {fq(current, 'A')} × ({run.resistance:.4g} × {pf:g} + "
                f"{run.reactance:.4g} × {math.sqrt(max(0.0, 1 - pf * pf)):.3g}) = "
                f"{fq(run.approx_drop_v, 'V')} = {run.approx_drop_pct:.3g} %")
    result.step("Conductor loss", "P = n_c I² R", f"= {fq(run.loss_w, 'W')}")
    drop_limit_check(result, "drop_limit", run.drop_pct, inputs["max_drop_pct"])
    difference = run.approx_drop_v - run.drop_v
    agree = abs(difference) <= APPROXIMATION_TOLERANCE * max(run.drop_v, 1e-12)
    result.check("approximation", "pass" if agree else "warn",
                 f"The approximation gives {run.approx_drop_pct:.3g} %, "
                 f"{difference / max(run.drop_v, 1e-12):+.1%} from the exact {run.drop_pct:.3g} %"
                 + (f" (within {APPROXIMATION_TOLERANCE * 100:g} %)." if agree
                    else f", beyond {APPROXIMATION_TOLERANCE * 100:g} %; use the exact figure."))
    result.assumptions += [
        "Sending-end voltage held at nominal; a single load at the far end of the run.",
        "Constant-current load: the current is the given one (or found from the power at "
        "nominal voltage); a constant-power load would draw a little more as the voltage falls.",
        "Conductor resistance at the stated temperature; reactance for three conductors in "
        "trefoil, touching, unless the table method's NEC Table 9 values apply.",
    ]
    if system == "1ph3w":
        neutral = r.neutral_current
        result.assumptions.append(
            "120/240 V three-wire: " + ("balanced legs, no neutral current." if not neutral else
                                        f"{fq(neutral, 'A')} neutral current taken in phase with "
                                        "the line current (worst leg); end voltage is twice that "
                                        "leg's."))
    if system == "dc":
        result.assumptions.append("DC: no reactance, power factor 1.")
    result.sources += [FORMULA_SOURCE, LIMIT_SOURCE, CONDUCTOR_DATA_SOURCE]
    result.cautions += [
        "Voltage drop only: ampacity, insulation temperature rating, terminal temperature, "
        "derating for grouping or ambient, and overcurrent protection are NOT checked here.",
        "Motor starting draws several times running current; check the dip separately.",
    ]
    result.cautions += list(cautions.COMMON)


def drop_series(inputs, size, mark_length, limit):
    """Chart: the exact drop against run length, to twice `mark_length`, with the limit."""
    reading = read_run(inputs)
    z = conductor_impedance(inputs, size)
    lengths = [mark_length * 2.0 * k / CHART_POINTS for k in range(CHART_POINTS + 1)]
    drops = []
    for length in lengths:
        try:
            drops.append(solve_length(reading, z, length).drop_pct)
        except VoltageCollapse:
            break
    lengths = lengths[:len(drops)]
    return {
        "title": f"Voltage drop against run length, {size.label}",
        "x": {"label": "One-way length", "unit": "m", "values": lengths},
        "y": [{"label": "Drop (exact)", "unit": "%", "values": drops}],
        "marks": [{"axis": "y", "value": limit, "label": f"{limit:g} % limit"},
                  {"axis": "x", "value": mark_length, "label": "This run"}],
    }


def run_inputs(with_size=True, with_length=True, with_sizes=False):
    """The input specs shared by voltage-drop, wire-size and max-length."""
    items = [
        Input("system", "System", "choice", default="1ph", choices=SYSTEMS,
              help="Single-phase two-wire, 120/240 V three-wire, three-phase, or DC."),
        Input("voltage", "Nominal voltage", "quantity", unit="V", default=120, minimum=0,
              min_exclusive=True, maximum=35000, region_defaults={"iec": 230}, suggest="voltages",
              help="Line-to-line for three-phase (480 V, 400 V); 240 V for 120/240 V three-wire."),
        Input("current", "Load current", "quantity", unit="A", default=16, optional=True,
              minimum=0, min_exclusive=True, maximum=20000,
              help="Per line. Or leave blank and give the load's power under More inputs."),
    ]
    if with_length:
        items.append(Input("length", "One-way length", "quantity", unit="m", default="100 ft",
                           minimum=0, min_exclusive=True, maximum=100000,
                           region_defaults={"iec": "30 m"},
                           help="Source to load, one way (e.g. 150 ft or 45 m)."))
    if with_size:
        items.append(Input("size", "Conductor size", "size", default="12 AWG",
                           region_defaults={"iec": "2.5 mm²"}))
    if with_sizes:
        items.append(Input("sizes", "Sizes to choose from", "choice", default="awg",
                           choices=SIZE_SYSTEMS, region_defaults={"iec": "metric"}))
    items += [
        _inputs.material(),
        Input("pf", "Power factor (lagging)", "quantity", unit="", default=0.9, minimum=0,
              min_exclusive=True, maximum=1, help="1 for heaters and lamps; ignored for DC."),
        Input("max_drop_pct", "Drop limit", "quantity", unit="%", default=3, minimum=0,
              min_exclusive=True, maximum=20,
              help="Recommended: 3 % branch, 5 % feeder plus branch (NEC note; IEC Annex G)."),
        Input("power", "Load power (instead of current)", "quantity", unit="kW", optional=True,
              minimum=0, min_exclusive=True, maximum=1e5, advanced=True,
              help="Real power drawn, kW or hp of input; the current field must be blank."),
        Input("kva", "Load apparent power (instead of current)", "quantity", unit="kVA",
              optional=True, minimum=0, min_exclusive=True, maximum=1e5, advanced=True),
        Input("conductor_temp_c", "Conductor temperature", "quantity", unit="degC", default=75,
              minimum=-40, maximum=250, region_defaults={"iec": 80}, advanced=True,
              help="75 °C matches NEC Chapter 9 tables; IEC Annex G uses about 80 °C."),
        Input("raceway", "Raceway", "choice", default="pvc", choices=conductors.RACEWAYS,
              advanced=True),
        Input("sets", "Parallel sets", "quantity", unit="", default=1, minimum=1, maximum=20,
              advanced=True, help="Conductors in parallel per phase."),
        _inputs.frequency(advanced=True),
        Input("neutral_a", "Neutral current (120/240 V only)", "quantity", unit="A",
              optional=True, minimum=0, maximum=20000, advanced=True,
              help="Unbalance current in the neutral; blank means balanced."),
        Input("method", "Conductor data", "choice", default="table",
              choices=conductors.METHODS, region_defaults={"iec": "physics"}, advanced=True,
              help="Table: NEC Chapter 9 Tables 8 and 9 (or IEC 60228); physics: from geometry."),
    ]
    return tuple(items)


def run_input(source, **changes):
    """The shared run input named `source`, reused by another calculator with the changes given
    (a change of `name` makes a second input of the same kind)."""
    (item,) = [item for item in run_inputs() if item.name == source]
    return dataclasses.replace(item, **changes)
