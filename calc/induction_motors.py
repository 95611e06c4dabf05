"""Induction motors: full-load current (formula and NEC tables), locked-rotor current from the
NEMA code letter, starting current and torque by starting method, the running tolerances of
NEMA MG 1, and what the voltage dip of a start does to the motor, its contactor and the lights.

Quantities follow the nomenclature page: power [W] (mechanical output), voltage [V]
(line-to-line for three-phase), current [A], apparent power [VA], locked-rotor ratio [VA/W]
(the code letters' kVA/hp where the tables use it), percentages [%].
"""

import math
from typing import NamedTuple

from calc import electrical, units
from calc.errors import ParameterError

# ==== published tables =======================================================================

# NEMA MG 1 §10.37.2 locked-rotor kVA code letters: kVA per horsepower at full voltage and
# rated frequency, as NEC Table 430.7(B) reproduces them (read, as reproduced by EASA). A range
# runs from its lower figure up to, but not including, the higher; I, O and Q are not used;
# letter V is "22.4 and up" (no upper figure).
CODE_LETTERS = {
    "A": (0.0, 3.15), "B": (3.15, 3.55), "C": (3.55, 4.0), "D": (4.0, 4.5), "E": (4.5, 5.0),
    "F": (5.0, 5.6), "G": (5.6, 6.3), "H": (6.3, 7.1), "J": (7.1, 8.0), "K": (8.0, 9.0),
    "L": (9.0, 10.0), "M": (10.0, 11.2), "N": (11.2, 12.5), "P": (12.5, 14.0),
    "R": (14.0, 16.0), "S": (16.0, 18.0), "T": (18.0, 20.0), "U": (20.0, 22.4),
    "V": (22.4, None),
}

# NEC Table 430.250: full-load current [A] of three-phase induction motors (squirrel cage and
# wound rotor) "typical for motors running at speeds usual for belted motors and motors with
# normal torque characteristics", by horsepower and rated motor voltage. Read, as reproduced
# (NEC 2017, repository mjk83093/sil NEC2017_Chapter_4.md; NEC 2008 at scribd.com/doc/250218196):
# every cell agrees with both; the same to 2023 from memory. None: no entry.
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
# motor voltage — read, as reproduced (NEC 2017, mjk83093/sil NEC2017_Chapter_4.md); the same
# 2008-2023 from memory.
NEC_430_248_VOLTS = (115.0, 200.0, 208.0, 230.0)
NEC_430_248 = {
    1 / 6: (4.4, 2.5, 2.4, 2.2), 0.25: (5.8, 3.3, 3.2, 2.9), 1 / 3: (7.2, 4.1, 4.0, 3.6),
    0.5: (9.8, 5.6, 5.4, 4.9), 0.75: (13.8, 7.9, 7.6, 6.9), 1.0: (16.0, 9.2, 8.8, 8.0),
    1.5: (20.0, 11.5, 11.0, 10.0), 2.0: (24.0, 13.8, 13.2, 12.0), 3.0: (34.0, 19.6, 18.7, 17.0),
    5.0: (56.0, 32.2, 30.8, 28.0), 7.5: (80.0, 46.0, 44.0, 40.0), 10.0: (100.0, 57.5, 55.0, 50.0),
}

# The tables' headings let their currents serve system voltages of 110-120 and 220-240 V, and
# for three-phase also 440-480 and 550-600 V (read, as reproduced in the same NEC 2017 text):
# (lowest, highest, table column).
NEC_SYSTEM_RANGES = {
    1: ((110.0, 120.0, 115.0), (220.0, 240.0, 230.0)),
    3: ((110.0, 120.0, 115.0), (220.0, 240.0, 230.0), (440.0, 480.0, 460.0),
        (550.0, 600.0, 575.0)),
}
NEC_TABLES = {1: (NEC_430_248_VOLTS, NEC_430_248, "430.248"),
              3: (NEC_430_250_VOLTS, NEC_430_250, "430.250")}

# NEMA MG 1-12.44 running tolerances of an induction motor at rated load (read): ±10 % of rated
# voltage, ±5 % of rated frequency, and the sum of the two deviations at most 10 %.
RUNNING_VOLTAGE_TOLERANCE_PCT = 10.0
RUNNING_FREQUENCY_TOLERANCE_PCT = 5.0
RUNNING_COMBINED_TOLERANCE_PCT = 10.0

# Motor sizes by rated voltage (the plausibility of a size at a voltage). The NEC full-load
# tables list three-phase motors at 115 V up to 2 hp, at 200-230 V up to 200 hp, at 460-575 V up
# to 500 hp and at 2300 V from 60 hp (read off NEC_430_250 above), single-phase motors up to
# 10 hp (NEC_430_248). IEC low-voltage motors are made to about 1000 kW at 400-690 V, and
# medium-voltage motors run to about 13.8 kV (NEMA MG 1 voltage ratings by size: common practice).
MOTOR_VOLTAGE_RANGE_V = (100.0, 13800.0)
LOW_VOLTAGE_MOTOR_MAX_W = 1000e3  # IEC low-voltage motors, about 1000 kW (common practice)
_SIZE_BANDS = ((130.0, 115.0), (250.0, 230.0), (1000.0, 575.0))  # (highest V, NEC column V)


# ==== starting ===============================================================================

# Starting methods the functions below know, in the trade's words. For each: the fraction of the
# voltage the motor sees at standstill, and the ratio of line to motor current. Wye-delta: the
# winding sees V/√3 and the delta-to-wye change divides the line current by 3. Autotransformer at
# tap a: motor current a × I_LR, line current a² × I_LR, magnetising current neglected. Primary
# reactor or resistor at k × V: line = motor = k × I_LR. Torque ∝ V² in every case. Machine
# theory, from memory.
AUTOTRANSFORMER_TAPS = {"auto-50": 0.50, "auto-65": 0.65, "auto-80": 0.80}
STARTING_METHODS = (
    ("dol", "Across the line (full voltage)"),
    ("wye-delta", "Wye-delta (star-delta), open transition"),
    *((token, f"Autotransformer, {100 * tap:g} % tap")
      for token, tap in AUTOTRANSFORMER_TAPS.items()),
    ("reactor", "Primary reactor or resistor at k × V"),
    ("soft", "Soft starter with current limit"),
    ("vfd", "Variable-frequency drive"),
)
# Methods that hold a current rather than present an impedance to the supply.
HELD_CURRENT_METHODS = ("soft", "vfd")

# Current limits when none is given [× FLC]: a soft starter is usually set to 2-4 × FLC
# (3 × taken); a drive delivers about 1.0-1.5 × FLC, its usual overload being 150 % for 60 s
# (1.5 × taken). Both common practice.
DEFAULT_CURRENT_LIMIT = {"soft": 3.0, "vfd": 1.5}

# Across-the-line locked-rotor current is usually 6-8 × FLC (Design B about 5.5-7 ×); outside
# 4-10 × a figure deserves a second look. Common practice.
USUAL_LOCKED_ROTOR_MULTIPLE = (6.0, 8.0)
PLAUSIBLE_LOCKED_ROTOR_MULTIPLE = (4.0, 10.0)

# ==== what a starting dip does ===============================================================

# A motor needs about 80 % of rated voltage at its terminals to accelerate a typical load;
# contactors and starters may drop out at about 60-70 % (IEEE Std 141-1993 (Red Book) ch. 3,
# critical voltage levels; NEMA ICS — from memory).
ACCELERATING_VOLTAGE_PCT = 80.0
CONTACTOR_DROPOUT_PCT = (60.0, 70.0)
# IEC 61000-3-3 relative voltage change limits (from memory): d_max 4 % in general (6 % or 7 %
# under conditions); d(t) may exceed d_c = 3.3 % for at most T_max = 0.5 s during one change.
IEC_61000_3_3_D_MAX_PCT = 4.0
IEC_61000_3_3_D_C_PCT = 3.3
IEC_61000_3_3_T_MAX_S = 0.5
# "Borderline of irritation" for lamp flicker against starts per hour: (starts per hour, dip [%]).
# The shape of the flicker curve published in IEEE Std 141-1993 ch. 3 (values from memory;
# common practice).
FLICKER_IRRITATION = ((1.0, 6.0), (10.0, 4.0), (60.0, 2.5), (600.0, 1.3))


class StartingCurrent(NamedTuple):
    """Currents and torque at standstill with a starting method."""

    line: float  # current drawn from the supply [A]
    motor: float  # current in the motor leads [A]
    voltage_fraction: float  # motor voltage at standstill, per unit of rated [-]
    torque_fraction: float  # starting torque, per unit of the across-the-line locked-rotor torque


# ==== currents ===============================================================================

def horsepower(power):
    """Mechanical output in horsepower.

    Parameters
    ----------
    power : float
        Mechanical output [W].

    Returns
    -------
    float
        Output in horsepower (550 ft·lbf/s) [hp].

    Notes
    -----
    hp = P / 745.699 872 W (calc.units.HORSEPOWER_W, exact from the foot, pound and g_n).

    References
    ----------
    NIST SP 811 (2008), Appendix B.8 (horsepower, 550 ft·lbf/s) — read.

    Examples
    --------
    >>> round(horsepower(7457.0), 3)
    10.0
    """
    return power / float(units.HORSEPOWER_W)


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
        Full-load efficiency, output / input, in (0, 1] [-].
    power_factor : float
        Full-load power factor, in (0, 1] [-].

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
    return electrical.line_current(power / (efficiency * power_factor), voltage, phases)


def locked_rotor_current(kva_per_hp, power, voltage, phases):
    """Locked-rotor line current at full voltage from the locked-rotor kVA per horsepower.

    Parameters
    ----------
    kva_per_hp : float or array
        Locked-rotor apparent power per horsepower of rated output, as the code letters give it
        [kVA/hp].
    power : float
        Rated output [W].
    voltage : float
        Rated voltage [V]; line-to-line for three-phase.
    phases : int
        1 or 3.

    Returns
    -------
    float or array
        Locked-rotor current [A].

    Notes
    -----
    I_LR = (kVA/hp) × hp × 1000 / (√3 V) three-phase, / V single-phase.

    References
    ----------
    NEMA MG 1 §10.37.2; NEC 430.7(B) and Table 430.7(B) (read, as reproduced by EASA).

    Examples
    --------
    >>> round(locked_rotor_current(7.1, 10 * 745.699872, 460.0, 3), 1)
    89.1
    """
    return electrical.line_current(kva_per_hp * 1000.0 * horsepower(power), voltage, phases)


def locked_rotor_ratio(current, power, voltage, phases):
    """Locked-rotor apparent power per watt of rated output, from a locked-rotor current.

    Parameters
    ----------
    current : float
        Locked-rotor current at full voltage [A].
    power : float
        Rated output [W].
    voltage : float
        Rated voltage [V]; line-to-line for three-phase.
    phases : int
        1 or 3.

    Returns
    -------
    float
        S_LR / P [VA/W]; 1 kVA/hp = 1000 / 745.7 = 1.341 VA/W.

    Notes
    -----
    S_LR = √3 V I_LR three-phase, V I_LR single-phase; the ratio is S_LR / P.

    References
    ----------
    NEMA MG 1 §10.37.2 (starting kVA per hp = V × LRA × (1 or 1.732) / (1000 × hp)) — read, as
    reproduced by EASA.

    Examples
    --------
    >>> round(locked_rotor_ratio(85.0, 7456.99872, 460.0, 3), 3)
    9.082
    """
    return electrical.apparent_power(voltage, current, phases) / power


def locked_rotor_kva_per_hp(current, power, voltage, phases):
    """The inverse of locked_rotor_current: the code letters' kVA per horsepower of a current.

    Parameters
    ----------
    current : float
        Locked-rotor current at full voltage [A].
    power : float
        Rated output [W].
    voltage : float
        Rated voltage [V]; line-to-line for three-phase.
    phases : int
        1 or 3.

    Returns
    -------
    float
        Locked-rotor kVA per horsepower [kVA/hp].

    Notes
    -----
    kVA/hp = k V I_LR / (1000 hp), k = √3 three-phase, 1 single-phase.

    References
    ----------
    NEMA MG 1 §10.37.2 (starting kVA per hp = V × LRA × (1 or 1.732) / (1000 × hp)) — read, as
    reproduced by EASA.

    Examples
    --------
    >>> round(locked_rotor_kva_per_hp(85.0, 7456.99872, 460.0, 3), 3)
    6.772
    """
    return electrical.apparent_power(voltage, current, phases) / (1000.0 * horsepower(power))


def code_letter_range(letter):
    """The locked-rotor kVA per horsepower a NEMA code letter allows.

    Parameters
    ----------
    letter : str
        A NEMA code letter, "A" to "V" (I, O and Q are not used).

    Returns
    -------
    (float, float or None)
        Lowest and highest figure [kVA/hp]; the highest is None for letter V (22.4 and up).

    Raises
    ------
    ParameterError
        For a letter NEMA MG 1 does not use; the message lists the valid ones.

    Notes
    -----
    A range runs from its lower figure up to, but not including, the higher one.

    References
    ----------
    NEMA MG 1 §10.37.2, NEC Table 430.7(B) (read, as reproduced by EASA).

    Examples
    --------
    >>> code_letter_range("H"), code_letter_range("V")
    ((6.3, 7.1), (22.4, None))
    """
    try:
        return CODE_LETTERS[letter]
    except (KeyError, TypeError):
        raise ParameterError("letter", letter, f"{letter!r} is not a NEMA code letter; use one "
                             f"of {', '.join(CODE_LETTERS)} (I, O and Q are not used)") from None


def code_letter_for(kva_per_hp):
    """The code letter whose range holds a locked-rotor kVA per horsepower.

    Parameters
    ----------
    kva_per_hp : float
        Locked-rotor apparent power per horsepower [kVA/hp], not negative.

    Returns
    -------
    str
        The NEMA code letter (lower figure included, upper not).

    Notes
    -----
    The letter L with low ≤ kVA/hp < high; V for 22.4 and up.

    References
    ----------
    NEMA MG 1 §10.37.2, NEC Table 430.7(B) (read, as reproduced by EASA): "3.14 is letter A and
    3.15 is letter B".

    Examples
    --------
    >>> code_letter_for(3.14), code_letter_for(3.15), code_letter_for(30.0)
    ('A', 'B', 'V')
    """
    for letter, (low, high) in CODE_LETTERS.items():
        if kva_per_hp >= low and (high is None or kva_per_hp < high):
            return letter
    return "A"  # only a negative figure gets here; callers pass positive ones


def code_letter_currents(letter, power, voltage, phases):
    """Locked-rotor current range of a motor from its code letter.

    Parameters
    ----------
    letter : str
        NEMA code letter.
    power : float
        Rated output [W].
    voltage : float
        Rated voltage [V]; line-to-line for three-phase.
    phases : int
        1 or 3.

    Returns
    -------
    (float, float or None)
        Lowest and highest locked-rotor current [A]; the highest is None for letter V.

    Raises
    ------
    ParameterError
        For a letter NEMA MG 1 does not use.

    Notes
    -----
    I_LR = kVA/hp × hp × 1000 / (√3 V) at each end of the letter's range.

    References
    ----------
    NEMA MG 1 §10.37.2, NEC Table 430.7(B) (read, as reproduced by EASA).

    Examples
    --------
    >>> [round(i, 1) for i in code_letter_currents("G", 25 * 745.699872, 480.0, 3)]
    [168.4, 189.4]
    """
    low, high = code_letter_range(letter)
    return (locked_rotor_current(low, power, voltage, phases),
            None if high is None else locked_rotor_current(high, power, voltage, phases))


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

    Notes
    -----
    A system voltage in a range the table's heading allows (440-480 V for the 460 V column...)
    reads that column.

    References
    ----------
    NEC Tables 430.248 and 430.250 and their headings — read, as reproduced (NEC 2017,
    repository mjk83093/sil NEC2017_Chapter_4.md; 430.250 also NEC 2008, scribd.com/doc/250218196).

    Examples
    --------
    >>> nec_table_current(10 * 745.699872, 480.0, 3)
    (14.0, 460.0, '430.250')
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


def usual_power_range(voltage, phases):
    """The rated outputs induction motors are made in at a rated voltage.

    Parameters
    ----------
    voltage : float
        Rated voltage [V]; line-to-line for three-phase.
    phases : int
        1 or 3.

    Returns
    -------
    (float, float or None)
        The smallest and largest usual output [W]; None: no upper figure. (0, 0) where no motors
        of that kind are made (single-phase above 1 kV, anything outside MOTOR_VOLTAGE_RANGE_V).

    Notes
    -----
    Single-phase: up to the largest NEC Table 430.248 size (10 hp), at most 1 kV. Three-phase up
    to 1 kV: up to the largest NEC Table 430.250 size of the band's column (115 V: 2 hp;
    200-250 V: 200 hp), 460-690 V up to the larger of the table's 500 hp and 1000 kW of IEC
    practice. Above 1 kV: from the smallest size of the 2300 V column (60 hp), no upper figure.

    References
    ----------
    NEC Tables 430.248 and 430.250 (read, as reproduced: NEC 2017, repository mjk83093/sil
    NEC2017_Chapter_4.md; NEC 2008 at scribd.com/doc/250218196); NEMA MG 1 voltage ratings by
    size and IEC low-voltage motor ranges — common practice.

    Examples
    --------
    >>> [round(horsepower(p)) for p in usual_power_range(208.0, 3)]
    [0, 200]
    >>> round(horsepower(usual_power_range(4160.0, 3)[0]))
    60
    """
    low_v, high_v = MOTOR_VOLTAGE_RANGE_V
    if not low_v <= voltage <= high_v or (phases == 1 and voltage > _SIZE_BANDS[-1][0]):
        return 0.0, 0.0
    hp_w = float(units.HORSEPOWER_W)
    if phases == 1:
        return 0.0, max(NEC_430_248) * hp_w
    column = next((c for top, c in _SIZE_BANDS if voltage <= top), None)
    if column is None:  # medium voltage: from the smallest size of the 2300 V column
        index = NEC_430_250_VOLTS.index(2300.0)
        return min(hp for hp, row in NEC_430_250.items() if row[index] is not None) * hp_w, None
    index = NEC_430_250_VOLTS.index(column)
    largest = max(hp for hp, row in NEC_430_250.items() if row[index] is not None) * hp_w
    if column == _SIZE_BANDS[-1][1]:
        largest = max(largest, LOW_VOLTAGE_MOTOR_MAX_W)
    return 0.0, largest


def _hp_text(hp):
    fractions = {1 / 6: "1/6", 0.25: "1/4", 1 / 3: "1/3", 0.5: "1/2", 0.75: "3/4", 1.5: "1-1/2",
                 7.5: "7-1/2"}
    return next((text for value, text in fractions.items() if math.isclose(hp, value)), f"{hp:g}")


def within_running_tolerance(voltage_deviation_pct, frequency_deviation_pct):
    """Whether an induction motor may run at rated load off its rated voltage and frequency.

    Parameters
    ----------
    voltage_deviation_pct : float
        Deviation of the supply voltage from the motor's rated voltage [%] (either sign).
    frequency_deviation_pct : float
        Deviation of the supply frequency from the rated frequency [%] (either sign).

    Returns
    -------
    bool
        True within ±10 % voltage, ±5 % frequency and a sum of the two at most 10 %.

    Notes
    -----
    |ΔV| ≤ 10 %, |Δf| ≤ 5 %, |ΔV| + |Δf| ≤ 10 %. A deviation of exactly a limit is within it
    (1e-9 % of slack absorbs the rounding of e.g. 57 Hz on 60 Hz).

    References
    ----------
    NEMA MG 1-12.44 (read).

    Examples
    --------
    >>> within_running_tolerance(-8.0, 2.0), within_running_tolerance(-8.0, 3.0)
    (True, False)
    """
    dv, df, slack = abs(voltage_deviation_pct), abs(frequency_deviation_pct), 1e-9
    return (dv <= RUNNING_VOLTAGE_TOLERANCE_PCT + slack
            and df <= RUNNING_FREQUENCY_TOLERANCE_PCT + slack
            and dv + df <= RUNNING_COMBINED_TOLERANCE_PCT + slack)


# ==== starting methods =======================================================================

def starting_current(starting_method, locked_rotor_current, full_load_current, voltage_fraction=None,
                     current_limit=None):
    """Line and motor current and the torque left at standstill with a starting method.

    Parameters
    ----------
    starting_method : str
        A token of STARTING_METHODS.
    locked_rotor_current : float
        Across-the-line locked-rotor current [A].
    full_load_current : float
        Full-load current [A] (soft starter and drive limits are multiples of it).
    voltage_fraction : float, optional
        "reactor": the motor voltage at standstill per unit of rated, k [-].
    current_limit : float, optional
        "soft" and "vfd": the current limit in multiples of full-load current [-]; default
        DEFAULT_CURRENT_LIMIT.

    Returns
    -------
    StartingCurrent
        For "vfd" torque_fraction is the drive's torque per unit of FULL-LOAD torque
        (≈ current limit: rated flux, torque ∝ torque-producing current), not of locked-rotor
        torque; voltage_fraction is the drive's output at standstill, taken as 0.

    Raises
    ------
    ParameterError
        For an unknown starting method, or "reactor" without its voltage fraction.

    Notes
    -----
    Wye-delta: I = I_LR / 3, T = T_LR / 3. Autotransformer at tap a: I_line = a² I_LR, I_motor =
    a I_LR, T = a² T_LR. Reactor at k: I = k I_LR, T = k² T_LR. Torque ∝ V², and current ∝ V for
    an impedance at standstill, so a soft starter holding the current to I leaves (I / I_LR)² of
    the across-the-line torque; a limit above I_LR never acts.

    References
    ----------
    Machine theory (phase voltage ÷ √3 and delta → wye ÷ 3; autotransformer line current ≈ tap²;
    torque ∝ V²) — from memory. Soft-starter and drive current limits — common practice.

    Examples
    --------
    >>> round(starting_current("wye-delta", 600.0, 100.0).line, 1)
    200.0
    >>> round(starting_current("auto-65", 600.0, 100.0).line, 2)
    253.5
    """
    if starting_method == "dol":
        return StartingCurrent(locked_rotor_current, locked_rotor_current, 1.0, 1.0)
    if starting_method == "wye-delta":
        third = locked_rotor_current / 3.0
        return StartingCurrent(third, third, 1.0 / electrical.SQRT3, 1.0 / 3.0)
    if starting_method in AUTOTRANSFORMER_TAPS:
        tap = AUTOTRANSFORMER_TAPS[starting_method]
        return StartingCurrent(tap * tap * locked_rotor_current, tap * locked_rotor_current, tap,
                               tap * tap)
    if starting_method == "reactor":
        if voltage_fraction is None:
            raise ParameterError("voltage_fraction", None, "a reactor or resistor start needs the "
                                 "motor's voltage at standstill, per unit of rated")
        k = voltage_fraction
        return StartingCurrent(k * locked_rotor_current, k * locked_rotor_current, k, k * k)
    if starting_method not in HELD_CURRENT_METHODS:
        raise ParameterError("starting_method", starting_method,
                             f"{starting_method!r} is not a starting method; use one "
                             f"of {', '.join(token for token, _ in STARTING_METHODS)}")
    limit = current_limit if current_limit is not None else DEFAULT_CURRENT_LIMIT[starting_method]
    current = limit * full_load_current
    if starting_method == "soft":
        current = min(current, locked_rotor_current)  # a limit above I_LR never acts
        share = current / locked_rotor_current
        return StartingCurrent(current, current, share, share * share)
    return StartingCurrent(current, current, 0.0, limit)  # vfd


def starting_impedance_scale(starting_method, voltage_fraction=None):
    """How much larger the supply sees a starting motor's impedance than its locked-rotor one.

    Parameters
    ----------
    starting_method : str
        A starting method that acts as an impedance: "dol", "wye-delta", "auto-50", "auto-65",
        "auto-80" or "reactor".
    voltage_fraction : float, optional
        "reactor": the motor voltage at standstill per unit of rated, k [-].

    Returns
    -------
    float
        Z_seen / Z_LR = I_LR / I_line [-]: 1 across the line, 3 wye-delta, 1/a² autotransformer.

    Raises
    ------
    ParameterError
        For a soft starter or drive (they hold a current, not an impedance) or an unknown starting_method.

    Notes
    -----
    At constant supply voltage the line current is I_LR / scale, so the supply sees
    Z = V² / S_LR × scale.

    References
    ----------
    Machine theory (wye-delta 1/3, autotransformer line current ≈ tap²) — from memory.

    Examples
    --------
    >>> [round(starting_impedance_scale(starting_method), 6) for starting_method in ("wye-delta", "auto-50")]
    [3.0, 4.0]
    """
    if starting_method in HELD_CURRENT_METHODS:
        raise ParameterError("starting_method", starting_method,
                             "a soft starter or drive holds a current; it does not present an "
                             "impedance to the supply")
    return 1.0 / starting_current(starting_method, 1.0, 1.0, voltage_fraction).line


# ==== what a starting dip does ===============================================================

def flicker_irritation_dip(starts_per_hour):
    """The dip people find irritating in lamps at a given rate of starts.

    Parameters
    ----------
    starts_per_hour : float
        Motor starts (voltage dips) per hour [1/h], more than 0.

    Returns
    -------
    float
        The borderline of irritation, as a dip [%].

    Notes
    -----
    Straight-line interpolation of FLICKER_IRRITATION in log(starts per hour), held at its end
    values outside 1-600 starts per hour.

    References
    ----------
    The flicker curve published in IEEE Std 141-1993 (Red Book) ch. 3 — shape from memory,
    values common practice.

    Examples
    --------
    >>> [round(flicker_irritation_dip(rate), 3) for rate in (0.1, 2.0, 10.0)]
    [6.0, 5.398, 4.0]
    """
    points = FLICKER_IRRITATION
    if starts_per_hour <= points[0][0]:
        return points[0][1]
    for (x0, y0), (x1, y1) in zip(points, points[1:]):
        if starts_per_hour <= x1:
            t = (math.log(starts_per_hour) - math.log(x0)) / (math.log(x1) - math.log(x0))
            return y0 + t * (y1 - y0)
    return points[-1][1]
