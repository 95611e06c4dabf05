"""Voltage drop along one run: exact phasor solution and the usual approximation, on any system.

Quantities follow the nomenclature page: voltage [V] (line-to-line for three-phase), current
[A], length [m] one-way, resistance and reactance [Ω] of one conductor of the whole run,
power [W], power_factor [-] (lagging).
"""

import math
from typing import NamedTuple

from calc import cautions, conductors, units
from calc.errors import CalcError, InputError
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

SQRT3 = math.sqrt(3.0)

# Systems: how the nominal voltage relates to the voltage across one load path, and how many
# conductors carry the load current there and back.
#   dc     two-wire DC: loop of 2 conductors, no reactance
#   1ph    single-phase two-wire: loop of 2 conductors
#   1ph3w  single-phase three-wire (120/240 V): nominal is line-to-line; each leg is half of it
#   3ph    three-phase three- or four-wire, balanced: per phase, V/√3 and one conductor
SYSTEMS = (
    ("1ph", "Single-phase two-wire"),
    ("1ph3w", "Single-phase three-wire (120/240 V)"),
    ("3ph", "Three-phase (three- or four-wire, balanced)"),
    ("dc", "DC two-wire"),
)

# The approximate formula's k: VD = k · I · (R cos θ + X sin θ) with R, X of one conductor.
# IEEE Std 141 (Red Book) ch. 3 and NEC Chapter 9 Table 9 note 2 — from memory for IEEE.
K_FACTOR = {"dc": 2.0, "1ph": 2.0, "1ph3w": 2.0, "3ph": SQRT3}

MAX_ITERATIONS = 100
TOLERANCE = 1e-12  # relative change of the load-end voltage that ends the iteration


class VoltageCollapse(CalcError):
    """The run cannot deliver the load: there is no load-end voltage for it (too long or thin)."""


def path_voltage(system, voltage):
    """Voltage across one load path [V]: phase-to-neutral for 3ph, leg-to-neutral for 1ph3w."""
    if system == "3ph":
        return voltage / SQRT3
    if system == "1ph3w":
        return voltage / 2.0
    return voltage


def loop_impedance(system, resistance, reactance):
    """(R, X) [Ω] of the path the load current travels: there and back for two-wire systems.

    For three-phase and for a balanced 120/240 V three-wire circuit the neutral carries no
    current, so the path is one conductor.
    """
    if system in ("dc", "1ph"):
        return 2.0 * resistance, (0.0 if system == "dc" else 2.0 * reactance)
    return resistance, reactance


def receiving_voltage(sending_voltage, current, resistance, reactance, power_factor):
    """Load-end voltage magnitude for a load current lagging its own voltage by acos(pf).

    Parameters
    ----------
    sending_voltage : float
        Voltage held at the source end of the path [V].
    current : float
        Load current magnitude [A].
    resistance, reactance : float
        Path impedance [Ω].
    power_factor : float
        Load power factor, lagging, in (0, 1].

    Returns
    -------
    float
        |V_r| [V], from |V_s|² = (V_r + I R cos φ + I X sin φ)² + (I X cos φ − I R sin φ)².

    Raises
    ------
    VoltageCollapse
        When the current cannot flow through that impedance from that voltage.

    Notes
    -----
    Phasor diagram of a short line with the load-end voltage as reference; exact for a series
    impedance with no shunt admittance.

    Examples
    --------
    >>> round(receiving_voltage(120.0, 20.0, 0.3, 0.0, 1.0), 3)
    114.0
    """
    cos_phi = power_factor
    sin_phi = math.sqrt(max(0.0, 1.0 - cos_phi * cos_phi))
    in_phase = current * (resistance * cos_phi + reactance * sin_phi)
    quadrature = current * (reactance * cos_phi - resistance * sin_phi)
    discriminant = sending_voltage * sending_voltage - quadrature * quadrature
    if discriminant < 0.0:
        raise VoltageCollapse("the run cannot carry this current: no load-end voltage exists")
    end = math.sqrt(discriminant) - in_phase
    if end <= 0.0:
        raise VoltageCollapse("the whole supply voltage is lost in the run at this current")
    return end


def receiving_voltage_constant_power(sending_voltage, power, resistance, reactance, power_factor):
    """Load-end voltage and current for a load that draws a fixed real power [W] on one path.

    The current rises as the voltage falls (I = P / (V_r pf)); solved by fixed-point iteration.

    Returns
    -------
    (float, float)
        |V_r| [V] and the load current [A].

    Raises
    ------
    VoltageCollapse
        When no steady state exists (the iteration diverges or finds no voltage).
    """
    end = sending_voltage
    for _ in range(MAX_ITERATIONS):
        current = power / (end * power_factor)
        new_end = receiving_voltage(sending_voltage, current, resistance, reactance, power_factor)
        if abs(new_end - end) <= TOLERANCE * sending_voltage:
            return new_end, power / (new_end * power_factor)
        end = new_end
    raise VoltageCollapse("no steady load-end voltage: the run is too weak for this load")


def approximate_drop(system, current, resistance, reactance, power_factor):
    """VD ≈ k · I · (R cos θ + X sin θ) [V] in terms of the nominal voltage (R, X of one conductor).

    For 1ph3w it is the line-to-line drop of a balanced load (both legs), for 3ph line-to-line.
    """
    sin_phi = math.sqrt(max(0.0, 1.0 - power_factor * power_factor))
    x_part = 0.0 if system == "dc" else reactance * sin_phi
    return K_FACTOR[system] * current * (resistance * power_factor + x_part)


def nominal_scale(system):
    """Factor from a drop on one path to a drop in the nominal voltage (LL for 3ph and 1ph3w)."""
    return {"3ph": SQRT3, "1ph3w": 2.0}.get(system, 1.0)


def conductor_loss(system, current, resistance, neutral_current=0.0):
    """I²R loss of the whole run [W] (R of one conductor of the run)."""
    conductors = {"dc": 2, "1ph": 2, "1ph3w": 2, "3ph": 3}[system]
    return conductors * current * current * resistance + neutral_current ** 2 * resistance


# ---- one run, solved ------------------------------------------------------------------------

class RunSolution(NamedTuple):
    """A run solved both ways. Voltages are in terms of the nominal voltage (LL for 3ph/1ph3w)."""

    current: float  # load current [A]
    end_v: float  # exact load-end voltage [V]
    drop_v: float  # exact drop, sending minus receiving magnitude [V]
    drop_pct: float  # of nominal [%]
    approx_drop_v: float  # k I (R cos θ + X sin θ) [V]
    approx_drop_pct: float
    loss_w: float  # I²R of the run [W]
    resistance: float  # one conductor of the run, sets in parallel [Ω]
    reactance: float  # [Ω]


def solve_run(system, voltage, length, r_per_m, x_per_m, power_factor, sets=1, current=None,
              power=None, neutral_current=0.0):
    """Drop along one run with the sending-end voltage held at nominal.

    Parameters
    ----------
    system : str
        "dc", "1ph", "1ph3w" or "3ph".
    voltage : float
        Nominal voltage [V]; line-to-line for 3ph and for 1ph3w (240 V for 120/240 V).
    length : float
        One-way run length [m].
    r_per_m, x_per_m : float
        Resistance and reactance of one conductor per metre [Ω/m] (x ignored for DC).
    power_factor : float
        Lagging, in (0, 1]; 1 for DC.
    sets : int
        Conductors in parallel per phase.
    current : float, optional
        Load current per line [A] (constant-current load) ...
    power : float, optional
        ... or total real power drawn [W] (constant-power load); give exactly one.
    neutral_current : float
        1ph3w only: current in the neutral from unbalance [A], taken in phase with the line
        current, which is the worst case for the more heavily loaded leg.

    Returns
    -------
    RunSolution

    Raises
    ------
    VoltageCollapse
        The run cannot carry the load.

    Examples
    --------
    >>> round(solve_run("1ph", 120.0, 30.0, 0.0065, 0.0, 1.0, current=16.0).drop_v, 3)
    6.24
    """
    if system == "dc":
        power_factor, x_per_m = 1.0, 0.0
    resistance = r_per_m * length / sets
    reactance = x_per_m * length / sets
    path_r, path_x = loop_impedance(system, resistance, reactance)
    if system == "1ph3w" and neutral_current:
        line = current if current is not None else power / (voltage * power_factor)
        scale = 1.0 + neutral_current / line  # the neutral's drop adds to the leg's
        path_r, path_x = path_r * scale, path_x * scale
    send = path_voltage(system, voltage)
    if current is not None:
        end = receiving_voltage(send, current, path_r, path_x, power_factor)
    else:
        paths = {"3ph": 3.0, "1ph3w": 2.0}.get(system, 1.0)
        end, current = receiving_voltage_constant_power(
            send, power / paths, path_r, path_x, power_factor)
    scale = nominal_scale(system)
    drop = (send - end) * scale
    approx = approximate_drop(system, current, resistance, reactance, power_factor)
    if system == "1ph3w" and neutral_current:
        approx *= 1.0 + neutral_current / current
    loss = conductor_loss(system, current, resistance, neutral_current if system == "1ph3w" else 0)
    return RunSolution(current, end * scale, drop, 100.0 * drop / voltage, approx,
                       100.0 * approx / voltage, loss, resistance, reactance)


def max_length(system, voltage, r_per_m, x_per_m, power_factor, max_drop_pct, sets=1,
               current=None, power=None, neutral_current=0.0):
    """Longest one-way run [m] whose exact drop stays within max_drop_pct of nominal.

    The drop grows monotonically with length, so the limit is found by bisection on length.
    """
    def drop_at(length):
        try:
            return solve_run(system, voltage, length, r_per_m, x_per_m, power_factor, sets,
                             current, power, neutral_current).drop_pct
        except VoltageCollapse:
            return math.inf

    low, high = 0.0, 1.0
    while drop_at(high) < max_drop_pct:
        low, high = high, high * 2.0
        if high > 1e7:
            raise VoltageCollapse("the drop stays under the limit for any length: check the load")
    for _ in range(200):
        middle = 0.5 * (low + high)
        if drop_at(middle) < max_drop_pct:
            low = middle
        else:
            high = middle
        if high - low <= 1e-9 * high:
            break
    return low


# ---- the calculators ------------------------------------------------------------------------

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
SIZE_SYSTEMS = (("awg", "AWG and kcmil"), ("metric", "Metric (mm²)"))
FIRST_SIZE = {"awg": "14 AWG", "metric": "1.5 mm²"}  # smallest power-circuit sizes considered


def _load_current(inputs, system, voltage, power_factor):
    """The load current per line [A] from the current, or the kW or kVA given, at nominal volts."""
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
    apparent = inputs["kva"] if name == "kva" else inputs["power"] / power_factor
    per_volt = {"3ph": SQRT3 * voltage}.get(system, voltage)
    return apparent / per_volt, name


def _count(inputs, name):
    value = inputs[name]
    if not float(value).is_integer():
        raise InputError(name, value, f"{value:g} is not a whole number; enter 1, 2, 3 …")
    return int(value)


def _conductor_impedance(inputs, size):
    frequency = 0.0 if inputs["system"] == "dc" else inputs["frequency_hz"]
    return conductors.impedance(size, inputs["material"], inputs["conductor_temp_c"], frequency,
                                inputs["raceway"], None, inputs["method"])


def _setup(inputs):
    """Common reading of the inputs: (system, voltage, pf, sets, current, current_from, neutral)."""
    system = inputs["system"]
    voltage = inputs["voltage"]
    power_factor = 1.0 if system == "dc" else inputs["pf"]
    sets = _count(inputs, "sets")
    neutral = inputs.get("neutral_a")
    if neutral is not None and system != "1ph3w":
        raise InputError("neutral_a", neutral, "a neutral current applies only to the 120/240 V "
                         "three-wire system (1ph3w); leave it blank")
    current, current_from = _load_current(inputs, system, voltage, power_factor)
    return system, voltage, power_factor, sets, current, current_from, neutral or 0.0


def _solve(inputs, size, length):
    system, voltage, pf, sets, current, _, neutral = _setup(inputs)
    z = _conductor_impedance(inputs, size)
    try:
        return z, solve_run(system, voltage, length, z.r_ac, z.x, pf, sets, current=current,
                            neutral_current=neutral)
    except VoltageCollapse as error:
        raise InputError("length", length, f"{error}; shorten the run, use a larger size or "
                         "parallel sets, or a higher voltage") from None


def _describe_run(result, inputs, size, length, z, run):
    """Steps, checks, assumptions, sources and cautions shared by the three calculators."""
    system, voltage, pf, sets, current, current_from, neutral = _setup(inputs)
    limit = inputs["max_drop_pct"]
    per = fq(length, "m")
    result.step(f"Conductor: {size.label} {conductors.MATERIAL_NAMES[inputs['material']]} at "
                f"{inputs['conductor_temp_c']:g} °C, {inputs['raceway']} raceway "
                f"(method {inputs['method']}; see the conductor calculator)",
                "r_ac, x per metre of one conductor",
                f"= {z.r_ac * 1e3:.4g} Ω/km, {z.x * 1e3:.4g} Ω/km")
    result.step(f"One conductor of the run ({per}" + (f", {sets} sets in parallel)" if sets > 1
                                                     else ")"),
                "R = r_ac L / n, X = x L / n",
                f"= {run.resistance:.4g} Ω, {run.reactance:.4g} Ω")
    if current_from:
        given = fq(inputs[current_from], "W" if current_from == "power" else "VA")
        k = "√3 × " if system == "3ph" else ""
        pf_text = f" / {pf:g}" if current_from == "power" else ""
        result.step(f"Load current from the {'power' if current_from == 'power' else 'apparent power'}"
                    " at nominal voltage", f"I = S / ({k}V)",
                    f"= {given}{pf_text} / ({k}{fq(voltage, 'V')}) = {fq(current, 'A')}")
    path = {"3ph": "per phase, V/√3", "1ph3w": "per leg, V/2"}.get(system, "around the loop")
    result.step(f"Exact phasor solution ({path}; sending end held at nominal)",
                "V_s² = (V_r + I R cos φ + I X sin φ)² + (I X cos φ − I R sin φ)²",
                f"V_r = {fq(run.end_v, 'V')}; drop = {fq(voltage, 'V')} − {fq(run.end_v, 'V')} = "
                f"{fq(run.drop_v, 'V')} = {run.drop_pct:.3g} %")
    k_text = {"3ph": "√3", "dc": "2", "1ph": "2", "1ph3w": "2"}[system]
    result.step("The usual approximation", "VD = k I (R cos θ + X sin θ), k = " + k_text,
                f"= {k_text} × {fq(current, 'A')} × ({run.resistance:.4g} × {pf:g} + "
                f"{run.reactance:.4g} × {math.sqrt(max(0.0, 1 - pf * pf)):.3g}) = "
                f"{fq(run.approx_drop_v, 'V')} = {run.approx_drop_pct:.3g} %")
    result.step("Conductor loss", "P = n_c I² R", f"= {fq(run.loss_w, 'W')}")
    ok = run.drop_pct <= limit
    result.check("drop_limit", "pass" if ok else "fail",
                 f"Drop {run.drop_pct:.3g} % is {'within' if ok else 'over'} the {limit:g} % "
                 "limit (a recommendation; local code may differ).")
    difference = run.approx_drop_v - run.drop_v
    agree = abs(difference) <= 0.02 * max(run.drop_v, 1e-12)
    result.check("approximation", "pass" if agree else "warn",
                 f"The approximation gives {run.approx_drop_pct:.3g} %, "
                 f"{difference / max(run.drop_v, 1e-12):+.1%} from the exact {run.drop_pct:.3g} %"
                 + ("." if agree else "; use the exact figure."))
    result.assumptions += [
        "Sending-end voltage held at nominal; a single load at the far end of the run.",
        "Constant-current load: the current is the given one (or found from the power at "
        "nominal voltage); a constant-power load would draw a little more as the voltage falls.",
        "Conductor resistance at the stated temperature; reactance for three conductors in "
        "trefoil, touching, unless the table method's NEC Table 9 values apply.",
    ]
    if system == "1ph3w":
        result.assumptions.append(
            "120/240 V three-wire: " + ("balanced legs, no neutral current." if not neutral else
                                        f"{fq(neutral, 'A')} neutral current taken in phase with "
                                        "the line current (worst leg); end voltage is twice that "
                                        "leg's."))
    if system == "dc":
        result.assumptions.append("DC: no reactance, power factor 1.")
    result.sources += [FORMULA_SOURCE, LIMIT_SOURCE,
                       "Conductor data: see the conductor calculator (NEC Chapter 9 Tables 8 "
                       "and 9, IEC 60228, IEC 60287-1-1)."]
    result.cautions += [
        "Voltage drop only: ampacity, insulation temperature rating, terminal temperature, "
        "derating for grouping or ambient, and overcurrent protection are NOT checked here.",
        "Motor starting draws several times running current; check the dip separately.",
    ]
    result.cautions += list(cautions.COMMON)


def _drop_series(inputs, size, mark_length, limit):
    system, voltage, pf, sets, current, _, neutral = _setup(inputs)
    z = _conductor_impedance(inputs, size)
    lengths = [mark_length * 2.0 * k / 40 for k in range(41)]
    drops = []
    for length in lengths:
        try:
            drops.append(solve_run(system, voltage, length, z.r_ac, z.x, pf, sets,
                                   current=current, neutral_current=neutral).drop_pct)
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


def _voltage_drop_view(inputs):
    size, length = inputs["size"], inputs["length"]
    z, run = _solve(inputs, size, length)
    result = Result()
    result.output("drop_v", run.drop_v)
    result.output("drop_pct", run.drop_pct)
    result.output("end_v", run.end_v)
    result.output("loss_w", run.loss_w)
    result.output("current", run.current)
    result.output("drop_pct_approx", run.approx_drop_pct)
    _describe_run(result, inputs, size, length, z, run)
    result.series = [_drop_series(inputs, size, length, inputs["max_drop_pct"]),
                     _profile_series(inputs, size, length, z, run)]
    return result


def _profile_series(inputs, size, length, z, run):
    """Voltage along this run with its load at the far end (the current flows the whole way)."""
    system, voltage, pf, sets, current, _, neutral = _setup(inputs)
    distances = [length * k / 20 for k in range(21)]
    volts = [solve_run(system, voltage, d, z.r_ac, z.x, pf, sets, current=current,
                       neutral_current=neutral).end_v if d > 0 else voltage for d in distances]
    floor = voltage * (1 - inputs["max_drop_pct"] / 100)
    return {
        "title": "Voltage along the run",
        "x": {"label": "Distance from the source", "unit": "m", "values": distances},
        "y": [{"label": "Voltage", "unit": "V", "values": volts}],
        "marks": [{"axis": "y", "value": floor, "label": f"{inputs['max_drop_pct']:g} % below nominal"}],
    }


def _candidate_sizes(system, material):
    start = units.SIZES.index(FIRST_SIZE[system])
    labels = units.METRIC_SIZES if system == "metric" else units.AWG_SIZES + units.KCMIL_SIZES
    for label in labels:
        if units.SIZES.index(label) < start:
            continue
        try:
            conductors.check_made(label, material)
        except InputError:
            continue
        yield units.parse_conductor_size(label)


def _wire_size_view(inputs):
    limit, length = inputs["max_drop_pct"], inputs["length"]
    tried = []
    for size in _candidate_sizes(inputs["sizes"], inputs["material"]):
        try:
            z, run = _solve(inputs, size, length)
        except InputError:
            continue  # this size collapses; a larger one may not
        tried.append((size, z, run))
        if run.drop_pct <= limit:
            break
    else:
        largest = tried[-1][0].label if tried else "the largest size"
        raise InputError("length", length, f"no size up to {largest} with {int(inputs['sets'])} "
                         f"set(s) keeps the drop within {limit:g} %; use parallel sets, a higher "
                         "voltage or a shorter run")
    size, z, run = tried[-1]
    result = Result()
    result.output("size", size.area_m2, size.label)
    result.output("drop_pct", run.drop_pct)
    result.output("drop_v", run.drop_v)
    result.output("current", run.current)
    if len(tried) > 1:
        smaller, _, smaller_run = tried[-2]
        result.step("The next smaller size does not meet the limit", f"{smaller.label}",
                    f"= {smaller_run.drop_pct:.3g} % > {limit:g} %")
    following = []
    for bigger in list(_candidate_sizes(inputs["sizes"], inputs["material"])):
        if bigger.area_m2 > size.area_m2 and len(following) < 2:
            try:
                following.append((bigger, _solve(inputs, bigger, length)[1]))
            except InputError:
                pass
    for bigger, bigger_run in following:
        result.step("For comparison, a larger size", bigger.label,
                    f"= {bigger_run.drop_pct:.3g} % drop, {fq(bigger_run.loss_w, 'W')} loss")
    _describe_run(result, inputs, size, length, z, run)
    result.cautions.insert(0, "This is the smallest size for voltage drop alone; it may be "
                              "smaller than ampacity, protection or the code's minimum allow.")
    result.series = _drop_series(inputs, size, length, limit)
    return result


def _max_length_view(inputs):
    size, limit = inputs["size"], inputs["max_drop_pct"]
    system, voltage, pf, sets, current, _, neutral = _setup(inputs)
    z = _conductor_impedance(inputs, size)
    try:
        length = max_length(system, voltage, z.r_ac, z.x, pf, limit, sets, current=current,
                            neutral_current=neutral)
    except VoltageCollapse as error:
        raise InputError("current", current, str(error)) from None
    _, run = _solve(inputs, size, length)
    result = Result()
    result.output("length", length, f"{fq(length, 'm')} ({length / 0.3048:.3g} ft)")
    result.output("drop_pct", run.drop_pct)
    result.output("current", run.current)
    result.step("Longest run: the length at which the exact drop equals the limit (bisection)",
                f"drop(L) = {limit:g} %", f"L = {fq(length, 'm')} ({length / 0.3048:.3g} ft)")
    _describe_run(result, inputs, size, length, z, run)
    result.cautions.insert(0, "The longest run for voltage drop alone; ampacity, protection "
                              "and fault clearing may allow less.")
    result.series = _drop_series(inputs, size, length, limit)
    return result


def _inputs(with_size=True, with_length=True, with_sizes=False):
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
        Input("material", "Material", "choice", default="cu",
              choices=(("cu", "Copper"), ("al", "Aluminium"))),
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
        Input("frequency_hz", "Frequency", "quantity", unit="Hz", default=60, minimum=1,
              maximum=400, region_defaults={"iec": 50}, advanced=True),
        Input("neutral_a", "Neutral current (120/240 V only)", "quantity", unit="A",
              optional=True, minimum=0, maximum=20000, advanced=True,
              help="Unbalance current in the neutral; blank means balanced."),
        Input("method", "Conductor data", "choice", default="table",
              choices=conductors.METHODS, region_defaults={"iec": "physics"}, advanced=True,
              help="Table: NEC Chapter 9 Tables 8 and 9 (or IEC 60228); physics: from geometry."),
    ]
    return tuple(items)


VOLTAGE_DROP = Calculator(
    id="voltage-drop",
    title="Voltage drop",
    summary="Drop, load-end voltage and conductor loss of one run on DC, single-phase, 120/240 V "
            "or three-phase, exact and by the usual approximation.",
    group="Conductors",
    inputs=_inputs(),
    outputs=(
        Output("drop_v", "Voltage drop", "V"),
        Output("drop_pct", "Voltage drop", "%"),
        Output("end_v", "Voltage at the load", "V"),
        Output("loss_w", "Conductor loss", "W"),
        Output("current", "Load current", "A"),
        Output("drop_pct_approx", "Drop by the approximation", "%"),
    ),
    compute=_voltage_drop_view,
)

WIRE_SIZE = Calculator(
    id="wire-size",
    title="Wire size for a voltage-drop limit",
    summary="The smallest conductor that keeps a run within a drop limit, with the next sizes "
            "for comparison.",
    group="Conductors",
    inputs=_inputs(with_size=False, with_sizes=True),
    outputs=(
        Output("size", "Smallest size meeting the limit", "m²"),
        Output("drop_pct", "Voltage drop with it", "%"),
        Output("drop_v", "Voltage drop with it", "V"),
        Output("current", "Load current", "A"),
    ),
    compute=_wire_size_view,
)

MAX_LENGTH = Calculator(
    id="max-length",
    title="Longest run for a voltage-drop limit",
    summary="How far a conductor size can carry a load before the drop reaches the limit.",
    group="Conductors",
    inputs=_inputs(with_length=False),
    outputs=(
        Output("length", "Longest one-way run", "m"),
        Output("drop_pct", "Voltage drop at that length", "%"),
        Output("current", "Load current", "A"),
    ),
    compute=_max_length_view,
)
