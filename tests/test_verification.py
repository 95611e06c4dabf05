"""The "How the numbers are checked" page and the stored outside values behind it.

Every record in tests/reference_data (published table rows typed from their reproductions;
ngspice and pandapower results made by tests/reference_data/make_reference_data.py) is
recomputed with calc.api.run and must lie within its own stored tolerance. Nothing is skipped:
a record whose calculator refuses its inputs, or that names an output the calculator no longer
has, fails with a message saying which record and what to do.
"""

import copy
import json

import pytest

from build import reference, team
from build.reference import verification
from calc import api

STORED = verification.stored_checks()


def _id(check):
    return f"{check['file'].rsplit('/', 1)[-1]}: {check['calculator']}: {check['title']}"


def test_the_page_is_registered_and_in_the_nav():
    assert "reference/verification.md" in reference.pages()
    nav = (verification.TESTS_DIR.parent / "mkdocs.yml").read_text(encoding="utf-8")
    assert "- reference/verification.md" in nav


@pytest.mark.parametrize("region", ["na", "iec"])
def test_the_page_builds_and_lists_every_registered_calculator(region):
    text = verification.verification_page(team.parse({"region": region}))
    assert text.startswith("# How the numbers are checked")
    for calculator in api.REGISTRY.values():
        assert f"{{#{calculator.id}}}" in text, calculator.id  # its own section
        assert f"[{calculator.title}](#{calculator.id})" in text, calculator.id  # summary row


def test_the_page_says_which_calculators_have_no_simulator_comparison():
    text = verification.verification_page(team.parse({"region": "na"}))
    with_simulator = {c["calculator"] for c in STORED if c["kind"] == verification.KIND_SIMULATOR}
    line = next(ln for ln in text.splitlines() if ln.startswith("**No simulator comparison**"))
    for calculator in api.REGISTRY.values():
        assert (calculator.title in line) == (calculator.id not in with_simulator), calculator.id


def test_the_required_simulator_comparisons_are_stored():
    # The issue asks for at least these: ngspice transients and AC sweeps, the DC motor run-up,
    # pandapower power flow (voltage drop, motor-start dip) and IEC 60909 short circuit.
    stored = {(c["calculator"], c["produced_by"]["program"].split()[0].split("-")[0])
              for c in STORED if c["kind"] == verification.KIND_SIMULATOR}
    for needed in [("switching-transient", "ngspice"), ("rlc-resonance", "ngspice"),
                   ("back-emf", "ngspice"), ("voltage-drop", "pandapower"),
                   ("motor-start-dip", "pandapower"), ("transformer-fault-current", "pandapower"),
                   ("fault-current", "pandapower")]:
        assert needed in stored, needed


def test_every_stored_record_says_what_it_is_and_where_it_came_from():
    for check in STORED:
        assert check["calculator"] in api.REGISTRY, _id(check)
        assert check["why"] and check["source"], _id(check)
        tolerance = check["tolerance"]
        assert tolerance.get("rel", 0) >= 0 and tolerance.get("abs", 0) >= 0, _id(check)
        assert tolerance.get("rel", 0) + tolerance.get("abs", 0) > 0, _id(check)
        if check["kind"] == verification.KIND_SIMULATOR:
            produced = check["produced_by"]
            assert produced["program"] and produced["command"], _id(check)


@pytest.mark.parametrize("check", STORED, ids=[_id(c) for c in STORED])
def test_every_stored_record_recomputes_within_its_tolerance(check):
    try:
        outcome = verification.compare(check)
    except verification.StoredCheckError as error:
        pytest.fail(str(error))
    detail = check.get("produced_by", {}).get("network") or check.get("source")
    assert outcome.passed, (
        f"{_id(check)}: {check['output']} = {outcome.ours!r} now, reference "
        f"{outcome.reference!r}; |difference| {abs(outcome.ours - outcome.reference):.3g} > "
        f"allowed {outcome.allowed:.3g} ({check['why']}). Reference model: {detail}. If the "
        "calculator changed on purpose, rerun tests/reference_data/make_reference_data.py and "
        "review the diff.")


def test_the_deviation_shown_is_the_one_recomputed_not_a_stored_figure():
    check = next(c for c in STORED if c["calculator"] == "voltage-drop")
    ours = api.run(check["calculator"], check["inputs"])
    value = ours["outputs"][check["output"]]["value"]
    outcome = verification.compare(check)
    assert outcome.ours == value
    assert outcome.deviation == pytest.approx(abs(value - check["reference"])
                                              / abs(check["reference"]), rel=1e-12)
    # A run that answers differently moves the deviation with it.
    def shifted(calculator, inputs):
        result = copy.deepcopy(api.run(calculator, inputs))
        result["outputs"][check["output"]]["value"] *= 1.01
        return result
    moved = verification.compare(check, run=shifted)
    assert moved.deviation == pytest.approx(abs(1.01 * value / check["reference"] - 1), rel=1e-9)
    assert not moved.passed
    # and the page prints the recomputed figure in the check's row
    row = verification._rows([(check, outcome)])[0]
    assert row[3] == f"{verification._number(value)} {outcome.unit}".strip()
    assert row[4] == f"{outcome.deviation:.1e}"


def test_a_tampered_record_fails_the_comparison():
    check = next(c for c in STORED if c["calculator"] == "transformer-fault-current")
    assert verification.compare(check).passed
    tampered = dict(check, reference=check["reference"] * (1 + 10 * check["tolerance"]["rel"]))
    assert not verification.compare(tampered).passed
    # just inside and just outside the stored tolerance, built from it
    outcome = verification.compare(check)
    allowed = check["tolerance"]["rel"] * abs(check["reference"])
    inside = dict(check, reference=outcome.ours + 0.5 * allowed)
    outside = dict(check, reference=outcome.ours + 3 * allowed)
    assert verification.compare(inside).passed
    assert not verification.compare(outside).passed


def test_an_absolute_tolerance_is_honoured_at_a_zero_crossing():
    check = {"calculator": "rlc-resonance", "title": "phase near zero", "file": "test",
             "inputs": {"topology": "series", "r": "2 ohm", "l": "1 mH", "c": "0.4 uF"},
             "output": "phase_at_f", "reference": 0.0, "unit": "°",
             "tolerance": {"rel": 0.0, "abs": 1e-6}}
    outcome = verification.compare(check)  # at f0 (the default frequency) the phase is 0
    assert outcome.passed and outcome.deviation == abs(outcome.ours)
    assert not verification.compare(dict(check, reference=1e-5)).passed


def test_a_record_naming_a_missing_output_fails_with_a_clear_message():
    check = dict(next(c for c in STORED if c["calculator"] == "back-emf"), output="run_up_time")
    with pytest.raises(verification.StoredCheckError,
                       match=r"back-emf .* no output 'run_up_time' \(it has: .*run_up_s"):
        verification.compare(check)
    # the page shows it instead of dropping it, and counts it as not within tolerance
    evaluated = verification.evaluate([check])
    assert isinstance(evaluated[0][1], verification.StoredCheckError)
    assert "no output 'run_up_time'" in verification._rows(evaluated)[0][6]
    assert verification._worst(evaluated)[1] == 1


def test_a_record_with_refused_inputs_or_an_unknown_calculator_fails_clearly():
    check = next(c for c in STORED if c["calculator"] == "voltage-drop")
    with pytest.raises(verification.StoredCheckError, match="refused the stored inputs"):
        verification.compare(dict(check, inputs=dict(check["inputs"], length="-3 ft")))
    with pytest.raises(verification.StoredCheckError, match="no calculator 'volt-drop'"):
        verification.compare(dict(check, calculator="volt-drop"))


def test_worked_examples_come_from_the_vector_files():
    checks = verification.vector_checks()
    count = sum(len(v.get("expect", {}))
                for path in verification.VECTOR_DIR.glob("*.json")
                for v in json.loads(path.read_text(encoding="utf-8"))["vectors"])
    assert len(checks) == count
    assert all(c["source"] and c["kind"] == verification.KIND_EXAMPLE for c in checks)


def test_the_stored_files_name_their_generator():
    for path in verification.REFERENCE_DATA_DIR.glob("*.json"):
        data = json.loads(path.read_text(encoding="utf-8"))
        if data.get("kind", verification.KIND_SIMULATOR) == verification.KIND_SIMULATOR:
            assert data["script"] == verification.GENERATOR, path.name
            assert (verification.TESTS_DIR.parent / data["script"]).exists(), path.name


def test_a_case_comparing_several_outputs_is_named_once_and_every_figure_stays():
    check = next(c for c in STORED if c["calculator"] == "voltage-drop")
    evaluated = verification.evaluate([check, dict(check), dict(check, title="other <case>")])
    rows = verification._rows(evaluated)
    table = verification.checks_table(rows)
    assert table.count(f'<td rowspan="2">{check["title"]}</td>') == 1
    assert table.count(check["title"]) == 1 and "other &lt;case&gt;" in table
    assert table.count("<tr>") == 1 + len(rows)  # header and one row a check
    for row in rows:
        assert table.count(f"<td>{row[3]}</td>") >= 1 and f"<code>{row[1]}</code>" in table
    # the figures' alignment is the stylesheet's, counted from a row's end (a spanned first cell)
    css = (verification.TESTS_DIR.parent / "site_src/assets/css/fluxbook.css").read_text(encoding="utf-8")
    assert f".{verification.TABLE_CLASS} :is(td, th):nth-last-child(n+3):nth-last-child(-n+5)" in css
    assert len(verification.HEADER) - verification.HEADER.index("Reference") == 5


def test_a_file_and_tolerance_every_source_shares_are_said_once():
    checks = [c for c in verification.vector_checks() if c["calculator"] == "conductor"]
    text = verification._sources([(c, None) for c in checks])
    assert text.count(checks[0]["file"]) == 1 and text.count(checks[0]["why"]) == 1
    assert all(c["source"].replace("|", "\\|") in text for c in checks)
    mixed = [(checks[0], None), (dict(checks[0], why="another reason", source="elsewhere"), None)]
    text = verification._sources(mixed)
    assert "; tolerance: another reason" in text and text.count(checks[0]["file"]) == 1
