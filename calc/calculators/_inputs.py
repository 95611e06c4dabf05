"""Input factories several calculators share, so one quantity is asked for the same way on every
page. Each takes keyword overrides of any Input field (label, default, help, advanced...).

Input names are public (share links, saved jobs, scripts): a factory never renames one.
"""

from calc import electrical
from calc.errors import InputError
from calc.spec import Input

MATERIALS = (("cu", "Copper"), ("al", "Aluminium"))
PHASE_CHOICES = (("3", "Three-phase"), ("1", "Single-phase"))


def _input(name, label, kind, overrides, **spec):
    spec.update(overrides)
    return Input(name, spec.pop("label", label), kind, **spec)


def phases(**overrides):
    """`phases`: 3 or 1 (a choice token)."""
    return _input("phases", "Phases", "choice", overrides, default="3", choices=PHASE_CHOICES)


def material(**overrides):
    """`material`: conductor material, copper or aluminium."""
    return _input("material", "Conductor material", "choice", overrides, default="cu",
                  choices=MATERIALS)


def frequency(**overrides):
    """`frequency_hz`: supply frequency, 60 Hz (North American) or 50 Hz (IEC practice)."""
    return _input("frequency_hz", "Frequency", "quantity", overrides, unit="Hz", default=60,
                  minimum=1, maximum=400, region_defaults={"iec": 50})


def source_power(**overrides):
    """`source_mva`: the supply's three-phase short-circuit power; blank = an infinite source."""
    return _input("source_mva", "Supply short-circuit power", "quantity", overrides, unit="MVA",
                  group="source_level", optional=True, minimum=0.001, maximum=1e5,
                  help="At the transformer primary, from the utility; blank = infinite source "
                       "(the upper bound).")


def source_fault_current(**overrides):
    """`source_fault_a`: the supply's available three-phase fault current (instead of power)."""
    return _input("source_fault_a", "Or the supply's available fault current", "quantity",
                  overrides, unit="kA", group="source_level", optional=True, minimum=0.001,
                  maximum=1000, help="Three-phase, at the transformer primary.")


def source_x_r(**overrides):
    """`source_x_r`: the supply's X/R ratio."""
    return _input("source_x_r", "Supply X/R", "quantity", overrides, unit="", default=10,
                  minimum=0.1, maximum=100,
                  help="10 when unknown (IEC 60909 takes R = 0.1 X).")


def source_level(inputs, voltage, phases=3):
    """The supply's short-circuit power [VA] from `source_mva` or `source_fault_a` (or None for
    an infinite source), refusing both at once on the `source_fault_a` field.

    `voltage` is where the level is stated (the transformer primary) [V].
    """
    try:
        return electrical.short_circuit_power(voltage, phases,
                                              source_short_circuit_power=inputs.get("source_mva"),
                                              fault_current=inputs.get("source_fault_a"))
    except electrical.SourceLevelError as error:
        raise InputError("source_fault_a", inputs["source_fault_a"], str(error)) from None
