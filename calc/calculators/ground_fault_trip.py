"""ground-fault-trip: will the breaker clear a fault to an earthed case in time (TN systems)?

Earth fault loop impedance Zs = Ze + (R1 + R2), the prospective fault current, whether it
reaches the current Ia that surely operates the breaker's instantaneous trip (Zs × Ia ≤ U0,
IEC 60364-4-41 411.4.4) and the longest run that still passes.
"""

from calc import cautions, conductors, protection
from calc.calculators import _inputs
from calc.calculators._protection import require_table_conductor
from calc.errors import field_error
from calc.protection import (
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
CIRCUITS = (("final", "Final circuit (Table 41.1 time)"),
            ("distribution", f"Distribution circuit ({DISTRIBUTION_TIME_S['tn']:g} s)"))
SIZE_MATCH = 1.0001  # a protective conductor this much larger than the line conductor is larger
CHART_POINTS = 40

_BANDS = ", ".join(f"{letter} {low:g}–{high:g}" for letter, (low, high)
                   in MCB_INSTANTANEOUS_BANDS.items())
SOURCES = (
    f"IEC 60898-1: instantaneous trip bands {_BANDS} × In; preferred ratings (read).",
    "IEC 60364-4-41:2005: Table 41.1 disconnection times, 411.3.2.3 "
    f"({DISTRIBUTION_TIME_S['tn']:g} s distribution circuits), 411.4.4 (Zs × Ia ≤ U0) (read).",
    "Conductor resistance: IEC 60228 Table 2 (20 °C, Annex B α) / NEC Chapter 9 Table 8 "
    "(75 °C, note 2 α).",
    f"Moulded-case pickup tolerance ± {MCCB_TOLERANCE_PCT:g} %: common practice, from memory "
    "(use the maker's).",
)
ASSUMPTIONS = (
    "TN system (TN-S, TN-C-S): the fault returns through the protective conductor to the "
    "source's earthed neutral. TT and IT systems need other checks (TT: an RCD with "
    "R_A × IΔn ≤ 50 V, IEC 60364-4-41 411.5.3).",
    "Ze is the loop impedance outside this circuit (measured, or declared by the supplier); "
    "it is added to R1 + R2 arithmetically.",
    "R1 + R2 at the stated conductor temperature (the operating temperature, as IEC practice "
    "uses for the design check), from IEC 60228 / NEC Chapter 9 Table 8 values; the "
    "conductors' reactance is included (small below about 35 mm² or 2 AWG).",
    "A bolted fault to the exposed part; arc and contact resistance would lower the current.",
    "Only the instantaneous (magnetic) region is relied on; a slower thermal trip is not "
    "credited (breaker curves vary by maker).",
    "BS 7671 practice also multiplies U0 by C_min = 0.95 (from memory); this check uses U0 "
    "as IEC 60364-4-41 411.4.4 states.",
)
CAUTION_LOOP_TEST = (
    "A calculated trip is not a test: measure Zs at the farthest point with a loop-impedance "
    "tester, and check the protective conductor's continuity, as your local rules require "
    "(IEC 60364-6).")
CAUTION_CPC = (
    "An earthed case only protects if the protective conductor is continuous: a loose or "
    "missing CPC leaves the case live at U0 during a fault.")
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
    mccbs = [f"{rating} A {m}x" for rating in protection.NEC_STANDARD_RATINGS_A
             for m in MCCB_FORM_MULTIPLES]
    return tuple(mccbs + mcbs)


def _ia_step(result, breaker, ia, tolerance_pct):
    if breaker.kind == "mcb":
        low, high = MCB_INSTANTANEOUS_BANDS[breaker.code[0]]
        result.step(f"{breaker.code}: IEC 60898-1 type {breaker.code[0]} instantaneous band "
                    f"{low:g}–{high:g} × In; the upper limit surely trips within "
                    f"{INSTANTANEOUS_TEST_TIME_S:g} s",
                    "Ia = upper limit × In", f"= {high:g} × {fq(breaker.rating_a, 'A')} = "
                    f"{fq(ia, 'A')}")
    else:
        setting = (breaker.operating_multiple + breaker.lowest_multiple) / 2
        result.step(f"{breaker.code}: moulded-case instantaneous setting {setting:g} × In with "
                    f"± {tolerance_pct:g} % pickup tolerance; the upper end surely trips",
                    "Ia = m × (1 + tolerance) × In",
                    f"= {setting:g} × {1 + tolerance_pct / 100:g} × "
                    f"{fq(breaker.rating_a, 'A')} = {fq(ia, 'A')}")


def _tn_check(result, voltage, ze, zs, ia, time, longest, circuit):
    """The TN condition Zs × Ia ≤ U0 (IEC 60364-4-41 411.4.4)."""
    fault, zs_max = voltage / zs, voltage / ia
    if zs * ia <= voltage:
        result.check("tn_condition", "pass",
                     f"Zs × Ia = {fq(zs * ia, 'V')} ≤ U0 = {fq(voltage, 'V')} (IEC 60364-4-41 "
                     f"411.4.4): the {fq(fault, 'A')} fault current reaches the {fq(ia, 'A')} "
                     "that surely operates the instantaneous trip, which opens within about "
                     f"{INSTANTANEOUS_TEST_TIME_S:g} s, inside the {fq(time, 's')} required.")
    elif ze >= zs_max:
        result.check("tn_condition", "fail",
                     f"Ze alone ({fq(ze, 'ohm')}) is above the {fq(zs_max, 'ohm')} this breaker "
                     "allows (U0 / Ia): no length of cable passes. An RCD (30 mA where additional "
                     "protection is required) is needed, or a breaker with a lower Ia.")
    else:
        thermal = (f" For a {DISTRIBUTION_TIME_S['tn']:g} s distribution circuit the thermal "
                   "region may still clear in time: check the maker's time-current curve."
                   if circuit == "distribution" else "")
        result.check("tn_condition", "fail",
                     f"Zs × Ia = {fq(zs * ia, 'V')} > U0 = {fq(voltage, 'V')}: the "
                     f"{fq(fault, 'A')} fault current is below the {fq(ia, 'A')} that surely "
                     "operates the instantaneous trip, so disconnection within "
                     f"{fq(time, 's')} is not shown. Shorten the run (at most "
                     f"{fq(longest, 'm')}), enlarge the protective conductor, choose a breaker "
                     f"with a lower Ia, or add an RCD.{thermal}")


def _validity_checks(result, breaker, voltage, circuit, size, cpc):
    if circuit == "final" and breaker.rating_a > TABLE_41_1_MAX_RATING_A:
        result.check("table_41_1_scope", "warn",
                     f"IEC 60364-4-41:2005 applies Table 41.1 to final circuits up to "
                     f"{TABLE_41_1_MAX_RATING_A:g} A (411.3.2.2; AMD1:2017 extends it to 63 A "
                     f"socket-outlet circuits); larger final circuits may have "
                     f"{DISTRIBUTION_TIME_S['tn']:g} s (411.3.2.3). The shorter time is used "
                     "here.")
    if breaker.kind == "mcb" and voltage > MCB_MAX_VOLTAGE_V:
        result.check("mcb_voltage", "warn",
                     f"IEC 60898-1 covers breakers up to {MCB_MAX_VOLTAGE_V:g} V AC (from "
                     f"memory); at U0 = {fq(voltage, 'V')} use a breaker rated for the voltage.")
    if (size.system == "mm2") != (cpc.system == "mm2"):
        result.check("size_systems", "warn",
                     f"The line conductor ({size.label}) and the protective conductor "
                     f"({cpc.label}) are in different size systems; check both are right.")
    if cpc.area_m2 > size.area_m2 * SIZE_MATCH:
        result.check("cpc_larger", "warn",
                     f"The protective conductor ({cpc.label}) is larger than the line conductor "
                     f"({size.label}); unusual: check the sizes.")


def _view(inputs):
    tolerance_pct = inputs["trip_tolerance_pct"]
    with field_error("breaker"):
        breaker = protection.parse_breaker(inputs["breaker"], tolerance_pct)
    voltage, ze, length = inputs["voltage"], inputs["ze"], inputs["length"]
    size, cpc, material = inputs["size"], inputs["cpc_size"], inputs["material"]
    temperature, circuit = inputs["conductor_temp_c"], inputs["circuit"]
    require_table_conductor("size", size, material)
    require_table_conductor("cpc_size", cpc, material)
    z_m = protection.loop_impedance_per_metre(size, cpc, material, temperature,
                                              inputs["frequency_hz"])
    r1_r2 = abs(z_m) * length
    zs = protection.earth_fault_loop_impedance(ze, z_m, length)
    fault = voltage / zs
    ia = protection.operating_current(breaker)
    zs_max = voltage / ia
    longest = protection.max_length_for_disconnection(voltage, ze, z_m, ia)
    trips = zs * ia <= voltage
    time = protection.disconnection_time(voltage, circuit)

    result = Result()
    result.output("zs", zs)
    result.output("fault_a", fault)
    result.output("trips", trips, "yes" if trips else "no")
    result.output("max_length", longest)
    result.output("ia", ia)
    result.output("zs_max", zs_max)
    result.output("disconnection_time", time)
    result.output("r1_r2", r1_r2)

    name = conductors.MATERIAL_NAMES[material]
    per_m = fq(abs(z_m), "ohm/m")
    result.step(f"Loop through the line conductor ({size.label}) and the protective conductor "
                f"({cpc.label}), {name} at {temperature:g} °C, resistance and reactance",
                "z = (R1 + R2) + j(X1 + X2) per metre",
                f"= {fq(z_m.real, 'ohm/m')} + j{fq(z_m.imag, 'ohm/m')}, |z| = {per_m}")
    result.step("Resistance of the run", "R1 + R2 = |z| × L",
                f"= {per_m} × {fq(length, 'm')} = {fq(r1_r2, 'ohm')}")
    result.step("Earth fault loop impedance (Ze added arithmetically: its angle is not known)",
                "Zs = Ze + (R1 + R2)", f"= {fq(ze, 'ohm')} + {fq(r1_r2, 'ohm')} = {fq(zs, 'ohm')}")
    result.step("Prospective fault current to the exposed part", "I_f = U0 / Zs",
                f"= {fq(voltage, 'V')} / {fq(zs, 'ohm')} = {fq(fault, 'A')}")
    _ia_step(result, breaker, ia, tolerance_pct)
    where = ("Table 41.1, TN, final circuit" if circuit == "final"
             else "411.3.2.3, TN, distribution circuit")
    result.step(f"Disconnection time required (IEC 60364-4-41 {where})", "t_max",
                f"= {fq(time, 's')} at U0 = {fq(voltage, 'V')}")
    result.step("TN condition (IEC 60364-4-41 411.4.4)", "Zs × Ia ≤ U0",
                f"{fq(zs, 'ohm')} × {fq(ia, 'A')} = {fq(zs * ia, 'V')} "
                f"{'≤' if trips else '>'} {fq(voltage, 'V')}")
    result.step("Longest run that still passes (where Zs × Ia = U0)",
                "L_max = (U0 / Ia − Ze) / |z|",
                f"= ({fq(voltage, 'V')} / {fq(ia, 'A')} − {fq(ze, 'ohm')}) / {per_m} = "
                f"{fq(longest, 'm')}")

    _tn_check(result, voltage, ze, zs, ia, time, longest, circuit)
    _validity_checks(result, breaker, voltage, circuit, size, cpc)

    result.assumptions += list(ASSUMPTIONS)
    result.sources += list(SOURCES)
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
        "title": f"Earth fault loop impedance against length ({breaker.code})",
        "x": {"label": "Run length", "unit": "m", "values": lengths},
        "y": [{"label": "Zs", "unit": "Ω",
               "values": [protection.earth_fault_loop_impedance(ze, z_m, x) for x in lengths]}],
        "marks": marks,
    }


CALCULATOR = Calculator(
    id="ground-fault-trip",
    title="Will the breaker clear a fault to the case?",
    summary="Earth fault loop impedance Zs, fault current, whether the breaker's instantaneous "
            "trip clears it in the IEC 60364-4-41 time, and the longest run that still does.",
    group="Protection",
    inputs=(
        Input("voltage", "Line-to-earth voltage U0", "quantity", unit="V", default=120,
              minimum=protection.TABLE_41_1_LOWEST_U0_V, min_exclusive=True, maximum=1000,
              region_defaults={"iec": 230},
              help="Nominal voltage to earth: 120 V, 230 V, 277 V (above "
                   f"{protection.TABLE_41_1_LOWEST_U0_V:g} V)."),
        Input("ze", "External loop impedance Ze", "quantity", unit="ohm", default=0.15,
              minimum=0, min_exclusive=True, maximum=50, region_defaults={"iec": 0.35},
              help="Measured at the panel with a loop tester, or the supplier's declared value."),
        Input(
            "breaker", "Breaker", "text", default="20 A 10x", check=_check_breaker,
            suggestions=_breaker_suggestions(),
            region_defaults={"iec": "B20"},
            help="B16, C32, D20 (IEC 60898-1 type and rating, "
                 f"{protection.MCB_PREFERRED_RATINGS_A[0]}–{protection.MCB_PREFERRED_RATINGS_A[-1]}"
                 " A) or a moulded-case rating with its instantaneous multiple, 100 A 10x; any "
                 "rating and multiple can be typed on the command line or in a link."),
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
        Input("circuit", "Circuit", "choice", default="final", choices=CIRCUITS),
        Input("trip_tolerance_pct", "Moulded-case pickup tolerance", "quantity", unit="%",
              default=MCCB_TOLERANCE_PCT, minimum=0, maximum=50, advanced=True,
              help=f"Of the instantaneous setting (± {MCCB_TOLERANCE_PCT:g} % is usual; the "
                   "maker's curve says)."),
        _inputs.frequency(advanced=True),
    ),
    outputs=(
        Output("zs", "Earth fault loop impedance Zs", "Ω"),
        Output("fault_a", "Prospective fault current", "A"),
        Output("trips", "Instantaneous trip clears it", ""),
        Output("max_length", "Longest run that passes", "m"),
        Output("ia", "Current that surely trips (Ia)", "A"),
        Output("zs_max", "Largest Zs allowed (U0 / Ia)", "Ω"),
        Output("disconnection_time", "Disconnection time required", "s"),
        Output("r1_r2", "R1 + R2 of the run", "Ω"),
    ),
    compute=_view,
)
