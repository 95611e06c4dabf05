"""conductor: published resistances, skin effect against an exact solution, reactance, the
thresholds of its checks, errors."""

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calc import api, conductors, units
from calc.calculators import conductor as view
from calc.errors import ParameterError
from tests.conftest import check_message, checks, errors, values
from tests.conftest import run as run_calculator

KFT = 304.8  # metres in 1000 ft


def run(**inputs):
    return run_calculator("conductor", **inputs)


def per_kft(value):
    return value * KFT


# --- DC resistance against published tables ---------------------------------------------------

# NEC Chapter 9 Table 8, stranded, 75 °C [Ω/kft] (read, as reproduced from the 2011 edition).
# 2 %: the table is given to 3 significant figures and ρ75 × 1000 / cmil × 1.02 (IEC 60028 ρ and
# α, the 1.02 lay factor; computed) reproduces it within 1 %; the rest allows for the NEC's
# rounded areas.
TABLE8_READ = [(size, cu, al) for size, cu, al in [
    ("14 AWG", 3.14, 5.17), ("12 AWG", 1.98, 3.25), ("10 AWG", 1.24, 2.04),
    ("8 AWG", 0.778, 1.28), ("6 AWG", 0.491, 0.808), ("4 AWG", 0.308, 0.508),
    ("3 AWG", 0.245, 0.403), ("2 AWG", 0.194, 0.319), ("1 AWG", 0.154, 0.253),
    ("1/0 AWG", 0.122, 0.201), ("2/0 AWG", 0.0967, 0.159), ("3/0 AWG", 0.0766, 0.126),
    ("4/0 AWG", 0.0608, 0.100), ("250 kcmil", 0.0515, 0.0847), ("300 kcmil", 0.0429, 0.0707),
    ("350 kcmil", 0.0367, 0.0605), ("400 kcmil", 0.0321, 0.0529),
    ("500 kcmil", 0.0258, 0.0424)]]


@pytest.mark.parametrize("size, cu, al", TABLE8_READ)
def test_physics_reproduces_nec_table8_at_75c(size, cu, al):
    assert per_kft(conductors.dc_resistance(size, "cu", 75.0)) == pytest.approx(cu, rel=0.02)
    assert per_kft(conductors.dc_resistance(size, "al", 75.0)) == pytest.approx(al, rel=0.02)


def test_worst_physics_vs_table8_deviation_is_under_one_percent():
    # ρ/A × 1.02 reproduces NEC Chapter 9 Table 8's stranded columns within 1 % (computed check
    # against the 2011 edition's table, read as reproduced).
    worst = max(
        abs(per_kft(conductors.dc_resistance(size, material, 75.0)) / table - 1)
        for size, cu, al in TABLE8_READ for material, table in (("cu", cu), ("al", al))
    )
    assert worst < 0.01


@pytest.mark.parametrize("size", ["18 AWG", "16 AWG", "600 kcmil", "750 kcmil", "1000 kcmil"])
def test_physics_against_table8_values_from_memory(size):
    # NEC Chapter 9 Table 8 values held from memory (calc/conductors.py); same 2 % as above.
    for material, table in (("cu", conductors.NEC_TABLE8_CU_STRANDED_75C),
                            ("al", conductors.NEC_TABLE8_AL_STRANDED_75C)):
        if size in table:
            computed = per_kft(conductors.dc_resistance(size, material, 75.0))
            assert computed == pytest.approx(table[size], rel=0.02)


@pytest.mark.parametrize("table, material", [
    (conductors.IEC60228_CLASS2_CU_20C, "cu"), (conductors.IEC60228_CLASS2_AL_20C, "al")])
def test_physics_lies_below_the_iec60228_class2_maxima(table, material):
    # IEC 60228 Table 2 values are maxima (read, as reproduced): tabulated / (ρ20/A) is mostly
    # 1.05-1.07 for Cu, but 1.12 (Cu) and 1.13 (Al) at 50 mm², whose real area is below nominal
    # (computed here). Tested only to the 1.04-1.14 band: a ρ/A calculation cannot be held to a
    # table of maxima closer than about 8 %.
    for label, maximum in table.items():
        size = units.parse_conductor_size(label)
        plain = conductors.RESISTIVITY_20C[material] / size.area_m2 * 1e3  # Ω/km, no lay factor
        assert 1.04 <= maximum / plain <= 1.14, label
        assert conductors.dc_resistance(size, material, 20.0) * 1e3 < maximum, label


def test_class1_solid_differs_from_class2_from_185_mm2():
    # IEC 60228 Table 1 vs Table 2 copper (read, as reproduced): 0.101 vs 0.0991 at 185 mm² etc.
    for label, solid in conductors.IEC60228_CLASS1_CU_20C.items():
        assert solid > conductors.IEC60228_CLASS2_CU_20C[label]


@pytest.mark.parametrize("material, ratio", [("cu", 1.2162), ("al", 1.2217)])
def test_temperature_ratio_20_to_75c(material, ratio):
    # R75/R20 = 1 + α20 × 55 with IEC 60028 α20 = 0.00393 (Cu) and IEC 60889 0.00403 (Al)
    # (read, as reproduced in Agrawal, Industrial Power Engineering and Applications Handbook,
    # Table 30.1), computed to 5 figures.
    r20 = conductors.dc_resistance("4/0", material, 20.0)
    r75 = conductors.dc_resistance("4/0", material, 75.0)
    assert r75 / r20 == pytest.approx(ratio, rel=5e-5)


def test_table_method_uses_nec_note_alpha():
    # NEC Table 8 note 2: R2 = R1 [1 + 0.00323 (T2 − 75)]; 12 AWG Cu 1.98 Ω/kft at 75 °C ->
    # 1.98 × (1 − 0.00323 × 55) = 1.6283 Ω/kft at 20 °C (computed by hand).
    r20 = per_kft(conductors.dc_resistance("12 AWG", "cu", 20.0, "table"))
    assert r20 == pytest.approx(1.98 * (1 - 0.00323 * 55), rel=1e-12)


def test_table_method_uses_iec_annex_b_alpha():
    # IEC 60228 Annex B, α20 = 0.00393: 2.5 mm² Cu 7.41 Ω/km at 20 °C -> 8.8661 at 70 °C.
    r70 = conductors.dc_resistance("2.5 mm2", "cu", 70.0, "table") * 1e3
    assert r70 == pytest.approx(7.41 * (1 + 0.00393 * 50), rel=1e-12)


@settings(max_examples=100, deadline=None)
@given(size=st.sampled_from(units.SIZES), t1=st.floats(-40, 250), t2=st.floats(-40, 250),
       method=st.sampled_from(["physics", "table"]))
def test_resistance_grows_with_temperature(size, t1, t2, method):
    material = "cu"
    if method == "table" and conductors.table_resistance(size, material) is None:
        return
    low, high = sorted((t1, t2))
    r_low = conductors.dc_resistance(size, material, low, method)
    assert conductors.dc_resistance(size, material, high, method) >= r_low > 0


@settings(max_examples=100, deadline=None)
@given(system=st.sampled_from([units.AWG_SIZES + units.KCMIL_SIZES, units.METRIC_SIZES]),
       data=st.data(), temperature=st.floats(-40, 250))
def test_resistance_falls_with_size_and_aluminium_exceeds_copper(system, data, temperature):
    i = data.draw(st.integers(0, len(system) - 2))
    small, large = system[i], system[i + 1]
    assert (conductors.dc_resistance(large, "cu", temperature)
            < conductors.dc_resistance(small, "cu", temperature))
    made_in_al = small in conductors.IEC60228_CLASS2_AL_20C
    if units.parse_conductor_size(small).system != "mm2" or made_in_al:
        assert (conductors.dc_resistance(small, "al", temperature)
                > conductors.dc_resistance(small, "cu", temperature))


# --- Skin effect against the exact solution for a solid round wire ---------------------------

def _ber_bei(x, terms=40):
    """ber, bei and their derivatives from their power series (numpy, float64)."""
    k = np.arange(terms)
    fact = np.array([math.factorial(n) for n in range(2 * terms + 2)], dtype=float)
    sign = (-1.0) ** k
    half = x / 2
    ber_c = sign / fact[2 * k] ** 2
    bei_c = sign / fact[2 * k + 1] ** 2
    ber = np.sum(ber_c * half ** (4 * k))
    bei = np.sum(bei_c * half ** (4 * k + 2))
    dber = np.sum(ber_c[1:] * 4 * k[1:] * half ** (4 * k[1:] - 1)) / 2
    dbei = np.sum(bei_c * (4 * k + 2) * half ** (4 * k + 1)) / 2
    return ber, bei, dber, dbei


def exact_skin_ratio(x):
    """R_ac / R_dc of an isolated solid round wire: (x/2)(ber bei' − bei ber')/(ber'² + bei'²).

    S. Ramo, J. R. Whinnery, T. Van Duzer, Fields and Waves in Communication Electronics, 3rd
    ed., section 5.6 (internal impedance of a round wire) — from memory.
    """
    ber, bei, dber, dbei = _ber_bei(x)
    return x / 2 * (ber * dbei - bei * dber) / (dber ** 2 + dbei ** 2)


def test_exact_solution_limits():
    # Low x: 1 + x⁴/192 (the IEC formula's own limit); high x: x/(2√2) + 1/4 (the skin-depth
    # limit, Ramo et al. as above, from memory); 0.5 % because the neglected terms are O(1/x).
    assert exact_skin_ratio(0.3) == pytest.approx(1 + 0.3 ** 4 / 192, rel=1e-6)
    assert exact_skin_ratio(12.0) == pytest.approx(12.0 / (2 * math.sqrt(2)) + 0.25, rel=5e-3)


@pytest.mark.parametrize("x", [0.5, 1.0, 1.5, 2.0, 2.5, 2.8])
def test_iec_skin_formula_matches_the_exact_solution_up_to_2_8(x):
    # For a solid wire x_s² = 8πf/R' × 10⁻⁷ equals (r√(ωμ0/ρ))²; choose f to give x. The IEC
    # formula is an approximation; 0.3 % on R_ac/R_dc is what it achieves up to x_s = 2.8.
    rho, radius = conductors.RESISTIVITY_20C["cu"], 5e-3
    r_dc = rho / (math.pi * radius ** 2)
    frequency = x ** 2 * r_dc / (8 * math.pi * 1e-7)
    assert conductors.skin_argument(r_dc, frequency) == pytest.approx(x, rel=1e-12)
    iec = 1 + conductors.skin_effect_factor(r_dc, frequency)
    assert iec == pytest.approx(exact_skin_ratio(x), rel=3e-3)


def test_skin_effect_negligible_for_12_awg_noticeable_for_1000_kcmil():
    r12 = conductors.dc_resistance("12 AWG", "cu", 75.0)
    assert conductors.skin_effect_factor(r12, 60.0) < 0.01
    r1000 = conductors.dc_resistance("1000 kcmil", "cu", 75.0)
    y_s = conductors.skin_effect_factor(r1000, 60.0)
    assert 0.03 < y_s < 0.10
    # Independent: the exact solid-wire ratio at the same x_s (stranding aside).
    exact = exact_skin_ratio(conductors.skin_argument(r1000, 60.0))
    assert 1 + y_s == pytest.approx(exact, rel=3e-3)


def test_proximity_factor_worked_example():
    # IEC 60287-1-1 2.1.4 by hand: R' = 8.465e-5 Ω/m, 60 Hz -> F = 0.016264; d/s = 20.65/24.1,
    # (d/s)² = 0.73419; y_p = F × 0.73419 × (0.312 × 0.73419 + 1.18/(F + 0.27)) = 0.05212.
    y_p = conductors.proximity_effect_factor(8.465e-5, 60.0, 20.65e-3, 24.1e-3)
    assert y_p == pytest.approx(0.05212, rel=1e-3)


# --- Reactance --------------------------------------------------------------------------------

# NEC Chapter 9 Table 9, XL [Ω/kft] PVC conduit, and Z at 0.85 pf for uncoated copper in PVC
# conduit (from memory). Table 9 is rounded to 2 significant figures (Z) and 3 decimals (XL).
TABLE9_Z085_PVC_CU = {"12 AWG": 1.7, "10 AWG": 1.1, "4/0 AWG": 0.074, "500 kcmil": 0.043}


def test_table9_steel_over_pvc_ratio_is_about_1_25():
    # Each Table 9 row (from memory) has steel/PVC XL within 1.20-1.30: the factor is 1.25.
    for pvc, steel in conductors.NEC_TABLE9_XL.values():
        assert 1.20 <= steel / pvc <= 1.30


@pytest.mark.parametrize("size", list(conductors.NEC_TABLE9_XL))
def test_geometric_reactance_against_table9(size):
    # Touching THHN conductors in trefoil give 30-45 % less X than Table 9's (RHH, cradled) XL.
    # Band stated rather than a 15 % match: the table's basis is thicker insulation and looser
    # lay than touching THHN, and it is rounded to 0.001 Ω/kft (about 2 %).
    out = values(run(size=size))
    ratio = per_kft(out["x"]) / conductors.NEC_TABLE9_XL[size][0]
    assert 0.55 <= ratio <= 0.70


@pytest.mark.xfail(reason="known gap: touching-THHN geometry is 30-45 % below NEC Table 9 XL; "
                          "the table's spacing basis (RHH, cradled) is not modelled", strict=True)
def test_geometric_reactance_within_15_percent_of_table9():
    out = values(run(size="500 kcmil"))
    assert per_kft(out["x"]) == pytest.approx(0.039, rel=0.15)


@pytest.mark.parametrize("size, z", TABLE9_Z085_PVC_CU.items())
def test_table_method_reproduces_table9_effective_z(size, z):
    # Method table: Table 8 R with IEC skin/proximity, Table 9 XL. Within 5 %: Table 9's Z is
    # given to 2 significant figures (up to 3 % rounding) and its R_ac basis differs slightly.
    out = values(run(size=size, method="table"))
    assert per_kft(out["z_085"]) == pytest.approx(z, rel=0.05)


def test_steel_conduit_raises_x_by_1_25_and_r_ac():
    pvc = values(run(size="500 kcmil"))
    steel = values(run(size="500 kcmil", raceway="steel"))
    assert steel["x"] == pytest.approx(1.25 * pvc["x"], rel=1e-12)
    assert steel["r_ac"] > pvc["r_ac"]
    assert steel["r_dc"] == pvc["r_dc"]


def test_aluminium_conduit_is_treated_as_pvc():
    assert values(run(size="4/0", raceway="aluminum")) == values(run(size="4/0", raceway="pvc"))


def test_reactance_worked_example_12_awg():
    # By hand: 7 strands, d_s = √(4 × 3.3088 mm² / 7π) = 0.77575 mm, D = 3 d_s = 2.3273 mm
    # (NEC Table 8 lists 0.092 in = 2.34 mm, from memory); GMR = 0.726 × 1.16363 = 0.84480 mm;
    # GMD = 2.3273 + 2 × 0.483 = 3.2933 mm; X = 2π × 60 × 2e-7 × ln(3.2933/0.84480)
    # = 1.02578e-4 Ω/m.
    assert conductors.conductor_diameter("12 AWG") == pytest.approx(2.3273e-3, rel=1e-4)
    assert values(run())["x"] == pytest.approx(1.02578e-4, rel=1e-4)


def test_free_air_spacing_and_flat_gmd():
    wide = values(run(size="240 mm2", raceway="none", spacing_m="0.1 m", frequency_hz=50))
    gmr = conductors.geometric_mean_radius("240 mm2")
    assert wide["x"] == pytest.approx(2 * math.pi * 50 * 2e-7 * math.log(0.1 / gmr), rel=1e-12)
    assert conductors.geometric_mean_distance(0.1, "flat") == pytest.approx(0.1 * 2 ** (1 / 3))


def test_gmr_of_solid_wire():
    size = units.parse_conductor_size("10 AWG")
    radius = math.sqrt(size.area_m2 / math.pi)
    assert conductors.geometric_mean_radius(size, strands=1) == pytest.approx(
        radius * math.exp(-0.25), rel=1e-12)


# --- Limiting cases, the calculator record ----------------------------------------------------

@pytest.mark.parametrize("size", ["12 AWG", "1000 kcmil", "400 mm2"])
def test_dc_has_no_ac_effects(size):
    out = values(run(size=size, frequency_hz=0))
    assert out["r_ac"] == out["r_dc"] and out["x"] == 0.0
    assert out["z_085"] == pytest.approx(conductors.POWER_FACTOR_NEC * out["r_dc"], rel=1e-12)


def test_default_run_and_outputs():
    result = run()
    out = values(result)
    assert set(out) == {"area", "r_dc", "r_ac", "x", "r_dc_table", "z_085"}
    assert result["outputs"]["r_dc_table"]["display"] == "1.98 Ω/kft (6.50 Ω/km)"
    found = checks(result)
    assert found["table_agreement"] == "pass" and found["skin_effect_validity"] == "pass"
    assert any("Ampacity" in c for c in result["cautions"])


def test_no_table_output_without_a_table_value():
    out = values(run(size="18 AWG", material="al"))
    assert "r_dc_table" not in out


def test_iec_table_agreement_is_judged_against_the_maximum():
    result = run(size="2.5 mm2")
    assert checks(result)["table_agreement"] == "pass"
    assert "maximum" in check_message(result, "table_agreement")


def test_series_marks_the_chosen_temperature():
    series = run(temperature_c=90)["series"]
    temps = series["x"]["values"]
    assert temps[0] == -20 and temps[-1] == 120
    assert series["marks"][0]["value"] == 90
    assert run(temperature_c=200)["series"]["x"]["values"][-1] == 200


def test_iec_region_default_is_2_5_mm2():
    assert api.get("conductor").input("size").region_defaults == {"iec": "2.5 mm²"}


def test_touching_geometry_is_stated_in_the_assumptions():
    touching = " ".join(run()["assumptions"])
    spaced = " ".join(run(size="240 mm2", raceway="none", spacing_m="0.1 m")["assumptions"])
    assert "touching conductors in the raceway" in touching and "THHN" in touching
    assert "given axial spacing" in spaced


# --- The thresholds of the checks: just inside and just outside each --------------------------
# A table value is set (monkeypatch) so that physics / table lands at the limit × 0.99 or × 1.01:
# the judgement, not the data, is under test.

INSIDE, OUTSIDE = 0.99, 1.01  # 1 % either side of a limit


@pytest.mark.parametrize("side", [+1, -1])
@pytest.mark.parametrize("factor, status", [(INSIDE, "pass"), (OUTSIDE, "warn")])
def test_table8_agreement_threshold(monkeypatch, side, factor, status):
    physics = per_kft(conductors.dc_resistance("12 AWG", "cu", 75.0))  # 75 °C: table as listed
    ratio = 1 + side * view.TABLE8_AGREEMENT * factor
    monkeypatch.setitem(conductors.NEC_TABLE8_CU_STRANDED_75C, "12 AWG", physics / ratio)
    assert checks(run(size="12 AWG", temperature_c=75))["table_agreement"] == status


@pytest.mark.parametrize("bound, factor, status", [
    (0, 1 / INSIDE, "pass"), (0, 1 / OUTSIDE, "warn"),  # the low end: ratio just above / below
    (1, INSIDE, "pass"), (1, OUTSIDE, "warn"),  # the high end: ratio just below / above
])
def test_iec60228_agreement_threshold(monkeypatch, bound, factor, status):
    # Physics and table both use α20 here, so physics / table is the same at any temperature.
    physics = conductors.dc_resistance("2.5 mm2", "cu", 20.0) * 1e3  # Ω/km
    ratio = view.IEC60228_AGREEMENT[bound] * factor
    monkeypatch.setitem(conductors.IEC60228_CLASS2_CU_20C, "2.5 mm²", physics / ratio)
    assert checks(run(size="2.5 mm2"))["table_agreement"] == status


@pytest.mark.parametrize("factor, status", [(INSIDE, "pass"), (OUTSIDE, "warn")])
def test_skin_x_limit_threshold(factor, status):
    # x_s² = 8πf / R' × 10⁻⁷ (IEC 60287-1-1 2.1.2): the frequency that puts x_s at the limit.
    r_dc = conductors.dc_resistance("1000 kcmil", "cu", 75.0)
    x_s = conductors.SKIN_X_LIMIT * factor
    frequency = x_s ** 2 * r_dc / (8 * math.pi * 1e-7 * conductors.K_SKIN)
    result = run(size="1000 kcmil", temperature_c=75, frequency_hz=frequency)
    assert checks(result)["skin_effect_validity"] == status
    if status == "warn":
        assert str(conductors.SKIN_X_LIMIT) in check_message(result, "skin_effect_validity")


@pytest.mark.parametrize("side", [+1, -1])
@pytest.mark.parametrize("factor, status", [(INSIDE, "pass"), (OUTSIDE, "warn")])
def test_table9_z_agreement_threshold(monkeypatch, side, factor, status):
    # Z(R, X_geometry) / Z(R, XL_table9) − 1 = ±5 % × factor: solve for the table's XL.
    out = values(run(size="500 kcmil"))
    effect = side * view.TABLE9_Z_AGREEMENT * factor
    z_geometry = conductors.effective_impedance(out["r_ac"], out["x"])
    pf = conductors.POWER_FACTOR_NEC
    x_table9 = (z_geometry / (1 + effect) - pf * out["r_ac"]) / math.sqrt(1 - pf * pf)
    steel = conductors.NEC_TABLE9_XL["500 kcmil"][1]
    monkeypatch.setitem(conductors.NEC_TABLE9_XL, "500 kcmil", (per_kft(x_table9), steel))
    assert checks(run(size="500 kcmil"))["table9_reactance"] == status
    # By the table method Table 9's XL is the one used: nothing to warn about.
    assert checks(run(size="500 kcmil", method="table"))["table9_reactance"] == "pass"


# --- Error paths ------------------------------------------------------------------------------

@pytest.mark.parametrize("inputs, field, words", [
    ({"size": "13 AWG"}, "size", "not a standard AWG size"),
    ({"size": "1.5 mm2", "material": "al"}, "size", "not made in aluminium"),
    ({"material": "steel"}, "material", "choose one of"),
    ({"temperature_c": 300}, "temperature_c", "out of range"),
    ({"temperature_c": "-50 degC"}, "temperature_c", "at least -40"),
    ({"frequency_hz": 500}, "frequency_hz", "at most 400"),
    ({"frequency_hz": -1}, "frequency_hz", "out of range"),
    ({"raceway": "tray"}, "raceway", "choose one of"),
    ({"spacing_m": 0}, "spacing_m", "greater than 0"),
    ({"spacing_m": "1 mm"}, "spacing_m", "less than the conductor diameter"),
    ({"method": "guess"}, "method", "choose one of"),
    ({"size": "18 AWG", "material": "al", "method": "table"}, "method", "no published table"),
])
def test_bad_inputs_get_field_messages(inputs, field, words):
    found = errors("conductor", **inputs)
    assert list(found) == [field]
    assert words in found[field]


@pytest.mark.parametrize("call, parameter, words", [
    (lambda: conductors.dc_resistance("2.5 mm2", "al", 20.0), "size", "not made in aluminium"),
    (lambda: conductors.dc_resistance("12 AWG", "gold", 20.0), "material", "choose one of"),
    (lambda: conductors.dc_resistance("18 AWG", "al", 20.0, "table"), "method",
     "no published table"),
    (lambda: conductors.impedance("500 kcmil", "cu", 75.0, 60.0, "none", 0.01), "spacing",
     "less than the conductor diameter"),
])
def test_physics_errors_name_their_own_parameter(call, parameter, words):
    with pytest.raises(ParameterError, match=words) as raised:
        call()
    assert raised.value.parameter == parameter
