"""wire-size: what is the smallest conductor that keeps this run within its drop limit?

Each standard size from the smallest power-circuit size up is tried with the voltage-drop
calculator's exact method; the first within the limit is the answer, shown with the next
smaller size (which fails) and the next two larger sizes for comparison.
"""

from calc import conductors, units
from calc.calculators._conductors import (
    describe_run,
    drop_series,
    read_run,
    run_inputs,
    solve,
)
from calc.errors import InputError, ParameterError
from calc.spec import Calculator, Output, Result
from calc.units import format_quantity as fq

FIRST_SIZE = {"awg": "14 AWG", "metric": "1.5 mm²"}  # smallest power-circuit sizes considered
COMPARED_LARGER = 2  # larger sizes shown for comparison
CAUTION_DROP_ONLY = ("This is the smallest size for voltage drop alone; it may be smaller than "
                     "ampacity, protection or the code's minimum allow.")


def _candidate_sizes(system, material):
    """The sizes of the chosen system made in the material, smallest first."""
    start = units.SIZES.index(FIRST_SIZE[system])
    labels = units.METRIC_SIZES if system == "metric" else units.AWG_SIZES + units.KCMIL_SIZES
    for label in labels:
        if units.SIZES.index(label) < start:
            continue
        try:
            conductors.check_made(label, material)
        except ParameterError:
            continue
        yield units.parse_conductor_size(label)


def _view(inputs):
    limit, length = inputs["max_drop_pct"], inputs["length"]
    read_run(inputs)  # the load's errors are the user's, not a size's
    tried = []
    for size in _candidate_sizes(inputs["sizes"], inputs["material"]):
        try:
            z, run = solve(inputs, size, length)
        except InputError:
            continue  # this size collapses (or has no table value); a larger one may not
        tried.append((size, z, run))
        if run.limit_drop_pct <= limit:
            break
    else:
        largest = tried[-1][0].label if tried else "the largest size"
        raise InputError("length", length, f"no size up to {largest} with {int(inputs['sets'])} "
                         f"set(s) keeps the drop within {limit:g} %; use parallel sets, a higher "
                         "voltage or a shorter run")
    size, z, run = tried[-1]
    result = Result()
    result.output("conductor_area", size.area_m2, size.label)
    result.output("drop_pct", run.drop_pct)
    result.output("drop_v", run.drop_v)
    result.output("current", run.current)
    if run.leg_drop_pct is not None:
        result.output("drop_leg_pct", run.leg_drop_pct)
    if len(tried) > 1:
        smaller, _, smaller_run = tried[-2]
        result.step("The next smaller size does not meet the limit", f"{smaller.label}",
                    f"= {smaller_run.limit_drop_pct:.3g} % > {limit:g} %")
    following = []
    for bigger in _candidate_sizes(inputs["sizes"], inputs["material"]):
        if bigger.area_m2 > size.area_m2 and len(following) < COMPARED_LARGER:
            try:
                following.append((bigger, solve(inputs, bigger, length)[1]))
            except InputError:
                pass
    for bigger, bigger_run in following:
        result.step("For comparison, a larger size", bigger.label,
                    f"= {bigger_run.limit_drop_pct:.3g} % drop, "
                    f"{fq(bigger_run.loss_w, 'W')} loss")
    describe_run(result, inputs, size, length, z, run)
    result.cautions.insert(0, CAUTION_DROP_ONLY)
    result.series = drop_series(inputs, size, length, limit)
    return result


CALCULATOR = Calculator(
    id="wire-size",
    title="Wire size for a voltage-drop limit",
    summary="The smallest conductor that keeps a run within a drop limit, with the next sizes "
            "for comparison.",
    group="Conductors",
    inputs=run_inputs(with_size=False, with_sizes=True),
    outputs=(
        Output("conductor_area", "Smallest size meeting the limit", "m²"),
        Output("drop_pct", "Voltage drop with it", "%"),
        Output("drop_v", "Voltage drop with it", "V"),
        Output("current", "Load current", "A"),
        Output("drop_leg_pct", "120/240 V: drop on the heavier leg, line to neutral", "%"),
    ),
    compute=_view,
)
