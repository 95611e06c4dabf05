"""line-loss: run this load at one voltage or another, and is a larger feeder worth its cost?

The current and I²R loss of one run at two candidate voltages (the alternative with an optional
step-up / step-down transformer pair), the energy and money lost in a year at the given hours
and tariff, and the simple payback of a larger conductor at the first voltage.
"""

import math
from typing import NamedTuple

from calc import cautions, line_loss, units, voltage_drop
from calc.calculators._conductors import (
    CONDUCTOR_DATA_SOURCE,
    FORMULA_SOURCE,
    LIMIT_SOURCE,
    conductor_data_check,
    conductor_impedance,
    conductor_step,
    current_reason,
    drop_limit_check,
    drop_reason,
    refuse_hp,
    run_input,
    supply_reasons,
    whole_number,
)
from calc.calculators._plausibility import plausibility
from calc.errors import InputError, InputErrors, VoltageCollapse
from calc.line_loss import (
    BULLER_WOODROW,
    HOURS_IN_LEAP_YEAR,
    J_PER_KWH,
    MAX_PAYBACK_YEARS,
    YEAR_S,
)
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

# The constant-current and constant-power figures differ by more than this: the load model
# matters more than the precision of a loss-factor estimate (a margin chosen here).
LOAD_MODEL_WARN = 0.05
# A transformer loaded beyond its rating (S / S_r above this) is flagged.
MAX_TRANSFORMER_LOADING = 1.0
# Transformers whose total loss at rated load exceeds this share of their rating are unusual:
# distribution units run about 98 to 99.5 % efficient (common practice; DOE 10 CFR 431.196
# levels, from memory). A larger figure usually means a percentage typed as watts.
TRANSFORMER_LOSS_SANITY = 0.05

TRANSFORMER_ROLES = (("step_up", "step-up"), ("step_down", "step-down"))
_LINEAR, _SQUARE = BULLER_WOODROW
LOSS_FACTOR_FORMULA = f"LsF = {_LINEAR:g} LF + {_SQUARE:g} LF²"
CHART_LOADS_PCT = [5.0 * k for k in range(26)]  # 0 to 125 % of the given load

SOURCES = (
    "I = P / (√3 V pf) and P_loss = 3 I² R: Glover, Sarma & Overbye, Power System Analysis "
    "and Design, 5th ed., ch. 2 and ch. 5 — from memory.",
    f"{LOSS_FACTOR_FORMULA}: F. H. Buller and C. A. Woodrow, Electrical World, vol. 92, 1928, "
    "as quoted by T. Gönen, Electric Power Distribution System Engineering, 2nd ed., ch. 2 — "
    "from memory.",
    "Transformer losses P₀ + P_k (S/S_r)²: IEC 60076-1 definitions of no-load and load "
    "loss; S. J. Chapman, Electric Machinery Fundamentals, 5th ed., section 2.7 — from "
    "memory.",
    FORMULA_SOURCE,
    LIMIT_SOURCE,
    CONDUCTOR_DATA_SOURCE,
)
CAUTIONS = (
    "Loss and drop only: ampacity, insulation and terminal temperature ratings, derating "
    "and overcurrent protection are NOT checked here.",
    "A higher distribution voltage changes the equipment's ratings, the shock and arc-flash "
    "hazard, the labelling and who may work on it; have the change designed and reviewed "
    "by a qualified person.",
    "Costs are estimates: demand charges, tariff changes and the value of money over time "
    "are not included.",
)


class Option(NamedTuple):
    """One candidate: a run at one voltage with one size, and the year's energy and cost."""

    voltage: float  # [V]
    size: object  # calc.units.ConductorSize
    current: float  # I = P / (k V pf) [A]
    run: voltage_drop.RunSolution  # constant-current solution (loss, drop)
    loss_cp: float | None  # conductor loss of a constant-power load [W]; None: no steady state
    transformers: tuple  # ((role, calc.line_loss.TransformerLosses), ...)
    total_loss: float  # conductors + transformers at the given load [W]
    energy: float  # a year's loss [J]
    cost: float  # currency units a year


class _Reading(NamedTuple):
    """The inputs as every part of the view reads them (pf is 1 on DC)."""

    system: str
    power: float  # [W]
    pf: float
    sets: int
    length: float  # [m]
    n_conductors: int  # conductors carrying the load current
    loss_factor: float
    operating_time: float  # [s]
    energised_time: float  # [s]
    tariff: float


def _read(inputs):
    system = inputs["system"]
    refuse_hp(inputs, "power", "give the power the load draws, in kW (a motor draws its output / "
              "its efficiency)")
    if inputs["load_factor"] is not None and inputs["loss_factor"] is not None:
        raise InputError("loss_factor", inputs["loss_factor"], "give the load factor or the loss "
                         "factor, not both (the loss factor is found from the load factor)")
    sets = whole_number(inputs, "sets")
    if inputs["loss_factor"] is not None:
        lsf = inputs["loss_factor"]
    elif inputs["load_factor"] is not None:
        lsf = line_loss.loss_factor(inputs["load_factor"])
    else:
        lsf = 1.0
    return _Reading(system, inputs["power"], 1.0 if system == "dc" else inputs["pf"], sets,
                    inputs["length"], voltage_drop.LOADED_CONDUCTORS[system], lsf,
                    inputs["operating_hours"], inputs["energised_hours"], inputs["tariff"])


def _solve_option(reading, voltage, size, z, blame, chain=()):
    """One candidate solved; `blame` is (field, value) for a run that cannot carry the load."""
    r = reading
    current = voltage_drop.load_current(r.system, r.power, voltage, r.pf)
    try:
        run = voltage_drop.solve_run(r.system, voltage, r.length, z.r_ac, z.x, r.pf, r.sets,
                                     current=current)
    except VoltageCollapse as error:
        raise InputError(*blame, f"at {fq(voltage, 'V')} {error}; use a higher voltage, a "
                         "larger size or parallel sets, or a shorter run") from None
    try:
        loss_cp = voltage_drop.solve_run(r.system, voltage, r.length, z.r_ac, z.x, r.pf, r.sets,
                                         power=r.power).loss_w
    except VoltageCollapse:
        loss_cp = None
    burden = r.power / r.pf  # the load's apparent power [VA]
    units = tuple((role, line_loss.transformer_losses(rating, no_load, load_loss, burden))
                  for role, rating, no_load, load_loss in chain)
    load_dependent = run.loss_w + sum(t.load_loss for _, t in units)
    no_load = sum(t.no_load_loss for _, t in units)
    energy = line_loss.annual_loss_energy(load_dependent, r.operating_time, r.loss_factor,
                                          no_load, r.energised_time if units else 0.0)
    return Option(voltage, size, current, run, loss_cp, units, load_dependent + no_load, energy,
                  line_loss.energy_cost(energy, r.tariff))


def _transformer_chain(inputs):
    """((role, rating, no-load, load loss), ...) of the transformers given, or field errors."""
    errors, chain = [], []
    for prefix, role in TRANSFORMER_ROLES:
        names = (f"{prefix}_kva", f"{prefix}_no_load_w", f"{prefix}_load_loss_w")
        rating, no_load, load_loss = (inputs[name] for name in names)
        if rating is None:
            errors += [InputError(name, inputs[name], f"a {role} loss needs the {role} "
                                  f"transformer's rating in {names[0]}; fill it in or leave "
                                  "the losses blank")
                       for name in names[1:] if inputs[name] is not None]
            continue
        if inputs["system"] == "dc":
            errors.append(InputError(names[0], rating / 1e3, "a DC run has no transformers; "
                                     "leave the transformer fields blank or choose an AC system"))
            continue
        wanted = ((names[1], "no-load loss"), (names[2], "load loss at rated kVA"))
        missing = [InputError(name, None, f"give the {role} transformer's {what} in W from its "
                              "test report or nameplate (0 if it is negligible)")
                   for name, what in wanted if inputs[name] is None]
        errors += missing
        if not missing:
            chain.append((role, rating, no_load, load_loss))
    energised, operating = inputs["energised_hours"] / 3600.0, inputs["operating_hours"] / 3600.0
    if chain and energised < operating:
        errors.append(InputError("energised_hours", energised,
                                 f"the transformers are energised {energised:g} h a year, less "
                                 f"than the {operating:g} h the load runs; enter at least the "
                                 "operating hours"))
    if errors:
        raise InputErrors(errors)
    return tuple(chain)


def _loss_ratio(first, alt):
    """Conductor loss at the alternative over the first; None where the first is nothing (a load
    so small that its I²R underflows to 0 W)."""
    return alt.run.loss_w / first.run.loss_w if first.run.loss_w else None


def _energy_text(joules):
    """An energy in kWh, MWh or GWh (3 significant figures)."""
    kwh = joules / J_PER_KWH
    for unit, factor in (("GWh", 1e6), ("MWh", 1e3)):
        if abs(kwh) >= factor:
            return f"{fq(kwh / factor, '')} {unit}"
    return f"{fq(kwh, '')} kWh"


def format_money(amount: float) -> str:
    """Show an amount of money to the cent, in the one format every calculator uses.

    Parameters
    ----------
    amount : float
        In currency units (the user's own: the tariff sets them).

    Returns
    -------
    str
        Two decimals; from 10 000 up the whole part in groups of three separated by a narrow
        no-break space (U+202F), as the SI Brochure (9th ed., 5.4.4) groups digits; a
        four-digit whole part is not split. "392.00", "2088.00", "12 345.60".

    Raises
    ------
    ValueError
        For a non-finite amount (a computed cost never is one).

    Examples
    --------
    >>> format_money(392), format_money(2088.4), format_money(-1196.404)
    ('392.00', '2088.40', '-1196.40')
    >>> format_money(12345.6) == "12\u202f345.60"
    True
    """
    value = float(amount)
    if not math.isfinite(value):
        raise ValueError(f"received {amount!r}, which is not a finite number")
    whole, _, cents = f"{abs(value):.2f}".partition(".")
    if len(whole) > 4:
        groups = []
        while whole:
            groups.insert(0, whole[-3:])
            whole = whole[:-3]
        whole = "\u202f".join(groups)
    sign = "-" if value < 0 and (whole, cents) != ("0", "00") else ""
    return f"{sign}{whole}.{cents}"


def _years(seconds):
    return f"{fq(seconds / YEAR_S, '')} years"


def _view(inputs):
    reading = _read(inputs)
    chain = _transformer_chain(inputs)
    size, alt_size = inputs["size"], inputs["alt_size"]
    voltage, alt_voltage = inputs["voltage"], inputs["alt_voltage"]
    z = conductor_impedance(inputs, size)
    first = _solve_option(reading, voltage, size, z, ("voltage", voltage))
    alt = _solve_option(reading, alt_voltage, size, z, ("alt_voltage", alt_voltage), chain)
    upsized = _solve_option(reading, voltage, alt_size,
                            conductor_impedance(inputs, alt_size, "alt_size"),
                            ("alt_size", alt_size.label))
    saving = first.cost - alt.cost
    upsized_saving = first.cost - upsized.cost
    extra_cost = inputs["alt_size_cost"]
    payback = None if extra_cost is None else line_loss.payback_period(extra_cost, upsized_saving)

    result = Result()
    result.output("current", first.current)
    result.output("alt_current", alt.current)
    result.output("loss_w", first.run.loss_w)
    result.output("alt_loss_w", alt.run.loss_w)
    ratio = _loss_ratio(first, alt)
    if ratio is not None:
        result.output("loss_ratio", ratio)
    if alt.transformers:
        result.output("alt_xfmr_loss_w", alt.total_loss - alt.run.loss_w)
    result.output("alt_total_loss_w", alt.total_loss)
    result.output("loss_pct", 100.0 * first.total_loss / reading.power)
    result.output("alt_loss_pct", 100.0 * alt.total_loss / reading.power)
    result.output("drop_pct", first.run.drop_pct)
    result.output("alt_drop_pct", alt.run.drop_pct)
    for name, option in (("loss_cp_w", first), ("alt_loss_cp_w", alt)):
        if option.loss_cp is not None:
            result.output(name, option.loss_cp)
    result.output("annual_loss_j", first.energy, _energy_text(first.energy))
    result.output("alt_annual_loss_j", alt.energy, _energy_text(alt.energy))
    result.output("annual_cost", first.cost, format_money(first.cost))
    result.output("alt_annual_cost", alt.cost, format_money(alt.cost))
    result.output("annual_saving", saving, format_money(saving))
    result.output("upsized_loss_w", upsized.run.loss_w)
    result.output("upsized_annual_saving", upsized_saving, format_money(upsized_saving))
    if payback is not None:
        result.output("payback", payback, _years(payback))

    _steps(result, inputs, reading, z, first, alt, upsized, extra_cost, payback)
    _checks(result, inputs, first, alt, upsized_saving, extra_cost, payback)
    conductor_data_check(result, inputs["method"], z)
    _plausibility(result, inputs, reading, first, alt, upsized)
    _describe(result, inputs, chain, max(voltage, alt_voltage))
    result.series = _loss_series(first, alt)
    return result


def _steps(result, inputs, reading, z, first, alt, upsized, extra_cost, payback):
    r, n = reading, reading.n_conductors
    size, length = first.size, r.length
    conductor_step(result, inputs, size, z)
    result.step(f"One conductor of the run ({fq(length, 'm')}, {units.from_si(length, 'ft'):.4g} ft"
                + (f", {r.sets} sets in parallel)" if r.sets > 1 else ")"),
                "R = r_ac L / n", f"= {first.run.resistance:.4g} Ω")
    k, dc = ("√3 × " if r.system == "3ph" else ""), r.system == "dc"
    for option, name in ((first, "first voltage"), (alt, "alternative")):
        v = fq(option.voltage, "V")
        result.step(f"Load current at {v} ({name})", f"I = P / ({k}V{'' if dc else ' pf'})",
                    f"= {fq(r.power, 'W')} / ({k}{v}{'' if dc else f' × {r.pf:g}'}) = "
                    f"{fq(option.current, 'A')}")
        result.step(f"Conductor loss at {v} ({n} current-carrying conductors)",
                    f"P_loss = {n} I² R", f"= {n} × ({fq(option.current, 'A')})² × "
                    f"{option.run.resistance:.4g} Ω = {fq(option.run.loss_w, 'W')}")
    ratio = _loss_ratio(first, alt)
    ratio_text = "— (no loss)" if ratio is None else f"{ratio:.4g}"
    result.step("Raising the voltage lowers the current in proportion, and the loss goes with "
                "the current's square", "P_alt / P = (I_alt / I)² = (V / V_alt)²",
                f"= ({fq(first.voltage, 'V')} / {fq(alt.voltage, 'V')})² = "
                f"{(first.voltage / alt.voltage) ** 2:.4g}; {fq(alt.run.loss_w, 'W')} / "
                f"{fq(first.run.loss_w, 'W')} = {ratio_text}")
    for role, unit in alt.transformers:
        result.step(f"{role.capitalize()} transformer, {fq(unit.rating, 'VA')}, loaded "
                    f"to {unit.loading:.0%} by the load's {fq(r.power / r.pf, 'VA')}",
                    "P_T = P₀ + P_k (S / S_r)²",
                    f"= {fq(unit.no_load_loss, 'W')} + {fq(unit.rated_load_loss, 'W')} × "
                    f"{unit.loading:.3g}² = {fq(unit.no_load_loss + unit.load_loss, 'W')}")
    lsf = r.loss_factor
    if inputs["loss_factor"] is not None:
        result.step("Loss factor, as given", "LsF", f"= {lsf:.4g}")
    elif inputs["load_factor"] is not None:
        lf = inputs["load_factor"]
        result.step("Loss factor from the load factor (Buller & Woodrow; the given power is "
                    "the peak)", LOSS_FACTOR_FORMULA,
                    f"= {_LINEAR:g} × {lf:.4g} + {_SQUARE:g} × {lf:.4g}² = {lsf:.4g}")
    else:
        result.step("Loss factor: the load runs at the given power for all its hours",
                    "LsF = 1", "= 1")
    hours = r.operating_time / 3600.0
    for option in (first, alt):
        v = fq(option.voltage, "V")
        if option.transformers:
            load_part = option.total_loss - sum(t.no_load_loss for _, t in option.transformers)
            result.step(f"A year's loss at {v}, with the transformers' no-load loss for every "
                        "hour they are energised",
                        "E = (P_loss + Σ P_k (S/S_r)²) × LsF × t + Σ P₀ × t_energised",
                        f"= {fq(load_part, 'W')} × {lsf:.4g} × {hours:g} h + "
                        f"{fq(option.total_loss - load_part, 'W')} × "
                        f"{r.energised_time / 3600:g} h = {_energy_text(option.energy)}")
        else:
            result.step(f"A year's loss at {v}", "E = P_loss × LsF × t",
                        f"= {fq(option.run.loss_w, 'W')} × {lsf:.4g} × {hours:g} h = "
                        f"{_energy_text(option.energy)}")
    result.step("Cost of the losses (flat tariff, currency units per kWh)",
                "C = E [kWh] × tariff",
                f"= {_energy_text(first.energy)} × {r.tariff:g} = {format_money(first.cost)}; "
                f"{_energy_text(alt.energy)} × {r.tariff:g} = {format_money(alt.cost)} (currency "
                "units a year)")
    result.step(f"Saving a year at {fq(alt.voltage, 'V')}", "ΔC = C − C_alt",
                f"= {format_money(first.cost)} − {format_money(alt.cost)} = {format_money(first.cost - alt.cost)} "
                "currency units")
    upsized_saving = first.cost - upsized.cost
    result.step(f"The larger conductor at {fq(first.voltage, 'V')}: {upsized.size.label}",
                f"P_loss = {n} I² R_larger",
                f"= {n} × ({fq(upsized.current, 'A')})² × {upsized.run.resistance:.4g} Ω = "
                f"{fq(upsized.run.loss_w, 'W')}; {_energy_text(upsized.energy)} a year, saving "
                f"{format_money(upsized_saving)} currency units a year")
    if extra_cost is not None:
        shown = (_years(payback) if payback is not None else "never (no saving)"
                 if upsized_saving <= 0 else f"more than {MAX_PAYBACK_YEARS:g} years")
        result.step("Simple payback of the larger conductor", "t = extra cost / annual saving",
                    f"= {format_money(extra_cost)} / {format_money(upsized_saving)} a year = {shown}")


def _checks(result, inputs, first, alt, upsized_saving, extra_cost, payback):
    limit = inputs["max_drop_pct"]
    for name, option in (("drop_limit", first), ("alt_drop_limit", alt)):
        drop_limit_check(result, name, option.run.drop_pct, limit,
                         f"At {fq(option.voltage, 'V')} the drop")
    saving = first.cost - alt.cost
    better = (f"{fq(alt.voltage, 'V')} saves {format_money(saving)} currency units a year over "
              f"{fq(first.voltage, 'V')}")
    if saving <= 0:
        cause = (" the transformers' losses outweigh the conductor saving" if alt.transformers
                 else " its conductor loss is no lower")
        more = f" ({format_money(abs(saving))} currency units a year more)" if saving < 0 else ""
        better = (f"{fq(alt.voltage, 'V')} saves nothing over {fq(first.voltage, 'V')}{more}:"
                  f"{cause}")
    result.check("alt_voltage_saving", "pass" if saving > 0 else "warn", better + ".")
    _load_model_check(result, first, alt)
    for role, unit in alt.transformers:
        _transformer_checks(result, role, unit)
    size, alt_size = inputs["size"], inputs["alt_size"]
    if alt_size.area_m2 <= size.area_m2:
        result.check("alt_size_larger", "warn",
                     f"The comparison size {alt_size.label} is not larger than {size.label}; "
                     "choose a larger size to see what upsizing saves.")
    if extra_cost is None:
        return
    if payback is None:
        why = ("there is no saving" if upsized_saving <= 0 else
               f"it would take more than {MAX_PAYBACK_YEARS:g} years")
        result.check("payback", "warn", f"The larger conductor never pays back here: {why} at "
                     "this load, these hours and this tariff.")
    else:
        result.check("payback", "pass", f"The larger conductor pays back its extra cost in "
                     f"{_years(payback)} (simple payback, no discounting).")


def _plausibility(result, inputs, r, first, alt, upsized):
    """The `plausibility` check: currents against the sizes' ampacity, the run, the drops."""
    material = inputs["material"]
    reasons = [current_reason(option.current, option.size, material, r.sets)
               for option in (first, alt, upsized)]
    reasons += supply_reasons(r.system, first.voltage, r.pf, r.length)
    reasons += [drop_reason(option.run.limit_drop_pct) for option in (first, alt)]
    plausibility(result, [reason for reason in dict.fromkeys(reasons) if reason])


def _load_model_check(result, first, alt):
    parts, status = [], "pass"
    for option in (first, alt):
        if option.loss_cp is None:
            status = "warn"
            parts.append(f"at {fq(option.voltage, 'V')} a constant-power load of this size "
                         "could not be supplied over this run (no steady voltage)")
            continue
        more = option.loss_cp / option.run.loss_w - 1.0 if option.run.loss_w else 0.0
        if more > LOAD_MODEL_WARN:
            status = "warn"
        parts.append(f"at {fq(option.voltage, 'V')} {fq(option.loss_cp, 'W')} ({more:+.1%})")
    result.check("load_model", status,
                 "Losses are for a load drawing its current at nominal voltage. A "
                 "constant-power load (motors, drives) draws more as the voltage sags: "
                 + "; ".join(parts) + f" (warn beyond {LOAD_MODEL_WARN:.0%}).")


def _transformer_checks(result, role, unit):
    name = role.replace("-", "_")
    if unit.loading > MAX_TRANSFORMER_LOADING:
        result.check(f"{name}_loading", "warn",
                     f"The {role} transformer is loaded to {unit.loading:.0%} of its "
                     f"{fq(unit.rating, 'VA')} rating; choose a larger unit (its load loss and "
                     "temperature rise are past rated).")
    share = (unit.no_load_loss + unit.rated_load_loss) / unit.rating
    if share > TRANSFORMER_LOSS_SANITY:
        result.check(f"{name}_losses", "warn",
                     f"The {role} transformer's losses at rated load are {share:.1%} of "
                     f"its rating; distribution transformers lose about 0.5 to 2 % (common "
                     f"practice; flagged above {TRANSFORMER_LOSS_SANITY * 100:g} %). Check the "
                     "figures are in W, not %.")


def _describe(result, inputs, chain, highest_voltage):
    system = inputs["system"]
    result.assumptions += [
        "Both options carry the same load over the same run, conductor and system; only the "
        "voltage differs (and, for the payback, the size at the first voltage).",
        "Load current found from the power at nominal voltage, I = P / (k V pf), and held "
        "(constant-current load); the sending end is held at nominal. A constant-power load's "
        "figure is given beside it.",
        "Loss is I²R in the current-carrying conductors at the stated conductor temperature; "
        "a lightly loaded conductor runs cooler and loses a little less.",
        "Balanced load: no neutral current" + (" (120/240 V three-wire)." if system == "1ph3w"
                                               else "."),
    ]
    if inputs["loss_factor"] is None and inputs["load_factor"] is None:
        result.assumptions.append("The load runs at the given power for all its operating hours "
                                  "(loss factor 1).")
    else:
        result.assumptions.append("With a load or loss factor the given power is the peak; the "
                                  "loss energy is the peak loss × loss factor × hours.")
    if chain:
        result.assumptions += [
            "Transformers are loaded at the load's apparent power P / pf; their magnetising "
            "current and the chain's own losses are not added to the feeder current (about "
            "1–3 % more, from memory).",
            "No-load loss is drawn for every hour the transformers are energised; load loss "
            "goes with (S / S_r)² and the loss factor, like the conductors'.",
        ]
    result.assumptions.append("Costs: a flat energy tariff with no demand charge; simple "
                              "payback with no discounting or tariff change.")
    result.sources += list(SOURCES)
    result.cautions += list(CAUTIONS)
    if chain:
        result.cautions.append(cautions.BACKFEED)
    if highest_voltage > 1000.0:
        result.cautions.append(cautions.MEDIUM_VOLTAGE)
    result.cautions += list(cautions.COMMON)


def _loss_series(first, alt):
    """Chart: loss against load, 0 to 125 % of the given, at both voltages (I²R goes with
    load²)."""
    loads = CHART_LOADS_PCT
    lines = [
        {"label": f"At {fq(first.voltage, 'V')}", "unit": "W",
         "values": [first.run.loss_w * (p / 100) ** 2 for p in loads]},
        {"label": f"At {fq(alt.voltage, 'V')}, conductors", "unit": "W",
         "values": [alt.run.loss_w * (p / 100) ** 2 for p in loads]},
    ]
    if alt.transformers:
        lines.append({"label": f"At {fq(alt.voltage, 'V')}, with transformers", "unit": "W",
                      "values": [alt.run.loss_w * (p / 100) ** 2
                                 + sum(t.no_load_loss + t.load_loss * (p / 100) ** 2
                                       for _, t in alt.transformers) for p in loads]})
    return {
        "title": "Loss against load at both voltages",
        "x": {"label": "Load", "unit": "%", "values": list(loads)},
        "y_axis": {"label": "Loss", "unit": "W"},
        "y": lines,
        "marks": [{"axis": "x", "value": 100.0, "label": "Given load"}],
    }


def _transformer_inputs(prefix, role, where):
    return (
        Input(f"{prefix}_kva", f"{role.capitalize()} transformer rating", "quantity", unit="kVA",
              optional=True, minimum=0, min_exclusive=True, maximum=100000, advanced=True,
              help=f"The alternative's {role} transformer ({where}); blank means none."),
        Input(f"{prefix}_no_load_w", f"{role.capitalize()} no-load loss", "quantity", unit="W",
              optional=True, minimum=0, maximum=1e6, advanced=True,
              help="Core loss in W (not %), from the test report or nameplate."),
        Input(f"{prefix}_load_loss_w", f"{role.capitalize()} load loss at rated kVA", "quantity",
              unit="W", optional=True, minimum=0, maximum=1e6, advanced=True,
              help="Winding (copper) loss at rated current in W (not %)."),
    )


CALCULATOR = Calculator(
    id="line-loss",
    title="Line losses at two voltages",
    summary="Current, I²R loss, a year's energy and cost of one run at two candidate voltages "
            "(with an optional step-up / step-down pair), and the payback of a larger conductor.",
    group="Conductors",
    inputs=(
        run_input("system", default="3ph"),
        run_input("power", label="Load power", default=50, optional=False, advanced=False,
                  help="Real power the load draws, in kW (the peak, if you give a load "
                       "factor); a motor draws its output / its efficiency."),
        run_input("pf"),
        run_input("voltage", label="Voltage", default=208, region_defaults={"iec": 400},
                  help="The first candidate; line-to-line for three-phase, 240 V for 120/240 V."),
        run_input("voltage", name="alt_voltage", label="Alternative voltage", default=480,
                  region_defaults={"iec": 690},
                  help="The second candidate, e.g. 480 V where the first is 208 V or 240 V."),
        run_input("length", default="250 ft", region_defaults={"iec": "80 m"}),
        run_input("size", default="1/0", region_defaults={"iec": "50 mm²"}),
        run_input("material"),
        Input("operating_hours", "Hours at load per year", "quantity", unit="h", default=4000,
              minimum=0, maximum=HOURS_IN_LEAP_YEAR,
              help="Hours a year the load runs (8760 h is all year)."),
        Input("tariff", "Energy tariff per kWh", "quantity", unit="", default=0.15, minimum=0,
              maximum=100, help="Price of 1 kWh in your currency units, e.g. 0.15."),
        Input("alt_size", "Larger size for the payback", "size", default="2/0",
              region_defaults={"iec": "70 mm²"},
              help="A larger conductor for the same run at the first voltage."),
        Input("alt_size_cost", "Extra installed cost of the larger size", "quantity", unit="",
              optional=True, minimum=0, maximum=1e9,
              help="In currency units, over the whole run; blank means no payback figure."),
        Input("load_factor", "Load factor", "quantity", unit="", optional=True, minimum=0,
              min_exclusive=True, maximum=1, advanced=True,
              help="Average over peak load during the hours; gives the loss factor by "
                   "Buller & Woodrow. Blank: the load runs flat.", group="loss_shape"),
        Input("loss_factor", "Loss factor (instead of load factor)", "quantity", unit="",
              optional=True, minimum=0, min_exclusive=True, maximum=1, advanced=True,
              help="Average over peak I²R loss, if known from metering.", group="loss_shape"),
        *_transformer_inputs("step_up", "step-up", "at the source, from the first voltage up"),
        *_transformer_inputs("step_down", "step-down", "at the load, back down"),
        Input("energised_hours", "Transformer hours energised per year", "quantity", unit="h",
              default=8760, minimum=0, maximum=HOURS_IN_LEAP_YEAR, advanced=True,
              help="Their no-load loss runs this long (8760 h: never switched off)."),
        run_input("max_drop_pct"),
        run_input("conductor_temp_c"),
        run_input("raceway"),
        run_input("sets"),
        run_input("frequency_hz"),
        run_input("method"),
    ),
    outputs=(
        Output("current", "Load current at the first voltage", "A"),
        Output("alt_current", "Load current at the alternative voltage", "A"),
        Output("loss_w", "Conductor loss at the first voltage", "W"),
        Output("alt_loss_w", "Conductor loss at the alternative voltage", "W"),
        Output("loss_ratio", "Conductor loss ratio, alternative / first", ""),
        Output("alt_xfmr_loss_w", "Transformer losses (alternative)", "W"),
        Output("alt_total_loss_w", "Total loss at the alternative voltage", "W"),
        Output("loss_pct", "Loss as a share of the load, first voltage", "%"),
        Output("alt_loss_pct", "Loss as a share of the load, alternative (with transformers)", "%"),
        Output("drop_pct", "Voltage drop at the first voltage", "%"),
        Output("alt_drop_pct", "Voltage drop at the alternative voltage", "%"),
        Output("loss_cp_w", "Conductor loss, constant-power load, first voltage", "W"),
        Output("alt_loss_cp_w", "Conductor loss, constant-power load, alternative", "W"),
        Output("annual_loss_j", "Energy lost a year, first voltage", "J"),
        Output("alt_annual_loss_j", "Energy lost a year, alternative", "J"),
        Output("annual_cost", "Cost of the losses a year, first voltage (currency units)",
               ""),
        Output("alt_annual_cost", "Cost of the losses a year, alternative (currency units)",
               ""),
        Output("annual_saving", "Saving a year at the alternative voltage (currency units)",
               ""),
        Output("upsized_loss_w", "Conductor loss with the larger size, first voltage", "W"),
        Output("upsized_annual_saving", "Saving a year with the larger size (currency units)",
               ""),
        Output("payback", "Payback of the larger size", "s"),
    ),
    compute=_view,
)
