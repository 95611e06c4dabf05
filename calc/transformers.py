"""Transformers: rated currents and ratios, standard ratings, the fault level at the secondary,
regulation and taps, losses and efficiency, buck-boost connections, and flux on another supply.

Quantities follow the nomenclature page: apparent_power [VA], voltage [V] line-to-line for
three-phase, current [A], power [W]; impedances in percent on the transformer's own rating.
"""

import math
from typing import NamedTuple

from calc import network, voltage_drop
from calc.electrical import SQRT3, line_current
from calc.errors import ParameterError

# Preferred kVA ratings. Source: IEEE/ANSI C57.12 series preferred ratings (read, approximate);
# IEC practice: 100 to 3150 kVA as IEC 60076-1 lists them (R10 series, from memory). 25 and 50
# kVA are the smallest ratings of the same distribution series (EU Regulation 548/2014 Annex I
# Table I.1, from memory); 4000 to 10 000 kVA continue the R10 numbers (IEC 60076-1, from memory).
PREFERRED_KVA_1PH_NA = (5, 10, 15, 25, 37.5, 50, 75, 100, 167, 250, 333, 500, 833, 1250, 1667,
                        2500, 3333, 5000)
PREFERRED_KVA_3PH_NA = (3, 9, 15, 30, 45, 75, 112.5, 150, 225, 300, 500, 750, 1000, 1500, 2000,
                        2500, 3750, 5000, 7500, 10000)
PREFERRED_KVA_IEC = (25, 50, 100, 160, 250, 315, 400, 500, 630, 800, 1000, 1250, 1600, 2000, 2500,
                     3150, 4000, 5000, 6300, 8000, 10000)

# Winding connections, primary-secondary (see winding_voltage).
WINDING_CONNECTIONS = ("delta-wye", "delta-delta", "wye-wye", "wye-delta")

# IEEE C57.12.00 short-circuit categories: the largest rating [kVA] of categories I, II and III,
# single-phase and three-phase; above the last is category IV (IEEE C57.12.00, read).
SHORT_CIRCUIT_CATEGORY_KVA = {1: (500, 1667, 10000), 3: (500, 5000, 30000)}

# Impedance tolerance of a two-winding transformer: ±7.5 % of the specified %Z (IEEE C57.12.00
# §9.2, read as quoted from C57.12.51). The low end gives the highest fault current.
IMPEDANCE_TOLERANCE = 0.075

# Single-phase three-wire (mid-tapped, 120/240 V) secondary: a line-to-neutral fault drives one
# half-winding of about 1.5 %R + j1.2 %X (of the full winding, per unit of the rating on the half
# voltage), so I_LN is 4/3 (all R) to 5/3 (all X), about 1.5 ×, the line-to-line fault. Read: the
# point-to-point method's Note 2, as reproduced at scribd.com/document/388329023; the same split
# is Kersting's centre-tapped model (Distribution System Modeling and Analysis, from memory), read
# as gridlab-d/gridlab-d powerflow/transformer.cpp implements it: Z₁ = Z₂ = R + j0.4 X (half).
MID_TAP_R_FACTOR = 1.5
MID_TAP_X_FACTOR = 1.2

# IEC 60909-0 Table 1 voltage factor c_max (read, as reproduced in pandapower's doc/shortcircuit/
# correction.rst): 1.05 for low-voltage systems with a +6 % tolerance, 1.10 for +10 % and for
# every system above 1 kV. c = 1 is IEEE Std 141 / IEEE Std 551 practice (no correction).
VOLTAGE_FACTORS = (
    ("1", "c = 1.00: nominal voltage, no correction (IEEE/ANSI practice)"),
    ("1.05", "c = 1.05: IEC 60909 c_max, low voltage with +6 % tolerance"),
    ("1.1", "c = 1.10: IEC 60909 c_max, low voltage with +10 % tolerance"),
)
C_MAX_ABOVE_1KV = 1.10
LOW_VOLTAGE_LIMIT_V = 1000.0  # IEC 60909-0 Table 1 divides low and high voltage at 1 kV

# No-load taps of a de-energised tap changer on the HV winding: 2 × 2.5 % above and below rated
# (IEEE C57.12.10, read). A tap is named by the primary voltage it suits: the +2.5 % tap is for a
# supply 2.5 % above rated and gives 1/1.025 of the rated secondary voltage from a rated supply.
TAP_STEP_PCT = 2.5
TAP_STEPS = 2  # on each side of the rated tap
STANDARD_TAPS_PCT = tuple(TAP_STEP_PCT * n for n in range(-TAP_STEPS, TAP_STEPS + 1))

# Voltage band the loaded secondary should stay in [± %] (local rules may be tighter). ANSI C84.1
# Range A at the service, 114-126 V on 120 V, ±5 %; IEC practice ±10 %, which the page read gives
# as IEC 61000-2-2 / EN 50160 (both read, as quoted at powerstandards.com/tutorials/
# VoltageRegulation.php); IEC 60038's 230/400 V ±10 % from memory.
VOLTAGE_BAND_PCT = {"na": 5.0, "iec": 10.0}

# A winding may be run at up to 105 % of its rated voltage at rated load (IEEE C57.12.00 §4.1.6
# for liquid-filled units, C57.12.01 for dry-type; from memory). Above that the core saturates.
EXCITATION_LIMIT = 1.05

# Low-voltage insulating transformers made for buck-boost use: (name, primary half-winding [V],
# secondary half-winding [V]). Each has two primary and two secondary windings, connected in
# series or in parallel. Common practice (the usual ratings in North America, from memory).
BUCK_BOOST_WINDINGS = (
    ("120/240 × 12/24 V", 120.0, 12.0),
    ("120/240 × 16/32 V", 120.0, 16.0),
    ("240/480 × 24/48 V", 240.0, 24.0),
)
BUCK_BOOST_KVA = (0.05, 0.1, 0.15, 0.25, 0.5, 0.75, 1, 1.5, 2, 3, 5, 7.5, 10)  # their ratings


# ---- currents, ratios and ratings --------------------------------------------------------------

def rated_current(apparent_power, voltage, phases):
    """Rated line current of a transformer winding.

    Parameters
    ----------
    apparent_power : float or array
        Rated apparent power [VA].
    voltage : float or array
        Rated voltage of the winding [V]; line-to-line for three-phase.
    phases : int
        1 or 3.

    Returns
    -------
    float or array
        Line current at rated apparent power and rated voltage [A].

    Notes
    -----
    I = S / V (single-phase) or I = S / (√3 V_LL) (three-phase): calc.electrical.line_current.

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 2.10 — from memory.

    Examples
    --------
    >>> round(rated_current(75e3, 208.0, 3), 1)
    208.2
    """
    return line_current(apparent_power, voltage, phases)


def _connection_sides(connection):
    if connection not in WINDING_CONNECTIONS:
        raise ParameterError("connection", connection, f"{connection!r} is not a winding "
                             f"connection; choose one of {', '.join(WINDING_CONNECTIONS)}")
    return connection.split("-")


def winding_voltage(line_voltage, connection_side):
    """Voltage across one winding of a three-phase bank.

    Parameters
    ----------
    line_voltage : float
        Line-to-line voltage of the side [V].
    connection_side : str
        "delta" or "wye".

    Returns
    -------
    float
        The winding voltage [V].

    Notes
    -----
    V_w = V_LL for delta (between two lines), V_LL / √3 for wye (a line to the star point).

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 2.10 — from memory.

    Examples
    --------
    >>> winding_voltage(480.0, "delta"), round(winding_voltage(208.0, "wye"), 1)
    (480.0, 120.1)
    """
    return line_voltage if connection_side == "delta" else line_voltage / SQRT3


def turns_ratio(primary_voltage, secondary_voltage, phases, connection="delta-delta"):
    """Winding turns ratio N₁/N₂ of an ideal transformer.

    Parameters
    ----------
    primary_voltage, secondary_voltage : float
        Rated voltages [V]; line-to-line for three-phase.
    phases : int
        1 or 3.
    connection : str
        Three-phase only: one of WINDING_CONNECTIONS ("delta-wye", ...), primary first.

    Returns
    -------
    float
        N₁ / N₂ [-].

    Raises
    ------
    ParameterError
        For a three-phase connection not in WINDING_CONNECTIONS.

    Notes
    -----
    Single-phase: N₁/N₂ = V₁/V₂. Three-phase: the ratio of the winding voltages, which differs
    from the line-voltage ratio by √3 for delta-wye and wye-delta.

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 2.10 — from memory.

    Examples
    --------
    >>> round(turns_ratio(480.0, 208.0, 3, "delta-wye"), 3)
    3.997
    """
    if phases != 3:
        return primary_voltage / secondary_voltage
    primary_side, secondary_side = _connection_sides(connection)
    return winding_voltage(primary_voltage, primary_side) / winding_voltage(
        secondary_voltage, secondary_side
    )


def reflected_impedance(impedance, primary_voltage, secondary_voltage):
    """Impedance on the secondary as seen from the primary of an ideal transformer.

    Parameters
    ----------
    impedance : float or complex
        Impedance connected to the secondary [Ω] (per phase, wye-equivalent for three-phase).
    primary_voltage, secondary_voltage : float
        Rated voltages [V] (line-to-line for three-phase).

    Returns
    -------
    float or complex
        The impedance seen at the primary [Ω].

    Notes
    -----
    Z₁ = (V₁ / V₂)² Z₂.

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 2.3 — from memory.

    Examples
    --------
    >>> round(reflected_impedance(0.5, 480.0, 240.0), 3)
    2.0
    """
    return (primary_voltage / secondary_voltage) ** 2 * impedance


def short_circuit_category(apparent_power, phases):
    """IEEE C57.12.00 short-circuit category (I to IV) of a rating.

    Parameters
    ----------
    apparent_power : float
        Rating [VA].
    phases : int
        1 or 3.

    Returns
    -------
    str
        "I", "II", "III" or "IV".

    Notes
    -----
    The first category whose largest rating (SHORT_CIRCUIT_CATEGORY_KVA) reaches S; IV above.

    References
    ----------
    IEEE Std C57.12.00, short-circuit categories (read).

    Examples
    --------
    >>> short_circuit_category(1500e3, 3), short_circuit_category(1500e3, 1)
    ('II', 'II')
    """
    kva = apparent_power / 1e3
    limits = SHORT_CIRCUIT_CATEGORY_KVA[3 if phases == 3 else 1]
    for name, largest in zip(("I", "II", "III"), limits):
        if kva <= largest * (1.0 + 1e-9):
            return name
    return "IV"


def motor_start_dip(locked_rotor_apparent_power, apparent_power, z_pct):
    """Voltage dip at the secondary while a motor starts across the line.

    Parameters
    ----------
    locked_rotor_apparent_power : float
        Locked-rotor apparent power of the motor [VA] (NEC Table 430.7(B) code letter × hp).
    apparent_power : float
        Transformer rating [VA].
    z_pct : float
        Transformer impedance [%].

    Returns
    -------
    float
        The dip [%].

    Notes
    -----
    ΔV ≈ S_LR / (S_LR + S_sc) × 100, with S_sc = S_T × 100 / %Z (an infinite source).

    References
    ----------
    The simple dip estimate ΔV ≈ S_LR / (S_LR + S_sc), textbook — common practice.

    Examples
    --------
    >>> round(motor_start_dip(100e3, 150e3, 5.0), 2)
    3.23
    """
    short_circuit = apparent_power * 100.0 / z_pct
    return 100.0 * locked_rotor_apparent_power / (locked_rotor_apparent_power + short_circuit)


# ---- fault level ------------------------------------------------------------------------------

def impedance_per_unit(z_pct, x_r):
    """Complex impedance from its magnitude and X/R.

    Parameters
    ----------
    z_pct : float
        Impedance magnitude [%].
    x_r : float
        X/R ratio [-].

    Returns
    -------
    complex
        R + jX [per unit].

    Notes
    -----
    R = |Z| cos(atan X/R), X = |Z| sin(atan X/R), |Z| = %Z / 100.

    References
    ----------
    IEEE Std 141-1993 (Red Book), ch. 4 (per-unit impedances) — from memory.

    Examples
    --------
    >>> z = impedance_per_unit(5.0, 0.75); round(z.real, 4), round(z.imag, 4)
    (0.04, 0.03)
    """
    angle = math.atan(x_r)
    return complex(z_pct / 100.0 * math.cos(angle), z_pct / 100.0 * math.sin(angle))


def source_impedance_pct(apparent_power, source_short_circuit_power):
    """Source impedance on a transformer's rating.

    Parameters
    ----------
    apparent_power : float
        Transformer rating S_T [VA].
    source_short_circuit_power : float
        Short-circuit power of the source at the primary S_sc [VA].

    Returns
    -------
    float
        %Z_S [%].

    Notes
    -----
    %Z_S = 100 × S_T / S_sc.

    References
    ----------
    IAEI Magazine, J. Phillips, "Short-circuit calculations using transformer and source
    impedance" (2018) (read).

    Examples
    --------
    >>> round(source_impedance_pct(1.5e6, 500e6), 3)
    0.3
    """
    return 100.0 * apparent_power / source_short_circuit_power


class FaultLevel(NamedTuple):
    """Bolted fault at a transformer's secondary terminals (currents symmetrical rms [A])."""

    rated_current: float  # I_FL at the secondary [A]
    z_transformer: complex  # per unit on the rating, after K_T
    z_source: complex  # per unit on the rating, after c_Q (0 for an infinite source)
    correction: float  # K_T (1 when c = 1)
    fault_current: float  # three-phase (line-to-line for single-phase) I''k [A]
    infinite_fault_current: float  # the same with no source impedance [A]
    x_r: float  # X/R of the whole path at the fault
    kappa: float  # IEC 60909 peak factor
    peak_current: float  # i_p = κ √2 I''k [A]
    line_to_neutral_current: float  # delta-wye I''k1 or a mid-tapped 1-phase one [A], else nan


def source_voltage_factor(primary_voltage, voltage_factor):
    """The feeder's voltage factor c_Q for a fault at a given c.

    Parameters
    ----------
    primary_voltage : float
        Nominal voltage of the feeder [V].
    voltage_factor : float
        c at the fault [-]: 1 (nominal-voltage method) or IEC 60909 c_max.

    Returns
    -------
    float
        c_Q [-].

    Notes
    -----
    c_Q = 1 when c = 1; otherwise C_MAX_ABOVE_1KV above LOW_VOLTAGE_LIMIT_V, else c itself.

    References
    ----------
    IEC 60909-0 Table 1 (factor c) — read, as reproduced in pandapower's shortcircuit docs.

    Examples
    --------
    >>> source_voltage_factor(11000.0, 1.05), source_voltage_factor(480.0, 1.05)
    (1.1, 1.05)
    """
    if voltage_factor == 1.0:
        return 1.0
    return C_MAX_ABOVE_1KV if primary_voltage > LOW_VOLTAGE_LIMIT_V else voltage_factor


def secondary_fault(apparent_power, primary_voltage, secondary_voltage, phases, z_pct, x_r,
                    source_short_circuit_power=None, source_x_r=network.DEFAULT_SOURCE_X_R,
                    voltage_factor=1.0, delta_wye=False, mid_tap=False):
    """Bolted fault current at a transformer's secondary, infinite or finite source.

    A thin view over calc.network.faults on a one-transformer path, so this calculator and the
    path calculators give the same figures.

    Parameters
    ----------
    apparent_power : float
        Transformer rating S_T [VA].
    primary_voltage, secondary_voltage : float
        Rated voltages [V], line-to-line for three-phase; the secondary taken as the system's
        nominal voltage.
    phases : int
        1 or 3.
    z_pct : float
        Transformer impedance [%] on its rating.
    x_r : float
        Transformer X/R [-].
    source_short_circuit_power : float, optional
        Source short-circuit power S''kQ at the primary [VA]; None is an infinite source.
    source_x_r : float
        X/R of the source [-] (10 when unknown: IEC 60909-0 §6.2 takes R_Q = 0.1 X_Q).
    voltage_factor : float
        c at the fault [-]: 1 (nominal voltage, IEEE/ANSI practice), or IEC 60909 c_max (1.05 or
        1.10). Any value other than 1 is the IEC 60909 maximum case.
    delta_wye : bool
        Three-phase delta primary, grounded-wye secondary: also the line-to-neutral fault.
    mid_tap : bool
        Single-phase three-wire secondary, neutral at the mid-tap (120/240 V): also the fault
        from one line to the neutral.

    Returns
    -------
    FaultLevel

    Notes
    -----
    Per unit on (S_T, V₂): Z_T = K_T × %Z/100 ∠ atan(X/R), Z_S = c_Q S_T / S''kQ ∠ atan(X/R)_S
    (0 for an infinite source), and I''k = c I_FL / |Z_S + Z_T| with I_FL = S_T / (√3 V₂), or
    S_T / V₂ single-phase. In the IEC 60909 case (c ≠ 1) K_T = 0.95 c / (1 + 0.6 x_T) and c_Q is
    source_voltage_factor(V₁, c) (1.10 above 1 kV, else c); with c = 1, K_T = c_Q = 1 and, for
    equal X/R, I''k = I_FL × 100 / (%Z_T + %Z_S). The feeder's c_Q is handed to calc.network as
    its source voltage factor, which scales Z_S by it (IEC 60909 §6.2). Peak i_p = κ √2 I''k with
    κ = 1.02 + 0.98 e^(−3R/X) of Z_S + Z_T. Line-to-neutral on a delta-wye unit: I''k1 =
    3 c I_FL / |2 Z₁ + Z₀| with Z₁ = Z_S + Z_T and Z₀ = Z_T (the delta blocks the source's zero
    sequence; the transformer's zero-sequence impedance is taken equal to its positive-sequence
    one, K_T included). Mid-tapped single-phase: I_LN = 2 c I_FL / |Z_S + K_T Z_half| with
    Z_half = MID_TAP_R_FACTOR × R_T + j MID_TAP_X_FACTOR × X_T, per unit of S_T on V₂ / 2 (Z_S
    is the same per unit on either base).

    References
    ----------
    Infinite and finite source: IEEE Std 141 method; IAEI Magazine, J. Phillips, "Short-circuit
    calculations using transformer and source impedance" (2018) (read). IEC 60909-0: c (Table
    1), K_T (§6.3.3) and κ (§4.3.1.1) read, as reproduced in pandapower's documentation
    (doc/shortcircuit/); Z_Q (§6.2), I''k1 (§4.2.1.3) and the clause numbers from memory.
    Mid-tap: see MID_TAP_R_FACTOR (read).

    Examples
    --------
    >>> round(secondary_fault(1500e3, 13800.0, 480.0, 3, 5.75, 6.0).fault_current)
    31378
    """
    iec = voltage_factor != 1.0
    c_source = source_voltage_factor(primary_voltage, voltage_factor)
    transformer = network.Transformer("transformer", apparent_power, primary_voltage,
                                      secondary_voltage, z_pct, x_r,
                                      grounded_secondary=phases == 3 and delta_wye)

    def fault_at_secondary(source_power):
        source = network.Source(primary_voltage, phases, fault_va=source_power, x_r=source_x_r)
        return network.faults(network.Path(source, [transformer]), voltage_factor, iec,
                              source_voltage_factor=c_source)[1]

    fault, infinite = fault_at_secondary(source_short_circuit_power), fault_at_secondary(None)
    correction = network.transformer_correction(transformer, voltage_factor) if iec else 1.0
    z_source = 0j if source_short_circuit_power is None else impedance_per_unit(
        source_impedance_pct(apparent_power, source_short_circuit_power / c_source), source_x_r)
    line_to_neutral = math.nan
    if phases == 3 and delta_wye and fault.line_to_neutral_a is not None:
        line_to_neutral = fault.line_to_neutral_a
    elif phases != 3 and mid_tap:
        z_t = correction * impedance_per_unit(z_pct, x_r)
        half = complex(MID_TAP_R_FACTOR * z_t.real, MID_TAP_X_FACTOR * z_t.imag)
        line_to_neutral = voltage_factor * 2.0 * apparent_power / secondary_voltage / abs(
            z_source + half)
    return FaultLevel(rated_current(apparent_power, secondary_voltage, phases),
                      correction * impedance_per_unit(z_pct, x_r), z_source, correction,
                      fault.three_phase_a, infinite.three_phase_a, fault.x_r,
                      network.peak_factor(fault.x_r), fault.peak_a, line_to_neutral)


# ---- regulation and taps ----------------------------------------------------------------------

def _sin_phi(power_factor, leading):
    """sin φ of a load current: positive lagging, negative leading."""
    sine = math.sqrt(max(0.0, 1.0 - power_factor * power_factor))
    return -sine if leading else sine


def regulation_approx(r_pct, x_pct, power_factor, leading=False, load_fraction=1.0):
    """Voltage regulation by the textbook formula with its second-order term.

    Parameters
    ----------
    r_pct, x_pct : float
        Resistance and reactance [%] on the rating (from the short-circuit test).
    power_factor : float
        Load power factor in (0, 1] [-].
    leading : bool
        True for a leading (capacitive) load.
    load_fraction : float
        Load current as a fraction of rated current [-].

    Returns
    -------
    float
        ε [%].

    Notes
    -----
    ε ≈ p cos φ + q sin φ + (q cos φ − p sin φ)² / 200 with p = k %R, q = k %X; sin φ < 0
    leading. The 200 appears because p and q are in percent.

    References
    ----------
    Textbook regulation formula with its second-order term (read, as three electrical-machines
    textbooks give it); the first-order part ε ≈ %R cos φ + %X sin φ as in GATE 2018 EE
    Question 11.

    Examples
    --------
    >>> round(regulation_approx(1.0, 5.0, 0.8), 4)
    3.8578
    """
    sine = _sin_phi(power_factor, leading)
    p, q = load_fraction * r_pct, load_fraction * x_pct
    return p * power_factor + q * sine + (q * power_factor - p * sine) ** 2 / 200.0


def regulation_exact(r_pct, x_pct, power_factor, leading=False, load_fraction=1.0):
    """Voltage regulation from the phasor diagram: no-load voltage over loaded, minus one.

    Parameters
    ----------
    r_pct, x_pct : float
        Resistance and reactance [%] on the rating.
    power_factor : float
        Load power factor in (0, 1] [-].
    leading : bool
        True for a leading (capacitive) load.
    load_fraction : float
        Load current as a fraction of rated current [-].

    Returns
    -------
    float
        ε [%].

    Notes
    -----
    Loaded secondary at 1 per unit, load current k at φ: ε = (|1 + k (r + jx)(cos φ − j sin φ)|
    − 1) × 100. The approximate formula is this to second order.

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 2.7 — from memory.

    Examples
    --------
    >>> round(regulation_exact(1.0, 5.0, 0.8), 4)
    3.8557
    """
    current = load_fraction * complex(power_factor, -_sin_phi(power_factor, leading))
    return (abs(1.0 + complex(r_pct, x_pct) / 100.0 * current) - 1.0) * 100.0


def loaded_voltage(no_load_voltage, r_pct, x_pct, power_factor, leading=False, load_fraction=1.0):
    """Secondary voltage under load from the no-load voltage.

    Parameters
    ----------
    no_load_voltage : float
        No-load secondary voltage [per unit of rated].
    r_pct, x_pct : float
        Resistance and reactance [%] on the rating.
    power_factor : float
        Load power factor in (0, 1] [-].
    leading : bool
        True for a leading (capacitive) load.
    load_fraction : float
        Load current as a fraction of rated current [-].

    Returns
    -------
    float
        Loaded secondary voltage [per unit of rated].

    Raises
    ------
    calc.errors.VoltageCollapse
        When no loaded voltage exists for this current.

    Notes
    -----
    A constant current k at φ through r + jx (per unit): |V_nl|² = (V + k r cos φ + k x sin φ)² +
    (k x cos φ − k r sin φ)², solved for V by calc.voltage_drop.receiving_voltage (a leading
    load is a lagging one through −jx).

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 2.7 — from memory.

    Examples
    --------
    >>> round(loaded_voltage(1.0, 1.0, 5.0, 0.8), 5)
    0.96142
    """
    reactance = -x_pct / 100.0 if leading else x_pct / 100.0
    return voltage_drop.receiving_voltage(no_load_voltage, load_fraction, r_pct / 100.0,
                                          reactance, power_factor)


def tap_voltage_factor(tap_pct):
    """Secondary voltage at a no-load tap relative to the rated tap.

    Parameters
    ----------
    tap_pct : float
        Tap [%], named by the primary voltage it suits (+2.5 % for a supply 2.5 % high).

    Returns
    -------
    float
        V₂(tap) / V₂(rated tap) [-] from the same supply.

    Notes
    -----
    A +t % tap adds t % to the primary turns: the factor is 1 / (1 + t/100).

    References
    ----------
    IEEE C57.12.10, de-energised taps on the HV winding (read).

    Examples
    --------
    >>> round(tap_voltage_factor(-5.0), 4)
    1.0526
    """
    return 1.0 / (1.0 + tap_pct / 100.0)


# ---- losses and efficiency ---------------------------------------------------------------------

def efficiency(apparent_power, no_load_loss, load_loss, load_fraction, power_factor):
    """Efficiency at a loading: output over output plus losses.

    Parameters
    ----------
    apparent_power : float
        Rating [VA].
    no_load_loss, load_loss : float
        Core (no-load) loss P₀, the same at every load, and load loss at rated current P_k [W].
    load_fraction : float
        Load as a fraction of rated current k [-].
    power_factor : float
        Load power factor [-].

    Returns
    -------
    (float, float, float)
        η [-], output P_out [W] and losses [W].

    Notes
    -----
    P_out = k S cos φ, P_loss = P₀ + k² P_k, η = P_out / (P_out + P_loss) (0 at no load).

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 2.7 — from memory.

    Examples
    --------
    >>> round(efficiency(100e3, 500.0, 2000.0, 0.5, 1.0)[0], 5)
    0.98039
    """
    output = load_fraction * apparent_power * power_factor
    losses = no_load_loss + load_fraction * load_fraction * load_loss
    return (output / (output + losses) if output > 0.0 else 0.0), output, losses


def maximum_efficiency_load(no_load_loss, load_loss):
    """Load of maximum efficiency, where the load loss equals the no-load loss.

    Parameters
    ----------
    no_load_loss, load_loss : float
        Core (no-load) loss P₀ and load loss at rated current P_k [W].

    Returns
    -------
    float
        k, the load as a fraction of rated current [-].

    Notes
    -----
    k² P_k = P₀, so k = √(P₀ / P_k).

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 2.7 — from memory.

    Examples
    --------
    >>> maximum_efficiency_load(500.0, 2000.0)
    0.5
    """
    return math.sqrt(no_load_loss / load_loss)


def daily_energy(apparent_power, no_load_loss, load_loss, periods, energised_hours=24.0):
    """Energy delivered and lost over a daily load profile.

    Parameters
    ----------
    apparent_power : float
        Rating [VA].
    no_load_loss, load_loss : float
        Core (no-load) loss P₀ and load loss at rated current P_k [W].
    periods : iterable of (float, float, float)
        (load fraction [-], power factor [-], hours [h]) for each part of the day; the rest of
        the day the transformer is energised at no load.
    energised_hours : float
        Hours a day the transformer is energised [h] (the core loss runs all that time).

    Returns
    -------
    (float, float)
        Output and losses [W·h].

    Notes
    -----
    E_out = Σ k S cos φ t, E_loss = P₀ t_energised + Σ k² P_k t; η_day = E_out / (E_out + E_loss).

    References
    ----------
    M. A. Salam, *Fundamentals of Electrical Machines*, 2nd ed. (Narosa), Example 3.10
    (all-day efficiency from a daily load cycle).

    Examples
    --------
    >>> daily_energy(100e3, 500.0, 2000.0, [(1.0, 1.0, 4.0), (0.5, 1.0, 8.0)])
    (800000.0, 24000.0)
    """
    output = copper = 0.0
    for fraction, power_factor, hours in periods:
        output += fraction * apparent_power * power_factor * hours
        copper += fraction * fraction * load_loss * hours
    return output, no_load_loss * energised_hours + copper


# ---- buck-boost -------------------------------------------------------------------------------

class BuckBoost(NamedTuple):
    """One standard winding combination connected as an autotransformer."""

    windings: str  # the transformer's name, e.g. "120/240 × 12/24 V"
    shunt_v: float  # rated voltage of the primary connection across the supply [V]
    series_v: float  # rated voltage of the secondary connection in series with the line [V]
    mode: str  # "boost" (series winding aiding) or "buck" (opposing)
    output_v: float  # output across the unit at the given supply [V]


def buck_boost_output(supply_voltage, shunt_voltage, series_voltage, mode):
    """Output of a two-winding transformer connected as an autotransformer.

    Parameters
    ----------
    supply_voltage : float
        Voltage across the unit's input [V].
    shunt_voltage, series_voltage : float
        Rated voltages of the primary connection (across the supply) and of the secondary
        connection (in series with the line) [V].
    mode : str
        "boost" (additive polarity) or "buck" (subtractive).

    Returns
    -------
    float
        Output voltage [V].

    Notes
    -----
    The series winding adds its voltage (boost) or subtracts it: V_out = V_in (1 ± V_s / V_sh).

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 2.9 — from memory.

    Examples
    --------
    >>> round(buck_boost_output(208.0, 240.0, 24.0, "boost"), 1)
    228.8
    """
    ratio = series_voltage / shunt_voltage
    return supply_voltage * (1.0 + ratio if mode == "boost" else 1.0 - ratio)


def buck_boost_combinations(supply_voltage):
    """Every standard combination whose primary is not over-excited at a supply voltage.

    Parameters
    ----------
    supply_voltage : float
        Voltage across the unit [V].

    Returns
    -------
    list of BuckBoost
        Each transformer of BUCK_BOOST_WINDINGS with its primaries in parallel or series and
        its secondaries in parallel or series, boosting and bucking.

    Notes
    -----
    A primary connection is usable while V_supply ≤ EXCITATION_LIMIT × V_shunt (105 % of its
    rating); the output of each is buck_boost_output.

    References
    ----------
    IEEE C57.12.00 §4.1.6 (105 % excitation) — from memory; the winding ratings are common
    practice.

    Examples
    --------
    >>> len(buck_boost_combinations(208.0))
    16
    """
    found = []
    for name, primary, secondary in BUCK_BOOST_WINDINGS:
        for shunt in (primary, 2.0 * primary):
            if supply_voltage > EXCITATION_LIMIT * shunt * (1.0 + 1e-12):
                continue
            for series in (secondary, 2.0 * secondary):
                for mode in ("boost", "buck"):
                    found.append(BuckBoost(name, shunt, series, mode,
                                           buck_boost_output(supply_voltage, shunt, series, mode)))
    return found


# ---- equipment on a foreign supply -------------------------------------------------------------

def flux_ratio(applied_voltage, applied_frequency, rated_voltage, rated_frequency):
    """Core flux relative to rated.

    Parameters
    ----------
    applied_voltage, rated_voltage : float
        Voltage applied and the equipment's rated voltage [V].
    applied_frequency, rated_frequency : float
        Frequency applied and the rated frequency [Hz].

    Returns
    -------
    float
        Φ / Φ_rated [-].

    Notes
    -----
    E = 4.44 f N Φ_max, so Φ ∝ V/f: Φ / Φ_rated = (V / f) / (V_rated / f_rated).

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 2.2 — from memory.

    Examples
    --------
    >>> flux_ratio(120.0, 50.0, 120.0, 60.0)
    1.2
    """
    return (applied_voltage / applied_frequency) / (rated_voltage / rated_frequency)
