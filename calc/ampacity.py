"""Ampacity (current-carrying capacity) of insulated conductors, and the rules that judge a
circuit's conductor and its protection against it: NEC Table 310.16 with its ambient and
grouping factors, terminal temperatures and small-conductor limits, NEC Article 430 motor branch
figures, and IEC 60364-5-52 Annex B capacities with their correction and grouping factors.
Physics and published tables only; the calculators live in calc/calculators/.

Quantities follow the nomenclature page: current [A], temperature [°C], area [m²]. NEC rule
numbers are those of the 2020 and 2023 editions; the 2014 and 2017 editions number the same
tables 310.15(B)(16), 310.15(B)(2)(a) and 310.15(B)(3)(a).
"""

import bisect
from typing import NamedTuple

from calc import protection, units
from calc.errors import ParameterError

# ==== NEC: Table 310.16 and its factors ======================================================

# NEC Table 310.16 (2014/2017: Table 310.15(B)(16)): allowable ampacity [A] of insulated
# conductors rated up to 2000 V, not more than three current-carrying conductors in raceway,
# cable or earth, ambient 30 °C: (copper 60, 75, 90 °C, aluminium or copper-clad aluminium 60,
# 75, 90 °C); None where the table has no entry. Read, as reproduced in the NEC 2017 text
# (repository mjk83093/sil, NEC2017_Chapter_3.md) and in urdans/eecalcs ConductorProperties.java
# (NEC 2014): both agree in every cell from 14 AWG to 2000 kcmil. 18 and 16 AWG (90 °C column
# only) read in the 2017 text. The same in the 2020 and 2023 editions (from memory).
NEC_310_16 = {
    "18 AWG": (None, None, 14, None, None, None),
    "16 AWG": (None, None, 18, None, None, None),
    "14 AWG": (15, 20, 25, None, None, None),
    "12 AWG": (20, 25, 30, 15, 20, 25),
    "10 AWG": (30, 35, 40, 25, 30, 35),
    "8 AWG": (40, 50, 55, 35, 40, 45),
    "6 AWG": (55, 65, 75, 40, 50, 55),
    "4 AWG": (70, 85, 95, 55, 65, 75),
    "3 AWG": (85, 100, 115, 65, 75, 85),
    "2 AWG": (95, 115, 130, 75, 90, 100),
    "1 AWG": (110, 130, 145, 85, 100, 115),
    "1/0 AWG": (125, 150, 170, 100, 120, 135),
    "2/0 AWG": (145, 175, 195, 115, 135, 150),
    "3/0 AWG": (165, 200, 225, 130, 155, 175),
    "4/0 AWG": (195, 230, 260, 150, 180, 205),
    "250 kcmil": (215, 255, 290, 170, 205, 230),
    "300 kcmil": (240, 285, 320, 195, 230, 260),
    "350 kcmil": (260, 310, 350, 210, 250, 280),
    "400 kcmil": (280, 335, 380, 225, 270, 305),
    "500 kcmil": (320, 380, 430, 260, 310, 350),
    "600 kcmil": (350, 420, 475, 285, 340, 385),
    "700 kcmil": (385, 460, 520, 315, 375, 425),
    "750 kcmil": (400, 475, 535, 320, 385, 435),
    "800 kcmil": (410, 490, 555, 330, 395, 445),
    "900 kcmil": (435, 520, 585, 355, 425, 480),
    "1000 kcmil": (455, 545, 615, 375, 445, 500),
    "1250 kcmil": (495, 590, 665, 405, 485, 545),
    "1500 kcmil": (525, 625, 705, 435, 520, 585),
    "1750 kcmil": (545, 650, 735, 455, 545, 615),
    "2000 kcmil": (555, 665, 750, 470, 560, 630),
}
NEC_COLUMNS_C = (60, 75, 90)  # the temperature ratings of Table 310.16's columns [°C]
NEC_TABLE_AMBIENT_C = 30.0

# NEC 310.15(B)(1) (2017: Table 310.15(B)(2)(a)): ambient correction factors for Table 310.16,
# by ambient band: (hottest ambient of the band [°C], factor for 60, 75, 90 °C conductors); None:
# the conductor may not be used there. Each band runs from just above the previous one; the
# first is "10 °C or less". Read, as reproduced in the NEC 2017 text (mjk83093/sil
# NEC2017_Chapter_3.md) and in urdans/eecalcs Factors.java (NEC 2014, °F bands): they agree.
NEC_AMBIENT_FACTORS = (
    (10, 1.29, 1.20, 1.15), (15, 1.22, 1.15, 1.12), (20, 1.15, 1.11, 1.08),
    (25, 1.08, 1.05, 1.04), (30, 1.00, 1.00, 1.00), (35, 0.91, 0.94, 0.96),
    (40, 0.82, 0.88, 0.91), (45, 0.71, 0.82, 0.87), (50, 0.58, 0.75, 0.82),
    (55, 0.41, 0.67, 0.76), (60, None, 0.58, 0.71), (65, None, 0.47, 0.65),
    (70, None, 0.33, 0.58), (75, None, None, 0.50), (80, None, None, 0.41),
    (85, None, None, 0.29),
)

# NEC 310.15(C)(1) (2017: Table 310.15(B)(3)(a)): adjustment for more than three current-carrying
# conductors in a raceway or cable: (largest count of the band, factor). Read, as reproduced in
# the NEC 2017 text and in urdans/eecalcs Factors.java; they agree. 41 and above: 0.35.
NEC_ADJUSTMENT_FACTORS = ((3, 1.00), (6, 0.80), (9, 0.70), (20, 0.50), (30, 0.45), (40, 0.40),
                          (None, 0.35))

# NEC 110.14(C)(1): terminations of circuits rated 100 A or less, or marked for 14 to 1 AWG,
# take the 60 °C column; larger circuits and conductors the 75 °C column — unless the equipment
# is listed and marked for higher (read, as reproduced in the NEC 2017 text, NEC2017_Chapter_1.md).
# Without the circuit's rating the size decides: 14 to 1 AWG 60 °C, 1/0 AWG and larger 75 °C.
TERMINAL_SMALL_C, TERMINAL_LARGE_C = 60, 75
TERMINAL_SIZE_LIMIT = "1 AWG"
TERMINAL_RATING_LIMIT_A = 100.0

# NEC 240.4(D): the largest overcurrent device for small conductors [A], after any correction
# (read, as reproduced in the NEC 2017 text, NEC2017_Chapter_2.md; that copy lost the figure of
# 12 AWG aluminium, 15 A from memory). 18 and 16 AWG copper also need listed devices.
SMALL_CONDUCTOR_LIMITS_A = {
    ("cu", "18 AWG"): 7, ("cu", "16 AWG"): 10, ("cu", "14 AWG"): 15, ("cu", "12 AWG"): 20,
    ("cu", "10 AWG"): 30, ("al", "12 AWG"): 15, ("al", "10 AWG"): 25,
}
# NEC 240.4(B): the next higher standard rating may protect a conductor whose ampacity is not a
# standard rating, for devices up to 800 A; above, 240.4(C) needs the full ampacity (read, as
# reproduced in the NEC 2017 text).
NEXT_SIZE_UP_LIMIT_A = 800.0

# ==== NEC Article 430: motor branch circuits =================================================

# NEC 430.22: branch conductors of one continuous-duty motor carry at least 125 % of its
# full-load current (read as reproduced in the NEC 2017 text, NEC2017_Chapter_4.md);
# 210.19(A)(1) / 215.2(A)(1) ask the same 125 % of a continuous load (from memory).
MOTOR_CONDUCTOR_FACTOR = 1.25
CONTINUOUS_LOAD_FACTOR = 1.25
# NEC 430.32(A)(1): a separate overload device trips at no more than 125 % of the nameplate
# current for a service factor of 1.15 or more (or a marked rise of 40 °C or less), 115 % for
# all others (read, as reproduced in the NEC 2017 text).
OVERLOAD_FACTORS = {"1.15": 1.25, "1.0": 1.15}
# NEC Table 430.52: maximum rating or setting of the branch-circuit short-circuit and
# ground-fault device, percent of full-load current, by motor and device (read, as reproduced
# in the NEC 2017 text, NEC2017_Chapter_4.md): (non-time-delay fuse, dual-element time-delay
# fuse, instantaneous-trip breaker, inverse-time breaker).
NEC_430_52_PCT = {
    "standard": (300, 175, 800, 250),  # AC polyphase other than wound-rotor; squirrel cage
    # other than Design B energy-efficient; single-phase motors
    "design-b-ee": (300, 175, 1100, 250),  # Design B energy-efficient
    "wound-rotor": (150, 150, 800, 150),
}
MOTOR_DESIGNS = tuple(NEC_430_52_PCT)
MOTOR_DEVICE_COLUMNS = {"fuse-non-time-delay": 0, "fuse-time-delay": 1, "instantaneous": 2,
                        "inverse-time": 3}

# ==== IEC 60364-5-52 Annex B =================================================================

IEC_SIZES_MM2 = (1.5, 2.5, 4, 6, 10, 16, 25, 35, 50, 70, 95, 120, 150, 185, 240, 300)
IEC_METHODS = ("A1", "A2", "B1", "B2", "C", "D1", "D2", "E", "F")
IEC_GROUND_METHODS = ("D1", "D2")
IEC_INSULATION_C = {"pvc": 70, "xlpe": 90}  # maximum conductor temperature [°C]
_ = None
# Current-carrying capacities [A], one value per size of IEC_SIZES_MM2 (None: not given),
# ambient 30 °C in air, 20 °C in the ground, soil 2.5 K·m/W. Keys: (insulation, loaded
# conductors, material) -> {method: capacities}. A1 to D2: Tables B.52.2 (PVC, 2 loaded),
# B.52.3 (XLPE/EPR, 2), B.52.4 (PVC, 3), B.52.5 (XLPE/EPR, 3); E (multi-core cable in free air)
# and F (single-core cables touching in free air; copper from 25 mm²): Tables B.52.10 (PVC,
# copper), B.52.11 (PVC, aluminium), B.52.12 (XLPE, copper), B.52.13 (XLPE, aluminium); F for
# two loaded conductors is column 4 (flat touching), for three column 5 (trefoil).
# From memory (IEC 60364-5-52:2009 Annex B), to be checked against the standard. Aluminium in
# method F is not given here (not recalled with confidence).
IEC_CAPACITY_A = {
    ("pvc", 2, "cu"): {
        "A1": (14.5, 19.5, 26, 34, 46, 61, 80, 99, 119, 151, 182, 210, 240, 273, 321, 367),
        "A2": (14, 18.5, 25, 32, 43, 57, 75, 92, 110, 139, 167, 192, 219, 248, 291, 334),
        "B1": (17.5, 24, 32, 41, 57, 76, 101, 125, 151, 192, 232, 269, 300, 341, 400, 458),
        "B2": (16.5, 23, 30, 38, 52, 69, 90, 111, 133, 168, 201, 232, 258, 294, 344, 394),
        "C": (19.5, 27, 36, 46, 63, 85, 112, 138, 168, 213, 258, 299, 344, 392, 461, 530),
        "D1": (22, 29, 37, 46, 60, 78, 99, 119, 140, 173, 204, 231, 261, 292, 336, 379),
        "D2": (22, 28, 38, 48, 64, 83, 110, 132, 156, 192, 230, 261, 293, 331, 382, 427),
        "E": (22, 30, 40, 51, 70, 94, 119, 148, 180, 232, 282, 328, 379, 434, 514, 593),
        "F": (_, _, _, _, _, _, 131, 162, 196, 251, 304, 352, 406, 463, 546, 629),
    },
    ("pvc", 2, "al"): {
        "A1": (_, 15, 20, 26, 36, 48, 63, 77, 93, 118, 142, 164, 189, 215, 252, 289),
        "A2": (_, 14.5, 19.5, 25, 33, 44, 58, 71, 86, 108, 130, 150, 172, 195, 229, 263),
        "B1": (_, 18.5, 25, 32, 44, 60, 79, 97, 118, 150, 181, 210, 234, 266, 312, 358),
        "B2": (_, 17.5, 24, 30, 41, 54, 71, 86, 104, 131, 157, 181, 201, 230, 269, 308),
        "C": (_, 21, 28, 36, 49, 66, 83, 103, 125, 160, 195, 226, 261, 298, 352, 406),
        "D1": (_, 22, 29, 36, 47, 61, 77, 93, 109, 135, 159, 180, 204, 228, 262, 296),
        "D2": (_, _, _, _, _, 63, 82, 98, 117, 145, 173, 200, 224, 255, 298, 336),
        "E": (_, 23, 31, 39, 54, 73, 89, 111, 135, 173, 210, 244, 282, 322, 380, 439),
    },
    ("xlpe", 2, "cu"): {
        "A1": (19, 26, 35, 45, 61, 81, 106, 131, 158, 200, 241, 278, 318, 362, 424, 486),
        "A2": (18.5, 25, 33, 42, 57, 76, 99, 121, 145, 183, 220, 253, 290, 329, 386, 442),
        "B1": (23, 31, 42, 54, 75, 100, 133, 164, 198, 253, 306, 354, 393, 449, 528, 603),
        "B2": (22, 30, 40, 51, 69, 91, 119, 146, 175, 221, 265, 305, 334, 384, 459, 532),
        "C": (24, 33, 45, 58, 80, 107, 138, 171, 209, 269, 328, 382, 441, 506, 599, 693),
        "D1": (25, 33, 43, 53, 71, 91, 116, 139, 164, 203, 239, 271, 306, 343, 395, 446),
        "D2": (27, 35, 46, 58, 77, 100, 129, 155, 183, 225, 270, 306, 343, 387, 448, 502),
        "E": (26, 36, 49, 63, 86, 115, 149, 185, 225, 289, 352, 410, 473, 542, 641, 741),
        "F": (_, _, _, _, _, _, 161, 200, 242, 310, 377, 437, 504, 575, 679, 783),
    },
    ("xlpe", 2, "al"): {
        "A1": (_, 20, 27, 35, 48, 64, 84, 103, 125, 158, 191, 220, 253, 288, 338, 387),
        "A2": (_, 19.5, 26, 33, 45, 60, 78, 96, 115, 145, 175, 201, 230, 262, 307, 352),
        "B1": (_, 25, 33, 43, 59, 79, 105, 130, 157, 200, 242, 281, 307, 351, 412, 471),
        "B2": (_, 23, 31, 40, 54, 72, 94, 115, 138, 175, 210, 242, 261, 300, 358, 415),
        "C": (_, 26, 35, 45, 62, 84, 101, 126, 154, 198, 241, 280, 324, 371, 439, 508),
        "D1": (_, 26, 33, 42, 55, 71, 90, 108, 128, 158, 186, 211, 238, 267, 307, 346),
        "D2": (_, _, _, _, _, 76, 98, 117, 139, 170, 204, 233, 261, 296, 343, 386),
        "E": (_, 28, 38, 49, 67, 91, 108, 135, 164, 211, 257, 300, 346, 397, 470, 543),
    },
    ("pvc", 3, "cu"): {
        "A1": (13.5, 18, 24, 31, 42, 56, 73, 89, 108, 136, 164, 188, 216, 245, 286, 328),
        "A2": (13, 17.5, 23, 29, 39, 52, 68, 83, 99, 125, 150, 172, 196, 223, 261, 298),
        "B1": (15.5, 21, 28, 36, 50, 68, 89, 110, 134, 171, 207, 239, 262, 296, 346, 394),
        "B2": (15, 20, 27, 34, 46, 62, 80, 99, 118, 149, 179, 206, 225, 255, 297, 339),
        "C": (17.5, 24, 32, 41, 57, 76, 96, 119, 144, 184, 223, 259, 299, 341, 403, 464),
        "D1": (18, 24, 30, 38, 50, 64, 82, 98, 116, 143, 169, 192, 217, 243, 280, 316),
        "D2": (19, 24, 33, 41, 54, 70, 92, 110, 130, 162, 193, 220, 246, 278, 320, 359),
        "E": (18.5, 25, 34, 43, 60, 80, 101, 126, 153, 196, 238, 276, 319, 364, 430, 497),
        "F": (_, _, _, _, _, _, 110, 137, 167, 216, 264, 308, 356, 409, 485, 561),
    },
    ("pvc", 3, "al"): {
        "A1": (_, 14, 18.5, 24, 32, 43, 57, 70, 84, 107, 129, 149, 170, 194, 227, 261),
        "A2": (_, 13.5, 17.5, 23, 31, 41, 53, 65, 78, 98, 118, 135, 155, 176, 207, 237),
        "B1": (_, 16.5, 22, 28, 39, 53, 70, 86, 104, 133, 161, 186, 204, 230, 269, 306),
        "B2": (_, 15.5, 21, 27, 36, 48, 62, 77, 92, 116, 139, 160, 176, 199, 232, 265),
        "C": (_, 18.5, 25, 32, 44, 59, 73, 90, 110, 140, 170, 197, 227, 259, 305, 351),
        "D1": (_, 18.5, 24, 30, 39, 50, 64, 77, 91, 112, 132, 150, 169, 190, 218, 247),
        "D2": (_, _, _, _, _, 53, 69, 83, 99, 122, 148, 169, 189, 214, 250, 282),
        "E": (_, 19.5, 26, 33, 46, 61, 78, 96, 117, 150, 183, 212, 245, 280, 330, 381),
    },
    ("xlpe", 3, "cu"): {
        "A1": (17, 23, 31, 40, 54, 73, 95, 117, 141, 179, 216, 249, 285, 324, 380, 435),
        "A2": (16.5, 22, 30, 38, 51, 68, 89, 109, 130, 164, 197, 227, 259, 295, 346, 396),
        "B1": (20, 28, 37, 48, 66, 88, 117, 144, 175, 222, 269, 312, 342, 384, 450, 514),
        "B2": (19.5, 26, 35, 44, 60, 80, 105, 128, 154, 194, 233, 268, 300, 340, 398, 455),
        "C": (22, 30, 40, 52, 71, 96, 119, 147, 179, 229, 278, 322, 371, 424, 500, 576),
        "D1": (21, 28, 36, 44, 58, 75, 96, 115, 135, 167, 197, 223, 251, 281, 324, 365),
        "D2": (23, 30, 39, 49, 65, 84, 107, 129, 153, 188, 226, 257, 287, 324, 375, 419),
        "E": (23, 32, 42, 54, 75, 100, 127, 158, 192, 246, 298, 346, 399, 456, 538, 621),
        "F": (_, _, _, _, _, _, 135, 169, 207, 268, 328, 383, 444, 510, 607, 703),
    },
    ("xlpe", 3, "al"): {
        "A1": (_, 19, 25, 32, 44, 58, 76, 94, 113, 142, 171, 197, 226, 256, 300, 344),
        "A2": (_, 18, 24, 31, 41, 55, 71, 87, 104, 131, 157, 180, 206, 233, 273, 313),
        "B1": (_, 22, 29, 38, 52, 71, 93, 116, 140, 179, 217, 251, 267, 300, 351, 402),
        "B2": (_, 21, 28, 35, 48, 64, 84, 103, 124, 156, 188, 216, 240, 272, 318, 364),
        "C": (_, 24, 32, 41, 57, 76, 90, 112, 136, 174, 211, 245, 283, 323, 382, 440),
        "D1": (_, 22, 28, 35, 46, 59, 75, 90, 106, 130, 154, 174, 197, 220, 253, 286),
        "D2": (_, _, _, _, _, 64, 82, 98, 117, 144, 172, 197, 220, 250, 290, 326),
        "E": (_, 24, 32, 42, 58, 77, 97, 120, 146, 187, 227, 263, 304, 347, 409, 471),
    },
}
del _
IEC_TABLE_NUMBERS = {("pvc", 2): "B.52.2", ("xlpe", 2): "B.52.3", ("pvc", 3): "B.52.4",
                     ("xlpe", 3): "B.52.5"}
IEC_FREE_AIR_TABLES = {("pvc", "cu"): "B.52.10", ("pvc", "al"): "B.52.11",
                       ("xlpe", "cu"): "B.52.12", ("xlpe", "al"): "B.52.13"}

# Table B.52.14: correction for ambient air other than 30 °C, and Table B.52.15: for ground
# temperatures other than 20 °C (methods D1, D2): (ambient [°C], PVC, XLPE/EPR); None: PVC may
# not be used there. From memory (IEC 60364-5-52:2009).
IEC_AIR_FACTORS = (
    (10, 1.22, 1.15), (15, 1.17, 1.12), (20, 1.12, 1.08), (25, 1.06, 1.04), (30, 1.00, 1.00),
    (35, 0.94, 0.96), (40, 0.87, 0.91), (45, 0.79, 0.87), (50, 0.71, 0.82), (55, 0.61, 0.76),
    (60, 0.50, 0.71), (65, None, 0.65), (70, None, 0.58), (75, None, 0.50), (80, None, 0.41),
)
IEC_GROUND_FACTORS = (
    (10, 1.10, 1.07), (15, 1.05, 1.04), (20, 1.00, 1.00), (25, 0.95, 0.96), (30, 0.89, 0.93),
    (35, 0.84, 0.89), (40, 0.77, 0.85), (45, 0.71, 0.80), (50, 0.63, 0.76), (55, 0.55, 0.71),
    (60, 0.45, 0.65), (65, None, 0.60), (70, None, 0.53), (75, None, 0.46), (80, None, 0.38),
)
IEC_AIR_REFERENCE_C, IEC_GROUND_REFERENCE_C = 30.0, 20.0

# Table B.52.17: reduction for groups of circuits or multi-core cables, by arrangement: (counts,
# factors). Item 1, bunched in air, on a surface, embedded or enclosed; item 2, single layer on
# a wall, floor or unperforated tray; item 4, single layer on a perforated tray: all from
# memory (IEC 60364-5-52:2009). For single
# layers the standard gives no further reduction beyond nine circuits.
# Tables B.52.18 (direct in the ground, D2) and B.52.19 (multi-core cables in single-way ducts,
# D1), cables or ducts touching, 2 to 6 circuits: from memory (IEC 60364-5-52:2009).
GROUPING = {
    "bunched": ((1, 2, 3, 4, 5, 6, 7, 8, 9, 12, 16, 20),
                (1.00, 0.80, 0.70, 0.65, 0.60, 0.57, 0.54, 0.52, 0.50, 0.45, 0.41, 0.38)),
    "wall": ((1, 2, 3, 4, 5, 6, 7, 8, 9), (1.00, 0.85, 0.79, 0.75, 0.73, 0.72, 0.72, 0.71, 0.70)),
    "tray": ((1, 2, 3, 4, 5, 6, 7, 8, 9), (1.00, 0.88, 0.82, 0.77, 0.75, 0.73, 0.73, 0.72, 0.72)),
    "ground": ((1, 2, 3, 4, 5, 6), (1.00, 0.75, 0.65, 0.60, 0.55, 0.50)),
    "ducts": ((1, 2, 3, 4, 5, 6), (1.00, 0.85, 0.75, 0.70, 0.65, 0.60)),
}
GROUPING_BY_METHOD = {"A1": "bunched", "A2": "bunched", "B1": "bunched", "B2": "bunched",
                      "C": "wall", "E": "tray", "D1": "ducts", "D2": "ground"}
GROUPING_TABLES = {"bunched": "B.52.17 item 1", "wall": "B.52.17 item 2", "tray": "B.52.17 item 4",
                   "ground": "B.52.18", "ducts": "B.52.19"}
SINGLE_LAYER = ("wall", "tray")

# IEC 60364-4-43 433.1: Ib ≤ In ≤ Iz and I2 ≤ 1.45 Iz (from memory, H). I2, the conventional
# operating current, as a multiple of In: 1.45 for IEC 60898-1 MCBs (read, as reproduced:
# REFERENCE_VALUES §8), 1.30 for IEC 60947-2 breakers and 1.6 for gG fuses of 16 A and more
# (IEC 60269-2, from memory).
CONVENTIONAL_LIMIT = 1.45
CONVENTIONAL_MULTIPLES = {"mcb": 1.45, "breaker": 1.30, "fuse": 1.60}


# ==== helpers ================================================================================

def _label(size):
    """A size's label: Table 310.16 rows above 1000 kcmil are read by label alone."""
    if isinstance(size, str) and size in NEC_310_16:
        return size
    try:
        return units.parse_conductor_size(size).label
    except ValueError as error:
        raise ParameterError("size", size, str(error)) from None


def _column(column_c, parameter="column_c"):
    if column_c not in NEC_COLUMNS_C:
        raise ParameterError(parameter, column_c, "Table 310.16 has columns for 60, 75 and 90 °C "
                             "conductors")
    return NEC_COLUMNS_C.index(column_c)


def _material(material):
    if material not in ("cu", "al"):
        raise ParameterError("material", material, "material must be cu or al")
    return material


def _area(label):
    """Area [m²] of a Table 310.16 label (1250 to 2000 kcmil are beyond calc.units)."""
    if label.endswith("kcmil"):
        return float(label.split()[0]) * 1e3 * units.CIRCULAR_MIL_M2
    return units.CONDUCTOR_SIZES[label].area_m2


# ==== NEC ===================================================================================

def _table_ampacity(size, material, column_c):
    """NEC Table 310.16 ampacity [A] of a size in the 60, 75 or 90 °C column.

    >>> _table_ampacity("12 AWG", "cu", 60), _table_ampacity("4/0", "al", 75)
    (20.0, 180.0)
    """
    label = _label(size)
    column = _column(column_c)
    index = column + (3 if _material(material) == "al" else 0)
    row = NEC_310_16.get(label)
    if row is None or row[index] is None:
        listed = [name for name, values in NEC_310_16.items() if values[index] is not None]
        metal = "aluminium" if material == "al" else "copper"
        raise ParameterError("size", label, f"NEC Table 310.16 has no {column_c} °C {metal} "
                             f"ampacity for {label}; it lists {listed[0]} to {listed[-1]} (AWG "
                             "and kcmil only)")
    return float(row[index])


def _nec_ambient(ambient_c, column_c):
    """NEC 310.15(B)(1) factor of the band holding the ambient [°C]; between bands the hotter
    band (the safe side).

    >>> _nec_ambient(40, 90), _nec_ambient(30.5, 75)
    (0.91, 0.94)
    """
    column = _column(column_c)
    for hottest, *factors in NEC_AMBIENT_FACTORS:
        if ambient_c <= hottest:
            if factors[column] is None:
                break
            return factors[column]
    allowed = max(row[0] for row in NEC_AMBIENT_FACTORS if row[column + 1] is not None)
    raise ParameterError("ambient_c", ambient_c, f"a {column_c} °C conductor has no ampacity "
                         f"above {allowed} °C ambient (NEC 310.15(B)(1)); use a higher-rated "
                         "conductor or a cooler route")


def _nec_adjustment(conductor_count):
    """NEC 310.15(C)(1) factor for a count of current-carrying conductors.

    >>> _nec_adjustment(3), _nec_adjustment(4), _nec_adjustment(41)
    (1.0, 0.8, 0.35)
    """
    if conductor_count < 1 or int(conductor_count) != conductor_count:
        raise ParameterError("conductor_count", conductor_count, "the count of current-carrying "
                             "conductors is a whole number, 1 or more")
    return next(factor for largest, factor in NEC_ADJUSTMENT_FACTORS
                if largest is None or conductor_count <= largest)


def _terminal_column(size, insulation_c, terminal_c=None):
    """The Table 310.16 column [°C] the terminations allow (NEC 110.14(C)(1)): by size when
    their rating is not given (14 to 1 AWG 60 °C, larger 75 °C; the circuit's rating, the
    other test, is not known here), never above the conductor's own.

    >>> _terminal_column("12 AWG", 90), _terminal_column("250 kcmil", 90)
    (60, 75)
    """
    if terminal_c is None:
        limit = units.CONDUCTOR_SIZES[TERMINAL_SIZE_LIMIT].area_m2
        large = _area(_label(size)) > limit * 1.0001
        terminal_c = TERMINAL_LARGE_C if large else TERMINAL_SMALL_C
    _column(terminal_c)
    return min(terminal_c, insulation_c)


def _small_conductor_limit(size, material):
    """NEC 240.4(D) device limit [A] of a small conductor, or None.

    >>> _small_conductor_limit("14 AWG", "cu"), _small_conductor_limit("8 AWG", "cu")
    (15.0, None)
    """
    limit = SMALL_CONDUCTOR_LIMITS_A.get((_material(material), _label(size)))
    return None if limit is None else float(limit)


def next_standard_rating(current):
    """The smallest NEC 240.6(A) standard rating at or above a current.

    Parameters
    ----------
    current : float
        Current [A].

    Returns
    -------
    float or None
        Rating [A]; None above the largest (6000 A).

    Notes
    -----
    A look-up in protection.NEC_STANDARD_RATINGS_A.

    References
    ----------
    NEC 240.6(A) (read, as reproduced: see protection.NEC_STANDARD_RATINGS_A).

    Examples
    --------
    >>> next_standard_rating(37.5), next_standard_rating(40)
    (40.0, 40.0)
    """
    ratings = protection.NEC_STANDARD_RATINGS_A
    index = bisect.bisect_left(ratings, current * (1 - 1e-9))
    return float(ratings[index]) if index < len(ratings) else None


def largest_device(ampacity, small_limit=None):
    """The largest overcurrent device NEC 240.4 lets protect a conductor.

    Parameters
    ----------
    ampacity : float
        The conductor's ampacity after every correction and terminal limit [A].
    small_limit : float or None
        Its 240.4(D) limit [A], if any.

    Returns
    -------
    float
        Rating [A].

    Notes
    -----
    The ampacity, or the next standard rating above it where that is not over 800 A (240.4(B));
    over 800 A the ampacity itself (240.4(C)); never above the 240.4(D) limit.

    References
    ----------
    NEC 240.4(B), (C), (D), 240.6(A): read, as reproduced (mjk83093/sil NEC2017_Chapter_2.md).

    Examples
    --------
    >>> largest_device(25.0), largest_device(25.0, 20.0), largest_device(850.0)
    (25.0, 20.0, 850.0)
    """
    rounded = next_standard_rating(ampacity)
    allowed = rounded if rounded is not None and rounded <= NEXT_SIZE_UP_LIMIT_A else ampacity
    return allowed if small_limit is None else min(allowed, small_limit)


class NecAmpacity(NamedTuple):
    """A conductor's ampacity by NEC 310 with 110.14(C) and 240.4(D) beside it."""

    table_a: float  # Table 310.16 at the conductor's own rating [A]
    ambient_factor: float  # 310.15(B)(1) [-]
    adjustment_factor: float  # 310.15(C)(1) [-]
    corrected_a: float  # table_a × both factors [A]
    terminal_c: int  # the column the terminations allow [°C]
    terminal_a: float  # Table 310.16 in that column, uncorrected [A]
    ampacity_a: float  # the smaller of corrected_a and terminal_a [A]
    small_conductor_a: float | None  # 240.4(D) device limit [A]


def nec_ampacity(size, material, insulation_c, ambient_c, conductor_count, terminal_c=None):
    """A conductor's ampacity in North American practice, every factor and limit applied.

    Parameters
    ----------
    size : calc.units.ConductorSize or str
        AWG or kcmil size.
    material : str
        "cu" or "al".
    insulation_c : int
        The conductor's temperature rating, 60, 75 or 90 [°C].
    ambient_c : float
        Ambient temperature [°C].
    conductor_count : int
        Current-carrying conductors in the raceway or cable.
    terminal_c : int or None
        The terminations' listed rating [°C]; None applies 110.14(C)(1) by size.

    Returns
    -------
    NecAmpacity
        Table value, both factors, corrected value, terminal column and value, ampacity and the
        240.4(D) limit.

    Raises
    ------
    calc.errors.ParameterError
        On "size", "material", "insulation_c", "terminal_c", "ambient_c" or
        "conductor_count", saying what is allowed.

    Notes
    -----
    I = min(I_table(T_insulation) × k_ambient × k_adjust, I_table(T_terminal)): correction and
    adjustment may start from the conductor's own column, but the load at the terminations may
    not exceed the terminal column's ampacity (110.14(C)).

    References
    ----------
    NEC Table 310.16, 310.15(B)(1), 310.15(C)(1), 110.14(C), 240.4(D): read, as reproduced.

    Examples
    --------
    >>> a = nec_ampacity("12 AWG", "cu", 90, 40, 6)
    >>> round(a.corrected_a, 2), a.terminal_a, a.ampacity_a
    (21.84, 20.0, 20.0)
    """
    _column(insulation_c, "insulation_c")
    if terminal_c is not None:
        _column(terminal_c, "terminal_c")
    table = _table_ampacity(size, material, insulation_c)
    ambient = _nec_ambient(ambient_c, insulation_c)
    adjustment = _nec_adjustment(conductor_count)
    corrected = table * ambient * adjustment
    column = _terminal_column(size, insulation_c, terminal_c)
    terminal = _table_ampacity(size, material, column)
    return NecAmpacity(table, ambient, adjustment, corrected, column, terminal,
                       min(corrected, terminal), _small_conductor_limit(size, material))


# ==== NEC Article 430 ========================================================================

def motor_device_limit(full_load_current, device_type, motor_design="standard"):
    """NEC Table 430.52: the largest short-circuit and ground-fault device for a motor branch.

    Parameters
    ----------
    full_load_current : float
        The motor's full-load current from NEC Table 430.248 / 430.250 [A].
    device_type : str
        "inverse-time", "instantaneous", "fuse-time-delay" or "fuse-non-time-delay".
    motor_design : str
        "standard", "design-b-ee" or "wound-rotor" (see NEC_430_52_PCT).

    Returns
    -------
    tuple of (int, float, float or None)
        The percentage [%], the value it gives [A] (a setting, for an instantaneous-trip
        breaker) and the next standard rating above it [A] that 430.52(C)(1) Exception No. 1
        allows (None for an instantaneous-trip breaker).

    Raises
    ------
    calc.errors.ParameterError
        On "device_type" or "motor_design".

    Notes
    -----
    I_max = pct × I_FL / 100.

    References
    ----------
    NEC Table 430.52, 430.52(C)(1) Exception No. 1: read, as reproduced (see NEC_430_52_PCT).

    Examples
    --------
    >>> motor_device_limit(28.0, "inverse-time"), motor_device_limit(15.2, "fuse-time-delay")
    ((250, 70.0, 70.0), (175, 26.6, 30.0))
    """
    if device_type not in MOTOR_DEVICE_COLUMNS:
        raise ParameterError("device_type", device_type, "Table 430.52 has columns for "
                             + ", ".join(MOTOR_DEVICE_COLUMNS))
    if motor_design not in NEC_430_52_PCT:
        raise ParameterError("motor_design", motor_design, "choose one of "
                             + ", ".join(NEC_430_52_PCT))
    pct = NEC_430_52_PCT[motor_design][MOTOR_DEVICE_COLUMNS[device_type]]
    value = round(pct * full_load_current / 100.0, 9)
    return pct, value, None if device_type == "instantaneous" else next_standard_rating(value)


def overload_limit(full_load_current, service_factor="1.15"):
    """NEC 430.32(A)(1): the largest trip current of a separate motor overload device.

    Parameters
    ----------
    full_load_current : float
        The motor's nameplate full-load current [A].
    service_factor : str
        "1.15" (1.15 or more, or a marked rise of 40 °C or less) or "1.0" (all others).

    Returns
    -------
    float
        Current [A].

    Raises
    ------
    calc.errors.ParameterError
        On "service_factor".

    Notes
    -----
    125 % or 115 % of the nameplate current.

    References
    ----------
    NEC 430.32(A)(1): read, as reproduced (see OVERLOAD_FACTORS).

    Examples
    --------
    >>> overload_limit(28.0), overload_limit(28.0, "1.0")
    (35.0, 32.2)
    """
    if service_factor not in OVERLOAD_FACTORS:
        raise ParameterError("service_factor", service_factor, "choose 1.15 (1.15 or more, or "
                             "a 40 °C rise) or 1.0 (all other motors)")
    return round(OVERLOAD_FACTORS[service_factor] * full_load_current, 9)


# ==== IEC ====================================================================================

def _iec_table(size, material, cable_insulation, loaded_conductors, method):
    """(capacity [A], table) from IEC 60364-5-52 Annex B; E is a multi-core cable in free air, F
    single-core cables touching (flat for two loaded conductors, trefoil for three).

    >>> _iec_table("2.5 mm2", "cu", "pvc", 2, "C"), _iec_table("16 mm2", "al", "xlpe", 3, "E")
    ((27.0, 'B.52.2'), (77.0, 'B.52.13'))
    """
    try:
        size = units.parse_conductor_size(size)
    except ValueError as error:
        raise ParameterError("size", size, str(error)) from None
    if cable_insulation not in IEC_INSULATION_C:
        raise ParameterError("cable_insulation", cable_insulation,
                             "the insulation is pvc (70 °C) or xlpe (90 °C)")
    if loaded_conductors not in (2, 3):
        raise ParameterError("loaded_conductors", loaded_conductors,
                             "the tables give two or three loaded conductors")
    if method not in IEC_METHODS:
        raise ParameterError("method", method, "reference methods: " + ", ".join(IEC_METHODS))
    columns = IEC_CAPACITY_A[(cable_insulation, loaded_conductors, _material(material))]
    if method not in columns:
        raise ParameterError("method", method, f"method {method} for aluminium is not tabulated "
                             "here (IEC Tables B.52.11 and B.52.13, single-core columns, not "
                             "confirmed); use method C or E, or the cable maker's rating")
    values = columns[method]
    index = next((i for i, mm2 in enumerate(IEC_SIZES_MM2)
                  if size.system == "mm2" and abs(mm2 - size.area_m2 * 1e6) < 1e-6), None)
    if index is None or values[index] is None:
        listed = [f"{mm2:g}" for mm2, value in zip(IEC_SIZES_MM2, values) if value is not None]
        metal = "aluminium" if material == "al" else "copper"
        raise ParameterError("size", size.label, f"IEC 60364-5-52 Annex B gives method {method} "
                             f"{metal} sizes {listed[0]} to {listed[-1]} mm² (metric only)")
    table = (IEC_FREE_AIR_TABLES[(cable_insulation, material)] if method in ("E", "F")
             else IEC_TABLE_NUMBERS[(cable_insulation, loaded_conductors)])
    return float(values[index]), table


def _iec_temperature(ambient_c, cable_insulation, method):
    """IEC Table B.52.14 (air) or B.52.15 (ground, methods D1 and D2) factor; between rows the
    hotter row, below 10 °C the 10 °C row (the safe side).

    >>> _iec_temperature(40, "pvc", "C"), _iec_temperature(25, "xlpe", "D2")
    (0.87, 0.96)
    """
    table = IEC_GROUND_FACTORS if method in IEC_GROUND_METHODS else IEC_AIR_FACTORS
    column = 1 if cable_insulation == "pvc" else 2
    for row in table:
        if ambient_c <= row[0]:
            if row[column] is None:
                break
            return row[column]
    hottest = max(row[0] for row in table if row[column] is not None)
    where = "ground" if method in IEC_GROUND_METHODS else "air"
    raise ParameterError("ambient_c", ambient_c, f"{cable_insulation.upper()} insulation has no "
                         f"rating above {hottest} °C {where} (IEC 60364-5-52); use XLPE or a "
                         "cooler route")


def _iec_grouping(circuits, method):
    """(factor, table) for a group of circuits by the method's arrangement (see GROUPING); a count
    between two columns takes the larger count's factor; single layers no further beyond nine.

    >>> _iec_grouping(3, "B2"), _iec_grouping(12, "C")
    ((0.7, 'B.52.17 item 1'), (0.7, 'B.52.17 item 2'))
    """
    if circuits < 1 or int(circuits) != circuits:
        raise ParameterError("circuits", circuits, "the number of circuits is a whole number, "
                             "1 or more")
    if method not in GROUPING_BY_METHOD:
        if circuits == 1:
            return 1.0, "none"
        raise ParameterError("circuits", circuits, f"grouping for method {method} (single-core "
                             "cables in free air, IEC Table B.52.21) is not given here; use the "
                             "cable maker's factor")
    arrangement = GROUPING_BY_METHOD[method]
    counts, factors = GROUPING[arrangement]
    table = GROUPING_TABLES[arrangement]
    if arrangement in SINGLE_LAYER:
        circuits = min(circuits, counts[-1])
    for count, factor in zip(counts, factors):
        if circuits <= count:
            return factor, table
    raise ParameterError("circuits", circuits, f"IEC Table {table} goes to {counts[-1]} circuits "
                         f"for method {method}")


class IecCapacity(NamedTuple):
    """A cable's current-carrying capacity by IEC 60364-5-52, with its factors."""

    table_a: float  # the Annex B value [A]
    table: str  # which table
    temperature_factor: float  # B.52.14 or B.52.15 [-]
    grouping_factor: float  # B.52.17 to B.52.19 [-]
    grouping_table: str
    capacity_a: float  # Iz [A]


def iec_capacity(size, material, cable_insulation, loaded_conductors, method, ambient_c,
                 circuits=1):
    """Iz: a cable's current-carrying capacity with its correction and grouping factors.

    Parameters
    ----------
    size : calc.units.ConductorSize or str
        Metric size.
    material : str
        "cu" or "al".
    cable_insulation : str
        "pvc" or "xlpe".
    loaded_conductors : int
        2 or 3.
    method : str
        Reference method.
    ambient_c : float
        Air (or ground, for D1 and D2) temperature [°C].
    circuits : int
        Circuits in the group, this one included.

    Returns
    -------
    IecCapacity
        The table value and table, both factors and Iz.

    Raises
    ------
    calc.errors.ParameterError
        On "size", "material", "cable_insulation", "loaded_conductors", "method", "ambient_c" or
        "circuits", saying what the tables hold.

    Notes
    -----
    Iz = I_table × k_temperature × k_group.

    References
    ----------
    IEC 60364-5-52:2009 Annex B, B.52.14 to B.52.19 (see the tables above).

    Examples
    --------
    >>> iec_capacity("2.5 mm2", "cu", "pvc", 2, "C", 40, 2).capacity_a
    19.9665
    """
    table_a, table = _iec_table(size, material, cable_insulation, loaded_conductors, method)
    temperature = _iec_temperature(ambient_c, cable_insulation, method)
    grouping, grouping_table = _iec_grouping(circuits, method)
    return IecCapacity(table_a, table, temperature, grouping, grouping_table,
                       round(table_a * temperature * grouping, 9))


# ==== protective conductors ==================================================================

# IEC 60364-5-54 Table 54.2: the least protective conductor of the line conductor's material,
# S ≤ 16 mm²: S; 16 < S ≤ 35: 16 mm²; S > 35: S / 2 (from memory, H). Or, 543.1.2 (from
# memory, H), by the adiabatic equation S = √(I² t) / k, with k for a core of the cable
# (Table A.54.3, from memory, M): copper PVC 115, XLPE/EPR 143; aluminium PVC 76, XLPE 94.
PE_TABLE_BANDS_MM2 = (16.0, 35.0)
ADIABATIC_K = {("cu", "pvc"): 115.0, ("cu", "xlpe"): 143.0, ("al", "pvc"): 76.0,
               ("al", "xlpe"): 94.0}


def iec_protective_minimum(area):
    """IEC 60364-5-54 Table 54.2: the smallest protective conductor for a line conductor.

    Parameters
    ----------
    area : float
        Line conductor cross-section [m²].

    Returns
    -------
    float
        Protective conductor cross-section [m²], of the same material.

    Notes
    -----
    S ≤ 16 mm²: S; 16 < S ≤ 35 mm²: 16 mm²; S > 35 mm²: S / 2.

    References
    ----------
    IEC 60364-5-54 Table 54.2 (from memory).

    Examples
    --------
    >>> round(iec_protective_minimum(25e-6) * 1e6, 6), round(iec_protective_minimum(95e-6) * 1e6, 6)
    (16.0, 47.5)
    """
    mm2 = area * 1e6
    low, high = PE_TABLE_BANDS_MM2
    return area if mm2 <= low else (low * 1e-6 if mm2 <= high else area / 2.0)


def adiabatic_minimum(fault_current, time, material, cable_insulation):
    """IEC 60364-5-54 543.1.2: the least protective conductor a fault's energy allows.

    Parameters
    ----------
    fault_current : float
        The fault current through the protective conductor [A].
    time : float
        The time the device takes to clear it [s].
    material : str
        "cu" or "al".
    cable_insulation : str
        "pvc" or "xlpe".

    Returns
    -------
    float
        Cross-section [m²].

    Raises
    ------
    calc.errors.ParameterError
        On "material" or "cable_insulation".

    Notes
    -----
    S = √(I² t) / k, S in mm² with I in A and t in s.

    References
    ----------
    IEC 60364-5-54 543.1.2 and Table A.54.3 (from memory).

    Examples
    --------
    >>> round(adiabatic_minimum(1000.0, 0.1, "cu", "pvc") * 1e6, 3)
    2.75
    """
    key = (_material(material), cable_insulation)
    if key not in ADIABATIC_K:
        raise ParameterError("cable_insulation", cable_insulation, "the insulation is pvc or xlpe")
    return (fault_current * fault_current * time) ** 0.5 / ADIABATIC_K[key] * 1e-6


def proportional_egc(table_area, phase_area, minimum_phase_area):
    """NEC 250.122(B): the equipment grounding conductor of upsized circuit conductors.

    Parameters
    ----------
    table_area : float
        The EGC Table 250.122 asks for the device [m²].
    phase_area : float
        The ungrounded conductors installed [m²].
    minimum_phase_area : float
        The smallest conductor with ampacity enough for the installation [m²].

    Returns
    -------
    float
        The EGC cross-section required [m²], never above the phase conductors' (250.122(A)).

    Notes
    -----
    A_EGC = A_table × A_phase / A_min when A_phase > A_min.

    References
    ----------
    NEC 250.122(B) and (A) (from memory; Table 250.122 read, see protection.NEC_250_122).

    Examples
    --------
    >>> round(proportional_egc(3.31e-6, 5.26e-6, 3.31e-6) * 1e6, 3)
    5.26
    """
    ratio = max(1.0, phase_area / minimum_phase_area)
    return min(table_area * ratio, phase_area)
