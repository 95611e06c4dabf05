"""The answer first: for each calculator, the one to three outputs that answer its page's question.

The page shows them at the top of the result with the overall verdict (the worst check), in
`[data-summary]`. One table for every calculator, read by `calc.api.describe` (a Calculator may
also carry its own `summary_outputs`, which win). Names are output names of that calculator, in
the order shown; an output a result leaves out (it does not apply) is skipped on the page.
"""

SUMMARY_OUTPUTS = {
    # Conductors and voltage drop
    "conductor": ("r_ac", "x", "z_085"),
    "ampacity": ("ampacity_a", "max_device_a"),
    "voltage-drop": ("drop_pct", "end_v", "drop_v"),
    "wire-size": ("conductor_area", "drop_pct"),
    "max-length": ("length", "drop_pct"),
    "line-loss": ("loss_w", "alt_total_loss_w", "annual_saving"),
    "circuit-check": ("governing", "fix"),  # the verdict is the summary's own badge
    # Transformers
    "transformer-currents": ("primary_a", "secondary_a"),
    "transformer-size": ("rating", "loading_pct"),
    "transformer-fault-current": ("fault_a", "peak_a", "fault_ln_a"),
    "transformer-regulation": ("regulation_pct", "loaded_v", "tap_pct"),
    "transformer-efficiency": ("efficiency_pct", "loss_w", "annual_loss_cost"),
    "buck-boost": ("output_v", "rating", "units"),
    "supply-mismatch": ("rating", "secondary_v", "flux_pct"),
    # Motors
    "motor-current": ("table_a", "full_load_a", "starting_a"),
    "motor-start-dip": ("dip_pct_shared", "dip_pct_motor"),
    "back-emf": ("back_emf_v", "speed", "starting_a"),
    # Protection
    "fault-current": ("main_fault_a", "panel_fault_a", "equipment_fault_a"),
    "ground-fault-trip": ("fault_a", "zs", "max_length"),
    "gfci-check": ("passes", "must_trip_at", "time_limit"),
    # Circuits and power factor
    "switching-transient": ("tau", "peak_value", "settling_time"),
    "rlc-resonance": ("f0", "q", "bandwidth"),
    "inductive-kick": ("switch_v", "peak_v", "stored_energy"),
    "pf-correction": ("capacitor_q", "line_a_after", "resonance_order"),
}


def summary_outputs(calculator):
    """The summary output names of a Calculator: its own `summary_outputs`, else the table's."""
    own = getattr(calculator, "summary_outputs", ())
    return tuple(own) if own else SUMMARY_OUTPUTS.get(calculator.id, ())
