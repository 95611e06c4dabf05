"""The calculator contract: list, describe, run, run_json and the command line."""

import json
import math
import os
import subprocess
import sys

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calc import __version__, api
from calc.spec import Calculator, Input, Output, Result

ROOT_CMD = [sys.executable, "-m", "calc"]


def cli(*args):
    completed = subprocess.run(ROOT_CMD + list(args), capture_output=True, text=True,
                               encoding="utf-8", check=False)
    return completed.returncode, completed.stdout, completed.stderr


def test_list_has_every_registered_calculator():
    listed = api.list_calculators()
    assert [entry["id"] for entry in listed] == list(api.REGISTRY)
    for entry in listed:
        assert set(entry) == {"id", "title", "summary", "group"}
        assert all(entry[key] for key in entry)


def test_describe_gives_what_the_form_needs():
    spec = api.describe("transformer-currents")
    assert spec["id"] == "transformer-currents"
    names = [item["name"] for item in spec["inputs"]]
    assert names[:4] == ["kva", "phases", "primary_v", "secondary_v"]
    kva = spec["inputs"][0]
    assert kva["unit"] == "kVA" and kva["default"] == 75 and kva["min"] == 0 and kva["min_exclusive"]
    assert "kVA" in kva["units"]
    phases = spec["inputs"][1]
    assert {c["value"] for c in phases["choices"]} == {"1", "3"}
    assert [o["name"] for o in spec["outputs"]][:3] == ["primary_a", "secondary_a", "turns_ratio"]


def test_result_has_the_contract_shape():
    result = api.run("transformer-currents", {})
    assert result["ok"] is True
    assert result["calculator"] == "transformer-currents"
    assert result["version"] == __version__
    for output in result["outputs"].values():
        assert set(output) == {"value", "unit", "label", "display"}
        assert math.isfinite(output["value"])
    for check in result["checks"]:
        assert set(check) == {"name", "status", "message"} and check["status"] in ("pass", "warn", "fail")
    for step in result["steps"]:
        assert set(step) == {"text", "formula", "result"}
    assert result["assumptions"] and result["sources"] and result["cautions"]


def test_run_json_round_trip_and_no_nan():
    text = api.run_json("transformer-currents", json.dumps({"kva": "150 kVA"}))
    assert "NaN" not in text and "Infinity" not in text
    assert json.loads(text)["outputs"]["secondary_a"]["display"] == "416 A"  # 150e3/(√3·208), computed


def test_run_json_refuses_text_that_is_not_json():
    result = json.loads(api.run_json("transformer-currents", "{kva: 75"))
    assert result["ok"] is False and "not valid JSON" in result["errors"][0]["message"]


def test_inputs_must_be_an_object():
    result = api.run("transformer-currents", ["kva", 75])
    assert result["ok"] is False and "object" in result["errors"][0]["message"]


def test_unknown_calculator_is_an_error_naming_the_known_ones():
    result = api.run("flux-capacitor", {})
    assert result["ok"] is False
    assert "unknown calculator" in result["errors"][0]["message"]
    assert "transformer-currents" in result["errors"][0]["message"]


def test_unknown_input_names_the_allowed_inputs():
    result = api.run("transformer-currents", {"kv": 75})
    (error,) = result["errors"]
    assert error["field"] == "kv" and "kva" in error["message"] and error["value"] == 75


def test_every_wrong_field_is_listed_at_once():
    result = api.run("transformer-currents", {"kva": -5, "phases": "2", "primary_v": "abc"})
    assert sorted(e["field"] for e in result["errors"]) == ["kva", "phases", "primary_v"]


def test_range_message_names_field_value_and_limits():
    (error,) = api.run("transformer-currents", {"kva": 0})["errors"]
    assert error["field"] == "kva" and error["value"] == 0
    assert "greater than 0 kVA" in error["message"]


def test_limits_are_written_out_not_in_exponent_form():
    (error,) = api.run("transformer-currents", {"kva": "2000 MVA"})["errors"]
    assert "at most 1000000 kVA" in error["message"] and "e+" not in error["message"]


def test_blank_required_input_is_an_error():
    (error,) = api.run("transformer-currents", {"primary_v": "  "})["errors"]
    assert error["field"] == "primary_v" and "required" in error["message"]


def test_bool_is_not_a_number():
    (error,) = api.run("transformer-currents", {"kva": True})["errors"]
    assert error["field"] == "kva"


def test_choice_accepts_an_integer_token():
    assert api.run("transformer-currents", {"phases": 1})["ok"] is True
    assert api.run("transformer-currents", {"phases": 1.0})["ok"] is True


def _broken(inputs):
    raise ZeroDivisionError("boom")


def _nan(inputs):
    result = Result()
    result.output("x", float("nan"))
    return result


@pytest.mark.parametrize("compute, words", [(_broken, "internal error"), (_nan, "could not be computed")])
def test_a_bug_never_leaks_a_traceback_or_nan(monkeypatch, compute, words):
    fake = Calculator("fake", "Fake", "For tests", "Tests", (Input("v", "V", "quantity", unit="V", default=1),),
                      (Output("x", "X", "V"),), compute)
    monkeypatch.setitem(api.REGISTRY, "fake", fake)
    result = api.run("fake", {})
    assert result["ok"] is False and words in result["errors"][0]["message"]
    assert "Traceback" not in json.dumps(result)


TEXT = st.one_of(st.text(max_size=12), st.integers(), st.floats(allow_nan=True), st.booleans(), st.none())


@settings(max_examples=300, deadline=None)
@given(st.dictionaries(st.sampled_from(["kva", "phases", "primary_v", "secondary_v", "connection", "zz"]), TEXT))
def test_any_input_gives_a_result_or_field_errors(inputs):
    result = api.run("transformer-currents", inputs)
    text = api.dumps(result)  # raises on NaN or infinity
    assert "internal error" not in text
    if not result["ok"]:
        for error in result["errors"]:
            assert error["field"] in inputs and error["message"]



# Values at the edges of a float: the smallest subnormal once reached a ZeroDivisionError in
# back-emf (speed_ref), conductor (frequency_hz) and the fault calculators (%Z) because each input
# was only "more than 0". Every quantity input of every calculator, alone, must give a result or
# a field error.
EDGE_VALUES = ("5e-324", "1e-300", "-5e-324", "1e300")


@pytest.mark.parametrize("calculator", list(api.REGISTRY.values()), ids=lambda c: c.id)
def test_edge_of_float_values_never_give_an_internal_error(calculator):
    for field in calculator.inputs:
        if field.kind != "quantity":
            continue
        for value in EDGE_VALUES:
            result = api.run(calculator.id, {field.name: value})
            text = api.dumps(result)
            assert "internal error" not in text, (field.name, value, text[-200:])
            if not result["ok"]:
                assert {e["field"] for e in result["errors"]} <= {f.name for f in calculator.inputs}


# ---- the command line ---------------------------------------------------------------------

def test_cli_list():
    status, out, _ = cli("list")
    assert status == 0 and [e["id"] for e in json.loads(out)] == list(api.REGISTRY)


def test_cli_describe():
    status, out, _ = cli("describe", "transformer-currents")
    assert status == 0 and json.loads(out)["id"] == "transformer-currents"


def test_cli_run_name_value():
    status, out, _ = cli("run", "transformer-currents", "kva=75 kVA", "primary_v=480", "secondary_v=208 V")
    result = json.loads(out)
    assert status == 0 and result["outputs"]["secondary_a"]["display"] == "208 A"


def test_cli_run_json():
    status, out, _ = cli("run", "transformer-currents", "--json", '{"kva": 25, "phases": "1", "primary_v": "7.2 kV", "secondary_v": 240}')
    assert status == 0 and json.loads(out)["outputs"]["secondary_a"]["value"] == pytest.approx(25e3 / 240)


@pytest.mark.parametrize("args", [
    ("run", "transformer-currents", "kva=0"),
    ("run", "transformer-currents", "kva"),
    ("run", "nope"),
    ("describe", "nope"),
    ("run", "transformer-currents", "--json"),
    ("run", "transformer-currents", "--json", "[1"),
    ("frobnicate",),
    (),
])
def test_cli_errors_exit_2_with_json_and_no_traceback(args):
    status, out, err = cli(*args)
    assert status == 2
    assert json.loads(out)["ok"] is False
    assert "Traceback" not in out + err


def test_cli_help_exits_0():
    status, out, _ = cli("--help")
    assert status == 0 and "python -m calc [--region na|iec] list" in out


# ---- regions, alternatives and long text (issue 11) -----------------------------------------

def _fake(monkeypatch, inputs, compute=None):
    def echo(values):
        result = Result()
        result.output("x", 1.0)
        result.check("seen", "pass", json.dumps({k: v for k, v in values.items()}, default=str))
        result.check("units", "pass", json.dumps(values.typed_units))
        return result
    fake = Calculator("fake", "Fake", "For tests", "Tests", tuple(inputs), (Output("x", "X", ""),),
                      compute or echo)
    monkeypatch.setitem(api.REGISTRY, "fake", fake)


def _seen(result):
    assert result["ok"], result
    return json.loads(result["checks"][0]["message"])


def test_an_alternative_given_means_its_siblings_take_no_default(monkeypatch):
    # Issue 11 item 8: a default the user did not type must never conflict with one they did.
    _fake(monkeypatch, [
        Input("current", "Current", "quantity", unit="A", default=16, optional=True, group="load"),
        Input("power", "Power", "quantity", unit="kW", optional=True, group="load"),
        Input("length", "Length", "quantity", unit="m", default=10),
    ])
    assert _seen(api.run("fake", {"power": "5 kW"})) == {"current": None, "power": 5000.0,
                                                        "length": 10.0}
    assert _seen(api.run("fake", {}))["current"] == 16.0  # nothing given: the default stands
    assert _seen(api.run("fake", {"current": 20, "power": ""}))["current"] == 20.0
    # A blank alternative does not count as given.
    assert _seen(api.run("fake", {"power": " "}))["current"] == 16.0


def test_omitted_inputs_take_the_region_s_default(monkeypatch):
    _fake(monkeypatch, [Input("f", "Frequency", "quantity", unit="Hz", default=60,
                              region_defaults={"iec": 50})])
    assert _seen(api.run("fake", {}))["f"] == 60.0
    assert _seen(api.run("fake", {}, region="iec"))["f"] == 50.0
    assert _seen(api.run("fake", {}, region="na"))["f"] == 60.0
    assert _seen(api.run("fake", {"f": 400}, region="iec"))["f"] == 400.0  # typed wins
    refused = api.run("fake", {}, region="mars")
    assert refused["ok"] is False and "na, iec" in refused["errors"][0]["message"]


def test_views_learn_the_unit_the_user_typed(monkeypatch):
    _fake(monkeypatch, [Input("power", "Power", "quantity", unit="kW", default=5),
                        Input("length", "Length", "quantity", unit="m", default=10)])
    assert _seen(api.run("fake", {"power": "10 hp", "length": "150 ft"})) is not None
    units_seen = json.loads(api.run("fake", {"power": "10 hp"})["checks"][1]["message"])
    assert units_seen == {"power": "hp", "length": "m"}


def test_long_text_is_refused_and_never_echoed_whole():
    # Issue 11 item 11: a 50,000-character value came back whole in its error message.
    long_value, long_name = "1" * 50000, "x" * 3000
    result = api.run("voltage-drop", {"voltage": long_value, long_name: 1})
    text = api.dumps(result)
    assert result["ok"] is False and len(text) < 2000
    by_field = {e["field"][:3]: e for e in result["errors"]}
    assert "too long" in by_field["vol"]["message"] and "50000 characters" in by_field["vol"]["value"]
    assert "3000 characters" in by_field["xxx"]["message"]
    for calculator_id in api.REGISTRY:
        assert len(api.dumps(api.run(calculator_id, {"zz": long_value}))) < 3000


def test_text_at_the_length_limit_is_read():
    # Just inside the limit the value is read (and judged on its own merits).
    padded = "480" + " " * (api.MAX_TEXT_CHARS - 3)
    result = api.run("transformer-currents", {"primary_v": padded})
    assert result["ok"], result
    over = api.run("transformer-currents", {"primary_v": padded + " "})
    assert over["ok"] is False and "too long" in over["errors"][0]["message"]


def test_cli_region_option_and_team_file(tmp_path):
    na = json.loads(cli("run", "transformer-currents")[1])["outputs"]["secondary_a"]["value"]
    status, out, _ = cli("--region", "iec", "run", "transformer-currents")
    iec = json.loads(out)["outputs"]["secondary_a"]["value"]
    assert status == 0 and iec != na
    team = tmp_path / "team.yml"
    team.write_text("# a team\nregion: iec  # IEC practice\n", encoding="utf-8")
    completed = subprocess.run(ROOT_CMD + ["run", "transformer-currents"], capture_output=True,
                               text=True, encoding="utf-8", check=False,
                               env={**os.environ, "FLUXBOOK_TEAM_FILE": str(team)})
    assert json.loads(completed.stdout)["outputs"]["secondary_a"]["value"] == iec
    status, out, _ = cli("--region", "mars", "list")
    assert status == 2 and "na, iec" in json.loads(out)["errors"][0]["message"]
