"""Motors: induction-motor full-load, locked-rotor and starting currents by starting method, and
DC motors (shunt, series, permanent-magnet): back-EMF, starting current and resistor, speed,
a run-up simulation and a stalled-armature temperature estimate.

Quantities follow the nomenclature page: power [W] (mechanical output), voltage [V]
(line-to-line for three-phase), current [A], resistance [Ω], inductance [H], speed [rad/s]
(shown in r/min), torque [N·m], inertia [kg·m²], time [s], temperature [°C].
"""

import math
from typing import NamedTuple

from calc import cautions, units
from calc.errors import InputError
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

SQRT3 = math.sqrt(3.0)
HORSEPOWER_W = float(units.HORSEPOWER_W)  # 550 ft·lbf/s = 745.7 W (NIST SP 811 B.8)
RAD_S_PER_RPM = 2.0 * math.pi / 60.0

# ==== induction motors: tables ===============================================================

# NEMA MG 1 §10.37.2 locked-rotor kVA code letters, as NEC Table 430.7(B) reproduces them:
# kVA per horsepower at full voltage and rated frequency (REFERENCE_VALUES 4a, read). A range
# runs from its lower figure up to, but not including, the higher; I, O and Q are not used;
# letter V is "22.4 and up" (no upper figure).
CODE_LETTERS = {
    "A": (0.0, 3.15), "B": (3.15, 3.55), "C": (3.55, 4.0), "D": (4.0, 4.5), "E": (4.5, 5.0),
    "F": (5.0, 5.6), "G": (5.6, 6.3), "H": (6.3, 7.1), "J": (7.1, 8.0), "K": (8.0, 9.0),
    "L": (9.0, 10.0), "M": (10.0, 11.2), "N": (11.2, 12.5), "P": (12.5, 14.0),
    "R": (14.0, 16.0), "S": (16.0, 18.0), "T": (18.0, 20.0), "U": (20.0, 22.4),
    "V": (22.4, None),
}
NO_CODE_LETTER = "none"  # the choice for a motor whose letter is not known

# NEC Table 430.250: full-load current [A] of three-phase induction motors (squirrel cage and
# wound rotor) "typical for motors running at speeds usual for belted motors and motors with
# normal torque characteristics", by horsepower and rated motor voltage. From memory (the
# values are the same in the 2008-2023 editions); they agree with a reproduction of the 2008
# table read while writing. None: no entry.
NEC_430_250_VOLTS = (115.0, 200.0, 208.0, 230.0, 460.0, 575.0, 2300.0)
NEC_430_250 = {
    0.5: (4.4, 2.5, 2.4, 2.2, 1.1, 0.9, None),
    0.75: (6.4, 3.7, 3.5, 3.2, 1.6, 1.3, None),
    1.0: (8.4, 4.8, 4.6, 4.2, 2.1, 1.7, None),
    1.5: (12.0, 6.9, 6.6, 6.0, 3.0, 2.4, None),
    2.0: (13.6, 7.8, 7.5, 6.8, 3.4, 2.7, None),
    3.0: (None, 11.0, 10.6, 9.6, 4.8, 3.9, None),
    5.0: (None, 17.5, 16.7, 15.2, 7.6, 6.1, None),
    7.5: (None, 25.3, 24.2, 22.0, 11.0, 9.0, None),
    10.0: (None, 32.2, 30.8, 28.0, 14.0, 11.0, None),
    15.0: (None, 48.3, 46.2, 42.0, 21.0, 17.0, None),
    20.0: (None, 62.1, 59.4, 54.0, 27.0, 22.0, None),
    25.0: (None, 78.2, 74.8, 68.0, 34.0, 27.0, None),
    30.0: (None, 92.0, 88.0, 80.0, 40.0, 32.0, None),
    40.0: (None, 120.0, 114.0, 104.0, 52.0, 41.0, None),
    50.0: (None, 150.0, 143.0, 130.0, 65.0, 52.0, None),
    60.0: (None, 177.0, 169.0, 154.0, 77.0, 62.0, 16.0),
    75.0: (None, 221.0, 211.0, 192.0, 96.0, 77.0, 20.0),
    100.0: (None, 285.0, 273.0, 248.0, 124.0, 99.0, 26.0),
    125.0: (None, 359.0, 343.0, 312.0, 156.0, 125.0, 31.0),
    150.0: (None, 414.0, 396.0, 360.0, 180.0, 144.0, 37.0),
    200.0: (None, 552.0, 528.0, 480.0, 240.0, 192.0, 49.0),
    250.0: (None, None, None, None, 302.0, 242.0, 60.0),
    300.0: (None, None, None, None, 361.0, 289.0, 72.0),
    350.0: (None, None, None, None, 414.0, 336.0, 83.0),
    400.0: (None, None, None, None, 477.0, 382.0, 95.0),
    450.0: (None, None, None, None, 515.0, 412.0, 103.0),
    500.0: (None, None, None, None, 590.0, 472.0, 118.0),
}

# NEC Table 430.248: full-load current [A] of single-phase AC motors, by horsepower and rated
# motor voltage — from memory (2008-2023 editions).
NEC_430_248_VOLTS = (115.0, 200.0, 208.0, 230.0)
NEC_430_248 = {
    1 / 6: (4.4, 2.5, 2.4, 2.2), 0.25: (5.8, 3.3, 3.2, 2.9), 1 / 3: (7.2, 4.1, 4.0, 3.6),
    0.5: (9.8, 5.6, 5.4, 4.9), 0.75: (13.8, 7.9, 7.6, 6.9), 1.0: (16.0, 9.2, 8.8, 8.0),
    1.5: (20.0, 11.5, 11.0, 10.0), 2.0: (24.0, 13.8, 13.2, 12.0), 3.0: (34.0, 19.6, 18.7, 17.0),
    5.0: (56.0, 32.2, 30.8, 28.0), 7.5: (80.0, 46.0, 44.0, 40.0), 10.0: (100.0, 57.5, 55.0, 50.0),
}

# The tables' headings let their currents serve system voltages of 110-120 and 220-240 V, and
# for three-phase also 440-480 and 550-600 V (from memory): (lowest, highest, table column).
NEC_SYSTEM_RANGES = {
    1: ((110.0, 120.0, 115.0), (220.0, 240.0, 230.0)),
    3: ((110.0, 120.0, 115.0), (220.0, 240.0, 230.0), (440.0, 480.0, 460.0),
        (550.0, 600.0, 575.0)),
}
NEC_TABLES = {1: (NEC_430_248_VOLTS, NEC_430_248, "430.248"),
              3: (NEC_430_250_VOLTS, NEC_430_250, "430.250")}
CODE_TABLES = (("nec", "NEC Tables 430.248 / 430.250 (North America)"),
               ("none", "None: nameplate practice (IEC)"))

# A calculated full-load current within this of the table value is called consistent. The
# tables are for typical motors, not this one: with typical efficiency and power factor the
# formula falls 5-15 % below them from 5 hp up (computed in tests/test_motors.py).
TABLE_AGREEMENT = 0.15

# Starting methods (REFERENCE_VALUES 4d). For each: the fraction of the locked-rotor voltage
# the motor sees at standstill (None where it is set by a current limit), and the ratio of line
# to motor current. Wye-delta: the winding sees V/√3 and the delta-to-wye change divides the
# line current by 3 (theory; memory, H). Autotransformer at tap a: motor current a × I_LR, line
# current a² × I_LR, magnetising current neglected (theory; memory, H). Primary reactor or
# resistor at k × V: line = motor = k × I_LR (theory; memory, H). Torque ∝ V² in every case.
STARTING_METHODS = (
    ("dol", "Across the line (full voltage)"),
    ("wye-delta", "Wye-delta (star-delta), open transition"),
    ("auto-50", "Autotransformer, 50 % tap"),
    ("auto-65", "Autotransformer, 65 % tap"),
    ("auto-80", "Autotransformer, 80 % tap"),
    ("reactor", "Primary reactor or resistor at k × V"),
    ("soft", "Soft starter with current limit"),
    ("vfd", "Variable-frequency drive"),
)
AUTOTRANSFORMER_TAPS = {"auto-50": 0.50, "auto-65": 0.65, "auto-80": 0.80}

# Current limits when none is entered [× FLC]: a soft starter is usually set to 2-4 × FLC
# (3 × taken); a drive delivers about 1.0-1.5 × FLC, its usual overload being 150 % for 60 s
# (1.5 × taken). Both common practice (REFERENCE_VALUES 4d).
DEFAULT_CURRENT_LIMIT = {"soft": 3.0, "vfd": 1.5}

# Across-the-line locked-rotor current is typically 6-8 × FLC (Design B about 5.5-7 ×), common
# practice (REFERENCE_VALUES 4d); outside 4-10 × a given figure deserves a second look.
TYPICAL_LR_MULTIPLE = (4.0, 10.0)


class StartingCurrent(NamedTuple):
    """Currents and torque at standstill with a starting method."""

    line: float  # current drawn from the supply [A]
    motor: float  # current in the motor leads [A]
    voltage_fraction: float  # motor voltage at standstill, per unit of rated
    torque_fraction: float  # starting torque, per unit of the across-the-line locked-rotor torque


def horsepower(power):
    """Mechanical output in horsepower (550 ft·lbf/s) from watts."""
    return power / HORSEPOWER_W


def full_load_current(power, voltage, phases, efficiency, power_factor):
    """Line current of an induction motor delivering its rated output.

    Parameters
    ----------
    power : float
        Rated mechanical output [W] (1 hp = 745.7 W).
    voltage : float
        Rated voltage [V]; line-to-line for three-phase.
    phases : int
        1 or 3.
    efficiency : float
        Full-load efficiency, output / input, in (0, 1].
    power_factor : float
        Full-load power factor, in (0, 1].

    Returns
    -------
    float
        Full-load line current [A].

    Notes
    -----
    P_in = P_out / η and I = P_in / (√3 V pf) three-phase, P_in / (V pf) single-phase.

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., ch. 6 (induction motor power
    flow) — from memory.

    Examples
    --------
    >>> round(full_load_current(7457.0, 460.0, 3, 0.917, 0.85), 2)
    12.01
    """
    per_volt = SQRT3 * voltage if phases == 3 else voltage
    return power / (efficiency * power_factor * per_volt)


def locked_rotor_current(kva_per_hp, power, voltage, phases):
    """Locked-rotor line current at full voltage from the locked-rotor kVA per horsepower.

    Parameters
    ----------
    kva_per_hp : float
        Locked-rotor apparent power per horsepower of rated output [kVA/hp].
    power : float
        Rated output [W].
    voltage : float
        Rated voltage [V]; line-to-line for three-phase.
    phases : int
        1 or 3.

    Returns
    -------
    float
        Locked-rotor current [A].

    Notes
    -----
    I_LR = (kVA/hp) × hp × 1000 / (√3 V) three-phase, / V single-phase.

    References
    ----------
    NEMA MG 1 §10.37.2; NEC 430.7(B) and Table 430.7(B) (REFERENCE_VALUES 4a, read).

    Examples
    --------
    >>> round(locked_rotor_current(7.1, 10 * 745.699872, 460.0, 3), 1)
    89.1
    """
    per_volt = SQRT3 * voltage if phases == 3 else voltage
    return kva_per_hp * horsepower(power) * 1000.0 / per_volt


def locked_rotor_kva_per_hp(current, power, voltage, phases):
    """The inverse of locked_rotor_current: kVA per horsepower of a locked-rotor current [A]."""
    per_volt = SQRT3 * voltage if phases == 3 else voltage
    return current * per_volt / (1000.0 * horsepower(power))


def code_letter_range(letter):
    """(lowest, highest) kVA/hp of a NEMA code letter; highest is None for letter V.

    Raises
    ------
    InputError
        For a letter NEMA MG 1 does not use; the message lists the valid ones.
    """
    try:
        return CODE_LETTERS[letter]
    except (KeyError, TypeError):
        raise InputError("code_letter", letter, f"{letter!r} is not a NEMA code letter; use one "
                         f"of {', '.join(CODE_LETTERS)} (I, O and Q are not used)") from None


def code_letter_for(kva_per_hp):
    """The code letter whose range holds `kva_per_hp` (lower figure included, upper not).

    Examples
    --------
    >>> code_letter_for(3.14), code_letter_for(3.15), code_letter_for(30.0)
    ('A', 'B', 'V')
    """
    for letter, (low, high) in CODE_LETTERS.items():
        if kva_per_hp >= low and (high is None or kva_per_hp < high):
            return letter
    return "A"  # only a negative figure gets here; callers pass positive ones


def nec_table_current(power, voltage, phases):
    """NEC Table 430.248 / 430.250 full-load current for a motor, if the table lists it.

    Parameters
    ----------
    power : float
        Rated output [W]; it must be a horsepower the table lists (within 0.1 %).
    voltage : float
        Rated motor voltage or system voltage [V].
    phases : int
        1 or 3.

    Returns
    -------
    (float, float, str) or (None, None, str)
        The table current [A], the column's voltage [V] and the table's number; or Nones and a
        sentence saying why the table has no value.
    """
    volts, table, number = NEC_TABLES[phases]
    hp = horsepower(power)
    row = next((values for size, values in table.items() if math.isclose(hp, size, rel_tol=1e-3)),
               None)
    if row is None:
        sizes = ", ".join(_hp_text(size) for size in table)
        return None, None, (f"Table {number} lists {sizes} hp; {hp:.4g} hp is not among them "
                            "(use the nameplate current)")
    column = next((v for v in volts if math.isclose(voltage, v, rel_tol=1e-9)), None)
    for low, high, value in NEC_SYSTEM_RANGES[phases]:
        if column is None and low <= voltage <= high:
            column = value
    if column is None:
        listed = ", ".join(f"{v:g}" for v in volts)
        return None, None, (f"Table {number} has columns for {listed} V (and the system ranges "
                            f"its heading allows); {voltage:g} V is not one")
    current = row[volts.index(column)]
    if current is None:
        return None, None, f"Table {number} has no {_hp_text(hp)} hp entry at {column:g} V"
    return current, column, number


def _hp_text(hp):
    fractions = {1 / 6: "1/6", 0.25: "1/4", 1 / 3: "1/3", 0.5: "1/2", 0.75: "3/4", 1.5: "1-1/2",
                 7.5: "7-1/2"}
    return next((text for value, text in fractions.items() if math.isclose(hp, value)), f"{hp:g}")


def starting_current(method, locked_rotor_current, full_load_current, voltage_fraction=None,
                     current_limit=None):
    """Line and motor current and the torque left at standstill with a starting method.

    Parameters
    ----------
    method : str
        A token of STARTING_METHODS.
    locked_rotor_current : float
        Across-the-line locked-rotor current [A].
    full_load_current : float
        Full-load current [A] (soft starter and drive limits are multiples of it).
    voltage_fraction : float, optional
        "reactor": the motor voltage at standstill per unit of rated (k).
    current_limit : float, optional
        "soft" and "vfd": the current limit [× full-load current]; default
        DEFAULT_CURRENT_LIMIT.

    Returns
    -------
    StartingCurrent
        For "vfd" torque_fraction is the drive's torque per unit of FULL-LOAD torque
        (≈ current limit: rated flux, torque ∝ torque-producing current), not of locked-rotor
        torque; voltage_fraction is the drive's output at standstill, taken as 0.

    Notes
    -----
    Torque ∝ V², and current ∝ V for an impedance at standstill, so a soft starter holding the
    current to I leaves (I / I_LR)² of the across-the-line torque.

    References
    ----------
    REFERENCE_VALUES 4d (wye-delta 1/3; autotransformer line ≈ tap²; reactor ≈ k; soft starter
    (I/I_LR)² — theory and common practice).

    Examples
    --------
    >>> round(starting_current("wye-delta", 600.0, 100.0).line, 1)
    200.0
    >>> round(starting_current("auto-65", 600.0, 100.0).line, 2)
    253.5
    """
    if method == "dol":
        return StartingCurrent(locked_rotor_current, locked_rotor_current, 1.0, 1.0)
    if method == "wye-delta":
        third = locked_rotor_current / 3.0
        return StartingCurrent(third, third, 1.0 / SQRT3, 1.0 / 3.0)
    if method in AUTOTRANSFORMER_TAPS:
        tap = AUTOTRANSFORMER_TAPS[method]
        return StartingCurrent(tap * tap * locked_rotor_current, tap * locked_rotor_current, tap,
                               tap * tap)
    if method == "reactor":
        k = voltage_fraction
        return StartingCurrent(k * locked_rotor_current, k * locked_rotor_current, k, k * k)
    limit = current_limit if current_limit is not None else DEFAULT_CURRENT_LIMIT[method]
    current = limit * full_load_current
    if method == "soft":
        current = min(current, locked_rotor_current)  # a limit above I_LR never acts
        share = current / locked_rotor_current
        return StartingCurrent(current, current, share, share * share)
    return StartingCurrent(current, current, 0.0, limit)  # vfd


# ---- the motor-current view -------------------------------------------------------------------

def _locked_rotor(inputs, power, voltage, phases, flc, result):
    """Locked-rotor range from the code letter and the current used for starting [A]."""
    letter, lra, multiple = inputs["code_letter"], inputs["lra"], inputs["lr_multiple"]
    if letter == NO_CODE_LETTER:
        letter = None
    if lra is not None and multiple is not None:
        raise InputError("lr_multiple", multiple, "give the locked-rotor current or its multiple "
                         "of full-load current, not both (clear one)")
    if letter is None and lra is None and multiple is None:
        raise InputError("code_letter", inputs["code_letter"], "give the NEMA code letter from "
                         "the nameplate, or the locked-rotor current (LRA) or its multiple of "
                         "full-load current under More inputs")
    kw = "√3 × " if phases == 3 else ""
    low_a = high_a = None
    if letter is not None:
        low, high = code_letter_range(letter)
        low_a = locked_rotor_current(low, power, voltage, phases)
        high_a = None if high is None else locked_rotor_current(high, power, voltage, phases)
        result.output("locked_rotor_a_min", low_a)
        upper = f"{high:g}" if high is not None else "(no upper figure)"
        if high_a is not None:
            result.output("locked_rotor_a_max", high_a)
        result.step(f"Locked-rotor current range of code letter {letter} ({low:g} to {upper} "
                    "kVA/hp; NEC Table 430.7(B))",
                    f"I_LR = kVA/hp × hp × 1000 / ({kw}V)",
                    f"= {low:g} … {upper} × {horsepower(power):.4g} hp × 1000 / ({kw}"
                    f"{fq(voltage, 'V')}) = {fq(low_a, 'A')} … "
                    f"{fq(high_a, 'A') if high_a is not None else 'no limit'}")
    if lra is not None:
        used, basis = lra, "the locked-rotor current given"
    elif multiple is not None:
        used, basis = multiple * flc, f"{multiple:g} × the calculated full-load current"
        result.step("Locked-rotor current from the multiple given", "I_LR = m × I_FL",
                    f"= {multiple:g} × {fq(flc, 'A')} = {fq(used, 'A')}")
    elif high_a is not None:
        used, basis = high_a, f"the upper end of code letter {letter} (the most current it allows)"
    else:
        used, basis = low_a, f"the lower end of code letter {letter} (V has no upper figure)"
        result.check("code_letter_v", "warn", "Code letter V has no upper figure: the starting "
                     f"current shown is its minimum, {fq(used, 'A')}; the motor may draw more.")
    if letter is None:
        result.output("locked_rotor_a_min", used)
        result.output("locked_rotor_a_max", used)
    if lra is not None or multiple is not None:
        ratio = locked_rotor_kva_per_hp(used, power, voltage, phases)
        implied = code_letter_for(ratio)
        result.output("lr_kva_per_hp", ratio, f"{ratio:.3g} kVA/hp (code letter {implied})")
        if letter is not None:
            status = "pass" if implied == letter else "warn"
            result.check("code_letter_match", status,
                         f"{fq(used, 'A')} is {ratio:.3g} kVA/hp, code letter {implied}; the "
                         f"letter entered is {letter}" + ("." if status == "pass" else
                         ": check the nameplate (NEC Table 430.7(B) ranges)."))
    share = used / flc
    low_m, high_m = TYPICAL_LR_MULTIPLE
    typical = low_m <= share <= high_m
    result.check("locked_rotor_multiple", "pass" if typical else "warn",
                 f"Locked-rotor current is {share:.3g} × full-load current; across-the-line "
                 f"starting is typically 6-8 × (common practice)" +
                 ("." if typical else f", so {share:.3g} × deserves a check of the data."))
    return used, basis


def _starting(inputs, phases, locked_a, flc, result):
    method = inputs["starting"]
    if method == "wye-delta" and phases == 1:
        raise InputError("starting", method, "wye-delta starting needs a three-phase motor with "
                         "both ends of each winding brought out (six leads); choose another "
                         "method for a single-phase motor")
    limit = inputs["current_limit"]
    start = starting_current(method, locked_a, flc, inputs["voltage_pct"] / 100.0, limit)
    name = dict(STARTING_METHODS)[method]
    la = fq(locked_a, "A")
    if method == "dol":
        result.step("Across the line: the motor sees full voltage and draws its locked-rotor "
                    "current", "I_start = I_LR", f"= {fq(start.line, 'A')}")
    elif method == "wye-delta":
        result.step("Wye-delta: each winding sees V/√3 and the line current of a wye is a third "
                    "of a delta's", "I_start = I_LR / 3; T = T_LR / 3",
                    f"= {la} / 3 = {fq(start.line, 'A')}")
    elif method in AUTOTRANSFORMER_TAPS:
        tap = AUTOTRANSFORMER_TAPS[method]
        result.step(f"Autotransformer at {100 * tap:g} %: motor current a × I_LR, line current a² × "
                    "I_LR (magnetising current neglected)", "I_line = a² I_LR; T = a² T_LR",
                    f"= {tap:g}² × {la} = {fq(start.line, 'A')} (motor {fq(start.motor, 'A')})")
    elif method == "reactor":
        k = start.voltage_fraction
        result.step(f"Primary reactor or resistor leaving k = {100 * k:g} % of rated voltage at the "
                    "motor at standstill", "I_start = k I_LR; T = k² T_LR",
                    f"= {k:g} × {la} = {fq(start.line, 'A')}")
    elif method == "soft":
        set_limit = limit if limit is not None else DEFAULT_CURRENT_LIMIT["soft"]
        result.step("Soft starter: the current limit sets the current; the voltage falls to "
                    "suit, so torque falls with the square", "I = limit × I_FL; T = (I/I_LR)² T_LR",
                    f"= {set_limit:g} × {fq(flc, 'A')} = {fq(start.line, 'A')}; "
                    f"({fq(start.line, 'A')} / {la})² = {start.torque_fraction:.3g}")
        if set_limit * flc >= locked_a:
            result.check("current_limit", "warn",
                         f"A limit of {set_limit:g} × FLC ({fq(set_limit * flc, 'A')}) is at or "
                         f"above the locked-rotor current {la}: it never acts, and the start "
                         "is as across the line.")
    else:
        set_limit = limit if limit is not None else DEFAULT_CURRENT_LIMIT["vfd"]
        result.step("Variable-frequency drive: the drive starts at low frequency and holds the "
                    "current to its limit", "I = limit × I_FL; T ≈ limit × T_FL",
                    f"= {set_limit:g} × {fq(flc, 'A')} = {fq(start.line, 'A')}")
    result.output("starting_a", start.line)
    result.output("motor_starting_a", start.motor)
    result.output("starting_multiple", start.line / flc, f"{start.line / flc:.3g} × FLC")
    lrt = inputs["lrt_pct"]
    if method == "vfd":
        flt_pct = 100.0 * start.torque_fraction
        result.output("starting_torque_flt_pct", flt_pct)
        if lrt is not None:
            result.output("starting_torque_pct", 100.0 * flt_pct / lrt)
    else:
        result.output("starting_torque_pct", 100.0 * start.torque_fraction)
        if lrt is not None:
            result.output("starting_torque_flt_pct", lrt * start.torque_fraction)
    if lrt is not None:
        torque = lrt * start.torque_fraction if method != "vfd" else 100.0 * start.torque_fraction
        enough = torque >= 100.0
        result.check("starting_torque", "pass" if enough else "warn",
                     f"Starting torque {torque:.3g} % of full-load torque with {name.lower()}" +
                     (". " if enough else ": below full-load torque, enough for fans and "
                      "centrifugal pumps, which need little at standstill, but not for a loaded "
                      "conveyor or a compressor starting against pressure (common practice). ") +
                     ("" if method == "vfd" else "Torque ∝ V² through the run-up too."))
    return start


def _motor_current_view(inputs):
    power, voltage = inputs["power"], inputs["voltage"]
    phases = int(inputs["phases"])
    efficiency, pf = inputs["efficiency"], inputs["pf"]
    result = Result()

    if not efficiency * pf * voltage > 1e-200:  # their product would underflow to 0
        raise InputError("efficiency", efficiency, "efficiency × power factor × voltage is too "
                         "small to compute with; a motor's efficiency is typically 0.7-0.97")
    flc = full_load_current(power, voltage, phases, efficiency, pf)
    result.output("full_load_a", flc)
    kw = "√3 × " if phases == 3 else ""
    result.step("Full-load current from the output power (input = output / efficiency)",
                f"I_FL = P / (η × pf × {kw}V)",
                f"= {fq(power, 'W')} ({horsepower(power):.4g} hp) / ({efficiency:g} × {pf:g} × "
                f"{kw}{fq(voltage, 'V')}) = {fq(flc, 'A')}")
    if inputs["code_table"] == "nec":
        table_a, column, number = nec_table_current(power, voltage, phases)
        if table_a is None:
            result.check("code_table", "warn", f"No NEC table value: {number}.")
        else:
            result.output("table_a", table_a)
            deviation = flc / table_a - 1.0
            result.step(f"NEC Table {number} full-load current ({column:g} V column; from memory "
                        "— check your code book)", "I_table", f"= {fq(table_a, 'A')}; the "
                        f"formula gives {100 * deviation:+.1f} % against it")
            agree = abs(deviation) <= TABLE_AGREEMENT
            result.check("table_agreement", "pass" if agree else "warn",
                         f"Calculated {fq(flc, 'A')} is {100 * deviation:+.1f} % from the table's "
                         f"{fq(table_a, 'A')}" + (" (within ±15 %, the spread of typical "
                         "motors)." if agree else "; outside ±15 %: check the efficiency and "
                         "power factor against the nameplate."))

    locked_a, basis = _locked_rotor(inputs, power, voltage, phases, flc, result)
    result.output("locked_rotor_a", locked_a)
    start = _starting(inputs, phases, locked_a, flc, result)
    result.series = _reduced_voltage_series(locked_a, flc, start, inputs["starting"])

    result.assumptions += [
        "Full-load current from rated output, efficiency and power factor at rated voltage and "
        "frequency; the nameplate current is the better figure where it is known.",
        f"Starting current from {basis}, at full rated voltage; a supply that sags during the "
        "start lowers it (see the motor-start dip calculator).",
        "Reduced-voltage methods: current ∝ voltage and torque ∝ voltage² at standstill; "
        "autotransformer magnetising current and open-transition switching surges neglected.",
    ]
    if inputs["starting"] == "vfd":
        result.assumptions.append(
            "Drive: the current shown is on the motor side; from the supply a drive draws "
            "roughly the power delivered, so at low speed its line current is lower (common "
            "practice).")
    if inputs["lrt_pct"] is None and inputs["starting"] != "vfd":
        result.assumptions.append(
            "Starting torque is given as a share of the across-the-line locked-rotor torque; "
            "enter the locked-rotor torque (% of full-load) under More inputs to compare it with "
            "the load.")
    result.sources += [
        "Code letters: NEMA MG 1 §10.37.2 as reproduced in NEC Table 430.7(B) (read in a copy).",
        "Full-load currents: NEC Tables 430.248 (single-phase) and 430.250 (three-phase) — from "
        "memory, checked against a reproduction of the 2008 three-phase table.",
        "Starting methods: wye-delta 1/3, autotransformer line current ≈ tap², reactor ≈ k, "
        "torque ∝ V² — machine theory; soft-starter and drive settings — common practice.",
        "Power relations: S. J. Chapman, Electric Machinery Fundamentals, 5th ed., ch. 6 — from "
        "memory.",
    ]
    result.cautions += [
        "NEC 430.6(A)(1): size conductors, switches and short-circuit/ground-fault protection "
        "from the TABLE full-load current, not the nameplate (except low-speed, high-torque and "
        "multispeed motors); size overload protection from the nameplate current (430.6(A)(2)) "
        "— from memory; your code book and local amendments decide.",
        "A motor whose rotor is stuck draws locked-rotor current until its protection trips; "
        "never defeat overloads to get a motor started.",
        "Open-transition wye-delta and autotransformer starters draw a brief surge at the "
        "changeover; check that protection rides through it.",
    ]
    result.cautions += list(cautions.COMMON)
    return result


def _reduced_voltage_series(locked_a, flc, start, method):
    """Line current at standstill against the motor's voltage: reactor (∝ k) and autotransformer
    (∝ k²), with the chosen method and the full-load current marked."""
    shares = [0.3 + 0.7 * n / 70 for n in range(71)]
    marks = [{"axis": "y", "value": flc, "label": "Full-load current"}]
    if method not in ("vfd", "dol"):
        marks.append({"axis": "x", "value": 100.0 * start.voltage_fraction,
                      "label": dict(STARTING_METHODS)[method]})
    return {
        "title": "Starting line current against the voltage at the motor",
        "x": {"label": "Motor voltage at standstill", "unit": "%",
              "values": [100.0 * k for k in shares]},
        "y_axis": {"label": "Line current at standstill", "unit": "A"},
        "y": [
            {"label": "Reactor or resistor (∝ k)", "unit": "A",
             "values": [k * locked_a for k in shares]},
            {"label": "Autotransformer (∝ k²)", "unit": "A",
             "values": [k * k * locked_a for k in shares]},
        ],
        "marks": marks,
    }


MOTOR_CURRENT = Calculator(
    id="motor-current",
    title="Motor full-load, locked-rotor and starting current",
    summary="Full-load current from output, efficiency and power factor beside the NEC table; "
            "locked-rotor current from the code letter; starting current and torque by method.",
    group="Motors",
    inputs=(
        Input("power", "Rated output", "quantity", unit="hp", default=10, minimum=0,
              min_exclusive=True, maximum=100000, region_defaults={"iec": "7.5 kW"},
              help="Mechanical output on the nameplate, hp or kW (e.g. 10 hp or 7.5 kW)."),
        Input("voltage", "Rated voltage", "quantity", unit="V", default=460, minimum=1,
              maximum=15000, region_defaults={"iec": 400},
              suggest="voltages", help="Line-to-line for three-phase (460 V, 400 V)."),
        Input("phases", "Phases", "choice", default="3",
              choices=(("3", "Three-phase"), ("1", "Single-phase"))),
        Input("efficiency", "Full-load efficiency", "quantity", unit="", default=0.91, minimum=0,
              min_exclusive=True, maximum=1,
              help="Nameplate nominal efficiency, e.g. 0.917 or 91.7 %."),
        Input("pf", "Full-load power factor", "quantity", unit="", default=0.85, minimum=0,
              min_exclusive=True, maximum=1, help="From the nameplate or data sheet, e.g. 0.85."),
        Input("code_letter", "NEMA code letter", "choice", default="H",
              region_defaults={"iec": NO_CODE_LETTER},
              choices=tuple((letter, f"{letter} ({low:g}–{high:g} kVA/hp)" if high else
                             f"{letter} ({low:g} kVA/hp and up)")
                            for letter, (low, high) in CODE_LETTERS.items())
              + ((NO_CODE_LETTER, "Not marked or not known"),),
              help="Locked-rotor kVA per hp, marked 'CODE' on the nameplate."),
        Input("starting", "Starting method", "choice", default="dol", choices=STARTING_METHODS),
        Input("voltage_pct", "Reactor or resistor: motor voltage at start", "quantity",
              unit="%", default=65, minimum=0, min_exclusive=True, maximum=100,
              help="k × V left at the motor at standstill (usual taps 50, 65, 80 %)."),
        Input("current_limit", "Soft starter or drive: current limit (× FLC)", "quantity",
              unit="", optional=True, minimum=0, min_exclusive=True, maximum=10,
              help="Blank: 3 × for a soft starter, 1.5 × for a drive (common practice)."),
        Input("lra", "Locked-rotor current (LRA), if known", "quantity", unit="A", optional=True,
              minimum=0, min_exclusive=True, maximum=1e6, advanced=True,
              help="From the nameplate or data sheet; it replaces the code-letter figure."),
        Input("lr_multiple", "Locked-rotor current as a multiple of FLC", "quantity", unit="",
              optional=True, minimum=1, maximum=20, advanced=True,
              region_defaults={"iec": 7},
              help="I_LR / I_N from the data sheet (IEC practice), e.g. 7."),
        Input("lrt_pct", "Locked-rotor torque (% of full-load torque)", "quantity", unit="%",
              optional=True, minimum=0, min_exclusive=True, maximum=1000, advanced=True,
              help="From the data sheet, e.g. 150 %; lets the result compare torque with load."),
        Input("code_table", "Code table of full-load currents", "choice", default="nec",
              choices=CODE_TABLES, region_defaults={"iec": "none"}, advanced=True),
    ),
    outputs=(
        Output("full_load_a", "Full-load current (calculated)", "A"),
        Output("table_a", "Full-load current, NEC table", "A"),
        Output("locked_rotor_a_min", "Locked-rotor current, lowest for the code letter", "A"),
        Output("locked_rotor_a_max", "Locked-rotor current, highest for the code letter", "A"),
        Output("locked_rotor_a", "Locked-rotor current used", "A"),
        Output("starting_a", "Starting line current", "A"),
        Output("motor_starting_a", "Starting current in the motor leads", "A"),
        Output("starting_multiple", "Starting current, multiple of FLC", ""),
        Output("starting_torque_pct", "Starting torque, % of across-the-line torque", "%"),
        Output("starting_torque_flt_pct", "Starting torque, % of full-load torque", "%"),
        Output("lr_kva_per_hp", "Locked-rotor kVA per hp (of the current given)", ""),
    ),
    compute=_motor_current_view,
)


# ==== DC motors ==============================================================================

MOTOR_TYPES = (
    ("shunt", "Shunt (separately excited): constant field"),
    ("series", "Series: field carries the armature current"),
    ("pm", "Permanent-magnet"),
)
LOAD_KINDS = (
    ("constant", "Constant torque (conveyor, hoist, mixer)"),
    ("fan", "Torque ∝ speed² (fan, centrifugal pump)"),
    ("none", "Uncoupled (no load)"),
)

# IEC 60085 thermal classes and the NEMA MG 1 insulation classes of the same letters: the
# highest temperature the insulation system is rated for [°C] — from memory.
INSULATION_CLASSES = {"A": 105.0, "B": 130.0, "F": 155.0, "H": 180.0}

# A DC machine commutates without damaging sparking up to about 2 × rated current for a short
# time; starters and drives hold it to about 1.5-2.5 × (common practice, from memory).
COMMUTATION_MULTIPLE = 2.0

# DC motors withstand an overspeed of 25 % above the highest rated speed for up to 2 minutes
# (NEMA MG 1 Part 12, from memory): a steady speed above it is flagged.
OVERSPEED_LIMIT = 1.25

# Simulation: about RUN_STEPS fixed RK4 steps per run-up, never more than MAX_STEPS (it runs on
# each keystroke in the browser); a step is at most STEP_RATE / (fastest rate of the system),
# where RK4 is accurate to about 1e-4 per step and far inside its stability limit (|hλ| ≤ 2.78).
RUN_STEPS = 1200
MAX_STEPS = 2500
MIN_STEPS = 400  # a run that settles in fewer steps is run again on a finer step
STEP_RATE = 0.5
SETTLED = 0.002  # within 0.2 % of the steady speed and current counts as settled
SETTLE_MARGIN = 1.1  # the chart runs on 10 % past settling
TIME_CONSTANTS = 6.0  # a stage's run-up is taken as 6 time constants (0.25 % left)
RUN_UP_SHARE = 0.95  # run-up time: to 95 % of the steady speed
CHART_POINTS = 301
MAX_STARTER_STEPS = 20

# A current-sensing starter cuts a step when the current falls to the switch-out current; the
# load's own steady current must sit below it by this margin or the starter would wait forever.
SWITCH_MARGIN = 1.05


class DCMotor(NamedTuple):
    """A DC motor and its load, as the run-up equations need them.

    For shunt and permanent-magnet motors `constant` is k [V·s/rad] (E = k ω, T = k i); for
    series motors it is k_s [V·s/(rad·A)] with Φ ∝ i (E = k_s i ω, T = k_s i²).
    """

    motor_type: str  # "shunt", "series" or "pm"
    voltage: float  # supply [V]
    armature_r: float  # armature circuit resistance, series field included [Ω]
    inductance: float  # armature circuit inductance [H]; 0 = neglected
    inertia: float  # motor and load [kg·m²]
    constant: float
    load: str  # "constant", "fan" or "none"
    load_torque: float  # constant torque, or the fan's torque at load_speed [N·m]
    load_speed: float  # [rad/s]
    damping: float = 0.0  # viscous friction B [N·m·s/rad]

    @property
    def series(self):
        return self.motor_type == "series"

    def emf(self, current, speed):
        """Back-EMF [V]."""
        return self.constant * (current if self.series else 1.0) * speed

    def torque(self, current):
        """Electromagnetic torque [N·m]."""
        return self.constant * (current * current if self.series else current)

    def load_at(self, speed):
        """Load torque [N·m] plus viscous friction."""
        friction = self.damping * speed
        if self.load == "fan":
            return self.load_torque * (speed / self.load_speed) ** 2 + friction
        if self.load == "constant":
            return self.load_torque + friction
        return friction

    def load_slope(self, speed):
        """d(load torque + friction)/dω [N·m·s/rad]."""
        fan = 2.0 * self.load_torque * speed / self.load_speed ** 2 if self.load == "fan" else 0.0
        return fan + self.damping

    def quasi_current(self, resistance, speed):
        """Armature current with the inductance neglected [A] (L di/dt = 0)."""
        if self.series:
            return self.voltage / (resistance + self.constant * speed)
        return (self.voltage - self.constant * speed) / resistance


class RunUp(NamedTuple):
    """A run-up simulation: the samples and what happened."""

    time: list  # [s]
    current: list  # armature current [A]
    speed: list  # [rad/s]
    emf: list  # back-EMF [V]
    switch_times: list  # when each starter step was cut out [s]
    steady_speed: float  # the final stage's steady speed [rad/s]
    steady_current: float  # [A]
    settled: bool  # reached the final steady state within MAX_STEPS
    hung: bool  # stopped on a starter step (or at standstill) the load never lets it leave
    quasi_static: bool  # the inductance was neglected (too fast to resolve)
    steps: int  # RK4 steps taken


def back_emf(voltage, armature_r, armature_current):
    """Back-EMF of a DC motor.

    Parameters
    ----------
    voltage : float
        Voltage across the armature circuit [V].
    armature_r : float
        Armature circuit resistance (brushes, interpoles; for a series motor the series field
        too) [Ω].
    armature_current : float
        Armature current [A].

    Returns
    -------
    float
        E_b = V − I_a R_a [V].

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 8.2 (the equivalent
    circuit of a DC motor) — from memory.

    Examples
    --------
    >>> back_emf(250.0, 0.06, 95.0)
    244.3
    """
    return voltage - armature_current * armature_r


def starting_current_dc(voltage, armature_r):
    """Armature current at standstill with no starter, E_b = 0: I = V / R_a [A].

    Examples
    --------
    >>> starting_current_dc(250.0, 0.05)
    5000.0
    """
    return voltage / armature_r


def starting_resistance(voltage, armature_r, allowed_current):
    """Series resistance that holds the standstill current to `allowed_current`.

    Parameters
    ----------
    voltage : float
        Supply [V].
    armature_r : float
        Armature circuit resistance [Ω].
    allowed_current : float
        Largest current allowed at standstill [A].

    Returns
    -------
    float
        R_s = V / I_allowed − R_a [Ω]; 0 when the armature alone already keeps the current
        within the allowance.

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 8.8 (DC motor starters)
    — from memory.

    Examples
    --------
    >>> round(starting_resistance(250.0, 0.05, 700.0), 4)
    0.3071
    """
    return max(0.0, voltage / allowed_current - armature_r)


def starter_sections(voltage, armature_r, max_current, switch_current, series=False):
    """Resistor sections of a starter that cuts one out each time the current falls.

    Parameters
    ----------
    voltage : float
        Supply [V].
    armature_r : float
        Armature circuit resistance [Ω].
    max_current : float
        Largest current allowed, at standstill and just after each cut [A].
    switch_current : float
        Current at which each section is cut out [A]; below max_current.
    series : bool
        A series motor (flux ∝ current) instead of a constant-flux one.

    Returns
    -------
    list of float
        Section resistances [Ω] in the order they are cut out; empty when none is needed.

    Notes
    -----
    With R_n in circuit the current falls to I_min at E_n = V − I_min R_n. Cutting to R_{n+1}
    at the same speed: constant flux keeps E, so R_{n+1} = R_n I_min / I_max; a series motor's
    E scales with the current, so R_{n+1} = R_n − V (1/I_min − 1/I_max). The last cut goes
    straight to R_a once the next total would be at or below it (the jump then stays under
    I_max). Inductance neglected.

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 8.8 and its starter
    example (100 hp, 250 V, 350 A, R_A = 0.05 Ω, 2 × rated: three sections) — from memory.

    Examples
    --------
    >>> [round(r, 4) for r in starter_sections(250.0, 0.05, 700.0, 350.0)]
    [0.1786, 0.0893, 0.0393]
    """
    total = voltage / max_current
    sections = []
    while total > armature_r:
        if series:
            following = total - voltage * (1.0 / switch_current - 1.0 / max_current)
        else:
            following = total * switch_current / max_current
        following = max(following, armature_r)
        sections.append(total - following)
        total = following
        if len(sections) > MAX_STARTER_STEPS:
            break
    return sections


def motor_constant(motor_type, emf, speed, armature_current):
    """k = E/ω for constant flux, or k_s = E/(ω I_a) for a series motor (Φ ∝ I_a).

    Examples
    --------
    >>> round(motor_constant("shunt", 250.0, 1200 * RAD_S_PER_RPM, 0.0), 4)
    1.9894
    """
    if motor_type == "series":
        return emf / (speed * armature_current)
    return emf / speed


def speed_from_back_emf(speed_ref, emf_ref, emf, flux_ratio=1.0):
    """Speed at another back-EMF: N = N_ref × (E / E_ref) / (Φ / Φ_ref).

    For a series motor, unsaturated, Φ / Φ_ref = I_a / I_a,ref.

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., Example 8-1 (E = K φ ω) — from
    memory.

    Examples
    --------
    >>> round(speed_from_back_emf(1200.0, 250.0, 244.3), 1)
    1172.6
    """
    return speed_ref * (emf / emf_ref) / flux_ratio


def steady_state(motor, resistance):
    """Speed and current where the motor's torque balances the load, inductance aside.

    Parameters
    ----------
    motor : DCMotor
    resistance : float
        Total armature circuit resistance, starter included [Ω].

    Returns
    -------
    (float, float) or None
        Steady speed [rad/s] and current [A]; speed 0 when the starting torque does not exceed
        the load's; None when there is no steady speed (a series motor with nothing to hold it
        runs away).

    Notes
    -----
    f(ω) = T_e(i(ω)) − T_load(ω) − B ω falls with ω for every motor type and load here, so the
    root is found by bisection (100 halvings: to the last bit).
    """
    def surplus(speed):
        return motor.torque(motor.quasi_current(resistance, speed)) - motor.load_at(speed)

    if surplus(0.0) <= 0.0:
        return 0.0, motor.quasi_current(resistance, 0.0)
    if motor.series:
        high = motor.voltage / motor.constant  # speed at which E = V with 1 A of flux current
        for _ in range(200):
            if surplus(high) < 0.0:
                break
            high *= 2.0
        else:
            return None
    else:
        high = motor.voltage / motor.constant  # no-load speed: the surplus is ≤ 0 there
    low = 0.0
    for _ in range(100):
        middle = 0.5 * (low + high)
        if surplus(middle) > 0.0:
            low = middle
        else:
            high = middle
    speed = 0.5 * (low + high)
    return speed, motor.quasi_current(resistance, speed)


def _rates(motor, resistance, current, speed, quasi):
    """(di/dt, dω/dt). A load never drives the rotor backwards from standstill (it holds)."""
    if quasi:
        current = motor.quasi_current(resistance, speed)
        di = 0.0
    else:
        di = (motor.voltage - resistance * current - motor.emf(current, speed)) / motor.inductance
    net = motor.torque(current) - motor.load_at(speed)
    dw = 0.0 if speed <= 0.0 and net < 0.0 else net / motor.inertia
    return di, dw


def _rk4(motor, resistance, current, speed, h, quasi):
    a1, b1 = _rates(motor, resistance, current, speed, quasi)
    a2, b2 = _rates(motor, resistance, current + 0.5 * h * a1, speed + 0.5 * h * b1, quasi)
    a3, b3 = _rates(motor, resistance, current + 0.5 * h * a2, speed + 0.5 * h * b2, quasi)
    a4, b4 = _rates(motor, resistance, current + h * a3, speed + h * b3, quasi)
    speed = speed + h / 6.0 * (b1 + 2.0 * b2 + 2.0 * b3 + b4)
    if quasi:
        return motor.quasi_current(resistance, speed), speed
    return current + h / 6.0 * (a1 + 2.0 * a2 + 2.0 * a3 + a4), speed


def _fastest_rate(motor, resistance, current, speed, quasi):
    """Largest |eigenvalue| of the linearised equations at one state [1/s]."""
    mech = motor.load_slope(speed) / motor.inertia
    if motor.series:
        de_di, de_dw, dt_di = motor.constant * speed, motor.constant * current, \
            2.0 * motor.constant * current
    else:
        de_di, de_dw, dt_di = 0.0, motor.constant, motor.constant
    if quasi:
        # i = i(ω): dT/dω = dT/di × di/dω, di/dω = −(∂E/∂ω) / (R + ∂E/∂i)
        return abs(-dt_di * de_dw / (resistance + de_di) / motor.inertia - mech)
    a, b = -(resistance + de_di) / motor.inductance, -de_dw / motor.inductance
    c, d = dt_di / motor.inertia, -mech
    half_trace, det = 0.5 * (a + d), a * d - b * c
    disc = half_trace * half_trace - det
    if disc >= 0.0:
        root = math.sqrt(disc)
        return max(abs(half_trace + root), abs(half_trace - root))
    return math.sqrt(det)  # complex pair: |λ|² = det


def _stage_totals(armature_r, sections):
    """Total circuit resistance on each starter step, the last being the armature alone."""
    return [armature_r + sum(sections[n:]) for n in range(len(sections) + 1)]


def _plan(motor, totals, steadies, quasi):
    """(expected run-up time [s], number of steps the electrical transient alone would need)."""
    estimate, electrical = 0.0, 0.0
    for total, (speed, current) in zip(totals, steadies):
        slowest = _fastest_rate(motor, total, current, speed, True)
        if slowest <= 0.0:
            slowest = _fastest_rate(motor, total, motor.quasi_current(total, 0.0), 0.0, True)
        estimate += TIME_CONSTANTS / max(slowest, 1e-9)
        if not quasi:
            estimate += TIME_CONSTANTS * motor.inductance / total
            for w in (0.0, speed):  # a series motor's E adds k_s ω to the circuit's R
                electrical = max(electrical, _fastest_rate(
                    motor, total, motor.quasi_current(total, w), w, False))
    return estimate, estimate * electrical / STEP_RATE


def run_up(motor, sections=(), switch_current=None):
    """Simulate the start of a DC motor from standstill with classical RK4.

    Parameters
    ----------
    motor : DCMotor
    sections : sequence of float
        Starter resistor sections [Ω], cut out in order (see starter_sections); empty for a
        start across the line.
    switch_current : float, optional
        The current at which a section is cut out as it falls [A] (needed with sections).

    Returns
    -------
    RunUp

    Notes
    -----
    L di/dt = V − R i − E(i, ω) and J dω/dt = T(i) − T_load(ω) − B ω, with E = k ω, T = k i
    (constant flux) or E = k_s i ω, T = k_s i² (series, unsaturated), from i = ω = 0. A section
    is cut where the current crosses the switch-out current falling, located within the step by
    regula falsi. Each step is STEP_RATE / (fastest rate of the equations linearised at that
    state), at most 1/RUN_STEPS of the expected run-up: RK4 without error control, its step
    fixed by the physics rather than by an error estimate. When the armature time constant is
    too short to resolve within MAX_STEPS the inductance is neglected (i follows ω).

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., ch. 8 (DC motor equivalent
    circuit and E I_A = T ω) — from memory; RK4: E. Hairer, S. P. Nørsett and G. Wanner,
    *Solving Ordinary Differential Equations I*, 2nd ed., section II.1 — from memory.
    """
    totals = _stage_totals(motor.armature_r, list(sections))
    steadies = [steady_state(motor, total) or (0.0, 0.0) for total in totals]
    quasi = motor.inductance <= 0.0
    estimate, electrical_steps = _plan(motor, totals, steadies, quasi)
    if not quasi and electrical_steps > MAX_STEPS:
        quasi = True  # the electrical transient is over in a tiny fraction of the run-up
        estimate, _ = _plan(motor, totals, steadies, quasi)
    longest = estimate / RUN_STEPS
    run = _integrate(motor, totals, steadies, switch_current, longest, quasi)
    if run.steps < MIN_STEPS and (run.settled or run.hung):
        run = _integrate(motor, totals, steadies, switch_current, run.time[-1] / RUN_STEPS, quasi)
    return run


def _integrate(motor, totals, steadies, switch_current, longest, quasi):
    stage, last = 0, len(totals) - 1
    current = motor.quasi_current(totals[0], 0.0) if quasi else 0.0
    speed, t = 0.0, 0.0
    time, currents, speeds = [t], [current], [speed]
    switches, peak = [], abs(current)
    stop, settled, hung, steps = None, False, False, 0
    while steps < MAX_STEPS:
        total = totals[stage]
        h = min(longest, STEP_RATE / _fastest_rate(motor, total, current, speed, quasi))
        new_i, new_w = _rk4(motor, total, current, speed, h, quasi)
        steps += 1
        crossing = stage < last and current > switch_current >= new_i
        if crossing:
            h, new_i, new_w, steps = _locate_switch(motor, total, current, speed, h, quasi,
                                                    switch_current, new_i, steps)
        t += h
        current, speed = new_i, new_w
        if crossing:
            stage += 1
            switches.append(t)
            if quasi:
                time.append(t)
                currents.append(current)
                speeds.append(speed)
                current = motor.quasi_current(totals[stage], speed)  # the jump at the cut
        time.append(t)
        currents.append(current)
        speeds.append(speed)
        peak = max(peak, abs(current))
        if stop is None:
            steady_w, steady_i = steadies[stage]
            near = (abs(speed - steady_w) <= SETTLED * max(steady_w, 1e-12)
                    and abs(current - steady_i) <= SETTLED * peak)
            if near and (stage == last or steady_w <= 0.0 or steady_i > switch_current):
                settled, hung = stage == last, stage != last
                stop = t * SETTLE_MARGIN
        if stop is not None and t >= stop:
            break
    emfs = [motor.emf(i, w) for i, w in zip(currents, speeds)]
    steady_w, steady_i = steadies[last]
    return RunUp(time, currents, speeds, emfs, switches, steady_w, steady_i, settled, hung,
                 quasi, steps)


def _locate_switch(motor, total, current, speed, h, quasi, target, new_i, steps):
    """Shorten a step to end where the current reaches `target` (three regula-falsi passes)."""
    low, high = 0.0, 1.0
    g_low, g_high = current - target, new_i - target
    fraction, state = 1.0, None
    for _ in range(3):
        fraction = low + (high - low) * g_low / (g_low - g_high) if g_low != g_high else high
        state = _rk4(motor, total, current, speed, fraction * h, quasi)
        steps += 1
        g = state[0] - target
        if g > 0.0:
            low, g_low = fraction, g
        else:
            high, g_high = fraction, g
    return fraction * h, state[0], state[1], steps


def time_to_share(times, values, target):
    """First time the samples reach `target`, linearly interpolated; None if never."""
    for n in range(1, len(values)):
        if values[n] >= target > values[n - 1] or values[n] == target:
            span = values[n] - values[n - 1]
            share = (target - values[n - 1]) / span if span else 0.0
            return times[n - 1] + share * (times[n] - times[n - 1])
    return None


def resample(times, values, grid):
    """Linear interpolation of samples onto `grid`; the last value is held beyond the end."""
    out, n = [], 1
    for t in grid:
        while n < len(times) - 1 and times[n] < t:
            n += 1
        if t >= times[-1]:
            out.append(values[-1])
            continue
        t0, t1 = times[n - 1], times[n]
        share = (t - t0) / (t1 - t0) if t1 > t0 else 1.0
        out.append(values[n - 1] + share * (values[n] - values[n - 1]))
    return out


def thin(times, keep_times, points=CHART_POINTS):
    """Indices of about `points` samples, evenly spread, plus every sample at a time in
    `keep_times` (so a chart keeps the current's jump at each starter cut)."""
    stride = max(1, len(times) // points)
    keep = set(range(0, len(times), stride)) | {len(times) - 1}
    marked = set(keep_times)
    keep |= {n for n, t in enumerate(times) if t in marked}
    return sorted(keep)


def winding_temperature_rise(time, current, rated_current, rated_rise, time_constant,
                             initial_rise=0.0):
    """Temperature rise of a winding carrying a steady current, first-order thermal model.

    Parameters
    ----------
    time : float
        Time since the current started [s].
    current : float
        Winding current [A].
    rated_current : float
        Current at which the winding settles at `rated_rise` [A].
    rated_rise : float
        Steady rise above ambient at rated current [K].
    time_constant : float
        Thermal time constant of the winding to its surroundings [s].
    initial_rise : float
        Rise at time 0 [K] (0 cold, rated_rise after running at rated load).

    Returns
    -------
    float
        θ(t) = θ_ss + (θ_0 − θ_ss) e^(−t/τ), θ_ss = θ_rated (I / I_rated)² [K].

    Notes
    -----
    Loss I²R with R constant (copper's rise of resistance with temperature is left out: at
    constant voltage it lowers the current and the heating, so the estimate errs early). For
    t ≪ τ it is the adiabatic rise θ_0 + θ_ss t / τ.

    Examples
    --------
    >>> round(winding_temperature_rise(1800.0, 20.0, 20.0, 80.0, 1800.0), 2)
    50.57
    """
    steady = rated_rise * (current / rated_current) ** 2
    return steady + (initial_rise - steady) * math.exp(-time / time_constant)


def time_to_rise(limit_rise, current, rated_current, rated_rise, time_constant, initial_rise=0.0):
    """Time for winding_temperature_rise to reach `limit_rise` [s]; None if it never does.

    Returns 0 when the winding starts at or above the limit.

    Examples
    --------
    >>> round(time_to_rise(115.0, 500.0, 20.0, 80.0, 1800.0, 80.0), 3)
    1.262
    """
    if initial_rise >= limit_rise:
        return 0.0
    steady = rated_rise * (current / rated_current) ** 2
    if steady <= limit_rise:
        return None
    return time_constant * math.log((steady - initial_rise) / (steady - limit_rise))


# ---- the back-emf view ------------------------------------------------------------------------

def _rpm(speed):
    return f"{_figure(speed / RAD_S_PER_RPM)} r/min"


def _figure(number):
    """Four significant figures without an exponent below 1e9 (50000, not 5e+04)."""
    return f"{number:.0f}" if 1e4 <= abs(number) < 1e9 else f"{number:.4g}"


def _armature(name, value, field_a, series):
    """Armature current [A] from a line-current input, the shunt field current taken off.

    A series motor needs some current (its flux is the current); a shunt or PM motor may be at
    no load (0 A in the armature).
    """
    if series and value <= 0.0:
        raise InputError(name, value, "a series motor has no field without current (Φ ∝ I_a): "
                         "enter its running current, more than 0 A")
    armature = value - field_a
    if armature < 0.0 or (armature == 0.0 and name == "rated_current"):
        raise InputError(name, value, f"the shunt field takes {fq(field_a, 'A')} of the line "
                         f"current {fq(value, 'A')}, which leaves no armature current; enter "
                         f"more than {fq(field_a, 'A')}, or check the field resistance")
    return armature


def _dc_setup(inputs):
    """Read and cross-check the inputs: the armature currents, k and the reference point."""
    kind, voltage, r_a = inputs["motor_type"], inputs["voltage"], inputs["armature_r"]
    field_r = inputs["field_r"]
    if field_r is not None and kind != "shunt":
        raise InputError("field_r", field_r, "a field resistance applies only to a shunt motor "
                         "(a series motor's field is part of the armature circuit resistance); "
                         "leave it blank")
    field_a = voltage / field_r if field_r is not None else 0.0
    series = kind == "series"
    rated_line = inputs["rated_current"] if inputs["rated_current"] is not None else \
        inputs["current"]
    ref_line = inputs["current_ref"] if inputs["current_ref"] is not None else rated_line
    ref_name = "current_ref" if inputs["current_ref"] is not None else (
        "rated_current" if inputs["rated_current"] is not None else "current")
    rated_name = "rated_current" if inputs["rated_current"] is not None else "current"
    armature_a = _armature("current", inputs["current"], field_a, series)
    rated_a = _armature(rated_name, rated_line, field_a, series)
    ref_a = _armature(ref_name, ref_line, field_a, series)
    if rated_a <= 0.0:
        raise InputError(rated_name, rated_line, "the rated current (the current now, when "
                         "rated current is blank) must be more than 0 A: starting multiples "
                         "and the thermal estimate are reckoned from it")
    for name, amps in (("current", armature_a), (rated_name, rated_a), (ref_name, ref_a)):
        if back_emf(voltage, r_a, amps) <= 0.0:
            raise InputError(name, inputs[name], f"at {fq(amps, 'A')} the armature drop I R_a = "
                             f"{fq(amps * r_a, 'V')} uses the whole {fq(voltage, 'V')}: the "
                             "motor would be at standstill (it draws "
                             f"{fq(voltage / r_a, 'A')} there); enter a running current")
    speed_ref = inputs["speed_ref"] * RAD_S_PER_RPM
    emf_ref = back_emf(voltage, r_a, ref_a)
    constant = motor_constant(kind, emf_ref, speed_ref, ref_a)
    return field_a, armature_a, rated_a, ref_a, speed_ref, emf_ref, constant


def _speed_at_current(kind, constant, voltage, r_a, armature_a):
    emf = back_emf(voltage, r_a, armature_a)
    return emf / (constant * armature_a) if kind == "series" else emf / constant


def _back_emf_view(inputs):
    kind, voltage, r_a = inputs["motor_type"], inputs["voltage"], inputs["armature_r"]
    series = kind == "series"
    field_a, armature_a, rated_a, ref_a, speed_ref, emf_ref, k = _dc_setup(inputs)
    result = Result()
    v, ra = fq(voltage, "V"), fq(r_a, "ohm")

    if field_a:
        result.step("Shunt field current, and the armature's share of the line current",
                    "I_f = V / R_f; I_a = I_L − I_f",
                    f"= {v} / {fq(inputs['field_r'], 'ohm')} = {fq(field_a, 'A')}; "
                    f"{fq(inputs['current'], 'A')} − {fq(field_a, 'A')} = {fq(armature_a, 'A')}")
    emf = back_emf(voltage, r_a, armature_a)
    result.output("back_emf_v", emf)
    result.output("armature_a", armature_a)
    result.step("Back-EMF: the supply less the armature circuit's drop", "E_b = V − I_a R_a",
                f"= {v} − {fq(armature_a, 'A')} × {ra} = {fq(emf, 'V')}")
    share = emf / voltage
    result.check("back_emf_share", "pass" if share >= 0.8 else "warn",
                 f"Back-EMF is {100 * share:.1f} % of the supply" + (
                     "." if share >= 0.8 else "; a running DC motor usually loses under 10-20 % "
                     "in its armature (common practice): check R_a and the current."))

    speed = _speed_at_current(kind, k, voltage, r_a, armature_a)
    flux = armature_a / ref_a if series else 1.0
    result.output("speed", speed, _rpm(speed))
    result.step("Speed from back-EMF, scaled from the known speed" +
                (" (series: flux ∝ armature current, unsaturated)" if series else
                 " (constant flux)"),
                "N = N_ref × (E_b / E_ref) / (Φ / Φ_ref)",
                f"E_ref = {v} − {fq(ref_a, 'A')} × {ra} = {fq(emf_ref, 'V')}; N = "
                f"{inputs['speed_ref']:g} × {emf / emf_ref:.4g}" +
                (f" / {flux:.4g}" if series else "") + f" = {_rpm(speed)}")
    torque = (k * armature_a * armature_a) if series else k * armature_a
    result.output("torque", torque, f"{torque:.4g} N·m")
    result.output("developed_power_w", emf * armature_a)
    result.step("Torque and developed power (E_b I_a = T ω)", "T = E_b I_a / ω",
                f"= {fq(emf, 'V')} × {fq(armature_a, 'A')} / {speed:.4g} rad/s = "
                f"{torque:.4g} N·m; P = {fq(emf * armature_a, 'W')}")
    if not series:
        no_load = voltage / k
        result.output("no_load_speed", no_load, _rpm(no_load))
        result.step("No-load speed (I_a → 0, E_b → V)", "N_0 = N_ref × V / E_ref",
                    f"= {inputs['speed_ref']:g} × {voltage / emf_ref:.4g} = {_rpm(no_load)}")
    else:
        ratio = armature_a / ref_a
        valid = 0.5 <= ratio <= 1.5
        result.check("series_flux", "pass" if valid else "warn",
                     "Series motor: flux taken ∝ armature current (unsaturated iron)" + (
                         "." if valid else f"; at {ratio:.2g} × the reference current the iron "
                         "is far from that point (saturated above, residual flux below), so the "
                         "speed is a rough estimate."))
    if speed > OVERSPEED_LIMIT * speed_ref:
        result.check("overspeed", "warn",
                     f"{_rpm(speed)} is more than 25 % above the known speed "
                     f"({inputs['speed_ref']:g} r/min); DC motors are built for about 25 % "
                     "overspeed (NEMA MG 1, from memory)" +
                     (": a series motor races when its load is light." if series else "."))

    at_speed = inputs["speed_at"]
    if at_speed is not None:
        omega = at_speed * RAD_S_PER_RPM
        model = DCMotor(kind, voltage, r_a, 0.0, 1.0, k, "none", 0.0, 1.0)
        current_at = model.quasi_current(r_a, omega)
        result.output("current_at_speed_a", current_at)
        formula = "I_a = V / (R_a + k_s ω)" if series else "I_a = (V − k ω) / R_a"
        result.step(f"Armature current at {at_speed:g} r/min (steady, inductance aside)", formula,
                    f"k{'_s' if series else ''} = {k:.4g}; I_a = {fq(current_at, 'A')}")
        if current_at < 0.0:
            result.check("regenerating", "warn",
                         f"Above the no-load speed the machine generates: {fq(-current_at, 'A')} "
                         "flows back into the supply, which must be able to take it.")

    _starting_dc(inputs, result, voltage, r_a, rated_a)
    _simulate(inputs, result, k, armature_a, rated_a, speed, speed_ref)

    result.assumptions += [
        "Armature current is the line current less the shunt field current (when the field "
        "resistance is given; otherwise the field current is neglected). Brush drop is taken "
        "as part of R_a.",
        "Constant flux for shunt and permanent-magnet motors (armature reaction neglected); "
        "series motors: flux ∝ armature current, unsaturated." if series else
        "Constant flux (shunt field on the full supply, armature reaction neglected).",
        "Speeds scale from the known speed at its current; torque is electromagnetic (rotational "
        "losses come off it before the shaft).",
    ]
    result.sources += [
        "E_b = V − I_a R_a, I_start = V/R_a, R_s = V/I − R_a, N ∝ E_b/Φ, E I = T ω: S. J. "
        "Chapman, Electric Machinery Fundamentals, 5th ed., ch. 8 — from memory.",
        "Insulation classes A 105, B 130, F 155, H 180 °C: IEC 60085 / NEMA MG 1 — from memory.",
    ]
    result.cautions += [
        "Never start a DC motor above fractional size across the line: the armature draws many "
        "times rated current until back-EMF builds, which can flash over the commutator.",
        "A shunt motor whose field opens, or a series motor that loses its load, can race to a "
        "destructive speed: keep field-loss protection and never run a series motor uncoupled.",
        "A stalled armature heats in seconds; the protection, not the insulation, must end it.",
        "Starting resistors run hot and stay live; guard them and let them cool.",
    ]
    result.cautions += list(cautions.COMMON)
    return result


def _starting_dc(inputs, result, voltage, r_a, rated_a):
    start = starting_current_dc(voltage, r_a)
    result.output("starting_a", start)
    result.output("starting_multiple", start / rated_a, f"{start / rated_a:.3g} × rated")
    result.step("Starting current with no starter (E_b = 0 at standstill)", "I_start = V / R_a",
                f"= {fq(voltage, 'V')} / {fq(r_a, 'ohm')} = {fq(start, 'A')} = "
                f"{start / rated_a:.3g} × rated {fq(rated_a, 'A')}")
    if start > COMMUTATION_MULTIPLE * rated_a:
        result.check("starting_current", "warn",
                     f"Across the line the armature would draw {start / rated_a:.3g} × rated; "
                     f"starters hold it to about 1.5-2.5 × (common practice, from memory).")
    limit = inputs["start_limit"]
    if limit is None:
        return
    allowed = limit * rated_a
    resistor = starting_resistance(voltage, r_a, allowed)
    result.output("starting_resistor_ohm", resistor)
    result.step(f"Starting resistance for {limit:g} × rated at standstill",
                "R_s = V / I_allowed − R_a",
                f"= {fq(voltage, 'V')} / {fq(allowed, 'A')} − {fq(r_a, 'ohm')} = "
                f"{fq(resistor, 'ohm')}")
    if resistor == 0.0:
        result.check("starting_resistor", "pass",
                     f"No resistor needed: the armature alone holds the start to {fq(start, 'A')}.")
        return
    sections = starter_sections(voltage, r_a, allowed, rated_a, inputs["motor_type"] == "series")
    if len(sections) > MAX_STARTER_STEPS:
        raise InputError("start_limit", limit, f"a starter switching between {limit:g} × and "
                         f"1 × rated would need more than {MAX_STARTER_STEPS} steps; allow a "
                         "higher starting multiple")
    listed = ", ".join(fq(r, "ohm") for r in sections)
    result.output("starter_steps", len(sections),
                  f"{len(sections)} step{'s' if len(sections) > 1 else ''}: {listed}")
    result.step("Starter steps cut out as the current falls back to rated (constant flux keeps "
                "E_b at the cut: R_{n+1} = R_n I_min / I_max; series: R_{n+1} = R_n − V(1/I_min "
                "− 1/I_max))", "sections, first cut first", f"= {listed}")


def _simulate(inputs, result, k, armature_a, rated_a, speed, speed_ref):
    """The run-up and stalled-armature charts and outputs."""
    kind, voltage, r_a = inputs["motor_type"], inputs["voltage"], inputs["armature_r"]
    series = kind == "series"
    if inputs["load_pct"] is None:
        load_torque, load_speed = k * armature_a * (armature_a if series else 1.0), speed
        basis = "the operating point entered"
    else:
        load_torque = inputs["load_pct"] / 100.0 * k * rated_a * (rated_a if series else 1.0)
        load_speed = _speed_at_current(kind, k, voltage, r_a, rated_a)
        basis = f"{inputs['load_pct']:g} % of rated torque"
    motor = DCMotor(kind, voltage, r_a, inputs["inductance"], inputs["inertia"], k,
                    inputs["load"], load_torque, load_speed, inputs["damping"])
    result.assumptions.append(
        f"Run-up: J = {inputs['inertia']:g} kg·m², L = {fq(inputs['inductance'], 'H')}, "
        f"B = {inputs['damping']:g} N·m·s/rad; load {dict(LOAD_KINDS)[inputs['load']].lower()}"
        + ("" if inputs["load"] == "none" else
           f", sized from {basis} ({load_torque:.4g} N·m at {_rpm(load_speed)})")
        + "; supply voltage held constant; a load never drives the rotor backwards from "
        "standstill.")
    limit = inputs["start_limit"]
    allowed = limit * rated_a if limit is not None else None
    if allowed is not None and starting_resistance(voltage, r_a, allowed) <= 0.0:
        allowed = None  # the armature alone keeps within the limit: no starter to simulate
    if steady_state(motor, r_a) is None:
        result.check("runaway", "fail",
                     "A series motor with no load has no steady speed: it accelerates until it "
                     "destroys itself. No run-up is shown; couple a load.")
        result.series = []
        _stall(inputs, result, voltage, r_a, rated_a, allowed)
        return
    runs = [("Across the line", run_up(motor))]
    if allowed is not None:
        sections = starter_sections(voltage, r_a, allowed, rated_a, series)
        held = [steady_state(motor, total) for total in _stage_totals(r_a, sections)[:-1]]
        held = [current for speed_n, current in held if speed_n > 0.0]
        switch = max([rated_a] + [SWITCH_MARGIN * current for current in held])
        if switch > rated_a:
            result.check("starter_switching", "warn",
                         f"The load holds the current at {fq(max(held), 'A')} on a starter step, "
                         "above rated: a starter that waits for rated current would never step "
                         f"on. The simulation cuts at {fq(switch, 'A')}, so the peaks exceed the "
                         "design limit; use a timed starter or a lighter start.")
        runs.append((f"{len(sections)}-step starter", run_up(motor, sections, switch)))
    _describe_runs(result, runs, motor, allowed, speed_ref)
    result.series = _run_charts(runs, motor, rated_a, allowed)
    _stall(inputs, result, voltage, r_a, rated_a, allowed)


def _describe_runs(result, runs, motor, allowed, speed_ref):
    for (label, run), suffix in zip(runs, ("", "_starter")):
        if run.hung or run.steady_speed <= 0.0:
            where = ("at standstill: its starting torque does not exceed the load's "
                     f"({motor.load_at(0.0):.4g} N·m)") if run.speed[-1] <= 0.0 else \
                "on a starter step: the load keeps the current above the switch-out current"
            result.check("cannot_start" + suffix, "fail", f"{label}: the motor stays {where}.")
            continue
        reached = time_to_share(run.time, run.speed, RUN_UP_SHARE * run.steady_speed)
        if reached is not None:
            result.output(f"run_up{suffix}_s", reached)
        peak = max(run.current)
        result.output(f"peak{suffix}_a", peak)
        result.step(f"Run-up simulation, {label.lower()} (fixed-step RK4, {run.steps} steps"
                    + (", inductance neglected" if run.quasi_static else "") + ")",
                    "L di/dt = V − R i − E;  J dω/dt = T − T_load − B ω",
                    f"peak {fq(peak, 'A')}; 95 % of {_rpm(run.steady_speed)} after "
                    + (fq(reached, "s") if reached is not None else "more than the time shown")
                    + (f"; steps cut at {', '.join(fq(t, 's') for t in run.switch_times)}"
                       if run.switch_times else ""))
        if not run.settled:
            result.check("run_up" + suffix, "warn",
                         f"{label}: not settled within {fq(run.time[-1], 's')} "
                         f"({MAX_STEPS} steps); the chart shows the start of the run-up.")
        if run.quasi_static and motor.inductance > 0.0:
            result.check("inductance" + suffix, "pass",
                         f"{label}: the armature time constant L/R is too short to matter "
                         "beside the run-up, so the current is taken to follow the speed at "
                         "once (it starts at V/R, a little above the true first peak).")
        if suffix and peak > 1.001 * allowed:
            result.check("starter_peak", "warn",
                         f"The starter's peaks reach {fq(peak, 'A')}, above the "
                         f"{fq(allowed, 'A')} design limit.")
    steady = runs[0][1].steady_speed
    if steady > OVERSPEED_LIMIT * speed_ref:
        result.check("steady_overspeed", "warn",
                     f"The load lets the motor settle at {_rpm(steady)}, more than 25 % above "
                     "the known speed (NEMA MG 1 overspeed, from memory).")


def _grid(end):
    return [end * n / (CHART_POINTS - 1) for n in range(CHART_POINTS)]


def _chart(title, x_label, grid, axis, unit, lines, marks=()):
    """One chart of the contract: lines are (label, values) on the same grid."""
    return {"title": title, "x": {"label": x_label, "unit": "s", "values": grid},
            "y_axis": {"label": axis, "unit": unit},
            "y": [{"label": label, "unit": unit, "values": values} for label, values in lines],
            "marks": list(marks)}


def _run_charts(runs, motor, rated_a, allowed):
    """Current for each run on its own time scale; speed and back-EMF of the runs together."""
    marks = [{"axis": "y", "value": rated_a, "label": "Rated current"}]
    charts = []
    for label, run in runs:
        keep = thin(run.time, run.switch_times)
        shown = marks + ([{"axis": "y", "value": allowed, "label": "Starter limit"}]
                         if allowed is not None and run.switch_times else [])
        charts.append(_chart(f"Armature current during the run-up, {label.lower()}", "Time",
                             [run.time[n] for n in keep], "Armature current", "A",
                             [(label, [run.current[n] for n in keep])], shown))
    grid = _grid(max(run.time[-1] for _, run in runs))
    charts.append(_chart("Speed during the run-up", "Time", grid, "Speed", "r/min",
                         [(label, [w / RAD_S_PER_RPM for w in resample(run.time, run.speed, grid)])
                          for label, run in runs]))
    charts.append(_chart("Back-EMF during the run-up", "Time", grid, "Back-EMF", "V",
                         [(label, resample(run.time, run.emf, grid)) for label, run in runs],
                         [{"axis": "y", "value": motor.voltage, "label": "Supply voltage"}]))
    return charts


def _stall(inputs, result, voltage, r_a, rated_a, allowed):
    """Winding temperature with the rotor held: across the line and on the starter's first step."""
    insulation = inputs["insulation_class"]
    limit_c = INSULATION_CLASSES[insulation]
    ambient, rated_rise, tau = inputs["ambient_c"], inputs["rated_rise"], inputs["thermal_tau"]
    initial = rated_rise if inputs["start_hot"] else 0.0
    allowed_rise = limit_c - ambient
    result.assumptions.append(
        f"Stalled armature: first-order thermal model, τ = {fq(tau, 's')}, {rated_rise:g} K "
        f"rise at rated current, starting from "
        f"{'the rated running temperature' if initial else 'ambient'} with {ambient:g} °C "
        "ambient; resistance held constant (the estimate errs early); commutator and brush "
        "heating, which can be worse at standstill, are not modelled.")
    if allowed_rise <= initial:
        result.check("insulation", "fail",
                     f"Ambient {ambient:g} °C plus the {'running ' if initial else ''}rise "
                     f"{initial:g} K already reaches the class {insulation} limit of "
                     f"{limit_c:g} °C: check the rated rise and the ambient.")
        return
    cases = [("across the line", voltage / r_a, "")]
    if allowed is not None:
        cases.append(("on the starter's first step", allowed, "_starter"))
    for label, amps, suffix in cases:
        steady = rated_rise * (amps / rated_a) ** 2
        t = time_to_rise(allowed_rise, amps, rated_a, rated_rise, tau, initial)
        if t is None:
            result.check("stall" + suffix, "pass",
                         f"Stalled {label} at {fq(amps, 'A')} the winding settles at "
                         f"{ambient + steady:.4g} °C, below the class {insulation} limit.")
            span = 5.0 * tau
        else:
            adiabatic = tau * (allowed_rise - initial) / steady
            result.output(f"time_to_limit{suffix}_s", t)
            result.step(f"Stalled rotor {label}: the winding heats from {ambient + initial:g} °C "
                        f"towards the class {insulation} limit, {limit_c:g} °C",
                        "t = τ ln((θ_ss − θ_0) / (θ_ss − θ_lim)), θ_ss = θ_rated (I/I_rated)²",
                        f"I = {fq(amps, 'A')}: θ_ss = {_figure(steady)} K; t = {fq(t, 's')} "
                        f"(adiabatic estimate θ_ss t / τ: {fq(adiabatic, 's')})")
            result.check("stall" + suffix, "warn",
                         f"Stalled {label} at {fq(amps, 'A')} the armature reaches the class "
                         f"{insulation} limit in about {fq(t, 's')}: its protection must clear "
                         "well within that.")
            span = min(1.5 * t, 5.0 * tau)
        grid = _grid(span)
        temperatures = [ambient + winding_temperature_rise(time, amps, rated_a, rated_rise, tau,
                                                           initial) for time in grid]
        result.series.append(_chart(f"Winding temperature with the rotor stalled {label}",
                                    "Time stalled", grid, "Winding temperature", "°C",
                                    [(f"Stalled {label}", temperatures)],
                                    [{"axis": "y", "value": limit_c,
                                      "label": f"Class {insulation} limit"}]))


BACK_EMF = Calculator(
    id="back-emf",
    title="DC motor back-EMF, starting and run-up",
    summary="Back-EMF, speed and torque of a shunt, series or permanent-magnet DC motor; "
            "starting current and resistor; run-up simulation and stalled-armature heating.",
    group="Motors",
    inputs=(
        Input("motor_type", "Motor type", "choice", default="shunt", choices=MOTOR_TYPES),
        Input("voltage", "Armature supply voltage", "quantity", unit="V", default=250, minimum=1,
              maximum=3000, help="DC across the armature circuit."),
        Input("armature_r", "Armature circuit resistance R_a", "quantity", unit="ohm",
              default=0.5, minimum=1e-4, maximum=10000,
              help="Armature, brushes and interpoles; for a series motor include the series "
                   "field."),
        Input("current", "Motor current now", "quantity", unit="A", default=16, minimum=0,
              maximum=100000, help="Line current at the operating point (clamp reading)."),
        Input("speed_ref", "Known speed (r/min)", "quantity", unit="", default=1750, minimum=0,
              min_exclusive=True, maximum=100000,
              help="Nameplate speed at rated current, or another speed you know the current "
                   "for."),
        Input("start_limit", "Allowed starting current (× rated)", "quantity", unit="",
              default=2, optional=True, minimum=1, min_exclusive=True, maximum=20,
              help="Blank: no starter is sized. Starters commonly hold 1.5-2.5 ×."),
        Input("rated_current", "Rated current", "quantity", unit="A", default=20, optional=True,
              minimum=0, min_exclusive=True, maximum=100000, advanced=True,
              help="Nameplate armature (line) current; blank = the current now."),
        Input("current_ref", "Current at the known speed", "quantity", unit="A", optional=True,
              minimum=0, maximum=100000, advanced=True,
              help="Blank = rated current. For a no-load speed enter the no-load current."),
        Input("speed_at", "Speed for the current-at-speed (r/min)", "quantity", unit="",
              optional=True, minimum=0, maximum=100000, advanced=True),
        Input("field_r", "Shunt field circuit resistance", "quantity", unit="ohm",
              optional=True, minimum=0, min_exclusive=True, maximum=1e6, advanced=True,
              help="Shunt motors: its current V/R_f is taken off the line currents."),
        Input("inductance", "Armature circuit inductance", "quantity", unit="H",
              default="10 mH", minimum=0, maximum=10, advanced=True,
              help="0 neglects it (the current then follows the speed at once)."),
        Input("inertia", "Inertia of motor and load (kg·m²)", "quantity", unit="", default=0.5,
              minimum=0, min_exclusive=True, maximum=1e6, advanced=True),
        Input("load", "Load", "choice", default="constant", choices=LOAD_KINDS, advanced=True),
        Input("load_pct", "Load torque (% of rated)", "quantity", unit="%", optional=True,
              minimum=0, maximum=500, advanced=True,
              help="At rated speed; blank = the torque at the operating point entered."),
        Input("damping", "Viscous friction B (N·m·s/rad)", "quantity", unit="", default=0,
              minimum=0, maximum=1e6, advanced=True),
        Input("insulation_class", "Insulation class", "choice", default="F",
              choices=tuple((c, f"Class {c} ({t:g} °C)") for c, t in INSULATION_CLASSES.items()),
              advanced=True),
        Input("ambient_c", "Ambient temperature", "quantity", unit="degC", default=40,
              minimum=-40, maximum=100, advanced=True),
        Input("rated_rise", "Winding rise at rated current (K)", "quantity", unit="",
              default=80, minimum=0, min_exclusive=True, maximum=250, advanced=True,
              help="Steady rise above ambient at rated load, e.g. 80 K (class B rise)."),
        Input("thermal_tau", "Winding thermal time constant", "quantity", unit="min",
              default=30, minimum=0, min_exclusive=True, maximum=1000, advanced=True,
              help="Heating time constant of the armature, e.g. 30 min."),
        Input("start_hot", "Stall from running temperature", "flag", default=True,
              advanced=True, help="Yes: the winding is at its rated rise when the rotor stalls."),
    ),
    outputs=(
        Output("back_emf_v", "Back-EMF", "V"),
        Output("armature_a", "Armature current", "A"),
        Output("speed", "Speed", "rad/s"),
        Output("torque", "Electromagnetic torque", "N·m"),
        Output("developed_power_w", "Developed power E_b I_a", "W"),
        Output("no_load_speed", "No-load speed", "rad/s"),
        Output("starting_a", "Starting current, no starter", "A"),
        Output("starting_multiple", "Starting current, multiple of rated", ""),
        Output("starting_resistor_ohm", "Starting resistance for the limit", "Ω"),
        Output("starter_steps", "Starter steps", ""),
        Output("current_at_speed_a", "Armature current at the speed given", "A"),
        Output("run_up_s", "Run-up time to 95 % speed, across the line", "s"),
        Output("peak_a", "Peak current, across the line", "A"),
        Output("run_up_starter_s", "Run-up time to 95 % speed, with the starter", "s"),
        Output("peak_starter_a", "Peak current, with the starter", "A"),
        Output("time_to_limit_s", "Stalled across the line: time to the insulation limit", "s"),
        Output("time_to_limit_starter_s", "Stalled on the first starter step: time to the limit",
               "s"),
    ),
    compute=_back_emf_view,
)
