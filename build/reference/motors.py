"""Reference: NEMA locked-rotor code letters and starting-method multipliers, from
calc.induction_motors, and insulation classes from calc.dc_motors."""

import numpy as np

from build.reference import GENERATED_NOTE, markdown_table
from calc import dc_motors, units
from calc import induction_motors as motors

# Supplies for the locked-rotor-current-per-horsepower columns: (phases, voltage [V], heading).
LR_SUPPLIES = {
    "na": ((3, 208.0, "208 V 3-φ"), (3, 230.0, "230 V 3-φ"), (3, 460.0, "460 V 3-φ"),
           (3, 575.0, "575 V 3-φ"), (1, 230.0, "230 V 1-φ")),
    "iec": ((3, 400.0, "400 V 3-φ"), (3, 690.0, "690 V 3-φ"), (1, 230.0, "230 V 1-φ")),
}

# A motor whose across-the-line locked-rotor current is this multiple of its full-load current,
# to show the starting methods in the multiples of FLC a technician reads on a clamp meter:
# 6.5 × lies in the usual 6-8 × (Design B about 5.5-7 ×), common practice.
EXAMPLE_LR_MULTIPLE = 6.5
REACTOR_TAPS = (0.50, 0.65, 0.80)  # usual reactor and resistor starter taps (common practice)


def code_letter_rows(region):
    """[letter, kVA/hp range, LRA per hp at each supply ...] for every code letter."""
    letters = list(motors.CODE_LETTERS)
    low = np.array([motors.CODE_LETTERS[letter][0] for letter in letters])
    high = np.array([np.nan if motors.CODE_LETTERS[letter][1] is None
                     else motors.CODE_LETTERS[letter][1] for letter in letters])
    columns = []
    for phases, voltage, _ in LR_SUPPLIES[region]:
        # One horsepower of output: the same function the calculator uses, on whole arrays.
        columns.append((motors.locked_rotor_current(low, units.HORSEPOWER_W, voltage, phases),
                        motors.locked_rotor_current(high, units.HORSEPOWER_W, voltage, phases)))
    rows = []
    for n, letter in enumerate(letters):
        span = (f"{low[n]:g} – {high[n]:g}" if np.isfinite(high[n]) else f"{low[n]:g} and up")
        cells = [f"{a[n]:.3g} – {b[n]:.3g}" if np.isfinite(b[n]) else f"{a[n]:.3g} and up"
                 for a, b in columns]
        rows.append([letter, span, *cells])
    return rows


def starting_rows():
    """[method, line % LRC, motor % LRC, torque % LRT, line × FLC] for each starting method."""
    locked, full_load = 1.0, 1.0 / EXAMPLE_LR_MULTIPLE
    rows = []
    for token, label in motors.STARTING_METHODS:
        fractions = REACTOR_TAPS if token == "reactor" else (None,)
        for k in fractions:
            start = motors.starting_current(token, locked, full_load, voltage_fraction=k)
            name = label if k is None else f"Primary reactor or resistor at {100 * k:g} % V"
            if token == "vfd":
                torque = f"≈ {100 * start.torque_fraction:.0f} % of full-load torque"
            else:
                torque = f"{100 * start.torque_fraction:.3g} %"
            rows.append([name, f"{100 * start.line:.3g} %", f"{100 * start.motor:.3g} %", torque,
                         f"{start.line / full_load:.3g} ×"])
    return rows


# Rated voltages shown in the sizes-by-voltage table (NEC Table 430.250 columns and IEC 400/690 V).
SIZE_VOLTAGES = {"na": ((115.0, "115 V"), (208.0, "200–230 V"), (460.0, "460–575 V"),
                        (2300.0, "2300 V and up")),
                 "iec": ((230.0, "230 V"), (400.0, "400 V"), (690.0, "690 V"),
                         (3300.0, "3.3 kV and up"))}


def size_rows(region):
    """[voltage, single-phase range, three-phase range] from calc's usual_power_range."""
    def span(voltage, phases):
        low, high = motors.usual_power_range(voltage, phases)
        if high == 0.0:
            return "not made"
        if high is None:
            return f"from {motors.horsepower(low):.0f} hp ({low / 1e3:.4g} kW)"
        return f"up to {motors.horsepower(high):.0f} hp ({high / 1e3:.4g} kW)"
    return [[label, span(voltage, 1), span(voltage, 3)] for voltage, label in
            SIZE_VOLTAGES[region]]


def motors_page(team_config):
    region = team_config.region
    headings = [heading for _, _, heading in LR_SUPPLIES[region]]
    limits = ", ".join(f"{limit:g} ×" for limit in motors.DEFAULT_CURRENT_LIMIT.values())
    classes = markdown_table(["Class", "Highest temperature"],
                             [[f"{name}", f"{limit:g} °C"]
                              for name, limit in dc_motors.INSULATION_CLASSES.items()])
    return "\n\n".join([
        "# Motor starting: code letters and starting methods",
        GENERATED_NOTE,
        "## NEMA locked-rotor code letters",
        "The code letter on a NEMA motor's nameplate gives its locked-rotor apparent power per "
        "horsepower at full voltage and rated frequency (NEMA MG 1 §10.37.2, reproduced in NEC "
        "Table 430.7(B)). Each range runs from its lower figure up to, but not including, the "
        "higher; I, O and Q are not used. The current columns are amperes of locked-rotor "
        "current per horsepower of rated output, I = kVA/hp × 1000 / (√3 V) three-phase or "
        "/ V single-phase: multiply by the motor's horsepower.",
        markdown_table(["Letter", "kVA/hp", *[f"A/hp, {h}" for h in headings]],
                       code_letter_rows(region), "l" + "r" * (1 + len(headings))),
        "Example: a 10 hp, 460 V, code H motor draws 6.3 to 7.1 kVA/hp, so between "
        f"{10 * motors.locked_rotor_current(6.3, units.HORSEPOWER_W, 460.0, 3):.1f} and "
        f"{10 * motors.locked_rotor_current(7.1, units.HORSEPOWER_W, 460.0, 3):.1f} A "
        "across the line.",
        "## Starting methods",
        "Line current drawn from the supply and torque left at standstill, as shares of the "
        "across-the-line locked-rotor current (LRC) and torque (LRT). Torque follows the square "
        "of the motor's voltage. The last column is the line current in multiples of full-load "
        f"current (FLC) for a motor whose LRC is {EXAMPLE_LR_MULTIPLE:g} × FLC. Soft starter and "
        f"drive are at their usual current limits ({limits} FLC, common practice); those rows "
        "depend on the setting, not on the motor's LRC.",
        markdown_table(["Method", "Line current, % LRC", "Motor current, % LRC",
                        "Starting torque, % LRT", "Line current, × FLC"], starting_rows()),
        "Wye-delta needs a motor with both ends of each winding brought out, run in delta; "
        "open-transition wye-delta and autotransformer starters draw a brief surge at the "
        "changeover. A drive's supply current at low speed is below its motor current (it "
        "draws roughly the power delivered).",
        "## Motor sizes by rated voltage",
        "The outputs induction motors are usually made in at each voltage: the plausibility "
        "check of the motor calculators warns outside them. NEC Tables 430.248/430.250 list "
        "single-phase motors to 10 hp, three-phase motors to 2 hp at 115 V, 200 hp at 200–230 V "
        "and 500 hp at 460–575 V, and from 60 hp at 2300 V; IEC low-voltage motors are made to "
        "about 1000 kW (NEMA MG 1 voltage ratings by size, IEC practice: common practice).",
        markdown_table(["Rated voltage", "Single-phase", "Three-phase"], size_rows(region),
                       "lrr"),
        "## Insulation classes",
        "The highest temperature each insulation class is rated for (IEC 60085 thermal "
        "classes; NEMA MG 1 uses the same letters) — from memory. The DC motor calculator's "
        "stalled-armature estimate runs to these limits.",
        classes,
        "Sources: NEMA MG 1 §10.37.2 and NEC Table 430.7(B) (code letters); machine theory for "
        "the reduced-voltage ratios (wye-delta 1/3, autotransformer line current ≈ tap², reactor "
        "≈ k, torque ∝ V²); soft-starter and drive settings are common practice. Defer to the "
        "motor's data sheet and your local code.",
    ]) + "\n"


PAGES = {"reference/motors.md": motors_page}
