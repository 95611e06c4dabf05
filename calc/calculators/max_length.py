"""max-length: how far can this conductor carry this load before the drop reaches the limit?

The one-way length at which the exact drop (the voltage-drop calculator's method) equals the
limit, found by bisection; the voltage-drop run, not the protective loop's longest run (that is
ground-fault-trip's).
"""

from calc.calculators._conductors import (
    conductor_impedance,
    describe_run,
    drop_series,
    read_run,
    run_inputs,
    solve,
)
from calc.errors import InputError, VoltageCollapse
from calc.spec import Calculator, Output, Result
from calc.units import format_quantity as fq
from calc.voltage_drop import max_run_length

CAUTION_DROP_ONLY = ("The longest run for voltage drop alone; ampacity, protection and fault "
                     "clearing may allow less.")


def _view(inputs):
    size, limit = inputs["size"], inputs["max_drop_pct"]
    r = read_run(inputs)
    z = conductor_impedance(inputs, size)
    try:
        length = max_run_length(r.system, r.voltage, z.r_ac, z.x, r.power_factor, limit, r.sets,
                                current=r.current, neutral_current=r.neutral_current)
    except VoltageCollapse as error:
        raise InputError("current", r.current, str(error)) from None
    _, run = solve(inputs, size, length)
    result = Result()
    result.output("length", length)  # in the page's display system (ft or m)
    result.output("drop_pct", run.drop_pct)
    result.output("current", run.current)
    if run.leg_drop_pct is not None:
        result.output("drop_leg_pct", run.leg_drop_pct)
    result.step("Longest run: the length at which the exact drop equals the limit (bisection)",
                f"drop(L) = {limit:g} %", f"L = {fq(length, 'm')}")
    describe_run(result, inputs, size, length, z, run)
    result.cautions.insert(0, CAUTION_DROP_ONLY)
    result.series = drop_series(inputs, size, length, limit)
    return result


CALCULATOR = Calculator(
    id="max-length",
    title="Longest run for a voltage-drop limit",
    summary="How far a conductor size can carry a load before the drop reaches the limit.",
    group="Conductors",
    inputs=run_inputs(with_length=False),
    outputs=(
        Output("length", "Longest one-way run", "m"),
        Output("drop_pct", "Voltage drop at that length", "%"),
        Output("current", "Load current", "A"),
        Output("drop_leg_pct", "120/240 V: drop on the heavier leg, line to neutral", "%"),
    ),
    compute=_view,
)
