"""gfci-check: does a GFCI or RCD pass its tester's readings?

A ramp test's trip current against the window the device must trip in, and a timed test's trip
time against the greatest (and, for a type S RCD, the least) time allowed at the test current:
UL 943 Class A for a GFCI, IEC 61008-1 / 61009-1 for an RCD.
"""

from typing import NamedTuple

from calc import cautions, protection
from calc.calculators._plausibility import plausibility
from calc.errors import InputError
from calc.protection import (
    ADDITIONAL_PROTECTION_A,
    GFCI_CURVE_A,
    GFCI_CURVE_EXPONENT,
    GFCI_CURVE_RANGE_A,
    GFCI_MUST_TRIP_A,
    GFCI_NO_TRIP_A,
    RCD_BREAK_TIMES_S,
    RCD_NO_TRIP_FRACTION,
)
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

DEVICES = (("gfci", "GFCI, UL 943 Class A"), ("rcd", "RCD, general type (IEC 61008/61009)"),
           ("rcd-s", "RCD, type S (time-delayed)"))
_ROUNDING = 1e-9  # a current entered as exactly 50 % or 30 mA is at the limit, not above it
CHART_POINTS = 40

# Plausibility: readings a real device and a real tester can give.
# Preferred rated residual operating currents IΔn [A] (IEC 61008-1 / 61009-1, from memory).
RCD_PREFERRED_RESIDUAL_A = (0.006, 0.01, 0.03, 0.1, 0.3, 0.5, 1.0)
# A GFCI's or RCD's contacts take some milliseconds to part (the fastest trip in about a quarter
# of a cycle): a reading below 5 ms is faster than any device — common practice; most often a
# unit slip (s for ms).
FASTEST_TRIP_S = 0.005
# RCD testers apply ½, 1, 2 and 5 × IΔn for timed tests and ramp up to about 1.1 × IΔn
# (IEC 61557-6, from memory): no tester gives a reading beyond these.
TESTER_MAX_MULTIPLE = 5.0
RAMP_MAX_MULTIPLE = 1.1
_SERIES_MATCH = 1e-6  # an IΔn entered as 30 mA is the preferred 0.03 A despite float rounding



def _ma(current):
    """A published threshold [A] as the standards write it: "6 mA"."""
    return f"{current * 1e3:g} mA"


_NO_TRIP_PCT = f"{RCD_NO_TRIP_FRACTION * 100:g} %"
_GFCI_WINDOW = f"no trip below {_ma(GFCI_NO_TRIP_A)}, trip at {_ma(GFCI_MUST_TRIP_A)}"
_GFCI_FORMULA = (f"T = ({GFCI_CURVE_A * 1e3:g} / I)^{GFCI_CURVE_EXPONENT:g} s, I in mA")
_GFCI_RANGE = f"{_ma(GFCI_CURVE_RANGE_A[0])} to {_ma(GFCI_CURVE_RANGE_A[1])}"
_ADDITIONAL = f"IΔn ≤ {_ma(ADDITIONAL_PROTECTION_A)}"
_RCD_MULTIPLES = ", ".join(f"{m} IΔn" if m > 1 else "IΔn" for m in RCD_BREAK_TIMES_S["rcd"])

SOURCES = (
    f"UL 943: Class A trips at {_ma(GFCI_MUST_TRIP_A)} and above, not below "
    f"{_ma(GFCI_NO_TRIP_A)}; {_GFCI_FORMULA} for {_GFCI_RANGE} (read as quoted).",
    f"IEC 61008-1 / 61009-1: greatest break times at {_RCD_MULTIPLES} (read, as reproduced in "
    "the BS EN 61008-1 / 61009-1 table quoted at html.pdfcookie.com/…/rvr7mmqer72o.html); type "
    f"S least times and no trip at {_NO_TRIP_PCT} IΔn (from memory).",
    f"IEC 60364-4-41 415.1.1: RCDs of {_ADDITIONAL} as additional protection (read, as quoted "
    "with its clause number in the same article, BS 7671 numbering).",
)
ASSUMPTIONS = (
    "Readings from an RCD / GFCI tester at the outlet, with the circuit's own leakage small "
    "(it adds to the tester's current).",
    "Sinusoidal residual current (the AC test); Type A and B devices have further tests with "
    "pulsating and smooth DC.",
)
CAUTIONS = (
    "The TEST button checks the mechanism only: it does not measure the trip current or time, "
    "and does not prove the earthing. Use an RCD / GFCI tester for that.",
    "A GFCI or RCD does not stop a shock between line and neutral through the body, and the "
    "shock is still felt: it limits how long the current flows.",
    "Disconnect equipment with large leakage (drives, heaters) before a ramp test, or the "
    "reading is low; test again with it connected to find nuisance trips.",
)


class _TimeRule(NamedTuple):
    """What a GFCI or RCD must do at one test current."""

    least: float | None  # least break time [s] (type S), None if none
    greatest: float | None  # greatest trip time [s], None where no time is set
    must_not_trip: bool  # the current is in the region where the device must hold
    text: str  # the rule, in words, with its source


def _trip_time_rule(device, test_current, rated_residual):
    """The trip-time rule at `test_current` [A] for a "gfci" (UL 943 Class A), "rcd" (general)
    or "rcd-s" (type S) of rated residual current `rated_residual` [A] (RCDs only).

    GFCI: no trip below GFCI_NO_TRIP_A; no time set from there to the start of the UL 943 curve,
    then the curve (carried on beyond the end of its range). RCD: no trip at or below
    RCD_NO_TRIP_FRACTION × IΔn; no time set below IΔn; from IΔn the limit of the highest test
    multiple reached.
    """
    if device == "gfci":
        if test_current < GFCI_NO_TRIP_A:
            return _TimeRule(None, None, True, f"below {_ma(GFCI_NO_TRIP_A)} a Class A GFCI "
                             "must not trip (UL 943)")
        if test_current < GFCI_CURVE_RANGE_A[0]:
            return _TimeRule(None, None, False, f"from {_ma(GFCI_NO_TRIP_A)} to "
                             f"{_ma(GFCI_CURVE_RANGE_A[0])} UL 943 sets no trip time")
        return _TimeRule(None, protection.gfci_time_limit(test_current), False,
                         f"UL 943: {_GFCI_FORMULA}")
    multiple = test_current / rated_residual
    if multiple <= RCD_NO_TRIP_FRACTION * (1 + _ROUNDING):
        return _TimeRule(None, None, True, f"at or below {_NO_TRIP_PCT} of IΔn an RCD must not "
                         "trip (IEC 61008-1 / 61009-1)")
    reached = protection.rcd_test_multiple(test_current, rated_residual, device)
    if reached is None:
        return _TimeRule(None, None, False, f"between {_NO_TRIP_PCT} and 100 % of IΔn the "
                         "standard sets no break time")
    return _TimeRule(*RCD_BREAK_TIMES_S[device][reached], False,
                     f"IEC 61008-1 / 61009-1 break time at {reached} × IΔn (the test is at "
                     f"{multiple:.3g} × IΔn)")


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
    rule = (f"UL 943 Class A: {_GFCI_WINDOW}" if gfci else
            f"IEC 61008-1 / 61009-1: no trip at {_NO_TRIP_PCT} IΔn, trip by IΔn")
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


def _timed_test(result, device, rated, test_current, trip_time):
    """The time allowed at the test current, and the measured time judged; returns the verdict
    (None when no time was measured)."""
    gfci = device == "gfci"
    rule = _trip_time_rule(device, test_current, rated)
    if rule.greatest is not None:
        result.output("time_limit", rule.greatest)
        if rule.least is not None:
            result.output("min_time", rule.least)
        span = (f"{fq(rule.least, 's')} to {fq(rule.greatest, 's')}" if rule.least is not None
                else f"at most {fq(rule.greatest, 's')}")
        formula = (f"({GFCI_CURVE_A * 1e3:g} / {test_current * 1e3:.4g})^{GFCI_CURVE_EXPONENT:g}"
                   " s = " if gfci else "")
        result.step(f"Trip time allowed at {fq(test_current, 'A')}: {rule.text}", "t_trip",
                    f"= {formula}{span}")
    else:
        result.step(f"At {fq(test_current, 'A')}: {rule.text}", "—", "no time limit")
    if gfci and not GFCI_CURVE_RANGE_A[0] <= test_current <= GFCI_CURVE_RANGE_A[1]:
        result.check("curve_range", "warn",
                     f"UL 943's time formula holds from {_GFCI_RANGE}; at "
                     f"{fq(test_current, 'A')} "
                     + ("no time applies." if test_current < GFCI_CURVE_RANGE_A[0] else
                        "the time shown is the formula carried beyond its range."))
    if trip_time is None:
        return None
    result.step("Measured trip time", "t", f"= {fq(trip_time, 's')}")
    return _trip_time_check(result, rule, test_current, trip_time)


def _rcd_rating_checks(result, device, rated):
    extra = rated <= ADDITIONAL_PROTECTION_A * (1 + _ROUNDING)
    result.check("additional_protection", "pass" if extra else "warn",
                 f"IΔn = {fq(rated, 'A')}: " + (
                     f"qualifies as additional protection ({_ADDITIONAL}, IEC 60364-4-41 "
                     "415.1.1)." if extra else f"not additional protection, which needs "
                     f"{_ADDITIONAL} (IEC 60364-4-41 415.1.1); it can serve fault or fire "
                     "protection."))
    if device == "rcd-s" and extra:
        result.check("type_s", "warn", "Type S (time-delayed) RCDs are made for IΔn above "
                     f"{_ma(ADDITIONAL_PROTECTION_A)} (IEC 61008-1, from memory): check the "
                     "marking.")


def _plausibility(result, gfci, rated, trip_current, test_current, trip_time):
    """Readings outside what any GFCI, RCD or tester gives."""
    reasons = []
    if not gfci and not any(abs(rated / preferred - 1.0) <= _SERIES_MATCH
                            for preferred in RCD_PREFERRED_RESIDUAL_A):
        series = ", ".join(_ma(i) for i in RCD_PREFERRED_RESIDUAL_A)
        reasons.append(f"IΔn = {_ma(rated)} is not a rating RCDs are made in ({series}: IEC "
                       "61008-1 / 61009-1 preferred values, from memory); check the marking")
    if trip_time is not None and trip_time < FASTEST_TRIP_S:
        reasons.append(f"a trip time of {fq(trip_time, 's')} is faster than any device opens "
                       f"(at least about {fq(FASTEST_TRIP_S, 's')}: common practice); check the "
                       "unit (ms, not s)")
    ramp_top = GFCI_CURVE_RANGE_A[1] if gfci else RAMP_MAX_MULTIPLE * rated
    test_top = GFCI_CURVE_RANGE_A[1] if gfci else TESTER_MAX_MULTIPLE * rated
    tops = (
        (trip_current, ramp_top, "a ramp reading",
         f"the {_ma(ramp_top)} top of UL 943's test range" if gfci else
         f"{RAMP_MAX_MULTIPLE:g} × IΔn = {_ma(ramp_top)}, where a tester's ramp stops "
         "(IEC 61557-6, from memory): a device that has not tripped by then has failed, and no "
         "tester reports a higher trip current"),
        (test_current, test_top, "a test current",
         f"the {_ma(test_top)} top of UL 943's trip-time range" if gfci else
         f"the {TESTER_MAX_MULTIPLE:g} × IΔn = {_ma(test_top)} a tester applies (IEC 61557-6 / "
         "IEC 61008-1 tests, from memory)"),
    )
    for reading, top, what, where in tops:
        if reading is not None and reading > top * (1 + _SERIES_MATCH):
            reasons.append(f"{what} of {_ma(reading)} is beyond {where}")
    plausibility(result, reasons)


def _view(inputs):
    device = inputs["device"]
    gfci = device == "gfci"
    rated = inputs["rated_residual"]
    trip_current, test_current, trip_time = (inputs["trip_current"], inputs["test_current"],
                                             inputs["trip_time"])
    result = Result()
    if trip_time is not None and test_current is None:
        if gfci:
            raise InputError("test_current", None, "enter the test current the trip time was "
                             f"measured at (the UL 943 time is for {_GFCI_RANGE})")
        test_current = rated
        result.step("No test current given: the timed test is taken at IΔn", "I_test = IΔn",
                    f"= {fq(rated, 'A')}")
    no_trip = GFCI_NO_TRIP_A if gfci else RCD_NO_TRIP_FRACTION * rated
    must_trip = GFCI_MUST_TRIP_A if gfci else rated
    result.output("no_trip_below", no_trip)
    result.output("must_trip_at", must_trip)
    if gfci:
        result.step("UL 943 Class A GFCI thresholds (fixed by the standard; IΔn is not used)",
                    f"no trip below {_ma(GFCI_NO_TRIP_A)}; trip at {_ma(GFCI_MUST_TRIP_A)} and "
                    "above", f"= {fq(no_trip, 'A')} / {fq(must_trip, 'A')}")
    else:
        result.step(f"RCD with IΔn = {fq(rated, 'A')}",
                    f"no trip at {_NO_TRIP_PCT} IΔn; trip by IΔn",
                    f"= {fq(no_trip, 'A')} / {fq(must_trip, 'A')}")

    verdicts = []
    if trip_current is not None:
        result.step("Measured trip current (ramp test)", "I_trip", f"= {fq(trip_current, 'A')}")
        verdicts.append(_trip_current_check(result, gfci, trip_current, no_trip, must_trip))
    if test_current is not None:
        verdicts.append(_timed_test(result, device, rated, test_current, trip_time))
    verdicts = [v for v in verdicts if v is not None]

    if not gfci:
        _rcd_rating_checks(result, device, rated)
    if verdicts:
        passes = all(verdicts)
        result.output("passes", passes, "yes" if passes else "no")
    else:
        result.check("measured", "warn", "Nothing measured to judge: enter the tester's trip "
                     "current, or its trip time and test current.")

    _plausibility(result, gfci, rated, trip_current, test_current, trip_time)
    result.assumptions += list(ASSUMPTIONS)
    result.sources += list(SOURCES)
    result.cautions += list(CAUTIONS)
    result.cautions += list(cautions.COMMON)
    result.series = _chart(device, rated, test_current, trip_time, trip_current)
    return result


def _chart(device, rated, test_current, trip_time, trip_current):
    if device == "gfci":
        low, high = GFCI_CURVE_RANGE_A
        currents = [low * (high / low) ** (k / CHART_POINTS) for k in range(CHART_POINTS + 1)]
        lines = [{"label": "UL 943 greatest trip time", "unit": "ms",
                  "values": [protection.gfci_time_limit(i) * 1e3 for i in currents]}]
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


CALCULATOR = Calculator(
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
              help=f"From the RCD's marking: {_ma(ADDITIONAL_PROTECTION_A)} for additional "
                   "protection. Not used for a GFCI."),
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
    compute=_view,
)
