"""The plausibility check of the seven transformer calculators (issue 11, item 9): pass on ordinary
equipment, warn, never fail, when an input or result is outside real transformers, and every range
tested just inside and just outside, built from its constant.

Thresholds are approached at 1 % inside and 1 % outside: far wider than floating-point rounding,
far narrower than any range here.
"""

import math

import pytest

from calc import api, transformers
from calc.calculators import (
    _transformers,
    buck_boost,
    supply_mismatch,
    transformer_efficiency,
    transformer_fault_current,
    transformer_regulation,
)
from calc.calculators._plausibility import CHECK_NAME
from tests.conftest import check_message, checks, run

SQRT3 = math.sqrt(3)
IDS = ("transformer-currents", "transformer-size", "transformer-fault-current",
       "transformer-regulation", "transformer-efficiency", "buck-boost", "supply-mismatch")
INSIDE, OUTSIDE = 0.99, 1.01


def around(bounds):
    """(value, status) just inside and just outside each end of a (low, high) range."""
    low, high = bounds
    return [(low * INSIDE, "warn"), (low * OUTSIDE, "pass"), (high * INSIDE, "pass"),
            (high * OUTSIDE, "warn")]


def plausible(calculator_id, **inputs):
    """The plausibility status of a run; exactly one such check, never a fail."""
    result = run(calculator_id, **inputs)
    statuses = [c["status"] for c in result["checks"] if c["name"] == CHECK_NAME]
    assert len(statuses) == 1 and statuses[0] in ("pass", "warn"), statuses
    return statuses[0]


def warning(calculator_id, **inputs):
    """The plausibility message of a run that must warn."""
    result = run(calculator_id, **inputs)
    assert checks(result)[CHECK_NAME] == "warn"
    return check_message(result, CHECK_NAME)


@pytest.mark.parametrize("region", ["na", "iec"])
@pytest.mark.parametrize("calculator_id", IDS)
def test_issue11_defaults_are_ordinary_transformers(calculator_id, region):
    assert checks(api.run(calculator_id, {}, region=region))[CHECK_NAME] == "pass"


# ---- the issue's examples: absurd inputs are no longer marked OK --------------------------------

def test_issue11_a_1_kva_500_kv_transformer_warns():
    message = warning("transformer-currents", kva="1 kVA", primary_v="500 kV", secondary_v="480 V")
    assert "500 kV primary" in message and "50.0 kVA and up" in message


def test_issue11_impedance_outside_real_transformers_warns():
    message = warning("transformer-fault-current", kva=75, secondary_v=208, z_pct=0.3)
    assert "0.3 %" in message and "0.5-20 %" in message


def test_issue11_a_load_no_low_voltage_winding_carries_warns():
    # 10 MVA at 208 V three-phase: 10e6 / (√3 × 208) = 27.8 kA
    message = warning("transformer-currents", kva="10 MVA", primary_v="13.8 kV", secondary_v=208)
    assert "27.8 kA" in message


def test_issue11_a_secondary_no_transformer_is_wound_for_warns():
    message = warning("transformer-currents", kva="1 kVA", phases="1", primary_v=120,
                      secondary_v="5 V")
    assert "secondary of 5.00 V" in message


def test_issue11_efficiency_losses_above_ten_percent_warn():
    # 75 kVA losing 3 kW + 6 kW = 12 % of its rating at full load
    message = warning("transformer-efficiency", kva=75, no_load_w="3 kW", load_loss_w="6 kW")
    assert "12 %" in message


def test_several_reasons_join_in_one_message():
    message = warning("transformer-currents", kva="1 kVA", primary_v="500 kV", secondary_v="5 V",
                      phases="1")
    assert "500 kV" in message and "5.00 V" in message and message.count(";") >= 1


# ---- shared ranges (_transformers), through transformer-currents --------------------------------

@pytest.mark.parametrize("factor, status", [(INSIDE, "warn"), (OUTSIDE, "pass")])
def test_threshold_lowest_winding_voltage(factor, status):
    volts = _transformers.WINDING_V_MIN * factor
    assert plausible("transformer-currents", kva=1, phases="1", primary_v=120,
                     secondary_v=volts) == status


@pytest.mark.parametrize("above, smallest_kva", _transformers.SMALLEST_KVA_ABOVE_V)
def test_threshold_smallest_rating_for_a_winding_voltage(above, smallest_kva):
    def status(volts, kva):
        return plausible("transformer-currents", kva=kva, phases="1", primary_v=volts,
                         secondary_v=120)
    assert status(above * OUTSIDE, smallest_kva * INSIDE) == "warn"
    assert status(above * OUTSIDE, smallest_kva * OUTSIDE) == "pass"
    assert status(above * INSIDE, smallest_kva * INSIDE) == "pass"  # the tier below allows it


@pytest.mark.parametrize("factor, status", [(INSIDE, "pass"), (OUTSIDE, "warn")])
def test_threshold_largest_low_voltage_winding_current(factor, status):
    amps = _transformers.LV_WINDING_CURRENT_MAX_A * factor
    kva = SQRT3 * 208 * amps / 1e3  # three-phase 208 V
    assert plausible("transformer-currents", kva=kva, primary_v="13.8 kV",
                     secondary_v=208) == status


def test_threshold_low_voltage_current_limit_applies_only_to_low_voltage_windings():
    # The same current in a winding just above LOW_VOLTAGE_LIMIT_V is a medium-voltage winding.
    volts = transformers.LOW_VOLTAGE_LIMIT_V
    amps = _transformers.LV_WINDING_CURRENT_MAX_A * OUTSIDE
    for factor, status in ((INSIDE, "warn"), (OUTSIDE, "pass")):
        kva = volts * factor * amps / 1e3  # single-phase
        assert plausible("transformer-currents", kva=kva, phases="1", primary_v="13.8 kV",
                         secondary_v=volts * factor) == status


@pytest.mark.parametrize("z_pct, status", around(_transformers.Z_PCT_RANGE))
def test_threshold_impedance_range(z_pct, status):
    # 75 kVA at 208 V keeps the fault (at most 208 A × 100 / 0.495 = 42 kA) inside every other range
    assert plausible("transformer-fault-current", kva=75, secondary_v=208, z_pct=z_pct) == status
    assert plausible("transformer-size", z_pct=z_pct) == status


# ---- transformer-fault-current ----------------------------------------------------------------

@pytest.mark.parametrize("x_r, status", around(transformer_fault_current.X_R_RANGE))
def test_threshold_transformer_x_r_range(x_r, status):
    assert plausible("transformer-fault-current", x_r=x_r) == status


@pytest.mark.parametrize("side, volts", [("low", 480.0), ("medium", 4160.0)])
@pytest.mark.parametrize("factor, status", [(INSIDE, "pass"), (OUTSIDE, "warn")])
def test_threshold_largest_interrupting_rating(side, volts, factor, status):
    # Infinite bus, c = 1, delta-wye: I = I_FL × 100 / %Z (the line-to-neutral fault is equal).
    # 2.5 % keeps I_FL (200 kA × 0.025 = 5 kA) within the low-voltage winding current.
    fault_a = transformer_fault_current.FAULT_MAX_A[side] * factor
    kva = SQRT3 * volts * fault_a * 0.025 / 1e3
    assert plausible("transformer-fault-current", kva=kva, secondary_v=volts,
                     primary_v="34.5 kV", z_pct=2.5) == status


def test_threshold_interrupting_limit_changes_at_the_low_voltage_limit():
    # 100 kA is within the low-voltage limit and beyond the medium-voltage one.
    volts = transformers.LOW_VOLTAGE_LIMIT_V
    for factor, status in ((INSIDE, "pass"), (OUTSIDE, "warn")):
        kva = SQRT3 * volts * factor * 100e3 * 0.025 / 1e3
        assert plausible("transformer-fault-current", kva=kva, secondary_v=volts * factor,
                         primary_v="34.5 kV", z_pct=2.5) == status


@pytest.mark.parametrize("factor, status", [(INSIDE, "pass"), (OUTSIDE, "warn")])
def test_threshold_weakest_source(factor, status):
    # c = 1: %Z_S = 100 S_T / S_sc, so S_sc = 100 S_T / %Z_S.
    z_source = transformer_fault_current.SOURCE_Z_PCT_MAX * factor
    assert plausible("transformer-fault-current", kva=1500,
                     source_mva=100 * 1.5 / z_source) == status


def test_the_mid_tap_fault_counts_for_the_interrupting_limit():
    # 167 kVA, 1 %, X/R 20 at 240 V: 69.6 kA line to line, about 115 kA line to neutral; scaled so
    # the line-to-neutral fault alone passes the 200 kA low-voltage limit.
    level = transformers.secondary_fault(167e3, 7200.0, 240.0, 1, 1.0, 20.0, mid_tap=True)
    scale = transformer_fault_current.FAULT_MAX_A["low"] / level.line_to_neutral_current
    for factor, status in ((INSIDE, "pass"), (OUTSIDE, "warn")):
        assert plausible("transformer-fault-current", kva=167 * scale * factor, phases="1",
                         secondary_v=240, primary_v="7.2 kV", z_pct=1, x_r=20) == status


# ---- transformer-regulation and transformer-efficiency -----------------------------------------

@pytest.mark.parametrize("calculator_id, field", [("transformer-regulation", "load_pct"),
                                                  ("transformer-efficiency", "load_pct"),
                                                  ("transformer-efficiency", "load1_pct")])
@pytest.mark.parametrize("factor, status", [(INSIDE, "pass"), (OUTSIDE, "warn")])
def test_threshold_load_beyond_the_loading_guides(calculator_id, field, factor, status):
    load = _transformers.LOAD_PCT_MAX * factor
    assert plausible(calculator_id, **{field: load}) == status


@pytest.mark.parametrize("supply, status", around(transformer_regulation.SUPPLY_PCT_RANGE))
def test_threshold_supply_voltage_range(supply, status):
    assert plausible("transformer-regulation", supply_pct=supply) == status


@pytest.mark.parametrize("sign", [1, -1])
@pytest.mark.parametrize("factor, status", [(INSIDE, "pass"), (OUTSIDE, "warn")])
def test_threshold_system_voltage_against_the_rated_secondary(sign, factor, status):
    system_v = 208 * (1 + sign * transformer_regulation.SYSTEM_MATCH_PCT / 100 * factor)
    assert plausible("transformer-regulation", system_v=system_v) == status


def test_regulation_with_no_impedance_warns():
    assert "0 % is outside" in warning("transformer-regulation", r_pct=0, x_pct=0)


@pytest.mark.parametrize("fraction, status", around(transformer_efficiency.LOSS_FRACTION_RANGE))
def test_threshold_losses_as_a_fraction_of_the_rating(fraction, status):
    # 75 kVA; the total at rated load split 1 : 4 between no-load and load loss.
    total = 75e3 * fraction
    assert plausible("transformer-efficiency", kva=75, no_load_w=total / 5,
                     load_loss_w=4 * total / 5) == status


# ---- buck-boost and supply-mismatch ------------------------------------------------------------

@pytest.mark.parametrize("calculator_id, extra", [
    ("buck-boost", {}), ("supply-mismatch", {"equipment_v": 100, "load_type": "resistive"})])
@pytest.mark.parametrize("factor, status", [(INSIDE, "warn"), (OUTSIDE, "pass")])
def test_threshold_lowest_public_supply(calculator_id, extra, factor, status):
    supply = _transformers.SUPPLY_V_MIN * factor
    inputs = {"supply_v": supply, **extra}
    if calculator_id == "buck-boost":
        inputs["target_v"] = supply * 1.1
    assert plausible(calculator_id, **inputs) == status


@pytest.mark.parametrize("sign", [1, -1])
@pytest.mark.parametrize("factor, status", [(INSIDE, "pass"), (OUTSIDE, "warn")])
def test_threshold_buck_boost_reach(sign, factor, status):
    assert buck_boost.REACH_PCT == pytest.approx(100 * 2 * 16 / 120, rel=1e-12)  # 16/32 V on 120 V
    target = 240 * (1 + sign * buck_boost.REACH_PCT / 100 * factor)
    assert plausible("buck-boost", supply_v=240, target_v=target) == status


@pytest.mark.parametrize("factor, status", [(INSIDE, "pass"), (OUTSIDE, "warn")])
def test_threshold_buck_boost_load_current(factor, status):
    amps = _transformers.LV_WINDING_CURRENT_MAX_A * factor
    assert plausible("buck-boost", load_kva=None, load_a=amps) == status


@pytest.mark.parametrize("factor, status", [(INSIDE, "warn"), (OUTSIDE, "pass")])
def test_threshold_mismatch_equipment_voltage(factor, status):
    volts = _transformers.WINDING_V_MIN * factor
    assert plausible("supply-mismatch", equipment_v=volts, load_type="resistive",
                     load_kva="0.1 kVA") == status


@pytest.mark.parametrize("field", ["supply_hz", "equipment_hz", "transformer_hz"])
@pytest.mark.parametrize("factor, status", [
    (1 + supply_mismatch.FREQUENCY_MATCH * INSIDE, "pass"),
    (1 + supply_mismatch.FREQUENCY_MATCH * OUTSIDE, "warn"),
    (1 - supply_mismatch.FREQUENCY_MATCH * INSIDE, "pass"),
    (1 - supply_mismatch.FREQUENCY_MATCH * OUTSIDE, "warn"),
])
def test_threshold_frequencies_in_use(field, factor, status):
    assert plausible("supply-mismatch", load_type="resistive", **{field: 60 * factor}) == status


def test_every_listed_frequency_is_in_use():
    for hertz in supply_mismatch.FREQUENCIES_HZ:
        assert plausible("supply-mismatch", load_type="resistive", supply_hz=hertz,
                         equipment_hz=hertz) == "pass"


@pytest.mark.parametrize("factor, status", [(INSIDE, "pass"), (OUTSIDE, "warn")])
def test_threshold_mismatch_supply_current(factor, status):
    # 120 V single-phase supply side: S = 120 V × I; the 230 V side carries less.
    kva = 120 * _transformers.LV_WINDING_CURRENT_MAX_A * factor / 1e3
    assert plausible("supply-mismatch", load_kva=kva, load_type="resistive") == status


# ---- the page says what the constants say ------------------------------------------------------

def test_pages_quote_the_ranges():
    from build import paths
    fault_page = (paths.ROOT / "site_src/calculators/transformer-fault-current.md").read_text()
    low, high = _transformers.Z_PCT_RANGE
    assert f"{low:g}-{high:g} %" in fault_page
    assert f"{transformer_fault_current.FAULT_MAX_A['low'] / 1e3:g} kA low voltage" in fault_page
    currents_page = (paths.ROOT / "site_src/calculators/transformer-currents.md").read_text()
    assert f"below {_transformers.WINDING_V_MIN:g} V" in currents_page
    assert f"{_transformers.LV_WINDING_CURRENT_MAX_A / 1e3:g} kA" in currents_page
    regulation_page = (paths.ROOT / "site_src/calculators/transformer-regulation.md").read_text()
    supply_low, supply_high = transformer_regulation.SUPPLY_PCT_RANGE
    assert f"{supply_low:g}-{supply_high:g} %" in regulation_page
    assert f"beyond {_transformers.LOAD_PCT_MAX:g} %" in regulation_page
    efficiency_page = (paths.ROOT / "site_src/calculators/transformer-efficiency.md").read_text()
    loss_low, loss_high = (100 * f for f in transformer_efficiency.LOSS_FRACTION_RANGE)
    assert f"{loss_low:g}-{loss_high:g} %" in efficiency_page
