"""inductive-kick: what voltage does a relay, contactor or solenoid coil throw back when it is
switched off, what does a diode, zener, RC snubber or varistor make of it, and how much does the
suppressor slow the release? Stored energy, coil and switch voltages, release delay and a
suggested snubber.
"""

import math

from calc import cautions, rlc
from calc.calculators._circuits import chart_times, format_energy, part_reasons
from calc.calculators._plausibility import outside, plausibility
from calc.errors import InputError
from calc.rlc import PASCHEN_MINIMUM_V, TWO_PI
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

SUPPRESSIONS = (
    ("none", "None (stray capacitance only)"),
    ("diode", "Freewheel diode"),
    ("diode_zener", "Diode + zener"),
    ("rc", "RC snubber"),
    ("varistor", "Varistor (MOV or TVS)"),
)

# A varistor chosen just above the supply clamps at roughly 2.5 times its working voltage at a
# coil's current — from memory (typical datasheet ratios); used only when no clamp is entered.
VARISTOR_CLAMP_RATIO = 2.5

# With no switch rating entered, the snubber is sized to keep the switch within twice the
# supply — common practice (what a diode + zener at the supply voltage gives).
DEFAULT_SWITCH_LIMIT_RATIO = 2.0

# The chart shows at most this many cycles of a long ringing.
CHART_CYCLES = 8.0

# The smallest supply, clamp or diode voltage the form takes: 0.1 V, below any real coil supply
# and any diode's forward drop (Schottky diodes drop about 0.2 V); smaller values only overflow
# the arithmetic (a clamp of 1e-300 V).
MIN_VOLTAGE_V = 0.1

# The suggested snubber capacitor is given as the next IEC 60063 preferred value up in this
# series (E12 holds every E6 value too; read, as reproduced in Wikipedia — see calc.rlc.E_SERIES).
SNUBBER_SERIES = "E12"

# ---- plausibility: the range of real DC coils (issue 11, item 9) -------------------------------

# DC relay, contactor and solenoid coils are made for 3 V to 250 V (5, 12, 24, 48, 110, 125,
# 220, 250 V are usual control voltages) — common practice.
COIL_SUPPLY_RANGE_V = (3.0, 250.0)
# Coils draw from about 50 mW (sensitive relays) to a few hundred watts (large DC contactors);
# brakes and lifting magnets reach kilowatts — common practice.
COIL_POWER_RANGE_W = (0.05, 2000.0)
# Inductances from a tenth of a millihenry (reed relays) to tens of henries (large contactors,
# brakes, lifting magnets) — common practice.
COIL_INDUCTANCE_RANGE_H = (1e-4, 100.0)
# Winding and wiring capacitance: picofarads to a few nanofarads — common practice.
STRAY_CAPACITANCE_RANGE_F = (1e-12, 10e-9)
# Non-polarised (film) capacitors for a snubber are rarely made above this; beyond it a
# diode + zener or a varistor is the practical suppressor — common practice.
SNUBBER_CAPACITANCE_MAX_F = 100e-6

SOURCES = (
    "Energy ½LI², first-order decay and the series RLC loop: Nilsson and Riedel, Electric "
    "Circuits, 10th ed., chapters 6–8 — from memory.",
    "Suppressor choice (diode slowest, diode + zener or varistor faster, RC for AC or DC): "
    "common practice.",
    f"Minimum breakdown voltage of an air gap, about {PASCHEN_MINIMUM_V:g} V (Paschen minimum): "
    "J. M. Meek and J. D. Craggs, Electrical Breakdown of Gases, 1978 — from memory.",
    f"Preferred capacitor values: IEC 60063:2015, {SNUBBER_SERIES} series (read, as reproduced in "
    "Wikipedia, “E series of preferred numbers”).",
)
ASSUMPTIONS = (
    "DC coil, switched off by an ideal switch in its supply lead; the suppressor is across "
    "the coil. The armature releases when the coil current falls to the dropout current; "
    "the mechanical release adds a few milliseconds (common practice).",
    "The coil is a constant L with its winding resistance R (no saturation, no eddy "
    "currents; a real iron core releases a little of its energy as losses).",
    "Diode, zener and varistor are ideal clamps at their stated voltage; a varistor's real "
    "voltage rises with current, so enter its datasheet clamping voltage at the coil "
    "current.",
)
CAUTIONS = (
    "A freewheel diode goes cathode to the positive side: fitted the wrong way round it "
    "shorts the supply when the coil is switched on.",
    "The kick appears on the coil's wiring and terminals too: keep clear of the terminals "
    "of a large DC coil when its circuit is opened, even at 24 V.",
)
CLAMP_NAMES = {"diode": "the diode's forward drop", "diode_zener": "V_F + V_Z",
               "varistor": "the varistor's clamping voltage"}


def _clamp_voltage(inputs, suppression):
    supply = inputs["supply_v"]
    vf, clamp = inputs["diode_vf"], inputs["clamp_v"]
    if suppression == "diode":
        return vf
    if suppression == "diode_zener":
        return vf + (supply if clamp is None else clamp)
    if clamp is None:
        return VARISTOR_CLAMP_RATIO * supply
    if clamp <= supply:
        raise InputError("clamp_v", clamp, f"a varistor across the coil sees the supply "
                         f"({fq(supply, 'V')}) all the time; its clamping voltage must be above "
                         "it (choose one whose working voltage exceeds the supply)")
    return clamp


def _view(inputs):
    supply, r, l = inputs["supply_v"], inputs["r"], inputs["l"]
    suppression = inputs["suppression"]
    dropout = inputs["dropout_pct"] / 100.0
    rating = inputs["switch_rating_v"]
    if rating is not None and rating <= supply:
        raise InputError("switch_rating_v", rating, f"a switch rated {fq(rating, 'V')} cannot "
                         f"block the {fq(supply, 'V')} supply; enter a rating above the supply")
    limit = rating if rating is not None else DEFAULT_SWITCH_LIMIT_RATIO * supply
    current = supply / r
    energy = 0.5 * l * current * current
    stray = inputs["stray_c"]
    bare = rlc.capacitive_kick(supply, r, l, stray, dropout)
    snub_r, snub_c = rlc.suggested_snubber(supply, r, l, limit, dropout)
    result = Result()

    if suppression in ("none", "rc"):
        entered_r, entered_c = inputs["snubber_r"], inputs["snubber_c"]
        cap = stray if suppression == "none" else (snub_c if entered_c is None else entered_c)
        rs = 0.0 if suppression == "none" else (snub_r if entered_r is None else entered_r)
        kick = rlc.capacitive_kick(supply, r, l, cap, dropout, rs)
        clamp = None
    else:
        cap, rs = None, 0.0
        clamp = _clamp_voltage(inputs, suppression)
        kick = rlc.clamped_kick(supply, r, l, clamp, dropout)

    result.output("coil_a", current)
    result.output("stored_energy", energy, format_energy(energy))
    result.output("peak_v", -kick.peak_coil_v)
    result.output("switch_v", kick.peak_switch_v)
    result.output("release_delay", kick.release_delay)
    if suppression != "none":
        result.output("absorbed_energy", kick.absorbed_energy, format_energy(kick.absorbed_energy))
    result.output("unsuppressed_v", -bare.peak_coil_v)
    result.output("snubber_r", rs if suppression == "rc" else snub_r)
    result.output("snubber_c", cap if suppression == "rc" else snub_c)
    standard_c = rlc.preferred_value_up(snub_c, SNUBBER_SERIES)
    result.output("snubber_c_standard", standard_c, fq(standard_c, "F", 2))

    _steps(result, inputs, kick, bare, clamp, cap, rs)
    ratio_text = "" if rating is not None else f" ({DEFAULT_SWITCH_LIMIT_RATIO:g} × the supply)"
    result.step(f"Suggested RC snubber for a switch limit of {fq(limit, 'V')}{ratio_text}",
                "R_s = R_coil; smallest C_s with V_switch ≤ limit",
                f"R_s = {fq(snub_r, 'ohm')}, C_s ≥ {fq(snub_c, 'F')}: fit "
                f"{fq(standard_c, 'F', 2)}, the next IEC 60063 {SNUBBER_SERIES} value up, rated "
                f"for at least {fq(max(limit, DEFAULT_SWITCH_LIMIT_RATIO * supply), 'V')}")

    _checks(result, suppression, kick, bare, rating)
    used_c = cap if suppression == "rc" else snub_c
    plausibility(result, _implausible(inputs, used_c))
    result.assumptions += ASSUMPTIONS
    if suppression == "varistor" and inputs["clamp_v"] is None:
        result.assumptions.append(
            f"No clamping voltage entered: taken as {VARISTOR_CLAMP_RATIO:g} × the supply = "
            f"{fq(clamp, 'V')} (a typical ratio for a varistor just above the supply — from "
            "memory).")
    if suppression == "diode_zener" and inputs["clamp_v"] is None:
        result.assumptions.append(
            f"No zener voltage entered: taken as the supply, {fq(supply, 'V')}, so the switch "
            "sees about twice the supply (common practice).")
    result.sources += SOURCES
    result.cautions += [*CAUTIONS, *cautions.COMMON]
    span = 1.5 * max(_kick_duration(kick, r + rs, l, cap), kick.release_delay)
    times = chart_times(span)
    coil_v, _ = rlc.kick_waveform(supply, r, l, suppression, times, cap, rs, clamp)
    result.series = {
        "title": "Voltage after the switch opens",
        "x": {"label": "Time", "unit": "s", "values": times},
        "y_axis": {"label": "Voltage", "unit": "V"},
        "y": [
            {"label": "Across the coil", "unit": "V", "values": coil_v},
            {"label": "Across the switch", "unit": "V", "values": [supply - x for x in coil_v]},
        ],
        "marks": [{"axis": "x", "value": kick.release_delay, "label": "Release"}],
    }
    return result


def _steps(result, inputs, kick, bare, clamp, cap, rs):
    supply, r, l = inputs["supply_v"], inputs["r"], inputs["l"]
    suppression, stray = inputs["suppression"], inputs["stray_c"]
    current = supply / r
    dropout = inputs["dropout_pct"] / 100.0
    result.step("Coil current while energised", "I = V / R", f"= {fq(supply, 'V')} / "
                f"{fq(r, 'ohm')} = {fq(current, 'A')}")
    result.step("Energy stored in the coil's field", "W = ½ L I²",
                f"= ½ × {fq(l, 'H')} × ({fq(current, 'A')})² = "
                f"{format_energy(0.5 * l * current * current)}")
    result.step("Coil time constant", "τ = L / R", f"= {fq(l / r, 's')}")
    so_bare = rlc.series_second_order(r, l, stray)
    result.step(f"No suppression: the current rings into the stray capacitance "
                f"({fq(stray, 'F')}) at f = 1/(2π√(LC)) = {fq(so_bare.omega0 / TWO_PI, 'Hz')}",
                "V_peak ≈ I √(L / C) (all of ½LI² into ½CV²)",
                f"≈ {fq(current * math.sqrt(l / stray), 'V')}; exact with losses and the "
                f"supply's charge: {fq(-bare.peak_coil_v, 'V')}")
    dropout_text = f"{inputs['dropout_pct']:g} % of I = {fq(dropout * current, 'A')}"
    if clamp is not None:
        result.step(f"Clamped at {CLAMP_NAMES[suppression]}", "v_coil = −V_c",
                    f"V_c = {fq(clamp, 'V')}; the switch sees V + V_c = "
                    f"{fq(kick.peak_switch_v, 'V')}")
        result.step("Current decays against the clamp", "i = (I + V_c/R) e^(−t/τ) − V_c/R",
                    f"reaches zero at t0 = τ ln(1 + I R / V_c) = {fq(kick.decay_time, 's')}")
        result.step(f"Release: current down to the dropout current ({dropout_text})",
                    "t_r = τ ln((I + V_c/R) / (I_do + V_c/R))", f"= {fq(kick.release_delay, 's')}")
        result.step("Energy the clamp absorbs (the rest heats the winding)",
                    "W_c = V_c (τ I − V_c t0 / R)", f"= {format_energy(kick.absorbed_energy)}")
        return
    if suppression == "rc":
        result.step("RC snubber across the coil", "R_s, C_s", f"= {fq(rs, 'ohm')}, {fq(cap, 'F')}")
    so = rlc.series_second_order(r + rs, l, cap)
    result.step(f"Loop L, R + R_s, C after opening: {so.case} (ζ = {so.damping_ratio:.3g})",
                "v_coil = v_C − R_s i; i(0) = I, v_C(0) = V",
                f"most negative coil voltage {fq(kick.peak_coil_v, 'V')}; the switch sees up "
                f"to {fq(kick.peak_switch_v, 'V')}")
    result.step(f"Release: current down to the dropout current ({dropout_text})",
                "first t with i(t) = I_do", f"= {fq(kick.release_delay, 's')}")
    if suppression == "rc":
        result.step("Energy R_s absorbs (share of ½LI² + ½CV² by resistance)",
                    "W_s = (½LI² + ½C V²) R_s / (R + R_s)",
                    f"= {format_energy(kick.absorbed_energy)}")


def _implausible(inputs, snubber_c):
    """Why this coil or its suppressor lies outside real ones ([] when it does not)."""
    supply, r, l, stray = inputs["supply_v"], inputs["r"], inputs["l"], inputs["stray_c"]
    reasons = part_reasons(resistance=r)
    for value, (low, high), unit, what, usual in (
            (supply, COIL_SUPPLY_RANGE_V, "V", "a coil supply of", "DC coils are made for"),
            (supply * supply / r, COIL_POWER_RANGE_W, "W", "a coil power V²/R of",
             "DC coils draw"),
            (l, COIL_INDUCTANCE_RANGE_H, "H", "a coil inductance of", "DC coils have"),
            (stray, STRAY_CAPACITANCE_RANGE_F, "F", "a stray capacitance of",
             "windings and wiring have")):
        if outside(value, low, high):
            reasons.append(f"{what} {fq(value, unit)}: {usual} {fq(low, unit, 2)} to "
                           f"{fq(high, unit, 2)} (common practice)")
    if snubber_c > SNUBBER_CAPACITANCE_MAX_F:
        reasons.append(f"a snubber capacitor of {fq(snubber_c, 'F')}: film capacitors for "
                       f"snubbers are rarely above {fq(SNUBBER_CAPACITANCE_MAX_F, 'F', 2)} "
                       "(common practice); use a diode + zener or a varistor")
    return reasons


def _kick_duration(kick, resistance, inductance, capacitance):
    """How long the chart shows: the whole decay, or CHART_CYCLES cycles of a long ringing."""
    if capacitance is None:
        return kick.decay_time
    so = rlc.series_second_order(resistance, inductance, capacitance)
    if so.sigma > 0.0:
        return min(kick.decay_time, CHART_CYCLES * TWO_PI / so.beta)
    return kick.decay_time


def _checks(result, suppression, kick, bare, rating):
    if rating is not None:
        if kick.peak_switch_v > rating:
            result.check("switch_rating", "fail",
                         f"The switch sees up to {fq(kick.peak_switch_v, 'V')}, above its "
                         f"{fq(rating, 'V')} rating: a transistor output fails, a contact arcs.")
        else:
            result.check("switch_rating", "pass",
                         f"The switch sees up to {fq(kick.peak_switch_v, 'V')}, within its "
                         f"{fq(rating, 'V')} rating.")
    if suppression == "none":
        status = "warn" if -bare.peak_coil_v > PASCHEN_MINIMUM_V else "pass"
        result.check("unsuppressed", status,
                     f"Unsuppressed kick {fq(-bare.peak_coil_v, 'V')}" +
                     (f": above the ~{PASCHEN_MINIMUM_V:g} V an air gap can hold, so in "
                      "practice the opening contact arcs over (showering arc) and the figure "
                      "is not reached; the arc burns the contact and radiates interference."
                      if status == "warn" else "."))
    if suppression == "diode":
        result.check("slow_release", "warn",
                     f"A plain diode lets the current circulate: release takes "
                     f"{fq(kick.release_delay, 's')}. Where that matters (contactor breaking a "
                     "load, safety circuits), use a diode + zener or a varistor (common "
                     "practice).")


CALCULATOR = Calculator(
    id="inductive-kick",
    title="Inductive kick of a DC coil",
    summary="Stored energy, the voltage spike when a relay, contactor or solenoid coil is "
            "switched off, and what a diode, zener, RC snubber or varistor makes of it.",
    group="Circuits",
    inputs=(
        Input("supply_v", "Coil supply voltage (DC)", "quantity", unit="V", default=24,
              minimum=MIN_VOLTAGE_V, maximum=1000),
        Input("r", "Coil resistance", "quantity", unit="ohm", default=48, minimum=1e-3,
              maximum=1e7, help="Measured across the coil terminals, de-energised."),
        Input("l", "Coil inductance", "quantity", unit="H", default="0.5 H", minimum=1e-9,
              maximum=1e3, help="With the armature closed (energised position) if known."),
        Input("suppression", "Suppression", "choice", default="diode", choices=SUPPRESSIONS),
        Input("switch_rating_v", "Switch voltage rating", "quantity", unit="V", optional=True,
              minimum=0, min_exclusive=True, maximum=1e5,
              help="Of the contact or transistor that switches the coil; blank: no check."),
        Input("clamp_v", "Zener or varistor clamping voltage", "quantity", unit="V",
              optional=True, minimum=MIN_VOLTAGE_V, maximum=1e5,
              help=f"Blank: the supply (zener) or {VARISTOR_CLAMP_RATIO:g} × the supply "
                   "(varistor)."),
        Input("snubber_r", "Snubber resistance", "quantity", unit="ohm", optional=True,
              minimum=0, maximum=1e7, help="Blank: the suggested value."),
        Input("snubber_c", "Snubber capacitance", "quantity", unit="F", optional=True,
              minimum=1e-12, maximum=1, help="Blank: the suggested value."),
        Input("dropout_pct", "Dropout current", "quantity", unit="%", default=20, minimum=0,
              min_exclusive=True, maximum=100, max_exclusive=True, advanced=True,
              help="Share of the holding current at which the armature releases "
                   "(common practice 10–30 %)."),
        Input("diode_vf", "Diode forward voltage", "quantity", unit="V", default=0.8,
              minimum=MIN_VOLTAGE_V, maximum=5, advanced=True),
        Input("stray_c", "Coil stray capacitance", "quantity", unit="F", default="200 pF",
              minimum=1e-13, maximum=1e-6, advanced=True,
              help="Winding and wiring capacitance; it alone limits an unsuppressed kick."),
    ),
    outputs=(
        Output("coil_a", "Coil current", "A"),
        Output("stored_energy", "Stored energy ½LI²", "J"),
        Output("peak_v", "Peak reverse voltage across the coil", "V"),
        Output("switch_v", "Peak voltage across the opening switch", "V"),
        Output("release_delay", "Release delay (current down to dropout)", "s"),
        Output("absorbed_energy", "Energy the suppressor absorbs", "J"),
        Output("unsuppressed_v", "Peak coil voltage with no suppression", "V"),
        Output("snubber_r", "Snubber R (suggested or entered)", "Ω"),
        Output("snubber_c", "Snubber C (suggested minimum, or entered)", "F"),
        Output("snubber_c_standard", f"Suggested snubber C, next IEC 60063 {SNUBBER_SERIES} "
               "value up", "F"),
    ),
    compute=_view,
)
