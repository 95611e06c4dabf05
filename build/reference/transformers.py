"""Reference: transformer full-load currents, standard ratings, typical impedance, fault levels,
taps and buck-boost outputs, computed at build time from calc.transformers."""

import numpy as np

from build.reference import GENERATED_NOTE, markdown_table
from calc import transformers

# Voltages of each full-load current table [V], line-to-line for three-phase: the usual system
# and distribution voltages of each region (ANSI C84.1 and IEC 60038, from memory).
CURRENT_TABLES = {
    "na": (
        ("Three-phase, North American ratings", 3, transformers.PREFERRED_KVA_3PH_NA,
         (208.0, 240.0, 480.0, 600.0, 2400.0, 4160.0, 12470.0, 13800.0, 34500.0)),
        ("Single-phase, North American ratings", 1, transformers.PREFERRED_KVA_1PH_NA,
         (120.0, 240.0, 277.0, 480.0, 2400.0, 7200.0, 7620.0, 14400.0, 19920.0)),
    ),
    "iec": (
        ("Three-phase, IEC ratings", 3, transformers.PREFERRED_KVA_IEC,
         (400.0, 415.0, 690.0, 3300.0, 6600.0, 10000.0, 11000.0, 20000.0, 33000.0)),
    ),
}

# Fault-level tables: the usual low-voltage secondary of each region, and the %Z columns.
FAULT_TABLES = {"na": (480.0, (3, 75, 150, 300, 500, 750, 1000, 1500, 2000, 2500)),
                "iec": (400.0, (100, 160, 250, 400, 630, 800, 1000, 1250, 1600, 2000, 2500))}
FAULT_Z_PCT = (2.0, 3.0, 4.0, 5.0, 5.75, 6.0, 7.0)
PRIMARY_V = 13800.0  # the primary does not change an infinite-source fault; named for the path
# Single-phase pole and pad units with a 120/240 V mid-tapped secondary: preferred ratings [kVA]
# and their usual %Z, about 1.5-3 % (common practice). The line-to-neutral column takes an all-reactance winding (X/R 10⁶), its largest: 2 / 1.2 = 5/3 ×
# the line-to-line fault (calc.transformers.MID_TAP_X_FACTOR).
MID_TAP_KVA = (10, 15, 25, 37.5, 50, 75, 100, 167)
MID_TAP_Z_PCT = (1.5, 2.0, 2.5, 3.0)
MID_TAP_X_R = 1e6

TOLERANCE_PCT = 100 * transformers.IMPEDANCE_TOLERANCE  # 7.5 % of the nameplate %Z
# How much more fault current a unit at the low end of its impedance tolerance gives [%].
LOW_Z_GAIN_PCT = 100 * (1 / (1 - transformers.IMPEDANCE_TOLERANCE) - 1)
EXCITATION_PCT = 100 * transformers.EXCITATION_LIMIT

# Typical short-circuit impedance, each row with its source and how far to trust it.
TYPICAL_IMPEDANCE = (
    ("Minimum %Z, IEC 60076-5 Table 1", "≤ 630 kVA: 4.0 %; 631-1250: 5.0 %; 1251-2500: 6.0 %; "
     "2501-6300: 7.0 %; 6301-25 000: 8.0 %", "IEC 60076-5 Table 1 (from memory)"),
    ("Typical %Z, Indian practice", "< 1 MVA 5 %; 1-2.5 MVA 6 %; 2.5-5 MVA 7 %; 5-7 MVA 8 %; "
     "7-12 MVA 9 %; 12-30 MVA 10 %; > 30 MVA 12.5 %", "IS 2026 (read as quoted)"),
    ("Liquid-filled substation and pad-mount, 750-2500 kVA (US)", "5.75 %",
     "common practice under the C57.12 series"),
    ("600 V dry-type, 15-1000 kVA (US)", "about 3-7 %, by design", "common practice"),
    ("Impedance tolerance, two-winding", f"± {TOLERANCE_PCT:g} % of the specified %Z (± 10 % for "
     "three-winding, auto and zig-zag)", f"IEEE C57.12.00 §9.2 (read for {TOLERANCE_PCT:g} %; 10 % "
     "from memory)"),
)

BUCK_BOOST_SUPPLIES_V = (120.0, 208.0, 240.0, 277.0, 480.0)


def full_load_table(phases, ratings_kva, voltages):
    """Array [rating, voltage] of full-load currents [A], by calc's rated_current (numpy)."""
    kva = np.asarray(ratings_kva, dtype=float)[:, None]
    volts = np.asarray(voltages, dtype=float)[None, :]
    return transformers.rated_current(kva * 1e3, volts, phases)


def _amps(value):
    return f"{value:,.0f}".replace(",", " ") if value >= 100 else f"{value:.3g}"


def _volts(value):
    return f"{value / 1e3:g} kV" if value >= 1000 else f"{value:g} V"


def _current_tables(region):
    parts = []
    for title, phases, ratings, voltages in CURRENT_TABLES[region]:
        grid = full_load_table(phases, ratings, voltages)
        rows = [[f"{kva:g}", *[_amps(a) for a in row]] for kva, row in zip(ratings, grid)]
        formula = "kVA × 1000 / (√3 × V)" if phases == 3 else "kVA × 1000 / V"
        parts.append(f"### {title}\n\nI = {formula}, amperes.\n\n"
                     + markdown_table(["kVA"] + [_volts(v) for v in voltages], rows))
    return "\n\n".join(parts)


def fault_grid(region):
    """Array [rating, %Z] of infinite-source three-phase fault currents [A] at the secondary."""
    voltage, ratings = FAULT_TABLES[region]
    return np.array([[transformers.secondary_fault(kva * 1e3, PRIMARY_V, voltage, 3, z, 5.0)
                      .fault_current
                      for z in FAULT_Z_PCT] for kva in ratings])


def _fault_table(region):
    voltage, ratings = FAULT_TABLES[region]
    rows = [[f"{kva:g}", *[f"{a / 1e3:.3g}" for a in row]]
            for kva, row in zip(ratings, fault_grid(region))]
    return (f"### {_volts(voltage)} three-phase secondary, kA\n\n"
            + markdown_table(["kVA"] + [f"{z:g} %" for z in FAULT_Z_PCT], rows))


def mid_tap_grid():
    """Array [rating, %Z, 2] of infinite-source faults [A] at a 120/240 V mid-tapped secondary:
    line to line, and line to neutral at its bound for an all-reactance winding (the largest)."""
    return np.array([[[level.fault_current, level.line_to_neutral_current]
                      for level in (transformers.secondary_fault(kva * 1e3, 7200.0, 240.0, 1, z,
                                                                 MID_TAP_X_R, mid_tap=True)
                                    for z in MID_TAP_Z_PCT)]
                     for kva in MID_TAP_KVA])


def _mid_tap_table():
    rows = [[f"{kva:g}", *[f"{ll / 1e3:.3g} / {ln / 1e3:.3g}" for ll, ln in row]]
            for kva, row in zip(MID_TAP_KVA, mid_tap_grid())]
    return ("### 120/240 V single-phase (mid-tapped), kA line to line / line to neutral\n\n"
            + markdown_table(["kVA"] + [f"{z:g} %" for z in MID_TAP_Z_PCT], rows))


def _category_table():
    limits = transformers.SHORT_CIRCUIT_CATEGORY_KVA
    rows, low = [], {1: 5, 3: 15}
    for n, name in enumerate(("I", "II", "III")):
        cells = []
        for phases in (1, 3):
            start = low[phases] if n == 0 else limits[phases][n - 1] + 1
            cells.append(f"{start:g}-{limits[phases][n]:g}")
        rows.append([name, *cells])
    rows.append(["IV", f"above {limits[1][-1]:g}", f"above {limits[3][-1]:g}"])
    return markdown_table(["Category", "Single-phase kVA", "Three-phase kVA"], rows, "lrr")


def _tap_table():
    rows = []
    for tap in transformers.STANDARD_TAPS_PCT:
        factor = transformers.tap_voltage_factor(tap)
        rows.append([f"{tap:+g} %" if tap else "0 % (rated)",
                     f"{480 * (1 + tap / 100):.0f} V", f"{13800 * (1 + tap / 100) / 1e3:.2f} kV",
                     f"{208 * factor:.1f} V", f"{400 * factor:.1f} V",
                     f"{100 * (factor - 1):+.2f} %"])
    return markdown_table(["Tap", "Suits a 480 V supply of", "or 13.8 kV of",
                           "208 V secondary from a rated supply", "400 V secondary",
                           "Change"], rows)


def _buck_boost_table():
    rows = []
    for supply in BUCK_BOOST_SUPPLIES_V:
        for option in transformers.buck_boost_combinations(supply):
            if option.mode != "boost":
                continue
            buck = transformers.buck_boost_output(supply, option.shunt_v, option.series_v, "buck")
            rows.append([f"{supply:g} V", option.windings, f"{option.shunt_v:g} V",
                         f"{option.series_v:g} V", f"{option.output_v:.1f} V", f"{buck:.1f} V"])
    return markdown_table(["Supply", "Transformer", "Primary connected for",
                           "Secondary connected for", "Boost output", "Buck output"], rows,
                          "lllrrr")


# ---- connection diagrams, drawn here as SVG (no drawing library) ------------------------------

DIAGRAM_CONNECTIONS = (
    ("delta-wye", "Delta – grounded wye (Dyn)",
     "Delta primary, grounded-wye secondary: the usual distribution connection. A primary winding "
     "has the line voltage, a secondary winding the line voltage / √3; the delta carries the "
     "triplen harmonics and blocks zero sequence. ANSI: the low voltage lags the high voltage by "
     "30° (IEEE C57.12.00, from memory); IEC practice is often Dyn11, leading by 30°."),
    ("delta-delta", "Delta – delta (Dd)",
     "Both windings at line voltage, no neutral; can run open-delta on two units at 57.7 % of "
     "the bank rating (from memory)."),
    ("wye-wye", "Wye – grounded wye (Yyn)",
     "Both windings at line voltage / √3; needs a tertiary or a grounded primary neutral to "
     "carry triplen currents (common practice)."),
    ("wye-delta", "Wye – delta (Yd)",
     "Wye primary, delta secondary: a step-up at a generator, or a three-wire load supply."),
)
COIL_BUMPS = 4  # semicircles that draw one winding


def _coil(x1, y1, x2, y2, size=0.5):
    """SVG path of a winding from (x1, y1) to (x2, y2): straight leads and a row of bumps."""
    length = ((x2 - x1) ** 2 + (y2 - y1) ** 2) ** 0.5
    ux, uy = (x2 - x1) / length, (y2 - y1) / length
    lead = (1 - size) / 2 * length
    bump = size * length / COIL_BUMPS
    start_x, start_y = x1 + ux * lead, y1 + uy * lead
    arcs = " ".join(f"a {bump / 2:.2f} {bump / 2:.2f} 0 0 1 {ux * bump:.2f} {uy * bump:.2f}"
                    for _ in range(COIL_BUMPS))
    return (f'<path d="M {x1:.2f} {y1:.2f} L {start_x:.2f} {start_y:.2f} {arcs} '
            f'L {x2:.2f} {y2:.2f}" fill="none" stroke="currentColor" stroke-width="1.6"/>')


def _text(x, y, text, anchor="middle", size=11):
    return (f'<text x="{x:.1f}" y="{y:.1f}" text-anchor="{anchor}" font-size="{size}" '
            f'fill="currentColor">{text}</text>')


def _winding_set(kind, cx, cy, labels, neutral_label=None):
    """Three windings in delta or wye around (cx, cy), terminals labelled."""
    import math
    radius = 42.0
    corners = [(cx + radius * math.cos(math.radians(a)), cy - radius * math.sin(math.radians(a)))
               for a in (90, 210, 330)]
    parts = []
    if kind == "delta":
        for (xa, ya), (xb, yb) in zip(corners, corners[1:] + corners[:1]):
            parts.append(_coil(xa, ya, xb, yb))
    else:
        for x, y in corners:
            parts.append(_coil(cx, cy, x, y))
        parts.append(f'<circle cx="{cx:.1f}" cy="{cy:.1f}" r="2.5" fill="currentColor"/>')
        if neutral_label:
            parts.append(f'<path d="M {cx:.1f} {cy:.1f} L {cx:.1f} {cy + 62:.1f} M {cx - 9:.1f} '
                         f'{cy + 62:.1f} L {cx + 9:.1f} {cy + 62:.1f} M {cx - 5:.1f} {cy + 66:.1f} '
                         f'L {cx + 5:.1f} {cy + 66:.1f}" fill="none" stroke="currentColor" '
                         'stroke-width="1.4"/>')
            parts.append(_text(cx + 8, cy + 52, neutral_label, "start"))
    for (x, y), label in zip(corners, labels):
        parts.append(f'<circle cx="{x:.1f}" cy="{y:.1f}" r="3" fill="currentColor"/>')
        dy = -8 if y < cy else 16
        parts.append(_text(x, y + dy, label))
    return "".join(parts)


def _svg(width, height, label, body):
    return (f'<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 {width} {height}" '
            f'width="{width}" height="{height}" role="img" aria-label="{label}">{body}</svg>')


def connection_diagram(connection):
    """SVG of a three-phase winding connection: primary (H terminals) and secondary (X)."""
    primary, secondary = connection.split("-")
    body = (_winding_set(primary, 80, 70, ("H1", "H2", "H3"))
            + _winding_set(secondary, 240, 70, ("X1", "X2", "X3"),
                           "X0" if secondary == "wye" else None)
            + _text(80, 150, "Primary") + _text(240, 150, "Secondary"))
    return _svg(320, 160, f"{connection} winding connection", body)


def buck_boost_diagram(mode):
    """SVG of a buck-boost unit as an autotransformer: shunt winding across the supply, series
    winding in the line, aiding (boost) or opposing (buck); dots mark like polarity."""
    series_dot = 125 if mode == "boost" else 195
    body = "".join([
        '<path d="M 20 40 L 120 40 M 200 40 L 300 40 M 20 140 L 300 140" fill="none" '
        'stroke="currentColor" stroke-width="1.6"/>',
        _coil(120, 40, 200, 40, size=0.8),
        _coil(90, 40, 90, 140, size=0.7),
        f'<circle cx="{series_dot}" cy="30" r="3" fill="currentColor"/>',
        '<circle cx="100" cy="62" r="3" fill="currentColor"/>',
        _text(20, 30, "Supply", "start"), _text(300, 30, "Load", "end"),
        _text(20, 156, "Line 2 or neutral", "start"),
        _text(160, 62, "series winding (X)"), _text(114, 100, "shunt", "start"),
        _text(114, 113, "winding (H)", "start"),
        _text(160, 176, "boost: V_out = V_in (1 + X/H)" if mode == "boost"
              else "buck: V_out = V_in (1 − X/H)"),
    ])
    return _svg(320, 185, f"buck-boost unit connected to {mode}", body)


def _figure(svg, caption):
    return f'<figure class="fb-diagram">{svg}<figcaption>{caption}</figcaption></figure>'


def _diagrams():
    parts = [_figure(connection_diagram(connection), f"<strong>{title}.</strong> {text}")
             for connection, title, text in DIAGRAM_CONNECTIONS]
    parts += [_figure(buck_boost_diagram(mode), text) for mode, text in (
        ("boost", "<strong>Boost.</strong> The series winding aids the supply (additive "
                  "polarity): its dot faces the supply, like the shunt winding's."),
        ("buck", "<strong>Buck.</strong> The same unit with the series winding reversed "
                 "(subtractive polarity). Always wire from the maker's diagram."),
    )]
    return "\n\n".join(parts)


def transformers_page(team_config):
    region = team_config.region
    other = "iec" if region == "na" else "na"
    ratings = [
        ["IEEE/ANSI single-phase", ", ".join(f"{k:g}" for k in transformers.PREFERRED_KVA_1PH_NA)],
        ["IEEE/ANSI three-phase", ", ".join(f"{k:g}" for k in transformers.PREFERRED_KVA_3PH_NA)],
        ["IEC practice", ", ".join(f"{k:g}" for k in transformers.PREFERRED_KVA_IEC)],
        ["Buck-boost units", ", ".join(f"{k:g}" for k in transformers.BUCK_BOOST_KVA)],
    ]
    return "\n\n".join([
        "# Transformer reference",
        GENERATED_NOTE,
        "Full-load currents, standard ratings, typical impedance, secondary fault levels, "
        "no-load taps and buck-boost outputs. Three-phase voltages are line-to-line. These are "
        "rated (nameplate) figures; conductors and protection follow your code, not this page.",
        "## Full-load current",
        _current_tables(region),
        _current_tables(other).replace("### ", "### Also: "),
        "## Standard ratings (kVA)",
        markdown_table(["List", "kVA"], ratings, "ll"),
        "Sources: IEEE/ANSI C57.12 series preferred ratings (read, approximate); IEC 60076 and "
        "EU Regulation 548/2014 Annex I Table I.1 for IEC practice (from memory); buck-boost "
        "sizes common practice (from memory).",
        "## IEEE C57.12.00 short-circuit categories",
        _category_table(),
        "Source: IEEE C57.12.00 (read). The category sets the through-fault duty the "
        "transformer is built to withstand.",
        "## Typical impedance",
        markdown_table(["What", "Value", "Source"], [list(row) for row in TYPICAL_IMPEDANCE],
                       "lll"),
        "Always use the nameplate %Z for a calculation; these are for planning before the "
        "transformer is chosen.",
        "## Secondary fault current, infinite source",
        "Bolted three-phase fault at the secondary terminals, I = I_FL × 100 / %Z, nominal "
        "voltage (c = 1), no source impedance, so the upper bound for that nameplate. The "
        "utility's source impedance lowers it (see the fault-current calculator); a unit at "
        f"its −{TOLERANCE_PCT:g} % impedance tolerance gives {LOW_Z_GAIN_PCT:.0f} % more.",
        _fault_table(region),
        _fault_table(other).replace("### ", "### Also: "),
        "On a single-phase 120/240 V secondary the fault from one line to the neutral drives "
        "half the winding and is the larger one: 4/3 (a resistive winding) to 5/3 (a reactive "
        "one) × the line-to-line fault. The table gives its upper bound; the fault-current "
        "calculator estimates it from %Z and X/R with the half-winding impedance "
        f"{transformers.MID_TAP_R_FACTOR:g} × %R + j{transformers.MID_TAP_X_FACTOR:g} × %X "
        "(the point-to-point method's Note 2, read as reproduced at scribd.com/document/"
        "388329023).",
        _mid_tap_table(),
        f"## No-load taps (± {transformers.TAP_STEPS} × {transformers.TAP_STEP_PCT:g} %)",
        _tap_table(),
        "A tap is named by the primary voltage it suits. On a rated supply, a minus tap raises "
        "the secondary and a plus tap lowers it. Source: IEEE C57.12.10 (read). Change taps "
        "only with the transformer de-energised, locked out and proved dead.",
        "## Buck-boost outputs",
        "Standard low-voltage units connected as an autotransformer, the primary across the "
        f"supply (not over {EXCITATION_PCT:g} % of its rating) and the secondary in series, "
        "aiding for boost and opposing for buck: V_out = V_in (1 ± V_secondary / V_primary).",
        _buck_boost_table(),
        "## Connection diagrams",
        "Drawn at build time. H terminals are the high-voltage winding, X the low-voltage; X0 is "
        "the secondary neutral, grounded. Polarity marks and terminal numbering on a real unit "
        "follow its nameplate diagram.",
        _diagrams(),
    ]) + "\n"


PAGES = {"reference/transformers.md": transformers_page}
