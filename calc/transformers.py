"""Transformers: rated currents and ratios, sizing, fault level, regulation and taps, losses,
buck-boost connections, and equipment built for another supply (voltage and frequency).

Quantities follow the nomenclature page: apparent_power [VA], voltage [V] line-to-line for
three-phase, current [A], power [W]; impedances in percent on the transformer's own rating.
"""

import math
from typing import NamedTuple

from calc import cautions, network, voltage_drop
from calc.errors import InputError
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

SQRT3 = math.sqrt(3.0)

# Preferred kVA ratings. Source: IEEE/ANSI C57.12 series preferred ratings (read, approximate,
# as quoted in REFERENCE_VALUES section 5); IEC practice: 100 to 3150 kVA as IEC 60076 lists them
# (from memory). 25 and 50 kVA are the smallest ratings of the same distribution series (EU
# Regulation 548/2014 Annex I Table I.1, from memory); 4000 to 10 000 kVA continue the R10
# numbers (IEC 60076-1, from memory).
PREFERRED_KVA_1PH_NA = (5, 10, 15, 25, 37.5, 50, 75, 100, 167, 250, 333, 500, 833, 1250, 1667,
                        2500, 3333, 5000)
PREFERRED_KVA_3PH_NA = (3, 9, 15, 30, 45, 75, 112.5, 150, 225, 300, 500, 750, 1000, 1500, 2000,
                        2500, 3750, 5000, 7500, 10000)
PREFERRED_KVA_IEC = (25, 50, 100, 160, 250, 315, 400, 500, 630, 800, 1000, 1250, 1600, 2000, 2500,
                     3150, 4000, 5000, 6300, 8000, 10000)

# Line-to-neutral voltages of common wye systems (120/208, 127/220, 230/400, 277/480, 347/600).
# Entered as a three-phase line-to-line voltage they usually mean a mix-up. Common practice.
COMMON_LINE_TO_NEUTRAL_V = (120.0, 127.0, 230.0, 277.0, 347.0)

# Winding connections: the winding voltage is the line voltage for delta, line/sqrt(3) for wye.
CONNECTIONS = (
    ("delta-wye", "Delta – wye (Dyn)"),
    ("delta-delta", "Delta – delta (Dd)"),
    ("wye-wye", "Wye – wye (Yyn)"),
    ("wye-delta", "Wye – delta (Yd)"),
)


def full_load_current(apparent_power, voltage, phases):
    """Rated line current of a transformer winding.

    Parameters
    ----------
    apparent_power : float
        Rated apparent power [VA].
    voltage : float
        Rated voltage [V]; line-to-line for three-phase.
    phases : int
        1 or 3.

    Returns
    -------
    float
        Line current at rated apparent power and rated voltage [A].

    Notes
    -----
    I = S / V (single-phase) or I = S / (sqrt(3) V_LL) (balanced three-phase).

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 2.10 (three-phase
    transformers) — from memory.

    Examples
    --------
    >>> round(full_load_current(75e3, 208.0, 3), 1)
    208.2
    """
    if phases == 3:
        return apparent_power / (SQRT3 * voltage)
    return apparent_power / voltage


def winding_voltage(line_voltage, connection_side):
    """Voltage across one winding [V]: the line voltage for delta, line/sqrt(3) for wye."""
    return line_voltage if connection_side == "delta" else line_voltage / SQRT3


def turns_ratio(primary_voltage, secondary_voltage, phases, connection="delta-delta"):
    """Winding turns ratio N1/N2 of an ideal transformer.

    For single-phase it is V1/V2. For three-phase it is the ratio of the winding voltages, which
    differs from the line-voltage ratio by sqrt(3) for delta-wye and wye-delta.

    Examples
    --------
    >>> round(turns_ratio(480.0, 208.0, 3, "delta-wye"), 3)
    3.997
    """
    if phases != 3:
        return primary_voltage / secondary_voltage
    primary_side, secondary_side = connection.split("-")
    return winding_voltage(primary_voltage, primary_side) / winding_voltage(
        secondary_voltage, secondary_side
    )


def _ratio_display(ratio):
    if ratio >= 1.0:
        return f"{fq(ratio, '')} : 1"
    return f"1 : {fq(1.0 / ratio, '')}"


def _is_preferred(kva, phases):
    lists = (PREFERRED_KVA_3PH_NA if phases == 3 else PREFERRED_KVA_1PH_NA, PREFERRED_KVA_IEC)
    return any(math.isclose(kva, rating, rel_tol=1e-9) for table in lists for rating in table)


def _currents_view(inputs):
    apparent_power = inputs["kva"]
    phases = int(inputs["phases"])
    primary_v = inputs["primary_v"]
    secondary_v = inputs["secondary_v"]
    connection = inputs["connection"]
    result = Result()

    primary_a = full_load_current(apparent_power, primary_v, phases)
    secondary_a = full_load_current(apparent_power, secondary_v, phases)
    voltage_ratio = primary_v / secondary_v
    ratio = turns_ratio(primary_v, secondary_v, phases, connection)

    result.output("primary_a", primary_a)
    result.output("secondary_a", secondary_a)
    result.output("turns_ratio", ratio, _ratio_display(ratio))
    result.output("voltage_ratio", voltage_ratio, _ratio_display(voltage_ratio))

    s, v1, v2 = fq(apparent_power, "VA"), fq(primary_v, "V"), fq(secondary_v, "V")
    if phases == 3:
        result.step("Primary full-load current (balanced three-phase)", "I₁ = S / (√3 × V₁)",
                    f"= {s} / (√3 × {v1}) = {fq(primary_a, 'A')}")
        result.step("Secondary full-load current", "I₂ = S / (√3 × V₂)",
                    f"= {s} / (√3 × {v2}) = {fq(secondary_a, 'A')}")
    else:
        result.step("Primary full-load current (single-phase)", "I₁ = S / V₁",
                    f"= {s} / {v1} = {fq(primary_a, 'A')}")
        result.step("Secondary full-load current", "I₂ = S / V₂",
                    f"= {s} / {v2} = {fq(secondary_a, 'A')}")
    direction = "step-down" if voltage_ratio > 1 else ("step-up" if voltage_ratio < 1 else "1:1")
    result.step(f"Voltage ratio ({direction}); the currents are in the inverse ratio",
                "V₁ / V₂ = I₂ / I₁", f"= {v1} / {v2} = {_ratio_display(voltage_ratio)}")
    if phases == 3:
        primary_side, secondary_side = connection.split("-")
        w1 = winding_voltage(primary_v, primary_side)
        w2 = winding_voltage(secondary_v, secondary_side)
        result.step(f"Winding turns ratio, {connection} (delta winding: line voltage; wye "
                    "winding: line voltage / √3)", "N₁ / N₂ = V₁,winding / V₂,winding",
                    f"= {fq(w1, 'V')} / {fq(w2, 'V')} = {_ratio_display(ratio)}")
        for side, side_name, line_a in (
            (primary_side, "Primary", primary_a), (secondary_side, "Secondary", secondary_a)
        ):
            if side == "delta":
                result.step(f"{side_name} winding current (delta: line current / √3)",
                            "I_winding = I_line / √3",
                            f"= {fq(line_a, 'A')} / √3 = {fq(line_a / SQRT3, 'A')}")
    else:
        result.step("Turns ratio (single-phase)", "N₁ / N₂ = V₁ / V₂",
                    f"= {v1} / {v2} = {_ratio_display(ratio)}")

    kva = apparent_power / 1e3
    if _is_preferred(kva, phases):
        result.check("rating", "pass",
                     f"{fq(apparent_power, 'VA')} is a preferred rating (IEEE C57.12 / IEC 60076 lists).")
    else:
        result.check("rating", "warn",
                     f"{fq(apparent_power, 'VA')} is not in the preferred-rating lists; confirm it "
                     "on the nameplate.")
    if phases == 3:
        for name, volts in (("primary_v", primary_v), ("secondary_v", secondary_v)):
            if any(math.isclose(volts, v, rel_tol=1e-9) for v in COMMON_LINE_TO_NEUTRAL_V):
                result.check(f"{name}_line_to_line", "warn",
                             f"{fq(volts, 'V')} is a usual line-to-neutral voltage; three-phase "
                             "inputs are line-to-line (for 120/208 V enter 208 V, for 277/480 V "
                             "enter 480 V, for 230/400 V enter 400 V).")

    result.assumptions += [
        "Rated (nameplate) currents: rated kVA divided by rated voltage; the secondary voltage "
        "sags a few percent under load (regulation), which is not included.",
        "Ideal transformer for the ratios: losses and magnetising current neglected.",
    ]
    if phases == 3:
        result.assumptions.append(
            "Three-phase: balanced load; voltages are line-to-line; the winding connection "
            f"({connection}) sets the turns ratio and the winding currents."
        )
    result.sources += [
        "I = S / (√3 V_LL) and I = S / V: S. J. Chapman, Electric Machinery Fundamentals, 5th "
        "ed., ch. 2 (three-phase transformers) — from memory.",
        "Preferred ratings: IEEE/ANSI C57.12 series (North America); IEC 60076 R10 series — "
        "from memory.",
    ]
    result.cautions += [
        "Rated current is not the conductor ampacity or the overcurrent device rating: size "
        "those by your code (for example NEC 450.3 and 240.4).",
        "Energising a transformer draws an inrush of many times rated current for a few "
        "cycles; protection must ride through it (common practice).",
        cautions.BACKFEED,
    ]
    if max(primary_v, secondary_v) > 1000.0:
        result.cautions.append(cautions.MEDIUM_VOLTAGE)
    result.cautions += list(cautions.COMMON)

    loads = [5.0 * k for k in range(31)]  # 0 to 150 % of rating, every 5 %
    result.series = {
        "title": "Line current against load",
        "x": {"label": "Load", "unit": "%", "values": loads},
        "y_axis": {"label": "Line current", "unit": "A"},
        "y": [
            {"label": "Primary", "unit": "A", "values": [primary_a * p / 100 for p in loads]},
            {"label": "Secondary", "unit": "A", "values": [secondary_a * p / 100 for p in loads]},
        ],
        "marks": [{"axis": "x", "value": 100.0, "label": "Rated load"}],
    }
    return result


CURRENTS = Calculator(
    id="transformer-currents",
    title="Transformer currents and ratio",
    summary="Full-load primary and secondary currents, voltage ratio and turns ratio from kVA "
            "and the winding voltages.",
    group="Transformers",
    inputs=(
        Input("kva", "Rating", "quantity", unit="kVA", default=75, minimum=0, min_exclusive=True,
              maximum=1_000_000, region_defaults={"iec": 500},
              help="Nameplate apparent power, e.g. 75 kVA or 1.5 MVA."),
        Input("phases", "Phases", "choice", default="3",
              choices=(("3", "Three-phase"), ("1", "Single-phase"))),
        Input("primary_v", "Primary voltage", "quantity", unit="V", default=480, minimum=1,
              maximum=800_000, region_defaults={"iec": 11000},
              suggest="voltages",
              help="Rated primary voltage; line-to-line for three-phase (e.g. 480 V, 13.8 kV)."),
        Input("secondary_v", "Secondary voltage", "quantity", unit="V", default=208, minimum=1,
              maximum=800_000, region_defaults={"iec": 400},
              suggest="voltages",
              help="Rated secondary voltage; line-to-line for three-phase (208 V for 120/208 V)."),
        Input("connection", "Winding connection", "choice", default="delta-wye",
              choices=CONNECTIONS,
              help="Three-phase only: sets the turns ratio and winding currents."),
    ),
    outputs=(
        Output("primary_a", "Primary full-load current", "A"),
        Output("secondary_a", "Secondary full-load current", "A"),
        Output("turns_ratio", "Winding turns ratio N₁/N₂", ""),
        Output("voltage_ratio", "Voltage ratio V₁/V₂", ""),
    ),
    compute=_currents_view,
)


# ==== the numbers behind the transformer family ===============================================

# IEEE C57.12.00 short-circuit categories: the largest rating [kVA] of categories I, II and III,
# single-phase and three-phase; above the last is category IV (REFERENCE_VALUES 5, read).
SHORT_CIRCUIT_CATEGORY_KVA = {1: (500, 1667, 10000), 3: (500, 5000, 30000)}

# Impedance tolerance of a two-winding transformer: ±7.5 % of the specified %Z (IEEE C57.12.00
# §9.2, read as quoted from C57.12.51). The low end gives the highest fault current.
IMPEDANCE_TOLERANCE = 0.075

# IEC 60909-0 Table 1 voltage factor c_max (from memory): 1.05 for low-voltage systems with a
# +6 % tolerance, 1.10 for +10 % and for every system above 1 kV. c = 1 is the nominal-voltage
# practice of IEEE Std 141 / IEEE Std 551 (no correction).
VOLTAGE_FACTORS = (
    ("1", "c = 1.00: nominal voltage, no correction (IEEE/ANSI practice)"),
    ("1.05", "c = 1.05: IEC 60909 c_max, low voltage with +6 % tolerance"),
    ("1.1", "c = 1.10: IEC 60909 c_max, low voltage with +10 % tolerance"),
)
C_MAX_ABOVE_1KV = 1.10
LOW_VOLTAGE_LIMIT_V = 1000.0  # IEC 60909-0 Table 1 divides low and high voltage at 1 kV

# When a network feeder's R is not known IEC 60909-0 §6.2 (from memory) takes R_Q = 0.1 X_Q:
# a source X/R of 10.
DEFAULT_SOURCE_X_R = 10.0

# No-load taps of a de-energised tap changer on the HV winding: 2 × 2.5 % above and below rated
# (IEEE C57.12.10, read). A tap is named by the primary voltage it suits: the +2.5 % tap is for a
# supply 2.5 % above rated and gives 1/1.025 of the rated secondary voltage from a rated supply.
STANDARD_TAPS_PCT = (-5.0, -2.5, 0.0, 2.5, 5.0)
TAP_CHOICES = tuple((f"{t:g}", f"{t:+g} %" if t else "0 % (rated)") for t in STANDARD_TAPS_PCT)

# Voltage band the loaded secondary should stay in [± %]. North America: ANSI C84.1 Range A at
# the service, 114-126 V on 120 V, i.e. ±5 % (from memory); IEC 60038: 230/400 V ±10 % (from
# memory). Local rules and the equipment's own tolerance may be tighter.
VOLTAGE_BAND_PCT = {"na": 5.0, "iec": 10.0}

# A winding may be run at up to 105 % of its rated voltage at rated load (IEEE C57.12.00 §4.1.6
# for liquid-filled units, C57.12.01 for dry-type; from memory). Above that the core saturates.
EXCITATION_LIMIT = 1.05

# Low-voltage insulating transformers made for buck-boost use: (name, primary half-winding [V],
# secondary half-winding [V]). Each has two primary and two secondary windings, connected in
# series or in parallel. Common practice (the usual ratings in North America, from memory).
BUCK_BOOST_WINDINGS = (
    ("120/240 × 12/24 V", 120.0, 12.0),
    ("120/240 × 16/32 V", 120.0, 16.0),
    ("240/480 × 24/48 V", 240.0, 24.0),
)
# Their usual kVA ratings (common practice, from memory).
BUCK_BOOST_KVA = (0.05, 0.1, 0.15, 0.25, 0.5, 0.75, 1, 1.5, 2, 3, 5, 7.5, 10)
BUCK_BOOST_BANKS = (
    ("single", "Single-phase: one unit"),
    ("wye", "Three-phase four-wire wye: three units, neutral connected"),
    ("open-delta", "Three-phase: two units in open delta"),
)
BANK_UNITS = {"single": 1, "wye": 3, "open-delta": 2}

# General-purpose dry-type ratings below the distribution lists [kVA], for small equipment on a
# foreign supply. Common practice (from memory).
SMALL_KVA_1PH = (0.05, 0.1, 0.15, 0.25, 0.5, 0.75, 1, 1.5, 2, 3)
SMALL_KVA_3PH = (6.0,)  # 3 and 9 kVA are already in the three-phase list

# NEMA MG 1-12.44 running tolerances of an induction motor at rated load (REFERENCE_VALUES 4a,
# read): ±10 % voltage, ±5 % frequency, and the sum of the two deviations at most 10 %.
MOTOR_VOLTAGE_TOLERANCE_PCT = 10.0
MOTOR_FREQUENCY_TOLERANCE_PCT = 5.0
MOTOR_COMBINED_TOLERANCE_PCT = 10.0

# A motor start dip of up to 15 % at the starting motor's bus is the usual design limit (common
# practice, REFERENCE_VALUES 7).
MOTOR_DIP_LIMIT_PCT = 15.0

EQUIPMENT_LOADS = (
    ("motor", "Induction motor (fan, pump, compressor, mixer)"),
    ("magnetic", "Magnetic: mains transformer, ballast, welder, solenoid"),
    ("resistive", "Resistive: heater, kettle, incandescent lamp"),
    ("electronic", "Electronic with a wide-range input (100-240 V, 50/60 Hz)"),
)
TRANSFORMER_DUTIES = (
    ("step-down", "Step-down (secondary below primary)"),
    ("step-up", "Step-up (secondary above primary)"),
    ("isolating", "Isolating 1:1 (secondary equal to primary)"),
)
RATING_SERIES = (
    ("na", "IEEE/ANSI preferred kVA (North America)"),
    ("iec", "IEC ratings (25 kVA to 10 MVA)"),
)


def phase_factor(phases):
    """√3 for three-phase, 1 for single-phase: S = k V I with V line-to-line."""
    return SQRT3 if phases == 3 else 1.0


def reflected_impedance(impedance, primary_voltage, secondary_voltage):
    """Impedance on the secondary as seen from the primary of an ideal transformer.

    Parameters
    ----------
    impedance : float or complex
        Impedance connected to the secondary [Ω] (per phase, wye-equivalent for three-phase).
    primary_voltage, secondary_voltage : float
        Rated voltages [V] (line-to-line for three-phase).

    Returns
    -------
    float or complex
        Z₁ = (V₁ / V₂)² Z₂ [Ω].

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 2.3 (impedance
    transformation through a transformer) — from memory.

    Examples
    --------
    >>> round(reflected_impedance(0.5, 480.0, 240.0), 3)
    2.0
    """
    return (primary_voltage / secondary_voltage) ** 2 * impedance


def standard_ratings(phases, series="na"):
    """Standard kVA ratings, smallest first: IEEE/ANSI by phase count ("na") or IEC ("iec")."""
    if series == "iec":
        return PREFERRED_KVA_IEC
    return PREFERRED_KVA_3PH_NA if phases == 3 else PREFERRED_KVA_1PH_NA


def next_standard_rating(apparent_power, ratings_kva):
    """Smallest rating in `ratings_kva` at or above `apparent_power`.

    Parameters
    ----------
    apparent_power : float
        Apparent power the transformer must carry [VA].
    ratings_kva : sequence of float
        Ratings to choose from [kVA], smallest first.

    Returns
    -------
    float or None
        The rating [VA], or None when the load is above the largest.

    Examples
    --------
    >>> next_standard_rating(80e3, PREFERRED_KVA_3PH_NA)
    112500.0
    """
    for kva in ratings_kva:
        if kva * 1e3 >= apparent_power * (1.0 - 1e-9):
            return kva * 1e3
    return None


def short_circuit_category(apparent_power, phases):
    """IEEE C57.12.00 short-circuit category (I to IV) of a rating [VA].

    References
    ----------
    IEEE Std C57.12.00, short-circuit categories: single-phase I 5-500, II 501-1667, III
    1668-10 000 kVA; three-phase I 15-500, II 501-5000, III 5001-30 000 kVA; IV above.

    Examples
    --------
    >>> short_circuit_category(1500e3, 3), short_circuit_category(1500e3, 1)
    ('II', 'II')
    """
    kva = apparent_power / 1e3
    for name, largest in zip(("I", "II", "III"), SHORT_CIRCUIT_CATEGORY_KVA[3 if phases == 3 else 1]):
        if kva <= largest * (1.0 + 1e-9):
            return name
    return "IV"


def motor_start_dip(locked_rotor_apparent_power, apparent_power, z_pct):
    """Voltage dip at the secondary while a motor starts across the line [%].

    Parameters
    ----------
    locked_rotor_apparent_power : float
        Locked-rotor kVA of the motor [VA] (NEC Table 430.7(B) code letter × hp).
    apparent_power : float
        Transformer rating [VA].
    z_pct : float
        Transformer impedance [%].

    Returns
    -------
    float
        ΔV ≈ S_LR / (S_LR + S_sc) × 100, with S_sc = S_T × 100 / %Z (infinite source).

    References
    ----------
    Simple dip estimate, common practice (REFERENCE_VALUES 7).

    Examples
    --------
    >>> round(motor_start_dip(100e3, 150e3, 5.0), 2)
    3.23
    """
    short_circuit = apparent_power * 100.0 / z_pct
    return 100.0 * locked_rotor_apparent_power / (locked_rotor_apparent_power + short_circuit)


# ---- fault level ------------------------------------------------------------------------------

def impedance_per_unit(z_pct, x_r):
    """Complex impedance [per unit] from its magnitude [%] and X/R.

    Examples
    --------
    >>> z = impedance_per_unit(5.0, 0.75); round(z.real, 4), round(z.imag, 4)
    (0.04, 0.03)
    """
    angle = math.atan(x_r)
    return complex(z_pct / 100.0 * math.cos(angle), z_pct / 100.0 * math.sin(angle))


def source_impedance_pct(apparent_power, source_short_circuit_power):
    """Source impedance on the transformer's rating [%]: %Z_S = 100 × S_T / S_sc.

    References
    ----------
    Finite-source method (REFERENCE_VALUES 5, read in an IAEI Magazine article: J. Phillips,
    "Short-circuit calculations using transformer and source impedance", 2018).

    Examples
    --------
    >>> round(source_impedance_pct(1.5e6, 500e6), 3)
    0.3
    """
    return 100.0 * apparent_power / source_short_circuit_power


class FaultLevel(NamedTuple):
    """Bolted fault at a transformer's secondary terminals (currents symmetrical rms [A])."""

    rated_current: float  # I_FL at the secondary [A]
    z_transformer: complex  # per unit on the rating, after K_T
    z_source: complex  # per unit on the rating, referred to the secondary (0 for infinite)
    correction: float  # K_T (1 when c = 1)
    fault_current: float  # three-phase (line-to-line for single-phase) I''k [A]
    infinite_fault_current: float  # the same with no source impedance [A]
    x_r: float  # X/R of the whole path at the fault
    kappa: float  # IEC 60909 peak factor
    peak_current: float  # i_p = κ √2 I''k [A]
    line_to_neutral_current: float  # three-phase delta-wye only: I''k1 [A] (else nan)


def source_voltage_factor(primary_voltage, voltage_factor):
    """c_Q of the feeder: 1 in the nominal-voltage method; in the IEC 60909 maximum case 1.10
    above 1 kV (Table 1, from memory), else the low-voltage c itself.

    Examples
    --------
    >>> source_voltage_factor(11000.0, 1.05), source_voltage_factor(480.0, 1.05)
    (1.1, 1.05)
    """
    if voltage_factor == 1.0:
        return 1.0
    return C_MAX_ABOVE_1KV if primary_voltage > LOW_VOLTAGE_LIMIT_V else voltage_factor


def secondary_fault(apparent_power, primary_voltage, secondary_voltage, phases, z_pct, x_r,
                    source_short_circuit_power=None, source_x_r=DEFAULT_SOURCE_X_R,
                    voltage_factor=1.0, delta_wye=False):
    """Bolted fault current at a transformer's secondary, infinite or finite source.

    A thin view over calc.network.faults on a one-transformer path, so this calculator and the
    path calculators give the same figures.

    Parameters
    ----------
    apparent_power : float
        Transformer rating S_T [VA].
    primary_voltage, secondary_voltage : float
        Rated voltages [V], line-to-line for three-phase; the secondary taken as the system's
        nominal voltage.
    phases : int
        1 or 3.
    z_pct : float
        Transformer impedance [%] on its rating.
    x_r : float
        Transformer X/R.
    source_short_circuit_power : float, optional
        Source short-circuit power S''kQ [VA] at the primary; None is an infinite source.
    source_x_r : float
        X/R of the source.
    voltage_factor : float
        c at the fault: 1 (nominal voltage, IEEE/ANSI practice), or IEC 60909 c_max (1.05 or
        1.10). Any value other than 1 is the IEC 60909 maximum case: K_T on the transformer and
        the feeder at its own c_Q (1.10 above 1 kV, else c).
    delta_wye : bool
        Three-phase delta primary, grounded-wye secondary: also the line-to-neutral fault.

    Returns
    -------
    FaultLevel

    Notes
    -----
    Per unit on (S_T, V₂): Z_T = %Z/100 ∠ atan(X/R) × K_T, Z_S = c_Q S_T / S''kQ ∠ atan(X/R)_S.
    I''k = c I_FL / |Z_S + Z_T| (I_FL = S_T / (√3 V₂), or S_T / V₂ single-phase). With c = 1 and
    equal X/R this is I_FL × 100 / (%Z_T + %Z_S). Peak i_p = κ √2 I''k with κ = 1.02 + 0.98
    e^(−3R/X) of the whole path. Line-to-neutral on a delta-wye unit: I''k1 = 3 c I_FL /
    |2 Z₁ + Z₀| with Z₁ = Z_S + Z_T and Z₀ = Z_T (the delta blocks the source's zero sequence;
    the transformer's zero-sequence impedance is taken equal to its positive-sequence one).
    calc.network scales the feeder by the fault's c; IEC 60909 §6.2 scales it by the feeder's
    own c_Q, so the source power is handed over as S''kQ × c / c_Q.

    References
    ----------
    Infinite and finite source: IEEE Std 141 method; IAEI Magazine, J. Phillips, 2018 (read,
    REFERENCE_VALUES 5). IEC 60909-0: c (Table 1), Z_Q (§6.2), K_T (§6.3.3), κ (§4.3.1.1),
    I''k1 (§4.2.1.3) — from memory.

    Examples
    --------
    >>> round(secondary_fault(1500e3, 13800.0, 480.0, 3, 5.75, 6.0).fault_current)
    31378
    """
    iec = voltage_factor != 1.0
    c_source = source_voltage_factor(primary_voltage, voltage_factor)
    transformer = network.Transformer("transformer", apparent_power, primary_voltage,
                                      secondary_voltage, z_pct, x_r,
                                      grounded_secondary=phases == 3 and delta_wye)

    def fault_at_secondary(source_power):
        source = network.Source(primary_voltage, phases, fault_va=source_power, x_r=source_x_r)
        return network.faults(network.Path(source, [transformer]), voltage_factor, iec,
                              source_voltage_factor=c_source)[1]

    fault, infinite = fault_at_secondary(source_short_circuit_power), fault_at_secondary(None)
    correction = network.transformer_correction(transformer, voltage_factor) if iec else 1.0
    z_source = 0j if source_short_circuit_power is None else impedance_per_unit(
        source_impedance_pct(apparent_power, source_short_circuit_power / c_source), source_x_r)
    line_to_neutral = math.nan
    if phases == 3 and delta_wye and fault.line_to_neutral_a is not None:
        line_to_neutral = fault.line_to_neutral_a
    return FaultLevel(full_load_current(apparent_power, secondary_voltage, phases),
                      correction * impedance_per_unit(z_pct, x_r), z_source, correction,
                      fault.three_phase_a, infinite.three_phase_a, fault.x_r,
                      network.peak_factor(fault.x_r), fault.peak_a, line_to_neutral)


# ---- regulation and taps ----------------------------------------------------------------------

def _sin_phi(power_factor, leading):
    """sin φ of a load current: positive lagging, negative leading."""
    sine = math.sqrt(max(0.0, 1.0 - power_factor * power_factor))
    return -sine if leading else sine


def regulation_approx(r_pct, x_pct, power_factor, leading=False, load_fraction=1.0):
    """Voltage regulation by the textbook formula with its second-order term [%].

    Parameters
    ----------
    r_pct, x_pct : float
        Resistance and reactance [%] on the rating (from the short-circuit test).
    power_factor : float
        Load power factor in (0, 1].
    leading : bool
        True for a leading (capacitive) load.
    load_fraction : float
        Load current as a fraction of rated current.

    Returns
    -------
    float
        ε ≈ p cos φ + q sin φ + (q cos φ − p sin φ)² / 200 with p = k %R, q = k %X; sin φ < 0
        leading. The 200 appears because p and q are in percent.

    References
    ----------
    REFERENCE_VALUES 5 (read in three textbooks); the first-order part is the usual
    ε ≈ %R cos φ + %X sin φ, e.g. GATE 2018 EE Question 11.

    Examples
    --------
    >>> round(regulation_approx(1.0, 5.0, 0.8), 4)
    3.8578
    """
    sine = _sin_phi(power_factor, leading)
    p, q = load_fraction * r_pct, load_fraction * x_pct
    return p * power_factor + q * sine + (q * power_factor - p * sine) ** 2 / 200.0


def regulation_exact(r_pct, x_pct, power_factor, leading=False, load_fraction=1.0):
    """Voltage regulation from the phasor diagram [%]: no-load voltage over loaded, minus one.

    Notes
    -----
    With the loaded secondary at rated voltage (1 per unit) and the load current k at φ, the
    no-load voltage is |1 + k (r + jx)(cos φ − j sin φ)|; ε = (|V_nl| − 1) × 100. The
    approximate formula is this to second order.

    Examples
    --------
    >>> round(regulation_exact(1.0, 5.0, 0.8), 4)
    3.8557
    """
    current = load_fraction * complex(power_factor, -_sin_phi(power_factor, leading))
    return (abs(1.0 + complex(r_pct, x_pct) / 100.0 * current) - 1.0) * 100.0


def loaded_voltage(no_load_voltage, r_pct, x_pct, power_factor, leading=False, load_fraction=1.0):
    """Secondary voltage under load [per unit] from the no-load voltage [per unit].

    The load draws a constant current k (per unit of rated) at φ from its own voltage; the
    series impedance r + jx (per unit) drops the voltage. Solved exactly by
    calc.voltage_drop.receiving_voltage (a leading load is a lagging one through −jx).

    Raises
    ------
    calc.voltage_drop.VoltageCollapse
        When no loaded voltage exists for this current.

    Examples
    --------
    >>> round(loaded_voltage(1.0, 1.0, 5.0, 0.8), 5)
    0.96142
    """
    reactance = -x_pct / 100.0 if leading else x_pct / 100.0
    return voltage_drop.receiving_voltage(no_load_voltage, load_fraction, r_pct / 100.0,
                                          reactance, power_factor)


def tap_voltage_factor(tap_pct):
    """Secondary voltage at a no-load tap relative to the rated tap: 1 / (1 + tap/100).

    Examples
    --------
    >>> round(tap_voltage_factor(-5.0), 4)
    1.0526
    """
    return 1.0 / (1.0 + tap_pct / 100.0)


def select_tap(voltage_at_tap, target, band_pct, taps=STANDARD_TAPS_PCT):
    """The smallest tap change that brings a voltage within target ± band.

    Parameters
    ----------
    voltage_at_tap : callable
        tap [%] -> voltage [V].
    target : float
        Nominal voltage [V].
    band_pct : float
        Half-width of the band [%].

    Returns
    -------
    (float, bool)
        The tap [%] and whether it is within the band. When none is, the tap that comes
        closest, and False.

    Examples
    --------
    >>> select_tap(lambda t: 200.0 * tap_voltage_factor(t), 208.0, 2.0)
    (-2.5, True)
    """
    for tap in sorted(taps, key=lambda t: (abs(t), t)):
        if abs(voltage_at_tap(tap) - target) <= band_pct / 100.0 * target * (1.0 + 1e-12):
            return tap, True
    return min(taps, key=lambda t: abs(voltage_at_tap(t) - target)), False


# ---- losses and efficiency ---------------------------------------------------------------------

def efficiency(apparent_power, no_load_loss, load_loss, load_fraction, power_factor):
    """Efficiency at a loading: output over output plus losses.

    Parameters
    ----------
    apparent_power : float
        Rating [VA].
    no_load_loss : float
        Core (no-load) loss P₀ [W], the same at every load.
    load_loss : float
        Load (copper) loss at rated current P_k [W].
    load_fraction : float
        Load as a fraction of rated current k.
    power_factor : float
        Load power factor.

    Returns
    -------
    (float, float, float)
        η [-], output P_out = k S cos φ [W] and losses P₀ + k² P_k [W].

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 2.7 (efficiency) — from
    memory.

    Examples
    --------
    >>> round(efficiency(100e3, 500.0, 2000.0, 0.5, 1.0)[0], 5)
    0.98039
    """
    output = load_fraction * apparent_power * power_factor
    losses = no_load_loss + load_fraction * load_fraction * load_loss
    return (output / (output + losses) if output > 0.0 else 0.0), output, losses


def maximum_efficiency_load(no_load_loss, load_loss):
    """Load [fraction of rated] of maximum efficiency, where load loss equals no-load loss.

    Notes
    -----
    k² P_k = P₀, so k = √(P₀ / P_k).

    Examples
    --------
    >>> maximum_efficiency_load(500.0, 2000.0)
    0.5
    """
    return math.sqrt(no_load_loss / load_loss)


def daily_energy(apparent_power, no_load_loss, load_loss, periods, energised_hours=24.0):
    """Energy delivered and lost over a daily load profile.

    Parameters
    ----------
    apparent_power, no_load_loss, load_loss : float
        As for `efficiency`.
    periods : iterable of (float, float, float)
        (load fraction, power factor, hours) for each part of the day; the rest of the day the
        transformer is energised at no load.
    energised_hours : float
        Hours a day the transformer is energised (the core loss runs all that time).

    Returns
    -------
    (float, float)
        Output and losses [W·h].

    Notes
    -----
    All-day efficiency = output / (output + losses) over the 24 hours.

    References
    ----------
    M. A. Salam, *Fundamentals of Electrical Machines*, 2nd ed. (Narosa), Example 3.10
    (all-day efficiency from a daily load cycle).

    Examples
    --------
    >>> daily_energy(100e3, 500.0, 2000.0, [(1.0, 1.0, 4.0), (0.5, 1.0, 8.0)])
    (800000.0, 24000.0)
    """
    output = copper = 0.0
    for fraction, power_factor, hours in periods:
        output += fraction * apparent_power * power_factor * hours
        copper += fraction * fraction * load_loss * hours
    return output, no_load_loss * energised_hours + copper


# ---- buck-boost -------------------------------------------------------------------------------

class BuckBoost(NamedTuple):
    """One standard winding combination connected as an autotransformer."""

    windings: str  # the transformer's name, e.g. "120/240 × 12/24 V"
    shunt_v: float  # rated voltage of the primary connection across the supply [V]
    series_v: float  # rated voltage of the secondary connection in series with the line [V]
    mode: str  # "boost" (series winding aiding) or "buck" (opposing)
    output_v: float  # output across the unit at the given supply [V]


def buck_boost_output(supply_voltage, shunt_voltage, series_voltage, mode):
    """Output of a two-winding transformer connected as an autotransformer [V].

    Notes
    -----
    The primary (shunt) winding sits across the supply; the secondary (series) winding adds
    its voltage (boost, additive polarity) or subtracts it (buck, subtractive polarity):
    V_out = V_in (1 ± V_series / V_shunt).

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 2.9 (the autotransformer)
    — from memory.

    Examples
    --------
    >>> round(buck_boost_output(208.0, 240.0, 24.0, "boost"), 1)
    228.8
    """
    ratio = series_voltage / shunt_voltage
    return supply_voltage * (1.0 + ratio if mode == "boost" else 1.0 - ratio)


def buck_boost_combinations(supply_voltage):
    """Every standard combination whose primary is not over-excited at `supply_voltage`.

    Each transformer in BUCK_BOOST_WINDINGS has its primaries in parallel or series and its
    secondaries in parallel or series; a primary connection is usable while the supply is at
    most 105 % of its rating (EXCITATION_LIMIT).

    Examples
    --------
    >>> len(buck_boost_combinations(208.0))
    16
    """
    found = []
    for name, primary, secondary in BUCK_BOOST_WINDINGS:
        for shunt in (primary, 2.0 * primary):
            if supply_voltage > EXCITATION_LIMIT * shunt * (1.0 + 1e-12):
                continue
            for series in (secondary, 2.0 * secondary):
                for mode in ("boost", "buck"):
                    found.append(BuckBoost(name, shunt, series, mode,
                                           buck_boost_output(supply_voltage, shunt, series, mode)))
    return found


def buck_boost_unit_rating(series_voltage, load_current):
    """kVA a buck-boost unit needs [VA]: the series winding's rated voltage × the load current.

    The series winding carries the whole line current, so its current rating (unit kVA / its
    rated voltage) must reach the load current: kVA_unit = V_series × I_L.

    References
    ----------
    Autotransformer theory (REFERENCE_VALUES 5, from memory): kVA_xfmr = V_bb × I_L / 1000.

    Examples
    --------
    >>> buck_boost_unit_rating(24.0, 40.0)
    960.0
    """
    return series_voltage * load_current


# ---- equipment on a foreign supply -------------------------------------------------------------

def flux_ratio(applied_voltage, applied_frequency, rated_voltage, rated_frequency):
    """Core flux relative to rated: (V / f) / (V_rated / f_rated).

    Notes
    -----
    From E = 4.44 f N Φ_max, the flux of a transformer or motor is proportional to V/f.

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 2.2 — from memory.

    Examples
    --------
    >>> flux_ratio(120.0, 50.0, 120.0, 60.0)
    1.2
    """
    return (applied_voltage / applied_frequency) / (rated_voltage / rated_frequency)


# ==== the calculators ==========================================================================

SOURCE_RATINGS = (
    "Preferred ratings: IEEE/ANSI C57.12 series (North America); IEC 60076 and EU Regulation "
    "548/2014 Annex I Table I.1 ratings (IEC practice) — from memory for IEC."
)
SOURCE_IDEAL = (
    "Ideal-transformer relations (ratios, reflected impedance, power balance): S. J. Chapman, "
    "Electric Machinery Fundamentals, 5th ed., sections 2.3 and 2.10 — from memory."
)
SOURCE_FAULT = (
    "Fault current by summed per-unit impedance, I = I_FL × 100 / (%Z_T + %Z_S) with %Z_S = 100 "
    "S_T / S_sc: IEEE Std 141 method as set out in IAEI Magazine (J. Phillips, 2018, 'Short-"
    "circuit calculations using transformer and source impedance'); the impedances are summed "
    "as phasors here."
)
SOURCE_IEC60909 = (
    "IEC 60909-0: voltage factor c (Table 1), network feeder Z_Q = c U² / S''kQ (§6.2), "
    "transformer correction K_T = 0.95 c_max / (1 + 0.6 x_T) (§6.3.3), peak factor κ = 1.02 + "
    "0.98 e^(−3R/X) (§4.3.1.1), line-to-earth I''k1 (§4.2.1.3) — from memory."
)
SOURCE_REGULATION = (
    "Regulation ε ≈ %R cos φ + %X sin φ + (%X cos φ − %R sin φ)² / 200 (textbook formula with "
    "its second-order term); exact value from the phasor diagram of the series impedance."
)
SOURCE_TAPS = "No-load taps 2 × 2.5 % above and below rated: IEEE C57.12.10."
CAUTION_TAPS = (
    "Change a de-energised (no-load) tap changer only with the transformer switched off, locked "
    "out and verified dead on both windings; set every phase to the same tap, and check the "
    "nameplate: some label taps by position number or letter rather than by percent."
)
CAUTION_AUTOTRANSFORMER = (
    "Connected as an autotransformer, a buck-boost unit gives no isolation: the output is "
    "bonded to the supply, and a fault in the series winding puts the supply voltage on the "
    "load side."
)


def _ideal_relations(result, primary_v, secondary_v, phases, apparent_power, output_power=None,
                     losses=0.0, connection="delta-wye", show_turns=True):
    """The ideal-transformer steps every transformer result carries (the winding turns ratio
    only where the connection is known)."""
    ratio = primary_v / secondary_v
    i1 = full_load_current(apparent_power, primary_v, phases)
    i2 = full_load_current(apparent_power, secondary_v, phases)
    result.step("Ideal transformer: the voltage ratio, and the currents in the inverse ratio",
                "a = V₁ / V₂ = I₂ / I₁",
                f"= {fq(primary_v, 'V')} / {fq(secondary_v, 'V')} = {_ratio_display(ratio)}; at "
                f"{fq(apparent_power, 'VA')}: I₁ = {fq(i1, 'A')}, I₂ = {fq(i2, 'A')}")
    if phases == 3 and show_turns:
        turns = turns_ratio(primary_v, secondary_v, 3, connection)
        result.step(f"Winding turns ratio, {connection} (a delta winding has the line voltage, a "
                    "wye winding the line voltage / √3)", "N₁ / N₂",
                    f"= {_ratio_display(turns)}")
    load_z = secondary_v * secondary_v / apparent_power
    per_phase = " (per phase, wye-equivalent)" if phases == 3 else ""
    result.step("Impedance reflected through the ratio squared: the rated load impedance seen "
                f"from the primary{per_phase}", "Z₁ = a² Z₂, Z₂ = V₂² / S",
                f"= {ratio:.4g}² × {fq(load_z, 'ohm')} = "
                f"{fq(reflected_impedance(load_z, primary_v, secondary_v), 'ohm')}")
    if output_power is None:
        output_power, text = apparent_power, "Power balance at rated load, unity power factor"
    else:
        text = "Power balance"
    loss_text = fq(losses, "W") if losses else "0 W (ideal)"
    result.step(f"{text}: power in = power out + losses", "P₁ = P₂ + P_loss",
                f"= {fq(output_power, 'W')} + {loss_text} = {fq(output_power + losses, 'W')}")


def _connection_inputs():
    return Input("connection", "Winding connection", "choice", default="delta-wye",
                 choices=CONNECTIONS, advanced=True,
                 help="Three-phase only: sets the turns ratio (and, for the fault level, whether "
                      "there is a line-to-neutral fault to find).")


def _voltage_input(name, label, default, iec, help_text, optional=False):
    return Input(name, label, "quantity", unit="V", default=default, minimum=1,
                 maximum=800_000, region_defaults={"iec": iec},
                 suggest="voltages", optional=optional, help=help_text)


PHASES_INPUT = Input("phases", "Phases", "choice", default="3",
                     choices=(("3", "Three-phase"), ("1", "Single-phase")))


# ---- transformer-size --------------------------------------------------------------------------

LOAD_FIELDS = ("load_kva", "load_kw", "load_a")


def _the_one_given(inputs, names, missing):
    """The one field of `names` that is filled in; InputError if none or more than one is."""
    given = [name for name in names if inputs.get(name) is not None]
    if not given:
        raise InputError(names[0], None, missing)
    if len(given) > 1:
        raise InputError(given[1], inputs[given[1]], f"give only one of {', '.join(names)} "
                         f"({given[0]} and {given[1]} are both filled in; leave one blank)")
    return given[0]


def _load_apparent_power(inputs, phases, voltage):
    """(apparent power [VA], the field it came from, the step's substituted text)."""
    name = _the_one_given(inputs, LOAD_FIELDS, "give the load: its kVA, or its kW (with its "
                          "power factor), or its current at the secondary voltage")
    value = inputs[name]
    if name == "load_kva":
        return value, name, f"= {fq(value, 'VA')} (given)"
    if name == "load_kw":
        apparent = value / inputs["pf"]
        return apparent, name, f"= P / cos φ = {fq(value, 'W')} / {inputs['pf']:g} = {fq(apparent, 'VA')}"
    apparent = phase_factor(phases) * voltage * value
    k = "√3 × " if phases == 3 else ""
    return apparent, name, (f"= {k}V₂ × I = {k}{fq(voltage, 'V')} × {fq(value, 'A')} = "
                            f"{fq(apparent, 'VA')}")


def _check_duty(duty, primary_v, secondary_v):
    """Refuse voltages that contradict the step-down / step-up / isolating label."""
    v1, v2 = fq(primary_v, "V"), fq(secondary_v, "V")
    if duty == "step-down" and secondary_v >= primary_v:
        raise InputError("secondary_v", secondary_v, f"a step-down transformer's secondary must be "
                         f"below its primary ({v2} is not below {v1}); swap the voltages or "
                         "choose step-up")
    if duty == "step-up" and secondary_v <= primary_v:
        raise InputError("secondary_v", secondary_v, f"a step-up transformer's secondary must be "
                         f"above its primary ({v2} is not above {v1}); swap the voltages or "
                         "choose step-down")
    if duty == "isolating" and not math.isclose(primary_v, secondary_v, rel_tol=1e-9):
        raise InputError("secondary_v", secondary_v, f"an isolating (1:1) transformer has equal "
                         f"voltages ({v1} and {v2} differ); choose step-down or step-up")


def _size_view(inputs):
    phases = int(inputs["phases"])
    primary_v, secondary_v = inputs["primary_v"], inputs["secondary_v"]
    _check_duty(inputs["duty"], primary_v, secondary_v)
    load, given, load_text = _load_apparent_power(inputs, phases, secondary_v)
    growth = inputs["growth_pct"]
    series = inputs["ratings"]
    table = standard_ratings(phases, series)
    design = load * (1.0 + growth / 100.0)
    rating = next_standard_rating(design, table)
    if rating is None:
        raise InputError(given, inputs[given], f"the design load {fq(design, 'VA')} is above the "
                         f"largest rating in the list ({fq(table[-1] * 1e3, 'VA')}); split the "
                         "load between transformers or specify a power transformer")
    result = Result()
    result.step("Load apparent power", "S_load", load_text)
    result.step(f"Design load with a {growth:g} % growth margin", "S_design = S_load × (1 + m)",
                f"= {fq(load, 'VA')} × {1 + growth / 100:g} = {fq(design, 'VA')}")
    series_name = dict(RATING_SERIES)[series]
    result.step(f"Next standard rating at or above it ({series_name})", "S_T ≥ S_design",
                f"= {fq(rating, 'VA')}")

    motor = inputs["motor_lr_kva"]
    z_pct, dip_limit = inputs["z_pct"], inputs["max_dip_pct"]
    dip = None
    if motor is not None:
        dip = motor_start_dip(motor, rating, z_pct)
        if dip > dip_limit:
            larger = [kva * 1e3 for kva in table if kva * 1e3 > rating
                      and motor_start_dip(motor, kva * 1e3, z_pct) <= dip_limit]
            result.step(f"Motor start: {fq(motor, 'VA')} locked-rotor through {fq(rating, 'VA')} "
                        f"at {z_pct:g} % dips the voltage more than {dip_limit:g} %",
                        "ΔV ≈ S_LR / (S_LR + S_T × 100 / %Z)", f"= {dip:.3g} %")
            if larger:
                rating = larger[0]
                dip = motor_start_dip(motor, rating, z_pct)
                result.step("Sized up for motor starting: the smallest rating that holds the dip",
                            f"ΔV ≤ {dip_limit:g} %", f"S_T = {fq(rating, 'VA')}, ΔV = {dip:.3g} %")
        else:
            result.step(f"Motor start dip through {fq(rating, 'VA')} at {z_pct:g} %",
                        "ΔV ≈ S_LR / (S_LR + S_T × 100 / %Z)", f"= {dip:.3g} %")

    loading = 100.0 * load / rating
    primary_a = full_load_current(rating, primary_v, phases)
    secondary_a = full_load_current(rating, secondary_v, phases)
    result.output("kva", rating)
    result.output("loading_pct", loading)
    result.output("primary_a", primary_a)
    result.output("secondary_a", secondary_a)
    result.output("load_va", load)
    result.output("design_va", design)
    if dip is not None:
        result.output("motor_dip_pct", dip)
    result.step("Loading of the chosen rating (without the margin)", "S_load / S_T × 100",
                f"= {fq(load, 'VA')} / {fq(rating, 'VA')} × 100 = {loading:.3g} %")
    k = "√3 × " if phases == 3 else ""
    result.step("Full-load currents of the chosen rating", f"I = S_T / ({k}V)",
                f"I₁ = {fq(primary_a, 'A')}, I₂ = {fq(secondary_a, 'A')}")
    _ideal_relations(result, primary_v, secondary_v, phases, rating,
                     connection=inputs["connection"])

    result.check("loading", "pass",
                 f"The load is {loading:.3g} % of {fq(rating, 'VA')} ({100 * design / rating:.3g} "
                 f"% with the {growth:g} % margin); a transformer may carry its rating "
                 "continuously in its rated ambient.")
    category = short_circuit_category(rating, phases)
    result.check("short_circuit_category", "pass",
                 f"{fq(rating, 'VA')} {'three' if phases == 3 else 'single'}-phase is IEEE "
                 f"C57.12.00 short-circuit category {category}; its through-fault limits are "
                 "those of that category.")
    if dip is not None:
        ok = dip <= dip_limit
        result.check("motor_start", "pass" if ok else "warn",
                     f"Estimated start dip {dip:.3g} % at the secondary (limit {dip_limit:g} %, a "
                     "common design figure; infinite source, so the real dip is larger)"
                     + ("." if ok else "; no listed rating holds it: use a reduced-voltage "
                        "starter, a soft starter or a drive."))
    if inputs["nonlinear"]:
        result.check("nonlinear_load", "warn",
                     "Non-linear load (drives, rectifiers, LED drivers, IT equipment): harmonic "
                     "currents add eddy-current and stray loss, so a transformer runs hotter than "
                     "its kVA suggests. Specify a K-factor rated unit or derate by IEEE C57.110 "
                     "(from memory), and size the neutral for triplen harmonics.")

    result.assumptions += [
        f"The load is {'a balanced three-phase' if phases == 3 else 'a single-phase'} load at the "
        "secondary; kW are converted at the stated power factor, amps at the secondary voltage.",
        f"Growth margin {growth:g} %: spare capacity of 20-25 % is common practice.",
        "Continuous duty in the rated ambient (30 °C average, 40 °C maximum for IEEE and IEC "
        "ratings, from memory); a hotter room or poor ventilation needs derating.",
    ]
    if motor is None:
        result.assumptions.append("No motor starting considered: give the largest motor's "
                                  "locked-rotor kVA (code letter × hp) to check the dip.")
    else:
        result.assumptions.append(f"Motor dip estimated with an assumed {z_pct:g} % impedance and "
                                  "an infinite source (common practice).")
    result.sources += [SOURCE_RATINGS,
                       "IEEE C57.12.00 short-circuit categories (read, REFERENCE_VALUES 5).",
                       "Motor start dip ΔV ≈ S_LR / (S_LR + S_sc): common practice.",
                       SOURCE_IDEAL]
    result.cautions += [
        "Size the primary and secondary conductors and overcurrent protection by your code (for "
        "example NEC 450.3, 240.21(C)); they are not the full-load currents shown.",
        "Motor starting and non-linear loads are reasons to size up: check both before ordering.",
        cautions.BACKFEED,
    ]
    if max(primary_v, secondary_v) > LOW_VOLTAGE_LIMIT_V:
        result.cautions.append(cautions.MEDIUM_VOLTAGE)
    result.cautions += list(cautions.COMMON)
    result.series = {
        "title": "Loading of each standard rating",
        "x": {"label": "Rating", "unit": "kVA", "values": [float(kva) for kva in table]},
        "y": [{"label": "Load / rating", "unit": "%", "values": [100.0 * load / (kva * 1e3)
                                                                 for kva in table]}],
        "marks": [{"axis": "y", "value": 100.0, "label": "Full load"},
                  {"axis": "x", "value": rating / 1e3, "label": "Chosen"}],
    }
    return result


SIZE = Calculator(
    id="transformer-size",
    title="Transformer size",
    summary="The next standard kVA rating for a load with a growth margin, its loading and its "
            "full-load currents; motor starting and non-linear loads as reasons to size up.",
    group="Transformers",
    inputs=(
        Input("load_kva", "Load apparent power", "quantity", unit="kVA", default=60,
              optional=True, minimum=0.001, maximum=1_000_000,
              region_defaults={"iec": 350},
              help="The load in kVA; or leave blank and give kW or amps below."),
        Input("load_kw", "Load real power (instead of kVA)", "quantity", unit="kW", optional=True,
              minimum=0.001, maximum=1_000_000,
              help="With the power factor below; the kVA field must be blank."),
        Input("load_a", "Load current (instead of kVA)", "quantity", unit="A", optional=True,
              minimum=0.001, maximum=200_000,
              help="Line current at the secondary voltage; the kVA field must be blank."),
        Input("pf", "Power factor (for kW)", "quantity", unit="", default=0.85, minimum=0.05,
              maximum=1),
        PHASES_INPUT,
        _voltage_input("primary_v", "Primary voltage", 480, 11000,
                       "Line-to-line for three-phase (480 V, 13.8 kV, 11 kV)."),
        _voltage_input("secondary_v", "Secondary voltage", 208, 400,
                       "Line-to-line for three-phase (208 V for 120/208 V, 400 V for 230/400 V)."),
        Input("duty", "Transformer", "choice", default="step-down", choices=TRANSFORMER_DUTIES,
              help="Checks that the voltages are the right way round."),
        Input("growth_pct", "Growth margin", "quantity", unit="%", default=25, minimum=0,
              maximum=200, help="Spare capacity for future load (20-25 % is common practice)."),
        Input("ratings", "Standard ratings", "choice", default="na", choices=RATING_SERIES,
              region_defaults={"iec": "iec"}),
        Input("nonlinear", "Mostly non-linear load (drives, rectifiers, IT)", "flag",
              default=False),
        Input("motor_lr_kva", "Largest motor's locked-rotor kVA", "quantity", unit="kVA",
              optional=True, minimum=0.001, maximum=1_000_000, advanced=True,
              help="Code letter kVA/hp × hp (NEC Table 430.7(B)); blank: no motor check."),
        Input("z_pct", "Assumed impedance (for the motor dip)", "quantity", unit="%",
              default=5.75, minimum=0, min_exclusive=True, maximum=30, advanced=True,
              region_defaults={"iec": 6}, help="Nameplate %Z if known."),
        Input("max_dip_pct", "Motor start dip limit", "quantity", unit="%",
              default=MOTOR_DIP_LIMIT_PCT,
              minimum=0, min_exclusive=True, maximum=50, advanced=True),
        _connection_inputs(),
    ),
    outputs=(
        Output("kva", "Standard rating", "VA"),
        Output("loading_pct", "Loading of that rating", "%"),
        Output("primary_a", "Primary full-load current", "A"),
        Output("secondary_a", "Secondary full-load current", "A"),
        Output("load_va", "Load apparent power", "VA"),
        Output("design_va", "Design load with margin", "VA"),
        Output("motor_dip_pct", "Motor start dip", "%"),
    ),
    compute=_size_view,
)


# ---- transformer-fault-current -----------------------------------------------------------------

def _source_power(inputs, phases):
    """(source short-circuit power [VA] or None, the step text or None)."""
    mva, fault_a = inputs["source_mva"], inputs["source_fault_a"]
    if mva is not None and fault_a is not None:
        raise InputError("source_fault_a", fault_a, "give the source as short-circuit MVA or as "
                         "available fault current, not both (leave one blank)")
    if fault_a is not None:
        power = phase_factor(phases) * inputs["primary_v"] * fault_a
        k = "√3 × " if phases == 3 else ""
        return power, (f"= {k}V₁ × I_sc = {k}{fq(inputs['primary_v'], 'V')} × "
                       f"{fq(fault_a, 'A')} = {fq(power, 'VA')}")
    if mva is not None:
        return mva, f"= {fq(mva, 'VA')} (given)"
    return None, None


def _fault_view(inputs):
    phases = int(inputs["phases"])
    apparent_power = inputs["kva"]
    primary_v, secondary_v = inputs["primary_v"], inputs["secondary_v"]
    z_pct, x_r = inputs["z_pct"], inputs["x_r"]
    c = float(inputs["voltage_factor"])
    iec = c != 1.0
    c_source = source_voltage_factor(primary_v, c)
    delta_wye = phases == 3 and inputs["connection"] == "delta-wye"
    source, source_text = _source_power(inputs, phases)
    source_x_r = inputs["source_x_r"]
    level = secondary_fault(apparent_power, primary_v, secondary_v, phases, z_pct, x_r, source,
                            source_x_r, c, delta_wye)
    low_z = secondary_fault(apparent_power, primary_v, secondary_v, phases,
                            z_pct * (1 - IMPEDANCE_TOLERANCE), x_r, source, source_x_r, c,
                            delta_wye)
    if not all(math.isfinite(value) for value in (low_z.infinite_fault_current,
                                                  low_z.peak_current)):
        raise InputError("z_pct", z_pct, f"{z_pct:g} % is too small to give a finite fault "
                         "current here; enter the nameplate impedance (more than 0 and at most "
                         "30 %)")
    result = Result()
    result.output("secondary_a", level.rated_current)
    result.output("fault_a", level.fault_current)
    result.output("peak_a", level.peak_current)
    result.output("fault_infinite_a", level.infinite_fault_current)
    if delta_wye:
        result.output("fault_ln_a", level.line_to_neutral_current)
    result.output("fault_low_z_a", low_z.fault_current)
    result.output("fault_x_r", level.x_r)
    result.output("kappa", level.kappa)
    result.output("source_z_pct", 100.0 * abs(level.z_source))

    k = "√3 × " if phases == 3 else ""
    result.step("Secondary full-load current", f"I_FL = S_T / ({k}V₂)",
                f"= {fq(apparent_power, 'VA')} / ({k}{fq(secondary_v, 'V')}) = "
                f"{fq(level.rated_current, 'A')}")
    z_t = impedance_per_unit(z_pct, x_r)
    result.step(f"Transformer impedance on its rating, X/R = {x_r:g}",
                "R_T = Z cos(atan X/R), X_T = Z sin(atan X/R)",
                f"= {100 * z_t.real:.4g} % + j{100 * z_t.imag:.4g} %")
    if iec:
        result.step("IEC 60909 transformer correction (network transformer)",
                    "K_T = 0.95 c_max / (1 + 0.6 x_T)",
                    f"= 0.95 × {c:g} / (1 + 0.6 × {z_t.imag:.4g}) = {level.correction:.4f}")
    if source is None:
        result.step("Infinite source: no impedance ahead of the transformer (the upper bound)",
                    "Z_S = 0", "= 0 %")
    else:
        if inputs["source_fault_a"] is not None:
            result.step("Source short-circuit power from the available fault current",
                        f"S_sc = {k}V₁ × I_sc", source_text)
        cq = f"{c_source:g} × " if iec else ""
        result.step(f"Source impedance on the transformer's rating, X/R = {source_x_r:g}"
                    + (f" (c_Q = {c_source:g})" if iec else ""),
                    "%Z_S = 100 × " + ("c_Q × " if iec else "") + "S_T / S_sc",
                    f"= 100 × {cq}{fq(apparent_power, 'VA')} / {fq(source, 'VA')} = "
                    f"{100 * abs(level.z_source):.4g} % = {100 * level.z_source.real:.4g} % + "
                    f"j{100 * level.z_source.imag:.4g} %")
    z_total = level.z_source + level.z_transformer
    result.step("Impedances summed as phasors (in series)", "Z = Z_S + " +
                ("K_T Z_T" if iec else "Z_T"),
                f"= {100 * z_total.real:.4g} % + j{100 * z_total.imag:.4g} %, |Z| = "
                f"{100 * abs(z_total):.4g} %")
    phase_word = "three-phase" if phases == 3 else "line-to-line (full secondary)"
    cf = f"{c:g} × " if iec else ""
    result.step(f"Bolted {phase_word} fault current", "I''k = " + ("c × " if iec else "") +
                "I_FL × 100 / |Z%|",
                f"= {cf}{fq(level.rated_current, 'A')} × 100 / {100 * abs(z_total):.4g} = "
                f"{fq(level.fault_current, 'A')}")
    result.step("The same with an infinite source (upper bound)",
                "I''k,∞ = " + ("c × " if iec else "") + "I_FL × 100 / |Z_T%|",
                f"= {fq(level.infinite_fault_current, 'A')}")
    result.step("X/R at the secondary, peak factor and peak asymmetrical current",
                "κ = 1.02 + 0.98 e^(−3R/X); i_p = κ √2 I''k",
                f"X/R = {level.x_r:.3g}; κ = {level.kappa:.4f}; i_p = {level.kappa:.4f} × √2 × "
                f"{fq(level.fault_current, 'A')} = {fq(level.peak_current, 'A')}")
    if delta_wye:
        result.step("Line-to-neutral fault on the grounded-wye secondary (delta primary: the "
                    "source's zero sequence is blocked; Z₀ of the transformer taken = Z₁)",
                    "I''k1 = 3 " + ("c " if iec else "") + "I_FL / |2 Z₁ + Z₀|",
                    f"= {fq(level.line_to_neutral_current, 'A')}")
    result.step(f"Impedance at its −{100 * IMPEDANCE_TOLERANCE:g} % tolerance (IEEE C57.12.00 §9.2): "
                "the most fault current a unit of this nameplate can give",
                f"%Z × {1 - IMPEDANCE_TOLERANCE:g}", f"= {z_pct * (1 - IMPEDANCE_TOLERANCE):.4g} % → "
                f"{fq(low_z.fault_current, 'A')}")
    _ideal_relations(result, primary_v, secondary_v, phases, apparent_power,
                     connection=inputs["connection"])

    category = short_circuit_category(apparent_power, phases)
    result.check("short_circuit_category", "pass",
                 f"IEEE C57.12.00 short-circuit category {category}: the transformer is built to "
                 "withstand its own through-fault current for the duration that category sets.")
    if not 1.0 <= z_pct <= 15.0:
        result.check("impedance", "warn",
                     f"{z_pct:g} % is unusual for a distribution transformer (typically 2-10 %, "
                     "common practice); check the nameplate.")
    rating = inputs["device_rating_a"]
    if rating is not None:
        ok = low_z.fault_current <= rating
        result.check("device_rating", "pass" if ok else "fail",
                     f"Fault current up to {fq(low_z.fault_current, 'A')} (at the −7.5 % impedance "
                     f"tolerance) against the equipment's {fq(rating, 'A')} short-circuit "
                     "rating" + (": within it." if ok else ": the rating is too low (NEC 110.9, "
                                 "110.10)."))
    if iec and phases == 1:
        result.check("iec_single_phase", "warn",
                     "IEC 60909 is written for three-phase systems; c and K_T are applied to "
                     "this single-phase unit by analogy.")
    if phases == 3 and not delta_wye:
        result.step("No line-to-neutral figure for this connection: it needs the zero-sequence "
                    "data of the source and transformer", "—", "—")

    result.assumptions += [
        "Bolted (zero-impedance) fault at the secondary terminals; no cable, no arc resistance.",
        "No motor contribution: running motors add roughly 4 × their full-load current in the "
        "first cycles (common practice); add it, or use a full study, where motors are large.",
        "The secondary voltage is the system's nominal voltage; the transformer is on its rated "
        "tap.",
    ]
    if iec:
        result.assumptions.append(
            f"IEC 60909 maximum case: c = {c:g} at the fault, c_Q = {c_source:g} for the source, "
            f"K_T = {level.correction:.4f} on the transformer.")
    else:
        result.assumptions.append("Nominal-voltage method (c = 1, no correction factors), as "
                                  "IEEE Std 141 and the per-unit method use.")
    if source is None:
        result.assumptions.append("Infinite source: the utility can supply unlimited fault power, "
                                  "so the result is the upper bound; the utility's figure gives "
                                  "a lower, truer one.")
    result.sources += [SOURCE_FAULT, SOURCE_IEC60909,
                       "Impedance tolerance ±7.5 %: IEEE C57.12.00 §9.2 (read as quoted).",
                       "IEEE C57.12.00 short-circuit categories (read).", SOURCE_IDEAL]
    result.cautions += [
        "Equipment at this point must be rated for the fault current (NEC 110.9, 110.10; "
        "IEC 61439): mark the available fault current where your code requires it (NEC 110.24).",
        "Arc-flash incident energy is a separate study (IEEE 1584); a lower fault current can "
        "give a higher incident energy through a slower protective device.",
        cautions.BACKFEED,
    ]
    if max(primary_v, secondary_v) > LOW_VOLTAGE_LIMIT_V:
        result.cautions.append(cautions.MEDIUM_VOLTAGE)
    result.cautions += list(cautions.COMMON)

    strengths = [10.0 * 10 ** (k / 10) for k in range(31)]  # 10 MVA to 10 GVA, ten a decade
    curve = [secondary_fault(apparent_power, primary_v, secondary_v, phases, z_pct, x_r, s * 1e6,
                             source_x_r, c).fault_current for s in strengths]
    marks = [{"axis": "y", "value": level.infinite_fault_current, "label": "Infinite source"}]
    if source is not None:
        marks.append({"axis": "x", "value": source / 1e6, "label": "This source"})
    result.series = {
        "title": "Secondary fault current against source strength",
        "x": {"label": "Source short-circuit power", "unit": "MVA", "values": strengths},
        "y": [{"label": "Fault current", "unit": "A", "values": curve}],
        "marks": marks,
    }
    return result


FAULT_CURRENT = Calculator(
    id="transformer-fault-current",
    title="Transformer fault current",
    summary="Bolted fault current at a transformer's secondary for an infinite or a finite "
            "source, X/R, peak asymmetrical current (IEC 60909 κ) and the line-to-neutral fault.",
    group="Transformers",
    inputs=(
        Input("kva", "Rating", "quantity", unit="kVA", default=1500, minimum=0.001,
              maximum=1_000_000, region_defaults={"iec": 1000},
              help="Nameplate kVA (the self-cooled rating)."),
        PHASES_INPUT,
        _voltage_input("secondary_v", "Secondary voltage", 480, 400,
                       "Line-to-line for three-phase (480 V, 208 V, 400 V)."),
        Input("z_pct", "Impedance", "quantity", unit="%", default=5.75, minimum=0,
              min_exclusive=True, maximum=30, region_defaults={"iec": 6},
              help="Nameplate %Z (impedance voltage), more than 0 and at most 30 %."),
        Input("x_r", "Transformer X/R", "quantity", unit="", default=6, minimum=0.1, maximum=100,
              region_defaults={"iec": 8},
              help="From the test report; typically 3-10 for distribution transformers."),
        Input("source_mva", "Source short-circuit power", "quantity", unit="MVA", optional=True,
              minimum=0.001, maximum=1_000_000,
              help="At the primary, from the utility; blank means an infinite source."),
        Input("source_fault_a", "Or available fault current at the primary", "quantity",
              unit="kA", optional=True, minimum=0.001, maximum=1000,
              help="The utility's three-phase figure; needs the primary voltage."),
        Input("source_x_r", "Source X/R", "quantity", unit="", default=10, minimum=0.1,
              maximum=100, help="10 when unknown (IEC 60909 takes R = 0.1 X)."),
        _voltage_input("primary_v", "Primary voltage", 13800, 11000,
                       "Line-to-line for three-phase; used with the available fault current."),
        Input("voltage_factor", "Voltage factor c", "choice", default="1",
              choices=VOLTAGE_FACTORS, region_defaults={"iec": "1.1"},
              help="1 for the nominal-voltage method; IEC 60909 c_max also applies K_T."),
        _connection_inputs(),
        Input("device_rating_a", "Equipment short-circuit rating", "quantity", unit="kA",
              optional=True, minimum=0, min_exclusive=True, maximum=1000, advanced=True,
              help="Interrupting or withstand rating of the equipment at the secondary."),
    ),
    outputs=(
        Output("secondary_a", "Secondary full-load current", "A"),
        Output("fault_a", "Fault current at the secondary", "A"),
        Output("peak_a", "Peak asymmetrical current", "A"),
        Output("fault_infinite_a", "Fault current, infinite source", "A"),
        Output("fault_ln_a", "Line-to-neutral fault current", "A"),
        Output("fault_low_z_a", "Fault current at −7.5 % impedance tolerance", "A"),
        Output("fault_x_r", "X/R at the secondary", ""),
        Output("kappa", "Peak factor κ", ""),
        Output("source_z_pct", "Source impedance on the transformer rating", "%"),
    ),
    compute=_fault_view,
)


# ---- transformer-regulation --------------------------------------------------------------------

def _impedance_components(inputs):
    """(%R, %X, step text or None): the given %R and %X, or both from %Z and X/R."""
    z_pct, x_r = inputs["z_pct"], inputs["x_r"]
    if z_pct is None and x_r is None:
        return inputs["r_pct"], inputs["x_pct"], None
    if z_pct is None:
        raise InputError("z_pct", None, "give %Z together with X/R (or clear X/R to use %R and "
                         "%X)")
    if x_r is None:
        raise InputError("x_r", None, "give X/R together with %Z (or clear %Z to use %R and %X)")
    z = impedance_per_unit(z_pct, x_r)
    r_pct, x_pct = 100.0 * z.real, 100.0 * z.imag
    return r_pct, x_pct, (f"%R = {z_pct:g} / √(1 + {x_r:g}²) = {r_pct:.4g} %, %X = {x_r:g} × %R = "
                          f"{x_pct:.4g} % (the %R and %X fields are not used)")


def _tap_name(tap):
    return f"{tap:+g} % tap" if tap else "rated tap"


def _regulation_view(inputs):
    r_pct, x_pct, from_z = _impedance_components(inputs)
    pf, leading = inputs["pf"], inputs["leading"]
    load = inputs["load_pct"] / 100.0
    secondary_v, primary_v = inputs["secondary_v"], inputs["primary_v"]
    supply = inputs["supply_pct"] / 100.0
    present = float(inputs["present_tap"])
    band = inputs["band_pct"]
    system_v = inputs["system_v"] if inputs["system_v"] is not None else secondary_v

    def loaded_at(tap, fraction=load):
        try:
            return secondary_v * loaded_voltage(supply * tap_voltage_factor(tap), r_pct, x_pct,
                                                pf, leading, fraction)
        except voltage_drop.VoltageCollapse:
            raise InputError("load_pct", inputs["load_pct"], "no steady voltage exists at this "
                             "load through this impedance; check %R, %X and the load") from None

    exact = regulation_exact(r_pct, x_pct, pf, leading, load)
    approx = regulation_approx(r_pct, x_pct, pf, leading, load)
    loaded_v = loaded_at(present)
    tap, in_band = select_tap(loaded_at, system_v, band)
    tapped_v = loaded_at(tap)
    no_load_v = secondary_v * supply * tap_voltage_factor(tap)
    result = Result()
    result.output("regulation_pct", exact)
    result.output("loaded_v", loaded_v)
    result.output("tap_pct", tap, f"{tap:+g} %" if tap else "0 % (rated tap)")
    result.output("regulation_approx_pct", approx)
    result.output("tapped_v", tapped_v)
    result.output("no_load_v", no_load_v)

    sine = _sin_phi(pf, leading)
    kind = "leading" if leading else "lagging"
    if from_z:
        result.step("%R and %X from %Z and X/R", "%R = %Z / √(1 + (X/R)²), %X = (X/R) %R", from_z)
    p, q = load * r_pct, load * x_pct
    result.step(f"At {100 * load:g} % load the resistance and reactance drops", "p = k %R, q = k %X",
                f"= {p:.4g} %, {q:.4g} %; cos φ = {pf:g}, sin φ = {sine:+.4g} ({kind})")
    result.step("Regulation, textbook formula with its second-order term",
                "ε ≈ p cos φ + q sin φ + (q cos φ − p sin φ)² / 200",
                f"= {p:.4g} × {pf:g} + {q:.4g} × {sine:+.4g} + ({q:.4g} × {pf:g} − {p:.4g} × "
                f"{sine:+.4g})² / 200 = {approx:.4g} %")
    result.step("Regulation, exact (phasor diagram, loaded secondary at rated voltage)",
                "ε = |1 + k (r + jx)(cos φ − j sin φ)| − 1", f"= {exact:.4g} %")
    result.step(f"Loaded secondary voltage on the {_tap_name(present)} with the supply at "
                f"{100 * supply:g} % (constant-current load, exact phasor solution)",
                "V_nl = V₂ × supply / (1 + tap); |V_nl|² = (V + I R cos φ + I X sin φ)² + "
                "(I X cos φ − I R sin φ)²",
                f"V_nl = {fq(secondary_v * supply * tap_voltage_factor(present), 'V')}; "
                f"V = {fq(loaded_v, 'V')}")
    low, high = system_v * (1 - band / 100), system_v * (1 + band / 100)
    result.step(f"Tap that brings the loaded voltage within {fq(system_v, 'V')} ± {band:g} % "
                f"({fq(low, 'V')} to {fq(high, 'V')}): the smallest change from rated",
                "taps −5, −2.5, 0, +2.5, +5 % of rated primary voltage",
                f"{_tap_name(tap)} (for a {fq(primary_v * (1 + tap / 100), 'V')} primary) → "
                f"{fq(tapped_v, 'V')} loaded, {fq(no_load_v, 'V')} at no load")
    phases, apparent_power = int(inputs["phases"]), inputs["kva"]
    load_a = load * full_load_current(apparent_power, secondary_v, phases)
    result.output("load_a", load_a)
    result.step("Load current", "I = k × I_FL",
                f"= {load:g} × {fq(full_load_current(apparent_power, secondary_v, phases), 'A')} = "
                f"{fq(load_a, 'A')}")
    _ideal_relations(result, primary_v, secondary_v, phases, apparent_power)

    ok_now = low * (1 - 1e-12) <= loaded_v <= high * (1 + 1e-12)
    result.check("present_band", "pass" if ok_now else "warn",
                 f"On the {_tap_name(present)} the loaded voltage is {fq(loaded_v, 'V')} "
                 f"({100 * (loaded_v / system_v - 1):+.3g} % of {fq(system_v, 'V')}); the band is "
                 f"± {band:g} %.")
    result.check("tap", "pass" if in_band else "fail",
                 f"The {_tap_name(tap)} gives {fq(tapped_v, 'V')} under this load"
                 + (" — within the band." if in_band else ": no tap reaches the band; look at "
                    "the supply voltage, the load, or a buck-boost connection."))
    light_ok = no_load_v <= high * (1 + 1e-12)
    result.check("light_load", "pass" if light_ok else "warn",
                 f"At no load the tap gives {fq(no_load_v, 'V')}"
                 + (f", within the upper limit {fq(high, 'V')}." if light_ok else
                    f", above the upper limit {fq(high, 'V')}: equipment may see overvoltage at "
                    "light load."))
    agree = abs(exact - approx) <= 0.1
    result.check("formula_validity", "pass" if agree else "warn",
                 f"The approximate formula gives {approx:.4g} %, the exact phasor value "
                 f"{exact:.4g} %" + ("." if agree else f"; they differ by more than 0.1 "
                                    "percentage point, so use the exact value."))

    result.assumptions += [
        "Series impedance only (no magnetising branch); %R and %X on the transformer's rating, "
        "the same on every tap.",
        "Constant-current load at the stated power factor; balanced three-phase or single-phase "
        "alike (per unit).",
        f"The supply (primary) voltage is held at {100 * supply:g} % of rated whatever the load.",
        f"Band ± {band:g} % of {fq(system_v, 'V')}: ANSI C84.1 Range A is ± 5 % at the service, "
        "IEC 60038 is ± 10 % (from memory); the equipment may need less.",
    ]
    result.sources += [SOURCE_REGULATION, SOURCE_TAPS,
                       "Exact loaded voltage: phasor solution as in calc.voltage_drop "
                       "(short-line model).", SOURCE_IDEAL]
    result.cautions += [CAUTION_TAPS, cautions.BACKFEED]
    result.cautions += list(cautions.COMMON)

    loads = [5.0 * k for k in range(31)]
    result.series = {
        "title": "Loaded secondary voltage against load",
        "x": {"label": "Load", "unit": "%", "values": loads},
        "y": [{"label": f"{_tap_name(present).capitalize()} (present)", "unit": "V",
               "values": [loaded_at(present, f / 100) for f in loads]},
              {"label": f"{_tap_name(tap).capitalize()} (recommended)", "unit": "V",
               "values": [loaded_at(tap, f / 100) for f in loads]}],
        "y_axis": {"label": "Secondary voltage", "unit": "V"},
        "marks": [{"axis": "y", "value": low, "label": f"−{band:g} %"},
                  {"axis": "y", "value": high, "label": f"+{band:g} %"},
                  {"axis": "x", "value": 100 * load, "label": "This load"}],
    }
    return result


REGULATION = Calculator(
    id="transformer-regulation",
    title="Transformer regulation and taps",
    summary="Voltage regulation at a load and power factor from %R and %X (or %Z and X/R), "
            "the loaded secondary voltage, and the no-load tap that brings it back in band.",
    group="Transformers",
    inputs=(
        Input("r_pct", "Resistance %R", "quantity", unit="%", default=1.0, minimum=0,
              maximum=30, help="From the test report (load loss / rating × 100)."),
        Input("x_pct", "Reactance %X", "quantity", unit="%", default=5.0, minimum=0,
              maximum=30, help="From the test report: √(%Z² − %R²)."),
        Input("z_pct", "Or impedance %Z", "quantity", unit="%", optional=True, minimum=0,
              min_exclusive=True, maximum=30,
              help="With X/R, replaces %R and %X. More than 0 and at most 30 %."),
        Input("x_r", "and X/R", "quantity", unit="", optional=True, minimum=0, maximum=100),
        Input("pf", "Load power factor", "quantity", unit="", default=0.85, minimum=0.05,
              maximum=1),
        Input("leading", "Leading power factor (capacitive load)", "flag", default=False),
        Input("load_pct", "Load", "quantity", unit="%", default=100, minimum=0, maximum=200,
              help="Load current as a percentage of rated current."),
        _voltage_input("secondary_v", "Rated secondary voltage", 208, 400,
                       "No-load voltage on the rated tap; line-to-line for three-phase."),
        _voltage_input("primary_v", "Rated primary voltage", 480, 11000,
                       "Line-to-line for three-phase; names the tap voltages."),
        Input("present_tap", "Present tap", "choice", default="0", choices=TAP_CHOICES),
        Input("kva", "Rating", "quantity", unit="kVA", default=75, minimum=0.001,
              maximum=1_000_000, region_defaults={"iec": 630}, advanced=True,
              help="For the currents; the regulation itself is per unit."),
        Input("phases", "Phases", "choice", default="3", advanced=True,
              choices=(("3", "Three-phase"), ("1", "Single-phase"))),
        Input("supply_pct", "Supply voltage", "quantity", unit="%", default=100, minimum=50,
              maximum=150, help="The primary supply as a percentage of rated primary voltage."),
        Input("band_pct", "Voltage band ±", "quantity", unit="%", default=VOLTAGE_BAND_PCT["na"],
              minimum=0, min_exclusive=True, maximum=20,
              region_defaults={"iec": VOLTAGE_BAND_PCT["iec"]},
              help="ANSI C84.1 Range A ± 5 %; IEC 60038 ± 10 %."),
        Input("system_v", "Nominal system voltage", "quantity", unit="V", optional=True,
              minimum=1, maximum=800_000, advanced=True,
              help="Blank: the rated secondary voltage (enter 400 V for a 420 V unit)."),
    ),
    outputs=(
        Output("regulation_pct", "Voltage regulation", "%"),
        Output("loaded_v", "Loaded secondary voltage (present tap)", "V"),
        Output("tap_pct", "Tap to use", "%"),
        Output("regulation_approx_pct", "Regulation by the approximate formula", "%"),
        Output("tapped_v", "Loaded voltage on that tap", "V"),
        Output("no_load_v", "No-load voltage on that tap", "V"),
        Output("load_a", "Load current", "A"),
    ),
    compute=_regulation_view,
)


# ---- transformer-efficiency --------------------------------------------------------------------

PROFILE_PERIODS = 3  # daily profile: three periods of (load %, hours); the rest at no load
JOULES_PER_KWH = 3.6e6  # exact


def _kwh(energy_j):
    return f"{fq(energy_j / JOULES_PER_KWH, '')} kWh"


def _profile(inputs):
    """[(load fraction, hours)] of the daily profile; InputError when it exceeds 24 h."""
    periods, total = [], 0.0
    for n in range(1, PROFILE_PERIODS + 1):
        hours = inputs[f"hours{n}"] / 3600.0  # the input arrives in seconds
        total += hours
        if total > 24.0 * (1 + 1e-12):
            raise InputError(f"hours{n}", inputs[f"hours{n}"] / 3600.0,
                             f"the profile's hours add up to {total:g} h, more than a day; the "
                             "three periods together may take at most 24 h (the rest of the day "
                             "counts as no load)")
        periods.append((inputs[f"load{n}_pct"] / 100.0, hours))
    return periods, total


def _efficiency_view(inputs):
    apparent_power, p0, pk = inputs["kva"], inputs["no_load_w"], inputs["load_loss_w"]
    pf, load = inputs["pf"], inputs["load_pct"] / 100.0
    periods, busy = _profile(inputs)
    days, price = inputs["days"], inputs["energy_price"]
    eta, output, losses = efficiency(apparent_power, p0, pk, load, pf)
    k_max = maximum_efficiency_load(p0, pk)
    eta_max = efficiency(apparent_power, p0, pk, k_max, pf)[0]
    day_out, day_loss = daily_energy(apparent_power, p0, pk, [(k, pf, h) for k, h in periods])
    all_day = day_out / (day_out + day_loss) if day_out > 0 else 0.0
    annual_loss = day_loss * 3600.0 * days  # W·h -> J
    cost = annual_loss / JOULES_PER_KWH * price

    result = Result()
    result.output("efficiency_pct", 100.0 * eta)
    result.output("loss_w", losses)
    result.output("max_efficiency_load_pct", 100.0 * k_max)
    result.output("max_efficiency_pct", 100.0 * eta_max)
    result.output("all_day_efficiency_pct", 100.0 * all_day)
    result.output("daily_output", day_out * 3600.0, _kwh(day_out * 3600.0))
    result.output("annual_loss_energy", annual_loss, _kwh(annual_loss))
    result.output("annual_loss_cost", cost, f"{cost:,.2f}".replace(",", " "))

    s = fq(apparent_power, "VA")
    result.step(f"Output at {100 * load:g} % load, power factor {pf:g}", "P_out = k S cos φ",
                f"= {load:g} × {s} × {pf:g} = {fq(output, 'W')}")
    result.step("Losses: no-load (core) loss at every load, load loss with the square of the load",
                "P_loss = P₀ + k² P_k",
                f"= {fq(p0, 'W')} + {load:g}² × {fq(pk, 'W')} = {fq(losses, 'W')}")
    result.step("Efficiency", "η = P_out / (P_out + P_loss)",
                f"= {fq(output, 'W')} / {fq(output + losses, 'W')} = {100 * eta:.4g} %")
    result.step("Load of maximum efficiency: where the load loss equals the no-load loss",
                "k = √(P₀ / P_k)", f"= √({fq(p0, 'W')} / {fq(pk, 'W')}) = {100 * k_max:.3g} % → "
                f"η_max = {100 * eta_max:.4g} %")
    parts = "; ".join(f"{100 * k:g} % for {h:g} h" for k, h in periods if h)
    result.step(f"Daily profile: {parts or 'no load all day'}; {24 - busy:g} h at no load "
                "(energised 24 h)", "E_out = Σ k S cos φ t; E_loss = 24 h × P₀ + Σ k² P_k t",
                f"E_out = {_kwh(day_out * 3600)}, E_loss = {_kwh(day_loss * 3600)}")
    result.step("All-day efficiency", "η_day = E_out / (E_out + E_loss)",
                f"= {100 * all_day:.4g} %")
    result.step(f"Energy and cost of the losses over {days:g} days a year",
                "E_year = E_loss × days; cost = E_year × price",
                f"= {_kwh(annual_loss)} × {price:g} = {cost:,.2f}".replace(",", " "))
    _ideal_relations(result, inputs["primary_v"], inputs["secondary_v"], int(inputs["phases"]),
                     apparent_power, output_power=output, losses=losses)

    heavy = max([load] + [k for k, h in periods if h])
    result.check("overload", "pass" if heavy <= 1.0 + 1e-12 else "warn",
                 f"The heaviest load is {100 * heavy:g} % of rating" +
                 ("." if heavy <= 1.0 + 1e-12 else ": above 100 % the windings run hotter and age "
                  "faster; check the loading guide (IEEE C57.91, IEC 60076-7; from memory)."))
    result.check("maximum_efficiency", "pass",
                 f"Maximum efficiency at {100 * k_max:.3g} % load; distribution transformers are "
                 "usually designed for it at 35-50 % (common practice), power transformers nearer "
                 "full load.")

    result.assumptions += [
        "No-load loss constant at rated voltage and frequency; load loss at the reference "
        "temperature of the test report (75 °C IEC, 85 °C IEEE liquid-filled; from memory), "
        "varying with the square of the load current.",
        f"One power factor ({pf:g}) for the whole profile; the transformer stays energised all "
        "day, so the core loss runs 24 h.",
        "Harmonic currents, which add eddy and stray loss, are not included.",
    ]
    result.sources += [
        "η = P_out / (P_out + P₀ + k² P_k); maximum at k = √(P₀ / P_k): S. J. Chapman, Electric "
        "Machinery Fundamentals, 5th ed., section 2.7 — from memory.",
        "All-day efficiency from a daily load cycle: M. A. Salam, Fundamentals of Electrical "
        "Machines, 2nd ed. (Narosa), Example 3.10.",
        SOURCE_IDEAL,
    ]
    result.cautions += ["Loss figures come from the test report or the maker's data sheet; "
                        "measure losses only with the test equipment and procedure of IEEE "
                        "C57.12.90 / IEC 60076-1, by qualified persons.", cautions.BACKFEED]
    result.cautions += list(cautions.COMMON)

    loads = [5.0 * k for k in range(1, 31)]
    result.series = {
        "title": "Efficiency against load",
        "x": {"label": "Load", "unit": "%", "values": loads},
        "y": [{"label": f"Efficiency at pf {pf:g}", "unit": "%",
               "values": [100 * efficiency(apparent_power, p0, pk, f / 100, pf)[0] for f in loads]}],
        "marks": [{"axis": "x", "value": 100 * k_max, "label": "Maximum efficiency"},
                  {"axis": "x", "value": 100 * load, "label": "This load"}],
    }
    return result


def _profile_inputs():
    defaults = ((100, 4), (60, 10), (30, 6))  # an invented dairy-barn day: milking, day, night
    items = []
    for n, (pct, hours) in enumerate(defaults, start=1):
        items += [
            Input(f"load{n}_pct", f"Period {n}: load", "quantity", unit="%", default=pct,
                  minimum=0, maximum=200, help="Load as a percentage of the rating."),
            Input(f"hours{n}", f"Period {n}: hours a day", "quantity", unit="h", default=hours,
                  minimum=0, maximum=24, help="The three periods take at most 24 h together."),
        ]
    return tuple(items)


EFFICIENCY = Calculator(
    id="transformer-efficiency",
    title="Transformer losses and efficiency",
    summary="No-load and load losses, efficiency at any load, the load of maximum efficiency, "
            "all-day efficiency and the yearly energy and cost of the losses.",
    group="Transformers",
    inputs=(
        Input("kva", "Rating", "quantity", unit="kVA", default=75, minimum=0.001,
              maximum=1_000_000, region_defaults={"iec": 630}),
        Input("no_load_w", "No-load (core) loss", "quantity", unit="W", default=300, minimum=0.001,
              maximum=1e6, region_defaults={"iec": 600},
              help="From the test report or data sheet."),
        Input("load_loss_w", "Load loss at rated current", "quantity", unit="W", default=1800,
              minimum=0.001, maximum=1e7, region_defaults={"iec": 6500},
              help="Copper loss at full load, at the reference temperature."),
        Input("pf", "Load power factor", "quantity", unit="", default=0.9, minimum=0.05,
              maximum=1),
        Input("load_pct", "Load for the efficiency", "quantity", unit="%", default=75, minimum=0,
              maximum=200),
        *_profile_inputs(),
        Input("energy_price", "Energy price per kWh", "quantity", unit="", default=0.15,
              minimum=0, maximum=100, help="In your currency."),
        Input("days", "Days energised a year", "quantity", unit="", default=365, minimum=0,
              maximum=366),
        _voltage_input("primary_v", "Primary voltage", 480, 11000, "For the ideal relations.",),
        _voltage_input("secondary_v", "Secondary voltage", 208, 400, "For the ideal relations."),
        Input("phases", "Phases", "choice", default="3", advanced=True,
              choices=(("3", "Three-phase"), ("1", "Single-phase"))),
    ),
    outputs=(
        Output("efficiency_pct", "Efficiency at that load", "%"),
        Output("loss_w", "Losses at that load", "W"),
        Output("max_efficiency_load_pct", "Load of maximum efficiency", "%"),
        Output("max_efficiency_pct", "Maximum efficiency", "%"),
        Output("all_day_efficiency_pct", "All-day efficiency", "%"),
        Output("daily_output", "Energy delivered a day", "J"),
        Output("annual_loss_energy", "Energy lost a year", "J"),
        Output("annual_loss_cost", "Cost of the losses a year", ""),
    ),
    compute=_efficiency_view,
)


# ---- buck-boost --------------------------------------------------------------------------------

def _near(voltage, nominal, tolerance=0.05):
    return abs(voltage / nominal - 1.0) <= tolerance


def _autotransformer_permission(bank, neutral, supply_v, output_v):
    """(status, message) for whether this autotransformer connection is permitted."""
    if bank == "wye" and not neutral:
        return "fail", ("Three units in wye need the supply's neutral connected to the star "
                        "point: without it the star point floats and the phase voltages swing "
                        "with the load. Not permitted; use two units in open delta on a "
                        "three-wire system (common practice).")
    if neutral:
        return "pass", ("The supply's grounded (neutral) conductor is common to input and "
                        "output, as NEC 210.9 and 215.11 require for circuits derived from an "
                        "autotransformer (from memory).")
    if (_near(supply_v, 208.0) and 220.0 <= output_v <= 250.0) or (
            220.0 <= supply_v <= 250.0 and _near(output_v, 208.0)):
        return "pass", ("208 V ↔ 240 V without a grounded conductor is the exception NEC 210.9 "
                        "and 215.11 allow (from memory).")
    if (_near(supply_v, 480.0) and _near(output_v, 600.0)) or (
            _near(supply_v, 600.0) and _near(output_v, 480.0)):
        return "warn", ("480 V ↔ 600 V without a grounded conductor is allowed only in "
                        "industrial occupancies where qualified persons service the installation "
                        "(NEC 210.9 Exception No. 2, from memory).")
    return "warn", ("NEC 210.9 and 215.11 (from memory) allow a circuit derived from an "
                    "autotransformer only where its grounded conductor connects to the supply's, "
                    "apart from 208 V ↔ 240 V (and 480 V ↔ 600 V in supervised industrial sites). "
                    "Without the neutral this connection needs the authority's acceptance.")


def _buck_boost_view(inputs):
    supply_v, target_v, bank = inputs["supply_v"], inputs["target_v"], inputs["bank"]
    neutral = inputs["neutral"]
    units = BANK_UNITS[bank]
    per_unit = SQRT3 if bank == "wye" else 1.0  # a wye unit sits line-to-neutral
    winding_v, winding_target = supply_v / per_unit, target_v / per_unit
    options = buck_boost_combinations(winding_v)
    if not options:
        top = EXCITATION_LIMIT * 2 * max(p for _, p, _ in BUCK_BOOST_WINDINGS)
        raise InputError("supply_v", supply_v, f"{fq(winding_v, 'V')} across each unit is above "
                         f"the highest standard buck-boost primary ({fq(top, 'V')} with its 105 % "
                         "allowance); use a transformer rated for this voltage")
    best = min(options, key=lambda o: (abs(o.output_v - winding_target),
                                       abs(1.0 - winding_v / o.shunt_v)))
    output_v = best.output_v * per_unit
    given = _the_one_given(inputs, ("load_kva", "load_a"),
                           "give the load: its kVA, or its current at the output")
    k = 1.0 if bank == "single" else SQRT3
    if given == "load_kva":
        load = inputs["load_kva"]
        load_a = load / (k * output_v)
    else:
        load_a = inputs["load_a"]
        load = k * output_v * load_a
    supply_a = load / (k * supply_v)
    required = buck_boost_unit_rating(best.series_v, load_a)
    standard = next_standard_rating(required, BUCK_BOOST_KVA)
    result = Result()
    result.output("output_v", output_v)
    result.output("kva", standard if standard is not None else required)
    result.output("kva_required", required)
    result.output("units", float(units), f"{units} unit{'s' if units > 1 else ''}")
    result.output("load_a", load_a)
    result.output("supply_a", supply_a)
    result.output("boost_pct", 100.0 * (output_v / supply_v - 1.0))

    where = {"single": "across the unit", "wye": "line-to-neutral, across each unit",
             "open-delta": "line-to-line, across each unit"}[bank]
    result.step(f"Voltage {where}", "V_unit", f"= {fq(winding_v, 'V')} (target "
                f"{fq(winding_target, 'V')})")
    near = sorted(options, key=lambda o: abs(o.output_v - winding_target))[:4]
    result.step("Standard combinations nearest the target (primary connection across the supply, "
                "secondary in series with the line)", "V_out = V_in (1 ± V_series / V_shunt)",
                "; ".join(f"{o.windings} at {o.shunt_v:g}/{o.series_v:g} V {o.mode}: "
                          f"{fq(o.output_v, 'V')}" for o in near))
    sign = "+" if best.mode == "boost" else "−"
    result.step(f"Chosen: {best.windings}, primaries for {best.shunt_v:g} V, secondaries for "
                f"{best.series_v:g} V, {best.mode} ({'additive' if best.mode == 'boost' else 'subtractive'} "
                "polarity)", f"V_out = V_in (1 {sign} {best.series_v:g} / {best.shunt_v:g})",
                f"= {fq(winding_v, 'V')} × {1 + (1 if best.mode == 'boost' else -1) * best.series_v / best.shunt_v:.4g} = "
                f"{fq(best.output_v, 'V')}" + (f" ({fq(output_v, 'V')} line-to-line)"
                                               if bank == "wye" else ""))
    formula, shown = ("S / (√3 × V_out)", f"({'√3 × '}{fq(output_v, 'V')})") if k != 1.0 else (
        "S / V_out", fq(output_v, "V"))
    result.step("Load current (it flows through every series winding)", f"I_L = {formula}",
                f"= {fq(load, 'VA')} / {shown} = {fq(load_a, 'A')}")
    result.step("Rating each unit needs: its series winding must carry the load current",
                "S_unit = V_series × I_L",
                f"= {best.series_v:g} V × {fq(load_a, 'A')} = {fq(required, 'VA')} → "
                + (f"standard {fq(standard, 'VA')}" if standard else "beyond the usual sizes"))
    result.step(f"The bank: {units} × {fq(standard or required, 'VA')} carries "
                f"{fq(load, 'VA')} of load", "S_load / S_bank",
                f"= {load / (units * (standard or required)):.3g} (an autotransformer transforms "
                "only the buck or boost voltage)")
    _ideal_relations(result, supply_v, output_v, 1 if bank == "single" else 3, load,
                     show_turns=False)  # an autotransformer's turns are shunt + series

    status, message = _autotransformer_permission(bank, neutral, supply_v, output_v)
    result.check("connection_permitted", status, message)
    off = abs(output_v / target_v - 1.0) * 100.0
    result.check("target", "pass" if off <= 2.5 else "warn",
                 f"The nearest standard combination gives {fq(output_v, 'V')}, {off:.2g} % from "
                 f"the {fq(target_v, 'V')} target" + ("." if off <= 2.5 else
                                                     " (more than 2.5 %): check the equipment's "
                                                     "tolerance, or use a tapped transformer."))
    result.check("excitation", "pass",
                 f"Each unit's primary connection ({best.shunt_v:g} V) sees "
                 f"{fq(winding_v, 'V')}, {100 * winding_v / best.shunt_v:.3g} % of its rating "
                 "(at most 105 %).")
    if standard is None:
        result.check("unit_size", "warn",
                     f"{fq(required, 'VA')} per unit is beyond the usual buck-boost sizes (to 10 "
                     "kVA); use larger units made for it or an insulating transformer.")

    result.assumptions += [
        "Standard buck-boost units: 120/240 V primaries with 12/24 or 16/32 V secondaries, "
        "240/480 V with 24/48 V (common practice); an ideal autotransformer (no regulation).",
        "The supply is held at the stated voltage; if it varies, the output varies in proportion.",
    ]
    if bank == "open-delta":
        result.assumptions.append("Open delta gives a three-wire output; loads that need the "
                                  "neutral stay on the supply side.")
    result.sources += [
        "V_out = V_in (1 ± N_series / N_shunt): autotransformer from a two-winding transformer, "
        "S. J. Chapman, Electric Machinery Fundamentals, 5th ed., section 2.9 — from memory.",
        "Unit rating kVA = V_series × I_L (REFERENCE_VALUES 5, autotransformer theory, from "
        "memory); wye bank 3 units, open delta 2.",
        "NEC 210.9, 215.11 (circuits derived from autotransformers), 450.4 (overcurrent "
        "protection; a transformer field-connected as an autotransformer must be identified for "
        "it) — from memory.",
        SOURCE_IDEAL,
    ]
    result.cautions += [
        CAUTION_AUTOTRANSFORMER,
        "Protect the autotransformer as NEC 450.4 requires (or as your code does), and wire "
        "it from the maker's connection diagram: a reversed secondary bucks instead of boosting.",
        "Outside North America IEC 60364 and national rules govern autotransformers; check "
        "them before using one.",
    ]
    result.cautions += list(cautions.COMMON)
    currents = [load_a * f / 100 for f in range(0, 151, 5)]
    result.series = {
        "title": "Unit rating needed against load current",
        "x": {"label": "Load current", "unit": "A", "values": currents},
        "y": [{"label": "Unit rating needed", "unit": "VA",
               "values": [buck_boost_unit_rating(best.series_v, i) for i in currents]}],
        "marks": [{"axis": "x", "value": load_a, "label": "This load"},
                  {"axis": "y", "value": standard or required, "label": "Unit chosen"}],
    }
    return result


BUCK_BOOST = Calculator(
    id="buck-boost",
    title="Buck-boost transformer",
    summary="Low-voltage insulating transformers connected as an autotransformer to raise or "
            "lower a supply: output of each standard combination, the kVA needed, the currents, "
            "and whether the connection is permitted.",
    group="Transformers",
    inputs=(
        Input("supply_v", "Supply voltage", "quantity", unit="V", default=208, minimum=1,
               maximum=1000, suggest="voltages",
              help="Measured or nominal; line-to-line for a three-phase bank."),
        Input("target_v", "Voltage wanted", "quantity", unit="V", default=230, minimum=1,
               maximum=1000, help="The equipment's rated voltage."),
        Input("bank", "Connection", "choice", default="single", choices=BUCK_BOOST_BANKS),
        Input("neutral", "Supply neutral connected to the bank", "flag", default=False,
              help="Yes when the grounded conductor runs to the autotransformer (needed for a "
                   "wye bank)."),
        Input("load_kva", "Load", "quantity", unit="kVA", default=5, optional=True, minimum=0.001,
              maximum=10_000),
        Input("load_a", "Or load current", "quantity", unit="A", optional=True, minimum=0.001,
              maximum=10_000, help="At the output; the kVA field blank."),
    ),
    outputs=(
        Output("output_v", "Output voltage", "V"),
        Output("kva", "Rating of each unit", "VA"),
        Output("kva_required", "Rating needed per unit", "VA"),
        Output("units", "Units in the bank", ""),
        Output("load_a", "Load current", "A"),
        Output("supply_a", "Supply current", "A"),
        Output("boost_pct", "Change in voltage", "%"),
    ),
    compute=_buck_boost_view,
)


# ---- supply-mismatch ---------------------------------------------------------------------------

def _mismatch_view(inputs):
    equipment_v, equipment_hz = inputs["equipment_v"], inputs["equipment_hz"]
    supply_v, supply_hz = inputs["supply_v"], inputs["supply_hz"]
    phases, load, kind = int(inputs["phases"]), inputs["load_kva"], inputs["load_type"]
    margin = inputs["margin_pct"]
    magnetic = kind in ("motor", "magnetic")
    frequency_ratio = supply_hz / equipment_hz
    target_v = equipment_v * min(1.0, frequency_ratio) if magnetic else equipment_v
    flux_equipment = flux_ratio(target_v, supply_hz, equipment_v, equipment_hz)
    flux_direct = flux_ratio(supply_v, supply_hz, equipment_v, equipment_hz)
    ratio = supply_v / target_v
    design = load * (1.0 + margin / 100.0)
    table = (SMALL_KVA_3PH + PREFERRED_KVA_3PH_NA) if phases == 3 else (
        SMALL_KVA_1PH + PREFERRED_KVA_1PH_NA)
    rating = next_standard_rating(design, sorted(table))
    if rating is None:
        raise InputError("load_kva", load, f"{fq(design, 'VA')} with the margin is above the "
                         f"largest listed rating ({fq(max(table) * 1e3, 'VA')}); this is a "
                         "substation job, not an adapter transformer")
    primary_a = load / (phase_factor(phases) * supply_v)
    secondary_a = load / (phase_factor(phases) * target_v)
    result = Result()
    result.output("secondary_v", target_v)
    result.output("ratio", ratio, _ratio_display(ratio))
    result.output("kva", rating)
    result.output("flux_pct", 100.0 * flux_equipment)
    result.output("direct_flux_pct", 100.0 * flux_direct)
    result.output("speed_pct", 100.0 * frequency_ratio)
    result.output("primary_a", primary_a)
    result.output("secondary_a", secondary_a)

    result.step("Connected directly, the equipment's flux (V/Hz) relative to its rating",
                "Φ / Φ_rated = (V_supply / f_supply) / (V_rated / f_rated)",
                f"= ({fq(supply_v, 'V')} / {supply_hz:g} Hz) / ({fq(equipment_v, 'V')} / "
                f"{equipment_hz:g} Hz) = {100 * flux_direct:.3g} %")
    if magnetic and frequency_ratio < 1.0:
        result.step("Lower frequency: feed it less voltage, in proportion, to keep the rated flux",
                    "V = V_rated × f_supply / f_rated",
                    f"= {fq(equipment_v, 'V')} × {supply_hz:g} / {equipment_hz:g} = "
                    f"{fq(target_v, 'V')}")
    else:
        result.step("Voltage to give the equipment", "V = V_rated", f"= {fq(target_v, 'V')}"
                    + (" (never above the nameplate, even where the higher frequency would "
                       "allow it)" if magnetic and frequency_ratio > 1.0 else ""))
    result.step("Its flux on the transformer's output", "(V / f_supply) / (V_rated / f_rated)",
                f"= {100 * flux_equipment:.3g} %")
    result.step("Transformer ratio", "a = V_supply / V_equipment",
                f"= {fq(supply_v, 'V')} / {fq(target_v, 'V')} = {_ratio_display(ratio)}")
    result.step(f"Transformer rating with a {margin:g} % margin, next listed size",
                "S ≥ S_load × (1 + m)", f"= {fq(load, 'VA')} × {1 + margin / 100:g} = "
                f"{fq(design, 'VA')} → {fq(rating, 'VA')}")
    if kind == "motor":
        poles = 4
        result.step("Motor speed follows the frequency (a 4-pole motor shown)",
                    "n_s = 120 f / p",
                    f"{120 * equipment_hz / poles:g} r/min at {equipment_hz:g} Hz → "
                    f"{120 * supply_hz / poles:g} r/min at {supply_hz:g} Hz "
                    f"({100 * frequency_ratio:.3g} %)")
    _ideal_relations(result, supply_v, target_v, phases, rating, show_turns=False)

    off = abs(supply_v / equipment_v - 1.0) * 100.0
    result.check("direct_connection", "pass" if off <= 5.0 else (
        "warn" if off <= 10.0 else "fail"),
                 f"The supply is {100 * (supply_v / equipment_v - 1):+.3g} % from the equipment's "
                 "rated voltage" + (": it may be connected directly as far as voltage goes."
                                    if off <= 5.0 else ": do not connect it directly; use the "
                                    "transformer."))
    if magnetic:
        status = "pass" if flux_equipment <= EXCITATION_LIMIT + 1e-12 else "fail"
        result.check("flux", status,
                     f"Flux at {100 * flux_equipment:.3g} % of rated on the transformer's output"
                     + (" (at most 105 %)." if status == "pass" else
                        ": the core saturates, magnetising current and heating rise sharply."))
        if flux_direct > EXCITATION_LIMIT + 1e-12:
            result.check("direct_flux", "fail",
                         f"Connected directly the flux would be {100 * flux_direct:.3g} % of "
                         "rated: saturation, overheating and burnt windings.")
    if kind == "motor":
        dv = abs(target_v / equipment_v - 1.0) * 100.0
        df = abs(frequency_ratio - 1.0) * 100.0
        slack = 1e-9  # a deviation of exactly the limit (e.g. 57 Hz on 60 Hz) is within it
        ok = (dv <= MOTOR_VOLTAGE_TOLERANCE_PCT + slack
              and df <= MOTOR_FREQUENCY_TOLERANCE_PCT + slack
              and dv + df <= MOTOR_COMBINED_TOLERANCE_PCT + slack)
        result.check("motor_tolerance", "pass" if ok else "fail",
                     f"Voltage {dv:.3g} % and frequency {df:.3g} % from the nameplate "
                     f"(NEMA MG 1-12.44: ±10 % voltage, ±5 % frequency, sum at most 10 %)"
                     + ("." if ok else ": outside the motor's rating. Use a motor rated for "
                        "this supply, a 50/60 Hz dual-rated motor, or a variable-frequency drive."))
        if frequency_ratio > 1.0 + 1e-12:
            result.check("driven_load", "warn",
                         f"The motor runs {100 * (frequency_ratio - 1):.3g} % faster: a fan or "
                         f"centrifugal pump then needs about {frequency_ratio ** 3:.3g} × the "
                         "power (affinity laws, power ∝ speed³), which overloads the motor.")
        elif frequency_ratio < 1.0 - 1e-12:
            result.check("driven_load", "warn",
                         f"The motor runs {100 * (1 - frequency_ratio):.3g} % slower at "
                         f"{fq(target_v, 'V')}: it gives about {frequency_ratio:.3g} × its rated "
                         "power at rated current, and its own cooling fan moves less air.")
    if kind == "electronic":
        result.check("nameplate", "pass" if abs(frequency_ratio - 1) < 1e-12 else "warn",
                     "Check the nameplate lists this voltage and frequency (e.g. '100-240 V, "
                     "50/60 Hz'); timers and clocks that count mains cycles run fast or slow.")
    rated_hz = inputs["transformer_hz"]
    if rated_hz is not None:
        flux_t = rated_hz / supply_hz
        ok = flux_t <= EXCITATION_LIMIT + 1e-12
        result.check("transformer_frequency", "pass" if ok else "fail",
                     f"A {rated_hz:g} Hz transformer on {supply_hz:g} Hz at its rated voltage runs "
                     f"at {100 * flux_t:.3g} % flux" + (
                         "." if ok else f": use it at no more than {100 * supply_hz / rated_hz:.3g} "
                         f"% of its rated voltage (and kVA), i.e. pick one whose primary is rated "
                         f"for at least {fq(supply_v * rated_hz / supply_hz, 'V')}."))

    result.assumptions += [
        "Flux ∝ V / f (E = 4.44 f N Φ); the transformer itself is rated for the supply "
        "frequency unless its frequency is given.",
        "Magnetic loads and motors are fed at most their rated voltage, reduced in proportion "
        "below their rated frequency; resistive and electronic loads at their rated voltage.",
        f"Transformer sized on the equipment's nameplate kVA with a {margin:g} % margin (common "
        "practice; more for motors started across the line).",
    ]
    result.sources += [
        "Flux ∝ V/f from E = 4.44 f N Φ_max: S. J. Chapman, Electric Machinery Fundamentals, 5th "
        "ed., section 2.2 — from memory.",
        "Motor tolerances: NEMA MG 1-12.44 (read, REFERENCE_VALUES 4a); synchronous speed n = "
        "120 f / p.",
        "Winding excitation limit 105 %: IEEE C57.12.00 §4.1.6 — from memory.",
        SOURCE_IDEAL,
    ]
    result.cautions += [
        "Equipment built for another country may differ in more than voltage: earthing "
        "arrangement, plug and socket, protective devices and approval marks. It may need "
        "inspection before use.",
        "Capacitors (motor run, power-factor) draw current in proportion to frequency; "
        "synchronous clocks and timers change speed with it.",
    ]
    result.cautions += list(cautions.COMMON)
    volts = [supply_v * f / 20 for f in range(10, 31)]
    result.series = {
        "title": "Equipment flux against the voltage applied",
        "x": {"label": f"Voltage at {supply_hz:g} Hz", "unit": "V", "values": volts},
        "y": [{"label": "Flux / rated", "unit": "%",
               "values": [100 * flux_ratio(v, supply_hz, equipment_v, equipment_hz)
                          for v in volts]}],
        "marks": [{"axis": "y", "value": 100 * EXCITATION_LIMIT, "label": "105 %"},
                  {"axis": "x", "value": target_v, "label": "Through the transformer"},
                  {"axis": "x", "value": supply_v, "label": "Direct"}],
    }
    return result


SUPPLY_MISMATCH = Calculator(
    id="supply-mismatch",
    title="Equipment on a foreign supply",
    summary="Equipment rated for one voltage and frequency on another supply (120 vs 230 V, 50 "
            "vs 60 Hz): the transformer needed, the flux (V/Hz) it will see, the motor speed "
            "change, and plain warnings.",
    group="Transformers",
    inputs=(
        Input("equipment_v", "Equipment rated voltage", "quantity", unit="V", default=230,
              minimum=1, maximum=1000, region_defaults={"iec": 120},
              help="From its nameplate; line-to-line for three-phase."),
        Input("equipment_hz", "Equipment rated frequency", "quantity", unit="Hz", default=50,
              minimum=10, maximum=400, region_defaults={"iec": 60}),
        Input("supply_v", "Supply voltage", "quantity", unit="V", default=120, minimum=1,
               maximum=1000, region_defaults={"iec": 230}, suggest="voltages"),
        Input("supply_hz", "Supply frequency", "quantity", unit="Hz", default=60, minimum=10,
              maximum=400, region_defaults={"iec": 50}),
        Input("phases", "Phases", "choice", default="1",
              choices=(("1", "Single-phase"), ("3", "Three-phase"))),
        Input("load_kva", "Equipment rating", "quantity", unit="kVA", default=1.5, minimum=0.001,
              maximum=100_000, help="Nameplate kVA (or V × A)."),
        Input("load_type", "Kind of equipment", "choice", default="motor",
              choices=EQUIPMENT_LOADS),
        Input("margin_pct", "Sizing margin", "quantity", unit="%", default=25, minimum=0,
              maximum=300),
        Input("transformer_hz", "Transformer's rated frequency", "quantity", unit="Hz",
              optional=True, minimum=10, maximum=400, advanced=True,
              help="Blank: rated for the supply frequency."),
    ),
    outputs=(
        Output("secondary_v", "Voltage to give the equipment", "V"),
        Output("ratio", "Transformer ratio", ""),
        Output("kva", "Transformer rating", "VA"),
        Output("flux_pct", "Equipment flux through the transformer", "%"),
        Output("direct_flux_pct", "Equipment flux connected directly", "%"),
        Output("speed_pct", "Motor speed relative to rated", "%"),
        Output("primary_a", "Supply current", "A"),
        Output("secondary_a", "Equipment current", "A"),
    ),
    compute=_mismatch_view,
)
