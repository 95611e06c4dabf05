"""View helpers the circuits calculators share (switching-transient, rlc-resonance,
inductive-kick): chart resolution and the display of energy."""

from calc.units import format_quantity

# Points in each waveform and sweep chart: smooth on a phone, a few kB of JSON.
CHART_POINTS = 401


def format_energy(value):
    """Energy in J with the trade's prefixes (kJ, J, mJ), three significant figures."""
    # calc.units has no energy dimension yet; the voltage prefixes (kV, V, mV) are the same.
    return format_quantity(value, "V")[:-1] + "J"


def chart_times(span):
    """CHART_POINTS times evenly from 0 to `span` [s]."""
    return [span * k / (CHART_POINTS - 1) for k in range(CHART_POINTS)]
