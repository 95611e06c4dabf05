"""Protection and shock safety: breaker trip bands and codes, disconnection times, the earth fault
loop of a TN circuit, GFCI and RCD trip-time limits, and the test conditions behind interrupting
ratings. Physics and published tables only; the calculators live in calc/calculators/.

Quantities follow the nomenclature page: voltage [V], current [A], impedance [Ω], length [m],
time [s].
"""

import math
import re
from typing import NamedTuple

from calc import conductors, units
from calc.errors import ParameterError

# ---- published data ---------------------------------------------------------------------------

# IEC 60898-1 instantaneous-trip bands of MCBs, in multiples of the rated current In: the breaker
# must not trip within 0.1 s at the lower limit and must trip within 0.1 s at the upper limit
# (IEC 60898-1: bands read; the 0.1 s test rule from memory).
MCB_INSTANTANEOUS_BANDS = {"B": (3.0, 5.0), "C": (5.0, 10.0), "D": (10.0, 20.0)}
INSTANTANEOUS_TEST_TIME_S = 0.1
# IEC 60898-1 preferred rated currents [A] (read).
MCB_PREFERRED_RATINGS_A = (6, 10, 13, 16, 20, 25, 32, 40, 50, 63, 80, 100, 125)
# IEC 60898-1 covers breakers for rated voltages up to 440 V AC between phases (from memory):
# on a three-phase system that is √3 U0 (line_voltage), so 230/400 V is inside it and 277/480 V
# and 347/600 V are not.
MCB_MAX_VOLTAGE_V = 440.0

# Moulded-case breakers: the instantaneous pickup is the maker's setting ± a tolerance. ± 20 % is
# usual for thermal-magnetic trips (common practice, from memory; the maker's curve states it).
MCCB_TOLERANCE_PCT = 20.0
MCCB_RATING_LIMITS_A = (1.0, 6000.0)  # UL 489 covers breakers up to 6000 A (read, its scope 1.3)
MCCB_MULTIPLE_LIMITS = (2.0, 20.0)  # instantaneous settings offered by makers (common practice)
# Standard ampere ratings of fuses and inverse-time breakers, NEC 240.6(A) (read, as reproduced
# in EC&M's "Code Q&A: Fuse and Breaker Ratings", 2019, and NEC 2023 code-reference pages; 15 to
# 800 A also in urdans/eecalcs OCPD.java, NEC 2014); the additional fuse ratings 1, 3, 6, 10 and
# 601 A are not listed here.
NEC_STANDARD_RATINGS_A = (15, 20, 25, 30, 35, 40, 45, 50, 60, 70, 80, 90, 100, 110, 125, 150, 175,
                          200, 225, 250, 300, 350, 400, 450, 500, 600, 700, 800, 1000, 1200, 1600,
                          2000, 2500, 3000, 4000, 5000, 6000)
# The ratings the form offers (NEC 240.4(B) lets a breaker round up to the next standard rating
# only to 800 A; larger breakers are adjustable).
NEC_FORM_RATINGS_A = tuple(r for r in NEC_STANDARD_RATINGS_A if r <= 800)

# A fuse has no instantaneous trip: it melts in about 0.1 s (the speed of a breaker's magnetic
# trip) at roughly 8 to 15 × its rating (IEC 60269-1 gG 0.1 s gates and UL 248 non-time-delay
# curves, from memory); 10 × is taken as the current that surely clears it quickly — common
# practice. Time-delay fuses carry 5 × for 10 s or more (UL 248, from memory): give the
# multiple read from the maker's curve ("30 A fuse 15x").
FUSE_CLEARING_MULTIPLE = 10.0
FUSE_MULTIPLE_LIMITS = (2.0, 40.0)  # multiples a fuse curve gives at 0.1 s (common practice)
DEVICE_KINDS = {
    "mcb": "IEC 60898-1 miniature circuit breaker",
    "mccb": "inverse-time (thermal-magnetic) breaker",
    "mcp": "instantaneous-trip breaker (motor circuit protector)",
    "fuse": "fuse, melting quickly",
}

# NEC Table 250.122: minimum equipment grounding conductor by the rating of the overcurrent
# device ahead of it, "not exceeding" [A]: (copper, aluminium) sizes (read, as reproduced by
# Bruns Engineering, "NEC Table 250.122"; the same rows up to 1200 A in Mike Holt's 250.122
# commentary). The table's note: where needed to comply with 250.4(A)(5) the EGC shall be larger.
NEC_250_122 = (
    (15, "14 AWG", "12 AWG"), (20, "12 AWG", "10 AWG"), (60, "10 AWG", "8 AWG"),
    (100, "8 AWG", "6 AWG"), (200, "6 AWG", "4 AWG"), (300, "4 AWG", "2 AWG"),
    (400, "3 AWG", "1 AWG"), (500, "2 AWG", "1/0 AWG"), (600, "1 AWG", "2/0 AWG"),
    (800, "1/0 AWG", "3/0 AWG"), (1000, "2/0 AWG", "4/0 AWG"), (1200, "3/0 AWG", "250 kcmil"),
    (1600, "4/0 AWG", "350 kcmil"), (2000, "250 kcmil", "400 kcmil"),
    (2500, "350 kcmil", "600 kcmil"), (3000, "400 kcmil", "600 kcmil"),
    (4000, "500 kcmil", "750 kcmil"), (5000, "700 kcmil", "1250 kcmil"),
    (6000, "800 kcmil", "1250 kcmil"),
)
_CMIL_M2 = 5.067074790974977e-10  # one circular mil [m²] (π/4 × (25.4 µm)², exact)

# IEC 60364-4-41 Table 41.1: maximum disconnection times [s] for final circuits, AC, by U0 band:
# (highest U0 of the band [V], TN, TT); each band starts just above the previous one, the first
# above 50 V, and the last is open (IEC 60364-4-41 Table 41.1, read, as quoted at
# ericmark.talktalk.net/41-1.html).
TABLE_41_1_S = ((120.0, 0.8, 0.3), (230.0, 0.4, 0.2), (400.0, 0.2, 0.07), (None, 0.1, 0.04))
TABLE_41_1_LOWEST_U0_V = 50.0
# IEC 60364-4-41:2005 411.3.2.2 applies Table 41.1 to final circuits up to 32 A (read, as quoted
# on the same page);
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
# has no least time. The greatest times read, as reproduced (BS EN 61008-1 / 61009-1 table quoted
# at html.pdfcookie.com/02/2019/12/28/rvr7mmqer72o/rvr7mmqer72o.html); the type S least times
# from memory (H at IΔn and 5 IΔn; M at 2 IΔn, where a tester's manual gives 0.05 s).
RCD_BREAK_TIMES_S = {
    "rcd": {1: (None, 0.3), 2: (None, 0.15), 5: (None, 0.04)},
    "rcd-s": {1: (0.13, 0.5), 2: (0.06, 0.2), 5: (0.05, 0.15)},
}
RCD_NO_TRIP_FRACTION = 0.5  # must not trip at 50 % of IΔn (IEC 61008-1, from memory, H)
# IEC 60364-4-41 415.1.1: RCDs of IΔn ≤ 30 mA give additional protection, operating within 40 ms
# at 5 IΔn (read, as quoted with its clause number in the html.pdfcookie.com article above; BS
# 7671 17th ed. numbering, which follows IEC 60364-4-41).
ADDITIONAL_PROTECTION_A = 30e-3
_MULTIPLE_ROUNDING = 1e-9  # a test current entered as exactly k × IΔn reaches k × IΔn

# UL 489 short-circuit test power factor by interrupting rating (read, as reproduced in TSEWG
# TP-6 "Low-voltage breaker interrupting ratings", 2008, Table 1, studylib.net/doc/12093578): up
# to 10 kA 0.45–0.50, 10–20 kA 0.25–0.30, above 20 kA 0.15–0.20. The rating holds up to the X/R of
# the test; the highest power factor of each range (the lowest X/R) is taken, the safe side.
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
    """A protective device as the fault-clearing checks need it: its instantaneous (fast) region.

    The name is kept for its first use; a fuse is one too (kind "fuse").
    """

    code: str  # canonical text: "B16", "100 A 10x", "MCP 50 A 8x", "30 A fuse 10x"
    kind: str  # a key of DEVICE_KINDS: "mcb", "mccb", "mcp" or "fuse"
    rating_a: float  # In [A]
    lowest_multiple: float  # below this multiple of In the instantaneous trip does not act
    operating_multiple: float  # at this multiple it surely acts (Ia = multiple × In)


_MCB_CODE = re.compile(r"\s*([BCDbcd])\s*(\d+(?:\.\d+)?)\s*(?:A|a)?\s*")
_MCCB_CODE = re.compile(r"\s*(MCP\s+)?(\d+(?:\.\d+)?)\s*[Aa]\s+(\d+(?:\.\d+)?)\s*[xX×]\s*",
                        re.IGNORECASE)
_FUSE_CODE = re.compile(r"\s*(\d+(?:\.\d+)?)\s*[Aa]\s+fuse(?:\s+(\d+(?:\.\d+)?)\s*[xX×])?\s*",
                        re.IGNORECASE)

BREAKER_FORMS = (
    "an IEC 60898-1 MCB as its type letter B, C or D and a preferred rating "
    f"({', '.join(str(r) for r in MCB_PREFERRED_RATINGS_A)} A), e.g. B16, C32, D20; an "
    "inverse-time breaker as its rating and instantaneous multiple, e.g. 100 A 10x (rating "
    f"{MCCB_RATING_LIMITS_A[0]:g} to {MCCB_RATING_LIMITS_A[1]:g} A, multiple "
    f"{MCCB_MULTIPLE_LIMITS[0]:g}x to {MCCB_MULTIPLE_LIMITS[1]:g}x); an instantaneous-trip breaker "
    "as MCP 50 A 8x; or a fuse as 30 A fuse (melting quickly at "
    f"{FUSE_CLEARING_MULTIPLE:g}x) or 30 A fuse 15x"
)


def protective_device(kind, rated_current, multiple=None, tolerance_pct=MCCB_TOLERANCE_PCT):
    """A protective device's instantaneous region from its kind, rating and setting.

    Parameters
    ----------
    kind : str
        "mcb" (IEC 60898-1, `multiple` is its type letter B, C or D), "mccb" (inverse-time
        breaker with a magnetic trip at `multiple` × In), "mcp" (instantaneous-trip breaker set
        at `multiple` × In) or "fuse" (melting quickly at `multiple` × In; None takes
        FUSE_CLEARING_MULTIPLE).
    rated_current : float
        Rated current In [A].
    multiple : float or str or None
        Instantaneous setting [× In], or the MCB's type letter.
    tolerance_pct : float
        Pickup tolerance of a breaker's instantaneous setting [%] (mccb and mcp only).

    Returns
    -------
    Breaker
        Its canonical code, kind, rating [A] and the band of the instantaneous region in
        multiples of In [-].

    Raises
    ------
    calc.errors.ParameterError
        On parameter "kind", "rated_current" or "multiple", saying what is allowed.

    Notes
    -----
    MCB: the band of IEC 60898-1 (B 3–5, C 5–10, D 10–20 × In). Breakers with a setting m:
    m × (1 − t) to m × (1 + t). Fuse: no band; m × In melts it in about 0.1 s.

    References
    ----------
    IEC 60898-1 bands and preferred ratings (read). UL 489 scope 1.3, up to 6000 A (read).
    Pickup tolerance ± 20 %: common practice, from memory. Fuse multiple: IEC 60269-1 gG gates
    and UL 248 curves (from memory), common practice.

    Examples
    --------
    >>> protective_device("mcp", 50, 8).operating_multiple
    9.6
    >>> protective_device("fuse", 30).code
    '30 A fuse 10x'
    """
    if kind not in DEVICE_KINDS:
        raise ParameterError("kind", kind, f"{kind!r} is not one of {', '.join(DEVICE_KINDS)}")
    if kind == "mcb":
        letter = str(multiple).upper()
        if letter not in MCB_INSTANTANEOUS_BANDS:
            raise ParameterError("multiple", multiple, "an MCB's type is B, C or D")
        if rated_current not in MCB_PREFERRED_RATINGS_A:
            raise ParameterError("rated_current", rated_current,
                                 f"{rated_current:g} A is not an IEC 60898-1 preferred rating")
        low, high = MCB_INSTANTANEOUS_BANDS[letter]
        return Breaker(f"{letter}{rated_current:g}", kind, float(rated_current), low, high)
    low_a, high_a = MCCB_RATING_LIMITS_A
    if not low_a <= rated_current <= high_a:
        raise ParameterError("rated_current", rated_current,
                             f"a rating is {low_a:g} to {high_a:g} A")
    if kind == "fuse":
        multiple = FUSE_CLEARING_MULTIPLE if multiple is None else multiple
        low_m, high_m = FUSE_MULTIPLE_LIMITS
    else:
        low_m, high_m = MCCB_MULTIPLE_LIMITS
    if multiple is None or not low_m <= multiple <= high_m:
        what = "a fuse's quick-melting multiple" if kind == "fuse" else "an instantaneous multiple"
        raise ParameterError("multiple", multiple, f"{what} is {low_m:g}x to {high_m:g}x")
    if kind == "fuse":
        return Breaker(f"{rated_current:g} A fuse {multiple:g}x", kind, float(rated_current),
                       multiple, multiple)
    spread = tolerance_pct / 100.0
    prefix = "MCP " if kind == "mcp" else ""
    return Breaker(f"{prefix}{rated_current:g} A {multiple:g}x", kind, float(rated_current),
                   multiple * (1 - spread), multiple * (1 + spread))


def parse_breaker(code, tolerance_pct=MCCB_TOLERANCE_PCT):
    """Read a protective device code: an IEC 60898-1 MCB ("B16"), an inverse-time breaker's
    instantaneous setting ("100 A 10x"), an instantaneous-trip breaker ("MCP 50 A 8x") or a fuse
    ("30 A fuse", "30 A fuse 15x").

    Parameters
    ----------
    code : str
        The device as text, in one of the forms above.
    tolerance_pct : float
        Pickup tolerance of a breaker's instantaneous setting [%] (not used for MCBs, whose band
        limits are already the guarantee, nor for fuses).

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
    D 10–20 × In); Ia is the upper limit. Breakers with a setting m: Ia = m × (1 + tolerance)
    × In. Fuse: Ia = m × In, m = 10 unless given.

    References
    ----------
    IEC 60898-1: instantaneous trip bands and preferred ratings (read). UL 489 scope 1.3, up to
    6000 A (read). Pickup tolerance ± 20 %: common practice, from memory.

    Examples
    --------
    >>> parse_breaker("c32").operating_multiple, parse_breaker("100 A 10x").operating_multiple
    (10.0, 12.0)
    >>> parse_breaker("30 a FUSE").operating_multiple
    10.0
    """
    text = code if isinstance(code, str) else ""
    mcb, mccb, fuse = (form.fullmatch(text) for form in (_MCB_CODE, _MCCB_CODE, _FUSE_CODE))
    try:
        if mcb:
            return protective_device("mcb", float(mcb[2]), mcb[1], tolerance_pct)
        if mccb:
            return protective_device("mcp" if mccb[1] else "mccb", float(mccb[2]),
                                     float(mccb[3]), tolerance_pct)
        if fuse:
            return protective_device("fuse", float(fuse[1]),
                                     float(fuse[2]) if fuse[2] else None)
        message = "not a breaker code"
    except ParameterError as error:
        message = error.message
    raise ParameterError("code", code, f"{code!r}: {message}; enter {BREAKER_FORMS}")


def operating_current(breaker):
    """Ia: the current that surely operates a device's instantaneous trip (or melts a fuse
    quickly).

    Parameters
    ----------
    breaker : Breaker
        As parse_breaker or protective_device gives it.

    Returns
    -------
    float
        Ia [A].

    Notes
    -----
    Ia = k × In, k the upper limit of the instantaneous band (MCB), the setting plus its pickup
    tolerance (breakers with a setting) or the fuse's quick-melting multiple.

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


def standard_ratings(breaker):
    """The published series of ratings a device of this kind is made in.

    Parameters
    ----------
    breaker : Breaker
        As parse_breaker or protective_device gives it.

    Returns
    -------
    tuple of float
        Ratings [A], smallest first: IEC 60898-1 preferred ratings for an MCB, NEC 240.6(A)
        standard ratings otherwise.

    Notes
    -----
    A rating suggested to a user comes from one of these series, never from arithmetic.

    References
    ----------
    IEC 60898-1 preferred ratings (read); NEC 240.6(A) (read, as reproduced in EC&M, 2019).

    Examples
    --------
    >>> standard_ratings(parse_breaker("B16"))[:4]
    (6.0, 10.0, 13.0, 16.0)
    """
    series = MCB_PREFERRED_RATINGS_A if breaker.kind == "mcb" else NEC_STANDARD_RATINGS_A
    return tuple(float(r) for r in series)


# ---- fault clearing by the instantaneous region (NEC effective ground-fault current path) ------

class FaultClearing(NamedTuple):
    """A far-end fault current against the current that surely operates a device quickly."""

    fault_a: float  # prospective fault current at the far end, U0 / Zs [A]
    required_a: float  # Ia: the current that surely operates the instantaneous region [A]
    clears: bool  # fault_a ≥ required_a
    margin: float  # fault_a / required_a [-]
    loop_impedance_max: float  # the largest loop impedance that still clears, U0 / Ia [Ω]


def instantaneous_clearing(voltage, loop_impedance, breaker):
    """Does a bolted fault at the far end of a circuit operate the device's instantaneous trip
    (or melt its fuse quickly)? The judgement of an effective ground-fault current path.

    Parameters
    ----------
    voltage : float
        U0, nominal line-to-ground (line-to-earth) voltage [V].
    loop_impedance : float
        Zs, impedance of the fault loop from the source through the line conductor to the fault
        and back on the equipment grounding conductor [Ω] (earth_fault_loop_impedance).
    breaker : Breaker
        The protective device, as parse_breaker or protective_device gives it: an MCB, an
        inverse-time breaker's magnetic trip or an instantaneous-trip breaker with its pickup
        tolerance, or a fuse with its quick-melting multiple.

    Returns
    -------
    FaultClearing
        The fault current [A], the current Ia that surely operates the device [A], whether the
        fault reaches it, the margin I_f / Ia [-] and the largest Zs that clears [Ω].

    Raises
    ------
    calc.errors.ParameterError
        On parameter "voltage" or "loop_impedance" when not above 0.

    Notes
    -----
    I_f = U0 / Zs; clears when I_f ≥ Ia, Ia = operating_current(breaker) (the upper end of the
    pickup band with its tolerance). The same as Zs × Ia ≤ U0 (IEC 60364-4-41 411.4.4), without
    a disconnection time: the NEC asks for a path of impedance low enough to "facilitate the
    operation of the overcurrent device" (250.4(A)(5)); the instantaneous trip opens within a
    few cycles, a thermal trip may take minutes.

    References
    ----------
    NEC 250.4(A)(5) effective ground-fault current path and the note to Table 250.122 (read, as
    reproduced by Bruns Engineering); IEC 60364-4-41:2005 411.4.4 (read as quoted).

    Examples
    --------
    >>> clearing = instantaneous_clearing(120.0, 0.546, parse_breaker("20 A 10x"))
    >>> round(clearing.fault_a, 1), clearing.required_a, clearing.clears
    (219.8, 240.0, False)
    """
    for name, value in (("voltage", voltage), ("loop_impedance", loop_impedance)):
        if not value > 0.0:
            raise ParameterError(name, value, f"{name} must be above 0")
    fault = voltage / loop_impedance
    required = operating_current(breaker)
    return FaultClearing(fault, required, fault >= required, fault / required,
                         voltage / required)


def largest_clearing_rating(fault_current, breaker):
    """The largest standard rating of the same kind and setting that a fault current still
    operates instantaneously.

    Parameters
    ----------
    fault_current : float
        Prospective fault current at the far end [A].
    breaker : Breaker
        The device as chosen; its type letter, multiple and tolerance are kept.

    Returns
    -------
    float or None
        Rating [A] from the device's published series (standard_ratings), or None when even the
        smallest is not operated.

    Notes
    -----
    The largest In of the series with In × k ≤ I_f, k the device's operating multiple.

    References
    ----------
    IEC 60898-1 preferred ratings (read); NEC 240.6(A) standard ratings (read, as reproduced in
    EC&M, 2019).

    Examples
    --------
    >>> largest_clearing_rating(219.8, parse_breaker("20 A 10x"))
    15.0
    >>> largest_clearing_rating(219.8, parse_breaker("B32"))
    40.0
    """
    fitting = [rating for rating in standard_ratings(breaker)
               if rating * breaker.operating_multiple <= fault_current]
    return fitting[-1] if fitting else None


def egc_minimum_size(device_rating, material):
    """Smallest equipment grounding conductor NEC Table 250.122 allows behind a device.

    Parameters
    ----------
    device_rating : float
        Rating or setting of the overcurrent device ahead of the conductor [A].
    material : str
        "cu" or "al" (aluminium or copper-clad aluminium).

    Returns
    -------
    tuple of (str, float) or None
        The size's label and its area [m²]; None above the table's 6000 A row.

    Raises
    ------
    calc.errors.ParameterError
        On parameter "material" for anything but "cu" or "al".

    Notes
    -----
    The first row whose rating the device does not exceed. The table is a minimum: 250.122(A)
    never asks for an EGC larger than the circuit conductors, and its note asks for a larger one
    where needed to comply with 250.4(A)(5) (the fault must still operate the device).

    References
    ----------
    NEC Table 250.122 (read, as reproduced by Bruns Engineering, "NEC Table 250.122").

    Examples
    --------
    >>> egc_minimum_size(20, "cu")[0], egc_minimum_size(100, "al")[0]
    ('12 AWG', '6 AWG')
    """
    if material not in ("cu", "al"):
        raise ParameterError("material", material, "material must be cu or al")
    for highest, copper, aluminium in NEC_250_122:
        if device_rating <= highest:
            label = copper if material == "cu" else aluminium
            return label, _area_of(label)
    return None


def _area_of(label):
    """Area [m²] of an AWG or kcmil label of Table 250.122 (1250 kcmil is beyond calc.units)."""
    if label.endswith("kcmil"):
        return float(label.split()[0]) * 1e3 * _CMIL_M2
    return units.parse_conductor_size(label).area_m2


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
    IEC 60228 Table 2 (read); NEC Chapter 9 Tables 8 and 9 (read, as reproduced); IEC 60287-1-1
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
    IEC 61008-1 / IEC 61009-1 break-time tests at IΔn, 2 IΔn and 5 IΔn (read, as reproduced:
    see RCD_BREAK_TIMES_S).

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
    IEC 61008-1 / IEC 61009-1: general type 300 / 150 / 40 ms at 1 / 2 / 5 IΔn, type S at most
    500 / 200 / 150 ms (read, as reproduced: see RCD_BREAK_TIMES_S); type S at least 130 ms at
    IΔn and 50 ms at 5 IΔn (from memory, H), 60 ms at 2 IΔn (from memory, M).

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
    0.15–0.20 above (read, as reproduced in TSEWG TP-6 Table 1, studylib.net/doc/12093578).

    Examples
    --------
    >>> round(rating_test_x_r(22e3), 3), round(rating_test_x_r(10e3), 3)
    (4.899, 1.732)
    """
    power_factor = _band_value(UL489_TEST_POWER_FACTOR, interrupting_rating, 0)
    return math.sqrt(1.0 / power_factor ** 2 - 1.0)
