"""View helpers the run calculators share (voltage-drop, wire-size, max-length, line-loss): their
common inputs, the reading of the load, one run solved with its field errors, the method steps,
the drop-limit check and the drop chart, and the texts they cite.
"""

import contextlib
import dataclasses
import math
from typing import NamedTuple

from calc import cautions, conductors, units, voltage_drop
from calc import induction_motors as motors
from calc.calculators import _inputs
from calc.calculators._plausibility import plausibility
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
    "LV supply (6 % / 8 % from a private supply; read, as reproduced at scribd.com/document/"
    "599637287). Local code may set others."
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

# ---- plausibility: the range of real low-voltage runs (issue 11, item 9) ---------------------
# NEC Table 310.16, 90 °C column [A], copper and aluminium, 14 AWG to 1000 kcmil: read, as
# reproduced in a scan of the table (scribd document 768710860, an edition before 2014; later
# editions differ by a few amperes at 3 and 1 AWG, which the bound below does not feel), 14 to 1
# AWG copper also on ask-the-electrician.com's copy. 18 and 16 AWG copper: NEC Table 402.5
# (fixture wire), from memory. Metric sizes and sizes outside a column: log-log interpolation by
# area (computed) — a bound for judging plausibility, not an IEC 60364-5-52 rating.
AMPACITY_90C = {
    "cu": {"18 AWG": 14, "16 AWG": 18, "14 AWG": 25, "12 AWG": 30, "10 AWG": 40, "8 AWG": 55,
           "6 AWG": 75, "4 AWG": 95, "3 AWG": 110, "2 AWG": 130, "1 AWG": 150, "1/0 AWG": 170,
           "2/0 AWG": 195, "3/0 AWG": 225, "4/0 AWG": 260, "250 kcmil": 290, "300 kcmil": 320,
           "350 kcmil": 350, "400 kcmil": 380, "500 kcmil": 430, "600 kcmil": 475,
           "700 kcmil": 520, "750 kcmil": 535, "800 kcmil": 555, "900 kcmil": 585,
           "1000 kcmil": 615},
    "al": {"12 AWG": 25, "10 AWG": 35, "8 AWG": 45, "6 AWG": 60, "4 AWG": 75, "3 AWG": 85,
           "2 AWG": 100, "1 AWG": 115, "1/0 AWG": 135, "2/0 AWG": 150, "3/0 AWG": 175,
           "4/0 AWG": 205, "250 kcmil": 230, "300 kcmil": 255, "350 kcmil": 280,
           "400 kcmil": 305, "500 kcmil": 350, "600 kcmil": 385, "700 kcmil": 420,
           "750 kcmil": 435, "800 kcmil": 450, "900 kcmil": 480, "1000 kcmil": 500},
}
# Warn above this multiple of the 90 °C ampacity: NEC Table 310.17 (single conductors in free air)
# allows at most about 1.7 × Table 310.16 (from memory), so twice it is above any ampacity the
# NEC gives the size, whatever the installation.
PLAUSIBLE_CURRENT_MULTIPLE = 2.0
# Low voltage: up to 1000 V AC and 1500 V DC (IEC 60038; NEC 2020 on, from memory) — the range
# of the 600 V building wire and 0.6/1 kV cable data used here. Below 12 V (the smallest battery
# systems; common practice) contacts and terminations, not modelled, dominate the drop.
PLAUSIBLE_VOLTAGE_V = {"ac": (12.0, 1000.0), "dc": (12.0, 1500.0)}
# Longest plausible low-voltage run (common practice: feeders and branch circuits run tens to
# hundreds of metres; beyond a few kilometres distribution is at medium voltage).
PLAUSIBLE_LENGTH_M = 3000.0
# Lowest running power factor of a real load (common practice: running motors 0.7 to 0.9; lower
# is a motor starting or an idling transformer, not a steady load).
PLAUSIBLE_PF = 0.5
# Largest drop at which the constant-current load stands for a real load: equipment is rated to
# run within 10 % of its voltage (NEMA MG 1-12.44, read), so a load beyond it is not running as
# rated and its current is not the one given.
PLAUSIBLE_DROP_PCT = 10.0
# A motor's full-load efficiency where NEC Table 430.250/430.248 has no current: the
# motor-current calculator's default (a typical full-load efficiency, common practice).
MOTOR_EFFICIENCY = 0.91


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


def refuse_hp(inputs, name, hint):
    """Refuse a power field given in hp: a load in hp is a motor's output, not what it draws."""
    if getattr(inputs, "typed_units", {}).get(name) == "hp":
        hp = motors.horsepower(inputs[name])
        raise InputError(name, f"{hp:g} hp", f"{hp:g} hp is a motor's output, not the power it "
                         f"draws (a motor draws more: output / efficiency); {hint}")


def motor_current(system, motor_power, voltage, power_factor, efficiency=MOTOR_EFFICIENCY):
    """(full-load current [A], how it was found) of a motor of `motor_power` output [W]: NEC
    Table 430.250 / 430.248 where it lists the motor and voltage, else output, efficiency and
    power factor."""
    phases = 3 if system == "3ph" else 1
    hp = motors.horsepower(motor_power)
    if system != "dc":
        table_a, column, number = motors.nec_table_current(motor_power, voltage, phases)
        if table_a is not None:
            return table_a, (f"NEC Table {number} full-load current of a {hp:.4g} hp motor at "
                             f"{column:g} V (read, as reproduced), as NEC 430.6(A)(1) sizes "
                             "conductors")
    if system == "dc":
        current = motor_power / (efficiency * voltage)
    else:
        current = motors.full_load_current(motor_power, voltage, phases, efficiency,
                                           power_factor)
    k = "√3 × " if system == "3ph" else ""
    pf_text = "" if system == "dc" else f" × {power_factor:g}"
    return current, (f"{hp:.4g} hp output / (efficiency {efficiency:g}{pf_text} × {k}"
                     f"{fq(voltage, 'V')}) — the NEC table lists no current for it")


LOAD_FIELDS = ("current", "power", "kva", "motor_power")


def _load_current(inputs, system, voltage, power_factor):
    """The load current per line [A] from the current, or the kW, kVA or motor hp given, at
    nominal volts; the name of the field it came from (None for the current itself); and how."""
    given = [name for name in LOAD_FIELDS if inputs.get(name) is not None]
    if not given:
        raise InputError("current", None, "give the load current, or its power (kW), apparent "
                         "power (kVA) or a motor's output (hp) in the other load fields")
    if len(given) > 1:
        raise InputError(given[1], inputs[given[1]], f"give only one of current, power, kVA and "
                         f"motor power (both {given[0]} and {given[1]} are filled in)")
    name = given[0]
    if name == "current":
        return inputs["current"], None, None
    if name == "motor_power":
        current, basis = motor_current(system, inputs["motor_power"], voltage, power_factor,
                                       inputs.get("motor_efficiency") or MOTOR_EFFICIENCY)
        return current, name, basis
    refuse_hp(inputs, "power", "give a motor in the motor power field (its full-load current is "
              "then taken from NEC Table 430.250/430.248, or from efficiency and power factor)")
    if name == "kva":  # apparent power: the current of a unity-pf load of that many watts
        return voltage_drop.load_current(system, inputs["kva"], voltage, 1.0), name, None
    return voltage_drop.load_current(system, inputs["power"], voltage, power_factor), name, None


class RunReading(NamedTuple):
    """The run inputs as every run calculator reads them (pf is 1 on DC)."""

    system: str
    voltage: float  # [V]
    power_factor: float
    sets: int
    current: float  # per line [A]; the heavier leg's on an unbalanced 120/240 V run
    current_from: str | None  # "power", "kva" or "motor_power" when found from it
    neutral_current: float  # [A]
    current_basis: str | None = None  # how a motor's current was found


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
    current, current_from, basis = _load_current(inputs, system, voltage, power_factor)
    if neutral and current_from:  # a power is shared by the legs: the heavier draws I + I_N/2
        current += neutral / 2.0
    if neutral and neutral > current:
        raise InputError("neutral_a", neutral, f"the neutral carries the difference of the two "
                         f"legs' currents: 0 to the heavier leg's {current:g} A")
    return RunReading(system, voltage, power_factor, sets, current, current_from, neutral or 0.0,
                      basis)


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


R_BASIS = {
    "table9": "NEC Chapter 9 Table 9's R_ac",
    "table8": "the DC table (NEC Chapter 9 Table 8 or IEC 60228) with the IEC 60287-1-1 AC effects",
    "physics": "resistivity with the IEC 60287-1-1 AC effects",
}


def basis_text(z):
    """Where R_ac and X came from, in words."""
    r_text = R_BASIS[z.r_ac_basis]
    if z.r_ac_basis == "table8" and z.r_ac_table9 is not None:
        r_text += (f" (it rounds to Table 9's {z.r_ac_table9 * conductors.METRES_PER_KFT:.2g} "
                   "Ω/kft, given to two figures)")
    if z.x_basis == "table9":
        x_text = "NEC Chapter 9 Table 9's XL"
    else:
        insulation = dict(conductors.INSULATIONS)[z.insulation].split(" (")[0]
        own = (": NEC Chapter 9 Table 9's own basis" if {"insulation": z.insulation,
               "formation": z.formation} == conductors.TABLE9_BASIS else "")
        x_text = f"the geometry ({insulation}, {z.formation}{own})"
    return f"R_ac from {r_text}; X from {x_text}"


def conductor_step(result, inputs, size, z):
    """The method step that names the conductor, its impedance per metre and their basis."""
    result.step(f"Conductor: {size.label} {conductors.MATERIAL_NAMES[inputs['material']]} at "
                f"{inputs['conductor_temp_c']:g} °C, {inputs['raceway']} raceway "
                f"(method {inputs['method']}: {basis_text(z)}; see the conductor calculator)",
                "r_ac, x per metre of one conductor",
                f"= {z.r_ac * 1e3:.4g} Ω/km, {z.x * 1e3:.4g} Ω/km")


def conductor_data_check(result, method, z):
    """`conductor_data`: pass when the method's data are what it used; warn, naming the size or
    the installation, where the table method had to fall back on the physics."""
    if method != "table" or not z.table_gaps:
        result.check("conductor_data", "pass", basis_text(z) + ".")
        return
    result.check("conductor_data", "warn", "; ".join(z.table_gaps) + ".")


def drop_limit_check(result, name, drop_pct, limit, subject="The drop"):
    """pass when the drop [%] is within the limit [%], else fail; `subject` opens the message."""
    ok = drop_pct <= limit
    result.check(name, "pass" if ok else "fail",
                 f"{subject} is {drop_pct:.3g} %, {'within' if ok else 'over'} the {limit:g} % "
                 "limit (a recommendation; local code may differ).")


def ampacity_90c(size, material):
    """NEC Table 310.16's 90 °C ampacity of `size` [A], interpolated (log-log in area) where
    the column does not list it."""
    column = AMPACITY_90C[material]
    if size.label in column:
        return float(column[size.label])
    points = sorted((units.parse_conductor_size(label).area_m2, amps)
                    for label, amps in column.items())
    above = min(max(sum(1 for area, _ in points if area < size.area_m2), 1), len(points) - 1)
    (a1, i1), (a2, i2) = points[above - 1], points[above]
    return i1 * (size.area_m2 / a1) ** (math.log(i2 / i1) / math.log(a2 / a1))


def current_reason(current, size, material, sets=1):
    """A plausibility reason when `current` [A] per phase is far above any ampacity of `size`."""
    ampacity = ampacity_90c(size, material)
    each = current / sets
    if each <= PLAUSIBLE_CURRENT_MULTIPLE * ampacity:
        return None
    return (f"{fq(each, 'A')} in each {size.label} {conductors.MATERIAL_NAMES[material]} "
            f"conductor is over {PLAUSIBLE_CURRENT_MULTIPLE:g} × its {ampacity:.3g} A 90 °C "
            "ampacity (NEC Table 310.16), above any ampacity the NEC gives the size: a real "
            "run would burn; choose a larger size or parallel sets")


def supply_reasons(system, voltage, power_factor, length=None):
    """Plausibility reasons about a run's voltage, power factor and length."""
    reasons = []
    low, high = PLAUSIBLE_VOLTAGE_V["dc" if system == "dc" else "ac"]
    if not low <= voltage <= high:
        reasons.append(f"{fq(voltage, 'V')} is outside low voltage ({low:g} to {high:g} V "
                       f"{'DC' if system == 'dc' else 'AC'}, IEC 60038), the range of the "
                       "conductor data used here")
    if system != "dc" and power_factor < PLAUSIBLE_PF:
        reasons.append(f"a running load at power factor {power_factor:g} is unusual (real loads "
                       f"run from about {PLAUSIBLE_PF:g} to 1; lower is a motor starting)")
    if length is not None and length > PLAUSIBLE_LENGTH_M:
        reasons.append(f"a {fq(length, 'm')} low-voltage run is unusual (they run tens to "
                       f"hundreds of metres; beyond {PLAUSIBLE_LENGTH_M / 1e3:g} km, medium "
                       "voltage)")
    return reasons


def drop_reason(drop_pct):
    """A plausibility reason when a drop [%] is beyond what equipment runs on."""
    if drop_pct <= PLAUSIBLE_DROP_PCT:
        return None
    return (f"a {drop_pct:.3g} % drop is beyond the {PLAUSIBLE_DROP_PCT:g} % equipment is rated "
            "to run on (NEMA MG 1-12.44): the load would not draw the current given")


def run_plausibility(result, inputs, size, length, run, extra=()):
    """The `plausibility` check of a run calculator."""
    r = read_run(inputs)
    reasons = [current_reason(r.current, size, inputs["material"], r.sets),
               *supply_reasons(r.system, r.voltage, r.power_factor, length),
               drop_reason(run.limit_drop_pct), *extra]
    plausibility(result, [reason for reason in reasons if reason])


def _loss_step(result, r, run):
    if r.system == "1ph3w" and r.neutral_current:
        lighter = r.current - r.neutral_current
        result.step("Conductor loss, each conductor at its own current (heavier line, lighter "
                    "line, neutral)", "P = (I_A² + I_B² + I_N²) R",
                    f"= ({fq(r.current, 'A')}² + {fq(lighter, 'A')}² + "
                    f"{fq(r.neutral_current, 'A')}²) × {run.resistance:.4g} Ω = "
                    f"{fq(run.loss_w, 'W')}")
        return
    n = voltage_drop.LOADED_CONDUCTORS[r.system]
    result.step(f"Conductor loss ({n} conductors carry the load current)", f"P = {n} I² R",
                f"= {n} × ({fq(r.current, 'A')})² × {run.resistance:.4g} Ω = "
                f"{fq(run.loss_w, 'W')}")


def _load_step(result, inputs, r):
    if r.current_from == "motor_power":
        result.step("Load current of the motor: a motor's hp is its output, so its current is "
                    "its full-load current, not the hp in watts over the voltage",
                    "I = I_FL", f"= {fq(r.current, 'A')}: {r.current_basis}")
    elif r.current_from:
        power = r.current_from == "power"
        given = fq(inputs[r.current_from], "W" if power else "VA")
        k = "√3 × " if r.system == "3ph" else ""
        pf_text = f" / {r.power_factor:g}" if power else ""
        result.step(f"Load current from the {'power' if power else 'apparent power'} at "
                    "nominal voltage", f"I = S / ({k}V)",
                    f"= {given}{pf_text} / ({k}{fq(r.voltage, 'V')})")
    if r.current_from and r.neutral_current:
        result.step("The heavier leg of an unbalanced 120/240 V load", "I_A = I + I_N / 2",
                    f"= {fq(r.current, 'A')}")


def _drop_steps(result, r, run):
    if r.system == "1ph3w":
        leg, neutral = r.voltage / 2.0, r.neutral_current
        lighter = r.current - neutral
        result.step("Exact phasor solution, heavier leg to neutral (where its loads are): its "
                    "line and the neutral", "drop through (I_A + I_N) Z from V/2",
                    f"I_A + I_N = {fq(r.current + neutral, 'A')}; V = "
                    f"{fq(run.leg_end_v, 'V')}; drop = {fq(leg, 'V')} − "
                    f"{fq(run.leg_end_v, 'V')} = {fq(run.leg_drop_v, 'V')} = "
                    f"{run.leg_drop_pct:.3g} % of {fq(leg, 'V')}")
        result.step("Exact phasor solution, line to line (the neutral's drop cancels)",
                    "drop through (I_A + I_B) Z from V",
                    f"I_A + I_B = {fq(r.current + lighter, 'A')}; V = {fq(run.end_v, 'V')}; "
                    f"drop = {fq(run.drop_v, 'V')} = {run.drop_pct:.3g} %; the lighter leg "
                    f"ends at {fq(run.light_leg_end_v, 'V')}")
        return
    path = {"3ph": "per phase, V/√3"}.get(r.system, "around the loop")
    result.step(f"Exact phasor solution ({path}; sending end held at nominal)",
                "V_s² = (V_r + I R cos φ + I X sin φ)² + (I X cos φ − I R sin φ)²",
                f"V_r = {fq(run.end_v, 'V')}; drop = {fq(r.voltage, 'V')} − "
                f"{fq(run.end_v, 'V')} = {fq(run.drop_v, 'V')} = {run.drop_pct:.3g} %")


def describe_run(result, inputs, size, length, z, run, judge=True):
    """Steps, checks, assumptions, sources and cautions shared by the three drop calculators;
    `judge` False leaves the plausibility check to the calculator."""
    r = read_run(inputs)
    system, pf, current = r.system, r.power_factor, r.current
    conductor_step(result, inputs, size, z)
    result.step(f"One conductor of the run ({fq(length, 'm')}"
                + (f", {r.sets} sets in parallel)" if r.sets > 1 else ")"),
                "R = r_ac L / n, X = x L / n",
                f"= {run.resistance:.4g} Ω, {run.reactance:.4g} Ω")
    _load_step(result, inputs, r)
    _drop_steps(result, r, run)
    k_text = K_TEXT[system]
    formula = "VD = k I (R cos θ + X sin θ), k = " + k_text
    factor = f"{k_text} × {fq(current, 'A')}"
    if system == "1ph3w" and r.neutral_current:  # line to line: (I_A + I_B) Z
        formula = "VD = (I_A + I_B) (R cos θ + X sin θ), I_B = I_A − I_N"
        factor = f"({fq(current, 'A')} + {fq(current - r.neutral_current, 'A')})"
    result.step("The usual approximation", formula,
                f"= {factor} × ({run.resistance:.4g} × {pf:g} + "
                f"{run.reactance:.4g} × {math.sqrt(max(0.0, 1 - pf * pf)):.3g}) = "
                f"{fq(run.approx_drop_v, 'V')} = {run.approx_drop_pct:.3g} %")
    _loss_step(result, r, run)
    leg = system == "1ph3w"
    drop_limit_check(result, "drop_limit", run.limit_drop_pct, inputs["max_drop_pct"],
                     "The heavier leg's drop to neutral" if leg else "The drop")
    difference = run.approx_drop_v - run.drop_v
    agree = abs(difference) <= APPROXIMATION_TOLERANCE * max(run.drop_v, 1e-12)
    result.check("approximation", "pass" if agree else "warn",
                 f"The approximation gives {run.approx_drop_pct:.3g} %, "
                 f"{difference / max(run.drop_v, 1e-12):+.1%} from the exact {run.drop_pct:.3g} %"
                 + (f" (within {APPROXIMATION_TOLERANCE * 100:g} %)." if agree
                    else f", beyond {APPROXIMATION_TOLERANCE * 100:g} %; use the exact figure."))
    conductor_data_check(result, inputs["method"], z)
    if judge:
        run_plausibility(result, inputs, size, length, run)
    result.assumptions += [
        "Sending-end voltage held at nominal; a single load at the far end of the run.",
        "Constant-current load: the current is the given one (or found from the power at "
        "nominal voltage); a constant-power load would draw a little more as the voltage falls.",
        f"Conductor resistance at the stated temperature; {basis_text(z)}.",
    ]
    if system == "1ph3w":
        result.assumptions.append(
            "120/240 V three-wire: " + ("balanced legs, no neutral current; each leg's drop to "
                                        "neutral is half the line-to-line drop."
                                        if not r.neutral_current else
                                        f"legs of {fq(current, 'A')} and "
                                        f"{fq(current - r.neutral_current, 'A')} at one power "
                                        f"factor, {fq(r.neutral_current, 'A')} in the neutral; the "
                                        "limit is judged on the heavier leg's drop to neutral."))
    if system == "dc":
        result.assumptions.append("DC: no reactance, power factor 1.")
    result.sources += [FORMULA_SOURCE, LIMIT_SOURCE, CONDUCTOR_DATA_SOURCE]
    if r.current_from == "motor_power":
        result.sources.append("Motor full-load current: NEC 430.6(A)(1) (from memory) and "
                              "Tables 430.248, 430.250 (read, as reproduced in the NEC 2017 "
                              "text, repository mjk83093/sil); I = P / (η √3 V pf) otherwise "
                              "(Chapman, Electric Machinery Fundamentals, 5th ed., ch. 6; from "
                              "memory).")
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
        Input("voltage", "Nominal voltage", "quantity", unit="V", default=120, minimum=1,
              maximum=35000, region_defaults={"iec": 230}, suggest="voltages",
              help="Line-to-line for three-phase (480 V, 400 V); 240 V for 120/240 V three-wire."),
        Input("current", "Load current", "quantity", unit="A", default=16, optional=True,
              minimum=0, min_exclusive=True, maximum=20000,
              help="Per line. Or leave blank and give the load's power under More inputs.",
              group="load"),
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
              help="Real power drawn, in kW; the current field must be blank. A motor's rating "
                   "in hp is its output: give it under motor power.", group="load"),
        Input("kva", "Load apparent power (instead of current)", "quantity", unit="kVA",
              optional=True, minimum=0, min_exclusive=True, maximum=1e5, advanced=True,
              group="load"),
        Input("motor_power", "Motor power (instead of current)", "quantity", unit="hp",
              optional=True, minimum=0, min_exclusive=True, maximum=5000, advanced=True,
              group="load",
              help="A motor's rated output, e.g. 10 hp or 7.5 kW: its full-load current is taken "
                   "from NEC Table 430.250/430.248, else from efficiency and power factor."),
        Input("motor_efficiency", "Motor efficiency", "quantity", unit="",
              default=MOTOR_EFFICIENCY, minimum=0, min_exclusive=True, maximum=1, advanced=True,
              help="Full-load efficiency, used only where the NEC table lists no current."),
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
        method_input(advanced=True),
    ]
    return tuple(items)


def method_input(**changes):
    """`method`: the conductor data, one default a region for every calculator — the published
    tables for North American practice, the physics for IEC practice."""
    return dataclasses.replace(Input(
        "method", "Conductor data", "choice", default="table", choices=conductors.METHODS,
        region_defaults={"iec": "physics"},
        help="Table: NEC Chapter 9 Tables 8 and 9 (IEC 60228 for mm²); physics: resistivity "
             "and geometry."), **changes)


def run_input(source, **changes):
    """The shared run input named `source`, reused by another calculator with the changes given
    (a change of `name` makes a second input of the same kind)."""
    (item,) = [item for item in run_inputs() if item.name == source]
    return dataclasses.replace(item, **changes)
