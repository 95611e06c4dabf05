"""The registry: every calculator Fluxbook ships, one module a calculator id, in site order.

A calculator module `calc/calculators/<id with underscores>.py` holds its spec, view, checks,
chart and texts, and exposes the spec as `CALCULATOR`. The physics it calls lives in the domain
modules of calc/. This tuple feeds the CLI, the page builder, the worker and the completeness
test.
"""

from calc.calculators import (
    ampacity,
    back_emf,
    buck_boost,
    circuit_check,
    conductor,
    fault_current,
    gfci_check,
    ground_fault_trip,
    inductive_kick,
    line_loss,
    max_length,
    motor_current,
    motor_start_dip,
    pf_correction,
    rlc_resonance,
    supply_mismatch,
    switching_transient,
    transformer_currents,
    transformer_efficiency,
    transformer_fault_current,
    transformer_regulation,
    transformer_size,
    voltage_drop,
    wire_size,
)

CALCULATORS = tuple(module.CALCULATOR for module in (
    # Conductors and voltage drop
    conductor,
    ampacity,
    voltage_drop,
    wire_size,
    max_length,
    line_loss,
    circuit_check,
    # Transformers
    transformer_currents,
    transformer_size,
    transformer_fault_current,
    transformer_regulation,
    transformer_efficiency,
    buck_boost,
    supply_mismatch,
    # Motors and the supply path
    motor_current,
    motor_start_dip,
    back_emf,
    # Protection and shock safety
    fault_current,
    ground_fault_trip,
    gfci_check,
    # Inductors, RLC and power-factor correction
    switching_transient,
    rlc_resonance,
    inductive_kick,
    pf_correction,
))
