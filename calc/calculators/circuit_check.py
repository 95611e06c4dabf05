"""circuit-check: is this branch circuit or feeder right, end to end?

One circuit, every check it needs, each with its clause: the conductor's ampacity against the
load (×1.25 when continuous), the overcurrent device against the conductor (NEC 240.4 with the
next-size-up and small-conductor rules, or IEC 60364-4-43 433.1), the voltage drop, whether a
fault to the case operates the device quickly (NEC 250.4(A)(5), or IEC 60364-4-41), the
equipment grounding (protective) conductor (NEC Table 250.122 with 250.122(B), or
IEC 60364-5-54), and for a motor its branch (NEC 430.22, 430.32, Table 430.52). The output
`verdict` is the worst status, `governing` the check that set it, and `fix` what would mend it.
"""

from calc import ampacity, cautions, protection, units
from calc import induction_motors as im
from calc.calculators import _circuit as cc
from calc.calculators._conductors import (
    LIMIT_SOURCE,
    PLAUSIBLE_CURRENT_MULTIPLE,
    RunReading,
    conductor_fields,
    drop_reason,
    read_run,
    solve_length,
    supply_reasons,
)
from calc.calculators._plausibility import CHECK_NAME, outside, plausibility
from calc.calculators._protection import require_table_conductor
from calc.calculators.ground_fault_trip import SOURCES_NEC as GROUND_SOURCES_NEC
from calc.calculators.ground_fault_trip import ZE_USUAL_OHM
from calc.errors import InputError, VoltageCollapse, field_error
from calc.spec import Calculator, Input, Output, Result

fq = cc.fq
STATUS_RANK = {"pass": 0, "warn": 1, "fail": 2}
# The order checks are listed, and the order that settles a tie between equal statuses.
CHECK_ORDER = ("ampacity", "overcurrent", "voltage_drop", "fault_clearing", "egc_size",
               "motor_branch", CHECK_NAME)
# Conductor temperature for the voltage drop: the voltage-drop calculator's defaults, 75 °C
# (NEC Chapter 9 Table 9's basis) and 80 °C (IEC 60364-5-52 Annex G's ρ1 = 1.25 ρ20).
DROP_TEMPERATURE_C = {"nec": 75.0, "iec": 80.0}
# The quickest an instantaneous trip or a quickly melting fuse clears: IEC 60898-1's 0.1 s test
# (protection.INSTANTANEOUS_TEST_TIME_S), the time the adiabatic check of the protective
# conductor takes.
CLEARING_TIME_S = protection.INSTANTANEOUS_TEST_TIME_S
STARTING = tuple(item for item in im.STARTING_METHODS if item[0] != "reactor")
MOTOR_DESIGNS = (("standard", "Squirrel cage other than Design B energy-efficient; single-phase"),
                 ("design-b-ee", "Design B energy-efficient"), ("wound-rotor", "Wound rotor"))
SERVICE_FACTORS = (("1.15", "1.15 or more (or a 40 °C rise): overload at 125 %"),
                   ("1.0", "Other motors: overload at 115 %"))
CIRCUITS = (("final", "Final circuit (IEC Table 41.1 time)"),
            ("distribution", "Distribution circuit (5 s)"))

SOURCE_OCPD_NEC = (
    "NEC 240.4(B), (C), (D), (G) and 240.6(A): read, as reproduced (NEC 2017 text, repository "
    "mjk83093/sil); a device carries a continuous load at 125 %, 210.20(A) / 215.3 (from memory).")
SOURCE_MOTOR = (
    "NEC 430.22 (125 % conductor), 430.32(A)(1) (overload 125 % / 115 %), Table 430.52 and "
    "430.52(C)(1) Exception No. 1, 430.52(B) (carry the starting current), 240.4(G): read, as "
    "reproduced (NEC 2017 text, mjk83093/sil NEC2017_Chapter_4.md); full-load currents from "
    "Tables 430.248 / 430.250 (see the motor-current calculator).")
SOURCES_IEC = (
    "IEC 60364-4-43 433.1: Ib ≤ In ≤ Iz and I2 ≤ 1.45 Iz (from memory); I2 = 1.45 In for "
    "IEC 60898-1 MCBs (read), 1.30 In for IEC 60947-2 breakers and 1.6 In for gG fuses (from "
    "memory).",
    "IEC 60364-4-41: Zs × Ia ≤ U0 (411.4.4) within the Table 41.1 time (read, as quoted at "
    "ericmark.talktalk.net/41-1.html); IEC 60364-5-54 Table 54.2 and 543.1.2 (from memory).",
)
ASSUMPTIONS = (
    "The load is at the far end of the run; the supply holds its nominal voltage at the panel.",
    "The fault path: Ze (or the panel's available line-to-ground fault current, Ze = U0 / I) "
    "plus the line and grounding conductors at the insulation's rated temperature, added "
    "arithmetically; only the device's instantaneous (magnetic) region is credited.",
    "Solidly grounded (TN) system: the fault returns on the grounding conductor, not through "
    "the earth.",
)
CAUTION_SCOPE = (
    "A calculated check, not an inspection: measure the loop impedance and insulation "
    "resistance, and read the equipment's listing and the maker's curves, as your rules require.")


def _amps(value):
    """A device rating or limit: whole amperes as the device is marked ("40 A"), else 3 figures."""
    return f"{value:g} A" if float(value).is_integer() else fq(value, "A")


def _out(result, name, value, unit):
    """An output with its display worked by the fast formatter."""
    result.output(name, value, fq(value, unit))


def _reading(inputs):
    """The load as calc.calculators._conductors reads a run: current, motor basis, errors on the
    load fields (a current alone needs no reading)."""
    system = inputs["system"]
    if inputs.get("current") is not None and all(
            inputs.get(name) is None for name in ("power", "kva", "motor_power")):
        return RunReading(cc.DROP_SYSTEM[system], inputs["voltage"], inputs["pf"], 1,
                          inputs["current"], None, 0.0)
    shim = _RunInputs(system=cc.DROP_SYSTEM[system], voltage=inputs["voltage"], pf=inputs["pf"],
                      sets=1, neutral_a=None, current=inputs.get("current"),
                      power=inputs.get("power"), kva=inputs.get("kva"),
                      motor_power=inputs.get("motor_power"), motor_efficiency=None)
    shim.typed_units = getattr(inputs, "typed_units", {})
    return read_run(shim)


class _RunInputs(dict):
    """The inputs of a run as _conductors reads them (a dict that knows the units typed)."""

    typed_units = {}

    def __init__(self, **values):
        super().__init__(values)


def _drop(inputs, size, current, temperature):
    """The RunSolution of the run with `size` carrying `current` (the voltage-drop
    calculators' exact method, with the conductor's impedance remembered)."""
    system = cc.DROP_SYSTEM[inputs["system"]]
    reading = RunReading(system, inputs["voltage"], inputs["pf"], 1, current, None, 0.0)
    with conductor_fields():
        z = cc.impedance(size, inputs["material"], temperature, inputs["frequency_hz"],
                         inputs["raceway"], None, "table")
    try:
        return solve_length(reading, z, inputs["length"])
    except VoltageCollapse as error:
        raise InputError("length", inputs["length"], f"{error}; shorten the run, use a larger "
                         "size or a higher voltage") from None


class _Judged:
    """The checks as they are found: (name, status, message, utilisation, fix)."""

    def __init__(self):
        self.items = []

    def add(self, name, status, message, utilisation=0.0, fix=""):
        self.items.append((name, status, message, utilisation, fix))

    def verdict(self):
        """(worst status, governing check, its fix): the worst status, ties to the check with
        the highest utilisation (load over limit), then to the order of CHECK_ORDER."""
        worst = max(STATUS_RANK[item[1]] for item in self.items)
        candidates = [item for item in self.items if STATUS_RANK[item[1]] == worst]
        chosen = max(candidates, key=lambda item: (item[3], -CHECK_ORDER.index(item[0])))
        return chosen[1], chosen[0], chosen[4]


def _count(inputs, system, iec):
    """NEC current-carrying conductors (or IEC loaded conductors) of the circuit."""
    given = inputs.get("current_carrying")
    if given is not None:
        return cc.whole(inputs, "current_carrying", given)
    return 3 if system == "3ph" else 2


def _fix_size(inputs, size, material, works, why):
    """Words naming the smallest larger size for which `works` holds, or saying none does."""
    bigger = cc.first_size(size, material, works)
    if bigger is None or bigger.label == size.label:
        return f"no standard {units.SYSTEM_NAMES[size.system]} size up to the largest meets {why}"
    return f"use {bigger.label}, the smallest size {why}"


# ---- the checks -------------------------------------------------------------------------------

def _ampacity_check(judged, c, amp):
    need, iz = c.required, amp.ampacity_a
    ok = need <= iz * (1 + 1e-9)
    if c.iec:
        message = (f"Ib = {fq(need, 'A')} {'≤' if ok else '>'} Iz = {fq(iz, 'A')} of "
                   f"{c.size.label} ({amp.table}, after ambient and grouping).")
    else:
        limit = (f"its {amp.terminal_c} °C terminals allow {fq(amp.terminal_a, 'A')}"
                 if amp.terminal_a < amp.corrected_a else "after ambient and grouping")
        message = (f"{c.required_basis} {fq(need, 'A')}; {c.size.label} carries {fq(iz, 'A')} "
                   f"({amp.table}: {fq(amp.table_a, 'A')}, corrected {fq(amp.corrected_a, 'A')}; "
                   f"{limit}).")
    fix = ""
    if not ok:
        fix = _fix_size(c.inputs, c.size, c.material,
                        lambda s: cc.conductor_ampacity(c.inputs, s, c.count, c.count)
                        .ampacity_a >= need, f"with ampacity for {fq(need, 'A')}")
        message += f" Too small: {fix}."
    judged.add("ampacity", "pass" if ok else "fail", message, need / iz, fix)


def _nec_overcurrent(judged, c, amp):
    rating, load = c.device.rating_a, c.current
    largest = ampacity.largest_device(amp.ampacity_a, amp.small_limit_a)
    need = ampacity.CONTINUOUS_LOAD_FACTOR * load if c.continuous else load
    problems, fix = [], ""
    if rating < need * (1 - 1e-9):
        problems.append(f"the {_amps(rating)} device is below the {fq(need, 'A')} it must carry"
                        + (" (125 % of a continuous load, 210.20(A))" if c.continuous else ""))
        fix = f"use a device of at least {_amps(ampacity.next_standard_rating(need) or need)}"
    if rating > largest * (1 + 1e-9):
        rule = ("240.4(D)" if amp.small_limit_a is not None and largest >= amp.small_limit_a
                else "240.4(B)" if largest <= ampacity.NEXT_SIZE_UP_LIMIT_A else "240.4(C)")
        problems.append(f"the {_amps(rating)} device is above the {_amps(largest)} the "
                        f"{c.size.label} conductor allows ({rule})")
        bigger = cc.first_size(c.size, c.material, lambda s: ampacity.largest_device(
            cc.conductor_ampacity(c.inputs, s, c.count).ampacity_a,
            ampacity.nec_ampacity(s, c.material, 90, 30, 1).small_conductor_a
            if s.system != "mm2" else None) >= rating)
        fix = (f"use a {_amps(largest)} device" if largest >= need else "") + (
            f"{' or ' if largest >= need else 'use '}{bigger.label} conductors"
            if bigger is not None else "")
    where = ("next standard rating above the ampacity, 240.4(B)"
             if amp.ampacity_a < rating <= largest else "240.4")
    if problems:
        message = "NEC 240.4: " + "; ".join(problems) + (f". Fix: {fix}." if fix else ".")
        judged.add("overcurrent", "fail", message, rating / largest, fix)
    else:
        judged.add("overcurrent", "pass",
                   f"The {_amps(rating)} device protects {c.size.label} (largest allowed "
                   f"{_amps(largest)}, {where}) and carries the {fq(need, 'A')} load.",
                   rating / largest)


def _iec_overcurrent(judged, c, amp):
    rating, ib, iz = c.device.rating_a, c.current, amp.ampacity_a
    family, k2 = cc.conventional_multiple(c.device_type)
    i2 = k2 * rating
    limit = ampacity.CONVENTIONAL_LIMIT * iz
    problems = []
    if ib > rating * (1 + 1e-9):
        problems.append(f"Ib = {fq(ib, 'A')} is above In = {_amps(rating)}")
    if rating > iz * (1 + 1e-9):
        problems.append(f"In = {_amps(rating)} is above Iz = {fq(iz, 'A')}")
    if i2 > limit * (1 + 1e-9):
        problems.append(f"I2 = {k2:g} × In = {fq(i2, 'A')} is above 1.45 Iz = {fq(limit, 'A')}")
    utilisation = max(rating / iz, i2 / limit)
    if not problems:
        judged.add("overcurrent", "pass",
                   f"IEC 60364-4-43 433.1: Ib {fq(ib, 'A')} ≤ In {_amps(rating)} ≤ Iz "
                   f"{fq(iz, 'A')}, and I2 {fq(i2, 'A')} ({family}, {k2:g} In) ≤ 1.45 Iz.",
                   utilisation)
        return
    need = max(rating, i2 / ampacity.CONVENTIONAL_LIMIT)
    fix = _fix_size(c.inputs, c.size, c.material,
                    lambda s: cc.conductor_ampacity(c.inputs, s, c.count, c.count)
                    .ampacity_a >= need, f"with Iz of {fq(need, 'A')} for this device")
    if ib > rating:
        fix = f"use a device rated at least {fq(ib, 'A')} with conductors to match"
    judged.add("overcurrent", "fail", "IEC 60364-4-43 433.1: " + "; ".join(problems)
               + f". Fix: {fix}.", utilisation, fix)


def _drop_check(judged, c, result):
    temperature = DROP_TEMPERATURE_C[c.inputs["practice"]]
    run = _drop(c.inputs, c.size, c.current, temperature)
    limit = c.inputs["max_drop_pct"]
    drop = run.limit_drop_pct
    _out(result, "drop_pct", drop, "%")
    _out(result, "end_v", run.end_v, "V")
    leg = " (heavier leg to neutral)" if c.system == "1ph3w" else ""
    result.step(f"Voltage drop of {fq(c.current, 'A')} over {fq(c.inputs['length'], 'm')} of "
                f"{c.size.label}{leg} at {temperature:g} °C, exact phasor solution "
                "(see the voltage-drop calculator)", "drop %",
                f"= {drop:.3g} % (load end {fq(run.end_v, 'V')})")
    ok = drop <= limit
    fix = ""
    message = (f"The drop is {drop:.3g} %, {'within' if ok else 'over'} the {limit:g} % limit "
               "(a recommendation; local rules may differ).")
    if not ok:
        fix = _fix_size(c.inputs, c.size, c.material,
                        lambda s: _drop(c.inputs, s, c.current, temperature).limit_drop_pct
                        <= limit, f"that keeps the drop within {limit:g} %")
        message += f" Fix: {fix}, or shorten the run."
    judged.add("voltage_drop", "pass" if ok else "fail", message, drop / limit, fix)


def _fault_check(judged, c, result):
    inputs = c.inputs
    require_table_conductor("size", c.size, c.material)
    require_table_conductor("egc_size", c.egc, c.material)
    temperature = c.insulation_c
    z_m = cc.loop_impedance_per_metre(c.size, c.egc, c.material, temperature,
                                      inputs["frequency_hz"])
    ze = c.ze
    zs = protection.earth_fault_loop_impedance(ze, z_m, inputs["length"])
    clearing = protection.instantaneous_clearing(c.u0, zs, c.device)
    fault, ia = clearing.fault_a, clearing.required_a
    longest = protection.max_length_for_disconnection(c.u0, ze, z_m, ia)
    _out(result, "zs", zs, "ohm")
    _out(result, "far_end_fault_a", fault, "A")
    _out(result, "ia", ia, "A")
    result.step(f"Fault loop: Ze {c.ze_basis} plus line ({c.size.label}) and grounding "
                f"conductor ({c.egc.label}) at {temperature:g} °C", "Zs = Ze + |z| L",
                f"= {fq(ze, 'ohm')} + {fq(abs(z_m), 'ohm/m')} × {fq(inputs['length'], 'm')} = "
                f"{fq(zs, 'ohm')}")
    result.step(f"Fault current at the far end against the current that surely operates the "
                f"{c.device.code} quickly", "I_f = U0 / Zs ≥ Ia",
                f"{fq(c.u0, 'V')} / {fq(zs, 'ohm')} = {fq(fault, 'A')} "
                f"{'≥' if clearing.clears else '<'} {fq(ia, 'A')}")
    if c.iec:
        time = protection.disconnection_time(c.u0, inputs["circuit_type"])
        basis = (f"IEC 60364-4-41 411.4.4: Zs × Ia = {fq(zs * ia, 'V')} "
                 f"{'≤' if clearing.clears else '>'} U0 = {fq(c.u0, 'V')}, so the "
                 f"instantaneous region opens well inside the {fq(time, 's')} required"
                 if clearing.clears else
                 f"IEC 60364-4-41 411.4.4: Zs × Ia = {fq(zs * ia, 'V')} > U0 = {fq(c.u0, 'V')}")
    else:
        basis = (f"Effective ground-fault current path (NEC 250.4(A)(5)): {fq(fault, 'A')} at the "
                 f"far end {'reaches' if clearing.clears else 'is below'} the {fq(ia, 'A')} "
                 "that surely operates the instantaneous trip")
    if clearing.clears:
        judged.add("fault_clearing", "pass", f"{basis} (margin {clearing.margin:.3g} ×).",
                   1 / clearing.margin)
        return fault
    fix = (f"shorten the run to {fq(longest, 'm')}, enlarge the grounding conductor, or choose "
           "a device with a lower instantaneous trip" if longest > 0 else
           "Ze alone is too high for this device: choose one with a lower instantaneous trip, "
           "or add ground-fault protection (RCD / GFCI)")
    judged.add("fault_clearing", "fail", f"{basis}. Fix: {fix}.", 1 / clearing.margin, fix)
    return fault


def _egc_check(judged, c, amp, fault):
    egc, size = c.egc, c.size
    if c.iec:
        table_area = ampacity.iec_protective_minimum(size.area_m2)
        adiabatic = ampacity.adiabatic_minimum(fault, CLEARING_TIME_S, c.material,
                                               cc.IEC_INSULATIONS[int(c.insulation_c)])
        need = min(table_area, max(adiabatic, 0.0))
        if egc.area_m2 >= table_area * (1 - 1e-9):
            status, words = "pass", f"no smaller than the {fq(table_area, 'm2')} of Table 54.2"
        elif egc.area_m2 >= adiabatic:
            status, words = "pass", (f"smaller than Table 54.2's {fq(table_area, 'm2')} but "
                                     f"above the adiabatic {fq(adiabatic, 'm2')} (543.1.2, "
                                     f"{fq(fault, 'A')} for {CLEARING_TIME_S:g} s)")
        else:
            status, words = "fail", (f"below both Table 54.2's {fq(table_area, 'm2')} and the "
                                     f"adiabatic {fq(adiabatic, 'm2')} (543.1.2)")
        result_area = table_area
        fix = "" if status == "pass" else (
            f"use a {cc.area_to_size(min(table_area, size.area_m2), size, c.material).label} "
            "protective conductor")
        judged.add("egc_size", status, f"IEC 60364-5-54: the protective conductor "
                   f"({egc.label}) is {words}." + (f" Fix: {fix}." if fix else ""),
                   need / egc.area_m2, fix)
        return result_area
    minimum = cc.egc_minimum_size(c.device.rating_a, c.material)
    if minimum is None:
        judged.add("egc_size", "warn", "The device is above NEC Table 250.122's last row; size "
                   "the grounding conductor by engineering.", 0.0)
        return None
    label, table_area = minimum
    need, upsized = table_area, ""
    smallest = _minimum_size(c)
    if smallest is not None and size.area_m2 > smallest.area_m2 * 1.0001:
        need = ampacity.proportional_egc(table_area, size.area_m2, smallest.area_m2)
        upsized = (f"; the conductors were upsized from {smallest.label}, so 250.122(B) raises "
                   f"it in proportion to {fq(need, 'm2')}")
    capped = need > size.area_m2
    need = min(need, size.area_m2)  # 250.122(A): never larger than the circuit conductors
    ok = egc.area_m2 >= need * (1 - 1e-9)
    if ok:
        words = (f"; the EGC is {egc.label}, as large as the circuit conductors, which "
                 "250.122(A) accepts" if capped or egc.area_m2 < table_area * (1 - 1e-9)
                 else f"; the EGC is {egc.label}")
        fix = ""
    else:
        needed = cc.area_to_size(need, size, c.material)
        fix = f"use at least {needed.label if needed else label} for the EGC"
        words = f"; the EGC is {egc.label}, too small. Fix: {fix}"
    judged.add("egc_size", "pass" if ok else "fail",
               f"NEC Table 250.122 asks {label} behind a {_amps(c.device.rating_a)} device"
               f"{upsized}{words}.", need / egc.area_m2, fix)
    return need


def _minimum_size(c):
    """The smallest size with ampacity for this installation (250.122(B)'s measure), or None
    when the size itself is the smallest (the size just below it does not fit)."""
    key = "mm2" if c.size.system == "mm2" else "awg"
    family = units.METRIC_SIZES if key == "mm2" else units.AWG_SIZES + units.KCMIL_SIZES
    index, first = family.index(c.size.label), family.index(cc.SMALLEST_POWER_SIZE[key])
    if index <= first or not _safe_fits(c, units.CONDUCTOR_SIZES[family[index - 1]]):
        return None
    return cc.first_size(units.CONDUCTOR_SIZES[family[first]], c.material, lambda s: _fits(c, s))


def _safe_fits(c, size):
    try:
        return _fits(c, size)
    except InputError:
        return False


def _fits(c, size):
    """Whether `size` would pass the ampacity and 240.4 checks with this device (the minimum
    size 250.122(B) measures upsizing from)."""
    amp = cc.conductor_ampacity(c.inputs, size, c.count)
    largest = ampacity.largest_device(amp.ampacity_a, amp.small_limit_a)
    return amp.ampacity_a >= c.required * (1 - 1e-9) and (
        c.motor or largest >= c.device.rating_a * (1 - 1e-9))


def _motor_device(judged, c):
    """Overcurrent of a motor branch: NEC 240.4(G) sends it to Table 430.52."""
    device_type = "inverse-time" if c.device_type.startswith("mcb-") else c.device_type
    design = c.inputs["motor_design"]
    with field_error("motor_design"):
        pct, value, allowed = ampacity.motor_device_limit(c.flc, device_type, design)
    setting = c.device.rating_a
    if allowed is None:  # above the largest standard rating: the percentage itself
        allowed = value
    if device_type == "instantaneous":
        setting = c.device.rating_a * (c.device.operating_multiple + c.device.lowest_multiple) / 2
        allowed = value
    ok = setting <= allowed * (1 + 1e-9)
    what = "setting" if device_type == "instantaneous" else "rating"
    rounded = ("" if device_type == "instantaneous" or allowed == value else
               f", rounded up to the next standard {fq(allowed, 'A')} (430.52(C)(1) Exc. 1)")
    message = (f"NEC 240.4(G) sends motor circuits to Article 430: Table 430.52 allows {pct} % "
               f"of {fq(c.flc, 'A')} = {fq(value, 'A')}{rounded}; the device's {what} is "
               f"{fq(setting, 'A')}.")
    fix = "" if ok else f"use a device {what} of at most {fq(allowed, 'A')}"
    judged.add("overcurrent", "pass" if ok else "fail",
               message + (f" Fix: {fix}." if fix else ""), setting / allowed, fix)
    return allowed


def _motor_check(judged, c, amp, result):
    inputs = c.inputs
    nameplate = inputs.get("nameplate_a") or c.flc
    with field_error("service_factor"):
        overload_max = ampacity.overload_limit(nameplate, inputs["service_factor"])
    _out(result, "overload_max_a", overload_max, "A")
    parts, status, fixes = [], "pass", []
    need = ampacity.MOTOR_CONDUCTOR_FACTOR * c.flc
    if amp.ampacity_a >= need * (1 - 1e-9):
        parts.append(f"conductors {fq(amp.ampacity_a, 'A')} ≥ 125 % of {fq(c.flc, 'A')} = "
                     f"{fq(need, 'A')} (430.22)")
    else:
        status = "fail"
        parts.append(f"conductors {fq(amp.ampacity_a, 'A')} < 125 % of {fq(c.flc, 'A')} = "
                     f"{fq(need, 'A')} (430.22)")
    overload = inputs.get("overload_a")
    basis = "nameplate" if inputs.get("nameplate_a") else "table full-load current"
    if overload is None:
        parts.append(f"set the overload at no more than {fq(overload_max, 'A')} "
                     f"({inputs['service_factor']} service factor, 430.32(A)(1), {basis})")
    elif overload <= overload_max * (1 + 1e-9):
        parts.append(f"overload {fq(overload, 'A')} ≤ {fq(overload_max, 'A')} (430.32(A)(1))")
    else:
        status = "fail"
        parts.append(f"overload {fq(overload, 'A')} > {fq(overload_max, 'A')} (430.32(A)(1))")
        fixes.append(f"set the overload at no more than {fq(overload_max, 'A')}")
    starting = _starting_current(c)
    if starting is not None and not c.device_type.startswith("fuse"):
        pickup = c.device.lowest_multiple * c.device.rating_a
        if pickup <= starting:
            status = "warn" if status == "pass" else status
            parts.append(f"the instantaneous trip may pick up at {fq(pickup, 'A')}, below the "
                         f"{fq(starting, 'A')} starting current (code letter, "
                         f"{dict(STARTING)[inputs['starting']].lower()}): it may trip on "
                         "starting (430.52(B))")
            fixes.append("raise the instantaneous setting within Table 430.52")
        else:
            parts.append(f"starting current {fq(starting, 'A')} below the lowest instantaneous "
                         f"pickup {fq(pickup, 'A')} (430.52(B))")
    fix = "; ".join(fixes) if status != "pass" and fixes else (
        _fix_size(inputs, c.size, c.material, lambda s: cc.conductor_ampacity(
            inputs, s, c.count).ampacity_a >= need, "with 125 % of the full-load current "
            "(430.22)") if status == "fail" else "")
    judged.add("motor_branch", status, "Motor branch: " + "; ".join(parts) + ".",
               need / amp.ampacity_a, fix)


def _starting_current(c):
    """The motor's line current while starting [A], from its code letter, or None."""
    letter = c.inputs.get("code_letter")
    if not letter:
        return None
    phases = 3 if c.system == "3ph" else 1
    with field_error("code_letter"):
        low, high = im.code_letter_currents(letter.upper(), c.inputs["motor_power"],
                                            c.inputs["voltage"], phases)
        return im.starting_current(c.inputs["starting"], high or low, c.flc).line


def _check_code_letter(text):
    """The code_letter field's check (blank is allowed: no letter known)."""
    with field_error("code_letter"):
        im.code_letter_range(text.upper())


def _plausibility_check(judged, c, amp, run_drop):
    reasons = [_current_reason(c, amp),
               *supply_reasons(cc.DROP_SYSTEM[c.system], c.inputs["voltage"], c.inputs["pf"],
                               c.inputs["length"]), drop_reason(run_drop)]
    if outside(c.ze, *ZE_USUAL_OHM):
        reasons.append(f"Ze = {fq(c.ze, 'ohm')} is outside the {fq(ZE_USUAL_OHM[0], 'ohm')} to "
                       f"{fq(ZE_USUAL_OHM[1], 'ohm')} of real grounded supplies (see "
                       "ground-fault-trip)")
    probe = _Probe()
    plausibility(probe, [r for r in reasons if r])
    (item,) = probe.checks
    judged.add(CHECK_NAME, item["status"], item["message"], 0.0)


def _current_reason(c, amp):
    """A plausibility reason when the load is far above any ampacity of the size: over
    PLAUSIBLE_CURRENT_MULTIPLE × its table value at its own insulation rating (the voltage-drop
    calculators' rule, there against the NEC 90 °C column)."""
    if c.current <= PLAUSIBLE_CURRENT_MULTIPLE * amp.table_a:
        return None
    return (f"{fq(c.current, 'A')} in {c.size.label} is over {PLAUSIBLE_CURRENT_MULTIPLE:g} × its "
            f"table ampacity ({fq(amp.table_a, 'A')}): a real circuit would burn; check the "
            "load and the size")


class _Probe:
    """Collects the plausibility check before it joins the others in order."""

    def __init__(self):
        self.checks = []

    def check(self, name, status, message):
        self.checks.append({"name": name, "status": status, "message": message})


# ---- the view ---------------------------------------------------------------------------------

class _Circuit:
    """The circuit as read from its inputs."""

    def __init__(self, inputs):
        self.inputs = inputs
        self.iec = inputs["practice"] == "iec"
        self.system = inputs["system"]
        self.u0 = inputs["voltage"] * cc.U0_PER_VOLT[self.system]
        reading = _reading(inputs)
        self.current = reading.current
        self.motor = reading.current_from == "motor_power"
        self.flc = reading.current if self.motor else None
        self.current_basis = reading.current_basis
        self.continuous = bool(inputs["continuous"])
        self.size, self.material = inputs["size"], inputs["material"]
        self.egc = inputs.get("egc_size") or self.size
        self.count = _count(inputs, self.system, self.iec)
        self.insulation_c = inputs["insulation_temp_c"]
        self.device_type = inputs["device_type"]
        self.device = cc.build_device(inputs)
        fault_a = inputs.get("fault_a")
        if fault_a is not None:
            self.ze, self.ze_basis = self.u0 / fault_a, (
                f"= U0 / {fq(fault_a, 'A')} available at the panel")
        elif inputs.get("ze") is not None:
            self.ze, self.ze_basis = inputs["ze"], "as given"
        else:
            raise InputError("ze", None, "give the loop impedance outside the circuit (Ze) or "
                             "the available fault current at the panel (fault_a)")
        if self.iec or not (self.motor or self.continuous):
            factor, self.required_basis = 1.0, "The load needs"
        elif self.motor:
            factor, self.required_basis = ampacity.MOTOR_CONDUCTOR_FACTOR, (
                "The motor needs 125 % of its full-load current (NEC 430.22):")
        else:
            factor, self.required_basis = ampacity.CONTINUOUS_LOAD_FACTOR, (
                "The continuous load needs 125 % (NEC 210.19(A)(1), 215.2(A)(1)):")
        self.required = factor * self.current


def _view(inputs):
    c = _Circuit(inputs)
    result, judged = Result(), _Judged()
    amp = cc.conductor_ampacity(inputs, c.size, c.count, c.count)
    if c.motor:
        result.step("Motor full-load current (a motor is sized by it, not by its hp in watts)",
                    "I_FL", f"= {fq(c.flc, 'A')}: {c.current_basis}")
    count_text = (f"{c.count} loaded conductors, {inputs['grouped']:g} circuit(s) grouped"
                  if c.iec else f"{c.count} current-carrying conductors")
    cc.ampacity_steps(result, amp, c.size, c.material, count_text)
    _ampacity_check(judged, c, amp)
    if c.motor and not c.iec:
        largest = _motor_device(judged, c)
    else:
        (_iec_overcurrent if c.iec else _nec_overcurrent)(judged, c, amp)
        largest = (amp.ampacity_a if c.iec else
                   ampacity.largest_device(amp.ampacity_a, amp.small_limit_a))
    _drop_check(judged, c, result)
    fault = _fault_check(judged, c, result)
    egc_need = _egc_check(judged, c, amp, fault)
    if c.motor and not c.iec:
        _motor_check(judged, c, amp, result)
    _plausibility_check(judged, c, amp, result.outputs["drop_pct"][0])

    status, governing, fix = judged.verdict()
    result.output("verdict", status, status)
    result.output("governing", governing, governing.replace("_", " "))  # value: the check's name
    if fix:
        result.output("fix", fix, fix)
    _out(result, "load_a", c.current, "A")
    _out(result, "required_a", c.required, "A")
    _out(result, "ampacity_a", amp.ampacity_a, "A")
    _out(result, "max_device_a", largest, "A")
    if egc_need:
        smallest = cc.area_to_size(egc_need, c.size, c.material)
        result.output("egc_min_area", egc_need, smallest.label if smallest else fq(egc_need, "m2"))
    if c.motor:
        _out(result, "flc_a", c.flc, "A")
    by_name = {item[0]: item for item in judged.items}
    for name in CHECK_ORDER:
        if name in by_name:
            result.check(name, by_name[name][1], by_name[name][2])
    _texts(result, c)
    return result


def _texts(result, c):
    result.assumptions += list(ASSUMPTIONS)
    if not c.iec:
        result.assumptions.append(
            "The available fault current at the panel is taken as its line-to-ground value; a "
            "three-phase bolted figure is higher, so a check on it is optimistic.")
    result.sources += [cc.SOURCE_IEC, *SOURCES_IEC] if c.iec else [
        cc.SOURCE_NEC, SOURCE_OCPD_NEC, *GROUND_SOURCES_NEC]
    if c.motor and not c.iec:
        result.sources.append(SOURCE_MOTOR)
    result.sources.append(LIMIT_SOURCE)
    result.cautions += [CAUTION_SCOPE, *cautions.COMMON]


_CONDUCTOR = {item.name: item for item in cc.conductor_inputs()}

CALCULATOR = Calculator(
    id="circuit-check",
    title="Check a whole circuit",
    summary="One branch circuit or feeder checked end to end: ampacity, the breaker or fuse "
            "against the conductor, voltage drop, fault clearing, the grounding conductor and a "
            "motor's branch rules, with the check that governs and what would fix it.",
    group="Conductors",
    inputs=(
        _CONDUCTOR["practice"],
        Input("system", "System", "choice", default="1ph", choices=cc.SYSTEMS,
              help="Line to neutral, line to line of a wye (208 V from 208Y/120 V), 120/240 V, "
                   "or three-phase."),
        Input("voltage", "Voltage", "quantity", unit="V", default=120, minimum=0,
              min_exclusive=True, maximum=1000, region_defaults={"iec": 230},
              suggest="voltages", help="Line to line for three-phase and line-to-line circuits."),
        Input("current", "Load current", "quantity", unit="A", default=16, optional=True,
              minimum=0, min_exclusive=True, maximum=6000, group="load",
              region_defaults={"iec": 13},
              help="Or give the load as power, kVA or a motor's output."),
        Input("power", "Or load power", "quantity", unit="kW", optional=True, minimum=0,
              min_exclusive=True, maximum=1e4, group="load", advanced=True),
        Input("kva", "Or load apparent power", "quantity", unit="kVA", optional=True, minimum=0,
              min_exclusive=True, maximum=1e4, group="load", advanced=True),
        Input("motor_power", "Or a motor's output", "quantity", unit="hp", optional=True,
              minimum=0, min_exclusive=True, maximum=1000, group="load",
              help="10 hp or 7.5 kW: its full-load current comes from NEC Table 430.250 / "
                   "430.248, and the motor branch rules apply."),
        Input("continuous", "Continuous load (3 h or more)", "flag", default=False,
              help="NEC: the conductor and device carry 125 % of a continuous load."),
        Input("length", "One-way length", "quantity", unit="m", default="50 ft", minimum=0.001,
              maximum=10000, region_defaults={"iec": "25 m"}),
        _CONDUCTOR["size"],
        _CONDUCTOR["material"],
        _CONDUCTOR["insulation_temp_c"],
        Input("raceway", "Raceway", "choice", default="pvc", choices=cc.conductors.RACEWAYS,
              help="For the conductors' reactance (voltage drop and fault loop)."),
        _CONDUCTOR["ambient_c"],
        _CONDUCTOR["current_carrying"],
        _CONDUCTOR["installation"],
        _CONDUCTOR["grouped"],
        Input("device_type", "Breaker or fuse", "choice", default="inverse-time",
              choices=cc.DEVICE_TYPES, region_defaults={"iec": "mcb-b"}),
        Input("device_rating", "Device rating", "quantity", unit="A", default=20, minimum=1,
              maximum=6000, region_defaults={"iec": 16},
              help="In; an MCB takes an IEC 60898-1 preferred rating (6 to 125 A)."),
        Input("egc_size", "Grounding (protective) conductor", "size", optional=True,
              help="The EGC / CPC run with the circuit; blank: the same size as the line "
                   "conductors."),
        Input("fault_a", "Available fault current at the panel", "quantity", unit="kA",
              optional=True, minimum=0.01, maximum=300, group="source",
              help="Line to ground, at the panel feeding the circuit; or give Ze."),
        Input("ze", "Or loop impedance outside the circuit, Ze", "quantity", unit="ohm",
              default=0.15, optional=True, minimum=0.001, maximum=50,
              group="source", region_defaults={"iec": 0.35},
              help="Measured at the panel, or the supplier's declared value."),
        Input("max_drop_pct", "Drop limit", "quantity", unit="%", default=3, minimum=0,
              min_exclusive=True, maximum=20,
              help="3 % branch, 5 % feeder plus branch (NEC note; IEC Annex G)."),
        Input("pf", "Power factor", "quantity", unit="", default=0.9, minimum=0,
              min_exclusive=True, maximum=1, advanced=True),
        Input("trip_multiple", "Instantaneous trip (or fuse quick-melt) multiple", "quantity",
              unit="", optional=True, minimum=2, maximum=40, advanced=True,
              help="× In. Blank: 10 for breakers and non-time-delay fuses, 15 for time-delay "
                   "fuses; not used for MCBs (their type letter sets it)."),
        _CONDUCTOR["terminal_temp_c"],
        Input("code_letter", "Motor code letter", "text", optional=True, advanced=True,
              check=_check_code_letter, suggestions=tuple(im.CODE_LETTERS),
              help="NEMA locked-rotor code letter, A to V: checks the device carries the start."),
        Input("starting", "Motor starting method", "choice", default="dol", choices=STARTING,
              advanced=True),
        Input("motor_design", "Motor type (NEC Table 430.52)", "choice", default="standard",
              choices=MOTOR_DESIGNS, advanced=True),
        Input("service_factor", "Motor service factor", "choice", default="1.15",
              choices=SERVICE_FACTORS, advanced=True),
        Input("nameplate_a", "Motor nameplate current", "quantity", unit="A", optional=True,
              minimum=0, min_exclusive=True, maximum=6000, advanced=True,
              help="For the overload (430.32); blank: the table full-load current."),
        Input("overload_a", "Overload relay setting", "quantity", unit="A", optional=True,
              minimum=0, min_exclusive=True, maximum=6000, advanced=True),
        Input("circuit_type", "Circuit (IEC disconnection time)", "choice", default="final",
              choices=CIRCUITS, advanced=True),
        Input("frequency_hz", "Frequency", "quantity", unit="Hz", default=60, minimum=1,
              maximum=400, region_defaults={"iec": 50}, advanced=True),
    ),
    outputs=(
        Output("verdict", "Verdict", ""),
        Output("governing", "Governing check", ""),
        Output("fix", "What would fix it", ""),
        Output("load_a", "Load current", "A"),
        Output("required_a", "Ampacity the load needs", "A"),
        Output("ampacity_a", "Conductor ampacity", "A"),
        Output("max_device_a", "Largest device the conductor allows", "A"),
        Output("drop_pct", "Voltage drop", "%"),
        Output("end_v", "Voltage at the load", "V"),
        Output("zs", "Fault loop impedance Zs", "Ω"),
        Output("far_end_fault_a", "Fault current at the far end", "A"),
        Output("ia", "Current that surely trips (Ia)", "A"),
        Output("egc_min_area", "Smallest grounding conductor", "m²"),
        Output("flc_a", "Motor full-load current", "A"),
        Output("overload_max_a", "Largest overload setting", "A"),
    ),
    compute=_view,
)
