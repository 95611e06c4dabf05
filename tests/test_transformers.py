"""calc.transformers (currents, ratios, ratings) with transformer-currents and transformer-size;
what the whole transformer family shares; the reference page.

The other transformer calculators have their own files: test_transformers_fault.py,
test_transformers_regulation.py (regulation and efficiency), test_transformers_supply.py
(buck-boost and supply-mismatch).

Independent references: pandapower, scipy, ngspice and pint (in those files). Published values
carry their source beside them; everything else is computed here by other means than calc/.
rel=1e-12 wherever two routes to the same number are compared (an identity, a round trip, a
hand formula with no rounding): only floating-point rounding separates them.
"""

import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calc import api, cautions, transformers
from calc.calculators import transformer_currents, transformer_size
from calc.errors import ParameterError
from tests.conftest import check_message, checks, errors, run, values

SQRT3 = math.sqrt(3)

FAMILY = ("transformer-size", "transformer-fault-current", "transformer-regulation",
          "transformer-efficiency", "buck-boost", "supply-mismatch")


def currents(**inputs):
    return run("transformer-currents", **inputs)


# ==== transformer-currents ====================================================================

def test_three_phase_full_load_current_worked_example():
    # I_FL = kVA / (√3 kV), textbook formula (from memory): 75 kVA at 208 V -> 208.2 A, at 480 V
    # -> 90.2 A. The numbers are computed by hand to 4 significant figures, hence rel=1e-3.
    out = values(currents(kva=75, primary_v=480, secondary_v=208))
    assert out["secondary_a"] == pytest.approx(208.2, rel=1e-3)
    assert out["primary_a"] == pytest.approx(90.21, rel=1e-3)


def test_single_phase_full_load_current_worked_example():
    # I = S / V: 50 kVA at 240 V -> 208.3 A; at 7200 V -> 6.944 A (computed by hand).
    out = values(currents(kva=50, phases="1", primary_v=7200, secondary_v=240))
    assert out["secondary_a"] == pytest.approx(208.3, rel=1e-3)
    assert out["primary_a"] == pytest.approx(6.944, rel=1e-3)


def test_rated_current_is_the_line_current_of_the_rating():
    # The physics function behind both: S / (√3 V) and S / V, written out here.
    assert transformers.rated_current(75e3, 208.0, 3) == pytest.approx(75e3 / (SQRT3 * 208),
                                                                        rel=1e-12)
    assert transformers.rated_current(50e3, 240.0, 1) == pytest.approx(50e3 / 240, rel=1e-12)


def test_delta_wye_turns_ratio_is_sqrt3_times_the_voltage_ratio():
    # 480 V delta to 208Y/120: 480 V across a primary winding, 120 V across a secondary one.
    out = values(currents(primary_v=480, secondary_v=208, connection="delta-wye"))
    assert out["turns_ratio"] == pytest.approx(480 / (208 / SQRT3), rel=1e-12)
    assert out["turns_ratio"] == pytest.approx(SQRT3 * out["voltage_ratio"], rel=1e-12)


@pytest.mark.parametrize("connection, factor", [
    ("delta-delta", 1.0), ("wye-wye", 1.0), ("delta-wye", SQRT3), ("wye-delta", 1 / SQRT3)])
def test_turns_ratio_by_connection(connection, factor):
    out = values(currents(primary_v=4160, secondary_v=480, connection=connection))
    assert out["turns_ratio"] == pytest.approx(factor * 4160 / 480, rel=1e-12)


def test_turns_ratio_refuses_an_unknown_connection():
    with pytest.raises(ParameterError, match="'zigzag' is not a winding connection"):
        transformers.turns_ratio(480.0, 208.0, 3, "zigzag")


def test_single_phase_ignores_the_connection():
    a = values(currents(phases="1", primary_v=480, secondary_v=240, connection="delta-wye"))
    assert a["turns_ratio"] == pytest.approx(2.0, rel=1e-12)


def test_one_to_one_isolating_transformer():
    out = values(currents(primary_v=480, secondary_v=480, connection="delta-delta"))
    assert out["primary_a"] == pytest.approx(out["secondary_a"], rel=1e-12)
    assert out["voltage_ratio"] == 1.0


def test_step_up_ratio_is_shown_the_right_way_round():
    result = currents(primary_v=480, secondary_v=4160, connection="delta-delta")
    assert result["outputs"]["voltage_ratio"]["display"] == "1 : 8.67"


@settings(max_examples=200, deadline=None)
@given(
    kva=st.floats(0.5, 1e5), v1=st.floats(50, 5e5), v2=st.floats(50, 5e5),
    phases=st.sampled_from(["1", "3"]),
)
def test_ideal_power_balance(kva, v1, v2, phases):
    out = values(currents(kva=kva, primary_v=v1, secondary_v=v2, phases=phases))
    k = SQRT3 if phases == "3" else 1.0
    assert k * v1 * out["primary_a"] == pytest.approx(kva * 1e3, rel=1e-12)
    assert k * v2 * out["secondary_a"] == pytest.approx(kva * 1e3, rel=1e-12)
    assert out["secondary_a"] / out["primary_a"] == pytest.approx(out["voltage_ratio"], rel=1e-12)


def test_current_scales_with_rating():
    small = values(currents(kva=75))["secondary_a"]
    large = values(currents(kva=150))["secondary_a"]
    assert large == pytest.approx(2 * small, rel=1e-12)


def test_line_to_neutral_entry_is_flagged():
    assert checks(currents(secondary_v=120))["secondary_v_line_to_line"] == "warn"


def test_line_to_neutral_is_not_flagged_for_single_phase():
    result = currents(phases="1", primary_v=7200, secondary_v=120, kva=25)
    assert "secondary_v_line_to_line" not in checks(result)


@pytest.mark.parametrize("kva, phases, status", [
    (75, "3", "pass"),     # IEEE/ANSI C57.12 preferred three-phase rating (read, approximate)
    (167, "1", "pass"),    # preferred single-phase rating, same source
    (630, "3", "pass"),    # IEC 60076 R10 series (from memory)
    (80, "3", "warn"),
])
def test_preferred_rating_check(kva, phases, status):
    assert checks(currents(kva=kva, phases=phases))["rating"] == status


def test_series_is_current_against_load_through_rated_point():
    series = currents(kva=75)["series"]
    loads = series["x"]["values"]
    secondary = series["y"][1]["values"]
    at_rated = secondary[loads.index(100.0)]
    assert at_rated == pytest.approx(75e3 / (SQRT3 * 208), rel=1e-12)
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
def test_currents_bad_inputs_get_field_messages(inputs, field, words):
    found = errors("transformer-currents", **inputs)
    assert list(found) == [field] and words in found[field]


# ---- thresholds of transformer-currents -------------------------------------------------------

@pytest.mark.parametrize("table, phases", [
    (transformers.PREFERRED_KVA_3PH_NA, "3"), (transformers.PREFERRED_KVA_1PH_NA, "1"),
    (transformers.PREFERRED_KVA_IEC, "3")])
def test_threshold_preferred_rating(table, phases):
    # A rating matches a list entry to a relative 1e-9 (rounding of a typed value): 1e-10 off
    # is the entry, 1e-6 off is not (no two entries of any list are that close).
    rating = table[len(table) // 2]
    inside = currents(kva=rating * (1 + 1e-10), phases=phases)
    outside = currents(kva=rating * (1 + 1e-6), phases=phases)
    assert checks(inside)["rating"] == "pass" and checks(outside)["rating"] == "warn"


def test_threshold_line_to_neutral_voltage():
    # Each usual line-to-neutral voltage is flagged as a three-phase entry; 1 % off it is not.
    for volts in transformer_currents.COMMON_LINE_TO_NEUTRAL_V:
        assert checks(currents(secondary_v=volts))["secondary_v_line_to_line"] == "warn"
        assert "secondary_v_line_to_line" not in checks(currents(secondary_v=volts * 1.01))
        assert "secondary_v_line_to_line" not in checks(currents(secondary_v=volts * 0.99))


def test_threshold_medium_voltage_caution():
    # The medium-voltage caution appears above LOW_VOLTAGE_LIMIT_V on either winding.
    limit = transformers.LOW_VOLTAGE_LIMIT_V
    below = currents(primary_v=limit * 0.99, secondary_v=208)["cautions"]
    above = currents(primary_v=limit * 1.01, secondary_v=208)["cautions"]
    assert cautions.MEDIUM_VOLTAGE not in below and cautions.MEDIUM_VOLTAGE in above
    assert cautions.MEDIUM_VOLTAGE not in currents(primary_v=limit)["cautions"]


# ==== the whole family ==========================================================================

@pytest.mark.parametrize("calculator", FAMILY)
def test_every_result_carries_the_ideal_transformer_relations(calculator):
    texts = " | ".join(step["text"] for step in run(calculator)["steps"])
    for words in ("voltage ratio", "reflected through the ratio squared", "power in = power out"):
        assert words in texts, (calculator, words)


@pytest.mark.parametrize("calculator", FAMILY)
def test_every_result_has_sources_assumptions_and_the_common_cautions(calculator):
    result = run(calculator)
    assert result["sources"] and result["assumptions"]
    for caution in cautions.COMMON:
        assert caution in result["cautions"]


def test_reflected_impedance_round_trip():
    # Z₁ = a² Z₂ and back: reflecting to the primary then to the secondary returns the load.
    z2 = complex(0.4, 0.3)
    z1 = transformers.reflected_impedance(z2, 13800.0, 480.0)
    assert z1 == pytest.approx((13800 / 480) ** 2 * z2, rel=1e-12)
    assert transformers.reflected_impedance(z1, 480.0, 13800.0) == pytest.approx(z2, rel=1e-12)


@st.composite
def _inputs_within_limits(draw, calculator):
    """Any mix of inputs at or inside the limits `describe` states, blanks where allowed."""
    inputs = {}
    for item in api.describe(calculator)["inputs"]:
        if draw(st.booleans()):
            continue  # left at its default
        if item["kind"] == "quantity":
            low = item["min"] if item["min"] is not None else -1e6
            high = item["max"] if item["max"] is not None else 1e6
            if item["min_exclusive"]:
                low = low + max(abs(low), 1.0) * 1e-12
            choices = [st.floats(low, high), st.sampled_from([low, high])]
            if item["optional"]:
                choices.append(st.just(""))
            inputs[item["name"]] = draw(st.one_of(choices))
        elif item["kind"] == "choice":
            inputs[item["name"]] = draw(st.sampled_from([c["value"] for c in item["choices"]]))
        elif item["kind"] == "flag":
            inputs[item["name"]] = draw(st.booleans())
    return inputs


@pytest.mark.parametrize("calculator", ("transformer-currents",) + FAMILY)
@settings(max_examples=300, deadline=None)
@given(data=st.data())
def test_inputs_within_the_limits_never_give_an_unattributed_error(calculator, data):
    # Extremes of every stated limit together: either a result, or errors that each name a field
    # (a cross-field problem), never an internal error, NaN or infinity.
    result = api.run(calculator, data.draw(_inputs_within_limits(calculator)))
    if result["ok"]:
        assert all(math.isfinite(o["value"]) for o in result["outputs"].values())
    else:
        assert all(error["field"] for error in result["errors"]), result["errors"]


# ==== transformer-size ==========================================================================

def size(**inputs):
    return run("transformer-size", **inputs)


@pytest.mark.parametrize("load_kva, phases, series, expected_kva", [
    # IEEE/ANSI C57.12 series preferred ratings (read, approximate): 75 < 80 <= 112.5
    (80, "3", "na", 112.5),
    (112.5, "3", "na", 112.5),  # a load exactly at a rating takes that rating
    (40, "1", "na", 50),      # single-phase list: 37.5 < 40 <= 50
    (140, "1", "na", 167),    # single-phase has 167 kVA, three-phase has not
    (700, "3", "iec", 800),   # IEC 60076-1 R10 list (from memory): 630 < 700 <= 800
    (1, "3", "na", 3),        # below the smallest: the smallest
])
def test_next_standard_rating_from_the_published_lists(load_kva, phases, series, expected_kva):
    out = values(size(load_kva=load_kva, phases=phases, ratings=series, growth_pct=0))
    assert out["rating"] == expected_kva * 1e3


def test_preferred_rating_tables_are_the_published_lists():
    # IEEE/ANSI C57.12 series preferred ratings (read, approximate; 3 and 9 kVA in some lists).
    assert transformers.PREFERRED_KVA_3PH_NA[2:18] == (15, 30, 45, 75, 112.5, 150, 225, 300, 500,
                                                        750, 1000, 1500, 2000, 2500, 3750, 5000)
    assert transformers.PREFERRED_KVA_1PH_NA[:9] == (5, 10, 15, 25, 37.5, 50, 75, 100, 167)
    # IEC 60076-1 R10 ratings (from memory) 100 to 3150 kVA.
    assert transformers.PREFERRED_KVA_IEC[2:16] == (100, 160, 250, 315, 400, 500, 630, 800, 1000,
                                                     1250, 1600, 2000, 2500, 3150)


@pytest.mark.parametrize("kva, phases, category", [
    # IEEE C57.12.00 short-circuit categories (read), at the boundaries
    (500, 1, "I"), (501, 1, "II"), (1667, 1, "II"), (1668, 1, "III"), (10000, 1, "III"),
    (10001, 1, "IV"), (15, 3, "I"), (500, 3, "I"), (501, 3, "II"), (5000, 3, "II"),
    (5001, 3, "III"), (30000, 3, "III"), (30001, 3, "IV"),
])
def test_short_circuit_categories(kva, phases, category):
    assert transformers.short_circuit_category(kva * 1e3, phases) == category


@settings(max_examples=150, deadline=None)
@given(load=st.floats(0.5, 7000), growth=st.floats(0, 40), phases=st.sampled_from(["1", "3"]),
       v1=st.sampled_from([4160, 12470, 13800]), v2=st.sampled_from([208, 240, 480]))
def test_size_properties(load, growth, phases, v1, v2):
    result = api.run("transformer-size", {"load_kva": load, "growth_pct": growth, "phases": phases,
                                          "primary_v": v1, "secondary_v": v2})
    if not result["ok"]:  # only a load above the list may be refused
        (error,) = result["errors"]
        assert error["field"] == "load_kva" and "largest rating" in error["message"]
        return
    out = values(result)
    design = load * 1e3 * (1 + growth / 100)
    assert out["rating"] >= design * (1 - 1e-9)  # the rating covers the design load
    assert out["loading_pct"] <= 100 / (1 + growth / 100) * (1 + 1e-9)
    table = {"3": transformers.PREFERRED_KVA_3PH_NA, "1": transformers.PREFERRED_KVA_1PH_NA}[phases]
    assert out["rating"] / 1e3 in table
    smaller = [k for k in table if k * 1e3 < out["rating"]]
    assert not smaller or smaller[-1] * 1e3 < design * (1 - 1e-12)  # and it is the next one up
    k = SQRT3 if phases == "3" else 1.0  # ideal power balance on both windings
    assert k * v1 * out["primary_a"] == pytest.approx(out["rating"], rel=1e-12)
    assert k * v2 * out["secondary_a"] == pytest.approx(out["rating"], rel=1e-12)


def test_size_load_by_kw_and_by_amps_agree_with_kva():
    # The same 50 kVA load given three ways (40 kW at 0.8; 138.8 A at 208 V three-phase).
    by_kva = values(size(load_kva=50))
    by_kw = values(size(load_kva="", load_kw=40, pf=0.8))
    by_amps = values(size(load_kva="", load_a=50e3 / (SQRT3 * 208)))
    for out in (by_kw, by_amps):
        assert out["load_va"] == pytest.approx(50e3, rel=1e-12)
        assert out["rating"] == by_kva["rating"]


def test_motor_dip_estimate_limits():
    # ΔV = S_LR / (S_LR + S_sc) (textbook, common practice): no motor, no dip; an enormous one,
    # nearly 100 %.
    assert transformers.motor_start_dip(0.0, 150e3, 5.0) == 0.0
    assert transformers.motor_start_dip(1e15, 150e3, 5.0) == pytest.approx(100.0, rel=1e-6)
    # the dip falls as the rating rises (a stiffer source)
    dips = [transformers.motor_start_dip(300e3, kva * 1e3, 5.75) for kva in (75, 150, 300, 500)]
    assert dips == sorted(dips, reverse=True)


def test_motor_start_sizes_up_and_says_so():
    result = size(load_kva=100, growth_pct=0, motor_lr_kva=500)
    assert values(result)["rating"] == 225e3  # vector transformer-size.json computes it by hand
    assert checks(result)["motor_start"] == "pass"
    assert any("Sized up for motor starting" in s["text"] for s in result["steps"])


def test_motor_too_big_for_any_rating_warns():
    result = size(load_kva=10, growth_pct=0, motor_lr_kva="1000 MVA")
    assert checks(result)["motor_start"] == "warn"


def test_nonlinear_flag_warns_with_a_remedy():
    result = size(nonlinear="yes")
    assert checks(result)["nonlinear_load"] == "warn"
    assert "K-factor" in check_message(result, "nonlinear_load")


def test_size_no_load_given():
    assert "give the load" in errors("transformer-size", load_kva="")["load_kva"]


def test_size_two_loads_given():
    assert "only one" in errors("transformer-size", load_kva=60, load_a=100)["load_a"]


def test_size_above_the_largest_rating():
    assert "largest rating" in errors("transformer-size", load_kva="9 MVA", phases="1")["load_kva"]


@pytest.mark.parametrize("duty, v1, v2, words", [
    ("step-down", 208, 480, "must be below its primary"),
    ("step-up", 480, 208, "must be above its primary"),
    ("isolating", 480, 208, "equal voltages"),
])
def test_size_duty_label_contradicts_the_voltages(duty, v1, v2, words):
    found = errors("transformer-size", duty=duty, primary_v=v1, secondary_v=v2)
    assert list(found) == ["secondary_v"] and words in found["secondary_v"]


def test_size_duty_labels_accept_matching_voltages():
    assert size(duty="step-up", primary_v=480, secondary_v=4160)
    assert size(duty="isolating", primary_v=480, secondary_v=480)


@pytest.mark.parametrize("inputs, field, words", [
    ({"pf": 0, "load_kva": "", "load_kw": 10}, "pf", "at least 0.05"),
    ({"growth_pct": -5}, "growth_pct", "at least 0"),
    ({"z_pct": 0}, "z_pct", "at least 0.1 %"),
    ({"z_pct": 31}, "z_pct", "at most 30 %"),
    ({"ratings": "jis"}, "ratings", "choose one of"),
    ({"motor_lr_kva": "50 kW"}, "motor_lr_kva", "apparent power"),
])
def test_size_bad_input_gets_a_field_message(inputs, field, words):
    found = errors("transformer-size", **inputs)
    assert list(found) == [field] and words in found[field]


# ---- thresholds of transformer-size -----------------------------------------------------------

def _motor_for_dip(dip_pct, rating, z_pct):
    """Locked-rotor apparent power [VA] that dips `rating` at `z_pct` by `dip_pct`: the dip
    estimate ΔV = S_LR / (S_LR + S_T × 100 / %Z) solved for S_LR by hand."""
    return dip_pct / (100.0 - dip_pct) * rating * 100.0 / z_pct


def test_threshold_motor_dip_limit_holds_the_rating():
    # 60 kVA with 25 % growth takes 75 kVA; a motor dipping it by 99 % of the limit keeps it,
    # one dipping it by 101 % sizes up to the next rating, which holds the dip.
    limit, z = transformer_size.MOTOR_DIP_LIMIT_PCT, 5.75
    limit_input = transformer_size.CALCULATOR.input("max_dip_pct")
    assert limit_input.default == limit and limit_input.help.startswith(f"{limit:g} %")
    inside = size(load_kva=60, motor_lr_kva=_motor_for_dip(0.99 * limit, 75e3, z) / 1e3)
    outside = size(load_kva=60, motor_lr_kva=_motor_for_dip(1.01 * limit, 75e3, z) / 1e3)
    assert values(inside)["rating"] == 75e3 and checks(inside)["motor_start"] == "pass"
    assert values(inside)["motor_dip_pct"] == pytest.approx(0.99 * limit, rel=1e-9)
    assert values(outside)["rating"] == 112.5e3 and checks(outside)["motor_start"] == "pass"


def test_threshold_motor_dip_limit_warns_at_the_largest_rating():
    # 8 MVA with 25 % growth takes the largest list entry (10 MVA): past the limit nothing holds.
    limit, z = transformer_size.MOTOR_DIP_LIMIT_PCT, 5.75
    largest = transformers.PREFERRED_KVA_3PH_NA[-1]
    for factor, status in ((0.99, "pass"), (1.01, "warn")):
        motor = _motor_for_dip(factor * limit, largest * 1e3, z) / 1e3
        result = size(load_kva=8000, primary_v=13800, secondary_v=480, motor_lr_kva=motor)
        assert values(result)["rating"] == largest * 1e3
        assert checks(result)["motor_start"] == status


def test_threshold_motor_dip_limit_is_the_input():
    # The limit the check uses is the form's, not a constant: 10 % instead of the default.
    motor = _motor_for_dip(12.0, 75e3, 5.75) / 1e3
    assert values(size(load_kva=60, motor_lr_kva=motor))["rating"] == 75e3
    assert values(size(load_kva=60, motor_lr_kva=motor, max_dip_pct=10))["rating"] > 75e3


def test_threshold_next_standard_rating():
    # A design load just under a rating takes it; just over, the next one up.
    table = transformers.PREFERRED_KVA_3PH_NA
    for i in (3, 9, 15):
        assert values(size(load_kva=table[i] * 0.99, growth_pct=0))["rating"] == table[i] * 1e3
        assert values(size(load_kva=table[i] * 1.01, growth_pct=0))["rating"] == table[i + 1] * 1e3


# ==== the reference page ========================================================================

def test_reference_full_load_table_against_hand_values():
    from build.reference import transformers as page
    grid = page.full_load_table(3, (75, 1000), (208.0, 480.0))
    # 75 kVA at 208 V: 208.2 A; 1000 kVA at 480 V: 1203 A (I = S / (√3 V), by hand)
    assert grid[0, 0] == pytest.approx(75e3 / (SQRT3 * 208), rel=1e-12)
    assert grid[1, 1] == pytest.approx(1202.8, rel=1e-4)


def test_reference_fault_table_is_the_infinite_bus_formula():
    from build.reference import transformers as page
    voltage, ratings = page.FAULT_TABLES["na"]
    grid = page.fault_grid("na")
    for i, kva in enumerate(ratings):
        for j, z in enumerate(page.FAULT_Z_PCT):
            assert grid[i, j] == pytest.approx(kva * 1e3 / (SQRT3 * voltage) * 100 / z, rel=1e-12)


def test_reference_mid_tap_table_is_the_line_to_line_fault_and_its_five_thirds_bound():
    # Infinite bus: line to line I_FL × 100 / %Z (S / V, by hand); line to neutral for an
    # all-reactance winding 2 / 1.2 = 5/3 × that (MID_TAP_X_FACTOR). X/R 10⁶ leaves R a part in
    # 10¹² of Z, so rel 1e-9.
    from build import team
    from build.reference import transformers as page
    grid = page.mid_tap_grid()
    for i, kva in enumerate(page.MID_TAP_KVA):
        for j, z in enumerate(page.MID_TAP_Z_PCT):
            line_to_line = kva * 1e3 / 240 * 100 / z
            assert grid[i, j, 0] == pytest.approx(line_to_line, rel=1e-12)
            assert grid[i, j, 1] == pytest.approx(5 / 3 * line_to_line, rel=1e-9)
    text = page.transformers_page(team.TeamConfig(region="iec"))
    assert "| 37.5 | 10.4 / 17.4 | 7.81 / 13 | 6.25 / 10.4 | 5.21 / 8.68 |" in text


def test_reference_page_builds_for_both_regions():
    from build import team
    from build.reference import transformers as page
    for region in ("na", "iec"):
        text = page.transformers_page(team.TeamConfig(region=region))
        assert text.startswith("# Transformer reference")
        assert "IEEE C57.12.00" in text and "IEC 60076-5" in text and "| 1500 |" in text


def test_reference_page_labels_follow_the_constants():
    from build import team
    from build.reference import transformers as page
    text = page.transformers_page(team.TeamConfig(region="na"))
    tolerance = 100 * transformers.IMPEDANCE_TOLERANCE
    gain = 100 * (1 / (1 - transformers.IMPEDANCE_TOLERANCE) - 1)  # 8.1 % at 7.5 %
    assert f"−{tolerance:g} % impedance tolerance gives {gain:.0f} % more" in text
    assert f"No-load taps (± {transformers.TAP_STEPS} × {transformers.TAP_STEP_PCT:g} %)" in text
    assert f"not over {100 * transformers.EXCITATION_LIMIT:g} % of its rating" in text


def test_reference_diagrams_are_well_formed_svg():
    import xml.etree.ElementTree as ElementTree
    from build.reference import transformers as page
    for connection, _, _ in page.DIAGRAM_CONNECTIONS:
        svg = ElementTree.fromstring(page.connection_diagram(connection))
        texts = {t.text for t in svg.iter("{http://www.w3.org/2000/svg}text")}
        assert {"H1", "H2", "H3", "X1", "X2", "X3"} <= texts
        assert ("X0" in texts) == connection.endswith("wye")  # a neutral only on a wye secondary
    for mode in ("boost", "buck"):
        svg = ElementTree.fromstring(page.buck_boost_diagram(mode))
        texts = " ".join(t.text for t in svg.iter("{http://www.w3.org/2000/svg}text"))
        assert ("1 + X/H" in texts) == (mode == "boost")
