"""calc.transformers regulation, taps and losses with transformer-regulation and
transformer-efficiency: published examples, pandapower's power flow, scipy, pint, limits, the
threshold of every judgement, and every error path.

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

from calc import api, transformers
from calc.calculators import transformer_efficiency, transformer_regulation
from tests.conftest import check_message, checks, errors, run, values

BAND_NA = transformers.VOLTAGE_BAND_PCT["na"]


def regulation(**inputs):
    return run("transformer-regulation", **inputs)


def efficiency_result(**inputs):
    return run("transformer-efficiency", **inputs)


# ==== transformer-regulation ====================================================================

def test_regulation_published_first_order_value():
    # GATE 2018 EE Question 11: R = 3 %, X = 4 % (Z = 5 %), full load 0.8 lagging -> 4.8 % by the
    # first-order formula. The second-order term adds (4 × 0.8 − 3 × 0.6)² / 200 = 0.0098.
    assert transformers.regulation_approx(3, 4, 0.8) == pytest.approx(4.8 + 0.0098, rel=1e-12)
    assert transformers.regulation_approx(3, 4, 0.8) == pytest.approx(4.8, rel=3e-3)


@pytest.mark.parametrize("pf, leading, first_order", [(0.8, False, 3.8), (1.0, False, 1.0),
                                                      (0.8, True, -2.2)])
def test_regulation_textbook_exercise(pf, leading, first_order):
    # The classic exercise "ohmic loss 1 % of output, reactance drop 5 %" (as quoted at askfilo,
    # answers 3.8 %, 1 %, −2.2 % by the first-order formula). The textbook formula with its
    # second-order term (read, as three electrical-machines textbooks give it) adds exactly
    # (q cos φ − p sin φ)² / 200, computed here by hand.
    sin = math.sqrt(1 - pf * pf) * (-1 if leading else 1)
    second = (5 * pf - 1 * sin) ** 2 / 200
    assert transformers.regulation_approx(1, 5, pf, leading) == pytest.approx(
        first_order + second, rel=1e-12)


def test_regulation_exact_against_an_independent_phasor_computation():
    # |V_nl| = |V + I Z| with V = 1 at angle 0 and I lagging by φ: written with cmath here.
    for r, x, pf, lead, k in [(1, 5, 0.8, False, 1), (2, 8, 0.6, True, 1.3),
                              (0.5, 3, 1.0, False, 0.4)]:
        phi = math.acos(pf) * (-1 if lead else 1)
        v_nl = 1 + cmath.rect(k, -phi) * complex(r, x) / 100
        assert transformers.regulation_exact(r, x, pf, lead, k) == pytest.approx(
            (abs(v_nl) - 1) * 100, rel=1e-12)


def _pandapower_loaded(kva, v1, v2, r, x, pf, leading, load, supply, tap):
    """Loaded secondary voltage [pu] from a pandapower power flow: ext grid at the HV bus, the
    transformer with vk, vkr, pfe_kw = 0, i0 = 0 and its ±2 × 2.5 % HV tap, a constant-current
    load at the LV bus."""
    pp = pytest.importorskip("pandapower")
    net = pp.create_empty_network(sn_mva=1.0, f_hz=60)
    hv = pp.create_bus(net, vn_kv=v1 / 1e3)
    lv = pp.create_bus(net, vn_kv=v2 / 1e3)
    pp.create_ext_grid(net, hv, vm_pu=supply)
    pp.create_transformer_from_parameters(
        net, hv, lv, sn_mva=kva / 1e3, vn_hv_kv=v1 / 1e3, vn_lv_kv=v2 / 1e3, vkr_percent=r,
        vk_percent=math.hypot(r, x), pfe_kw=0, i0_percent=0, tap_side="hv", tap_neutral=0,
        tap_min=-2, tap_max=2, tap_step_percent=2.5, tap_pos=tap / 2.5, tap_changer_type="Ratio")
    s = load * kva / 1e3
    q = s * math.sqrt(1 - pf * pf) * (-1 if leading else 1)
    pp.create_load(net, lv, p_mw=s * pf, q_mvar=q, const_i_p_percent=100, const_i_q_percent=100)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        pp.runpp(net, tolerance_mva=1e-12, max_iteration=50)
    return net.res_bus.vm_pu.at[lv]


def test_loaded_voltage_matches_pandapower_power_flow_random_cases():
    # The same series impedance, tap and constant-current load in pandapower's Newton-Raphson
    # power flow; tolerance 1e-9, set by its convergence (tolerance_mva 1e-12 on ~1 MVA).
    pytest.importorskip("pandapower")
    rng = random.Random(44)
    worst = 0.0
    for _ in range(25):
        kva = rng.choice([25.0, 75.0, 500.0, 1500.0])
        v1, v2 = rng.choice([(480.0, 208.0), (13800.0, 480.0), (11000.0, 400.0), (7200.0, 240.0)])
        r, x = rng.uniform(0.3, 3), rng.uniform(1, 10)
        pf, lead = rng.uniform(0.6, 1.0), rng.random() < 0.3
        load, supply = rng.uniform(0, 1.5), rng.uniform(0.9, 1.1)
        tap = rng.choice(transformers.STANDARD_TAPS_PCT)
        result = regulation(r_pct=r, x_pct=x, pf=pf, leading=lead, load_pct=100 * load,
                            secondary_v=v2, primary_v=v1, kva=kva, supply_pct=100 * supply,
                            present_tap=f"{tap:g}")
        theirs = _pandapower_loaded(kva, v1, v2, r, x, pf, lead, load, supply, tap) * v2
        mine = values(result)["loaded_v"]
        assert mine == pytest.approx(theirs, rel=1e-9)
        worst = max(worst, abs(mine / theirs - 1))
    assert worst < 1e-9, worst


@settings(max_examples=200, deadline=None)
@given(r=st.floats(0, 5), x=st.floats(0.5, 15), pf=st.floats(0.3, 0.999),
       k1=st.floats(0, 1.5), k2=st.floats(0, 1.5))
def test_regulation_rises_with_load_lagging(r, x, pf, k1, k2):
    low, high = sorted((k1, k2))
    assert transformers.regulation_exact(r, x, pf, False, low) <= \
        transformers.regulation_exact(r, x, pf, False, high) + 1e-12
    assert transformers.regulation_approx(r, x, pf, False, low) <= \
        transformers.regulation_approx(r, x, pf, False, high) + 1e-12


@settings(max_examples=200, deadline=None)
@given(r=st.floats(0, 5), x=st.floats(0, 15), pf=st.floats(0.3, 1.0), lead=st.booleans(),
       k=st.floats(0, 1.5))
def test_regulation_round_trip(r, x, pf, lead, k):
    # The no-load voltage 1 + ε gives back exactly rated voltage at that load: the exact
    # regulation and the loaded-voltage solution are inverses.
    epsilon = transformers.regulation_exact(r, x, pf, lead, k)
    back = transformers.loaded_voltage(1 + epsilon / 100, r, x, pf, lead, k)
    assert back == pytest.approx(1.0, rel=1e-12)


def test_regulation_limits():
    assert transformers.regulation_exact(1, 5, 0.8, False, 0.0) == 0.0  # no load, no regulation
    assert transformers.loaded_voltage(0.98, 1, 5, 0.8, False, 0.0) == pytest.approx(0.98,
                                                                                      rel=1e-15)
    assert transformers.regulation_exact(0, 0, 0.8) == 0.0  # an ideal transformer
    # unity power factor: ε = %R + %X² / 200 to second order (the textbook formula, read)
    assert transformers.regulation_approx(1, 5, 1.0) == pytest.approx(1 + 25 / 200, rel=1e-12)
    # leading enough, the voltage rises under load
    assert transformers.regulation_exact(1, 5, 0.8, True) < 0


def test_approximate_formula_validity_warns_for_a_large_impedance():
    close = regulation(r_pct=1, x_pct=5)
    far = regulation(r_pct=10, x_pct=28, load_pct=150)
    assert checks(close)["formula_validity"] == "pass"
    assert checks(far)["formula_validity"] == "warn"


def test_tap_factors():
    # IEEE C57.12.10 taps ±2 × 2.5 % (read): each is named by the primary voltage it suits.
    assert transformers.STANDARD_TAPS_PCT == (-5.0, -2.5, 0.0, 2.5, 5.0)
    assert [round(transformers.tap_voltage_factor(t), 6) for t in transformers.STANDARD_TAPS_PCT] \
        == [round(1 / (1 + t / 100), 6) for t in (-5, -2.5, 0, 2.5, 5)]


@pytest.mark.parametrize("supply_pct, band, tap, status", [
    (100.0, 1.0, 0.0, "pass"),                # already in band: no change
    (100 * 200 / 208, 2.0, -2.5, "pass"),     # low: −2.5 % suffices before −5 % is considered
    (100 * 150 / 208, 5.0, -5.0, "fail"),     # nothing reaches the band: the closest, flagged
])
def test_tap_choice_smallest_change_first(supply_pct, band, tap, status):
    # At no load the secondary is V₂ × supply / (1 + tap): the tap only moves it.
    result = regulation(load_pct=0, supply_pct=supply_pct, band_pct=band)
    assert values(result)["tap_pct"] == tap and checks(result)["tap"] == status


def test_regulation_recommends_a_plus_tap_for_a_high_supply():
    result = regulation(supply_pct=106, load_pct=10)
    out = values(result)
    assert out["tap_pct"] > 0 and checks(result)["tap"] == "pass"
    assert abs(out["tapped_v"] / 208 - 1) <= BAND_NA / 100


def test_regulation_light_load_overvoltage_warns():
    # Fixing a full-load sag with −2.5 % (205.9 V in 208 V ± 2 %) leaves 213.3 V at no load,
    # above 212.2 V (computed by hand: 208 / 0.975).
    result = regulation(r_pct=1, x_pct=5, pf=0.85, band_pct=2)
    assert values(result)["tap_pct"] < 0
    assert checks(result)["light_load"] == "warn"


def test_regulation_from_z_and_x_r_equals_from_r_and_x():
    by_z = values(regulation(z_pct=5, x_r=4 / 3))
    by_rx = values(regulation(r_pct=3, x_pct=4))
    assert by_z["regulation_pct"] == pytest.approx(by_rx["regulation_pct"], rel=1e-12)


def test_regulation_labels_follow_the_constants():
    # The tap list, the band help and the default band come from calc.transformers.
    taps = ", ".join(("+" if t > 0 else "−" if t < 0 else "") + f"{abs(t):g}"
                     for t in transformers.STANDARD_TAPS_PCT)
    formulas = [s["formula"] for s in regulation()["steps"]]
    assert f"taps {taps} % of rated primary voltage" in formulas
    band = transformer_regulation.CALCULATOR.input("band_pct")
    assert band.default == BAND_NA
    assert band.region_defaults == {"iec": transformers.VOLTAGE_BAND_PCT["iec"]}
    assert f"± {BAND_NA:g} %" in band.help
    assert [token for token, _ in transformer_regulation.TAP_CHOICES] == [
        f"{t:g}" for t in transformers.STANDARD_TAPS_PCT]


@pytest.mark.parametrize("inputs, field, words", [
    ({"z_pct": 5}, "x_r", "give X/R together with %Z"),
    ({"x_r": 4}, "z_pct", "give %Z together with X/R"),
    ({"z_pct": 0, "x_r": 4}, "z_pct", "at least 0.1 %"),
    ({"z_pct": 35, "x_r": 4}, "z_pct", "at most 30 %"),
    ({"pf": 0}, "pf", "at least 0.05"),
    ({"pf": 1.1}, "pf", "at most 1"),
    ({"load_pct": 250}, "load_pct", "at most 200 %"),
    ({"present_tap": "3"}, "present_tap", "choose one of"),
    ({"supply_pct": 40}, "supply_pct", "at least 50 %"),
    ({"leading": "maybe"}, "leading", "yes or no"),
])
def test_regulation_bad_input_gets_a_field_message(inputs, field, words):
    found = errors("transformer-regulation", **inputs)
    assert list(found) == [field] and words in found[field]


# ---- thresholds of transformer-regulation -----------------------------------------------------

@pytest.mark.parametrize("side", (-1, 1))
@pytest.mark.parametrize("factor, status", [(0.99, "pass"), (1.01, "warn")])
def test_threshold_voltage_band_present_tap(side, factor, status):
    # At no load on the rated tap the secondary is V₂ × supply: a supply off rated by 99 % of
    # the band is inside it, by 101 % outside, above and below.
    supply = 100 + side * factor * BAND_NA
    result = regulation(load_pct=0, supply_pct=supply)
    assert values(result)["loaded_v"] == pytest.approx(208 * supply / 100, rel=1e-12)
    assert checks(result)["present_band"] == status


@pytest.mark.parametrize("factor, status", [(1.001, "pass"), (0.999, "fail")])
def test_threshold_voltage_band_lowest_tap(factor, status):
    # The lowest tap raises a no-load secondary by 1 / (1 + t/100): a supply of
    # (1 + t/100)(1 − band/100) is the lowest it can bring into the band.
    lowest = min(transformers.STANDARD_TAPS_PCT)
    supply = 100 * (1 + lowest / 100) * (1 - BAND_NA / 100) * factor
    result = regulation(load_pct=0, supply_pct=supply)
    assert values(result)["tap_pct"] == lowest and checks(result)["tap"] == status


@pytest.mark.parametrize("factor, status", [(0.999, "pass"), (1.001, "warn")])
def test_threshold_voltage_band_light_load(factor, status):
    # The highest tap lowers the no-load secondary by 1 / (1 + t/100); with a supply of
    # (1 + t/100)(1 + band/100) the no-load voltage sits on the band's upper limit.
    highest = max(transformers.STANDARD_TAPS_PCT)
    supply = 100 * (1 + highest / 100) * (1 + BAND_NA / 100) * factor
    result = regulation(load_pct=0, supply_pct=supply)
    assert values(result)["tap_pct"] == highest and checks(result)["light_load"] == status


def _load_at_formula_gap(gap):
    """Load [fraction] at which exact and approximate regulation of 10 % R, 28 % X, pf 0.5
    differ by `gap` percentage points (bisection; the gap grows with the load there)."""
    low, high = 0.0, 2.0
    for _ in range(200):
        middle = (low + high) / 2
        diff = abs(transformers.regulation_exact(10, 28, 0.5, False, middle)
                   - transformers.regulation_approx(10, 28, 0.5, False, middle))
        low, high = (middle, high) if diff < gap else (low, middle)
    return low


@pytest.mark.parametrize("factor, status", [(0.99, "pass"), (1.01, "warn")])
def test_threshold_approximate_formula_agreement(factor, status):
    limit = transformer_regulation.FORMULA_AGREEMENT_PCT
    load = _load_at_formula_gap(limit * factor)
    result = regulation(r_pct=10, x_pct=28, pf=0.5, load_pct=100 * load)
    out = values(result)
    assert abs(out["regulation_pct"] - out["regulation_approx_pct"]) == pytest.approx(
        limit * factor, rel=1e-6)  # the bisection's resolution, far inside the 1 % margin
    assert checks(result)["formula_validity"] == status
    if status == "warn":
        assert f"more than {limit:g} percentage point" in check_message(result, "formula_validity")


# ==== transformer-efficiency ====================================================================

def test_all_day_efficiency_published_example():
    # M. A. Salam, Fundamentals of Electrical Machines, 2nd ed. (Narosa), Example 3.10: 12 kVA,
    # 97 % maximum efficiency at full load and unity pf (so P_cu = P_i = half the loss);
    # 8 h at 10 kW 0.8 pf, 10 h at 15 kW 0.9 pf, 6 h at no load; answer printed as 96 %.
    # Tolerance 0.5 percentage point: the published answer is rounded to a whole percent.
    loss = 12e3 / 0.97 - 12e3
    p_i = p_cu = loss / 2
    periods = [(10 / 0.8 / 12, 0.8, 8.0), (15 / 0.9 / 12, 0.9, 10.0)]
    out, lost = transformers.daily_energy(12e3, p_i, p_cu, periods)
    assert out == pytest.approx(230e3, rel=1e-12)  # 10 × 8 + 15 × 10 kWh, as the example sums
    assert 100 * out / (out + lost) == pytest.approx(96.0, abs=0.5)


def test_maximum_efficiency_load_against_scipy():
    # scipy's bounded scalar minimiser on −η(k) finds the same load as k = √(P₀/P_k); rel 1e-6
    # is its xatol of 1e-10 on k ≈ 0.1-0.4, with margin for the flat top of η(k).
    optimize = pytest.importorskip("scipy.optimize")
    for p0, pk, pf in [(300, 1800, 0.9), (600, 6500, 0.95), (1100, 9000, 0.8)]:
        found = optimize.minimize_scalar(
            lambda k: -transformers.efficiency(100e3, p0, pk, k, pf)[0],
            bounds=(0.01, 2.0), method="bounded", options={"xatol": 1e-10})
        assert transformers.maximum_efficiency_load(p0, pk) == pytest.approx(found.x, rel=1e-6)


def _pandapower_losses(kva, p0, pk, z_pct, pf, load):
    """Transformer losses [W] and the loaded secondary voltage [pu] from a pandapower power flow
    (constant-current load so the current is exactly k × rated)."""
    pp = pytest.importorskip("pandapower")
    net = pp.create_empty_network(sn_mva=1.0, f_hz=60)
    hv = pp.create_bus(net, vn_kv=0.48)
    lv = pp.create_bus(net, vn_kv=0.208)
    pp.create_ext_grid(net, hv, vm_pu=1.0)
    i0 = 1.5 * p0 / (kva * 1e3) * 100 if p0 else 0.0  # magnetising current above its loss part
    pp.create_transformer_from_parameters(
        net, hv, lv, sn_mva=kva / 1e3, vn_hv_kv=0.48, vn_lv_kv=0.208,
        vkr_percent=pk / (kva * 1e3) * 100, vk_percent=z_pct, pfe_kw=p0 / 1e3, i0_percent=i0)
    s = load * kva / 1e3
    pp.create_load(net, lv, p_mw=s * pf, q_mvar=s * math.sqrt(1 - pf * pf), const_i_p_percent=100,
                   const_i_q_percent=100)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        pp.runpp(net, tolerance_mva=1e-12)
    return net.res_trafo.pl_mw.at[0] * 1e6, net.res_bus.vm_pu.at[lv]


def test_load_loss_matches_pandapower_exactly_without_core_loss():
    # pfe = 0: pandapower's loss is I²R with I = k exactly, i.e. k² P_k; tolerance 1e-9 (its
    # power-flow convergence).
    for kva, pk, z, pf, k in [(75, 1800, 4.5, 0.9, 0.75), (1000, 9000, 5.75, 0.8, 1.2)]:
        theirs, _ = _pandapower_losses(kva, 0.0, pk, z, pf, k)
        mine = transformers.efficiency(kva * 1e3, 0.0, pk, k, pf)[2]
        assert mine == pytest.approx(theirs, rel=1e-9)


def test_total_loss_matches_pandapower_within_the_core_voltage_effect():
    # With core loss, pandapower puts it at the magnetising branch (mid-winding, T model), whose
    # voltage is below rated by up to the regulation ε; the core loss ∝ V², so the totals may
    # differ by about 2ε × P₀'s share of the loss. That bound is the tolerance.
    for kva, p0, pk, z, pf, k in [(75, 300, 1800, 4.5, 0.9, 0.75),
                                  (1000, 1100, 9000, 5.75, 0.8, 1.0)]:
        theirs, vm = _pandapower_losses(kva, p0, pk, z, pf, k)
        mine = transformers.efficiency(kva * 1e3, p0, pk, k, pf)[2]
        bound = 2 * (1 - vm) * p0 / mine + 1e-6
        assert mine == pytest.approx(theirs, rel=bound)


def test_annual_energy_units_against_pint():
    # J from kWh by pint's own definitions (1 kWh = 3.6 MJ).
    pint = pytest.importorskip("pint")
    ureg = pint.UnitRegistry()
    out = values(efficiency_result())
    daily_loss_kwh = (300 * 24 + 1800 * (4 + 0.36 * 10 + 0.09 * 6)) / 1000  # the default profile
    expected = (daily_loss_kwh * 365 * ureg.kilowatt_hour).to(ureg.joule).magnitude
    assert out["annual_loss_energy"] == pytest.approx(expected, rel=1e-12)


@settings(max_examples=200, deadline=None)
@given(p0=st.floats(10, 5000), pk=st.floats(10, 50000), k=st.floats(0.01, 2), pf=st.floats(0.3, 1))
def test_efficiency_properties(p0, pk, k, pf):
    eta, output, losses = transformers.efficiency(100e3, p0, pk, k, pf)
    k_max = transformers.maximum_efficiency_load(p0, pk)
    assert eta <= transformers.efficiency(100e3, p0, pk, k_max, pf)[0] + 1e-12  # the maximum
    assert (output + losses) * eta == pytest.approx(output, rel=1e-12)  # in = out + losses
    assert k_max ** 2 * pk == pytest.approx(p0, rel=1e-12)  # where the two losses are equal


def test_efficiency_limits():
    assert transformers.efficiency(100e3, 300, 1800, 0.0, 0.9) == (0.0, 0.0, 300.0)  # no load
    assert transformers.daily_energy(100e3, 300, 1800, []) == (0.0, 7200.0)  # energised, idle
    out = values(efficiency_result(load_pct=0, load1_pct=0, load2_pct=0, load3_pct=0))
    assert out["efficiency_pct"] == 0.0 and out["all_day_efficiency_pct"] == 0.0
    assert out["annual_loss_energy"] == pytest.approx(300 * 24 * 365 * 3600, rel=1e-12)


def test_all_day_efficiency_is_below_the_maximum():
    out = values(efficiency_result())
    assert out["all_day_efficiency_pct"] <= out["max_efficiency_pct"]


def test_overload_in_the_profile_warns():
    assert checks(efficiency_result(load1_pct=130))["overload"] == "warn"
    assert checks(efficiency_result())["overload"] == "pass"


@pytest.mark.parametrize("inputs, field, words", [
    ({"hours1": 10, "hours2": 10, "hours3": 5}, "hours3", "more than a day"),
    ({"hours1": 20, "hours2": 10}, "hours2", "more than a day"),
    ({"hours1": 25}, "hours1", "at most 24 h"),
    ({"no_load_w": 0}, "no_load_w", "at least 0.001 W"),
    ({"load_loss_w": "-1 kW"}, "load_loss_w", "out of range"),
    ({"pf": 1.2}, "pf", "at most 1"),
    ({"hours1": "4 A"}, "hours1", "not a time"),
    ({"days": 400}, "days", "at most 366"),
])
def test_efficiency_bad_input_gets_a_field_message(inputs, field, words):
    found = errors("transformer-efficiency", **inputs)
    assert list(found) == [field] and words in found[field]


# ---- thresholds of transformer-efficiency -----------------------------------------------------

@pytest.mark.parametrize("factor, status", [(0.99, "pass"), (1.0, "pass"), (1.01, "warn")])
def test_threshold_rated_load(factor, status):
    # Any period (or the efficiency load) above the rating is flagged; at it, not.
    percent = 100 * transformer_efficiency.RATED_LOAD * factor
    assert checks(efficiency_result(load1_pct=percent))["overload"] == status
    assert checks(efficiency_result(load_pct=percent))["overload"] == status


def test_threshold_rated_load_ignores_an_empty_period():
    # A period of no hours does not count, however heavy its load.
    assert checks(efficiency_result(load3_pct=150, hours3=0))["overload"] == "pass"


@pytest.mark.parametrize("factor, refused", [(0.99, False), (1.0, False), (1.01, True)])
def test_threshold_hours_in_a_day(factor, refused):
    day = transformer_efficiency.HOURS_A_DAY
    hours3 = day * factor - 4 - 10  # the default periods take 4 h and 10 h
    result = api.run("transformer-efficiency", {"hours3": hours3})
    assert (not result["ok"]) == refused
