"""calc.protection and its calculators: fault-current against pandapower's IEC 60909,
ground-fault-trip against IEC 60898-1 / IEC 60364-4-41 and hand computations from published
tables, gfci-check against UL 943 and IEC 61008-1; every judgement just inside and just outside
its limit; properties and one test per error path."""

import math
import random
import warnings

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calc import api, cautions, conductors, network, protection, transformers, units
from calc.calculators import fault_current, gfci_check
from calc.errors import ParameterError
from tests.conftest import check_message, checks, errors, run, values

INSIDE, OUTSIDE = 0.99, 1.01  # a threshold test lands 1 % inside and 1 % outside the limit


def out(calculator, **inputs):
    return values(run(calculator, **inputs))


# ---- fault-current: the independent reference ---------------------------------------------

def _random_fault_inputs(rng):
    """A random LV path with a finite source (pandapower's ext grid needs one)."""
    material = rng.choice(["cu", "al"])
    feeder = rng.choice(["4/0", "250 kcmil", "500 kcmil", "95 mm2", "185 mm2"])
    branch = rng.choice(["6 AWG", "2 AWG", "1/0", "16 mm2", "35 mm2"] if material == "al" else
                        ["12 AWG", "8 AWG", "2 AWG", "4 mm2", "16 mm2"])
    return {
        "xfmr_kva": rng.choice([150, 300, 500, 750, 1000, 1500, 2500]),
        "secondary_v": rng.choice([208, 400, 480, 600]),
        "xfmr_z_pct": rng.uniform(2.5, 7.5), "xfmr_x_r": rng.uniform(2, 10),
        "source_v": rng.choice([4160, 11000, 12470, 13800]),
        "source_mva": rng.uniform(30, 1000), "source_x_r": rng.uniform(3, 15),
        "feeder_size": feeder, "feeder_length": rng.uniform(5, 150),
        "feeder_sets": rng.choice([1, 2, 3]), "branch_size": branch,
        "branch_length": rng.uniform(2, 60), "material": material,
        "raceway": rng.choice(["pvc", "steel", "none"]), "frequency_hz": rng.choice([50, 60]),
    }


def _reference_path(raw):
    """The calculator's path rebuilt here from its inputs (not by the code under test): supply,
    the transformer, the feeder and the branch, conductors at 20 °C as IEC 60909-0 takes them
    for maximum currents (from memory)."""
    inputs = api.validate(api.get("fault-current"), raw)
    runs = [{"kind": "cable", "size": inputs[f"{run_}_size"].label,
             "length": inputs[f"{run_}_length"], "material": inputs["material"], "sets": sets,
             "raceway": inputs["raceway"], "conductor_temp_c": 20.0}
            for run_, sets in (("feeder", int(inputs["feeder_sets"])), ("branch", 1))]
    return network.path_from_dict({
        "source": {"voltage": inputs["source_v"], "frequency_hz": inputs["frequency_hz"],
                   "x_r": inputs["source_x_r"], "fault_mva": inputs["source_mva"] / 1e6},
        "elements": [{"kind": "transformer", "kva": inputs["xfmr_kva"] / 1e3,
                      "primary_v": inputs["source_v"], "secondary_v": inputs["secondary_v"],
                      "z_pct": inputs["xfmr_z_pct"], "x_r": inputs["xfmr_x_r"]}, *runs],
    })


def _pandapower_faults(raw, lv_tol_percent):
    """pandapower calc_sc(case="max") three-phase and single-phase results on the same path.

    Zero sequence as the path engine models it (IEC 60909-0 §4.2.1.3, from memory): Dyn
    transformer with Z0 = Z1, each run's Z0 = Z_phase + 3 Z_neutral = 4 Z_phase (neutral of
    the phase size). The MV feeder's zero sequence is blocked by the delta winding.
    """
    pp_sc = pytest.importorskip("pandapower.shortcircuit")
    from tests.pandapower_reference import pandapower_net

    net = pandapower_net(_reference_path(raw))
    net.ext_grid["x0x_max"], net.ext_grid["r0x0_max"] = 1.0, 0.1
    net.trafo["vector_group"] = "Dyn"
    net.trafo["vk0_percent"] = net.trafo.vk_percent
    net.trafo["vkr0_percent"] = net.trafo.vkr_percent
    net.trafo["mag0_percent"], net.trafo["mag0_rx"], net.trafo["si0_hv_partial"] = 100, 0, 0.9
    net.line["r0_ohm_per_km"] = 4 * net.line.r_ohm_per_km
    net.line["x0_ohm_per_km"] = 4 * net.line.x_ohm_per_km
    net.line["c0_nf_per_km"] = 0
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        pp_sc.calc_sc(net, case="max", ip=True, branch_results=False, lv_tol_percent=lv_tol_percent)
        three = net.res_bus_sc.copy()
        pp_sc.calc_sc(net, case="max", fault="1ph", branch_results=False,
                      lv_tol_percent=lv_tol_percent)
        single = net.res_bus_sc.copy()
    return three, single


@pytest.mark.parametrize("voltage_factor, lv_tol_percent", [("1.1", 10), ("1.05", 6)])
def test_fault_current_matches_pandapower_iec_60909(voltage_factor, lv_tol_percent):
    # pandapower's IEC 60909 calc_sc(case="max"): c = 1.10 (lv_tol_percent 10) or 1.05 (6) at
    # LV, c_Q = 1.10 for the MV feeder, K_T on the transformer, κ for a radial network. The same
    # model, so initial symmetrical, peak and line-to-neutral currents agree to float rounding
    # (1e-9; measured worst 1e-15).
    pytest.importorskip("pandapower")
    rng = random.Random(70 + lv_tol_percent)
    for _ in range(10):
        raw = dict(_random_fault_inputs(rng), voltage_factor=voltage_factor)
        ours = out("fault-current", **raw)
        three, single = _pandapower_faults(raw, lv_tol_percent)
        for name, node in (("main", 1), ("panel", 2), ("equipment", 3)):
            assert ours[f"{name}_fault_a"] == pytest.approx(three.ikss_ka[node] * 1e3, rel=1e-9)
            assert ours[f"{name}_peak_a"] == pytest.approx(three.ip_ka[node] * 1e3, rel=1e-9)
            assert ours[f"{name}_ln_a"] == pytest.approx(single.ikss_ka[node] * 1e3, rel=1e-9)


# ---- fault-current: published and hand-worked values ----------------------------------------

SHORT_RUNS = {"feeder_length": "1 mm", "branch_length": "1 mm"}


def test_infinite_bus_transformer_secondary_published():
    # IAEI Magazine, J. Phillips, "Short-circuit calculations using transformer and source
    # impedance" (2018): 1500 kVA, 480 V, 5.75 %, infinite bus -> 31 374 A. The article rounds
    # I_FL to 1804 A, hence 2e-4.
    result = out("fault-current", xfmr_kva=1500, secondary_v=480, xfmr_z_pct=5.75)
    assert result["main_fault_a"] == pytest.approx(31374, rel=2e-4)
    # delta-wye, infinite source: the line-to-neutral fault equals the three-phase one
    # (Z0 = Z1 of the transformer; IEC 60909-0 §4.2.1.3 with Z_Q = 0, computed)
    assert result["main_ln_a"] == pytest.approx(result["main_fault_a"], rel=1e-12)


def test_finite_source_mva_method_published():
    # Worked MVA-method example (textbook solution quoted at holooly.com/?p=1193422): 1000 kVA
    # 13.8 kV-208Y/120 V, 5 %, utility 15 kA -> MVA_U = 358.52, MVA_T = 20, I = 52 583 A. Equal
    # X/R (6) makes the phasor sum the arithmetic one; the source rounds MVA to 4 figures.
    result = out("fault-current", xfmr_kva=1000, secondary_v=208, xfmr_z_pct=5, xfmr_x_r=6,
                 source_v="13.8 kV", source_fault_a="15 kA", source_x_r=6)
    assert result["main_fault_a"] == pytest.approx(52583, rel=2e-4)


def test_iec_60909_transformer_correction_by_hand():
    # IEC 60909-0 (c, K_T, κ read, as reproduced in pandapower's docs) by hand: 630 kVA 400 V 4 %
    # X/R 3, infinite source, c = 1.05: I_FL = 909.327 A; x_T = 0.04 × 3/√10 = 0.037947; K_T = 0.95
    # × 1.05/(1 + 0.6 x_T) = 0.975294; I''k = 1.05 × 909.327/(0.04 × 0.975294) = 24 474.5 A; κ =
    # 1.02 + 0.98 e^-1 = 1.38052; i_p = κ √2 I''k = 47 782.8 A. Six figures by hand, hence 1e-5.
    result = out("fault-current", xfmr_kva=630, secondary_v=400, xfmr_z_pct=4, xfmr_x_r=3,
                 source_v="11 kV", voltage_factor="1.05")
    assert result["main_fault_a"] == pytest.approx(24474.5, rel=1e-5)
    assert result["main_peak_a"] == pytest.approx(47782.8, rel=1e-5)
    assert result["main_x_r"] == pytest.approx(3.0, rel=1e-12)


def test_run_impedance_by_hand_from_nec_tables():
    # 1000 kVA 480 V 5.75 % X/R 6 on an infinite bus, then 100 ft of 4/0 Cu in PVC conduit:
    # NEC Chapter 9 Table 8 (read) 0.0608 Ω/kft at 75 °C -> 20 °C by note 2 (α75 = 0.00323):
    # 0.0608 × (1 − 0.00323 × 55) = 0.04999 Ω/kft; NEC Table 9 XL 0.041 Ω/kft (read, as reproduced).
    # The calculator adds IEC 60287 skin and proximity effect (about 1 % for 4/0 at 60 Hz),
    # hence 1 % on a current that the run lowers by about 30 %.
    z_base = 480 ** 2 / 1000e3
    z_t = 0.0575 * z_base * complex(math.cos(math.atan(6)), math.sin(math.atan(6)))
    z_run = complex(0.0608 * (1 - 0.00323 * 55), 0.041) * 0.1
    expected = 480 / (math.sqrt(3) * abs(z_t + z_run))
    result = out("fault-current", xfmr_kva=1000, secondary_v=480, xfmr_z_pct=5.75, xfmr_x_r=6,
                 feeder_size="4/0", feeder_length="100 ft")
    assert result["panel_fault_a"] == pytest.approx(expected, rel=0.01)


def test_short_runs_leave_the_current_of_the_transformer_secondary():
    # Limiting case: 1 mm runs change the impedance by micro-ohms against ~20 mΩ.
    result = out("fault-current", **SHORT_RUNS)
    assert result["panel_fault_a"] == pytest.approx(result["main_fault_a"], rel=1e-3)
    assert result["equipment_fault_a"] == pytest.approx(result["main_fault_a"], rel=1e-3)


def test_ungrounded_secondary_has_no_line_to_neutral_figure():
    result = out("fault-current", grounded_wye="no")
    assert "main_ln_a" not in result and "equipment_ln_a" not in result
    assert "main_fault_a" in result


def test_source_given_as_current_equals_the_same_source_as_power():
    # S_sc = √3 U I (IEC 60909-0 §6.2, from memory): 20 kA at 12.47 kV is 431.96 MVA.
    by_current = out("fault-current", source_fault_a="20 kA")
    by_power = out("fault-current", source_mva=math.sqrt(3) * 12.47 * 20)  # rounding: 1e-12
    assert by_current["main_fault_a"] == pytest.approx(by_power["main_fault_a"], rel=1e-12)


# ---- fault-current: properties ------------------------------------------------------------

PATHS = st.builds(
    lambda kva, z, x_r, mva, feeder, lf, branch, lb: {
        "xfmr_kva": kva, "xfmr_z_pct": z, "xfmr_x_r": x_r, "source_mva": mva,
        "feeder_size": feeder, "feeder_length": lf, "branch_size": branch, "branch_length": lb},
    st.sampled_from([45, 150, 500, 1500, 3000]), st.floats(1.5, 12), st.floats(0.5, 15),
    st.one_of(st.none(), st.floats(5, 2000)),
    st.sampled_from(["1/0", "4/0", "500 kcmil", "70 mm2"]),
    st.floats(0.5, 500), st.sampled_from(["14 AWG", "10 AWG", "4 AWG", "2.5 mm2"]),
    st.floats(0.5, 300))


@settings(max_examples=60, deadline=None)
@given(PATHS, st.sampled_from(["1", "1.05", "1.1"]))
def test_fault_current_falls_along_the_path(path, c):
    result = out("fault-current", **path, voltage_factor=c)
    for kind in ("fault_a", "ln_a", "peak_a"):
        along = [result[f"{node}_{kind}"] for node in ("main", "panel", "equipment")]
        assert along == sorted(along, reverse=True), kind


@settings(max_examples=40, deadline=None)
@given(PATHS)
def test_infinite_source_and_iec_maximum_are_upper_bounds(path):
    plain = out("fault-current", **path)
    infinite = out("fault-current", **dict(path, source_mva=None))
    iec = out("fault-current", **path, voltage_factor="1.1")
    for node in ("main", "panel", "equipment"):  # 1e-12: float rounding where they are equal
        assert infinite[f"{node}_fault_a"] >= plain[f"{node}_fault_a"] * (1 - 1e-12)
        # c = 1.1 with K_T ≤ 0.95 × 1.1 and c_Q = 1.1: |Z| grows by at most 1.1 (computed)
        assert iec[f"{node}_fault_a"] >= plain[f"{node}_fault_a"] * (1 - 1e-12)


def test_longer_feeder_lowers_the_panel_current():
    currents = [out("fault-current", feeder_length=f"{ft} ft")["panel_fault_a"]
                for ft in (10, 50, 200, 800)]
    assert currents == sorted(currents, reverse=True)


def test_chart_follows_the_path_from_the_secondary_to_the_equipment():
    result = run("fault-current", main_rating="22 kA")
    chart, result = result["series"], values(result)
    three = chart["y"][0]["values"]  # the chart sums 12 pieces of each run: rounding, 1e-9
    assert three[0] == pytest.approx(result["main_fault_a"] / 1e3, rel=1e-12)
    panel = result["panel_fault_a"] / 1e3
    assert three[fault_current.CHART_SEGMENTS] == pytest.approx(panel, rel=1e-9)
    assert three[-1] == pytest.approx(result["equipment_fault_a"] / 1e3, rel=1e-9)
    assert chart["x"]["values"][-1] == pytest.approx((120 + 50) * 0.3048, rel=1e-12)
    assert {"axis": "y", "value": 22.0, "label": "Main rating"} in chart["marks"]


# ---- fault-current: ratings and their thresholds --------------------------------------------

def test_interrupting_rating_fails_when_the_available_current_exceeds_it():
    # Default path: 15.7 kA at the secondary (IEEE 141 method, I_FL × 100/%Z = 902 × 100/5.75).
    status = checks(run("fault-current", main_rating="10 kA", panel_rating="65 kA",
                        equipment_rating="10 kA"))
    assert status["main_rating"] == "fail" and status["panel_rating"] == "pass"
    assert status["equipment_rating"] == "pass"  # 5.8 kA at the end of 50 ft of 8 AWG


@pytest.mark.parametrize("source_mva", [None, 100])
@pytest.mark.parametrize("node", ["main", "panel", "equipment"])
def test_interrupting_rating_threshold_is_the_larger_available_current(node, source_mva):
    # NEC 110.9: the rating must be at least the current available; the duty is the larger of
    # the three-phase and line-to-neutral currents (a finite source makes line-to-neutral the
    # larger at the secondary).
    available = out("fault-current", source_mva=source_mva)
    duty = max(available[f"{node}_fault_a"], available[f"{node}_ln_a"])
    for factor, status in ((OUTSIDE, "pass"), (INSIDE, "fail")):  # rating in kA
        result = run("fault-current", source_mva=source_mva,
                     **{f"{node}_rating": duty * factor / 1e3})
        assert checks(result)[f"{node}_rating"] == status


def test_line_to_neutral_duty_is_used_where_it_is_larger():
    # A finite supply: its impedance is in Z1 but not in the Dyn transformer's Z0, so at the
    # secondary I''k1 = 3 U/√3 / |2 Z1 + Z0| > I''k3 (IEC 60909-0 §4.2.1.3, from memory).
    result = run("fault-current", source_mva=100, main_rating=15.9)
    available = values(result)
    assert available["main_ln_a"] > available["main_fault_a"]
    assert "line-to-neutral" in check_message(result, "main_rating")


def test_x_r_above_the_ul_489_test_circuit_warns():
    # UL 489 test power factor above 20 kA: 0.15–0.20 (read, TSEWG TP-6 Table 1) -> X/R ≤
    # √(1/0.2² − 1) = 4.899 (computed). The 750 kVA secondary has X/R 6.
    assert protection.rating_test_x_r(22e3) == pytest.approx(math.sqrt(24), rel=1e-12)
    assert protection.rating_test_x_r(10e3) == pytest.approx(math.sqrt(3), rel=1e-12)
    status = checks(run("fault-current", main_rating="22 kA"))
    assert status["main_rating"] == "pass" and status["main_x_r"] == "warn"
    assert "main_x_r" not in checks(run("fault-current", main_rating="22 kA", xfmr_x_r=4))


@pytest.mark.parametrize("rating", [5e3, 15e3, 22e3])
def test_ul_489_test_x_r_threshold(rating):
    # On an infinite bus the X/R at the secondary is the transformer's own (computed), so the
    # transformer X/R puts the secondary 1 % either side of the rating's test X/R.
    limit = protection.rating_test_x_r(rating)
    inside = checks(run("fault-current", main_rating=rating / 1e3, xfmr_x_r=limit * INSIDE))
    outside = checks(run("fault-current", main_rating=rating / 1e3, xfmr_x_r=limit * OUTSIDE))
    assert "main_x_r" not in inside and outside["main_x_r"] == "warn"


@pytest.mark.parametrize("band", [0, 1])
def test_ul_489_power_factor_band_thresholds(band):
    # The test power factor changes at 10 kA and 20 kA (UL 489, read, TSEWG TP-6): an X/R between
    # the two bands' test X/R warns just below the band edge and passes just above it.
    edge = protection.UL489_TEST_POWER_FACTOR[band][0]
    x_r = math.sqrt(protection.rating_test_x_r(edge * INSIDE)
                    * protection.rating_test_x_r(edge * OUTSIDE))
    below = checks(run("fault-current", main_rating=edge * INSIDE / 1e3, xfmr_x_r=x_r))
    above = checks(run("fault-current", main_rating=edge * OUTSIDE / 1e3, xfmr_x_r=x_r))
    assert below["main_x_r"] == "warn" and "main_x_r" not in above


def test_low_voltage_factor_on_a_medium_voltage_secondary_warns():
    status = checks(run("fault-current", secondary_v="4160 V", voltage_factor="1.05",
                        source_v="13.8 kV", feeder_size="1/0", branch_size="6 AWG"))
    assert status["voltage_factor"] == "warn"


@pytest.mark.parametrize("voltage_factor", ["1", "1.05", "1.1"])
def test_iec_60909_low_voltage_limit_threshold(voltage_factor):
    # IEC 60909-0 Table 1 (read, as reproduced in pandapower's docs): c_max = 1.05 only at low
    # voltage, up to 1 kV; above it c_max is 1.10. Only c = 1.05 on a secondary above the limit
    # warns.
    limit = transformers.LOW_VOLTAGE_LIMIT_V
    inside = checks(run("fault-current", secondary_v=limit * INSIDE,
                        voltage_factor=voltage_factor))
    outside = checks(run("fault-current", secondary_v=limit * OUTSIDE,
                         voltage_factor=voltage_factor))
    assert "voltage_factor" not in inside
    assert ("voltage_factor" in outside) is (voltage_factor == "1.05")


def test_medium_voltage_caution_threshold():
    limit = transformers.LOW_VOLTAGE_LIMIT_V
    inside = run("fault-current", source_v=limit * INSIDE, secondary_v=480)
    outside = run("fault-current", source_v=limit * OUTSIDE, secondary_v=480)
    assert cautions.MEDIUM_VOLTAGE not in inside["cautions"]
    assert cautions.MEDIUM_VOLTAGE in outside["cautions"]


@pytest.mark.parametrize("inputs, field", [
    ({"source_mva": 500, "source_fault_a": "20 kA"}, "source_fault_a"),
    ({"feeder_sets": 1.5}, "feeder_sets"),
    ({"feeder_size": "3.3 mm2"}, "feeder_size"),
    ({"material": "al", "branch_size": "2.5 mm2"}, "branch_size"),
    ({"voltage_factor": "1.2"}, "voltage_factor"),
    ({"xfmr_z_pct": 0}, "xfmr_z_pct"),
    ({"feeder_length": 0}, "feeder_length"),
    ({"main_rating": "-5 kA"}, "main_rating"),
])
def test_fault_current_bad_input_names_the_field(inputs, field):
    assert list(errors("fault-current", **inputs)) == [field]


def test_fault_current_error_messages_say_what_is_allowed():
    assert "not both" in errors("fault-current", source_mva=500,
                                source_fault_a="20 kA")["source_fault_a"]
    assert "whole number" in errors("fault-current", feeder_sets=1.5)["feeder_sets"]


def test_a_conductor_without_a_published_resistance_is_refused_on_its_field(monkeypatch):
    # Every offered size has a Table 8 / IEC 60228 value (NEC 2017 Table 8 lists aluminium from
    # 18 AWG, read, as reproduced); take aluminium 16 AWG out to reach the refusal.
    monkeypatch.delitem(conductors.NEC_TABLE8_AL_STRANDED_75C, "16 AWG")
    assert "no published resistance" in errors("fault-current", material="al",
                                               feeder_size="16 AWG")["feeder_size"]
    found = errors("ground-fault-trip", **{**IEC_CIRCUIT, "breaker": "B16", "length": 10,
                                           "material": "al", "size": "16 AWG",
                                           "cpc_size": "12 AWG"})
    assert list(found) == ["size"] and "no published resistance" in found["size"]


# ---- ground-fault-trip: published values ----------------------------------------------------

IEC_CIRCUIT = {"voltage": 230, "ze": 0.35, "size": "2.5 mm2", "cpc_size": "1.5 mm2",
               "material": "cu", "conductor_temp_c": 70, "frequency_hz": 50, "circuit": "final",
               "practice": "iec"}


@pytest.mark.parametrize("code, ia", [("B32", 160), ("C32", 320), ("D32", 640), ("B6", 30),
                                      ("D125", 2500)])
def test_operating_current_is_the_upper_iec_60898_band_limit(code, ia):
    # IEC 60898-1 bands B 3–5, C 5–10, D 10–20 × In (read): Ia = upper × In.
    assert protection.operating_current(protection.parse_breaker(code)) == ia


@pytest.mark.parametrize("voltage, seconds", [(100, 0.8), (120, 0.8), (121, 0.4), (127, 0.4),
                                              (230, 0.4), (231, 0.2), (277, 0.2), (400, 0.2),
                                              (401, 0.1), (480, 0.1)])
def test_table_41_1_tn_disconnection_times(voltage, seconds):
    # IEC 60364-4-41 Table 41.1, TN, AC (read): 50 < U0 ≤ 120 V 0.8 s, ≤ 230 V 0.4 s,
    # ≤ 400 V 0.2 s, > 400 V 0.1 s.
    assert protection.disconnection_time(voltage) == seconds
    assert protection.disconnection_time(voltage, "distribution") == 5.0  # 411.3.2.3 (read)


@pytest.mark.parametrize("voltage, seconds", [(120, 0.3), (230, 0.2), (400, 0.07), (690, 0.04)])
def test_table_41_1_tt_disconnection_times(voltage, seconds):
    # IEC 60364-4-41 Table 41.1, TT, AC (read); distribution circuits 1 s (411.3.2.4, from
    # memory).
    assert protection.disconnection_time(voltage, system="tt") == seconds
    assert protection.disconnection_time(voltage, "distribution", "tt") == 1.0


@pytest.mark.parametrize("code, table", [("B16", 2.87), ("B32", 1.44), ("C16", 1.44),
                                         ("C32", 0.72), ("D16", 0.72), ("D32", 0.36)])
def test_largest_zs_matches_the_bs_7671_2008_table(code, table):
    # BS 7671:2008 Table 41.3, 0.4 s, U0 = 230 V, MCBs to BS EN 60898 (from memory): the
    # table is U0 / Ia rounded to 0.01 Ω, hence abs = 0.005 Ω.
    result = out("ground-fault-trip", **IEC_CIRCUIT, breaker=code, length=10)
    assert result["zs_max"] == pytest.approx(table, abs=0.005)


def test_r1_plus_r2_of_2_5_and_1_5_mm2_at_20_and_70_c():
    # IEC 60228 Table 2 (read): 7.41 + 12.1 = 19.51 mΩ/m at 20 °C. The loop's reactance
    # (~0.2 mΩ/m) and skin effect change |z| by < 0.01 %, hence 1e-3.
    size, cpc = units.parse_conductor_size("2.5 mm2"), units.parse_conductor_size("1.5 mm2")
    cold = protection.loop_impedance_per_metre(size, cpc, "cu", 20.0, 50.0)
    assert abs(cold) == pytest.approx(19.51e-3, rel=1e-3)
    # BS 7671 practice multiplies by 1.20 for 70 °C PVC: 23.41 mΩ/m (from memory). α20 = 0.00393
    # gives 1.1965, so the practice factor is 0.3 % high: 5e-3.
    hot = protection.loop_impedance_per_metre(size, cpc, "cu", 70.0, 50.0)
    assert abs(hot) == pytest.approx(23.41e-3, rel=5e-3)


def test_iec_radial_circuit_by_hand():
    # 230 V, Ze 0.35 Ω, 30 m of 2.5/1.5 mm² Cu at 70 °C, B20. By hand from IEC 60228 (read) and
    # α20 = 0.00393 (IEC 60028): R1 + R2 = 19.51 × (1 + 0.00393 × 50) = 23.344 mΩ/m; Zs = 0.35
    # + 30 × 0.023344 = 1.0503 Ω; I = 219.0 A ≥ Ia = 5 × 20 = 100 A; L_max = (230/100 − 0.35)
    # / 0.023344 = 83.53 m. Reactance is left out by hand: 1e-3.
    per_m = 19.51e-3 * (1 + 0.00393 * 50)
    result = out("ground-fault-trip", **IEC_CIRCUIT, breaker="B20", length=30)
    assert result["zs"] == pytest.approx(0.35 + 30 * per_m, rel=1e-3)
    assert result["fault_a"] == pytest.approx(230 / (0.35 + 30 * per_m), rel=1e-3)
    assert result["trips"] is True and result["ia"] == 100
    assert result["max_length"] == pytest.approx((2.3 - 0.35) / per_m, rel=1e-3)
    assert result["disconnection_time"] == 0.4


def test_north_american_branch_by_hand():
    # 120 V, Ze 0.15 Ω, 100 ft of 12 AWG Cu with a 12 AWG EGC at 75 °C, 20 A breaker with a 10x
    # instantaneous ± 20 %: NEC Chapter 9 Table 8 (read) 1.98 Ω/kft per conductor -> 0.396 Ω;
    # Zs = 0.546 Ω; I = 219.8 A < Ia = 240 A: it does not trip instantaneously. L_max =
    # (0.5 − 0.15) / 3.96 Ω/kft = 88.4 ft. NEC Table 9 XL (0.054 Ω/kft each, read) adds
    # 0.04 % to |z|, hence 1e-3.
    result = out("ground-fault-trip", voltage=120, ze=0.15, size="12 AWG", cpc_size="12 AWG",
                 length="100 ft", breaker="20 A 10x", conductor_temp_c=75)
    assert result["zs"] == pytest.approx(0.15 + 0.396, rel=1e-3)
    assert result["trips"] is False and result["ia"] == pytest.approx(240, rel=1e-12)
    assert result["max_length"] == pytest.approx(0.35 / 3.96 * 1000 * 0.3048, rel=1e-3)


def test_loop_impedance_and_longest_run_are_inverse():
    # Round trip: the earth fault loop impedance at the longest run is U0 / Ia (computed).
    z = protection.loop_impedance_per_metre(units.parse_conductor_size("4 mm2"),
                                            units.parse_conductor_size("2.5 mm2"), "cu", 70, 50)
    longest = protection.max_length_for_disconnection(230.0, 0.2, z, 160.0)
    assert protection.earth_fault_loop_impedance(0.2, z, longest) == pytest.approx(230 / 160,
                                                                                   rel=1e-12)
    assert protection.max_length_for_disconnection(230.0, 2.0, z, 160.0) == 0.0


def test_moulded_case_tolerance_moves_ia():
    assert protection.operating_current(protection.parse_breaker("100 A 10x", 0)) == 1000
    assert protection.operating_current(protection.parse_breaker("100 A 10x", 20)) == \
        pytest.approx(1200, rel=1e-12)
    assert protection.operating_current(protection.parse_breaker("250 a 7.5X", 10)) == \
        pytest.approx(250 * 7.5 * 1.1, rel=1e-12)


def test_breaker_codes_beyond_the_form_list_are_accepted():
    # The form lists common breakers; any code of the syntax works from a link or the CLI.
    result = out("ground-fault-trip", **IEC_CIRCUIT, breaker="250 A 7x", length=10,
                 trip_tolerance_pct=0)
    assert result["ia"] == pytest.approx(1750, rel=1e-12)
    listed = api.get("ground-fault-trip").input("breaker").suggestions
    assert "250 A 7x" not in listed and "B16" in listed and "100 A 10x" in listed


# ---- ground-fault-trip: thresholds ----------------------------------------------------------

def _tn_status(breaker, ze, length=0):
    result = run("ground-fault-trip", **{**IEC_CIRCUIT, "ze": ze}, breaker=breaker,
                 length=length)
    return result, checks(result)["tn_condition"]


@pytest.mark.parametrize("letter", list(protection.MCB_INSTANTANEOUS_BANDS))
def test_magnetic_trip_multiple_threshold(letter):
    # IEC 60898-1 (read): the B / C / D trip surely acts at the upper band limit × In; with
    # length 0, Zs = Ze lands the fault current 1 % either side of that Ia.
    ia = protection.MCB_INSTANTANEOUS_BANDS[letter][1] * 16
    _, inside = _tn_status(f"{letter}16", 230 / ia * INSIDE)
    result, outside = _tn_status(f"{letter}16", 230 / ia * OUTSIDE)
    assert inside == "pass" and outside == "fail"
    assert "no length of cable passes" in check_message(result, "tn_condition")


def test_moulded_case_pickup_tolerance_threshold():
    # Ia = m × (1 + tolerance) × In (common practice, from memory).
    ia = 10 * (1 + protection.MCCB_TOLERANCE_PCT / 100) * 100
    _, inside = _tn_status("100 A 10x", 230 / ia * INSIDE)
    _, outside = _tn_status("100 A 10x", 230 / ia * OUTSIDE)
    assert inside == "pass" and outside == "fail"


@pytest.mark.parametrize("breaker", ["B16", "C32", "63 A 8x"])
def test_tn_condition_threshold_along_the_run(breaker):
    # IEC 60364-4-41 411.4.4 (read as quoted): Zs × Ia ≤ U0; the longest run is where it is
    # equal, so 1 % shorter passes and 1 % longer fails.
    longest = out("ground-fault-trip", **IEC_CIRCUIT, breaker=breaker, length=1)["max_length"]
    _, inside = _tn_status(breaker, IEC_CIRCUIT["ze"], longest * INSIDE)
    result, outside = _tn_status(breaker, IEC_CIRCUIT["ze"], longest * OUTSIDE)
    assert inside == "pass" and outside == "fail"
    assert "Shorten the run" in check_message(result, "tn_condition")


@pytest.mark.parametrize("band", range(len(protection.TABLE_41_1_S) - 1))
@pytest.mark.parametrize("system, column", [("tn", 1), ("tt", 2)])
def test_table_41_1_band_thresholds(band, system, column):
    # IEC 60364-4-41 Table 41.1 (read): each band ends at its highest U0 inclusive.
    highest = protection.TABLE_41_1_S[band][0]
    time_in, time_next = (protection.TABLE_41_1_S[band][column],
                          protection.TABLE_41_1_S[band + 1][column])
    assert protection.disconnection_time(highest * INSIDE, system=system) == time_in
    assert protection.disconnection_time(highest * OUTSIDE, system=system) == time_next
    if system == "tn":  # the calculator judges TN circuits
        voltage = out("ground-fault-trip", **dict(IEC_CIRCUIT, voltage=highest * OUTSIDE),
                      breaker="B16", length=1)
        assert voltage["disconnection_time"] == time_next


def test_table_41_1_lowest_voltage_threshold():
    # Table 41.1 starts above 50 V (read): 1 % above is judged, 1 % below is refused.
    lowest = protection.TABLE_41_1_LOWEST_U0_V
    assert out("ground-fault-trip", **dict(IEC_CIRCUIT, voltage=lowest * OUTSIDE),
               breaker="B6", length=1)["disconnection_time"] == protection.TABLE_41_1_S[0][1]
    assert "voltage" in errors("ground-fault-trip", **dict(IEC_CIRCUIT, voltage=lowest * INSIDE),
                               breaker="B6", length=1)


def test_table_41_1_scope_threshold():
    # 411.3.2.2 (read): Table 41.1 applies to final circuits up to 32 A.
    limit = protection.TABLE_41_1_MAX_RATING_A
    inside = checks(run("ground-fault-trip", **IEC_CIRCUIT, breaker=f"{limit * INSIDE:g} A 5x",
                        length=5))
    outside = checks(run("ground-fault-trip", **IEC_CIRCUIT, breaker=f"{limit * OUTSIDE:g} A 5x",
                         length=5))
    distribution = checks(run("ground-fault-trip", **dict(IEC_CIRCUIT, circuit="distribution"),
                              breaker=f"{limit * OUTSIDE:g} A 5x", length=5))
    assert "table_41_1_scope" not in inside and outside["table_41_1_scope"] == "warn"
    assert "table_41_1_scope" not in distribution
    assert checks(run("ground-fault-trip", **IEC_CIRCUIT, breaker="B40",
                      length=5))["table_41_1_scope"] == "warn"


def test_mcb_voltage_threshold():
    # IEC 60898-1 covers breakers up to 440 V AC between phases (from memory): on a wye system
    # that is √3 U0, so the threshold on the U0 field is 440 / √3 = 254.0 V (computed).
    # Moulded-case breakers are not held to it.
    limit = protection.MCB_MAX_VOLTAGE_V / math.sqrt(3)
    inside = checks(run("ground-fault-trip", **dict(IEC_CIRCUIT, voltage=limit * INSIDE),
                        breaker="B16", length=5))
    outside = checks(run("ground-fault-trip", **dict(IEC_CIRCUIT, voltage=limit * OUTSIDE),
                         breaker="B16", length=5))
    moulded = checks(run("ground-fault-trip", **dict(IEC_CIRCUIT, voltage=limit * OUTSIDE),
                         breaker="16 A 5x", length=5))
    assert "mcb_voltage" not in inside and outside["mcb_voltage"] == "warn"
    assert "mcb_voltage" not in moulded


@pytest.mark.parametrize("practice", ["iec", None])
@pytest.mark.parametrize("u0, line, warns", [(230, 398, False), (240, 416, False),
                                             (277, 480, True), (347, 601, True)])
def test_issue_11_mcb_on_277_480_and_347_600_systems_warns(u0, line, warns, practice):
    # Issue 11 item 7: IEC 60898-1's 440 V is between phases (from memory). The old code
    # compared U0 with it, so a B16 on 277/480 V or 347/600 V got no warning (277 V < 440 V).
    # Now √3 U0 is compared: 480 V and 601 V are above 440 V; 230/400 and 240/415 V are within.
    # (practice None: the default, North American, with no input the old code lacked.)
    circuit = {k: v for k, v in IEC_CIRCUIT.items() if k != "practice"}
    if practice:
        circuit["practice"] = practice
    result = run("ground-fault-trip", **dict(circuit, voltage=u0), breaker="B16", length=5)
    assert ("mcb_voltage" in checks(result)) is warns
    if warns:
        assert f"{line} V" in check_message(result, "mcb_voltage")


def test_size_warnings():
    mixed = checks(run("ground-fault-trip", **dict(IEC_CIRCUIT, cpc_size="14 AWG"),
                       breaker="B16", length=5))
    assert mixed["size_systems"] == "warn"
    same = checks(run("ground-fault-trip", **dict(IEC_CIRCUIT, cpc_size="2.5 mm2"),
                      breaker="B16", length=5))
    larger = checks(run("ground-fault-trip", **dict(IEC_CIRCUIT, cpc_size="4 mm2"),
                        breaker="B16", length=5))
    assert "cpc_larger" not in same and larger["cpc_larger"] == "warn"


# ---- ground-fault-trip: North American practice (issue 11 item 7) ------------------------

NA_CIRCUIT = {"voltage": 120, "ze": 0.15, "size": "12 AWG", "cpc_size": "12 AWG",
              "conductor_temp_c": 75, "breaker": "20 A 10x"}


def test_issue_11_nec_circuit_is_judged_by_the_effective_path_not_table_41_1():
    # Issue 11 item 7: with North American defaults the old code judged a 120 V NEC circuit by
    # IEC 60364-4-41 411.4.4 with a Table 41.1 time (check "tn_condition", output
    # disconnection_time = 0.8 s). NEC 250.4(A)(5) asks for an effective ground-fault current
    # path that operates the device; the IEC time is shown for information only.
    result = run("ground-fault-trip")
    status = checks(result)
    assert "tn_condition" not in status and status["ground_fault_path"] == "pass"
    assert "250.4(A)(5)" in check_message(result, "ground_fault_path")
    assert "disconnection_time" not in result["outputs"]
    info = [s for s in result["steps"] if "not judged" in s["text"]]
    assert len(info) == 1 and "Table 41.1" in info[0]["text"]
    assert not any("60364" in c["message"] for c in result["checks"])


def test_iec_practice_keeps_the_table_41_1_judgement():
    result = run("ground-fault-trip", **IEC_CIRCUIT, breaker="B20", length=30)
    assert checks(result)["tn_condition"] == "pass" and "ground_fault_path" not in checks(result)
    assert values(result)["disconnection_time"] == 0.4  # Table 41.1, TN, 230 V (read)


@pytest.mark.parametrize("breaker", ["20 A 10x", "MCP 50 A 8x", "30 A fuse", "C16"])
def test_effective_path_threshold_is_the_instantaneous_pickup_with_tolerance(breaker):
    # NEC 250.4(A)(5) judged as I_f ≥ Ia, Ia the pickup with its tolerance (± 20 %, common
    # practice), the fuse's quick-melting multiple (10 ×, common practice) or the IEC 60898-1
    # upper band limit; with length 0, Zs = Ze lands I_f 1 % either side of Ia.
    ia = protection.operating_current(protection.parse_breaker(breaker))
    for factor, status in ((INSIDE, "pass"), (OUTSIDE, "fail")):
        result = run("ground-fault-trip", **dict(NA_CIRCUIT, breaker=breaker,
                                                 ze=120 / ia * factor), length=0)
        assert checks(result)["ground_fault_path"] == status
        assert values(result)["ia"] == pytest.approx(ia, rel=1e-12)


def test_instantaneous_clearing_by_hand():
    # 120 V, Zs = 0.546 Ω (the dairy barn by hand from NEC Chapter 9 Table 8, read):
    # I_f = 219.8 A; 20 A at 10 × + 20 % -> Ia = 240 A: does not clear; margin 0.916.
    clearing = protection.instantaneous_clearing(120.0, 0.546,
                                                 protection.parse_breaker("20 A 10x"))
    assert clearing.fault_a == pytest.approx(219.78, rel=1e-4)
    assert clearing.required_a == pytest.approx(240.0, rel=1e-12) and clearing.clears is False
    assert clearing.margin == pytest.approx(219.78 / 240, rel=1e-4)
    assert clearing.loop_impedance_max == pytest.approx(0.5, rel=1e-12)
    # an instantaneous-trip breaker (MCP) set at 8 × 50 A with ± 20 %: Ia = 480 A; a fuse of
    # 30 A melts quickly at 10 × = 300 A (common practice) or at the multiple given.
    assert protection.operating_current(protection.parse_breaker("MCP 50 A 8x")) == \
        pytest.approx(480, rel=1e-12)
    assert protection.operating_current(protection.parse_breaker("30 A fuse")) == 300
    assert protection.operating_current(protection.parse_breaker("30 A fuse 15x")) == 450
    for bad in (0.0, -1.0):
        with pytest.raises(ParameterError, match="above 0"):
            protection.instantaneous_clearing(120.0, bad, protection.parse_breaker("B16"))


def test_suggested_smaller_device_comes_from_the_published_series():
    # The dairy barn fails (219.8 A < 240 A); the largest NEC 240.6(A) rating (read) the fault
    # still trips at 10 × + 20 % is 15 A (15 × 12 = 180 A ≤ 219.8 A < 20 × 12 = 240 A).
    result = run("ground-fault-trip", **NA_CIRCUIT, length="100 ft")
    assert checks(result)["ground_fault_path"] == "fail"
    assert "15 A 10x" in check_message(result, "ground_fault_path")
    assert "NEC 240.6(A)" in check_message(result, "ground_fault_path")
    assert 15 in protection.NEC_STANDARD_RATINGS_A
    # IEC 60898-1 preferred ratings (read): a B32 on 219.8 A -> B40 would still trip (200 A),
    # and 219.8 A falls short of a C32's 320 A -> C20 (200 A).
    b32 = protection.parse_breaker("B32")
    assert protection.largest_clearing_rating(219.8, b32) == 40
    assert protection.largest_clearing_rating(219.8, protection.parse_breaker("C32")) == 20
    assert protection.largest_clearing_rating(10.0, b32) is None
    for rating in (40, 20):
        assert rating in protection.MCB_PREFERRED_RATINGS_A


@pytest.mark.parametrize("rating, material, size", [
    (15, "cu", "14 AWG"), (20, "cu", "12 AWG"), (60, "cu", "10 AWG"), (100, "cu", "8 AWG"),
    (200, "cu", "6 AWG"), (400, "cu", "3 AWG"), (800, "cu", "1/0 AWG"), (6000, "cu", "800 kcmil"),
    (15, "al", "12 AWG"), (100, "al", "6 AWG"), (1200, "al", "250 kcmil"),
    (6000, "al", "1250 kcmil"), (61, "cu", "8 AWG"), (30, "cu", "10 AWG"),
])
def test_nec_table_250_122_rows(rating, material, size):
    # NEC Table 250.122 (read, as reproduced by Bruns Engineering): the first row whose rating
    # the device does not exceed.
    assert protection.egc_minimum_size(rating, material)[0] == size
    assert protection.egc_minimum_size(6001, material) is None


def test_egc_size_check_follows_table_250_122():
    # 60 A -> 10 AWG Cu (Table 250.122, read). 12 AWG fails; 10 AWG passes; an EGC the size of
    # the circuit conductors passes whatever the table says (250.122(A)).
    base = dict(NA_CIRCUIT, breaker="60 A 10x", size="6 AWG", length=10)
    assert checks(run("ground-fault-trip", **dict(base, cpc_size="10 AWG")))["egc_size"] == "pass"
    assert checks(run("ground-fault-trip", **dict(base, cpc_size="12 AWG")))["egc_size"] == "fail"
    same = dict(base, size="12 AWG")
    assert checks(run("ground-fault-trip", **same))["egc_size"] == "pass"
    assert "egc_size" not in checks(run("ground-fault-trip", **IEC_CIRCUIT, breaker="B20",
                                        length=5))


@pytest.mark.parametrize("edge", [0, 1])
def test_ground_fault_trip_plausibility_ze_thresholds(edge):
    # ZE_USUAL_OHM (common practice): 1 % inside passes, 1 % outside warns.
    from calc.calculators import ground_fault_trip as gft
    limit = gft.ZE_USUAL_OHM[edge]
    inside = limit * (OUTSIDE if edge == 0 else INSIDE)
    outside = limit * (INSIDE if edge == 0 else OUTSIDE)
    passing = run("ground-fault-trip", **dict(NA_CIRCUIT, ze=inside), length=1)
    assert checks(passing)["plausibility"] == "pass"
    result = run("ground-fault-trip", **dict(NA_CIRCUIT, ze=outside), length=1)
    assert checks(result)["plausibility"] == "warn" and "Ze" in check_message(result,
                                                                           "plausibility")


def test_ground_fault_trip_plausibility_low_voltage_threshold():
    # Low voltage ends at 1000 V between phases (IEC 60038 / NEC, from memory): U0 = 1000/√3.
    limit = transformers.LOW_VOLTAGE_LIMIT_V / math.sqrt(3)
    inside = run("ground-fault-trip", **dict(NA_CIRCUIT, voltage=limit * INSIDE,
                                             breaker="100 A 10x"), length=1)
    outside = run("ground-fault-trip", **dict(NA_CIRCUIT, voltage=limit * OUTSIDE,
                                              breaker="100 A 10x"), length=1)
    assert checks(inside)["plausibility"] == "pass"
    assert checks(outside)["plausibility"] == "warn"
    assert "low voltage" in check_message(outside, "plausibility")


# ---- ground-fault-trip: limiting cases and properties ---------------------------------------

def test_zero_length_leaves_ze():
    result = out("ground-fault-trip", **IEC_CIRCUIT, breaker="B16", length=0)
    assert result["zs"] == 0.35 and result["r1_r2"] == 0


def test_ze_above_the_breaker_limit_leaves_no_length():
    result = run("ground-fault-trip", **dict(IEC_CIRCUIT, ze=1.5), breaker="C32", length=5)
    assert values(result)["max_length"] == 0
    assert "no length of cable passes" in check_message(result, "tn_condition")


CIRCUITS = st.fixed_dictionaries({
    "voltage": st.sampled_from([120, 230, 277]), "ze": st.floats(0.01, 1.0),
    "size": st.sampled_from(["1.5 mm2", "2.5 mm2", "6 mm2", "14 AWG", "10 AWG"]),
    "cpc_size": st.sampled_from(["1 mm2", "1.5 mm2", "14 AWG", "12 AWG"]),
    "breaker": st.sampled_from(["B6", "B16", "C10", "C20", "D16", "15 A 10x", "30 A 5x"]),
    "conductor_temp_c": st.floats(20, 90), "circuit": st.sampled_from(["final", "distribution"]),
})


@settings(max_examples=60, deadline=None)
@given(CIRCUITS, st.floats(0.5, 300))
def test_max_length_is_where_zs_times_ia_equals_u0(circuit, length):
    result = out("ground-fault-trip", **circuit, length=length)
    if result["max_length"] == 0:
        return  # Ze alone is over the limit (tested above)
    at_limit = out("ground-fault-trip", **circuit, length=result["max_length"])  # 1e-9: rounding
    assert at_limit["zs"] * at_limit["ia"] == pytest.approx(circuit["voltage"], rel=1e-9)
    # the longest run does not depend on the length entered
    assert at_limit["max_length"] == pytest.approx(result["max_length"], rel=1e-12)
    shorter = out("ground-fault-trip", **circuit, length=result["max_length"] * 0.999)
    longer = out("ground-fault-trip", **circuit, length=result["max_length"] * 1.001)
    assert shorter["trips"] is True and longer["trips"] is False


@settings(max_examples=40, deadline=None)
@given(CIRCUITS, st.floats(0.5, 200), st.floats(1.0, 3.0))
def test_a_longer_run_never_trips_more_readily(circuit, length, factor):
    short = out("ground-fault-trip", **circuit, length=length)
    long_ = out("ground-fault-trip", **circuit, length=length * factor)
    assert long_["zs"] >= short["zs"] and long_["fault_a"] <= short["fault_a"]
    assert not (long_["trips"] and not short["trips"])


def test_max_length_agrees_with_a_scipy_root_of_the_tn_condition():
    # brentq on Zs(L) × Ia − U0 using the calculator's own Zs at each length, to 1e-12 m.
    optimize = pytest.importorskip("scipy.optimize")
    ia = out("ground-fault-trip", **IEC_CIRCUIT, breaker="C16", length=1)["ia"]
    root = optimize.brentq(
        lambda length: out("ground-fault-trip", **IEC_CIRCUIT, breaker="C16",
                           length=length)["zs"] * ia - 230, 0, 5000, xtol=1e-12)
    assert out("ground-fault-trip", **IEC_CIRCUIT, breaker="C16", length=1)["max_length"] == \
        pytest.approx(root, rel=1e-9)


def test_chart_crosses_the_limit_at_the_longest_run():
    result = run("ground-fault-trip", **IEC_CIRCUIT, breaker="B32", length=20)
    chart, result = result["series"], values(result)
    limit = next(m["value"] for m in chart["marks"] if m["axis"] == "y")
    assert limit == pytest.approx(result["zs_max"], rel=1e-12)
    longest = next(m["value"] for m in chart["marks"] if m["label"] == "Longest run")
    assert longest == pytest.approx(result["max_length"], rel=1e-12)
    assert chart["y"][0]["values"][0] == pytest.approx(0.35, rel=1e-12)


@pytest.mark.parametrize("inputs, field", [
    ({"breaker": "B17"}, "breaker"),
    ({"breaker": "E16"}, "breaker"),
    ({"breaker": "100 A 50x"}, "breaker"),
    ({"breaker": "100 A"}, "breaker"),
    ({"cpc_size": ""}, "cpc_size"),
    ({"cpc_size": "none"}, "cpc_size"),
    ({"material": "al", "cpc_size": "2.5 mm2", "size": "16 mm2"}, "cpc_size"),
    ({"material": "al", "size": "4 mm2", "cpc_size": "16 mm2"}, "size"),
    ({"voltage": 48}, "voltage"),
    ({"length": "-3 m"}, "length"),
    ({"ze": 0}, "ze"),
    ({"circuit": "sub-main"}, "circuit"),
])
def test_ground_fault_trip_bad_input_names_the_field(inputs, field):
    assert list(errors("ground-fault-trip", **{**IEC_CIRCUIT, "breaker": "B16", "length": 10,
                                               **inputs})) == [field]


def test_bad_breaker_message_lists_the_forms_and_every_wrong_field_at_once():
    refused = errors("ground-fault-trip", **dict(IEC_CIRCUIT, breaker="B17", length=10,
                                                 voltage=20))
    assert sorted(refused) == ["breaker", "voltage"]
    message = refused["breaker"]
    assert "'B17': 17 A is not an IEC 60898-1 preferred rating" in message
    assert "e.g. 100 A 10x" in message and len(message) < 600  # the forms, not every choice


@pytest.mark.parametrize("code, match", [
    ("B17", r"not an IEC 60898-1 preferred rating.*6, 10, 13, 16.*100 A 10x"),
    ("100 A 50x", r"multiple 2x to 20x"),
    ("sixteen", r"not a breaker code"),
])
def test_parse_breaker_refuses_with_a_parameter_error(code, match):
    # Physics names its own parameter, never the form's field.
    with pytest.raises(ParameterError, match=match) as raised:
        protection.parse_breaker(code)
    assert raised.value.parameter == "code" and raised.value.value == code


# ---- gfci-check: published values -----------------------------------------------------------

def test_ul_943_curve_published_form():
    # UL 943 (read as quoted): T = (20/I)^1.43 with I in mA and T in s. pint carries the units,
    # so the A-based implementation is checked against the mA formula exactly as published.
    pint = pytest.importorskip("pint")
    ureg = pint.UnitRegistry()
    for milliamps in (6, 10, 20, 50, 100, 264):
        published = (20 / milliamps) ** 1.43
        current = (milliamps * ureg.mA).to(ureg.A).magnitude
        assert protection.gfci_time_limit(current) == pytest.approx(published, rel=1e-12)
    assert protection.gfci_time_limit(0.020) == pytest.approx(1.0, rel=1e-12)  # 20 mA -> 1 s


@pytest.mark.parametrize("milliamps, ok", [(3.9, False), (4.0, True), (5.1, True), (6.0, True),
                                           (6.1, False)])
def test_gfci_trip_current_window(milliamps, ok):
    # UL 943 Class A (read): must not trip below 4 mA; must trip at 6 mA and above.
    assert out("gfci-check", device="gfci", trip_current=f"{milliamps} mA")["passes"] is ok


@pytest.mark.parametrize("milliamps, ok", [(15.0, False), (15.1, True), (30.0, True),
                                           (30.5, False)])
def test_rcd_trip_current_window(milliamps, ok):
    # IEC 61008-1 (from memory): no trip at 50 % IΔn, trip by IΔn.
    result = out("gfci-check", device="rcd", rated_residual=30, trip_current=f"{milliamps} mA")
    assert result["passes"] is ok


@pytest.mark.parametrize("device, rated, test, limit, least", [
    ("rcd", 30, 30, 0.3, None), ("rcd", 30, 60, 0.15, None), ("rcd", 30, 150, 0.04, None),
    ("rcd", 30, 45, 0.3, None), ("rcd", 30, 400, 0.04, None),
    ("rcd-s", 100, 100, 0.5, 0.13), ("rcd-s", 100, 200, 0.2, 0.06),
    ("rcd-s", 300, 1500, 0.15, 0.05),
])
def test_rcd_break_time_limits(device, rated, test, limit, least):
    # IEC 61008-1 / 61009-1 break times: general 300 / 150 / 40 ms at 1 / 2 / 5 IΔn and type S
    # at most 500 / 200 / 150 ms (read, as reproduced; see protection.RCD_BREAK_TIMES_S); type S
    # at least 130 / 60 / 50 ms (from memory).
    result = out("gfci-check", device=device, rated_residual=rated, test_current=test,
                 trip_time="1 ms")
    assert result["time_limit"] == pytest.approx(limit, rel=1e-12)
    assert result.get("min_time") == (None if least is None else pytest.approx(least, rel=1e-12))


@pytest.mark.parametrize("inputs, ok", [
    ({"device": "rcd", "trip_time": "299 ms"}, True),
    ({"device": "rcd", "trip_time": "301 ms"}, False),
    ({"device": "rcd", "test_current": 150, "trip_time": "41 ms"}, False),
    ({"device": "rcd", "test_current": 15, "trip_time": "20 ms"}, False),  # tripped at 50 %
    ({"device": "rcd", "test_current": 21, "trip_time": "2 s"}, True),  # no time below IΔn
    ({"device": "rcd-s", "rated_residual": 100, "trip_time": "120 ms"}, False),  # too fast
    ({"device": "rcd-s", "rated_residual": 100, "trip_time": "200 ms"}, True),
    ({"device": "gfci", "test_current": 10, "trip_time": "2.6 s"}, True),  # 2^1.43 = 2.69 s
    ({"device": "gfci", "test_current": 10, "trip_time": "2.8 s"}, False),
    ({"device": "gfci", "test_current": 3, "trip_time": "1 s"}, False),  # below 4 mA
    ({"device": "gfci", "test_current": 5, "trip_time": "9 s"}, True),  # 4–6 mA: no time
])
def test_trip_time_judgement(inputs, ok):
    assert out("gfci-check", **inputs)["passes"] is ok


def test_gfci_formula_outside_its_range_warns():
    status = checks(run("gfci-check", device="gfci", test_current="300 mA", trip_time="20 ms"))
    assert status["curve_range"] == "warn" and status["trip_time"] == "pass"


@settings(max_examples=100, deadline=None)
@given(st.floats(6e-3, 264e-3), st.floats(1.0, 3.0))
def test_more_current_is_never_allowed_more_time(current, factor):
    assert protection.gfci_time_limit(current * factor) <= protection.gfci_time_limit(current)
    for device in ("rcd", "rcd-s"):
        low = protection.rcd_time_limits(current * 4, 0.01, device)
        high = protection.rcd_time_limits(current * 4 * factor, 0.01, device)
        if low is not None:
            assert high[1] <= low[1]


def test_nothing_measured_warns_and_gives_no_verdict():
    result = run("gfci-check", device="gfci")
    assert checks(result)["measured"] == "warn" and "passes" not in result["outputs"]
    assert any("TEST button checks the mechanism only" in c for c in result["cautions"])


# ---- gfci-check: thresholds -----------------------------------------------------------------

def _gfci(**inputs):
    result = run("gfci-check", **inputs)
    return checks(result), values(result)


@pytest.mark.parametrize("limit, factor, status", [
    (protection.GFCI_NO_TRIP_A, INSIDE, "fail"), (protection.GFCI_NO_TRIP_A, OUTSIDE, "pass"),
    (protection.GFCI_MUST_TRIP_A, INSIDE, "pass"), (protection.GFCI_MUST_TRIP_A, OUTSIDE, "fail"),
])
def test_gfci_trip_current_thresholds(limit, factor, status):
    # UL 943 Class A (read): no trip below 4 mA, trip at 6 mA and above.
    status_of, _ = _gfci(device="gfci", trip_current=f"{limit * factor * 1e3} mA")
    assert status_of["trip_current"] == status


@pytest.mark.parametrize("fraction, factor, status", [
    (protection.RCD_NO_TRIP_FRACTION, INSIDE, "fail"),
    (protection.RCD_NO_TRIP_FRACTION, OUTSIDE, "pass"),
    (1.0, INSIDE, "pass"), (1.0, OUTSIDE, "fail"),
])
def test_rcd_trip_current_thresholds(fraction, factor, status):
    # IEC 61008-1 (from memory): no trip at 50 % IΔn, trip by IΔn.
    status_of, _ = _gfci(device="rcd", rated_residual=100,
                         trip_current=f"{100 * fraction * factor} mA")
    assert status_of["trip_current"] == status


@pytest.mark.parametrize("milliamps", [6.5, 10, 100, 260])
def test_gfci_trip_time_threshold(milliamps):
    # UL 943 (read as quoted): the greatest time is (20 / I)^1.43 s at the test current.
    limit = protection.gfci_time_limit(milliamps / 1e3)
    inside, _ = _gfci(device="gfci", test_current=milliamps, trip_time=limit * INSIDE * 1e3)
    outside, _ = _gfci(device="gfci", test_current=milliamps, trip_time=limit * OUTSIDE * 1e3)
    assert inside["trip_time"] == "pass" and outside["trip_time"] == "fail"


def test_gfci_timed_test_current_thresholds():
    # UL 943 (read): below 4 mA it must not trip at all; from 4 to 6 mA no time is set; from
    # 6 mA the curve applies. A long trip time passes only where no time is set.
    long_time = protection.gfci_time_limit(protection.GFCI_CURVE_RANGE_A[0]) * 1.5 * 1e3  # ms
    no_trip, start = protection.GFCI_NO_TRIP_A * 1e3, protection.GFCI_CURVE_RANGE_A[0] * 1e3
    status = {factor * edge: _gfci(device="gfci", test_current=factor * edge,
                                   trip_time=long_time)[0]["trip_time"]
              for edge in (no_trip, start) for factor in (INSIDE, OUTSIDE)}
    assert status[no_trip * INSIDE] == "fail" and status[no_trip * OUTSIDE] == "pass"
    assert status[start * INSIDE] == "pass" and status[start * OUTSIDE] == "fail"


@pytest.mark.parametrize("edge, warn_below", [(0, True), (1, False)])
def test_gfci_curve_range_thresholds(edge, warn_below):
    # UL 943 (read as quoted): the formula holds from 6 mA to 264 mA.
    milliamps = protection.GFCI_CURVE_RANGE_A[edge] * 1e3
    below, _ = _gfci(device="gfci", test_current=milliamps * INSIDE)
    above, _ = _gfci(device="gfci", test_current=milliamps * OUTSIDE)
    assert ("curve_range" in below) is warn_below and ("curve_range" in above) is not warn_below


@pytest.mark.parametrize("device, multiple", [
    (device, multiple) for device in protection.RCD_BREAK_TIMES_S
    for multiple in protection.RCD_BREAK_TIMES_S[device]])
def test_rcd_break_time_thresholds(device, multiple):
    # IEC 61008-1 / 61009-1: the greatest (read, as reproduced) and for type S the least (from
    # memory) break time at each test multiple of IΔn.
    least, greatest = protection.RCD_BREAK_TIMES_S[device][multiple]
    test = {"device": device, "rated_residual": 100, "test_current": 100 * multiple}
    assert _gfci(**test, trip_time=greatest * INSIDE * 1e3)[0]["trip_time"] == "pass"
    assert _gfci(**test, trip_time=greatest * OUTSIDE * 1e3)[0]["trip_time"] == "fail"
    if least is not None:
        assert _gfci(**test, trip_time=least * INSIDE * 1e3)[0]["trip_time"] == "fail"
        assert _gfci(**test, trip_time=least * OUTSIDE * 1e3)[0]["trip_time"] == "pass"


@pytest.mark.parametrize("device", list(protection.RCD_BREAK_TIMES_S))
def test_rcd_test_multiple_thresholds(device):
    # A test current just short of k × IΔn is held to the time of the multiple below (none
    # below IΔn); just past it, to that of k.
    table = protection.RCD_BREAK_TIMES_S[device]
    previous = None
    for multiple in table:
        _, below = _gfci(device=device, rated_residual=100, test_current=100 * multiple * INSIDE)
        _, above = _gfci(device=device, rated_residual=100, test_current=100 * multiple * OUTSIDE)
        assert below.get("time_limit") == (None if previous is None else table[previous][1])
        assert above["time_limit"] == table[multiple][1]
        previous = multiple


def test_rcd_no_trip_fraction_threshold_for_a_timed_test():
    # IEC 61008-1 (from memory): at or below 50 % IΔn an RCD must not trip at all; above it,
    # and below IΔn, no time is set.
    edge = 100 * protection.RCD_NO_TRIP_FRACTION
    inside, _ = _gfci(device="rcd", rated_residual=100, test_current=edge * INSIDE, trip_time=10)
    outside, _ = _gfci(device="rcd", rated_residual=100, test_current=edge * OUTSIDE,
                       trip_time=10)
    assert inside["trip_time"] == "fail" and outside["trip_time"] == "pass"


@pytest.mark.parametrize("device", ["rcd", "rcd-s"])
def test_additional_protection_threshold(device):
    # IEC 60364-4-41 415.1.1: IΔn ≤ 30 mA is additional protection (the 30 mA read as quoted);
    # type S RCDs are made above it (IEC 61008-1, from memory).
    milliamps = protection.ADDITIONAL_PROTECTION_A * 1e3
    inside, _ = _gfci(device=device, rated_residual=milliamps * INSIDE)
    outside, _ = _gfci(device=device, rated_residual=milliamps * OUTSIDE)
    assert inside["additional_protection"] == "pass"
    assert outside["additional_protection"] == "warn"
    assert ("type_s" in inside) is (device == "rcd-s") and "type_s" not in outside


@pytest.mark.parametrize("inputs, field", [
    ({"device": "gfci", "trip_time": "25 ms"}, "test_current"),
    ({"device": "rcbo"}, "device"),
    ({"rated_residual": 0}, "rated_residual"),
    ({"trip_time": "-5 ms"}, "trip_time"),
    ({"trip_current": "abc"}, "trip_current"),
])
def test_gfci_check_bad_input_names_the_field(inputs, field):
    assert list(errors("gfci-check", **inputs)) == [field]


# ---- the reference page -----------------------------------------------------------------------

def test_reference_page_cells_are_the_calculators_own():
    from build.reference import protection as page
    grid = page.longest_run_grid("iec")
    i = page.LONGEST_RUN_CIRCUITS["iec"]["cables"].index(("2.5 mm²", "1.5 mm²"))
    j = page.LONGEST_RUN_CIRCUITS["iec"]["breakers"].index("B20")
    result = out("ground-fault-trip", **IEC_CIRCUIT, breaker="B20", length=1)
    assert grid[i, j] == pytest.approx(result["max_length"], rel=1e-12)
    times = page.ul943_times()
    assert times[list(page.UL943_TABLE_MA).index(20)] == pytest.approx(1.0, rel=1e-12)


# ---- plausibility (issue 11 item 9) -----------------------------------------------------------

def _plausibility(calculator, **inputs):
    result = run(calculator, **inputs)
    return checks(result)["plausibility"], check_message(result, "plausibility")


@pytest.mark.parametrize("calculator", ["fault-current", "ground-fault-trip", "gfci-check"])
def test_defaults_and_ordinary_vectors_are_plausible(calculator):
    # Issue 11 item 9: ordinary equipment passes; the vectors' cases are ordinary equipment.
    import json
    from tests.vectors import VECTOR_DIR
    for region in (None, "iec"):
        result = api.run(calculator, {}, region)
        assert checks(result)["plausibility"] == "pass", region
    data = json.loads((VECTOR_DIR / f"{calculator}.json").read_text(encoding="utf-8"))
    for vector in data["vectors"]:
        if "expect" in vector:
            assert checks(api.run(calculator, vector["inputs"]))["plausibility"] == "pass", \
                vector["name"]


@pytest.mark.parametrize("name, edge, inputs", [
    ("LV_TRANSFORMER_VA", 0, {}), ("LV_TRANSFORMER_VA", 1, {}),
    ("TRANSFORMER_Z_PCT", 0, {}), ("TRANSFORMER_Z_PCT", 1, {}),
    ("TRANSFORMER_X_R", 0, {}), ("TRANSFORMER_X_R", 1, {}),
])
def test_fault_current_plausibility_range_thresholds(name, edge, inputs):
    # Each range (common practice) 1 % inside passes and 1 % outside warns.
    limit = getattr(fault_current, name)[edge]
    field = {"LV_TRANSFORMER_VA": "xfmr_kva", "TRANSFORMER_Z_PCT": "xfmr_z_pct",
             "TRANSFORMER_X_R": "xfmr_x_r"}[name]
    scale = 1e-3 if field == "xfmr_kva" else 1.0  # the field is in kVA
    inside = limit * (OUTSIDE if edge == 0 else INSIDE) * scale
    beyond = limit * (INSIDE if edge == 0 else OUTSIDE) * scale
    assert _plausibility("fault-current", **{field: inside})[0] == "pass"
    assert _plausibility("fault-current", **{field: beyond})[0] == "warn"


def test_fault_current_plausibility_interrupting_rating_threshold():
    # A 2 % transformer on an infinite bus at 480 V puts the secondary's current at
    # kVA / (√3 × 480 V × 0.02) (IEEE 141 method, computed); sized 1 % either side of the
    # 200 kA of the highest low-voltage interrupting ratings (common practice).
    def kva(factor):
        return fault_current.MAX_FAULT_LV_A * math.sqrt(3) * 480 * 0.02 / 1e3 * factor
    assert _plausibility("fault-current", xfmr_kva=kva(INSIDE), xfmr_z_pct=2)[0] == "pass"
    status, message = _plausibility("fault-current", xfmr_kva=kva(OUTSIDE), xfmr_z_pct=2)
    assert status == "warn" and "interrupting ratings" in message


def test_fault_current_plausibility_supply_level_threshold():
    # 12.47 kV primary: medium-voltage switchgear is rated to 63 kA (common practice).
    limit_ka = fault_current.MAX_FAULT_MV_A / 1e3
    assert _plausibility("fault-current", source_fault_a=limit_ka * INSIDE)[0] == "pass"
    status, message = _plausibility("fault-current", source_fault_a=limit_ka * OUTSIDE)
    assert status == "warn" and "supply" in message


def test_gfci_plausibility_preferred_residual_current():
    # IEC 61008-1 / 61009-1 preferred IΔn (from memory): 30 mA passes, 30.3 mA warns.
    assert _plausibility("gfci-check", device="rcd", rated_residual=30, trip_current=21)[0] == \
        "pass"
    assert _plausibility("gfci-check", device="rcd", rated_residual=30 * OUTSIDE,
                         trip_current=21)[0] == "warn"


def test_gfci_plausibility_fastest_trip_threshold():
    edge_ms = gfci_check.FASTEST_TRIP_S * 1e3
    assert _plausibility("gfci-check", device="rcd", trip_time=edge_ms * OUTSIDE)[0] == "pass"
    status, message = _plausibility("gfci-check", device="rcd", trip_time=edge_ms * INSIDE)
    assert status == "warn" and "faster than any device" in message


@pytest.mark.parametrize("device, top_ma", [
    ("rcd", gfci_check.RAMP_MAX_MULTIPLE * 30), ("gfci", protection.GFCI_CURVE_RANGE_A[1] * 1e3)])
def test_gfci_plausibility_ramp_reading_threshold(device, top_ma):
    # A tester's ramp stops at 1.1 IΔn (IEC 61557-6, from memory); a GFCI's readings stay within
    # UL 943's 264 mA (read as quoted).
    assert _plausibility("gfci-check", device=device, rated_residual=30,
                         trip_current=top_ma * INSIDE)[0] == "pass"
    status, message = _plausibility("gfci-check", device=device, rated_residual=30,
                                    trip_current=top_ma * OUTSIDE)
    assert status == "warn" and "ramp reading" in message


def test_gfci_plausibility_test_current_threshold():
    # Testers apply up to 5 × IΔn (IEC 61557-6 / IEC 61008-1, from memory).
    top = gfci_check.TESTER_MAX_MULTIPLE * 30
    assert _plausibility("gfci-check", device="rcd", test_current=top * INSIDE,
                         trip_time=20)[0] == "pass"
    status, message = _plausibility("gfci-check", device="rcd", test_current=top * OUTSIDE,
                                    trip_time=20)
    assert status == "warn" and "test current" in message
