"""Conductors: DC and AC resistance, series reactance and effective impedance of one conductor,
with the published resistance tables (NEC Chapter 9 Tables 8 and 9, IEC 60228).

Quantities follow the nomenclature page: area [m²], resistance per length [Ω/m], temperature
[°C], frequency [Hz], spacing [m] (axial, centre to centre).
"""

import math
from typing import NamedTuple

from calc import units
from calc.errors import ParameterError

METRES_PER_KFT = 304.8  # 1000 ft, exact
MU0_OVER_2PI = 2e-7  # μ0 / 2π [H/m], the constant of the line-inductance formula

# Resistivity at 20 °C [Ω·m] and temperature coefficient referred to 20 °C [1/K].
# Copper: annealed, 100 % IACS, 1/58 Ω·mm²/m, α20 = 0.00393: IEC 60028 (read, as reproduced in
# K. C. Agrawal, Industrial Power Engineering and Applications Handbook, Table 30.1).
# Aluminium: EC grade 1350, 61 % IACS, 0.028264 Ω·mm²/m = 1/(58 × 0.61): IEC 60889 / IEC 60111
# (from memory); 61 % IACS and α20 = 0.00403 read in Agrawal, Table 30.1.
RESISTIVITY_20C = {"cu": 1e-6 / 58.0, "al": 0.028264e-6}
ALPHA_20C = {"cu": 0.00393, "al": 0.00403}
MATERIAL_NAMES = {"cu": "copper", "al": "aluminium"}

# Coefficients referred to 75 °C that NEC Chapter 9 Table 8 note 2 gives for its correction
# R2 = R1 [1 + α (T2 − 75)] (read, as reproduced in NEC 2017 Table 8, repository mjk83093/sil
# NEC2017_Chapter_9.md; 0.00393 / (1 + 0.00393 × 55) = 0.003231 agrees).
ALPHA_75C_NEC = {"cu": 0.00323, "al": 0.00330}

# Concentric-stranding (lay) factor: each strand is longer than the conductor because it is laid
# helically, so R is about 2 % above ρ/A (common practice). With it, ρ/A reproduces the stranded
# columns of NEC Chapter 9 Table 8 within 1 % (computed check).
LAY_FACTOR_STRANDED = 1.02

# NEC Chapter 9 Table 8: DC resistance at 75 °C [Ω per 1000 ft], uncoated copper stranded, and
# aluminium stranded. 14 AWG to 500 kcmil read, as reproduced from the 2011 edition; 18, 16 AWG
# and 600 to 1000 kcmil read, as reproduced (NEC 2017 Table 8, repository mjk83093/sil
# NEC2017_Chapter_9.md; 600 to 1000 kcmil also urdans/eecalcs ConductorProperties.java, NEC 2014).
# The same in the 2008 to 2023 editions (from memory).
NEC_TABLE8_CU_STRANDED_75C = {
    "18 AWG": 7.95, "16 AWG": 4.99, "14 AWG": 3.14, "12 AWG": 1.98, "10 AWG": 1.24, "8 AWG": 0.778,
    "6 AWG": 0.491, "4 AWG": 0.308, "3 AWG": 0.245, "2 AWG": 0.194, "1 AWG": 0.154,
    "1/0 AWG": 0.122, "2/0 AWG": 0.0967, "3/0 AWG": 0.0766, "4/0 AWG": 0.0608, "250 kcmil": 0.0515,
    "300 kcmil": 0.0429, "350 kcmil": 0.0367, "400 kcmil": 0.0321, "500 kcmil": 0.0258,
    "600 kcmil": 0.0214, "700 kcmil": 0.0184, "750 kcmil": 0.0171, "800 kcmil": 0.0161,
    "900 kcmil": 0.0143, "1000 kcmil": 0.0129,
}
NEC_TABLE8_AL_STRANDED_75C = {
    "18 AWG": 13.1, "16 AWG": 8.21, "14 AWG": 5.17, "12 AWG": 3.25, "10 AWG": 2.04, "8 AWG": 1.28,
    "6 AWG": 0.808, "4 AWG": 0.508, "3 AWG": 0.403, "2 AWG": 0.319, "1 AWG": 0.253,
    "1/0 AWG": 0.201, "2/0 AWG": 0.159, "3/0 AWG": 0.126, "4/0 AWG": 0.100, "250 kcmil": 0.0847,
    "300 kcmil": 0.0707, "350 kcmil": 0.0605, "400 kcmil": 0.0529, "500 kcmil": 0.0424,
    "600 kcmil": 0.0353, "700 kcmil": 0.0303, "750 kcmil": 0.0282, "800 kcmil": 0.0265,
    "900 kcmil": 0.0235, "1000 kcmil": 0.0212,
}
# IEC 60228 Table 2 (Class 2, stranded): maximum DC resistance at 20 °C [Ω/km]. 1.5 to 300 mm²
# read, as reproduced; 0.75, 1 and 400 mm² from memory. IEC 60228 has no Class 2 aluminium
# conductor below 10 mm².
IEC60228_CLASS2_CU_20C = {
    "0.75 mm²": 24.5, "1 mm²": 18.1,  # from memory
    "1.5 mm²": 12.1, "2.5 mm²": 7.41, "4 mm²": 4.61, "6 mm²": 3.08, "10 mm²": 1.83,
    "16 mm²": 1.15, "25 mm²": 0.727, "35 mm²": 0.524, "50 mm²": 0.387, "70 mm²": 0.268,
    "95 mm²": 0.193, "120 mm²": 0.153, "150 mm²": 0.124, "185 mm²": 0.0991,
    "240 mm²": 0.0754, "300 mm²": 0.0601,
    "400 mm²": 0.0470,  # from memory
}
IEC60228_CLASS2_AL_20C = {
    "10 mm²": 3.08, "16 mm²": 1.91, "25 mm²": 1.20, "35 mm²": 0.868, "50 mm²": 0.641,
    "70 mm²": 0.443, "95 mm²": 0.320, "120 mm²": 0.253, "150 mm²": 0.206, "185 mm²": 0.164,
    "240 mm²": 0.125, "300 mm²": 0.100,
    "400 mm²": 0.0778,  # from memory
}
# IEC 60228 Table 1 (Class 1, solid) copper where it differs from Class 2 (read, as reproduced).
IEC60228_CLASS1_CU_20C = {"185 mm²": 0.101, "240 mm²": 0.0775, "300 mm²": 0.0620}

# Number of strands. ASTM B8 Class B concentric stranding, as NEC Chapter 9 Table 8 lists it
# (read, as reproduced in NEC 2017 Table 8, mjk83093/sil): 7 strands for 18 to 2 AWG, 19 for 1 to
# 4/0 AWG, 37 for 250 to 500 kcmil, 61 for 600 to 1000 kcmil. IEC 60228 Class 2 circular
# non-compacted minimum strand counts (from memory): 7 up to 35 mm², 19 for 50 to 95 mm², 37 for
# 120 to 240 mm², 61 for 300 and 400 mm². Keyed by the largest area [mm²] of each band.
STRANDS_CLASS_B = ((34.0, 7), (108.0, 19), (254.0, 37), (507.0, 61))
STRANDS_CLASS_2 = ((35.0, 7), (95.0, 19), (240.0, 37), (400.0, 61))

# Geometric mean radius of concentric-lay stranding as a fraction of the outer radius, by strand
# count; 1 is a solid round wire, e^(−1/4). Glover, Sarma & Overbye, Power System Analysis and
# Design, 5th ed., section 4.5 and Table A.3 — from memory.
GMR_FRACTION = {1: math.exp(-0.25), 7: 0.726, 19: 0.758, 37: 0.768, 61: 0.772}

# Insulation thickness [mm] by the largest conductor area [mm²] of each band, for the geometry of
# touching conductors. THHN/THWN-2 (UL 83; from memory): 14-12 AWG 19 mil, 10 AWG 24, 8-6 AWG 35,
# 4-2 AWG 46, 1-4/0 AWG 57, 250-500 kcmil 68, 600-1000 kcmil 79 mil. XHHW-2 (ICEA S-95-658 /
# NEMA WC 70 column B; read, as reproduced in a distributor's XHHW-2 data sheet, scribd document
# 460047549): 14-10 AWG 30 mil, 8-2 AWG 45, 1-4/0 AWG 55, 250-500 kcmil 65, 600-1000 kcmil 80
# mil. RHH/RHW-2 (UL 44; from memory): 14-10 AWG 45 mil, 8-2 AWG 60, 1-4/0 AWG 80, 250-500 kcmil
# 95, 600-1000 kcmil 110 mil. PVC and XLPE, 0.6/1 kV: IEC 60502-1 nominal thickness (from memory).
INSULATION_MM = {
    "thhn": ((3.4, 0.483), (5.3, 0.610), (13.4, 0.889), (33.7, 1.168), (108.0, 1.448),
             (254.0, 1.727), (507.0, 2.007)),
    "xhhw": ((5.3, 0.762), (33.7, 1.143), (108.0, 1.397), (254.0, 1.651), (507.0, 2.032)),
    "rhh": ((5.3, 1.143), (33.7, 1.524), (108.0, 2.032), (254.0, 2.413), (507.0, 2.794)),
    "iec_pvc": ((2.5, 0.8), (16.0, 1.0), (35.0, 1.2), (70.0, 1.4), (120.0, 1.6), (150.0, 1.8),
                (185.0, 2.0), (240.0, 2.2), (300.0, 2.4), (400.0, 2.6)),
    "iec_xlpe": ((16.0, 0.7), (35.0, 0.9), (50.0, 1.0), (95.0, 1.1), (120.0, 1.2), (150.0, 1.4),
                 (185.0, 1.6), (240.0, 1.7), (300.0, 1.8), (400.0, 2.0)),
}
INSULATIONS = (
    ("typical", "Typical for the size: THHN (AWG, kcmil), PVC (mm²)"),
    ("thhn", "THHN/THWN-2 (UL 83)"),
    ("xhhw", "XHHW-2 (UL 44)"),
    ("rhh", "RHH/RHW-2 (UL 44)"),
    ("iec_pvc", "PVC, 0.6/1 kV (IEC 60502-1)"),
    ("iec_xlpe", "XLPE, 0.6/1 kV (IEC 60502-1)"),
)
# Three phase conductors, adjacent ones touching unless a spacing is given. Cradled: in a row
# along the bottom of a conduit of inner diameter CRADLE_CONDUIT_RATIO × the insulated diameter,
# centres on an arc; 3 is mid-way in the 2.8-3.2 range of conduit to conductor diameter in which
# three conductors can jam (NEC Chapter 9 Table 1 Informational Note No. 2; read, as reproduced).
FORMATIONS = (
    ("trefoil", "Trefoil (triangle)"),
    ("cradled", "Cradled in conduit"),
    ("flat", "Flat (in a row)"),
)
CRADLE_CONDUIT_RATIO = 3.0

# IEC 60287-1-1 clause 2.1.2 / 2.1.4 (Table 2): k_s and k_p for round stranded conductors with
# extruded insulation, both 1 (from memory). For cables in steel pipe (pipe-type) the standard
# multiplies y_s and y_p by 1.5 (clause 2.1, from memory); used here for steel conduit.
K_SKIN = 1.0
K_PROXIMITY = 1.0
STEEL_CONDUIT_AC_FACTOR = 1.5
# The skin-effect formula is accurate up to x_s = 2.8 (IEC 60287-1-1 clause 2.1.2, from memory).
SKIN_X_LIMIT = 2.8

# Steel conduit against PVC in NEC Chapter 9 Table 9's XL columns: 1.22 to 1.27 for every size
# (computed from the rows below). The geometric model uses X_steel = 1.25 X_nonmagnetic.
STEEL_CONDUIT_X_FACTOR = 1.25

# NEC Chapter 9 Table 9: AC resistance and reactance of 600 V cables, three single conductors in
# conduit, 60 Hz, 75 °C [Ω to neutral per 1000 ft]: XL (PVC or aluminium conduit, steel conduit),
# R uncoated copper (PVC, aluminium, steel conduit), R aluminium (PVC, aluminium, steel conduit).
# Read, row by row, as reproduced in (a) a cable maker's "Engineering Data: AC Resistance and
# Reactance" sheet (studylib.net document 18564968), all rows; (b) brunsengineering.com/nec-
# table-9/, 14 AWG to 300 kcmil (350 kcmil in part); (c) a scan of the table (scribd document
# 481338126), 14 to 1 AWG (1/0 AWG per km). They agree but for 1/0 AWG copper in Al conduit:
# (b) 0.12, (a) 0.13, (c) 0.43 Ω/km = 0.131 Ω/kft; 0.13 is kept. 400 kcmil up rest on (a) alone.
# The table's note 1 (from memory): RHH conductors, Class B stranding, cradled configuration.
# Entries have two significant figures; 18, 16 AWG and 700, 800, 900 kcmil have no row.
_TABLE9_ROWS = (
    ("14 AWG", 0.058, 0.073, 3.1, 3.1, 3.1, None, None, None),
    ("12 AWG", 0.054, 0.068, 2.0, 2.0, 2.0, 3.2, 3.2, 3.2),
    ("10 AWG", 0.050, 0.063, 1.2, 1.2, 1.2, 2.0, 2.0, 2.0),
    ("8 AWG", 0.052, 0.065, 0.78, 0.78, 0.78, 1.3, 1.3, 1.3),
    ("6 AWG", 0.051, 0.064, 0.49, 0.49, 0.49, 0.81, 0.81, 0.81),
    ("4 AWG", 0.048, 0.060, 0.31, 0.31, 0.31, 0.51, 0.51, 0.51),
    ("3 AWG", 0.047, 0.059, 0.25, 0.25, 0.25, 0.40, 0.41, 0.40),
    ("2 AWG", 0.045, 0.057, 0.19, 0.20, 0.20, 0.32, 0.32, 0.32),
    ("1 AWG", 0.046, 0.057, 0.15, 0.16, 0.16, 0.25, 0.26, 0.25),
    ("1/0 AWG", 0.044, 0.055, 0.12, 0.13, 0.12, 0.20, 0.21, 0.20),
    ("2/0 AWG", 0.043, 0.054, 0.10, 0.10, 0.10, 0.16, 0.16, 0.16),
    ("3/0 AWG", 0.042, 0.052, 0.077, 0.082, 0.079, 0.13, 0.13, 0.13),
    ("4/0 AWG", 0.041, 0.051, 0.062, 0.067, 0.063, 0.10, 0.11, 0.10),
    ("250 kcmil", 0.041, 0.052, 0.052, 0.057, 0.054, 0.085, 0.090, 0.086),
    ("300 kcmil", 0.041, 0.051, 0.044, 0.049, 0.045, 0.071, 0.076, 0.072),
    ("350 kcmil", 0.040, 0.050, 0.038, 0.043, 0.039, 0.061, 0.066, 0.063),
    ("400 kcmil", 0.040, 0.049, 0.033, 0.038, 0.035, 0.054, 0.059, 0.055),
    ("500 kcmil", 0.039, 0.048, 0.027, 0.032, 0.029, 0.043, 0.048, 0.045),
    ("600 kcmil", 0.039, 0.048, 0.023, 0.028, 0.025, 0.036, 0.041, 0.038),
    ("750 kcmil", 0.038, 0.048, 0.019, 0.024, 0.021, 0.029, 0.034, 0.031),
    ("1000 kcmil", 0.037, 0.046, 0.015, 0.019, 0.018, 0.023, 0.027, 0.025),
)
TABLE9_RACEWAYS = ("pvc", "aluminum", "steel")
NEC_TABLE9_XL = {row[0]: row[1:3] for row in _TABLE9_ROWS}
NEC_TABLE9_R = {(material, raceway): {row[0]: row[column] for row in _TABLE9_ROWS
                                      if row[column] is not None}
                for first, material in ((3, "cu"), (6, "al"))
                for column, raceway in enumerate(TABLE9_RACEWAYS, first)}
TABLE9_FREQUENCY_HZ = 60.0  # the frequency NEC Chapter 9 Table 9 is given for
TABLE9_TEMPERATURE_C = 75.0  # and its temperature
TABLE9_BASIS = {"insulation": "rhh", "formation": "cradled"}  # its note 1, for the geometry

RACEWAYS = (
    ("none", "None (free air, cable tray)"),
    ("pvc", "PVC conduit"),
    ("aluminum", "Aluminium conduit"),
    ("steel", "Steel conduit"),
)
METHODS = (("physics", "Physics (resistivity, area)"), ("table", "Published table"))

POWER_FACTOR_NEC = 0.85  # NEC Chapter 9 Table 9 note 2: effective Z at 0.85 lagging


def _band(table, area_mm2):
    """The value of the first band of ((largest area, value), ...) that holds `area_mm2`."""
    for largest, value in table:
        if area_mm2 <= largest * 1.0001:
            return value
    return table[-1][1]


def _material(material):
    if material not in RESISTIVITY_20C:
        raise ParameterError("material", material, "choose one of: cu (copper), al (aluminium)")
    return material


def check_made(size, material):
    """Refuse a size that is not made in the material.

    Parameters
    ----------
    size : calc.units.ConductorSize or str
        Conductor size ("12 AWG", "250 kcmil", "2.5 mm2").
    material : str
        "cu" or "al".

    Returns
    -------
    None
        When the size is made in the material.

    Raises
    ------
    calc.errors.ParameterError
        On `size` for a metric size below 10 mm² in aluminium (IEC 60228 has no Class 2
        aluminium conductor there), listing the aluminium sizes; on `material` for a material
        other than cu or al.

    Notes
    -----
    AWG and kcmil sizes are made in both materials; metric aluminium sizes are those of
    IEC 60228 Class 2.

    References
    ----------
    IEC 60228, Table 2 (Class 2 conductors) — read, as reproduced.

    Examples
    --------
    >>> check_made("16 mm2", "al")
    >>> try:
    ...     check_made("2.5 mm2", "al")
    ... except ParameterError as error:
    ...     print(error.parameter, error.value)
    size 2.5 mm²
    """
    size = units.parse_conductor_size(size)
    if _material(material) == "al" and size.system == "mm2" and (
        size.label not in IEC60228_CLASS2_AL_20C
    ):
        allowed = ", ".join(IEC60228_CLASS2_AL_20C)
        raise ParameterError("size", size.label, f"{size.label} is not made in aluminium "
                             f"(IEC 60228 Class 2); aluminium sizes: {allowed}")


def strand_count(size):
    """Number of strands of standard concentric stranding.

    Parameters
    ----------
    size : calc.units.ConductorSize or str
        Conductor size.

    Returns
    -------
    int
        7, 19, 37 or 61: ASTM B8 Class B for AWG and kcmil, IEC 60228 Class 2 for mm².

    Notes
    -----
    Looked up by the size's area in the bands of STRANDS_CLASS_B or STRANDS_CLASS_2.

    References
    ----------
    ASTM B8 Class B, as NEC Chapter 9 Table 8 lists it (read, as reproduced in NEC 2017 Table 8,
    repository mjk83093/sil); IEC 60228 Class 2 minimum strand counts — from memory.

    Examples
    --------
    >>> strand_count("12 AWG"), strand_count("4/0"), strand_count("240 mm2")
    (7, 19, 37)
    """
    size = units.parse_conductor_size(size)
    table = STRANDS_CLASS_2 if size.system == "mm2" else STRANDS_CLASS_B
    return _band(table, size.area_m2 * 1e6)


def conductor_diameter(size, strands=None):
    """Outer diameter of a concentric-lay stranded (or solid) round conductor.

    Parameters
    ----------
    size : calc.units.ConductorSize or str
        Conductor size; its nominal area A [m²].
    strands : int, optional
        1, 7, 19, 37 or 61; default the size's standard stranding.

    Returns
    -------
    float
        Diameter [m].

    Notes
    -----
    n = 1 + 3k(k + 1) equal strands of diameter d_s = √(4A / (π n)) in k layers round a centre
    strand; the outer diameter is (2k + 1) d_s. For 7 strands that is 3 d_s.

    References
    ----------
    Concentric-lay geometry as in ASTM B8 (from memory); computed, not a published figure.

    Examples
    --------
    >>> round(conductor_diameter("12 AWG") * 1e3, 3)
    2.327
    """
    size = units.parse_conductor_size(size)
    strands = strand_count(size) if strands is None else strands
    layers = round((math.sqrt(12 * strands - 3) - 3) / 6)  # inverse of n = 1 + 3k(k+1)
    strand_d = math.sqrt(4 * size.area_m2 / (math.pi * strands))
    return (2 * layers + 1) * strand_d


def geometric_mean_radius(size, strands=None):
    """Geometric mean radius (GMR) of a round conductor.

    Parameters
    ----------
    size : calc.units.ConductorSize or str
        Conductor size.
    strands : int, optional
        1 (solid), 7, 19, 37 or 61; default the size's standard stranding.

    Returns
    -------
    float
        GMR [m].

    Notes
    -----
    GMR = k r with r the outer radius and k = e^(−1/4) = 0.7788 (solid), 0.726 (7 strands),
    0.758 (19), 0.768 (37), 0.772 (61).

    References
    ----------
    J. D. Glover, M. S. Sarma, T. J. Overbye, Power System Analysis and Design, 5th ed.,
    section 4.5 and Table A.3 — from memory.

    Examples
    --------
    >>> round(geometric_mean_radius("12 AWG") * 1e3, 4)
    0.8448
    """
    size = units.parse_conductor_size(size)
    strands = strand_count(size) if strands is None else strands
    return GMR_FRACTION[strands] * conductor_diameter(size, strands) / 2


def _insulation(size, insulation):
    """The insulation token: "typical" (or None) is THHN for AWG and kcmil, PVC for mm²."""
    if insulation in (None, "typical"):
        return "iec_pvc" if size.system == "mm2" else "thhn"
    if insulation not in INSULATION_MM:
        raise ParameterError("insulation", insulation, "choose one of: "
                             + ", ".join(token for token, _ in INSULATIONS))
    return insulation


def insulated_diameter(size, insulation=None):
    """Outer diameter over the insulation of a single conductor.

    Parameters
    ----------
    size : calc.units.ConductorSize or str
        Conductor size.
    insulation : str, optional
        "thhn", "xhhw", "rhh", "iec_pvc" or "iec_xlpe"; None or "typical" gives THHN for AWG and
        kcmil, PVC for mm².

    Returns
    -------
    float
        Diameter over insulation [m].

    Notes
    -----
    D = d_c + 2 t, with t the nominal thickness of the size's band in INSULATION_MM.

    References
    ----------
    UL 83 (THHN) and UL 44 (RHH) thicknesses, IEC 60502-1 (PVC, XLPE) — from memory; ICEA
    S-95-658 column B (XHHW-2) — read, as reproduced in a distributor's data sheet.

    Examples
    --------
    >>> [round(insulated_diameter("12 AWG", kind) * 1e3, 2) for kind in ("thhn", "rhh")]
    [3.29, 4.61]
    """
    size = units.parse_conductor_size(size)
    table = INSULATION_MM[_insulation(size, insulation)]
    return conductor_diameter(size) + 2e-3 * _band(table, size.area_m2 * 1e6)


def geometric_mean_distance(spacing, formation="trefoil"):
    """Geometric mean distance between three phase conductors.

    Parameters
    ----------
    spacing : float
        Axial spacing between adjacent conductors [m] (the insulated diameter when touching).
    formation : str
        "trefoil" (equilateral triangle), "flat" (equally spaced in a row) or "cradled" (touching
        in a row along the bottom of a conduit).

    Returns
    -------
    float
        GMD [m].

    Notes
    -----
    GMD = ∛(d_ab d_bc d_ca): s in trefoil, ∛2 s = 1.26 s flat. Cradled: centres on a circle of
    radius R = (k − 1) s / 2 in a conduit k = CRADLE_CONDUIT_RATIO diameters wide, adjacent ones
    s apart, so sin α = s / 2R and the outer pair is 2R sin 2α apart (√3 s for k = 3, GMD =
    3^(1/6) s = 1.20 s).

    References
    ----------
    J. D. Glover, M. S. Sarma, T. J. Overbye, Power System Analysis and Design, 5th ed.,
    section 4.5 — from memory; the cradle is geometry (computed).

    Examples
    --------
    >>> [round(geometric_mean_distance(0.1, formation), 4) for formation in ("flat", "cradled")]
    [0.126, 0.1201]
    """
    if formation == "trefoil":
        return spacing
    if formation == "flat":
        return (2.0 * spacing ** 3) ** (1 / 3)
    if formation == "cradled":
        radius = (CRADLE_CONDUIT_RATIO - 1.0) * spacing / 2.0
        outer = 2.0 * radius * math.sin(2.0 * math.asin(spacing / (2.0 * radius)))
        return (spacing * spacing * outer) ** (1 / 3)
    raise ParameterError("formation", formation, "choose one of: "
                         + ", ".join(token for token, _ in FORMATIONS))


def table_resistance(size, material):
    """The published DC resistance of a stranded conductor and how to correct it for temperature.

    Parameters
    ----------
    size : calc.units.ConductorSize or str
        Conductor size.
    material : str
        "cu" or "al".

    Returns
    -------
    tuple or None
        (resistance [Ω/m] at the reference temperature, reference temperature [°C], α referred to
        it [1/K], source text), or None when the table has no value for the size and material.

    Raises
    ------
    calc.errors.ParameterError
        On `material` for a material other than cu or al.

    Notes
    -----
    AWG and kcmil: NEC Chapter 9 Table 8 at 75 °C with its note 2 α75; mm²: IEC 60228 Class 2
    maximum at 20 °C with α20. The table gives Ω/kft (÷ 304.8 m) or Ω/km (÷ 1000 m).

    References
    ----------
    NEC Chapter 9 Table 8 and its note 2 (read, as reproduced); IEC 60228 Table 2 (read, as
    reproduced) and Annex B (from memory).

    Examples
    --------
    >>> r, t, alpha, _ = table_resistance("12 AWG", "cu"); round(r * 304.8, 3), t, alpha
    (1.98, 75.0, 0.00323)
    """
    size = units.parse_conductor_size(size)
    material = _material(material)
    if size.system == "mm2":
        table = IEC60228_CLASS2_CU_20C if material == "cu" else IEC60228_CLASS2_AL_20C
        if size.label not in table:
            return None
        return (table[size.label] * 1e-3, 20.0, ALPHA_20C[material],
                "IEC 60228 Table 2 (Class 2) maximum at 20 °C, corrected with Annex B α20")
    table = NEC_TABLE8_CU_STRANDED_75C if material == "cu" else NEC_TABLE8_AL_STRANDED_75C
    if size.label not in table:
        return None
    return (table[size.label] / METRES_PER_KFT, 75.0, ALPHA_75C_NEC[material],
            "NEC Chapter 9 Table 8 (stranded, 75 °C), corrected with its note 2 α75")


def dc_resistance(size, material, temperature_c=20.0, method="physics"):
    """DC resistance of one stranded conductor per unit length.

    Parameters
    ----------
    size : calc.units.ConductorSize or str
        Conductor size ("12 AWG", "250 kcmil", "2.5 mm2").
    material : str
        "cu" (annealed copper, 100 % IACS) or "al" (aluminium 1350, 61 % IACS).
    temperature_c : float
        Conductor temperature [°C].
    method : str
        "physics" (resistivity, area and lay factor) or "table" (NEC Chapter 9 Table 8 for AWG
        and kcmil, IEC 60228 Class 2 for mm², corrected to `temperature_c`).

    Returns
    -------
    float
        Resistance [Ω/m].

    Raises
    ------
    calc.errors.ParameterError
        On `size` for a size not made in the material, on `material` for an unknown one, on
        `method` for "table" where the table has no value.

    Notes
    -----
    Physics: R = ρ20 [1 + α20 (T − 20)] / A × 1.02. Table: R = R_ref [1 + α_ref (T − T_ref)].

    References
    ----------
    IEC 60028 (copper resistivity; read, as reproduced in Agrawal, Industrial Power Engineering
    and Applications Handbook, Table 30.1); NEC Chapter 9 Table 8 and its note 2 (read, as
    reproduced); IEC 60228 Table 2 (read, as reproduced) and Annex B (from memory).

    Examples
    --------
    >>> round(dc_resistance("12 AWG", "cu", 75.0) * 304.8, 3)
    1.97
    """
    size = units.parse_conductor_size(size)
    material = _material(material)
    check_made(size, material)
    if method == "table":
        entry = table_resistance(size, material)
        if entry is None:
            raise ParameterError("method", method, f"no published table value for {size.label} "
                                 f"{MATERIAL_NAMES[material]}; choose physics")
        resistance, reference_c, alpha, _ = entry
        return resistance * (1 + alpha * (temperature_c - reference_c))
    rho = RESISTIVITY_20C[material] * (1 + ALPHA_20C[material] * (temperature_c - 20.0))
    return rho / size.area_m2 * LAY_FACTOR_STRANDED


def _effect_term(r_dc, frequency, k):
    """x⁴ / (192 + 0.8 x⁴) with x² = 8πf / R' × 10⁻⁷ k (the shape both IEC factors share)."""
    x4 = (8 * math.pi * frequency / r_dc * 1e-7 * k) ** 2
    return x4 / (192 + 0.8 * x4)


def _skin_argument(r_dc, frequency, k_s=K_SKIN):
    """x_s = √(8πf / R' × 10⁻⁷ k_s) of IEC 60287-1-1 clause 2.1.2 (the y_s formula holds to 2.8)."""
    return math.sqrt(8 * math.pi * frequency / r_dc * 1e-7 * k_s)


def skin_effect_factor(r_dc, frequency, k_s=K_SKIN):
    """Skin-effect factor y_s of IEC 60287-1-1 clause 2.1.2.

    Parameters
    ----------
    r_dc : float
        DC resistance at operating temperature R' [Ω/m].
    frequency : float
        Supply frequency [Hz]; 0 gives 0.
    k_s : float
        Conductor-construction constant [-] (1 for round stranded).

    Returns
    -------
    float
        y_s [-] (R_ac = R' (1 + y_s + y_p)).

    Notes
    -----
    x_s² = 8πf / R' × 10⁻⁷ k_s; y_s = x_s⁴ / (192 + 0.8 x_s⁴), accurate for x_s ≤ 2.8.

    References
    ----------
    IEC 60287-1-1, clause 2.1.2 — from memory.

    Examples
    --------
    >>> round(skin_effect_factor(8.465e-5, 60.0), 4)
    0.0163
    """
    return _effect_term(r_dc, frequency, k_s)


def proximity_effect_factor(r_dc, frequency, diameter, spacing, k_p=K_PROXIMITY):
    """Proximity-effect factor y_p for three single-core cables (or three-core), IEC 60287-1-1.

    Parameters
    ----------
    r_dc : float
        DC resistance at operating temperature R' [Ω/m].
    frequency : float
        Supply frequency [Hz].
    diameter : float
        Conductor diameter d_c [m].
    spacing : float
        Axial spacing s [m] (for flat formation √(s1 s2)).
    k_p : float
        Construction constant [-] (1 for round stranded, extruded insulation).

    Returns
    -------
    float
        y_p [-].

    Notes
    -----
    x_p² = 8πf / R' × 10⁻⁷ k_p, F = x_p⁴ / (192 + 0.8 x_p⁴);
    y_p = F (d_c/s)² [0.312 (d_c/s)² + 1.18 / (F + 0.27)].

    References
    ----------
    IEC 60287-1-1, clause 2.1.4 — from memory.

    Examples
    --------
    >>> round(proximity_effect_factor(8.465e-5, 60.0, 0.02065, 0.0241), 4)
    0.0521
    """
    term = _effect_term(r_dc, frequency, k_p)
    ratio2 = (diameter / spacing) ** 2
    return term * ratio2 * (0.312 * ratio2 + 1.18 / (term + 0.27))


def series_reactance(frequency, gmd, gmr):
    """Series (positive-sequence) reactance per conductor of a three-phase line.

    Parameters
    ----------
    frequency : float
        Supply frequency [Hz].
    gmd : float
        Geometric mean distance between the phase conductors [m].
    gmr : float
        Geometric mean radius of one conductor [m].

    Returns
    -------
    float
        Reactance [Ω/m].

    Notes
    -----
    X = 2πf × 2×10⁻⁷ × ln(GMD / GMR).

    References
    ----------
    J. D. Glover, M. S. Sarma, T. J. Overbye, Power System Analysis and Design, 5th ed.,
    section 4.5 — from memory.

    Examples
    --------
    >>> round(series_reactance(60.0, 3.29e-3, 0.8448e-3) * 304.8, 4)
    0.0312
    """
    return 2 * math.pi * frequency * MU0_OVER_2PI * math.log(gmd / gmr)


def effective_impedance(r_per_m, x_per_m, power_factor=POWER_FACTOR_NEC):
    """Effective impedance of a conductor for voltage drop at a given power factor.

    Parameters
    ----------
    r_per_m : float
        AC resistance per metre [Ω/m] (a whole run's [Ω] works the same way).
    x_per_m : float
        Series reactance per metre [Ω/m].
    power_factor : float
        Load power factor, lagging [-]; NEC Chapter 9 Table 9 uses 0.85.

    Returns
    -------
    float
        Z_eff in the unit of the arguments [Ω/m].

    Notes
    -----
    Z = R cos θ + X sin θ.

    References
    ----------
    NEC Chapter 9 Table 9, note 2 (read, as quoted).

    Examples
    --------
    >>> round(effective_impedance(1.0, 1.0, 0.85), 4)
    1.3768
    """
    return r_per_m * power_factor + x_per_m * math.sin(math.acos(power_factor))


_TABLE8 = {"cu": NEC_TABLE8_CU_STRANDED_75C, "al": NEC_TABLE8_AL_STRANDED_75C}
_TABLE9_AREA = {label: units.parse_conductor_size(label).area_m2 for label in NEC_TABLE9_XL}


def _table9_entry(size, material, raceway):
    """Table 9's (XL, R_ac or None [Ω/kft], note) in conduit `raceway`, or None outside its range;
    a size it does not list is interpolated in log area (R as its AC/DC ratio over Table 8)."""
    column = 1 if raceway == "steel" else 0
    rows = NEC_TABLE9_R[(material, raceway)]
    if size.label in NEC_TABLE9_XL:
        return NEC_TABLE9_XL[size.label][column], rows.get(size.label), None
    below = [label for label, area in _TABLE9_AREA.items() if area < size.area_m2]
    above = [label for label, area in _TABLE9_AREA.items() if area > size.area_m2]
    if size.system == "mm2" or not below or not above:
        return None
    low, high = below[-1], above[0]
    t = math.log(size.area_m2 / _TABLE9_AREA[low]) / math.log(_TABLE9_AREA[high]
                                                               / _TABLE9_AREA[low])
    xl = NEC_TABLE9_XL[low][column] + t * (NEC_TABLE9_XL[high][column]
                                           - NEC_TABLE9_XL[low][column])
    table8 = _TABLE8[material]
    resistance = None
    if {low, high} <= set(rows) and size.label in table8:
        ratio_low, ratio_high = rows[low] / table8[low], rows[high] / table8[high]
        resistance = (ratio_low + t * (ratio_high - ratio_low)) * table8[size.label]
    return xl, resistance, f"interpolated between its {low} and {high} rows"


def _rounds_to(value, entry):
    """True when `value` rounds to a two-significant-figure table `entry`."""
    return abs(value - entry) <= 0.5 * 10 ** (math.floor(math.log10(entry)) - 1) * (1 + 1e-9)


def _ac_resistance(r_dc, frequency, diameter, spacing, raceway):
    """(R_ac, x_s, y_s, y_p): IEC 60287-1-1 skin and proximity effect, × 1.5 in steel conduit."""
    if frequency <= 0:
        return r_dc, 0.0, 0.0, 0.0
    y_s = skin_effect_factor(r_dc, frequency)
    y_p = proximity_effect_factor(r_dc, frequency, diameter, spacing)
    factor = STEEL_CONDUIT_AC_FACTOR if raceway == "steel" else 1.0
    return r_dc * (1 + factor * (y_s + y_p)), _skin_argument(r_dc, frequency), y_s, y_p


class ConductorImpedance(NamedTuple):
    """One conductor's impedance per metre and the figures it was found from (SI units)."""

    r_dc: float  # by the chosen method [Ω/m]
    r_ac: float  # [Ω/m]
    x: float  # by the chosen method [Ω/m]
    r_dc_physics: float  # [Ω/m]
    r_dc_table: float | None  # [Ω/m]; None where the table has no entry
    x_geometry: float  # [Ω/m]
    x_table9: float | None  # NEC Table 9 XL [Ω/m] at the frequency, conductors in conduit
    x_s: float  # IEC 60287-1-1 skin argument [-]
    y_s: float  # skin-effect factor [-]
    y_p: float  # proximity-effect factor [-]
    diameter: float  # conductor [m]
    spacing: float  # axial, adjacent conductors [m]
    gmr: float  # [m]
    gmd: float  # [m]
    r_ac_table9: float | None = None  # NEC Table 9 R_ac at 75 °C, 60 Hz [Ω/m]
    r_ac_basis: str = "physics"  # "table9", "table8" (Table 8 with AC effects) or "physics"
    x_basis: str = "geometry"  # "table9" or "geometry"
    table_note: str | None = None  # how a Table 9 figure was found where it lists no row
    table_gaps: tuple = ()  # what the table method could not take from a table, and why
    insulation: str = "thhn"  # of the geometry
    formation: str = "trefoil"  # of the geometry


def impedance(size, material, temperature_c, frequency, raceway="pvc", spacing=None,
              method="physics", *, insulation=None, formation="trefoil"):
    """Resistance and reactance per metre of one conductor, the way every run calculator needs.

    Parameters
    ----------
    size : calc.units.ConductorSize or str
        Conductor size.
    material : str
        "cu" or "al".
    temperature_c : float
        Conductor temperature [°C].
    frequency : float
        Supply frequency [Hz]; 0 for DC.
    raceway : str
        "none", "pvc", "aluminum" or "steel".
    spacing : float or None
        Axial spacing between adjacent conductors [m]; None means touching conductors.
    method : str
        "physics", or "table" (NEC Chapter 9 Table 8 / IEC 60228 DC resistance; NEC Chapter 9
        Table 9 AC resistance and reactance for conductors in conduit).
    insulation, formation : str, optional
        Of the geometry: see insulated_diameter and geometric_mean_distance.

    Returns
    -------
    ConductorImpedance
        R_dc, R_ac and X [Ω/m], the figures they were found from, their basis, and
        `table_gaps`: each part the table method could not take from a table, and why.

    Raises
    ------
    calc.errors.ParameterError
        On the parameter at fault: a size not made in the material, a method whose DC table has
        no entry, a spacing below the conductor's diameter or given for a cradle, an unknown
        insulation or formation.

    Notes
    -----
    Physics: R_ac = R_dc [1 + k (y_s + y_p)] (k = 1.5 in steel conduit, else 1) and
    X = k_X × 2πf × 2×10⁻⁷ ln(GMD / GMR) (k_X = 1.25 in steel conduit). Table method, AC, in
    conduit: X = XL_9 × f / 60 Hz; R_ac = R_ref × R_ac(T, f) / R_ac(75 °C, 60 Hz), where R_ref is
    Table 8's R_dc with the AC effects when that rounds to Table 9's two-figure R_ac, else Table
    9's R_ac. A size Table 9 does not list inside its range is interpolated (a gap, named); in
    free air, for mm² sizes and for 18 and 16 AWG, R_ac and X come from the physics (a gap).

    References
    ----------
    IEC 60287-1-1, clauses 2.1.2 and 2.1.4 (from memory); Glover, Sarma & Overbye, Power System
    Analysis and Design, 5th ed., section 4.5 (from memory); NEC Chapter 9 Tables 8 and 9 (read,
    as reproduced).

    Examples
    --------
    >>> z = impedance("12 AWG", "cu", 75.0, 60.0)
    >>> round(z.r_ac * 1e3, 4), round(z.x * 1e3, 4)
    (6.4639, 0.1026)
    >>> z = impedance("3 AWG", "cu", 75.0, 60.0, method="table")
    >>> round(z.x * 304.8, 4), z.x_basis, z.table_gaps
    (0.047, 'table9', ())
    """
    size = units.parse_conductor_size(size)
    check_made(size, material)
    insulation = _insulation(size, insulation)
    diameter = conductor_diameter(size)
    given_spacing = spacing is not None
    if not given_spacing:
        spacing = insulated_diameter(size, insulation)  # touching
    elif spacing < diameter:
        raise ParameterError("spacing", spacing,
                             f"{spacing * 1e3:.3g} mm is less than the conductor diameter "
                             f"{diameter * 1e3:.3g} mm; enter the centre-to-centre spacing")
    elif formation == "cradled":
        raise ParameterError("spacing", spacing, "cradled conductors touch; leave the spacing "
                             "blank or choose a trefoil or flat formation")
    gmd = geometric_mean_distance(spacing, formation)
    entry = table_resistance(size, material)
    if method == "table" and entry is None:
        dc_resistance(size, material, temperature_c, "table")  # raises the method error
    r_physics = dc_resistance(size, material, temperature_c, "physics")
    r_table = dc_resistance(size, material, temperature_c, "table") if entry else None
    r_dc = r_table if method == "table" else r_physics
    r_ac, x_s, y_s, y_p = _ac_resistance(r_dc, frequency, diameter, spacing, raceway)
    gmr = geometric_mean_radius(size)
    x_factor = STEEL_CONDUIT_X_FACTOR if raceway == "steel" else 1.0
    x_geometry = x_factor * series_reactance(frequency, gmd, gmr)
    table9 = (_table9_entry(size, material, raceway) if raceway in TABLE9_RACEWAYS
              and not given_spacing and frequency > 0 else None)
    x_table9 = None if table9 is None else table9[0] / METRES_PER_KFT * frequency / 60.0
    r_ac_table9 = None if table9 is None or table9[1] is None else table9[1] / METRES_PER_KFT
    x, r_basis, x_basis, gaps = x_geometry, "physics", "geometry", []
    if method == "table" and frequency > 0:
        r_basis = "table8"
        if table9 is None:
            gaps.append(_table9_gap(size, raceway, given_spacing))
        else:
            x, x_basis = x_table9, "table9"
            if table9[2]:
                gaps.append(f"NEC Chapter 9 Table 9 has no row for {size.label}: R_ac and X "
                            f"{table9[2]}")
        if r_ac_table9 is not None:
            reference = dc_resistance(size, material, TABLE9_TEMPERATURE_C, "table")
            r_ref, *_ = _ac_resistance(reference, TABLE9_FREQUENCY_HZ, diameter, spacing, raceway)
            if table9[2] or not _rounds_to(r_ref * METRES_PER_KFT, table9[1]):
                r_ac, r_basis = r_ac_table9 * r_ac / r_ref, "table9"
    elif method == "table":
        r_basis = "table8"
    return ConductorImpedance(r_dc, r_ac, x, r_physics, r_table, x_geometry, x_table9, x_s, y_s,
                              y_p, diameter, spacing, gmr, gmd, r_ac_table9, r_basis, x_basis,
                              None if table9 is None else table9[2], tuple(gaps), insulation,
                              formation)


def _table9_gap(size, raceway, given_spacing):
    """Why NEC Chapter 9 Table 9 gives nothing for this run (the physics is used instead)."""
    why = ("is for three conductors in conduit, not in free air or tray"
           if raceway not in TABLE9_RACEWAYS else
           "is for conductors touching in conduit, not at a given spacing" if given_spacing else
           f"has no metric sizes ({size.label}); IEC 60228 gives resistance only"
           if size.system == "mm2" else f"has no row for {size.label} (it lists 14 AWG to "
           "1000 kcmil)")
    return (f"NEC Chapter 9 Table 9 {why}: R_ac from the DC table with the IEC 60287-1-1 "
            "effects, X from the geometry")
