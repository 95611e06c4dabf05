"""ground-fault-trip: will the breaker (or fuse) clear a fault to a grounded case?

The fault loop Zs = Ze + (R1 + R2) and the prospective fault current at the far end, against the
current Ia that surely operates the device's instantaneous (magnetic) trip. North American
practice judges what the NEC asks: an effective ground-fault current path (NEC 250.4(A)(5)) of
impedance low enough that the instantaneous trip operates, with the EGC no smaller than Table
250.122. IEC practice judges Zs × Ia ≤ U0 (IEC 60364-4-41 411.4.4) with the disconnection times
of Table 41.1. Both give the longest run that still clears.
"""

from calc import cautions, conductors, electrical, protection, transformers, units
from calc.calculators import _inputs
from calc.calculators._plausibility import outside, plausibility
from calc.calculators._protection import require_table_conductor
from calc.errors import field_error
from calc.protection import (
    DEVICE_KINDS,
    DISTRIBUTION_TIME_S,
    INSTANTANEOUS_TEST_TIME_S,
    MCB_INSTANTANEOUS_BANDS,
    MCB_MAX_VOLTAGE_V,
    MCCB_TOLERANCE_PCT,
    TABLE_41_1_MAX_RATING_A,
)
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

# Moulded-case instantaneous multiples the form offers with each NEC 240.6(A) rating (the usual
# low and high settings; any multiple can be typed).
MCCB_FORM_MULTIPLES = (5, 10)
FUSE_FORM_RATINGS_A = (15, 20, 30, 60, 100)  # fuses the form offers (NEC 240.6(A) ratings)
PRACTICES = (("nec", "NEC: effective ground-fault current path (North America)"),
             ("iec", "IEC 60364-4-41: disconnection time (TN)"))
CIRCUITS = (("final", "Final circuit (Table 41.1 time)"),
            ("distribution", f"Distribution circuit ({DISTRIBUTION_TIME_S['tn']:g} s)"))
SIZE_MATCH = 1.0001  # a protective conductor this much larger than the line conductor is larger
CHART_POINTS = 40

# Plausibility: the loop impedance outside the circuit of a TN supply. The smallest is at the
# terminals of the largest low-voltage transformers (a 4000 kVA, 480 V, 5.75 % unit has 3.3 mΩ:
# computed); supplier-declared maxima are 0.35 Ω (TN-C-S) and 0.8 Ω (TN-S) (BS 7671 practice,
# from memory), and a long rural overhead TN supply reaches about 2 Ω. Above that the return is
# through earth electrodes (TT), where this method does not hold — common practice.
ZE_USUAL_OHM = (0.002, 2.0)

_BANDS = ", ".join(f"{letter} {low:g}–{high:g}" for letter, (low, high)
                   in MCB_INSTANTANEOUS_BANDS.items())
SOURCE_MCB = (f"IEC 60898-1: instantaneous trip bands {_BANDS} × In; preferred ratings (read); "
              f"rated voltage up to {MCB_MAX_VOLTAGE_V:g} V between phases (from memory).")
SOURCE_RESISTANCE = ("Conductor resistance: IEC 60228 Table 2 (20 °C, Annex B α) / NEC Chapter 9 "
                     "Table 8 (75 °C, note 2 α).")
SOURCE_TOLERANCE = (f"Moulded-case pickup tolerance ± {MCCB_TOLERANCE_PCT:g} %: common practice, "
                    "from memory (use the maker's); a fuse melts quickly at "
                    f"{protection.FUSE_CLEARING_MULTIPLE:g} × its rating: common practice (IEC "
                    "60269-1 gG 0.1 s gates and UL 248 curves, from memory).")
SOURCES_IEC = (
    "IEC 60364-4-41:2005: Table 41.1 disconnection times, 411.3.2.3 "
    f"({DISTRIBUTION_TIME_S['tn']:g} s distribution circuits), 411.4.4 (Zs × Ia ≤ U0) (read; "
    "Table 41.1 as quoted at ericmark.talktalk.net/41-1.html).",
)
SOURCES_NEC = (
    "NEC 250.4(A)(5): an effective ground-fault current path of low impedance that facilitates "
    "the operation of the overcurrent device; 250.118 (types of EGC); Table 250.122 (minimum EGC "
    "by device rating, read as reproduced by Bruns Engineering).",
    "NEC 240.6(A) standard ampere ratings (read, as reproduced in EC&M, 2019, and in "
    "urdans/eecalcs OCPD.java).",
)
ASSUMPTIONS = (
    "Ze is the loop impedance outside this circuit (measured, or declared by the supplier); "
    "it is added to R1 + R2 arithmetically.",
    "R1 + R2 at the stated conductor temperature (the operating temperature, as IEC practice "
    "uses for the design check), from IEC 60228 / NEC Chapter 9 Table 8 values; the "
    "conductors' reactance is included (small below about 35 mm² or 2 AWG).",
    "A bolted fault to the exposed part; arc and contact resistance would lower the current.",
    "Only the instantaneous (magnetic) region is relied on; a slower thermal trip is not "
    "credited (breaker curves vary by maker).",
    "Line-to-line voltage √3 U0 (a three-phase wye system; a 120/240 V three-wire system has "
    "2 U0 = 240 V, within every limit used here).",
)
ASSUMPTIONS_IEC = (
    "TN system (TN-S, TN-C-S): the fault returns through the protective conductor to the "
    "source's earthed neutral. TT and IT systems need other checks (TT: an RCD with "
    "R_A × IΔn ≤ 50 V, IEC 60364-4-41 411.5.3).",
    "BS 7671 practice also multiplies U0 by C_min = 0.95 (IEC 60909-0's low-voltage c_min, "
    "read, as reproduced in pandapower's documentation; its use in BS 7671 from memory); this "
    "check uses U0 as IEC 60364-4-41 411.4.4 states.",
)
ASSUMPTIONS_NEC = (
    "Solidly grounded system: the fault returns on the equipment grounding conductor (a wire "
    "of NEC 250.118; a metal raceway as the EGC is not modelled) to the source's grounded "
    "neutral. The NEC sets no disconnection time; it asks that the fault operate the device, "
    "which the instantaneous trip does within a few cycles.",
    "The circuit type (final or distribution) is used only by IEC practice.",
)
CAUTION_LOOP_TEST = (
    "A calculated trip is not a test: measure Zs at the farthest point with a loop-impedance "
    "tester, and check the protective conductor's continuity, as your local rules require "
    "(IEC 60364-6).")
CAUTION_CPC = (
    "A grounded case only protects if the protective conductor (EGC) is continuous: a loose or "
    "missing one leaves the case live at U0 during a fault.")
CAUTION_NOT_CHECKED = (
    "The breaker must also suit the conductor's current-carrying capacity and the fault level "
    "at the panel; neither is checked here.")


def _check_breaker(code):
    """The breaker field's check: a code parse_breaker reads, else an error on this field."""
    with field_error("breaker"):
        protection.parse_breaker(code)


def _breaker_suggestions():
    """The common codes the form offers; any code parse_breaker reads is accepted."""
    mcbs = [f"{letter}{rating}" for letter in MCB_INSTANTANEOUS_BANDS
            for rating in protection.MCB_PREFERRED_RATINGS_A]
    mccbs = [f"{rating} A {m}x" for rating in protection.NEC_FORM_RATINGS_A
             for m in MCCB_FORM_MULTIPLES]
    fuses = [f"{rating} A fuse" for rating in FUSE_FORM_RATINGS_A]
    return tuple(mccbs + fuses + mcbs)


def _ia_step(result, breaker, ia, tolerance_pct):
    rated = fq(breaker.rating_a, "A")
    if breaker.kind == "mcb":
        low, high = MCB_INSTANTANEOUS_BANDS[breaker.code[0]]
        result.step(f"{breaker.code}: IEC 60898-1 type {breaker.code[0]} instantaneous band "
                    f"{low:g}–{high:g} × In; the upper limit surely trips within "
                    f"{INSTANTANEOUS_TEST_TIME_S:g} s",
                    "Ia = upper limit × In", f"= {high:g} × {rated} = {fq(ia, 'A')}")
    elif breaker.kind == "fuse":
        result.step(f"{breaker.code}: a fuse melts in about {INSTANTANEOUS_TEST_TIME_S:g} s at "
                    f"{breaker.operating_multiple:g} × its rating (common practice; the maker's "
                    "curve says)", "Ia = m × In",
                    f"= {breaker.operating_multiple:g} × {rated} = {fq(ia, 'A')}")
    else:
        setting = (breaker.operating_multiple + breaker.lowest_multiple) / 2
        result.step(f"{breaker.code}: {DEVICE_KINDS[breaker.kind]}, instantaneous setting "
                    f"{setting:g} × In with "
                    f"± {tolerance_pct:g} % pickup tolerance; the upper end surely trips",
                    "Ia = m × (1 + tolerance) × In",
                    f"= {setting:g} × {1 + tolerance_pct / 100:g} × {rated} = {fq(ia, 'A')}")


def _smaller_device(clearing, breaker):
    """Words suggesting the largest standard rating of the same device that the fault still
    operates instantaneously (from the published series, never from arithmetic)."""
    rating = protection.largest_clearing_rating(clearing.fault_a, breaker)
    if rating is None or rating >= breaker.rating_a:
        return "choose a device with a lower Ia"
    if breaker.kind == "mcb":
        code, series = f"{breaker.code[0]}{rating:g}", "IEC 60898-1 preferred ratings"
    else:
        setting = breaker.code.split(" A ", 1)[1]  # "10x", "fuse 10x"
        prefix = "MCP " if breaker.kind == "mcp" else ""
        code, series = f"{prefix}{rating:g} A {setting}", "NEC 240.6(A) standard ratings"
    return (f"choose a device with a lower Ia (the largest of the {series} this fault still "
            f"trips instantaneously is {code}, if the load allows it)")


def _clearing_check(result, name, clearing, ze, longest, breaker, basis, time=None, thermal=""):
    """The fault current against Ia: `name` is "ground_fault_path" (NEC) or "tn_condition"."""
    fault, ia, zs_max = clearing.fault_a, clearing.required_a, clearing.loop_impedance_max
    if clearing.clears:
        within = (f", which opens within about {INSTANTANEOUS_TEST_TIME_S:g} s, inside the "
                  f"{fq(time, 's')} required" if time is not None else
                  f", which opens within a few cycles")
        result.check(name, "pass",
                     f"{basis}: the {fq(fault, 'A')} fault current at the far end reaches the "
                     f"{fq(ia, 'A')} that surely operates the instantaneous trip{within} "
                     f"(margin {clearing.margin:.3g} ×).")
    elif ze >= zs_max:
        result.check(name, "fail",
                     f"{basis}: Ze alone ({fq(ze, 'ohm')}) is above the {fq(zs_max, 'ohm')} this "
                     "device allows (U0 / Ia): no length of cable passes. "
                     + _smaller_device(clearing, breaker).capitalize()
                     + ", or add ground-fault protection (an RCD / GFCI, or equipment "
                     "ground-fault protection).")
    else:
        result.check(name, "fail",
                     f"{basis}: the {fq(fault, 'A')} fault current at the far end is below the "
                     f"{fq(ia, 'A')} that surely operates the instantaneous trip, so the fault "
                     "is left to the thermal trip, which may take minutes with the case live. "
                     f"Shorten the run (at most {fq(longest, 'm')}), enlarge the protective "
                     f"conductor, {_smaller_device(clearing, breaker)}, or add an RCD / GFCI."
                     + thermal)


def _egc_check(result, breaker, size, cpc, material):
    """NEC Table 250.122: the EGC no smaller than the table's size for the device's rating
    (and never asked to be larger than the circuit conductors, 250.122(A))."""
    if cpc.system == "mm2":
        return
    minimum = protection.egc_minimum_size(breaker.rating_a, material)
    if minimum is None:
        return
    label, area = minimum
    rating = f"{breaker.rating_a:g} A"
    by_table = cpc.area_m2 >= area * (1 - 1e-9)
    as_circuit = cpc.area_m2 >= size.area_m2 * (1 - 1e-9)
    result.step(f"Smallest EGC behind a {rating} device (NEC Table 250.122, "
                f"{conductors.MATERIAL_NAMES[material].lower()})", "EGC ≥ table size",
                f"= {label}; the EGC is {cpc.label}")
    if by_table:
        status, words = "pass", f"no smaller than the {label} NEC Table 250.122 asks"
    elif as_circuit:
        status, words = "pass", (f"smaller than the table's {label} but as large as the circuit "
                                 "conductors, which 250.122(A) accepts")
    else:
        status, words = "fail", (f"smaller than the {label} NEC Table 250.122 asks; use at "
                                 "least that size")
    result.check("egc_size", status, f"The EGC ({cpc.label}) behind a {rating} device is {words}.")


def _validity_checks(result, breaker, voltage, circuit, size, cpc, iec):
    if iec and circuit == "final" and breaker.rating_a > TABLE_41_1_MAX_RATING_A:
        result.check("table_41_1_scope", "warn",
                     f"IEC 60364-4-41:2005 applies Table 41.1 to final circuits up to "
                     f"{TABLE_41_1_MAX_RATING_A:g} A (411.3.2.2; AMD1:2017 extends it to 63 A "
                     f"socket-outlet circuits); larger final circuits may have "
                     f"{DISTRIBUTION_TIME_S['tn']:g} s (411.3.2.3). The shorter time is used "
                     "here.")
    line = electrical.SQRT3 * voltage
    if breaker.kind == "mcb" and line > MCB_MAX_VOLTAGE_V:
        result.check("mcb_voltage", "warn",
                     f"IEC 60898-1 covers breakers up to {MCB_MAX_VOLTAGE_V:g} V AC between "
                     f"phases (from memory); U0 = {fq(voltage, 'V')} is a "
                     f"{fq(voltage, 'V')}/{fq(line, 'V')} system: use a breaker rated for "
                     f"{fq(line, 'V')}.")
    if (size.system == "mm2") != (cpc.system == "mm2"):
        result.check("size_systems", "warn",
                     f"The line conductor ({size.label}) and the protective conductor "
                     f"({cpc.label}) are in different size systems; check both are right.")
    if cpc.area_m2 > size.area_m2 * SIZE_MATCH:
        result.check("cpc_larger", "warn",
                     f"The protective conductor ({cpc.label}) is larger than the line conductor "
                     f"({size.label}); unusual: check the sizes.")


def _plausibility(result, voltage, ze):
    """Inputs outside the range of real TN / solidly grounded low-voltage supplies."""
    reasons = []
    if outside(ze, *ZE_USUAL_OHM):
        reasons.append(f"Ze = {fq(ze, 'ohm')} is outside the {fq(ZE_USUAL_OHM[0], 'ohm')} to "
                       f"{fq(ZE_USUAL_OHM[1], 'ohm')} of real grounded supplies (the terminals of "
                       "the largest LV transformers to a long overhead TN supply; higher means "
                       "an earth-electrode return, where an RCD protects — common practice)")
    line = electrical.SQRT3 * voltage
    if line > transformers.LOW_VOLTAGE_LIMIT_V:
        reasons.append(f"U0 = {fq(voltage, 'V')} makes {fq(line, 'V')} between phases, above the "
                       f"{fq(transformers.LOW_VOLTAGE_LIMIT_V, 'V')} of low voltage (IEC 60038 / "
                       "NEC, from memory), where breakers and this method do not apply")
    plausibility(result, reasons)


def _view(inputs):
    tolerance_pct = inputs["trip_tolerance_pct"]
    with field_error("breaker"):
        breaker = protection.parse_breaker(inputs["breaker"], tolerance_pct)
    voltage, ze, length = inputs["voltage"], inputs["ze"], inputs["length"]
    size, cpc, material = inputs["size"], inputs["cpc_size"], inputs["material"]
    temperature, circuit = inputs["conductor_temp_c"], inputs["circuit"]
    iec = inputs["practice"] == "iec"
    require_table_conductor("size", size, material)
    require_table_conductor("cpc_size", cpc, material)
    z_m = protection.loop_impedance_per_metre(size, cpc, material, temperature,
                                              inputs["frequency_hz"])
    r1_r2 = abs(z_m) * length
    zs = protection.earth_fault_loop_impedance(ze, z_m, length)
    clearing = protection.instantaneous_clearing(voltage, zs, breaker)
    ia, zs_max = clearing.required_a, clearing.loop_impedance_max
    longest = protection.max_length_for_disconnection(voltage, ze, z_m, ia)
    time = protection.disconnection_time(voltage, circuit)

    result = Result()
    result.output("zs", zs)
    result.output("fault_a", clearing.fault_a)
    result.output("trips", clearing.clears, "yes" if clearing.clears else "no")
    result.output("max_length", longest)
    result.output("ia", ia)
    result.output("zs_max", zs_max)
    if iec:
        result.output("disconnection_time", time)
    result.output("r1_r2", r1_r2)

    name = conductors.MATERIAL_NAMES[material]
    per_m = fq(abs(z_m), "ohm/m")
    result.step(f"Loop through the line conductor ({size.label}) and the protective conductor "
                f"({cpc.label}), {name} at {temperature:g} °C, resistance and reactance",
                "z = (R1 + R2) + j(X1 + X2) per metre",
                f"= {units.format_complex(z_m, 'ohm/m')}, |z| = {per_m}")
    result.step("Resistance of the run", "R1 + R2 = |z| × L",
                f"= {per_m} × {fq(length, 'm')} = {fq(r1_r2, 'ohm')}")
    result.step("Fault loop impedance (Ze added arithmetically: its angle is not known)",
                "Zs = Ze + (R1 + R2)", f"= {fq(ze, 'ohm')} + {fq(r1_r2, 'ohm')} = {fq(zs, 'ohm')}")
    result.step("Prospective fault current to the grounded case at the far end", "I_f = U0 / Zs",
                f"= {fq(voltage, 'V')} / {fq(zs, 'ohm')} = {fq(clearing.fault_a, 'A')}")
    _ia_step(result, breaker, ia, tolerance_pct)
    where = ("Table 41.1, TN, final circuit" if circuit == "final"
             else "411.3.2.3, TN, distribution circuit")
    if iec:
        result.step(f"Disconnection time required (IEC 60364-4-41 {where})", "t_max",
                    f"= {fq(time, 's')} at U0 = {fq(voltage, 'V')}")
        result.step("TN condition (IEC 60364-4-41 411.4.4)", "Zs × Ia ≤ U0",
                    f"{fq(zs, 'ohm')} × {fq(ia, 'A')} = {fq(zs * ia, 'V')} "
                    f"{'≤' if clearing.clears else '>'} {fq(voltage, 'V')}")
    else:
        result.step("Effective ground-fault current path (NEC 250.4(A)(5)): the far-end fault "
                    "current must operate the device's instantaneous trip", "I_f ≥ Ia",
                    f"{fq(clearing.fault_a, 'A')} {'≥' if clearing.clears else '<'} "
                    f"{fq(ia, 'A')} (margin {clearing.margin:.3g} ×)")
        result.step(f"For information only, not judged: IEC practice (IEC 60364-4-41 {where}) "
                    "would ask disconnection within this time; the NEC sets none",
                    "t_max (IEC)", f"= {fq(time, 's')} at U0 = {fq(voltage, 'V')}")
    result.step("Longest run that still clears (where U0 / Zs = Ia)",
                "L_max = (U0 / Ia − Ze) / |z|",
                f"= ({fq(voltage, 'V')} / {fq(ia, 'A')} − {fq(ze, 'ohm')}) / {per_m} = "
                f"{fq(longest, 'm')}")

    if iec:
        _clearing_check(result, "tn_condition", clearing, ze, longest, breaker,
                        f"Zs × Ia = {fq(zs * ia, 'V')} {'≤' if clearing.clears else '>'} U0 = "
                        f"{fq(voltage, 'V')} (IEC 60364-4-41 411.4.4)", time,
                        (f" For a {DISTRIBUTION_TIME_S['tn']:g} s distribution circuit the "
                         "thermal region may still clear in time: check the maker's time-current "
                         "curve.") if circuit == "distribution" else "")
    else:
        _clearing_check(result, "ground_fault_path", clearing, ze, longest, breaker,
                        "Effective ground-fault current path (NEC 250.4(A)(5))")
        _egc_check(result, breaker, size, cpc, material)
    _validity_checks(result, breaker, voltage, circuit, size, cpc, iec)
    _plausibility(result, voltage, ze)

    result.assumptions += list(ASSUMPTIONS) + list(ASSUMPTIONS_IEC if iec else ASSUMPTIONS_NEC)
    result.sources += [SOURCE_MCB] + list(SOURCES_IEC if iec else SOURCES_NEC)
    result.sources += [SOURCE_RESISTANCE, SOURCE_TOLERANCE]
    result.cautions += [CAUTION_LOOP_TEST, CAUTION_CPC, CAUTION_NOT_CHECKED]
    result.cautions += list(cautions.COMMON)
    result.series = _chart(breaker, ze, z_m, length, longest, zs_max)
    return result


def _chart(breaker, ze, z_m, length, longest, zs_max):
    """Zs against run length, to past the longest run (or 1.5 × the run entered)."""
    end = max(1.5 * length, min(1.25 * longest, 10.0 * max(length, 1.0)), 10.0)
    lengths = [end * k / CHART_POINTS for k in range(CHART_POINTS + 1)]
    marks = [{"axis": "y", "value": zs_max, "label": "Zs max = U0 / Ia"},
             {"axis": "x", "value": length, "label": "This run"}]
    if 0 < longest <= end:
        marks.append({"axis": "x", "value": longest, "label": "Longest run"})
    return {
        "title": f"Fault loop impedance against length ({breaker.code})",
        "x": {"label": "Run length", "unit": "m", "values": lengths},
        "y": [{"label": "Zs", "unit": "Ω",
               "values": [protection.earth_fault_loop_impedance(ze, z_m, x) for x in lengths]}],
        "marks": marks,
    }


CALCULATOR = Calculator(
    id="ground-fault-trip",
    title="Will the breaker clear a fault to the case?",
    summary="Fault loop impedance Zs, the far-end fault current, whether the breaker's "
            "instantaneous trip clears it (NEC effective ground-fault path, or IEC 60364-4-41 "
            "time) and the longest run that still does.",
    group="Protection",
    inputs=(
        Input("voltage", "Line-to-ground voltage U0", "quantity", unit="V", default=120,
              minimum=protection.TABLE_41_1_LOWEST_U0_V, min_exclusive=True, maximum=1000,
              region_defaults={"iec": 230},
              help="Nominal voltage to ground (earth): 120 V, 230 V, 277 V, 347 V (above "
                   f"{protection.TABLE_41_1_LOWEST_U0_V:g} V)."),
        Input("ze", "External loop impedance Ze", "quantity", unit="ohm", default=0.15,
              minimum=0, min_exclusive=True, maximum=50, region_defaults={"iec": 0.35},
              help="Measured at the panel with a loop tester, or the supplier's declared value."),
        Input(
            "breaker", "Breaker or fuse", "text", default="20 A 10x", check=_check_breaker,
            suggestions=_breaker_suggestions(),
            region_defaults={"iec": "B20"},
            help="B16, C32, D20 (IEC 60898-1 type and rating, "
                 f"{protection.MCB_PREFERRED_RATINGS_A[0]}–{protection.MCB_PREFERRED_RATINGS_A[-1]}"
                 " A); an inverse-time breaker's rating and instantaneous multiple, 100 A 10x; "
                 "an instantaneous-trip breaker, MCP 50 A 8x; or a fuse, 30 A fuse."),
        Input("size", "Line conductor size", "size", default="12 AWG",
              region_defaults={"iec": "2.5 mm²"}),
        Input("cpc_size", "Protective conductor (CPC / EGC) size", "size", default="12 AWG",
              region_defaults={"iec": "1.5 mm²"},
              help="The equipment grounding conductor that carries the fault back."),
        Input("length", "Run length", "quantity", unit="m", default="75 ft", minimum=0,
              maximum=5000, region_defaults={"iec": "30 m"},
              help="One way, from the breaker to the farthest point."),
        _inputs.material(),
        Input("conductor_temp_c", "Conductor temperature", "quantity", unit="degC", default=75,
              minimum=-40, maximum=250, region_defaults={"iec": 70},
              help="Operating temperature for the loop resistance (70 °C PVC, 90 °C XLPE; 75 °C "
                   "as NEC Table 8)."),
        Input("practice", "Rule judged", "choice", default="nec", choices=PRACTICES,
              region_defaults={"iec": "iec"},
              help="NEC: the fault must operate the instantaneous trip (250.4(A)(5)); IEC: "
                   "Zs × Ia ≤ U0 within the Table 41.1 time."),
        Input("circuit", "Circuit (IEC practice)", "choice", default="final", choices=CIRCUITS),
        Input("trip_tolerance_pct", "Breaker pickup tolerance", "quantity", unit="%",
              default=MCCB_TOLERANCE_PCT, minimum=0, maximum=50, advanced=True,
              help=f"Of the instantaneous setting (± {MCCB_TOLERANCE_PCT:g} % is usual; the "
                   "maker's curve says). Not used for MCBs and fuses."),
        _inputs.frequency(advanced=True),
    ),
    outputs=(
        Output("zs", "Fault loop impedance Zs", "Ω"),
        Output("fault_a", "Fault current at the far end", "A"),
        Output("trips", "Instantaneous trip clears it", ""),
        Output("max_length", "Longest run that clears", "m"),
        Output("ia", "Current that surely trips (Ia)", "A"),
        Output("zs_max", "Largest Zs allowed (U0 / Ia)", "Ω"),
        Output("disconnection_time", "Disconnection time required (IEC)", "s"),
        Output("r1_r2", "R1 + R2 of the run", "Ω"),
    ),
    compute=_view,
)
