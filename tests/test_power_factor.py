"""pf-correction: published multipliers and examples, limiting cases, properties (the target is
met, resonance order falls as the bank grows), independent checks with pandapower, pint and
ngspice (each skips itself when missing), one test per error path including leading/lagging
mix-ups, and every check's threshold just inside and just outside."""

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calc import api, power_factor
from calc.calculators import pf_correction
from tests import conftest, spice
from tests.conftest import check_message, checks, values

ID = "pf-correction"


def run(**inputs):
    """The pf-correction result for these inputs (the shared helper, one calculator)."""
    return conftest.run(ID, **inputs)


def errors(**inputs):
    """{field: message} of a refused pf-correction (the shared helper, one calculator)."""
    return conftest.errors(ID, **inputs)


# ---- published values -------------------------------------------------------------------------

# kvar per kW to raise the power factor: IEEE Std 141-1993 (Red Book), ch. 8, table of
# multipliers for power-factor correction — from memory, printed to 3 decimals (abs 5e-4).
MULTIPLIERS = [
    (0.60, 0.90, 0.849), (0.70, 0.90, 0.536), (0.75, 0.95, 0.553), (0.80, 0.95, 0.421),
    (0.85, 0.95, 0.291), (0.80, 1.00, 0.750), (0.70, 1.00, 1.020),
]


@pytest.mark.parametrize("now, target, multiplier", MULTIPLIERS)
def test_kvar_multipliers(now, target, multiplier):
    out = values(run(power=100, pf_now=now, pf_target=target, xfmr_kva=None, xfmr_z_pct=None))
    assert out["capacitor_q"] / 100e3 == pytest.approx(multiplier, abs=5e-4)


def test_single_phase_capacitance_example():
    # 10 kvar at 240 V, 60 Hz: C = Q/(2πf V²) = 460.5 µF (computed by hand from Q = ωC V²,
    # C. K. Alexander and M. N. O. Sadiku, Fundamentals of Electric Circuits, 5th ed., section
    # 11.8 (power factor correction) — from memory; 4 figures).
    assert power_factor.capacitance_per_phase(10e3, 240, 60, "single") == pytest.approx(
        460.5e-6, rel=2e-4)


def test_detuned_capacitor_voltage_example():
    # 6 % reactor on 400 V: U_C = 400/(1 − 0.06) = 425.5 V — read, as worked at erbar.id, "Efek
    # pemasangan detuned reactor pada kapasitor" (2022); the relation in J. C. Das, Power System
    # Harmonics and Filter Design, 1st ed., Springer, 2015, passive-filter chapters — from memory.
    assert power_factor.capacitor_voltage(400, 0.06) == pytest.approx(425.5, abs=0.05)


@pytest.mark.parametrize("p, order", [(0.05, 4.47), (0.0567, 4.20), (0.06, 4.08), (0.07, 3.78),
                                      (0.08, 3.54), (0.14, 2.67)])
def test_tuning_orders(p, order):
    # n = 1/√p (J. C. Das, Power System Harmonics and Filter Design, 1st ed., 2015 — from
    # memory; orders computed, 3 figures). 7 % → 189 Hz at 50 Hz: read, as worked at
    # studylib.net document 27030577, "Detuned reactor calculation".
    assert power_factor.tuning_order(p) == pytest.approx(order, abs=0.005)


def test_seven_percent_tunes_to_189_hz_at_50_hz():
    out = values(run(frequency_hz=50, voltage=400, reactor_pct=7))
    # Read, as worked at studylib.net document 27030577: "7 % → 189 Hz at 50 Hz" (3 figures).
    assert out["tuned_hz"] == pytest.approx(189, abs=0.5)


def test_geometric_mean_of_third_and_fifth():
    # Tuning between the 3rd and 5th at √15 = 3.873 means X_L/X_C = 1/15 (power-quality
    # practice; computed from n = 1/√p).
    assert power_factor.tuning_order(1 / 15) == pytest.approx(math.sqrt(15), rel=1e-12)


def test_transformer_dominated_resonance_form():
    # h ≈ √(kVA_T × 100 / (%Z_T × kvar)) (J. C. Das, Power System Harmonics and Filter Design,
    # 1st ed., 2015, the resonance of capacitor banks — from memory):
    # 1000 kVA, 5.75 %, 300 kvar → √(100 000 / 1725) = 7.614 (by hand).
    s_sc = power_factor.bus_short_circuit_power(1000e3, 5.75)
    assert power_factor.resonance_order(s_sc, 300e3) == pytest.approx(7.614, abs=5e-4)


def test_default_barn_example_by_hand():
    # The page's invented dairy-barn feeder: 150 kW at 0.78 lagging to 0.95 on 480 V from a
    # 500 kVA, 5.75 % transformer. By hand: tan φ1 = 0.80229, tan φ2 = 0.32868,
    # Q_c = 150 × 0.47361 = 71.04 kvar; I_C = 71 040/(√3 × 480) = 85.45 A; 135 % = 115.4 A;
    # S_sc = 500/0.0575 = 8696 kVA; h = √(8696/71.04) = 11.06 → near the 11th: warned.
    result = run()
    out = values(result)
    assert out["capacitor_q"] == pytest.approx(71.04e3, rel=2e-4)
    assert out["capacitor_a"] == pytest.approx(85.45, rel=2e-4)
    assert out["conductor_a"] == pytest.approx(115.4, rel=5e-4)
    assert out["short_circuit_va"] == pytest.approx(8.696e6, rel=1e-4)
    assert out["resonance_order"] == pytest.approx(11.06, abs=0.01)
    assert checks(result)["resonance"] == "warn" and "11th" in check_message(result, "resonance")


# ---- limiting cases --------------------------------------------------------------------------

def test_correcting_to_unity_cancels_all_the_reactive_power():
    out = values(run(power=100, pf_now=0.8, pf_target=1.0))
    assert out["capacitor_q"] == pytest.approx(100e3 * 0.75, rel=1e-12)  # Q = P tan φ1, tan = 0.75
    assert out["apparent_after"] == pytest.approx(100e3, rel=1e-12)


def test_a_tiny_correction_needs_a_tiny_bank():
    out = values(run(power=100, pf_now=0.9, pf_target=0.9 + 1e-9))
    # dQ/dpf = −P d(tan φ)/d(cos φ) = P / (pf² sin φ) ≈ 2.839e5 var per unit pf.
    assert out["capacitor_q"] == pytest.approx(1e-9 * 100e3 / (0.81 * math.sqrt(0.19)), rel=1e-5)


def test_a_stiff_source_leaves_only_the_transformer():
    # A 100 000 MVA source ahead of the transformer changes S_sc by 1e-4 relative at most.
    alone = values(run())
    stiff = values(run(source_mva=1e5))
    assert stiff["short_circuit_va"] == pytest.approx(alone["short_circuit_va"], rel=1e-4)


def test_fault_level_alone_sets_the_resonance():
    out = values(run(xfmr_kva=None, xfmr_z_pct=None, source_mva=10))
    assert out["short_circuit_va"] == pytest.approx(10e6, rel=1e-12)
    assert out["resonance_order"] == pytest.approx(math.sqrt(10e6 / out["capacitor_q"]), rel=1e-12)


def test_no_supply_given_skips_the_resonance_with_a_warning():
    result = run(xfmr_kva=None, xfmr_z_pct=None)
    assert "resonance_order" not in result["outputs"]
    assert checks(result)["resonance"] == "warn"
    assert result["series"]["x"]["label"] == "Target power factor"


def test_single_phase_gives_one_capacitance():
    result = run(phases="1", voltage=240, power=20, xfmr_kva=None, xfmr_z_pct=None)
    out = values(result)
    assert "c_wye" not in out and "c_delta" not in out
    assert out["capacitor_a"] == pytest.approx(out["capacitor_q"] / 240, rel=1e-12)  # I = Q/V


def test_the_chart_axis_ends_at_unity_where_its_sum_rounds_past_it():
    """0.3048 + (1 - 0.3048) × 100 / 100 is 1.0000000000000002 in floating point; the chart's last target
    must still be 1, not a power factor tan φ cannot take (found by the property below)."""
    assert 0.3048 + (1 - 0.3048) * 100 / 100.0 > 1.0  # the axis's last point, as written
    result = run(power=1, pf_now=0.3048, pf_target=1.0, voltage=100, phases="1",
                 xfmr_kva=None, xfmr_z_pct=None)
    assert max(result["series"]["x"]["values"]) == 1.0


# ---- properties ---------------------------------------------------------------------------------

PF = st.floats(0.3, 0.99)


@settings(max_examples=200, deadline=None)
@given(power=st.floats(1, 1e5), now=PF, gain=st.floats(0.001, 1.0),
       voltage=st.floats(100, 35000), phases=st.sampled_from(["1", "3"]))
def test_the_corrected_load_meets_its_target(power, now, gain, voltage, phases):
    target = now + (1 - now) * gain
    out = values(run(power=power, pf_now=now, pf_target=target, voltage=voltage, phases=phases,
                     xfmr_kva=None, xfmr_z_pct=None))
    # Complex power after the bank: P + j(P tan φ1 − Q_c); its power factor is the target.
    s = complex(power * 1e3, power * 1e3 * math.tan(math.acos(now)) - out["capacitor_q"])
    assert s.real / abs(s) == pytest.approx(target, rel=1e-9)
    assert out["apparent_after"] == pytest.approx(abs(s), rel=1e-9)
    ratio = out["line_a_after"] / out["line_a_before"]
    assert out["loss_reduction_pct"] == pytest.approx(100 * (1 - ratio ** 2), rel=1e-9, abs=1e-9)
    if phases == "3":
        assert out["c_wye"] == pytest.approx(3 * out["c_delta"], rel=1e-12)


@settings(max_examples=100, deadline=None)
@given(now=st.floats(0.5, 0.9), kva=st.floats(50, 5000), z=st.floats(2, 10),
       steps=st.lists(st.floats(0.001, 0.1), min_size=2, max_size=6))
def test_resonance_order_falls_as_the_bank_grows(now, kva, z, steps):
    targets = np.minimum(now + np.cumsum(steps), 1.0)
    targets = sorted(set(float(t) for t in targets))
    orders, banks = [], []
    for target in targets:
        out = values(run(power=200, pf_now=now, pf_target=target, xfmr_kva=kva, xfmr_z_pct=z))
        banks.append(out["capacitor_q"])
        orders.append(out["resonance_order"])
    assert banks == sorted(banks)  # a higher target needs a bigger bank ...
    assert orders == sorted(orders, reverse=True)  # ... which resonates lower


@settings(max_examples=100, deadline=None)
@given(s_sc=st.floats(1e5, 1e9), share=st.floats(1e-4, 0.5), p=st.sampled_from(
    power_factor.DETUNING_FACTORS))
def test_a_detuned_bank_resonates_below_its_tuning_order(s_sc, share, p):
    q = share * s_sc  # a bank is a small part of the fault level (h > 1.4)
    detuned = power_factor.resonance_order(s_sc, q, p)
    assert detuned < power_factor.tuning_order(p)
    assert detuned < power_factor.resonance_order(s_sc, q)


# ---- independent references ------------------------------------------------------------------

def test_capacitance_and_currents_with_pint():
    # The barn bank worked in pint's units: C_Y = Q/(2πf V²), I = Q/(√3 V). pint has no var,
    # so reactive power is in kVA (the same dimension).
    ureg = pytest.importorskip("pint").UnitRegistry()
    q = 71.04 * ureg.kVA
    c_wye = (q / (2 * math.pi * ureg.Hz * 60 * (480 * ureg.V) ** 2)).to(ureg.F).magnitude
    current = (q / (math.sqrt(3) * 480 * ureg.V)).to(ureg.A).magnitude
    assert power_factor.capacitance_per_phase(71.04e3, 480, 60, "wye") == pytest.approx(c_wye,
                                                                                       rel=1e-12)
    assert power_factor.capacitance_per_phase(71.04e3, 480, 60, "delta") == pytest.approx(
        c_wye / 3, rel=1e-12)
    # The barn bank is 71.04 kvar to 4 figures.
    assert values(run())["capacitor_a"] == pytest.approx(current, rel=2e-4)


@pytest.mark.parametrize("now, target", [(0.78, 0.95), (0.6, 0.9), (0.85, 1.0)])
def test_target_met_in_a_pandapower_power_flow(now, target):
    pp = pytest.importorskip("pandapower")
    out = values(run(power=150, pf_now=now, pf_target=target))
    net = pp.create_empty_network()
    bus = pp.create_bus(net, vn_kv=0.48)
    pp.create_ext_grid(net, bus, vm_pu=1.0)
    pp.create_load(net, bus, p_mw=0.150, q_mvar=0.150 * math.tan(math.acos(now)))
    pp.create_shunt(net, bus, q_mvar=-out["capacitor_q"] / 1e6, p_mw=0.0)  # capacitive: negative
    pp.runpp(net)
    p, q = net.res_ext_grid.p_mw.iloc[0], net.res_ext_grid.q_mvar.iloc[0]
    # The power flow converges to 1e-8 MVA (pandapower's default tolerance): the supply sees
    # the target power factor to ~1e-7.
    assert p / math.hypot(p, q) == pytest.approx(target, abs=1e-6)


@pytest.mark.parametrize("reactor_pct", [None, 7, 14])
@pytest.mark.parametrize("kva, z, pf_now", [(500, 5.75, 0.78), (1500, 6.0, 0.7), (150, 4.0, 0.85)])
def test_resonance_order_agrees_with_an_ngspice_ac_sweep(kva, z, pf_now, reactor_pct):
    inputs = dict(pf_now=pf_now, xfmr_kva=kva, xfmr_z_pct=z)
    if reactor_pct:
        inputs["reactor_pct"] = reactor_pct
    out = values(run(**inputs))
    f1, v = 60.0, 480.0
    # Per-phase (wye) equivalent: supply reactance X_s = V²/S_sc, the bank's X_C from its output
    # at 60 Hz (with a reactor, Q_c = V²/(X_C − X_L), X_L = p X_C); a 1 A harmonic current is
    # injected at the bus and |V| peaks at the parallel resonance.
    x_s = v * v / out["short_circuit_va"]
    p = (reactor_pct or 0) / 100
    x_c = v * v / (out["capacitor_q"] * (1 - p))
    w1 = 2 * math.pi * f1
    elements = ["I1 0 1 DC 0 AC 1", f"LS 1 2 {x_s / w1!r}", f"RS 2 0 {x_s / 1000!r}",
                f"C1 3 0 {1 / (w1 * x_c)!r}"]
    elements.append(f"LR 1 3 {p * x_c / w1!r}" if p else "RW 1 3 1e-9")
    expected = out["detuned_resonance_order"] if p else out["resonance_order"]
    sweep = spice.ac(elements, 0.5 * expected * f1, 2 * expected * f1, 20000, ["v(1)"])
    peak = sweep["frequency"][np.argmax(np.abs(sweep["v(1)"]))]
    # 20 000 points a decade are 0.0115 % apart; the 0.1 % supply resistance moves the peak
    # by ~1e-6: within 2e-4 of h f1.
    assert peak / f1 == pytest.approx(expected, rel=2e-4)


# ---- checks -------------------------------------------------------------------------------------

def test_detuned_bank_checks_the_capacitor_voltage_against_ieee_18():
    within = run(voltage=400, frequency_hz=50, reactor_pct=7, capacitor_rated_v=440)
    over = run(voltage=480, reactor_pct=7, capacitor_rated_v=440)
    allowance = run(voltage=480, reactor_pct=7, capacitor_rated_v=480)
    status = {name: checks(r)["capacitor_voltage"]
              for name, r in (("within", within), ("over", over), ("allowance", allowance))}
    # 400/0.93 = 430 V ≤ 440 V; 480/0.93 = 516 V is 117 % of 440 V (> 110 %, IEEE 18) and
    # 108 % of 480 V (inside the 110 % allowance). By hand.
    assert status == {"within": "pass", "over": "fail", "allowance": "warn"}


def test_suggested_detuning_moves_the_resonance_below_the_fifth():
    result = run()
    out = values(result)
    assert out["detuning_pct"] == 7.0 and out["detuned_resonance_order"] < 4.5
    assert checks(result)["detuned"] == "pass"


def test_a_bank_large_for_the_supply_is_warned():
    # 300 kW from 0.6 to 1.0 is 400 kvar on a 150 kVA, 4 % transformer (S_sc = 3.75 MVA):
    # ΔU ≈ 100 × 0.4/3.75 = 10.7 % (by hand), above the 3 % step of common practice.
    result = run(power=300, pf_now=0.6, pf_target=1.0, xfmr_kva=150, xfmr_z_pct=4)
    assert values(result)["voltage_rise_pct"] == pytest.approx(10.67, abs=0.01)
    assert checks(result)["voltage_rise"] == "warn"


def test_high_target_is_warned():
    result = run(pf_target=0.99)
    assert checks(result)["light_load"] == "warn"


def test_chart_marks_the_bank_and_the_characteristic_harmonics():
    series = run()["series"]
    assert series["x"]["label"] == "Bank reactive power"
    harmonics = [m["value"] for m in series["marks"] if m["axis"] == "y"]
    assert harmonics == [5.0, 7.0, 11.0, 13.0]
    plain = series["y"][0]["values"]
    assert plain == sorted(plain, reverse=True)  # larger bank, lower resonance


def test_medium_voltage_caution():
    result = run(voltage="4.16 kV")
    assert any("1000 V" in c for c in result["cautions"])


# ---- bad input: one test per error path -----------------------------------------------------

@pytest.mark.parametrize("inputs, field, words", [
    ({"pf_target": 0.7}, "pf_target", "below the present power factor"),
    ({"pf_target": 0.78}, "pf_target", "already at 0.78"),
    ({"pf_now_sense": "leading"}, "pf_now_sense", "already leads"),
    ({"pf_target_sense": "leading"}, "pf_target_sense", "leading target"),
    ({"xfmr_z_pct": None}, "xfmr_z_pct", "impedance"),
    ({"xfmr_kva": None}, "xfmr_kva", "rating"),
    ({"pf_now": 0}, "pf_now", "at least 0.01"),
    ({"pf_now": 1.2}, "pf_now", "at most 1"),
    ({"pf_target": "95 %"}, None, None),  # 95 % is read as 0.95: not an error
    ({"power": 0}, "power", "at least 0.001 kW"),
    ({"voltage": "-480 V"}, "voltage", "out of range"),
    ({"voltage": "0.5 V"}, "voltage", "at least 1 V"),
    ({"phases": "2"}, "phases", "choose one of"),
    ({"xfmr_z_pct": 0}, "xfmr_z_pct", "at least 0.1 %"),
    ({"reactor_pct": 30}, "reactor_pct", "at most 20 %"),
    ({"source_mva": "10 kV"}, "source_mva", "apparent power"),
])
def test_bad_inputs_get_field_messages(inputs, field, words):
    if field is None:
        run(**inputs)
        return
    refused = errors(**inputs)
    assert list(refused) == [field] and words in refused[field]


def test_leading_target_of_unity_is_accepted():
    # At pf 1 there is no leading or lagging: the sense does not matter.
    run(pf_target=1, pf_target_sense="leading")


@settings(max_examples=200, deadline=None)
@given(st.dictionaries(
    st.sampled_from(["power", "pf_now", "pf_target", "voltage", "phases", "xfmr_kva",
                     "xfmr_z_pct", "source_mva", "reactor_pct", "pf_now_sense"]),
    st.one_of(st.text(max_size=8), st.floats(allow_nan=True), st.none(), st.integers(-5, 5))))
def test_any_input_gives_a_result_or_field_errors(inputs):
    result = api.run("pf-correction", inputs)
    text = api.dumps(result)  # raises on NaN or infinity
    assert "internal error" not in text
    if not result["ok"]:
        assert all(e["field"] in inputs and e["message"] for e in result["errors"])


# ---- thresholds: every limit a check uses, just inside and just outside ----------------------
# Inputs are built from the constant each check reads, so that a changed judgement fails here.
# The supply is given as a fault level at the bus (no transformer): S_sc is then exactly what
# the test asks for.

LOAD = dict(power=150, pf_now=0.78, pf_target=0.95, xfmr_kva=None, xfmr_z_pct=None)
BANK_Q = power_factor.capacitor_reactive_power(150e3, 0.78, 0.95)  # [var], for S_sc below


def _at_bus(short_circuit_power, **inputs):
    return run(**{**LOAD, "source_mva": short_circuit_power / 1e6, **inputs})


@pytest.mark.parametrize("share, status", [(0.99, None), (1.01, "warn")])
def test_voltage_rise_threshold(share, status):
    # ΔU = 100 Q/S_sc lands at `share` of VOLTAGE_RISE_LIMIT_PCT.
    rise = pf_correction.VOLTAGE_RISE_LIMIT_PCT * share
    result = _at_bus(100 * BANK_Q / rise)
    assert values(result)["voltage_rise_pct"] == pytest.approx(rise, rel=1e-12)
    assert checks(result).get("voltage_rise") == status


# Each band edge whose other side is clear of the next harmonic's band (11 × 1.1 and 13 × 0.9
# overlap, so the 11th's upper and the 13th's lower edges fall in the other band).
BAND_EDGES = [(5, -1), (5, 1), (7, -1), (7, 1), (11, -1), (13, 1)]


@pytest.mark.parametrize("harmonic, side", BAND_EDGES)
@pytest.mark.parametrize("share, status", [(0.99, "warn"), (1.01, "pass")])
def test_resonance_band_threshold(harmonic, side, share, status):
    # h = √(S_sc/Q_c) lands at share × RESONANCE_BAND from the harmonic, below or above it.
    order = harmonic * (1 + side * pf_correction.RESONANCE_BAND * share)
    result = _at_bus(order * order * BANK_Q)
    assert values(result)["resonance_order"] == pytest.approx(order, rel=1e-12)
    assert checks(result)["resonance"] == status
    if status == "warn":
        assert f"{harmonic}th" in check_message(result, "resonance")


@pytest.mark.parametrize("share, status", [(0.99, "pass"), (1.01, "warn")])
def test_detuned_resonance_threshold(share, status):
    # With a 2 % reactor, h' = 1/√(p + (1 − p) Q_c/S_sc) lands at `share` of the limit just
    # below the lowest characteristic harmonic, 5 × (1 − RESONANCE_BAND).
    p = 0.02
    limit = power_factor.SIX_PULSE_HARMONICS[0] * (1 - pf_correction.RESONANCE_BAND)
    order = limit * share
    result = _at_bus(BANK_Q * (1 - p) / (1 / order ** 2 - p), reactor_pct=100 * p)
    assert values(result)["detuned_resonance_order"] == pytest.approx(order, rel=1e-9)
    assert checks(result)["detuned"] == status


@pytest.mark.parametrize("limit, share, status", [
    (power_factor.IEEE18_RMS_VOLTAGE, 0.99, "warn"),  # inside the continuous allowance
    (power_factor.IEEE18_RMS_VOLTAGE, 1.01, "fail"),  # beyond it
    (1.0, 0.99, "pass"),  # within rating
    (1.0, 1.01, "warn"),  # above rating
])
def test_capacitor_voltage_thresholds(limit, share, status):
    # A 7 % reactor on 480 V puts U_C = 480/0.93 on the capacitors; their rating is chosen so
    # that U_C / U_rated lands at `share` of each limit.
    u_c = power_factor.capacitor_voltage(480.0, 0.07)
    result = run(voltage=480, reactor_pct=7, capacitor_rated_v=u_c / (limit * share))
    assert checks(result)["capacitor_voltage"] == status


def test_detuned_capacitors_without_a_rating_are_warned():
    assert checks(run(reactor_pct=7))["capacitor_voltage"] == "warn"
    assert "capacitor_voltage" not in checks(run(**LOAD))  # plain bank, no rating: silent


@pytest.mark.parametrize("share, status", [(0.99, None), (1.01, "warn")])
def test_high_target_threshold(share, status):
    result = run(pf_target=pf_correction.HIGH_TARGET_PF * share)
    assert checks(result).get("light_load") == status


def test_conductor_factor_is_the_nec_multiple():
    out = values(run())
    assert out["conductor_a"] == pytest.approx(power_factor.NEC_460_8_FACTOR
                                               * out["capacitor_a"], rel=1e-12)


# ---- issue 11, item 6: a detuned bank delivers the kvar asked --------------------------------

def _delivered(out, voltage, frequency, p, connection="wye"):
    """Reactive power [var] the bank's capacitors (the calculator's C) and their reactor give at
    the system voltage: Q = V²/(X_C − X_L), X_L = p X_C, per wye phase (delta C is C_Y/3)."""
    c_wye = out["c_wye"] if connection == "wye" else 3 * out["c_delta"]
    x_c = 1 / (2 * math.pi * frequency * c_wye)
    return voltage ** 2 / (x_c * (1 - p))


@pytest.mark.parametrize("p_pct", [5.67, 7, 14])
def test_issue11_detuned_bank_delivers_the_kvar_asked(p_pct):
    # Before the fix the capacitance ignored the reactor and the bank gave Q/(1 − p): 7.5 % too
    # much at 7 % (16 % at 14 %). The series branch X_C − X_L is exact: rel 1e-12 is rounding.
    out = values(run(voltage=400, frequency_hz=50, reactor_pct=p_pct))
    p = p_pct / 100
    for connection in ("wye", "delta"):
        assert _delivered(out, 400, 50, p, connection) == pytest.approx(out["capacitor_q"],
                                                                        rel=1e-12)


def test_issue11_detuned_capacitance_is_1_minus_p_of_the_plain_bank():
    plain = values(run(voltage=400, frequency_hz=50))
    detuned = values(run(voltage=400, frequency_hz=50, reactor_pct=7))
    assert detuned["c_wye"] == pytest.approx(0.93 * plain["c_wye"], rel=1e-12)
    assert detuned["c_delta"] == pytest.approx(0.93 * plain["c_delta"], rel=1e-12)


# 80 kvar, 525 V (three-phase) capacitors with a 7 % reactor deliver 49.9 kvar on a 400 V, 50 Hz
# supply: read, as worked at studylib.net document 27030577, "Detuned reactor calculation"
# (80/0.93 = 86.0 kvar at 525 V, × (400/525)² = 49.9 kvar). The calculator asked for 49.9 kvar
# there must give those capacitors: their delta capacitance 80 kvar/(3 × 2π50 × 525²) and their
# nameplate 80 kvar at 525 V. The source prints 49.9 (3 figures): rel 1e-3.
WORKED_Q, WORKED_RATED_Q, WORKED_RATED_V = 49.9e3, 80e3, 525.0


def test_issue11_detuned_bank_matches_the_worked_525_v_example():
    # pf 0.8 → 1.0 needs Q = P tan φ1 = 0.75 P: P = 49.9 kvar / 0.75.
    out = values(run(power=WORKED_Q / 0.75 / 1e3, pf_now=0.8, pf_target=1.0, voltage=400,
                     frequency_hz=50, reactor_pct=7, capacitor_rated_v=WORKED_RATED_V,
                     xfmr_kva=None, xfmr_z_pct=None))
    assert out["capacitor_q"] == pytest.approx(WORKED_Q, rel=1e-12)
    c_delta = WORKED_RATED_Q / (3 * 2 * math.pi * 50 * WORKED_RATED_V ** 2)  # 308.0 µF
    assert out["c_delta"] == pytest.approx(c_delta, rel=1e-3)
    assert out["capacitor_rated_q"] == pytest.approx(WORKED_RATED_Q, rel=1e-3)


def test_issue11_capacitor_voltage_and_own_kvar_match_the_worked_6_percent_example():
    # 400 V, 6 %, a 50 kvar step: the capacitors run at 425.5 V and must give 53 kvar there —
    # read, as worked at erbar.id, "Efek pemasangan detuned reactor pada kapasitor" (2022):
    # U_C = U/(1 − p), Q_C = Q/(1 − p). Printed to 0.1 V and to the kvar.
    out = values(run(power=50 / 0.75, pf_now=0.8, pf_target=1.0, voltage=400, frequency_hz=50,
                     reactor_pct=6, xfmr_kva=None, xfmr_z_pct=None))
    assert out["capacitor_q"] == pytest.approx(50e3, rel=1e-12)
    assert out["capacitor_v"] == pytest.approx(425.5, abs=0.05)
    assert out["capacitor_rated_q"] == pytest.approx(53e3, abs=500)


@pytest.mark.parametrize("p_pct, voltage, frequency", [(7, 400.0, 50.0), (14, 480.0, 60.0)])
def test_issue11_detuned_bank_draws_the_kvar_asked_in_an_ngspice_ac_analysis(p_pct, voltage,
                                                                           frequency):
    # One wye phase at the fundamental: V/√3 across the reactor (L = p X_C/ω) in series with the
    # calculator's C_Y; the supply's reactive power 3 V_ph |I| must be the kvar asked. An AC
    # analysis is one complex solve written with 15 digits: rel 1e-9.
    out = values(run(voltage=voltage, frequency_hz=frequency, reactor_pct=p_pct))
    p, w = p_pct / 100, 2 * math.pi * frequency
    x_c = 1 / (w * out["c_wye"])
    v_phase = voltage / math.sqrt(3)
    elements = [f"V1 1 0 DC 0 AC {v_phase!r}", f"LR 1 2 {p * x_c / w!r}",
                f"C1 2 0 {out['c_wye']!r}"]
    sweep = spice.ac(elements, frequency, 10 * frequency, 10, ["i(V1)"])  # first point: f
    assert sweep["frequency"][0] == pytest.approx(frequency, rel=1e-9)
    current = abs(sweep["i(V1)"][0])
    assert 3 * v_phase * current == pytest.approx(out["capacitor_q"], rel=1e-9)


def test_issue11_nameplate_kvar_at_the_rated_voltage_entered():
    # Q_r = Q_c (1 − p)(U_r/U)², computed: 480 V, 7 %, capacitors rated 600 V.
    out = values(run(reactor_pct=7, capacitor_rated_v=600))
    assert out["capacitor_rated_q"] == pytest.approx(out["capacitor_q"] * 0.93 * (600 / 480) ** 2,
                                                     rel=1e-12)
    plain = values(run(capacitor_rated_v=480))  # plain bank rated at the system voltage
    assert plain["capacitor_rated_q"] == pytest.approx(plain["capacitor_q"], rel=1e-12)
    assert "capacitor_rated_q" not in values(run())  # plain, no rating: nothing to say


def test_issue11_an_entered_reactor_takes_the_resonance_off_the_harmonic():
    # The plain barn bank sits on the 11th (warned); with a 7 % reactor the bank's resonance is
    # h' = 3.59, so the resonance check passes and says why.
    assert checks(run())["resonance"] == "warn"
    detuned = run(reactor_pct=7)
    assert checks(detuned)["resonance"] == "pass"
    assert "7 % reactor" in check_message(detuned, "resonance")


# ---- issue 11, item 9: plausibility ------------------------------------------------------------

def test_issue11_a_bank_on_a_1_kva_transformer_is_not_a_resonance_marked_ok():
    # The audit's case: the barn load on a 1 kVA, 5.75 % transformer. S_sc = 17.4 kVA against a
    # 71 kvar bank: h = √(17.4/71.0) = 0.495 (by hand), ΔU ≈ 408 %. Before the fix the resonance
    # check passed.
    result = run(xfmr_kva=1)
    out, status = values(result), checks(result)
    assert out["resonance_order"] == pytest.approx(0.4948, abs=1e-4)
    assert status["resonance"] == "warn" and "below the fundamental" in check_message(
        result, "resonance")
    assert status["detuned"] == "warn"
    assert status["plausibility"] == "warn"
    message = check_message(result, "plausibility")
    assert "1.00 kVA transformer" in message and "short-circuit power" in message


def _plausible(result):
    return checks(result)["plausibility"]


def test_issue11_defaults_and_ordinary_banks_are_plausible():
    for inputs in ({}, {"reactor_pct": 7, "capacitor_rated_v": 525}, LOAD,
                   {"phases": "1", "voltage": 240, "power": 20, "xfmr_kva": None,
                    "xfmr_z_pct": None}):
        assert _plausible(run(**inputs)) == "pass", inputs


@pytest.mark.parametrize("share, status", [(0.99, "pass"), (1.01, "warn")])
def test_issue11_bank_share_threshold(share, status):
    # Q_c/S_sc lands at `share` of BANK_SHARE_MAX_PCT: h = √(100/10) = 3.16, clear of the
    # harmonics, so only the share decides the resonance, detuned and plausibility checks.
    result = _at_bus(BANK_Q * 100 / (pf_correction.BANK_SHARE_MAX_PCT * share))
    found = checks(result)
    assert found["resonance"] == found["detuned"] == found["plausibility"] == status
    if status == "warn":
        assert "below the fundamental" not in check_message(result, "resonance")


@pytest.mark.parametrize("share, words", [(0.99, "below the fundamental"), (1.01, "more than")])
def test_issue11_fundamental_order_threshold(share, words):
    order = pf_correction.FUNDAMENTAL_ORDER * share
    result = _at_bus(order * order * BANK_Q)
    assert values(result)["resonance_order"] == pytest.approx(order, rel=1e-12)
    assert checks(result)["resonance"] == "warn" and words in check_message(result, "resonance")


@pytest.mark.parametrize("share, status", [(0.99, "pass"), (1.01, "warn")])
def test_issue11_transformer_overload_threshold(share, status):
    # The barn load (150 kW at 0.78 = 192.3 kVA) on a transformer that carries it at `share` of
    # TRANSFORMER_OVERLOAD_MAX; the bank stays ~3 % of the fault level.
    rating = 150 / 0.78 / (pf_correction.TRANSFORMER_OVERLOAD_MAX * share)
    assert _plausible(run(xfmr_kva=rating)) == status


@pytest.mark.parametrize("edge, share, status", [(0, 1.01, "pass"), (0, 0.99, "warn"),
                                                 (1, 0.99, "pass"), (1, 1.01, "warn")])
def test_issue11_transformer_impedance_range(edge, share, status):
    z = pf_correction.TRANSFORMER_Z_RANGE_PCT[edge] * share
    assert _plausible(run(xfmr_z_pct=z)) == status


@pytest.mark.parametrize("edge, share, status", [(0, 1.01, "pass"), (0, 0.99, "warn"),
                                                 (1, 0.99, "pass"), (1, 1.01, "warn")])
def test_issue11_supply_frequency_range(edge, share, status):
    frequency = pf_correction.SUPPLY_FREQUENCY_RANGE_HZ[edge] * share
    assert _plausible(run(frequency_hz=frequency)) == status


@pytest.mark.parametrize("share, status", [(1.01, "pass"), (0.99, "warn")])
def test_issue11_supply_voltage_threshold(share, status):
    # 20 kW single-phase without a transformer: only the voltage is out of the ordinary.
    voltage = pf_correction.SUPPLY_VOLTAGE_MIN_V * share
    assert _plausible(run(phases="1", power=2, voltage=voltage, xfmr_kva=None,
                          xfmr_z_pct=None)) == status


@pytest.mark.parametrize("share, status", [(0.99, "pass"), (1.01, "warn")])
def test_issue11_line_current_threshold(share, status):
    # P = √3 V I pf puts the present line current at `share` of LINE_CURRENT_MAX_A.
    current = pf_correction.LINE_CURRENT_MAX_A * share
    power_kw = math.sqrt(3) * 480 * current * 0.78 / 1e3
    result = run(power=power_kw, xfmr_kva=None, xfmr_z_pct=None)
    assert values(result)["line_a_before"] == pytest.approx(current, rel=1e-12)
    assert _plausible(result) == status


@pytest.mark.parametrize("share, status", [(1.01, "pass"), (0.99, "warn")])
def test_issue11_present_power_factor_threshold(share, status):
    assert _plausible(run(pf_now=pf_correction.PRESENT_PF_MIN * share, xfmr_kva=None,
                          xfmr_z_pct=None)) == status


def test_issue11_several_reasons_join_in_one_message():
    message = check_message(run(xfmr_kva=1, frequency_hz=400), "plausibility")
    assert "400 Hz" in message and "transformer" in message and "short-circuit" in message


# ---- a blank target never conflicts with a typed present power factor (as issue 11, item 8) ----

def test_a_blank_target_is_the_usual_one():
    result = run()  # pf_target left blank
    assert values(result)["capacitor_q"] == pytest.approx(
        power_factor.capacitor_reactive_power(150e3, 0.78, pf_correction.USUAL_TARGET_PF),
        rel=1e-12)
    assert any("No target entered" in a for a in result["assumptions"])


@pytest.mark.parametrize("pf_now", [pf_correction.USUAL_TARGET_PF, 0.97, 1.0])
def test_a_present_power_factor_at_the_usual_target_is_refused_on_its_own_field(pf_now):
    refused = errors(pf_now=pf_now)
    assert list(refused) == ["pf_now"] and "needs no capacitors" in refused["pf_now"]
    run(pf_now=pf_now, pf_target=1.0) if pf_now < 1.0 else None  # a typed target still works


@pytest.mark.parametrize("name, floor", [
    ("power", pf_correction.MIN_POWER_KW), ("pf_now", pf_correction.MIN_POWER_FACTOR),
    ("xfmr_z_pct", pf_correction.MIN_IMPEDANCE_PCT),
    ("xfmr_kva", pf_correction.MIN_TRANSFORMER_KVA),
    ("source_mva", pf_correction.MIN_SOURCE_MVA), ("reactor_pct", pf_correction.MIN_REACTOR_PCT),
])
def test_input_floors_refuse_only_what_overflows(name, floor):
    # Just above each floor the calculator answers (with a plausibility warning where the value
    # is unreal); just below it the field is refused with the floor in the message.
    assert run(**{name: floor * 1.01})["ok"]
    refused = errors(**{name: floor * 0.99})
    assert list(refused) == [name] and "at least" in refused[name]
