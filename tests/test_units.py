"""Tests of calc.units: conversions against pint, conductor areas against ASTM B258 and NEC
Chapter 9 Table 8, every error path, and round trips."""

import ast
import math
import sys
from pathlib import Path

import pint
import pytest
from hypothesis import given
from hypothesis import strategies as st

from calc import units
from calc.errors import UnitError
from calc.units import (
    AWG_SIZES,
    CIRCULAR_MIL_M2,
    KCMIL_SIZES,
    METRIC_SIZES,
    SIZES,
    ConductorSize,
    dimension_of,
    format_conductor_size,
    format_quantity,
    from_si,
    parse_conductor_size,
    to_si,
    units_for,
)

# pint is the independent reference for every conversion factor.
ureg = pint.UnitRegistry()

# pint's spelling of our symbols where it differs (pint has no var, and reads "m2" as nothing).
PINT_SPELLING = {
    "kva": "kVA", "KVA": "kVA",
    "var": "V*A", "VAr": "V*A", "VAR": "V*A",
    "kvar": "kV*A", "kVAr": "kV*A", "kVAR": "kV*A",
    "Mvar": "MV*A", "MVAr": "MV*A", "MVAR": "MV*A",
    "Ohm": "ohm", "m2": "m**2", "mm2": "mm**2", "ohm/1000ft": "ohm/kft",
    "C": "degC", "%": "percent", "": "dimensionless",
    # the marks a tradesperson writes for feet and inches (issue 12), and speed in r/min
    "'": "ft", "\u2032": "ft", "\u2019": "ft", '"': "inch", "\u2033": "inch", "\u201d": "inch",
    "''": "inch", "r/min": "rpm", "RPM": "rpm", "rev/min": "rpm", "r/s": "revolution/second",
}

# The coherent unit to_si returns, per dimension, in pint's spelling.
PINT_BASE = {
    "voltage": "V", "current": "A", "apparent_power": "V*A", "power": "W",
    "reactive_power": "V*A", "frequency": "Hz", "inductance": "H", "capacitance": "F",
    "resistance": "ohm", "time": "s", "length": "m", "area": "m**2",
    "impedance_per_length": "ohm/m", "percent": "percent", "dimensionless": "dimensionless",
    "temperature": "degC", "angular_speed": "rad/s",
}

ALL_SYMBOLS = [
    (symbol, dimension)
    for dimension, row in units.UNITS_BY_DIMENSION.items()
    for symbol in row
]
SYMBOLS = [symbol for symbol, _ in ALL_SYMBOLS]


def pint_si(magnitude, pint_unit, dimension):
    """pint's value of `magnitude` `pint_unit` in the SI unit to_si returns for `dimension`."""
    return ureg.Quantity(magnitude, pint_unit).to(PINT_BASE[dimension]).magnitude


# --- conversion factors against pint ----------------------------------------------------------

@pytest.mark.parametrize("symbol, dimension", ALL_SYMBOLS)
def test_every_symbol_matches_pint(symbol, dimension):
    # Reference: pint 0.25 definitions; rel 1e-12 allows pint's float (not exact) arithmetic.
    expected = pint_si(12.5, PINT_SPELLING.get(symbol, symbol), dimension)
    assert to_si(f"12.5 {symbol}", symbol) == pytest.approx(expected, rel=1e-12)
    assert to_si(12.5, symbol) == pytest.approx(expected, rel=1e-12)
    assert dimension_of(symbol) == dimension


# (text, declared unit, magnitude and unit as pint reads them): the forms technicians type.
TYPED = [
    ("150 ft", "m", 150, "ft"),
    ("45 m", "m", 45, "m"),
    ("480 V", "V", 480, "V"),
    ("13.8 kV", "V", 13.8, "kV"),
    ("13.8kV", "kV", 13.8, "kV"),
    ("75 kVA", "VA", 75, "kVA"),
    ("75 kva", "kVA", 75, "kVA"),
    ("10 hp", "W", 10, "hp"),
    ("10 hp", "kW", 10, "hp"),
    ("7.5 kW", "W", 7.5, "kW"),
    ("60 Hz", "Hz", 60, "Hz"),
    ("10 mH", "H", 10, "mH"),
    ("4.7 uF", "F", 4.7, "uF"),
    ("4.7 \u00b5F", "uF", 4.7, "uF"),  # micro sign
    ("4.7 \u03bcF", "uF", 4.7, "uF"),  # Greek mu
    ("0.35 ohm", "ohm", 0.35, "ohm"),
    ("0.35 \u03a9", "ohm", 0.35, "ohm"),  # Greek capital omega
    ("0.35 \u2126", "ohm", 0.35, "ohm"),  # ohm sign
    ("350 m\u03a9", "ohm", 350, "mohm"),
    ("5.75 %", "%", 5.75, "percent"),
    ("5.75", "%", 5.75, "percent"),  # bare number in a declared percentage
    ("0.85", "", 0.85, "dimensionless"),
    ("85 %", "", 85, "percent"),  # a percentage where a ratio is asked for
    ("75 C", "degC", 75, "degC"),
    ("75 \u00b0C", "degC", 75, "degC"),
    ("75 \u2103", "degC", 75, "degC"),  # degree Celsius sign
    ("167 \u00b0F", "degC", 167, "degF"),
    ("167 F", "degC", 167, "degF"),  # F is °F where a temperature is asked for
    ("167 F", "F", 167, "F"),  # and the farad elsewhere
    ("348 K", "degC", 348, "K"),
    ("-5 degC", "degF", -5, "degC"),
    ("\u22125 \u00b0C", "degC", -5, "degC"),  # Unicode minus sign
    ("1.2e3 V", "V", 1.2e3, "V"),
    ("+1.2E-3 kV", "V", 1.2e-3, "kV"),
    ("208", "V", 208, "V"),  # bare text is in the declared unit
    ("208", "kV", 208, "kV"),
    (".5 A", "A", 0.5, "A"),
    ("2.5 mm\u00b2", "m2", 2.5, "mm**2"),
    ("2.5mm2", "mm2", 2.5, "mm**2"),
    ("0.193 ohm/km", "ohm/m", 0.193, "ohm/km"),
    ("0.0617 ohm/kft", "ohm/km", 0.0617, "ohm/kft"),
    ("0.0617 ohm/1000ft", "ohm/m", 0.0617, "ohm/kft"),
    ("5 min", "s", 5, "min"),
    ("1.5 h", "s", 1.5, "hour"),
    ("12 in", "ft", 12, "inch"),
    ("5\u00a0kV", "V", 5, "kV"),  # no-break space, as copied from a web page
]


@pytest.mark.parametrize("text, unit, magnitude, pint_unit", TYPED)
def test_typed_text_matches_pint(text, unit, magnitude, pint_unit):
    # Reference: pint; rel 1e-12 for its float arithmetic (temperatures go through kelvin).
    expected = pint_si(magnitude, pint_unit, dimension_of(unit))
    assert to_si(text, unit) == pytest.approx(expected, rel=1e-12)


def test_exact_factors():
    # Exact by definition: 1959 international foot and inch; SI prefixes; hour = 3600 s.
    assert to_si("150 ft", "m") == 45.72
    assert to_si("12 in", "m") == 0.3048
    assert to_si("13.8 kV", "V") == 13800.0
    assert to_si("1.5 h", "s") == 5400.0
    # Exact by definition: 0 °C = 32 °F = 273.15 K; 212 °F = 100 °C.
    assert to_si("32 degF", "degC") == 0.0
    assert to_si(212, "degF") == 100.0
    assert to_si("0 K", "degC") == -273.15
    # 550 ft·lbf/s, computed exactly: 745.699 871 582 270 22 W (NIST SP 811 B.8: 7.456 999 E+02).
    assert to_si(1, "hp") == 745.6998715822702
    assert to_si(1, "hp") == pytest.approx(745.6999, rel=1e-7)  # NIST's 7-figure value


def test_from_si_examples():
    # Exact by definition (SI prefix k; 100 °C = 212 °F); computed: 45.72 m = 150 ft.
    assert from_si(13800, "kV") == 13.8
    assert from_si(100, "degF") == 212
    assert from_si(45.72, "ft") == 150
    assert from_si(0.85, "") == 0.85
    assert from_si(5.75, "%") == 5.75
    assert from_si(0, "K") == 273.15


# --- format_quantity ------------------------------------------------------------------------

# (SI value, unit, shown): the display rules of DISPLAY_UNITS; expected text computed by hand.
SHOWN = [
    (13800, "V", "13.8 kV"),
    (208.2, "A", "208 A"),
    (24100, "A", "24.1 kA"),
    (75000, "VA", "75.0 kVA"),
    (0.0000047, "F", "4.70 \u00b5F"),
    (0.0047, "F", "4700 \u00b5F"),  # capacitors stay in µF below 1 F
    (0.01, "H", "10.0 mH"),
    (0.35, "ohm", "0.350 \u03a9"),  # Ω down to 1 mΩ
    (0.001, "ohm", "0.00100 \u03a9"),
    (0.0005, "ohm", "0.500 m\u03a9"),
    (2.5e6, "ohm", "2.50 M\u03a9"),
    (6.3245, "V", "6.32 V"),
    (2.5e-6, "m2", "2.50 mm\u00b2"),
    (45, "m", "45.0 m"),
    (1500, "m", "1500 m"),  # lengths stay in metres
    (1234.5, "m", "1230 m"),
    (12.5, "ft", "12.5 m"),
    (0.35, "m", "0.350 m"),
    (3.2, "%", "3.20 %"),
    (0.85, "", "0.850"),
    (75, "degC", "75.0 \u00b0C"),
    (75, "degF", "75.0 \u00b0C"),  # the unit picks the dimension; temperatures show in °C
    (1234567, "W", "1.23 MW"),
    (0.000193, "ohm/m", "0.193 \u03a9/km"),
    (0.0005, "s", "500 \u00b5s"),
    (0, "V", "0 V"),
    (-0.0, "A", "0 A"),
    (0, "", "0"),
    (0, "F", "0 F"),
    (-13800, "V", "-13.8 kV"),
    (-5, "degC", "-5.00 \u00b0C"),
    (999.7, "V", "1.00 kV"),  # rounds up across the prefix boundary
    (999.4, "V", "999 V"),
    (1.2e6, "V", "1200 kV"),  # no MV in the trade's display
    (1e300, "m", "1.00e+300 m"),  # beyond 1e16 an exponent keeps the text short
]


@pytest.mark.parametrize("value, unit, shown", SHOWN)
def test_format_quantity(value, unit, shown):
    assert format_quantity(value, unit) == shown


def test_format_quantity_digits():
    # Computed: 208.2 A to 1, 2 and 5 significant figures; 1/3 V to 17.
    assert format_quantity(208.2, "A", 1) == "200 A"
    # 1234.5 is halfway between two 4-figure numbers: one figure more, never a guess (issue 12)
    assert format_quantity(1234.5, "m", 4) == "1234.5 m"
    assert format_quantity(208.2, "A", 2) == "210 A"
    assert format_quantity(208.2, "A", 5) == "208.20 A"
    assert format_quantity(1 / 3, "V", 17) == "333.33333333333331 mV"


# --- conductor sizes ------------------------------------------------------------------------

# (text, canonical label): every spelling parse_conductor_size reads.
SPELLINGS = [
    ("12 AWG", "12 AWG"), ("12AWG", "12 AWG"), ("#12", "12 AWG"), ("# 12", "12 AWG"),
    ("12 awg", "12 AWG"), ("12", "12 AWG"), (12, "12 AWG"), ("18", "18 AWG"), ("1", "1 AWG"),
    ("1/0", "1/0 AWG"), ("2/0", "2/0 AWG"), ("3/0", "3/0 AWG"), ("4/0", "4/0 AWG"),
    ("0", "1/0 AWG"), ("00", "2/0 AWG"), ("000", "3/0 AWG"), ("0000", "4/0 AWG"),
    ("4/0 AWG", "4/0 AWG"), ("#4/0", "4/0 AWG"),
    ("250 kcmil", "250 kcmil"), ("250kcmil", "250 kcmil"), ("250 MCM", "250 kcmil"),
    ("250 kcm", "250 kcmil"), ("1000 KCMIL", "1000 kcmil"),
    ("2.5 mm2", "2.5 mm\u00b2"), ("2.5 mm\u00b2", "2.5 mm\u00b2"), ("2.5mm2", "2.5 mm\u00b2"),
    ("2.5 sq mm", "2.5 mm\u00b2"), ("0.75 mm2", "0.75 mm\u00b2"), ("1.0 mm2", "1 mm\u00b2"),
    ("400 mm2", "400 mm\u00b2"),
]


@pytest.mark.parametrize("text, label", SPELLINGS)
def test_parse_conductor_size(text, label):
    size = parse_conductor_size(text)
    assert size.label == label
    assert format_conductor_size(text) == label
    assert parse_conductor_size(size) is size  # a ConductorSize passes through


def test_gauge_numbers():
    # ASTM B258 numbering: 1/0 is gauge 0, 2/0 is -1, 3/0 is -2, 4/0 is -3.
    assert [parse_conductor_size(t).value for t in ("1", "1/0", "2/0", "3/0", "4/0")] == [
        1, 0, -1, -2, -3]
    assert parse_conductor_size("250 MCM") == ConductorSize(
        "kcmil", 250, "250 kcmil", 250e3 * CIRCULAR_MIL_M2)


# NEC Chapter 9 Table 8, "Area, Circular Mils" column (values recalled from memory, not read
# from the table).
NEC_TABLE_8_CMIL = {
    "14 AWG": 4110, "12 AWG": 6530, "10 AWG": 10380, "8 AWG": 16510, "6 AWG": 26240,
    "4 AWG": 41740, "2 AWG": 66360, "1/0 AWG": 105600, "2/0 AWG": 133100, "4/0 AWG": 211600,
}


@pytest.mark.parametrize("label, cmil", NEC_TABLE_8_CMIL.items())
def test_awg_area_matches_nec_table_8(label, cmil):
    # ±0.1 %: NEC rounds the diameters to 0.1 mil before squaring; the ASTM B258 formula does not.
    assert parse_conductor_size(label).area_m2 / CIRCULAR_MIL_M2 == pytest.approx(cmil, rel=1e-3)


def test_awg_area_formula():
    # ASTM B258: 4/0 (n = -3) is 0.4600 in across, exactly 211 600 cmil; 36 AWG is 0.005 in.
    assert parse_conductor_size("4/0").area_m2 == pytest.approx(211600 * CIRCULAR_MIL_M2, rel=1e-14)
    # Computed: d = 0.127 mm × 92^(24/39) = 2.0525 mm for 12 AWG, A = π d²/4 = 3.3088 mm².
    assert parse_conductor_size("12").area_m2 == pytest.approx(3.3088e-6, rel=2e-5)


def test_kcmil_and_metric_areas():
    # Exact by definition: 1 cmil = π/4 × (0.001 in)²; computed: 1 kcmil = 0.5067 mm² (4 figures).
    assert CIRCULAR_MIL_M2 == pytest.approx(math.pi / 4 * (0.0254e-3) ** 2, rel=1e-15)
    assert 1000 * CIRCULAR_MIL_M2 == pytest.approx(0.5067e-6, rel=1e-4)
    assert parse_conductor_size("500 kcmil").area_m2 == pytest.approx(253.35e-6, rel=1e-4)
    # IEC 60228: metric sizes are nominal.
    assert parse_conductor_size("2.5 mm2").area_m2 == pytest.approx(2.5e-6, rel=1e-15)


def test_size_lists_are_ordered_by_area():
    for labels in (AWG_SIZES, KCMIL_SIZES, METRIC_SIZES):
        areas = [parse_conductor_size(label).area_m2 for label in labels]
        assert areas == sorted(areas) and len(set(areas)) == len(areas)
    assert SIZES == AWG_SIZES + KCMIL_SIZES + METRIC_SIZES
    assert (len(AWG_SIZES), len(KCMIL_SIZES), len(METRIC_SIZES)) == (15, 11, 19)


# --- error paths ----------------------------------------------------------------------------

# (value, declared unit, message pattern): every way to_si refuses input.
TO_SI_ERRORS = [
    ("1,000", "V", "use a point for decimals and no thousands separators"),
    ("2,5 V", "V", "use a point for decimals"),
    ("1_000 V", "V", "without underscores"),
    ("nan", "V", "'nan' is not a finite number"),
    ("inf V", "V", "'inf V' is not a finite number"),
    ("-Infinity", "A", "not a finite number"),
    ("", "V", "received empty text; enter a number, e.g. 480 V"),
    ("   ", "m", "received empty text; enter a number, e.g. 45 m"),
    (True, "V", "received True, a yes/no value, not a number"),
    (False, "A", "received False, a yes/no value"),
    (None, "V", r"received no value \(None\)"),
    (float("nan"), "V", "received nan, which is not a finite number"),
    (float("-inf"), "V", "received -inf, which is not a finite number"),
    ([480], "V", r"received list \[480\]"),
    ("abc V", "V", "'abc V' does not start with a number"),
    ("1e400 V", "V", "too large a number"),
    ("1e308 MV", "V", "too large to compute with"),
    (10**400, "V", "too large to compute with"),
    ("75 kVA", "V", r"'75 kVA' is apparent power, not a voltage; use V, kV, mV \(e.g. 480 V"),
    ("5 %", "V", "is a percentage, not a voltage"),
    ("5 V", "", "is a voltage, not a plain number"),
    ("75 \u00b0C", "F", "is a temperature, not a capacitance"),
    ("5 furlongs", "m", "'5 furlongs': unknown unit 'furlongs'; for a length use m, mm, km, ft"),
    ("5 mva", "VA", "unknown unit 'mva'"),  # m is milli: refused rather than guessed
    ("5 MH", "H", "unknown unit 'MH'; for an inductance use mH"),
    (5, "furlong", "unknown unit 'furlong'; known units include V, A, VA"),
    (5, None, "a unit must be text"),
]


@pytest.mark.parametrize("value, unit, message", TO_SI_ERRORS)
def test_to_si_errors(value, unit, message):
    with pytest.raises(UnitError, match=message):
        to_si(value, unit)


@pytest.mark.parametrize("call, message", [
    (lambda: from_si(float("nan"), "V"), "not a finite number"),
    (lambda: from_si(True, "V"), "yes/no value"),
    (lambda: from_si(1e308, "mV"), "too large to compute with"),
    (lambda: format_quantity(float("inf"), "V"), "not a finite number"),
    (lambda: format_quantity(None, "V"), "None"),
    (lambda: format_quantity(1, "V", 0), "digits must be a whole number from 1 to 17"),
    (lambda: format_quantity(1, "V", True), "digits must be"),
    (lambda: dimension_of("furlong"), "unknown unit 'furlong'"),
    (lambda: units_for("speed"), "unknown dimension 'speed'; known: voltage, current"),
])
def test_other_errors(call, message):
    with pytest.raises(UnitError, match=message):
        call()


# (text, message pattern): every way parse_conductor_size refuses input.
SIZE_ERRORS = [
    ("2.5 AWG", "'2.5 AWG' is not a standard AWG size; allowed: 18 AWG, 16 AWG"),
    ("20 AWG", "not a standard AWG size"),
    ("5/0", "not a standard AWG size"),
    ("250", r"not a standard AWG size; .*\(for kcmil or mm² write the unit"),
    ("3.3 mm2", r"'3.3 mm2' is not a standard metric \(IEC 60228\) size; allowed: 0.75 mm²"),
    ("275 kcmil", "not a standard kcmil size; allowed: 250 kcmil, 300 kcmil"),
    ("0/0", "is not a conductor size"),
    ("4/0 kcmil", "is not a conductor size"),
    ("#250 kcmil", "is not a conductor size"),
    ("12 gauge", "'12 gauge' is not a conductor size; enter one such as 12 AWG"),
    ("", "is not a conductor size"),
    (True, "received True"),
    (None, "received None"),
    (2.5, "received 2.5"),
]


@pytest.mark.parametrize("text, message", SIZE_ERRORS)
def test_conductor_size_errors(text, message):
    with pytest.raises(UnitError, match=message):
        parse_conductor_size(text)


def test_errors_are_value_errors():
    # calc.errors: every UnitError is a ValueError, as pint's errors are.
    with pytest.raises(ValueError):
        to_si("abc", "V")


# --- tables hold together -------------------------------------------------------------------

@pytest.mark.parametrize("dimension", units.DIMENSIONS)
def test_help_and_display_units_are_accepted(dimension):
    shown = [s for s, _ in units.DISPLAY_UNITS[dimension]]
    shown += [s for system in units.DISPLAY_OVERRIDES.values() for s, _ in system.get(dimension, ())]
    for symbol in units_for(dimension) + shown:
        assert dimension_of(symbol) == dimension
    assert units_for("voltage") == ["V", "kV", "mV"]
    assert units_for("dimensionless") == []  # a plain number advertises no "%" (issue 12)


def test_standard_library_only():
    # calc/ runs under Pyodide: units.py may import nothing outside the standard library and calc.
    tree = ast.parse(Path(units.__file__).read_text(encoding="utf-8"))
    names = {alias.name for node in ast.walk(tree) if isinstance(node, ast.Import)
             for alias in node.names}
    names |= {node.module for node in ast.walk(tree) if isinstance(node, ast.ImportFrom)}
    assert {name.split(".")[0] for name in names} <= set(sys.stdlib_module_names) | {"calc"}


# --- round trips ----------------------------------------------------------------------------

# Magnitudes from 1e-200 to 1e200 (and zero), either sign: wide, but clear of float underflow
# and overflow once a prefix is applied.
magnitudes = st.floats(min_value=1e-200, max_value=1e200)
values = st.one_of(st.just(0.0), magnitudes, magnitudes.map(lambda x: -x))


@given(symbol=st.sampled_from(SYMBOLS), value=values)
def test_from_si_inverts_to_si(symbol, value):
    # Two roundings of half an ulp each (rel 2.2e-16 apiece); temperatures also carry the offset's
    # rounding: half an ulp of 273.15 is 2.8e-14, so abs 1e-13.
    tolerance = 1e-13 if dimension_of(symbol) == "temperature" else 0
    assert from_si(to_si(value, symbol), symbol) == pytest.approx(value, rel=1e-15, abs=tolerance)


@given(symbol=st.sampled_from(SYMBOLS), value=values)
def test_text_reads_as_the_number(symbol, value):
    # repr(float) is exact, so the text of a number converts exactly as the number does.
    assert to_si(f"{value!r} {symbol}", symbol) == to_si(value, symbol)


@given(symbol=st.sampled_from(SYMBOLS), value=values, digits=st.integers(1, 8))
def test_format_quantity_reads_back(symbol, value, digits):
    shown = format_quantity(value, symbol, digits)
    assert "nan" not in shown.lower() and "inf" not in shown.lower()
    # Rounding to `digits` significant figures moves a value by at most half a unit in the last
    # place: relative 0.5 × 10^(1 − digits); 1e-12 more for the float conversions.
    assert to_si(shown, symbol) == pytest.approx(value, rel=0.5 * 10 ** (1 - digits) + 1e-12)


# --- issue 12: what a technician types, and values shown the way the user works --------------

@pytest.mark.parametrize("text, unit, expected", [
    ("100'", "m", 30.48), ("100 '", "m", 30.48), ("100\u2032", "m", 30.48),
    ("100\u2019", "m", 30.48),  # a phone keyboard's curly apostrophe
    ('6"', "m", 0.1524), ("6\u2033", "m", 0.1524), ("6''", "m", 0.1524), ("6\u201d", "m", 0.1524),
    ("1750 rpm", "r/min", 1750 * math.pi / 30), ("1750 r/min", "rad/s", 1750 * math.pi / 30),
    ("1750", "r/min", 1750 * math.pi / 30),
])
def test_trade_marks_and_speeds_read(text, unit, expected):
    # Exact by definition: 1 ft = 0.3048 m, 1 in = 0.0254 m; 1 r/min = 2π/60 rad/s.
    assert to_si(text, unit) == pytest.approx(expected, rel=1e-15)


def test_speed_in_a_plain_number_field_names_the_dimension():
    with pytest.raises(UnitError, match="rotational speed, not a plain number"):
        to_si("1750 rpm", "")


@pytest.mark.parametrize("value, unit, shown", [
    (112500, "VA", "112.5 kVA"),  # a standard rating (IEEE C57.12.00 series) keeps its half
    (37500, "VA", "37.5 kVA"),
    (208.2, "A", "208 A"),  # not halfway: three figures as always
    (999.5, "V", "999.5 V"),  # halfway decides before the prefix: not "1.00 kV"
    (0.0125, "V", "12.5 mV"),
])
def test_halfway_values_keep_their_figure(value, unit, shown):
    assert format_quantity(value, unit) == shown


@pytest.mark.parametrize("value, unit, system, lengths, shown", [
    # 1 ft = 0.3048 m exactly; 150 ft = 45.72 m, 4 in = 0.1016 m
    (45.72, "m", "na", None, "150 ft"),
    (0.1016, "m", "na", None, "4.00 in"),
    (45.72, "m", "iec", None, "45.7 m"),
    (45.72, "m", "iec", "na", "150 ft"),  # typed in feet, shown in feet on an IEC display
    (45.72, "m", "na", "iec", "45.7 m"),  # typed in metres: metres
    # NEC Ch. 9 Table 8: 12 AWG Cu 1.98 ohm/kft = 6.50 ohm/km (6.496 computed)
    (6.496e-3, "ohm/m", "na", None, "1.98 \u03a9/kft"),
    (6.496e-3, "ohm/m", "iec", None, "6.50 \u03a9/km"),
    # NEC Ch. 9 Table 8: 12 AWG is 6530 cmil = 6.53 kcmil, 3.31 mm²
    (6530 * CIRCULAR_MIL_M2, "m2", "na", None, "6.53 kcmil"),
    (6530 * CIRCULAR_MIL_M2, "m2", "iec", None, "3.31 mm\u00b2"),
    (75.0, "degC", "na", None, "75.0 \u00b0C"),  # conductor ratings stay in °C (NEC 310.16)
    (183.26, "rad/s", None, None, "1750 r/min"),  # 1750 × 2π/60 = 183.26 rad/s
])
def test_display_systems(value, unit, system, lengths, shown):
    with units.display_units(system, lengths):
        assert format_quantity(value, unit) == shown


def test_display_units_is_undone_on_exit_even_after_an_error():
    with pytest.raises(RuntimeError):
        with units.display_units("na"):
            assert format_quantity(30.48, "m") == "100 ft"
            raise RuntimeError("a calculation failed")
    assert format_quantity(30.48, "m") == "30.5 m"
    with pytest.raises(UnitError, match="display system 'imperial' is not one of: na, iec"):
        with units.display_units("imperial"):
            pass


def test_length_system_of_typed_units():
    assert [units.length_system(s) for s in ("ft", "in", "'", '"', "m", "mm", "km", "V", "")] == \
        ["na", "na", "na", "na", "iec", "iec", "iec", None, None]


def test_unit_symbols_read_as_people_write_them():
    assert [units.unit_symbol(s) for s in ("ohm", "degC", "uF", "ohm/km", "m2", "V")] == \
        ["\u03a9", "\u00b0C", "\u00b5F", "\u03a9/km", "m\u00b2", "V"]


@pytest.mark.parametrize("amount, shown", [
    (2088, "2088.00"), (392, "392.00"), (1196.404, "1196.40"), (0.005, "0.01"),
    (12345.6, "12\u202f345.60"), (-2088.5, "-2088.50"), (1234567.891, "1\u202f234\u202f567.89"),
])
def test_one_money_format(amount, shown):
    from calc.calculators.line_loss import format_money

    assert format_money(amount) == shown


@pytest.mark.parametrize("value, shown", [
    (complex(2, 1.421e-14), "2.00 + j0 \u03a9"),  # float noise of X_L − X_C at resonance
    (complex(3100, -1200), "3.10 \u2212 j1.20 k\u03a9"),
    (complex(-0.5, 0.25), "-0.500 + j0.250 \u03a9"),
    (0j, "0 + j0 \u03a9"),
])
def test_format_complex(value, shown):
    assert units.format_complex(value, "ohm") == shown


@pytest.mark.parametrize("call, message", [
    (lambda: units.format_complex(complex(float("inf"), 0), "ohm"), "not a finite number"),
    (lambda: units.format_complex("2+3j", "ohm"), "a phasor is a complex number"),
])
def test_formatting_errors(call, message):
    with pytest.raises(UnitError, match=message):
        call()


def test_money_is_never_shown_non_finite():
    from calc.calculators.line_loss import format_money
    with pytest.raises(ValueError, match="not a finite number"):
        format_money(float("nan"))
