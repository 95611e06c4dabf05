"""fault-current: how much current can a bolted fault draw at the transformer secondary, at the
panel and at the equipment, and is the interrupting rating entered at each point enough?

The path (supply → transformer → feeder → panel → branch → equipment) is solved by the path
engine, calc.network; interrupting ratings are judged against the larger of the three-phase and
line-to-neutral currents and the X/R of their test circuit.
"""

import math

from calc import cautions, conductors, electrical, network, protection, transformers, units
from calc.calculators import _inputs
from calc.calculators._plausibility import outside, plausibility
from calc.calculators._protection import require_table_conductor
from calc.calculators._transformers import Z_PCT_MIN
from calc.calculators._texts import SOURCE_IEC60909
from calc.errors import InputError
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

CHART_SEGMENTS = 12  # points along each run of the chart
# The three points judged: (output prefix, node of the path, label).
NODES = (("main", 1, "Transformer secondary (main)"), ("panel", 2, "End of the feeder (panel)"),
         ("equipment", 3, "End of the branch (equipment)"))
MAX_FEEDER_SETS = 20

# Plausibility: the range of real transformers and switchgear (all common practice).
# Low-voltage secondaries (up to 1 kV) are made from 3 kVA (the smallest three-phase rating of
# the IEEE C57.12 preferred series, read) to about 5000 kVA (secondary unit substations).
LV_TRANSFORMER_VA = (3e3, 5e6)
# Nameplate impedance: 1 % (small dry-types) to 15 % (large power transformers); IS 2026 lists
# 5 % below 1 MVA to 12.5 % above 30 MVA (read), US liquid-filled units 5.75 %.
TRANSFORMER_Z_PCT = (1.0, 15.0)
# Transformer X/R: about 1 for the smallest dry-types to about 50 for the largest power
# transformers (IEEE C37.010 typical X/R curves, from memory).
TRANSFORMER_X_R = (0.5, 50.0)
# The highest interrupting ratings made: 200 kA for low-voltage breakers and fuses (UL 489,
# IEC 60947-2; UL 248 fuses to 200 kA, 300 kA for a few), 63 kA for medium-voltage breakers
# (IEEE C37.06 / IEC 62271-100 ratings): a fault current above them is outside real equipment.
MAX_FAULT_LV_A = 200e3
MAX_FAULT_MV_A = 63e3

SOURCE_PATH_ENGINE = (
    "Impedances summed as phasors along the radial path by Fluxbook's path engine (checked "
    "against pandapower's IEC 60909 short-circuit calculation).")
SOURCE_CONDUCTORS = (
    "Conductor impedance: NEC Chapter 9 Tables 8 and 9 / IEC 60228 with IEC 60287-1-1 skin and "
    "proximity effect (see the conductor calculator).")
SOURCE_UL489 = ("UL 489 short-circuit test power factors — read, as reproduced in TSEWG TP-6 "
                "Table 1 (studylib.net/doc/12093578).")
CAUTION_SERIES_RATINGS = (
    "Series ratings (a breaker protected by an upstream device with a higher rating) hold only "
    "for combinations the maker has tested and the equipment is marked for (NEC 240.86, from "
    "memory); do not combine ratings yourself.")
CAUTION_TEST_X_R = (
    "An interrupting rating is tested at a stated X/R (power factor); near large transformers "
    "the X/R is often higher, which lowers the effective rating.")
CAUTION_ARC_FLASH = (
    "Arc-flash incident energy is a separate study (IEEE 1584) by qualified persons; a lower "
    "fault current can give a higher incident energy through a slower protective device.")
CAUTION_MARKING = (
    "Mark the available fault current where your code requires it (NEC 110.24) and update it "
    "when the supply or the transformer changes.")
ASSUMPTIONS = (
    "Bolted (zero-impedance) faults: an arcing fault draws less current; the bolted figure is "
    "the duty for interrupting ratings.",
    "No motor contribution: running motors feed roughly 4 × their full-load current into a "
    "nearby fault for the first cycles (common practice); add it where motors are large.",
    f"Conductors at {protection.MAX_FAULT_CONDUCTOR_C:g} °C (IEC 60909-0 maximum currents, from "
    "memory): cold conductors give the most current.",
    "Each run's neutral (the return of a line-to-neutral fault) is the size of its phase "
    "conductors; a line-to-ground fault returning on a smaller grounding conductor draws less. "
    "The transformer is delta-wye with Z₀ = Z₁ of the transformer.",
    "A three-phase path; the transformer is on its rated tap; runs are in trefoil or in the "
    "chosen raceway.",
)


def _path_data(inputs, segments=1):
    """Source → transformer (node 1) → feeder → node 2 → branch → node 3, each run in
    `segments` equal pieces (for the chart); conductors at the maximum-current temperature."""
    source = {"voltage": inputs["source_v"], "frequency_hz": inputs["frequency_hz"],
              "x_r": inputs["source_x_r"]}
    level = _inputs.source_level(inputs, inputs["source_v"], 3)
    if level is not None:
        source["fault_mva"] = level / 1e6
    elements = [{"kind": "transformer", "name": "Transformer", "kva": inputs["xfmr_kva"] / 1e3,
                 "primary_v": inputs["source_v"], "secondary_v": inputs["secondary_v"],
                 "z_pct": inputs["xfmr_z_pct"], "x_r": inputs["xfmr_x_r"],
                 "grounded_secondary": inputs["grounded_wye"]}]
    for name, prefix, sets in (("Feeder", "feeder", inputs["feeder_sets"]), ("Branch", "branch", 1)):
        size = inputs[f"{prefix}_size"]
        require_table_conductor(f"{prefix}_size", size, inputs["material"])
        for _ in range(segments):
            elements.append({"kind": "cable", "name": name, "size": size.label,
                             "length": inputs[f"{prefix}_length"] / segments,
                             "material": inputs["material"], "sets": int(sets),
                             "raceway": inputs["raceway"],
                             "conductor_temp_c": protection.MAX_FAULT_CONDUCTOR_C})
    return {"source": source, "elements": elements}


def _faults(path, voltage_factor):
    """Fault currents at every node of the path, IEC 60909 c_Q applied to the feeder
    (Z_Q = c_Q U² / S''kQ with c_Q of the feeder's own voltage, IEC 60909-0 §6.2)."""
    c_q = transformers.source_voltage_factor(path.source.voltage, voltage_factor)
    return network.faults(path, voltage_factor, voltage_factor != 1.0, source_voltage_factor=c_q)


def _supply_step(result, inputs, c, iec):
    level = _inputs.source_level(inputs, inputs["source_v"], 3)
    volts = inputs["secondary_v"]
    if level is None:
        result.step("Supply: infinite source (no impedance ahead of the transformer, the upper "
                    "bound)", "Z_Q = 0", "= 0 Ω")
        return
    c_q = transformers.source_voltage_factor(inputs["source_v"], c)
    z_q = c_q * volts ** 2 / level
    cq = f"{c_q:g} × " if iec else ""
    primary_current = electrical.line_current(level, inputs["source_v"], 3)
    result.step("Supply feeder impedance at the secondary voltage, X/R "
                f"{inputs['source_x_r']:g}" + (f" (c_Q = {c_q:g}, IEC 60909-0 §6.2)" if iec else ""),
                "Z_Q = " + ("c_Q " if iec else "") + "U² / S_sc",
                f"= {cq}({fq(volts, 'V')})² / {fq(level, 'VA')} = {fq(z_q, 'ohm')}; at the "
                f"primary the fault current is S_sc / (√3 U) = {fq(primary_current, 'A')}")


def _impedance_steps(result, inputs, path, c, iec):
    volts, z_pct, rating = inputs["secondary_v"], inputs["xfmr_z_pct"], inputs["xfmr_kva"]
    z_t = z_pct / 100.0 * volts ** 2 / rating
    if iec:
        k_t = network.transformer_correction(path.elements[0], c)
        result.step("Transformer impedance with the IEC 60909 correction (network transformer)",
                    "Z_T = K_T × u_k U² / S_T; K_T = 0.95 c_max / (1 + 0.6 x_T)",
                    f"K_T = {k_t:.4f}; Z_T = {k_t:.4f} × {z_pct:g} % × ({fq(volts, 'V')})² / "
                    f"{fq(rating, 'VA')} = {fq(k_t * z_t, 'ohm')}")
    else:
        result.step(f"Transformer impedance, X/R {inputs['xfmr_x_r']:g}", "Z_T = u_k U² / S_T",
                    f"= {z_pct:g} % × ({fq(volts, 'V')})² / {fq(rating, 'VA')} = "
                    f"{fq(z_t, 'ohm')}")
    for index, run in ((1, "feeder"), (2, "branch")):
        cable = path.elements[index]
        phase, _ = network.cable_ohms(path, cable)
        sets = f", {cable.sets} sets in parallel" if cable.sets > 1 else ""
        result.step(f"The {run}: {cable.size.label} {conductors.MATERIAL_NAMES[cable.material]} × "
                    f"{fq(cable.length, 'm')}{sets}, at {protection.MAX_FAULT_CONDUCTOR_C:g} °C",
                    "Z = (R_ac + jX) × L / sets (per phase)",
                    f"= {units.format_complex(phase, 'ohm')}")


def _fault_steps(result, faults, volts, c, iec):
    cf = f"{c:g} × " if iec else ""
    for _, node, label in NODES:
        fault = faults[node]
        z = c * volts / (electrical.SQRT3 * fault.three_phase_a)
        kappa = network.peak_factor(fault.x_r)
        result.step(f"{label}: bolted three-phase fault", "I''k = " + ("c " if iec else "")
                    + "U / (√3 |Z|); κ = 1.02 + 0.98 e^(−3R/X); i_p = κ √2 I''k",
                    f"= {cf}{fq(volts, 'V')} / (√3 × {fq(z, 'ohm')}) = "
                    f"{fq(fault.three_phase_a, 'A')}; X/R {fault.x_r:.3g}, κ = {kappa:.3f}, "
                    f"i_p = {fq(fault.peak_a, 'A')}")
        if fault.line_to_neutral_a is not None:
            result.step(f"{label}: bolted line-to-neutral fault (delta-wye transformer: its Z₀ "
                        "taken = Z₁; a run adds its phase and neutral)",
                        "I''k1 = " + ("c " if iec else "") + "√3 U / |2 Z₁ + Z₀|",
                        f"= {fq(fault.line_to_neutral_a, 'A')}")


def _rating_checks(result, inputs, faults):
    """Each interrupting rating entered against the larger fault duty there, and the X/R of the
    rating's test circuit against the X/R there."""
    for name, node, label in NODES:
        rating = inputs[f"{name}_rating"]
        if rating is None:
            continue
        fault = faults[node]
        duty = max(fault.three_phase_a, fault.line_to_neutral_a or 0.0)
        which = "line-to-neutral" if duty > fault.three_phase_a else "three-phase"
        ok = duty <= rating
        result.check(f"{name}_rating", "pass" if ok else "fail",
                     f"{label}: available {which} fault current {fq(duty, 'A')} against the "
                     f"{fq(rating, 'A')} interrupting rating entered"
                     + (": within it." if ok else ": the rating is too low. Equipment must be "
                        "rated for the current available at its terminals (NEC 110.9, 110.10; "
                        "IEC 60947-2 / IEC 61439)."))
        x_r_test = protection.rating_test_x_r(rating)
        if fault.x_r > x_r_test:
            result.check(f"{name}_x_r", "warn",
                         f"{label}: X/R is {fault.x_r:.3g}, above the {x_r_test:.3g} of the test "
                         f"circuit for a {fq(rating, 'A')} rating (UL 489 test power factor "
                         f"{math.cos(math.atan(x_r_test)):.2f}, read, as reproduced in TSEWG "
                         "TP-6). The asymmetrical current is higher than in the test, so the "
                         "breaker's effective rating is lower: apply the maker's X/R "
                         "multiplying factor.")


def _voltage_factor_check(result, token, volts):
    """A low-voltage c_max chosen for a secondary above the IEC 60909 low-voltage limit."""
    c = float(token)
    c_there = transformers.source_voltage_factor(volts, c)  # c_max at the secondary's voltage
    if c != c_there:
        result.check("voltage_factor", "warn",
                     f"{dict(transformers.VOLTAGE_FACTORS)[token]}; above "
                     f"{transformers.LOW_VOLTAGE_LIMIT_V / 1e3:g} kV (this secondary is "
                     f"{fq(volts, 'V')}) c_max is {c_there:.2f} (IEC 60909-0 Table 1, read, as "
                     "reproduced in pandapower's documentation).")


def transformer_reasons(rating, secondary_voltage, z_pct):
    """Plausibility reasons for a transformer that is not made: a low-voltage secondary outside
    LV_TRANSFORMER_VA, or an impedance outside TRANSFORMER_Z_PCT (shared with motor-start-dip)."""
    reasons = []
    low_voltage = secondary_voltage <= transformers.LOW_VOLTAGE_LIMIT_V
    if low_voltage and outside(rating, *LV_TRANSFORMER_VA):
        reasons.append(f"a {fq(rating, 'VA')} transformer with a {fq(secondary_voltage, 'V')} "
                       "secondary: low-voltage secondaries are made from "
                       f"{fq(LV_TRANSFORMER_VA[0], 'VA')} to about "
                       f"{fq(LV_TRANSFORMER_VA[1], 'VA')} (common practice)")
    if outside(z_pct, *TRANSFORMER_Z_PCT):
        reasons.append(f"an impedance of {z_pct:g} % is outside the {TRANSFORMER_Z_PCT[0]:g}–"
                       f"{TRANSFORMER_Z_PCT[1]:g} % of real transformers (common practice)")
    return reasons


def _largest_fault(voltage):
    """The highest interrupting rating made at a voltage [A]."""
    return MAX_FAULT_LV_A if voltage <= transformers.LOW_VOLTAGE_LIMIT_V else MAX_FAULT_MV_A


def _plausibility(result, inputs, main):
    """Transformers, supplies and fault levels outside the range of real equipment."""
    volts = inputs["secondary_v"]
    reasons = transformer_reasons(inputs["xfmr_kva"], volts, inputs["xfmr_z_pct"])
    if outside(inputs["xfmr_x_r"], *TRANSFORMER_X_R):
        reasons.append(f"an X/R of {inputs['xfmr_x_r']:g} is outside the "
                       f"{TRANSFORMER_X_R[0]:g}–{TRANSFORMER_X_R[1]:g} of real transformers "
                       "(IEEE C37.010 typical values, from memory)")
    duty = max(main.three_phase_a, main.line_to_neutral_a or 0.0)
    if duty > _largest_fault(volts):
        reasons.append(f"{fq(duty, 'A')} at the secondary is above the "
                       f"{fq(_largest_fault(volts), 'A')} of the highest interrupting ratings made "
                       "at that voltage (common practice): no device could be applied there")
    level = _inputs.source_level(inputs, inputs["source_v"], 3)
    if level is not None:
        primary = electrical.line_current(level, inputs["source_v"], 3)
        if primary > _largest_fault(inputs["source_v"]):
            reasons.append(f"the supply's {fq(primary, 'A')} at {fq(inputs['source_v'], 'V')} is "
                           f"above the {fq(_largest_fault(inputs['source_v']), 'A')} switchgear "
                           "is rated for there (common practice): check the supply's level")
    plausibility(result, reasons)


def _view(inputs):
    c = float(inputs["voltage_factor"])
    iec = c != 1.0
    if not float(inputs["feeder_sets"]).is_integer():
        raise InputError("feeder_sets", inputs["feeder_sets"], "enter a whole number of sets, "
                         f"1 to {MAX_FEEDER_SETS}")
    path = network.path_from_dict(_path_data(inputs))
    faults = _faults(path, c)
    volts = inputs["secondary_v"]
    result = Result()

    for name, node, _ in NODES:
        fault = faults[node]
        result.output(f"{name}_fault_a", fault.three_phase_a)
        if fault.line_to_neutral_a is not None:
            result.output(f"{name}_ln_a", fault.line_to_neutral_a)
        result.output(f"{name}_x_r", fault.x_r)
        result.output(f"{name}_peak_a", fault.peak_a)

    _supply_step(result, inputs, c, iec)
    _impedance_steps(result, inputs, path, c, iec)
    _fault_steps(result, faults, volts, c, iec)
    if not inputs["grounded_wye"]:
        result.step("No line-to-neutral figure: the secondary is not a grounded wye, so a fault "
                    "to ground draws little current (it needs the system's grounding data)",
                    "—", "—")

    _rating_checks(result, inputs, faults)
    _voltage_factor_check(result, inputs["voltage_factor"], volts)
    _plausibility(result, inputs, faults[1])

    result.assumptions += list(ASSUMPTIONS)
    if iec:
        result.assumptions.append(
            f"IEC 60909 maximum case: c = {c:g} at the fault, c_Q for the supply feeder, K_T on "
            "the transformer.")
    else:
        result.assumptions.append("Nominal-voltage method (c = 1, no correction factors), as "
                                  "IEEE Std 141 and the per-unit method use.")
    result.sources += [SOURCE_IEC60909, SOURCE_PATH_ENGINE, SOURCE_CONDUCTORS, SOURCE_UL489]
    result.cautions += [CAUTION_SERIES_RATINGS, CAUTION_TEST_X_R, CAUTION_ARC_FLASH,
                        CAUTION_MARKING, cautions.BACKFEED]
    if inputs["source_v"] > transformers.LOW_VOLTAGE_LIMIT_V:
        result.cautions.append(cautions.MEDIUM_VOLTAGE)
    result.cautions += list(cautions.COMMON)
    result.series = _chart(inputs, c)
    return result


def _chart(inputs, c):
    chart_path = network.path_from_dict(_path_data(inputs, CHART_SEGMENTS))
    along = _faults(chart_path, c)[1:]  # from the transformer secondary on
    step_f = inputs["feeder_length"] / CHART_SEGMENTS
    step_b = inputs["branch_length"] / CHART_SEGMENTS
    distance = [k * step_f for k in range(CHART_SEGMENTS + 1)]
    distance += [inputs["feeder_length"] + k * step_b for k in range(1, CHART_SEGMENTS + 1)]
    lines = [{"label": "Three-phase", "unit": "kA",
              "values": [f.three_phase_a / 1e3 for f in along]}]
    if inputs["grounded_wye"]:
        lines.append({"label": "Line-to-neutral", "unit": "kA",
                      "values": [f.line_to_neutral_a / 1e3 for f in along]})
    marks = [{"axis": "x", "value": inputs["feeder_length"], "label": "Panel"},
             {"axis": "x", "value": distance[-1], "label": "Equipment"}]
    for name, _, _ in NODES:
        if inputs[f"{name}_rating"] is not None:
            marks.append({"axis": "y", "value": inputs[f"{name}_rating"] / 1e3,
                          "label": f"{name.capitalize()} rating"})
    return {"title": "Bolted fault current along the path (0 m = transformer secondary)",
            "x": {"label": "Distance from the transformer", "unit": "m", "values": distance},
            "y_axis": {"label": "Fault current", "unit": "kA"}, "y": lines, "marks": marks}


def _rating_input(name, where):
    return Input(f"{name}_rating", f"Interrupting rating at the {where}", "quantity", unit="kA",
                 optional=True, minimum=0, min_exclusive=True, maximum=1000,
                 help="The breaker's interrupting rating or the equipment's short-circuit "
                      "current rating (kA); blank = not checked.")


CALCULATOR = Calculator(
    id="fault-current",
    title="Fault current along a supply path",
    summary="Bolted three-phase and line-to-neutral fault current, X/R and peak at the "
            "transformer, the panel and the equipment, against the interrupting ratings there.",
    group="Protection",
    inputs=(
        Input("xfmr_kva", "Transformer rating", "quantity", unit="kVA", default=750, minimum=1,
              maximum=100000, region_defaults={"iec": 630}),
        Input("secondary_v", "Secondary voltage", "quantity", unit="V", default=480, minimum=100,
              maximum=35000, region_defaults={"iec": 400}, suggest="voltages",
              help="Line-to-line."),
        Input("xfmr_z_pct", "Transformer impedance", "quantity", unit="%", default=5.75,
              minimum=Z_PCT_MIN, maximum=30, region_defaults={"iec": 4.0},
              help="Nameplate %Z."),
        Input("xfmr_x_r", "Transformer X/R", "quantity", unit="", default=6, minimum=0.1,
              maximum=100, region_defaults={"iec": 5}, help="From the test report; typically "
              "3–10 for distribution transformers."),
        Input("feeder_size", "Feeder size", "size", default="4/0",
              region_defaults={"iec": "95 mm²"}),
        Input("feeder_length", "Feeder length", "quantity", unit="m", default="120 ft",
              minimum=0.001, maximum=5000, region_defaults={"iec": "40 m"},
              help="One way, from the transformer to the panel."),
        Input("branch_size", "Branch size", "size", default="8 AWG",
              region_defaults={"iec": "10 mm²"}),
        Input("branch_length", "Branch length", "quantity", unit="m", default="50 ft",
              minimum=0.001, maximum=5000, region_defaults={"iec": "20 m"},
              help="One way, from the panel to the equipment."),
        _rating_input("main", "transformer secondary (main)"),
        _rating_input("panel", "panel"),
        _rating_input("equipment", "equipment"),
        Input("voltage_factor", "Voltage factor c", "choice", default="1",
              choices=transformers.VOLTAGE_FACTORS, region_defaults={"iec": "1.1"},
              help="1 for a plain bolted-fault estimate; IEC 60909 c_max also applies K_T."),
        _inputs.source_power(advanced=True),
        _inputs.source_fault_current(advanced=True),
        _inputs.source_x_r(advanced=True),
        Input("source_v", "Transformer primary voltage", "quantity", unit="V", default=12470,
              minimum=100, maximum=800000, region_defaults={"iec": 11000}, advanced=True),
        Input("grounded_wye", "Secondary is a grounded wye", "flag", default=True, advanced=True,
              help="Delta-wye with the neutral grounded (yes) gives the line-to-neutral fault."),
        Input("feeder_sets", "Feeder sets in parallel", "quantity", unit="", default=1,
              minimum=1, maximum=MAX_FEEDER_SETS, advanced=True),
        _inputs.material(advanced=True),
        Input("raceway", "Raceway", "choice", default="pvc", choices=conductors.RACEWAYS,
              advanced=True, help="Steel conduit raises the reactance."),
        _inputs.frequency(advanced=True),
    ),
    outputs=tuple(
        Output(f"{name}_{what}", f"{label}: {text}", unit)
        for name, _, label in NODES
        for what, text, unit in (("fault_a", "three-phase fault current", "A"),
                                 ("ln_a", "line-to-neutral fault current", "A"),
                                 ("x_r", "X/R", ""), ("peak_a", "peak current", "A"))
    ),
    compute=_view,
)
