"""transformer-currents: what currents does a transformer carry at its rating, and what are its
voltage and turns ratios?"""

import math

from calc import transformers
from calc.calculators import _inputs
from calc.calculators._plausibility import plausibility
from calc.calculators._transformers import (
    connection_input,
    equipment_reasons,
    ratio_display,
    rating_input,
    standard_ratings,
    transformer_cautions,
    voltage_input,
)
from calc.electrical import SQRT3
from calc.spec import Calculator, Output, Result
from calc.units import format_quantity as fq

# Line-to-neutral voltages of common wye systems (120/208, 127/220, 230/400, 277/480, 347/600).
# Entered as a three-phase line-to-line voltage they usually mean a mix-up. Common practice.
COMMON_LINE_TO_NEUTRAL_V = (120.0, 127.0, 230.0, 277.0, 347.0)

SOURCE_CURRENTS = (
    "I = S / (√3 V_LL) and I = S / V: S. J. Chapman, Electric Machinery Fundamentals, 5th "
    "ed., ch. 2 (three-phase transformers) — from memory."
)
SOURCE_PREFERRED = (
    "Preferred ratings: IEEE/ANSI C57.12 series (North America); IEC 60076 R10 series — "
    "from memory."
)
CAUTIONS = (
    "Rated current is not the conductor ampacity or the overcurrent device rating: size "
    "those by your code (for example NEC 450.3 and 240.4).",
    "Energising a transformer draws an inrush of many times rated current for a few "
    "cycles; protection must ride through it (common practice).",
)


def _is_preferred(apparent_power, phases):
    """Whether a rating [VA] is in the IEEE/ANSI list of its phase count or the IEC list."""
    kva = apparent_power / 1e3
    lists = (standard_ratings(phases, "na"), standard_ratings(phases, "iec"))
    return any(math.isclose(kva, rating, rel_tol=1e-9) for table in lists for rating in table)


def _is_line_to_neutral(voltage):
    return any(math.isclose(voltage, v, rel_tol=1e-9) for v in COMMON_LINE_TO_NEUTRAL_V)


def _steps(result, inputs, primary_a, secondary_a, voltage_ratio, ratio):
    apparent_power, phases = inputs["kva"], int(inputs["phases"])
    primary_v, secondary_v = inputs["primary_v"], inputs["secondary_v"]
    connection = inputs["connection"]
    s, v1, v2 = fq(apparent_power, "VA"), fq(primary_v, "V"), fq(secondary_v, "V")
    if phases == 3:
        kind, formula, shown = "balanced three-phase", "I{n} = S / (√3 × V{n})", "(√3 × {v})"
    else:
        kind, formula, shown = "single-phase", "I{n} = S / V{n}", "{v}"
    result.step(f"Primary full-load current ({kind})", formula.format(n="₁"),
                f"= {s} / {shown.format(v=v1)} = {fq(primary_a, 'A')}")
    result.step("Secondary full-load current", formula.format(n="₂"),
                f"= {s} / {shown.format(v=v2)} = {fq(secondary_a, 'A')}")
    direction = "step-down" if voltage_ratio > 1 else ("step-up" if voltage_ratio < 1 else "1:1")
    result.step(f"Voltage ratio ({direction}); the currents are in the inverse ratio",
                "V₁ / V₂ = I₂ / I₁", f"= {v1} / {v2} = {ratio_display(voltage_ratio)}")
    if phases != 3:
        result.step("Turns ratio (single-phase)", "N₁ / N₂ = V₁ / V₂",
                    f"= {v1} / {v2} = {ratio_display(ratio)}")
        return
    primary_side, secondary_side = connection.split("-")
    w1 = transformers.winding_voltage(primary_v, primary_side)
    w2 = transformers.winding_voltage(secondary_v, secondary_side)
    result.step(f"Winding turns ratio, {connection} (delta winding: line voltage; wye "
                "winding: line voltage / √3)", "N₁ / N₂ = V₁,winding / V₂,winding",
                f"= {fq(w1, 'V')} / {fq(w2, 'V')} = {ratio_display(ratio)}")
    for side, side_name, line_a in ((primary_side, "Primary", primary_a),
                                    (secondary_side, "Secondary", secondary_a)):
        if side == "delta":
            result.step(f"{side_name} winding current (delta: line current / √3)",
                        "I_winding = I_line / √3",
                        f"= {fq(line_a, 'A')} / √3 = {fq(line_a / SQRT3, 'A')}")


def _currents_view(inputs):
    apparent_power = inputs["kva"]
    phases = int(inputs["phases"])
    primary_v, secondary_v = inputs["primary_v"], inputs["secondary_v"]
    connection = inputs["connection"]
    result = Result()

    primary_a = transformers.rated_current(apparent_power, primary_v, phases)
    secondary_a = transformers.rated_current(apparent_power, secondary_v, phases)
    voltage_ratio = primary_v / secondary_v
    ratio = transformers.turns_ratio(primary_v, secondary_v, phases, connection)

    result.output("primary_a", primary_a)
    result.output("secondary_a", secondary_a)
    result.output("turns_ratio", ratio, ratio_display(ratio))
    result.output("voltage_ratio", voltage_ratio, ratio_display(voltage_ratio))
    _steps(result, inputs, primary_a, secondary_a, voltage_ratio, ratio)

    if _is_preferred(apparent_power, phases):
        result.check("rating", "pass", f"{fq(apparent_power, 'VA')} is a preferred rating "
                     "(IEEE C57.12 / IEC 60076 lists).")
    else:
        result.check("rating", "warn",
                     f"{fq(apparent_power, 'VA')} is not in the preferred-rating lists; confirm it "
                     "on the nameplate.")
    if phases == 3:
        for name, volts in (("primary_v", primary_v), ("secondary_v", secondary_v)):
            if _is_line_to_neutral(volts):
                result.check(f"{name}_line_to_line", "warn",
                             f"{fq(volts, 'V')} is a usual line-to-neutral voltage; three-phase "
                             "inputs are line-to-line (for 120/208 V enter 208 V, for 277/480 V "
                             "enter 480 V, for 230/400 V enter 400 V).")
    plausibility(result, equipment_reasons(apparent_power, phases, (("primary", primary_v),
                                                                   ("secondary", secondary_v))))

    result.assumptions += [
        "Rated (nameplate) currents: rated kVA divided by rated voltage; the secondary voltage "
        "sags a few percent under load (regulation), which is not included.",
        "Ideal transformer for the ratios: losses and magnetising current neglected.",
    ]
    if phases == 3:
        result.assumptions.append(
            "Three-phase: balanced load; voltages are line-to-line; the winding connection "
            f"({connection}) sets the turns ratio and the winding currents."
        )
    result.sources += [SOURCE_CURRENTS, SOURCE_PREFERRED]
    result.cautions += list(CAUTIONS)
    transformer_cautions(result, primary_v, secondary_v)

    loads = [5.0 * k for k in range(31)]  # 0 to 150 % of rating, every 5 %
    result.series = {
        "title": "Line current against load",
        "x": {"label": "Load", "unit": "%", "values": loads},
        "y_axis": {"label": "Line current", "unit": "A"},
        "y": [
            {"label": "Primary", "unit": "A", "values": [primary_a * p / 100 for p in loads]},
            {"label": "Secondary", "unit": "A", "values": [secondary_a * p / 100 for p in loads]},
        ],
        "marks": [{"axis": "x", "value": 100.0, "label": "Rated load"}],
    }
    return result


CALCULATOR = Calculator(
    id="transformer-currents",
    title="Transformer currents and ratio",
    summary="Full-load primary and secondary currents, voltage ratio and turns ratio from kVA "
            "and the winding voltages.",
    group="Transformers",
    inputs=(
        rating_input(minimum=0, min_exclusive=True, region_defaults={"iec": 500},
                     help="Nameplate apparent power, e.g. 75 kVA or 1.5 MVA."),
        _inputs.phases(),
        voltage_input("primary_v", "Primary voltage", 480, 11000,
                      "Rated primary voltage; line-to-line for three-phase (e.g. 480 V, 13.8 kV)."),
        voltage_input("secondary_v", "Secondary voltage", 208, 400,
                      "Rated secondary voltage; line-to-line for three-phase (208 V for "
                      "120/208 V)."),
        connection_input(advanced=False,
                         help="Three-phase only: sets the turns ratio and winding currents."),
    ),
    outputs=(
        Output("primary_a", "Primary full-load current", "A"),
        Output("secondary_a", "Secondary full-load current", "A"),
        Output("turns_ratio", "Winding turns ratio N₁/N₂", ""),
        Output("voltage_ratio", "Voltage ratio V₁/V₂", ""),
    ),
    compute=_currents_view,
)
