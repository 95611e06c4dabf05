"""Reference: conductor data and quick longest-run tables, from calc.conductors and voltage_drop."""

import numpy as np

from build.reference import GENERATED_NOTE, markdown_table
from calc import api, conductors, units, voltage_drop
from calc.conductors import METRES_PER_KFT
from calc.errors import ParameterError

TEMPERATURES_C = np.array([20.0, 75.0, 90.0])  # 20 °C reference, 75 °C NEC tables, 90 °C rating

# Quick tables: circuits a technician meets most, at the given current, 3 % drop, copper in PVC.
QUICK_CIRCUITS = {
    "na": (("1ph", 120.0, "120 V single-phase"), ("1ph", 240.0, "240 V single-phase"),
           ("1ph", 277.0, "277 V single-phase"), ("3ph", 208.0, "208 V three-phase"),
           ("3ph", 480.0, "480 V three-phase")),
    "iec": (("1ph", 230.0, "230 V single-phase"), ("3ph", 400.0, "400 V three-phase")),
}
QUICK_SIZES = {
    "na": ("14 AWG", "12 AWG", "10 AWG", "8 AWG", "6 AWG", "4 AWG", "2 AWG", "1/0 AWG"),
    "iec": ("1.5 mm²", "2.5 mm²", "4 mm²", "6 mm²", "10 mm²", "16 mm²", "25 mm²", "35 mm²"),
}
QUICK_CURRENTS_A = (10.0, 16.0, 20.0, 32.0)
QUICK_LIMIT_PCT = 3.0
QUICK_PF = 0.9
METHOD_WORDS = {"table": "the published tables (NEC Chapter 9 Tables 8 and 9; IEC 60228 for mm²)",
                "physics": "the physics (resistivity, touching-conductor geometry)"}


def quick_method(region):
    """The conductor-data method the max-length calculator starts from in `region` ("na" or
    "iec"): the published tables for North American practice, the physics for IEC practice."""
    return api.default_for(api.get("max-length").input("method"), region)


def _resistances(size, material):
    """DC resistance [Ω/m] at each of TEMPERATURES_C, by the calculators' physics."""
    return np.array([conductors.dc_resistance(size, material, t, "physics") for t in TEMPERATURES_C])


def _us_table(material):
    rows = []
    for label in units.AWG_SIZES + units.KCMIL_SIZES:
        size = units.parse_conductor_size(label)
        r = _resistances(size, material) * METRES_PER_KFT  # Ω per 1000 ft
        z = conductors.impedance(size, material, 75.0, 60.0, "pvc")
        table = conductors.table_resistance(size, material)
        table_75 = "—" if table is None else f"{conductors.dc_resistance(size, material, 75.0, 'table') * METRES_PER_KFT:.4g}"
        row9 = conductors.NEC_TABLE9_R[(material, "pvc")].get(label)
        xl9 = conductors.NEC_TABLE9_XL.get(label)
        rows.append([label, f"{size.area_m2 * 1e6:.3g}", f"{size.area_m2 / units.CIRCULAR_MIL_M2:,.0f}",
                     *[f"{value:.4g}" for value in r], table_75, f"{z.x * METRES_PER_KFT:.3f}",
                     "—" if row9 is None else f"{row9:g}", "—" if xl9 is None else f"{xl9[0]:.3f}"])
    return markdown_table(
        ["Size", "mm²", "cmil", "R 20 °C", "R 75 °C", "R 90 °C", "Table 8, 75 °C", "X, 60 Hz",
         "Table 9 R (PVC)", "Table 9 XL (PVC)"], rows)


def _metric_table(material):
    rows = []
    for label in units.METRIC_SIZES:
        size = units.parse_conductor_size(label)
        try:
            conductors.check_made(size, material)
        except ParameterError:  # not made in this material (IEC 60228 Class 2)
            continue
        r = _resistances(size, material) * 1e3  # Ω/km
        z = conductors.impedance(size, material, 70.0, 50.0, "pvc")
        maximum = conductors.table_resistance(size, material)
        table_20 = "—" if maximum is None else f"{conductors.dc_resistance(size, material, 20.0, 'table') * 1e3:.4g}"
        rows.append([label, *[f"{value:.4g}" for value in r], table_20, f"{z.x * 1e3:.3f}"])
    return markdown_table(["Size", "R 20 °C", "R 75 °C", "R 90 °C", "IEC 60228 max, 20 °C", "X, 50 Hz"], rows)


def longest_runs(region):
    """{circuit label: array[size, current] of longest one-way runs [m]} at 3 %, Cu, PVC conduit,
    by the region's default conductor-data method (quick_method)."""
    frequency = 50.0 if region == "iec" else 60.0
    method = quick_method(region)
    tables = {}
    for system, voltage, label in QUICK_CIRCUITS[region]:
        grid = np.zeros((len(QUICK_SIZES[region]), len(QUICK_CURRENTS_A)))
        for i, size in enumerate(QUICK_SIZES[region]):
            z = conductors.impedance(size, "cu", 75.0, frequency, "pvc", method=method)
            for j, current in enumerate(QUICK_CURRENTS_A):
                grid[i, j] = voltage_drop.max_run_length(system, voltage, z.r_ac, z.x, QUICK_PF,
                                                         QUICK_LIMIT_PCT, current=current)
        tables[label] = grid
    return tables


def _quick_tables(region):
    feet = region != "iec"
    words = METHOD_WORDS[quick_method(region)]
    parts = []
    for label, grid in longest_runs(region).items():
        shown = grid / 0.3048 if feet else grid
        unit = "ft" if feet else "m"
        rows = [[size, *[f"{value:,.0f}" for value in row]]
                for size, row in zip(QUICK_SIZES[region], np.round(shown, 0))]
        parts.append(f"### {label}\n\n" + markdown_table(
            ["Size"] + [f"{current:g} A" for current in QUICK_CURRENTS_A], rows)
            + f"\n\nOne-way {unit}; conductor data by {words}.")
    return "\n\n".join(parts)


def conductors_page(team_config):
    region = team_config.region
    other = "iec" if region == "na" else "na"
    return "\n\n".join([
        "# Conductor data and quick run lengths",
        GENERATED_NOTE,
        "Resistance is per conductor, DC, from resistivity and temperature coefficient "
        "(IEC 60028 copper 1/58 Ω·mm²/m, α20 = 0.00393; aluminium 1350 at 61 % IACS, "
        "α20 = 0.00403) with a 1.02 stranding factor; the published table's value stands "
        "beside it. Reactance X is for three touching conductors in trefoil in non-magnetic "
        "conduit (see the conductor calculator for the basis and the NEC Table 9 comparison). "
        "NEC Chapter 9 Table 9's AC resistance and reactance (PVC conduit, 60 Hz, 75 °C; read, "
        "as reproduced) stand beside them for the sizes it lists.",
        "## Longest run at 3 % drop",
        f"Copper in PVC conduit at 75 °C, power factor {QUICK_PF:g}, load at the far end, "
        "sending end at nominal; by the same exact method as the voltage-drop calculator, with "
        "the conductor data each region's calculators start from: "
        f"{METHOD_WORDS[quick_method('na')]} for North American practice, "
        f"{METHOD_WORDS[quick_method('iec')]} for IEC practice. "
        "Voltage drop only: ampacity and protection may allow less (common circuit currents "
        "shown whatever the size's ampacity).",
        _quick_tables(region),
        _quick_tables(other).replace("### ", "### Also: "),
        "## AWG and kcmil, copper (Ω per 1000 ft)",
        _us_table("cu"),
        "## AWG and kcmil, aluminium (Ω per 1000 ft)",
        _us_table("al"),
        "## Metric (IEC 60228), copper (Ω/km)",
        _metric_table("cu"),
        "## Metric (IEC 60228), aluminium (Ω/km)",
        _metric_table("al"),
        "Sources: NEC Chapter 9 Table 8 (DC resistance at 75 °C) and Table 9 (AC resistance "
        "and reactance, three conductors in conduit, 60 Hz, 75 °C), both read, as reproduced; "
        "IEC 60228 Tables 1 and 2 (maximum resistance at 20 °C, a ceiling, not a nominal value; "
        "read, as reproduced, but 0.75, 1 and 400 mm² from memory); ASTM B258 (AWG "
        "diameters). Defer to the maker's data and your local code for a design.",
    ]) + "\n"


PAGES = {"reference/conductors.md": conductors_page}
