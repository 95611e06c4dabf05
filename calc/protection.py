"""Protection and shock safety: fault current along a supply path against interrupting ratings,
whether a breaker's instantaneous trip clears a fault to an earthed case (TN systems), and
judging a GFCI or RCD tester's readings.
"""

import math
import re
from typing import NamedTuple

from calc import cautions, conductors, network, transformers, units
from calc.errors import InputError
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

SQRT3 = math.sqrt(3.0)

# ---- published data ---------------------------------------------------------------------------

# IEC 60898-1 instantaneous-trip bands of MCBs, in multiples of the rated current In: the breaker
# must not trip within 0.1 s at the lower limit and must trip within 0.1 s at the upper limit
# (bands read; the 0.1 s test rule from memory — REFERENCE_VALUES 8).
MCB_INSTANTANEOUS_BANDS = {"B": (3.0, 5.0), "C": (5.0, 10.0), "D": (10.0, 20.0)}
INSTANTANEOUS_TEST_TIME_S = 0.1
# IEC 60898-1 preferred rated currents [A] (read).
MCB_PREFERRED_RATINGS_A = (6, 10, 13, 16, 20, 25, 32, 40, 50, 63, 80, 100, 125)
# IEC 60898-1 covers breakers for rated voltages up to 440 V AC (from memory).
MCB_MAX_VOLTAGE_V = 440.0

# Moulded-case breakers: the instantaneous pickup is the maker's setting ± a tolerance. ± 20 % is
# usual for thermal-magnetic trips (common practice, from memory; the maker's curve states it).
MCCB_TOLERANCE_PCT = 20.0
MCCB_RATING_LIMITS_A = (1.0, 6000.0)  # UL 489 covers breakers up to 6000 A (read, its scope 1.3)
MCCB_MULTIPLE_LIMITS = (2.0, 20.0)  # instantaneous settings offered by makers (common practice)
# Standard ampere ratings of NEC 240.6(A) from 15 to 800 A (from memory), offered in the form at
# the usual low and high instantaneous settings; any rating and multiple can be typed.
NEC_STANDARD_RATINGS_A = (15, 20, 25, 30, 35, 40, 45, 50, 60, 70, 80, 90, 100, 110, 125, 150, 175,
                          200, 225, 250, 300, 350, 400, 450, 500, 600, 700, 800)
MCCB_FORM_MULTIPLES = (5, 10)

# IEC 60364-4-41 Table 41.1: maximum disconnection times [s] for final circuits, AC, by U0 band:
# (highest U0 of the band [V], TN, TT); each band starts just above the previous one, the first
# above 50 V, and the last is open (read — REFERENCE_VALUES 8).
TABLE_41_1_S = ((120.0, 0.8, 0.3), (230.0, 0.4, 0.2), (400.0, 0.2, 0.07), (None, 0.1, 0.04))
TABLE_41_1_LOWEST_U0_V = 50.0
# IEC 60364-4-41:2005 411.3.2.2 applies Table 41.1 to final circuits up to 32 A (read);
# AMD1:2017 and BS 7671:2018 extend it to 63 A socket-outlet circuits (read as quoted, M).
TABLE_41_1_MAX_RATING_A = 32.0
# Distribution circuits (and circuits Table 41.1 does not cover): 5 s in TN (411.3.2.3, read),
# 1 s in TT (411.3.2.4, from memory).
DISTRIBUTION_TIME_S = {"tn": 5.0, "tt": 1.0}
CIRCUITS = (("final", "Final circuit (Table 41.1 time)"),
            ("distribution", "Distribution circuit (5 s)"))

# UL 943 Class A GFCI: trips at 6 mA and above, does not trip below 4 mA (read); trip time
# T = (20 / I)^1.43 s with I in mA, for 6 mA to 264 mA (read as quoted — REFERENCE_VALUES 8).
GFCI_MUST_TRIP_A = 6e-3
GFCI_NO_TRIP_A = 4e-3
GFCI_CURVE_A = 20e-3  # the 20 mA of the formula
GFCI_CURVE_EXPONENT = 1.43
GFCI_CURVE_RANGE_A = (6e-3, 264e-3)

# IEC 61008-1 / 61009-1 break times [s] at multiples of IΔn: (least, greatest); general type has
# no least time (from memory, H; the type S times at 2 IΔn from memory, M — REFERENCE_VALUES 8).
RCD_BREAK_TIMES_S = {
    "rcd": {1: (None, 0.3), 2: (None, 0.15), 5: (None, 0.04)},
    "rcd-s": {1: (0.13, 0.5), 2: (0.06, 0.2), 5: (0.05, 0.15)},
}
RCD_NO_TRIP_FRACTION = 0.5  # must not trip at 50 % of IΔn (IEC 61008-1, from memory, H)
ADDITIONAL_PROTECTION_A = 30e-3  # IEC 60364-4-41 415.1.1: IΔn ≤ 30 mA (REFERENCE_VALUES 8)
DEVICES = (("gfci", "GFCI, UL 943 Class A"), ("rcd", "RCD, general type (IEC 61008/61009)"),
           ("rcd-s", "RCD, type S (time-delayed)"))

# UL 489 short-circuit test power factor by interrupting rating (from memory): up to 10 kA
# 0.45–0.50, 10–20 kA 0.25–0.30, above 20 kA 0.15–0.20. The rating holds up to the X/R of the
# test; the highest power factor of each range (the lowest X/R) is taken, the safe side.
UL489_TEST_POWER_FACTOR = ((10e3, 0.50), (20e3, 0.30), (None, 0.20))

# Maximum short-circuit currents take conductors at 20 °C (IEC 60909-0, from memory): cold
# conductors give the most current, the duty an interrupting rating must meet.
MAX_FAULT_CONDUCTOR_C = 20.0
CHART_SEGMENTS = 12  # points along each run of the fault-current chart


def _band_time(voltage, column):
    for highest, *times in TABLE_41_1_S:
        if highest is None or voltage <= highest:
            return times[column]
    raise AssertionError("the last band is open")


# ---- breakers ---------------------------------------------------------------------------------

class Breaker(NamedTuple):
    """A breaker as the fault-loop check needs it."""

    code: str  # canonical text: "B16", "100 A 10x"
    kind: str  # "mcb" (IEC 60898-1) or "mccb" (moulded-case, its instantaneous setting)
    rating_a: float  # In [A]
    lowest_multiple: float  # below this multiple of In the instantaneous trip does not act
    operating_multiple: float  # at this multiple it surely acts (Ia = multiple × In)


_MCB_CODE = re.compile(r"\s*([BCDbcd])\s*(\d+(?:\.\d+)?)\s*(?:A|a)?\s*")
_MCCB_CODE = re.compile(r"\s*(\d+(?:\.\d+)?)\s*[Aa]\s+(\d+(?:\.\d+)?)\s*[xX×]\s*")

BREAKER_FORMS = (
    "an IEC 60898-1 MCB as its type letter B, C or D and a preferred rating "
    f"({', '.join(str(r) for r in MCB_PREFERRED_RATINGS_A)} A), e.g. B16, C32, D20; or a "
    "moulded-case breaker as its rating and instantaneous multiple, e.g. 100 A 10x (rating "
    f"{MCCB_RATING_LIMITS_A[0]:g} to {MCCB_RATING_LIMITS_A[1]:g} A, multiple "
    f"{MCCB_MULTIPLE_LIMITS[0]:g}x to {MCCB_MULTIPLE_LIMITS[1]:g}x)"
)


def parse_breaker(code, tolerance_pct=MCCB_TOLERANCE_PCT):
    """Read a breaker code: an IEC 60898-1 MCB ("B16") or a moulded-case setting ("100 A 10x").

    Parameters
    ----------
    code : str
        "B16", "C32", "D20" (letter and a preferred rating from 6 to 125 A), or a rating with
        its instantaneous multiple, "100 A 10x".
    tolerance_pct : float
        Pickup tolerance of a moulded-case instantaneous setting [%] (not used for MCBs, whose
        band limits are already the guarantee).

    Returns
    -------
    Breaker

    Raises
    ------
    InputError
        On field "breaker", listing the allowed forms and ratings.

    Notes
    -----
    MCB: the instantaneous trip acts between the band limits of IEC 60898-1 (B 3–5, C 5–10,
    D 10–20 × In); Ia is the upper limit. Moulded-case: setting m × (1 ± tolerance); Ia is the
    upper end, m × (1 + tolerance) × In.

    Examples
    --------
    >>> parse_breaker("c32").operating_multiple, parse_breaker("100 A 10x").operating_multiple
    (10.0, 12.0)
    """
    text = code if isinstance(code, str) else ""
    mcb, mccb = _MCB_CODE.fullmatch(text), _MCCB_CODE.fullmatch(text)
    if mcb:
        letter, rating = mcb[1].upper(), float(mcb[2])
        if rating in MCB_PREFERRED_RATINGS_A:
            low, high = MCB_INSTANTANEOUS_BANDS[letter]
            return Breaker(f"{letter}{rating:g}", "mcb", rating, low, high)
        message = f"{rating:g} A is not an IEC 60898-1 preferred rating"
    elif mccb:
        rating, multiple = float(mccb[1]), float(mccb[2])
        low_a, high_a = MCCB_RATING_LIMITS_A
        low_m, high_m = MCCB_MULTIPLE_LIMITS
        if low_a <= rating <= high_a and low_m <= multiple <= high_m:
            spread = tolerance_pct / 100.0
            return Breaker(f"{rating:g} A {multiple:g}x", "mccb", rating,
                           multiple * (1 - spread), multiple * (1 + spread))
        message = (f"a moulded-case rating is {low_a:g} to {high_a:g} A and its instantaneous "
                   f"multiple {low_m:g}x to {high_m:g}x")
    else:
        message = "not a breaker code"
    raise InputError("breaker", code, f"{code!r}: {message}; enter {BREAKER_FORMS}")


def _breaker_suggestions():
    """The common codes the form offers; any code parse_breaker reads is accepted."""
    mcbs = [f"{letter}{rating}" for letter in MCB_INSTANTANEOUS_BANDS for rating in MCB_PREFERRED_RATINGS_A]
    mccbs = [f"{rating} A {m}x" for rating in NEC_STANDARD_RATINGS_A for m in MCCB_FORM_MULTIPLES]
    return tuple(mccbs + mcbs)


def operating_current(breaker):
    """Ia [A]: the current that surely operates the instantaneous trip (upper band limit × In).

    Examples
    --------
    >>> operating_current(parse_breaker("B32"))
    160.0
    """
    return breaker.operating_multiple * breaker.rating_a


# ---- fault loop (TN) --------------------------------------------------------------------------

def disconnection_time(voltage, circuit="final", system="tn"):
    """Maximum disconnection time [s] of IEC 60364-4-41 for a fault to an exposed part.

    Parameters
    ----------
    voltage : float
        U0, nominal AC line-to-earth voltage [V]; above 50 V.
    circuit : str
        "final" (Table 41.1) or "distribution" (5 s TN, 1 s TT).
    system : str
        "tn" or "tt".

    Returns
    -------
    float
        Time [s].

    References
    ----------
    IEC 60364-4-41:2005, Table 41.1 and 411.3.2.2 to 411.3.2.4.

    Examples
    --------
    >>> disconnection_time(230), disconnection_time(120), disconnection_time(230, "distribution")
    (0.4, 0.8, 5.0)
    """
    if circuit == "distribution":
        return DISTRIBUTION_TIME_S[system]
    return _band_time(voltage, 0 if system == "tn" else 1)


def _conductor(field, size, material):
    """Refuse a size not made in the material or without a published resistance (the loop and
    the fault path use the tables), naming the calculator's own field."""
    try:
        conductors.check_made(size, material)
    except InputError as error:
        raise InputError(field, size.label, error.message) from None
    if conductors.table_resistance(size, material) is None:
        name = conductors.MATERIAL_NAMES[material]
        raise InputError(field, size.label, f"{size.label} {name} has no published resistance "
                         "(NEC Chapter 9 Table 8 lists aluminium from 14 AWG); choose a larger "
                         "size or copper")


def loop_impedance_per_metre(size, cpc_size, material, temperature_c, frequency_hz):
    """Impedance per metre of the fault loop through a line conductor and its protective
    conductor (CPC / equipment grounding conductor) run together.

    Parameters
    ----------
    size, cpc_size : calc.units.ConductorSize
        Line conductor and protective conductor.
    material : str
        "cu" or "al" (both conductors).
    temperature_c : float
        Conductor temperature [°C].
    frequency_hz : float
        [Hz].

    Returns
    -------
    complex
        (R1 + R2) + j(X1 + X2) [Ω/m].

    Notes
    -----
    R from the published table (IEC 60228 Class 2 at 20 °C or NEC Chapter 9 Table 8 at 75 °C)
    corrected to temperature, with IEC 60287 skin and proximity effect; X of each conductor from
    calc.conductors.impedance (touching conductors; NEC Table 9 for AWG in conduit).

    Examples
    --------
    >>> z = loop_impedance_per_metre(units.parse_conductor_size("2.5 mm2"),
    ...                              units.parse_conductor_size("1.5 mm2"), "cu", 20.0, 50.0)
    >>> round(z.real * 1e3, 2)
    19.51
    """
    total = 0j
    for conductor in (size, cpc_size):
        z = conductors.impedance(conductor, material, temperature_c, frequency_hz, "pvc",
                                 None, "table")
        total += complex(z.r_ac, z.x)
    return total


def loop_impedance(ze, z_per_metre, length):
    """Earth fault loop impedance Zs = Ze + |(R1 + R2) + j(X1 + X2)| × L [Ω].

    Ze is a measured magnitude of unknown angle, so it is added arithmetically: never less than
    the phasor sum, the safe side for a trip check.

    Examples
    --------
    >>> loop_impedance(0.35, 0.02334, 20.0)
    0.8168
    """
    return ze + abs(z_per_metre) * length


def max_length(voltage, ze, z_per_metre, ia):
    """Longest run [m] for which Zs × Ia ≤ U0 still holds; 0 when Ze alone is too high.

    Zs grows in proportion to length, so the limit is L = (U0 / Ia − Ze) / |z|.

    Examples
    --------
    >>> round(max_length(230.0, 0.35, 0.02334, 100.0), 2)
    83.55
    """
    return max(0.0, (voltage / ia - ze) / abs(z_per_metre))


# ---- GFCI and RCD -----------------------------------------------------------------------------

def gfci_time_limit(current):
    """UL 943 Class A greatest trip time T = (20 mA / I)^1.43 [s] (valid 6 mA to 264 mA).

    Works elementwise on numpy arrays too.

    Examples
    --------
    >>> round(gfci_time_limit(0.264), 4), round(gfci_time_limit(0.006), 3)
    (0.025, 5.594)
    """
    return (GFCI_CURVE_A / current) ** GFCI_CURVE_EXPONENT


def rcd_time_limits(test_current, rated_residual, device="rcd"):
    """(least, greatest) break time [s] an RCD must meet at `test_current`, or None where the
    standard sets no time (below IΔn).

    The limit is that of the highest test multiple (1, 2 or 5 IΔn) the current reaches: a larger
    current is never allowed a longer time. Least is None for the general type.

    Examples
    --------
    >>> rcd_time_limits(0.15, 0.03), rcd_time_limits(0.06, 0.1, "rcd-s")
    ((None, 0.04), None)
    """
    multiple = test_current / rated_residual
    reached = [m for m in RCD_BREAK_TIMES_S[device] if multiple >= m * (1 - 1e-9)]
    return RCD_BREAK_TIMES_S[device][max(reached)] if reached else None


# ---- fault current along a path ---------------------------------------------------------------

def path_faults(data, voltage_factor=1.0):
    """Fault currents at every node of path data, IEC 60909 c_Q applied to the feeder
    (Z_Q = c_Q U² / S''kQ with c_Q of the feeder's own voltage, IEC 60909-0 §6.2).

    Returns
    -------
    list of calc.network.Fault
        One per node (node 0, the supply bus, is left to the caller: its current is the given
        level).
    """
    iec = voltage_factor != 1.0
    c_q = transformers.source_voltage_factor(data["source"]["voltage"], voltage_factor)
    return network.faults(network.path_from_dict(data), voltage_factor, iec,
                          source_voltage_factor=c_q)


def rating_test_x_r(interrupting_rating):
    """X/R up to which a UL 489 interrupting rating holds: that of its test circuit [-].

    X/R = √(1 / pf² − 1) with the highest test power factor of the rating's range (from memory).

    Examples
    --------
    >>> round(rating_test_x_r(22e3), 3), round(rating_test_x_r(10e3), 3)
    (4.899, 1.732)
    """
    for highest, power_factor in UL489_TEST_POWER_FACTOR:
        if highest is None or interrupting_rating <= highest:
            return math.sqrt(1.0 / power_factor ** 2 - 1.0)
    raise AssertionError("the last band is open")

NODES = (("main", 1, "Transformer secondary (main)"), ("panel", 2, "End of the feeder (panel)"),
         ("equipment", 3, "End of the branch (equipment)"))


def _source_va(inputs):
    """The supply's three-phase short-circuit power [VA], or None for an infinite source."""
    if inputs["source_mva"] is not None and inputs["source_fault_a"] is not None:
        raise InputError("source_fault_a", inputs["source_fault_a"],
                         "give the supply's short-circuit power or its available fault current, "
                         "not both (leave one blank)")
    if inputs["source_fault_a"] is not None:
        return SQRT3 * inputs["source_v"] * inputs["source_fault_a"]
    return inputs["source_mva"]


def _path_data(inputs, segments=1):
    """Source → transformer (node 1) → feeder → node 2 → branch → node 3, each run in
    `segments` equal pieces (for the chart); conductors at 20 °C."""
    source = {"voltage": inputs["source_v"], "frequency_hz": inputs["frequency_hz"],
              "x_r": inputs["source_x_r"]}
    level = _source_va(inputs)
    if level is not None:
        source["fault_mva"] = level / 1e6
    elements = [{"kind": "transformer", "name": "Transformer", "kva": inputs["xfmr_kva"] / 1e3,
                 "primary_v": inputs["source_v"], "secondary_v": inputs["secondary_v"],
                 "z_pct": inputs["xfmr_z_pct"], "x_r": inputs["xfmr_x_r"],
                 "grounded_secondary": inputs["grounded_wye"]}]
    runs = (("Feeder", "feeder", inputs["feeder_sets"]), ("Branch", "branch", 1))
    for name, prefix, sets in runs:
        size = inputs[f"{prefix}_size"]
        _conductor(f"{prefix}_size", size, inputs["material"])
        for _ in range(segments):
            elements.append({"kind": "cable", "name": name, "size": size.label,
                             "length": inputs[f"{prefix}_length"] / segments,
                             "material": inputs["material"], "sets": int(sets),
                             "raceway": inputs["raceway"],
                             "conductor_temp_c": MAX_FAULT_CONDUCTOR_C})
    return {"source": source, "elements": elements}


def _fault_current_view(inputs):
    c = float(inputs["voltage_factor"])
    iec = c != 1.0
    if not float(inputs["feeder_sets"]).is_integer():
        raise InputError("feeder_sets", inputs["feeder_sets"], "enter a whole number of sets, "
                         "1 to 20")
    data = _path_data(inputs)
    chart_data = _path_data(inputs, CHART_SEGMENTS)
    faults = path_faults(data, c)
    path = network.path_from_dict(data)
    volts = inputs["secondary_v"]
    result = Result()

    for name, node, _ in NODES:
        fault = faults[node]
        result.output(f"{name}_fault_a", fault.three_phase_a)
        if fault.line_to_neutral_a is not None:
            result.output(f"{name}_ln_a", fault.line_to_neutral_a)
        result.output(f"{name}_x_r", fault.x_r)
        result.output(f"{name}_peak_a", fault.peak_a)

    # method
    level = _source_va(inputs)
    if level is None:
        result.step("Supply: infinite source (no impedance ahead of the transformer, the upper "
                    "bound)", "Z_Q = 0", "= 0 Ω")
    else:
        c_q = transformers.source_voltage_factor(inputs["source_v"], c)
        z_q = c_q * volts ** 2 / level
        cq = f"{c_q:g} × " if iec else ""
        result.step("Supply feeder impedance at the secondary voltage, X/R "
                    f"{inputs['source_x_r']:g}"
                    + (f" (c_Q = {c_q:g}, IEC 60909-0 §6.2)" if iec else ""),
                    "Z_Q = " + ("c_Q " if iec else "") + "U² / S_sc",
                    f"= {cq}({fq(volts, 'V')})² / {fq(level, 'VA')} = {fq(z_q, 'ohm')}; at the "
                    f"primary the fault current is S_sc / (√3 U) = "
                    f"{fq(level / (SQRT3 * inputs['source_v']), 'A')}")
    transformer = path.elements[0]
    z_t = inputs["xfmr_z_pct"] / 100.0 * volts ** 2 / inputs["xfmr_kva"]
    if iec:
        k_t = network.transformer_correction(transformer, c)
        result.step("Transformer impedance with the IEC 60909 correction (network transformer)",
                    "Z_T = K_T × u_k U² / S_T; K_T = 0.95 c_max / (1 + 0.6 x_T)",
                    f"K_T = {k_t:.4f}; Z_T = {k_t:.4f} × {inputs['xfmr_z_pct']:g} % × "
                    f"({fq(volts, 'V')})² / {fq(inputs['xfmr_kva'], 'VA')} = "
                    f"{fq(k_t * z_t, 'ohm')}")
    else:
        result.step(f"Transformer impedance, X/R {inputs['xfmr_x_r']:g}", "Z_T = u_k U² / S_T",
                    f"= {inputs['xfmr_z_pct']:g} % × ({fq(volts, 'V')})² / "
                    f"{fq(inputs['xfmr_kva'], 'VA')} = {fq(z_t, 'ohm')}")
    for index, run in ((1, "feeder"), (2, "branch")):
        cable = path.elements[index]
        phase, _ = network.cable_ohms(path, cable)
        sets = f", {cable.sets} sets in parallel" if cable.sets > 1 else ""
        result.step(f"The {run}: {cable.size.label} {conductors.MATERIAL_NAMES[cable.material]} × "
                    f"{fq(cable.length, 'm')}{sets}, at {MAX_FAULT_CONDUCTOR_C:g} °C",
                    "Z = (R_ac + jX) × L / sets (per phase)",
                    f"= {fq(phase.real, 'ohm')} + j{fq(phase.imag, 'ohm')}")
    cf = f"{c:g} × " if iec else ""
    for name, node, label in NODES:
        fault = faults[node]
        z = c * volts / (SQRT3 * fault.three_phase_a)
        kappa = network.peak_factor(fault.x_r)
        result.step(f"{label}: bolted three-phase fault", "I''k = " + ("c " if iec else "")
                    + "U / (√3 |Z|); κ = 1.02 + 0.98 e^(−3R/X); i_p = κ √2 I''k",
                    f"= {cf}{fq(volts, 'V')} / (√3 × {fq(z, 'ohm')}) = "
                    f"{fq(fault.three_phase_a, 'A')}; X/R {fault.x_r:.3g}, κ = {kappa:.3f}, "
                    f"i_p = {fq(fault.peak_a, 'A')}")
        if fault.line_to_neutral_a is not None:
            result.step(f"{label}: bolted line-to-neutral fault (delta-wye transformer: its Z₀ "
                        "taken = Z₁; a run adds its phase and neutral)",
                        "I''k1 = " + ("c " if iec else "") + "√3 U / |2 Z₁ + Z₀|",
                        f"= {fq(fault.line_to_neutral_a, 'A')}")
    if not inputs["grounded_wye"]:
        result.step("No line-to-neutral figure: the secondary is not a grounded wye, so a fault "
                    "to ground draws little current (it needs the system's grounding data)",
                    "—", "—")

    # judgements
    for name, node, label in NODES:
        rating = inputs[f"{name}_rating"]
        if rating is None:
            continue
        fault = faults[node]
        duty = max(fault.three_phase_a, fault.line_to_neutral_a or 0.0)
        which = "line-to-neutral" if duty > fault.three_phase_a else "three-phase"
        ok = duty <= rating
        result.check(f"{name}_rating", "pass" if ok else "fail",
                     f"{label}: available {which} fault current {fq(duty, 'A')} against the "
                     f"{fq(rating, 'A')} interrupting rating entered"
                     + (": within it." if ok else ": the rating is too low. Equipment must be "
                        "rated for the current available at its terminals (NEC 110.9, 110.10; "
                        "IEC 60947-2 / IEC 61439)."))
        x_r_test = rating_test_x_r(rating)
        if fault.x_r > x_r_test:
            result.check(f"{name}_x_r", "warn",
                         f"{label}: X/R is {fault.x_r:.3g}, above the {x_r_test:.3g} of the test "
                         f"circuit for a {fq(rating, 'A')} rating (UL 489 test power factor "
                         f"{math.cos(math.atan(x_r_test)):.2f}, from memory). The asymmetrical "
                         "current is higher than in the test, so the breaker's effective rating "
                         "is lower: apply the maker's X/R multiplying factor.")
    if iec and volts > transformers.LOW_VOLTAGE_LIMIT_V and c == 1.05:
        result.check("voltage_factor", "warn",
                     "c = 1.05 is IEC 60909's factor for low-voltage systems with +6 % tolerance; "
                     "above 1 kV c_max is 1.10 (IEC 60909-0 Table 1, from memory).")

    result.assumptions += [
        "Bolted (zero-impedance) faults: an arcing fault draws less current; the bolted figure "
        "is the duty for interrupting ratings.",
        "No motor contribution: running motors feed roughly 4 × their full-load current into a "
        "nearby fault for the first cycles (common practice); add it where motors are large.",
        f"Conductors at {MAX_FAULT_CONDUCTOR_C:g} °C (IEC 60909-0 maximum currents, from memory): "
        "cold conductors give the most current.",
        "Each run's neutral (the return of a line-to-neutral fault) is the size of its phase "
        "conductors; a line-to-ground fault returning on a smaller grounding conductor draws "
        "less. The transformer is delta-wye with Z₀ = Z₁ of the transformer.",
        "A three-phase path; the transformer is on its rated tap; runs are in trefoil or in "
        "the chosen raceway.",
    ]
    if iec:
        result.assumptions.append(
            f"IEC 60909 maximum case: c = {c:g} at the fault, c_Q for the supply feeder, K_T on "
            "the transformer.")
    else:
        result.assumptions.append("Nominal-voltage method (c = 1, no correction factors), as "
                                  "IEEE Std 141 and the per-unit method use.")
    result.sources += [
        transformers.SOURCE_IEC60909,
        "Impedances summed as phasors along the radial path by Fluxbook's path engine (checked "
        "against pandapower's IEC 60909 short-circuit calculation).",
        "Conductor impedance: NEC Chapter 9 Tables 8 and 9 / IEC 60228 with IEC 60287-1-1 skin "
        "and proximity effect (see the conductor calculator).",
        "UL 489 short-circuit test power factors — from memory.",
    ]
    result.cautions += [
        "Series ratings (a breaker protected by an upstream device with a higher rating) hold "
        "only for combinations the maker has tested and the equipment is marked for (NEC "
        "240.86, from memory); do not combine ratings yourself.",
        "An interrupting rating is tested at a stated X/R (power factor); near large "
        "transformers the X/R is often higher, which lowers the effective rating.",
        "Arc-flash incident energy is a separate study (IEEE 1584) by qualified persons; a lower "
        "fault current can give a higher incident energy through a slower protective device.",
        "Mark the available fault current where your code requires it (NEC 110.24) and update "
        "it when the supply or the transformer changes.",
        cautions.BACKFEED,
    ]
    if inputs["source_v"] > transformers.LOW_VOLTAGE_LIMIT_V:
        result.cautions.append(cautions.MEDIUM_VOLTAGE)
    result.cautions += list(cautions.COMMON)
    result.series = _fault_chart(inputs, chart_data, c, faults)
    return result


def _fault_chart(inputs, chart_data, c, faults):
    along = path_faults(chart_data, c)[1:]  # from the transformer secondary on
    step_f = inputs["feeder_length"] / CHART_SEGMENTS
    step_b = inputs["branch_length"] / CHART_SEGMENTS
    distance = [k * step_f for k in range(CHART_SEGMENTS + 1)]
    distance += [inputs["feeder_length"] + k * step_b for k in range(1, CHART_SEGMENTS + 1)]
    lines = [{"label": "Three-phase", "unit": "kA",
              "values": [f.three_phase_a / 1e3 for f in along]}]
    if inputs["grounded_wye"]:
        lines.append({"label": "Line-to-neutral", "unit": "kA",
                      "values": [f.line_to_neutral_a / 1e3 for f in along]})
    marks = [{"axis": "x", "value": inputs["feeder_length"], "label": "Panel"},
             {"axis": "x", "value": distance[-1], "label": "Equipment"}]
    for name, _, label in NODES:
        if inputs[f"{name}_rating"] is not None:
            marks.append({"axis": "y", "value": inputs[f"{name}_rating"] / 1e3,
                          "label": f"{name.capitalize()} rating"})
    return {"title": "Bolted fault current along the path (0 m = transformer secondary)",
            "x": {"label": "Distance from the transformer", "unit": "m", "values": distance},
            "y_axis": {"label": "Fault current", "unit": "kA"}, "y": lines, "marks": marks}


def _rating_input(name, where):
    return Input(f"{name}_rating", f"Interrupting rating at the {where}", "quantity", unit="kA",
                 optional=True, minimum=0, min_exclusive=True, maximum=1000,
                 help="The breaker's interrupting rating or the equipment's short-circuit "
                      "current rating (kA); blank = not checked.")


FAULT_CURRENT = Calculator(
    id="fault-current",
    title="Fault current along a supply path",
    summary="Bolted three-phase and line-to-neutral fault current, X/R and peak at the "
            "transformer, the panel and the equipment, against the interrupting ratings there.",
    group="Protection",
    inputs=(
        Input("xfmr_kva", "Transformer rating", "quantity", unit="kVA", default=750, minimum=0,
              min_exclusive=True, maximum=100000, region_defaults={"iec": 630}),
        Input("secondary_v", "Secondary voltage", "quantity", unit="V", default=480, minimum=100,
              maximum=35000, region_defaults={"iec": 400}, suggest="voltages",
              help="Line-to-line."),
        Input("xfmr_z_pct", "Transformer impedance", "quantity", unit="%", default=5.75,
              minimum=0, min_exclusive=True, maximum=30, region_defaults={"iec": 4.0},
              help="Nameplate %Z."),
        Input("xfmr_x_r", "Transformer X/R", "quantity", unit="", default=6, minimum=0.1,
              maximum=100, region_defaults={"iec": 5}, help="From the test report; typically "
              "3–10 for distribution transformers."),
        Input("feeder_size", "Feeder size", "size", default="4/0",
              region_defaults={"iec": "95 mm²"}),
        Input("feeder_length", "Feeder length", "quantity", unit="m", default="120 ft",
              minimum=0, min_exclusive=True, maximum=5000, region_defaults={"iec": "40 m"},
              help="One way, from the transformer to the panel."),
        Input("branch_size", "Branch size", "size", default="8 AWG",
              region_defaults={"iec": "10 mm²"}),
        Input("branch_length", "Branch length", "quantity", unit="m", default="50 ft",
              minimum=0, min_exclusive=True, maximum=5000, region_defaults={"iec": "20 m"},
              help="One way, from the panel to the equipment."),
        _rating_input("main", "transformer secondary (main)"),
        _rating_input("panel", "panel"),
        _rating_input("equipment", "equipment"),
        Input("voltage_factor", "Voltage factor c", "choice", default="1",
              choices=transformers.VOLTAGE_FACTORS, region_defaults={"iec": "1.1"},
              help="1 for a plain bolted-fault estimate; IEC 60909 c_max also applies K_T."),
        Input("source_mva", "Supply short-circuit power", "quantity", unit="MVA", optional=True,
              minimum=0, min_exclusive=True, maximum=1e5, advanced=True,
              help="At the transformer primary, from the utility; blank = infinite source "
                   "(the upper bound)."),
        Input("source_fault_a", "Or the supply's available fault current", "quantity",
              unit="kA", optional=True, minimum=0, min_exclusive=True, maximum=1000,
              advanced=True, help="Three-phase, at the transformer primary."),
        Input("source_x_r", "Supply X/R", "quantity", unit="", default=10, minimum=0.1,
              maximum=100, advanced=True, help="10 when unknown (IEC 60909 takes R = 0.1 X)."),
        Input("source_v", "Transformer primary voltage", "quantity", unit="V", default=12470,
              minimum=100, maximum=800000, region_defaults={"iec": 11000}, advanced=True),
        Input("grounded_wye", "Secondary is a grounded wye", "flag", default=True, advanced=True,
              help="Delta-wye with the neutral grounded (yes) gives the line-to-neutral fault."),
        Input("feeder_sets", "Feeder sets in parallel", "quantity", unit="", default=1,
              minimum=1, maximum=20, advanced=True),
        Input("material", "Conductor material", "choice", default="cu",
              choices=(("cu", "Copper"), ("al", "Aluminium")), advanced=True),
        Input("raceway", "Raceway", "choice", default="pvc", choices=conductors.RACEWAYS,
              advanced=True, help="Steel conduit raises the reactance."),
        Input("frequency_hz", "Frequency", "quantity", unit="Hz", default=60, minimum=1,
              maximum=400, region_defaults={"iec": 50}, advanced=True),
    ),
    outputs=tuple(
        Output(f"{name}_{what}", f"{label}: {text}", unit)
        for name, _, label in NODES
        for what, text, unit in (("fault_a", "three-phase fault current", "A"),
                                 ("ln_a", "line-to-neutral fault current", "A"),
                                 ("x_r", "X/R", ""), ("peak_a", "peak current", "A"))
    ),
    compute=_fault_current_view,
)


# ---- ground-fault-trip ------------------------------------------------------------------------

def _ground_fault_view(inputs):
    breaker = parse_breaker(inputs["breaker"], inputs["trip_tolerance_pct"])
    voltage, ze, length = inputs["voltage"], inputs["ze"], inputs["length"]
    size, cpc, material = inputs["size"], inputs["cpc_size"], inputs["material"]
    temperature, circuit = inputs["conductor_temp_c"], inputs["circuit"]
    _conductor("size", size, material)
    _conductor("cpc_size", cpc, material)
    z_m = loop_impedance_per_metre(size, cpc, material, temperature, inputs["frequency_hz"])
    r1_r2 = abs(z_m) * length
    zs = loop_impedance(ze, z_m, length)
    fault = voltage / zs
    ia = operating_current(breaker)
    zs_max = voltage / ia
    longest = max_length(voltage, ze, z_m, ia)
    trips = zs * ia <= voltage
    time = disconnection_time(voltage, circuit)

    result = Result()
    result.output("zs", zs)
    result.output("fault_a", fault)
    result.output("trips", trips, "yes" if trips else "no")
    result.output("max_length", longest)
    result.output("ia", ia)
    result.output("zs_max", zs_max)
    result.output("disconnection_time", time)
    result.output("r1_r2", r1_r2)

    name = conductors.MATERIAL_NAMES[material]
    per_km = fq(abs(z_m), "ohm/m")
    result.step(f"Loop through the line conductor ({size.label}) and the protective conductor "
                f"({cpc.label}), {name} at {temperature:g} °C, resistance and reactance",
                "z = (R1 + R2) + j(X1 + X2) per metre",
                f"= {fq(z_m.real, 'ohm/m')} + j{fq(z_m.imag, 'ohm/m')}, |z| = {per_km}")
    result.step("Resistance of the run", "R1 + R2 = |z| × L",
                f"= {per_km} × {fq(length, 'm')} = {fq(r1_r2, 'ohm')}")
    result.step("Earth fault loop impedance (Ze added arithmetically: its angle is not known)",
                "Zs = Ze + (R1 + R2)", f"= {fq(ze, 'ohm')} + {fq(r1_r2, 'ohm')} = {fq(zs, 'ohm')}")
    result.step("Prospective fault current to the exposed part", "I_f = U0 / Zs",
                f"= {fq(voltage, 'V')} / {fq(zs, 'ohm')} = {fq(fault, 'A')}")
    if breaker.kind == "mcb":
        low, high = MCB_INSTANTANEOUS_BANDS[breaker.code[0]]
        result.step(f"{breaker.code}: IEC 60898-1 type {breaker.code[0]} instantaneous band "
                    f"{low:g}–{high:g} × In; the upper limit surely trips within "
                    f"{INSTANTANEOUS_TEST_TIME_S:g} s",
                    "Ia = upper limit × In", f"= {high:g} × {fq(breaker.rating_a, 'A')} = "
                    f"{fq(ia, 'A')}")
    else:
        setting = (breaker.operating_multiple + breaker.lowest_multiple) / 2
        result.step(f"{breaker.code}: moulded-case instantaneous setting {setting:g} × In with "
                    f"± {inputs['trip_tolerance_pct']:g} % pickup tolerance; the upper end surely "
                    "trips", "Ia = m × (1 + tolerance) × In",
                    f"= {setting:g} × {1 + inputs['trip_tolerance_pct'] / 100:g} × "
                    f"{fq(breaker.rating_a, 'A')} = {fq(ia, 'A')}")
    where = ("Table 41.1, TN, final circuit" if circuit == "final"
             else "411.3.2.3, TN, distribution circuit")
    result.step(f"Disconnection time required (IEC 60364-4-41 {where})", "t_max",
                f"= {fq(time, 's')} at U0 = {fq(voltage, 'V')}")
    result.step("TN condition (IEC 60364-4-41 411.4.4)", "Zs × Ia ≤ U0",
                f"{fq(zs, 'ohm')} × {fq(ia, 'A')} = {fq(zs * ia, 'V')} "
                f"{'≤' if trips else '>'} {fq(voltage, 'V')}")
    result.step("Longest run that still passes (where Zs × Ia = U0)",
                "L_max = (U0 / Ia − Ze) / |z|",
                f"= ({fq(voltage, 'V')} / {fq(ia, 'A')} − {fq(ze, 'ohm')}) / {per_km} = "
                f"{fq(longest, 'm')}")

    if trips:
        result.check("tn_condition", "pass",
                     f"Zs × Ia = {fq(zs * ia, 'V')} ≤ U0 = {fq(voltage, 'V')} (IEC 60364-4-41 "
                     f"411.4.4): the {fq(fault, 'A')} fault current reaches the {fq(ia, 'A')} "
                     "that surely operates the instantaneous trip, which opens within about "
                     f"{INSTANTANEOUS_TEST_TIME_S:g} s, inside the {fq(time, 's')} required.")
    elif ze >= zs_max:
        result.check("tn_condition", "fail",
                     f"Ze alone ({fq(ze, 'ohm')}) is above the {fq(zs_max, 'ohm')} this breaker "
                     "allows (U0 / Ia): no length of cable passes. An RCD (30 mA where additional "
                     "protection is required) is needed, or a breaker with a lower Ia.")
    else:
        thermal = (" For a 5 s distribution circuit the thermal region may still clear in time: "
                   "check the maker's time-current curve." if circuit == "distribution" else "")
        result.check("tn_condition", "fail",
                     f"Zs × Ia = {fq(zs * ia, 'V')} > U0 = {fq(voltage, 'V')}: the "
                     f"{fq(fault, 'A')} fault current is below the {fq(ia, 'A')} that surely "
                     "operates the instantaneous trip, so disconnection within "
                     f"{fq(time, 's')} is not shown. Shorten the run (at most "
                     f"{fq(longest, 'm')}), enlarge the protective conductor, choose a breaker "
                     f"with a lower Ia, or add an RCD.{thermal}")
    if circuit == "final" and breaker.rating_a > TABLE_41_1_MAX_RATING_A:
        result.check("table_41_1_scope", "warn",
                     f"IEC 60364-4-41:2005 applies Table 41.1 to final circuits up to "
                     f"{TABLE_41_1_MAX_RATING_A:g} A (411.3.2.2; AMD1:2017 extends it to 63 A "
                     "socket-outlet circuits); larger final circuits may have 5 s (411.3.2.3). "
                     "The shorter time is used here.")
    if breaker.kind == "mcb" and voltage > MCB_MAX_VOLTAGE_V:
        result.check("mcb_voltage", "warn",
                     f"IEC 60898-1 covers breakers up to {MCB_MAX_VOLTAGE_V:g} V AC (from "
                     f"memory); at U0 = {fq(voltage, 'V')} use a breaker rated for the voltage.")
    if (size.system == "mm2") != (cpc.system == "mm2"):
        result.check("size_systems", "warn",
                     f"The line conductor ({size.label}) and the protective conductor "
                     f"({cpc.label}) are in different size systems; check both are right.")
    if cpc.area_m2 > size.area_m2 * 1.0001:
        result.check("cpc_larger", "warn",
                     f"The protective conductor ({cpc.label}) is larger than the line conductor "
                     f"({size.label}); unusual: check the sizes.")

    result.assumptions += [
        "TN system (TN-S, TN-C-S): the fault returns through the protective conductor to the "
        "source's earthed neutral. TT and IT systems need other checks (TT: an RCD with "
        "R_A × IΔn ≤ 50 V, IEC 60364-4-41 411.5.3).",
        "Ze is the loop impedance outside this circuit (measured, or declared by the supplier); "
        "it is added to R1 + R2 arithmetically.",
        "R1 + R2 at the stated conductor temperature (the operating temperature, as IEC practice "
        "uses for the design check), from IEC 60228 / NEC Chapter 9 Table 8 values; the "
        "conductors' reactance is included (small below about 35 mm² or 2 AWG).",
        "A bolted fault to the exposed part; arc and contact resistance would lower the current.",
        "Only the instantaneous (magnetic) region is relied on; a slower thermal trip is not "
        "credited (breaker curves vary by maker).",
        "BS 7671 practice also multiplies U0 by C_min = 0.95 (from memory); this check uses U0 "
        "as IEC 60364-4-41 411.4.4 states.",
    ]
    result.sources += [
        "IEC 60898-1: instantaneous trip bands B 3–5, C 5–10, D 10–20 × In; preferred ratings.",
        "IEC 60364-4-41:2005: Table 41.1 disconnection times, 411.3.2.3 (5 s distribution "
        "circuits), 411.4.4 (Zs × Ia ≤ U0).",
        "Conductor resistance: IEC 60228 Table 2 (20 °C, Annex B α) / NEC Chapter 9 Table 8 "
        "(75 °C, note 2 α).",
        "Moulded-case pickup tolerance ± 20 %: common practice, from memory (use the maker's).",
    ]
    result.cautions += [
        "A calculated trip is not a test: measure Zs at the farthest point with a loop-impedance "
        "tester, and check the protective conductor's continuity, as your local rules require "
        "(IEC 60364-6).",
        "An earthed case only protects if the protective conductor is continuous: a loose or "
        "missing CPC leaves the case live at U0 during a fault.",
        "The breaker must also suit the conductor's current-carrying capacity and the fault "
        "level at the panel; neither is checked here.",
    ]
    result.cautions += list(cautions.COMMON)

    end = max(1.5 * length, min(1.25 * longest, 10.0 * max(length, 1.0)), 10.0)
    lengths = [end * k / 40 for k in range(41)]
    marks = [{"axis": "y", "value": zs_max, "label": "Zs max = U0 / Ia"},
             {"axis": "x", "value": length, "label": "This run"}]
    if 0 < longest <= end:
        marks.append({"axis": "x", "value": longest, "label": "Longest run"})
    result.series = {
        "title": f"Earth fault loop impedance against length ({breaker.code})",
        "x": {"label": "Run length", "unit": "m", "values": lengths},
        "y": [{"label": "Zs", "unit": "Ω",
               "values": [loop_impedance(ze, z_m, x) for x in lengths]}],
        "marks": marks,
    }
    return result


GROUND_FAULT_TRIP = Calculator(
    id="ground-fault-trip",
    title="Will the breaker clear a fault to the case?",
    summary="Earth fault loop impedance Zs, fault current, whether the breaker's instantaneous "
            "trip clears it in the IEC 60364-4-41 time, and the longest run that still does.",
    group="Protection",
    inputs=(
        Input("voltage", "Line-to-earth voltage U0", "quantity", unit="V", default=120,
              minimum=TABLE_41_1_LOWEST_U0_V, min_exclusive=True, maximum=1000,
              region_defaults={"iec": 230},
              help="Nominal voltage to earth: 120 V, 230 V, 277 V (above 50 V)."),
        Input("ze", "External loop impedance Ze", "quantity", unit="ohm", default=0.15,
              minimum=0, min_exclusive=True, maximum=50, region_defaults={"iec": 0.35},
              help="Measured at the panel with a loop tester, or the supplier's declared value."),
        Input(
            "breaker", "Breaker", "text", default="20 A 10x", check=parse_breaker,
            suggestions=_breaker_suggestions(),
            region_defaults={"iec": "B20"},
            help="B16, C32, D20 (IEC 60898-1 type and rating, 6–125 A) or a moulded-case rating "
                 "with its instantaneous multiple, 100 A 10x; any rating and multiple can be "
                 "typed on the command line or in a link."),
        Input("size", "Line conductor size", "size", default="12 AWG",
              region_defaults={"iec": "2.5 mm²"}),
        Input("cpc_size", "Protective conductor (CPC / EGC) size", "size", default="12 AWG",
              region_defaults={"iec": "1.5 mm²"},
              help="The equipment grounding conductor that carries the fault back."),
        Input("length", "Run length", "quantity", unit="m", default="75 ft", minimum=0,
              maximum=5000, region_defaults={"iec": "30 m"},
              help="One way, from the breaker to the farthest point."),
        Input("material", "Conductor material", "choice", default="cu",
              choices=(("cu", "Copper"), ("al", "Aluminium"))),
        Input("conductor_temp_c", "Conductor temperature", "quantity", unit="degC", default=75,
              minimum=-40, maximum=250, region_defaults={"iec": 70},
              help="Operating temperature for the loop resistance (70 °C PVC, 90 °C XLPE; 75 °C "
                   "as NEC Table 8)."),
        Input("circuit", "Circuit", "choice", default="final", choices=CIRCUITS),
        Input("trip_tolerance_pct", "Moulded-case pickup tolerance", "quantity", unit="%",
              default=MCCB_TOLERANCE_PCT, minimum=0, maximum=50, advanced=True,
              help="Of the instantaneous setting (± 20 % is usual; the maker's curve says)."),
        Input("frequency_hz", "Frequency", "quantity", unit="Hz", default=60, minimum=1,
              maximum=400, region_defaults={"iec": 50}, advanced=True),
    ),
    outputs=(
        Output("zs", "Earth fault loop impedance Zs", "Ω"),
        Output("fault_a", "Prospective fault current", "A"),
        Output("trips", "Instantaneous trip clears it", ""),
        Output("max_length", "Longest run that passes", "m"),
        Output("ia", "Current that surely trips (Ia)", "A"),
        Output("zs_max", "Largest Zs allowed (U0 / Ia)", "Ω"),
        Output("disconnection_time", "Disconnection time required", "s"),
        Output("r1_r2", "R1 + R2 of the run", "Ω"),
    ),
    compute=_ground_fault_view,
)


# ---- gfci-check -------------------------------------------------------------------------------

class TimeRule(NamedTuple):
    """What a GFCI or RCD must do at one test current."""

    least: float | None  # least break time [s] (type S), None if none
    greatest: float | None  # greatest trip time [s], None where no time is set
    must_not_trip: bool  # the current is in the region where the device must hold
    text: str  # the rule, in words, with its source


def trip_time_rule(device, test_current, rated_residual=ADDITIONAL_PROTECTION_A):
    """The trip-time rule at `test_current` [A] for a "gfci" (UL 943 Class A), "rcd" (general)
    or "rcd-s" (type S) of rated residual current `rated_residual` [A] (RCDs only).

    Notes
    -----
    GFCI: no trip below 4 mA; no time set from 4 to 6 mA; T = (20/I)^1.43 s from 6 mA (the
    formula's range ends at 264 mA; it is carried on above). RCD: no trip at or below 50 % IΔn;
    no time set below IΔn; from IΔn the limit of the highest test multiple reached.

    Examples
    --------
    >>> trip_time_rule("rcd", 0.015, 0.03).must_not_trip, trip_time_rule("gfci", 0.005).greatest
    (True, None)
    """
    if device == "gfci":
        if test_current < GFCI_NO_TRIP_A:
            return TimeRule(None, None, True, "below 4 mA a Class A GFCI must not trip (UL 943)")
        if test_current < GFCI_CURVE_RANGE_A[0]:
            return TimeRule(None, None, False, "from 4 to 6 mA UL 943 sets no trip time")
        return TimeRule(None, gfci_time_limit(test_current), False,
                        "UL 943: T = (20 / I)^1.43 s, I in mA")
    multiple = test_current / rated_residual
    if multiple <= RCD_NO_TRIP_FRACTION * (1 + 1e-9):
        return TimeRule(None, None, True, "at or below 50 % of IΔn an RCD must not trip "
                        "(IEC 61008-1 / 61009-1)")
    limits = rcd_time_limits(test_current, rated_residual, device)
    if limits is None:
        return TimeRule(None, None, False, "between 50 % and 100 % of IΔn the standard sets no "
                        "break time")
    reached = max(m for m in RCD_BREAK_TIMES_S[device] if multiple >= m * (1 - 1e-9))
    return TimeRule(*limits, False, f"IEC 61008-1 / 61009-1 break time at {reached} × IΔn "
                    f"(the test is at {multiple:.3g} × IΔn)")


def _trip_current_check(result, gfci, trip_current, no_trip, must_trip):
    """Judge a ramp test's trip current; returns whether it passes."""
    ok = (no_trip <= trip_current if gfci else no_trip < trip_current) and trip_current <= must_trip
    if ok:
        message = (f"Tripped at {fq(trip_current, 'A')}, within the {fq(no_trip, 'A')} to "
                   f"{fq(must_trip, 'A')} window")
    elif trip_current > must_trip:
        message = (f"Tripped at {fq(trip_current, 'A')}, above the {fq(must_trip, 'A')} it must "
                   "trip by: it does not protect as rated; replace it")
    else:
        message = (f"Tripped at {fq(trip_current, 'A')}, in the region up to {fq(no_trip, 'A')} "
                   "where it must hold: it will trip on normal leakage (nuisance trips); check "
                   "the circuit's leakage, then the device")
    rule = ("UL 943 Class A: no trip below 4 mA, trip at 6 mA" if gfci else
            "IEC 61008-1 / 61009-1: no trip at 50 % IΔn, trip by IΔn")
    result.check("trip_current", "pass" if ok else "fail", f"{message} ({rule}).")
    return ok


def _trip_time_check(result, rule, test_current, trip_time):
    """Judge a timed test against its rule; returns whether it passes."""
    at = f"Tripped in {fq(trip_time, 's')} at {fq(test_current, 'A')}"
    if rule.must_not_trip:
        ok, message = False, f"{at}, but {rule.text}: it will trip on normal leakage."
    elif rule.greatest is None:
        ok, message = True, f"{at}; {rule.text}."
    else:
        slow = trip_time > rule.greatest
        fast = rule.least is not None and trip_time < rule.least
        ok = not (slow or fast)
        message = f"{at}; the greatest time allowed is {fq(rule.greatest, 's')}"
        if rule.least is not None:
            message += f" and a time-delayed type S must take at least {fq(rule.least, 's')}"
        message += f" ({rule.text})"
        message += (": too slow, replace it." if slow else ": faster than a type S may be, so it "
                    "will not discriminate with the device downstream." if fast else ".")
    result.check("trip_time", "pass" if ok else "fail", message)
    return ok


def _gfci_view(inputs):
    device = inputs["device"]
    gfci = device == "gfci"
    rated = inputs["rated_residual"]
    trip_current, test_current, trip_time = (inputs["trip_current"], inputs["test_current"],
                                             inputs["trip_time"])
    result = Result()
    if trip_time is not None and test_current is None:
        if gfci:
            raise InputError("test_current", None, "enter the test current the trip time was "
                             "measured at (the UL 943 time is for 6 to 264 mA)")
        test_current = rated
        result.step("No test current given: the timed test is taken at IΔn", "I_test = IΔn",
                    f"= {fq(rated, 'A')}")
    no_trip = GFCI_NO_TRIP_A if gfci else RCD_NO_TRIP_FRACTION * rated
    must_trip = GFCI_MUST_TRIP_A if gfci else rated
    result.output("no_trip_below", no_trip)
    result.output("must_trip_at", must_trip)
    if gfci:
        result.step("UL 943 Class A GFCI thresholds (fixed by the standard; IΔn is not used)",
                    "no trip below 4 mA; trip at 6 mA and above",
                    f"= {fq(no_trip, 'A')} / {fq(must_trip, 'A')}")
    else:
        result.step(f"RCD with IΔn = {fq(rated, 'A')}", "no trip at 50 % IΔn; trip by IΔn",
                    f"= {fq(no_trip, 'A')} / {fq(must_trip, 'A')}")

    verdicts = []
    if trip_current is not None:
        result.step("Measured trip current (ramp test)", "I_trip", f"= {fq(trip_current, 'A')}")
        verdicts.append(_trip_current_check(result, gfci, trip_current, no_trip, must_trip))
    if test_current is not None:
        rule = trip_time_rule(device, test_current, rated)
        if rule.greatest is not None:
            result.output("time_limit", rule.greatest)
            if rule.least is not None:
                result.output("min_time", rule.least)
            span = (f"{fq(rule.least, 's')} to {fq(rule.greatest, 's')}" if rule.least is not None
                    else f"at most {fq(rule.greatest, 's')}")
            formula = f"(20 / {test_current * 1e3:.4g})^1.43 s = " if gfci else ""
            result.step(f"Trip time allowed at {fq(test_current, 'A')}: {rule.text}", "t_trip",
                        f"= {formula}{span}")
        else:
            result.step(f"At {fq(test_current, 'A')}: {rule.text}", "—", "no time limit")
        if gfci and not GFCI_CURVE_RANGE_A[0] <= test_current <= GFCI_CURVE_RANGE_A[1]:
            result.check("curve_range", "warn",
                         f"UL 943's time formula holds from {fq(GFCI_CURVE_RANGE_A[0], 'A')} to "
                         f"{fq(GFCI_CURVE_RANGE_A[1], 'A')}; at {fq(test_current, 'A')} "
                         + ("no time applies." if test_current < GFCI_CURVE_RANGE_A[0] else
                            "the time shown is the formula carried beyond its range."))
        if trip_time is not None:
            result.step("Measured trip time", "t", f"= {fq(trip_time, 's')}")
            verdicts.append(_trip_time_check(result, rule, test_current, trip_time))

    if not gfci:
        extra = rated <= ADDITIONAL_PROTECTION_A * (1 + 1e-9)
        result.check("additional_protection", "pass" if extra else "warn",
                     f"IΔn = {fq(rated, 'A')}: " + (
                         "qualifies as additional protection (IΔn ≤ 30 mA, IEC 60364-4-41 "
                         "415.1.1)." if extra else "not additional protection, which needs "
                         "IΔn ≤ 30 mA (IEC 60364-4-41 415.1.1); it can serve fault or fire "
                         "protection."))
        if device == "rcd-s" and extra:
            result.check("type_s", "warn", "Type S (time-delayed) RCDs are made for IΔn above "
                         "30 mA (IEC 61008-1, from memory): check the marking.")
    if verdicts:
        passes = all(verdicts)
        result.output("passes", passes, "yes" if passes else "no")
    else:
        result.check("measured", "warn", "Nothing measured to judge: enter the tester's trip "
                     "current, or its trip time and test current.")

    result.assumptions += [
        "Readings from an RCD / GFCI tester at the outlet, with the circuit's own leakage small "
        "(it adds to the tester's current).",
        "Sinusoidal residual current (the AC test); Type A and B devices have further tests "
        "with pulsating and smooth DC.",
    ]
    result.sources += [
        "UL 943: Class A trips at 6 mA and above, not below 4 mA; T = (20/I)^1.43 s for "
        "6–264 mA (read as quoted).",
        "IEC 61008-1 / 61009-1: break times at IΔn, 2 IΔn, 5 IΔn; no trip at 50 % IΔn "
        "(from memory).",
        "IEC 60364-4-41 415.1.1: RCDs of IΔn ≤ 30 mA as additional protection.",
    ]
    result.cautions += [
        "The TEST button checks the mechanism only: it does not measure the trip current or "
        "time, and does not prove the earthing. Use an RCD / GFCI tester for that.",
        "A GFCI or RCD does not stop a shock between line and neutral through the body, and the "
        "shock is still felt: it limits how long the current flows.",
        "Disconnect equipment with large leakage (drives, heaters) before a ramp test, or the "
        "reading is low; test again with it connected to find nuisance trips.",
    ]
    result.cautions += list(cautions.COMMON)
    result.series = _gfci_chart(device, rated, test_current, trip_time, trip_current)
    return result


def _gfci_chart(device, rated, test_current, trip_time, trip_current):
    if device == "gfci":
        low, high = GFCI_CURVE_RANGE_A
        currents = [low * (high / low) ** (k / 40) for k in range(41)]
        lines = [{"label": "UL 943 greatest trip time", "unit": "ms",
                  "values": [gfci_time_limit(i) * 1e3 for i in currents]}]
    else:
        table = RCD_BREAK_TIMES_S[device]
        points = [(1.0, 1), (1.999, 1), (2.0, 2), (4.999, 2), (5.0, 5), (10.0, 5)]
        currents = [m * rated for m, _ in points]
        lines = [{"label": "Greatest break time", "unit": "ms",
                  "values": [table[key][1] * 1e3 for _, key in points]}]
        if device == "rcd-s":
            lines.append({"label": "Least break time (type S)", "unit": "ms",
                          "values": [table[key][0] * 1e3 for _, key in points]})
    marks = []
    if test_current is not None:
        marks.append({"axis": "x", "value": test_current * 1e3, "label": "Test current"})
    if trip_time is not None:
        marks.append({"axis": "y", "value": trip_time * 1e3, "label": "Measured time"})
    if trip_current is not None:
        marks.append({"axis": "x", "value": trip_current * 1e3, "label": "Measured trip current"})
    return {"title": "Trip time allowed against residual current",
            "x": {"label": "Residual current", "unit": "mA", "values": [i * 1e3 for i in currents]},
            "y_axis": {"label": "Trip time", "unit": "ms"}, "y": lines, "marks": marks}


GFCI_CHECK = Calculator(
    id="gfci-check",
    title="GFCI / RCD test check",
    summary="Judge a tester's trip current and trip time for a Class A GFCI (UL 943) or an RCD "
            "(IEC 61008/61009), with the limits that apply.",
    group="Protection",
    inputs=(
        Input("device", "Device", "choice", default="gfci", choices=DEVICES,
              region_defaults={"iec": "rcd"}),
        Input("rated_residual", "Rated residual current IΔn (RCD)", "quantity", unit="mA",
              default=30, minimum=5, maximum=1000,
              help="From the RCD's marking: 30 mA for additional protection. Not used for a "
                   "GFCI."),
        Input("trip_current", "Measured trip current", "quantity", unit="mA", optional=True,
              minimum=0, min_exclusive=True, maximum=5000,
              region_defaults={"na": "5.1 mA", "iec": "21 mA"},
              help="The ramp test's reading; blank = not measured."),
        Input("test_current", "Test current for the time", "quantity", unit="mA",
              optional=True, minimum=0, min_exclusive=True, maximum=5000,
              help="The current the trip time was measured at (RCD: blank = IΔn)."),
        Input("trip_time", "Measured trip time", "quantity", unit="ms", optional=True,
              minimum=0, min_exclusive=True, maximum=10000, region_defaults={"iec": "24 ms"},
              help="The tester's reading; blank = not measured."),
    ),
    outputs=(
        Output("passes", "Passes the checks made", ""),
        Output("time_limit", "Greatest trip time allowed", "s"),
        Output("min_time", "Least break time (type S)", "s"),
        Output("no_trip_below", "Must not trip at or below", "A"),
        Output("must_trip_at", "Must trip by", "A"),
    ),
    compute=_gfci_view,
)
