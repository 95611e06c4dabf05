"""calc.ampacity and the ampacity calculator: NEC Table 310.16 rows of both metals in all three
columns, its ambient and adjustment factors, terminals and small conductors; IEC 60364-5-52
Annex B rows for methods B1, C and E (and the others), its temperature and grouping factors;
every band edge just inside and just outside; the tables' own shape; one test per error path."""

import itertools

import pytest

from calc import ampacity, units
from calc.calculators import ampacity as ampacity_calculator
from calc.errors import ParameterError
from tests.conftest import check_message, checks, errors, run, values


def nec(size, material="cu", column=75, ambient=30, count=3, terminal=None):
    return ampacity.nec_ampacity(size, material, column, ambient, count, terminal)


# ---- NEC Table 310.16 ---------------------------------------------------------------------------

# NEC Table 310.16 (2014/2017: 310.15(B)(16)), read as reproduced in the NEC 2017 text
# (mjk83093/sil NEC2017_Chapter_3.md) and in urdans/eecalcs ConductorProperties.java (NEC 2014):
# (size, copper 60/75/90 °C, aluminium 60/75/90 °C); both copies agree in these cells.
TABLE_310_16_ROWS = [
    ("14 AWG", 15, 20, 25, None, None, None),
    ("12 AWG", 20, 25, 30, 15, 20, 25),
    ("10 AWG", 30, 35, 40, 25, 30, 35),
    ("4 AWG", 70, 85, 95, 55, 65, 75),
    ("1 AWG", 110, 130, 145, 85, 100, 115),
    ("1/0 AWG", 125, 150, 170, 100, 120, 135),
    ("4/0 AWG", 195, 230, 260, 150, 180, 205),
    ("250 kcmil", 215, 255, 290, 170, 205, 230),
    ("500 kcmil", 320, 380, 430, 260, 310, 350),
    ("1000 kcmil", 455, 545, 615, 375, 445, 500),
    ("2000 kcmil", 555, 665, 750, 470, 560, 630),
]


@pytest.mark.parametrize("row", TABLE_310_16_ROWS, ids=lambda r: r[0])
def test_table_310_16_rows_both_metals_all_columns(row):
    size, *cells = row
    for (material, column), expected in zip(itertools.product(("cu", "al"), (60, 75, 90)), cells):
        if expected is None:
            with pytest.raises(ParameterError, match="lists"):
                nec(size, material, column)
        else:
            assert nec(size, material, column).table_a == expected  # exact table figures


def test_table_310_16_has_the_shape_of_an_ampacity_table():
    """A mistyped cell shows: every column grows with size, 60 ≤ 75 ≤ 90, aluminium ≤ copper."""
    rows = list(ampacity.NEC_310_16.values())
    for index in range(6):
        column = [row[index] for row in rows if row[index] is not None]
        assert column == sorted(column)
    for row in rows:
        for metal in (row[:3], row[3:]):
            present = [cell for cell in metal if cell is not None]
            assert present == sorted(present)
        for cu, al in zip(row[:3], row[3:]):
            assert al is None or al <= cu


# NEC 310.15(B)(1) (2017: Table 310.15(B)(2)(a)), read in the same two copies: (ambient °C, column,
# factor) at each band's edges — the band's hottest ambient inside, and just above it the next.
AMBIENT_EDGES = [
    (10, 60, 1.29), (10.01, 60, 1.22), (30, 75, 1.00), (30.01, 75, 0.94), (40, 90, 0.91),
    (40.01, 90, 0.87), (55, 60, 0.41), (70, 75, 0.33), (85, 90, 0.29), (-20, 90, 1.15),
]


@pytest.mark.parametrize("ambient, column, factor", AMBIENT_EDGES)
def test_ambient_correction_at_the_band_edges(ambient, column, factor):
    assert nec("12 AWG", column=column, ambient=ambient).ambient_factor == factor


@pytest.mark.parametrize("ambient, column", [(55.01, 60), (70.01, 75), (85.01, 90)])
def test_no_ampacity_past_the_table(ambient, column):
    with pytest.raises(ParameterError, match="no ampacity above") as caught:
        nec("12 AWG", column=column, ambient=ambient)
    assert caught.value.parameter == "ambient_c"


# NEC 310.15(C)(1) (2017: Table 310.15(B)(3)(a)), read in the same two copies.
ADJUSTMENT_EDGES = [(1, 1.0), (3, 1.0), (4, 0.8), (6, 0.8), (7, 0.7), (9, 0.7), (10, 0.5),
                    (20, 0.5), (21, 0.45), (30, 0.45), (31, 0.4), (40, 0.4), (41, 0.35), (90, 0.35)]


@pytest.mark.parametrize("count, factor", ADJUSTMENT_EDGES)
def test_adjustment_at_the_band_edges(count, factor):
    assert nec("12 AWG", count=count).adjustment_factor == factor


@pytest.mark.parametrize("count", [0, 2.5, -3])
def test_a_count_must_be_a_whole_number_from_one(count):
    with pytest.raises(ParameterError, match="whole number") as caught:
        nec("12 AWG", count=count)
    assert caught.value.parameter == "conductor_count"


def test_terminals_by_size_110_14_c():
    # 110.14(C)(1)(a): 14 to 1 AWG use the 60 °C column; (b) larger the 75 °C (read)
    assert nec("1 AWG", column=90).terminal_c == 60
    assert nec("1/0 AWG", column=90).terminal_c == 75
    assert nec("12 AWG", column=90, terminal=75).terminal_c == 75  # listed equipment
    assert nec("12 AWG", column=60, terminal=90).terminal_c == 60  # never above the conductor
    hot = nec("12 AWG", column=90, ambient=40, count=6)  # the docstring's example, by hand
    assert hot.corrected_a == pytest.approx(30 * 0.91 * 0.8, rel=1e-12)
    assert hot.ampacity_a == 20  # the 60 °C terminals govern


@pytest.mark.parametrize("size, material, limit", [
    ("18 AWG", "cu", 7), ("16 AWG", "cu", 10), ("14 AWG", "cu", 15), ("12 AWG", "al", 15),
    ("12 AWG", "cu", 20), ("10 AWG", "al", 25), ("10 AWG", "cu", 30), ("8 AWG", "cu", None)])
def test_small_conductor_limits_240_4_d(size, material, limit):
    # NEC 240.4(D)(1)-(7), read as reproduced (NEC 2017 text); 12 AWG aluminium from memory
    column = 90 if size in ("18 AWG", "16 AWG") else 75
    terminal = 90 if column == 90 else None
    if material == "al" and size == "12 AWG":
        assert nec(size, material).small_conductor_a == limit
    else:
        assert nec(size, material, column, terminal=terminal).small_conductor_a == limit


def test_next_size_up_ends_at_800_a_240_4_b_and_c():
    assert ampacity.largest_device(760.0) == 800  # 240.4(B): the next standard rating
    assert ampacity.largest_device(800.0) == 800
    assert ampacity.largest_device(800.1) == 800.1  # 240.4(C): the ampacity itself
    assert ampacity.largest_device(24.0) == 25 and ampacity.largest_device(25.0) == 25
    assert ampacity.largest_device(25.0, 20.0) == 20  # 240.4(D) caps it
    assert ampacity.next_standard_rating(6000.0) == 6000
    assert ampacity.next_standard_rating(6001) is None


def test_nec_errors_name_their_parameter():
    for call, parameter in [(lambda: nec("2.5 mm2"), "size"),
                            (lambda: nec("12 AWG", "fe"), "material"),
                            (lambda: nec("12 AWG", column=80), "insulation_c"),
                            (lambda: nec("12 AWG", terminal=65), "terminal_c"),
                            (lambda: nec("nonsense"), "size")]:
        with pytest.raises(ParameterError) as caught:
            call()
        assert caught.value.parameter == parameter and caught.value.message


# ---- NEC Article 430 ---------------------------------------------------------------------------

@pytest.mark.parametrize("device, design, pct", [
    ("fuse-non-time-delay", "standard", 300), ("fuse-time-delay", "standard", 175),
    ("instantaneous", "standard", 800), ("inverse-time", "standard", 250),
    ("instantaneous", "design-b-ee", 1100), ("inverse-time", "wound-rotor", 150)])
def test_table_430_52_percentages(device, design, pct):
    # NEC Table 430.52, read as reproduced (NEC 2017 text, mjk83093/sil NEC2017_Chapter_4.md)
    found, value, rounded = ampacity.motor_device_limit(20.0, device, design)
    assert found == pct and value == pytest.approx(pct * 0.2, rel=1e-12)
    assert rounded is None if device == "instantaneous" else rounded >= value


def test_430_52_exception_rounds_up_to_the_next_standard_rating():
    # 10 hp 208 V: 30.8 A (Table 430.250, read); 250 % = 77 A; the next standard rating 80 A
    assert ampacity.motor_device_limit(30.8, "inverse-time") == (250, 77.0, 80.0)
    assert ampacity.motor_device_limit(32.0, "inverse-time") == (250, 80.0, 80.0)  # already standard


def test_overload_430_32_and_errors():
    assert ampacity.overload_limit(16.0) == 20.0 and ampacity.overload_limit(16.0, "1.0") == 18.4
    with pytest.raises(ParameterError, match="1.15"):
        ampacity.overload_limit(16.0, "1.25")
    with pytest.raises(ParameterError) as caught:
        ampacity.motor_device_limit(10.0, "mcb-b")
    assert caught.value.parameter == "device_type"
    with pytest.raises(ParameterError) as caught:
        ampacity.motor_device_limit(10.0, "inverse-time", "synchronous-x")
    assert caught.value.parameter == "motor_design"


# ---- IEC 60364-5-52 Annex B ---------------------------------------------------------------------

def iec(size, material="cu", insulation="pvc", loaded=2, method="C", ambient=30, circuits=1):
    return ampacity.iec_capacity(size, material, insulation, loaded, method, ambient, circuits)


# IEC 60364-5-52:2009 Annex B, from memory: (table, insulation, loaded, material, method, size,
# A).
ANNEX_B_ROWS = [
    ("B.52.2", "pvc", 2, "cu", "B1", "2.5 mm2", 24), ("B.52.2", "pvc", 2, "cu", "C", "300 mm2", 530),
    ("B.52.2", "pvc", 2, "al", "B1", "16 mm2", 60), ("B.52.3", "xlpe", 2, "cu", "B1", "95 mm2", 306),
    ("B.52.3", "xlpe", 2, "cu", "C", "1.5 mm2", 24), ("B.52.3", "xlpe", 2, "al", "C", "25 mm2", 101),
    ("B.52.4", "pvc", 3, "cu", "B1", "10 mm2", 50), ("B.52.4", "pvc", 3, "cu", "C", "16 mm2", 76),
    ("B.52.4", "pvc", 3, "al", "C", "120 mm2", 197), ("B.52.5", "xlpe", 3, "cu", "B1", "240 mm2", 450),
    ("B.52.5", "xlpe", 3, "cu", "C", "4 mm2", 40), ("B.52.5", "xlpe", 3, "al", "B1", "150 mm2", 267),
    ("B.52.4", "pvc", 3, "cu", "D1", "120 mm2", 192), ("B.52.2", "pvc", 2, "cu", "A1", "6 mm2", 34),
    ("B.52.10", "pvc", 2, "cu", "E", "35 mm2", 148), ("B.52.10", "pvc", 3, "cu", "E", "2.5 mm2", 25),
    ("B.52.11", "pvc", 2, "al", "E", "50 mm2", 135), ("B.52.11", "pvc", 3, "al", "E", "95 mm2", 183),
    ("B.52.12", "xlpe", 2, "cu", "E", "300 mm2", 741),
    ("B.52.12", "xlpe", 3, "cu", "E", "70 mm2", 246),
    ("B.52.13", "xlpe", 3, "al", "E", "16 mm2", 77), ("B.52.10", "pvc", 3, "cu", "F", "95 mm2", 264),
    ("B.52.12", "xlpe", 2, "cu", "F", "25 mm2", 161),
]


@pytest.mark.parametrize("row", ANNEX_B_ROWS, ids=lambda r: f"{r[0]} {r[4]} {r[5]} {r[3]}")
def test_annex_b_rows_for_methods_b1_c_e_and_others(row):
    table, insulation, loaded, material, method, size, expected = row
    found = iec(size, material, insulation, loaded, method)
    assert (found.table_a, found.table) == (expected, table)


def test_annex_b_has_the_shape_of_an_ampacity_table():
    """Mistyped cells show: capacities grow with size; XLPE ≥ PVC; two loaded ≥ three; copper ≥
    aluminium; in conduit in an insulated wall (A1) is never above on a wall (B1) or clipped
    direct (C). (C may fall below B1 from 25 mm²: its larger sizes are shaped multi-core cores.)"""
    for (insulation, loaded, material), columns in ampacity.IEC_CAPACITY_A.items():
        for method, cells in columns.items():
            present = [cell for cell in cells if cell is not None]
            assert present == sorted(present), (insulation, loaded, material, method)
            swapped = "xlpe" if insulation == "pvc" else "pvc"
            other = ampacity.IEC_CAPACITY_A[(swapped, loaded, material)]
            three = ampacity.IEC_CAPACITY_A.get((insulation, 3, material), {}).get(method)
            for i, cell in enumerate(cells):
                if cell is None:
                    continue
                if insulation == "pvc" and other.get(method) and other[method][i]:
                    assert other[method][i] >= cell
                if loaded == 2 and three and three[i]:
                    assert cell >= three[i]
                if material == "al":
                    copper = ampacity.IEC_CAPACITY_A[(insulation, loaded, "cu")][method][i]
                    assert copper is None or copper >= cell
            if method in ("B1", "C"):
                assert all(c >= w for c, w in zip(cells, columns["A1"]) if c and w)


# IEC 60364-5-52:2009 Table B.52.14 (air, 30 °C) and B.52.15 (ground, 20 °C), from memory.
@pytest.mark.parametrize("ambient, insulation, method, factor", [
    (30, "pvc", "C", 1.0), (30.01, "pvc", "C", 0.94), (60, "pvc", "C", 0.50), (80, "xlpe", "E", 0.41),
    (5, "pvc", "C", 1.22), (20, "pvc", "D2", 1.0), (20.01, "pvc", "D2", 0.95), (60, "pvc", "D1", 0.45),
    (80, "xlpe", "D2", 0.38), (40, "xlpe", "B1", 0.91)])
def test_temperature_factors_at_the_row_edges(ambient, insulation, method, factor):
    assert iec("10 mm2", "cu", insulation, 3, method, ambient).temperature_factor == factor


@pytest.mark.parametrize("ambient, insulation, method", [(60.01, "pvc", "C"), (80.01, "xlpe", "E"),
                                                         (60.01, "pvc", "D2")])
def test_no_capacity_past_the_temperature_tables(ambient, insulation, method):
    with pytest.raises(ParameterError, match="no rating above") as caught:
        iec("10 mm2", "cu", insulation, 3, method, ambient)
    assert caught.value.parameter == "ambient_c"


# IEC 60364-5-52:2009 Table B.52.17 items 1, 2 and 4, B.52.18 and B.52.19, from memory.
@pytest.mark.parametrize("method, circuits, factor", [
    ("B2", 1, 1.0), ("B2", 2, 0.80), ("A1", 9, 0.50), ("B1", 10, 0.45), ("B1", 12, 0.45),
    ("B1", 13, 0.41), ("B1", 20, 0.38), ("C", 9, 0.70), ("C", 15, 0.70), ("E", 3, 0.82),
    ("E", 9, 0.72), ("D2", 2, 0.75), ("D2", 6, 0.50), ("D1", 6, 0.60), ("F", 1, 1.0)])
def test_grouping_factors_at_the_column_edges(method, circuits, factor):
    assert iec("25 mm2", method=method, circuits=circuits, loaded=3).grouping_factor == factor


@pytest.mark.parametrize("method, circuits, words", [
    ("B1", 21, "goes to 20"), ("D2", 7, "goes to 6"), ("F", 2, "B.52.21"), ("C", 1.5, "whole number")])
def test_grouping_past_the_tables_is_refused(method, circuits, words):
    with pytest.raises(ParameterError, match=words) as caught:
        iec("25 mm2", method=method, circuits=circuits, loaded=3)
    assert caught.value.parameter == "circuits"


@pytest.mark.parametrize("args, parameter, words", [
    (("12 AWG",), "size", "metric only"), (("1.5 mm2", "al"), "size", "2.5 to 300"),
    (("25 mm2", "al", "pvc", 3, "F"), "method", "not tabulated"),
    (("4 mm2", "al", "pvc", 2, "D2"), "size", "16 to 300"),
    (("25 mm2", "cu", "rubber"), "cable_insulation", "pvc"),
    (("25 mm2", "cu", "pvc", 4), "loaded_conductors", "two or three"),
    (("25 mm2", "cu", "pvc", 3, "G"), "method", "A1, A2"), (("25 mm2", "fe"), "material", "cu or al"),
    (("16 mm2", "cu", "pvc", 3, "F"), "size", "25 to 300")])
def test_iec_errors_name_their_parameter(args, parameter, words):
    with pytest.raises(ParameterError, match=words) as caught:
        iec(*args)
    assert caught.value.parameter == parameter


def test_iec_capacity_multiplies_the_factors():
    # Table B.52.2 C 27 A x B.52.14 PVC 40 °C 0.87 x B.52.17 item 2, two circuits 0.85 (by hand)
    found = iec("2.5 mm2", ambient=40, circuits=2).capacity_a
    assert found == pytest.approx(27 * 0.87 * 0.85, rel=1e-12)


# ---- protective conductors --------------------------------------------------------------------

@pytest.mark.parametrize("line_mm2, pe_mm2", [(2.5, 2.5), (16, 16), (16.5, 16), (25, 16), (35, 16),
                                              (35.5, 17.75), (95, 47.5)])
def test_table_54_2_at_its_band_edges(line_mm2, pe_mm2):
    # IEC 60364-5-54 Table 54.2 (from memory): S ≤ 16: S; ≤ 35: 16; above: S / 2
    assert ampacity.iec_protective_minimum(line_mm2 * 1e-6) == pytest.approx(pe_mm2 * 1e-6, rel=1e-12)


def test_adiabatic_equation_and_proportional_egc():
    # S = √(I² t) / k: 1000 A for 0.1 s, k 115 (copper PVC, from memory) -> 2.7497 mm² by hand
    assert ampacity.adiabatic_minimum(1000, 0.1, "cu", "pvc") == pytest.approx(2.7497e-6, rel=1e-4)
    assert ampacity.adiabatic_minimum(1000, 0.1, "al", "xlpe") == pytest.approx(
        316.228 / 94 * 1e-6, rel=1e-5)
    with pytest.raises(ParameterError) as caught:
        ampacity.adiabatic_minimum(1000, 0.1, "cu", "rubber")
    assert caught.value.parameter == "cable_insulation"
    twelve, ten, six = (units.CONDUCTOR_SIZES[s].area_m2 for s in ("12 AWG", "10 AWG", "6 AWG"))
    # 250.122(B): in proportion to the upsizing
    assert ampacity.proportional_egc(twelve, ten, twelve) == pytest.approx(ten, rel=1e-12)
    assert ampacity.proportional_egc(ten, twelve, twelve) == twelve  # 250.122(A): not above the line
    assert ampacity.proportional_egc(twelve, six, ten) == pytest.approx(twelve * six / ten, rel=1e-12)


# ---- the calculator -----------------------------------------------------------------------------

def test_calculator_nec_and_iec_results():
    hot = values(run("ampacity", practice="nec", size="12 AWG", insulation_temp_c=90, ambient_c=40,
                     current_carrying=6))
    assert hot["ampacity_a"] == 20 and hot["corrected_a"] == pytest.approx(21.84, rel=1e-12)
    assert hot["max_device_a"] == 20  # 240.4(D)
    result = run("ampacity", practice="iec", size="2.5 mm2", insulation_temp_c=70, installation="B2",
                 current_carrying=3, grouped=4)
    assert values(result)["ampacity_a"] == pytest.approx(20 * 0.65, rel=1e-12)  # B.52.4 B2, item 1
    assert "terminal_a" not in values(result) and "max_device_a" not in values(result)
    assert "B.52.4" in check_message(result, "ampacity_basis")
    steps = " ".join(step["text"] for step in result["steps"])
    assert "B.52.14" in steps and "B.52.17" in steps


def test_calculator_says_which_limit_governs():
    assert "60 °C terminal column governs" in check_message(
        run("ampacity", size="12 AWG", insulation_temp_c=90), "ampacity_basis")
    assert "corrected value governs" in check_message(
        run("ampacity", size="12 AWG", insulation_temp_c=90, ambient_c=50, current_carrying=9),
        "ampacity_basis")


@pytest.mark.parametrize("ambient, status",
                         [(-30, "pass"), (-30.5, "warn"), (70, "pass"), (70.5, "warn")])
def test_plausibility_of_the_ambient(ambient, status):
    assert ampacity_calculator.AMBIENT_USUAL_C == (-30.0, 70.0)
    result = run("ampacity", size="10 AWG", insulation_temp_c=90, ambient_c=ambient)
    assert checks(result)["plausibility"] == status


def test_plausibility_of_fixture_wire():
    result = run("ampacity", size="16 AWG", insulation_temp_c=90, terminal_temp_c="90")
    assert checks(result)["plausibility"] == "warn"
    assert "fixture" in check_message(result, "plausibility")


@pytest.mark.parametrize("inputs, field", [
    ({"practice": "iec", "insulation_temp_c": 75, "size": "4 mm2"}, "insulation_temp_c"),
    ({"practice": "nec", "current_carrying": 2.5}, "current_carrying"),
    ({"practice": "iec", "size": "4 mm2", "grouped": 30}, "grouped"),
    ({"practice": "iec", "size": "4 mm2", "material": "al", "installation": "F",
      "insulation_temp_c": 70}, "installation"),
    ({"practice": "nec", "ambient_c": 60, "insulation_temp_c": 60}, "ambient_c"),
])
def test_calculator_errors_name_the_field(inputs, field):
    assert field in errors("ampacity", **inputs)
