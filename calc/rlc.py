"""RLC circuits: DC switching transients of RL, RC and series RLC loops, series and parallel
resonance, and the voltage kick of a DC coil switched off, with and without suppression.

Quantities follow the nomenclature page: resistance [Ω], inductance [H], capacitance [F],
voltage [V], current [A], time [s], frequency [Hz], energy [J].
"""

import math
from typing import NamedTuple

from calc.errors import ParameterError

TWO_PI = 2.0 * math.pi

# Settling band: the response stays within 2 % of its final value. K. Ogata, Modern Control
# Engineering, 5th ed., section 5-3 (transient-response specifications) — from memory.
SETTLING_BAND = 0.02

# Below |σ| t² = 1e-4 the damped-oscillation functions are taken from their Taylor series, which
# is exact there to better than 1e-16 and avoids cancellation near critical damping.
SERIES_LIMIT = 1e-4

# ζ within this of 1 is called critically damped; the formulas are continuous through it.
CRITICAL_BAND = 1e-9

# Air breaks down at no less than about 327 V across any gap (the minimum of Paschen's curve):
# a computed kick above this is limited in practice by an arc at the opening contact. J. M.
# Meek and J. D. Craggs, Electrical Breakdown of Gases, 1978, ch. 6 — from memory.
PASCHEN_MINIMUM_V = 327.0

# The circuits, switch positions, resonant connections and coil suppressions the functions know.
CIRCUIT_KINDS = ("rl", "rc", "rlc")
POSITION_KINDS = ("1", "2")
TOPOLOGY_KINDS = ("series", "parallel")
SUPPRESSION_KINDS = ("none", "diode", "diode_zener", "rc", "varistor")


def _one_of(parameter, value, allowed):
    """`value`, if it is one of `allowed`; else a ParameterError that lists them."""
    if value not in allowed:
        raise ParameterError(parameter, value, f"{value!r} is not one of {allowed}")
    return value


# ---- the second-order loop ------------------------------------------------------------------

class SecondOrder(NamedTuple):
    """The characteristic numbers of a series RLC loop."""

    alpha: float  # neper frequency R / 2L: the envelope decays as e^(−αt) [1/s]
    omega0: float  # undamped natural angular frequency 1/√(LC) [rad/s]
    damping_ratio: float  # ζ = α / ω0 [-]
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
    resistance, inductance, capacitance : float
        Total series resistance R [Ω], L [H] and C [F], each > 0.

    Returns
    -------
    SecondOrder
        α [1/s], ω0 [rad/s], ζ [-], σ = ω0² − α² [1/s²] and β = √|σ| [1/s].

    Notes
    -----
    L di/dt + R i + v_C = V gives s² + 2α s + ω0² = 0, α = R/(2L), ω0 = 1/√(LC), ζ = α/ω0 =
    (R/2)√(C/L): underdamped for ζ < 1 (ωd = ω0√(1 − ζ²)), critical at R = 2√(L/C), else over.

    References
    ----------
    J. W. Nilsson and S. A. Riedel, *Electric Circuits*, 10th ed., sections 8.3–8.4 — from memory.

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
    """(e^(−αt) C(t), e^(−αt) S(t)): C'' = −σC, S = ∫C, C(0) = 1, S(0) = 0. Underdamped
    C = cos βt, S = sin(βt)/β; overdamped cosh and sinh; critical 1 and t."""
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
    """The first one or two times t > 0 at which even·e^(−αt)C + odd·e^(−αt)S stops rising or
    falling: later extremes are each e^(−απ/β) times the one before (an overdamped or critical
    wave has at most one)."""
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


def _loop_coefficients(resistance, inductance, capacitance, source_voltage=0.0,
                       initial_current=0.0, initial_capacitor_voltage=0.0):
    """(SecondOrder, i wave [A], v_C − V wave [V]) of a series RLC loop: each wave the (even,
    odd) coefficients on the basis e^(−αt) C(t), e^(−αt) S(t) of _basis.

    With x = v_C − V: x'' + 2αx' + ω0²x = 0, x(0) = v0 − V, x'(0) = i0/C, so
    x(t) = e^(−αt)[x0 C + (i0/C + α x0) S] and i(t) = e^(−αt)[i0 C − (α i0 + x0/L) S]
    (Nilsson and Riedel, Electric Circuits, 10th ed., sections 8.3–8.4 — from memory).
    """
    so = series_second_order(resistance, inductance, capacitance)
    x0 = initial_capacitor_voltage - source_voltage
    current = (initial_current, -(so.alpha * initial_current + x0 / inductance))
    voltage = (x0, initial_current / capacitance + so.alpha * x0)
    return so, current, voltage


def _series_loop(resistance, time, inductance=None, capacitance=None, source_voltage=0.0,
                 initial_current=0.0, initial_capacitor_voltage=0.0):
    """(loop current [A], capacitor voltage [V]) of a series R, L, C loop `time` [s] after a DC
    source [V] is in it, from i0 [A] and v_C0 [V]; L None for RC, C None for RL (v_C = 0).

    RL: i = V/R + (i0 − V/R) e^(−t/τ), τ = L/R. RC: v_C = V + (v0 − V) e^(−t/τ), τ = RC,
    i = (V − v0)/R e^(−t/τ). RLC: _loop_coefficients, under-, critically and overdamped in one
    continuous form (Nilsson and Riedel, Electric Circuits, 10th ed., ch. 7–8 — from memory).
    """
    if capacitance is None:
        final = source_voltage / resistance
        decay = math.exp(-time * resistance / inductance)
        return final + (initial_current - final) * decay, 0.0
    if inductance is None:
        decay = math.exp(-time / (resistance * capacitance))
        step = source_voltage - initial_capacitor_voltage
        return step / resistance * decay, source_voltage - step * decay
    so, current, voltage = _loop_coefficients(resistance, inductance, capacitance,
                                             source_voltage, initial_current,
                                             initial_capacitor_voltage)
    return _wave(so, *current, time), source_voltage + _wave(so, *voltage, time)


# ---- switching transients -------------------------------------------------------------------

def time_constant(circuit, resistance, inductance=None, capacitance=None):
    """The time constant of an RL, RC or series RLC circuit.

    Parameters
    ----------
    circuit : str
        "rl", "rc" or "rlc" (series).
    resistance, inductance, capacitance : float or None
        Series resistance R [Ω], > 0; L [H] (rl, rlc) and C [F] (rc, rlc), else None.

    Returns
    -------
    float
        τ [s]: L/R (rl), RC (rc), or the envelope's 2L/R = 1/α (rlc).

    Notes
    -----
    A first-order response changes as e^(−t/τ); a series RLC's envelope as e^(−αt), α = R/(2L).

    References
    ----------
    Nilsson and Riedel, *Electric Circuits*, 10th ed., sections 7.1–7.2 and 8.3 — from memory.

    Examples
    --------
    >>> time_constant("rl", 48.0, 0.5), time_constant("rc", 1e3, capacitance=1e-6)
    (0.010416666666666666, 0.001)
    """
    circuit = _one_of("circuit", circuit, CIRCUIT_KINDS)
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
    if _one_of("position", position, POSITION_KINDS) == "1":
        return source_voltage, 0.0, 0.0
    if circuit == "rl":
        return 0.0, source_voltage / resistance, 0.0
    return 0.0, 0.0, source_voltage


def switching_transient(circuit, resistance, source_voltage, time, inductance=None,
                        capacitance=None, position="1"):
    """A DC switching transient of an RL, RC or series RLC circuit at one instant.

    Parameters
    ----------
    circuit, position : str
        "rl", "rc" or "rlc" (series); "1": the source switched onto a circuit at rest (step
        response), "2": after a long time on it, the source replaced by a short (natural).
    resistance, source_voltage, time, inductance, capacitance : float or None
        R [Ω], > 0; DC source [V]; time after switching [s], ≥ 0; L [H] (rl, rlc) and C [F]
        (rc, rlc), else None.

    Returns
    -------
    TransientPoint
        The response (rl: coil current [A]; rc, rlc: capacitor voltage [V]), the loop current
        [A], and the capacitor and inductor voltages [V].

    Notes
    -----
    v_L = V − R i − v_C around the loop. Position 2 starts from i = V/R (rl) or v_C = V (rc,
    rlc, with i = 0).

    References
    ----------
    Nilsson and Riedel, *Electric Circuits*, 10th ed., ch. 7 and sections 8.3–8.4 — from memory.

    Examples
    --------
    >>> round(switching_transient("rl", 48.0, 24.0, 0.5 / 48.0, inductance=0.5).response, 4)
    0.3161
    """
    circuit = _one_of("circuit", circuit, CIRCUIT_KINDS)
    source, i0, v0 = _initial_state(circuit, resistance, source_voltage, position)
    current, capacitor = _series_loop(resistance, time, None if circuit == "rc" else inductance,
                                      None if circuit == "rl" else capacitance, source, i0, v0)
    inductor = 0.0 if circuit == "rc" else source - resistance * current - capacitor
    return TransientPoint(current if circuit == "rl" else capacitor, current, capacitor, inductor)


def settling_time(circuit, resistance, inductance=None, capacitance=None, band=SETTLING_BAND):
    """Time after which the response stays within `band` of its final value.

    Parameters
    ----------
    circuit : str
        "rl", "rc" or "rlc" (series).
    resistance, inductance, capacitance : float or None
        Series resistance R [Ω], > 0; L [H] (rl, rlc) and C [F] (rc, rlc), else None.
    band : float
        Share of the total change [-] (0.02 for the 2 % criterion).

    Returns
    -------
    float
        Settling time [s], exact: τ ln(1/band) for first order; for RLC the last exit from the
        band (step and release alike).

    Notes
    -----
    Underdamped, the error e^(−αt)(cos ωd t + (α/ωd) sin ωd t) has its extremes at ωd t = kπ,
    of size e^(−αkπ/ωd); the last one above the band is followed by the crossing, found by
    bisection. The common estimate 4/(ζω0) is an envelope bound.

    References
    ----------
    K. Ogata, *Modern Control Engineering*, 5th ed., section 5-3 — from memory.

    Examples
    --------
    >>> round(settling_time("rl", 48.0, 0.5) * 1e3, 3)
    40.75
    """
    if _one_of("circuit", circuit, CIRCUIT_KINDS) != "rlc":
        return time_constant(circuit, resistance, inductance, capacitance) * math.log(1.0 / band)
    so = series_second_order(resistance, inductance, capacitance)
    even, odd = 1.0, so.alpha  # the normalised error, from rest: e^(−αt)(C + αS)
    if so.sigma <= 0.0 or so.case == "critically damped":
        return _first_time_below(so, even, odd, band)
    last_above = math.ceil(so.beta * math.log(1.0 / band) / (so.alpha * math.pi)) - 1
    start = last_above * math.pi / so.beta
    return _bisect(lambda t: abs(_wave(so, even, odd, t)) > band, start, start + math.pi / so.beta)


def _rlc_waves(resistance, source_voltage, inductance, capacitance, position):
    """(source in the loop, SecondOrder, i wave, v_C wave) of a series RLC set to `position`."""
    source, i0, v0 = _initial_state("rlc", resistance, source_voltage, position)
    return (source, *_loop_coefficients(resistance, inductance, capacitance, source, i0, v0))


class Peak(NamedTuple):
    time: float  # [s]; infinity for a value approached, not reached
    value: float  # [V] or [A]


def response_peak(circuit, resistance, source_voltage, inductance=None, capacitance=None,
                  position="1"):
    """The farthest the response swings: its maximum for a step, its minimum for a release.

    Parameters
    ----------
    circuit, position : str
        "rl", "rc" or "rlc" (series); "1" (step) or "2" (release), as switching_transient.
    resistance, source_voltage, inductance, capacitance : float or None
        R [Ω], > 0; DC source [V]; L [H] (rl, rlc) and C [F] (rc, rlc), else None.

    Returns
    -------
    Peak
        Time [s] and value ([A] for rl, [V] otherwise): the final (step, time infinite) or initial
        (release, time 0) value, or an underdamped rlc's first swing past the final value.

    Notes
    -----
    Underdamped, v_C peaks at t = π/ωd at V(1 + e^(−ζπ/√(1 − ζ²))) for a step from rest; a
    release swings to −V e^(−ζπ/√(1 − ζ²)). Otherwise the start or the final value.

    References
    ----------
    Ogata, *Modern Control Engineering*, 5th ed., 5-3 (t_p = π/ωd, overshoot) — from memory.

    Examples
    --------
    >>> p = response_peak("rlc", 280.0, 48.0, 0.1, 0.4e-6)
    >>> round(p.time * 1e3, 4), round(p.value, 2)
    (0.6545, 67.2)
    """
    if _one_of("circuit", circuit, CIRCUIT_KINDS) != "rlc":  # monotonic
        level = source_voltage / resistance if circuit == "rl" else source_voltage
        return Peak(0.0 if _one_of("position", position, POSITION_KINDS) == "2" else math.inf,
                    level)
    source, so, _, voltage = _rlc_waves(resistance, source_voltage, inductance, capacitance,
                                        position)
    highest, lowest = _extremes(so, *voltage)
    time, value = highest if position == "1" else lowest
    return Peak(time, source + value)


def peak_current(circuit, resistance, source_voltage, inductance=None, capacitance=None,
                 position="1"):
    """The largest loop current, by magnitude, and when it flows.

    Parameters
    ----------
    circuit, position : str
        "rl", "rc" or "rlc" (series); "1" (step) or "2" (release), as switching_transient.
    resistance, source_voltage, inductance, capacitance : float or None
        R [Ω], > 0; DC source [V]; L [H] (rl, rlc) and C [F] (rc, rlc), else None.

    Returns
    -------
    Peak
        Time [s] and magnitude [A]. RL on the source approaches V/R (time infinite); an RL
        release and both RC cases start at V/R (time 0).

    Notes
    -----
    RLC: i = ∓(V/L) e^(−αt) S(t), largest where tan ωd t = ωd/α (underdamped), at t = 1/α
    (critical), or t = ln(s2/s1)/(s1 − s2) (overdamped).

    References
    ----------
    Nilsson and Riedel, *Electric Circuits*, 10th ed., section 8.4 — from memory.

    Examples
    --------
    >>> p = peak_current("rlc", 280.0, 48.0, 0.1, 0.4e-6)
    >>> round(p.time * 1e6, 1), round(p.value, 5)
    (268.1, 0.06595)
    """
    if _one_of("circuit", circuit, CIRCUIT_KINDS) != "rlc":
        rising = circuit == "rl" and _one_of("position", position, POSITION_KINDS) == "1"
        return Peak(math.inf if rising else 0.0, source_voltage / resistance)
    _, so, current, _ = _rlc_waves(resistance, source_voltage, inductance, capacitance,
                                   position)
    highest, lowest = _extremes(so, *current)
    time, value = max((highest, lowest), key=lambda p: abs(p[1]))
    return Peak(time, abs(value))


def overshoot_pct(damping_ratio):
    """Percent overshoot of an underdamped second-order step response.

    Parameters
    ----------
    damping_ratio : float
        ζ [-], ≥ 0.

    Returns
    -------
    float
        M_p [%]; 0 for ζ ≥ 1.

    Notes
    -----
    M_p = 100 e^(−ζπ/√(1 − ζ²)).

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

def resonant_frequency(inductance, capacitance):
    """The frequency at which L and C resonate, series or parallel.

    Parameters
    ----------
    inductance, capacitance : float
        L [H] and C [F], > 0.

    Returns
    -------
    float
        f0 [Hz].

    Notes
    -----
    X_L = X_C at f0 = 1 / (2π √(LC)).

    References
    ----------
    C. K. Alexander and M. N. O. Sadiku, *Fundamentals of Electric Circuits*, 5th ed., sections
    14.5–14.6 — from memory.

    Examples
    --------
    >>> round(resonant_frequency(1e-3, 0.4e-6) * TWO_PI)
    50000
    """
    return 1.0 / (TWO_PI * math.sqrt(inductance) * math.sqrt(capacitance))


def resonant_partner(frequency, partner):
    """The C that resonates with an L at a frequency, or the L with a C (L and C are symmetric).

    Parameters
    ----------
    frequency : float
        Wanted resonant frequency [Hz], > 0.
    partner : float
        The L [H] (to find C) or the C [F] (to find L) already in the circuit, > 0.

    Returns
    -------
    float
        C [F] for an inductance, L [H] for a capacitance.

    Notes
    -----
    C = 1 / ((2πf)² L) and L = 1 / ((2πf)² C), from f = 1 / (2π √(LC)).

    References
    ----------
    Alexander and Sadiku, *Fundamentals of Electric Circuits*, 5th ed., 14.5 — from memory.

    Examples
    --------
    >>> [round(resonant_partner(f, x), 8) for f, x in ((50000 / TWO_PI, 1e-3), (1e3, 1e-6))]
    [4e-07, 0.0253303]
    """
    return 1.0 / ((TWO_PI * frequency) ** 2 * partner)


# IEC 60063:2015 preferred values, one decade: E6 (±20 %) and E12 (±10 %). Read, as reproduced in
# en.wikipedia.org/wiki/E_series_of_preferred_numbers ("E series of preferred numbers").
E_SERIES = {
    "E6": (1.0, 1.5, 2.2, 3.3, 4.7, 6.8),
    "E12": (1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2),
}


def preferred_value_up(value, e_series="E12"):
    """The smallest IEC 60063 preferred value at or above a component value.

    Parameters
    ----------
    value : float
        A component value [F, Ω or H], > 0.
    e_series : str
        "E6" or "E12".

    Returns
    -------
    float
        The preferred value ≥ value, in the same unit.

    Notes
    -----
    Each series repeats every decade: value = m × 10^k, 1 ≤ m < 10; the first mantissa of the
    series ≥ m (within 1e-9, so a preferred value is its own answer), else 1 × 10^(k+1).

    References
    ----------
    IEC 60063:2015, E6 and E12 (read, as reproduced in Wikipedia; see E_SERIES).

    Examples
    --------
    >>> preferred_value_up(44.7e-6), preferred_value_up(34e-6), preferred_value_up(34e-6, "E6")
    (4.7e-05, 3.9e-05, 4.7e-05)
    """
    mantissas = E_SERIES[_one_of("e_series", e_series, tuple(E_SERIES))]
    exponent = math.floor(math.log10(value))
    mantissa = value / 10.0 ** exponent
    chosen = next((m for m in mantissas if m >= mantissa * (1.0 - 1e-9)), 10.0)
    return float(f"{chosen:g}e{exponent}")  # "10e-5" is the next decade's 1e-4


def quality_factor(topology, resistance, inductance, capacitance):
    """Q of a series or parallel RLC at resonance.

    Parameters
    ----------
    topology : str
        "series" (R, L, C in one loop) or "parallel" (R ∥ L ∥ C).
    resistance, inductance, capacitance : float
        R [Ω]: the loop resistance (series) or across the tank (parallel); L [H]; C [F]; > 0.

    Returns
    -------
    float
        Q [-].

    Notes
    -----
    Series Q = (1/R)√(L/C) = ω0 L/R; parallel Q = R√(C/L) = R/(ω0 L).

    References
    ----------
    Alexander and Sadiku, *Fundamentals of Electric Circuits*, 5th ed., 14.5–14.6 — from memory.

    Examples
    --------
    >>> quality_factor("series", 2.0, 1e-3, 0.4e-6)
    25.0
    >>> round(quality_factor("parallel", 8e3, 0.2e-3, 8e-6))
    1600
    """
    ratio = math.sqrt(inductance / capacitance)
    if _one_of("topology", topology, TOPOLOGY_KINDS) == "series":
        return ratio / resistance
    return resistance / ratio


def half_power_frequencies(f0, q):
    """The −3 dB (half-power) frequencies either side of a resonance.

    Parameters
    ----------
    f0, q : float
        Resonant frequency [Hz] and quality factor [-], > 0.

    Returns
    -------
    (float, float)
        f1 and f2 [Hz], f1 < f0 < f2.

    Notes
    -----
    f1,2 = f0 (√(1 + 1/4Q²) ∓ 1/2Q); f2 − f1 = f0/Q and f1 f2 = f0².

    References
    ----------
    Alexander and Sadiku, *Fundamentals of Electric Circuits*, 5th ed., 14.5 — from memory.

    Examples
    --------
    >>> [round(f * TWO_PI) for f in half_power_frequencies(50000 / TWO_PI, 25.0)]
    [49010, 51010]
    """
    root = math.sqrt(1.0 + 1.0 / (4.0 * q * q))
    upper = root + 1.0 / (2.0 * q)
    return f0 / upper, f0 * upper  # f1 f2 = f0²: no cancellation at low Q


def rlc_impedance(topology, resistance, inductance, capacitance, frequency):
    """Complex impedance of a series or parallel RLC at a frequency.

    Parameters
    ----------
    topology : str
        "series" or "parallel".
    resistance, inductance, capacitance, frequency : float
        R [Ω], L [H], C [F] and the frequency [Hz], each > 0.

    Returns
    -------
    complex
        Z [Ω].

    Notes
    -----
    Series Z = R + j(ωL − 1/(ωC)); parallel Z = 1 / (1/R + 1/(jωL) + jωC); ω = 2πf.

    References
    ----------
    Alexander and Sadiku, *Fundamentals of Electric Circuits*, 5th ed., 14.5–14.6 — from memory.

    Examples
    --------
    >>> z = rlc_impedance("series", 2.0, 1e-3, 0.4e-6, 51000 / TWO_PI)
    >>> round(abs(z), 3)
    2.815
    """
    omega = TWO_PI * frequency
    if _one_of("topology", topology, TOPOLOGY_KINDS) == "series":
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
    supply_voltage, resistance, inductance : float
        DC supply across the coil while on [V]; its winding resistance [Ω] and L [H], > 0.
    clamp_voltage, dropout_fraction : float
        V_c [V], > 0 (a diode's V_F, V_F + V_Z, or a varistor's V_c at I); the share of the
        holding current at which the armature releases [-], in (0, 1).

    Returns
    -------
    Kick
        Currents [A], voltages [V], times [s] and the clamp's energy [J], as Kick lists them.

    Notes
    -----
    L di/dt = −R i − V_c: i = (I + V_c/R) e^(−t/τ) − V_c/R until i = 0 at t0 = τ ln(1 + IR/V_c);
    release at τ ln((I + V_c/R)/(I_do + V_c/R)); the clamp absorbs V_c ∫ i dt =
    V_c (τ I − V_c t0 / R); the switch sees V + V_c.

    References
    ----------
    Nilsson and Riedel, *Electric Circuits*, 10th ed., section 7.3 (RL step) — from memory.

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
    supply_voltage, resistance, inductance : float
        DC supply across the coil while on [V]; its winding resistance [Ω] and L [H], > 0.
    capacitance, snubber_resistance, dropout_fraction : float
        The snubber's C [F] and R_s [Ω] (or the stray C and 0); the share of the holding
        current at which the armature releases [-], in (0, 1).

    Returns
    -------
    Kick
        As clamped_kick; the absorbed energy is R_s's share of ½LI² + ½CV², R_s/(R + R_s) (the
        loop current flows through R and R_s alike).

    Notes
    -----
    The coil current goes on through the capacitor: a series loop of L, R + R_s and C with
    i(0) = I and C charged to the supply, opposing. Coil v = v_C − R_s i; the switch sees V − v.

    References
    ----------
    Nilsson and Riedel, *Electric Circuits*, 10th ed., sections 8.3–8.4 — from memory.

    Examples
    --------
    >>> kick = capacitive_kick(24.0, 48.0, 0.5, 200e-12, 0.2)
    >>> round(kick.peak_coil_v)
    -24981
    """
    current = supply_voltage / resistance
    so, i_wave, x_wave = _loop_coefficients(resistance + snubber_resistance, inductance,
                                           capacitance, 0.0, current, -supply_voltage)
    # The coil voltage −(x + R_s i), as a wave of the same basis.
    coil = [-(x + snubber_resistance * i) for x, i in zip(x_wave, i_wave)]
    highest, lowest = _extremes(so, *coil)
    delay = _first_time_below(so, *i_wave, dropout_fraction * current)
    stored = 0.5 * inductance * current ** 2 + 0.5 * capacitance * supply_voltage ** 2
    absorbed = stored * snubber_resistance / (resistance + snubber_resistance)
    end = settling_time("rlc", resistance + snubber_resistance, inductance, capacitance)
    return Kick(current, min(lowest[1], 0.0), supply_voltage - lowest[1], delay, absorbed, end)


def kick_waveform(supply_voltage, resistance, inductance, suppression, times, capacitance=None,
                  snubber_resistance=0.0, clamp_voltage=None):
    """The coil's voltage and current at each time after its switch opens.

    Parameters
    ----------
    supply_voltage, resistance, inductance : float
        DC supply across the coil while on [V]; its winding resistance [Ω] and L [H], > 0.
    suppression : str
        "none" or "rc" (a capacitance across the coil); "diode", "diode_zener" or "varistor".
    times : sequence of float
        Times after opening [s].
    capacitance, snubber_resistance, clamp_voltage : float or None
        Stray (none) or snubber (rc) C [F] and R_s [Ω] (else 0); a clamp's V_c [V].

    Returns
    -------
    (list of float, list of float)
        Coil voltage [V] and coil current [A] at each time.

    Notes
    -----
    Capacitive: the series loop of capacitive_kick, v = −(x + R_s i). Clamped:
    i = max((I + V_c/R) e^(−t/τ) − V_c/R, 0) and v = −V_c while current flows.

    References
    ----------
    Nilsson and Riedel, *Electric Circuits*, 10th ed., ch. 7–8 — from memory.

    Examples
    --------
    >>> volts, amps = kick_waveform(24.0, 48.0, 0.5, "diode", [0.0, 0.1], clamp_voltage=0.8)
    >>> volts, amps
    ([-0.8, 0.0], [0.5, 0.0])
    """
    current = supply_voltage / resistance
    voltages, currents = [], []
    if _one_of("suppression", suppression, SUPPRESSION_KINDS) in ("none", "rc"):
        so, i_wave, x_wave = _loop_coefficients(resistance + snubber_resistance, inductance,
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
    """An RC snubber for a DC coil that keeps its switch within a voltage limit.

    Parameters
    ----------
    supply_voltage, resistance, inductance : float
        DC supply across the coil while on [V]; its winding resistance [Ω] and L [H], > 0.
    switch_limit_v : float
        The most the opening switch may see [V]; above the supply.
    dropout_fraction : float
        Share of the holding current at which the armature releases [-], in (0, 1).

    Returns
    -------
    (float, float)
        R_s [Ω] (the coil's R) and the smallest C_s [F] that keeps the switch within the limit.

    Notes
    -----
    R_s = R starts the coil voltage from zero at opening (V − R_s I = 0) and limits the charging
    current at closing to the coil current. With R_s fixed the switch voltage falls as C grows,
    towards V as C → ∞: C is found by bisection on log C.

    References
    ----------
    R_s = R_coil: common practice. The loop: as capacitive_kick.

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
