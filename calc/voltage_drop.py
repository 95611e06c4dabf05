"""Voltage drop along one run: exact phasor solution and the usual approximation, on DC,
single-phase two- and three-wire, and balanced three-phase systems.

Quantities follow the nomenclature page: voltage [V] (line-to-line for three-phase), current
[A], length [m] one-way, resistance and reactance [Ω] of one conductor of the whole run,
power [W], power_factor [-] (lagging).
"""

import math
from typing import NamedTuple

from calc import electrical
from calc.electrical import SQRT3
from calc.errors import ParameterError, VoltageCollapse

# Systems, by token: how the nominal voltage relates to the voltage across one load path, and
# how many conductors carry the load current there and back.
#   dc     two-wire DC: loop of 2 conductors, no reactance
#   1ph    single-phase two-wire: loop of 2 conductors
#   1ph3w  single-phase three-wire (120/240 V): nominal is line-to-line; each leg is half of it
#   3ph    three-phase three- or four-wire, balanced: per phase, V/√3 and one conductor
# The approximate formula's k: VD = k · I · (R cos θ + X sin θ) with R, X of one conductor.
# IEEE Std 141 (Red Book) ch. 3 (from memory) and NEC Chapter 9 Table 9 note 2 (read, as quoted).
K_FACTOR = {"dc": 2.0, "1ph": 2.0, "1ph3w": 2.0, "3ph": SQRT3}
# Conductors that carry the load current (a balanced load's neutral carries none).
LOADED_CONDUCTORS = {"dc": 2, "1ph": 2, "1ph3w": 2, "3ph": 3}
# Load paths that share a three-phase or 120/240 V load (the power on one path is P / paths).
LOAD_PATHS = {"dc": 1, "1ph": 1, "1ph3w": 2, "3ph": 3}

MAX_ITERATIONS = 100
TOLERANCE = 1e-12  # relative change of the load-end voltage that ends the iteration
LONGEST_SEARCH_M = 1e7  # max_run_length gives up beyond 10 000 km: the load is too small


def load_current(system, power, voltage, power_factor):
    """Line current drawn by a load of given real power at nominal voltage.

    Parameters
    ----------
    system : str
        "dc", "1ph", "1ph3w" or "3ph".
    power : float
        Real power of the load [W]; the total of all phases.
    voltage : float
        Nominal voltage [V]; line-to-line for 3ph and 1ph3w (240 V for 120/240 V).
    power_factor : float
        Lagging, in (0, 1] [-]; taken as 1 for DC.

    Returns
    -------
    float
        Current in each line conductor [A].

    Raises
    ------
    calc.errors.ParameterError
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
    if system not in K_FACTOR:
        raise ParameterError("system", system, f"system {system!r} is not one of "
                             f"{', '.join(K_FACTOR)}")
    if not power >= 0.0:
        raise ParameterError("power", power, f"power must be zero or more, not {power!r} W")
    if not voltage > 0.0:
        raise ParameterError("voltage", voltage,
                             f"voltage must be more than 0 V, not {voltage!r} V")
    if system == "dc":
        power_factor = 1.0
    if not 0.0 < power_factor <= 1.0:
        raise ParameterError("power_factor", power_factor,
                             f"power factor must lie in (0, 1], not {power_factor!r}")
    return electrical.line_current(power / power_factor, voltage, 3 if system == "3ph" else 1)


def path_voltage(system, voltage):
    """Voltage across one load path.

    Parameters
    ----------
    system : str
        "dc", "1ph", "1ph3w" or "3ph".
    voltage : float
        Nominal voltage [V]; line-to-line for 3ph and 1ph3w.

    Returns
    -------
    float
        Phase-to-neutral voltage for 3ph, leg-to-neutral for 1ph3w, else the nominal [V].

    Notes
    -----
    V_path = V / s with s = √3 (3ph), 2 (1ph3w) or 1 (dc, 1ph): see nominal_scale.

    References
    ----------
    IEEE Std 141-1993 (Red Book), ch. 3 — from memory.

    Examples
    --------
    >>> round(path_voltage("3ph", 480.0), 2), path_voltage("1ph3w", 240.0)
    (277.13, 120.0)
    """
    return voltage / nominal_scale(system)


def load_path_impedance(system, resistance, reactance):
    """Impedance of the path the load current travels in one run: there and back for two-wire.

    Parameters
    ----------
    system : str
        "dc", "1ph", "1ph3w" or "3ph".
    resistance : float
        Resistance of one conductor of the run [Ω].
    reactance : float
        Reactance of one conductor of the run [Ω].

    Returns
    -------
    (float, float)
        R and X of the load current's path [Ω].

    Notes
    -----
    Two-wire (dc, 1ph): 2R + j2X (no X on DC). Three-phase and a balanced 120/240 V three-wire
    circuit: the neutral carries no current, so the path is one conductor, R + jX.

    References
    ----------
    IEEE Std 141-1993 (Red Book), ch. 3 — from memory.

    Examples
    --------
    >>> load_path_impedance("1ph", 0.1, 0.02), load_path_impedance("3ph", 0.1, 0.02)
    ((0.2, 0.04), (0.1, 0.02))
    """
    if system in ("dc", "1ph"):
        return 2.0 * resistance, (0.0 if system == "dc" else 2.0 * reactance)
    return resistance, reactance


def receiving_voltage(sending_voltage, current, resistance, reactance, power_factor):
    """Load-end voltage magnitude for a load current lagging its own voltage by acos(pf).

    Parameters
    ----------
    sending_voltage : float
        Voltage held at the source end of the path [V].
    current : float
        Load current magnitude [A].
    resistance, reactance : float
        Path impedance [Ω].
    power_factor : float
        Load power factor, lagging, in (0, 1] [-].

    Returns
    -------
    float
        |V_r| [V].

    Raises
    ------
    calc.errors.VoltageCollapse
        When the current cannot flow through that impedance from that voltage.

    Notes
    -----
    |V_s|² = (V_r + I R cos φ + I X sin φ)² + (I X cos φ − I R sin φ)²: the phasor diagram of
    a short line with the load-end voltage as reference; exact for a series impedance with no
    shunt admittance.

    References
    ----------
    J. D. Glover, M. S. Sarma, T. J. Overbye, Power System Analysis and Design, 5th ed.,
    section 5.1 (the short line) — from memory.

    Examples
    --------
    >>> round(receiving_voltage(120.0, 20.0, 0.3, 0.0, 1.0), 3)
    114.0
    """
    cos_phi = power_factor
    sin_phi = math.sqrt(max(0.0, 1.0 - cos_phi * cos_phi))
    in_phase = current * (resistance * cos_phi + reactance * sin_phi)
    quadrature = current * (reactance * cos_phi - resistance * sin_phi)
    discriminant = sending_voltage * sending_voltage - quadrature * quadrature
    if discriminant < 0.0:
        raise VoltageCollapse("the run cannot carry this current: no load-end voltage exists")
    end = math.sqrt(discriminant) - in_phase
    if end <= 0.0:
        raise VoltageCollapse("the whole supply voltage is lost in the run at this current")
    return end


def receiving_voltage_constant_power(sending_voltage, power, resistance, reactance, power_factor):
    """Load-end voltage and current for a load that draws a fixed real power on one path.

    Parameters
    ----------
    sending_voltage : float
        Voltage held at the source end of the path [V].
    power : float
        Real power drawn on this path [W].
    resistance, reactance : float
        Path impedance [Ω].
    power_factor : float
        Load power factor, lagging, in (0, 1] [-].

    Returns
    -------
    (float, float)
        |V_r| [V] and the load current [A].

    Raises
    ------
    calc.errors.VoltageCollapse
        When no steady state exists (the iteration diverges or finds no voltage).

    Notes
    -----
    The current rises as the voltage falls, I = P / (V_r pf); solved by fixed-point iteration
    on receiving_voltage until V_r changes by less than TOLERANCE × V_s.

    References
    ----------
    J. D. Glover, M. S. Sarma, T. J. Overbye, Power System Analysis and Design, 5th ed.,
    section 5.1 (the short line) — from memory.

    Examples
    --------
    >>> end, current = receiving_voltage_constant_power(120.0, 2000.0, 0.3, 0.0, 1.0)
    >>> round(end, 3), round(current, 3)
    (114.772, 17.426)
    """
    end = sending_voltage
    for _ in range(MAX_ITERATIONS):
        current = power / (end * power_factor)
        new_end = receiving_voltage(sending_voltage, current, resistance, reactance, power_factor)
        if abs(new_end - end) <= TOLERANCE * sending_voltage:
            return new_end, power / (new_end * power_factor)
        end = new_end
    raise VoltageCollapse("no steady load-end voltage: the run is too weak for this load")


def approximate_drop(system, current, resistance, reactance, power_factor):
    """The usual approximate voltage drop of one run, in terms of the nominal voltage.

    Parameters
    ----------
    system : str
        "dc", "1ph", "1ph3w" or "3ph".
    current : float
        Load current per line [A].
    resistance, reactance : float
        Resistance and reactance of one conductor of the run [Ω] (X ignored on DC).
    power_factor : float
        Load power factor, lagging [-].

    Returns
    -------
    float
        VD [V]: line-to-line for 3ph, the line-to-line drop of a balanced load for 1ph3w.

    Notes
    -----
    VD ≈ k · I · (R cos θ + X sin θ), k = 2 (dc, 1ph, 1ph3w) or √3 (3ph).

    References
    ----------
    IEEE Std 141-1993 (Red Book), ch. 3 (from memory); NEC Chapter 9 Table 9, note 2 (read, as
    quoted); IEC 60364-5-52 Annex G (the same form with b = 1 or 2; read, as reproduced at
    scribd.com/document/599637287).

    Examples
    --------
    >>> round(approximate_drop("1ph", 16.0, 0.0225 * 20 / 2.5, 0.0016, 1.0), 2)
    5.76
    """
    sin_phi = math.sqrt(max(0.0, 1.0 - power_factor * power_factor))
    x_part = 0.0 if system == "dc" else reactance * sin_phi
    return K_FACTOR[system] * current * (resistance * power_factor + x_part)


def nominal_scale(system):
    """Factor from a voltage on one load path to the nominal voltage.

    Parameters
    ----------
    system : str
        "dc", "1ph", "1ph3w" or "3ph".

    Returns
    -------
    float
        √3 for 3ph, 2 for 1ph3w, 1 otherwise [-].

    Notes
    -----
    V_nominal = s V_path: line-to-line is √3 × phase-to-neutral; 240 V is 2 × 120 V.

    References
    ----------
    IEEE Std 141-1993 (Red Book), ch. 3 — from memory.

    Examples
    --------
    >>> round(nominal_scale("3ph"), 4), nominal_scale("1ph3w"), nominal_scale("dc")
    (1.7321, 2.0, 1.0)
    """
    return {"3ph": SQRT3, "1ph3w": 2.0}.get(system, 1.0)


def conductor_loss(system, current, resistance, neutral_current=0.0):
    """I²R loss of the whole run, each conductor at its own current.

    Parameters
    ----------
    system : str
        "dc", "1ph", "1ph3w" or "3ph".
    current : float
        Load current per line [A]; for an unbalanced 1ph3w load, the heavier leg's.
    resistance : float
        Resistance of one conductor of the run [Ω].
    neutral_current : float
        Current in the neutral (1ph3w unbalance) [A], at most `current`.

    Returns
    -------
    float
        Loss [W].

    Notes
    -----
    P = n I² R, n the conductors that carry the load current (LOADED_CONDUCTORS). On 1ph3w with
    loads of one power factor the lighter line carries I − I_N, so P = [I² + (I − I_N)² + I_N²] R.

    References
    ----------
    J. D. Glover, M. S. Sarma, T. J. Overbye, Power System Analysis and Design, 5th ed., ch. 5
    — from memory; the three-wire currents by Kirchhoff's current law at the load.

    Examples
    --------
    >>> conductor_loss("3ph", 10.0, 0.5), conductor_loss("1ph3w", 40.0, 0.5, 20.0)
    (150.0, 1200.0)
    """
    if system == "1ph3w" and neutral_current:
        lighter = current - neutral_current
        return (current * current + lighter * lighter + neutral_current ** 2) * resistance
    return LOADED_CONDUCTORS[system] * current * current * resistance


# ---- one run, solved ------------------------------------------------------------------------

class RunSolution(NamedTuple):
    """A run solved both ways. Voltages are in terms of the nominal voltage (LL for 3ph/1ph3w);
    on 1ph3w the leg figures are the heavier leg's, line to neutral, where its loads are."""

    current: float  # load current [A]
    end_v: float  # exact load-end voltage [V]
    drop_v: float  # exact drop, sending minus receiving magnitude [V]
    drop_pct: float  # of nominal [%]
    approx_drop_v: float  # k I (R cos θ + X sin θ) [V]
    approx_drop_pct: float  # [%]
    loss_w: float  # I²R of the run [W]
    resistance: float  # one conductor of the run, sets in parallel [Ω]
    reactance: float  # [Ω]
    leg_end_v: float | None = None  # 1ph3w: heavier leg's load-end voltage to neutral [V]
    leg_drop_v: float | None = None  # 1ph3w: its drop [V]
    leg_drop_pct: float | None = None  # 1ph3w: of the leg's nominal (V/2) [%]
    light_leg_end_v: float | None = None  # 1ph3w: the lighter leg's [V]

    @property
    def limit_drop_pct(self):
        """The drop a limit is judged on [%]: the heavier leg's on 1ph3w, else drop_pct."""
        return self.drop_pct if self.leg_drop_pct is None else max(self.drop_pct,
                                                                   self.leg_drop_pct)


def _three_wire(voltage, current, neutral_current, resistance, reactance, power_factor):
    """(line-to-line end, heavier leg end, lighter leg end) [V] of a 120/240 V run whose legs draw
    `current` and current − neutral_current at one power factor."""
    if not 0.0 <= neutral_current <= current:
        raise ParameterError("neutral_current", neutral_current,
                             f"the neutral carries the difference of the two legs' currents: "
                             f"0 to the heavier leg's {current:g} A")
    leg = voltage / 2.0
    lighter = current - neutral_current
    args = (resistance, reactance, power_factor)
    return (receiving_voltage(voltage, current + lighter, *args),
            receiving_voltage(leg, current + neutral_current, *args),
            receiving_voltage(leg, lighter - neutral_current, *args))


def solve_run(system, voltage, length, r_per_m, x_per_m, power_factor, sets=1, current=None,
              power=None, neutral_current=0.0):
    """Drop along one run with the sending-end voltage held at nominal.

    Parameters
    ----------
    system : str
        "dc", "1ph", "1ph3w" or "3ph".
    voltage : float
        Nominal voltage [V]; line-to-line for 3ph and for 1ph3w (240 V for 120/240 V).
    length : float
        One-way run length [m].
    r_per_m, x_per_m : float
        Resistance and reactance of one conductor per metre [Ω/m] (x ignored for DC).
    power_factor : float
        Lagging, in (0, 1] [-]; 1 for DC.
    sets : int
        Conductors in parallel per phase.
    current : float, optional
        Load current per line [A] (constant-current load); the heavier leg's on 1ph3w ...
    power : float, optional
        ... or total real power drawn [W] (constant-power, balanced); give exactly one.
    neutral_current : float
        1ph3w only: current in the neutral from unbalance [A], 0 to `current`: the legs draw
        `current` and current − neutral_current at one power factor.

    Returns
    -------
    RunSolution
        Current, exact and approximate drop, load-end voltage and loss; on 1ph3w also the
        heavier leg's drop to neutral.

    Raises
    ------
    calc.errors.VoltageCollapse
        The run cannot carry the load.
    calc.errors.ParameterError
        On `neutral_current` above the leg current, or given with a power.

    Notes
    -----
    R = r L / n, X = x L / n for one conductor; the load path's impedance (load_path_impedance)
    carries the current from V_s = V / s (path_voltage) to V_r (receiving_voltage); the drop is
    s (V_s − V_r), s = nominal_scale(system). 1ph3w with legs I_A ≥ I_B and I_N = I_A − I_B: the
    heavier leg sees (I_A + I_N) Z from V/2, the lighter (I_B − I_N) Z (a rise when negative),
    and line to line (I_A + I_B) Z from V (the neutral's drop cancels).

    References
    ----------
    J. D. Glover, M. S. Sarma, T. J. Overbye, Power System Analysis and Design, 5th ed.,
    section 5.1 (from memory); IEEE Std 141-1993 (Red Book), ch. 3 (from memory).

    Examples
    --------
    >>> round(solve_run("1ph", 120.0, 30.0, 0.0065, 0.0, 1.0, current=16.0).drop_v, 3)
    6.24
    >>> run = solve_run("1ph3w", 240.0, 30.0, 0.0065, 0.0, 1.0, current=40.0, neutral_current=20.0)
    >>> round(run.leg_drop_v, 3), round(run.drop_v, 3), round(run.loss_w, 1)
    (11.7, 11.7, 468.0)
    """
    if system == "dc":
        power_factor, x_per_m = 1.0, 0.0
    resistance = r_per_m * length / sets
    reactance = x_per_m * length / sets
    if system == "1ph3w" and neutral_current:
        if current is None:
            raise ParameterError("neutral_current", neutral_current, "with an unbalanced "
                                 "120/240 V load give the heavier leg's current, not a power")
        end, leg_end, light_end = _three_wire(voltage, current, neutral_current, resistance,
                                              reactance, power_factor)
        drop = voltage - end
        approx = (approximate_drop(system, current, resistance, reactance, power_factor)
                  * (2.0 * current - neutral_current) / (2.0 * current))
        leg = voltage / 2.0
        return RunSolution(current, end, drop, 100.0 * drop / voltage, approx,
                           100.0 * approx / voltage,
                           conductor_loss(system, current, resistance, neutral_current),
                           resistance, reactance, leg_end, leg - leg_end,
                           100.0 * (leg - leg_end) / leg, light_end)
    path_r, path_x = load_path_impedance(system, resistance, reactance)
    send = path_voltage(system, voltage)
    if current is not None:
        end = receiving_voltage(send, current, path_r, path_x, power_factor)
    else:
        end, current = receiving_voltage_constant_power(
            send, power / LOAD_PATHS[system], path_r, path_x, power_factor)
    scale = nominal_scale(system)
    drop = (send - end) * scale
    approx = approximate_drop(system, current, resistance, reactance, power_factor)
    legs = (end, send - end, 100.0 * (send - end) / send, end) if system == "1ph3w" else ()
    return RunSolution(current, end * scale, drop, 100.0 * drop / voltage, approx,
                       100.0 * approx / voltage, conductor_loss(system, current, resistance),
                       resistance, reactance, *legs)


def max_run_length(system, voltage, r_per_m, x_per_m, power_factor, max_drop_pct, sets=1,
                   current=None, power=None, neutral_current=0.0):
    """Longest one-way run whose exact voltage drop stays within a limit.

    Parameters
    ----------
    system : str
        "dc", "1ph", "1ph3w" or "3ph".
    voltage : float
        Nominal voltage [V]; line-to-line for 3ph and 1ph3w.
    r_per_m, x_per_m : float
        Resistance and reactance of one conductor per metre [Ω/m].
    power_factor : float
        Lagging, in (0, 1] [-].
    max_drop_pct : float
        Drop limit [%] of nominal.
    sets : int
        Conductors in parallel per phase.
    current : float, optional
        Load current per line [A] ...
    power : float, optional
        ... or total real power drawn [W]; give exactly one.
    neutral_current : float
        1ph3w only: neutral current from unbalance [A].

    Returns
    -------
    float
        One-way length [m] (the voltage-drop run; not the protective loop's longest run).

    Raises
    ------
    calc.errors.VoltageCollapse
        When the drop stays under the limit up to 10 000 km (no load to speak of).

    Notes
    -----
    The exact drop of solve_run grows monotonically with length (a collapse counts as an
    infinite drop), so L with drop(L) = limit is found by doubling, then bisection to a relative
    width of 1e-9.

    References
    ----------
    J. D. Glover, M. S. Sarma, T. J. Overbye, Power System Analysis and Design, 5th ed.,
    section 5.1 — from memory.

    Examples
    --------
    >>> round(max_run_length("dc", 48.0, 1.24 / 304.8, 0.0, 1.0, 3.0, current=15.0), 3)
    11.799
    """
    def drop_at(length):
        try:
            return solve_run(system, voltage, length, r_per_m, x_per_m, power_factor, sets,
                             current, power, neutral_current).limit_drop_pct
        except VoltageCollapse:
            return math.inf

    low, high = 0.0, 1.0
    while drop_at(high) < max_drop_pct:
        low, high = high, high * 2.0
        if high > LONGEST_SEARCH_M:
            raise VoltageCollapse("the drop stays under the limit for any length: check the load")
    for _ in range(200):
        middle = 0.5 * (low + high)
        if drop_at(middle) < max_drop_pct:
            low = middle
        else:
            high = middle
        if high - low <= 1e-9 * high:
            break
    return low
