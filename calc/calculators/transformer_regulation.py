"""transformer-regulation: how far does the secondary voltage fall under this load, and which
no-load tap brings it back within the voltage band?"""

import math

from calc import cautions, transformers
from calc.calculators import _inputs
from calc.calculators._plausibility import outside, plausibility
from calc.calculators._transformers import (
    SOURCE_IDEAL,
    Z_PCT_MAX,
    Z_PCT_MIN,
    equipment_reasons,
    ideal_relations,
    load_reason,
    rating_input,
    voltage_input,
)
from calc.errors import InputError, VoltageCollapse
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

# The approximate formula is trusted while it is within this many percentage points of the
# exact phasor value (common practice: a tenth of a point is below any meter's reading error).
FORMULA_AGREEMENT_PCT = 0.1

# Plausibility. A supply held this far from rated is a fault or a wrong rating, not a tap job:
# ANSI C84.1 Range B spans about −13 % to +6 % (from memory); IEC 61000-2-2 / EN 50160 allow
# ± 10 % (read, as quoted: see transformers.VOLTAGE_BAND_PCT) [% of rated].
SUPPLY_PCT_RANGE = (85.0, 110.0)
# A transformer's rated secondary is its system's nominal voltage or a few percent above it (420 V
# for 400 V, 480 V for 460 V; common practice): a system voltage further off is a mix-up [%].
SYSTEM_MATCH_PCT = 10.0

BAND_NA, BAND_IEC = transformers.VOLTAGE_BAND_PCT["na"], transformers.VOLTAGE_BAND_PCT["iec"]
BAND_TEXT = f"ANSI C84.1 Range A ± {BAND_NA:g} %; IEC 61000-2-2 / EN 50160 ± {BAND_IEC:g} %"


def _signed(tap):
    """A tap as the trade writes it: "−5", "0", "+2.5" (a true minus sign)."""
    return ("+" if tap > 0 else "−" if tap < 0 else "") + f"{abs(tap):g}"


TAP_CHOICES = tuple((f"{t:g}", f"{t:+g} %" if t else "0 % (rated)")
                    for t in transformers.STANDARD_TAPS_PCT)
TAPS_TEXT = ", ".join(_signed(t) for t in transformers.STANDARD_TAPS_PCT)

SOURCE_REGULATION = (
    "Regulation ε ≈ %R cos φ + %X sin φ + (%X cos φ − %R sin φ)² / 200 (textbook formula with "
    "its second-order term); exact value from the phasor diagram of the series impedance."
)
SOURCE_TAPS = (f"No-load taps {transformers.TAP_STEPS} × {transformers.TAP_STEP_PCT:g} % above "
               "and below rated: IEEE C57.12.10.")
CAUTION_TAPS = (
    "Change a de-energised (no-load) tap changer only with the transformer switched off, locked "
    "out and verified dead on both windings; set every phase to the same tap, and check the "
    "nameplate: some label taps by position number or letter rather than by percent."
)


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
    z = transformers.impedance_per_unit(z_pct, x_r)
    r_pct, x_pct = 100.0 * z.real, 100.0 * z.imag
    return r_pct, x_pct, (f"%R = {z_pct:g} / √(1 + {x_r:g}²) = {r_pct:.4g} %, %X = {x_r:g} × %R = "
                          f"{x_pct:.4g} % (the %R and %X fields are not used)")


def _select_tap(voltage_at_tap, target, band_pct):
    """(tap [%], in band): the smallest tap change from rated (the lower first at equal size)
    whose voltage, `voltage_at_tap(tap)` [V], is within target ± band_pct; when none is, the tap
    that comes closest, and False."""
    taps = transformers.STANDARD_TAPS_PCT
    for tap in sorted(taps, key=lambda t: (abs(t), t)):
        if abs(voltage_at_tap(tap) - target) <= band_pct / 100.0 * target * (1.0 + 1e-12):
            return tap, True
    return min(taps, key=lambda t: abs(voltage_at_tap(t) - target)), False


def _tap_name(tap):
    return f"{tap:+g} % tap" if tap else "rated tap"


def _regulation_steps(result, inputs, r_pct, x_pct, from_z, approx, exact):
    pf, leading, load = inputs["pf"], inputs["leading"], inputs["load_pct"] / 100.0
    sine = math.sqrt(max(0.0, 1.0 - pf * pf)) * (-1.0 if leading else 1.0)  # negative leading
    kind = "leading" if leading else "lagging"
    if from_z:
        result.step("%R and %X from %Z and X/R", "%R = %Z / √(1 + (X/R)²), %X = (X/R) %R", from_z)
    p, q = load * r_pct, load * x_pct
    result.step(f"At {100 * load:g} % load the resistance and reactance drops",
                "p = k %R, q = k %X",
                f"= {p:.4g} %, {q:.4g} %; cos φ = {pf:g}, sin φ = {sine:+.4g} ({kind})")
    result.step("Regulation, textbook formula with its second-order term",
                "ε ≈ p cos φ + q sin φ + (q cos φ − p sin φ)² / 200",
                f"= {p:.4g} × {pf:g} + {q:.4g} × {sine:+.4g} + ({q:.4g} × {pf:g} − {p:.4g} × "
                f"{sine:+.4g})² / 200 = {approx:.4g} %")
    result.step("Regulation, exact (phasor diagram, loaded secondary at rated voltage)",
                "ε = |1 + k (r + jx)(cos φ − j sin φ)| − 1", f"= {exact:.4g} %")


def _checks(result, system_v, band, present, loaded_v, tap, in_band, tapped_v, no_load_v,
            approx, exact):
    low, high = system_v * (1 - band / 100), system_v * (1 + band / 100)
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
    agree = abs(exact - approx) <= FORMULA_AGREEMENT_PCT
    result.check("formula_validity", "pass" if agree else "warn",
                 f"The approximate formula gives {approx:.4g} %, the exact phasor value "
                 f"{exact:.4g} %" + ("." if agree else f"; they differ by more than "
                                    f"{FORMULA_AGREEMENT_PCT:g} percentage point, so use the "
                                    "exact value."))


def _plausibility(result, inputs, r_pct, x_pct, system_v):
    secondary_v = inputs["secondary_v"]
    reasons = equipment_reasons(inputs["kva"], int(inputs["phases"]),
                                (("primary", inputs["primary_v"]), ("secondary", secondary_v)),
                                math.hypot(r_pct, x_pct))
    reasons.append(load_reason(inputs["load_pct"]))
    supply = inputs["supply_pct"]
    if outside(supply, *SUPPLY_PCT_RANGE):
        reasons.append(f"a supply at {supply:g} % of rated is outside {SUPPLY_PCT_RANGE[0]:g}-"
                       f"{SUPPLY_PCT_RANGE[1]:g} % (beyond ANSI C84.1 Range B, from memory, and "
                       "the ± 10 % of IEC 61000-2-2 / EN 50160): a supply that far off is a "
                       "fault, not a tap setting")
    off = abs(system_v / secondary_v - 1.0) * 100.0
    if off > SYSTEM_MATCH_PCT:
        reasons.append(f"the nominal system voltage {fq(system_v, 'V')} is {off:.3g} % from the "
                       f"rated secondary {fq(secondary_v, 'V')}: a rated secondary is within a "
                       f"few percent of its system's (more than {SYSTEM_MATCH_PCT:g} % is a "
                       "mix-up; common practice)")
    plausibility(result, reasons)


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
            return secondary_v * transformers.loaded_voltage(
                supply * transformers.tap_voltage_factor(tap), r_pct, x_pct, pf, leading, fraction)
        except VoltageCollapse:
            raise InputError("load_pct", inputs["load_pct"], "no steady voltage exists at this "
                             "load through this impedance; check %R, %X and the load") from None

    exact = transformers.regulation_exact(r_pct, x_pct, pf, leading, load)
    approx = transformers.regulation_approx(r_pct, x_pct, pf, leading, load)
    loaded_v = loaded_at(present)
    tap, in_band = _select_tap(loaded_at, system_v, band)
    tapped_v = loaded_at(tap)
    no_load_v = secondary_v * supply * transformers.tap_voltage_factor(tap)
    result = Result()
    result.output("regulation_pct", exact)
    result.output("loaded_v", loaded_v)
    result.output("tap_pct", tap, f"{tap:+g} %" if tap else "0 % (rated tap)")
    result.output("regulation_approx_pct", approx)
    result.output("tapped_v", tapped_v)
    result.output("no_load_v", no_load_v)

    _regulation_steps(result, inputs, r_pct, x_pct, from_z, approx, exact)
    result.step(f"Loaded secondary voltage on the {_tap_name(present)} with the supply at "
                f"{100 * supply:g} % (constant-current load, exact phasor solution)",
                "V_nl = V₂ × supply / (1 + tap); |V_nl|² = (V + I R cos φ + I X sin φ)² + "
                "(I X cos φ − I R sin φ)²",
                f"V_nl = {fq(secondary_v * supply * transformers.tap_voltage_factor(present), 'V')}"
                f"; V = {fq(loaded_v, 'V')}")
    low, high = system_v * (1 - band / 100), system_v * (1 + band / 100)
    result.step(f"Tap that brings the loaded voltage within {fq(system_v, 'V')} ± {band:g} % "
                f"({fq(low, 'V')} to {fq(high, 'V')}): the smallest change from rated",
                f"taps {TAPS_TEXT} % of rated primary voltage",
                f"{_tap_name(tap)} (for a {fq(primary_v * (1 + tap / 100), 'V')} primary) → "
                f"{fq(tapped_v, 'V')} loaded, {fq(no_load_v, 'V')} at no load")
    phases, apparent_power = int(inputs["phases"]), inputs["kva"]
    rated_a = transformers.rated_current(apparent_power, secondary_v, phases)
    load_a = load * rated_a
    result.output("load_a", load_a)
    result.step("Load current", "I = k × I_FL",
                f"= {load:g} × {fq(rated_a, 'A')} = {fq(load_a, 'A')}")
    ideal_relations(result, primary_v, secondary_v, phases, apparent_power)
    _checks(result, system_v, band, present, loaded_v, tap, in_band, tapped_v, no_load_v, approx,
            exact)
    _plausibility(result, inputs, r_pct, x_pct, system_v)

    result.assumptions += [
        "Series impedance only (no magnetising branch); %R and %X on the transformer's rating, "
        "the same on every tap.",
        "Constant-current load at the stated power factor; balanced three-phase or single-phase "
        "alike (per unit).",
        f"The supply (primary) voltage is held at {100 * supply:g} % of rated whatever the load.",
        f"Band ± {band:g} % of {fq(system_v, 'V')}: ANSI C84.1 Range A is ± {BAND_NA:g} % at the "
        f"service and IEC 61000-2-2 / EN 50160 give ± {BAND_IEC:g} % (both read, as quoted at "
        "powerstandards.com); the equipment may need less.",
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


CALCULATOR = Calculator(
    id="transformer-regulation",
    title="Transformer regulation and taps",
    summary="Voltage regulation at a load and power factor from %R and %X (or %Z and X/R), "
            "the loaded secondary voltage, and the no-load tap that brings it back in band.",
    group="Transformers",
    inputs=(
        Input("r_pct", "Resistance %R", "quantity", unit="%", default=1.0, minimum=0,
              maximum=Z_PCT_MAX, help="From the test report (load loss / rating × 100)."),
        Input("x_pct", "Reactance %X", "quantity", unit="%", default=5.0, minimum=0,
              maximum=Z_PCT_MAX, help="From the test report: √(%Z² − %R²)."),
        Input("z_pct", "Or impedance %Z", "quantity", unit="%", optional=True,
              minimum=Z_PCT_MIN, maximum=Z_PCT_MAX,
              help=f"With X/R, replaces %R and %X. {Z_PCT_MIN:g} to {Z_PCT_MAX:g} %."),
        Input("x_r", "and X/R", "quantity", unit="", optional=True, minimum=0, maximum=100),
        Input("pf", "Load power factor", "quantity", unit="", default=0.85, minimum=0.05,
              maximum=1),
        Input("leading", "Leading power factor (capacitive load)", "flag", default=False),
        Input("load_pct", "Load", "quantity", unit="%", default=100, minimum=0, maximum=200,
              help="Load current as a percentage of rated current."),
        voltage_input("secondary_v", "Rated secondary voltage", 208, 400,
                      "No-load voltage on the rated tap; line-to-line for three-phase."),
        voltage_input("primary_v", "Rated primary voltage", 480, 11000,
                      "Line-to-line for three-phase; names the tap voltages."),
        Input("present_tap", "Present tap", "choice", default="0", choices=TAP_CHOICES),
        rating_input(advanced=True, help="For the currents; the regulation itself is per unit."),
        _inputs.phases(advanced=True),
        Input("supply_pct", "Supply voltage", "quantity", unit="%", default=100, minimum=50,
              maximum=150, help="The primary supply as a percentage of rated primary voltage."),
        Input("band_pct", "Voltage band ±", "quantity", unit="%", default=BAND_NA,
              minimum=0, min_exclusive=True, maximum=20, region_defaults={"iec": BAND_IEC},
              help=f"{BAND_TEXT}."),
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
