"""Line losses: the I²R loss of one run at two candidate voltages (with an optional step-up /
step-down transformer pair), its annual energy and cost, and the payback of a larger conductor.

Quantities follow the nomenclature page: power [W], voltage [V] (line-to-line for three-phase),
current [A], time [s], energy [J], cost in the team's currency units (a plain number).
"""

import dataclasses
import math
from typing import NamedTuple

from calc import cautions, conductors, transformers, voltage_drop
from calc.errors import CalcError, InputError, InputErrors
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

SQRT3 = math.sqrt(3.0)

# 1 kWh = 1000 W × 3600 s, exact (SI Brochure, 9th ed., 2019, Table 8: h = 3600 s).
J_PER_KWH = 3.6e6
# The Julian year, 365.25 d = 31 557 600 s (ISO 80000-3 symbol "a"; IAU) — from memory. Used
# only to state a payback in seconds; the calculation itself counts operating years.
YEAR_S = 365.25 * 86400.0
# A payback longer than this is reported as "never" rather than as a number.
MAX_PAYBACK_YEARS = 1000.0
# Longest year of operation: 366 days (a leap year), 8784 h.
HOURS_IN_LEAP_YEAR = 8784

# Buller & Woodrow's empirical relation between loss factor and load factor for distribution
# feeders: LsF = 0.3 LF + 0.7 LF². F. H. Buller and C. A. Woodrow, "Load factor — equivalent
# hour values compared", Electrical World, vol. 92, 1928; quoted by T. Gönen, Electric Power
# Distribution System Engineering, 2nd ed., ch. 2 (loss factor) — both from memory.
BULLER_WOODROW = (0.3, 0.7)

# The constant-current and constant-power figures differ by more than this: the load model
# matters more than the precision of a loss-factor estimate (a margin chosen here).
LOAD_MODEL_WARN = 0.05

# Transformers whose total loss at rated load exceeds this share of their rating are unusual:
# distribution units run about 98 to 99.5 % efficient (common practice; DOE 10 CFR 431.196
# levels, from memory). A larger figure usually means a percentage typed as watts.
TRANSFORMER_LOSS_SANITY = 0.05

TRANSFORMER_ROLES = (("step_up", "step-up"), ("step_down", "step-down"))


# ---- the numbers ----------------------------------------------------------------------------

def load_current(system, power, voltage, power_factor):
    """Line current drawn by a load of given real power at nominal voltage.

    Parameters
    ----------
    system : str
        "dc", "1ph", "1ph3w" or "3ph" (calc.voltage_drop.SYSTEMS).
    power : float
        Real power of the load [W]; the total of all phases.
    voltage : float
        Nominal voltage [V]; line-to-line for 3ph and 1ph3w (240 V for 120/240 V).
    power_factor : float
        Lagging, in (0, 1]; taken as 1 for DC.

    Returns
    -------
    float
        Current in each line conductor [A].

    Raises
    ------
    calc.errors.CalcError
        For an unknown system, a negative power, a voltage not above zero or a power factor
        outside (0, 1].

    Notes
    -----
    I = P / (k V pf), k = √3 for balanced three-phase and 1 otherwise (a balanced 120/240 V
    load draws P / (240 V pf) in each line and none in the neutral).

    References
    ----------
    J. D. Glover, M. S. Sarma, T. J. Overbye, Power System Analysis and Design, 5th ed.,
    ch. 2 (balanced three-phase power) — from memory.

    Examples
    --------
    >>> round(load_current("3ph", 50e3, 480.0, 0.9), 2)
    66.82
    """
    if system not in voltage_drop.K_FACTOR:
        known = ", ".join(voltage_drop.K_FACTOR)
        raise CalcError(f"system {system!r} is not one of {known}")
    if not power >= 0.0:
        raise CalcError(f"power must be zero or more, not {power!r} W")
    if not voltage > 0.0:
        raise CalcError(f"voltage must be more than 0 V, not {voltage!r} V")
    if system == "dc":
        power_factor = 1.0
    if not 0.0 < power_factor <= 1.0:
        raise CalcError(f"power factor must lie in (0, 1], not {power_factor!r}")
    k = SQRT3 if system == "3ph" else 1.0
    return power / (k * voltage * power_factor)


def loss_factor(load_factor):
    """Loss factor from load factor by the Buller & Woodrow relation.

    Parameters
    ----------
    load_factor : float
        Average load over peak load during the operating hours, in [0, 1].

    Returns
    -------
    float
        Loss factor: average I²R loss over the loss at peak load, in [0, 1].

    Raises
    ------
    calc.errors.CalcError
        For a load factor outside [0, 1].

    Notes
    -----
    LsF = 0.3 LF + 0.7 LF². It lies between LF² (a flat load) and LF (an on/off load), the
    bounds any load shape obeys.

    References
    ----------
    F. H. Buller and C. A. Woodrow, Electrical World, vol. 92, 1928; T. Gönen, Electric Power
    Distribution System Engineering, 2nd ed., ch. 2 — both from memory.

    Examples
    --------
    >>> round(loss_factor(0.6), 3)
    0.432
    """
    if not 0.0 <= load_factor <= 1.0:
        raise CalcError(f"load factor must lie in [0, 1], not {load_factor!r}")
    linear, square = BULLER_WOODROW
    return linear * load_factor + square * load_factor * load_factor


def annual_loss_energy(peak_loss, operating_time, loss_factor=1.0, no_load_loss=0.0,
                       energised_time=0.0):
    """Energy lost in a year.

    Parameters
    ----------
    peak_loss : float
        Load-dependent (I²R) loss at the given load [W].
    operating_time : float
        Time at load in the year [s].
    loss_factor : float
        Average over peak of the load-dependent loss, in [0, 1]; 1 for a load that runs flat.
    no_load_loss : float
        Loss that does not depend on the load (transformer cores) [W].
    energised_time : float
        Time in the year the no-load loss is drawn [s].

    Returns
    -------
    float
        E = P_peak LsF t_op + P₀ t_en [J].

    Raises
    ------
    calc.errors.CalcError
        For a negative loss or time, or a loss factor outside [0, 1].

    Notes
    -----
    The loss factor is the average I²R loss over the loss at peak, so it turns the peak loss
    into the year's energy; core loss does not depend on the load and counts for every hour
    energised.

    References
    ----------
    T. Gönen, Electric Power Distribution System Engineering, 2nd ed., ch. 2 (loss factor) —
    from memory.

    Examples
    --------
    >>> annual_loss_energy(1000.0, 3600.0 * 4000) / 3.6e6
    4000.0
    """
    if not (peak_loss >= 0.0 and operating_time >= 0.0 and no_load_loss >= 0.0
            and energised_time >= 0.0):
        raise CalcError("losses and times must be zero or more")
    if not 0.0 <= loss_factor <= 1.0:
        raise CalcError(f"loss factor must lie in [0, 1], not {loss_factor!r}")
    return peak_loss * loss_factor * operating_time + no_load_loss * energised_time


def energy_cost(energy, tariff):
    """Cost of energy at a flat tariff.

    Parameters
    ----------
    energy : float
        Energy [J].
    tariff : float
        Price per kWh, in currency units.

    Returns
    -------
    float
        energy / 3.6 MJ × tariff, in currency units.

    Raises
    ------
    calc.errors.CalcError
        For a negative tariff.

    Examples
    --------
    >>> energy_cost(3.6e9, 0.15)
    150.0
    """
    if not tariff >= 0.0:
        raise CalcError(f"the tariff must be zero or more, not {tariff!r}")
    return energy / J_PER_KWH * tariff


def payback_period(extra_cost, annual_saving):
    """Simple payback of an extra first cost from a yearly saving.

    Parameters
    ----------
    extra_cost : float
        Extra installed cost, in currency units (zero or more).
    annual_saving : float
        Saving per year of operation, in currency units.

    Returns
    -------
    float or None
        extra_cost / annual_saving years, expressed in seconds (Julian years); None when the
        saving is zero or negative, or the payback would exceed MAX_PAYBACK_YEARS (it never
        pays back: the division is never taken to infinity).

    Raises
    ------
    calc.errors.CalcError
        For a negative extra cost.

    Notes
    -----
    No discounting, no change of tariff: a simple payback.

    Examples
    --------
    >>> payback_period(1200.0, 300.0) / YEAR_S
    4.0
    """
    if not extra_cost >= 0.0:
        raise CalcError(f"the extra cost must be zero or more, not {extra_cost!r}")
    if not annual_saving > 0.0 or extra_cost > MAX_PAYBACK_YEARS * annual_saving:
        return None
    return extra_cost / annual_saving * YEAR_S


# ---- one option, solved ---------------------------------------------------------------------

class Transformer(NamedTuple):
    """One transformer of the alternative's chain, at the load's apparent power."""

    role: str  # "step-up" or "step-down"
    rating: float  # [VA]
    no_load: float  # [W]
    load_loss_rated: float  # [W] at rating
    load_loss: float  # [W] at this load
    loading: float  # S / S_r


class Option(NamedTuple):
    """One candidate: a run at one voltage with one size, and the year's energy and cost."""

    voltage: float
    size: object  # calc.units.ConductorSize
    current: float  # I = P / (k V pf) [A]
    run: voltage_drop.RunSolution  # constant-current solution (loss, drop)
    loss_cp: float | None  # conductor loss of a constant-power load [W]; None: no steady state
    transformers: tuple  # Transformer, ...
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
    if inputs["load_factor"] is not None and inputs["loss_factor"] is not None:
        raise InputError("loss_factor", inputs["loss_factor"], "give the load factor or the loss "
                         "factor, not both (the loss factor is found from the load factor)")
    sets = inputs["sets"]
    if not float(sets).is_integer():
        raise InputError("sets", sets, f"{sets:g} is not a whole number; enter 1, 2, 3 …")
    if inputs["loss_factor"] is not None:
        lsf = inputs["loss_factor"]
    elif inputs["load_factor"] is not None:
        lsf = loss_factor(inputs["load_factor"])
    else:
        lsf = 1.0
    # I²R of 1 A through 1 Ω in the run's conductors: the number of them that carry the current.
    n_conductors = round(voltage_drop.conductor_loss(system, 1.0, 1.0))
    return _Reading(system, inputs["power"], 1.0 if system == "dc" else inputs["pf"], int(sets),
                    inputs["length"], n_conductors, lsf, inputs["operating_hours"],
                    inputs["energised_hours"], inputs["tariff"])


def _impedance(inputs, size, field):
    """calc.conductors.impedance for `size`; a size error is reported against `field`."""
    frequency = 0.0 if inputs["system"] == "dc" else inputs["frequency_hz"]
    try:
        return conductors.impedance(size, inputs["material"], inputs["conductor_temp_c"],
                                    frequency, inputs["raceway"], None, inputs["method"])
    except InputError as error:
        if error.field == "size":
            raise InputError(field, size.label, error.message) from None
        raise


def _solve_option(reading, voltage, size, z, blame, chain=()):
    """One candidate solved; `blame` is (field, value) for a run that cannot carry the load."""
    r = reading
    current = load_current(r.system, r.power, voltage, r.pf)
    try:
        run = voltage_drop.solve_run(r.system, voltage, r.length, z.r_ac, z.x, r.pf, r.sets,
                                     current=current)
    except voltage_drop.VoltageCollapse as error:
        raise InputError(*blame, f"at {fq(voltage, 'V')} {error}; use a higher voltage, a "
                         "larger size or parallel sets, or a shorter run") from None
    try:
        loss_cp = voltage_drop.solve_run(r.system, voltage, r.length, z.r_ac, z.x, r.pf, r.sets,
                                         power=r.power).loss_w
    except voltage_drop.VoltageCollapse:
        loss_cp = None
    burden = r.power / r.pf  # the load's apparent power [VA]
    # Load loss P_k (S/S_r)²: calc.transformers.efficiency's losses with the core loss left out.
    units = tuple(Transformer(role, rating, no_load, load_loss,
                              transformers.efficiency(rating, 0.0, load_loss, burden / rating,
                                                      r.pf)[2], burden / rating)
                  for role, rating, no_load, load_loss in chain)
    load_dependent = run.loss_w + sum(t.load_loss for t in units)
    no_load = sum(t.no_load for t in units)
    energy = annual_loss_energy(load_dependent, r.operating_time, r.loss_factor, no_load,
                                r.energised_time if units else 0.0)
    return Option(voltage, size, current, run, loss_cp, units, load_dependent + no_load, energy,
                  energy_cost(energy, r.tariff))


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


# ---- the calculator -------------------------------------------------------------------------

def _energy_text(joules):
    """An energy in kWh, MWh or GWh (3 significant figures)."""
    kwh = joules / J_PER_KWH
    for unit, factor in (("GWh", 1e6), ("MWh", 1e3)):
        if abs(kwh) >= factor:
            return f"{fq(kwh / factor, '')} {unit}"
    return f"{fq(kwh, '')} kWh"


def _money(amount):
    """A sum in currency units: whole units from 1000 up, else two decimals."""
    return f"{amount:.0f}" if abs(amount) >= 1000 else f"{amount:.2f}"


def _years(seconds):
    return f"{fq(seconds / YEAR_S, '')} years"


def _line_loss_view(inputs):
    reading = _read(inputs)
    chain = _transformer_chain(inputs)
    size, alt_size = inputs["size"], inputs["alt_size"]
    voltage, alt_voltage = inputs["voltage"], inputs["alt_voltage"]
    z = _impedance(inputs, size, "size")
    first = _solve_option(reading, voltage, size, z, ("voltage", voltage))
    alt = _solve_option(reading, alt_voltage, size, z, ("alt_voltage", alt_voltage), chain)
    upsized = _solve_option(reading, voltage, alt_size, _impedance(inputs, alt_size, "alt_size"),
                            ("alt_size", alt_size.label))
    saving = first.cost - alt.cost
    upsized_saving = first.cost - upsized.cost
    extra_cost = inputs["alt_size_cost"]
    payback = None if extra_cost is None else payback_period(extra_cost, upsized_saving)

    result = Result()
    result.output("current", first.current)
    result.output("alt_current", alt.current)
    result.output("loss_w", first.run.loss_w)
    result.output("alt_loss_w", alt.run.loss_w)
    result.output("loss_ratio", alt.run.loss_w / first.run.loss_w)
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
    result.output("annual_cost", first.cost, _money(first.cost))
    result.output("alt_annual_cost", alt.cost, _money(alt.cost))
    result.output("annual_saving", saving, _money(saving))
    result.output("upsized_loss_w", upsized.run.loss_w)
    result.output("upsized_annual_saving", upsized_saving, _money(upsized_saving))
    if payback is not None:
        result.output("payback", payback, _years(payback))

    _steps(result, inputs, reading, z, first, alt, upsized, extra_cost, payback)
    _checks(result, inputs, first, alt, upsized_saving, extra_cost, payback)
    _describe(result, inputs, chain, max(voltage, alt_voltage))
    result.series = _loss_series(first, alt)
    return result


def _steps(result, inputs, reading, z, first, alt, upsized, extra_cost, payback):
    r, n = reading, reading.n_conductors
    size, length = first.size, r.length
    result.step(f"Conductor: {size.label} {conductors.MATERIAL_NAMES[inputs['material']]} at "
                f"{inputs['conductor_temp_c']:g} °C, {inputs['raceway']} raceway "
                f"(method {inputs['method']}; see the conductor calculator)",
                "r_ac, x per metre of one conductor",
                f"= {z.r_ac * 1e3:.4g} Ω/km, {z.x * 1e3:.4g} Ω/km")
    result.step(f"One conductor of the run ({fq(length, 'm')}, {length / 0.3048:.4g} ft"
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
    result.step("Raising the voltage lowers the current in proportion, and the loss goes with "
                "the current's square", "P_alt / P = (I_alt / I)² = (V / V_alt)²",
                f"= ({fq(first.voltage, 'V')} / {fq(alt.voltage, 'V')})² = "
                f"{(first.voltage / alt.voltage) ** 2:.4g}; {fq(alt.run.loss_w, 'W')} / "
                f"{fq(first.run.loss_w, 'W')} = {alt.run.loss_w / first.run.loss_w:.4g}")
    for unit in alt.transformers:
        result.step(f"{unit.role.capitalize()} transformer, {fq(unit.rating, 'VA')}, loaded "
                    f"to {unit.loading:.0%} by the load's {fq(r.power / r.pf, 'VA')}",
                    "P_T = P₀ + P_k (S / S_r)²",
                    f"= {fq(unit.no_load, 'W')} + {fq(unit.load_loss_rated, 'W')} × "
                    f"{unit.loading:.3g}² = {fq(unit.no_load + unit.load_loss, 'W')}")
    lsf = r.loss_factor
    if inputs["loss_factor"] is not None:
        result.step("Loss factor, as given", "LsF", f"= {lsf:.4g}")
    elif inputs["load_factor"] is not None:
        lf = inputs["load_factor"]
        result.step("Loss factor from the load factor (Buller & Woodrow; the given power is "
                    "the peak)", "LsF = 0.3 LF + 0.7 LF²",
                    f"= 0.3 × {lf:.4g} + 0.7 × {lf:.4g}² = {lsf:.4g}")
    else:
        result.step("Loss factor: the load runs at the given power for all its hours",
                    "LsF = 1", "= 1")
    hours = r.operating_time / 3600.0
    for option in (first, alt):
        v = fq(option.voltage, "V")
        if option.transformers:
            load_part = option.total_loss - sum(t.no_load for t in option.transformers)
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
                f"= {_energy_text(first.energy)} × {r.tariff:g} = {_money(first.cost)}; "
                f"{_energy_text(alt.energy)} × {r.tariff:g} = {_money(alt.cost)} (currency "
                "units a year)")
    result.step(f"Saving a year at {fq(alt.voltage, 'V')}", "ΔC = C − C_alt",
                f"= {_money(first.cost)} − {_money(alt.cost)} = {_money(first.cost - alt.cost)} "
                "currency units")
    upsized_saving = first.cost - upsized.cost
    result.step(f"The larger conductor at {fq(first.voltage, 'V')}: {upsized.size.label}",
                f"P_loss = {n} I² R_larger",
                f"= {n} × ({fq(upsized.current, 'A')})² × {upsized.run.resistance:.4g} Ω = "
                f"{fq(upsized.run.loss_w, 'W')}; {_energy_text(upsized.energy)} a year, saving "
                f"{_money(upsized_saving)} currency units a year")
    if extra_cost is not None:
        shown = (_years(payback) if payback is not None else "never (no saving)"
                 if upsized_saving <= 0 else f"more than {MAX_PAYBACK_YEARS:g} years")
        result.step("Simple payback of the larger conductor", "t = extra cost / annual saving",
                    f"= {_money(extra_cost)} / {_money(upsized_saving)} a year = {shown}")


def _checks(result, inputs, first, alt, upsized_saving, extra_cost, payback):
    limit = inputs["max_drop_pct"]
    for name, option in (("drop_limit", first), ("alt_drop_limit", alt)):
        ok = option.run.drop_pct <= limit
        result.check(name, "pass" if ok else "fail",
                     f"At {fq(option.voltage, 'V')} the drop is {option.run.drop_pct:.3g} %, "
                     f"{'within' if ok else 'over'} the {limit:g} % limit (a recommendation; "
                     "local code may differ).")
    saving = first.cost - alt.cost
    better = (f"{fq(alt.voltage, 'V')} saves {_money(saving)} currency units a year over "
              f"{fq(first.voltage, 'V')}")
    if saving <= 0:
        cause = (" the transformers' losses outweigh the conductor saving" if alt.transformers
                 else " its conductor loss is no lower")
        more = f" ({_money(abs(saving))} currency units a year more)" if saving < 0 else ""
        better = (f"{fq(alt.voltage, 'V')} saves nothing over {fq(first.voltage, 'V')}{more}:"
                  f"{cause}")
    result.check("alt_voltage_saving", "pass" if saving > 0 else "warn", better + ".")
    _load_model_check(result, first, alt)
    for unit in alt.transformers:
        _transformer_checks(result, unit)
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


def _load_model_check(result, first, alt):
    parts, status = [], "pass"
    for option in (first, alt):
        if option.loss_cp is None:
            status = "warn"
            parts.append(f"at {fq(option.voltage, 'V')} a constant-power load of this size "
                         "could not be supplied over this run (no steady voltage)")
            continue
        more = option.loss_cp / option.run.loss_w - 1.0
        if more > LOAD_MODEL_WARN:
            status = "warn"
        parts.append(f"at {fq(option.voltage, 'V')} {fq(option.loss_cp, 'W')} ({more:+.1%})")
    result.check("load_model", status,
                 "Losses are for a load drawing its current at nominal voltage. A "
                 "constant-power load (motors, drives) draws more as the voltage sags: "
                 + "; ".join(parts) + f" (warn beyond {LOAD_MODEL_WARN:.0%}).")


def _transformer_checks(result, unit):
    name = unit.role.replace("-", "_")
    if unit.loading > 1.0:
        result.check(f"{name}_loading", "warn",
                     f"The {unit.role} transformer is loaded to {unit.loading:.0%} of its "
                     f"{fq(unit.rating, 'VA')} rating; choose a larger unit (its load loss and "
                     "temperature rise are past rated).")
    share = (unit.no_load + unit.load_loss_rated) / unit.rating
    if share > TRANSFORMER_LOSS_SANITY:
        result.check(f"{name}_losses", "warn",
                     f"The {unit.role} transformer's losses at rated load are {share:.1%} of "
                     f"its rating; distribution transformers lose about 0.5 to 2 % (common "
                     "practice). Check the figures are in W, not %.")


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
    result.sources += [
        "I = P / (√3 V pf) and P_loss = 3 I² R: Glover, Sarma & Overbye, Power System Analysis "
        "and Design, 5th ed., ch. 2 and ch. 5 — from memory.",
        "LsF = 0.3 LF + 0.7 LF²: F. H. Buller and C. A. Woodrow, Electrical World, vol. 92, "
        "1928, as quoted by T. Gönen, Electric Power Distribution System Engineering, 2nd ed., "
        "ch. 2 — from memory.",
        "Transformer losses P₀ + P_k (S/S_r)²: IEC 60076-1 definitions of no-load and load "
        "loss; S. J. Chapman, Electric Machinery Fundamentals, 5th ed., section 2.7 — from "
        "memory.",
        voltage_drop.FORMULA_SOURCE,
        voltage_drop.LIMIT_SOURCE,
        "Conductor data: see the conductor calculator (NEC Chapter 9 Tables 8 and 9, IEC 60228, "
        "IEC 60287-1-1).",
    ]
    result.cautions += [
        "Loss and drop only: ampacity, insulation and terminal temperature ratings, derating "
        "and overcurrent protection are NOT checked here.",
        "A higher distribution voltage changes the equipment's ratings, the shock and arc-flash "
        "hazard, the labelling and who may work on it; have the change designed and reviewed "
        "by a qualified person.",
        "Costs are estimates: demand charges, tariff changes and the value of money over time "
        "are not included.",
    ]
    if chain:
        result.cautions.append(cautions.BACKFEED)
    if highest_voltage > 1000.0:
        result.cautions.append(cautions.MEDIUM_VOLTAGE)
    result.cautions += list(cautions.COMMON)


def _loss_series(first, alt):
    """Loss against load, 0 to 125 % of the given, at both voltages (I²R goes with load²)."""
    loads = [5.0 * k for k in range(26)]
    lines = [
        {"label": f"At {fq(first.voltage, 'V')}", "unit": "W",
         "values": [first.run.loss_w * (p / 100) ** 2 for p in loads]},
        {"label": f"At {fq(alt.voltage, 'V')}, conductors", "unit": "W",
         "values": [alt.run.loss_w * (p / 100) ** 2 for p in loads]},
    ]
    if alt.transformers:
        lines.append({"label": f"At {fq(alt.voltage, 'V')}, with transformers", "unit": "W",
                      "values": [alt.run.loss_w * (p / 100) ** 2
                                 + sum(t.no_load + t.load_loss * (p / 100) ** 2
                                       for t in alt.transformers) for p in loads]})
    return {
        "title": "Loss against load at both voltages",
        "x": {"label": "Load", "unit": "%", "values": loads},
        "y_axis": {"label": "Loss", "unit": "W"},
        "y": lines,
        "marks": [{"axis": "x", "value": 100.0, "label": "Given load"}],
    }


# ---- the spec -------------------------------------------------------------------------------

def _shared(source, **changes):
    """The voltage-drop calculator's input `source`, reused here with the changes given."""
    return dataclasses.replace(voltage_drop.VOLTAGE_DROP.input(source), **changes)


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


LINE_LOSS = Calculator(
    id="line-loss",
    title="Line losses at two voltages",
    summary="Current, I²R loss, a year's energy and cost of one run at two candidate voltages "
            "(with an optional step-up / step-down pair), and the payback of a larger conductor.",
    group="Conductors",
    inputs=(
        _shared("system", default="3ph"),
        _shared("power", label="Load power", default=50, optional=False, advanced=False,
                help="Real power the load draws, kW or hp of input (the peak, if you give a "
                     "load factor)."),
        _shared("pf"),
        _shared("voltage", label="Voltage", default=208, region_defaults={"iec": 400},
                help="The first candidate; line-to-line for three-phase, 240 V for 120/240 V."),
        _shared("voltage", name="alt_voltage", label="Alternative voltage", default=480,
                region_defaults={"iec": 690},
                help="The second candidate, e.g. 480 V where the first is 208 V or 240 V."),
        _shared("length", default="250 ft", region_defaults={"iec": "80 m"}),
        _shared("size", default="1/0", region_defaults={"iec": "50 mm²"}),
        _shared("material"),
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
                   "Buller & Woodrow. Blank: the load runs flat."),
        Input("loss_factor", "Loss factor (instead of load factor)", "quantity", unit="",
              optional=True, minimum=0, min_exclusive=True, maximum=1, advanced=True,
              help="Average over peak I²R loss, if known from metering."),
        *_transformer_inputs("step_up", "step-up", "at the source, from the first voltage up"),
        *_transformer_inputs("step_down", "step-down", "at the load, back down"),
        Input("energised_hours", "Transformer hours energised per year", "quantity", unit="h",
              default=8760, minimum=0, maximum=HOURS_IN_LEAP_YEAR, advanced=True,
              help="Their no-load loss runs this long (8760 h: never switched off)."),
        _shared("max_drop_pct"),
        _shared("conductor_temp_c"),
        _shared("raceway"),
        _shared("sets"),
        _shared("frequency_hz"),
        _shared("method"),
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
    compute=_line_loss_view,
)
