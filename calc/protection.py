"""Protection and shock safety: breaker trip bands and codes, disconnection times, the earth fault
loop of a TN circuit, GFCI and RCD trip-time limits, and the test conditions behind interrupting
ratings. Physics and published tables only; the calculators live in calc/calculators/.

Quantities follow the nomenclature page: voltage [V], current [A], impedance [Ω], length [m],
time [s].
"""

import math
import re
from typing import NamedTuple

from calc import conductors
from calc.errors import ParameterError

# ---- published data ---------------------------------------------------------------------------

# IEC 60898-1 instantaneous-trip bands of MCBs, in multiples of the rated current In: the breaker
# must not trip within 0.1 s at the lower limit and must trip within 0.1 s at the upper limit
# (IEC 60898-1: bands read; the 0.1 s test rule from memory).
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
# Standard ampere ratings of NEC 240.6(A) from 15 to 800 A (from memory).
NEC_STANDARD_RATINGS_A = (15, 20, 25, 30, 35, 40, 45, 50, 60, 70, 80, 90, 100, 110, 125, 150, 175,
                          200, 225, 250, 300, 350, 400, 450, 500, 600, 700, 800)

# IEC 60364-4-41 Table 41.1: maximum disconnection times [s] for final circuits, AC, by U0 band:
# (highest U0 of the band [V], TN, TT); each band starts just above the previous one, the first
# above 50 V, and the last is open (IEC 60364-4-41 Table 41.1, read).
TABLE_41_1_S = ((120.0, 0.8, 0.3), (230.0, 0.4, 0.2), (400.0, 0.2, 0.07), (None, 0.1, 0.04))
TABLE_41_1_LOWEST_U0_V = 50.0
# IEC 60364-4-41:2005 411.3.2.2 applies Table 41.1 to final circuits up to 32 A (read);
# AMD1:2017 and BS 7671:2018 extend it to 63 A socket-outlet circuits (read as quoted, M).
TABLE_41_1_MAX_RATING_A = 32.0
# Distribution circuits (and circuits Table 41.1 does not cover): 5 s in TN (411.3.2.3, read),
# 1 s in TT (411.3.2.4, from memory).
DISTRIBUTION_TIME_S = {"tn": 5.0, "tt": 1.0}

# UL 943 Class A GFCI: trips at 6 mA and above, does not trip below 4 mA (UL 943, read); trip
# time T = (20 / I)^1.43 s with I in mA, for 6 mA to 264 mA (UL 943, read as quoted).
GFCI_MUST_TRIP_A = 6e-3
GFCI_NO_TRIP_A = 4e-3
GFCI_CURVE_A = 20e-3  # the 20 mA of the formula
GFCI_CURVE_EXPONENT = 1.43
GFCI_CURVE_RANGE_A = (6e-3, 264e-3)

# IEC 61008-1 / 61009-1 break times [s] at multiples of IΔn: (least, greatest); the general type
# has no least time (IEC 61008-1 / 61009-1, from memory, H; the type S times at 2 IΔn from
# memory, M).
RCD_BREAK_TIMES_S = {
    "rcd": {1: (None, 0.3), 2: (None, 0.15), 5: (None, 0.04)},
    "rcd-s": {1: (0.13, 0.5), 2: (0.06, 0.2), 5: (0.05, 0.15)},
}
RCD_NO_TRIP_FRACTION = 0.5  # must not trip at 50 % of IΔn (IEC 61008-1, from memory, H)
# IEC 60364-4-41 415.1.1: RCDs of IΔn ≤ 30 mA give additional protection (the 30 mA read as
# quoted; the clause number from memory).
ADDITIONAL_PROTECTION_A = 30e-3
_MULTIPLE_ROUNDING = 1e-9  # a test current entered as exactly k × IΔn reaches k × IΔn

# UL 489 short-circuit test power factor by interrupting rating (from memory): up to 10 kA
# 0.45–0.50, 10–20 kA 0.25–0.30, above 20 kA 0.15–0.20. The rating holds up to the X/R of the
# test; the highest power factor of each range (the lowest X/R) is taken, the safe side.
UL489_TEST_POWER_FACTOR = ((10e3, 0.50), (20e3, 0.30), (None, 0.20))

# Maximum short-circuit currents take conductors at 20 °C (IEC 60909-0, from memory): cold
# conductors give the most current, the duty an interrupting rating must meet.
MAX_FAULT_CONDUCTOR_C = 20.0


def _band_value(table, key, column):
    """The column of the first (highest, ...) band holding `key`; the last band is open."""
    for highest, *rest in table:
        if highest is None or key <= highest:
            return rest[column]
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
        Its canonical code, kind, rating [A] and the instantaneous band in multiples of In [-].

    Raises
    ------
    calc.errors.ParameterError
        On parameter "code", listing the allowed forms and ratings.

    Notes
    -----
    MCB: the instantaneous trip acts between the band limits of IEC 60898-1 (B 3–5, C 5–10,
    D 10–20 × In); Ia is the upper limit. Moulded-case: setting m × (1 ± tolerance); Ia is the
    upper end, m × (1 + tolerance) × In.

    References
    ----------
    IEC 60898-1: instantaneous trip bands and preferred ratings (read). UL 489 scope 1.3, up to
    6000 A (read). Moulded-case pickup tolerance ± 20 %: common practice, from memory.

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
    raise ParameterError("code", code, f"{code!r}: {message}; enter {BREAKER_FORMS}")


def operating_current(breaker):
    """Ia: the current that surely operates a breaker's instantaneous trip.

    Parameters
    ----------
    breaker : Breaker
        As parse_breaker reads it.

    Returns
    -------
    float
        Ia [A].

    Notes
    -----
    Ia = k × In, k the upper limit of the instantaneous band (MCB) or the setting plus its pickup
    tolerance (moulded-case).

    References
    ----------
    IEC 60364-4-41:2005 411.4.4 (Ia, the current that operates the device in the required
    time; read as quoted); IEC 60898-1 band limits (read).

    Examples
    --------
    >>> operating_current(parse_breaker("B32"))
    160.0
    """
    return breaker.operating_multiple * breaker.rating_a


# ---- fault loop (TN) --------------------------------------------------------------------------

def disconnection_time(voltage, circuit_type="final", system="tn"):
    """Maximum disconnection time of IEC 60364-4-41 for a fault to an exposed part.

    Parameters
    ----------
    voltage : float
        U0, nominal AC line-to-earth voltage [V]; above 50 V.
    circuit_type : str
        "final" (Table 41.1) or "distribution" (5 s TN, 1 s TT).
    system : str
        "tn" or "tt".

    Returns
    -------
    float
        Time [s].

    Notes
    -----
    Final circuits: the time of the Table 41.1 band holding U0 (50–120, 120–230, 230–400,
    above 400 V). Distribution circuits: 5 s (TN) or 1 s (TT), whatever U0.

    References
    ----------
    IEC 60364-4-41:2005, Table 41.1 (read), 411.3.2.3 (TN 5 s, read) and 411.3.2.4 (TT 1 s,
    from memory).

    Examples
    --------
    >>> disconnection_time(230), disconnection_time(120), disconnection_time(230, "distribution")
    (0.4, 0.8, 5.0)
    """
    if circuit_type == "distribution":
        return DISTRIBUTION_TIME_S[system]
    return _band_value(TABLE_41_1_S, voltage, 0 if system == "tn" else 1)


def loop_impedance_per_metre(size, cpc_size, material, temperature_c, frequency):
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
    frequency : float
        Supply frequency [Hz].

    Returns
    -------
    complex
        (R1 + R2) + j(X1 + X2) [Ω/m].

    Notes
    -----
    z = (R1 + R2) + j(X1 + X2), each conductor's R from the published table (IEC 60228 Class 2 at
    20 °C or NEC Chapter 9 Table 8 at 75 °C) corrected to temperature, with IEC 60287 skin and
    proximity effect; X of each conductor from calc.conductors.impedance (touching conductors;
    NEC Table 9 for AWG in conduit).

    References
    ----------
    IEC 60228 Table 2 (read); NEC Chapter 9 Tables 8 (read) and 9 (from memory); IEC 60287-1-1
    skin and proximity effect (from memory).

    Examples
    --------
    >>> from calc.units import parse_conductor_size as size
    >>> z = loop_impedance_per_metre(size("2.5 mm2"), size("1.5 mm2"), "cu", 20.0, 50.0)
    >>> round(z.real * 1e3, 2)
    19.51
    """
    total = 0j
    for conductor in (size, cpc_size):
        z = conductors.impedance(conductor, material, temperature_c, frequency, "pvc",
                                 None, "table")
        total += complex(z.r_ac, z.x)
    return total


def earth_fault_loop_impedance(external_impedance, impedance_per_metre, length):
    """Earth fault loop impedance Zs of a TN circuit: Ze plus the loop of the run.

    Parameters
    ----------
    external_impedance : float
        Ze, the loop impedance outside the circuit (measured or declared) [Ω].
    impedance_per_metre : complex
        (R1 + R2) + j(X1 + X2) of the run [Ω/m], as loop_impedance_per_metre gives it.
    length : float
        One-way run length [m].

    Returns
    -------
    float
        Zs [Ω].

    Notes
    -----
    Zs = Ze + |z| × L. Ze is a measured magnitude of unknown angle, so it is added
    arithmetically: never less than the phasor sum, the safe side for a trip check.

    References
    ----------
    IEC 60364-4-41:2005 411.4.4 (Zs, read as quoted); BS 7671 practice Zs = Ze + (R1 + R2)
    (from memory).

    Examples
    --------
    >>> earth_fault_loop_impedance(0.35, 0.02334, 20.0)
    0.8168
    """
    return external_impedance + abs(impedance_per_metre) * length


def max_length_for_disconnection(voltage, external_impedance, impedance_per_metre,
                                 operating_current):
    """Longest run for which the TN condition Zs × Ia ≤ U0 still holds.

    Parameters
    ----------
    voltage : float
        U0, nominal line-to-earth voltage [V].
    external_impedance : float
        Ze [Ω].
    impedance_per_metre : complex
        (R1 + R2) + j(X1 + X2) of the run [Ω/m].
    operating_current : float
        Ia, the current that surely operates the protective device [A].

    Returns
    -------
    float
        Longest one-way length [m]; 0 when Ze alone is too high.

    Notes
    -----
    Zs grows in proportion to length, so the limit is L = (U0 / Ia − Ze) / |z|.

    References
    ----------
    IEC 60364-4-41:2005 411.4.4 (Zs × Ia ≤ U0, read as quoted).

    Examples
    --------
    >>> round(max_length_for_disconnection(230.0, 0.35, 0.02334, 100.0), 2)
    83.55
    """
    return max(0.0, (voltage / operating_current - external_impedance)
               / abs(impedance_per_metre))


# ---- GFCI and RCD -----------------------------------------------------------------------------

def gfci_time_limit(current):
    """UL 943 Class A greatest trip time at a ground-fault current.

    Parameters
    ----------
    current : float or array
        Ground-fault current [A]; the formula holds from 6 mA to 264 mA.

    Returns
    -------
    float or array
        Greatest trip time [s] (elementwise on numpy arrays).

    Notes
    -----
    T = (20 mA / I)^1.43.

    References
    ----------
    UL 943, Class A trip-time formula (read as quoted).

    Examples
    --------
    >>> round(gfci_time_limit(0.264), 4), round(gfci_time_limit(0.006), 3)
    (0.025, 5.594)
    """
    return (GFCI_CURVE_A / current) ** GFCI_CURVE_EXPONENT


def rcd_test_multiple(test_current, rated_residual, device="rcd"):
    """The highest test multiple of IΔn (1, 2 or 5) a test current reaches.

    Parameters
    ----------
    test_current : float
        Residual test current [A].
    rated_residual : float
        IΔn, the RCD's rated residual operating current [A].
    device : str
        "rcd" (general type) or "rcd-s" (type S, time-delayed).

    Returns
    -------
    int or None
        1, 2 or 5; None below IΔn, where the standard sets no break time.

    Notes
    -----
    The largest k of the break-time table with I ≥ k × IΔn (a current entered as exactly
    k × IΔn reaches it despite float rounding).

    References
    ----------
    IEC 61008-1 / IEC 61009-1 break-time tests at IΔn, 2 IΔn and 5 IΔn (from memory).

    Examples
    --------
    >>> rcd_test_multiple(0.09, 0.03), rcd_test_multiple(0.02, 0.03)
    (2, None)
    """
    multiple = test_current / rated_residual
    reached = [m for m in RCD_BREAK_TIMES_S[device] if multiple >= m * (1 - _MULTIPLE_ROUNDING)]
    return max(reached) if reached else None


def rcd_time_limits(test_current, rated_residual, device="rcd"):
    """The break times an RCD must meet at a test current.

    Parameters
    ----------
    test_current : float
        Residual test current [A].
    rated_residual : float
        IΔn [A].
    device : str
        "rcd" (general type) or "rcd-s" (type S, time-delayed).

    Returns
    -------
    tuple or None
        (least, greatest) break time [s], least None for the general type; None where the
        standard sets no time (below IΔn).

    Notes
    -----
    The limit is that of the highest test multiple (1, 2 or 5 IΔn) the current reaches: a larger
    current is never allowed a longer time.

    References
    ----------
    IEC 61008-1 / IEC 61009-1: general type 300 / 150 / 40 ms at 1 / 2 / 5 IΔn; type S 130–500 ms
    at IΔn and 50–150 ms at 5 IΔn (from memory, H), 60–200 ms at 2 IΔn (from memory, M).

    Examples
    --------
    >>> rcd_time_limits(0.15, 0.03), rcd_time_limits(0.06, 0.1, "rcd-s")
    ((None, 0.04), None)
    """
    multiple = rcd_test_multiple(test_current, rated_residual, device)
    return None if multiple is None else RCD_BREAK_TIMES_S[device][multiple]


# ---- interrupting ratings ---------------------------------------------------------------------

def rating_test_x_r(interrupting_rating):
    """X/R up to which a UL 489 interrupting rating holds: that of its test circuit.

    Parameters
    ----------
    interrupting_rating : float
        The breaker's interrupting rating [A].

    Returns
    -------
    float
        X/R of the test circuit [-].

    Notes
    -----
    X/R = √(1 / pf² − 1) with the highest test power factor pf of the rating's range.

    References
    ----------
    UL 489 short-circuit test power factors: 0.45–0.50 up to 10 kA, 0.25–0.30 to 20 kA,
    0.15–0.20 above (from memory).

    Examples
    --------
    >>> round(rating_test_x_r(22e3), 3), round(rating_test_x_r(10e3), 3)
    (4.899, 1.732)
    """
    power_factor = _band_value(UL489_TEST_POWER_FACTOR, interrupting_rating, 0)
    return math.sqrt(1.0 / power_factor ** 2 - 1.0)
