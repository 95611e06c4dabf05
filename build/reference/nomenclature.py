"""The nomenclature page: one name and one unit per quantity, and every calculator's outputs.

The quantity table is the rule the physics modules follow (tests/test_layout.py checks their
docstrings against it); the output tables are generated from the registry, so they are always
the names the command line, share links and scripts see.
"""

from build.reference import GENERATED_NOTE, markdown_table
from calc import api

# (name, unit, meaning). Units are the coherent SI units the functions take and return; a name
# that ends in a unit word (_pct, _c, _hz, _a, _v, _w, _s) holds exactly that unit.
QUANTITIES = (
    ("voltage", "V", "r.m.s. voltage; line-to-line for three-phase unless the function says "
     "otherwise; DC voltage for DC circuits"),
    ("current", "A", "r.m.s. line current"),
    ("supply_voltage", "V", "the voltage of the supply feeding the element named"),
    ("phases", "-", "1 (single-phase) or 3 (three-phase)"),
    ("power", "W", "real power; for a motor, its rated mechanical output"),
    ("apparent_power", "VA", "apparent power S"),
    ("reactive_power", "var", "reactive power Q"),
    ("power_factor", "-", "cos φ of the load, lagging unless the function says otherwise"),
    ("efficiency", "-", "output over input, a fraction (0.91, not 91)"),
    ("rating", "VA", "a transformer's rated apparent power (nameplate kVA in SI)"),
    ("rated_current", "A", "a transformer winding's current at rated apparent power"),
    ("full_load_current", "A", "a motor's current at rated output (nameplate or NEC table)"),
    ("resistance", "Ω", "resistance of the element named"),
    ("reactance", "Ω", "reactance of the element named"),
    ("impedance", "Ω", "impedance magnitude (complex where the function says so)"),
    ("inductance", "H", "inductance"),
    ("capacitance", "F", "capacitance"),
    ("frequency", "Hz", "supply or evaluation frequency (form inputs call it `frequency_hz`)"),
    ("length", "m", "one-way length of a run"),
    ("area", "m²", "conductor cross-section"),
    ("spacing", "m", "axial, centre-to-centre spacing of conductors"),
    ("r_per_m", "Ω/m", "resistance per metre of one conductor"),
    ("x_per_m", "Ω/m", "reactance per metre of one conductor"),
    ("impedance_per_metre", "Ω/m", "loop impedance per metre of a circuit"),
    ("temperature_c", "°C", "a temperature"),
    ("time", "s", "time"),
    ("energy", "J", "energy (shown in kWh)"),
    ("speed", "rad/s", "shaft speed (shown in r/min)"),
    ("z_pct", "%", "short-circuit impedance on the transformer's own rating"),
    ("r_pct", "%", "resistance on the transformer's own rating"),
    ("x_pct", "%", "reactance on the transformer's own rating"),
    ("x_r", "-", "X/R ratio"),
    ("source_short_circuit_power", "VA", "a supply's three-phase short-circuit power"),
    ("fault_current", "A", "a bolted fault current (available, or at a point)"),
    ("voltage_factor", "-", "IEC 60909-0 voltage factor c"),
    ("load_fraction", "-", "load as a fraction of rating"),
    ("no_load_loss", "W", "a transformer's no-load (core) loss"),
    ("load_loss", "W", "a transformer's load (copper) loss at the load considered"),
    ("tap_pct", "%", "a transformer tap, percent of rated voltage"),
    ("max_drop_pct", "%", "a voltage-drop limit, percent of nominal"),
    ("material", "-", "conductor material token: cu or al"),
    ("method", "-", "conductor data: physics (resistivity and geometry) or table (NEC Chapter 9 "
     "Tables 8 and 9, IEC 60228)"),
    ("starting_method", "-", "a motor starting method token (dol, wye-delta, auto-65, soft, vfd...)"),
    ("circuit", "-", "a series circuit's kind: rl, rc or rlc"),
    ("circuit_type", "-", "final or distribution circuit (IEC 60364-4-41 disconnection times)"),
    ("connection", "-", "a transformer's winding connection, primary first (delta-wye...)"),
    ("bank_connection", "-", "a capacitor bank's connection: wye, delta or single"),
    ("size", "-", "a conductor size (calc.units.ConductorSize: 12 AWG, 250 kcmil, 2.5 mm²)"),
    ("system", "-", "dc, 1ph, 1ph3w or 3ph"),
    ("damping_ratio", "-", "ζ of a second-order circuit"),
    ("q", "-", "quality factor of a resonant circuit"),
)

RULES = """\
Fluxbook's calculation package, its command line, share links and saved jobs use one name per
quantity. The rules:

- **Values are coherent SI** — V, A, W, VA, var, Ω, H, F, Hz, m, m², s, J, rad/s — with
  percentages in % and ratios as plain numbers. The page shows the trade's units (kVA, ft,
  kcmil, hp, r/min); the numbers underneath are SI.
- **A name says the quantity** (`capacitor_q`, `rating`, `conductor_area`), not a unit. A name
  that ends in a unit word holds exactly that unit: `_a` amperes, `_v` volts, `_w` watts,
  `_va` volt-amperes, `_pct` percent, `_s` seconds, `_c` degrees Celsius, `_hz` hertz.
  Prefixed units (kVA, kW, MVA, mH) and non-SI units (hp, ft) never appear in a name: a value
  in the contract is never in them.
- **Input names are public.** Share links, saved jobs and scripts use them; once released they
  change only with a migration. Some inputs keep the unit a technician types in their name
  (`source_mva` takes "250 MVA"); the value the calculator receives is still SI.
- **Horsepower** is 745.7 W (550 ft·lbf/s, NIST SP 811 B.8), one constant:
  `calc.units.HORSEPOWER_W`.
"""


def build(team_config):
    """The page's Markdown."""
    parts = ["# Nomenclature", "", RULES, "## Quantities", "",
             "The names the calculation functions use for their parameters and results.", "",
             markdown_table(["Name", "Unit", "Meaning"],
                            [(f"`{name}`", unit, meaning) for name, unit, meaning in QUANTITIES],
                            align="lll"),
             "", "## Calculator outputs", "",
             "Every output of every calculator: its name (as `python -m calc run` and the "
             "saved JSON give it), the SI unit of its value, and its label on the page.", ""]
    for calculator in api.REGISTRY.values():
        parts += [f"### {calculator.title}", "", f"`{calculator.id}`", "",
                  markdown_table(["Output", "Unit", "Label"],
                                 [(f"`{o.name}`", o.unit or "-", o.label)
                                  for o in calculator.outputs], align="lll"), ""]
    parts += [GENERATED_NOTE, ""]
    return "\n".join(parts)


PAGES = {"reference/nomenclature.md": build}
