"""Issue 12 on the Python side: the answer first (summary outputs), units that follow the user
(display systems, typed lengths), and the words fields use for their units."""

import json
import re

import pytest

from calc import __main__ as cli
from calc import api, units
from calc.calculators._summary import SUMMARY_OUTPUTS


# --- the answer first -------------------------------------------------------------------------

@pytest.mark.parametrize("calculator_id", list(api.REGISTRY))
def test_every_calculator_names_one_to_three_summary_outputs(calculator_id):
    described = api.describe(calculator_id)
    names = [output["name"] for output in described["outputs"]]
    assert 1 <= len(described["summary"]) <= 3
    assert set(described["summary"]) <= set(names), described["summary"]
    assert len(set(described["summary"])) == len(described["summary"])


def test_the_summary_table_names_only_registered_calculators():
    assert set(SUMMARY_OUTPUTS) == set(api.REGISTRY)


@pytest.mark.parametrize("calculator_id", list(api.REGISTRY))
def test_defaults_give_at_least_one_summary_output(calculator_id):
    result = api.run(calculator_id, {})
    assert result["ok"], result
    assert set(api.describe(calculator_id)["summary"]) & set(result["outputs"])


# --- display systems --------------------------------------------------------------------------

def _texts(result):
    return [step["result"] for step in result["steps"]] + \
        [output["display"] for output in result["outputs"].values()]


def test_display_changes_the_texts_not_the_values():
    na = api.run("voltage-drop", {"length": "150 ft"}, display="na")
    iec = api.run("voltage-drop", {"length": "45.72 m"}, display="iec")
    assert {k: v["value"] for k, v in na["outputs"].items()} == pytest.approx(
        {k: v["value"] for k, v in iec["outputs"].items()}, rel=1e-12)
    # One conductor of the run: 150 ft = 45.72 m exactly
    assert any("(150 ft)" in step["text"] for step in na["steps"])
    assert any("(45.7 m)" in step["text"] for step in iec["steps"])


@pytest.mark.parametrize("display, typed, shown", [
    ("iec", "150 ft", "(150 ft)"),  # a length typed in feet comes back in feet
    ("na", "45.72 m", "(45.7 m)"),  # and one in metres in metres
    ("na", "150'", "(150 ft)"),  # the foot mark
    (None, "150 ft", "(150 ft)"),
])
def test_typed_lengths_come_back_in_their_system(display, typed, shown):
    result = api.run("voltage-drop", {"length": typed}, display=display)
    assert any(shown in step["text"] for step in result["steps"]), result["steps"]


def test_defaults_are_not_typed_lengths():
    # Omitted, the length is the default "100 ft", but the caller typed nothing: the system rules.
    result = api.run("voltage-drop", {}, region="na", display="iec")
    assert any("(30.5 m)" in step["text"] for step in result["steps"])


def test_without_display_the_texts_are_as_before():
    result = api.run("transformer-currents", {"kva": "150 kVA"})
    assert result["outputs"]["secondary_a"]["display"] == "416 A"  # 150e3/(√3·208), computed
    assert units.format_quantity(30.48, "m") == "30.5 m"  # nothing left behind by run()


def test_a_wrong_display_is_an_error_not_a_traceback():
    result = api.run("voltage-drop", {}, display="imperial")
    assert not result["ok"]
    assert result["errors"][0]["message"] == "display 'imperial' is not one of: na, iec"


def test_run_json_passes_the_display_from_the_page():
    text = api.run_json("voltage-drop", json.dumps({"length": "100 ft"}), "iec")
    steps = json.loads(text)["steps"]
    assert any("(100 ft)" in step["text"] for step in steps)


def test_cli_units_option(capsys):
    assert cli.main(["--region", "iec", "--units", "na", "run", "voltage-drop", "length=30 m"]) == 0
    result = json.loads(capsys.readouterr().out)
    assert any("(30.0 m)" in step["text"] for step in result["steps"])  # typed in metres
    assert cli.main(["--region", "na", "--units", "iec", "run", "conductor"]) == 0
    result = json.loads(capsys.readouterr().out)
    assert "mm\u00b2" in result["outputs"]["area"]["display"]
    assert cli.main(["--units", "metric", "run", "conductor"]) == 2
    assert "--units takes one of na, iec" in capsys.readouterr().out


@pytest.mark.parametrize("calculator_id, system", [
    (c, system) for c in api.REGISTRY for system in units.DISPLAY_SYSTEMS])
def test_no_value_is_shown_twice_in_the_same_unit(calculator_id, system):
    # "1.98 Ω/kft (1.98 Ω/kft)": a hand-made "(other system)" text once both sides follow one.
    doubled = re.compile(r"(\d[\d.]*\s?(\S+)) \(\1\)")
    for region in ("na", "iec"):
        for text in _texts(api.run(calculator_id, {}, region, display=system)):
            assert not doubled.search(text), text


# --- unit words on fields ---------------------------------------------------------------------

@pytest.mark.parametrize("calculator_id, name, hint", [
    ("voltage-drop", "pf", units.RATIO_HINT),
    ("voltage-drop", "sets", units.NUMBER_HINT),
    ("line-loss", "tariff", units.NUMBER_HINT),
    ("back-emf", "armature_r", "\u03a9, m\u03a9, k\u03a9, M\u03a9, ohm"),
    ("voltage-drop", "length", "m, mm, km, ft, in"),
])
def test_unit_hints(calculator_id, name, hint):
    entry = next(i for i in api.describe(calculator_id)["inputs"] if i["name"] == name)
    assert entry["unit_hint"] == hint


def test_a_plain_number_field_does_not_advertise_percent():
    message = api.run("voltage-drop", {"sets": "50%"})["errors"][0]["message"]
    assert "(%)" not in message and units.NUMBER_HINT in message


def test_limits_read_with_unit_symbols():
    message = api.run("back-emf", {"armature_r": "-1"})["errors"][0]["message"]
    assert "0.0001 \u03a9" in message and " ohm and" not in message
