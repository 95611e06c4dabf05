"""transformer-currents: worked values, ideal-transformer relations, checks and error paths."""

import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calc import api, transformers

SQRT3 = math.sqrt(3)


def run(**inputs):
    result = api.run("transformer-currents", inputs)
    assert result["ok"], result
    return result


def values(result):
    return {name: out["value"] for name, out in result["outputs"].items()}


def test_three_phase_full_load_current_worked_example():
    # I_FL = kVA / (sqrt(3) kV): 75 kVA at 208 V -> 208.2 A, at 480 V -> 90.2 A. Formula from
    # REFERENCE_VALUES section 5 (textbook, from memory); the numbers are computed by hand to 4
    # significant figures, hence rel=1e-3.
    out = values(run(kva=75, primary_v=480, secondary_v=208))
    assert out["secondary_a"] == pytest.approx(208.2, rel=1e-3)
    assert out["primary_a"] == pytest.approx(90.21, rel=1e-3)


def test_single_phase_full_load_current_worked_example():
    # I = S / V: 50 kVA at 240 V -> 208.3 A; at 7200 V -> 6.944 A (computed by hand).
    out = values(run(kva=50, phases="1", primary_v=7200, secondary_v=240))
    assert out["secondary_a"] == pytest.approx(208.3, rel=1e-3)
    assert out["primary_a"] == pytest.approx(6.944, rel=1e-3)


def test_delta_wye_turns_ratio_is_sqrt3_times_the_voltage_ratio():
    # 480 V delta to 208Y/120: 480 V across a primary winding, 120 V across a secondary one.
    out = values(run(primary_v=480, secondary_v=208, connection="delta-wye"))
    assert out["turns_ratio"] == pytest.approx(480 / (208 / SQRT3), rel=1e-12)
    assert out["turns_ratio"] == pytest.approx(SQRT3 * out["voltage_ratio"], rel=1e-12)


@pytest.mark.parametrize("connection, factor", [
    ("delta-delta", 1.0), ("wye-wye", 1.0), ("delta-wye", SQRT3), ("wye-delta", 1 / SQRT3)])
def test_turns_ratio_by_connection(connection, factor):
    out = values(run(primary_v=4160, secondary_v=480, connection=connection))
    assert out["turns_ratio"] == pytest.approx(factor * 4160 / 480, rel=1e-12)


def test_single_phase_ignores_the_connection():
    a = values(run(phases="1", primary_v=480, secondary_v=240, connection="delta-wye"))
    assert a["turns_ratio"] == pytest.approx(2.0, rel=1e-12)


def test_one_to_one_isolating_transformer():
    out = values(run(primary_v=480, secondary_v=480, connection="delta-delta"))
    assert out["primary_a"] == pytest.approx(out["secondary_a"], rel=1e-12)
    assert out["voltage_ratio"] == 1.0


def test_step_up_ratio_is_shown_the_right_way_round():
    result = run(primary_v=480, secondary_v=4160, connection="delta-delta")
    assert result["outputs"]["voltage_ratio"]["display"] == "1 : 8.67"


@settings(max_examples=200, deadline=None)
@given(
    kva=st.floats(0.5, 1e5), v1=st.floats(50, 5e5), v2=st.floats(50, 5e5),
    phases=st.sampled_from(["1", "3"]),
)
def test_ideal_power_balance(kva, v1, v2, phases):
    out = values(run(kva=kva, primary_v=v1, secondary_v=v2, phases=phases))
    k = SQRT3 if phases == "3" else 1.0
    assert k * v1 * out["primary_a"] == pytest.approx(kva * 1e3, rel=1e-12)
    assert k * v2 * out["secondary_a"] == pytest.approx(kva * 1e3, rel=1e-12)
    assert out["secondary_a"] / out["primary_a"] == pytest.approx(out["voltage_ratio"], rel=1e-12)


def test_current_scales_with_rating():
    small = values(run(kva=75))["secondary_a"]
    large = values(run(kva=150))["secondary_a"]
    assert large == pytest.approx(2 * small, rel=1e-12)


def test_line_to_neutral_entry_is_flagged():
    result = run(secondary_v=120)
    warned = {c["name"] for c in result["checks"] if c["status"] == "warn"}
    assert "secondary_v_line_to_line" in warned


def test_line_to_neutral_is_not_flagged_for_single_phase():
    result = run(phases="1", primary_v=7200, secondary_v=120, kva=25)
    assert all(c["name"] != "secondary_v_line_to_line" for c in result["checks"])


@pytest.mark.parametrize("kva, phases, status", [
    (75, "3", "pass"),     # IEEE/ANSI C57.12 preferred three-phase rating (read, approximate)
    (167, "1", "pass"),    # preferred single-phase rating, same source
    (630, "3", "pass"),    # IEC 60076 R10 series (from memory)
    (80, "3", "warn"),
])
def test_preferred_rating_check(kva, phases, status):
    (check,) = [c for c in run(kva=kva, phases=phases)["checks"] if c["name"] == "rating"]
    assert check["status"] == status


def test_medium_voltage_caution_only_above_1000_v():
    high = run(primary_v="13.8 kV")["cautions"]
    low = run(primary_v=480)["cautions"]
    assert any("1000 V" in c for c in high) and not any("1000 V" in c for c in low)


def test_series_is_current_against_load_through_rated_point():
    series = run(kva=75)["series"]
    loads = series["x"]["values"]
    secondary = series["y"][1]["values"]
    at_rated = secondary[loads.index(100.0)]
    assert at_rated == pytest.approx(transformers.full_load_current(75e3, 208, 3), rel=1e-12)
    assert loads[0] == 0 and loads[-1] == 150


@pytest.mark.parametrize("inputs, field, words", [
    ({"kva": 0}, "kva", "greater than 0 kVA"),
    ({"kva": "-75 kVA"}, "kva", "out of range"),
    ({"kva": "2000 MVA"}, "kva", "at most"),
    ({"primary_v": 0}, "primary_v", "at least 1 V"),  # 1e-308 V would overflow the current
    ({"secondary_v": "900 kV"}, "secondary_v", "at most 800000 V"),
    ({"primary_v": "75 kVA"}, "primary_v", "voltage"),
    ({"phases": "2"}, "phases", "choose one of"),
    ({"connection": "zigzag"}, "connection", "choose one of"),
])
def test_bad_inputs_get_field_messages(inputs, field, words):
    result = api.run("transformer-currents", inputs)
    assert result["ok"] is False
    (error,) = result["errors"]
    assert error["field"] == field
    assert words in error["message"]
