"""Transformers: rated currents and ratios (this module grows into sizing, fault level and taps).

Quantities follow the nomenclature page: apparent_power [VA], voltage [V] line-to-line for
three-phase, current [A].
"""

import math

from calc import cautions
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

SQRT3 = math.sqrt(3.0)

# Preferred kVA ratings. Source: IEEE/ANSI C57.12 series preferred ratings (read, approximate,
# as quoted in REFERENCE_VALUES section 5); IEC R10 series per IEC 60076 (from memory).
PREFERRED_KVA_1PH_NA = (5, 10, 15, 25, 37.5, 50, 75, 100, 167, 250, 333, 500, 833, 1250, 1667,
                        2500, 3333, 5000)
PREFERRED_KVA_3PH_NA = (3, 9, 15, 30, 45, 75, 112.5, 150, 225, 300, 500, 750, 1000, 1500, 2000,
                        2500, 3750, 5000, 7500, 10000)
PREFERRED_KVA_IEC = (100, 160, 250, 315, 400, 500, 630, 800, 1000, 1250, 1600, 2000, 2500, 3150)

# Line-to-neutral voltages of common wye systems (120/208, 127/220, 230/400, 277/480, 347/600).
# Entered as a three-phase line-to-line voltage they usually mean a mix-up. Common practice.
COMMON_LINE_TO_NEUTRAL_V = (120.0, 127.0, 230.0, 277.0, 347.0)

# Winding connections: the winding voltage is the line voltage for delta, line/sqrt(3) for wye.
CONNECTIONS = (
    ("delta-wye", "Delta – wye (Dyn)"),
    ("delta-delta", "Delta – delta (Dd)"),
    ("wye-wye", "Wye – wye (Yyn)"),
    ("wye-delta", "Wye – delta (Yd)"),
)


def full_load_current(apparent_power, voltage, phases):
    """Rated line current of a transformer winding.

    Parameters
    ----------
    apparent_power : float
        Rated apparent power [VA].
    voltage : float
        Rated voltage [V]; line-to-line for three-phase.
    phases : int
        1 or 3.

    Returns
    -------
    float
        Line current at rated apparent power and rated voltage [A].

    Notes
    -----
    I = S / V (single-phase) or I = S / (sqrt(3) V_LL) (balanced three-phase).

    References
    ----------
    S. J. Chapman, *Electric Machinery Fundamentals*, 5th ed., section 2.10 (three-phase
    transformers) — from memory.

    Examples
    --------
    >>> round(full_load_current(75e3, 208.0, 3), 1)
    208.2
    """
    if phases == 3:
        return apparent_power / (SQRT3 * voltage)
    return apparent_power / voltage


def winding_voltage(line_voltage, connection_side):
    """Voltage across one winding [V]: the line voltage for delta, line/sqrt(3) for wye."""
    return line_voltage if connection_side == "delta" else line_voltage / SQRT3


def turns_ratio(primary_voltage, secondary_voltage, phases, connection="delta-delta"):
    """Winding turns ratio N1/N2 of an ideal transformer.

    For single-phase it is V1/V2. For three-phase it is the ratio of the winding voltages, which
    differs from the line-voltage ratio by sqrt(3) for delta-wye and wye-delta.

    Examples
    --------
    >>> round(turns_ratio(480.0, 208.0, 3, "delta-wye"), 3)
    3.997
    """
    if phases != 3:
        return primary_voltage / secondary_voltage
    primary_side, secondary_side = connection.split("-")
    return winding_voltage(primary_voltage, primary_side) / winding_voltage(
        secondary_voltage, secondary_side
    )


def _ratio_display(ratio):
    if ratio >= 1.0:
        return f"{fq(ratio, '')} : 1"
    return f"1 : {fq(1.0 / ratio, '')}"


def _is_preferred(kva, phases):
    lists = (PREFERRED_KVA_3PH_NA if phases == 3 else PREFERRED_KVA_1PH_NA, PREFERRED_KVA_IEC)
    return any(math.isclose(kva, rating, rel_tol=1e-9) for table in lists for rating in table)


def _currents_view(inputs):
    apparent_power = inputs["kva"]
    phases = int(inputs["phases"])
    primary_v = inputs["primary_v"]
    secondary_v = inputs["secondary_v"]
    connection = inputs["connection"]
    result = Result()

    primary_a = full_load_current(apparent_power, primary_v, phases)
    secondary_a = full_load_current(apparent_power, secondary_v, phases)
    voltage_ratio = primary_v / secondary_v
    ratio = turns_ratio(primary_v, secondary_v, phases, connection)

    result.output("primary_a", primary_a)
    result.output("secondary_a", secondary_a)
    result.output("turns_ratio", ratio, _ratio_display(ratio))
    result.output("voltage_ratio", voltage_ratio, _ratio_display(voltage_ratio))

    s, v1, v2 = fq(apparent_power, "VA"), fq(primary_v, "V"), fq(secondary_v, "V")
    if phases == 3:
        result.step("Primary full-load current (balanced three-phase)", "I₁ = S / (√3 × V₁)",
                    f"= {s} / (√3 × {v1}) = {fq(primary_a, 'A')}")
        result.step("Secondary full-load current", "I₂ = S / (√3 × V₂)",
                    f"= {s} / (√3 × {v2}) = {fq(secondary_a, 'A')}")
    else:
        result.step("Primary full-load current (single-phase)", "I₁ = S / V₁",
                    f"= {s} / {v1} = {fq(primary_a, 'A')}")
        result.step("Secondary full-load current", "I₂ = S / V₂",
                    f"= {s} / {v2} = {fq(secondary_a, 'A')}")
    direction = "step-down" if voltage_ratio > 1 else ("step-up" if voltage_ratio < 1 else "1:1")
    result.step(f"Voltage ratio ({direction}); the currents are in the inverse ratio",
                "V₁ / V₂ = I₂ / I₁", f"= {v1} / {v2} = {_ratio_display(voltage_ratio)}")
    if phases == 3:
        primary_side, secondary_side = connection.split("-")
        w1 = winding_voltage(primary_v, primary_side)
        w2 = winding_voltage(secondary_v, secondary_side)
        result.step(f"Winding turns ratio, {connection} (delta winding: line voltage; wye "
                    "winding: line voltage / √3)", "N₁ / N₂ = V₁,winding / V₂,winding",
                    f"= {fq(w1, 'V')} / {fq(w2, 'V')} = {_ratio_display(ratio)}")
        for side, side_name, line_a in (
            (primary_side, "Primary", primary_a), (secondary_side, "Secondary", secondary_a)
        ):
            if side == "delta":
                result.step(f"{side_name} winding current (delta: line current / √3)",
                            "I_winding = I_line / √3",
                            f"= {fq(line_a, 'A')} / √3 = {fq(line_a / SQRT3, 'A')}")
    else:
        result.step("Turns ratio (single-phase)", "N₁ / N₂ = V₁ / V₂",
                    f"= {v1} / {v2} = {_ratio_display(ratio)}")

    kva = apparent_power / 1e3
    if _is_preferred(kva, phases):
        result.check("rating", "pass",
                     f"{fq(apparent_power, 'VA')} is a preferred rating (IEEE C57.12 / IEC 60076 lists).")
    else:
        result.check("rating", "warn",
                     f"{fq(apparent_power, 'VA')} is not in the preferred-rating lists; confirm it "
                     "on the nameplate.")
    if phases == 3:
        for name, volts in (("primary_v", primary_v), ("secondary_v", secondary_v)):
            if any(math.isclose(volts, v, rel_tol=1e-9) for v in COMMON_LINE_TO_NEUTRAL_V):
                result.check(f"{name}_line_to_line", "warn",
                             f"{fq(volts, 'V')} is a usual line-to-neutral voltage; three-phase "
                             "inputs are line-to-line (for 120/208 V enter 208 V, for 277/480 V "
                             "enter 480 V, for 230/400 V enter 400 V).")

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
    result.sources += [
        "I = S / (√3 V_LL) and I = S / V: S. J. Chapman, Electric Machinery Fundamentals, 5th "
        "ed., ch. 2 (three-phase transformers) — from memory.",
        "Preferred ratings: IEEE/ANSI C57.12 series (North America); IEC 60076 R10 series — "
        "from memory.",
    ]
    result.cautions += [
        "Rated current is not the conductor ampacity or the overcurrent device rating: size "
        "those by your code (for example NEC 450.3 and 240.4).",
        "Energising a transformer draws an inrush of many times rated current for a few "
        "cycles; protection must ride through it (common practice).",
        cautions.BACKFEED,
    ]
    if max(primary_v, secondary_v) > 1000.0:
        result.cautions.append(cautions.MEDIUM_VOLTAGE)
    result.cautions += list(cautions.COMMON)

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


CURRENTS = Calculator(
    id="transformer-currents",
    title="Transformer currents and ratio",
    summary="Full-load primary and secondary currents, voltage ratio and turns ratio from kVA "
            "and the winding voltages.",
    group="Transformers",
    inputs=(
        Input("kva", "Rating", "quantity", unit="kVA", default=75, minimum=0, min_exclusive=True,
              maximum=1_000_000, region_defaults={"iec": 500},
              help="Nameplate apparent power, e.g. 75 kVA or 1.5 MVA."),
        Input("phases", "Phases", "choice", default="3",
              choices=(("3", "Three-phase"), ("1", "Single-phase"))),
        Input("primary_v", "Primary voltage", "quantity", unit="V", default=480, minimum=1,
              maximum=800_000, region_defaults={"iec": 11000},
              suggest="voltages",
              help="Rated primary voltage; line-to-line for three-phase (e.g. 480 V, 13.8 kV)."),
        Input("secondary_v", "Secondary voltage", "quantity", unit="V", default=208, minimum=1,
              maximum=800_000, region_defaults={"iec": 400},
              suggest="voltages",
              help="Rated secondary voltage; line-to-line for three-phase (208 V for 120/208 V)."),
        Input("connection", "Winding connection", "choice", default="delta-wye",
              choices=CONNECTIONS,
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
