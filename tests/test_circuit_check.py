"""circuit-check: one circuit end to end. Every rule at its boundary (a 20 A breaker on 14 AWG
fails 240.4(D), on 12 AWG passes; a continuous load at 125 % of 60 °C terminals; a motor branch at
exactly 125 %; Table 430.52 with its next size up; IEC 433.1; the drop limit; fault clearing at
the longest run; Table 250.122 with 250.122(B)); the verdict, the governing check and the fix;
plausibility; every error path names its field."""

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calc import api, protection, units
from calc.calculators import _circuit
from tests.conftest import check_message, checks, errors, run, values

INSIDE, OUTSIDE = 0.99, 1.01  # a threshold test lands 1 % inside and 1 % outside the limit
# The invented school kitchen receptacle circuit: 120 V, 16 A, 50 ft of 12 AWG THHN, 12 AWG EGC,
# a 20 A inverse-time breaker, Ze 0.15 Ω.
BASE = {"practice": "nec", "system": "1ph", "voltage": "120 V", "current": "16 A",
        "length": "50 ft", "size": "12 AWG", "material": "cu", "insulation_temp_c": 90,
        "device_type": "inverse-time", "device_rating": 20, "egc_size": "12 AWG", "ze": 0.15}
IEC = {"practice": "iec", "system": "1ph", "voltage": "230 V", "current": "13 A", "length": "25 m",
       "size": "2.5 mm2", "insulation_temp_c": 70, "installation": "C", "device_type": "mcb-b",
       "device_rating": 16, "ze": 0.35, "frequency_hz": 50}


def check(**changes):
    return run("circuit-check", **{**BASE, **changes})


def check_iec(**changes):
    return run("circuit-check", **{**IEC, **changes})


def status(result, name):
    return checks(result)[name]


# ---- ampacity and NEC 240.4 ---------------------------------------------------------------------

def test_20_a_breaker_on_14_awg_fails_240_4_d():
    result = check(size="14 AWG", egc_size="14 AWG")
    assert status(result, "overcurrent") == "fail"
    assert "240.4(D)" in check_message(result, "overcurrent")
    assert values(result)["verdict"] == "fail"


def test_20_a_breaker_on_12_awg_copper_passes():
    result = check()
    assert status(result, "overcurrent") == "pass" and status(result, "ampacity") == "pass"
    assert values(result)["verdict"] == "pass"


def test_continuous_load_on_12_awg_at_60_c_terminals():
    # 12 AWG, 60 °C terminals: 20 A (Table 310.16, 110.14(C)); a continuous load needs 125 %
    # (210.19(A)(1)): 16 A × 1.25 = 20 A exactly passes, 17 A (21.25 A) fails
    at_limit = check(current="16 A", continuous="yes")
    assert status(at_limit, "ampacity") == "pass" and values(at_limit)["required_a"] == 20
    over = check(current="17 A", continuous="yes")
    assert status(over, "ampacity") == "fail"
    assert "12 AWG" in check_message(over, "ampacity") and "10 AWG" in values(over)["fix"]
    # 210.20(A): the device carries 125 % too; 16.1 A continuous is 20.1 A for a 20 A breaker
    assert status(check(current="16.1 A", continuous="yes"), "overcurrent") == "fail"


@pytest.mark.parametrize("rating, outcome", [(60, "pass"), (70, "fail")])
def test_next_size_up_240_4_b(rating, outcome):
    # 6 AWG with 60 °C terminals: 55 A (Table 310.16); the next standard rating is 60 A (240.6(A))
    result = check(size="6 AWG", egc_size="10 AWG", current="40 A", device_rating=rating, ze=0.05,
                   length="20 ft")
    assert status(result, "overcurrent") == outcome
    if outcome == "pass":
        assert "240.4(B)" in check_message(result, "overcurrent")


def test_device_smaller_than_the_load_fails():
    result = check(current="21 A")
    assert status(result, "overcurrent") == "fail" and "below" in check_message(result, "overcurrent")


# ---- motor branch (Article 430) -----------------------------------------------------------------

MOTOR = {**BASE, "current": None, "motor_power": "1 hp", "voltage": "115 V", "size": "12 AWG",
         "device_rating": 40, "length": "20 ft", "insulation_temp_c": 60}


def test_motor_branch_at_exactly_125_percent():
    # 1 hp 115 V single-phase: 16 A (NEC Table 430.248, read); 125 % = 20 A = the 60 °C column's
    # 20 A for 12 AWG (430.22): exactly at the limit passes
    result = run("circuit-check", **MOTOR)
    out = values(result)
    assert out["flc_a"] == 16 and out["required_a"] == 20 and out["ampacity_a"] == 20
    assert status(result, "ampacity") == "pass" and status(result, "motor_branch") == "pass"
    # at 31 °C the 60 °C conductor takes 0.91 (310.15(B)(1)): 18.2 A < 20 A fails
    hot = run("circuit-check", **{**MOTOR, "ambient_c": 31})
    assert status(hot, "motor_branch") == "fail" and status(hot, "ampacity") == "fail"


@pytest.mark.parametrize("overload, outcome", [(20.0, "pass"), (20.01, "fail")])
def test_overload_at_125_percent_430_32(overload, outcome):
    result = run("circuit-check", **{**MOTOR, "overload_a": overload})
    assert status(result, "motor_branch") == outcome
    assert values(result)["overload_max_a"] == 20


@pytest.mark.parametrize("rating, outcome", [(80, "pass"), (90, "fail")])
def test_table_430_52_with_its_next_standard_rating(rating, outcome):
    # 10 hp 208 V: 30.8 A (Table 430.250); 250 % = 77 A; 430.52(C)(1) Exc. 1 allows 80 A
    result = check(system="3ph", voltage="208 V", current=None, motor_power="10 hp", size="8 AWG",
                   egc_size="8 AWG", device_rating=rating, ze=0.02, length="20 ft")
    assert status(result, "overcurrent") == outcome
    assert "240.4(G)" in check_message(result, "overcurrent")


def test_a_motor_circuit_is_not_held_to_240_4_d():
    # 240.4(G): a 40 A inverse-time breaker on 12 AWG is within Table 430.52 for 16 A (250 % =
    # 40 A), though 240.4(D) would allow only 20 A on a general circuit
    assert status(run("circuit-check", **MOTOR), "overcurrent") == "pass"


def test_starting_current_against_the_instantaneous_trip():
    # code letter K: 8.0-9.0 kVA/hp (NEMA MG 1, read); 1 hp at 115 V: up to 78 A locked-rotor;
    # a 15 A breaker at 2x trips from 24 A (-20 %): it may trip on starting (430.52(B))
    result = run("circuit-check", **{**MOTOR, "code_letter": "K", "device_rating": 15,
                                     "trip_multiple": 2})
    assert status(result, "motor_branch") == "warn"
    assert "430.52(B)" in check_message(result, "motor_branch")
    calm = run("circuit-check", **{**MOTOR, "code_letter": "K"})
    assert status(calm, "motor_branch") == "pass"


# ---- IEC 60364-4-43 --------------------------------------------------------------------------

@pytest.mark.parametrize("changes, outcome", [
    ({"device_rating": 25}, "pass"),  # In 25 ≤ Iz 27 (Table B.52.2 C)
    ({"device_rating": 32}, "fail"),  # In 32 > Iz 27
    ({"device_rating": 10}, "fail"),  # Ib 13 > In 10
    ({"device_type": "fuse-non-time-delay", "device_rating": 25}, "fail"),  # 1.6 × 25 = 40 > 1.45 × 27
    ({"device_type": "fuse-non-time-delay", "device_rating": 20}, "pass"),  # 32 ≤ 39.15
])
def test_iec_433_1_both_conditions(changes, outcome):
    assert status(check_iec(**changes), "overcurrent") == outcome


# ---- voltage drop -----------------------------------------------------------------------------

def test_drop_limit_just_inside_and_outside():
    drop = values(check())["drop_pct"]
    assert status(check(max_drop_pct=drop / INSIDE), "voltage_drop") == "pass"
    failing = check(max_drop_pct=drop / OUTSIDE)
    assert status(failing, "voltage_drop") == "fail"
    assert "10 AWG" in check_message(failing, "voltage_drop")


# ---- fault clearing -----------------------------------------------------------------------------

def _longest_run(u0, ze, size, egc, temperature, frequency, ia):
    line, cpc = units.parse_conductor_size(size), units.parse_conductor_size(egc)
    z = protection.loop_impedance_per_metre(line, cpc, "cu", temperature, frequency)
    return (u0 / ia - ze) / abs(z)


@pytest.mark.parametrize("practice", ["nec", "iec"])
def test_fault_clearing_at_the_longest_run(practice):
    if practice == "nec":
        longest = _longest_run(120, 0.15, "12 AWG", "12 AWG", 90, 60, 240)  # Ia = 10 × 1.2 × 20
        inside, outside = check(length=longest * INSIDE), check(length=longest * OUTSIDE)
    else:
        longest = _longest_run(230, 0.35, "2.5 mm2", "2.5 mm2", 70, 50, 80)  # Ia = 5 × 16 (B16)
        inside, outside = check_iec(length=longest * INSIDE), check_iec(length=longest * OUTSIDE)
    assert status(inside, "fault_clearing") == "pass"
    assert status(outside, "fault_clearing") == "fail"
    out = values(outside)
    assert "shorten the run" in out["fix"] or out["governing"] != "fault_clearing"


def test_available_fault_current_stands_for_ze():
    # Ze = U0 / I: 120 V / 2 kA = 0.06 Ω
    with_ze = values(check(ze=0.06))
    with_fault = values(check(ze=None, fault_a="2 kA"))
    assert with_fault["zs"] == pytest.approx(with_ze["zs"], rel=1e-12)


def test_ze_too_high_for_the_device_is_named():
    result = check(ze=0.6)  # 120 V / 0.6 Ω = 200 A < Ia 240 A with no cable at all
    assert status(result, "fault_clearing") == "fail" and "Ze alone" in values(result)["fix"]


# ---- equipment grounding conductor ---------------------------------------------------------------

def test_table_250_122_and_its_250_122_a_limit():
    assert status(check(egc_size="14 AWG"), "egc_size") == "fail"  # 20 A asks 12 AWG (read)
    assert status(check(), "egc_size") == "pass"
    small = check(size="14 AWG", egc_size="14 AWG", device_rating=15, current="12 A")
    assert status(small, "egc_size") == "pass"  # 15 A asks 14 AWG


def test_upsized_conductors_raise_the_egc_250_122_b():
    # 10 AWG where 12 AWG would do (20 A): the EGC grows in proportion, 6530 → 10380 cmil
    upsized = check(size="10 AWG", egc_size="12 AWG")
    assert status(upsized, "egc_size") == "fail" and "250.122(B)" in check_message(upsized, "egc_size")
    assert values(upsized)["fix"] == "use at least 10 AWG for the EGC"
    assert status(check(size="10 AWG", egc_size="10 AWG"), "egc_size") == "pass"


def test_iec_protective_conductor_by_table_or_adiabatic():
    assert status(check_iec(), "egc_size") == "pass"  # 2.5 mm² cpc: Table 54.2's own size
    thin = check_iec(egc_size="1 mm2")  # below Table 54.2, above the adiabatic 0.8 mm²
    assert status(thin, "egc_size") == "pass" and "543.1.2" in check_message(thin, "egc_size")


# ---- verdict, governing, fix ---------------------------------------------------------------------

def test_verdict_is_the_worst_and_governing_the_check_that_set_it():
    result = check(length="300 ft")
    out = values(result)
    assert out["verdict"] == "fail" and checks(result)[out["governing"]] == "fail"
    assert out["fix"]
    passing = values(check())
    # all pass: the governing check is the one with the least margin (20 A on a 20 A conductor)
    assert passing["verdict"] == "pass" and passing["governing"] == "overcurrent"
    assert "fix" not in passing


def test_every_result_carries_its_checks_in_order():
    names = [c["name"] for c in check()["checks"]]
    assert names == ["ampacity", "overcurrent", "voltage_drop", "fault_clearing", "egc_size",
                     "plausibility"]
    motor = [c["name"] for c in run("circuit-check", **MOTOR)["checks"]]
    assert "motor_branch" in motor


# ---- plausibility -------------------------------------------------------------------------------

@pytest.mark.parametrize("ze, outcome",
                         [(0.002, "pass"), (0.0019, "warn"), (2.0, "pass"), (2.01, "warn")])
def test_plausibility_of_ze(ze, outcome):
    result = check(ze=ze, length="5 ft")
    assert status(result, "plausibility") == outcome


def test_plausibility_of_a_load_no_conductor_carries():
    # over 2 × the 90 °C table value of 12 AWG (2 × 30 = 60 A)
    assert status(check(current="60 A", device_rating=60, length="5 ft"), "plausibility") == "pass"
    assert status(check(current="61 A", device_rating=60, length="5 ft"), "plausibility") == "warn"


# ---- errors -------------------------------------------------------------------------------------

@pytest.mark.parametrize("changes, field", [
    ({"ze": None, "fault_a": None}, "ze"),
    ({"device_type": "mcb-c", "device_rating": 18}, "device_rating"),
    ({"trip_multiple": 50}, "trip_multiple"),
    ({"size": "2.5 mm2"}, "size"),
    ({"insulation_temp_c": 70}, "insulation_temp_c"),
    ({"current": None, "motor_power": "1 hp", "code_letter": "Q"}, "code_letter"),
    ({"current": "16 A", "kva": "2 kVA"}, "kva"),
    ({"power": "3 hp", "current": None}, "power"),
    ({"current_carrying": 2.5}, "current_carrying"),
    ({"practice": "iec", "size": "2.5 mm2", "insulation_temp_c": 70, "current_carrying": 4},
     "current_carrying"),
    ({"material": "al", "size": "6 AWG", "egc_size": "2.5 mm2"}, "egc_size"),  # no Al 2.5 mm²
    ({"length": "500 km"}, "length"),
])
def test_errors_name_their_field(changes, field):
    found = errors("circuit-check", **{**BASE, **changes})
    assert field in found and found[field]


TEXT = st.one_of(st.text(max_size=10), st.integers(-5, 5000), st.floats(allow_nan=True), st.none(),
                 st.sampled_from(["12 AWG", "4/0", "2.5 mm2", "yes", "mcb-b", "3ph", "1ph3w", "20 A"]))


@settings(max_examples=150, deadline=None)
@given(st.dictionaries(st.sampled_from(["size", "egc_size", "current", "device_type", "device_rating",
                                        "system", "length", "ze", "fault_a", "motor_power",
                                        "continuous", "ambient_c", "practice"]), TEXT))
def test_any_input_gives_a_result_or_field_errors(inputs):
    result = api.run("circuit-check", inputs)
    text = api.dumps(result)  # never NaN or infinity
    assert "internal error" not in text
    if not result["ok"]:
        for error in result["errors"]:
            assert error["message"]


# ---- the page's worked example --------------------------------------------------------------------

def test_the_pages_worked_example():
    out = values(check())
    assert round(out["drop_pct"], 1) == 2.4 and round(out["far_end_fault_a"]) == 336
    assert out["ia"] == 240


def test_formatting_helper_remembers_only_what_no_display_system_changes():
    assert _circuit.fq(20.0, "A") == units.format_quantity(20.0, "A")
    assert "length" in _circuit._SYSTEM_DIMENSIONS and "current" not in _circuit._SYSTEM_DIMENSIONS
