"""transformer-fault-current: how much fault current can a transformer deliver at its secondary
terminals, from an infinite or a finite source, and can the equipment there interrupt it?"""

import math

from calc import transformers
from calc.calculators import _inputs
from calc.calculators._texts import SOURCE_IEC60909
from calc.calculators._transformers import (
    SOURCE_IDEAL,
    Z_PCT_MAX,
    connection_input,
    ideal_relations,
    rating_input,
    transformer_cautions,
    voltage_input,
)
from calc.errors import InputError
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

# A distribution transformer's %Z is usually 2-10 %; outside this range it is worth checking the
# nameplate (common practice).
USUAL_Z_PCT = (1.0, 15.0)

TOLERANCE_PCT = 100 * transformers.IMPEDANCE_TOLERANCE  # ±7.5 % as a percentage of %Z

SOURCE_FAULT = (
    "Fault current by summed per-unit impedance, I = I_FL × 100 / (%Z_T + %Z_S) with %Z_S = 100 "
    "S_T / S_sc: IEEE Std 141 method as set out in IAEI Magazine (J. Phillips, 2018, 'Short-"
    "circuit calculations using transformer and source impedance'); the impedances are summed "
    "as phasors here."
)
SOURCE_TOLERANCE = (f"Impedance tolerance ±{TOLERANCE_PCT:g} %: IEEE C57.12.00 §9.2 (read as "
                    "quoted).")


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


def _current_steps(result, inputs, level, low_z, z_total, delta_wye):
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
    low = 1 - transformers.IMPEDANCE_TOLERANCE
    result.step(f"Impedance at its −{TOLERANCE_PCT:g} % tolerance (IEEE C57.12.00 §9.2): "
                "the most fault current a unit of this nameplate can give",
                f"%Z × {low:g}", f"= {z_pct * low:.4g} % → {fq(low_z.fault_current, 'A')}")


def _checks(result, inputs, low_z):
    phases, z_pct, c = int(inputs["phases"]), inputs["z_pct"], float(inputs["voltage_factor"])
    category = transformers.short_circuit_category(inputs["kva"], phases)
    result.check("short_circuit_category", "pass",
                 f"IEEE C57.12.00 short-circuit category {category}: the transformer is built to "
                 "withstand its own through-fault current for the duration that category sets.")
    low, high = USUAL_Z_PCT
    if not low <= z_pct <= high:
        result.check("impedance", "warn",
                     f"{z_pct:g} % is unusual for a distribution transformer (typically 2-10 %, "
                     "common practice); check the nameplate.")
    rating = inputs["device_rating_a"]
    if rating is not None:
        ok = low_z.fault_current <= rating
        result.check("device_rating", "pass" if ok else "fail",
                     f"Fault current up to {fq(low_z.fault_current, 'A')} (at the −"
                     f"{TOLERANCE_PCT:g} % impedance tolerance) against the equipment's "
                     f"{fq(rating, 'A')} short-circuit rating"
                     + (": within it." if ok else ": the rating is too low (NEC 110.9, 110.10)."))
    if c != 1.0 and phases == 1:
        result.check("iec_single_phase", "warn",
                     "IEC 60909 is written for three-phase systems; c and K_T are applied to "
                     "this single-phase unit by analogy.")


def _fault_view(inputs):
    phases = int(inputs["phases"])
    apparent_power = inputs["kva"]
    primary_v, secondary_v = inputs["primary_v"], inputs["secondary_v"]
    z_pct, x_r = inputs["z_pct"], inputs["x_r"]
    c = float(inputs["voltage_factor"])
    iec = c != 1.0
    c_source = transformers.source_voltage_factor(primary_v, c)
    delta_wye = phases == 3 and inputs["connection"] == "delta-wye"
    source = _inputs.source_level(inputs, primary_v, phases)
    source_x_r = inputs["source_x_r"]
    level = transformers.secondary_fault(apparent_power, primary_v, secondary_v, phases, z_pct,
                                         x_r, source, source_x_r, c, delta_wye)
    low_z = transformers.secondary_fault(apparent_power, primary_v, secondary_v, phases,
                                         z_pct * (1 - transformers.IMPEDANCE_TOLERANCE), x_r,
                                         source, source_x_r, c, delta_wye)
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
    if delta_wye:
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
    _current_steps(result, inputs, level, low_z, z_total, delta_wye)
    ideal_relations(result, primary_v, secondary_v, phases, apparent_power,
                    connection=inputs["connection"])
    _checks(result, inputs, low_z)
    if phases == 3 and not delta_wye:
        result.step("No line-to-neutral figure for this connection: it needs the zero-sequence "
                    "data of the source and transformer", "—", "—")

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
    if source is None:
        result.assumptions.append("Infinite source: the utility can supply unlimited fault power, "
                                  "so the result is the upper bound; the utility's figure gives "
                                  "a lower, truer one.")
    result.sources += [SOURCE_FAULT, SOURCE_IEC60909, SOURCE_TOLERANCE,
                       "IEEE C57.12.00 short-circuit categories (read).", SOURCE_IDEAL]
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
            "source, X/R, peak asymmetrical current (IEC 60909 κ) and the line-to-neutral fault.",
    group="Transformers",
    inputs=(
        rating_input(default=1500, region_defaults={"iec": 1000},
                     help="Nameplate kVA (the self-cooled rating)."),
        _inputs.phases(),
        voltage_input("secondary_v", "Secondary voltage", 480, 400,
                      "Line-to-line for three-phase (480 V, 208 V, 400 V)."),
        Input("z_pct", "Impedance", "quantity", unit="%", default=5.75, minimum=0,
              min_exclusive=True, maximum=Z_PCT_MAX, region_defaults={"iec": 6},
              help=f"Nameplate %Z (impedance voltage), more than 0 and at most {Z_PCT_MAX:g} %."),
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
