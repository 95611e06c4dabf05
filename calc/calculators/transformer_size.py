"""transformer-size: which standard transformer rating does this load need, with a growth margin,
and is it large enough to start the largest motor?"""

import math

from calc import transformers
from calc.calculators import _inputs
from calc.calculators._plausibility import plausibility
from calc.calculators._transformers import (
    SOURCE_IDEAL,
    Z_PCT_MAX,
    Z_PCT_MIN,
    connection_input,
    equipment_reasons,
    ideal_relations,
    next_standard_rating,
    standard_ratings,
    the_one_given,
    transformer_cautions,
    voltage_input,
)
from calc.electrical import apparent_power
from calc.errors import InputError
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

LOAD_FIELDS = ("load_kva", "load_kw", "load_a")

TRANSFORMER_DUTIES = (
    ("step-down", "Step-down (secondary below primary)"),
    ("step-up", "Step-up (secondary above primary)"),
    ("isolating", "Isolating 1:1 (secondary equal to primary)"),
)
RATING_SERIES = (
    ("na", "IEEE/ANSI preferred kVA (North America)"),
    ("iec", "IEC ratings (25 kVA to 10 MVA)"),
)

SOURCE_RATINGS = (
    "Preferred ratings: IEEE/ANSI C57.12 series (North America); IEC 60076 and EU Regulation "
    "548/2014 Annex I Table I.1 ratings (IEC practice) — from memory for IEC."
)
MOTOR_DIP_LIMIT_PCT = 15.0  # start dip at the motor's bus: the usual design limit (common practice)
DIP_FORMULA = "ΔV ≈ S_LR / (S_LR + S_T × 100 / %Z)"


def _load_apparent_power(inputs, phases, voltage):
    """(apparent power [VA], the field it came from, the step's substituted text)."""
    name = the_one_given(inputs, LOAD_FIELDS, "give the load: its kVA, or its kW (with its "
                         "power factor), or its current at the secondary voltage")
    value = inputs[name]
    if name == "load_kva":
        return value, name, f"= {fq(value, 'VA')} (given)"
    if name == "load_kw":
        apparent = value / inputs["pf"]
        return apparent, name, (f"= P / cos φ = {fq(value, 'W')} / {inputs['pf']:g} = "
                                f"{fq(apparent, 'VA')}")
    apparent = apparent_power(voltage, value, phases)
    k = "√3 × " if phases == 3 else ""
    return apparent, name, (f"= {k}V₂ × I = {k}{fq(voltage, 'V')} × {fq(value, 'A')} = "
                            f"{fq(apparent, 'VA')}")


def _check_duty(duty, primary_v, secondary_v):
    """Refuse voltages that contradict the step-down / step-up / isolating label."""
    v1, v2 = fq(primary_v, "V"), fq(secondary_v, "V")
    if duty == "step-down" and secondary_v >= primary_v:
        raise InputError("secondary_v", secondary_v, f"a step-down transformer's secondary must be "
                         f"below its primary ({v2} is not below {v1}); swap the voltages or "
                         "choose step-up")
    if duty == "step-up" and secondary_v <= primary_v:
        raise InputError("secondary_v", secondary_v, f"a step-up transformer's secondary must be "
                         f"above its primary ({v2} is not above {v1}); swap the voltages or "
                         "choose step-down")
    if duty == "isolating" and not math.isclose(primary_v, secondary_v, rel_tol=1e-9):
        raise InputError("secondary_v", secondary_v, f"an isolating (1:1) transformer has equal "
                         f"voltages ({v1} and {v2} differ); choose step-down or step-up")


def _motor_start(result, inputs, rating, table):
    """(rating [VA], dip [%] or None): the rating sized up until the largest motor's start dip
    is within the limit, where a listed rating can hold it."""
    motor = inputs["motor_lr_kva"]
    if motor is None:
        return rating, None
    z_pct, dip_limit = inputs["z_pct"], inputs["max_dip_pct"]
    dip = transformers.motor_start_dip(motor, rating, z_pct)
    if dip <= dip_limit:
        result.step(f"Motor start dip through {fq(rating, 'VA')} at {z_pct:g} %", DIP_FORMULA,
                    f"= {dip:.3g} %")
        return rating, dip
    larger = [kva * 1e3 for kva in table if kva * 1e3 > rating
              and transformers.motor_start_dip(motor, kva * 1e3, z_pct) <= dip_limit]
    result.step(f"Motor start: {fq(motor, 'VA')} locked-rotor through {fq(rating, 'VA')} "
                f"at {z_pct:g} % dips the voltage more than {dip_limit:g} %", DIP_FORMULA,
                f"= {dip:.3g} %")
    if not larger:
        return rating, dip
    rating = larger[0]
    dip = transformers.motor_start_dip(motor, rating, z_pct)
    result.step("Sized up for motor starting: the smallest rating that holds the dip",
                f"ΔV ≤ {dip_limit:g} %", f"S_T = {fq(rating, 'VA')}, ΔV = {dip:.3g} %")
    return rating, dip


def _size_view(inputs):
    phases = int(inputs["phases"])
    primary_v, secondary_v = inputs["primary_v"], inputs["secondary_v"]
    _check_duty(inputs["duty"], primary_v, secondary_v)
    load, given, load_text = _load_apparent_power(inputs, phases, secondary_v)
    growth = inputs["growth_pct"]
    series = inputs["ratings"]
    table = standard_ratings(phases, series)
    design = load * (1.0 + growth / 100.0)
    rating = next_standard_rating(design, table)
    if rating is None:
        raise InputError(given, inputs[given], f"the design load {fq(design, 'VA')} is above the "
                         f"largest rating in the list ({fq(table[-1] * 1e3, 'VA')}); split the "
                         "load between transformers or specify a power transformer")
    result = Result()
    result.step("Load apparent power", "S_load", load_text)
    result.step(f"Design load with a {growth:g} % growth margin", "S_design = S_load × (1 + m)",
                f"= {fq(load, 'VA')} × {1 + growth / 100:g} = {fq(design, 'VA')}")
    series_name = dict(RATING_SERIES)[series]
    result.step(f"Next standard rating at or above it ({series_name})", "S_T ≥ S_design",
                f"= {fq(rating, 'VA')}")
    rating, dip = _motor_start(result, inputs, rating, table)

    loading = 100.0 * load / rating
    primary_a = transformers.rated_current(rating, primary_v, phases)
    secondary_a = transformers.rated_current(rating, secondary_v, phases)
    result.output("rating", rating)
    result.output("loading_pct", loading)
    result.output("primary_a", primary_a)
    result.output("secondary_a", secondary_a)
    result.output("load_va", load)
    result.output("design_va", design)
    if dip is not None:
        result.output("motor_dip_pct", dip)
    result.step("Loading of the chosen rating (without the margin)", "S_load / S_T × 100",
                f"= {fq(load, 'VA')} / {fq(rating, 'VA')} × 100 = {loading:.3g} %")
    k = "√3 × " if phases == 3 else ""
    result.step("Full-load currents of the chosen rating", f"I = S_T / ({k}V)",
                f"I₁ = {fq(primary_a, 'A')}, I₂ = {fq(secondary_a, 'A')}")
    ideal_relations(result, primary_v, secondary_v, phases, rating,
                    connection=inputs["connection"])

    result.check("loading", "pass",
                 f"The load is {loading:.3g} % of {fq(rating, 'VA')} ({100 * design / rating:.3g} "
                 f"% with the {growth:g} % margin); a transformer may carry its rating "
                 "continuously in its rated ambient.")
    category = transformers.short_circuit_category(rating, phases)
    result.check("short_circuit_category", "pass",
                 f"{fq(rating, 'VA')} {'three' if phases == 3 else 'single'}-phase is IEEE "
                 f"C57.12.00 short-circuit category {category}; its through-fault limits are "
                 "those of that category.")
    dip_limit = inputs["max_dip_pct"]
    if dip is not None:
        ok = dip <= dip_limit
        result.check("motor_start", "pass" if ok else "warn",
                     f"Estimated start dip {dip:.3g} % at the secondary (limit {dip_limit:g} %, a "
                     "common design figure; infinite source, so the real dip is larger)"
                     + ("." if ok else "; no listed rating holds it: use a reduced-voltage "
                        "starter, a soft starter or a drive."))
    if inputs["nonlinear"]:
        result.check("nonlinear_load", "warn",
                     "Non-linear load (drives, rectifiers, LED drivers, IT equipment): harmonic "
                     "currents add eddy-current and stray loss, so a transformer runs hotter than "
                     "its kVA suggests. Specify a K-factor rated unit or derate by IEEE C57.110 "
                     "(from memory), and size the neutral for triplen harmonics.")
    plausibility(result, equipment_reasons(rating, phases, (("primary", primary_v),
                                                            ("secondary", secondary_v)),
                                           inputs["z_pct"]))

    result.assumptions += [
        f"The load is {'a balanced three-phase' if phases == 3 else 'a single-phase'} load at the "
        "secondary; kW are converted at the stated power factor, amps at the secondary voltage.",
        f"Growth margin {growth:g} %: spare capacity of 20-25 % is common practice.",
        "Continuous duty in the rated ambient (30 °C average, 40 °C maximum for IEEE and IEC "
        "ratings, from memory); a hotter room or poor ventilation needs derating.",
    ]
    if dip is None:
        result.assumptions.append("No motor starting considered: give the largest motor's "
                                  "locked-rotor kVA (code letter × hp) to check the dip.")
    else:
        result.assumptions.append(f"Motor dip estimated with an assumed {inputs['z_pct']:g} % "
                                  "impedance and an infinite source (common practice).")
    result.sources += [SOURCE_RATINGS,
                       "IEEE C57.12.00 short-circuit categories (read).",
                       "Motor start dip ΔV ≈ S_LR / (S_LR + S_sc): common practice.",
                       SOURCE_IDEAL]
    result.cautions += [
        "Size the primary and secondary conductors and overcurrent protection by your code (for "
        "example NEC 450.3, 240.21(C)); they are not the full-load currents shown.",
        "Motor starting and non-linear loads are reasons to size up: check both before ordering.",
    ]
    transformer_cautions(result, primary_v, secondary_v)
    result.series = {
        "title": "Loading of each standard rating",
        "x": {"label": "Rating", "unit": "kVA", "values": [float(kva) for kva in table]},
        "y": [{"label": "Load / rating", "unit": "%", "values": [100.0 * load / (kva * 1e3)
                                                                 for kva in table]}],
        "marks": [{"axis": "y", "value": 100.0, "label": "Full load"},
                  {"axis": "x", "value": rating / 1e3, "label": "Chosen"}],
    }
    return result


CALCULATOR = Calculator(
    id="transformer-size",
    title="Transformer size",
    summary="The next standard kVA rating for a load with a growth margin, its loading and its "
            "full-load currents; motor starting and non-linear loads as reasons to size up.",
    group="Transformers",
    inputs=(
        Input("load_kva", "Load apparent power", "quantity", unit="kVA", default=60,
              optional=True, minimum=0.001, maximum=1_000_000,
              region_defaults={"iec": 350},
              help="The load in kVA; or leave blank and give kW or amps below.", group="load"),
        Input("load_kw", "Load real power (instead of kVA)", "quantity", unit="kW", optional=True,
              minimum=0.001, maximum=1_000_000,
              help="With the power factor below; the kVA field must be blank.", group="load"),
        Input("load_a", "Load current (instead of kVA)", "quantity", unit="A", optional=True,
              minimum=0.001, maximum=200_000,
              help="Line current at the secondary voltage; the kVA field must be blank.",
              group="load"),
        Input("pf", "Power factor (for kW)", "quantity", unit="", default=0.85, minimum=0.05,
              maximum=1),
        _inputs.phases(),
        voltage_input("primary_v", "Primary voltage", 480, 11000,
                      "Line-to-line for three-phase (480 V, 13.8 kV, 11 kV)."),
        voltage_input("secondary_v", "Secondary voltage", 208, 400,
                      "Line-to-line for three-phase (208 V for 120/208 V, 400 V for 230/400 V)."),
        Input("duty", "Transformer", "choice", default="step-down", choices=TRANSFORMER_DUTIES,
              help="Checks that the voltages are the right way round."),
        Input("growth_pct", "Growth margin", "quantity", unit="%", default=25, minimum=0,
              maximum=200, help="Spare capacity for future load (20-25 % is common practice)."),
        Input("ratings", "Standard ratings", "choice", default="na", choices=RATING_SERIES,
              region_defaults={"iec": "iec"}),
        Input("nonlinear", "Mostly non-linear load (drives, rectifiers, IT)", "flag",
              default=False),
        Input("motor_lr_kva", "Largest motor's locked-rotor kVA", "quantity", unit="kVA",
              optional=True, minimum=0.001, maximum=1_000_000, advanced=True,
              help="Code letter kVA/hp × hp (NEC Table 430.7(B)); blank: no motor check."),
        Input("z_pct", "Assumed impedance (for the motor dip)", "quantity", unit="%",
              default=5.75, minimum=Z_PCT_MIN, maximum=Z_PCT_MAX, advanced=True,
              region_defaults={"iec": 6}, help="Nameplate %Z if known."),
        Input("max_dip_pct", "Motor start dip limit", "quantity", unit="%",
              default=MOTOR_DIP_LIMIT_PCT,
              minimum=0, min_exclusive=True, maximum=50, advanced=True,
              help=f"{MOTOR_DIP_LIMIT_PCT:g} % at the motor's bus is the usual "
                   "design limit (common practice)."),
        connection_input(),
    ),
    outputs=(
        Output("rating", "Standard rating", "VA"),
        Output("loading_pct", "Loading of that rating", "%"),
        Output("primary_a", "Primary full-load current", "A"),
        Output("secondary_a", "Secondary full-load current", "A"),
        Output("load_va", "Load apparent power", "VA"),
        Output("design_va", "Design load with margin", "VA"),
        Output("motor_dip_pct", "Motor start dip", "%"),
    ),
    compute=_size_view,
)
