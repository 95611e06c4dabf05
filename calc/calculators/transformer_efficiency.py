"""transformer-efficiency: what does a transformer lose at this load and over a day, where is it
most efficient, and what do its losses cost a year?"""

from calc import cautions, transformers
from calc.calculators import _inputs
from calc.calculators._plausibility import outside, plausibility
from calc.calculators._transformers import (
    SOURCE_IDEAL,
    equipment_reasons,
    ideal_relations,
    load_reason,
    rating_input,
    voltage_input,
)
from calc.errors import InputError
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

PROFILE_PERIODS = 3  # daily profile: three periods of (load %, hours); the rest at no load
HOURS_A_DAY = 24
JOULES_PER_KWH = 3.6e6  # exact
SECONDS_PER_HOUR = 3600.0  # exact
# Above rated current the windings run hotter than their design and age faster (IEEE C57.91,
# IEC 60076-7; from memory): a load over 100 % of rating is flagged.
RATED_LOAD = 1.0
SLACK = 1e-12  # a load of exactly 100 % is within the rating despite rounding
# Total losses at rated load, as a fraction of the rating, of real transformers: from about 0.2 %
# for the largest power transformers to a few percent for small dry-types (common practice; the
# efficiency levels of DOE 10 CFR 431.196 and EU 548/2014 lie well inside, from memory). Outside
# this range the loss figures are mistyped (watts for kilowatts) or belong to another unit.
LOSS_FRACTION_RANGE = (0.001, 0.10)

SOURCE_EFFICIENCY = (
    "η = P_out / (P_out + P₀ + k² P_k); maximum at k = √(P₀ / P_k): S. J. Chapman, Electric "
    "Machinery Fundamentals, 5th ed., section 2.7 — from memory."
)
SOURCE_ALL_DAY = (
    "All-day efficiency from a daily load cycle: M. A. Salam, Fundamentals of Electrical "
    "Machines, 2nd ed. (Narosa), Example 3.10."
)
CAUTION_LOSS_FIGURES = (
    "Loss figures come from the test report or the maker's data sheet; measure losses only "
    "with the test equipment and procedure of IEEE C57.12.90 / IEC 60076-1, by qualified "
    "persons."
)


def _kwh(energy_j):
    return f"{fq(energy_j / JOULES_PER_KWH, '')} kWh"


def _profile(inputs):
    """[(load fraction, hours)] of the daily profile; InputError when it exceeds a day."""
    periods, total = [], 0.0
    for n in range(1, PROFILE_PERIODS + 1):
        hours = inputs[f"hours{n}"] / SECONDS_PER_HOUR  # the input arrives in seconds
        total += hours
        if total > HOURS_A_DAY * (1 + SLACK):
            raise InputError(f"hours{n}", hours,
                             f"the profile's hours add up to {total:g} h, more than a day; the "
                             f"three periods together may take at most {HOURS_A_DAY:g} h (the "
                             "rest of the day counts as no load)")
        periods.append((inputs[f"load{n}_pct"] / 100.0, hours))
    return periods, total


def _steps(result, inputs, load, output, losses, eta, k_max, eta_max):
    apparent_power, p0, pk = inputs["kva"], inputs["no_load_w"], inputs["load_loss_w"]
    pf = inputs["pf"]
    s = fq(apparent_power, "VA")
    result.step(f"Output at {100 * load:g} % load, power factor {pf:g}", "P_out = k S cos φ",
                f"= {load:g} × {s} × {pf:g} = {fq(output, 'W')}")
    result.step("Losses: no-load (core) loss at every load, load loss with the square of the load",
                "P_loss = P₀ + k² P_k",
                f"= {fq(p0, 'W')} + {load:g}² × {fq(pk, 'W')} = {fq(losses, 'W')}")
    result.step("Efficiency", "η = P_out / (P_out + P_loss)",
                f"= {fq(output, 'W')} / {fq(output + losses, 'W')} = {100 * eta:.4g} %")
    result.step("Load of maximum efficiency: where the load loss equals the no-load loss",
                "k = √(P₀ / P_k)", f"= √({fq(p0, 'W')} / {fq(pk, 'W')}) = {100 * k_max:.3g} % → "
                f"η_max = {100 * eta_max:.4g} %")


def _plausibility(result, inputs, heavy):
    apparent_power, p0, pk = inputs["kva"], inputs["no_load_w"], inputs["load_loss_w"]
    reasons = equipment_reasons(apparent_power, int(inputs["phases"]),
                                (("primary", inputs["primary_v"]),
                                 ("secondary", inputs["secondary_v"])))
    fraction = (p0 + pk) / apparent_power
    if outside(fraction, *LOSS_FRACTION_RANGE):
        low, high = (100 * f for f in LOSS_FRACTION_RANGE)
        reasons.append(f"losses at rated load of {fq(p0 + pk, 'W')} are {100 * fraction:.3g} % of "
                       f"the {fq(apparent_power, 'VA')} rating; real transformers lose {low:g}-"
                       f"{high:g} % (common practice): check the loss figures' units and the "
                       "rating")
    reasons.append(load_reason(100 * heavy, "the heaviest load"))
    plausibility(result, reasons)


def _efficiency_view(inputs):
    apparent_power, p0, pk = inputs["kva"], inputs["no_load_w"], inputs["load_loss_w"]
    pf, load = inputs["pf"], inputs["load_pct"] / 100.0
    periods, busy = _profile(inputs)
    days, price = inputs["days"], inputs["energy_price"]
    eta, output, losses = transformers.efficiency(apparent_power, p0, pk, load, pf)
    k_max = transformers.maximum_efficiency_load(p0, pk)
    eta_max = transformers.efficiency(apparent_power, p0, pk, k_max, pf)[0]
    day_out, day_loss = transformers.daily_energy(apparent_power, p0, pk,
                                                  [(k, pf, h) for k, h in periods])
    all_day = day_out / (day_out + day_loss) if day_out > 0 else 0.0
    annual_loss = day_loss * SECONDS_PER_HOUR * days  # W·h -> J
    cost = annual_loss / JOULES_PER_KWH * price

    result = Result()
    result.output("efficiency_pct", 100.0 * eta)
    result.output("loss_w", losses)
    result.output("max_efficiency_load_pct", 100.0 * k_max)
    result.output("max_efficiency_pct", 100.0 * eta_max)
    result.output("all_day_efficiency_pct", 100.0 * all_day)
    result.output("daily_output", day_out * SECONDS_PER_HOUR, _kwh(day_out * SECONDS_PER_HOUR))
    result.output("annual_loss_energy", annual_loss, _kwh(annual_loss))
    result.output("annual_loss_cost", cost, f"{cost:,.2f}".replace(",", " "))

    _steps(result, inputs, load, output, losses, eta, k_max, eta_max)
    parts = "; ".join(f"{100 * k:g} % for {h:g} h" for k, h in periods if h)
    result.step(f"Daily profile: {parts or 'no load all day'}; {HOURS_A_DAY - busy:g} h at no "
                f"load (energised {HOURS_A_DAY:g} h)",
                f"E_out = Σ k S cos φ t; E_loss = {HOURS_A_DAY:g} h × P₀ + Σ k² P_k t",
                f"E_out = {_kwh(day_out * SECONDS_PER_HOUR)}, "
                f"E_loss = {_kwh(day_loss * SECONDS_PER_HOUR)}")
    result.step("All-day efficiency", "η_day = E_out / (E_out + E_loss)",
                f"= {100 * all_day:.4g} %")
    result.step(f"Energy and cost of the losses over {days:g} days a year",
                "E_year = E_loss × days; cost = E_year × price",
                f"= {_kwh(annual_loss)} × {price:g} = {cost:,.2f}".replace(",", " "))
    ideal_relations(result, inputs["primary_v"], inputs["secondary_v"], int(inputs["phases"]),
                    apparent_power, output_power=output, losses=losses)

    heavy = max([load] + [k for k, h in periods if h])
    within = heavy <= RATED_LOAD + SLACK
    result.check("overload", "pass" if within else "warn",
                 f"The heaviest load is {100 * heavy:g} % of rating" +
                 ("." if within else f": above {100 * RATED_LOAD:g} % the windings run hotter "
                  "and age faster; check the loading guide (IEEE C57.91, IEC 60076-7; from "
                  "memory)."))
    _plausibility(result, inputs, heavy)
    result.check("maximum_efficiency", "pass",
                 f"Maximum efficiency at {100 * k_max:.3g} % load; distribution transformers are "
                 "usually designed for it at 35-50 % (common practice), power transformers nearer "
                 "full load.")

    result.assumptions += [
        "No-load loss constant at rated voltage and frequency; load loss at the reference "
        "temperature of the test report (75 °C IEC, 85 °C IEEE liquid-filled; from memory), "
        "varying with the square of the load current.",
        f"One power factor ({pf:g}) for the whole profile; the transformer stays energised all "
        "day, so the core loss runs 24 h.",
        "Harmonic currents, which add eddy and stray loss, are not included.",
    ]
    result.sources += [SOURCE_EFFICIENCY, SOURCE_ALL_DAY, SOURCE_IDEAL]
    result.cautions += [CAUTION_LOSS_FIGURES, cautions.BACKFEED]
    result.cautions += list(cautions.COMMON)

    loads = [5.0 * k for k in range(1, 31)]
    curve = [100 * transformers.efficiency(apparent_power, p0, pk, f / 100, pf)[0] for f in loads]
    result.series = {
        "title": "Efficiency against load",
        "x": {"label": "Load", "unit": "%", "values": loads},
        "y": [{"label": f"Efficiency at pf {pf:g}", "unit": "%", "values": curve}],
        "marks": [{"axis": "x", "value": 100 * k_max, "label": "Maximum efficiency"},
                  {"axis": "x", "value": 100 * load, "label": "This load"}],
    }
    return result


def _profile_inputs():
    defaults = ((100, 4), (60, 10), (30, 6))  # an invented dairy-barn day: milking, day, night
    items = []
    for n, (pct, hours) in enumerate(defaults, start=1):
        items += [
            Input(f"load{n}_pct", f"Period {n}: load", "quantity", unit="%", default=pct,
                  minimum=0, maximum=200, help="Load as a percentage of the rating."),
            Input(f"hours{n}", f"Period {n}: hours a day", "quantity", unit="h", default=hours,
                  minimum=0, maximum=HOURS_A_DAY,
                  help=f"The three periods take at most {HOURS_A_DAY:g} h together."),
        ]
    return tuple(items)


CALCULATOR = Calculator(
    id="transformer-efficiency",
    title="Transformer losses and efficiency",
    summary="No-load and load losses, efficiency at any load, the load of maximum efficiency, "
            "all-day efficiency and the yearly energy and cost of the losses.",
    group="Transformers",
    inputs=(
        rating_input(),
        Input("no_load_w", "No-load (core) loss", "quantity", unit="W", default=300, minimum=0.001,
              maximum=1e6, region_defaults={"iec": 600},
              help="From the test report or data sheet."),
        Input("load_loss_w", "Load loss at rated current", "quantity", unit="W", default=1800,
              minimum=0.001, maximum=1e7, region_defaults={"iec": 6500},
              help="Copper loss at full load, at the reference temperature."),
        Input("pf", "Load power factor", "quantity", unit="", default=0.9, minimum=0.05,
              maximum=1),
        Input("load_pct", "Load for the efficiency", "quantity", unit="%", default=75, minimum=0,
              maximum=200),
        *_profile_inputs(),
        Input("energy_price", "Energy price per kWh", "quantity", unit="", default=0.15,
              minimum=0, maximum=100, help="In your currency."),
        Input("days", "Days energised a year", "quantity", unit="", default=365, minimum=0,
              maximum=366),
        voltage_input("primary_v", "Primary voltage", 480, 11000, "For the ideal relations."),
        voltage_input("secondary_v", "Secondary voltage", 208, 400, "For the ideal relations."),
        _inputs.phases(advanced=True),
    ),
    outputs=(
        Output("efficiency_pct", "Efficiency at that load", "%"),
        Output("loss_w", "Losses at that load", "W"),
        Output("max_efficiency_load_pct", "Load of maximum efficiency", "%"),
        Output("max_efficiency_pct", "Maximum efficiency", "%"),
        Output("all_day_efficiency_pct", "All-day efficiency", "%"),
        Output("daily_output", "Energy delivered a day", "J"),
        Output("annual_loss_energy", "Energy lost a year", "J"),
        Output("annual_loss_cost", "Cost of the losses a year", ""),
    ),
    compute=_efficiency_view,
)
