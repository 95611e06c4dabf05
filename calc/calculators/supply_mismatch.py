"""supply-mismatch: can equipment rated for one voltage and frequency run on another supply, and
what transformer does it need to do so?"""

from calc import cautions, induction_motors, transformers
from calc.calculators import _inputs
from calc.calculators._plausibility import plausibility
from calc.calculators._transformers import (
    LV_WINDING_CURRENT_MAX_A,
    SOURCE_IDEAL,
    SUPPLY_V_MIN,
    WINDING_V_MIN,
    ideal_relations,
    next_standard_rating,
    ratio_display,
    standard_ratings,
)
from calc.electrical import line_current
from calc.errors import InputError
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

EQUIPMENT_LOADS = (
    ("motor", "Induction motor (fan, pump, compressor, mixer)"),
    ("magnetic", "Magnetic: mains transformer, ballast, welder, solenoid"),
    ("resistive", "Resistive: heater, kettle, incandescent lamp"),
    ("electronic", "Electronic with a wide-range input (100-240 V, 50/60 Hz)"),
)
MAGNETIC_LOADS = ("motor", "magnetic")  # their flux follows V/f

# Equipment within 5 % of its rated voltage may be connected directly as far as voltage goes;
# beyond 10 % it must not be (common practice, in line with ANSI C84.1 Range A and the NEMA
# MG 1-12.44 motor tolerance).
DIRECT_OK_PCT = 5.0
DIRECT_LIMIT_PCT = 10.0

# General-purpose dry-type ratings below the distribution lists [kVA], for small equipment on a
# foreign supply. Common practice (from memory).
SMALL_KVA_1PH = (0.05, 0.1, 0.15, 0.25, 0.5, 0.75, 1, 1.5, 2, 3)
SMALL_KVA_3PH = (6.0,)  # 3 and 9 kVA are already in the three-phase list

# Supply frequencies in use [Hz]: 50 and 60 Hz public supplies (IEC 60196, from memory), 16.7 and
# 25 Hz railway and old industrial supplies, 400 Hz aircraft and ground power (common practice);
# a frequency within FREQUENCY_MATCH of one of them is taken as that one.
FREQUENCIES_HZ = (16.7, 25.0, 50.0, 60.0, 400.0)
FREQUENCY_MATCH = 0.02

EXCITATION_PCT = 100 * transformers.EXCITATION_LIMIT  # 105 %
SLACK = 1e-12  # a value exactly at a limit is within it despite rounding
SHOWN_POLES = 4  # the speed step shows a 4-pole motor

VOLTAGE_TOL = induction_motors.RUNNING_VOLTAGE_TOLERANCE_PCT
FREQUENCY_TOL = induction_motors.RUNNING_FREQUENCY_TOLERANCE_PCT
COMBINED_TOL = induction_motors.RUNNING_COMBINED_TOLERANCE_PCT
MOTOR_TOLERANCES = (f"NEMA MG 1-12.44: ±{VOLTAGE_TOL:g} % voltage, ±{FREQUENCY_TOL:g} % "
                    f"frequency, sum at most {COMBINED_TOL:g} %")

SOURCES = (
    "Flux ∝ V/f from E = 4.44 f N Φ_max: S. J. Chapman, Electric Machinery Fundamentals, 5th "
    "ed., section 2.2 — from memory.",
    "Motor tolerances: NEMA MG 1-12.44 (read); synchronous speed n = 120 f / p.",
    f"Winding excitation limit {EXCITATION_PCT:g} %: IEEE C57.12.00 §4.1.6 — from memory.",
    SOURCE_IDEAL,
)
CAUTIONS = (
    "Equipment built for another country may differ in more than voltage: earthing "
    "arrangement, plug and socket, protective devices and approval marks. It may need "
    "inspection before use.",
    "Capacitors (motor run, power-factor) draw current in proportion to frequency; "
    "synchronous clocks and timers change speed with it.",
)


def _rating_table(phases):
    """Ratings [kVA] for an adapter transformer: the small dry-type sizes, then the preferred."""
    small = SMALL_KVA_3PH if phases == 3 else SMALL_KVA_1PH
    return sorted(small + standard_ratings(phases, "na"))


def _motor_checks(result, target_v, equipment_v, frequency_ratio):
    dv = abs(target_v / equipment_v - 1.0) * 100.0
    df = abs(frequency_ratio - 1.0) * 100.0
    ok = induction_motors.within_running_tolerance(dv, df)
    result.check("motor_tolerance", "pass" if ok else "fail",
                 f"Voltage {dv:.3g} % and frequency {df:.3g} % from the nameplate "
                 f"({MOTOR_TOLERANCES})"
                 + ("." if ok else ": outside the motor's rating. Use a motor rated for "
                    "this supply, a 50/60 Hz dual-rated motor, or a variable-frequency drive."))
    if frequency_ratio > 1.0 + SLACK:
        result.check("driven_load", "warn",
                     f"The motor runs {100 * (frequency_ratio - 1):.3g} % faster: a fan or "
                     f"centrifugal pump then needs about {frequency_ratio ** 3:.3g} × the "
                     "power (affinity laws, power ∝ speed³), which overloads the motor.")
    elif frequency_ratio < 1.0 - SLACK:
        result.check("driven_load", "warn",
                     f"The motor runs {100 * (1 - frequency_ratio):.3g} % slower at "
                     f"{fq(target_v, 'V')}: it gives about {frequency_ratio:.3g} × its rated "
                     "power at rated current, and its own cooling fan moves less air.")


def _checks(result, inputs, target_v, flux_equipment, flux_direct, frequency_ratio):
    equipment_v, supply_v = inputs["equipment_v"], inputs["supply_v"]
    supply_hz = inputs["supply_hz"]
    kind = inputs["load_type"]
    off = abs(supply_v / equipment_v - 1.0) * 100.0
    direct = "pass" if off <= DIRECT_OK_PCT else ("warn" if off <= DIRECT_LIMIT_PCT else "fail")
    result.check("direct_connection", direct,
                 f"The supply is {100 * (supply_v / equipment_v - 1):+.3g} % from the equipment's "
                 "rated voltage" + (": it may be connected directly as far as voltage goes."
                                    if direct == "pass" else ": do not connect it directly; use "
                                    "the transformer."))
    if kind in MAGNETIC_LOADS:
        status = "pass" if flux_equipment <= transformers.EXCITATION_LIMIT + SLACK else "fail"
        result.check("flux", status,
                     f"Flux at {100 * flux_equipment:.3g} % of rated on the transformer's output"
                     + (f" (at most {EXCITATION_PCT:g} %)." if status == "pass" else
                        ": the core saturates, magnetising current and heating rise sharply."))
        if flux_direct > transformers.EXCITATION_LIMIT + SLACK:
            result.check("direct_flux", "fail",
                         f"Connected directly the flux would be {100 * flux_direct:.3g} % of "
                         "rated: saturation, overheating and burnt windings.")
    if kind == "motor":
        _motor_checks(result, target_v, equipment_v, frequency_ratio)
    if kind == "electronic":
        result.check("nameplate", "pass" if abs(frequency_ratio - 1) < SLACK else "warn",
                     "Check the nameplate lists this voltage and frequency (e.g. '100-240 V, "
                     "50/60 Hz'); timers and clocks that count mains cycles run fast or slow.")
    rated_hz = inputs["transformer_hz"]
    if rated_hz is not None:
        flux_t = rated_hz / supply_hz
        ok = flux_t <= transformers.EXCITATION_LIMIT + SLACK
        result.check("transformer_frequency", "pass" if ok else "fail",
                     f"A {rated_hz:g} Hz transformer on {supply_hz:g} Hz at its rated voltage runs "
                     f"at {100 * flux_t:.3g} % flux" + (
                         "." if ok else f": use it at no more than "
                         f"{100 * supply_hz / rated_hz:.3g} % of its rated voltage (and kVA), "
                         "i.e. pick one whose primary is rated "
                         f"for at least {fq(supply_v * rated_hz / supply_hz, 'V')}."))


def _steps(result, inputs, target_v, flux_equipment, flux_direct, design, rating):
    equipment_v, equipment_hz = inputs["equipment_v"], inputs["equipment_hz"]
    supply_v, supply_hz = inputs["supply_v"], inputs["supply_hz"]
    magnetic, frequency_ratio = inputs["load_type"] in MAGNETIC_LOADS, supply_hz / equipment_hz
    result.step("Connected directly, the equipment's flux (V/Hz) relative to its rating",
                "Φ / Φ_rated = (V_supply / f_supply) / (V_rated / f_rated)",
                f"= ({fq(supply_v, 'V')} / {supply_hz:g} Hz) / ({fq(equipment_v, 'V')} / "
                f"{equipment_hz:g} Hz) = {100 * flux_direct:.3g} %")
    if magnetic and frequency_ratio < 1.0:
        result.step("Lower frequency: feed it less voltage, in proportion, to keep the rated flux",
                    "V = V_rated × f_supply / f_rated",
                    f"= {fq(equipment_v, 'V')} × {supply_hz:g} / {equipment_hz:g} = "
                    f"{fq(target_v, 'V')}")
    else:
        result.step("Voltage to give the equipment", "V = V_rated", f"= {fq(target_v, 'V')}"
                    + (" (never above the nameplate, even where the higher frequency would "
                       "allow it)" if magnetic and frequency_ratio > 1.0 else ""))
    result.step("Its flux on the transformer's output", "(V / f_supply) / (V_rated / f_rated)",
                f"= {100 * flux_equipment:.3g} %")
    ratio = supply_v / target_v
    result.step("Transformer ratio", "a = V_supply / V_equipment",
                f"= {fq(supply_v, 'V')} / {fq(target_v, 'V')} = {ratio_display(ratio)}")
    load, margin = inputs["load_kva"], inputs["margin_pct"]
    result.step(f"Transformer rating with a {margin:g} % margin, next listed size",
                "S ≥ S_load × (1 + m)", f"= {fq(load, 'VA')} × {1 + margin / 100:g} = "
                f"{fq(design, 'VA')} → {fq(rating, 'VA')}")
    if inputs["load_type"] == "motor":
        result.step(f"Motor speed follows the frequency (a {SHOWN_POLES}-pole motor shown)",
                    "n_s = 120 f / p",
                    f"{120 * equipment_hz / SHOWN_POLES:g} r/min at {equipment_hz:g} Hz → "
                    f"{120 * supply_hz / SHOWN_POLES:g} r/min at {supply_hz:g} Hz "
                    f"({100 * frequency_ratio:.3g} %)")


def _plausibility(result, inputs, primary_a, secondary_a, target_v):
    reasons = []
    supply_v, equipment_v = inputs["supply_v"], inputs["equipment_v"]
    if supply_v < SUPPLY_V_MIN:
        reasons.append(f"a supply of {fq(supply_v, 'V')} is below any public supply (from "
                       f"{SUPPLY_V_MIN:g} V: 100 V less 10 %, IEC 60038; from memory)")
    if equipment_v < WINDING_V_MIN:
        reasons.append(f"equipment rated {fq(equipment_v, 'V')} is below any transformer "
                       f"secondary (from {WINDING_V_MIN:g} V, common practice)")
    for name, label in (("supply_hz", "supply"), ("equipment_hz", "equipment's rated"),
                        ("transformer_hz", "transformer's rated")):
        hertz = inputs[name]
        if hertz is not None and not any(abs(hertz / f - 1.0) <= FREQUENCY_MATCH
                                         for f in FREQUENCIES_HZ):
            listed = ", ".join(f"{f:g}" for f in FREQUENCIES_HZ)
            reasons.append(f"a {label} frequency of {hertz:g} Hz is none in use ({listed} Hz; "
                           "IEC 60196 and common practice)")
    for where, volts, amps in (("supply", supply_v, primary_a), ("equipment", target_v,
                                                                 secondary_a)):
        if amps > LV_WINDING_CURRENT_MAX_A:
            reasons.append(f"{fq(amps, 'A')} at {fq(volts, 'V')} on the {where} side is beyond "
                           f"low-voltage equipment (up to about {fq(LV_WINDING_CURRENT_MAX_A, 'A')}"
                           "; UL 891, IEEE C37.20.1, from memory)")
    plausibility(result, reasons)


def _mismatch_view(inputs):
    equipment_v, equipment_hz = inputs["equipment_v"], inputs["equipment_hz"]
    supply_v, supply_hz = inputs["supply_v"], inputs["supply_hz"]
    phases, load = int(inputs["phases"]), inputs["load_kva"]
    margin = inputs["margin_pct"]
    magnetic = inputs["load_type"] in MAGNETIC_LOADS
    frequency_ratio = supply_hz / equipment_hz
    target_v = equipment_v * min(1.0, frequency_ratio) if magnetic else equipment_v
    flux_equipment = transformers.flux_ratio(target_v, supply_hz, equipment_v, equipment_hz)
    flux_direct = transformers.flux_ratio(supply_v, supply_hz, equipment_v, equipment_hz)
    ratio = supply_v / target_v
    design = load * (1.0 + margin / 100.0)
    table = _rating_table(phases)
    rating = next_standard_rating(design, table)
    if rating is None:
        raise InputError("load_kva", load, f"{fq(design, 'VA')} with the margin is above the "
                         f"largest listed rating ({fq(max(table) * 1e3, 'VA')}); this is a "
                         "substation job, not an adapter transformer")
    primary_a = line_current(load, supply_v, phases)
    secondary_a = line_current(load, target_v, phases)
    result = Result()
    result.output("secondary_v", target_v)
    result.output("ratio", ratio, ratio_display(ratio))
    result.output("rating", rating)
    result.output("flux_pct", 100.0 * flux_equipment)
    result.output("direct_flux_pct", 100.0 * flux_direct)
    result.output("speed_pct", 100.0 * frequency_ratio)
    result.output("primary_a", primary_a)
    result.output("secondary_a", secondary_a)

    _steps(result, inputs, target_v, flux_equipment, flux_direct, design, rating)
    ideal_relations(result, supply_v, target_v, phases, rating, show_turns=False)
    _checks(result, inputs, target_v, flux_equipment, flux_direct, frequency_ratio)
    _plausibility(result, inputs, primary_a, secondary_a, target_v)

    result.assumptions += [
        "Flux ∝ V / f (E = 4.44 f N Φ); the transformer itself is rated for the supply "
        "frequency unless its frequency is given.",
        "Magnetic loads and motors are fed at most their rated voltage, reduced in proportion "
        "below their rated frequency; resistive and electronic loads at their rated voltage.",
        f"Transformer sized on the equipment's nameplate kVA with a {margin:g} % margin (common "
        "practice; more for motors started across the line).",
    ]
    result.sources += list(SOURCES)
    result.cautions += list(CAUTIONS)
    result.cautions += list(cautions.COMMON)
    volts = [supply_v * f / 20 for f in range(10, 31)]
    result.series = {
        "title": "Equipment flux against the voltage applied",
        "x": {"label": f"Voltage at {supply_hz:g} Hz", "unit": "V", "values": volts},
        "y": [{"label": "Flux / rated", "unit": "%",
               "values": [100 * transformers.flux_ratio(v, supply_hz, equipment_v, equipment_hz)
                          for v in volts]}],
        "marks": [{"axis": "y", "value": EXCITATION_PCT, "label": f"{EXCITATION_PCT:g} %"},
                  {"axis": "x", "value": target_v, "label": "Through the transformer"},
                  {"axis": "x", "value": supply_v, "label": "Direct"}],
    }
    return result


CALCULATOR = Calculator(
    id="supply-mismatch",
    title="Equipment on a foreign supply",
    summary="Equipment rated for one voltage and frequency on another supply (120 vs 230 V, 50 "
            "vs 60 Hz): the transformer needed, the flux (V/Hz) it will see, the motor speed "
            "change, and plain warnings.",
    group="Transformers",
    inputs=(
        Input("equipment_v", "Equipment rated voltage", "quantity", unit="V", default=230,
              minimum=1, maximum=1000, region_defaults={"iec": 120},
              help="From its nameplate; line-to-line for three-phase."),
        Input("equipment_hz", "Equipment rated frequency", "quantity", unit="Hz", default=50,
              minimum=10, maximum=400, region_defaults={"iec": 60}),
        Input("supply_v", "Supply voltage", "quantity", unit="V", default=120, minimum=1,
              maximum=1000, region_defaults={"iec": 230}, suggest="voltages"),
        Input("supply_hz", "Supply frequency", "quantity", unit="Hz", default=60, minimum=10,
              maximum=400, region_defaults={"iec": 50}),
        _inputs.phases(default="1", choices=(("1", "Single-phase"), ("3", "Three-phase"))),
        Input("load_kva", "Equipment rating", "quantity", unit="kVA", default=1.5, minimum=0.001,
              maximum=100_000, help="Nameplate kVA (or V × A)."),
        Input("load_type", "Kind of equipment", "choice", default="motor",
              choices=EQUIPMENT_LOADS),
        Input("margin_pct", "Sizing margin", "quantity", unit="%", default=25, minimum=0,
              maximum=300),
        Input("transformer_hz", "Transformer's rated frequency", "quantity", unit="Hz",
              optional=True, minimum=10, maximum=400, advanced=True,
              help="Blank: rated for the supply frequency."),
    ),
    outputs=(
        Output("secondary_v", "Voltage to give the equipment", "V"),
        Output("ratio", "Transformer ratio", ""),
        Output("rating", "Transformer rating", "VA"),
        Output("flux_pct", "Equipment flux through the transformer", "%"),
        Output("direct_flux_pct", "Equipment flux connected directly", "%"),
        Output("speed_pct", "Motor speed relative to rated", "%"),
        Output("primary_a", "Supply current", "A"),
        Output("secondary_a", "Equipment current", "A"),
    ),
    compute=_mismatch_view,
)
