"""RLC circuits: switching transients of RL, RC and series RLC circuits, series and parallel
resonance, and the voltage kick of a DC coil switched off, with and without suppression.

Quantities follow the nomenclature page: resistance [Ω], inductance [H], capacitance [F],
voltage [V], current [A], time [s], frequency [Hz], energy [J].
"""

import cmath
import math
from typing import NamedTuple

from calc import cautions
from calc.errors import InputError
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

TWO_PI = 2.0 * math.pi

# Settling band: the response stays within 2 % of its final value. K. Ogata, Modern Control
# Engineering, 5th ed., section 5-3 (transient-response specifications) — from memory.
SETTLING_BAND = 0.02

# Below |σ| t² = 1e-4 the damped-oscillation functions are taken from their Taylor series, which
# is exact there to better than 1e-16 and avoids cancellation near critical damping.
SERIES_LIMIT = 1e-4

# ζ within this of 1 is called critically damped in the text; the formulas are continuous.
CRITICAL_BAND = 1e-9

# The ringing envelope is drawn below this damping ratio; nearer 1 its √(1 + (α/ωd)²) factor
# grows without bound and would only flatten the chart.
ENVELOPE_ZETA = 0.8

# Points in each waveform and sweep chart: smooth on a phone, a few kB of JSON.
CHART_POINTS = 401

# Air breaks down at no less than about 327 V across any gap (the minimum of Paschen's curve):
# a computed kick above this is limited in practice by an arc at the opening contact. J. M.
# Meek and J. D. Craggs, Electrical Breakdown of Gases, 1978, ch. 6 — from memory.
PASCHEN_MINIMUM_V = 327.0

# Suppression of a DC coil, the choices of inductive-kick.
SUPPRESSIONS = (
    ("none", "None (stray capacitance only)"),
    ("diode", "Freewheel diode"),
    ("diode_zener", "Diode + zener"),
    ("rc", "RC snubber"),
    ("varistor", "Varistor (MOV or TVS)"),
)

# A varistor chosen just above the supply clamps at roughly 2.5 times its working voltage at a
# coil's current — from memory (typical datasheet ratios); used only when no clamp is entered.
VARISTOR_CLAMP_RATIO = 2.5


# ---- the second-order loop ------------------------------------------------------------------

class SecondOrder(NamedTuple):
    """The characteristic numbers of a series RLC loop."""

    alpha: float  # neper frequency R / 2L: the envelope decays as e^(−αt) [1/s]
    omega0: float  # undamped natural angular frequency 1/√(LC) [rad/s]
    damping_ratio: float  # ζ = α / ω0
    sigma: float  # ω0² − α²: > 0 underdamped, < 0 overdamped [1/s²]
    beta: float  # √|σ|: the damped angular frequency ωd when underdamped [1/s]

    @property
    def case(self):
        """"underdamped", "critically damped" or "overdamped"."""
        if self.damping_ratio < 1.0 - CRITICAL_BAND:
            return "underdamped"
        if self.damping_ratio > 1.0 + CRITICAL_BAND:
            return "overdamped"
        return "critically damped"

    @property
    def slow_rate(self):
        """Decay rate of the slowest mode [1/s]: α, or ω0²/(α + β) when overdamped."""
        if self.sigma >= 0.0:
            return self.alpha
        return self.omega0 * self.omega0 / (self.alpha + self.beta)


def series_second_order(resistance, inductance, capacitance):
    """Damping numbers of a series RLC loop.

    Parameters
    ----------
    resistance : float
        Total series resistance R [Ω], > 0.
    inductance : float
        L [H], > 0.
    capacitance : float
        C [F], > 0.

    Returns
    -------
    SecondOrder
        α, ω0, ζ, σ = ω0² − α² and β = √|σ|.

    Notes
    -----
    L di/dt + R i + v_C = V gives s² + 2α s + ω0² = 0 with α = R/(2L), ω0 = 1/√(LC) and
    ζ = α/ω0 = (R/2)√(C/L). Underdamped for ζ < 1 (ωd = ω0√(1 − ζ²)), critically damped at
    ζ = 1 (R = 2√(L/C)), overdamped above.

    References
    ----------
    J. W. Nilsson and S. A. Riedel, *Electric Circuits*, 10th ed., sections 8.3–8.4 (step response
    of a series RLC circuit) — from memory.

    Examples
    --------
    >>> so = series_second_order(280.0, 0.1, 0.4e-6)
    >>> round(so.alpha), round(so.omega0), round(so.beta), round(so.damping_ratio, 2)
    (1400, 5000, 4800, 0.28)
    """
    alpha = resistance / (2.0 * inductance)
    omega0 = 1.0 / (math.sqrt(inductance) * math.sqrt(capacitance))
    sigma = (omega0 - alpha) * (omega0 + alpha)
    return SecondOrder(alpha, omega0, alpha / omega0, sigma, math.sqrt(abs(sigma)))


def _basis(so, time):
    """(e^(−αt) C(t), e^(−αt) S(t)): C'' = −σC, S = ∫C, C(0) = 1, S(0) = 0.

    Underdamped C = cos βt, S = sin(βt)/β; overdamped cosh and sinh; critical 1 and t.
    """
    x = -so.sigma * time * time
    if abs(x) < SERIES_LIMIT:
        decay = math.exp(-so.alpha * time)
        even = 1.0 + x / 2.0 + x * x / 24.0 + x ** 3 / 720.0
        odd = time * (1.0 + x / 6.0 + x * x / 120.0 + x ** 3 / 5040.0)
        return decay * even, decay * odd
    if so.sigma > 0.0:
        decay = math.exp(-so.alpha * time)
        angle = so.beta * time
        return decay * math.cos(angle), decay * math.sin(angle) / so.beta
    # Overdamped: the two real modes, written so that nothing overflows or cancels.
    fast = math.exp(-(so.alpha + so.beta) * time)
    slow = math.exp(-so.slow_rate * time)
    return (slow + fast) / 2.0, (slow - fast) / (2.0 * so.beta)


def _wave(so, even, odd, time):
    """The value at `time` of even·e^(−αt)C(t) + odd·e^(−αt)S(t)."""
    c, s = _basis(so, time)
    return even * c + odd * s


def _stationary_times(so, even, odd):
    """Times t > 0 at which even·e^(−αt)C + odd·e^(−αt)S stops rising or falling.

    Only the first one or two are returned: after them each extreme is e^(−απ/β) times the
    one before it (underdamped), and an overdamped or critical wave has at most one.
    """
    p = odd - so.alpha * even  # d/dt = e^(−αt) (p C − q S)
    q = so.alpha * odd + so.sigma * even
    if so.sigma > 0.0:
        first = math.atan2(p * so.beta, q) % math.pi or math.pi
        return [first / so.beta, (first + math.pi) / so.beta]
    if so.beta == 0.0:
        time = p / q if q else 0.0  # critical: e^(−αt)(p − q t) = 0
    else:
        # e^(2βt) = (q + pβ)/(q − pβ), written as log1p so that it holds near critical.
        if q == p * so.beta:
            return []
        ratio = 2.0 * p * so.beta / (q - p * so.beta)
        if ratio <= -1.0:
            return []
        time = math.log1p(ratio) / (2.0 * so.beta)
    return [time] if time > 0.0 else []


def _extremes(so, even, odd):
    """Largest and smallest values of the wave over t ≥ 0 (it decays to 0): ((t, v), (t, v))."""
    points = [(0.0, even), (math.inf, 0.0)]
    points += [(t, _wave(so, even, odd, t)) for t in _stationary_times(so, even, odd)]
    return max(points, key=lambda p: p[1]), min(points, key=lambda p: p[1])


def _bisect(predicate, low, high, iterations=200):
    """The boundary in [low, high] where predicate turns from true to false (true at low)."""
    for _ in range(iterations):
        middle = 0.5 * (low + high)
        if middle in (low, high):
            break
        if predicate(middle):
            low = middle
        else:
            high = middle
    return high


def _first_time_below(so, even, odd, level):
    """First t at which a wave that starts above `level` (> 0) and falls reaches it."""
    if so.sigma > 0.0:
        # Underdamped: the wave falls monotonically to its first zero, which comes first.
        crossing = math.atan2(-even * so.beta, odd) % math.pi or math.pi
        high = crossing / so.beta
    else:
        high = 1.0 / so.slow_rate
        while _wave(so, even, odd, high) > level:
            high *= 2.0
    return _bisect(lambda t: _wave(so, even, odd, t) > level, 0.0, high)


def loop_coefficients(resistance, inductance, capacitance, source_voltage=0.0,
                      initial_current=0.0, initial_capacitor_voltage=0.0):
    """The loop's current and capacitor voltage as waves of the damped-oscillation basis.

    Returns
    -------
    (SecondOrder, (float, float), (float, float))
        The damping numbers, then (even, odd) coefficients of i(t) [A] and of v_C(t) − V [V].

    Notes
    -----
    With x = v_C − V, x'' + 2αx' + ω0²x = 0, x(0) = v0 − V, x'(0) = i0/C. Then
    x(t) = e^(−αt)[x0 C(t) + (i0/C + α x0) S(t)] and
    i(t) = e^(−αt)[i0 C(t) − (α i0 + x0/L) S(t)].
    """
    so = series_second_order(resistance, inductance, capacitance)
    x0 = initial_capacitor_voltage - source_voltage
    current = (initial_current, -(so.alpha * initial_current + x0 / inductance))
    voltage = (x0, initial_current / capacitance + so.alpha * x0)
    return so, current, voltage


class LoopState(NamedTuple):
    """The state of a series loop at one instant."""

    current: float  # loop current [A], positive in the source's direction
    capacitor_voltage: float  # [V], 0 for an RL loop


def series_loop(resistance, time, inductance=None, capacitance=None, source_voltage=0.0,
                initial_current=0.0, initial_capacitor_voltage=0.0):
    """Current and capacitor voltage of a series R, L, C loop driven by a DC source.

    Parameters
    ----------
    resistance : float
        Total series resistance [Ω], > 0.
    time : float
        Time after the switching instant [s], ≥ 0.
    inductance : float or None
        L [H]; None for an RC loop.
    capacitance : float or None
        C [F]; None for an RL loop.
    source_voltage : float
        The DC source in the loop from t = 0 [V] (0 for a loop left to itself).
    initial_current : float
        Inductor current at t = 0 [A] (ignored for an RC loop).
    initial_capacitor_voltage : float
        Capacitor voltage at t = 0 [V] (ignored for an RL loop).

    Returns
    -------
    LoopState

    Notes
    -----
    RL: i = V/R + (i0 − V/R) e^(−t/τ), τ = L/R. RC: v_C = V + (v0 − V) e^(−t/τ), τ = RC,
    i = (V − v0)/R e^(−t/τ). RLC: see loop_coefficients (under-, critically and overdamped in
    one continuous form).

    References
    ----------
    Nilsson and Riedel, *Electric Circuits*, 10th ed., ch. 7 (natural and step response of RL and
    RC circuits) and ch. 8 (RLC) — from memory.

    Examples
    --------
    >>> state = series_loop(280.0, 1e-3, 0.1, 0.4e-6, source_voltage=48.0)
    >>> round(state.capacitor_voltage, 3), round(state.current, 5)
    (50.403, -0.02457)
    """
    if capacitance is None:
        final = source_voltage / resistance
        decay = math.exp(-time * resistance / inductance)
        return LoopState(final + (initial_current - final) * decay, 0.0)
    if inductance is None:
        decay = math.exp(-time / (resistance * capacitance))
        step = source_voltage - initial_capacitor_voltage
        return LoopState(step / resistance * decay, source_voltage - step * decay)
    so, current, voltage = loop_coefficients(resistance, inductance, capacitance,
                                             source_voltage, initial_current,
                                             initial_capacitor_voltage)
    return LoopState(_wave(so, *current, time), source_voltage + _wave(so, *voltage, time))


# ---- switching transients -------------------------------------------------------------------

CIRCUITS = (
    ("rl", "RL (coil and resistance)"),
    ("rc", "RC (capacitor and resistance)"),
    ("rlc", "Series RLC"),
)
POSITIONS = (
    ("1", "1: switch onto the source (step)"),
    ("2", "2: source out, circuit closed on itself (release)"),
)
RESPONSE_NAMES = {"rl": "coil current", "rc": "capacitor voltage", "rlc": "capacitor voltage"}


def time_constant(circuit, resistance, inductance=None, capacitance=None):
    """Time constant [s]: L/R (rl), RC (rc), or the envelope's 2L/R = 1/α (rlc).

    Examples
    --------
    >>> time_constant("rl", 48.0, 0.5), time_constant("rc", 1e3, capacitance=1e-6)
    (0.010416666666666666, 0.001)
    """
    if circuit == "rc":
        return resistance * capacitance
    if circuit == "rl":
        return inductance / resistance
    return 2.0 * inductance / resistance


class TransientPoint(NamedTuple):
    """A switching transient at one instant."""

    response: float  # coil current [A] for rl; capacitor voltage [V] for rc and rlc
    current: float  # loop current [A]
    capacitor_voltage: float  # [V] (0 for rl)
    inductor_voltage: float  # [V] (0 for rc)


def _initial_state(circuit, resistance, source_voltage, position):
    """(source in the loop, i0, v_C0): position 1 starts from rest on the source; position 2
    starts from the steady state of position 1 with the source replaced by a short."""
    if position == "1":
        return source_voltage, 0.0, 0.0
    if circuit == "rl":
        return 0.0, source_voltage / resistance, 0.0
    return 0.0, 0.0, source_voltage


def switching_transient(circuit, resistance, source_voltage, time, inductance=None,
                        capacitance=None, position="1"):
    """A DC switching transient of an RL, RC or series RLC circuit at one instant.

    Parameters
    ----------
    circuit : str
        "rl", "rc" or "rlc" (series).
    resistance : float
        Series resistance [Ω], > 0.
    source_voltage : float
        DC source [V].
    time : float
        Time after switching [s], ≥ 0.
    inductance, capacitance : float or None
        [H], [F] as the circuit needs.
    position : str
        "1": the switch connects the source at t = 0 to a circuit at rest (step response).
        "2": after a long time in position 1 the switch replaces the source by a short
        (natural response: the stored energy drives the current down).

    Returns
    -------
    TransientPoint
        The response (coil current for rl, capacitor voltage for rc and rlc), the loop current,
        and the capacitor and inductor voltages.

    Notes
    -----
    v_L = V − R i − v_C around the loop. Position 2 starts from i = V/R (rl) or v_C = V (rc,
    rlc, with i = 0).

    Examples
    --------
    >>> round(switching_transient("rl", 48.0, 24.0, 0.5 / 48.0, inductance=0.5).response, 4)
    0.3161
    """
    source, i0, v0 = _initial_state(circuit, resistance, source_voltage, position)
    state = series_loop(resistance, time, None if circuit == "rc" else inductance,
                        None if circuit == "rl" else capacitance, source, i0, v0)
    inductor = (0.0 if circuit == "rc"
                else source - resistance * state.current - state.capacitor_voltage)
    response = state.current if circuit == "rl" else state.capacitor_voltage
    return TransientPoint(response, state.current, state.capacitor_voltage, inductor)


def settling_time(circuit, resistance, inductance=None, capacitance=None, band=SETTLING_BAND):
    """Time after which the response stays within `band` of its final value [s].

    Parameters
    ----------
    circuit : str
        "rl", "rc" or "rlc".
    resistance, inductance, capacitance : float
        [Ω], [H], [F] as the circuit needs.
    band : float
        Fraction of the total change (0.02 for the 2 % criterion).

    Returns
    -------
    float
        Exact settling time: τ ln(1/band) for first order; for RLC the last time the error
        leaves the band (step and release alike: both start from rest in one state).

    Notes
    -----
    Underdamped, the error e^(−αt)(cos ωd t + (α/ωd) sin ωd t) has its extremes at ωd t = kπ,
    of size e^(−αkπ/ωd); the last one above the band is followed by the crossing, found by
    bisection. The common estimate 4/(ζω0) is an envelope bound (Ogata, 5th ed., 5-3).

    Examples
    --------
    >>> round(settling_time("rl", 48.0, 0.5) * 1e3, 3)
    40.75
    """
    if circuit != "rlc":
        return time_constant(circuit, resistance, inductance, capacitance) * math.log(1.0 / band)
    so = series_second_order(resistance, inductance, capacitance)
    even, odd = 1.0, so.alpha  # the normalised error, from rest: e^(−αt)(C + αS)
    if so.sigma <= 0.0 or so.case == "critically damped":
        return _first_time_below(so, even, odd, band)
    last_above = math.ceil(so.beta * math.log(1.0 / band) / (so.alpha * math.pi)) - 1
    start = last_above * math.pi / so.beta
    return _bisect(lambda t: abs(_wave(so, even, odd, t)) > band, start, start + math.pi / so.beta)


def _rlc_waves(resistance, source_voltage, inductance, capacitance, position):
    """(source in the loop, SecondOrder, current wave, capacitor-voltage wave) of a series RLC
    switched to `position`."""
    source, i0, v0 = _initial_state("rlc", resistance, source_voltage, position)
    return (source, *loop_coefficients(resistance, inductance, capacitance, source, i0, v0))


class Peak(NamedTuple):
    time: float  # [s]; infinity for a value approached, not reached
    value: float


def response_peak(circuit, resistance, source_voltage, inductance=None, capacitance=None,
                  position="1"):
    """The farthest the response swings: its maximum for a step, its minimum for a release.

    Returns
    -------
    Peak
        For rl and rc the final (step) or initial (release) value; for an underdamped rlc the
        overshoot peak at t = π/ωd: V(1 + e^(−ζπ/√(1 − ζ²))) for a step, −V e^(...) for a release.

    Examples
    --------
    >>> p = response_peak("rlc", 280.0, 48.0, 0.1, 0.4e-6)
    >>> round(p.time * 1e3, 4), round(p.value, 2)
    (0.6545, 67.2)
    """
    if circuit != "rlc":  # monotonic: approached on the source, the starting value released
        level = source_voltage / resistance if circuit == "rl" else source_voltage
        return Peak(math.inf if position == "1" else 0.0, level)
    source, so, _, voltage = _rlc_waves(resistance, source_voltage, inductance, capacitance,
                                        position)
    highest, lowest = _extremes(so, *voltage)
    time, value = highest if position == "1" else lowest
    return Peak(time, source + value)


def peak_current(circuit, resistance, source_voltage, inductance=None, capacitance=None,
                 position="1"):
    """The largest loop current, by magnitude, and when it flows.

    Returns
    -------
    Peak
        Time [s] and magnitude [A]. RL on the source approaches V/R (time infinite); an RL
        release and both RC cases start at V/R (time 0).

    Notes
    -----
    RLC: i = ∓(V/L) e^(−αt) S(t), largest where tan ωd t = ωd/α (underdamped), at t = 1/α
    (critical), or t = ln(s2/s1)/(s1 − s2) (overdamped).

    Examples
    --------
    >>> p = peak_current("rlc", 280.0, 48.0, 0.1, 0.4e-6)
    >>> round(p.time * 1e6, 1), round(p.value, 5)
    (268.1, 0.06595)
    """
    if circuit != "rlc":
        rising = circuit == "rl" and position == "1"
        return Peak(math.inf if rising else 0.0, source_voltage / resistance)
    _, so, current, _ = _rlc_waves(resistance, source_voltage, inductance, capacitance,
                                   position)
    highest, lowest = _extremes(so, *current)
    time, value = max((highest, lowest), key=lambda p: abs(p[1]))
    return Peak(time, abs(value))


def overshoot_pct(damping_ratio):
    """Percent overshoot of an underdamped second-order step: 100 e^(−ζπ/√(1 − ζ²)).

    References
    ----------
    Ogata, *Modern Control Engineering*, 5th ed., section 5-3, eq. for M_p — from memory.

    Examples
    --------
    >>> round(overshoot_pct(0.5), 2)
    16.3
    """
    if damping_ratio >= 1.0:
        return 0.0
    return 100.0 * math.exp(-damping_ratio * math.pi / math.sqrt(1.0 - damping_ratio ** 2))


# ---- resonance ------------------------------------------------------------------------------

TOPOLOGIES = (
    ("series", "Series R–L–C"),
    ("parallel", "Parallel R ∥ L ∥ C"),
)


def resonant_frequency(inductance, capacitance):
    """f0 = 1 / (2π √(LC)) [Hz].

    Examples
    --------
    >>> round(resonant_frequency(1e-3, 0.4e-6) * TWO_PI)
    50000
    """
    return 1.0 / (TWO_PI * math.sqrt(inductance) * math.sqrt(capacitance))


def capacitance_for_resonance(frequency, inductance):
    """C that resonates with L at `frequency`: C = 1 / ((2πf)² L) [F].

    Examples
    --------
    >>> round(capacitance_for_resonance(50000 / TWO_PI, 1e-3) * 1e6, 6)
    0.4
    """
    return 1.0 / ((TWO_PI * frequency) ** 2 * inductance)


def inductance_for_resonance(frequency, capacitance):
    """L that resonates with C at `frequency`: L = 1 / ((2πf)² C) [H] (the same formula)."""
    return capacitance_for_resonance(frequency, capacitance)


def quality_factor(topology, resistance, inductance, capacitance):
    """Q at resonance: (1/R)√(L/C) for series, R√(C/L) for parallel.

    References
    ----------
    C. K. Alexander and M. N. O. Sadiku, *Fundamentals of Electric Circuits*, 5th ed., sections
    14.5 (series resonance) and 14.6 (parallel resonance) — from memory.

    Examples
    --------
    >>> quality_factor("series", 2.0, 1e-3, 0.4e-6)
    25.0
    >>> round(quality_factor("parallel", 8e3, 0.2e-3, 8e-6))
    1600
    """
    ratio = math.sqrt(inductance / capacitance)
    return ratio / resistance if topology == "series" else resistance / ratio


def half_power_frequencies(f0, q):
    """The −3 dB (half-power) frequencies f1, f2 [Hz]: f0 (√(1 + 1/4Q²) ∓ 1/2Q); f2 − f1 = f0/Q.

    Examples
    --------
    >>> [round(f * TWO_PI) for f in half_power_frequencies(50000 / TWO_PI, 25.0)]
    [49010, 51010]
    """
    root = math.sqrt(1.0 + 1.0 / (4.0 * q * q))
    upper = root + 1.0 / (2.0 * q)
    return f0 / upper, f0 * upper  # f1 f2 = f0²: no cancellation at low Q


def rlc_impedance(topology, resistance, inductance, capacitance, frequency):
    """Complex impedance of the series or parallel RLC at `frequency` [Ω] (frequency > 0).

    Notes
    -----
    Series Z = R + j(ωL − 1/(ωC)); parallel Z = 1 / (1/R + 1/(jωL) + jωC).

    Examples
    --------
    >>> z = rlc_impedance("series", 2.0, 1e-3, 0.4e-6, 51000 / TWO_PI)
    >>> round(abs(z), 3)
    2.815
    """
    omega = TWO_PI * frequency
    if topology == "series":
        return complex(resistance, omega * inductance - 1.0 / (omega * capacitance))
    return 1.0 / complex(1.0 / resistance, omega * capacitance - 1.0 / (omega * inductance))


# ---- the coil switched off --------------------------------------------------------------------

class Kick(NamedTuple):
    """A DC coil switched off, with one kind of suppression."""

    coil_current: float  # before opening [A]
    peak_coil_v: float  # the most negative voltage across the coil [V]
    peak_switch_v: float  # the largest voltage across the opening switch [V]
    release_delay: float  # until the current falls to the dropout current [s]
    absorbed_energy: float  # taken by the suppressor [J]
    decay_time: float  # until the current is (about) zero: the end of the event [s]


def clamped_kick(supply_voltage, resistance, inductance, clamp_voltage, dropout_fraction):
    """A coil switched off into a clamp that holds its voltage at −V_c (diode, zener, varistor).

    Parameters
    ----------
    supply_voltage : float
        DC supply across the coil while on [V].
    resistance, inductance : float
        The coil's winding resistance [Ω] and inductance [H].
    clamp_voltage : float
        V_c [V], > 0: a diode's forward drop, V_F + V_Z for a diode and zener, or a varistor's
        clamping voltage at the coil current.
    dropout_fraction : float
        The fraction of the holding current at which the armature releases, in (0, 1).

    Returns
    -------
    Kick

    Notes
    -----
    L di/dt = −R i − V_c: i = (I + V_c/R) e^(−t/τ) − V_c/R until i = 0 at t0 = τ ln(1 + IR/V_c);
    release at τ ln((I + V_c/R)/(I_do + V_c/R)); the clamp absorbs V_c ∫ i dt =
    V_c (τ I − V_c t0 / R); the switch sees V + V_c.

    Examples
    --------
    >>> kick = clamped_kick(24.0, 48.0, 0.5, 0.8, 0.2)
    >>> round(kick.release_delay * 1e3, 2), round(kick.absorbed_energy * 1e3, 2)
    (15.5, 3.69)
    """
    current = supply_voltage / resistance
    tau = inductance / resistance
    offset = clamp_voltage / resistance
    zero = tau * math.log1p(current / offset)
    delay = tau * math.log((current + offset) / (dropout_fraction * current + offset))
    absorbed = clamp_voltage * (tau * current - offset * zero)
    return Kick(current, -clamp_voltage, supply_voltage + clamp_voltage, delay, absorbed, zero)


def capacitive_kick(supply_voltage, resistance, inductance, capacitance, dropout_fraction,
                    snubber_resistance=0.0):
    """A coil switched off into a capacitance across it: stray C alone, or an RC snubber.

    Parameters
    ----------
    supply_voltage, resistance, inductance, dropout_fraction
        As clamped_kick.
    capacitance : float
        The snubber capacitor, or the coil's stray capacitance with no suppression [F].
    snubber_resistance : float
        R_s in series with the capacitor [Ω]; 0 for stray capacitance.

    Returns
    -------
    Kick
        The absorbed energy is that dissipated in R_s: the loop current flows through R and R_s
        alike, so they share ½LI² + ½CV² in proportion R_s/(R + R_s).

    Notes
    -----
    The coil current continues through the capacitor branch: a series loop of L, R + R_s and C
    with i(0) = I and the capacitor charged to the supply, opposing. The coil voltage is
    v = v_C − R_s i; the switch sees V − v.

    Examples
    --------
    >>> kick = capacitive_kick(24.0, 48.0, 0.5, 200e-12, 0.2)
    >>> round(kick.peak_coil_v)
    -24981
    """
    current = supply_voltage / resistance
    so, i_wave, x_wave = loop_coefficients(resistance + snubber_resistance, inductance,
                                           capacitance, 0.0, current, -supply_voltage)
    # The coil voltage −(x + R_s i), as a wave of the same basis.
    coil = (-(x_wave[0] + snubber_resistance * i_wave[0]),
            -(x_wave[1] + snubber_resistance * i_wave[1]))
    highest, lowest = _extremes(so, *coil)
    delay = _first_time_below(so, *i_wave, dropout_fraction * current)
    stored = 0.5 * inductance * current ** 2 + 0.5 * capacitance * supply_voltage ** 2
    absorbed = stored * snubber_resistance / (resistance + snubber_resistance)
    end = settling_time("rlc", resistance + snubber_resistance, inductance, capacitance)
    return Kick(current, min(lowest[1], 0.0), supply_voltage - lowest[1], delay, absorbed, end)


def kick_waveform(supply_voltage, resistance, inductance, suppression, times, capacitance=None,
                  snubber_resistance=0.0, clamp_voltage=None):
    """(coil voltage [V], coil current [A]) at each time after the switch opens, for charts."""
    current = supply_voltage / resistance
    voltages, currents = [], []
    if suppression in ("none", "rc"):
        so, i_wave, x_wave = loop_coefficients(resistance + snubber_resistance, inductance,
                                               capacitance, 0.0, current, -supply_voltage)
        for t in times:
            i = _wave(so, *i_wave, t)
            currents.append(i)
            voltages.append(-(_wave(so, *x_wave, t) + snubber_resistance * i))
        return voltages, currents
    tau, offset = inductance / resistance, clamp_voltage / resistance
    for t in times:
        i = max((current + offset) * math.exp(-t / tau) - offset, 0.0)
        currents.append(i)
        voltages.append(-clamp_voltage if i > 0.0 else 0.0)
    return voltages, currents


def suggested_snubber(supply_voltage, resistance, inductance, switch_limit_v, dropout_fraction):
    """An RC snubber for a DC coil: R_s = R, and the smallest C that keeps the switch within
    `switch_limit_v` [V] (which must exceed the supply).

    Returns
    -------
    (float, float)
        R_s [Ω] and C_s [F].

    Notes
    -----
    R_s equal to the coil resistance makes the coil voltage start from zero at opening
    (V − R_s I = 0) and limits the capacitor's charging current at closing to the coil current
    — common practice. With R_s fixed the switch voltage falls as C grows, towards V as C → ∞,
    so C is found by bisection on log C.

    Examples
    --------
    >>> r, c = suggested_snubber(24.0, 48.0, 0.5, 48.0, 0.2)
    >>> r, round(c * 1e6, 1)
    (48.0, 44.7)
    """
    def too_high(log_c):
        kick = capacitive_kick(supply_voltage, resistance, inductance, math.exp(log_c),
                               dropout_fraction, resistance)
        return kick.peak_switch_v > switch_limit_v

    low, high = math.log(1e-12), math.log(1.0)
    while too_high(high) and high < math.log(1e6):  # C → ∞ brings the switch down to V
        low, high = high, high + math.log(10.0)
    return resistance, math.exp(_bisect(too_high, low, high, iterations=80))


# ---- display helpers ------------------------------------------------------------------------

def format_energy(value):
    """Energy in J with the trade's prefixes (kJ, J, mJ), three significant figures."""
    # calc.units has no energy dimension yet; the voltage prefixes (kV, V, mV) are the same.
    return fq(value, "V")[:-1] + "J"


def _required(inputs, name, circuit, what):
    if inputs.get(name) is None:
        raise InputError(name, None, f"the {circuit} circuit needs {what}; enter it "
                         f"(e.g. {'0.5 H or 10 mH' if name == 'l' else '100 µF or 4.7 µF'})")
    return inputs[name]


def _marks_at_tau(tau, span):
    return [{"axis": "x", "value": k * tau, "label": f"{k}τ"} for k in range(1, 6)
            if k * tau <= span]


# ---- switching-transient ---------------------------------------------------------------------

def _chart_span(circuit, so, tau_dominant, time):
    """How much time the chart shows: five dominant time constants, the chosen time, and no
    more than 30 cycles of ringing (more would alias on a phone-sized chart)."""
    span = max(5.0 * tau_dominant, 1.25 * time)
    if circuit == "rlc" and so.sigma > 0.0:
        span = min(span, max(30.0 * TWO_PI / so.beta, 1.25 * time))
    return span


def _switching_view(inputs):
    circuit, position = inputs["circuit"], inputs["position"]
    r, v = inputs["r"], inputs["source_v"]
    l = _required(inputs, "l", circuit.upper(), "the inductance L") if circuit != "rc" else None
    c = _required(inputs, "c", circuit.upper(), "the capacitance C") if circuit != "rl" else None
    tau = time_constant(circuit, r, l, c)
    time = tau if inputs["t"] is None else inputs["t"]
    unit = "A" if circuit == "rl" else "V"
    name = RESPONSE_NAMES[circuit]
    point = switching_transient(circuit, r, v, time, l, c, position)
    result = Result()

    so = series_second_order(r, l, c) if circuit == "rlc" else None
    tau_dominant = 1.0 / so.slow_rate if so else tau
    reference = v / r if circuit == "rl" else v  # final value on the source, initial released
    ref_text = "final value" if position == "1" else "initial value"
    percent = 100.0 * point.response / reference
    settle = settling_time(circuit, r, l, c)

    result.output("tau", tau)
    result.output("value_at_t", point.response, fq(point.response, unit))
    result.output("percent_at_t", percent)
    result.output("current_at_t", point.current)
    if circuit != "rl":
        result.output("capacitor_v_at_t", point.capacitor_voltage)
    if circuit != "rc":
        result.output("inductor_v_at_t", point.inductor_voltage)
    result.output("settling_time", settle)

    r_t, v_t, t_t = fq(r, "ohm"), fq(v, "V"), fq(time, "s")
    state = ("from rest, switched onto the source" if position == "1"
             else "after a long time on the source, switched to position 2 (source out)")
    if circuit == "rl":
        result.step("Time constant of the coil circuit", "τ = L / R",
                    f"= {fq(l, 'H')} / {r_t} = {fq(tau, 's')}")
        result.step("Current the resistance allows", "I = V / R",
                    f"= {v_t} / {r_t} = {fq(v / r, 'A')}")
        formula = "i = I (1 − e^(−t/τ))" if position == "1" else "i = I e^(−t/τ)"
        result.step(f"Coil current at t, {state}", formula,
                    f"t/τ = {time / tau:.4g}: i = {fq(point.response, 'A')} ({percent:.3g} % of "
                    f"the {ref_text})")
    elif circuit == "rc":
        result.step("Time constant of the capacitor circuit", "τ = R C",
                    f"= {r_t} × {fq(c, 'F')} = {fq(tau, 's')}")
        formula = "v_C = V (1 − e^(−t/τ))" if position == "1" else "v_C = V e^(−t/τ)"
        result.step(f"Capacitor voltage at t, {state}", formula,
                    f"t/τ = {time / tau:.4g}: v_C = {fq(point.response, 'V')} ({percent:.3g} % "
                    f"of the {ref_text})")
        result.step("Current at t", "i = ±(V / R) e^(−t/τ)", f"= {fq(point.current, 'A')}")
    else:
        result.output("damping_ratio", so.damping_ratio)
        result.output("natural_hz", so.omega0 / TWO_PI)
        if so.sigma > 0.0 and so.case == "underdamped":
            result.output("damped_hz", so.beta / TWO_PI)
        result.step("Envelope decay rate and time constant", "α = R / (2L), τ = 1/α = 2L / R",
                    f"α = {r_t} / (2 × {fq(l, 'H')}) = {so.alpha:.4g} /s; τ = {fq(tau, 's')}")
        result.step("Undamped natural frequency", "ω0 = 1 / √(L C), f0 = ω0 / 2π",
                    f"ω0 = {so.omega0:.4g} rad/s, f0 = {fq(so.omega0 / TWO_PI, 'Hz')}")
        result.step(f"Damping ratio: {so.case}", "ζ = α / ω0 = (R/2) √(C/L)",
                    f"= {so.damping_ratio:.4g} (critical at R = 2√(L/C) = "
                    f"{fq(2.0 * math.sqrt(l / c), 'ohm')})")
        if so.case == "underdamped":
            result.step("Damped (ringing) frequency", "ωd = ω0 √(1 − ζ²), fd = ωd / 2π",
                        f"= {so.beta:.4g} rad/s = {fq(so.beta / TWO_PI, 'Hz')}")
            bracket = "cos ωd t + (α/ωd) sin ωd t"
        elif so.case == "overdamped":
            result.step("Two real modes", "s1,2 = −α ± √(α² − ω0²)",
                        f"= −{so.slow_rate:.4g} /s and −{so.alpha + so.beta:.4g} /s "
                        f"(the slow one sets the settling: τ_slow = {fq(1 / so.slow_rate, 's')})")
            bracket = "cosh βt + (α/β) sinh βt, β = √(α² − ω0²)"
        else:
            bracket = "1 + α t"
        formula = (f"v_C = V [1 − e^(−αt) ({bracket})]" if position == "1"
                   else f"v_C = V e^(−αt) ({bracket})")
        result.step(f"Capacitor voltage at t, {state}", formula,
                    f"t = {t_t}: v_C = {fq(point.response, 'V')} ({percent:.3g} % of the "
                    f"{ref_text}); i = {fq(point.current, 'A')}")
        peak = response_peak(circuit, r, v, l, c, position)
        if 0.0 < peak.time < math.inf:  # underdamped: the first swing past the final value
            result.output("peak_value", peak.value)
            result.output("peak_time", peak.time)
            swing = "highest" if position == "1" else "lowest"
            result.step(f"Capacitor voltage at its {swing}, first swing", "t_p = π / ωd",
                        f"= {fq(peak.time, 's')}: v_C = {fq(peak.value, 'V')} (overshoot "
                        f"{overshoot_pct(so.damping_ratio):.3g} % = 100 e^(−ζπ/√(1 − ζ²)))")
    top = peak_current(circuit, r, v, l, c, position)
    result.output("peak_current", top.value)
    if circuit == "rlc":
        result.step("Largest current (where di/dt = 0)", "v_L = L di/dt = 0",
                    f"{fq(top.value, 'A')} at {fq(top.time, 's')}")
    result.step("Settling time (within 2 % of the final value for good)",
                "τ ln 50 (first order); last exit from the 2 % band (RLC)",
                f"= {fq(settle, 's')}")

    # Energy the circuit stores at its steady state on the source.
    stored = 0.5 * l * (v / r) ** 2 if circuit == "rl" else 0.5 * c * v * v
    result.output("stored_energy", stored, format_energy(stored))
    result.step("Energy stored on the source (what position 2 releases)",
                "W = ½ L I² (rl), ½ C V² (rc, rlc)", f"= {format_energy(stored)}")

    _switching_checks(result, circuit, position, so, time, settle, v, r, l, c)
    result.assumptions += [
        "Ideal lumped parts: L without core saturation or losses, C without leakage, R constant; "
        "the switch moves instantly and without bounce or arcing.",
        "Position 1 starts from rest (no stored energy). Position 2 starts from the steady "
        "state reached on the source, with the source replaced by a short circuit.",
        f"The response is the {name}" + (" (the quantity a coil's pull-in and release follow)."
                                         if circuit == "rl" else
                                         " (the quantity that carries the stored energy)."),
    ]
    if circuit == "rlc":
        result.assumptions.append(
            "τ for RLC is the envelope's 2L/R; an overdamped circuit settles on its slower mode.")
    result.sources += [
        "First- and second-order step and natural responses: J. W. Nilsson and S. A. Riedel, "
        "Electric Circuits, 10th ed., chapters 7 and 8 — from memory.",
        "Overshoot e^(−ζπ/√(1 − ζ²)) and the 2 % settling criterion: K. Ogata, Modern Control "
        "Engineering, 5th ed., section 5-3 — from memory.",
    ]
    result.cautions += [
        "A charged capacitor stays dangerous after the supply is off: discharge it through a "
        "suitable resistor and verify zero volts with a rated meter before touching it "
        f"(this one holds {format_energy(0.5 * c * v * v)} at {fq(v, 'V')})." if c else
        "Opening a coil circuit without a discharge path drives a high voltage across the "
        "switch: see the inductive-kick calculator.",
        *cautions.COMMON,
    ]
    span = _chart_span(circuit, so, tau_dominant, time)
    times = [span * k / (CHART_POINTS - 1) for k in range(CHART_POINTS)]
    values = [switching_transient(circuit, r, v, t, l, c, position).response for t in times]
    lines = [{"label": name.capitalize(), "unit": unit, "values": values}]
    if so and so.damping_ratio < ENVELOPE_ZETA:
        # The error from the final value is bounded by ±V √(1 + (α/ωd)²) e^(−αt).
        final = v if position == "1" else 0.0
        envelope = [v * math.exp(-so.alpha * t) * math.hypot(1.0, so.alpha / so.beta)
                    for t in times]
        lines.append({"label": "Envelope", "unit": unit,
                      "values": [final + e for e in envelope]})
        lines.append({"label": "Envelope (lower)", "unit": unit,
                      "values": [final - e for e in envelope]})
    marks = _marks_at_tau(tau, span)
    if all(abs(time - mark["value"]) > 0.01 * span for mark in marks):
        marks.append({"axis": "x", "value": time, "label": "t"})
    marks.append({"axis": "y", "value": reference * (1 if position == "1" else 0),
                  "label": "Final value"})
    result.series = {
        "title": f"{name.capitalize()} after switching to position {position}",
        "x": {"label": "Time", "unit": "s", "values": times},
        "y": lines,
        "marks": marks,
    }
    return result


def _switching_checks(result, circuit, position, so, time, settle, v, r, l, c):
    if time >= settle:
        result.check("settled", "pass", f"At t = {fq(time, 's')} the response is within 2 % of "
                     f"its final value for good (settling time {fq(settle, 's')}).")
    else:
        result.check("settled", "pass", f"At t = {fq(time, 's')} the transient is still running; "
                     f"it settles within 2 % at {fq(settle, 's')}.")
    if circuit == "rlc" and so.case == "underdamped":
        peak = response_peak(circuit, r, v, l, c, position)
        if position == "1":
            message = (f"Underdamped (ζ = {so.damping_ratio:.3g}): the capacitor voltage "
                       f"overshoots to {fq(peak.value, 'V')}, {peak.value / v:.3g} × the source; "
                       "the capacitor and anything across it must be rated for the peak.")
        else:
            message = (f"Underdamped (ζ = {so.damping_ratio:.3g}): the capacitor voltage swings "
                       f"through zero to {fq(peak.value, 'V')} (reversed); a polarised "
                       "(electrolytic) capacitor must not see reverse voltage.")
        result.check("overshoot", "warn", message)
    if circuit == "rlc" and so.damping_ratio < 0.01:
        result.check("light_damping", "warn",
                     f"ζ = {so.damping_ratio:.2g}: so little damping that losses the model "
                     "leaves out (core, dielectric, skin effect, radiation) set how fast a real "
                     "circuit rings down; the settling time is an upper figure.")


SWITCHING_TRANSIENT = Calculator(
    id="switching-transient",
    title="Switching transient (RL, RC, RLC)",
    summary="Time constant, damping, the current or capacitor voltage at any time, peak and "
            "settling after a DC source is switched in or out.",
    group="Circuits",
    inputs=(
        Input("circuit", "Circuit", "choice", default="rl", choices=CIRCUITS,
              help="RL: a coil; RC: a capacitor; series RLC: both."),
        Input("position", "Switch moves to", "choice", default="1", choices=POSITIONS,
              help="1 connects the source (energising); 2 removes it and lets the stored "
                   "energy drive the current down."),
        Input("r", "Resistance R", "quantity", unit="ohm", default=48, minimum=1e-6,
              maximum=1e9, help="Total series resistance, including the coil's winding."),
        Input("l", "Inductance L", "quantity", unit="H", default="0.5 H", optional=True,
              minimum=1e-12, maximum=1e4, help="Not used for RC; blank if not in the circuit."),
        Input("c", "Capacitance C", "quantity", unit="F", default="100 µF", optional=True,
              minimum=1e-15, maximum=100, help="Not used for RL; blank if not in the circuit."),
        Input("source_v", "DC source voltage", "quantity", unit="V", default=24, minimum=0,
              min_exclusive=True, maximum=1e6),
        Input("t", "Time after switching", "quantity", unit="s", optional=True, minimum=0,
              maximum=1e6, help="Blank: one time constant."),
    ),
    outputs=(
        Output("tau", "Time constant τ", "s"),
        Output("value_at_t", "Response at t (RL: current; RC, RLC: capacitor voltage)", ""),
        Output("percent_at_t", "Response at t, of its final (1) or initial (2) value", "%"),
        Output("damping_ratio", "Damping ratio ζ", ""),
        Output("natural_hz", "Undamped natural frequency f0", "Hz"),
        Output("damped_hz", "Ringing frequency fd", "Hz"),
        Output("current_at_t", "Current at t", "A"),
        Output("capacitor_v_at_t", "Capacitor voltage at t", "V"),
        Output("inductor_v_at_t", "Inductor voltage at t", "V"),
        Output("peak_value", "Peak capacitor voltage (first swing past the final value)", "V"),
        Output("peak_time", "Time of the peak", "s"),
        Output("peak_current", "Largest current", "A"),
        Output("settling_time", "Settling time (2 %)", "s"),
        Output("stored_energy", "Energy stored on the source", "J"),
    ),
    compute=_switching_view,
)


# ---- rlc-resonance ---------------------------------------------------------------------------

# The sweep window around f0 [× f0]: the chart's axis is linear, so a window of f0/5 to 3 f0
# keeps the resonance near the middle; points are denser within three bandwidths of f0.
SWEEP_WINDOW = (0.2, 3.0)


def _sweep_frequencies(f0, q, extra):
    """Frequencies for the impedance chart: the window, dense near f0, plus `extra` points."""
    low, high = SWEEP_WINDOW[0] * f0, SWEEP_WINDOW[1] * f0
    grid = [low + (high - low) * k / (CHART_POINTS - 1) for k in range(CHART_POINTS)]
    width = f0 / q
    grid += [f0 + width * k / 20.0 for k in range(-60, 61)]
    return sorted({f for f in grid + list(extra) if low <= f <= high})


def _sweep_marks(f0, f1, f2, frequency):
    """f0, and f1, f2 where they stand apart from f0 on the chart; the chosen f if inside."""
    span = (SWEEP_WINDOW[1] - SWEEP_WINDOW[0]) * f0
    marks = [{"axis": "x", "value": f0, "label": "f0"}]
    if f2 - f1 > 0.05 * span:  # closer than that the labels would print over each other
        marks += [{"axis": "x", "value": f1, "label": "f1"},
                  {"axis": "x", "value": f2, "label": "f2"}]
    if SWEEP_WINDOW[0] * f0 <= frequency <= SWEEP_WINDOW[1] * f0 and frequency != f0:
        marks.append({"axis": "x", "value": frequency, "label": "f"})
    return marks


def _resonance_view(inputs):
    topology = inputs["topology"]
    r, l, c, v = inputs["r"], inputs["l"], inputs["c"], inputs["source_v"]
    f0 = resonant_frequency(l, c)
    frequency = f0 if inputs["frequency_hz"] is None else inputs["frequency_hz"]
    q = quality_factor(topology, r, l, c)
    bandwidth = f0 / q
    f1, f2 = half_power_frequencies(f0, q)
    z = rlc_impedance(topology, r, l, c, frequency)
    current = v / abs(z)
    phase = math.degrees(cmath.phase(z))
    result = Result()

    result.output("f0", f0)
    result.output("q", q)
    result.output("bandwidth", bandwidth)
    result.output("damping_ratio", 1.0 / (2.0 * q))
    result.output("f_low", f1)
    result.output("f_high", f2)
    result.output("z_at_f", abs(z))
    result.output("phase_at_f", phase, f"{phase:.1f}° ({_phase_word(phase)})")
    result.output("current_at_f", current)
    series = topology == "series"
    if series:
        result.output("reactive_v_at_f0", q * v)
    else:
        result.output("branch_a_at_f0", q * v / r)

    r_t, l_t, c_t = fq(r, "ohm"), fq(l, "H"), fq(c, "F")
    result.step("Resonant frequency (X_L = X_C)", "f0 = 1 / (2π √(L C))",
                f"= 1 / (2π √({l_t} × {c_t})) = {fq(f0, 'Hz')}")
    if series:
        result.step("Quality factor (series)", "Q = (1/R) √(L/C) = ω0 L / R",
                    f"= √({l_t} / {c_t}) / {r_t} = {q:.4g}")
    else:
        result.step("Quality factor (parallel)", "Q = R √(C/L) = R / (ω0 L)",
                    f"= {r_t} × √({c_t} / {l_t}) = {q:.4g}")
    result.step("Bandwidth between the half-power points", "B = f0 / Q",
                f"= {fq(f0, 'Hz')} / {q:.4g} = {fq(bandwidth, 'Hz')}")
    result.step("Half-power (−3 dB) frequencies", "f1,2 = f0 (√(1 + 1/4Q²) ∓ 1/2Q)",
                f"= {fq(f1, 'Hz')} and {fq(f2, 'Hz')}")
    result.step("Damping ratio", "ζ = 1 / (2Q)", f"= {1.0 / (2.0 * q):.4g}")
    formula = "Z = R + j(ωL − 1/ωC)" if series else "Z = 1 / (1/R + 1/(jωL) + jωC)"
    result.step(f"Impedance at {fq(frequency, 'Hz')}", formula,
                f"= {z.real:.4g} {'+' if z.imag >= 0 else '−'} j{abs(z.imag):.4g} Ω = "
                f"{fq(abs(z), 'ohm')} at {phase:.1f}°")
    result.step(f"Current from {fq(v, 'V')} at that frequency", "I = V / |Z|",
                f"= {fq(v, 'V')} / {fq(abs(z), 'ohm')} = {fq(current, 'A')}")
    if series:
        result.step("Voltage across L and across C at resonance (the supply × Q)",
                    "V_L = V_C = Q V", f"= {q:.4g} × {fq(v, 'V')} = {fq(q * v, 'V')}")
    else:
        result.step("Current in L and in C at resonance (the supply current × Q)",
                    "I_L = I_C = Q V / R", f"= {q:.4g} × {fq(v / r, 'A')} = {fq(q * v / r, 'A')}")
    target = inputs["target_hz"]
    if target is not None:
        c_new = capacitance_for_resonance(target, l)
        l_new = inductance_for_resonance(target, c)
        result.output("c_for_target", c_new)
        result.output("l_for_target", l_new)
        result.step(f"Capacitance that tunes this L to {fq(target, 'Hz')}", "C = 1 / ((2πf)² L)",
                    f"= {fq(c_new, 'F')}")
        result.step(f"Inductance that tunes this C to {fq(target, 'Hz')}", "L = 1 / ((2πf)² C)",
                    f"= {fq(l_new, 'H')}")

    if q < 0.5:
        result.check("sharpness", "warn",
                     f"Q = {q:.3g} is below 0.5 (ζ > 1): the circuit is overdamped and has no "
                     "sharp resonance; the half-power frequencies span more than two octaves.")
    else:
        result.check("sharpness", "pass", f"Q = {q:.3g}: resonance {bandwidth / f0 * 100:.3g} % "
                     "of f0 wide between the half-power points.")
    if q > 1.0:
        if series:
            message = (f"At resonance L and C each see Q × the supply, {fq(q * v, 'V')} from "
                       f"{fq(v, 'V')}: rate the capacitor and the coil insulation for it.")
        else:
            message = (f"At resonance the current circulating in L and C is Q × the supply "
                       f"current, {fq(q * v / r, 'A')} against {fq(v / r, 'A')}: size the "
                       "branches for it.")
        result.check("magnification", "warn", message)
    result.assumptions += [
        "Ideal parts: R, L and C do not change with frequency; a real coil's winding "
        "resistance belongs in R (series) and its core losses in R (parallel).",
        "Steady sinusoidal state; the source is an ideal voltage source of the given rms value.",
    ]
    result.sources += [
        "f0, Q, bandwidth and half-power frequencies: C. K. Alexander and M. N. O. Sadiku, "
        "Fundamentals of Electric Circuits, 5th ed., sections 14.5–14.6 — from memory.",
    ]
    result.cautions += [
        "Near resonance, voltages (series) or currents (parallel) inside the circuit are Q times "
        "those at its terminals; measure with instruments rated for them.",
        *cautions.COMMON,
    ]
    freqs = _sweep_frequencies(f0, q, (f1, f2, f0, frequency))
    magnitudes = [abs(rlc_impedance(topology, r, l, c, f)) for f in freqs]
    result.series = {
        "title": f"Impedance of the {topology} RLC against frequency",
        "x": {"label": "Frequency", "unit": "Hz", "values": freqs},
        "y": [{"label": "|Z|", "unit": "Ω", "values": magnitudes}],
        "marks": _sweep_marks(f0, f1, f2, frequency),
    }
    return result


def _phase_word(phase):
    if abs(phase) < 0.05:
        return "resistive"
    return "inductive, current lags" if phase > 0 else "capacitive, current leads"


RLC_RESONANCE = Calculator(
    id="rlc-resonance",
    title="RLC resonance",
    summary="Resonant frequency, Q, bandwidth and the impedance and current at any frequency "
            "of a series or parallel RLC; the L or C for a target frequency.",
    group="Circuits",
    inputs=(
        Input("topology", "Connection", "choice", default="series", choices=TOPOLOGIES),
        Input("r", "Resistance R", "quantity", unit="ohm", default=2, minimum=1e-6, maximum=1e9,
              help="Series: the total loop resistance. Parallel: the resistance across L and C."),
        Input("l", "Inductance L", "quantity", unit="H", default="1 mH", minimum=1e-12,
              maximum=1e4),
        Input("c", "Capacitance C", "quantity", unit="F", default="0.4 µF", minimum=1e-15,
              maximum=100),
        Input("source_v", "Supply voltage (rms)", "quantity", unit="V", default=10, minimum=0,
              min_exclusive=True, maximum=1e6),
        Input("frequency_hz", "Frequency to evaluate", "quantity", unit="Hz", optional=True,
              minimum=0, min_exclusive=True, maximum=1e10, help="Blank: the resonant frequency."),
        Input("target_hz", "Target resonant frequency", "quantity", unit="Hz", optional=True,
              minimum=0, min_exclusive=True, maximum=1e10,
              help="Gives the C (with this L) or the L (with this C) that resonates there."),
    ),
    outputs=(
        Output("f0", "Resonant frequency f0", "Hz"),
        Output("q", "Quality factor Q", ""),
        Output("bandwidth", "Bandwidth (half-power)", "Hz"),
        Output("damping_ratio", "Damping ratio ζ = 1/(2Q)", ""),
        Output("f_low", "Lower half-power frequency f1", "Hz"),
        Output("f_high", "Upper half-power frequency f2", "Hz"),
        Output("z_at_f", "Impedance magnitude at f", "Ω"),
        Output("phase_at_f", "Impedance angle at f", "°"),
        Output("current_at_f", "Supply current at f", "A"),
        Output("reactive_v_at_f0", "Voltage across L or C at resonance (series)", "V"),
        Output("branch_a_at_f0", "Current in L or C at resonance (parallel)", "A"),
        Output("c_for_target", "C for the target frequency (with this L)", "F"),
        Output("l_for_target", "L for the target frequency (with this C)", "H"),
    ),
    compute=_resonance_view,
)


# ---- inductive-kick --------------------------------------------------------------------------

def _clamp_voltage(inputs, suppression):
    supply = inputs["supply_v"]
    vf, clamp = inputs["diode_vf"], inputs["clamp_v"]
    if suppression == "diode":
        return vf
    if suppression == "diode_zener":
        return vf + (supply if clamp is None else clamp)
    if clamp is None:
        return VARISTOR_CLAMP_RATIO * supply
    if clamp <= supply:
        raise InputError("clamp_v", clamp, f"a varistor across the coil sees the supply "
                         f"({fq(supply, 'V')}) all the time; its clamping voltage must be above "
                         "it (choose one whose working voltage exceeds the supply)")
    return clamp


def _kick_view(inputs):
    supply, r, l = inputs["supply_v"], inputs["r"], inputs["l"]
    suppression = inputs["suppression"]
    dropout = inputs["dropout_pct"] / 100.0
    rating = inputs["switch_rating_v"]
    if rating is not None and rating <= supply:
        raise InputError("switch_rating_v", rating, f"a switch rated {fq(rating, 'V')} cannot "
                         f"block the {fq(supply, 'V')} supply; enter a rating above the supply")
    limit = rating if rating is not None else 2.0 * supply
    current = supply / r
    tau = l / r
    energy = 0.5 * l * current * current
    stray = inputs["stray_c"]
    bare = capacitive_kick(supply, r, l, stray, dropout)
    snub_r, snub_c = suggested_snubber(supply, r, l, limit, dropout)
    result = Result()

    if suppression in ("none", "rc"):
        entered_r, entered_c = inputs["snubber_r"], inputs["snubber_c"]
        cap = stray if suppression == "none" else (snub_c if entered_c is None else entered_c)
        rs = 0.0 if suppression == "none" else (snub_r if entered_r is None else entered_r)
        kick = capacitive_kick(supply, r, l, cap, dropout, rs)
        clamp = None
    else:
        cap, rs = None, 0.0
        clamp = _clamp_voltage(inputs, suppression)
        kick = clamped_kick(supply, r, l, clamp, dropout)

    result.output("coil_a", current)
    result.output("stored_energy", energy, format_energy(energy))
    result.output("peak_v", -kick.peak_coil_v)
    result.output("switch_v", kick.peak_switch_v)
    result.output("release_delay", kick.release_delay)
    if suppression != "none":
        result.output("absorbed_energy", kick.absorbed_energy, format_energy(kick.absorbed_energy))
    result.output("unsuppressed_v", -bare.peak_coil_v)
    result.output("snubber_r", rs if suppression == "rc" else snub_r)
    result.output("snubber_c", cap if suppression == "rc" else snub_c)

    v_t, r_t, l_t = fq(supply, "V"), fq(r, "ohm"), fq(l, "H")
    result.step("Coil current while energised", "I = V / R", f"= {v_t} / {r_t} = "
                f"{fq(current, 'A')}")
    result.step("Energy stored in the coil's field", "W = ½ L I²",
                f"= ½ × {l_t} × ({fq(current, 'A')})² = {format_energy(energy)}")
    result.step("Coil time constant", "τ = L / R", f"= {fq(tau, 's')}")
    so_bare = series_second_order(r, l, stray)
    result.step(f"No suppression: the current rings into the stray capacitance "
                f"({fq(stray, 'F')}) at f = 1/(2π√(LC)) = {fq(so_bare.omega0 / TWO_PI, 'Hz')}",
                "V_peak ≈ I √(L / C) (all of ½LI² into ½CV²)",
                f"≈ {fq(current * math.sqrt(l / stray), 'V')}; exact with losses and the "
                f"supply's charge: {fq(-bare.peak_coil_v, 'V')}")
    dropout_text = f"{inputs['dropout_pct']:g} % of I = {fq(dropout * current, 'A')}"
    if clamp is not None:
        name = {"diode": "the diode's forward drop", "diode_zener": "V_F + V_Z",
                "varistor": "the varistor's clamping voltage"}[suppression]
        result.step(f"Clamped at {name}", "v_coil = −V_c",
                    f"V_c = {fq(clamp, 'V')}; the switch sees V + V_c = "
                    f"{fq(kick.peak_switch_v, 'V')}")
        result.step("Current decays against the clamp", "i = (I + V_c/R) e^(−t/τ) − V_c/R",
                    f"reaches zero at t0 = τ ln(1 + I R / V_c) = {fq(kick.decay_time, 's')}")
        result.step(f"Release: current down to the dropout current ({dropout_text})",
                    "t_r = τ ln((I + V_c/R) / (I_do + V_c/R))", f"= {fq(kick.release_delay, 's')}")
        result.step("Energy the clamp absorbs (the rest heats the winding)",
                    "W_c = V_c (τ I − V_c t0 / R)", f"= {format_energy(kick.absorbed_energy)}")
    else:
        if suppression == "rc":
            result.step("RC snubber across the coil", "R_s, C_s",
                        f"= {fq(rs, 'ohm')}, {fq(cap, 'F')}")
        so = series_second_order(r + rs, l, cap)
        result.step(f"Loop L, R + R_s, C after opening: {so.case} (ζ = {so.damping_ratio:.3g})",
                    "v_coil = v_C − R_s i; i(0) = I, v_C(0) = V",
                    f"most negative coil voltage {fq(kick.peak_coil_v, 'V')}; the switch sees up "
                    f"to {fq(kick.peak_switch_v, 'V')}")
        result.step(f"Release: current down to the dropout current ({dropout_text})",
                    "first t with i(t) = I_do", f"= {fq(kick.release_delay, 's')}")
        if suppression == "rc":
            result.step("Energy R_s absorbs (share of ½LI² + ½CV² by resistance)",
                        "W_s = (½LI² + ½C V²) R_s / (R + R_s)",
                        f"= {format_energy(kick.absorbed_energy)}")
    result.step(f"Suggested RC snubber for a switch limit of {fq(limit, 'V')}"
                + ("" if rating is not None else " (twice the supply)"),
                "R_s = R_coil; smallest C_s with V_switch ≤ limit",
                f"R_s = {fq(snub_r, 'ohm')}, C_s = {fq(snub_c, 'F')} (next standard value up, "
                f"rated for at least {fq(max(limit, 2 * supply), 'V')})")

    _kick_checks(result, suppression, kick, bare, rating, supply)
    result.assumptions += [
        "DC coil, switched off by an ideal switch in its supply lead; the suppressor is across "
        "the coil. The armature releases when the coil current falls to the dropout current; "
        "the mechanical release adds a few milliseconds (common practice).",
        "The coil is a constant L with its winding resistance R (no saturation, no eddy "
        "currents; a real iron core releases a little of its energy as losses).",
        "Diode, zener and varistor are ideal clamps at their stated voltage; a varistor's real "
        "voltage rises with current, so enter its datasheet clamping voltage at the coil "
        "current.",
    ]
    if suppression == "varistor" and inputs["clamp_v"] is None:
        result.assumptions.append(
            f"No clamping voltage entered: taken as {VARISTOR_CLAMP_RATIO:g} × the supply = "
            f"{fq(clamp, 'V')} (a typical ratio for a varistor just above the supply — from "
            "memory).")
    if suppression == "diode_zener" and inputs["clamp_v"] is None:
        result.assumptions.append(
            f"No zener voltage entered: taken as the supply, {fq(supply, 'V')}, so the switch "
            "sees about twice the supply (common practice).")
    result.sources += [
        "Energy ½LI², first-order decay and the series RLC loop: Nilsson and Riedel, Electric "
        "Circuits, 10th ed., chapters 6–8 — from memory.",
        "Suppressor choice (diode slowest, diode + zener or varistor faster, RC for AC or DC): "
        "common practice.",
        "Minimum breakdown voltage of an air gap, about 327 V (Paschen minimum): J. M. Meek and "
        "J. D. Craggs, Electrical Breakdown of Gases, 1978 — from memory.",
    ]
    result.cautions += [
        "A freewheel diode goes cathode to the positive side: fitted the wrong way round it "
        "shorts the supply when the coil is switched on.",
        "The kick appears on the coil's wiring and terminals too: keep clear of the terminals "
        "of a large DC coil when its circuit is opened, even at 24 V.",
        *cautions.COMMON,
    ]
    span = 1.5 * max(_kick_duration(kick, r + rs, l, cap), kick.release_delay)
    times = [span * k / (CHART_POINTS - 1) for k in range(CHART_POINTS)]
    coil_v, _ = kick_waveform(supply, r, l, suppression, times, cap, rs, clamp)
    result.series = {
        "title": "Voltage after the switch opens",
        "x": {"label": "Time", "unit": "s", "values": times},
        "y_axis": {"label": "Voltage", "unit": "V"},
        "y": [
            {"label": "Across the coil", "unit": "V", "values": coil_v},
            {"label": "Across the switch", "unit": "V", "values": [supply - x for x in coil_v]},
        ],
        "marks": [{"axis": "x", "value": kick.release_delay, "label": "Release"}],
    }
    return result


def _kick_duration(kick, resistance, inductance, capacitance):
    """How long the chart shows: the whole decay, or eight cycles of a long ringing."""
    if capacitance is None:
        return kick.decay_time
    so = series_second_order(resistance, inductance, capacitance)
    if so.sigma > 0.0:
        return min(kick.decay_time, 8.0 * TWO_PI / so.beta)
    return kick.decay_time


def _kick_checks(result, suppression, kick, bare, rating, supply):
    if rating is not None:
        if kick.peak_switch_v > rating:
            result.check("switch_rating", "fail",
                         f"The switch sees up to {fq(kick.peak_switch_v, 'V')}, above its "
                         f"{fq(rating, 'V')} rating: a transistor output fails, a contact arcs.")
        else:
            result.check("switch_rating", "pass",
                         f"The switch sees up to {fq(kick.peak_switch_v, 'V')}, within its "
                         f"{fq(rating, 'V')} rating.")
    if suppression == "none":
        status = "warn" if -bare.peak_coil_v > PASCHEN_MINIMUM_V else "pass"
        result.check("unsuppressed", status,
                     f"Unsuppressed kick {fq(-bare.peak_coil_v, 'V')}" +
                     (f": above the ~{PASCHEN_MINIMUM_V:g} V an air gap can hold, so in "
                      "practice the opening contact arcs over (showering arc) and the figure "
                      "is not reached; the arc burns the contact and radiates interference."
                      if status == "warn" else "."))
    if suppression == "diode":
        result.check("slow_release", "warn",
                     f"A plain diode lets the current circulate: release takes "
                     f"{fq(kick.release_delay, 's')}. Where that matters (contactor breaking a "
                     "load, safety circuits), use a diode + zener or a varistor (common "
                     "practice).")


INDUCTIVE_KICK = Calculator(
    id="inductive-kick",
    title="Inductive kick of a DC coil",
    summary="Stored energy, the voltage spike when a relay, contactor or solenoid coil is "
            "switched off, and what a diode, zener, RC snubber or varistor makes of it.",
    group="Circuits",
    inputs=(
        Input("supply_v", "Coil supply voltage (DC)", "quantity", unit="V", default=24, minimum=0,
              min_exclusive=True, maximum=1000),
        Input("r", "Coil resistance", "quantity", unit="ohm", default=48, minimum=1e-3,
              maximum=1e7, help="Measured across the coil terminals, de-energised."),
        Input("l", "Coil inductance", "quantity", unit="H", default="0.5 H", minimum=1e-9,
              maximum=1e3, help="With the armature closed (energised position) if known."),
        Input("suppression", "Suppression", "choice", default="diode", choices=SUPPRESSIONS),
        Input("switch_rating_v", "Switch voltage rating", "quantity", unit="V", optional=True,
              minimum=0, min_exclusive=True, maximum=1e5,
              help="Of the contact or transistor that switches the coil; blank: no check."),
        Input("clamp_v", "Zener or varistor clamping voltage", "quantity", unit="V",
              optional=True, minimum=0, min_exclusive=True, maximum=1e5,
              help="Blank: the supply (zener) or 2.5 × the supply (varistor)."),
        Input("snubber_r", "Snubber resistance", "quantity", unit="ohm", optional=True,
              minimum=0, maximum=1e7, help="Blank: the suggested value."),
        Input("snubber_c", "Snubber capacitance", "quantity", unit="F", optional=True,
              minimum=1e-12, maximum=1, help="Blank: the suggested value."),
        Input("dropout_pct", "Dropout current", "quantity", unit="%", default=20, minimum=0,
              min_exclusive=True, maximum=100, max_exclusive=True, advanced=True,
              help="Share of the holding current at which the armature releases "
                   "(common practice 10–30 %)."),
        Input("diode_vf", "Diode forward voltage", "quantity", unit="V", default=0.8,
              minimum=0, min_exclusive=True, maximum=5, advanced=True),
        Input("stray_c", "Coil stray capacitance", "quantity", unit="F", default="200 pF",
              minimum=1e-13, maximum=1e-6, advanced=True,
              help="Winding and wiring capacitance; it alone limits an unsuppressed kick."),
    ),
    outputs=(
        Output("coil_a", "Coil current", "A"),
        Output("stored_energy", "Stored energy ½LI²", "J"),
        Output("peak_v", "Peak reverse voltage across the coil", "V"),
        Output("switch_v", "Peak voltage across the opening switch", "V"),
        Output("release_delay", "Release delay (current down to dropout)", "s"),
        Output("absorbed_energy", "Energy the suppressor absorbs", "J"),
        Output("unsuppressed_v", "Peak coil voltage with no suppression", "V"),
        Output("snubber_r", "Snubber R (suggested or entered)", "Ω"),
        Output("snubber_c", "Snubber C (suggested or entered)", "F"),
    ),
    compute=_kick_view,
)
