"""conductor: what resistance and reactance does one conductor have at its temperature and
frequency, and what effective impedance does that give for voltage drop?

DC resistance from resistivity and from the published table, AC resistance with the IEC 60287-1-1
skin and proximity effects, series reactance from the geometry (or NEC Chapter 9 Table 9), and
Z = R cos θ + X sin θ at the NEC's 0.85 power factor.
"""

import math

from calc import cautions, conductors, units
from calc.calculators import _inputs
from calc.calculators._conductors import (
    basis_text,
    conductor_data_check,
    conductor_fields,
    method_input,
)
from calc.calculators._plausibility import plausibility
from calc.conductors import (
    ALPHA_20C,
    GMR_FRACTION,
    LAY_FACTOR_STRANDED,
    MATERIAL_NAMES,
    POWER_FACTOR_NEC,
    RESISTIVITY_20C,
    SKIN_X_LIMIT,
    STEEL_CONDUIT_AC_FACTOR,
    STEEL_CONDUIT_X_FACTOR,
    TABLE9_BASIS,
    TABLE9_FREQUENCY_HZ,
    TABLE9_TEMPERATURE_C,
)
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

# Physics (ρ/A × lay factor) against IEC 60228: the table gives maxima, so a conforming conductor
# lies below them; ρ/A lands at 88 to 100 % of the maximum (computed over IEC 60228 Table 2).
IEC60228_AGREEMENT = (0.88, 1.0)
# Physics against NEC Chapter 9 Table 8: within 3 % (the lay-factor check reproduces the stranded
# columns within 1 %, computed; the rest allows for the NEC's rounded areas).
TABLE8_AGREEMENT = 0.03
# Z at 0.85 pf from the geometric X against Z from Table 9's XL: warn beyond 5 % (a margin chosen
# here, about the rounding of Table 9's two-figure Z column).
TABLE9_Z_AGREEMENT = 0.05
# Plausibility: the highest continuous rating of common building wire and 0.6/1 kV cable, 90 °C
# (NEC Table 310.4(A) types THHN, XHHW-2, RHH; IEC 60502-1 XLPE — from memory): above it only
# special insulations run (or a conductor carrying fault current). And the widest axial spacing
# of low-voltage conductors: 1 m (common practice: open LV lines about 0.2 to 0.6 m).
PLAUSIBLE_TEMPERATURE_C = 90.0
PLAUSIBLE_SPACING_M = 1.0
FORMATION_WORDS = {"trefoil": "trefoil", "cradled": "cradled in conduit", "flat": "flat"}
CHART_POINTS = 28  # temperature segments of the resistance chart
CHART_TEMPERATURES_C = (-20.0, 120.0)  # the chart's span, widened to include the input

SOURCES = (
    "Resistivity and α: IEC 60028 (copper, 1/58 Ω·mm²/m, 0.00393 /K; read, as reproduced in "
    "Agrawal, Industrial Power Engineering and Applications Handbook, Table 30.1); IEC 60889 "
    "(aluminium 1350, 0.028264 Ω·mm²/m, 0.00403 /K) — from memory.",
    "NEC Chapter 9 Table 8 (DC resistance at 75 °C; read, as reproduced) and Table 9 (AC "
    "resistance and reactance, three conductors in conduit, 60 Hz, 75 °C; every row read, as "
    "reproduced in a cable maker's engineering data sheet and checked against two other "
    "reproductions; its note 1 basis, RHH conductors cradled, from memory); IEC 60228 Tables 1 "
    "and 2 (read, as reproduced) and Annex B.",
    "Skin and proximity effect: IEC 60287-1-1 clauses 2.1.2 and 2.1.4 — from memory.",
    "GMR and X = 2πf 2×10⁻⁷ ln(GMD/GMR): Glover, Sarma & Overbye, Power System Analysis "
    "and Design, 5th ed., section 4.5, Table A.3 — from memory.",
    "Insulation thickness for touching conductors: UL 83 (THHN), UL 44 (RHH), IEC 60502-1 "
    "(PVC, XLPE) — from memory; XHHW-2: ICEA S-95-658 column B, read, as reproduced in a "
    "distributor's data sheet.",
)
CAUTION_AMPACITY = (
    "Ampacity, the insulation's temperature rating, termination ratings and derating for "
    "grouping or ambient temperature are not checked here; size conductors by your code.")


def _geometry_text(inputs, z):
    """The geometry of the reactance: insulation, formation and how the spacing was found."""
    insulation = dict(conductors.INSULATIONS)[z.insulation].split(" (")[0]
    formation = FORMATION_WORDS[z.formation]
    if inputs["spacing_m"] is not None:
        return f"{formation}, {z.spacing * 1e3:.4g} mm apart (given)"
    basis = (": NEC Chapter 9 Table 9's own basis" if (z.insulation, z.formation)
             == (TABLE9_BASIS["insulation"], TABLE9_BASIS["formation"]) else "")
    return f"{formation}, touching {insulation}, {z.spacing * 1e3:.4g} mm across{basis}"


def _steps(result, inputs, z, z_085, area_display, metric):
    size, material = inputs["size"], inputs["material"]
    temperature, frequency, raceway = (inputs["temperature_c"], inputs["frequency_hz"],
                                       inputs["raceway"])
    entry = conductors.table_resistance(size, material)
    rho20 = RESISTIVITY_20C[material] * 1e6
    result.step(f"Area of {size.label}" + (" (ASTM B258)" if size.system == "awg" else ""),
                "A", f"= {area_display}")
    result.step(f"DC resistance from resistivity ({MATERIAL_NAMES[material]}, lay factor "
                f"{LAY_FACTOR_STRANDED})", "R = ρ20 [1 + α20 (T − 20)] / A × k_lay",
                f"= {rho20:.6g} Ω·mm²/m × [1 + {ALPHA_20C[material]} × ({temperature:g} − 20)] / "
                f"{size.area_m2 * 1e6:.4g} mm² × {LAY_FACTOR_STRANDED} = "
                f"{fq(z.r_dc_physics, 'ohm/m')}")
    if entry is not None:
        r_ref, t_ref, alpha_ref, source = entry
        result.step(f"DC resistance from the table: {source}", "R = R_ref [1 + α (T − T_ref)]",
                    f"= {fq(r_ref, 'ohm/m')} × [1 + {alpha_ref} × ({temperature:g} − "
                    f"{t_ref:g})] = {fq(z.r_dc_table, 'ohm/m')}")
    if frequency > 0:
        result.step("Skin effect (IEC 60287-1-1 2.1.2)",
                    "x_s² = 8πf / R' × 10⁻⁷; y_s = x_s⁴ / (192 + 0.8 x_s⁴)",
                    f"x_s = {z.x_s:.3g}; y_s = {z.y_s:.3g}")
        result.step(f"Proximity effect (IEC 60287-1-1 2.1.4), d_c = {fq(z.diameter, 'm')}, "
                    f"s = {fq(z.spacing, 'm')}",
                    "y_p = F (d_c/s)² [0.312 (d_c/s)² + 1.18 / (F + 0.27)]", f"y_p = {z.y_p:.3g}")
        ac_factor = STEEL_CONDUIT_AC_FACTOR if raceway == "steel" else 1.0
        model = z.r_dc * (1 + ac_factor * (z.y_s + z.y_p))
        steel = f" × {STEEL_CONDUIT_AC_FACTOR} (steel conduit)" if raceway == "steel" else ""
        result.step("AC resistance with the skin and proximity effect",
                    "R_ac = R_dc [1 + k (y_s + y_p)]",
                    f"= {fq(z.r_dc, 'ohm/m')} × [1 + ({z.y_s:.3g} + {z.y_p:.3g}){steel}] "
                    f"= {fq(model, 'ohm/m')}")
        if z.r_ac_basis == "table9":
            where = f", {z.table_note}" if z.table_note else ""
            result.step(f"AC resistance from NEC Chapter 9 Table 9 ({raceway} conduit{where}): "
                        "its two-figure value differs from the line above by more than its "
                        "rounding, so the table's stands, moved to this temperature and frequency",
                        f"R_ac = R_ac,9 × R_ac(T, f) / R_ac({TABLE9_TEMPERATURE_C:g} °C, "
                        f"{TABLE9_FREQUENCY_HZ:g} Hz)",
                        f"= {fq(z.r_ac_table9, 'ohm/m')} × "
                        f"{z.r_ac / z.r_ac_table9:.4g} = {fq(z.r_ac, 'ohm/m')}")
        if z.x_basis == "table9":
            where = f" ({z.table_note})" if z.table_note else ""
            result.step(f"Series reactance from NEC Chapter 9 Table 9{where} (method table)",
                        f"X = XL_9 × f / {TABLE9_FREQUENCY_HZ:g} Hz",
                        f"= {fq(z.x, 'ohm/m')}")
        steel_x = f" × {STEEL_CONDUIT_X_FACTOR}" if raceway == "steel" else ""
        strands = conductors.strand_count(size)
        result.step(f"Series reactance from the geometry ({_geometry_text(inputs, z)}): GMR = "
                    f"{GMR_FRACTION[strands]:.4g} r ({strands} strands) = {z.gmr * 1e3:.4g} mm; "
                    f"GMD = {z.gmd * 1e3:.4g} mm",
                    "X = 2πf × 2×10⁻⁷ × ln(GMD / GMR)" + steel_x,
                    f"= 2π × {frequency:g} Hz × 2×10⁻⁷ × ln({z.gmd * 1e3:.4g} / "
                    f"{z.gmr * 1e3:.4g}){steel_x} = {fq(z.x_geometry, 'ohm/m')}")
    else:
        result.step("DC (0 Hz): no skin or proximity effect and no reactance", "R_ac = R_dc; X = 0",
                    f"= {fq(z.r_ac, 'ohm/m')}")
    sin_nec = math.sin(math.acos(POWER_FACTOR_NEC))
    result.step(f"Effective impedance at {POWER_FACTOR_NEC:g} power factor (NEC Chapter 9 "
                "Table 9 note 2)", f"Z = R_ac cos θ + X sin θ, cos θ = {POWER_FACTOR_NEC:g}",
                f"= {fq(z.r_ac, 'ohm/m')} × {POWER_FACTOR_NEC:g} + "
                f"{fq(z.x, 'ohm/m')} × {sin_nec:.3g} = "
                f"{fq(z_085, 'ohm/m')}")


def _checks(result, inputs, z, metric):
    frequency, method = inputs["frequency_hz"], inputs["method"]
    if z.r_dc_table is not None:
        ratio = z.r_dc_physics / z.r_dc_table
        if metric:
            low, high = IEC60228_AGREEMENT
            ok = low <= ratio <= high
            result.check("table_agreement", "pass" if ok else "warn",
                         f"Physics gives {ratio:.1%} of the IEC 60228 maximum; a conforming "
                         "conductor lies below that maximum (expected "
                         f"{low * 100:g}–{high * 100:g} %). "
                         "IEC 60228 (the maximum) and the maker's data are the basis for "
                         "compliance.")
        else:
            ok = abs(ratio - 1) <= TABLE8_AGREEMENT
            result.check("table_agreement", "pass" if ok else "warn",
                         f"Physics and NEC Chapter 9 Table 8 differ by {ratio - 1:+.1%} (pass "
                         f"within {TABLE8_AGREEMENT * 100:g} %). NEC Table 8 is the basis the code "
                         "uses for NEC calculations.")
    if frequency > 0:
        valid = z.x_s <= SKIN_X_LIMIT
        result.check("skin_effect_validity", "pass" if valid else "warn",
                     f"x_s = {z.x_s:.3g}; the IEC 60287-1-1 skin formula holds for x_s ≤ "
                     f"{SKIN_X_LIMIT}" + ("." if valid else "; beyond it use an exact (Bessel) "
                                          "solution or the maker's AC resistance."))
    if z.x_table9:  # None off the table; 0 at a frequency that rounds to DC
        effect = (conductors.effective_impedance(z.r_ac, z.x_geometry)
                  / conductors.effective_impedance(z.r_ac, z.x_table9) - 1)
        used = "Table 9's XL is used (method table)" if method == "table" else (
            "the geometric X is used; choose method table to use Table 9's")
        status = "pass" if method == "table" or abs(effect) <= TABLE9_Z_AGREEMENT else "warn"
        where = f", {z.table_note}" if z.table_note else ""
        result.check("table9_reactance", status,
                     f"NEC Chapter 9 Table 9 lists XL = {fq(z.x_table9, 'ohm/m')} "
                     f"(scaled to {frequency:g} Hz{where}); the geometry "
                     f"({_geometry_text(inputs, z)}) gives {fq(z.x_geometry, 'ohm/m')} "
                     f"({z.x_geometry / z.x_table9 - 1:+.0%}). Table 9's basis is RHH conductors "
                     "in cradled configuration (its note 1); on that basis the geometry is about "
                     "20 % below every row. Effect on Z at "
                     f"{POWER_FACTOR_NEC:g} pf: {effect:+.1%} (warn beyond "
                     f"{TABLE9_Z_AGREEMENT * 100:g} % if the geometry is used); {used}. For NEC "
                     "voltage drop Table 9 is the usual basis.")
    conductor_data_check(result, method, z)
    reasons = []
    if inputs["temperature_c"] > PLAUSIBLE_TEMPERATURE_C:
        reasons.append(f"{fq(inputs['temperature_c'], 'degC')} is above the "
                       f"{PLAUSIBLE_TEMPERATURE_C:g} °C that building wire and 0.6/1 kV cable "
                       "run at continuously (only special insulations, or fault current)")
    if inputs["spacing_m"] is not None and inputs["spacing_m"] > PLAUSIBLE_SPACING_M:
        reasons.append(f"an axial spacing of {fq(inputs['spacing_m'], 'm')} is wider than "
                       f"low-voltage conductors are run (up to about {PLAUSIBLE_SPACING_M:g} m)")
    plausibility(result, reasons)


def _describe(result, inputs, z, metric):
    size, raceway = inputs["size"], inputs["raceway"]
    result.assumptions += [
        f"Concentric stranded {MATERIAL_NAMES[inputs['material']]} conductor, "
        f"{conductors.strand_count(size)} strands "
        + ("(IEC 60228 Class 2)." if metric else "(ASTM B8 Class B)."),
        f"Lay (stranding) factor {LAY_FACTOR_STRANDED} on ρ/A (common practice).",
        f"Three phase conductors, {_geometry_text(inputs, z)}; insulation thickness nominal "
        "for the type. Cradled: in a row along the bottom of a conduit "
        f"{conductors.CRADLE_CONDUIT_RATIO:g} × their diameter wide.",
        f"Method {inputs['method']}: {basis_text(z)}.",
        "Temperature is the conductor temperature; resistance is linear in temperature with "
        "the stated α.",
    ]
    if raceway == "steel":
        result.assumptions.append(
            f"Steel conduit, for the geometry: X × {STEEL_CONDUIT_X_FACTOR} (NEC Chapter 9 "
            "Table 9's steel over PVC columns, 1.22 to 1.27 in every row, read) and (y_s + y_p) "
            f"× {STEEL_CONDUIT_AC_FACTOR} (IEC 60287-1-1 pipe-type cables, from memory).")
    if raceway == "aluminum":
        result.assumptions.append(
            "Aluminium conduit is non-magnetic: the physics treats it as PVC. NEC Table 9 lists "
            "up to 25 % higher AC resistance in aluminium conduit for large sizes (induced "
            "conduit currents); the table method takes its figures.")
    result.sources += list(SOURCES)
    result.cautions += [CAUTION_AMPACITY, *cautions.COMMON]


def _series(inputs):
    """Chart: DC resistance against temperature, by the method chosen, marked at the input."""
    size, material, temperature = inputs["size"], inputs["material"], inputs["temperature_c"]
    low, high = min(CHART_TEMPERATURES_C[0], temperature), max(CHART_TEMPERATURES_C[1], temperature)
    temperatures = [low + (high - low) * k / CHART_POINTS for k in range(CHART_POINTS + 1)]
    curve = "table" if inputs["method"] == "table" else "physics"
    return {
        "title": f"Resistance of {size.label} {MATERIAL_NAMES[material]} against temperature",
        "x": {"label": "Conductor temperature", "unit": "°C", "values": temperatures},
        "y_axis": {"label": "DC resistance", "unit": "Ω/km"},
        "y": [{"label": f"DC resistance ({curve})", "unit": "Ω/km",
               "values": [conductors.dc_resistance(size, material, t_c, curve) * 1e3
                          for t_c in temperatures]}],
        "marks": [{"axis": "x", "value": temperature, "label": fq(temperature, "degC")}],
    }


def _view(inputs):
    size, material = inputs["size"], inputs["material"]
    metric = size.system == "mm2"
    with conductor_fields(spacing="spacing_m"):
        z = conductors.impedance(size, material, inputs["temperature_c"], inputs["frequency_hz"],
                                 inputs["raceway"], inputs["spacing_m"], inputs["method"],
                                 insulation=inputs["insulation"], formation=inputs["formation"])
    z_085 = conductors.effective_impedance(z.r_ac, z.x)

    result = Result()
    area_display = fq(size.area_m2, "m2")
    if not metric:
        area_display += f" ({size.area_m2 / units.CIRCULAR_MIL_M2:.0f} cmil)"
    result.output("area", size.area_m2, area_display)
    result.output("r_dc", z.r_dc, fq(z.r_dc, "ohm/m"))
    result.output("r_ac", z.r_ac, fq(z.r_ac, "ohm/m"))
    result.output("x", z.x, fq(z.x, "ohm/m"))
    if z.r_dc_table is not None:
        result.output("r_dc_table", z.r_dc_table, fq(z.r_dc_table, "ohm/m"))
    if z.r_ac_table9 is not None:
        result.output("r_ac_table9", z.r_ac_table9, fq(z.r_ac_table9, "ohm/m"))
    result.output("z_085", z_085, fq(z_085, "ohm/m"))
    _steps(result, inputs, z, z_085, area_display, metric)
    _checks(result, inputs, z, metric)
    _describe(result, inputs, z, metric)
    result.series = _series(inputs)
    return result


CALCULATOR = Calculator(
    id="conductor",
    title="Conductor resistance and reactance",
    summary="DC and AC resistance, series reactance and effective impedance of one conductor "
            "by size, material, temperature, frequency and raceway.",
    group="Conductors",
    inputs=(
        Input("size", "Conductor size", "size", default="12 AWG",
              region_defaults={"iec": "2.5 mm²"},
              help="AWG, kcmil or mm², e.g. 12 AWG, 4/0, 250 kcmil, 2.5 mm²."),
        _inputs.material(),
        Input("temperature_c", "Conductor temperature", "quantity", unit="degC", default=75,
              minimum=-40, maximum=250, region_defaults={"iec": 70},
              help="Operating temperature of the conductor (75 °C NEC tables, 70 °C PVC)."),
        _inputs.frequency(minimum=0, help="0 Hz means DC."),
        Input("raceway", "Raceway", "choice", default="pvc", choices=conductors.RACEWAYS,
              help="Steel conduit raises reactance and AC resistance."),
        Input("spacing_m", "Conductor spacing", "quantity", unit="m", optional=True, minimum=0,
              min_exclusive=True, maximum=10,
              help="Centre-to-centre spacing of adjacent conductors; blank means touching."),
        Input("insulation", "Insulation (for the reactance)", "choice", default="typical",
              choices=conductors.INSULATIONS, advanced=True,
              help="Sets how far apart touching conductors lie. NEC Table 9 assumes RHH."),
        Input("formation", "Formation", "choice", default="trefoil",
              choices=conductors.FORMATIONS, advanced=True,
              help="How the three conductors lie. NEC Table 9 assumes cradled in conduit."),
        method_input(),
    ),
    outputs=(
        Output("area", "Cross-section", "m²"),
        Output("r_dc", "DC resistance", "Ω/m"),
        Output("r_ac", "AC resistance", "Ω/m"),
        Output("x", "Series reactance", "Ω/m"),
        Output("r_dc_table", "DC resistance, published table", "Ω/m"),
        Output("r_ac_table9", "AC resistance, NEC Chapter 9 Table 9 (75 °C, 60 Hz)", "Ω/m"),
        Output("z_085", f"Effective impedance at {POWER_FACTOR_NEC:g} pf", "Ω/m"),
    ),
    compute=_view,
)
