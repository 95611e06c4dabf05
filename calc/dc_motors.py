"""DC motors (shunt, series, permanent-magnet): back-EMF, speed and torque, the starting current
and a starter's resistor sections, a run-up simulation (classical RK4) and the heating of a
stalled armature.

Quantities follow the nomenclature page: voltage [V], current [A], resistance [Ω],
inductance [H], speed [rad/s] (shown in r/min), torque [N·m], inertia [kg·m²], time [s],
temperature [°C], temperature rise [K].
"""

import math
from typing import NamedTuple

RAD_S_PER_RPM = 2.0 * math.pi / 60.0  # one revolution per minute in rad/s (exact)

# Motor types and loads the functions below know (DCMotor.motor_type and DCMotor.load).
MOTOR_TYPES = ("shunt", "series", "pm")
LOAD_KINDS = ("constant", "fan", "none")

# IEC 60085 thermal classes and the NEMA MG 1 insulation classes of the same letters: the
# highest temperature the insulation system is rated for [°C] — from memory.
INSULATION_CLASSES = {"A": 105.0, "B": 130.0, "F": 155.0, "H": 180.0}

# A DC machine commutates without damaging sparking up to about 2 × rated current for a short
# time; starters and drives hold it to about 1.5-2.5 × (common practice, from memory).
COMMUTATION_MULTIPLE = 2.0
STARTER_MULTIPLES = (1.5, 2.5)

# DC motors withstand an overspeed of 25 % above the highest rated speed for up to 2 minutes
# (NEMA MG 1 Part 12, from memory): a steady speed above it is flagged.
OVERSPEED_LIMIT = 1.25

# A running DC motor usually loses under 10-20 % of its supply in the armature circuit, so its
# back-EMF is at least 80 % of the supply (common practice).
BACK_EMF_SHARE_MIN = 0.8

# Flux ∝ armature current holds for a series motor only near the current it was measured at:
# this calculator trusts it within 0.5-1.5 × that current (its own judgement, no published
# figure: saturated iron above, residual flux below).
SERIES_FLUX_RANGE = (0.5, 1.5)

# Simulation: about RUN_STEPS fixed RK4 steps per run-up, never more than MAX_STEPS (it runs on
# each keystroke in the browser); a step is at most STEP_RATE / (fastest rate of the system),
# where RK4 is accurate to about 1e-4 per step and far inside its stability limit (|hλ| ≤ 2.78).
RUN_STEPS = 1200
MAX_STEPS = 2500
MIN_STEPS = 400  # a run that settles in fewer steps is run again on a finer step
# An armature inductance below this is neglected [H]: its L/R is nanoseconds against a run-up of
# seconds, and dividing by it (a subnormal float) would overflow.
NEGLECTED_INDUCTANCE = 1e-9
STEP_RATE = 0.5
SETTLED = 0.002  # within 0.2 % of the steady speed and current counts as settled
SETTLE_MARGIN = 1.1  # the chart runs on 10 % past settling
TIME_CONSTANTS = 6.0  # a stage's run-up is taken as 6 time constants (0.25 % left)
MAX_STARTER_STEPS = 20  # a starter needing more sections is refused
# Classical RK4 (E. Hairer, S. P. Nørsett and G. Wanner, Solving Ordinary Differential Equations
# I, 2nd ed., section II.1 — from memory): each stage's weight in the sum (over 6) and how far
# along the step the next stage is taken (exact).
RK4_STAGES = ((1.0, 0.5), (2.0, 0.5), (2.0, 1.0), (1.0, 0.0))


class DCMotor(NamedTuple):
    """A DC motor and its load, as the run-up equations need them.

    For shunt and permanent-magnet motors `constant` is k [V·s/rad] (E = k ω, T = k i); for
    series motors it is k_s [V·s/(rad·A)] with Φ ∝ i (E = k_s i ω, T = k_s i²).
    """

    motor_type: str  # "shunt", "series" or "pm"
    voltage: float  # supply [V]
    armature_r: float  # armature circuit resistance, series field included [Ω]
    inductance: float  # armature circuit inductance [H]; 0 = neglected
    inertia: float  # motor and load [kg·m²]
    constant: float
    load: str  # "constant", "fan" or "none"
    load_torque: float  # constant torque, or the fan's torque at load_speed [N·m]
    load_speed: float  # [rad/s]
    damping: float = 0.0  # viscous friction B [N·m·s/rad]

    @property
    def series(self):
        return self.motor_type == "series"

    def emf(self, current, speed):
        """Back-EMF [V]."""
        return self.constant * (current if self.series else 1.0) * speed

    def torque(self, current):
        """Electromagnetic torque [N·m]."""
        return self.constant * (current * current if self.series else current)

    def load_at(self, speed):
        """Load torque [N·m] plus viscous friction."""
        friction = self.damping * speed
        if self.load == "fan":
            return self.load_torque * (speed / self.load_speed) ** 2 + friction
        if self.load == "constant":
            return self.load_torque + friction
        return friction

    def load_slope(self, speed):
        """d(load torque + friction)/dω [N·m·s/rad]."""
        fan = 2.0 * self.load_torque * speed / self.load_speed ** 2 if self.load == "fan" else 0.0
        return fan + self.damping

    def quasi_current(self, resistance, speed):
        """Armature current with the inductance neglected [A] (L di/dt = 0)."""
        if self.series:
            return self.voltage / (resistance + self.constant * speed)
        return (self.voltage - self.constant * speed) / resistance


class RunUp(NamedTuple):
    """A run-up simulation: the samples and what happened."""

    time: list  # [s]
    current: list  # armature current [A]
    speed: list  # [rad/s]
    emf: list  # back-EMF [V]
    switch_times: list  # when each starter step was cut out [s]
    steady_speed: float  # the final stage's steady speed [rad/s]
    steady_current: float  # [A]
    settled: bool  # reached the final steady state within MAX_STEPS
    hung: bool  # stopped on a starter step (or at standstill) the load never lets it leave
    quasi_static: bool  # the inductance was neglected (too fast to resolve)
    steps: int  # RK4 steps taken


def back_emf(voltage, armature_r, armature_current):
    """Back-EMF of a DC motor.

    Parameters
    ----------
    voltage : float
        Voltage across the armature circuit [V].
    armature_r : float
        Armature circuit resistance (brushes, interpoles; for a series motor the series field
        too) [Ω].
    armature_current : float
        Armature current [A].

    Returns
    -------
    float
        Back-EMF [V].

    Notes
    -----
    E_b = V − I_a R_a (brush drop taken as part of R_a).

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 8.2 (the equivalent
    circuit of a DC motor) — from memory.

    Examples
    --------
    >>> back_emf(250.0, 0.06, 95.0)
    244.3
    """
    return voltage - armature_current * armature_r


def armature_starting_current(voltage, armature_r):
    """Armature current at standstill with no starter.

    Parameters
    ----------
    voltage : float
        Supply across the armature circuit [V].
    armature_r : float
        Armature circuit resistance [Ω].

    Returns
    -------
    float
        Starting current [A].

    Notes
    -----
    At standstill E_b = 0, so I_start = V / R_a.

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 8.8 (DC motor starting)
    — from memory.

    Examples
    --------
    >>> armature_starting_current(250.0, 0.05)
    5000.0
    """
    return voltage / armature_r


def starting_resistance(voltage, armature_r, allowed_current):
    """Series resistance that holds the standstill current to `allowed_current`.

    Parameters
    ----------
    voltage : float
        Supply [V].
    armature_r : float
        Armature circuit resistance [Ω].
    allowed_current : float
        Largest current allowed at standstill [A].

    Returns
    -------
    float
        Starting resistance [Ω]; 0 when the armature alone already keeps the current within
        the allowance.

    Notes
    -----
    R_s = max(0, V / I_allowed − R_a).

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 8.8 (DC motor starters)
    — from memory.

    Examples
    --------
    >>> round(starting_resistance(250.0, 0.05, 700.0), 4)
    0.3071
    """
    return max(0.0, voltage / allowed_current - armature_r)


def starter_sections(voltage, armature_r, max_current, switch_current, series=False):
    """Resistor sections of a starter that cuts one out each time the current falls.

    Parameters
    ----------
    voltage : float
        Supply [V].
    armature_r : float
        Armature circuit resistance [Ω].
    max_current : float
        Largest current allowed, at standstill and just after each cut [A].
    switch_current : float
        Current at which each section is cut out [A]; below max_current.
    series : bool, optional
        A series motor (flux ∝ current) instead of a constant-flux one.

    Returns
    -------
    list of float
        Section resistances [Ω] in the order they are cut out; empty when none is needed.

    Notes
    -----
    With R_n in circuit the current falls to I_min at E_n = V − I_min R_n. Cutting to R_{n+1}
    at the same speed: constant flux keeps E, so R_{n+1} = R_n I_min / I_max; a series motor's
    E scales with the current, so R_{n+1} = R_n − V (1/I_min − 1/I_max). The last cut goes
    straight to R_a once the next total would be at or below it (the jump then stays under
    I_max). Inductance neglected.

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 8.8 and its starter
    example (100 hp, 250 V, 350 A, R_A = 0.05 Ω, 2 × rated: three sections) — from memory.

    Examples
    --------
    >>> [round(r, 4) for r in starter_sections(250.0, 0.05, 700.0, 350.0)]
    [0.1786, 0.0893, 0.0393]
    """
    total = voltage / max_current
    sections = []
    while total > armature_r:
        if series:
            following = total - voltage * (1.0 / switch_current - 1.0 / max_current)
        else:
            following = total * switch_current / max_current
        following = max(following, armature_r)
        sections.append(total - following)
        total = following
        if len(sections) > MAX_STARTER_STEPS:
            break
    return sections


def motor_constant(motor_type, emf, speed, armature_current):
    """The machine constant of a DC motor from one known operating point.

    Parameters
    ----------
    motor_type : str
        "shunt", "series" or "pm".
    emf : float
        Back-EMF at the known point [V].
    speed : float
        Speed at the known point [rad/s].
    armature_current : float
        Armature current at the known point [A] (used for a series motor only).

    Returns
    -------
    float
        k [V·s/rad] for constant flux (E = k ω, T = k I_a); k_s [V·s/(rad·A)] for a series
        motor (E = k_s I_a ω, T = k_s I_a²).

    Notes
    -----
    k = E / ω; series, unsaturated (Φ ∝ I_a): k_s = E / (ω I_a).

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 8.2 (E = K φ ω,
    τ = K φ I_A) — from memory.

    Examples
    --------
    >>> round(motor_constant("shunt", 250.0, 1200 * RAD_S_PER_RPM, 0.0), 4)
    1.9894
    """
    if motor_type == "series":
        return emf / (speed * armature_current)
    return emf / speed


def speed_from_back_emf(speed_ref, emf_ref, emf, flux_ratio=1.0):
    """Speed at another back-EMF, scaled from a known operating point.

    Parameters
    ----------
    speed_ref : float
        Speed at the known point [rad/s] (or r/min: the result is in the same unit).
    emf_ref : float
        Back-EMF at the known point [V].
    emf : float
        Back-EMF now [V].
    flux_ratio : float, optional
        Flux now over flux at the known point, Φ / Φ_ref [-]; 1 for constant flux, and
        I_a / I_a,ref for an unsaturated series motor.

    Returns
    -------
    float
        Speed now, in the unit of speed_ref [rad/s].

    Notes
    -----
    E = K Φ ω, so N = N_ref × (E / E_ref) / (Φ / Φ_ref).

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., Example 8-1 (E = K φ ω) — from
    memory.

    Examples
    --------
    >>> round(speed_from_back_emf(1200.0, 250.0, 244.3), 1)
    1172.6
    """
    return speed_ref * (emf / emf_ref) / flux_ratio


def steady_state(motor, resistance):
    """Speed and current where the motor's torque balances the load, inductance aside.

    Parameters
    ----------
    motor : DCMotor
        The motor and its load.
    resistance : float
        Total armature circuit resistance, starter included [Ω].

    Returns
    -------
    (float, float) or None
        Steady speed [rad/s] and current [A]; speed 0 when the starting torque does not exceed
        the load's; None when there is no steady speed (a series motor with nothing to hold it
        runs away).

    Notes
    -----
    f(ω) = T_e(i(ω)) − T_load(ω) − B ω falls with ω for every motor type and load here, so the
    root is found by bisection to the last bit (until the bracket is two neighbouring floats, at
    most 100 halvings). With L di/dt = 0 the current is i = (V − k ω) / R (constant flux) or
    V / (R + k_s ω) (series).

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., sections 8.4-8.6 (torque-speed
    characteristics of shunt, permanent-magnet and series motors) — from memory.

    Examples
    --------
    >>> motor = DCMotor("pm", 250.0, 0.5, 0.0, 0.5, 1.25, "constant", 20.0, 180.0)
    >>> [round(x, 2) for x in steady_state(motor, 0.5)]
    [193.6, 16.0]
    """
    surplus = _surplus_of(motor, resistance)
    if surplus(0.0) <= 0.0:
        return 0.0, motor.quasi_current(resistance, 0.0)
    if motor.series:
        high = motor.voltage / motor.constant  # speed at which E = V with 1 A of flux current
        for _ in range(200):
            if surplus(high) < 0.0:
                break
            high *= 2.0
        else:
            return None
    else:
        high = motor.voltage / motor.constant  # no-load speed: the surplus is ≤ 0 there
    low = 0.0
    for _ in range(100):
        middle = 0.5 * (low + high)
        last = middle in (low, high)  # adjacent floats: one more halving settles them for good
        if surplus(middle) > 0.0:
            low = middle
        else:
            high = middle
        if last:
            break
    speed = 0.5 * (low + high)
    return speed, motor.quasi_current(resistance, speed)


def _surplus_of(motor, resistance):
    """surplus(speed) -> T_e − T_load − B ω [N·m] with the current at i(ω) (inductance aside).

    DCMotor.torque(quasi_current) − load_at written out with the motor's numbers bound, the same
    arithmetic in the same order: steady_state's bisection and the reduced model's run-up call it
    hundreds to thousands of times a recompute.
    """
    series, k, voltage, damping = motor.series, motor.constant, motor.voltage, motor.damping
    fan, load_speed = motor.load == "fan", motor.load_speed
    held = motor.load_torque if motor.load != "none" else 0.0  # 0 + friction is friction

    def surplus(speed):
        current = (voltage / (resistance + k * speed) if series
                   else (voltage - k * speed) / resistance)
        return k * (current * current if series else current) - (
            (held * (speed / load_speed) ** 2 if fan else held) + damping * speed)

    return surplus


def _stepper(motor, resistance, quasi):
    """step(current, speed, h) -> (current, speed) after one classical RK4 step of h [s].

    The run-up takes about 1500 steps on each keystroke in the browser, so a step is one call:
    the full model's right-hand side (DCMotor.emf, torque and load_at) is written out with the
    motor's numbers bound, the same arithmetic in the same order as those methods. With `quasi`
    the inductance is neglected: the current follows the speed (_surplus_of gives the torque),
    and only the speed is integrated. A load never drives the rotor backwards from standstill
    (it holds).
    """
    series, k, voltage = motor.series, motor.constant, motor.voltage
    inductance, inertia, damping = motor.inductance, motor.inertia, motor.damping
    fan, load_speed = motor.load == "fan", motor.load_speed
    held = motor.load_torque if motor.load != "none" else 0.0  # 0 + friction is friction

    if quasi:
        surplus = _surplus_of(motor, resistance)

        def step(current, speed, h):
            w, total = speed, 0.0
            for weight, share in RK4_STAGES:
                net = surplus(w)
                dw = 0.0 if w <= 0.0 and net < 0.0 else net / inertia
                total += weight * dw
                w = speed + share * h * dw
            speed = speed + h / 6.0 * total
            return motor.quasi_current(resistance, speed), speed
        return step

    def step(current, speed, h):
        i, w, sum_i, sum_w = current, speed, 0.0, 0.0
        for weight, share in RK4_STAGES:
            di = (voltage - resistance * i - k * (i if series else 1.0) * w) / inductance
            net = k * (i * i if series else i) - (
                (held * (w / load_speed) ** 2 if fan else held) + damping * w)
            dw = 0.0 if w <= 0.0 and net < 0.0 else net / inertia
            sum_i += weight * di
            sum_w += weight * dw
            reach = share * h
            i, w = current + reach * di, speed + reach * dw
        return current + h / 6.0 * sum_i, speed + h / 6.0 * sum_w

    return step


def _fastest_rate(motor, resistance, current, speed, quasi):
    """Largest |eigenvalue| of the linearised equations at one state [1/s]."""
    return _fastest_rate_of(motor, resistance, quasi)(current, speed)


def _fastest_rate_of(motor, resistance, quasi):
    """fastest(current, speed) -> _fastest_rate's value, the motor's numbers bound (run-up)."""
    series, k, inductance, inertia = motor.series, motor.constant, motor.inductance, motor.inertia
    fan, load_torque, load_speed, damping = (motor.load == "fan", motor.load_torque,
                                             motor.load_speed, motor.damping)

    def fastest(current, speed):
        slope = (2.0 * load_torque * speed / load_speed ** 2 if fan else 0.0) + damping
        mech = slope / inertia
        if series:
            de_di, de_dw, dt_di = k * speed, k * current, 2.0 * k * current
        else:
            de_di, de_dw, dt_di = 0.0, k, k
        if quasi:
            # i = i(ω): dT/dω = dT/di × di/dω, di/dω = −(∂E/∂ω) / (R + ∂E/∂i)
            return abs(-dt_di * de_dw / (resistance + de_di) / inertia - mech)
        a, b = -(resistance + de_di) / inductance, -de_dw / inductance
        c, d = dt_di / inertia, -mech
        half_trace, det = 0.5 * (a + d), a * d - b * c
        disc = half_trace * half_trace - det
        if disc >= 0.0:
            root = math.sqrt(disc)
            return max(abs(half_trace + root), abs(half_trace - root))
        return math.sqrt(det)  # complex pair: |λ|² = det

    return fastest


def stage_resistances(armature_r, sections):
    """Total armature circuit resistance on each step of a starter.

    Parameters
    ----------
    armature_r : float
        Armature circuit resistance [Ω].
    sections : sequence of float
        Starter resistor sections [Ω], in the order they are cut out.

    Returns
    -------
    list of float
        The total resistance on each step [Ω], the last being the armature alone.

    Notes
    -----
    R_n = R_a + Σ_{m ≥ n} R_m: every section not yet cut out is in series with the armature.

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 8.8 (DC motor starters)
    — from memory.

    Examples
    --------
    >>> [round(r, 4) for r in stage_resistances(0.05, [0.1786, 0.0893, 0.0393])]
    [0.3572, 0.1786, 0.0893, 0.05]
    """
    sections = list(sections)
    return [armature_r + sum(sections[n:]) for n in range(len(sections) + 1)]


def _plan(motor, totals, steadies, quasi):
    """(expected run-up time [s], number of steps the electrical transient alone would need)."""
    estimate, electrical = 0.0, 0.0
    for total, (speed, current) in zip(totals, steadies):
        slowest = _fastest_rate(motor, total, current, speed, True)
        if slowest <= 0.0:
            slowest = _fastest_rate(motor, total, motor.quasi_current(total, 0.0), 0.0, True)
        estimate += TIME_CONSTANTS / max(slowest, 1e-9)
        if not quasi:
            estimate += TIME_CONSTANTS * motor.inductance / total
            for w in (0.0, speed):  # a series motor's E adds k_s ω to the circuit's R
                electrical = max(electrical, _fastest_rate(
                    motor, total, motor.quasi_current(total, w), w, False))
    return estimate, estimate * electrical / STEP_RATE


def run_up(motor, sections=(), switch_current=None):
    """Simulate the start of a DC motor from standstill with classical RK4.

    Parameters
    ----------
    motor : DCMotor
        The motor and its load.
    sections : sequence of float, optional
        Starter resistor sections [Ω], cut out in order (see starter_sections); empty for a
        start across the line.
    switch_current : float, optional
        The current at which a section is cut out as it falls [A] (needed with sections).

    Returns
    -------
    RunUp
        The samples (time [s], current [A], speed [rad/s], back-EMF [V]), the cut times and
        whether the run settled.

    Notes
    -----
    L di/dt = V − R i − E(i, ω) and J dω/dt = T(i) − T_load(ω) − B ω, with E = k ω, T = k i
    (constant flux) or E = k_s i ω, T = k_s i² (series, unsaturated), from i = ω = 0. A section
    is cut where the current crosses the switch-out current falling, located within the step by
    regula falsi. Each step is STEP_RATE / (fastest rate of the equations linearised at that
    state), at most 1/RUN_STEPS of the expected run-up: RK4 without error control, its step
    fixed by the physics rather than by an error estimate. When the armature time constant is
    too short to resolve within MAX_STEPS the inductance is neglected (i follows ω).

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., ch. 8 (DC motor equivalent
    circuit and E I_A = T ω) — from memory; RK4: E. Hairer, S. P. Nørsett and G. Wanner,
    *Solving Ordinary Differential Equations I*, 2nd ed., section II.1 — from memory.

    Examples
    --------
    >>> run = run_up(DCMotor("pm", 250.0, 0.5, 0.0, 0.5, 1.25, "constant", 20.0, 180.0))
    >>> run.settled, run.quasi_static, round(run.steady_speed, 1), round(run.current[0], 1)
    (True, True, 193.6, 500.0)
    """
    totals = stage_resistances(motor.armature_r, list(sections))
    steadies = [steady_state(motor, total) or (0.0, 0.0) for total in totals]
    quasi = motor.inductance < NEGLECTED_INDUCTANCE
    estimate, electrical_steps = _plan(motor, totals, steadies, quasi)
    if not quasi and electrical_steps > MAX_STEPS:
        quasi = True  # the electrical transient is over in a tiny fraction of the run-up
        estimate, _ = _plan(motor, totals, steadies, quasi)
    longest = estimate / RUN_STEPS
    run = _integrate(motor, totals, steadies, switch_current, longest, quasi)
    if run.steps < MIN_STEPS and (run.settled or run.hung):
        run = _integrate(motor, totals, steadies, switch_current, run.time[-1] / RUN_STEPS, quasi)
    return run


def _integrate(motor, totals, steadies, switch_current, longest, quasi):
    stage, last = 0, len(totals) - 1
    current = motor.quasi_current(totals[0], 0.0) if quasi else 0.0
    speed, t = 0.0, 0.0
    time, currents, speeds = [t], [current], [speed]
    switches, peak = [], abs(current)
    stop, settled, hung, steps = None, False, False, 0
    # Each stage's steady state, how near its speed counts as settled [rad/s], and whether the
    # run may stop there (the last stage, or one the motor cannot leave).
    goals = [(w, i, SETTLED * max(w, 1e-12), n == last or w <= 0.0 or i > switch_current)
             for n, (w, i) in enumerate(steadies)]
    steady_w, steady_i, speed_band, may_stop = goals[0]
    # Constant flux and no fan: the fastest rate, so the step, is the same at every state.
    fixed_step = not motor.series and motor.load != "fan"
    step, fastest, h = _phase(motor, totals[0], quasi, longest, current, speed)
    while steps < MAX_STEPS:
        if not fixed_step:
            h = min(longest, STEP_RATE / fastest(current, speed))
        new_i, new_w = step(current, speed, h)
        steps += 1
        crossing = stage < last and current > switch_current >= new_i
        if crossing:
            h, new_i, new_w, steps = _locate_switch(step, current, speed, h, switch_current,
                                                    new_i, steps)
        t += h
        current, speed = new_i, new_w
        if crossing:
            stage += 1
            switches.append(t)
            if quasi:
                time.append(t)
                currents.append(current)
                speeds.append(speed)
                current = motor.quasi_current(totals[stage], speed)  # the jump at the cut
            step, fastest, h = _phase(motor, totals[stage], quasi, longest, current, speed)
            steady_w, steady_i, speed_band, may_stop = goals[stage]
        time.append(t)
        currents.append(current)
        speeds.append(speed)
        if abs(current) > peak:
            peak = abs(current)
        if (stop is None and abs(speed - steady_w) <= speed_band
                and abs(current - steady_i) <= SETTLED * peak and may_stop):
            settled, hung = stage == last, stage != last
            stop = t * SETTLE_MARGIN
        if stop is not None and t >= stop:
            break
    emfs = [motor.emf(i, w) for i, w in zip(currents, speeds)]
    steady_w, steady_i = steadies[last]
    return RunUp(time, currents, speeds, emfs, switches, steady_w, steady_i, settled, hung,
                 quasi, steps)


def _phase(motor, total, quasi, longest, current, speed):
    """(step, fastest, h) on one starter step: the RK4 step and the fastest rate with the
    circuit's resistance bound, and the step length at this state [s]."""
    step, fastest = _stepper(motor, total, quasi), _fastest_rate_of(motor, total, quasi)
    return step, fastest, min(longest, STEP_RATE / fastest(current, speed))


def _locate_switch(step, current, speed, h, target, new_i, steps):
    """Shorten a step to end where the current reaches `target` (three regula-falsi passes)."""
    low, high = 0.0, 1.0
    g_low, g_high = current - target, new_i - target
    fraction, state = 1.0, None
    for _ in range(3):
        fraction = low + (high - low) * g_low / (g_low - g_high) if g_low != g_high else high
        state = step(current, speed, fraction * h)
        steps += 1
        g = state[0] - target
        if g > 0.0:
            low, g_low = fraction, g
        else:
            high, g_high = fraction, g
    return fraction * h, state[0], state[1], steps


def winding_temperature_rise(time, current, rated_current, rated_rise, time_constant,
                             initial_rise=0.0):
    """Temperature rise of a winding carrying a steady current, first-order thermal model.

    Parameters
    ----------
    time : float
        Time since the current started [s].
    current : float
        Winding current [A].
    rated_current : float
        Current at which the winding settles at `rated_rise` [A].
    rated_rise : float
        Steady rise above ambient at rated current [K].
    time_constant : float
        Thermal time constant of the winding to its surroundings [s].
    initial_rise : float, optional
        Rise at time 0 [K] (0 cold, rated_rise after running at rated load).

    Returns
    -------
    float
        Rise above ambient at `time` [K].

    Notes
    -----
    θ(t) = θ_ss + (θ_0 − θ_ss) e^(−t/τ), θ_ss = θ_rated (I / I_rated)². Loss I²R with R
    constant (copper's rise of resistance with temperature is left out: at constant voltage it
    lowers the current and the heating, so the estimate errs early). For t ≪ τ it is the
    adiabatic rise θ_0 + θ_ss t / τ.

    References
    ----------
    The first-order (single-body) heating and cooling model that machine-design texts give —
    common practice, from memory.

    Examples
    --------
    >>> round(winding_temperature_rise(1800.0, 20.0, 20.0, 80.0, 1800.0), 2)
    50.57
    """
    steady = rated_rise * (current / rated_current) ** 2
    return steady + (initial_rise - steady) * math.exp(-time / time_constant)


def time_to_rise(limit_rise, current, rated_current, rated_rise, time_constant, initial_rise=0.0):
    """How long a winding carrying a steady current takes to reach a temperature rise.

    Parameters
    ----------
    limit_rise : float
        The rise to reach, above ambient [K] (insulation class limit less the ambient).
    current : float
        Winding current [A].
    rated_current : float
        Current at which the winding settles at `rated_rise` [A].
    rated_rise : float
        Steady rise above ambient at rated current [K].
    time_constant : float
        Thermal time constant of the winding [s].
    initial_rise : float, optional
        Rise at time 0 [K].

    Returns
    -------
    float or None
        Time to the limit [s]; 0 when the winding starts at or above it; None when the current
        never takes it there (its steady rise is at or below the limit).

    Notes
    -----
    The inverse of winding_temperature_rise: t = τ ln((θ_ss − θ_0) / (θ_ss − θ_lim)),
    θ_ss = θ_rated (I / I_rated)².

    References
    ----------
    The first-order (single-body) heating and cooling model that machine-design texts give —
    common practice, from memory.

    Examples
    --------
    >>> round(time_to_rise(115.0, 500.0, 20.0, 80.0, 1800.0, 80.0), 3)
    1.262
    """
    if initial_rise >= limit_rise:
        return 0.0
    steady = rated_rise * (current / rated_current) ** 2
    if steady <= limit_rise:
        return None
    return time_constant * math.log((steady - initial_rise) / (steady - limit_rise))

