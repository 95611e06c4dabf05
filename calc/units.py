"""Units: read quantities ("13.8 kV", "150 ft") into coherent SI, show SI values the trade's way,
and read standard conductor sizes ("12 AWG", "4/0", "250 kcmil", "2.5 mm²").
"""

import contextlib
import contextvars
import functools
import math
import re
import unicodedata
from fractions import Fraction
from numbers import Integral, Real
from typing import NamedTuple

from calc.errors import UnitError

# Mechanical horsepower, 550 ft·lbf/s, exact from the foot (0.3048 m), the pound (0.453 592 37 kg)
# and standard gravity (9.806 65 m/s², 3rd CGPM 1901): 745.699 871 582 270 22 W. NIST SP 811
# (2008) Appendix B.8 lists it rounded, 7.456 999 E+02 W; "745.699872 W" is that to 9 figures.
HORSEPOWER_W = Fraction("550") * Fraction("0.3048") * Fraction("0.45359237") * Fraction("9.80665")

# Every accepted symbol by dimension, with its factor to the dimension's coherent SI unit (the
# first of each row; temperature is kept in °C, percent in %). Exact by definition: the SI
# prefixes (SI Brochure, 9th ed., 2019, Table 7), min = 60 s and h = 3600 s (Table 8), ft = 0.3048 m
# and in = 0.0254 m (international yard and pound agreement, 1959), 1 °F step = 5/9 K, and
# HORSEPOWER_W above. Symbols are case-sensitive (mV is not MV; MH is not a unit); "kva" and "KVA"
# are read as nameplates write them, "mva" is refused because m is milli. Unicode variants
# (µ U+00B5 / μ U+03BC, ² / 2, Ω U+2126 / U+03A9) are folded together by NFKC on lookup.
# Feet and inches also as the marks a tradesperson writes: 100' or 100′ (a phone's keyboard
# may turn ' into ’), 6" or 6″ (NFKC makes ″ two ′). One revolution is 2π rad, so
# 1 r/min = 2π/60 rad/s (SI Brochure, 9th ed., Table 4 note on the radian). The circular mil is
# CIRCULAR_MIL_M2 below (π/4 × (0.001 in)²); kcmil is a thousand of them.
UNITS_BY_DIMENSION = {
    "voltage": {"V": 1, "mV": "1e-3", "kV": "1e3", "MV": "1e6"},
    "current": {"A": 1, "mA": "1e-3", "kA": "1e3"},
    "apparent_power": {"VA": 1, "kVA": "1e3", "kva": "1e3", "KVA": "1e3", "MVA": "1e6"},
    "power": {"W": 1, "kW": "1e3", "MW": "1e6", "hp": HORSEPOWER_W},
    "reactive_power": {"var": 1, "VAr": 1, "VAR": 1, "kvar": "1e3", "kVAr": "1e3", "kVAR": "1e3",
                       "Mvar": "1e6", "MVAr": "1e6", "MVAR": "1e6"},
    "frequency": {"Hz": 1, "kHz": "1e3", "MHz": "1e6"},
    "inductance": {"H": 1, "mH": "1e-3", "uH": "1e-6", "µH": "1e-6", "μH": "1e-6"},
    "capacitance": {"F": 1, "mF": "1e-3", "uF": "1e-6", "µF": "1e-6", "μF": "1e-6", "nF": "1e-9",
                    "pF": "1e-12"},
    "resistance": {"Ω": 1, "ohm": 1, "ohms": 1, "Ohm": 1, "mΩ": "1e-3", "mohm": "1e-3",
                   "kΩ": "1e3", "kohm": "1e3", "MΩ": "1e6", "Mohm": "1e6"},
    "time": {"s": 1, "ms": "1e-3", "us": "1e-6", "µs": "1e-6", "min": 60, "h": 3600},
    "length": {"m": 1, "mm": "1e-3", "cm": "1e-2", "km": "1e3", "ft": "0.3048", "in": "0.0254",
               "'": "0.3048", "′": "0.3048", "’": "0.3048",
               '"': "0.0254", "″": "0.0254", "”": "0.0254", "''": "0.0254"},
    "area": {"m²": 1, "m2": 1, "mm²": "1e-6", "mm2": "1e-6",
             "kcmil": math.pi / 4 * 25.4e-6**2 * 1000, "cmil": math.pi / 4 * 25.4e-6**2},
    "impedance_per_length": {"Ω/m": 1, "ohm/m": 1, "Ω/km": "1e-3", "ohm/km": "1e-3",
                             "Ω/kft": "10/3048", "ohm/kft": "10/3048", "ohm/1000ft": "10/3048"},
    "percent": {"%": 1},
    "dimensionless": {"": 1},
    "temperature": {"°C": 1, "degC": 1, "C": 1, "°F": "5/9", "degF": "5/9", "K": 1},
    "angular_speed": {"rad/s": 1, "r/min": math.pi / 30, "rpm": math.pi / 30, "RPM": math.pi / 30,
                      "rev/min": math.pi / 30, "r/s": 2 * math.pi},
}

# The reading of 0 °C on the other temperature scales, exact by definition (SI Brochure, 9th ed.,
# 2.3.1: t/°C = T/K − 273.15; and 0 °C = 32 °F).
SCALE_ZEROS = {"°F": 32, "degF": 32, "K": "273.15"}

# Symbols read by the declared unit's dimension. "F" is the farad, except where a temperature is
# asked for: there it is °F. "%" is a percentage, except where a plain number is asked for: there
# 85 % is the ratio 0.85. Values: (dimension, factor, reading at zero).
CONTEXT_UNITS = {
    ("temperature", "F"): ("temperature", Fraction(5, 9), Fraction(32)),
    ("dimensionless", "%"): ("dimensionless", Fraction(1, 100), Fraction(0)),
}

# Each dimension in words (for messages), its preferred units for help text in trade order, and a
# typical entry. A plain number advertises no unit (units_for("dimensionless") is []); where it is
# a ratio (pf, efficiency) "85 %" still reads as 0.85, and the form says so (RATIO_HINT).
DIMENSIONS = {
    "voltage": ("a voltage", ("V", "kV", "mV"), "480 V or 13.8 kV"),
    "current": ("a current", ("A", "kA", "mA"), "208 A or 24.1 kA"),
    "apparent_power": ("apparent power", ("kVA", "VA", "MVA"), "75 kVA"),
    "power": ("real power", ("kW", "W", "MW", "hp"), "7.5 kW or 10 hp"),
    "reactive_power": ("reactive power", ("kvar", "var", "Mvar"), "50 kvar"),
    "frequency": ("a frequency", ("Hz", "kHz"), "60 Hz"),
    "inductance": ("an inductance", ("mH", "µH", "H"), "10 mH"),
    "capacitance": ("a capacitance", ("µF", "nF", "pF", "F"), "4.7 µF"),
    "resistance": ("a resistance", ("Ω", "mΩ", "kΩ", "MΩ", "ohm"), "0.35 ohm or 350 mΩ"),
    "time": ("a time", ("s", "ms", "min", "h"), "0.2 s"),
    "length": ("a length", ("m", "mm", "km", "ft", "in"), "45 m or 150 ft"),
    "area": ("an area", ("mm²", "m²"), "2.5 mm²"),
    "impedance_per_length": ("an impedance per length", ("ohm/km", "ohm/kft", "ohm/m"),
                             "0.193 ohm/km"),
    "percent": ("a percentage", ("%",), "5.75 %"),
    "dimensionless": ("a plain number", (), "0.85 or 2"),
    "temperature": ("a temperature", ("°C", "°F", "K"), "75 °C or 167 °F"),
    "angular_speed": ("a rotational speed", ("r/min", "rad/s"), "1750 r/min"),
}

# How the form and messages describe a plain-number input: a ratio (at most 1) may be typed as
# a percentage; any other plain number (parallel sets, X/R, a price) takes no unit.
RATIO_HINT = "a ratio, e.g. 0.85 or 85 %"
NUMBER_HINT = "a plain number, no unit"

# What format_quantity shows for each dimension: (unit, smallest rounded magnitude it is used
# for), largest first. Trade practice, not a standard: resistance stays in Ω down to 1 mΩ,
# capacitors are rated in µF up to 1 F, lengths stay in metres, per-length impedance is in Ω/km
# (as IEC 60228 cable data), and percent and temperature are never prefixed. This is the IEC
# display system and what format_quantity shows outside any display_units() block.
DISPLAY_UNITS = {
    "voltage": (("kV", 1e3), ("V", 1), ("mV", 0)),
    "current": (("kA", 1e3), ("A", 1), ("mA", 0)),
    "apparent_power": (("MVA", 1e6), ("kVA", 1e3), ("VA", 0)),
    "power": (("MW", 1e6), ("kW", 1e3), ("W", 0)),
    "reactive_power": (("Mvar", 1e6), ("kvar", 1e3), ("var", 0)),
    "frequency": (("MHz", 1e6), ("kHz", 1e3), ("Hz", 0)),
    "inductance": (("H", 1), ("mH", 1e-3), ("µH", 0)),
    "capacitance": (("F", 1), ("µF", 1e-6), ("nF", 1e-9), ("pF", 0)),
    "resistance": (("MΩ", 1e6), ("kΩ", 1e3), ("Ω", 1e-3), ("mΩ", 0)),
    "time": (("s", 1), ("ms", 1e-3), ("µs", 0)),
    "length": (("m", 0),),
    "area": (("m²", 1), ("mm²", 0)),
    "impedance_per_length": (("Ω/km", 0),),
    "percent": (("%", 0),),
    "dimensionless": (("", 0),),
    "temperature": (("°C", 0),),
    "angular_speed": (("r/min", 0),),
}

# Display systems (the page's unit switch, the CLI's --units): "iec" is DISPLAY_UNITS; "na"
# shows what North American trade data uses: lengths in feet (inches below a foot), impedance per
# length in Ω per 1000 ft and areas in kcmil (NEC Chapter 9 Tables 8 and 9). Temperatures stay in
# °C in both (conductor ratings, NEC 310.16, are in °C) and power in W/kW (a motor's hp is the
# calculator's own text). Thresholds are SI values, as in DISPLAY_UNITS.
DISPLAY_SYSTEMS = ("na", "iec")
DISPLAY_OVERRIDES = {
    "na": {
        "length": (("ft", 0.3048), ("in", 0)),
        "impedance_per_length": (("Ω/kft", 0),),
        "area": (("kcmil", 0),),
    },
    "iec": {},
}

# The display rows in force: None outside display_units() (DISPLAY_UNITS, as always), else a
# mapping of dimension -> rows that differ. A ContextVar, so concurrent callers never mix.
_DISPLAY = contextvars.ContextVar("calc_units_display", default=None)
_SYSTEM = "system"  # the key of the system's own name in those rows


class _Unit(NamedTuple):
    dimension: str
    factor: Fraction  # SI value per unit step
    zero: Fraction  # the reading at zero SI: non-zero only for °F and K
    factor_float: float  # the same as floats, for display (format_quantity)
    zero_float: float


def _fold(text):
    """Text as it is looked up: NFKC (µ -> μ, ² -> 2, Ω -> Ω, ℃ -> °C), U+2212 minus as '-'."""
    return unicodedata.normalize("NFKC", text).replace("\u2212", "-").strip()


def _entry(dimension, factor, zero):
    return _Unit(dimension, Fraction(factor), Fraction(zero), float(Fraction(factor)),
                 float(Fraction(zero)))


UNITS = {
    _fold(symbol): _entry(dimension, factor, SCALE_ZEROS.get(symbol, 0))
    for dimension, row in UNITS_BY_DIMENSION.items()
    for symbol, factor in row.items()
}
# Factors of the foot and the inch: a length typed in either is a North American length.
_IMPERIAL_LENGTHS = {Fraction("0.3048"), Fraction("0.0254")}

# A number: optional sign, digits with an optional point, optional exponent; then the unit.
_QUANTITY = re.compile(r"(?P<number>[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(?P<unit>.*)")
_NON_FINITE = re.compile(r"[+-]?(?:nan|inf)", re.IGNORECASE)


def _use(dimension):
    _, preferred, example = DIMENSIONS[dimension]
    return f"use {', '.join(preferred)} (e.g. {example})"


def _unit(symbol, declared=None, text=None):
    """The _Unit of `symbol`; `declared` settles "F" and "%"; `text` is quoted in the error."""
    if not isinstance(symbol, str):
        raise UnitError(f"a unit must be text such as 'V' or 'kVA', not {symbol!r}")
    key = _key(symbol)
    if declared is not None and (declared.dimension, key) in CONTEXT_UNITS:
        return _entry(*CONTEXT_UNITS[declared.dimension, key])
    if key in UNITS:
        return UNITS[key]
    if declared is None:
        known = ", ".join(filter(None, (next(iter(row)) for row in UNITS_BY_DIMENSION.values())))
        raise UnitError(f"unknown unit {symbol!r}; known units include {known}")
    noun = DIMENSIONS[declared.dimension][0]
    raise UnitError(f"'{text}': unknown unit {symbol!r}; for {noun} {_use(declared.dimension)}")


@functools.lru_cache(maxsize=1024)
def _key(symbol):
    """A unit symbol as UNITS holds it: folded, no spaces (cached: each run reads the same few)."""
    return "".join(_fold(symbol).split())


def _number(value, dimension):
    """An int or a finite float as an exact Fraction, or UnitError saying what arrived."""
    example = DIMENSIONS[dimension][2]
    if isinstance(value, bool):
        raise UnitError(f"received {value}, a yes/no value, not a number; enter e.g. {example}")
    if value is None:
        raise UnitError(f"received no value (None); enter a number, e.g. {example}")
    if isinstance(value, Integral):
        return Fraction(int(value))
    if isinstance(value, Real) and math.isfinite(value):
        return Fraction(float(value))
    if isinstance(value, Real):
        raise UnitError(f"received {value!r}, which is not a finite number; enter e.g. {example}")
    raise UnitError(f"received {type(value).__name__} {value!r}; enter a number, e.g. {example}")


def _read(text, dimension):
    """Split quantity text into its number (a Fraction) and its unit text ("" when bare)."""
    folded = _fold(text)
    example = DIMENSIONS[dimension][2]
    if not folded:
        raise UnitError(f"received empty text; enter a number, e.g. {example}")
    if "," in folded:
        raise UnitError(f"'{text}': use a point for decimals and no thousands separators "
                        "(e.g. 1000 or 2.5)")
    if "_" in folded:
        raise UnitError(f"'{text}': write numbers without underscores (e.g. 1000, not 1_000)")
    if _NON_FINITE.match(folded):
        raise UnitError(f"'{text}' is not a finite number; enter e.g. {example}")
    match = _QUANTITY.fullmatch(folded)
    if match is None:
        raise UnitError(f"'{text}' does not start with a number; enter e.g. {example}")
    number = float(match["number"])
    if not math.isfinite(number):
        raise UnitError(f"'{text}' is too large a number; enter e.g. {example}")
    return Fraction(number), match["unit"]


def _float(exact, received):
    try:
        return float(exact)
    except OverflowError:
        raise UnitError(f"{received!r} is too large to compute with (over 1.8e308)") from None


def to_si(value, unit: str) -> float:
    """Read a quantity into the coherent SI unit of its declared unit's dimension.

    Parameters
    ----------
    value : int, float or str
        A number in the declared `unit`, or text: a number with an optional unit, with or
        without a space ("150 ft", "13.8kV", "4.7 µF", "85 %", "167 °F"). Bare text is in `unit`.
        Numbers use a point for decimals and no thousands separators.
    unit : str
        The declared unit symbol (see UNITS_BY_DIMENSION), e.g. "V", "kVA", "m", "degC", "".

    Returns
    -------
    float
        The value in V, A, VA, W, var, Hz, H, F, Ω, s, m, m², Ω/m, % (percent), a plain ratio
        (dimensionless) or °C (temperature).

    Raises
    ------
    UnitError
        For text that is not a finite number with a known unit of the declared dimension, for
        bool, None and non-finite numbers, and for an unknown declared unit.

    Notes
    -----
    "F" is the farad unless `unit` is a temperature, then it is °F. Where `unit` is "" (a ratio),
    "85 %" is 0.85; where `unit` is "%", a bare number is a percentage. Temperatures convert
    affinely: t = (t_F − 32) × 5/9, t = T − 273.15. The arithmetic is exact (fractions) and
    rounded once to float.

    Examples
    --------
    >>> to_si("13.8 kV", "V"), to_si("150 ft", "m"), to_si("85 %", ""), to_si("167 F", "degC")
    (13800.0, 45.72, 0.85, 75.0)
    """
    if isinstance(value, (str, int, float)) and isinstance(unit, str):
        return _to_si_cached(value, unit)  # pure: every run reads the same limits and defaults
    return _to_si(value, unit)


@functools.lru_cache(maxsize=2048, typed=True)
def _to_si_cached(value, unit):
    return _to_si(value, unit)


def _to_si(value, unit):
    declared = _unit(unit)
    if isinstance(value, str):
        number, symbol = _read(value, declared.dimension)
        entry = _unit(symbol, declared, value) if symbol else declared
        if entry.dimension != declared.dimension:
            received, wanted = DIMENSIONS[entry.dimension][0], DIMENSIONS[declared.dimension][0]
            raise UnitError(f"'{value}' is {received}, not {wanted}; {_use(declared.dimension)}")
    else:
        number, entry = _number(value, declared.dimension), declared
    return _float((number - entry.zero) * entry.factor, value)


def typed_unit(value, unit: str) -> str:
    """The unit symbol a quantity was given in: the one typed after the number, or the
    declared `unit` for a bare number. The value is assumed valid (read by to_si first).

    Parameters
    ----------
    value : int, float or str
        The quantity as received.
    unit : str
        The declared unit symbol.

    Returns
    -------
    str
        The unit symbol as typed, folded (NFKC, no spaces): "hp", "ft", "kVA".

    Examples
    --------
    >>> typed_unit("10 hp", "kW"), typed_unit("150 ft", "m"), typed_unit(75, "kVA")
    ('hp', 'ft', 'kVA')
    """
    if isinstance(value, str):
        match = _QUANTITY.fullmatch(_fold(value))
        if match and match["unit"]:
            return "".join(match["unit"].split())
    return unit


def from_si(value_si: float, unit: str) -> float:
    """Express a coherent SI value (°C for temperature, % for percent) in `unit`.

    Parameters
    ----------
    value_si : float
        The value in the SI unit of `unit`'s dimension.
    unit : str
        Any symbol to_si accepts as a declared unit.

    Returns
    -------
    float
        The value in `unit`: the inverse of to_si for a number.

    Raises
    ------
    UnitError
        For an unknown unit, bool, None or a non-finite value.

    Examples
    --------
    >>> from_si(13800, "kV"), from_si(100, "degF"), from_si(45.72, "ft")
    (13.8, 212.0, 150.0)
    """
    entry = _unit(unit)
    return _float(_number(value_si, entry.dimension) / entry.factor + entry.zero, value_si)


def dimension_of(unit: str) -> str:
    """Name the dimension of a unit symbol.

    Parameters
    ----------
    unit : str
        A unit symbol, e.g. "kVA" or "ohm/km" ("F" is the farad, "%" is percent).

    Returns
    -------
    str
        One of the keys of DIMENSIONS, e.g. "apparent_power".

    Raises
    ------
    UnitError
        For an unknown unit.

    Examples
    --------
    >>> dimension_of("kVA"), dimension_of("ohm/kft"), dimension_of("")
    ('apparent_power', 'impedance_per_length', 'dimensionless')
    """
    return _unit(unit).dimension


def units_for(dimension: str) -> list[str]:
    """List the preferred unit symbols of a dimension, for help text, in trade order.

    Parameters
    ----------
    dimension : str
        A dimension name, as dimension_of returns.

    Returns
    -------
    list of str
        Symbols a number may carry (a bare number is always allowed too).

    Raises
    ------
    UnitError
        For an unknown dimension; the message lists the known ones.

    Examples
    --------
    >>> units_for("voltage")
    ['V', 'kV', 'mV']
    """
    if dimension not in DIMENSIONS:
        raise UnitError(f"unknown dimension {dimension!r}; known: {', '.join(DIMENSIONS)}")
    return list(DIMENSIONS[dimension][1])


def format_quantity(value_si: float, unit: str, digits: int = 3) -> str:
    """Show an SI value with `digits` significant figures in the trade's unit for its dimension.

    Parameters
    ----------
    value_si : float
        The value in the SI unit of `unit`'s dimension (°C for temperature).
    unit : str
        Any symbol of the dimension (it picks the dimension, not the unit shown).
    digits : int, optional
        Significant figures, 1 to 17 (default 3).

    Returns
    -------
    str
        Number, a space, then the unit (no space for a plain number), e.g. "13.8 kV".

    Raises
    ------
    UnitError
        For a non-finite or non-numeric value, an unknown unit or a bad `digits`.

    Notes
    -----
    The unit is the first in the display rows (DISPLAY_UNITS, or the system chosen with
    display_units()) whose threshold the value, once rounded, reaches, so 999.7 V shows as
    "1.00 kV". A value exactly halfway between two shown numbers keeps one figure more, so a
    standard rating is never cut short ("112.5 kVA", not "112 kVA"). A number of 1000 or more in the largest unit is
    written out in full ("1500 m", "4700 µF"); one outside 1e-6 to 1e16 gets an exponent
    ("1.00e+300 m"). Zero is "0" in the base unit.

    Examples
    --------
    >>> format_quantity(13800, "V"), format_quantity(0.35, "ohm"), format_quantity(2.5e-6, "m2")
    ('13.8 kV', '0.350 Ω', '2.50 mm²')
    >>> format_quantity(112500, "VA"), format_quantity(1234.5, "m")
    ('112.5 kVA', '1230 m')
    >>> with display_units("na"):
    ...     format_quantity(45.72, "m"), format_quantity(0.1, "m"), format_quantity(0.0065, "ohm/m")
    ('150 ft', '3.94 in', '1.98 Ω/kft')
    """
    dimension = _unit(unit).dimension
    _check_digits(digits)
    value = _float(_number(value_si, dimension), value_si)
    symbol, shown, used = _shown(value, dimension, digits)
    if not value:
        return f"0 {symbol}".rstrip()
    return f"{_number_text(shown, used)} {symbol}".rstrip()


def _check_digits(digits):
    if isinstance(digits, bool) or not isinstance(digits, int) or not 1 <= digits <= 17:
        raise UnitError(f"digits must be a whole number from 1 to 17, not {digits!r}")


def _rows(dimension):
    """The display rows of a dimension in force here (see display_units)."""
    overrides = _DISPLAY.get()
    if overrides and dimension in overrides:
        return overrides[dimension]
    return DISPLAY_UNITS[dimension]


def _in_unit(value, symbol):
    """A float SI value in a display unit (float arithmetic: display needs no exact fractions)."""
    entry = UNITS[_fold(symbol)]
    shown = value / entry.factor_float + entry.zero_float
    if not math.isfinite(shown):
        raise UnitError(f"{value!r} is too large to compute with (over 1.8e308)")
    return shown


def _exact_in(value, digits):
    """True when `value` is exactly (to float noise) a number of `digits` significant figures."""
    return math.isclose(float(f"{value:.{digits - 1}e}"), value, rel_tol=1e-12)


def _half_step(value, digits):
    """True when `value` lies exactly halfway between two `digits`-figure numbers (112.5 for 3):
    rounding would have to guess, and a standard rating (112.5 kVA, 37.5 kVA) would lose its
    figure, so it is shown with one figure more."""
    figures = f"{abs(value):.{digits}e}".partition("e")[0].replace(".", "")
    return figures[digits] == "5" and _exact_in(value, digits + 1)


def _shown(value, dimension, digits):
    """(symbol, value in it, significant figures used) for a finite SI value."""
    rows = _rows(dimension)
    used = digits
    for _ in range(2):  # a second pass when one more figure shows the value exactly
        rounded = float(f"{abs(value):.{used - 1}e}") if value else 1.0
        symbol = next(shown for shown, smallest in rows if rounded >= smallest)
        shown = _in_unit(value, symbol) if value else 0.0
        if used > digits or not shown or used == 17 or not _half_step(shown, used):
            break
        used += 1
    return symbol, shown, used


def _number_text(shown, digits):
    text = f"{shown:.{digits - 1}e}"  # rounded once, here
    exponent = int(text.partition("e")[2])
    if -6 <= exponent < 16:
        text = f"{float(text):.{max(digits - 1 - exponent, 0)}f}"
    return text


@contextlib.contextmanager
def display_units(system=None, lengths=None):
    """Within the block, format_quantity shows values in a display system's units.

    Parameters
    ----------
    system : {"na", "iec"} or None
        The display system (DISPLAY_OVERRIDES); None keeps DISPLAY_UNITS.
    lengths : {"na", "iec"} or None
        The system for lengths alone, whatever `system` says: the one the user typed lengths in
        (length_system of the typed unit), so "150 ft" comes back in feet.

    Raises
    ------
    UnitError
        For a system that is not one of DISPLAY_SYSTEMS.

    Notes
    -----
    The choice lives in a ContextVar set on entry and reset on exit, so nothing outside the
    block (another calculation, another thread or task) sees it.

    Examples
    --------
    >>> with display_units("iec", lengths="na"):
    ...     format_quantity(30.48, "m"), format_quantity(0.0002, "ohm/m")
    ('100 ft', '0.200 Ω/km')
    >>> format_quantity(30.48, "m")
    '30.5 m'
    """
    for name, chosen in (("display system", system), ("length system", lengths)):
        if chosen is not None and chosen not in DISPLAY_SYSTEMS:
            raise UnitError(f"{name} {shorten_text(chosen)!r} is not one of: "
                            + ", ".join(DISPLAY_SYSTEMS))
    overrides = dict(DISPLAY_OVERRIDES[system]) if system else {}
    if lengths:
        overrides["length"] = DISPLAY_OVERRIDES[lengths].get("length", DISPLAY_UNITS["length"])
    overrides[_SYSTEM] = system
    token = _DISPLAY.set(overrides)
    try:
        yield
    finally:
        _DISPLAY.reset(token)


def display_system():
    """The display system chosen with display_units() around this call ("na", "iec"), or None.

    Examples
    --------
    >>> with display_units("na"):
    ...     display_system()
    'na'
    >>> display_system() is None
    True
    """
    overrides = _DISPLAY.get()
    return overrides.get(_SYSTEM) if overrides else None


def format_in(value_si: float, symbol: str, digits: int = 3) -> str:
    """Show an SI value in exactly the unit `symbol`, whatever the display system: for a text
    that gives the other system's figure beside the shown one ("1.98 Ω/kft (6.50 Ω/km)").

    Examples
    --------
    >>> format_in(0.006496, "ohm/km"), format_in(18.93, "ft"), format_in(0.006496, "ohm/kft")
    ('6.50 Ω/km', '62.1 ft', '1.98 Ω/kft')
    """
    entry = _unit(symbol)
    _check_digits(digits)
    value = _float(_number(value_si, entry.dimension), value_si)
    shown = _in_unit(value, symbol) if value else 0.0
    used = digits + 1 if shown and digits < 17 and _half_step(shown, digits) else digits
    return f"{_number_text(shown, used) if shown else '0'} {unit_symbol(symbol)}".rstrip()


def shorten_text(value, limit=40):
    text = str(value)
    return text if len(text) <= limit else text[:limit] + "…"


def display_unit(unit: str) -> str:
    """The unit format_quantity shows for a dimension's ordinary values here (its base row).

    Parameters
    ----------
    unit : str
        Any symbol of the dimension.

    Returns
    -------
    str
        The symbol of the last (smallest-threshold) row whose threshold is at most 1 SI unit,
        e.g. "m" or "ft" for a length, "Ω/kft" for impedance per length in the na system.

    Examples
    --------
    >>> display_unit("m"), display_unit("ohm/m")
    ('m', 'Ω/km')
    """
    rows = _rows(_unit(unit).dimension)
    return next((shown for shown, smallest in rows if smallest <= 1), rows[-1][0])


def length_system(symbol: str):
    """"na" for a length typed in feet or inches, "iec" for metres (any prefix), else None.

    Examples
    --------
    >>> length_system("ft"), length_system("'"), length_system("km"), length_system("V")
    ('na', 'na', 'iec', None)
    """
    entry = UNITS.get("".join(_fold(symbol).split())) if isinstance(symbol, str) else None
    if entry is None or entry.dimension != "length":
        return None
    return "na" if entry.factor in _IMPERIAL_LENGTHS else "iec"


def unit_symbol(symbol: str) -> str:
    """How a declared unit reads beside a number: "ohm" as "Ω", "degC" as "°C", "uF" as "µF".

    Examples
    --------
    >>> unit_symbol("ohm"), unit_symbol("degC"), unit_symbol("ohm/km"), unit_symbol("kVA")
    ('Ω', '°C', 'Ω/km', 'kVA')
    """
    return UNIT_SYMBOLS.get(symbol, symbol)


# Declared-unit spellings and how they read (the rest read as written).
UNIT_SYMBOLS = {
    "ohm": "Ω", "ohms": "Ω", "Ohm": "Ω", "mohm": "mΩ", "kohm": "kΩ", "Mohm": "MΩ",
    "ohm/m": "Ω/m", "ohm/km": "Ω/km", "ohm/kft": "Ω/kft", "ohm/1000ft": "Ω/kft",
    "degC": "°C", "C": "°C", "degF": "°F", "uF": "µF", "uH": "µH", "us": "µs",
    "m2": "m²", "mm2": "mm²", "kva": "kVA", "KVA": "kVA", "rpm": "r/min", "RPM": "r/min",
    "'": "ft", "′": "ft", "’": "ft", '"': "in", "″": "in", "”": "in", "''": "in",
}


def format_complex(value, unit: str, digits: int = 3) -> str:
    """Show a phasor R + jX in one unit, a part below a billionth of |z| shown as 0 (float noise).

    Parameters
    ----------
    value : complex
        In the SI unit of `unit`'s dimension.
    unit : str
        Any symbol of the dimension, e.g. "ohm".
    digits : int, optional
        Significant figures of the larger part (default 3).

    Returns
    -------
    str
        "2.00 + j0 Ω", "3.10 − j1.20 kΩ": the unit chosen by |z| as format_quantity chooses it.

    Raises
    ------
    UnitError
        For a non-finite or non-numeric value, an unknown unit or a bad `digits`.

    Examples
    --------
    >>> format_complex(complex(2, 1.421e-14), "ohm"), format_complex(3100 - 1200j, "ohm")
    ('2.00 + j0 Ω', '3.10 − j1.20 kΩ')
    """
    dimension = _unit(unit).dimension
    _check_digits(digits)
    if isinstance(value, bool) or not isinstance(value, (Real, complex)):
        raise UnitError(f"received {type(value).__name__} {value!r}; a phasor is a complex number")
    z = complex(value)
    if not (math.isfinite(z.real) and math.isfinite(z.imag)):
        raise UnitError(f"received {value!r}, which is not a finite number")
    magnitude = abs(z)
    noise = magnitude * 1e-9
    real = z.real if abs(z.real) > noise else 0.0
    imag = z.imag if abs(z.imag) > noise else 0.0
    symbol, shown, used = _shown(magnitude, dimension, digits)
    scale = shown / magnitude if magnitude else 1.0
    # The larger part carries `used` figures; the smaller keeps the same last decimal place.
    places = len(_number_text(shown, used).partition(".")[2]) if shown else 0

    def part(x):
        return "0" if not x else f"{abs(x) * scale:.{places}f}"

    sign = "−" if imag < 0 else "+"
    return f"{'-' if real < 0 else ''}{part(real)} {sign} j{part(imag)} {symbol}".rstrip()


class ConductorSize(NamedTuple):
    """A standard conductor size."""

    system: str  # "awg", "kcmil" or "mm2"
    value: float  # gauge number for awg (1/0 -> 0, 2/0 -> -1, 4/0 -> -3), kcmil, or mm²
    label: str  # canonical text: "12 AWG", "4/0 AWG", "250 kcmil", "2.5 mm²"
    area_m2: float  # nominal cross-section [m²]


# Standard sizes by system, smallest area first. AWG 18 to 4/0 numbered as ASTM B258 does
# (1/0 = 0, 2/0 = -1, 3/0 = -2, 4/0 = -3) and kcmil 250 to 1000, as NEC Chapter 9 Table 8 lists
# them; metric nominal cross-sections [mm²] of IEC 60228 from 0.75 to 400 (its series is longer).
STANDARD_SIZES = {
    "awg": (18, 16, 14, 12, 10, 8, 6, 4, 3, 2, 1, 0, -1, -2, -3),
    "kcmil": (250, 300, 350, 400, 500, 600, 700, 750, 800, 900, 1000),
    "mm2": (0.75, 1, 1.5, 2.5, 4, 6, 10, 16, 25, 35, 50, 70, 95, 120, 150, 185, 240, 300, 400),
}

# How each system is named in messages.
SYSTEM_NAMES = {"awg": "AWG", "kcmil": "kcmil", "mm2": "metric (IEC 60228)"}

# The words after a size, lower-cased without spaces (NFKC has made "mm²" "mm2"); none is AWG.
SYSTEM_WORDS = {"": "awg", "awg": "awg", "kcmil": "kcmil", "mcm": "kcmil", "kcm": "kcmil",
                "mm2": "mm2", "sqmm": "mm2"}

# One circular mil, the area of a circle 0.001 in across: π/4 × (25.4 µm)² = 5.067 074 790 975e-10 m².
CIRCULAR_MIL_M2 = math.pi / 4 * 25.4e-6**2

_SIZE = re.compile(
    r"(?P<hash>#\s*)?(?:(?P<aughts>[1-9]\d*)/0|(?P<number>\d+(?:\.\d*)?|\.\d+))\s*(?P<word>.*)")
_SIZE_EXAMPLES = "such as 12 AWG, 4/0 AWG, 250 kcmil or 2.5 mm²"


def _size(system, number):
    """The ConductorSize of a gauge (awg), kcmil or mm² number, standard or not."""
    if system == "awg":
        label = f"{number:g} AWG" if number > 0 else f"{1 - number:g}/0 AWG"
        # ASTM B258: d = 0.005 in × 92^((36 − n)/39) = 0.127 mm × 92^((36 − n)/39).
        area = math.pi / 4 * (0.127e-3 * 92 ** ((36 - number) / 39)) ** 2
    elif system == "kcmil":
        label, area = f"{number:g} kcmil", number * 1000 * CIRCULAR_MIL_M2
    else:
        label, area = f"{number:g} mm²", number * 1e-6
    return ConductorSize(system, float(number), label, area)


# Every standard size by its label, and the labels of each system, smallest area first.
CONDUCTOR_SIZES = {
    size.label: size
    for system, numbers in STANDARD_SIZES.items()
    for size in (_size(system, number) for number in numbers)
}
SIZES_BY_SYSTEM = {system: tuple(label for label, size in CONDUCTOR_SIZES.items()
                                 if size.system == system) for system in STANDARD_SIZES}
AWG_SIZES, KCMIL_SIZES, METRIC_SIZES = SIZES_BY_SYSTEM.values()
SIZES = AWG_SIZES + KCMIL_SIZES + METRIC_SIZES


def parse_conductor_size(text) -> ConductorSize:
    """Read a conductor size in AWG, kcmil or mm².

    Parameters
    ----------
    text : str, int or ConductorSize
        "12 AWG", "12AWG", "#12", "12" (a bare number is AWG), "4/0", "0000", "250 kcmil",
        "250 MCM", "250 kcm", "2.5 mm2", "2.5 mm²", "2.5 sq mm"; a ConductorSize passes through.

    Returns
    -------
    ConductorSize
        The standard size, with its canonical label and nominal area [m²].

    Raises
    ------
    UnitError
        For text that is not a size, or a size that is not standard in its system (the message
        lists the standard ones).

    Notes
    -----
    AWG area by ASTM B258: d = 0.127 mm × 92^((36 − n)/39), A = π d²/4 (n = 0 for 1/0, −3 for
    4/0); 1 kcmil = 1000 × π/4 × (0.001 in)²; metric sizes are nominal.

    Examples
    --------
    >>> parse_conductor_size("4/0").label, round(parse_conductor_size("250 MCM").area_m2 * 1e6, 2)
    ('4/0 AWG', 126.68)
    """
    if isinstance(text, ConductorSize):
        return text
    if isinstance(text, Integral) and not isinstance(text, bool):
        text = str(text)
    if isinstance(text, str):
        return _size_from_text(text)  # pure: the tables look the same sizes up on every run
    return _parse_size(text)


@functools.lru_cache(maxsize=512)
def _size_from_text(text):
    return _parse_size(text)


def _parse_size(text):
    if not isinstance(text, str):
        raise UnitError(f"received {text!r}; enter a conductor size {_SIZE_EXAMPLES}")
    match = _SIZE.fullmatch(_fold(text))
    system = match and SYSTEM_WORDS.get("".join(match["word"].lower().split()))
    if system is None or (system != "awg" and (match["hash"] or match["aughts"])):
        raise UnitError(f"'{text}' is not a conductor size; enter one {_SIZE_EXAMPLES}")
    if match["aughts"]:
        number = 1 - float(match["aughts"])  # 4/0 is gauge -3
    elif set(match["number"]) == {"0"}:
        number = 1.0 - len(match["number"])  # "000" is 3/0, gauge -2
    else:
        number = float(match["number"])
    label = _size(system, number).label
    if label not in CONDUCTOR_SIZES:
        hint = "" if match["word"] else " (for kcmil or mm² write the unit, e.g. 250 kcmil)"
        allowed = ", ".join(SIZES_BY_SYSTEM[system])
        raise UnitError(f"'{text}' is not a standard {SYSTEM_NAMES[system]} size; "
                        f"allowed: {allowed}{hint}")
    return CONDUCTOR_SIZES[label]


def format_conductor_size(size) -> str:
    """Give the canonical label of a conductor size.

    Parameters
    ----------
    size : ConductorSize or str
        A size, or text parse_conductor_size reads.

    Returns
    -------
    str
        The label, e.g. "4/0 AWG", "250 kcmil", "2.5 mm²".

    Raises
    ------
    UnitError
        As parse_conductor_size.

    Examples
    --------
    >>> format_conductor_size("0000"), format_conductor_size("2.5 sq mm")
    ('4/0 AWG', '2.5 mm²')
    """
    return parse_conductor_size(size).label
