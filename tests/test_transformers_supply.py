"""buck-boost and supply-mismatch (calc.transformers autotransformer and flux): ngspice, limits,
the threshold of every judgement, and every error path.

rel=1e-12 wherever two routes to the same number are compared: only floating-point rounding
separates them.
"""

import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calc import api, induction_motors, transformers
from calc.calculators import buck_boost, supply_mismatch
from tests.conftest import check_message, checks, errors, run, values

SQRT3 = math.sqrt(3)
EXCITATION = transformers.EXCITATION_LIMIT


def boost(**inputs):
    return run("buck-boost", **inputs)


def mismatch(**inputs):
    return run("supply-mismatch", **inputs)


# ==== buck-boost ================================================================================

def _spice_autotransformer(supply_v, shunt_v, series_v, mode, load_ohms):
    """|V_out| and the load current [V, A] from ngspice: two coupled windings (k = 0.999999,
    L ∝ N²) connected as an autotransformer, an AC analysis at 60 Hz."""
    from tests import spice
    l_shunt = 20.0  # H: magnetising current negligible against the load's
    l_series = l_shunt * (series_v / shunt_v) ** 2
    # boost: the series winding's dot at the output (aiding); buck: at the input (opposing)
    series = "Ls out in" if mode == "boost" else "Ls in out"
    # 1 µΩ of source resistance keeps the DC operating point solvable (the shunt winding is a
    # short circuit at DC); it shifts the output by about 1e-7, far inside the tolerance.
    elements = [f"V1 src 0 AC {supply_v}", "Rsrc src in 1e-6", f"Lp in 0 {l_shunt}",
                f"{series} {l_series}", "K1 Lp Ls 0.999999", f"Rload out 0 {load_ohms}"]
    # one point a decade over two decades, 60 Hz first (ngspice 39 loops on a one-decade sweep
    # written 6.000000e+01 to 6.000000e+02)
    result = spice.ac(elements, 60.0, 6000.0, 1, ["v(out)"])
    assert result["frequency"][0] == pytest.approx(60.0, rel=1e-12)
    return abs(result["v(out)"][0]), abs(result["v(out)"][0]) / load_ohms


@pytest.mark.parametrize("supply, shunt, series, mode", [
    (208.0, 240.0, 24.0, "boost"), (240.0, 240.0, 32.0, "buck"), (120.0, 120.0, 12.0, "boost"),
    (480.0, 480.0, 48.0, "buck"),
])
def test_buck_boost_output_against_ngspice(supply, shunt, series, mode):
    # Coupling 0.999999 leaves a leakage of about 2e-6 of the winding reactance: the output and
    # the load current agree with the ideal autotransformer to 1e-4.
    v_out, i_load = _spice_autotransformer(supply, shunt, series, mode, load_ohms=10.0)
    output = transformers.buck_boost_output(supply, shunt, series, mode)
    assert output == pytest.approx(v_out, rel=1e-4)
    # the series winding carries the load current: the calculator rates the unit V_series × I_L
    out = values(boost(supply_v=supply, target_v=v_out, load_kva="", load_a=i_load,
                       bank="single", neutral=True))
    assert out["rating_required"] == pytest.approx(series * v_out / 10.0, rel=1e-4)


def test_buck_boost_combinations_respect_the_excitation_limit():
    # A primary connection may see at most 105 % of its rating (IEEE C57.12.00 §4.1.6, from
    # memory); 1e-9 either side of the limit on the 240 V and 480 V connections.
    for shunt in (240.0, 480.0):
        at_limit = transformers.buck_boost_combinations(EXCITATION * shunt * (1 - 1e-9))
        over = transformers.buck_boost_combinations(EXCITATION * shunt * (1 + 1e-9))
        assert any(o.shunt_v == shunt for o in at_limit)
        assert not any(o.shunt_v == shunt for o in over)
    assert all(o.shunt_v >= 480 for o in transformers.buck_boost_combinations(252.1))
    assert transformers.buck_boost_combinations(505.0) == []  # above 1.05 × 480


@settings(max_examples=200, deadline=None)
@given(supply=st.floats(100, 500), target=st.floats(90, 600), kva=st.floats(0.1, 50),
       bank=st.sampled_from(["single", "wye", "open-delta"]))
def test_buck_boost_properties(supply, target, kva, bank):
    if bank == "wye" and supply / SQRT3 < 100:
        supply *= 2
    result = api.run("buck-boost", {"supply_v": supply, "target_v": target, "bank": bank,
                                    "load_kva": kva, "neutral": bank == "wye"})
    if not result["ok"]:
        (error,) = result["errors"]
        assert error["field"] == "supply_v"  # only an over-excited supply is refused
        return
    out = values(result)
    k = 1.0 if bank == "single" else SQRT3
    # ideal power balance: what goes in comes out
    assert k * supply * out["supply_a"] == pytest.approx(k * out["output_v"] * out["load_a"],
                                                         rel=1e-12)
    assert out["rating"] >= out["rating_required"] * (1 - 1e-12)
    # no standard combination changes the voltage by more than 32/120 (26.7 %)
    assert abs(out["boost_pct"]) <= 100 * 32 / 120 + 1e-9
    assert out["units"] == buck_boost.BANK_UNITS[bank]


def test_buck_boost_chooses_the_nearest_output():
    options = transformers.buck_boost_combinations(208.0)
    best = min(abs(o.output_v - 230.0) for o in options)
    out = values(boost(supply_v=208, target_v=230))
    assert abs(out["output_v"] - 230.0) == pytest.approx(best, abs=1e-9)


@pytest.mark.parametrize("inputs, status, words", [
    ({"bank": "wye", "supply_v": 208, "target_v": 230, "neutral": False}, "fail", "floats"),
    ({"bank": "wye", "supply_v": 208, "target_v": 230, "neutral": True}, "pass", "common"),
    ({"supply_v": 208, "target_v": 230}, "pass", "208 V ↔ 240 V"),
    ({"supply_v": 240, "target_v": 208}, "pass", "208 V ↔ 240 V"),
    ({"supply_v": 480, "target_v": 456}, "warn", "grounded conductor"),
    ({"bank": "open-delta", "supply_v": 480, "target_v": 440}, "warn", "grounded conductor"),
])
def test_buck_boost_connection_permission(inputs, status, words):
    result = boost(**inputs)
    assert checks(result)["connection_permitted"] == status
    assert words in check_message(result, "connection_permitted")


def test_buck_boost_600_v_to_480_v_exception():
    # No standard combination spans 480 V ↔ 600 V (from 480 V the largest boost is 48/480 = 10 %,
    # and 600 V over-excites every primary), so the rule is reached only by calling it.
    status, message = buck_boost._autotransformer_permission("single", False, 600.0, 480.0)
    assert status == "warn" and "industrial" in message


def test_buck_boost_beyond_the_usual_sizes_warns():
    result = boost(load_kva="500 kVA")
    assert checks(result)["unit_size"] == "warn"
    out = values(result)
    assert out["rating"] == out["rating_required"]


def test_buck_boost_far_target_warns():
    assert checks(boost(supply_v=208, target_v=300))["target"] == "warn"


@pytest.mark.parametrize("inputs, field, words", [
    ({"load_kva": "", "load_a": ""}, "load_kva", "give the load"),
    ({"load_kva": 5, "load_a": 20}, "load_a", "only one"),
    ({"supply_v": 600, "target_v": 575}, "supply_v", "above the highest standard"),
    ({"supply_v": 1200}, "supply_v", "at most 1000 V"),
    ({"target_v": 0}, "target_v", "at least 1 V"),
    ({"bank": "closed-delta"}, "bank", "choose one of"),
    ({"neutral": "perhaps"}, "neutral", "yes or no"),
])
def test_buck_boost_bad_input_gets_a_field_message(inputs, field, words):
    found = errors("buck-boost", **inputs)
    assert list(found) == [field] and words in found[field]


# ---- thresholds of buck-boost ------------------------------------------------------------------

@pytest.mark.parametrize("factor, refused", [(1 - 1e-9, False), (1.001, True)])
def test_threshold_excitation_of_the_highest_primary(factor, refused):
    # The highest standard primary connection (2 × 240 V) takes up to EXCITATION_LIMIT of it.
    top = EXCITATION * 2 * max(p for _, p, _ in transformers.BUCK_BOOST_WINDINGS)
    result = api.run("buck-boost", {"supply_v": top * factor, "target_v": 480})
    assert (not result["ok"]) == refused
    if refused:
        assert f"{100 * EXCITATION:g} % allowance" in result["errors"][0]["message"]
    else:
        assert f"(at most {100 * EXCITATION:g} %)" in check_message(result, "excitation")


@pytest.mark.parametrize("factor, status", [(0.99, "pass"), (1.01, "warn")])
def test_threshold_target_tolerance(factor, status):
    # From 120 V the highest output of any combination is the top one; a target above it by
    # 99 % or 101 % of the tolerance leaves that combination the nearest.
    top = max(o.output_v for o in transformers.buck_boost_combinations(120.0))
    limit = buck_boost.TARGET_TOLERANCE_PCT
    target = top / (1 - factor * limit / 100)
    result = boost(supply_v=120, target_v=target, neutral=True)
    assert values(result)["output_v"] == pytest.approx(top, rel=1e-12)
    assert checks(result)["target"] == status


@pytest.mark.parametrize("factor, status", [(0.99, "pass"), (1.01, "warn")])
def test_threshold_nominal_match_of_208_v(factor, status):
    # A supply within NOMINAL_MATCH of 208 V counts as 208 V: boosted into the 240 V class it is
    # the exception; just beyond, it is not (and it is below the 240 V class itself).
    supply = 208 * (1 + factor * buck_boost.NOMINAL_MATCH)
    result = boost(supply_v=supply, target_v=230)
    assert buck_boost.CLASS_240_V[0] <= values(result)["output_v"] <= buck_boost.CLASS_240_V[1]
    assert supply < buck_boost.CLASS_240_V[0]
    assert checks(result)["connection_permitted"] == status


@pytest.mark.parametrize("edge, factor, status", [
    (0, 1.001, "pass"), (0, 0.999, "warn"), (1, 0.999, "pass"), (1, 1.001, "warn")])
def test_threshold_240_v_class(edge, factor, status):
    # A supply inside the 240 V class bucked to near 208 V is the exception; just outside the
    # class (and not near 208 V itself) it is not.
    supply = buck_boost.CLASS_240_V[edge] * factor
    result = boost(supply_v=supply, target_v=208)
    assert abs(values(result)["output_v"] / 208 - 1) <= buck_boost.NOMINAL_MATCH
    assert abs(supply / 208 - 1) > buck_boost.NOMINAL_MATCH
    assert checks(result)["connection_permitted"] == status


@pytest.mark.parametrize("factor, warned", [(0.99, False), (1.0, False), (1.01, True)])
def test_threshold_largest_unit(factor, warned):
    # A unit needing up to the largest usual rating gets it; beyond, the size check warns.
    series_v = values(boost(load_kva="", load_a=1))["rating_required"]  # V_series × 1 A
    largest = buck_boost.LARGEST_UNIT_KVA * 1e3
    result = boost(load_kva="", load_a=largest * factor / series_v)
    assert ("unit_size" in checks(result)) == warned
    assert values(result)["rating"] == (largest * factor if warned else pytest.approx(largest))


# ==== supply-mismatch ===========================================================================

def test_flux_of_60_hz_equipment_on_50_hz():
    # Flux ∝ V/f (E = 4.44 f N Φ, Chapman 5th ed. 2.2): at the same voltage 60/50 = 120 %, and
    # 5/6 of the voltage restores it.
    assert transformers.flux_ratio(120, 50, 120, 60) == pytest.approx(1.2, rel=1e-12)
    assert transformers.flux_ratio(100, 50, 120, 60) == pytest.approx(1.0, rel=1e-12)


@settings(max_examples=200, deadline=None)
@given(v=st.floats(1, 1000), f1=st.floats(10, 400), f2=st.floats(10, 400))
def test_flux_round_trip(v, f1, f2):
    # Scaling the voltage with the frequency keeps the flux: V f2/f1 at f2 is rated flux.
    assert transformers.flux_ratio(v * f2 / f1, f2, v, f1) == pytest.approx(1.0, rel=1e-12)


def test_motor_combined_tolerance():
    # 4 % low frequency and the voltage held at rated V × f ratio (−4 %): sum 8 % -> pass;
    # NEMA MG 1-12.44 (read) allows the sum to reach 10 %.
    result = mismatch(equipment_v=460, equipment_hz=60, supply_v=460, supply_hz=57.6, phases="3",
                      load_kva=20)
    assert checks(result)["motor_tolerance"] == "pass"
    assert values(result)["secondary_v"] == pytest.approx(460 * 0.96, rel=1e-12)


def test_sixty_hertz_transformer_on_fifty_hertz_fails_and_says_reduce_the_voltage():
    result = mismatch(equipment_v=120, equipment_hz=50, supply_v=230, supply_hz=50, load_kva=1,
                      load_type="resistive", transformer_hz=60)
    assert checks(result)["transformer_frequency"] == "fail"
    assert "no more than 83.3 %" in check_message(result, "transformer_frequency")
    ok = mismatch(equipment_v=120, equipment_hz=60, supply_v=230, supply_hz=60, load_kva=1,
                  load_type="resistive", transformer_hz=50)
    assert checks(ok)["transformer_frequency"] == "pass"


def test_direct_connection_flux_fails_for_magnetic_loads():
    result = mismatch(equipment_v=120, equipment_hz=60, supply_v=120, supply_hz=50,
                      load_type="magnetic")
    assert checks(result)["direct_flux"] == "fail"  # 120 % flux connected directly
    assert values(result)["secondary_v"] == pytest.approx(100.0, rel=1e-12)


def test_fan_on_a_higher_frequency_warns_of_overload():
    result = mismatch()  # 50 Hz motor on 60 Hz
    assert checks(result)["driven_load"] == "warn"
    assert "1.73" in check_message(result, "driven_load")  # (6/5)³ = 1.728, affinity laws


def test_same_supply_is_a_pass_throughout():
    result = mismatch(equipment_v=230, equipment_hz=50, supply_v=230, supply_hz=50)
    out = values(result)
    assert out["ratio"] == 1.0 and out["flux_pct"] == pytest.approx(100.0, rel=1e-12)
    assert all(status == "pass" for status in checks(result).values())


def test_electronic_load_is_told_to_check_the_nameplate():
    assert checks(mismatch(load_type="electronic"))["nameplate"] == "warn"
    same = mismatch(load_type="electronic", supply_hz=50)
    assert checks(same)["nameplate"] == "pass"


@settings(max_examples=150, deadline=None)
@given(ve=st.floats(50, 1000), fe=st.sampled_from([50.0, 60.0]), vs=st.floats(50, 1000),
       fs=st.sampled_from([50.0, 60.0]), kind=st.sampled_from(["motor", "magnetic", "resistive",
                                                              "electronic"]),
       kva=st.floats(0.05, 400))
def test_supply_mismatch_properties(ve, fe, vs, fs, kind, kva):
    out = values(mismatch(equipment_v=ve, equipment_hz=fe, supply_v=vs, supply_hz=fs,
                          load_type=kind, load_kva=kva, phases="3"))
    if kind in ("motor", "magnetic"):  # never over-fluxed through the transformer
        assert out["flux_pct"] <= 100.0 + 1e-9
    assert out["secondary_v"] <= ve * (1 + 1e-12)  # never above the nameplate
    assert out["speed_pct"] == pytest.approx(100 * fs / fe, rel=1e-12)
    assert out["rating"] >= kva * 1e3 * 1.25 * (1 - 1e-12)
    assert vs * out["primary_a"] == pytest.approx(out["secondary_v"] * out["secondary_a"],
                                                  rel=1e-12)


@pytest.mark.parametrize("inputs, field, words", [
    ({"supply_hz": "5 Hz"}, "supply_hz", "at least 10 Hz"),
    ({"equipment_hz": 500}, "equipment_hz", "at most 400 Hz"),
    ({"equipment_v": 0}, "equipment_v", "at least 1 V"),
    ({"load_type": "pump"}, "load_type", "choose one of"),
    ({"load_kva": "200 MVA"}, "load_kva", "at most"),
    ({"load_kva": "90 MVA"}, "load_kva", "largest listed rating"),
    ({"transformer_hz": "60 V"}, "transformer_hz", "frequency"),
])
def test_supply_mismatch_bad_input_gets_a_field_message(inputs, field, words):
    found = errors("supply-mismatch", **inputs)
    assert list(found) == [field] and words in found[field]


# ---- thresholds of supply-mismatch -------------------------------------------------------------

@pytest.mark.parametrize("side", (-1, 1))
@pytest.mark.parametrize("limit, factor, status", [
    (supply_mismatch.DIRECT_OK_PCT, 0.99, "pass"), (supply_mismatch.DIRECT_OK_PCT, 1.01, "warn"),
    (supply_mismatch.DIRECT_LIMIT_PCT, 0.99, "warn"),
    (supply_mismatch.DIRECT_LIMIT_PCT, 1.01, "fail"),
])
def test_threshold_direct_connection(side, limit, factor, status):
    supply = 230 * (1 + side * factor * limit / 100)
    result = mismatch(equipment_v=230, equipment_hz=50, supply_v=supply, supply_hz=50,
                      load_type="resistive")
    assert checks(result)["direct_connection"] == status


@pytest.mark.parametrize("factor, failed", [(0.999, False), (1.001, True)])
def test_threshold_excitation_connected_directly(factor, failed):
    # A magnetic load on its own frequency at up to EXCITATION_LIMIT of its voltage is not
    # over-fluxed; above it, connected directly it would be.
    result = mismatch(equipment_v=230, equipment_hz=50, supply_v=230 * EXCITATION * factor,
                      supply_hz=50, load_type="magnetic")
    assert ("direct_flux" in checks(result)) == failed
    assert checks(result)["flux"] == "pass"  # through the transformer it is fed its rating
    assert f"(at most {100 * EXCITATION:g} %)" in check_message(result, "flux")


@pytest.mark.parametrize("factor, status", [(0.999, "pass"), (1.001, "fail")])
def test_threshold_excitation_of_the_transformer(factor, status):
    # A transformer rated for f_r on a supply of f runs at f_r / f of its flux.
    result = mismatch(equipment_v=120, equipment_hz=60, supply_v=230, supply_hz=60,
                      load_type="resistive", transformer_hz=60 * EXCITATION * factor)
    assert checks(result)["transformer_frequency"] == status


@pytest.mark.parametrize("side", (-1, 1))
@pytest.mark.parametrize("factor, status", [(0.99, "pass"), (1.01, "fail")])
def test_threshold_motor_frequency_tolerance(side, factor, status):
    # NEMA MG 1-12.44 (read): ±5 % frequency. Below rated frequency the transformer lowers the
    # voltage in step (ΔV = Δf), so there the sum ΔV + Δf reaches the combined limit (10 %) at
    # the same point; the voltage limit alone cannot be reached through a transformer.
    tolerance = induction_motors.RUNNING_FREQUENCY_TOLERANCE_PCT
    assert 2 * tolerance == induction_motors.RUNNING_COMBINED_TOLERANCE_PCT
    supply_hz = 60 * (1 + side * factor * tolerance / 100)
    result = mismatch(equipment_v=460, equipment_hz=60, supply_v=460, supply_hz=supply_hz,
                      phases="3", load_kva=20)
    assert checks(result)["motor_tolerance"] == status
    voltage = induction_motors.RUNNING_VOLTAGE_TOLERANCE_PCT
    combined = induction_motors.RUNNING_COMBINED_TOLERANCE_PCT
    assert (f"±{voltage:g} % voltage, ±{tolerance:g} % frequency, sum at most {combined:g} %"
            in check_message(result, "motor_tolerance"))


@pytest.mark.parametrize("supply_hz, warned", [(50.0, False), (50.0 * (1 + 1e-6), True),
                                               (50.0 * (1 - 1e-6), True)])
def test_threshold_driven_load_speed(supply_hz, warned):
    # A motor off its rated frequency at all runs at another speed, and the check says so.
    result = mismatch(equipment_v=230, equipment_hz=50, supply_v=230, supply_hz=supply_hz)
    assert ("driven_load" in checks(result)) == warned
