"""buck-boost: which standard low-voltage transformer, connected as an autotransformer, raises or
lowers this supply to the voltage wanted, what must it be rated, and is the connection allowed?"""

from calc import cautions, transformers
from calc.calculators._plausibility import plausibility
from calc.calculators._transformers import (
    LV_WINDING_CURRENT_MAX_A,
    SOURCE_IDEAL,
    SUPPLY_V_MIN,
    ideal_relations,
    next_standard_rating,
    the_one_given,
)
from calc.electrical import SQRT3, apparent_power, line_current
from calc.errors import InputError
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

BANKS = (
    ("single", "Single-phase: one unit"),
    ("wye", "Three-phase four-wire wye: three units, neutral connected"),
    ("open-delta", "Three-phase: two units in open delta"),
)
# Units in a bank: one single-phase, three in a four-wire wye, two in open delta.
BANK_UNITS = {"single": 1, "wye": 3, "open-delta": 2}
EXCITATION_PCT = 100 * transformers.EXCITATION_LIMIT  # 105 %
LARGEST_UNIT_KVA = transformers.BUCK_BOOST_KVA[-1]

# An output this close to the target is taken as the target; beyond it the equipment's own
# tolerance or a tapped transformer decides (common practice).
TARGET_TOLERANCE_PCT = 2.5

# The largest change a standard combination makes: both secondaries in series over one primary
# half-winding, ± 2 × 16 / 120 = 26.7 % (from BUCK_BOOST_WINDINGS).
REACH_PCT = 100 * max(2 * series / shunt for _, shunt, series in transformers.BUCK_BOOST_WINDINGS)

# NEC 210.9 and 215.11 (from memory) name their exceptions by nominal system: a voltage within
# 5 % of a nominal one counts as that system, and 220-250 V as the 240 V class (common practice).
NOMINAL_MATCH = 0.05
CLASS_240_V = (220.0, 250.0)

SOURCE_BUCK_BOOST = (
    "V_out = V_in (1 ± N_series / N_shunt): autotransformer from a two-winding transformer, "
    "S. J. Chapman, Electric Machinery Fundamentals, 5th ed., section 2.9 — from memory."
)
SOURCE_UNIT_RATING = (
    "Unit rating kVA = V_series × I_L (autotransformer theory, textbook — from memory); wye bank "
    "3 units, open delta 2."
)
SOURCE_NEC = (
    "NEC 210.9, 215.11 (circuits derived from autotransformers), 450.4 (overcurrent "
    "protection; a transformer field-connected as an autotransformer must be identified for "
    "it) — from memory."
)
CAUTION_AUTOTRANSFORMER = (
    "Connected as an autotransformer, a buck-boost unit gives no isolation: the output is "
    "bonded to the supply, and a fault in the series winding puts the supply voltage on the "
    "load side."
)
CAUTIONS = (
    CAUTION_AUTOTRANSFORMER,
    "Protect the autotransformer as NEC 450.4 requires (or as your code does), and wire "
    "it from the maker's connection diagram: a reversed secondary bucks instead of boosting.",
    "Outside North America IEC 60364 and national rules govern autotransformers; check "
    "them before using one.",
)


def _unit_rating(series_voltage, load_current):
    """The rating a unit needs [VA]: its series winding carries the whole load current, so its
    current rating (unit rating / its rated voltage) must reach it, S = V_series × I_L."""
    return series_voltage * load_current


def _near(voltage, nominal):
    return abs(voltage / nominal - 1.0) <= NOMINAL_MATCH


def _in_240_class(voltage):
    return CLASS_240_V[0] <= voltage <= CLASS_240_V[1]


def _autotransformer_permission(bank, neutral, supply_v, output_v):
    """(status, message) for whether this autotransformer connection is permitted."""
    if bank == "wye" and not neutral:
        return "fail", ("Three units in wye need the supply's neutral connected to the star "
                        "point: without it the star point floats and the phase voltages swing "
                        "with the load. Not permitted; use two units in open delta on a "
                        "three-wire system (common practice).")
    if neutral:
        return "pass", ("The supply's grounded (neutral) conductor is common to input and "
                        "output, as NEC 210.9 and 215.11 require for circuits derived from an "
                        "autotransformer (from memory).")
    if (_near(supply_v, 208.0) and _in_240_class(output_v)) or (
            _in_240_class(supply_v) and _near(output_v, 208.0)):
        return "pass", ("208 V ↔ 240 V without a grounded conductor is the exception NEC 210.9 "
                        "and 215.11 allow (from memory).")
    if (_near(supply_v, 480.0) and _near(output_v, 600.0)) or (
            _near(supply_v, 600.0) and _near(output_v, 480.0)):
        return "warn", ("480 V ↔ 600 V without a grounded conductor is allowed only in "
                        "industrial occupancies where qualified persons service the installation "
                        "(NEC 210.9 Exception No. 2, from memory).")
    return "warn", ("NEC 210.9 and 215.11 (from memory) allow a circuit derived from an "
                    "autotransformer only where its grounded conductor connects to the supply's, "
                    "apart from 208 V ↔ 240 V (and 480 V ↔ 600 V in supervised industrial sites). "
                    "Without the neutral this connection needs the authority's acceptance.")


def _choose(winding_v, winding_target, supply_v):
    """(every usable combination, the one nearest the target) for the voltage across a unit."""
    options = transformers.buck_boost_combinations(winding_v)
    if not options:
        highest = max(primary for _, primary, _ in transformers.BUCK_BOOST_WINDINGS)
        top = transformers.EXCITATION_LIMIT * 2 * highest
        raise InputError("supply_v", supply_v, f"{fq(winding_v, 'V')} across each unit is above "
                         f"the highest standard buck-boost primary ({fq(top, 'V')} with its "
                         f"{EXCITATION_PCT:g} % allowance); use a transformer rated for this "
                         "voltage")
    best = min(options, key=lambda o: (abs(o.output_v - winding_target),
                                       abs(1.0 - winding_v / o.shunt_v)))
    return options, best


def _steps(result, bank, winding_v, winding_target, options, best, output_v):
    where = {"single": "across the unit", "wye": "line-to-neutral, across each unit",
             "open-delta": "line-to-line, across each unit"}[bank]
    result.step(f"Voltage {where}", "V_unit", f"= {fq(winding_v, 'V')} (target "
                f"{fq(winding_target, 'V')})")
    near = sorted(options, key=lambda o: abs(o.output_v - winding_target))[:4]
    result.step("Standard combinations nearest the target (primary connection across the supply, "
                "secondary in series with the line)", "V_out = V_in (1 ± V_series / V_shunt)",
                "; ".join(f"{o.windings} at {o.shunt_v:g}/{o.series_v:g} V {o.mode}: "
                          f"{fq(o.output_v, 'V')}" for o in near))
    boost = best.mode == "boost"
    factor = 1 + (1 if boost else -1) * best.series_v / best.shunt_v
    result.step(f"Chosen: {best.windings}, primaries for {best.shunt_v:g} V, secondaries for "
                f"{best.series_v:g} V, {best.mode} ({'additive' if boost else 'subtractive'} "
                "polarity)",
                f"V_out = V_in (1 {'+' if boost else '−'} {best.series_v:g} / {best.shunt_v:g})",
                f"= {fq(winding_v, 'V')} × {factor:.4g} = {fq(best.output_v, 'V')}"
                + (f" ({fq(output_v, 'V')} line-to-line)" if bank == "wye" else ""))


def _plausibility(result, supply_v, target_v, load_a):
    reasons = []
    if supply_v < SUPPLY_V_MIN:
        reasons.append(f"a supply of {fq(supply_v, 'V')} is below any public supply (from "
                       f"{SUPPLY_V_MIN:g} V: 100 V less 10 %, IEC 60038; from memory)")
    change = abs(target_v / supply_v - 1.0) * 100.0
    if change > REACH_PCT:
        reasons.append(f"a change of {change:.3g} % is beyond any buck-boost connection (the "
                       f"standard windings reach ± {REACH_PCT:.3g} %); use an insulating "
                       "transformer wound for the voltages")
    if load_a > LV_WINDING_CURRENT_MAX_A:
        reasons.append(f"a load current of {fq(load_a, 'A')} is beyond low-voltage equipment "
                       f"(up to about {fq(LV_WINDING_CURRENT_MAX_A, 'A')}; UL 891, IEEE C37.20.1, "
                       "from memory)")
    plausibility(result, reasons)


def _buck_boost_view(inputs):
    supply_v, target_v, bank = inputs["supply_v"], inputs["target_v"], inputs["bank"]
    neutral = inputs["neutral"]
    units = BANK_UNITS[bank]
    per_unit = SQRT3 if bank == "wye" else 1.0  # a wye unit sits line-to-neutral
    winding_v, winding_target = supply_v / per_unit, target_v / per_unit
    options, best = _choose(winding_v, winding_target, supply_v)
    output_v = best.output_v * per_unit
    given = the_one_given(inputs, ("load_kva", "load_a"),
                          "give the load: its kVA, or its current at the output")
    phases = 1 if bank == "single" else 3
    if given == "load_kva":
        load = inputs["load_kva"]
        load_a = line_current(load, output_v, phases)
    else:
        load_a = inputs["load_a"]
        load = apparent_power(output_v, load_a, phases)
    supply_a = line_current(load, supply_v, phases)
    required = _unit_rating(best.series_v, load_a)
    standard = next_standard_rating(required, transformers.BUCK_BOOST_KVA)
    chosen = standard if standard is not None else required
    result = Result()
    result.output("output_v", output_v)
    result.output("rating", chosen)
    result.output("rating_required", required)
    result.output("units", float(units), f"{units} unit{'s' if units > 1 else ''}")
    result.output("load_a", load_a)
    result.output("supply_a", supply_a)
    result.output("boost_pct", 100.0 * (output_v / supply_v - 1.0))

    _steps(result, bank, winding_v, winding_target, options, best, output_v)
    formula, shown = ("S / (√3 × V_out)", f"(√3 × {fq(output_v, 'V')})") if phases == 3 else (
        "S / V_out", fq(output_v, "V"))
    result.step("Load current (it flows through every series winding)", f"I_L = {formula}",
                f"= {fq(load, 'VA')} / {shown} = {fq(load_a, 'A')}")
    result.step("Rating each unit needs: its series winding must carry the load current",
                "S_unit = V_series × I_L",
                f"= {best.series_v:g} V × {fq(load_a, 'A')} = {fq(required, 'VA')} → "
                + (f"standard {fq(standard, 'VA')}" if standard else "beyond the usual sizes"))
    result.step(f"The bank: {units} × {fq(chosen, 'VA')} carries {fq(load, 'VA')} of load",
                "S_load / S_bank",
                f"= {load / (units * chosen):.3g} (an autotransformer transforms only the buck or "
                "boost voltage)")
    ideal_relations(result, supply_v, output_v, phases, load,
                    show_turns=False)  # an autotransformer's turns are shunt + series

    status, message = _autotransformer_permission(bank, neutral, supply_v, output_v)
    result.check("connection_permitted", status, message)
    off = abs(output_v / target_v - 1.0) * 100.0
    close = off <= TARGET_TOLERANCE_PCT
    result.check("target", "pass" if close else "warn",
                 f"The nearest standard combination gives {fq(output_v, 'V')}, {off:.2g} % from "
                 f"the {fq(target_v, 'V')} target" + ("." if close else
                                                     f" (more than {TARGET_TOLERANCE_PCT:g} %): "
                                                     "check the equipment's tolerance, or use a "
                                                     "tapped transformer."))
    result.check("excitation", "pass",
                 f"Each unit's primary connection ({best.shunt_v:g} V) sees "
                 f"{fq(winding_v, 'V')}, {100 * winding_v / best.shunt_v:.3g} % of its rating "
                 f"(at most {EXCITATION_PCT:g} %).")
    if standard is None:
        result.check("unit_size", "warn",
                     f"{fq(required, 'VA')} per unit is beyond the usual buck-boost sizes (to "
                     f"{LARGEST_UNIT_KVA:g} kVA); use larger units made for it or an insulating "
                     "transformer.")

    _plausibility(result, supply_v, target_v, load_a)

    windings = "; ".join(name for name, _, _ in transformers.BUCK_BOOST_WINDINGS)
    result.assumptions += [
        f"Standard buck-boost units ({windings}; common practice); an ideal autotransformer (no "
        "regulation).",
        "The supply is held at the stated voltage; if it varies, the output varies in proportion.",
    ]
    if bank == "open-delta":
        result.assumptions.append("Open delta gives a three-wire output; loads that need the "
                                  "neutral stay on the supply side.")
    result.sources += [SOURCE_BUCK_BOOST, SOURCE_UNIT_RATING, SOURCE_NEC, SOURCE_IDEAL]
    result.cautions += list(CAUTIONS)
    result.cautions += list(cautions.COMMON)
    currents = [load_a * f / 100 for f in range(0, 151, 5)]
    result.series = {
        "title": "Unit rating needed against load current",
        "x": {"label": "Load current", "unit": "A", "values": currents},
        "y": [{"label": "Unit rating needed", "unit": "VA",
               "values": [_unit_rating(best.series_v, i) for i in currents]}],
        "marks": [{"axis": "x", "value": load_a, "label": "This load"},
                  {"axis": "y", "value": chosen, "label": "Unit chosen"}],
    }
    return result


CALCULATOR = Calculator(
    id="buck-boost",
    title="Buck-boost transformer",
    summary="Low-voltage insulating transformers connected as an autotransformer to raise or "
            "lower a supply: output of each standard combination, the kVA needed, the currents, "
            "and whether the connection is permitted.",
    group="Transformers",
    inputs=(
        Input("supply_v", "Supply voltage", "quantity", unit="V", default=208, minimum=1,
              maximum=1000, suggest="voltages",
              help="Measured or nominal; line-to-line for a three-phase bank."),
        Input("target_v", "Voltage wanted", "quantity", unit="V", default=230, minimum=1,
              maximum=1000, help="The equipment's rated voltage."),
        Input("bank", "Connection", "choice", default="single", choices=BANKS),
        Input("neutral", "Supply neutral connected to the bank", "flag", default=False,
              help="Yes when the grounded conductor runs to the autotransformer (needed for a "
                   "wye bank)."),
        Input("load_kva", "Load", "quantity", unit="kVA", default=5, optional=True, minimum=0.001,
              maximum=10_000, group="load"),
        Input("load_a", "Or load current", "quantity", unit="A", optional=True, minimum=0.001,
              maximum=10_000, help="At the output; the kVA field blank.", group="load"),
    ),
    outputs=(
        Output("output_v", "Output voltage", "V"),
        Output("rating", "Rating of each unit", "VA"),
        Output("rating_required", "Rating needed per unit", "VA"),
        Output("units", "Units in the bank", ""),
        Output("load_a", "Load current", "A"),
        Output("supply_a", "Supply current", "A"),
        Output("boost_pct", "Change in voltage", "%"),
    ),
    compute=_buck_boost_view,
)
