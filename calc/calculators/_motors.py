"""View helpers the motor calculators share (motor-current, motor-start-dip)."""

from calc import induction_motors, transformers
from calc.calculators._plausibility import outside, plausibility
from calc.units import format_quantity as fq


def code_letter_choices():
    """The NEMA code letters as form choices, each with its kVA/hp range in the label."""
    return tuple((letter, f"{letter} ({low:g}–{high:g} kVA/hp)" if high else
                  f"{letter} ({low:g} kVA/hp and up)")
                 for letter, (low, high) in induction_motors.CODE_LETTERS.items())


def _hp(power):
    return f"{induction_motors.horsepower(power):.4g} hp"


def size_reasons(power, voltage, phases, current=None):
    """Why a motor of this output is not made at this voltage (empty when it is); `current` is
    the full-load current it would draw [A], quoted when given."""
    kind = "single-phase" if phases == 1 else "three-phase"
    low_v, high_v = induction_motors.MOTOR_VOLTAGE_RANGE_V
    if outside(voltage, low_v, high_v):
        return [f"{fq(voltage, 'V')} is outside the {fq(low_v, 'V')} to {fq(high_v, 'V')} "
                "induction motors are rated for (NEC Tables 430.248/430.250 start at 115 V; NEMA "
                "MG 1 medium-voltage ratings end near 13.8 kV — common practice)"]
    low, high = induction_motors.usual_power_range(voltage, phases)
    draw = f" would draw {fq(current, 'A')}" if current is not None else ""
    if high == 0.0:
        return [f"{kind} motors are not made for {fq(voltage, 'V')} (single-phase motors stop "
                f"at {fq(1000.0, 'V')} — common practice)"]
    if high is not None and power > high * (1 + 1e-9):
        above = ("motors this large are built for 2.3 kV and up"
                 if voltage <= transformers.LOW_VOLTAGE_LIMIT_V else "")
        return [f"a {_hp(power)} {kind} motor at {fq(voltage, 'V')}{draw}: {above}"
                f"{'; ' if above else ''}{kind} motors at this voltage are made to about "
                f"{_hp(high)} (NEC Tables 430.248/430.250 by voltage, IEC low-voltage ranges; "
                "NEMA MG 1 voltage ratings by size — common practice)"]
    if power < low * (1 - 1e-9):
        return [f"a {_hp(power)} motor at {fq(voltage, 'V')}{draw}: medium-voltage motors start "
                f"at about {_hp(low)} (NEC Table 430.250's 2300 V column — common practice); "
                "smaller motors are built for low voltage"]
    return []


def size_plausibility(result, power, voltage, phases, current, reasons=()):
    """The `plausibility` check of a motor calculator: its size at its voltage, plus `reasons`
    the calculator found itself."""
    plausibility(result, size_reasons(power, voltage, phases, current) + list(reasons))
