"""Power-factor correction: the capacitors' reactive power and capacitance for a target power
factor, and the bank's parallel resonance with the supply, with and without a detuning reactor.

Quantities follow the nomenclature page: power [W], reactive_power [var], apparent_power [VA],
voltage [V] line-to-line for three-phase, current [A], frequency [Hz], capacitance [F],
power_factor [-], percentages [%].
"""

import math

from calc.errors import ParameterError
from calc.transformers import source_impedance_pct

TWO_PI = 2.0 * math.pi

# Characteristic harmonics of a six-pulse rectifier (drives, DC supplies): h = 6k ± 1.
# IEEE Std 519-2014, clause 3 / Table 2 context — from memory.
SIX_PULSE_HARMONICS = (5, 7, 11, 13)

# Detuning factors offered by reactor makers, p = X_L/X_C at the fundamental: 7 % tunes to
# n = 1/√p = 3.78 × f1 (189 Hz at 50 Hz), below the 5th. The relation n = 1/√p: J. C. Das, Power
# System Harmonics and Filter Design, 1st ed., Springer, 2015 (from memory); 7 % → 189 Hz at
# 50 Hz read, as worked at studylib.net document 27030577; the tuning orders computed from it.
DETUNING_FACTORS = (0.05, 0.0567, 0.06, 0.07, 0.08, 0.14)

# IEEE Std 18-2012: capacitors may operate continuously up to 110 % of rated rms voltage,
# 120 % of rated peak voltage, 135 % of nominal rms current and 135 % of rated reactive power
# (read).
IEEE18_RMS_VOLTAGE = 1.10
IEEE18_CURRENT = 1.35

# NEC 460.8(A): conductors to a capacitor at least 135 % of its rated current (from memory).
NEC_460_8_FACTOR = 1.35

# The ways a bank's capacitors are connected.
CONNECTIONS = ("wye", "delta", "single")


def tan_phi(power_factor):
    """The ratio of reactive to real power of a load with a given power factor.

    Parameters
    ----------
    power_factor : float
        cos φ [-], in (0, 1].

    Returns
    -------
    float
        tan φ = Q/P [-].

    Notes
    -----
    tan φ = √(1 − cos² φ) / cos φ, written as √((1 − pf)(1 + pf)) / pf to keep its digits near
    unity.

    References
    ----------
    IEEE Std 141-1993 (Red Book), ch. 8 (the power triangle) — from memory.

    Examples
    --------
    >>> round(tan_phi(0.8), 4)
    0.75
    """
    return math.sqrt((1.0 - power_factor) * (1.0 + power_factor)) / power_factor


def capacitor_reactive_power(power, pf_now, pf_target):
    """Reactive power the capacitors must supply to raise a lagging load's power factor.

    Parameters
    ----------
    power : float
        Real power of the load [W].
    pf_now : float
        Present power factor [-], lagging.
    pf_target : float
        Wanted power factor [-], lagging, pf_now ≤ pf_target ≤ 1.

    Returns
    -------
    float
        Q_c [var].

    Notes
    -----
    Q_c = P (tan φ1 − tan φ2): the real power stays, the reactive power falls from P tan φ1 to
    P tan φ2.

    References
    ----------
    IEEE Std 141-1993 (Red Book), ch. 8, the table of kW multipliers for power-factor
    correction — from memory; the formula also in C. K. Alexander and M. N. O. Sadiku,
    Fundamentals of Electric Circuits, 5th ed., section 11.8 (power factor correction) — from
    memory.

    Examples
    --------
    >>> round(capacitor_reactive_power(100e3, 0.75, 0.95))
    55323
    """
    return power * (tan_phi(pf_now) - tan_phi(pf_target))


# Where the detuned-bank relations were read: a worked example (400 V, 6 %, 50 kvar → 425.5 V and
# 53 kvar at the capacitor) at erbar.id/2022/11/17/efek-pemasangan-detuned-reactor-pada-kapasitor;
# the derivation X_C = V²/((1 − p) Q), Q_rated = V_r² (1 − p) Q / V² in "Design of detuned
# capacitor stage", pt.scribd.com/document/362273248. The textbook treatment: J. C. Das, Power
# System Harmonics and Filter Design, 1st ed., Springer, 2015, the chapters on passive filters
# (from memory; section not checked).
DETUNED_BANK_READ = (
    "read, as worked at erbar.id (“Efek pemasangan detuned reactor pada kapasitor”, 2022) and "
    "derived in “Design of detuned capacitor stage” (scribd.com document 362273248); J. C. Das, "
    "Power System Harmonics and Filter Design, 1st ed., Springer, 2015, passive-filter chapters "
    "— from memory"
)


def capacitance_per_phase(reactive_power, voltage, frequency, bank_connection, detuning=0.0):
    """Capacitance of each of the bank's capacitors.

    Parameters
    ----------
    reactive_power : float
        The bank's output at the system voltage, all phases [var].
    voltage : float
        System voltage [V], line-to-line for three-phase.
    frequency : float
        Supply frequency [Hz].
    bank_connection : str
        "wye" (three capacitors line-to-neutral), "delta" (three line-to-line) or "single".
    detuning : float
        p = X_L/X_C of a series (detuning) reactor in each phase [-], in [0, 1); 0 for a plain
        bank.

    Returns
    -------
    float
        C [F] of each capacitor.

    Raises
    ------
    ParameterError
        For a bank_connection that is not one of CONNECTIONS.

    Notes
    -----
    Plain bank: wye C = Q/(2πf V²) (each capacitor takes Q/3 at V/√3); delta C = Q/(3 × 2πf V²);
    single-phase C = Q/(2πf V²). With a reactor the branch is X_C − X_L = (1 − p) X_C, so to
    deliver Q at V the capacitors need X_C = V²/((1 − p) Q): C is (1 − p) times the plain value.

    References
    ----------
    Q = 2πf C V²: IEEE Std 141-1993 (Red Book), ch. 8 — from memory. The detuned branch: see
    DETUNED_BANK_READ.

    Examples
    --------
    >>> round(capacitance_per_phase(10e3, 240.0, 60.0, "single") * 1e6, 1)
    460.5
    >>> round(capacitance_per_phase(10e3, 240.0, 60.0, "single", 0.07) * 1e6, 1)
    428.3
    """
    if bank_connection not in CONNECTIONS:
        raise ParameterError("bank_connection", bank_connection,
                             f"{bank_connection!r} is not one of {', '.join(CONNECTIONS)}")
    per_capacitor = reactive_power / 3.0 if bank_connection == "delta" else reactive_power
    return (1.0 - detuning) * per_capacitor / (TWO_PI * frequency * voltage * voltage)


def capacitor_rated_reactive_power(reactive_power, voltage, detuning, nameplate_voltage=None):
    """Nameplate reactive power of a bank's capacitors, at their own rated voltage.

    Parameters
    ----------
    reactive_power, voltage : float
        The bank's output at the system voltage, all phases [var]; that voltage [V],
        line-to-line for three-phase.
    detuning : float
        p = X_L/X_C of the series reactor [-], in [0, 1); 0 for a plain bank.
    nameplate_voltage : float or None
        The capacitors' rated voltage [V], same basis as `voltage`; None: the voltage they run
        at, U/(1 − p).

    Returns
    -------
    float
        Q_rated [var], all phases: what the capacitors' nameplate says at nameplate_voltage.

    Notes
    -----
    The capacitors' reactance is X_C = V²/((1 − p) Q) (capacitance_per_phase), so at their
    rated voltage U_r they are rated Q_r = U_r²/X_C = Q (1 − p) (U_r/V)²; at U_C = V/(1 − p)
    this is Q/(1 − p). The reactor takes the difference, p Q/(1 − p).

    References
    ----------
    DETUNED_BANK_READ: the 400 V, 6 %, 50 kvar example gives 53 kvar at 425.5 V; 80 kvar, 525 V
    capacitors with a 7 % reactor deliver 49.9 kvar on 400 V, 50 Hz (read, as worked at
    studylib.net document 27030577, "Detuned reactor calculation").

    Examples
    --------
    >>> round(capacitor_rated_reactive_power(50e3, 400.0, 0.06) / 1e3, 2)
    53.19
    >>> round(capacitor_rated_reactive_power(49.9e3, 400.0, 0.07, 525.0) / 1e3, 1)
    79.9
    """
    if nameplate_voltage is None:
        return reactive_power / (1.0 - detuning)
    return reactive_power * (1.0 - detuning) * (nameplate_voltage / voltage) ** 2


def bus_short_circuit_power(transformer_rating=None, transformer_impedance_pct=None,
                            source_short_circuit_power=None):
    """Short-circuit power at a capacitor bank's bus: the transformer's, the source's, or both.

    Parameters
    ----------
    transformer_rating : float or None
        Rating of the transformer feeding the bus [VA]; None when only the source is known.
    transformer_impedance_pct : float or None
        Its impedance [%] (needed with a rating).
    source_short_circuit_power : float or None
        Short-circuit power of the supply ahead of the transformer, or at the bus when there is
        no transformer [VA]; None with a transformer is an infinite source.

    Returns
    -------
    float or None
        S_sc at the bus [VA] (None when neither is given).

    Notes
    -----
    S_sc = 100 S_T / (%Z_T + %Z_S), %Z_S = 100 S_T / S_source (transformers.source_impedance_pct,
    the finite-source method); the source's level alone when no transformer is given.

    References
    ----------
    S_sc = 100 S_T/Z% on an infinite source: IEEE Std 141-1993 (Red Book), ch. 4 — from memory
    (the relation read, as quoted in the IAEI article below). The finite source: the IAEI
    Magazine article transformers.source_impedance_pct cites (read).

    Examples
    --------
    >>> round(bus_short_circuit_power(500e3, 5.75) / 1e3)
    8696
    >>> round(bus_short_circuit_power(500e3, 5.75, 50e6) / 1e3)
    7407
    """
    if transformer_rating is None:
        return source_short_circuit_power
    source_pct = (0.0 if source_short_circuit_power is None
                  else source_impedance_pct(transformer_rating, source_short_circuit_power))
    return 100.0 * transformer_rating / (transformer_impedance_pct + source_pct)


def resonance_order(short_circuit_power, reactive_power, detuning=0.0):
    """Harmonic order of the parallel resonance between the supply and a capacitor bank.

    Parameters
    ----------
    short_circuit_power : float
        S_sc at the bank [VA].
    reactive_power : float
        The bank's output at the fundamental [var].
    detuning : float
        p = X_L/X_C of a series (detuning) reactor [-], 0 for a plain bank.

    Returns
    -------
    float
        h [-]: the resonant frequency over the fundamental.

    Notes
    -----
    Plain bank: h = √(S_sc/Q_c) = √(X_C/X_s). Detuned: the supply and the bank's own reactor
    both face X_C: h = 1/√(p + (1 − p) Q_c/S_sc).

    References
    ----------
    IEEE Std 1531 and IEEE Std 519 application guidance, h_r ≈ √(S_sc/Q_c) (read; the clause
    numbers from memory).

    Examples
    --------
    >>> round(resonance_order(8.696e6, 71.0e3), 2)
    11.07
    """
    return 1.0 / math.sqrt(detuning + (1.0 - detuning) * reactive_power / short_circuit_power)


def tuning_order(detuning):
    """Series-resonant order of a detuned bank (its reactor against its capacitors).

    Parameters
    ----------
    detuning : float
        p = X_L/X_C at the fundamental [-], > 0.

    Returns
    -------
    float
        n [-]: the bank is inductive above n × f1.

    Notes
    -----
    n = 1/√p.

    References
    ----------
    n = 1/√p: J. C. Das, Power System Harmonics and Filter Design, 1st ed., Springer, 2015,
    passive-filter chapters — from memory; 7 % → 189 Hz at 50 Hz read, as worked at
    studylib.net document 27030577, "Detuned reactor calculation". Other orders computed.

    Examples
    --------
    >>> round(tuning_order(0.07), 2), round(tuning_order(0.14), 2)
    (3.78, 2.67)
    """
    return 1.0 / math.sqrt(detuning)


def capacitor_voltage(voltage, detuning):
    """Voltage across the capacitors of a detuned bank.

    Parameters
    ----------
    voltage : float
        System voltage [V].
    detuning : float
        p = X_L/X_C [-], in [0, 1).

    Returns
    -------
    float
        U_C [V].

    Notes
    -----
    U_C = U / (1 − p): the reactor's voltage adds to the capacitor's (they are in antiphase).

    References
    ----------
    DETUNED_BANK_READ (6 % on 400 V → 425.5 V, read as worked at erbar.id).

    Examples
    --------
    >>> round(capacitor_voltage(400.0, 0.06), 1)
    425.5
    """
    return voltage / (1.0 - detuning)


def voltage_rise_pct(reactive_power, short_circuit_power):
    """Steady voltage rise when a capacitor bank is switched in.

    Parameters
    ----------
    reactive_power : float
        The bank's output [var].
    short_circuit_power : float
        S_sc at the bank [VA].

    Returns
    -------
    float
        ΔU [%].

    Notes
    -----
    ΔU ≈ 100 Q_c / S_sc.

    References
    ----------
    IEEE Std 1036-2010 (shunt capacitor application), voltage rise ΔV ≈ kvar/kVA_sc — from
    memory.

    Examples
    --------
    >>> round(voltage_rise_pct(71e3, 8.696e6), 3)
    0.816
    """
    return 100.0 * reactive_power / short_circuit_power
