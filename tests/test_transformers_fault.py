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
    else:
        assert "fault_ln_a" not in out


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


def test_fault_unusual_impedance_warns():
    assert checks(fault(z_pct=0.5))["impedance"] == "warn"
    assert "impedance" not in checks(fault(z_pct=5.75))


def test_fault_source_given_twice():
    found = errors("transformer-fault-current", source_mva=500, source_fault_a=20)
    assert list(found) == ["source_fault_a"] and "not both" in found["source_fault_a"]


@pytest.mark.parametrize("inputs, field, words", [
    ({"z_pct": 0}, "z_pct", "greater than 0 %"),
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


@pytest.mark.parametrize("z_pct, warned", [
    (transformer_fault_current.USUAL_Z_PCT[0] * 0.99, True),
    (transformer_fault_current.USUAL_Z_PCT[0] * 1.01, False),
    (transformer_fault_current.USUAL_Z_PCT[1] * 0.99, False),
    (transformer_fault_current.USUAL_Z_PCT[1] * 1.01, True),
])
def test_threshold_usual_impedance_range(z_pct, warned):
    assert ("impedance" in checks(fault(z_pct=z_pct))) == warned


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
