"""transformer-fault-current: how much fault current can a transformer deliver at its secondary
terminals, from an infinite or a finite source, and can the equipment there interrupt it?"""

import math

from calc import transformers
from calc.calculators import _inputs
from calc.calculators._texts import SOURCE_IEC60909
from calc.calculators._plausibility import outside, plausibility
from calc.calculators._transformers import (
    SOURCE_IDEAL,
    Z_PCT_MAX,
    Z_PCT_MIN,
    connection_input,
    equipment_reasons,
    ideal_relations,
    rating_input,
    transformer_cautions,
    voltage_input,
)
from calc.errors import InputError
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

TOLERANCE_PCT = 100 * transformers.IMPEDANCE_TOLERANCE  # ±7.5 % as a percentage of %Z

# Single-phase secondaries: two-wire, or three-wire with the neutral at the mid-tap. "auto" takes a
# 240 V secondary (within MID_TAP_MATCH) as the North American 120/240 V three-wire service (ANSI
# C84.1 nominal system voltages, from memory); the user can say otherwise.
SECONDARY_WIRINGS = (
    ("auto", "Single-phase: from the voltage (240 V → 120/240 V three-wire)"),
    ("three-wire", "Single-phase three-wire, neutral at the mid-tap (120/240 V)"),
    ("two-wire", "Single-phase two-wire (no neutral at a mid-tap)"),
)
MID_TAP_SECONDARY_V = 240.0
MID_TAP_MATCH = 0.05  # ± 5 %: ANSI C84.1 Range A around the nominal (read, as quoted)
HALF_R, HALF_X = transformers.MID_TAP_R_FACTOR, transformers.MID_TAP_X_FACTOR

# Plausibility. Transformer X/R: about 1 for small dry-types to about 50 for the largest power
# transformers (IEEE C37.010 typical X/R curves, from memory). The largest interrupting ratings:
# 200 kA for low-voltage breakers and fuses (UL 489, UL 248; IEC 60947-2 reaches about the same),
# 80 kA for medium-voltage breakers (IEC 62271-100 preferred values, from memory).
X_R_RANGE = (0.5, 50.0)
FAULT_MAX_A = {"low": 200e3, "medium": 80e3}
# A source whose impedance on the transformer's rating is above this [%] would drop the voltage
# about as much at rated load as the transformer's own %Z can: not a supply (common practice).
SOURCE_Z_PCT_MAX = 20.0

SOURCE_FAULT = (
    "Fault current by summed per-unit impedance, I = I_FL × 100 / (%Z_T + %Z_S) with %Z_S = 100 "
    "S_T / S_sc: IEEE Std 141 method as set out in IAEI Magazine (J. Phillips, 2018, 'Short-"
    "circuit calculations using transformer and source impedance'); the impedances are summed "
    "as phasors here."
)
SOURCE_TOLERANCE = (f"Impedance tolerance ±{TOLERANCE_PCT:g} %: IEEE C57.12.00 §9.2 (read as "
                    "quoted).")
SOURCE_MID_TAP = (
    f"Mid-tap line-to-neutral fault: the half-winding impedance {HALF_R:g} × %R + j{HALF_X:g} × "
    "%X of the full winding, giving about 1.5 × the line-to-line fault (1.33 to 1.67): the "
    "point-to-point short-circuit method, Note 2 (read, as reproduced at scribd.com/document/"
    "388329023); the same split is W. H. Kersting's centre-tapped transformer model, "
    "Distribution System Modeling and Analysis (from memory; read as GridLAB-D implements it)."
)


def _source_step(result, inputs, phases, source):
    """The step that turns an available fault current into short-circuit power, if given so."""
    fault_a = inputs["source_fault_a"]
    if fault_a is None:
        return
    k = "√3 × " if phases == 3 else ""
    result.step("Source short-circuit power from the available fault current",
                f"S_sc = {k}V₁ × I_sc", f"= {k}V₁ × I_sc = {k}{fq(inputs['primary_v'], 'V')} × "
                f"{fq(fault_a, 'A')} = {fq(source, 'VA')}")


def _impedance_steps(result, inputs, level, source, c_source):
    """Transformer, K_T and source impedances, and their phasor sum."""
    z_pct, x_r, c = inputs["z_pct"], inputs["x_r"], float(inputs["voltage_factor"])
    iec = c != 1.0
    z_t = transformers.impedance_per_unit(z_pct, x_r)
    result.step(f"Transformer impedance on its rating, X/R = {x_r:g}",
                "R_T = Z cos(atan X/R), X_T = Z sin(atan X/R)",
                f"= {100 * z_t.real:.4g} % + j{100 * z_t.imag:.4g} %")
    if iec:
        result.step("IEC 60909 transformer correction (network transformer)",
                    "K_T = 0.95 c_max / (1 + 0.6 x_T)",
                    f"= 0.95 × {c:g} / (1 + 0.6 × {z_t.imag:.4g}) = {level.correction:.4f}")
    if source is None:
        result.step("Infinite source: no impedance ahead of the transformer (the upper bound)",
                    "Z_S = 0", "= 0 %")
    else:
        _source_step(result, inputs, int(inputs["phases"]), source)
        cq = f"{c_source:g} × " if iec else ""
        result.step(f"Source impedance on the transformer's rating, X/R = {inputs['source_x_r']:g}"
                    + (f" (c_Q = {c_source:g})" if iec else ""),
                    "%Z_S = 100 × " + ("c_Q × " if iec else "") + "S_T / S_sc",
                    f"= 100 × {cq}{fq(inputs['kva'], 'VA')} / {fq(source, 'VA')} = "
                    f"{100 * abs(level.z_source):.4g} % = {100 * level.z_source.real:.4g} % + "
                    f"j{100 * level.z_source.imag:.4g} %")
    z_total = level.z_source + level.z_transformer
    result.step("Impedances summed as phasors (in series)", "Z = Z_S + " +
                ("K_T Z_T" if iec else "Z_T"),
                f"= {100 * z_total.real:.4g} % + j{100 * z_total.imag:.4g} %, |Z| = "
                f"{100 * abs(z_total):.4g} %")
    return z_total


def _mid_tap_step(result, level, c, iec):
    """The line-to-neutral fault through one half-winding of a mid-tapped secondary."""
    z_t = level.z_transformer  # K_T included
    half = level.z_source + complex(HALF_R * z_t.real, HALF_X * z_t.imag)
    cf = f"{c:g} × " if iec else ""
    result.step(f"Line-to-neutral fault at the mid-tap: one half-winding, at half the voltage, "
                f"of about {HALF_R:g} %R + j{HALF_X:g} %X of the full winding (the source's "
                "per-unit impedance is the same on either half)",
                "I_LN = " + ("c × " if iec else "") + f"2 I_FL × 100 / |Z_S + {HALF_R:g} R_T + "
                f"j{HALF_X:g} X_T|",
                f"= {cf}2 × {fq(level.rated_current, 'A')} × 100 / |{100 * half.real:.4g} % + "
                f"j{100 * half.imag:.4g} %| = {fq(level.line_to_neutral_current, 'A')} "
                f"({level.line_to_neutral_current / level.fault_current:.3g} × the line-to-line "
                "fault)")


def _current_steps(result, inputs, level, low_z, z_total, delta_wye, mid_tap):
    """Fault, infinite-source, peak, line-to-neutral and low-tolerance currents."""
    phases, z_pct = int(inputs["phases"]), inputs["z_pct"]
    c = float(inputs["voltage_factor"])
    iec = c != 1.0
    phase_word = "three-phase" if phases == 3 else "line-to-line (full secondary)"
    cf = f"{c:g} × " if iec else ""
    result.step(f"Bolted {phase_word} fault current", "I''k = " + ("c × " if iec else "") +
                "I_FL × 100 / |Z%|",
                f"= {cf}{fq(level.rated_current, 'A')} × 100 / {100 * abs(z_total):.4g} = "
                f"{fq(level.fault_current, 'A')}")
    result.step("The same with an infinite source (upper bound)",
                "I''k,∞ = " + ("c × " if iec else "") + "I_FL × 100 / |Z_T%|",
                f"= {fq(level.infinite_fault_current, 'A')}")
    result.step("X/R at the secondary, peak factor and peak asymmetrical current",
                "κ = 1.02 + 0.98 e^(−3R/X); i_p = κ √2 I''k",
                f"X/R = {level.x_r:.3g}; κ = {level.kappa:.4f}; i_p = {level.kappa:.4f} × √2 × "
                f"{fq(level.fault_current, 'A')} = {fq(level.peak_current, 'A')}")
    if delta_wye:
        result.step("Line-to-neutral fault on the grounded-wye secondary (delta primary: the "
                    "source's zero sequence is blocked; Z₀ of the transformer taken = Z₁)",
                    "I''k1 = 3 " + ("c " if iec else "") + "I_FL / |2 Z₁ + Z₀|",
                    f"= {fq(level.line_to_neutral_current, 'A')}")
    if mid_tap:
        _mid_tap_step(result, level, c, iec)
    low = 1 - transformers.IMPEDANCE_TOLERANCE
    result.step(f"Impedance at its −{TOLERANCE_PCT:g} % tolerance (IEEE C57.12.00 §9.2): "
                "the most fault current a unit of this nameplate can give",
                f"%Z × {low:g}", f"= {z_pct * low:.4g} % → {fq(low_z.fault_current, 'A')}")


def _worst_fault(level, mid_tap):
    """(current [A], its name): the larger of the three-phase or line-to-line fault and the
    line-to-neutral one (delta-wye, or a mid-tapped single-phase secondary), where there is one."""
    line_to_neutral = level.line_to_neutral_current
    if not math.isnan(line_to_neutral) and line_to_neutral > level.fault_current * (1 + 1e-9):
        return line_to_neutral, "line-to-neutral" + (" at the mid-tap" if mid_tap else "")
    return level.fault_current, "line-to-line" if mid_tap else ""


def _checks(result, inputs, low_z, mid_tap):
    phases, c = int(inputs["phases"]), float(inputs["voltage_factor"])
    category = transformers.short_circuit_category(inputs["kva"], phases)
    result.check("short_circuit_category", "pass",
                 f"IEEE C57.12.00 short-circuit category {category}: the transformer is built to "
                 "withstand its own through-fault current for the duration that category sets.")
    rating = inputs["device_rating_a"]
    if rating is not None:
        worst, which = _worst_fault(low_z, mid_tap)
        ok = worst <= rating
        result.check("device_rating", "pass" if ok else "fail",
                     f"Fault current up to {fq(worst, 'A')} ({which + ', ' if which else ''}at "
                     f"the −{TOLERANCE_PCT:g} % impedance tolerance) against the equipment's "
                     f"{fq(rating, 'A')} short-circuit rating"
                     + (": within it." if ok else ": the rating is too low (NEC 110.9, 110.10)."))
    if c != 1.0 and phases == 1:
        result.check("iec_single_phase", "warn",
                     "IEC 60909 is written for three-phase systems; c and K_T are applied to "
                     "this single-phase unit by analogy.")


def is_mid_tapped(phases, secondary_v, wiring):
    """Whether a single-phase secondary has its neutral at the mid-tap: as the user says, or for
    "auto" when it is within MID_TAP_MATCH of MID_TAP_SECONDARY_V."""
    if phases == 3:
        return False
    if wiring == "auto":
        return abs(secondary_v / MID_TAP_SECONDARY_V - 1.0) <= MID_TAP_MATCH * (1 + 1e-12)
    return wiring == "three-wire"


def _plausibility(result, inputs, level, worst):
    phases, secondary_v = int(inputs["phases"]), inputs["secondary_v"]
    reasons = equipment_reasons(inputs["kva"], phases, (("primary", inputs["primary_v"]),
                                                        ("secondary", secondary_v)),
                                inputs["z_pct"])
    x_r = inputs["x_r"]
    if outside(x_r, *X_R_RANGE):
        reasons.append(f"a transformer X/R of {x_r:g} is outside the {X_R_RANGE[0]:g}-"
                       f"{X_R_RANGE[1]:g} of real units (IEEE C37.010 typical X/R, from memory)")
    side = "low" if secondary_v <= transformers.LOW_VOLTAGE_LIMIT_V else "medium"
    if worst > FAULT_MAX_A[side]:
        reasons.append(f"{fq(worst, 'A')} at {fq(secondary_v, 'V')} is beyond the largest "
                       f"{side}-voltage interrupting ratings ({fq(FAULT_MAX_A[side], 'A')}; UL "
                       "489, UL 248, IEC 60947-2, IEC 62271-100; from memory): no equipment could "
                       "be applied there")
    source_z = 100.0 * abs(level.z_source)
    if source_z > SOURCE_Z_PCT_MAX:
        reasons.append(f"the source impedance is {source_z:.3g} % on the transformer's rating "
                       f"(above {SOURCE_Z_PCT_MAX:g} %): a supply that weak could not carry the "
                       "transformer's load; check the source's MVA or kA and the rating")
    plausibility(result, reasons)


def _fault_view(inputs):
    phases = int(inputs["phases"])
    apparent_power = inputs["kva"]
    primary_v, secondary_v = inputs["primary_v"], inputs["secondary_v"]
    z_pct, x_r = inputs["z_pct"], inputs["x_r"]
    c = float(inputs["voltage_factor"])
    iec = c != 1.0
    c_source = transformers.source_voltage_factor(primary_v, c)
    delta_wye = phases == 3 and inputs["connection"] == "delta-wye"
    mid_tap = is_mid_tapped(phases, secondary_v, inputs["secondary_wiring"])
    source = _inputs.source_level(inputs, primary_v, phases)
    source_x_r = inputs["source_x_r"]
    level = transformers.secondary_fault(apparent_power, primary_v, secondary_v, phases, z_pct,
                                         x_r, source, source_x_r, c, delta_wye, mid_tap)
    low_z = transformers.secondary_fault(apparent_power, primary_v, secondary_v, phases,
                                         z_pct * (1 - transformers.IMPEDANCE_TOLERANCE), x_r,
                                         source, source_x_r, c, delta_wye, mid_tap)
    if not all(math.isfinite(value) for value in (low_z.infinite_fault_current,
                                                  low_z.peak_current)):
        raise InputError("z_pct", z_pct, f"{z_pct:g} % is too small to give a finite fault "
                         f"current here; enter the nameplate impedance (more than 0 and at most "
                         f"{Z_PCT_MAX:g} %)")
    result = Result()
    result.output("secondary_a", level.rated_current)
    result.output("fault_a", level.fault_current)
    result.output("peak_a", level.peak_current)
    result.output("fault_infinite_a", level.infinite_fault_current)
    if delta_wye or mid_tap:
        result.output("fault_ln_a", level.line_to_neutral_current)
    result.output("fault_low_z_a", low_z.fault_current)
    result.output("fault_x_r", level.x_r)
    result.output("kappa", level.kappa)
    result.output("source_z_pct", 100.0 * abs(level.z_source))

    k = "√3 × " if phases == 3 else ""
    result.step("Secondary full-load current", f"I_FL = S_T / ({k}V₂)",
                f"= {fq(apparent_power, 'VA')} / ({k}{fq(secondary_v, 'V')}) = "
                f"{fq(level.rated_current, 'A')}")
    z_total = _impedance_steps(result, inputs, level, source, c_source)
    _current_steps(result, inputs, level, low_z, z_total, delta_wye, mid_tap)
    ideal_relations(result, primary_v, secondary_v, phases, apparent_power,
                    connection=inputs["connection"])
    _checks(result, inputs, low_z, mid_tap)
    _plausibility(result, inputs, level, _worst_fault(level, mid_tap)[0])
    if phases == 3 and not delta_wye:
        result.step("No line-to-neutral figure for this connection: it needs the zero-sequence "
                    "data of the source and transformer", "—", "—")
    if phases != 3 and not mid_tap:
        result.step("Two-wire single-phase secondary: the only fault is across the whole "
                    "winding (choose three-wire for a 120/240 V mid-tapped unit)", "—", "—")

    result.assumptions += [
        "Bolted (zero-impedance) fault at the secondary terminals; no cable, no arc resistance.",
        "No motor contribution: running motors add roughly 4 × their full-load current in the "
        "first cycles (common practice); add it, or use a full study, where motors are large.",
        "The secondary voltage is the system's nominal voltage; the transformer is on its rated "
        "tap.",
    ]
    if iec:
        result.assumptions.append(
            f"IEC 60909 maximum case: c = {c:g} at the fault, c_Q = {c_source:g} for the source, "
            f"K_T = {level.correction:.4f} on the transformer.")
    else:
        result.assumptions.append("Nominal-voltage method (c = 1, no correction factors), as "
                                  "IEEE Std 141 and the per-unit method use.")
    if mid_tap:
        result.assumptions.append(
            f"Single-phase three-wire secondary, neutral at the mid-tap: the half-winding "
            f"impedance taken as {HALF_R:g} × %R + j{HALF_X:g} × %X of the full winding (the usual "
            "estimate); the maker's half-winding test figure gives the true one. Equipment is "
            "judged on the larger of the line-to-line and line-to-neutral faults.")
    if source is None:
        result.assumptions.append("Infinite source: the utility can supply unlimited fault power, "
                                  "so the result is the upper bound; the utility's figure gives "
                                  "a lower, truer one.")
    result.sources += [SOURCE_FAULT, SOURCE_IEC60909, SOURCE_TOLERANCE,
                       "IEEE C57.12.00 short-circuit categories (read).", SOURCE_IDEAL]
    if mid_tap:
        result.sources.append(SOURCE_MID_TAP)
    result.cautions += [
        "Equipment at this point must be rated for the fault current (NEC 110.9, 110.10; "
        "IEC 61439): mark the available fault current where your code requires it (NEC 110.24).",
        "Arc-flash incident energy is a separate study (IEEE 1584); a lower fault current can "
        "give a higher incident energy through a slower protective device.",
    ]
    transformer_cautions(result, primary_v, secondary_v)

    strengths = [10.0 * 10 ** (k / 10) for k in range(31)]  # 10 MVA to 10 GVA, ten a decade
    curve = [transformers.secondary_fault(apparent_power, primary_v, secondary_v, phases, z_pct,
                                          x_r, s * 1e6, source_x_r, c).fault_current
             for s in strengths]
    marks = [{"axis": "y", "value": level.infinite_fault_current, "label": "Infinite source"}]
    if source is not None:
        marks.append({"axis": "x", "value": source / 1e6, "label": "This source"})
    result.series = {
        "title": "Secondary fault current against source strength",
        "x": {"label": "Source short-circuit power", "unit": "MVA", "values": strengths},
        "y": [{"label": "Fault current", "unit": "A", "values": curve}],
        "marks": marks,
    }
    return result


CALCULATOR = Calculator(
    id="transformer-fault-current",
    title="Transformer fault current",
    summary="Bolted fault current at a transformer's secondary for an infinite or a finite "
            "source, X/R, peak asymmetrical current (IEC 60909 κ) and the line-to-neutral fault "
            "(delta-wye, or a 120/240 V mid-tap).",
    group="Transformers",
    inputs=(
        rating_input(default=1500, region_defaults={"iec": 1000},
                     help="Nameplate kVA (the self-cooled rating)."),
        _inputs.phases(),
        voltage_input("secondary_v", "Secondary voltage", 480, 400,
                      "Line-to-line for three-phase (480 V, 208 V, 400 V)."),
        Input("z_pct", "Impedance", "quantity", unit="%", default=5.75,
              minimum=Z_PCT_MIN, maximum=Z_PCT_MAX, region_defaults={"iec": 6},
              help=f"Nameplate %Z (impedance voltage), {Z_PCT_MIN:g} to {Z_PCT_MAX:g} %."),
        Input("x_r", "Transformer X/R", "quantity", unit="", default=6, minimum=0.1, maximum=100,
              region_defaults={"iec": 8},
              help="From the test report; typically 3-10 for distribution transformers."),
        # Limits kept from before the shared factories: 0.001 MVA to 1 000 000 MVA.
        _inputs.source_power(minimum=0.001, min_exclusive=False, maximum=1_000_000),
        _inputs.source_fault_current(minimum=0.001, min_exclusive=False,
                                     help="The utility's three-phase figure, at the transformer "
                                          "primary; needs the primary voltage."),
        _inputs.source_x_r(),
        voltage_input("primary_v", "Primary voltage", 13800, 11000,
                      "Line-to-line for three-phase; used with the available fault current."),
        Input("voltage_factor", "Voltage factor c", "choice", default="1",
              choices=transformers.VOLTAGE_FACTORS, region_defaults={"iec": "1.1"},
              help="1 for the nominal-voltage method; IEC 60909 c_max also applies K_T."),
        connection_input(),
        Input("secondary_wiring", "Single-phase secondary", "choice", default="auto",
              choices=SECONDARY_WIRINGS, region_defaults={"iec": "two-wire"}, advanced=True,
              help="Three-wire (neutral at the mid-tap, 120/240 V) adds the line-to-neutral "
                   "fault, which is the larger one."),
        Input("device_rating_a", "Equipment short-circuit rating", "quantity", unit="kA",
              optional=True, minimum=0, min_exclusive=True, maximum=1000, advanced=True,
              help="Interrupting or withstand rating of the equipment at the secondary."),
    ),
    outputs=(
        Output("secondary_a", "Secondary full-load current", "A"),
        Output("fault_a", "Fault current at the secondary", "A"),
        Output("peak_a", "Peak asymmetrical current", "A"),
        Output("fault_infinite_a", "Fault current, infinite source", "A"),
        Output("fault_ln_a", "Line-to-neutral fault current", "A"),
        Output("fault_low_z_a", f"Fault current at −{TOLERANCE_PCT:g} % impedance tolerance", "A"),
        Output("fault_x_r", "X/R at the secondary", ""),
        Output("kappa", "Peak factor κ", ""),
        Output("source_z_pct", "Source impedance on the transformer rating", "%"),
    ),
    compute=_fault_view,
)
