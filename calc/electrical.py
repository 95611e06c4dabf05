"""Relations every domain shares: the phase factor, line current from power, and a supply's
short-circuit level given as power or as available fault current.

Quantities follow the nomenclature page: voltage [V] (line-to-line for three-phase), current
[A], apparent_power [VA], short_circuit_power [VA], phases 1 or 3.
"""

import math

from calc.errors import CalcError

SQRT3 = math.sqrt(3.0)


def phase_factor(phases):
    """The k of S = k · V · I with V line-to-line: √3 for three-phase, 1 for single-phase.

    Parameters
    ----------
    phases : int
        1 or 3.

    Returns
    -------
    float
        √3 (three-phase) or 1.0 (single-phase) [-].

    Notes
    -----
    Balanced three-phase power is S = √3 · V_LL · I_L; single-phase S = V · I.

    References
    ----------
    IEEE Std 141-1993 (Red Book), ch. 3 — from memory.

    Examples
    --------
    >>> round(phase_factor(3), 6), phase_factor(1)
    (1.732051, 1.0)
    """
    return SQRT3 if int(phases) == 3 else 1.0


def line_current(apparent_power, voltage, phases):
    """Line current drawn by a balanced load of given apparent power.

    Parameters
    ----------
    apparent_power : float
        Apparent power [VA]; for a resistive load it equals the real power.
    voltage : float
        Voltage [V]; line-to-line for three-phase.
    phases : int
        1 or 3.

    Returns
    -------
    float
        Line current [A].

    Notes
    -----
    I = S / (k · V), k = √3 for three-phase and 1 for single-phase.

    References
    ----------
    IEEE Std 141-1993 (Red Book), ch. 3 — from memory.

    Examples
    --------
    >>> round(line_current(75e3, 208.0, 3), 1)
    208.2
    """
    return apparent_power / (phase_factor(phases) * voltage)


def apparent_power(voltage, current, phases):
    """Apparent power of a balanced load from its line current.

    Parameters
    ----------
    voltage : float
        Voltage [V]; line-to-line for three-phase.
    current : float
        Line current [A].
    phases : int
        1 or 3.

    Returns
    -------
    float
        Apparent power [VA].

    Notes
    -----
    S = k · V · I, k = √3 for three-phase and 1 for single-phase.

    References
    ----------
    IEEE Std 141-1993 (Red Book), ch. 3 — from memory.

    Examples
    --------
    >>> round(apparent_power(480.0, 100.0, 3))
    83138
    """
    return phase_factor(phases) * voltage * current


class SourceLevelError(CalcError):
    """A supply's short-circuit level was given twice (as power and as current)."""


def short_circuit_power(voltage, phases, source_short_circuit_power=None, fault_current=None):
    """A supply's short-circuit power from whichever of power or available current is given.

    Parameters
    ----------
    voltage : float
        Nominal voltage where the level is stated [V]; line-to-line for three-phase.
    phases : int
        1 or 3.
    source_short_circuit_power : float or None
        Short-circuit power [VA], if given.
    fault_current : float or None
        Available (bolted) fault current [A], if given.

    Returns
    -------
    float or None
        Short-circuit power [VA]; None when neither is given (an infinite source).

    Raises
    ------
    SourceLevelError
        When both are given: the two could disagree.

    Notes
    -----
    S_sc = k · V · I_sc, k = √3 for three-phase and 1 for single-phase (the same relation as a
    load's apparent power, applied to the bolted fault current).

    References
    ----------
    IEC 60909-0:2016, clause 6.2 (S"k = √3 U_n I"k) — from memory.

    Examples
    --------
    >>> round(short_circuit_power(12470.0, 3, fault_current=10e3) / 1e6, 1)
    216.0
    >>> short_circuit_power(480.0, 3) is None
    True
    """
    if source_short_circuit_power is not None and fault_current is not None:
        raise SourceLevelError("give the short-circuit level as power or as available fault "
                               "current, not both (leave one blank)")
    if fault_current is not None:
        return apparent_power(voltage, fault_current, phases)
    return source_short_circuit_power
