"""calc.transformers fault level and transformer-fault-current: published examples, pandapower's
IEC 60909 module, limits, the threshold of every judgement, and every error path.

rel=1e-12 wherever two routes to the same number are compared: only floating-point rounding
separates them.
"""

import cmath
import math
import random
import warnings

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calc import api, cautions, network, transformers
from calc.calculators import transformer_fault_current
from tests.conftest import check_message, checks, errors, run, values

SQRT3 = math.sqrt(3)
TOLERANCE = transformers.IMPEDANCE_TOLERANCE


def fault(**inputs):
    return run("transformer-fault-current", **inputs)


def test_fault_infinite_bus_published_example():
    # IAEI Magazine, J. Phillips (2018): 1500 kVA, 480 V, 5.75 %, infinite bus -> 31,374 A. The
    # article rounds I_FL to 1804 A (31 377 A unrounded), so rel 2e-4.
    level = transformers.secondary_fault(1500e3, 13800.0, 480.0, 3, 5.75, 6.0)
    assert level.fault_current == pytest.approx(31374, rel=2e-4)
    assert level.fault_current == level.infinite_fault_current


def test_fault_finite_source_published_mva_example():
    # holooly.com/?p=1193422 (a textbook's MVA-method solution): 1000 kVA 13.8 kV-208Y/120 V, Z =
    # 5 %, utility 15 kA -> MVA_U = 358.52, MVA_T = 20, total 18.94 MVA, I = 52,583 A. Equal
    # X/R makes the phasor sum equal the arithmetic one; the source rounds MVA to 4 figures.
    source = SQRT3 * 13.8e3 * 15e3
    level = transformers.secondary_fault(1000e3, 13800.0, 208.0, 3, 5.0, 6.0, source, 6.0)
    assert level.fault_current == pytest.approx(52583, rel=2e-4)
    # and the IAEI per-cent form, I_FL × 100 / (%Z_T + %Z_S), %Z_S = 100 S_T / S_sc
    z_s = 100 * 1000e3 / source
    assert level.fault_current == pytest.approx(1000e3 / (SQRT3 * 208) * 100 / (5 + z_s), rel=1e-12)


def test_source_impedance_percent():
    # %Z_S = 100 × S_T / S_sc (IAEI Magazine, J. Phillips, 2018, read): 1.5 MVA on a 500 MVA
    # source is 0.3 %.
    assert transformers.source_impedance_pct(1.5e6, 500e6) == pytest.approx(0.3, rel=1e-12)


def test_impedance_per_unit_round_trip():
    z = transformers.impedance_per_unit(5.75, 6.0)
    assert abs(z) == pytest.approx(0.0575, rel=1e-12)
    assert z.imag / z.real == pytest.approx(6.0, rel=1e-12)


def _pandapower_fault(kva, v1, v2, z_pct, x_r, source_mva, source_x_r, lv_tol_percent,
                      fault="3ph"):
    """The same one-transformer network in pandapower's IEC 60909 module (case max)."""
    pp = pytest.importorskip("pandapower")
    import pandapower.shortcircuit as sc
    net = pp.create_empty_network(sn_mva=1.0, f_hz=60)
    hv = pp.create_bus(net, vn_kv=v1 / 1e3)
    lv = pp.create_bus(net, vn_kv=v2 / 1e3)
    pp.create_ext_grid(net, hv, s_sc_max_mva=source_mva, rx_max=1 / source_x_r, x0x_max=1.0,
                       r0x0_max=0.1)
    vkr = z_pct / math.hypot(1, x_r)
    pp.create_transformer_from_parameters(
        net, hv, lv, sn_mva=kva / 1e3, vn_hv_kv=v1 / 1e3, vn_lv_kv=v2 / 1e3, vkr_percent=vkr,
        vk_percent=z_pct, pfe_kw=0, i0_percent=0, vector_group="Dyn", vk0_percent=z_pct,
        vkr0_percent=vkr, mag0_percent=100, mag0_rx=0, si0_hv_partial=0.9)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        sc.calc_sc(net, case="max", ip=True, lv_tol_percent=lv_tol_percent, topology="radial",
                   fault=fault)
    return net.res_bus_sc.loc[lv]


def test_fault_matches_pandapower_iec60909_random_cases():
    # pandapower.shortcircuit.calc_sc, case "max": c_max 1.10 (lv_tol 10 %) or 1.05 (6 %) at the
    # LV bus, 1.10 at an MV feeder, K_T on the transformer, κ from R/X (radial). Same model, so
    # the tolerance is floating-point: 1e-9. Seeded, so a failure reproduces.
    pytest.importorskip("pandapower")
    rng = random.Random(4)
    worst = 0.0
    for _ in range(20):
        kva = rng.choice([150, 300, 500, 750, 1000, 1500, 2000, 2500])
        v1 = rng.choice([4160.0, 11000.0, 13800.0, 480.0])
        v2 = rng.choice([208.0, 400.0, 480.0]) if v1 > 1000 else 208.0
        z, x_r = rng.uniform(2, 10), rng.uniform(1, 15)
        s_mva, s_x_r = rng.uniform(20, 1000), rng.uniform(2, 20)
        c, tol = rng.choice([(1.1, 10), (1.05, 6)])
        ours = transformers.secondary_fault(kva * 1e3, v1, v2, 3, z, x_r, s_mva * 1e6, s_x_r, c,
                                            delta_wye=True)
        three = _pandapower_fault(kva, v1, v2, z, x_r, s_mva, s_x_r, tol)
        one = _pandapower_fault(kva, v1, v2, z, x_r, s_mva, s_x_r, tol, fault="1ph")
        for theirs, mine in ((three.ikss_ka * 1e3, ours.fault_current),
                             (three.ip_ka * 1e3, ours.peak_current),
                             (one.ikss_ka * 1e3, ours.line_to_neutral_current)):
            assert mine == pytest.approx(theirs, rel=1e-9)
            worst = max(worst, abs(mine / theirs - 1))
    assert worst < 1e-9, worst


def test_fault_nominal_method_against_an_independent_complex_sum():
    # c = 1 (no pandapower setting turns off c and K_T): the per-unit sum written out with cmath.
    kva, v2, z, x_r, s, s_x_r = 750e3, 480.0, 5.75, 5.0, 100e6, 8.0
    z_t = cmath.rect(z / 100, math.atan(x_r))
    z_s = cmath.rect(kva / s, math.atan(s_x_r))
    expected = kva / (SQRT3 * v2) / abs(z_t + z_s)
    kappa = 1.02 + 0.98 * math.exp(-3 * (z_t + z_s).real / (z_t + z_s).imag)  # IEC 60909 §4.3.1.1
    level = transformers.secondary_fault(kva, 13800.0, v2, 3, z, x_r, s, s_x_r)
    assert level.fault_current == pytest.approx(expected, rel=1e-12)
    assert level.peak_current == pytest.approx(kappa * math.sqrt(2) * expected, rel=1e-12)


def test_fault_iec_case_as_the_docstring_states_it():
    # The Notes of secondary_fault, written out with cmath: Z_S scaled by c_Q (here 1.10, an
    # 11 kV feeder), Z_T by K_T = 0.95 c / (1 + 0.6 x_T), I = c I_FL / |Z_S + Z_T|, and
    # I''k1 = 3 c I_FL / |2 Z1 + Z0| with Z0 = K_T Z_T.
    kva, v1, v2, z, x_r, s, s_x_r, c = 630e3, 11000.0, 400.0, 4.0, 3.0, 250e6, 10.0, 1.05
    z_t = cmath.rect(z / 100, math.atan(x_r))
    k_t = 0.95 * c / (1 + 0.6 * z_t.imag)
    z_s = cmath.rect(1.10 * kva / s, math.atan(s_x_r))
    i_fl = kva / (SQRT3 * v2)
    level = transformers.secondary_fault(kva, v1, v2, 3, z, x_r, s, s_x_r, c, delta_wye=True)
    assert level.correction == pytest.approx(k_t, rel=1e-12)
    assert level.z_source == pytest.approx(z_s, rel=1e-12)
    assert level.fault_current == pytest.approx(c * i_fl / abs(z_s + k_t * z_t), rel=1e-12)
    assert level.line_to_neutral_current == pytest.approx(
        3 * c * i_fl / abs(2 * (z_s + k_t * z_t) + k_t * z_t), rel=1e-12)


def test_fault_calculator_agrees_with_the_path_engine():
    # One transformer on calc.network gives the same three-phase and line-to-neutral currents.
    out = values(fault(source_mva=250, voltage_factor="1"))
    path = network.Path(network.Source(13800.0, 3, fault_va=250e6, x_r=10.0),
                        [network.Transformer("T", 1500e3, 13800.0, 480.0, 5.75, 6.0)])
    node = network.faults(path)[1]
    assert out["fault_a"] == pytest.approx(node.three_phase_a, rel=1e-12)
    assert out["fault_ln_a"] == pytest.approx(node.line_to_neutral_a, rel=1e-12)


def test_fault_limits():
    # A source far stronger than the transformer tends to the infinite bus; κ tends to 2 as
    # R/X -> 0 and to 1.02 as X/R -> 0 (IEC 60909 §4.3.1.1).
    strong = transformers.secondary_fault(1e6, 13800.0, 480.0, 3, 5.0, 8.0, 1e15, 8.0)
    # Z_S / Z_T = (1e6 / 1e15) / 0.05 = 2e-8: the gap to the infinite bus, within rel 1e-7
    assert strong.fault_current == pytest.approx(strong.infinite_fault_current, rel=1e-7)
    stiff = transformers.secondary_fault(1e6, 13800.0, 480.0, 3, 5.0, 100.0)
    assert stiff.kappa == pytest.approx(1.02 + 0.98 * math.exp(-0.03), rel=1e-12)
    resistive = transformers.secondary_fault(1e6, 13800.0, 480.0, 3, 5.0, 0.1)
    assert resistive.kappa == pytest.approx(1.02 + 0.98 * math.exp(-30), rel=1e-12)
    # a very weak source limits the current to the source's own: I ≈ S_sc / (√3 V₂); rel 1e-3
    # is Z_T / Z_S = 0.05 / 1000 (the transformer's share of the path)
    weak = transformers.secondary_fault(1e6, 13800.0, 480.0, 3, 5.0, 8.0, 1e3, 8.0)
    assert weak.fault_current == pytest.approx(1e3 / (SQRT3 * 480), rel=1e-3)


@settings(max_examples=200, deadline=None)
@given(kva=st.floats(10, 5000), z=st.floats(0.5, 30), x_r=st.floats(0.1, 50),
       source=st.one_of(st.none(), st.floats(1, 1e5)), s_x_r=st.floats(0.1, 50),
       c=st.sampled_from(["1", "1.05", "1.1"]), phases=st.sampled_from(["1", "3"]))
def test_fault_properties(kva, z, x_r, source, s_x_r, c, phases):
    out = values(fault(kva=kva, z_pct=z, x_r=x_r, source_mva=source, source_x_r=s_x_r,
                       voltage_factor=c, phases=phases))
    # the infinite source is the upper bound of the finite one
    assert out["fault_a"] <= out["fault_infinite_a"] * (1 + 1e-12)
    # the low end of the impedance tolerance gives more current
    assert out["fault_low_z_a"] >= out["fault_a"] * (1 - 1e-12)
    # peak between √2 × 1.02 and √2 × 2 times the symmetrical current
    assert math.sqrt(2) * 1.02 * out["fault_a"] <= out["peak_a"] * (1 + 1e-12)
    assert out["peak_a"] <= 2 * math.sqrt(2) * out["fault_a"]
    if phases == "3":  # delta-wye: Z₀ = Z_T ≤ Z₁, so the line-to-neutral fault is the larger
        assert out["fault_ln_a"] >= out["fault_a"] * (1 - 1e-12)
    else:  # 480 V single-phase: two-wire unless the user says three-wire
        assert "fault_ln_a" not in out
    # A 120/240 V mid-tap: one half-winding of 1.5 %R + j1.2 %X at half the voltage gives 4/3 (all
    # R) to 5/3 (all X) × the line-to-line fault on an infinite source, and up to 2 × as the source
    # dominates (its per-unit impedance is the same on both bases).
    mid = values(fault(kva=kva, z_pct=z, x_r=x_r, source_mva=source, source_x_r=s_x_r,
                       voltage_factor=c, phases="1", secondary_v=240))
    assert 4 / 3 * (1 - 1e-9) <= mid["fault_ln_a"] / mid["fault_a"] <= 2 * (1 + 1e-9)


def test_fault_current_falls_as_impedance_rises():
    currents = [values(fault(z_pct=z))["fault_a"] for z in (2, 4, 8)]
    assert currents[0] > currents[1] > currents[2]
    assert currents[0] == pytest.approx(4 * currents[2], rel=1e-12)  # infinite bus: I ∝ 1/Z


def test_fault_equipment_rating_check():
    low = fault(device_rating_a="22 kA")
    high = fault(device_rating_a="65 kA")
    assert checks(low)["device_rating"] == "fail" and checks(high)["device_rating"] == "pass"


def test_fault_source_as_current_equals_source_as_mva():
    by_current = values(fault(source_fault_a="20 kA", primary_v="13.8 kV"))
    by_mva = values(fault(source_mva=SQRT3 * 13.8 * 20))
    assert by_current["fault_a"] == pytest.approx(by_mva["fault_a"], rel=1e-12)


def test_fault_line_to_neutral_only_for_delta_wye():
    assert "fault_ln_a" not in fault(connection="delta-delta")["outputs"]


def test_fault_iec_on_single_phase_warns():
    result = fault(phases="1", voltage_factor="1.1", secondary_v=240)
    assert checks(result)["iec_single_phase"] == "warn"
    assert "iec_single_phase" not in checks(fault(phases="1", voltage_factor="1", secondary_v=240))


def test_fault_source_given_twice():
    found = errors("transformer-fault-current", source_mva=500, source_fault_a=20)
    assert list(found) == ["source_fault_a"] and "not both" in found["source_fault_a"]


@pytest.mark.parametrize("inputs, field, words", [
    ({"z_pct": 0}, "z_pct", "at least 0.1 %"),
    ({"z_pct": "30.5 %"}, "z_pct", "at most 30 %"),
    ({"z_pct": -2}, "z_pct", "out of range"),
    ({"x_r": 0}, "x_r", "at least 0.1"),
    ({"source_mva": 0}, "source_mva", "at least 0.001 MVA"),
    ({"source_fault_a": "15 kV"}, "source_fault_a", "current"),
    ({"voltage_factor": "1.2"}, "voltage_factor", "choose one of"),
    ({"kva": "nan"}, "kva", "finite"),
])
def test_fault_bad_input_gets_a_field_message(inputs, field, words):
    found = errors("transformer-fault-current", **inputs)
    assert list(found) == [field] and words in found[field]


def test_source_level_inputs_keep_their_limits():
    # The shared factories' inputs keep this calculator's limits: 0.001 MVA to 1e6 MVA and
    # 0.001 kA to 1000 kA (inclusive), X/R 0.1 to 100.
    calculator = transformer_fault_current.CALCULATOR
    mva, amps, x_r = (calculator.input(n) for n in ("source_mva", "source_fault_a", "source_x_r"))
    assert (mva.unit, mva.minimum, mva.maximum, mva.min_exclusive) == ("MVA", 0.001, 1e6, False)
    assert (amps.unit, amps.minimum, amps.maximum, amps.min_exclusive) == ("kA", 0.001, 1000, False)
    assert (x_r.default, x_r.minimum, x_r.maximum) == (10, 0.1, 100)


# ---- thresholds --------------------------------------------------------------------------------

def test_threshold_impedance_tolerance_sets_the_low_z_current():
    # Infinite bus, c = 1: I = I_FL × 100 / %Z, so the −tolerance unit gives 1 / (1 − tol) more.
    out = values(fault(z_pct=5.75))
    assert out["fault_low_z_a"] == pytest.approx(out["fault_a"] / (1 - TOLERANCE), rel=1e-12)
    labels = {o["name"]: o["label"] for o in api.describe("transformer-fault-current")["outputs"]}
    assert f"−{100 * TOLERANCE:g} %" in labels["fault_low_z_a"]


def test_threshold_device_rating_against_the_low_z_current():
    # The equipment rating is judged against the current at the low end of the impedance
    # tolerance: 1 % above it passes, 1 % below fails, and so does one between the nominal and
    # the low-z current.
    i_fl = 1500e3 / (SQRT3 * 480)
    low_z = i_fl * 100 / (5.75 * (1 - TOLERANCE))  # by hand, infinite bus, c = 1
    nominal = i_fl * 100 / 5.75
    for rating, status in ((low_z * 1.01, "pass"), (low_z * 0.99, "fail"),
                           ((low_z + nominal) / 2, "fail")):
        result = fault(device_rating_a=rating / 1e3)
        assert checks(result)["device_rating"] == status
    assert f"−{100 * TOLERANCE:g} % impedance tolerance" in check_message(
        fault(device_rating_a=low_z * 1.01 / 1e3), "device_rating")


@pytest.mark.parametrize("factor, c_q", [
    (0.99, 1.05), (1.0, 1.05), (1.01, transformers.C_MAX_ABOVE_1KV)])
def test_threshold_low_voltage_limit_of_the_feeder_factor(factor, c_q):
    # IEC 60909 case, c = 1.05: a feeder at or below LOW_VOLTAGE_LIMIT_V keeps c; above it c_Q
    # is C_MAX_ABOVE_1KV. The source impedance on the rating shows it: 100 c_Q S_T / S_sc.
    primary = transformers.LOW_VOLTAGE_LIMIT_V * factor
    out = values(fault(kva=150, primary_v=primary, secondary_v=208, voltage_factor="1.05",
                       source_mva=50))
    assert out["source_z_pct"] == pytest.approx(100 * c_q * 150e3 / 50e6, rel=1e-12)
    assert transformers.source_voltage_factor(primary, 1.05) == c_q


def test_threshold_medium_voltage_caution():
    limit = transformers.LOW_VOLTAGE_LIMIT_V
    assert cautions.MEDIUM_VOLTAGE in fault(primary_v=limit * 1.01, secondary_v=208)["cautions"]
    assert cautions.MEDIUM_VOLTAGE not in fault(primary_v=limit * 0.99, secondary_v=208)["cautions"]


# ---- issue 11, item 4: the line-to-neutral fault of a 120/240 V (mid-tapped) secondary ----------

HALF_R, HALF_X = transformers.MID_TAP_R_FACTOR, transformers.MID_TAP_X_FACTOR


def pole_unit(**inputs):
    """The issue's case: a 37.5 kVA, 2.5 %, 7.2 kV-120/240 V pole unit (X/R 6, the form default)."""
    return fault(**{"phases": "1", "kva": "37.5 kVA", "primary_v": "7.2 kV", "secondary_v": "240 V",
                    "z_pct": 2.5, **inputs})


def test_issue11_mid_tap_fault_fails_a_10_ka_panel():
    # Computed by hand with the half-winding impedance 1.5 %R + j1.2 %X (the point-to-point
    # method's Note 2, read as reproduced at scribd.com/document/388329023): I_FL = 37 500 / 240
    # = 156.25 A; %R = 2.5 / √37 = 0.410997, %X = 6 %R = 2.465985; half = 0.616496 + j2.959182,
    # |half| = 3.022718 %; I_LN = 2 × 156.25 × 100 / 3.022718 = 10 338.38 A; at the −7.5 %
    # tolerance 10 338.38 / 0.925 = 11 176.6 A. Hand arithmetic to 7 figures, hence rel 1e-6.
    # The old code gave only the line-to-line 6.25 kA (6.76 kA at −7.5 %) and passed the panel.
    result = pole_unit(device_rating_a="10 kA")
    assert checks(result)["device_rating"] == "fail"
    out = values(result)
    assert out["fault_a"] == pytest.approx(6250.0, rel=1e-12)  # I_FL × 100 / 2.5
    assert out["fault_ln_a"] == pytest.approx(10338.38, rel=1e-6)
    message = check_message(result, "device_rating")
    assert "line-to-neutral at the mid-tap" in message and "11.2 kA" in message
    # the usual "about 1.5 ×" (the Note gives 1.33 to 1.67 with this R/X basis)
    assert out["fault_ln_a"] / out["fault_a"] == pytest.approx(1.654, abs=5e-4)


def test_mid_tap_multiplier_spans_four_thirds_to_five_thirds():
    # The Note's range: 1.33 for an all-resistance winding (2 / 1.5), 1.67 for all reactance
    # (2 / 1.2). X/R 1e4 and 1e-4 leave R or X a part in 1e8 of Z, hence rel 1e-6.
    for x_r, ratio in ((1e4, 2 / HALF_X), (1e-4, 2 / HALF_R)):
        level = transformers.secondary_fault(37.5e3, 7200.0, 240.0, 1, 2.5, x_r, mid_tap=True)
        assert level.line_to_neutral_current / level.fault_current == pytest.approx(ratio, rel=1e-6)


def test_mid_tap_is_kerstings_centre_tapped_model():
    # Kersting's centre-tapped transformer (Distribution System Modeling and Analysis, from
    # memory; read as gridlab-d/gridlab-d powerflow/transformer.cpp sets it up when only the full
    # winding's R + jX is known): Z₀ = 0.5 R + j0.8 X on the primary base, Z₁ = Z₂ = R + j0.4 X on
    # the 120 V base. Built in ohms and reflected through the turns, it must give the full
    # winding's own R + jX line to line and the calculator's line-to-neutral fault. Only
    # floating-point rounding separates the routes: rel 1e-12.
    kva, v1, half_v, z, x_r = 50e3, 7200.0, 120.0, 2.0, 2.0
    z_t = transformers.impedance_per_unit(z, x_r)
    z0 = complex(0.5 * z_t.real, 0.8 * z_t.imag) * v1 ** 2 / kva  # primary, ohms
    z1 = complex(z_t.real, 0.4 * z_t.imag) * half_v ** 2 / kva  # one half-winding, ohms
    full_ohms = z0 * (2 * half_v / v1) ** 2 + 2 * z1  # reflected to the 240 V winding
    assert full_ohms / ((2 * half_v) ** 2 / kva) == pytest.approx(z_t, rel=1e-12)
    half_ohms = z0 * (half_v / v1) ** 2 + z1  # a fault from X1 to the mid-tap
    level = transformers.secondary_fault(kva, v1, 2 * half_v, 1, z, x_r, mid_tap=True)
    assert level.line_to_neutral_current == pytest.approx(half_v / abs(half_ohms), rel=1e-12)
    assert level.fault_current == pytest.approx(2 * half_v / abs(full_ohms), rel=1e-12)


def test_mid_tap_with_a_source_and_iec_factors_as_the_docstring_states_it():
    # I_LN = 2 c I_FL / |Z_S + K_T (1.5 R + j1.2 X)|, Z_S = c_Q S_T / S_sc at the source's X/R,
    # written out with cmath (the Notes of secondary_fault); rel 1e-12 for rounding only.
    kva, v1, v2, z, x_r, s, s_x_r, c = 50e3, 7200.0, 240.0, 2.0, 3.0, 20e6, 5.0, 1.1
    z_t = cmath.rect(z / 100, math.atan(x_r))
    k_t = 0.95 * c / (1 + 0.6 * z_t.imag)
    z_s = cmath.rect(1.10 * kva / s, math.atan(s_x_r))  # 7.2 kV feeder: c_Q = 1.10
    half = k_t * complex(HALF_R * z_t.real, HALF_X * z_t.imag)
    level = transformers.secondary_fault(kva, v1, v2, 1, z, x_r, s, s_x_r, c, mid_tap=True)
    assert level.line_to_neutral_current == pytest.approx(2 * c * kva / v2 / abs(z_s + half),
                                                          rel=1e-12)
    assert math.isnan(transformers.secondary_fault(kva, v1, v2, 1, z, x_r).line_to_neutral_current)


@pytest.mark.parametrize("factor, mid_tapped", [
    (1 - 1.01 * transformer_fault_current.MID_TAP_MATCH, False),
    (1 - 0.99 * transformer_fault_current.MID_TAP_MATCH, True),
    (1.0, True),
    (1 + 0.99 * transformer_fault_current.MID_TAP_MATCH, True),
    (1 + 1.01 * transformer_fault_current.MID_TAP_MATCH, False),
])
def test_threshold_mid_tap_detected_from_the_secondary_voltage(factor, mid_tapped):
    volts = transformer_fault_current.MID_TAP_SECONDARY_V * factor
    assert ("fault_ln_a" in fault(phases="1", secondary_v=volts)["outputs"]) == mid_tapped


def test_mid_tap_choice_overrides_the_voltage():
    assert "fault_ln_a" not in pole_unit(secondary_wiring="two-wire")["outputs"]
    said = fault(phases="1", secondary_v=480, secondary_wiring="three-wire")  # 240/480 V
    assert "fault_ln_a" in said["outputs"]
    # three-phase ignores it: a delta-delta unit has no line-to-neutral figure either way
    assert "fault_ln_a" not in fault(connection="delta-delta", secondary_wiring="three-wire")[
        "outputs"]
    # IEC practice: a 230/240 V single-phase secondary is two-wire unless the user says otherwise
    iec = api.run("transformer-fault-current", {"phases": "1", "secondary_v": 240}, region="iec")
    assert "fault_ln_a" not in iec["outputs"]


def test_threshold_device_rating_on_the_mid_tap_fault():
    # The rating is judged on the larger fault, the line-to-neutral one at the −7.5 % tolerance:
    # 1 % above it passes, 1 % below fails, although both are far above the line-to-line figure.
    low_z = transformers.secondary_fault(37.5e3, 7200.0, 240.0, 1, 2.5 * (1 - TOLERANCE), 6.0,
                                         mid_tap=True).line_to_neutral_current
    assert low_z == pytest.approx(10338.38 / (1 - TOLERANCE), rel=1e-6)  # by hand, as above
    for rating, status in ((low_z * 1.01, "pass"), (low_z * 0.99, "fail")):
        assert checks(pole_unit(device_rating_a=rating / 1e3))["device_rating"] == status


def test_mid_tap_step_source_and_assumption_say_what_was_assumed():
    result = pole_unit()
    assert any("mid-tap" in step["text"] and "1.65 ×" in step["result"] for step in result["steps"])
    assert transformer_fault_current.SOURCE_MID_TAP in result["sources"]
    assert any("half-winding" in a for a in result["assumptions"])
    two_wire = pole_unit(secondary_wiring="two-wire")
    assert any("Two-wire" in step["text"] for step in two_wire["steps"])


def test_mid_tap_choice_refuses_an_unknown_wiring():
    found = errors("transformer-fault-current", secondary_wiring="four-wire")
    assert list(found) == ["secondary_wiring"] and "choose one of" in found["secondary_wiring"]
