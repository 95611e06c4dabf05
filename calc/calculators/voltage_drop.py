"""voltage-drop: will this run hold its voltage?

The drop, the voltage left at the load and the power lost in the conductors of one run, on DC,
single-phase two- or three-wire or three-phase, worked out exactly (phasors, with the sending
end held at nominal) and by the usual approximation, side by side.
"""

from calc.calculators._conductors import (
    describe_run,
    drop_series,
    read_run,
    run_inputs,
    solve,
    solve_length,
)
from calc.spec import Calculator, Output, Result

PROFILE_POINTS = 20  # segments of the voltage-along-the-run chart


def _profile_series(inputs, length, z):
    """Chart: the voltage along this run with its load at the far end (the current flows the
    whole way), against the limit's floor."""
    r = read_run(inputs)
    distances = [length * k / PROFILE_POINTS for k in range(PROFILE_POINTS + 1)]
    volts = [solve_length(r, z, d).end_v if d > 0 else r.voltage for d in distances]
    limit = inputs["max_drop_pct"]
    return {
        "title": "Voltage along the run",
        "x": {"label": "Distance from the source", "unit": "m", "values": distances},
        "y": [{"label": "Voltage", "unit": "V", "values": volts}],
        "marks": [{"axis": "y", "value": r.voltage * (1 - limit / 100),
                   "label": f"{limit:g} % below nominal"}],
    }


def _view(inputs):
    size, length = inputs["size"], inputs["length"]
    z, run = solve(inputs, size, length)
    result = Result()
    result.output("drop_v", run.drop_v)
    result.output("drop_pct", run.drop_pct)
    result.output("end_v", run.end_v)
    result.output("loss_w", run.loss_w)
    result.output("current", run.current)
    result.output("drop_pct_approx", run.approx_drop_pct)
    if run.leg_drop_v is not None:
        result.output("drop_leg_v", run.leg_drop_v)
        result.output("drop_leg_pct", run.leg_drop_pct)
        result.output("end_leg_v", run.leg_end_v)
    describe_run(result, inputs, size, length, z, run)
    result.series = [drop_series(inputs, size, length, inputs["max_drop_pct"]),
                     _profile_series(inputs, length, z)]
    return result


CALCULATOR = Calculator(
    id="voltage-drop",
    title="Voltage drop",
    summary="Drop, load-end voltage and conductor loss of one run on DC, single-phase, 120/240 V "
            "or three-phase, exact and by the usual approximation.",
    group="Conductors",
    inputs=run_inputs(),
    outputs=(
        Output("drop_v", "Voltage drop (line to line on three-phase and 120/240 V)", "V"),
        Output("drop_pct", "Voltage drop (of the nominal voltage)", "%"),
        Output("end_v", "Voltage at the load (line to line on three-phase and 120/240 V)", "V"),
        Output("loss_w", "Conductor loss", "W"),
        Output("current", "Load current", "A"),
        Output("drop_pct_approx", "Drop by the approximation", "%"),
        Output("drop_leg_v", "120/240 V: drop on the heavier leg, line to neutral", "V"),
        Output("drop_leg_pct", "120/240 V: drop on the heavier leg (of half the nominal)", "%"),
        Output("end_leg_v", "120/240 V: heavier leg's voltage to neutral at the load", "V"),
    ),
    compute=_view,
)
