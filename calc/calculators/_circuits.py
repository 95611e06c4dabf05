"""View helpers the circuits calculators share (switching-transient, rlc-resonance,
inductive-kick): chart resolution, the display of energy, and the range of real parts that
their `plausibility` checks judge R, L and C by."""

from calc.calculators._plausibility import outside
from calc.units import format_quantity

# Points in each waveform and sweep chart: smooth on a phone, a few kB of JSON.
CHART_POINTS = 401

# The range of real parts, for the plausibility check (issue 11, item 9). Common practice:
# resistances from a milliohm (a short wire, a busbar joint) to 100 MΩ (above it the leakage of
# the board and the insulation takes over); inductances from a nanohenry (a few millimetres of
# wire) to about 100 H (large DC contactor, brake and magnet coils); capacitances from a
# picofarad (below it the strays of any layout dominate) to a farad (beyond it supercapacitors,
# whose series resistance, leakage and voltage-dependent capacitance the ideal model leaves out).
RESISTANCE_RANGE_OHM = (1e-3, 1e8)
INDUCTANCE_RANGE_H = (1e-9, 100.0)
CAPACITANCE_RANGE_F = (1e-12, 1.0)

# Lumped coils reach a Q of a few hundred at best (air-cored, litz wire); a Q above this needs a
# loss resistance smaller than any real coil's, so the ringing and the magnification are the
# model's, not the circuit's — common practice.
Q_MAX = 1000.0


def format_energy(value):
    """Energy in J with the trade's prefixes (kJ, J, mJ), three significant figures."""
    # calc.units has no energy dimension yet; the voltage prefixes (kV, V, mV) are the same.
    return format_quantity(value, "V")[:-1] + "J"


def chart_times(span):
    """CHART_POINTS times evenly from 0 to `span` [s]."""
    return [span * k / (CHART_POINTS - 1) for k in range(CHART_POINTS)]


def part_reasons(resistance=None, inductance=None, capacitance=None):
    """Plausibility reasons for the parts given (None: not in the circuit): each one outside
    the range of real parts, with the range."""
    reasons = []
    for value, (low, high), unit, what in (
            (resistance, RESISTANCE_RANGE_OHM, "ohm", "resistance"),
            (inductance, INDUCTANCE_RANGE_H, "H", "inductance"),
            (capacitance, CAPACITANCE_RANGE_F, "F", "capacitance")):
        if value is not None and outside(value, low, high):
            reasons.append(f"the {what}, {format_quantity(value, unit)}, is outside the range "
                           f"of real parts, {format_quantity(low, unit, 1)} to "
                           f"{format_quantity(high, unit, 1)} (common practice)")
    return reasons


def q_reason(q):
    """The plausibility reason for a quality factor above Q_MAX, or None."""
    if q > Q_MAX:
        return (f"Q = {q:.3g}: real coils reach a Q of a few hundred, so above {Q_MAX:g} the loss "
                "resistance is smaller than any real coil's and the ringing and magnification "
                "are the model's (common practice); add the coil's resistance to R")
    return None
