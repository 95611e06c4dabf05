"""back-emf: what back-EMF, speed and torque does a DC motor (shunt, series or permanent-magnet)
run at, what does it draw starting, what resistor holds that down, how does it run up, and how
fast does a stalled armature heat?

Physics in calc.dc_motors; this module holds the spec, the view, its checks and charts.
"""

from bisect import bisect_left, bisect_right

from calc import cautions
from calc import dc_motors as dc
from calc.calculators._plausibility import outside, plausibility
from calc.errors import InputError
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

MOTOR_TYPES = (
    ("shunt", "Shunt (separately excited): constant field"),
    ("series", "Series: field carries the armature current"),
    ("pm", "Permanent-magnet"),
)
LOAD_KINDS = (
    ("constant", "Constant torque (conveyor, hoist, mixer)"),
    ("fan", "Torque ∝ speed² (fan, centrifugal pump)"),
    ("none", "Uncoupled (no load)"),
)

RUN_UP_SHARE = 0.95  # run-up time: to 95 % of the steady speed
CHART_POINTS = 301  # points of a simulated curve: about one a pixel across a phone's chart
# The stalled winding's temperature is one exponential, θ_ss + (θ_0 − θ_ss) e^(−t/τ), over at
# most 5 τ: between neighbours of STALL_POINTS evenly spread, a straight line strays at most
# (Δt/τ)²/8 ≤ (5/100)²/8 = 3e-4 of the rise, well under a pixel of the chart.
STALL_POINTS = 101
# A current-sensing starter cuts a step when the current falls to the switch-out current; the
# load's own steady current must sit below it by this margin or the starter would wait forever.
SWITCH_MARGIN = 1.05
PEAK_SLACK = 1.001  # the simulation's peak may pass the starter limit by this before a warning

# Plausibility: the range of real DC motors (all common practice). Base speeds run from about
# 50 r/min (large rolling-mill motors) to about 20 000 r/min (small permanent-magnet motors);
# supplies from 3 V (small PM motors) to 1500 V (traction and mill motors); the largest DC
# motors are about 10 MW. A motor with its load takes at least about 10 ms to run up (small
# servo motors unloaded); a shorter run-up means the inputs describe no real machine.
SPEED_RANGE_RPM = (50.0, 20000.0)
VOLTAGE_RANGE_V = (3.0, 1500.0)
LARGEST_POWER_W = 10e6
SHORTEST_RUN_UP_S = 0.01


def _time_to_share(times, values, target):
    """First time the samples reach `target`, linearly interpolated; None if never."""
    for n in range(1, len(values)):
        if values[n] >= target > values[n - 1] or values[n] == target:
            span = values[n] - values[n - 1]
            share = (target - values[n - 1]) / span if span else 0.0
            return times[n - 1] + share * (times[n] - times[n - 1])
    return None


def _resample(times, values, grid):
    """Linear interpolation of samples onto `grid`; the last value is held beyond the end."""
    out, end, last = [], times[-1], len(times) - 1
    for t in grid:
        if t >= end:
            out.append(values[-1])
            continue
        n = bisect_left(times, t, 1, last)  # the first sample at or after t (1 to last)
        t0, t1 = times[n - 1], times[n]
        share = (t - t0) / (t1 - t0) if t1 > t0 else 1.0
        out.append(values[n - 1] + share * (values[n] - values[n - 1]))
    return out


def _thin(times, values, keep_times, points=CHART_POINTS):
    """Indices of at most about `points` samples that keep a curve's shape: the first and last,
    the lowest and the highest of each run of samples (no peak is lost between the kept ones),
    and every sample at a time in `keep_times` (so a chart keeps the current's jump at each
    starter cut)."""
    size = len(times)
    if size <= points:
        return list(range(size))
    width = -(-2 * size // points)  # samples in a run: points / 2 runs, two kept from each
    keep = {0, size - 1}
    for start in range(0, size, width):
        run = values[start:start + width]
        keep.add(start + run.index(min(run)))
        keep.add(start + run.index(max(run)))
    for t in keep_times:
        keep.update(range(bisect_left(times, t), bisect_right(times, t)))
    return sorted(keep)


def _rpm(speed):
    return f"{_figure(speed / dc.RAD_S_PER_RPM)} r/min"


def _ref_rpm(inputs):
    """The known speed in r/min (inputs hold rad/s)."""
    return round(inputs["speed_ref"] / dc.RAD_S_PER_RPM, 9)


def _overspeed_pct():
    return f"{100 * (dc.OVERSPEED_LIMIT - 1):g} %"


def _figure(number):
    """Four significant figures without an exponent below 1e9 (50000, not 5e+04)."""
    return f"{number:.0f}" if 1e4 <= abs(number) < 1e9 else f"{number:.4g}"


def _armature(name, value, field_a, series):
    """Armature current [A] from a line-current input, the shunt field current taken off.

    A series motor needs some current (its flux is the current); a shunt or PM motor may be at
    no load (0 A in the armature).
    """
    if series and value <= 0.0:
        raise InputError(name, value, "a series motor has no field without current (Φ ∝ I_a): "
                         "enter its running current, more than 0 A")
    armature = value - field_a
    if armature < 0.0 or (armature == 0.0 and name == "rated_current"):
        raise InputError(name, value, f"the shunt field takes {fq(field_a, 'A')} of the line "
                         f"current {fq(value, 'A')}, which leaves no armature current; enter "
                         f"more than {fq(field_a, 'A')}, or check the field resistance")
    return armature


def _dc_setup(inputs):
    """Read and cross-check the inputs: the armature currents, k and the reference point."""
    kind, voltage, r_a = inputs["motor_type"], inputs["voltage"], inputs["armature_r"]
    field_r = inputs["field_r"]
    if field_r is not None and kind != "shunt":
        raise InputError("field_r", field_r, "a field resistance applies only to a shunt motor "
                         "(a series motor's field is part of the armature circuit resistance); "
                         "leave it blank")
    field_a = voltage / field_r if field_r is not None else 0.0
    series = kind == "series"
    rated_line = inputs["rated_current"] if inputs["rated_current"] is not None else \
        inputs["current"]
    ref_line = inputs["current_ref"] if inputs["current_ref"] is not None else rated_line
    ref_name = "current_ref" if inputs["current_ref"] is not None else (
        "rated_current" if inputs["rated_current"] is not None else "current")
    rated_name = "rated_current" if inputs["rated_current"] is not None else "current"
    armature_a = _armature("current", inputs["current"], field_a, series)
    rated_a = _armature(rated_name, rated_line, field_a, series)
    ref_a = _armature(ref_name, ref_line, field_a, series)
    if rated_a <= 0.0:
        raise InputError(rated_name, rated_line, "the rated current (the current now, when "
                         "rated current is blank) must be more than 0 A: starting multiples "
                         "and the thermal estimate are reckoned from it")
    for name, amps in (("current", armature_a), (rated_name, rated_a), (ref_name, ref_a)):
        if dc.back_emf(voltage, r_a, amps) <= 0.0:
            raise InputError(name, inputs[name], f"at {fq(amps, 'A')} the armature drop I R_a = "
                             f"{fq(amps * r_a, 'V')} uses the whole {fq(voltage, 'V')}: the "
                             "motor would be at standstill (it draws "
                             f"{fq(voltage / r_a, 'A')} there); enter a running current")
    speed_ref = inputs["speed_ref"]  # rad/s: the form reads r/min
    emf_ref = dc.back_emf(voltage, r_a, ref_a)
    constant = dc.motor_constant(kind, emf_ref, speed_ref, ref_a)
    return field_a, armature_a, rated_a, ref_a, speed_ref, emf_ref, constant


def _speed_at(inputs, reference, armature_a):
    """Speed [rad/s] at an armature current, scaled from the known point (ω_ref, E_ref, I_ref)."""
    speed_ref, emf_ref, ref_a = reference
    emf = dc.back_emf(inputs["voltage"], inputs["armature_r"], armature_a)
    flux = armature_a / ref_a if inputs["motor_type"] == "series" else 1.0
    return dc.speed_from_back_emf(speed_ref, emf_ref, emf, flux)


def _back_emf_view(inputs):
    kind, voltage, r_a = inputs["motor_type"], inputs["voltage"], inputs["armature_r"]
    series = kind == "series"
    field_a, armature_a, rated_a, ref_a, speed_ref, emf_ref, k = _dc_setup(inputs)
    result = Result()
    v, ra = fq(voltage, "V"), fq(r_a, "ohm")

    if field_a:
        result.step("Shunt field current, and the armature's share of the line current",
                    "I_f = V / R_f; I_a = I_L − I_f",
                    f"= {v} / {fq(inputs['field_r'], 'ohm')} = {fq(field_a, 'A')}; "
                    f"{fq(inputs['current'], 'A')} − {fq(field_a, 'A')} = {fq(armature_a, 'A')}")
    emf = dc.back_emf(voltage, r_a, armature_a)
    result.output("back_emf_v", emf)
    result.output("armature_a", armature_a)
    result.step("Back-EMF: the supply less the armature circuit's drop", "E_b = V − I_a R_a",
                f"= {v} − {fq(armature_a, 'A')} × {ra} = {fq(emf, 'V')}")
    share = emf / voltage
    usual = share >= dc.BACK_EMF_SHARE_MIN
    result.check("back_emf_share", "pass" if usual else "warn",
                 f"Back-EMF is {100 * share:.1f} % of the supply" + (
                     "." if usual else "; a running DC motor usually loses under "
                     f"{100 * (1 - dc.BACK_EMF_SHARE_MIN):.3g} % in its armature (common "
                     "practice): check R_a and the current."))

    reference = (speed_ref, emf_ref, ref_a)
    model = dc.DCMotor(kind, voltage, r_a, 0.0, 1.0, k, "none", 0.0, 1.0)
    speed = _speed_at(inputs, reference, armature_a)
    flux = armature_a / ref_a if series else 1.0
    result.output("speed", speed, _rpm(speed))
    result.step("Speed from back-EMF, scaled from the known speed" +
                (" (series: flux ∝ armature current, unsaturated)" if series else
                 " (constant flux)"),
                "N = N_ref × (E_b / E_ref) / (Φ / Φ_ref)",
                f"E_ref = {v} − {fq(ref_a, 'A')} × {ra} = {fq(emf_ref, 'V')}; N = "
                f"{_ref_rpm(inputs):g} × {emf / emf_ref:.4g}" +
                (f" / {flux:.4g}" if series else "") + f" = {_rpm(speed)}")
    torque = model.torque(armature_a)
    result.output("torque", torque, f"{torque:.4g} N·m")
    result.output("developed_power_w", emf * armature_a)
    result.step("Torque and developed power (E_b I_a = T ω)", "T = E_b I_a / ω",
                f"= {fq(emf, 'V')} × {fq(armature_a, 'A')} / {speed:.4g} rad/s = "
                f"{torque:.4g} N·m; P = {fq(emf * armature_a, 'W')}")
    if not series:
        no_load = voltage / k
        result.output("no_load_speed", no_load, _rpm(no_load))
        result.step("No-load speed (I_a → 0, E_b → V)", "N_0 = N_ref × V / E_ref",
                    f"= {_ref_rpm(inputs):g} × {voltage / emf_ref:.4g} = {_rpm(no_load)}")
    else:
        ratio = armature_a / ref_a
        low, high = dc.SERIES_FLUX_RANGE
        valid = low <= ratio <= high
        result.check("series_flux", "pass" if valid else "warn",
                     "Series motor: flux taken ∝ armature current (unsaturated iron)" + (
                         "." if valid else f"; at {ratio:.2g} × the reference current the iron "
                         "is far from that point (saturated above, residual flux below), so the "
                         "speed is a rough estimate."))
    if speed > dc.OVERSPEED_LIMIT * speed_ref:
        result.check("overspeed", "warn",
                     f"{_rpm(speed)} is more than {_overspeed_pct()} above the known speed "
                     f"({_ref_rpm(inputs):g} r/min); DC motors are built for about "
                     f"{_overspeed_pct()} overspeed (NEMA MG 1, from memory)" +
                     (": a series motor races when its load is light." if series else "."))

    at_speed = inputs["speed_at"]
    if at_speed is not None:
        omega = at_speed
        current_at = model.quasi_current(r_a, omega)
        result.output("current_at_speed_a", current_at)
        formula = "I_a = V / (R_a + k_s ω)" if series else "I_a = (V − k ω) / R_a"
        result.step(f"Armature current at {_rpm(at_speed)} (steady, inductance aside)", formula,
                    f"k{'_s' if series else ''} = {k:.4g}; I_a = {fq(current_at, 'A')}")
        if current_at < 0.0:
            result.check("regenerating", "warn",
                         f"Above the no-load speed the machine generates: {fq(-current_at, 'A')} "
                         "flows back into the supply, which must be able to take it.")

    _starting_dc(inputs, result, voltage, r_a, rated_a)
    _simulate(inputs, result, model, armature_a, rated_a, speed, reference)

    _plausibility(inputs, result, rated_a)
    result.assumptions += [
        "Armature current is the line current less the shunt field current (when the field "
        "resistance is given; otherwise the field current is neglected). Brush drop is taken "
        "as part of R_a.",
        "Constant flux for shunt and permanent-magnet motors (armature reaction neglected); "
        "series motors: flux ∝ armature current, unsaturated." if series else
        "Constant flux (shunt field on the full supply, armature reaction neglected).",
        "Speeds scale from the known speed at its current; torque is electromagnetic (rotational "
        "losses come off it before the shaft).",
    ]
    result.sources += [
        "E_b = V − I_a R_a, I_start = V/R_a, R_s = V/I − R_a, N ∝ E_b/Φ, E I = T ω: S. J. "
        "Chapman, Electric Machinery Fundamentals, 5th ed., ch. 8 — from memory.",
        "Insulation classes A 105, B 130, F 155, H 180 °C: IEC 60085 / NEMA MG 1 — from memory.",
    ]
    result.cautions += [
        "Never start a DC motor above fractional size across the line: the armature draws many "
        "times rated current until back-EMF builds, which can flash over the commutator.",
        "A shunt motor whose field opens, or a series motor that loses its load, can race to a "
        "destructive speed: keep field-loss protection and never run a series motor uncoupled.",
        "A stalled armature heats in seconds; the protection, not the insulation, must end it.",
        "Starting resistors run hot and stay live; guard them and let them cool.",
    ]
    result.cautions += list(cautions.COMMON)
    return result


def _plausibility(inputs, result, rated_a):
    """The motor's speed, voltage and size and the run-up against those of real DC motors."""
    reasons = []
    low, high = SPEED_RANGE_RPM
    if outside(_ref_rpm(inputs), low, high):
        reasons.append(f"a known speed of {_ref_rpm(inputs):g} r/min is outside the {low:g}–"
                       f"{high:g} r/min of real DC motors (common practice): with it the torque "
                       "is "
                       f"{result.outputs['torque'][0]:.4g} N·m for "
                       f"{fq(result.outputs['developed_power_w'][0], 'W')}")
    low, high = VOLTAGE_RANGE_V
    if outside(inputs["voltage"], low, high):
        reasons.append(f"{fq(inputs['voltage'], 'V')} is outside the {fq(low, 'V')} to "
                       f"{fq(high, 'V')} DC motors are built for (common practice)")
    rated_power = inputs["voltage"] * rated_a
    if rated_power > LARGEST_POWER_W:
        reasons.append(f"{fq(inputs['voltage'], 'V')} × {fq(rated_a, 'A')} = "
                       f"{fq(rated_power, 'W')} is above the largest DC motors, about "
                       f"{fq(LARGEST_POWER_W, 'W')} (common practice)")
    for name in ("run_up_s", "run_up_starter_s"):
        run_up = result.outputs.get(name, (None,))[0]
        if run_up is not None and run_up < SHORTEST_RUN_UP_S:
            reasons.append(f"a run-up in {fq(run_up, 's')} is shorter than any real motor and "
                           f"load take (at least about {fq(SHORTEST_RUN_UP_S, 's')}: common "
                           "practice); check the inertia, the speed and the current")
    plausibility(result, reasons)


def _starting_dc(inputs, result, voltage, r_a, rated_a):
    start = dc.armature_starting_current(voltage, r_a)
    result.output("starting_a", start)
    result.output("starting_multiple", start / rated_a, f"{start / rated_a:.3g} × rated")
    result.step("Starting current with no starter (E_b = 0 at standstill)", "I_start = V / R_a",
                f"= {fq(voltage, 'V')} / {fq(r_a, 'ohm')} = {fq(start, 'A')} = "
                f"{start / rated_a:.3g} × rated {fq(rated_a, 'A')}")
    if start > dc.COMMUTATION_MULTIPLE * rated_a:
        low, high = dc.STARTER_MULTIPLES
        result.check("starting_current", "warn",
                     f"Across the line the armature would draw {start / rated_a:.3g} × rated, "
                     f"more than the {dc.COMMUTATION_MULTIPLE:g} × it commutates without damage; "
                     f"starters hold it to about {low:g}-{high:g} × (common practice, from "
                     "memory).")
    limit = inputs["start_limit"]
    if limit is None:
        return
    allowed = limit * rated_a
    resistor = dc.starting_resistance(voltage, r_a, allowed)
    result.output("starting_resistor_ohm", resistor)
    result.step(f"Starting resistance for {limit:g} × rated at standstill",
                "R_s = V / I_allowed − R_a",
                f"= {fq(voltage, 'V')} / {fq(allowed, 'A')} − {fq(r_a, 'ohm')} = "
                f"{fq(resistor, 'ohm')}")
    if resistor == 0.0:
        result.check("starting_resistor", "pass",
                     f"No resistor needed: the armature alone holds the start to {fq(start, 'A')}.")
        return
    sections = dc.starter_sections(voltage, r_a, allowed, rated_a, inputs["motor_type"] == "series")
    if len(sections) > dc.MAX_STARTER_STEPS:
        raise InputError("start_limit", limit, f"a starter switching between {limit:g} × and "
                         f"1 × rated would need more than {dc.MAX_STARTER_STEPS} steps; allow a "
                         "higher starting multiple")
    listed = ", ".join(fq(r, "ohm") for r in sections)
    result.output("starter_steps", len(sections),
                  f"{len(sections)} step{'s' if len(sections) > 1 else ''}: {listed}")
    result.step("Starter steps cut out as the current falls back to rated (constant flux keeps "
                "E_b at the cut: R_{n+1} = R_n I_min / I_max; series: R_{n+1} = R_n − V(1/I_min "
                "− 1/I_max))", "sections, first cut first", f"= {listed}")


def _simulate(inputs, result, model, armature_a, rated_a, speed, reference):
    """The run-up and stalled-armature charts and outputs; `model` is the motor uncoupled."""
    kind, voltage, r_a = inputs["motor_type"], inputs["voltage"], inputs["armature_r"]
    series, k = kind == "series", model.constant
    if inputs["load_pct"] is None:
        load_torque, load_speed = model.torque(armature_a), speed
        basis = "the operating point entered"
    else:
        load_torque = inputs["load_pct"] / 100.0 * model.torque(rated_a)
        load_speed = _speed_at(inputs, reference, rated_a)
        basis = f"{inputs['load_pct']:g} % of rated torque"
    motor = dc.DCMotor(kind, voltage, r_a, inputs["inductance"], inputs["inertia"], k,
                       inputs["load"], load_torque, load_speed, inputs["damping"])
    result.assumptions.append(
        f"Run-up: J = {inputs['inertia']:g} kg·m², L = {fq(inputs['inductance'], 'H')}, "
        f"B = {inputs['damping']:g} N·m·s/rad; load {dict(LOAD_KINDS)[inputs['load']].lower()}"
        + ("" if inputs["load"] == "none" else
           f", sized from {basis} ({load_torque:.4g} N·m at {_rpm(load_speed)})")
        + "; supply voltage held constant; a load never drives the rotor backwards from "
        "standstill.")
    limit = inputs["start_limit"]
    allowed = limit * rated_a if limit is not None else None
    if allowed is not None and dc.starting_resistance(voltage, r_a, allowed) <= 0.0:
        allowed = None  # the armature alone keeps within the limit: no starter to simulate
    if dc.steady_state(motor, r_a) is None:
        result.check("runaway", "fail",
                     "A series motor with no load has no steady speed: it accelerates until it "
                     "destroys itself. No run-up is shown; couple a load.")
        result.series = []
        _stall(inputs, result, voltage, r_a, rated_a, allowed)
        return
    runs = [("Across the line", dc.run_up(motor))]
    if allowed is not None:
        sections = dc.starter_sections(voltage, r_a, allowed, rated_a, series)
        held = [dc.steady_state(motor, total)
                for total in dc.stage_resistances(r_a, sections)[:-1]]
        held = [current for speed_n, current in held if speed_n > 0.0]
        switch = max([rated_a] + [SWITCH_MARGIN * current for current in held])
        if switch > rated_a:
            result.check("starter_switching", "warn",
                         f"The load holds the current at {fq(max(held), 'A')} on a starter step, "
                         "above rated: a starter that waits for rated current would never step "
                         f"on. The simulation cuts at {fq(switch, 'A')}, so the peaks exceed the "
                         "design limit; use a timed starter or a lighter start.")
        runs.append((f"{len(sections)}-step starter", dc.run_up(motor, sections, switch)))
    _describe_runs(result, runs, motor, allowed, reference[0])
    result.series = _run_charts(runs, motor, rated_a, allowed)
    _stall(inputs, result, voltage, r_a, rated_a, allowed)


def _describe_runs(result, runs, motor, allowed, speed_ref):
    for (label, run), suffix in zip(runs, ("", "_starter")):
        if run.hung or run.steady_speed <= 0.0:
            where = ("at standstill: its starting torque does not exceed the load's "
                     f"({motor.load_at(0.0):.4g} N·m)") if run.speed[-1] <= 0.0 else \
                "on a starter step: the load keeps the current above the switch-out current"
            result.check("cannot_start" + suffix, "fail", f"{label}: the motor stays {where}.")
            continue
        reached = _time_to_share(run.time, run.speed, RUN_UP_SHARE * run.steady_speed)
        if reached is not None:
            result.output(f"run_up{suffix}_s", reached)
        peak = max(run.current)
        result.output(f"peak{suffix}_a", peak)
        result.step(f"Run-up simulation, {label.lower()} (fixed-step RK4, {run.steps} steps"
                    + (", inductance neglected" if run.quasi_static else "") + ")",
                    "L di/dt = V − R i − E;  J dω/dt = T − T_load − B ω",
                    f"peak {fq(peak, 'A')}; {100 * RUN_UP_SHARE:g} % of "
                    f"{_rpm(run.steady_speed)} after "
                    + (fq(reached, "s") if reached is not None else "more than the time shown")
                    + (f"; steps cut at {', '.join(fq(t, 's') for t in run.switch_times)}"
                       if run.switch_times else ""))
        if not run.settled:
            result.check("run_up" + suffix, "warn",
                         f"{label}: not settled within {fq(run.time[-1], 's')} "
                         f"({dc.MAX_STEPS} steps); the chart shows the start of the run-up.")
        if run.quasi_static and motor.inductance > 0.0:
            result.check("inductance" + suffix, "pass",
                         f"{label}: the armature time constant L/R is too short to matter "
                         "beside the run-up, so the current is taken to follow the speed at "
                         "once (it starts at V/R, a little above the true first peak).")
        if suffix and peak > PEAK_SLACK * allowed:
            result.check("starter_peak", "warn",
                         f"The starter's peaks reach {fq(peak, 'A')}, above the "
                         f"{fq(allowed, 'A')} design limit.")
    steady = runs[0][1].steady_speed
    if steady > dc.OVERSPEED_LIMIT * speed_ref:
        result.check("steady_overspeed", "warn",
                     f"The load lets the motor settle at {_rpm(steady)}, more than "
                     f"{_overspeed_pct()} above the known speed (NEMA MG 1 overspeed, from "
                     "memory).")


def _grid(end, points=CHART_POINTS):
    return [end * n / (points - 1) for n in range(points)]


def _chart(title, x_label, grid, axis, unit, lines, marks=()):
    """One chart of the contract: lines are (label, values) on the same grid."""
    return {"title": title, "x": {"label": x_label, "unit": "s", "values": grid},
            "y_axis": {"label": axis, "unit": unit},
            "y": [{"label": label, "unit": unit, "values": values} for label, values in lines],
            "marks": list(marks)}


def _run_charts(runs, motor, rated_a, allowed):
    """Current for each run on its own time scale; speed and back-EMF of the runs together."""
    marks = [{"axis": "y", "value": rated_a, "label": "Rated current"}]
    charts = []
    for label, run in runs:
        keep = _thin(run.time, run.current, run.switch_times)
        shown = marks + ([{"axis": "y", "value": allowed, "label": "Starter limit"}]
                         if allowed is not None and run.switch_times else [])
        charts.append(_chart(f"Armature current during the run-up, {label.lower()}", "Time",
                             [run.time[n] for n in keep], "Armature current", "A",
                             [(label, [run.current[n] for n in keep])], shown))
    grid = _grid(max(run.time[-1] for _, run in runs))
    charts.append(_chart("Speed during the run-up", "Time", grid, "Speed", "r/min",
                         [(label, [w / dc.RAD_S_PER_RPM
                                   for w in _resample(run.time, run.speed, grid)])
                          for label, run in runs]))
    charts.append(_chart("Back-EMF during the run-up", "Time", grid, "Back-EMF", "V",
                         [(label, _resample(run.time, run.emf, grid)) for label, run in runs],
                         [{"axis": "y", "value": motor.voltage, "label": "Supply voltage"}]))
    return charts


def _stall(inputs, result, voltage, r_a, rated_a, allowed):
    """Winding temperature with the rotor held: across the line and on the starter's first step."""
    insulation = inputs["insulation_class"]
    limit_c = dc.INSULATION_CLASSES[insulation]
    ambient, rated_rise, tau = inputs["ambient_c"], inputs["rated_rise"], inputs["thermal_tau"]
    initial = rated_rise if inputs["start_hot"] else 0.0
    allowed_rise = limit_c - ambient
    result.assumptions.append(
        f"Stalled armature: first-order thermal model, τ = {fq(tau, 's')}, {rated_rise:g} K "
        f"rise at rated current, starting from "
        f"{'the rated running temperature' if initial else 'ambient'} with {ambient:g} °C "
        "ambient; resistance held constant (the estimate errs early); commutator and brush "
        "heating, which can be worse at standstill, are not modelled.")
    if allowed_rise <= initial:
        result.check("insulation", "fail",
                     f"Ambient {ambient:g} °C plus the {'running ' if initial else ''}rise "
                     f"{initial:g} K already reaches the class {insulation} limit of "
                     f"{limit_c:g} °C: check the rated rise and the ambient.")
        return
    cases = [("across the line", voltage / r_a, "")]
    if allowed is not None:
        cases.append(("on the starter's first step", allowed, "_starter"))
    for label, amps, suffix in cases:
        steady = rated_rise * (amps / rated_a) ** 2
        t = dc.time_to_rise(allowed_rise, amps, rated_a, rated_rise, tau, initial)
        if t is None:
            result.check("stall" + suffix, "pass",
                         f"Stalled {label} at {fq(amps, 'A')} the winding settles at "
                         f"{ambient + steady:.4g} °C, below the class {insulation} limit.")
            span = 5.0 * tau
        else:
            adiabatic = tau * (allowed_rise - initial) / steady
            result.output(f"time_to_limit{suffix}_s", t)
            result.step(f"Stalled rotor {label}: the winding heats from {ambient + initial:g} °C "
                        f"towards the class {insulation} limit, {limit_c:g} °C",
                        "t = τ ln((θ_ss − θ_0) / (θ_ss − θ_lim)), θ_ss = θ_rated (I/I_rated)²",
                        f"I = {fq(amps, 'A')}: θ_ss = {_figure(steady)} K; t = {fq(t, 's')} "
                        f"(adiabatic estimate θ_ss t / τ: {fq(adiabatic, 's')})")
            result.check("stall" + suffix, "warn",
                         f"Stalled {label} at {fq(amps, 'A')} the armature reaches the class "
                         f"{insulation} limit in about {fq(t, 's')}: its protection must clear "
                         "well within that.")
            span = min(1.5 * t, 5.0 * tau)
        grid = _grid(span, STALL_POINTS)
        temperatures = [ambient + dc.winding_temperature_rise(time, amps, rated_a, rated_rise,
                                                              tau, initial) for time in grid]
        result.series.append(_chart(f"Winding temperature with the rotor stalled {label}",
                                    "Time stalled", grid, "Winding temperature", "°C",
                                    [(f"Stalled {label}", temperatures)],
                                    [{"axis": "y", "value": limit_c,
                                      "label": f"Class {insulation} limit"}]))


CALCULATOR = Calculator(
    id="back-emf",
    title="DC motor back-EMF, starting and run-up",
    summary="Back-EMF, speed and torque of a shunt, series or permanent-magnet DC motor; "
            "starting current and resistor; run-up simulation and stalled-armature heating.",
    group="Motors",
    inputs=(
        Input("motor_type", "Motor type", "choice", default="shunt", choices=MOTOR_TYPES),
        Input("voltage", "Armature supply voltage", "quantity", unit="V", default=250, minimum=1,
              maximum=3000, help="DC across the armature circuit."),
        Input("armature_r", "Armature circuit resistance R_a", "quantity", unit="ohm",
              default=0.5, minimum=1e-4, maximum=10000,
              help="Armature, brushes and interpoles; for a series motor include the series "
                   "field."),
        Input("current", "Motor current now", "quantity", unit="A", default=16, minimum=0,
              maximum=100000, help="Line current at the operating point (clamp reading)."),
        Input("speed_ref", "Known speed", "quantity", unit="r/min", default=1750, minimum=1,
              maximum=100000,
              help="Nameplate speed at rated current, or another speed you know the current "
                   "for."),
        Input("start_limit", "Allowed starting current (× rated)", "quantity", unit="",
              default=2, optional=True, minimum=1, min_exclusive=True, maximum=20,
              help="Blank: no starter is sized. Starters commonly hold "
                   f"{dc.STARTER_MULTIPLES[0]:g}-{dc.STARTER_MULTIPLES[1]:g} ×."),
        Input("rated_current", "Rated current", "quantity", unit="A", default=20, optional=True,
              minimum=0.001, maximum=100000, advanced=True,
              help="Nameplate armature (line) current; blank = the current now."),
        Input("current_ref", "Current at the known speed", "quantity", unit="A", optional=True,
              minimum=0, maximum=100000, advanced=True,
              help="Blank = rated current. For a no-load speed enter the no-load current."),
        Input("speed_at", "Speed for the current-at-speed", "quantity", unit="r/min",
              optional=True, minimum=0, maximum=100000, advanced=True),
        Input("field_r", "Shunt field circuit resistance", "quantity", unit="ohm",
              optional=True, minimum=0.01, maximum=1e6, advanced=True,
              help="Shunt motors: its current V/R_f is taken off the line currents."),
        Input("inductance", "Armature circuit inductance", "quantity", unit="H",
              default="10 mH", minimum=0, maximum=10, advanced=True,
              help="0 neglects it (the current then follows the speed at once)."),
        Input("inertia", "Inertia of motor and load (kg·m²)", "quantity", unit="", default=0.5,
              minimum=1e-5, maximum=1e6, advanced=True),
        Input("load", "Load", "choice", default="constant", choices=LOAD_KINDS, advanced=True),
        Input("load_pct", "Load torque (% of rated)", "quantity", unit="%", optional=True,
              minimum=0, maximum=500, advanced=True,
              help="At rated speed; blank = the torque at the operating point entered."),
        Input("damping", "Viscous friction B (N·m·s/rad)", "quantity", unit="", default=0,
              minimum=0, maximum=1e6, advanced=True),
        Input("insulation_class", "Insulation class", "choice", default="F",
              choices=tuple((c, f"Class {c} ({t:g} °C)")
                            for c, t in dc.INSULATION_CLASSES.items()),
              advanced=True),
        Input("ambient_c", "Ambient temperature", "quantity", unit="degC", default=40,
              minimum=-40, maximum=100, advanced=True),
        Input("rated_rise", "Winding rise at rated current (K)", "quantity", unit="",
              default=80, minimum=0, min_exclusive=True, maximum=250, advanced=True,
              help="Steady rise above ambient at rated load, e.g. 80 K (class B rise)."),
        Input("thermal_tau", "Winding thermal time constant", "quantity", unit="min",
              default=30, minimum=0, min_exclusive=True, maximum=1000, advanced=True,
              help="Heating time constant of the armature, e.g. 30 min."),
        Input("start_hot", "Stall from running temperature", "flag", default=True,
              advanced=True, help="Yes: the winding is at its rated rise when the rotor stalls."),
    ),
    outputs=(
        Output("back_emf_v", "Back-EMF", "V"),
        Output("armature_a", "Armature current", "A"),
        Output("speed", "Speed", "rad/s"),
        Output("torque", "Electromagnetic torque", "N·m"),
        Output("developed_power_w", "Developed power E_b I_a", "W"),
        Output("no_load_speed", "No-load speed", "rad/s"),
        Output("starting_a", "Starting current, no starter", "A"),
        Output("starting_multiple", "Starting current, multiple of rated", ""),
        Output("starting_resistor_ohm", "Starting resistance for the limit", "Ω"),
        Output("starter_steps", "Starter steps", ""),
        Output("current_at_speed_a", "Armature current at the speed given", "A"),
        Output("run_up_s", "Run-up time to 95 % speed, across the line", "s"),
        Output("peak_a", "Peak current, across the line", "A"),
        Output("run_up_starter_s", "Run-up time to 95 % speed, with the starter", "s"),
        Output("peak_starter_a", "Peak current, with the starter", "A"),
        Output("time_to_limit_s", "Stalled across the line: time to the insulation limit", "s"),
        Output("time_to_limit_starter_s", "Stalled on the first starter step: time to the limit",
               "s"),
    ),
    compute=_back_emf_view,
)
