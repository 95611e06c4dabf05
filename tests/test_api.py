"""The calculator contract: list, describe, run, run_json and the command line."""

import json
import math
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
    assert status == 0 and "python -m calc list" in out
