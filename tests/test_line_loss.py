"""line-loss: worked examples, the square law, agreement with voltage-drop, pandapower and
scipy, limiting cases, the thresholds of its checks and every error path."""

import math
import warnings

import numpy as np
import pint
import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st
from scipy import optimize

from calc import api, conductors, line_loss
from calc.calculators import line_loss as view
from calc.errors import ParameterError
from tests.conftest import check_message, checks, values
from tests.conftest import errors as calculator_errors
from tests.conftest import run as run_calculator

SPEC = view.CALCULATOR
HOUR = 3600.0
UREG = pint.UnitRegistry()
# Where both sides are the same arithmetic done another way (or exact by hand), only
# floating-point rounding separates them.
ROUNDING = 1e-12


def run(**inputs):
    return run_calculator("line-loss", **inputs)


def errors(**inputs):
    return calculator_errors("line-loss", **inputs)


def kwh(joules):
    """J to kWh through pint (an independent unit library), not calc's own constant."""
    return UREG.Quantity(joules, "J").to("kWh").magnitude


# ---- worked example 1: DC, every number from a published table -----------------------------
# A 10 kW DC irrigation pump fed from a farm's battery bank, 300 ft away on 1/0 copper: 125 V or
# 250 V? NEC Chapter 9 Table 8 gives 1/0 stranded copper 0.122 Ω/kft at 75 °C (read,
# as reproduced from the 2011 edition); on DC there is no skin effect, so R is the table value
# exactly. The
# relations I = P / V and P_loss = 2 I² R (loop of two conductors) are the textbook ones (Glover,
# Sarma & Overbye, Power System Analysis and Design, 5th ed., ch. 5 — from memory). Worked by
# hand below; the table's 3 significant figures are exact inputs here, so rel=1e-9 is rounding.
DC_INPUTS = dict(system="dc", power="10 kW", voltage="125 V", alt_voltage="250 V",
                 length="300 ft", size="1/0", alt_size="2/0", material="cu",
                 conductor_temp_c=75, method="table", operating_hours=4000, tariff=0.12,
                 alt_size_cost=500)
DC_R = 0.122 * 0.300  # Ω: 0.122 Ω/kft × 0.3 kft = 0.0366 Ω per conductor
DC_I, DC_I_ALT = 80.0, 40.0  # A: 10 000 W / 125 V, / 250 V
DC_LOSS = 468.48  # W: 2 × 80² × 0.0366
DC_LOSS_ALT = 117.12  # W: 2 × 40² × 0.0366
DC_KWH, DC_KWH_ALT = 1873.92, 468.48  # kWh: × 4000 h
DC_COST, DC_COST_ALT = 224.8704, 56.2176  # × 0.12 per kWh
DC_R_UPSIZED = 0.0967 * 0.300  # Ω: 2/0 copper, NEC Chapter 9 Table 8, 0.0967 Ω/kft (read)
DC_LOSS_UPSIZED = 371.328  # W: 2 × 80² × 0.02901
DC_UPSIZED_SAVING = 46.63296  # (468.48 − 371.328) W × 4000 h = 388.608 kWh, × 0.12
DC_PAYBACK_YEARS = 10.72203  # 500 / 46.63296


def test_dc_worked_example_from_nec_table8():
    out = values(run(**DC_INPUTS))
    assert out["current"] == pytest.approx(DC_I, rel=1e-9)
    assert out["alt_current"] == pytest.approx(DC_I_ALT, rel=1e-9)
    assert out["loss_w"] == pytest.approx(DC_LOSS, rel=1e-9)
    assert out["alt_loss_w"] == pytest.approx(DC_LOSS_ALT, rel=1e-9)
    assert out["loss_ratio"] == pytest.approx(0.25, rel=1e-9)
    assert kwh(out["annual_loss_j"]) == pytest.approx(DC_KWH, rel=1e-9)
    assert kwh(out["alt_annual_loss_j"]) == pytest.approx(DC_KWH_ALT, rel=1e-9)
    assert out["annual_cost"] == pytest.approx(DC_COST, rel=1e-9)
    assert out["alt_annual_cost"] == pytest.approx(DC_COST_ALT, rel=1e-9)
    assert out["annual_saving"] == pytest.approx(DC_COST - DC_COST_ALT, rel=1e-9)
    assert out["upsized_loss_w"] == pytest.approx(DC_LOSS_UPSIZED, rel=1e-9)
    assert out["upsized_annual_saving"] == pytest.approx(DC_UPSIZED_SAVING, rel=1e-9)
    # Payback in seconds of Julian years (365.25 d; pint's "julian_year" is that year).
    years = UREG.Quantity(out["payback"], "s").to("julian_year").magnitude
    assert years == pytest.approx(DC_PAYBACK_YEARS, rel=1e-6)  # the constant has 7 figures


def test_dc_worked_example_loss_share_and_displays():
    result = run(**DC_INPUTS)
    out = values(result)
    assert out["loss_pct"] == pytest.approx(100 * DC_LOSS / 10e3, rel=1e-9)  # 4.6848 %
    shown = {name: o["display"] for name, o in result["outputs"].items()}
    assert shown["annual_loss_j"] == "1.87 MWh"  # 1873.92 kWh to 3 figures
    assert shown["alt_annual_loss_j"] == "468 kWh"
    assert shown["payback"] == "10.7 years"


# ---- worked example 2: three-phase, 208 V or 480 V --------------------------------------------
# A school kitchen's 10 kW, 0.95 pf rooftop unit, 150 ft away on 10 AWG copper in PVC conduit.
# NEC Chapter 9 Table 8: 10 AWG stranded copper 1.24 Ω/kft at 75 °C (read). At 60 Hz the
# IEC 60287-1-1 skin and proximity terms for 10 AWG are below 2e-5 (x_s² = 8π·60/R'·1e-7 =
# 0.037, y_s = x_s⁴/192 = 7e-6; computed), so R_ac = R_dc within 2e-5: rel=1e-4.
AC_INPUTS = dict(system="3ph", power="10 kW", pf=0.95, voltage="208 V", alt_voltage="480 V",
                 length="150 ft", size="10 AWG", alt_size="8 AWG", material="cu",
                 conductor_temp_c=75, method="table", raceway="pvc", frequency_hz=60,
                 operating_hours=3000, tariff=0.20)
AC_R = 1.24 * 0.150  # Ω: 0.186 Ω per conductor
AC_I = 29.2181  # A: 10 000 / (√3 × 208 × 0.95)
AC_I_ALT = 12.6612  # A: 10 000 / (√3 × 480 × 0.95)
AC_LOSS = 476.364  # W: 3 × 29.2181² × 0.186
AC_LOSS_ALT = 89.4506  # W: 3 × 12.6612² × 0.186
AC_RATIO = 0.187778  # (208 / 480)²
AC_KWH, AC_KWH_ALT = 1429.09, 268.352  # kWh: × 3000 h
AC_COST, AC_COST_ALT = 285.818, 53.6704  # × 0.20 per kWh


def test_three_phase_worked_example_208_or_480():
    out = values(run(**AC_INPUTS))
    assert out["current"] == pytest.approx(AC_I, rel=1e-5)  # constants to 6 figures
    assert out["alt_current"] == pytest.approx(AC_I_ALT, rel=1e-5)
    assert out["loss_w"] == pytest.approx(AC_LOSS, rel=1e-4)  # R_ac within 2e-5 of Table 8
    assert out["alt_loss_w"] == pytest.approx(AC_LOSS_ALT, rel=1e-4)
    assert out["loss_ratio"] == pytest.approx(AC_RATIO, rel=1e-5)
    assert kwh(out["annual_loss_j"]) == pytest.approx(AC_KWH, rel=1e-4)
    assert kwh(out["alt_annual_loss_j"]) == pytest.approx(AC_KWH_ALT, rel=1e-4)
    assert out["annual_cost"] == pytest.approx(AC_COST, rel=1e-4)
    assert out["alt_annual_cost"] == pytest.approx(AC_COST_ALT, rel=1e-4)


# Worked example 2 with a 15 kVA step-down transformer at the load (no-load 100 W, load loss
# 300 W at rating; invented figures of a plausible size). The load's S = 10 kW / 0.95 =
# 10.526 kVA, so the unit runs at 0.70175 of rating: load loss 300 × 0.70175² = 147.738 W.
XFMR_LOAD_LOSS = 147.738  # W
XFMR_TOTAL = 247.738  # W: 100 + 147.738
ALT_KWH_WITH_XFMR = 1587.57  # kWh: (89.4506 + 147.738) W × 3000 h + 100 W × 8760 h


def test_step_down_transformer_adds_its_losses_all_year():
    result = run(**AC_INPUTS, step_down_kva=15, step_down_no_load_w=100,
                 step_down_load_loss_w=300)
    out = values(result)
    assert out["alt_xfmr_loss_w"] == pytest.approx(XFMR_TOTAL, rel=1e-5)
    assert out["alt_total_loss_w"] == pytest.approx(AC_LOSS_ALT + XFMR_TOTAL, rel=1e-4)
    assert kwh(out["alt_annual_loss_j"]) == pytest.approx(ALT_KWH_WITH_XFMR, rel=1e-4)
    # 1587.57 kWh at 480 V against 1429.09 kWh at 208 V: the transformer's year of no-load
    # loss outweighs the feeder saving, and the result says so.
    assert out["annual_saving"] < 0
    assert checks(result)["alt_voltage_saving"] == "warn"
    assert "outweigh" in check_message(result, "alt_voltage_saving")


def test_step_up_and_step_down_pair_counts_both():
    one = values(run(**AC_INPUTS, step_down_kva=15, step_down_no_load_w=100,
                     step_down_load_loss_w=300))
    two = values(run(**AC_INPUTS, step_down_kva=15, step_down_no_load_w=100,
                     step_down_load_loss_w=300, step_up_kva=15, step_up_no_load_w=100,
                     step_up_load_loss_w=300))
    assert two["alt_xfmr_loss_w"] == pytest.approx(2 * XFMR_TOTAL, rel=1e-5)
    assert two["alt_annual_loss_j"] - one["alt_annual_loss_j"] == pytest.approx(
        (XFMR_LOAD_LOSS * 3000 + 100 * 8760) * HOUR, rel=1e-5)


# ---- the functions ------------------------------------------------------------------------

# Buller & Woodrow LsF = 0.3 LF + 0.7 LF² (Electrical World, 1928; Gönen, Electric Power
# Distribution System Engineering, 2nd ed., ch. 2 — from memory): LF 0.6 -> 0.18 + 0.252 =
# 0.432; LF 0.5 -> 0.325 (computed by hand).
def test_loss_factor_worked_values():
    assert line_loss.loss_factor(0.6) == pytest.approx(0.432, rel=ROUNDING)
    assert line_loss.loss_factor(0.5) == pytest.approx(0.325, rel=ROUNDING)


def test_loss_factor_limits():
    assert line_loss.loss_factor(1.0) == 1.0  # a flat load: the loss is flat too
    assert line_loss.loss_factor(0.0) == 0.0


@settings(max_examples=200, deadline=None)
@given(st.floats(0.0, 1.0))
def test_loss_factor_lies_between_its_bounds(load_factor):
    # Any load shape has LF² ≤ LsF ≤ LF (Gönen, ch. 2 — from memory); the relation keeps to
    # them.
    value = line_loss.loss_factor(load_factor)
    assert load_factor ** 2 - 1e-15 <= value <= load_factor + 1e-15


@pytest.mark.parametrize("bad", [-0.1, 1.01])
def test_loss_factor_refuses_a_load_factor_outside_0_1(bad):
    with pytest.raises(ParameterError, match=r"load factor must lie in \[0, 1\]"):
        line_loss.loss_factor(bad)


def test_transformer_loss_at_rated_load_and_at_no_load():
    # P = P0 + Pk (S/Sr)² (IEC 60076-1 definitions — from memory): a 55.556 kVA unit carrying
    # the defaults' 50 kW at 0.9 pf runs at rating, 250 + 1100 = 1350 W (arithmetic by hand).
    out = values(run(step_down_kva=50 / 0.9, step_down_no_load_w=250, step_down_load_loss_w=1100))
    assert out["alt_xfmr_loss_w"] == pytest.approx(1350.0, rel=ROUNDING)


@settings(max_examples=40, deadline=None)
@given(power=st.floats(1, 150), p0=st.floats(0, 1e3), pk=st.floats(0, 3e3))
def test_transformer_load_loss_goes_with_the_square_of_the_load(power, p0, pk):
    inputs = dict(step_down_kva=75, step_down_no_load_w=p0, step_down_load_loss_w=pk,
                  voltage=480, alt_voltage=600)
    at = values(run(power=f"{power} kW", **inputs))["alt_xfmr_loss_w"] - p0
    double = values(run(power=f"{2 * power} kW", **inputs))["alt_xfmr_loss_w"] - p0
    # rounding of S/Sr squared, relative and (near zero load loss) absolute in µW
    assert double == pytest.approx(4 * at, rel=1e-9, abs=1e-6)


def test_transformer_losses_function():
    # P = P0 + Pk (S/Sr)² (IEC 60076-1 definitions — from memory): 15 kVA, 100 W + 300 W,
    # carrying 10.526 kVA -> 0.70175 of rating, 300 × 0.492459 = 147.738 W (by hand).
    losses = line_loss.transformer_losses(15e3, 100.0, 300.0, 10e3 / 0.95)
    assert losses.loading == pytest.approx(0.701754, rel=1e-6)  # constant to 6 figures
    assert losses.load_loss == pytest.approx(XFMR_LOAD_LOSS, rel=1e-5)
    assert line_loss.transformer_losses(15e3, 100.0, 300.0, 0.0).load_loss == 0.0


@pytest.mark.parametrize("args, parameter", [
    ((0.0, 100.0, 300.0, 1e3), "rating"),
    ((15e3, -1.0, 300.0, 1e3), "no_load_loss"),
    ((15e3, 100.0, -1.0, 1e3), "rated_load_loss"),
])
def test_transformer_losses_refuses(args, parameter):
    with pytest.raises(ParameterError) as raised:
        line_loss.transformer_losses(*args)
    assert raised.value.parameter == parameter


def test_annual_loss_energy_worked_value():
    # 1 kW for 4000 h at loss factor 0.432, plus 500 W of core loss for 8760 h:
    # 1728 kWh + 4380 kWh = 6108 kWh (by hand).
    energy = line_loss.annual_loss_energy(1000.0, 4000 * HOUR, 0.432, 500.0, 8760 * HOUR)
    assert kwh(energy) == pytest.approx(6108.0, rel=ROUNDING)


@settings(max_examples=200, deadline=None)
@given(loss=st.floats(0, 1e7), hours=st.floats(0, 8784), lsf=st.floats(0, 1))
def test_annual_loss_energy_is_linear_in_time(loss, hours, lsf):
    once = line_loss.annual_loss_energy(loss, hours * HOUR, lsf)
    assert line_loss.annual_loss_energy(loss, 2 * hours * HOUR, lsf) == pytest.approx(
        2 * once, rel=ROUNDING)
    assert line_loss.annual_loss_energy(loss, 0.0, lsf) == 0.0


@pytest.mark.parametrize("args, words", [
    ((-1.0, HOUR), "must be zero or more"),
    ((1.0, HOUR, 1.5), r"loss factor must lie in \[0, 1\]"),
])
def test_annual_loss_energy_refuses(args, words):
    with pytest.raises(ParameterError, match=words):
        line_loss.annual_loss_energy(*args)


def test_energy_cost_against_pint():
    # 3.6 GJ is 1000 kWh (pint), at 0.15 a kWh: 150.
    joules = UREG.Quantity(1000, "kWh").to("J").magnitude
    assert line_loss.energy_cost(joules, 0.15) == pytest.approx(150.0, rel=ROUNDING)
    assert line_loss.energy_cost(joules, 0.0) == 0.0


def test_energy_cost_refuses_a_negative_tariff():
    with pytest.raises(ParameterError, match="tariff must be zero or more"):
        line_loss.energy_cost(1.0, -0.1)


def test_payback_worked_value_and_limits():
    year = UREG.Quantity(1, "julian_year").to("s").magnitude
    assert line_loss.payback_period(1200.0, 300.0) == pytest.approx(4 * year, rel=ROUNDING)
    assert line_loss.payback_period(0.0, 300.0) == 0.0
    assert line_loss.payback_period(1200.0, 0.0) is None  # never: no division by zero
    assert line_loss.payback_period(1200.0, -5.0) is None
    assert line_loss.payback_period(1e9, 1e-300) is None  # beyond 1000 years: never, finite


@settings(max_examples=200, deadline=None)
@given(cost=st.floats(0, 1e9), saving=st.floats(1e-3, 1e9))
def test_payback_round_trip(cost, saving):
    payback = line_loss.payback_period(cost, saving)
    assume(payback is not None)
    assert payback / line_loss.YEAR_S * saving == pytest.approx(cost, rel=ROUNDING, abs=1e-9)


def test_payback_refuses_a_negative_cost():
    with pytest.raises(ParameterError, match="extra cost must be zero or more"):
        line_loss.payback_period(-1.0, 10.0)


# ---- the square law and other properties of the calculator ------------------------------------

@settings(max_examples=60, deadline=None)
@given(system=st.sampled_from(["1ph", "1ph3w", "3ph", "dc"]), v1=st.floats(100, 1000),
       v2=st.floats(100, 1000), power=st.floats(0.5, 20), pf=st.floats(0.5, 1.0),
       length=st.floats(5, 100), size=st.sampled_from(["4 AWG", "1/0", "250 kcmil", "35 mm2"]))
def test_loss_scales_with_the_square_of_the_voltage_ratio(system, v1, v2, power, pf, length,
                                                          size):
    # I ∝ 1/V at a given P and pf, and P_loss = n I² R: P_alt / P = (V / V_alt)² exactly, with
    # or without reactance (X moves the drop, not the I²R of a given current).
    result = api.run("line-loss", dict(system=system, voltage=v1, alt_voltage=v2,
                                       power=f"{power} kW", pf=pf, length=length, size=size))
    assume(result["ok"])  # a few random runs cannot carry the load at the lower voltage
    out = values(result)
    assert out["loss_ratio"] == pytest.approx((v1 / v2) ** 2, rel=ROUNDING)
    assert out["alt_current"] / out["current"] == pytest.approx(v1 / v2, rel=ROUNDING)


@settings(max_examples=40, deadline=None)
@given(length=st.floats(1, 300), factor=st.floats(0.1, 3), sets=st.integers(1, 4))
def test_loss_is_proportional_to_length_and_inverse_to_sets(length, factor, sets):
    base = values(run(length=length))["loss_w"]
    longer = values(run(length=length * factor))["loss_w"]
    parallel = values(run(length=length, sets=sets))["loss_w"]
    assert longer == pytest.approx(factor * base, rel=ROUNDING)
    assert parallel == pytest.approx(base / sets, rel=ROUNDING)


@pytest.mark.parametrize("pf", [0.7, 0.85, 1.0])
def test_loss_goes_with_one_over_pf_squared(pf):
    # The same real power at a lower power factor draws 1/pf more current: 1/pf² more loss.
    assert values(run(pf=pf))["loss_w"] == pytest.approx(
        values(run(pf=1.0))["loss_w"] / pf ** 2, rel=ROUNDING)


@settings(max_examples=40, deadline=None)
@given(hours=st.floats(0, 8784), tariff=st.floats(0, 2))
def test_cost_is_energy_times_tariff(hours, tariff):
    out = values(run(operating_hours=hours, tariff=tariff))
    assert out["annual_cost"] == pytest.approx(kwh(out["annual_loss_j"]) * tariff, rel=ROUNDING,
                                               abs=1e-12)
    assert out["annual_loss_j"] == pytest.approx(out["loss_w"] * hours * HOUR, rel=ROUNDING)


def test_load_factor_uses_buller_and_woodrow():
    flat = values(run(**DC_INPUTS))
    shaped = values(run(**DC_INPUTS, load_factor=0.5))
    # DC worked example at LF 0.5: LsF 0.325, 468.48 W × 0.325 × 4000 h = 609.024 kWh (by hand).
    assert kwh(shaped["annual_loss_j"]) == pytest.approx(609.024, rel=1e-9)
    assert shaped["loss_w"] == flat["loss_w"]  # the peak loss is the given power's
    given = values(run(**DC_INPUTS, loss_factor=0.325))
    assert given["annual_loss_j"] == pytest.approx(shaped["annual_loss_j"], rel=ROUNDING)


# ---- against voltage-drop, pandapower and scipy ----------------------------------------------

@pytest.mark.parametrize("system, voltage", [("3ph", 480), ("1ph", 240), ("1ph3w", 240),
                                             ("dc", 125)])
def test_loss_equals_voltage_drop_calculators_loss(system, voltage):
    # The same run in the voltage-drop calculator, its load given as power: the same current
    # (found at nominal voltage), the same loss and drop, to rounding.
    shared = dict(system=system, voltage=voltage, pf=0.9, length="200 ft", size="2 AWG",
                  material="cu", conductor_temp_c=75, raceway="steel", method="physics")
    drop = api.run("voltage-drop", dict(shared, current="", power="20 kW"))
    assert drop["ok"], drop
    out = values(run(**shared, power="20 kW"))
    assert out["loss_w"] == pytest.approx(drop["outputs"]["loss_w"]["value"], rel=ROUNDING)
    assert out["drop_pct"] == pytest.approx(drop["outputs"]["drop_pct"]["value"], rel=ROUNDING)
    assert out["current"] == pytest.approx(drop["outputs"]["current"]["value"], rel=ROUNDING)


def _pandapower_line_loss(voltage, power, pf, length, r_per_m, x_per_m, sets, constant_current):
    """Three-phase line loss [W] of a two-bus pandapower case: slack at nominal, one load."""
    pp = pytest.importorskip("pandapower")
    net = pp.create_empty_network(sn_mva=1.0)
    source = pp.create_bus(net, vn_kv=voltage / 1e3)
    load = pp.create_bus(net, vn_kv=voltage / 1e3)
    pp.create_ext_grid(net, source, vm_pu=1.0, va_degree=0.0)
    pp.create_line_from_parameters(net, source, load, length_km=length / 1e3,
                                   r_ohm_per_km=r_per_m * 1e3, x_ohm_per_km=x_per_m * 1e3,
                                   c_nf_per_km=0.0, max_i_ka=10.0, parallel=sets)
    share = 100.0 if constant_current else 0.0  # pandapower's ZIP model: all I, or all P
    pp.create_load(net, load, p_mw=power / 1e6, q_mvar=power * math.tan(math.acos(pf)) / 1e6,
                   const_i_p_percent=share, const_i_q_percent=share)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        pp.runpp(net, tolerance_mva=1e-12, max_iteration=50, numba=False)
    return float(net.res_line.pl_mw.iloc[0]) * 1e6


# pandapower 3.5.6 Newton-Raphson power flow, short line without shunt capacitance, slack held
# at 1.0 pu. It stops when the power mismatch is below tolerance_mva = 1e-12 MVA (1 µW), a few
# parts in 1e9 of these losses (hundreds of W); rel=1e-8 keeps that visible with some margin.
# Like is compared with like: a constant-current load (const_i 100 %) against loss_w, and a
# constant-power load (pandapower's default) against loss_cp_w.
PANDAPOWER_REL = 1e-8
PANDAPOWER_CASES = [
    # the defaults: 50 kW, 0.9 pf, 208 V or 480 V, 250 ft of 1/0 copper in PVC
    dict(),
    # a dairy barn's 120 kW of fans and pumps, 400 ft of 250 kcmil aluminium, 2 sets, steel
    dict(power="120 kW", pf=0.8, voltage=208, alt_voltage=480, length="400 ft",
         size="250 kcmil", alt_size="350 kcmil", material="al", sets=2, raceway="steel",
         method="physics"),
    # IEC: a workshop's 90 kW at 400 V or 690 V, 120 m of 70 mm² copper, 50 Hz
    dict(power="90 kW", pf=0.85, voltage=400, alt_voltage=690, length="120 m", size="70 mm2",
         alt_size="95 mm2", frequency_hz=50, conductor_temp_c=80, method="physics"),
]


@pytest.mark.parametrize("case", PANDAPOWER_CASES)
def test_three_phase_losses_agree_with_pandapower(case):
    spec = {item.name: item.default for item in SPEC.inputs}
    inputs = dict(spec, **case)
    checked = api.validate(SPEC, inputs)  # the same SI reading the view gets
    z = conductors.impedance(checked["size"], checked["material"], checked["conductor_temp_c"],
                             checked["frequency_hz"], checked["raceway"], None, checked["method"])
    out = values(run(**case))
    for voltage, cc, cp in ((checked["voltage"], "loss_w", "loss_cp_w"),
                            (checked["alt_voltage"], "alt_loss_w", "alt_loss_cp_w")):
        args = (voltage, checked["power"], checked["pf"], checked["length"], z.r_ac, z.x,
                int(checked["sets"]))
        assert out[cc] == pytest.approx(_pandapower_line_loss(*args, True), rel=PANDAPOWER_REL)
        assert out[cp] == pytest.approx(_pandapower_line_loss(*args, False), rel=PANDAPOWER_REL)


def test_worst_deviation_from_pandapower_is_below_1e8():
    worst = 0.0
    for case in PANDAPOWER_CASES:
        inputs = dict({item.name: item.default for item in SPEC.inputs}, **case)
        checked = api.validate(SPEC, inputs)
        z = conductors.impedance(checked["size"], checked["material"],
                                 checked["conductor_temp_c"], checked["frequency_hz"],
                                 checked["raceway"], None, checked["method"])
        out = values(run(**case))
        args = (checked["voltage"], checked["power"], checked["pf"], checked["length"], z.r_ac,
                z.x, int(checked["sets"]))
        worst = max(worst, abs(out["loss_w"] / _pandapower_line_loss(*args, True) - 1),
                    abs(out["loss_cp_w"] / _pandapower_line_loss(*args, False) - 1))
    assert worst < PANDAPOWER_REL


def test_single_phase_constant_power_loss_against_scipy():
    # Single-phase two-wire, which pandapower (balanced three-phase) does not model: solve the
    # phasor circuit V_s = V_r + I Z with P = Re(V_r I*) and the load's pf for V_r and I with
    # scipy's fsolve, then |I|² × 2R (the loop). fsolve's xtol=1e-13 makes rel=1e-9 generous.
    inputs = dict(system="1ph", voltage=240, alt_voltage=480, power="12 kW", pf=0.8,
                  length="150 ft", size="6 AWG", alt_size="4 AWG", method="physics")
    checked = api.validate(SPEC,
                           dict({i.name: i.default for i in SPEC.inputs}, **inputs))
    z = conductors.impedance(checked["size"], "cu", checked["conductor_temp_c"], 60.0, "pvc")
    loop = 2 * (z.r_ac + 1j * z.x) * checked["length"]
    phi = math.acos(0.8)
    out = values(run(**inputs))
    for voltage, name in ((240.0, "loss_cp_w"), (480.0, "alt_loss_cp_w")):
        def mismatch(unknowns):
            end, angle = unknowns  # load-end voltage magnitude and angle (source at 0°)
            v_r = end * np.exp(1j * angle)
            current = 12e3 / (end * 0.8) * np.exp(1j * (angle - phi))
            v_s = v_r + current * loop
            return [abs(v_s) - voltage, np.angle(v_s)]
        end, angle = optimize.fsolve(mismatch, [voltage, 0.0], xtol=1e-13)
        current = 12e3 / (end * 0.8)
        assert out[name] == pytest.approx(current ** 2 * loop.real, rel=1e-9)


# ---- limiting cases -----------------------------------------------------------------------

def test_no_operating_hours_means_no_energy_no_saving_and_no_payback():
    result = run(operating_hours=0, alt_size_cost=1000)
    out = values(result)
    assert out["annual_loss_j"] == 0.0 and out["alt_annual_loss_j"] == 0.0
    assert out["upsized_annual_saving"] == 0.0
    assert "payback" not in out  # never divided by a zero saving
    assert checks(result)["payback"] == "warn"


def test_idle_transformers_still_lose_their_core_loss():
    out = values(run(operating_hours=0, step_down_kva=75, step_down_no_load_w=250,
                     step_down_load_loss_w=1100))
    assert kwh(out["alt_annual_loss_j"]) == pytest.approx(250 * 8760 / 1e3, rel=ROUNDING)


def test_free_energy_costs_nothing():
    out = values(run(tariff=0, alt_size_cost=100))
    assert out["annual_cost"] == 0.0 and out["annual_saving"] == 0.0
    assert "payback" not in out


def test_same_voltage_twice_saves_nothing():
    result = run(voltage=480, alt_voltage=480)
    out = values(result)
    assert out["loss_ratio"] == 1.0 and out["annual_saving"] == 0.0
    assert checks(result)["alt_voltage_saving"] == "warn"


def test_lossless_transformers_change_nothing():
    plain = values(run())
    ideal = values(run(step_up_kva=75, step_up_no_load_w=0, step_up_load_loss_w=0,
                       step_down_kva=75, step_down_no_load_w=0, step_down_load_loss_w=0))
    assert ideal["alt_total_loss_w"] == plain["alt_total_loss_w"]
    assert ideal["alt_annual_loss_j"] == plain["alt_annual_loss_j"]


def test_free_upsizing_pays_back_at_once():
    out = values(run(alt_size_cost=0))
    assert out["payback"] == 0.0


def test_same_size_for_the_payback_is_flagged_and_never_pays_back():
    result = run(size="1/0", alt_size="1/0", alt_size_cost=500)
    assert checks(result)["alt_size_larger"] == "warn"
    assert checks(result)["payback"] == "warn"
    assert "payback" not in values(result)


def test_a_very_short_run_loses_almost_nothing():
    out = values(run(length="0.01 m"))
    assert 0 < out["loss_w"] < 1.0 and out["drop_pct"] < 1e-3


def test_load_model_warns_where_the_drop_is_large():
    # The defaults drop 4.2 % at 208 V: a constant-power load loses 9 % more there.
    result = run()
    assert checks(result)["load_model"] == "warn"
    assert checks(run(voltage=480, alt_voltage=600))["load_model"] == "pass"


def test_overloaded_or_implausible_transformers_are_flagged():
    result = run(step_down_kva=30, step_down_no_load_w=2000, step_down_load_loss_w=3000)
    named = checks(result)
    assert named["step_down_loading"] == "warn"  # 55.6 kVA on 30 kVA
    assert named["step_down_losses"] == "warn"  # 5 kW of 30 kVA is 17 %


def test_medium_voltage_and_backfeed_cautions():
    high = run(voltage=480, alt_voltage="4.16 kV", step_up_kva=75, step_up_no_load_w=300,
               step_up_load_loss_w=1000)["cautions"]
    low = run()["cautions"]
    assert any("1000 V" in c for c in high) and not any("1000 V" in c for c in low)
    assert any("back-feed" in c for c in high) and not any("back-feed" in c for c in low)
    assert any("lock out" in c for c in low)


def test_series_is_loss_against_load_through_the_given_point():
    result = run(step_down_kva=75, step_down_no_load_w=250, step_down_load_loss_w=1100)
    series, out = result["series"], values(result)
    loads = series["x"]["values"]
    assert loads[0] == 0 and loads[-1] == 125
    at = loads.index(100.0)
    assert series["y"][0]["values"][at] == pytest.approx(out["loss_w"], rel=ROUNDING)
    assert series["y"][1]["values"][at] == pytest.approx(out["alt_loss_w"], rel=ROUNDING)
    assert series["y"][2]["values"][at] == pytest.approx(out["alt_total_loss_w"], rel=ROUNDING)
    assert series["y"][2]["values"][0] == pytest.approx(250.0, rel=ROUNDING)  # core loss only


def test_result_has_steps_with_numbers_assumptions_sources_and_cautions():
    result = run(load_factor=0.6, alt_size_cost=900)
    texts = " ".join(s["formula"] + s["result"] for s in result["steps"])
    assert "(V / V_alt)²" in texts and "0.3 LF + 0.7 LF²" in texts
    assert "extra cost / annual saving" in texts
    assert result["assumptions"] and result["sources"] and result["cautions"]
    assert any("Buller" in s for s in result["sources"])


# ---- the thresholds of the checks: just inside and just outside each ---------------------------

INSIDE, OUTSIDE = 0.99, 1.01  # 1 % either side of a limit


@pytest.mark.parametrize("name, output", [("drop_limit", "drop_pct"),
                                          ("alt_drop_limit", "alt_drop_pct")])
@pytest.mark.parametrize("factor, status", [(INSIDE, "pass"), (OUTSIDE, "fail")])
def test_drop_limit_threshold(name, output, factor, status):
    drop = values(run())[output]
    assert checks(run(max_drop_pct=drop / factor))[name] == status


@pytest.mark.parametrize("factor, status", [(INSIDE, "pass"), (OUTSIDE, "warn")])
def test_alt_voltage_saving_threshold(factor, status):
    # Zero saving is the threshold: a step-down transformer's no-load loss, drawn all year,
    # set to 0.99 or 1.01 of what the conductor saving pays for (no load loss, so nothing else
    # changes): cost of P0 = P0 × 8760 h / 1000 × tariff.
    plain = values(run())
    tariff, energised_h = 0.15, 8760
    break_even = plain["annual_saving"] / (energised_h / 1e3 * tariff)
    result = run(tariff=tariff, energised_hours=energised_h, step_down_kva=75,
                 step_down_no_load_w=break_even * factor, step_down_load_loss_w=0)
    assert checks(result)["alt_voltage_saving"] == status


def _length_for_load_model_gap(share):
    """The run length [m] at which the constant-power loss exceeds the constant-current loss by
    `share` at the first (lower) voltage, found by bisection on the calculator's outputs."""
    def gap(length):
        out = values(run(length=length))
        return out["loss_cp_w"] / out["loss_w"] - 1.0

    low, high = 1.0, 250 * 0.3048  # the default run (250 ft) is past the threshold
    assert gap(low) < share < gap(high)
    for _ in range(60):
        middle = 0.5 * (low + high)
        low, high = (middle, high) if gap(middle) < share else (low, middle)
    return 0.5 * (low + high)


@pytest.mark.parametrize("factor, status", [(INSIDE, "pass"), (OUTSIDE, "warn")])
def test_load_model_threshold(factor, status):
    length = _length_for_load_model_gap(view.LOAD_MODEL_WARN * factor)
    out = values(run(length=length))
    assert out["alt_loss_cp_w"] / out["alt_loss_w"] - 1 < view.LOAD_MODEL_WARN  # 480 V is far in
    assert checks(run(length=length))["load_model"] == status


@pytest.mark.parametrize("factor, status", [(INSIDE, None), (OUTSIDE, "warn")])
def test_transformer_loading_threshold(factor, status):
    # The defaults' load is 50 kW at 0.9 pf = 55.556 kVA; a rating it loads to 0.99 or 1.01.
    burden_kva = 50 / 0.9
    rating = burden_kva / (view.MAX_TRANSFORMER_LOADING * factor)
    result = run(step_down_kva=rating, step_down_no_load_w=100, step_down_load_loss_w=500)
    assert checks(result).get("step_down_loading") == status


@pytest.mark.parametrize("factor, status", [(INSIDE, None), (OUTSIDE, "warn")])
def test_transformer_loss_sanity_threshold(factor, status):
    # Losses at rated load as a share of a 75 kVA rating: 0.99 or 1.01 of the limit.
    total = view.TRANSFORMER_LOSS_SANITY * factor * 75e3
    result = run(step_up_kva=75, step_up_no_load_w=total / 4, step_up_load_loss_w=total * 3 / 4)
    assert checks(result).get("step_up_losses") == status


@pytest.mark.parametrize("factor, status", [(INSIDE, "pass"), (OUTSIDE, "warn")])
def test_max_payback_years_threshold(factor, status):
    saving = values(run())["upsized_annual_saving"]
    result = run(alt_size_cost=saving * line_loss.MAX_PAYBACK_YEARS * factor)
    assert checks(result)["payback"] == status
    assert ("payback" in values(result)) is (status == "pass")


@pytest.mark.parametrize("alt_size, status", [("1/0", "warn"), ("2/0", None)])
def test_alt_size_larger_threshold(alt_size, status):
    # The comparison size must be larger than the run's 1/0: equal is flagged, the next is not.
    assert checks(run(size="1/0", alt_size=alt_size)).get("alt_size_larger") == status


@pytest.mark.parametrize("factor, status", [(INSIDE, "pass"), (OUTSIDE, "warn")])
def test_plausible_current_threshold_issue_11(factor, status):
    # Issue 11, item 9: the first voltage's current set, through the power, at the plausibility
    # multiple × 1/0 copper's 90 °C ampacity (NEC Table 310.16, 170 A) × 0.99 / 1.01; a short
    # run and a large comparison size so nothing else is out of range.
    from calc.calculators import _conductors
    current = (_conductors.PLAUSIBLE_CURRENT_MULTIPLE * _conductors.AMPACITY_90C["cu"]["1/0 AWG"]
               * factor)
    power = current * math.sqrt(3) * 480 * 0.9
    result = run(system="3ph", power=f"{power} W", pf=0.9, voltage=480, alt_voltage=600,
                 length="10 ft", size="1/0", alt_size="500 kcmil")
    assert checks(result)["plausibility"] == status
    if status == "warn":
        assert "1/0 AWG copper" in check_message(result, "plausibility")


def test_defaults_are_plausible_and_say_their_conductor_data():
    for region in ("na", "iec"):
        found = checks(api.run("line-loss", {}, region=region))
        assert found["plausibility"] == "pass" and found["conductor_data"] == "pass"


# ---- every error path ---------------------------------------------------------------------

@pytest.mark.parametrize("inputs, field, words", [
    ({"power": 0}, "power", "greater than 0 kW"),
    ({"pf": 1.2}, "pf", "at most 1"),
    ({"voltage": "0 V"}, "voltage", "at least 1 V"),
    ({"alt_voltage": "50 kV"}, "alt_voltage", "at most 35000 V"),
    ({"operating_hours": "9000 h"}, "operating_hours", "at most 8784 h"),
    ({"tariff": -0.1}, "tariff", "at least 0"),
    ({"alt_size_cost": -5}, "alt_size_cost", "at least 0"),
    ({"load_factor": 0}, "load_factor", "greater than 0"),
    ({"length": "150 kVA"}, "length", "length"),
    ({"alt_size": "13 AWG"}, "alt_size", "not a standard AWG size"),
    ({"system": "2ph"}, "system", "choose one of"),
    ({"speed": 3}, "speed", "unknown input"),
    ({"power": "50 hp"}, "power", "motor's output"),
])
def test_bad_inputs_get_field_messages(inputs, field, words):
    assert words in errors(**inputs)[field]


def test_load_factor_and_loss_factor_together_is_an_error():
    assert "not both" in errors(load_factor=0.5, loss_factor=0.3)["loss_factor"]


def test_parallel_sets_must_be_whole():
    assert "not a whole number" in errors(sets=1.5)["sets"]


def test_dc_has_no_transformers():
    found = errors(system="dc", step_down_kva=15, step_down_no_load_w=50,
                   step_down_load_loss_w=200)
    assert "DC run has no transformers" in found["step_down_kva"]


def test_transformer_losses_need_the_rating():
    assert "needs the step-up transformer's rating" in errors(
        step_up_no_load_w=100)["step_up_no_load_w"]


def test_transformer_rating_needs_both_losses():
    found = errors(step_down_kva=15)
    assert "no-load loss" in found["step_down_no_load_w"]
    assert "load loss at rated kVA" in found["step_down_load_loss_w"]


def test_transformers_must_be_energised_while_the_load_runs():
    message = errors(operating_hours=8784, step_down_kva=75, step_down_no_load_w=250,
                     step_down_load_loss_w=1100)["energised_hours"]
    assert "less than the 8784 h" in message


def test_a_run_that_cannot_carry_the_load_at_the_first_voltage():
    message = errors(system="1ph", voltage=120, alt_voltage=480, power="100 kW",
                     size="14 AWG", alt_size="12 AWG", length="1000 ft")["voltage"]
    assert "at 120 V" in message and "higher voltage" in message


def test_a_run_that_cannot_carry_the_load_at_the_alternative_voltage():
    message = errors(system="1ph", voltage=2400, alt_voltage=120, power="100 kW",
                     size="14 AWG", alt_size="12 AWG", length="1000 ft")["alt_voltage"]
    assert "at 120 V" in message


def test_a_comparison_size_not_made_in_the_material_names_its_own_field():
    message = errors(material="al", size="1/0", alt_size="4 mm2")["alt_size"]
    assert "not made in aluminium" in message


def test_a_size_without_a_table_value(monkeypatch):
    # Every offered size has a table value (NEC 2017 Table 8 lists aluminium from 18 AWG, read,
    # as reproduced); take aluminium 16 AWG out to reach the refusal.
    monkeypatch.delitem(conductors.NEC_TABLE8_AL_STRANDED_75C, "16 AWG")
    assert "choose physics" in errors(material="al", size="1/0", alt_size="16 AWG",
                                      method="table")["method"]


TEXT = st.one_of(st.text(max_size=10), st.integers(-10, 10_000), st.floats(allow_nan=True),
                 st.booleans(), st.none())


@settings(max_examples=300, deadline=None)
@given(st.dictionaries(st.sampled_from([
    "system", "power", "pf", "voltage", "alt_voltage", "length", "size", "alt_size",
    "operating_hours", "tariff", "alt_size_cost", "load_factor", "loss_factor", "step_up_kva",
    "step_up_no_load_w", "step_down_kva", "step_down_load_loss_w", "energised_hours", "sets"]),
    TEXT))
def test_any_input_gives_a_result_or_field_errors(inputs):
    result = api.run("line-loss", inputs)
    text = api.dumps(result)  # raises on NaN or infinity
    assert "internal error" not in text
    names = {item.name for item in SPEC.inputs} | set(inputs)
    if not result["ok"]:
        for error in result["errors"]:
            assert error["field"] in names and error["message"]



def test_a_load_too_small_to_lose_anything_is_no_internal_error():
    # 1e-300 kW: I²R underflows to 0 W, so the loss ratio is undefined and left out (found by
    # test_any_input_gives_a_result_or_field_errors).
    out = values(run(power=1e-300))
    assert out["loss_w"] == 0.0 and "loss_ratio" not in out
