"""voltage-drop, wire-size and max-length: published formulas, pandapower, properties, the
thresholds of their checks, errors."""

import math
import random
import warnings

import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st

from calc import api, units
from calc import voltage_drop as vd
from calc.calculators import _conductors
from calc.electrical import SQRT3
from calc.errors import ParameterError, VoltageCollapse
from tests.conftest import check_message, checks, errors, values
from tests.conftest import run as run_calculator


def run(calculator="voltage-drop", **inputs):
    """The output values of a calculation that must compute."""
    return values(run_calculator(calculator, **inputs))


# ---- published formulas ---------------------------------------------------------------------

def test_iec_annex_g_three_phase_formula():
    # IEC 60364-5-52 Annex G: u = b (ρ1 L/S cos φ + λ L sin φ) I_B, b = 1 for three-phase,
    # ρ1 = 0.0225 Ω·mm²/m (Cu), λ = 0.08 mΩ/m; Δu = 100 u / U0. With L = 50 m, S = 16 mm²,
    # I = 50 A, cos φ = 0.8: u = 2.9325 V, 1.275 % of 230 V (computed from the standard's form).
    r, x = 0.0225 * 50 / 16, 0.08e-3 * 50
    drop_ll = vd.approximate_drop("3ph", 50.0, r, x, 0.8)
    assert drop_ll / SQRT3 == pytest.approx(2.9325, rel=1e-12)
    assert 100 * drop_ll / 400 == pytest.approx(100 * 2.9325 / 230.94, rel=1e-4)


def test_iec_annex_g_single_phase_formula():
    # Same clause, b = 2 for single-phase: 2.5 mm² Cu, 20 m, 16 A, cos φ = 1 →
    # u = 2 × 0.0225 × 20 / 2.5 × 16 = 5.76 V = 2.50 % of 230 V (computed from the standard's form).
    drop = vd.approximate_drop("1ph", 16.0, 0.0225 * 20 / 2.5, 0.08e-3 * 20, 1.0)
    assert drop == pytest.approx(5.76, rel=1e-12)


def test_k_constant_rule_agrees_with_table_8():
    # VD = 2 K I L / cmil with K = 12.9 Ω·cmil/ft for Cu at 75 °C (common practice, trade
    # textbooks): 12 AWG (6530 cmil), 20 A, 100 ft → 7.90 V. The calculator with NEC Chapter 9
    # Table 8 resistance must agree within the rounding of K (0.5 %).
    k_rule = 2 * 12.9 * 20 * 100 / 6530
    out = run(system="dc", voltage=120, current=20, length="100 ft", size="12 AWG", method="table")
    assert out["drop_v"] == pytest.approx(k_rule, rel=5e-3)


def test_exact_equals_approximation_when_purely_resistive():
    # With X = 0 and pf = 1 the phasor solution is V_r = V_s − I R exactly.
    run_ = vd.solve_run("1ph", 120.0, 30.0, 0.0065, 0.0, 1.0, current=16.0)
    assert run_.drop_v == pytest.approx(run_.approx_drop_v, rel=1e-12)
    assert run_.drop_v == pytest.approx(2 * 16 * 0.0065 * 30, rel=1e-12)


# ---- the independent reference: pandapower power flow on a two-bus network ----------------------

def _pandapower_end_voltage(voltage, length_m, r_per_m, x_per_m, power, power_factor):
    """Load-end line voltage [V] of a constant-power load on one line (pandapower's
    Newton-Raphson power flow)."""
    pandapower = pytest.importorskip("pandapower")
    net = pandapower.create_empty_network(f_hz=60)
    source = pandapower.create_bus(net, vn_kv=voltage / 1e3)
    load = pandapower.create_bus(net, vn_kv=voltage / 1e3)
    pandapower.create_ext_grid(net, source, vm_pu=1.0)
    pandapower.create_line_from_parameters(
        net, source, load, length_km=length_m / 1e3, r_ohm_per_km=r_per_m * 1e3,
        x_ohm_per_km=x_per_m * 1e3, c_nf_per_km=0.0, max_i_ka=100.0)
    reactive = power * math.tan(math.acos(power_factor))
    pandapower.create_load(net, load, p_mw=power / 1e6, q_mvar=reactive / 1e6)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        pandapower.runpp(net, tolerance_mva=1e-12, max_iteration=50, numba=False)
    return float(net.res_bus.vm_pu[load]) * voltage


def test_exact_method_matches_pandapower_three_phase():
    pytest.importorskip("pandapower")
    # pandapower's line model with no shunt capacitance is the same series R + jX; its power flow
    # is solved to 1e-12 MVA, so the two must agree to better than 1e-7 (float rounding).
    rng = random.Random(20261201)
    for _ in range(25):
        voltage = rng.choice([208.0, 400.0, 480.0, 600.0, 4160.0])
        length = rng.uniform(5, 400)
        r, x = rng.uniform(0.03e-3, 2e-3), rng.uniform(0.05e-3, 0.15e-3)
        pf = rng.uniform(0.6, 1.0)
        # a load that drops 0.5 to 8 % by the approximation
        target = rng.uniform(0.005, 0.08) * voltage
        current = target / (SQRT3 * length * (r * pf + x * math.sqrt(1 - pf * pf)))
        power = SQRT3 * voltage * current * pf
        ours = vd.solve_run("3ph", voltage, length, r, x, pf, power=power)
        theirs = _pandapower_end_voltage(voltage, length, r, x, power, pf)
        assert ours.end_v == pytest.approx(theirs, rel=1e-7), (voltage, length, r, x, pf)


# ---- limiting cases and properties ------------------------------------------------------------

def test_dc_ignores_reactance_and_power_factor():
    a = run(system="dc", voltage=48, current=15, length="20 m", size="10 AWG", pf=0.5)
    b = run(system="dc", voltage=48, current=15, length="20 m", size="10 AWG", pf=1)
    assert a["drop_v"] == b["drop_v"]


def test_balanced_120_240_has_half_the_percent_of_a_120_v_two_wire():
    # Balanced 3-wire: the neutral carries nothing, so each leg sees one conductor's drop on
    # 120 V instead of a loop of two (computed). Exact for the linear approximation; the exact
    # phasor drop adds a small second-order term that does not halve (hence 1 % there).
    two_wire = run(system="1ph", voltage=120, current=20, length="100 ft")
    three_wire = run(system="1ph3w", voltage=240, current=20, length="100 ft")
    assert three_wire["drop_pct_approx"] == pytest.approx(two_wire["drop_pct_approx"] / 2,
                                                          rel=1e-12)
    assert three_wire["drop_pct"] == pytest.approx(two_wire["drop_pct"] / 2, rel=1e-2)


def test_neutral_current_adds_to_the_drop():
    balanced = run(system="1ph3w", voltage=240, current=20)
    unbalanced = run(system="1ph3w", voltage=240, current=20, neutral_a=10)
    # neutral current in phase with the line current: the leg's drop scales by 1 + In/I
    assert unbalanced["drop_pct_approx"] == pytest.approx(1.5 * balanced["drop_pct_approx"],
                                                          rel=1e-12)
    assert unbalanced["drop_pct"] == pytest.approx(1.5 * balanced["drop_pct"], rel=1e-2)
    assert unbalanced["loss_w"] > balanced["loss_w"]


def test_power_gives_the_current_at_nominal_voltage():
    out = run(system="3ph", voltage=480, current="", power="50 kW", pf=0.85)
    assert out["current"] == pytest.approx(50e3 / (SQRT3 * 480 * 0.85), rel=1e-12)
    out = run(system="1ph", voltage=240, current="", kva="4.8 kVA")
    assert out["current"] == pytest.approx(20.0, rel=1e-12)


def test_constant_power_load_draws_more_than_at_nominal():
    run_ = vd.solve_run("3ph", 480.0, 200.0, 0.5e-3, 0.1e-3, 0.85, power=100e3)
    assert run_.current > 100e3 / (SQRT3 * 480 * 0.85)


SIZES = ["14 AWG", "12 AWG", "10 AWG", "8 AWG", "6 AWG", "4 AWG", "2 AWG", "1/0 AWG", "4/0 AWG",
         "250 kcmil", "500 kcmil"]


@settings(max_examples=60, deadline=None)
@given(length=st.floats(3, 300), current=st.floats(1, 60),
       system=st.sampled_from(["1ph", "3ph", "dc", "1ph3w"]), pf=st.floats(0.5, 1.0),
       i=st.integers(0, len(SIZES) - 2))
def test_drop_grows_with_length_and_current_and_falls_with_size_and_sets(length, current, system,
                                                                         pf, i):
    base = dict(system=system, voltage=480 if system == "3ph" else 240, pf=pf, size=SIZES[i])
    def drop(**change):
        inputs = {**base, "length": length, "current": current, **change}
        result = api.run("voltage-drop", inputs)
        assume(result["ok"])  # a collapse at the extremes is its own test
        return result["outputs"]["drop_pct"]["value"]
    d = drop()
    assert drop(length=length * 1.5) > d
    assert drop(current=current * 1.5) > d
    assert drop(size=SIZES[i + 1]) < d
    assert drop(sets=2) < d


@settings(max_examples=40, deadline=None)
@given(length=st.floats(10, 150), current=st.floats(5, 80), limit=st.floats(1, 6),
       system=st.sampled_from(["1ph", "3ph"]))
def test_wire_size_meets_the_limit_and_the_next_smaller_does_not(length, current, limit, system):
    inputs = dict(system=system, voltage=208, length=length, current=current, max_drop_pct=limit)
    result = api.run("wire-size", inputs)
    assume(result["ok"])
    chosen = result["outputs"]["conductor_area"]["display"]
    assert result["outputs"]["drop_pct"]["value"] <= limit
    index = units.SIZES.index(chosen)
    if chosen != "14 AWG":
        smaller = units.SIZES[index - 1]
        check = api.run("voltage-drop", {**inputs, "size": smaller})
        assert not check["ok"] or check["outputs"]["drop_pct"]["value"] > limit


@settings(max_examples=40, deadline=None)
@given(current=st.floats(1, 100), limit=st.floats(0.5, 8), size=st.sampled_from(SIZES),
       system=st.sampled_from(["1ph", "3ph", "dc", "1ph3w"]))
def test_max_length_gives_the_limit_back(current, limit, size, system):
    inputs = dict(system=system, voltage=240, current=current, size=size, max_drop_pct=limit)
    result = api.run("max-length", inputs)
    assume(result["ok"])
    length = result["outputs"]["length"]["value"]
    back = run(**{**inputs, "length": length})
    assert back["drop_pct"] == pytest.approx(limit, rel=1e-6)


def test_round_trip_size_drop_size():
    # A run's own drop, used as the limit, picks that size again (or, if equal, the same).
    inputs = dict(system="3ph", voltage=480, current=100, length="300 ft", pf=0.85)
    drop = run(size="2 AWG", **inputs)["drop_pct"]
    result = api.run("wire-size", {**inputs, "max_drop_pct": drop * (1 + 1e-9)})
    assert result["outputs"]["conductor_area"]["display"] == "2 AWG"


def test_wire_size_gives_the_area_in_square_metres_shown_as_the_size():
    result = run_calculator("wire-size", system="1ph", voltage=120, current=20, length="100 ft",
                            pf=1, method="table")
    out = result["outputs"]["conductor_area"]
    assert out["unit"] == "m²" and out["display"] == "8 AWG"
    assert out["value"] == pytest.approx(units.parse_conductor_size("8 AWG").area_m2, rel=1e-12)


def test_load_current_worked_values():
    # I = P / (√3 V pf): 50 kW, 480 V, 0.9 -> 50 000 / 748.246 = 66.8229 A; single-phase
    # 2.4 kW at 120 V, pf 1 -> 20 A; 120/240 V three-wire 4.8 kW at 240 V -> 20 A a line; DC
    # 1 kW at 48 V -> 20.8333 A, its pf ignored (computed by hand).
    assert vd.load_current("3ph", 50e3, 480.0, 0.9) == pytest.approx(66.8229, rel=1e-5)
    assert vd.load_current("1ph", 2.4e3, 120.0, 1.0) == pytest.approx(20.0, rel=1e-12)
    assert vd.load_current("1ph3w", 4.8e3, 240.0, 1.0) == pytest.approx(20.0, rel=1e-12)
    assert vd.load_current("dc", 1.0e3, 48.0, 0.5) == pytest.approx(20.8333, rel=1e-5)
    assert vd.load_current("3ph", 0.0, 480.0, 0.9) == 0.0


@settings(max_examples=200, deadline=None)
@given(power=st.floats(1, 1e8), voltage=st.floats(1, 1e5), pf=st.floats(0.05, 1.0),
       system=st.sampled_from(["1ph", "1ph3w", "3ph"]))
def test_load_current_round_trip_to_power(power, voltage, pf, system):
    current = vd.load_current(system, power, voltage, pf)
    k = SQRT3 if system == "3ph" else 1.0
    assert k * voltage * current * pf == pytest.approx(power, rel=1e-12)  # rounding only


@pytest.mark.parametrize("args, parameter, words", [
    (("2ph", 1e3, 480.0, 0.9), "system", "is not one of"),
    (("3ph", -1.0, 480.0, 0.9), "power", "power must be zero or more"),
    (("3ph", 1e3, 0.0, 0.9), "voltage", "voltage must be more than 0 V"),
    (("3ph", 1e3, 480.0, 1.2), "power_factor", r"power factor must lie in \(0, 1\]"),
])
def test_load_current_refuses(args, parameter, words):
    with pytest.raises(ParameterError, match=words) as raised:
        vd.load_current(*args)
    assert raised.value.parameter == parameter


def test_load_path_is_a_loop_on_two_wire_and_one_conductor_otherwise():
    assert vd.load_path_impedance("1ph", 0.1, 0.02) == (0.2, 0.04)
    assert vd.load_path_impedance("dc", 0.1, 0.02) == (0.2, 0.0)
    assert vd.load_path_impedance("1ph3w", 0.1, 0.02) == (0.1, 0.02)
    assert vd.load_path_impedance("3ph", 0.1, 0.02) == (0.1, 0.02)


def test_a_run_that_cannot_carry_its_current_collapses():
    # 100 A through a 2 Ω loop from 120 V: the whole voltage would be lost (I R > V).
    with pytest.raises(VoltageCollapse):
        vd.solve_run("1ph", 120.0, 100.0, 0.01, 0.0, 1.0, current=100.0)


# ---- the thresholds of the checks: just inside and just outside each ---------------------------

INSIDE, OUTSIDE = 0.99, 1.01  # 1 % either side of a limit
RUN = dict(system="1ph", voltage=120, current=16, length="100 ft", size="12 AWG", pf=0.9)


@pytest.mark.parametrize("calculator", ["voltage-drop", "max-length"])
@pytest.mark.parametrize("factor, status", [(INSIDE, "pass"), (OUTSIDE, "fail")])
def test_drop_limit_threshold(calculator, factor, status):
    if calculator == "voltage-drop":
        # The limit set so that this run's drop is the limit × 0.99 (within) or × 1.01 (over).
        drop = run(**RUN)["drop_pct"]
        result = run_calculator("voltage-drop", **RUN, max_drop_pct=drop / factor)
        assert checks(result)["drop_limit"] == status
        return
    # max-length's run lands on the limit (and passes): 1 % shorter is within it, 1 % longer
    # is over it.
    inputs = {k: v for k, v in RUN.items() if k != "length"}
    result = run_calculator("max-length", **inputs)
    assert checks(result)["drop_limit"] == "pass"
    at = run_calculator("voltage-drop", **inputs, length=values(result)["length"] * factor)
    assert checks(at)["drop_limit"] == status


@pytest.mark.parametrize("factor, chosen", [(INSIDE, "10 AWG"), (OUTSIDE, "8 AWG")])
def test_wire_size_drop_limit_threshold(factor, chosen):
    # 10 AWG's own drop as the limit × 0.99 ... × 1.01: within it 10 AWG is the answer, over it
    # the next size up. The drop of 12 AWG is far above either limit.
    inputs = {k: v for k, v in RUN.items() if k != "size"}
    drop = run(**inputs, size="10 AWG")["drop_pct"]
    result = run_calculator("wire-size", **inputs, max_drop_pct=drop / factor)
    assert result["outputs"]["conductor_area"]["display"] == chosen
    assert checks(result)["drop_limit"] == "pass"


def _length_for_approximation_error(share):
    """The run length [m] at which (approximate − exact) / exact drop reaches −share.

    The gap grows with the drop (the quadrature term of the phasor diagram), so bisection on
    length finds it; read from the calculator's own outputs, not its judgement."""
    inputs = dict(RUN, pf=0.7)

    def gap(length):
        out = run(**{**inputs, "length": length})
        return (out["drop_pct"] - out["drop_pct_approx"]) / out["drop_pct"]

    low, high = 1.0, 100.0
    assert gap(low) < share < gap(high)
    for _ in range(60):
        middle = 0.5 * (low + high)
        low, high = (middle, high) if gap(middle) < share else (low, middle)
    return inputs, 0.5 * (low + high)


@pytest.mark.parametrize("factor, status", [(INSIDE, "pass"), (OUTSIDE, "warn")])
def test_approximation_tolerance_threshold(factor, status):
    inputs, length = _length_for_approximation_error(_conductors.APPROXIMATION_TOLERANCE * factor)
    result = run_calculator("voltage-drop", **{**inputs, "length": length})
    assert checks(result)["approximation"] == status
    if status == "warn":
        assert "use the exact figure" in check_message(result, "approximation")


# ---- errors -------------------------------------------------------------------------------------

@pytest.mark.parametrize("calculator, inputs, field, words", [
    ("voltage-drop", {"length": "-5 m"}, "length", "out of range"),
    ("voltage-drop", {"length": 0}, "length", "greater than 0 m"),
    ("voltage-drop", {"size": "3.3 mm2"}, "size", "mm"),
    ("voltage-drop", {"pf": 0}, "pf", "greater than 0"),
    ("voltage-drop", {"pf": "1.1"}, "pf", "at most 1"),
    ("voltage-drop", {"voltage": 0}, "voltage", "greater than 0 V"),
    ("voltage-drop", {"size": "2.5 mm2", "material": "al"}, "size", "not made in aluminium"),
    ("voltage-drop", {"current": ""}, "current", "give the load current"),
    ("voltage-drop", {"kva": 3}, "kva", "only one of"),
    ("voltage-drop", {"sets": 2.5}, "sets", "whole number"),
    ("voltage-drop", {"neutral_a": 4}, "neutral_a", "three-wire"),
    ("voltage-drop", {"system": "2ph"}, "system", "choose one of"),
    ("voltage-drop", {"current": 5000, "length": "2 km"}, "length", "cannot carry"),
    ("wire-size", {"current": 2000, "voltage": 12, "system": "dc", "length": "1 km"}, "length",
     "no size"),
    ("max-length", {"max_drop_pct": 25}, "max_drop_pct", "at most 20"),
])
def test_bad_input_gets_a_field_message(calculator, inputs, field, words):
    found = errors(calculator, **inputs)
    assert list(found) == [field]
    assert words in found[field]
