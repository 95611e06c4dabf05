"""rlc-resonance: where does a coil and capacitor pair resonate, how sharp is it, and what
impedance and current does it present at another frequency? f0, Q, bandwidth, the half-power
frequencies, |Z| and I at any frequency, and the L or C that tunes to a target frequency.
"""

import cmath
import math

from calc import cautions, rlc, units
from calc.calculators._circuits import CHART_POINTS, part_reasons, q_reason
from calc.calculators._plausibility import plausibility
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

TOPOLOGIES = (
    ("series", "Series R–L–C"),
    ("parallel", "Parallel R ∥ L ∥ C"),
)

# Below Q = 0.5 (ζ = 1/(2Q) above 1) a circuit is overdamped: no sharp resonance.
# Alexander and Sadiku, Fundamentals of Electric Circuits, 5th ed., section 14.5 (ζ = 1/2Q and
# the overdamped case) — from memory.
SHARP_Q = 0.5

# Above Q = 1 the voltage across L and C (series), or the current in them (parallel), exceeds
# the supply's: the parts must be rated for it.
MAGNIFYING_Q = 1.0

# The sweep window around f0 [× f0]: the chart's axis is linear, so a window of f0/5 to 3 f0
# keeps the resonance near the middle; points are denser within three bandwidths of f0.
SWEEP_WINDOW = (0.2, 3.0)

# Half-power marks closer together than this share of the window would print over f0's.
MARK_SPACING = 0.05

# Below this angle [°] the impedance is called resistive in the display.
RESISTIVE_ANGLE = 0.05

# The lowest frequency the form takes, a millihertz: below it 1/(ωC) and the tuning L or C
# overflow for the smallest parts, and no circuit of these parts is used there.
MIN_FREQUENCY_HZ = 1e-3

# Above about 1 GHz a part's size nears a tenth of the wavelength (3 cm at 1 GHz): R, L and C are
# no longer lumped and the formulas stop holding — common practice.
LUMPED_MAX_HZ = 1e9

SOURCES = (
    "f0, Q, bandwidth and half-power frequencies: C. K. Alexander and M. N. O. Sadiku, "
    "Fundamentals of Electric Circuits, 5th ed., sections 14.5–14.6 — from memory.",
)
ASSUMPTIONS = (
    "Ideal parts: R, L and C do not change with frequency; a real coil's winding "
    "resistance belongs in R (series) and its core losses in R (parallel).",
    "Steady sinusoidal state; the source is an ideal voltage source of the given rms value.",
)
CAUTION_MAGNIFICATION = (
    "Near resonance, voltages (series) or currents (parallel) inside the circuit are Q times "
    "those at its terminals; measure with instruments rated for them."
)


def _sweep_frequencies(f0, q, extra):
    """Frequencies for the impedance chart: the window, dense near f0, plus `extra` points."""
    low, high = SWEEP_WINDOW[0] * f0, SWEEP_WINDOW[1] * f0
    grid = [low + (high - low) * k / (CHART_POINTS - 1) for k in range(CHART_POINTS)]
    width = f0 / q
    grid += [f0 + width * k / 20.0 for k in range(-60, 61)]
    return sorted({f for f in grid + list(extra) if low <= f <= high})


def _sweep_marks(f0, f1, f2, frequency):
    """f0, and f1, f2 where they stand apart from f0 on the chart; the chosen f if inside."""
    span = (SWEEP_WINDOW[1] - SWEEP_WINDOW[0]) * f0
    marks = [{"axis": "x", "value": f0, "label": "f0"}]
    if f2 - f1 > MARK_SPACING * span:
        marks += [{"axis": "x", "value": f1, "label": "f1"},
                  {"axis": "x", "value": f2, "label": "f2"}]
    if SWEEP_WINDOW[0] * f0 <= frequency <= SWEEP_WINDOW[1] * f0 and frequency != f0:
        marks.append({"axis": "x", "value": frequency, "label": "f"})
    return marks


def _phase_word(phase):
    if abs(phase) < RESISTIVE_ANGLE:
        return "resistive"
    return "inductive, current lags" if phase > 0 else "capacitive, current leads"


def _view(inputs):
    topology = inputs["topology"]
    r, l, c, v = inputs["r"], inputs["l"], inputs["c"], inputs["source_v"]
    f0 = rlc.resonant_frequency(l, c)
    frequency = f0 if inputs["frequency_hz"] is None else inputs["frequency_hz"]
    q = rlc.quality_factor(topology, r, l, c)
    bandwidth = f0 / q
    f1, f2 = rlc.half_power_frequencies(f0, q)
    z = rlc.rlc_impedance(topology, r, l, c, frequency)
    current = v / abs(z)
    phase = math.degrees(cmath.phase(z))
    result = Result()

    result.output("f0", f0)
    result.output("q", q)
    result.output("bandwidth", bandwidth)
    result.output("damping_ratio", 1.0 / (2.0 * q))
    result.output("f_low", f1)
    result.output("f_high", f2)
    result.output("z_at_f", abs(z))
    result.output("phase_at_f", phase, f"{phase:.1f}° ({_phase_word(phase)})")
    result.output("current_at_f", current)
    series = topology == "series"
    if series:
        result.output("reactive_v_at_f0", q * v)
    else:
        result.output("branch_a_at_f0", q * v / r)

    r_t, l_t, c_t = fq(r, "ohm"), fq(l, "H"), fq(c, "F")
    result.step("Resonant frequency (X_L = X_C)", "f0 = 1 / (2π √(L C))",
                f"= 1 / (2π √({l_t} × {c_t})) = {fq(f0, 'Hz')}")
    if series:
        result.step("Quality factor (series)", "Q = (1/R) √(L/C) = ω0 L / R",
                    f"= √({l_t} / {c_t}) / {r_t} = {q:.4g}")
    else:
        result.step("Quality factor (parallel)", "Q = R √(C/L) = R / (ω0 L)",
                    f"= {r_t} × √({c_t} / {l_t}) = {q:.4g}")
    result.step("Bandwidth between the half-power points", "B = f0 / Q",
                f"= {fq(f0, 'Hz')} / {q:.4g} = {fq(bandwidth, 'Hz')}")
    result.step("Half-power (−3 dB) frequencies", "f1,2 = f0 (√(1 + 1/4Q²) ∓ 1/2Q)",
                f"= {fq(f1, 'Hz')} and {fq(f2, 'Hz')}")
    result.step("Damping ratio", "ζ = 1 / (2Q)", f"= {1.0 / (2.0 * q):.4g}")
    formula = "Z = R + j(ωL − 1/ωC)" if series else "Z = 1 / (1/R + 1/(jωL) + jωC)"
    result.step(f"Impedance at {fq(frequency, 'Hz')}", formula,
                f"= {units.format_complex(z, 'ohm', 4)} = "
                f"{fq(abs(z), 'ohm')} at {phase:.1f}°")
    result.step(f"Current from {fq(v, 'V')} at that frequency", "I = V / |Z|",
                f"= {fq(v, 'V')} / {fq(abs(z), 'ohm')} = {fq(current, 'A')}")
    if series:
        result.step("Voltage across L and across C at resonance (the supply × Q)",
                    "V_L = V_C = Q V", f"= {q:.4g} × {fq(v, 'V')} = {fq(q * v, 'V')}")
    else:
        result.step("Current in L and in C at resonance (the supply current × Q)",
                    "I_L = I_C = Q V / R", f"= {q:.4g} × {fq(v / r, 'A')} = {fq(q * v / r, 'A')}")
    target = inputs["target_hz"]
    if target is not None:
        c_new = rlc.resonant_partner(target, l)
        l_new = rlc.resonant_partner(target, c)
        result.output("c_for_target", c_new)
        result.output("l_for_target", l_new)
        result.step(f"Capacitance that tunes this L to {fq(target, 'Hz')}", "C = 1 / ((2πf)² L)",
                    f"= {fq(c_new, 'F')}")
        result.step(f"Inductance that tunes this C to {fq(target, 'Hz')}", "L = 1 / ((2πf)² C)",
                    f"= {fq(l_new, 'H')}")

    _checks(result, series, q, bandwidth / f0, v, r)
    plausibility(result, _implausible(r, l, c, q, f0, frequency))
    result.assumptions += ASSUMPTIONS
    result.sources += SOURCES
    result.cautions += [CAUTION_MAGNIFICATION, *cautions.COMMON]
    freqs = _sweep_frequencies(f0, q, (f1, f2, f0, frequency))
    magnitudes = [abs(rlc.rlc_impedance(topology, r, l, c, f)) for f in freqs]
    result.series = {
        "title": f"Impedance of the {topology} RLC against frequency",
        "x": {"label": "Frequency", "unit": "Hz", "values": freqs},
        "y": [{"label": "|Z|", "unit": "Ω", "values": magnitudes}],
        "marks": _sweep_marks(f0, f1, f2, frequency),
    }
    return result


def _implausible(r, l, c, q, f0, frequency):
    """Why these parts or results lie outside real circuits ([] when they do not)."""
    reasons = part_reasons(r, l, c) + [q_reason(q)]
    evaluated = () if frequency == f0 else (("the frequency evaluated", frequency),)
    for what, value in (("the resonant frequency", f0), *evaluated):
        if value > LUMPED_MAX_HZ:
            reasons.append(f"{what}, {fq(value, 'Hz')}, is above {fq(LUMPED_MAX_HZ, 'Hz')}: parts "
                           "are no longer lumped there (their size nears a tenth of the "
                           "wavelength) and these formulas stop holding (common practice)")
    return [reason for reason in reasons if reason]


def _checks(result, series, q, relative_width, v, r):
    if q < SHARP_Q:
        result.check("sharpness", "warn",
                     f"Q = {q:.3g} is below {SHARP_Q:g} (ζ > {1 / (2 * SHARP_Q):g}): the circuit "
                     "is overdamped and has no sharp resonance; the half-power frequencies span "
                     "more than two octaves.")
    else:
        result.check("sharpness", "pass", f"Q = {q:.3g}: resonance {relative_width * 100:.3g} % "
                     "of f0 wide between the half-power points.")
    if q > MAGNIFYING_Q:
        if series:
            message = (f"At resonance L and C each see Q × the supply, {fq(q * v, 'V')} from "
                       f"{fq(v, 'V')}: rate the capacitor and the coil insulation for it.")
        else:
            message = (f"At resonance the current circulating in L and C is Q × the supply "
                       f"current, {fq(q * v / r, 'A')} against {fq(v / r, 'A')}: size the "
                       "branches for it.")
        result.check("magnification", "warn", message)


CALCULATOR = Calculator(
    id="rlc-resonance",
    title="RLC resonance",
    summary="Resonant frequency, Q, bandwidth and the impedance and current at any frequency "
            "of a series or parallel RLC; the L or C for a target frequency.",
    group="Circuits",
    inputs=(
        Input("topology", "Connection", "choice", default="series", choices=TOPOLOGIES),
        Input("r", "Resistance R", "quantity", unit="ohm", default=2, minimum=1e-6, maximum=1e9,
              help="Series: the total loop resistance. Parallel: the resistance across L and C."),
        Input("l", "Inductance L", "quantity", unit="H", default="1 mH", minimum=1e-12,
              maximum=1e4),
        Input("c", "Capacitance C", "quantity", unit="F", default="0.4 µF", minimum=1e-15,
              maximum=100),
        Input("source_v", "Supply voltage (rms)", "quantity", unit="V", default=10, minimum=1e-6,
              maximum=1e6),
        Input("frequency_hz", "Frequency to evaluate", "quantity", unit="Hz", optional=True,
              minimum=MIN_FREQUENCY_HZ, maximum=1e10, help="Blank: the resonant frequency."),
        Input("target_hz", "Target resonant frequency", "quantity", unit="Hz", optional=True,
              minimum=MIN_FREQUENCY_HZ, maximum=1e10,
              help="Gives the C (with this L) or the L (with this C) that resonates there."),
    ),
    outputs=(
        Output("f0", "Resonant frequency f0", "Hz"),
        Output("q", "Quality factor Q", ""),
        Output("bandwidth", "Bandwidth (half-power)", "Hz"),
        Output("damping_ratio", "Damping ratio ζ = 1/(2Q)", ""),
        Output("f_low", "Lower half-power frequency f1", "Hz"),
        Output("f_high", "Upper half-power frequency f2", "Hz"),
        Output("z_at_f", "Impedance magnitude at f", "Ω"),
        Output("phase_at_f", "Impedance angle at f", "°"),
        Output("current_at_f", "Supply current at f", "A"),
        Output("reactive_v_at_f0", "Voltage across L or C at resonance (series)", "V"),
        Output("branch_a_at_f0", "Current in L or C at resonance (parallel)", "A"),
        Output("c_for_target", "C for the target frequency (with this L)", "F"),
        Output("l_for_target", "L for the target frequency (with this C)", "H"),
    ),
    compute=_view,
)
