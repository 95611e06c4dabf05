"""switching-transient: how fast does a coil's current build up or a capacitor charge or bleed
down when a DC source is switched in or out, and does a series RLC ring? The time constant,
damping, the value at any time, the peak and the settling time, with the waveform.
"""

import math

from calc import cautions, rlc
from calc.calculators._circuits import chart_times, format_energy, part_reasons, q_reason
from calc.calculators._plausibility import plausibility
from calc.errors import InputError
from calc.rlc import SETTLING_BAND, TWO_PI
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

CIRCUITS = (
    ("rl", "RL (coil and resistance)"),
    ("rc", "RC (capacitor and resistance)"),
    ("rlc", "Series RLC"),
)
POSITIONS = (
    ("1", "1: switch onto the source (step)"),
    ("2", "2: source out, circuit closed on itself (release)"),
)
RESPONSE_NAMES = {"rl": "coil current", "rc": "capacitor voltage", "rlc": "capacitor voltage"}

# The ringing envelope is drawn below this damping ratio; nearer 1 its √(1 + (α/ωd)²) factor
# grows without bound and would only flatten the chart.
ENVELOPE_ZETA = 0.8

# Below this damping ratio the losses the ideal model leaves out (core, dielectric, skin effect,
# radiation) set how fast a real circuit rings down — common practice.
LIGHT_DAMPING_ZETA = 0.01

SETTLING_PCT = 100.0 * SETTLING_BAND

# The largest currents of low-voltage installations are faults of about 100 kA (the breaking
# capacity of the largest breakers — common practice): a switching transient beyond it means R
# is missing a part of the loop (wiring, the source's own resistance).
PEAK_CURRENT_MAX_A = 1e5

SOURCES = (
    "First- and second-order step and natural responses: J. W. Nilsson and S. A. Riedel, "
    "Electric Circuits, 10th ed., chapters 7 and 8 — from memory.",
    f"Overshoot e^(−ζπ/√(1 − ζ²)) and the {SETTLING_PCT:g} % settling criterion: K. Ogata, "
    "Modern Control Engineering, 5th ed., section 5-3 — from memory.",
)
ASSUMPTIONS = (
    "Ideal lumped parts: L without core saturation or losses, C without leakage, R constant; "
    "the switch moves instantly and without bounce or arcing.",
    "Position 1 starts from rest (no stored energy). Position 2 starts from the steady "
    "state reached on the source, with the source replaced by a short circuit.",
)
CAUTION_CAPACITOR = (
    "A charged capacitor stays dangerous after the supply is off: discharge it through a "
    "suitable resistor and verify zero volts with a rated meter before touching it "
    "(this one holds {energy} at {voltage})."
)
CAUTION_COIL = (
    "Opening a coil circuit without a discharge path drives a high voltage across the "
    "switch: see the inductive-kick calculator."
)


def _required(inputs, name, circuit, what):
    if inputs.get(name) is None:
        raise InputError(name, None, f"the {circuit} circuit needs {what}; enter it "
                         f"(e.g. {'0.5 H or 10 mH' if name == 'l' else '100 µF or 4.7 µF'})")
    return inputs[name]


def _chart_span(circuit, so, tau_dominant, time):
    """How much time the chart shows: five dominant time constants, the chosen time, and no
    more than 30 cycles of ringing (more would alias on a phone-sized chart)."""
    span = max(5.0 * tau_dominant, 1.25 * time)
    if circuit == "rlc" and so.sigma > 0.0:
        span = min(span, max(30.0 * TWO_PI / so.beta, 1.25 * time))
    return span


def _view(inputs):
    circuit, position = inputs["circuit"], inputs["position"]
    r, v = inputs["r"], inputs["source_v"]
    l = _required(inputs, "l", circuit.upper(), "the inductance L") if circuit != "rc" else None
    c = _required(inputs, "c", circuit.upper(), "the capacitance C") if circuit != "rl" else None
    tau = rlc.time_constant(circuit, r, l, c)
    time = tau if inputs["t"] is None else inputs["t"]
    unit = "A" if circuit == "rl" else "V"
    name = RESPONSE_NAMES[circuit]
    point = rlc.switching_transient(circuit, r, v, time, l, c, position)
    result = Result()

    so = rlc.series_second_order(r, l, c) if circuit == "rlc" else None
    tau_dominant = 1.0 / so.slow_rate if so else tau
    reference = v / r if circuit == "rl" else v  # final value on the source, initial released
    ref_text = "final value" if position == "1" else "initial value"
    percent = 100.0 * point.response / reference
    settle = rlc.settling_time(circuit, r, l, c)

    result.output("tau", tau)
    result.output("value_at_t", point.response, fq(point.response, unit))
    result.output("percent_at_t", percent)
    result.output("current_at_t", point.current)
    if circuit != "rl":
        result.output("capacitor_v_at_t", point.capacitor_voltage)
    if circuit != "rc":
        result.output("inductor_v_at_t", point.inductor_voltage)
    result.output("settling_time", settle)

    state = ("from rest, switched onto the source" if position == "1"
             else "after a long time on the source, switched to position 2 (source out)")
    if circuit == "rlc":
        _second_order_steps(result, inputs, so, point, percent, ref_text, state, time)
    else:
        _first_order_steps(result, inputs, tau, point, percent, ref_text, state, time)
    top = rlc.peak_current(circuit, r, v, l, c, position)
    result.output("peak_current", top.value)
    if circuit == "rlc":
        result.step("Largest current (where di/dt = 0)", "v_L = L di/dt = 0",
                    f"{fq(top.value, 'A')} at {fq(top.time, 's')}")
    result.step(f"Settling time (within {SETTLING_PCT:g} % of the final value for good)",
                f"τ ln {1.0 / SETTLING_BAND:g} (first order); last exit from the "
                f"{SETTLING_PCT:g} % band (RLC)", f"= {fq(settle, 's')}")

    # Energy the circuit stores at its steady state on the source.
    stored = 0.5 * l * (v / r) ** 2 if circuit == "rl" else 0.5 * c * v * v
    result.output("stored_energy", stored, format_energy(stored))
    result.step("Energy stored on the source (what position 2 releases)",
                "W = ½ L I² (rl), ½ C V² (rc, rlc)", f"= {format_energy(stored)}")

    _checks(result, circuit, position, so, time, settle, v, r, l, c)
    plausibility(result, _implausible(so, r, l, c, top.value))
    result.assumptions += [
        *ASSUMPTIONS,
        f"The response is the {name}" + (" (the quantity a coil's pull-in and release follow)."
                                         if circuit == "rl" else
                                         " (the quantity that carries the stored energy)."),
    ]
    if circuit == "rlc":
        result.assumptions.append(
            "τ for RLC is the envelope's 2L/R; an overdamped circuit settles on its slower mode.")
    result.sources += SOURCES
    result.cautions += [
        CAUTION_CAPACITOR.format(energy=format_energy(0.5 * c * v * v), voltage=fq(v, "V"))
        if c else CAUTION_COIL,
        *cautions.COMMON,
    ]
    result.series = _chart(circuit, position, so, r, l, c, v, tau, tau_dominant, time,
                           reference)
    return result


def _implausible(so, r, l, c, peak_current):
    """Why these parts or results lie outside real circuits ([] when they do not)."""
    reasons = part_reasons(r, l, c)
    if so is not None and so.damping_ratio > 0.0:
        reasons.append(q_reason(1.0 / (2.0 * so.damping_ratio)))
    if peak_current > PEAK_CURRENT_MAX_A:
        reasons.append(f"a peak current of {fq(peak_current, 'A')}: beyond the "
                       f"{fq(PEAK_CURRENT_MAX_A, 'A')} of the largest low-voltage faults (common "
                       "practice); include the wiring's and the source's resistance in R")
    return [reason for reason in reasons if reason]


def _first_order_steps(result, inputs, tau, point, percent, ref_text, state, time):
    r, v, l, c = inputs["r"], inputs["source_v"], inputs["l"], inputs["c"]
    r_t, v_t = fq(r, "ohm"), fq(v, "V")
    if inputs["circuit"] == "rl":
        result.step("Time constant of the coil circuit", "τ = L / R",
                    f"= {fq(l, 'H')} / {r_t} = {fq(tau, 's')}")
        result.step("Current the resistance allows", "I = V / R",
                    f"= {v_t} / {r_t} = {fq(v / r, 'A')}")
        formula = "i = I (1 − e^(−t/τ))" if inputs["position"] == "1" else "i = I e^(−t/τ)"
        result.step(f"Coil current at t, {state}", formula,
                    f"t/τ = {time / tau:.4g}: i = {fq(point.response, 'A')} ({percent:.3g} % of "
                    f"the {ref_text})")
        return
    result.step("Time constant of the capacitor circuit", "τ = R C",
                f"= {r_t} × {fq(c, 'F')} = {fq(tau, 's')}")
    formula = "v_C = V (1 − e^(−t/τ))" if inputs["position"] == "1" else "v_C = V e^(−t/τ)"
    result.step(f"Capacitor voltage at t, {state}", formula,
                f"t/τ = {time / tau:.4g}: v_C = {fq(point.response, 'V')} ({percent:.3g} % "
                f"of the {ref_text})")
    result.step("Current at t", "i = ±(V / R) e^(−t/τ)", f"= {fq(point.current, 'A')}")


def _second_order_steps(result, inputs, so, point, percent, ref_text, state, time):
    r, v, l, c = inputs["r"], inputs["source_v"], inputs["l"], inputs["c"]
    position = inputs["position"]
    result.output("damping_ratio", so.damping_ratio)
    result.output("natural_hz", so.omega0 / TWO_PI)
    if so.sigma > 0.0 and so.case == "underdamped":
        result.output("damped_hz", so.beta / TWO_PI)
    result.step("Envelope decay rate and time constant", "α = R / (2L), τ = 1/α = 2L / R",
                f"α = {fq(r, 'ohm')} / (2 × {fq(l, 'H')}) = {so.alpha:.4g} /s; "
                f"τ = {fq(rlc.time_constant('rlc', r, l), 's')}")
    result.step("Undamped natural frequency", "ω0 = 1 / √(L C), f0 = ω0 / 2π",
                f"ω0 = {so.omega0:.4g} rad/s, f0 = {fq(so.omega0 / TWO_PI, 'Hz')}")
    result.step(f"Damping ratio: {so.case}", "ζ = α / ω0 = (R/2) √(C/L)",
                f"= {so.damping_ratio:.4g} (critical at R = 2√(L/C) = "
                f"{fq(2.0 * math.sqrt(l / c), 'ohm')})")
    if so.case == "underdamped":
        result.step("Damped (ringing) frequency", "ωd = ω0 √(1 − ζ²), fd = ωd / 2π",
                    f"= {so.beta:.4g} rad/s = {fq(so.beta / TWO_PI, 'Hz')}")
        bracket = "cos ωd t + (α/ωd) sin ωd t"
    elif so.case == "overdamped":
        result.step("Two real modes", "s1,2 = −α ± √(α² − ω0²)",
                    f"= −{so.slow_rate:.4g} /s and −{so.alpha + so.beta:.4g} /s "
                    f"(the slow one sets the settling: τ_slow = {fq(1 / so.slow_rate, 's')})")
        bracket = "cosh βt + (α/β) sinh βt, β = √(α² − ω0²)"
    else:
        bracket = "1 + α t"
    formula = (f"v_C = V [1 − e^(−αt) ({bracket})]" if position == "1"
               else f"v_C = V e^(−αt) ({bracket})")
    result.step(f"Capacitor voltage at t, {state}", formula,
                f"t = {fq(time, 's')}: v_C = {fq(point.response, 'V')} ({percent:.3g} % of the "
                f"{ref_text}); i = {fq(point.current, 'A')}")
    peak = rlc.response_peak("rlc", r, v, l, c, position)
    if 0.0 < peak.time < math.inf:  # underdamped: the first swing past the final value
        result.output("peak_value", peak.value)
        result.output("peak_time", peak.time)
        swing = "highest" if position == "1" else "lowest"
        result.step(f"Capacitor voltage at its {swing}, first swing", "t_p = π / ωd",
                    f"= {fq(peak.time, 's')}: v_C = {fq(peak.value, 'V')} (overshoot "
                    f"{rlc.overshoot_pct(so.damping_ratio):.3g} % = 100 e^(−ζπ/√(1 − ζ²)))")


def _checks(result, circuit, position, so, time, settle, v, r, l, c):
    if time >= settle:
        result.check("settled", "pass", f"At t = {fq(time, 's')} the response is within "
                     f"{SETTLING_PCT:g} % of its final value for good (settling time "
                     f"{fq(settle, 's')}).")
    else:
        result.check("settled", "pass", f"At t = {fq(time, 's')} the transient is still running; "
                     f"it settles within {SETTLING_PCT:g} % at {fq(settle, 's')}.")
    if circuit == "rlc" and so.case == "underdamped":
        peak = rlc.response_peak(circuit, r, v, l, c, position)
        if position == "1":
            message = (f"Underdamped (ζ = {so.damping_ratio:.3g}): the capacitor voltage "
                       f"overshoots to {fq(peak.value, 'V')}, {peak.value / v:.3g} × the source; "
                       "the capacitor and anything across it must be rated for the peak.")
        else:
            message = (f"Underdamped (ζ = {so.damping_ratio:.3g}): the capacitor voltage swings "
                       f"through zero to {fq(peak.value, 'V')} (reversed); a polarised "
                       "(electrolytic) capacitor must not see reverse voltage.")
        result.check("overshoot", "warn", message)
    if circuit == "rlc" and so.damping_ratio < LIGHT_DAMPING_ZETA:
        result.check("light_damping", "warn",
                     f"ζ = {so.damping_ratio:.2g}: so little damping that losses the model "
                     "leaves out (core, dielectric, skin effect, radiation) set how fast a real "
                     "circuit rings down; the settling time is an upper figure.")


def _chart(circuit, position, so, r, l, c, v, tau, tau_dominant, time, reference):
    name = RESPONSE_NAMES[circuit]
    unit = "A" if circuit == "rl" else "V"
    span = _chart_span(circuit, so, tau_dominant, time)
    times = chart_times(span)
    values = [rlc.switching_transient(circuit, r, v, t, l, c, position).response for t in times]
    lines = [{"label": name.capitalize(), "unit": unit, "values": values}]
    if so and so.damping_ratio < ENVELOPE_ZETA:
        # The error from the final value is bounded by ±V √(1 + (α/ωd)²) e^(−αt).
        final = v if position == "1" else 0.0
        envelope = [v * math.exp(-so.alpha * t) * math.hypot(1.0, so.alpha / so.beta)
                    for t in times]
        lines.append({"label": "Envelope", "unit": unit,
                      "values": [final + e for e in envelope]})
        lines.append({"label": "Envelope (lower)", "unit": unit,
                      "values": [final - e for e in envelope]})
    marks = [{"axis": "x", "value": k * tau, "label": f"{k}τ"} for k in range(1, 6)
             if k * tau <= span]
    if all(abs(time - mark["value"]) > 0.01 * span for mark in marks):
        marks.append({"axis": "x", "value": time, "label": "t"})
    marks.append({"axis": "y", "value": reference * (1 if position == "1" else 0),
                  "label": "Final value"})
    return {
        "title": f"{name.capitalize()} after switching to position {position}",
        "x": {"label": "Time", "unit": "s", "values": times},
        "y": lines,
        "marks": marks,
    }


CALCULATOR = Calculator(
    id="switching-transient",
    title="Switching transient (RL, RC, RLC)",
    summary="Time constant, damping, the current or capacitor voltage at any time, peak and "
            "settling after a DC source is switched in or out.",
    group="Circuits",
    inputs=(
        Input("circuit", "Circuit", "choice", default="rl", choices=CIRCUITS,
              help="RL: a coil; RC: a capacitor; series RLC: both."),
        Input("position", "Switch moves to", "choice", default="1", choices=POSITIONS,
              help="1 connects the source (energising); 2 removes it and lets the stored "
                   "energy drive the current down."),
        Input("r", "Resistance R", "quantity", unit="ohm", default=48, minimum=1e-6,
              maximum=1e9, help="Total series resistance, including the coil's winding."),
        Input("l", "Inductance L", "quantity", unit="H", default="0.5 H", optional=True,
              minimum=1e-12, maximum=1e4, help="Not used for RC; blank if not in the circuit."),
        Input("c", "Capacitance C", "quantity", unit="F", default="100 µF", optional=True,
              minimum=1e-15, maximum=100, help="Not used for RL; blank if not in the circuit."),
        Input("source_v", "DC source voltage", "quantity", unit="V", default=24, minimum=1e-6,
              maximum=1e6),
        Input("t", "Time after switching", "quantity", unit="s", optional=True, minimum=0,
              maximum=1e6, help="Blank: one time constant."),
    ),
    outputs=(
        Output("tau", "Time constant τ", "s"),
        Output("value_at_t", "Response at t (RL: current; RC, RLC: capacitor voltage)", ""),
        Output("percent_at_t", "Response at t, of its final (1) or initial (2) value", "%"),
        Output("damping_ratio", "Damping ratio ζ", ""),
        Output("natural_hz", "Undamped natural frequency f0", "Hz"),
        Output("damped_hz", "Ringing frequency fd", "Hz"),
        Output("current_at_t", "Current at t", "A"),
        Output("capacitor_v_at_t", "Capacitor voltage at t", "V"),
        Output("inductor_v_at_t", "Inductor voltage at t", "V"),
        Output("peak_value", "Peak capacitor voltage (first swing past the final value)", "V"),
        Output("peak_time", "Time of the peak", "s"),
        Output("peak_current", "Largest current", "A"),
        Output("settling_time", f"Settling time ({SETTLING_PCT:g} %)", "s"),
        Output("stored_energy", "Energy stored on the source", "J"),
    ),
    compute=_view,
)
