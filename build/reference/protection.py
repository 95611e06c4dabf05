"""Reference: breaker trip bands, the effective ground-fault path (NEC) and disconnection times
(IEC), EGC sizes, longest runs for the fault-clearing check, GFCI and RCD trip times and
interrupting-rating test conditions, computed at build time from calc.protection."""

import numpy as np

from build.reference import GENERATED_NOTE, markdown_table
from calc import protection, units

MCCB_TABLE_MULTIPLE = 10  # the moulded-case tables take the usual 10 × In instantaneous setting
_MCCB_IA = MCCB_TABLE_MULTIPLE * (1 + protection.MCCB_TOLERANCE_PCT / 100)  # Ia in × In
_MCCB_SETTING = f"{MCCB_TABLE_MULTIPLE} × In + {protection.MCCB_TOLERANCE_PCT:g} %"
_MA = 1e3  # mA per A

# Longest-run tables: the circuits a technician meets most, each region's usual U0 and a typical
# Ze at the board (TN-C-S 0.35 Ω is a common supplier's declared maximum in IEC countries, from
# memory; 0.15 Ω is an invented North American panel fed from a nearby transformer).
LONGEST_RUN_CIRCUITS = {
    "iec": {"voltage": 230.0, "ze": 0.35, "temperature_c": 70.0, "frequency_hz": 50.0,
            "note": "230 V, Ze 0.35 Ω, copper at 70 °C (PVC), 50 Hz",
            "cables": (("1.5 mm²", "1 mm²"), ("1.5 mm²", "1.5 mm²"), ("2.5 mm²", "1.5 mm²"),
                       ("4 mm²", "1.5 mm²"), ("4 mm²", "2.5 mm²"), ("6 mm²", "2.5 mm²"),
                       ("10 mm²", "4 mm²"), ("16 mm²", "6 mm²")),
            "breakers": ("B6", "B10", "B16", "B20", "B32", "C10", "C16", "C20", "C32", "D16")},
    "na": {"voltage": 120.0, "ze": 0.15, "temperature_c": 75.0, "frequency_hz": 60.0,
           "note": f"120 V, Ze 0.15 Ω, copper at 75 °C, 60 Hz; moulded-case instantaneous "
                   f"{_MCCB_SETTING} tolerance",
           "cables": (("14 AWG", "14 AWG"), ("12 AWG", "12 AWG"), ("10 AWG", "10 AWG"),
                      ("8 AWG", "10 AWG"), ("6 AWG", "10 AWG")),
           "breakers": ("15 A 10x", "20 A 10x", "30 A 10x", "40 A 10x", "50 A 10x", "60 A 10x")},
}
MCCB_TABLE_RATINGS_A = (15, 20, 25, 30, 40, 50, 60, 70, 100, 125, 150, 200, 225, 400)
MCCB_TABLE_VOLTAGES_V = (120.0, 277.0)
MCB_TABLE_VOLTAGE_V = 230.0
UL943_TABLE_MA = (6, 8, 10, 15, 20, 30, 50, 75, 100, 150, 200, 264)
BAND_USES = {"B": "resistive loads, lighting, long final circuits",
             "C": "motors, fluorescent and LED drivers, small transformers",
             "D": "large inrush: transformers, welders, X-ray"}  # common practice


def longest_run_grid(region):
    """Array [cable, breaker] of the longest run [m] that passes Zs × Ia ≤ U0, by calc's own
    loop_impedance_per_metre and max_length_for_disconnection."""
    circuit = LONGEST_RUN_CIRCUITS[region]
    rows = []
    for line, cpc in circuit["cables"]:
        z = protection.loop_impedance_per_metre(
            units.parse_conductor_size(line), units.parse_conductor_size(cpc), "cu",
            circuit["temperature_c"], circuit["frequency_hz"])
        currents = [protection.operating_current(protection.parse_breaker(b))
                    for b in circuit["breakers"]]
        rows.append([protection.max_length_for_disconnection(circuit["voltage"], circuit["ze"],
                                                             z, ia) for ia in currents])
    return np.array(rows)


def ul943_times():
    """UL 943 greatest trip times [s] at UL943_TABLE_MA (numpy, the calculator's formula)."""
    return protection.gfci_time_limit(np.asarray(UL943_TABLE_MA, dtype=float) / _MA)


def _metres(value, region):
    if region == "na":
        return f"{value / 0.3048:.0f} ft" if value > 0 else "none"
    return f"{value:.0f} m" if value > 0 else "none"


def _longest_run_table(region):
    circuit = LONGEST_RUN_CIRCUITS[region]
    grid = longest_run_grid(region)
    rows = [[f"{line} / {cpc}", *[_metres(v, region) for v in row]]
            for (line, cpc), row in zip(circuit["cables"], grid)]
    return (f"### {circuit['note']}\n\n"
            + markdown_table(["Line / protective conductor", *circuit["breakers"]], rows))


def _band_table():
    rows = [[letter, f"{low:g} × In", f"{high:g} × In", BAND_USES[letter]]
            for letter, (low, high) in protection.MCB_INSTANTANEOUS_BANDS.items()]
    test = f"{protection.INSTANTANEOUS_TEST_TIME_S:g} s"
    return markdown_table(["Type", f"Does not trip within {test} at", f"Trips within {test} by",
                           "Usual for (common practice)"], rows, "lrrl")


def _mcb_zs_table():
    rows = []
    for rating in protection.MCB_PREFERRED_RATINGS_A:
        cells = [f"{rating} A"]
        for letter in protection.MCB_INSTANTANEOUS_BANDS:
            ia = protection.operating_current(protection.parse_breaker(f"{letter}{rating}"))
            cells += [f"{ia:g} A", f"{MCB_TABLE_VOLTAGE_V / ia:.3g} Ω"]
        rows.append(cells)
    header = ["In"] + [f"{label} {letter}" for letter in protection.MCB_INSTANTANEOUS_BANDS
                       for label in ("Ia", "Zs max")]
    return markdown_table(header, rows)


def _mccb_zs_table():
    rows = []
    for rating in MCCB_TABLE_RATINGS_A:
        ia = protection.operating_current(
            protection.parse_breaker(f"{rating} A {MCCB_TABLE_MULTIPLE}x"))
        limits = [f"{v / ia:.3g} Ω" for v in MCCB_TABLE_VOLTAGES_V]
        rows.append([f"{rating} A", f"{ia:g} A", *limits])
    return markdown_table(["Rating", f"Ia ({_MCCB_SETTING})",
                           *[f"Zs max at U0 = {v:g} V" for v in MCCB_TABLE_VOLTAGES_V]], rows)


def _disconnection_table():
    rows, low = [], protection.TABLE_41_1_LOWEST_U0_V
    for highest, tn, tt in protection.TABLE_41_1_S:
        band = f"{low:g} V < U0 ≤ {highest:g} V" if highest else f"U0 > {low:g} V"
        rows.append([band, f"{tn:g} s", f"{tt:g} s"])
        low = highest
    rows.append(["Distribution circuits (any U0)", f"{protection.DISTRIBUTION_TIME_S['tn']:g} s",
                 f"{protection.DISTRIBUTION_TIME_S['tt']:g} s"])
    return markdown_table(["U0 (AC)", "TN", "TT"], rows, "lrr")


def _egc_table():
    rows = [[f"{rating:g} A", copper, aluminium]
            for rating, copper, aluminium in protection.NEC_250_122]
    return markdown_table(["Device rating, not exceeding", "Copper", "Aluminium"], rows, "lrr")


def _nec_section():
    ratings = ", ".join(f"{r:g}" for r in protection.NEC_STANDARD_RATINGS_A)
    return ["## Effective ground-fault current path (NEC)",
            "NEC 250.4(A)(5) asks for a ground-fault path of impedance low enough to operate the "
            "overcurrent device; it sets no disconnection time. Fluxbook judges it as the fault "
            "current at the far end, U0 / Zs, reaching the current that surely operates the "
            "instantaneous trip: the magnetic pickup with its tolerance (± "
            f"{protection.MCCB_TOLERANCE_PCT:g} % unless the maker says), the setting of an "
            "instantaneous-trip breaker, or a fuse's quick-melting multiple "
            f"({protection.FUSE_CLEARING_MULTIPLE:g} × its rating, common practice). The EGC "
            "must also be no smaller than Table 250.122, and larger where needed for that path "
            "(the table's note).",
            "### Minimum EGC (NEC Table 250.122)", _egc_table(),
            "Source: NEC Table 250.122 (read, as reproduced by Bruns Engineering). 250.122(A): "
            "never required larger than the circuit conductors.",
            f"Standard ampere ratings (NEC 240.6(A), read, as reproduced in EC&M, 2019, and in "
            f"urdans/eecalcs OCPD.java): {ratings} A."]


def _ul943_table():
    rows = [[f"{ma:g} mA", f"{t:.3g} s"] for ma, t in zip(UL943_TABLE_MA, ul943_times())]
    return markdown_table(["Ground-fault current", "Greatest trip time"], rows)


def _rcd_table():
    rows = []
    for device, name in (("rcd", "General type"), ("rcd-s", "Type S (time-delayed)")):
        cells = [name]
        for multiple, (least, greatest) in protection.RCD_BREAK_TIMES_S[device].items():
            span = (f"{least * _MA:g}–{greatest * _MA:g} ms" if least
                    else f"≤ {greatest * _MA:g} ms")
            cells.append(span)
        rows.append(cells)
    return markdown_table(["RCD", "at IΔn", "at 2 IΔn", "at 5 IΔn"], rows, "lrrr")


def _interrupting_table():
    rows, low = [], 0.0
    for highest, power_factor in protection.UL489_TEST_POWER_FACTOR:
        band = f"{low / 1e3:g} to {highest / 1e3:g} kA" if highest else f"above {low / 1e3:g} kA"
        x_r = protection.rating_test_x_r(highest if highest else low * 2)
        rows.append([band, f"{power_factor:.2f}", f"{x_r:.3g}"])
        low = highest or low
    return markdown_table(["Interrupting rating", "Test power factor (highest)", "X/R up to"],
                          rows, "lrr")


def protection_page(team_config):
    region = team_config.region
    other = "iec" if region == "na" else "na"
    test = f"{protection.INSTANTANEOUS_TEST_TIME_S:g} s"
    table_time = f"{protection.disconnection_time(MCB_TABLE_VOLTAGE_V):g} s"
    tn, tt = (f"{protection.DISTRIBUTION_TIME_S[s]:g} s" for s in ("tn", "tt"))
    low_ma, high_ma = (f"{i * _MA:g}" for i in protection.GFCI_CURVE_RANGE_A)
    additional = f"{protection.ADDITIONAL_PROTECTION_A * _MA:g} mA"
    mcb = [f"## MCBs: Ia and the largest Zs at U0 = {MCB_TABLE_VOLTAGE_V:g} V",
           "Ia is the upper band limit × In; the TN condition Zs × Ia ≤ U0 (IEC 60364-4-41 "
           f"411.4.4) gives Zs max = U0 / Ia. The instantaneous trip opens within {test}, so "
           f"these values serve the {table_time} of Table 41.1 and the {tn} of distribution "
           f"circuits alike (a maker's curve may allow more at {tn}).", _mcb_zs_table()]
    mccb = ["## Moulded-case breakers: Ia and the largest Zs",
            f"Instantaneous setting {MCCB_TABLE_MULTIPLE} × In with the usual "
            f"± {protection.MCCB_TOLERANCE_PCT:g} % pickup tolerance (common practice, from "
            f"memory): Ia = {_MCCB_IA:g} × In. Use the maker's setting and tolerance where "
            "known; adjustable trips differ.", _mccb_zs_table()]
    parts = ["# Protection reference", GENERATED_NOTE,
             "Trip bands, disconnection times, the longest run a breaker still protects, GFCI "
             "and RCD trip times, and the test conditions behind interrupting ratings. A "
             "calculated trip is not a test: verify with a loop-impedance tester and an RCD / "
             "GFCI tester as your local rules require; breaker curves vary by maker.",
             "## MCB instantaneous trip bands (IEC 60898-1)", _band_table(),
             f"Source: IEC 60898-1 (bands read; the {test} test rule from memory). Preferred "
             f"ratings: {', '.join(str(r) for r in protection.MCB_PREFERRED_RATINGS_A)} A "
             "(read)."]
    parts += (mccb + mcb) if region == "na" else (mcb + mccb)
    nec = _nec_section()
    parts += nec if region == "na" else []
    parts += ["## Maximum disconnection times, IEC practice (IEC 60364-4-41 Table 41.1)",
              _disconnection_table(),
              f"Final circuits up to {protection.TABLE_41_1_MAX_RATING_A:g} A (411.3.2.2, 2005 "
              "edition; AMD1:2017 and BS 7671:2018 extend it to 63 A socket-outlet circuits). "
              f"Distribution circuits: {tn} in TN (411.3.2.3, read), {tt} in TT (411.3.2.4, from "
              "memory). TN condition Zs × Ia ≤ U0; TT condition R_A × IΔn ≤ 50 V (411.5.3). "
              "Source: IEC 60364-4-41 (read, as quoted at ericmark.talktalk.net/41-1.html).",
              *([] if region == "na" else nec),
              "## Longest run for the fault to operate the instantaneous trip",
              "Where Zs = Ze + (R1 + R2) × L reaches U0 / Ia (the NEC effective-path judgement "
              "and the IEC TN condition alike); R1 + R2 from IEC 60228 / NEC "
              "Chapter 9 Table 8 at the stated temperature, reactance included. \"none\" means "
              "Ze alone is too high for that breaker.",
              _longest_run_table(region), _longest_run_table(other).replace("### ", "### Also: "),
              "## GFCI trip time (UL 943, Class A)",
              f"Trips at {protection.GFCI_MUST_TRIP_A * _MA:g} mA and above, never below "
              f"{protection.GFCI_NO_TRIP_A * _MA:g} mA; greatest trip time T = "
              f"({protection.GFCI_CURVE_A * _MA:g} / I)^{protection.GFCI_CURVE_EXPONENT:g} s "
              f"with I in mA, for {low_ma} to {high_ma} mA. Source: UL 943 (read as quoted).",
              _ul943_table(),
              "## RCD break times (IEC 61008-1 / IEC 61009-1)", _rcd_table(),
              f"An RCD must not trip at {protection.RCD_NO_TRIP_FRACTION * 100:g} % of IΔn. "
              f"{additional} devices give additional protection (IEC 60364-4-41 415.1.1). Type S "
              f"are made for IΔn above {additional}. Source: IEC 61008-1 / 61009-1, the "
              "greatest times read, as reproduced in the BS EN 61008-1 / 61009-1 table quoted "
              "at html.pdfcookie.com/…/rvr7mmqer72o.html, with 415.1.1; type S least times, "
              "the 50 % no-trip and the type S ratings from memory.",
              "## Interrupting ratings: the X/R of the test",
              "A UL 489 interrupting rating holds up to the X/R of its test circuit (test power "
              "factors read, as reproduced in TSEWG TP-6 Table 1, studylib.net/doc/12093578). "
              "Where the available fault current has a higher X/R (close to large "
              "transformers), the effective rating is lower: apply the maker's multiplying "
              "factor. IEC 60947-2 uses similar test power factors.", _interrupting_table()]
    return "\n\n".join(parts) + "\n"


PAGES = {"reference/protection.md": protection_page}
