"""Job records (issue 13): the job file's checks, input-name migrations, recomputing a saved
record, and `python -m calc job FILE.json`.

Saved results in these files are made here with calc.api.run, never typed in: a test compares
what the code computes today with what the same code saved, so it fails if either side drifts.
Demo jobs are invented scenarios (a school kitchen, a dairy barn).
"""

import json
import re
import subprocess
import sys

import pytest

from calc import __version__, api, jobs
from calc.__main__ import main
from tests.conftest import ROOT

KITCHEN_DROP = {"system": "3ph", "voltage": "208 V", "current": "38", "length": "95 ft",
                "size": "8 AWG"}
KITCHEN_TRANSFORMER = {"kva": "112.5 kVA", "primary_v": "480 V", "secondary_v": "208 V"}


def record(calculator, inputs, note=""):
    """A record as the page saves it: the inputs as typed and the result as shown."""
    return {
        "calculator": calculator,
        "title": api.get(calculator).title,
        "inputs": dict(inputs),
        "note": note,
        "saved": "2026-11-30T09:12:00.000Z",
        "fluxbook_version": __version__,
        "result": jobs.without_chart(api.run(calculator, inputs)),
    }


def job_file(*records, name="School kitchen refit", site="Hillcrest Primary, kitchen"):
    return {
        "format": jobs.FORMAT,
        "schema": jobs.SCHEMA_VERSION,
        "fluxbook_version": __version__,
        "exported": "2026-12-01T08:00:00Z",
        "job": {"name": name, "site": site, "notes": "Dishwasher and oven circuits",
                "created": "2026-11-30", "updated": "2026-11-30T09:20:00Z",
                "records": list(records)},
    }


def kitchen():
    return job_file(record("voltage-drop", KITCHEN_DROP, "Dishwasher feeder"),
                    record("transformer-currents", KITCHEN_TRANSFORMER, "Kitchen transformer"))


def write(tmp_path, data, name="job.json"):
    path = tmp_path / name
    path.write_text(data if isinstance(data, str) else json.dumps(data), encoding="utf-8")
    return path


def run_cli(capsys, *args):
    status = main(["job", *map(str, args)])
    return status, capsys.readouterr().out


def problems(data):
    return jobs.check_job(data)["problems"]


# --- the file format ------------------------------------------------------------------------

def test_a_saved_job_checks_clean_and_keeps_what_was_typed():
    data = kitchen()
    checked = jobs.check_job(data)
    assert checked["problems"] == [] and checked["notices"] == []
    job = checked["job"]
    assert (job["name"], job["site"]) == ("School kitchen refit", "Hillcrest Primary, kitchen")
    assert [r["inputs"] for r in job["records"]] == [KITCHEN_DROP, KITCHEN_TRANSFORMER]
    assert job["records"][0]["result"] == data["job"]["records"][0]["result"]
    assert job["records"][0]["note"] == "Dishwasher feeder"


def test_the_page_and_python_agree_on_the_format():
    """jobs-store.js writes the files calc.jobs reads: the same format name and schema."""
    script = (ROOT / "site_src" / "assets" / "js" / "jobs-store.js").read_text(encoding="utf-8")
    assert re.search(r'FILE_FORMAT = "([^"]+)"', script).group(1) == jobs.FORMAT
    assert int(re.search(r"FILE_SCHEMA = (\d+)", script).group(1)) == jobs.SCHEMA_VERSION
    fields = re.search(r"RECORD_FIELDS = \[([^\]]+)\]", script).group(1)
    assert tuple(re.findall(r'"(\w+)"', fields)) == jobs.RECORD_KEYS


def test_the_chart_is_not_kept_and_unknown_result_members_are_dropped():
    data = kitchen()
    saved = data["job"]["records"][0]["result"]
    saved["series"] = {"title": "drawn again on reopening"}
    saved["colour"] = "not part of a result"
    kept = jobs.check_job(data)["job"]["records"][0]["result"]
    assert "series" not in kept and "colour" not in kept
    assert kept["outputs"] == saved["outputs"]


@pytest.mark.parametrize("change, where, words", [
    (lambda d: d.update(format="something-else"), "format", "not a Fluxbook job file"),
    (lambda d: d.update(schema="1"), "schema", "whole number"),
    (lambda d: d.update(schema=jobs.SCHEMA_VERSION + 1), "schema", "newer Fluxbook"),
    (lambda d: d.update(schema=0), "schema", "does not exist"),
])
def test_a_file_that_is_not_a_job_of_a_known_schema_is_refused(change, where, words):
    data = kitchen()
    change(data)
    with pytest.raises(jobs.JobFileError, match=words) as caught:
        jobs.check_job(data)
    assert caught.value.where == where


@pytest.mark.parametrize("change, where, words", [
    (lambda d: d["job"].pop("name"), "job.name", "required"),
    (lambda d: d["job"].update(name="   "), "job.name", "blank"),
    (lambda d: d["job"].update(site=42), "job.site", "must be text, not a number"),
    (lambda d: d["job"].update(notes="x" * 2001), "job.notes", "2001 characters is too long"),
    (lambda d: d["job"].update(created="last Tuesday"), "job.created", "not a date"),
    (lambda d: d["job"].update(records={"a": 1}), "job.records", "must be a list"),
    (lambda d: d["job"].update(colour="red"), "job", "unknown member 'colour'"),
    (lambda d: d.update(job=[]), "job", "must be an object"),
    (lambda d: d["job"]["records"].append("voltage-drop"), "job.records[2]", "must be an object"),
    (lambda d: d["job"]["records"][0].update(calculator="flux-capacitor"),
     "job.records[0].calculator", "unknown calculator 'flux-capacitor'"),
    (lambda d: d["job"]["records"][0]["inputs"].update(lenght="95 ft"),
     "job.records[0].inputs.lenght", "unknown input 'lenght' of voltage-drop"),
    (lambda d: d["job"]["records"][0]["inputs"].update(length=[95, "ft"]),
     "job.records[0].inputs.length", "must be text, a number or true/false, not a list"),
    (lambda d: d["job"]["records"][0].update(inputs="length=95"), "job.records[0].inputs",
     "must be an object"),
    (lambda d: d["job"]["records"][0]["result"]["checks"][0].update(status="great"),
     "job.records[0].result.checks", "status 'great'"),
    (lambda d: d["job"]["records"][1].update(result={"ok": False}), "job.records[1].result",
     '"ok": true'),
])
def test_each_wrong_member_is_named_and_refuses_the_file(change, where, words):
    data = kitchen()
    change(data)
    found = problems(data)
    assert any(p["where"] == where and words in p["message"] and p["kind"] == "file" for p in found), found


def test_a_value_this_version_refuses_keeps_the_record_and_says_so():
    """An input value out of today's range is not a broken file: the record is kept as saved
    (kind "input"), and cannot be recomputed."""
    data = kitchen()
    data["job"]["records"][1]["inputs"]["kva"] = "lots"
    checked = jobs.check_job(data)
    assert len(checked["job"]["records"]) == 2
    (problem,) = checked["problems"]
    assert problem["kind"] == "input" and problem["where"] == "job.records[1].inputs.kva"
    assert "'lots'" in problem["message"]


def test_too_many_records_is_refused_with_the_limit(monkeypatch):
    monkeypatch.setattr(jobs, "MAX_RECORDS", 1)
    with pytest.raises(jobs.JobFileError, match="2 records is more than a job file may hold "
                                                 r"\(at most 1\)"):
        jobs.check_job(kitchen())


@pytest.mark.parametrize("text, words", [
    ('{"format": "fluxbook-job", "schema": ', "not valid JSON (line 1, column 38"),
    ("", "the file is empty"),
    ("[" * 100000 + "]" * 100000, "nested too deeply"),
    ('{"schema": NaN}', "NaN is not a number a job file may hold"),
    (b"\xff\xfe{}", "not UTF-8 text"),
    ("[1, 2]", "holds a list, not a Fluxbook job"),
])
def test_a_file_that_is_not_a_job_gets_one_clear_problem(text, words):
    (problem,) = jobs.check_job_text(text)["problems"]
    assert problem["kind"] == "file" and words in problem["message"], problem


def test_a_file_too_large_is_refused_before_it_is_read(monkeypatch):
    monkeypatch.setattr(jobs, "MAX_FILE_BYTES", 1000)
    (problem,) = jobs.check_job_text(json.dumps(kitchen()))["problems"]
    assert re.search(r"MB is too large for a job file \(at most 0.001 MB\)", problem["message"])


def test_a_byte_order_mark_is_read_past():
    assert jobs.check_job_text("\ufeff" + json.dumps(kitchen()))["problems"] == []


# --- migrations -----------------------------------------------------------------------------

def test_migrations_point_at_inputs_that_exist():
    for (calculator_id, old), new in jobs.MIGRATIONS.items():
        names = {item.name for item in api.get(calculator_id).inputs}
        assert new in names and old not in names, (calculator_id, old, new)
    for old, new in jobs.RENAMED_CALCULATORS.items():
        assert new in api.REGISTRY and old not in api.REGISTRY


def test_a_renamed_input_is_read_under_its_new_name(monkeypatch):
    """A record saved before `length` was called that: the value moves, untouched."""
    monkeypatch.setitem(jobs.MIGRATIONS, ("voltage-drop", "run_length"), "length")
    old = record("voltage-drop", KITCHEN_DROP, "Dishwasher feeder")
    old["inputs"] = {("run_length" if k == "length" else k): v for k, v in KITCHEN_DROP.items()}
    checked = jobs.check_job(job_file(old))
    assert checked["problems"] == []
    assert checked["job"]["records"][0]["inputs"] == KITCHEN_DROP
    assert checked["notices"] == ["job.records[0]: input 'run_length' of voltage-drop is now called "
                                  "'length'"]
    report = jobs.recheck(old)
    assert report["ok"] and report["renamed"] == [["run_length", "length"]]
    assert report["differences"] == []
    assert report["inputs"]["length"] == "95 ft"


def test_migrations_follow_chains_and_refuse_a_name_given_twice(monkeypatch):
    monkeypatch.setitem(jobs.MIGRATIONS, ("voltage-drop", "run"), "run_length")
    monkeypatch.setitem(jobs.MIGRATIONS, ("voltage-drop", "run_length"), "length")
    assert jobs.migrate_inputs("voltage-drop", {"run": "10 m"}) == (
        {"length": "10 m"}, [("run", "length")], [])
    both = record("voltage-drop", KITCHEN_DROP)
    both["inputs"]["run"] = "20 m"
    found = problems(job_file(both))
    assert any("gives 'length' twice" in p["message"] and p["kind"] == "file" for p in found)


def test_a_loop_in_the_table_does_not_hang(monkeypatch):
    monkeypatch.setitem(jobs.MIGRATIONS, ("voltage-drop", "a"), "b")
    monkeypatch.setitem(jobs.MIGRATIONS, ("voltage-drop", "b"), "a")
    assert jobs.migrate_inputs("voltage-drop", {"a": 1})[0] == {"a": 1}


def test_a_renamed_calculator_is_read_under_its_new_id(monkeypatch):
    monkeypatch.setitem(jobs.RENAMED_CALCULATORS, "feeder-drop", "voltage-drop")
    old = record("voltage-drop", KITCHEN_DROP)
    old["calculator"] = "feeder-drop"
    checked = jobs.check_job(job_file(old))
    assert checked["job"]["records"][0]["calculator"] == "voltage-drop"
    assert "calculator 'feeder-drop' is now called 'voltage-drop'" in checked["notices"][0]


# --- recomputing ----------------------------------------------------------------------------

def test_recheck_finds_the_saved_result_unchanged():
    saved = record("transformer-currents", KITCHEN_TRANSFORMER)
    report = jobs.recheck(saved)
    assert report["ok"] and report["differences"] == []
    assert report["verdict"] == jobs.verdict(saved["result"]["checks"]) == report["saved_verdict"]
    assert report["result"] == saved["result"]


def test_recheck_shows_both_results_when_they_differ():
    saved = record("voltage-drop", KITCHEN_DROP)
    now = saved["result"]["outputs"]["drop_v"]["display"]
    saved["result"]["outputs"]["drop_v"]["display"] = "99.9 V"
    saved["result"]["checks"][0]["status"] = "fail" if saved["result"]["checks"][0]["status"] != "fail" else "pass"
    report = jobs.recheck(saved)
    changed = {(d["kind"], d["name"]): d for d in report["differences"]}
    assert changed[("output", "drop_v")]["saved"] == "99.9 V"
    assert changed[("output", "drop_v")]["now"] == now
    check_name = saved["result"]["checks"][0]["name"]
    assert changed[("check", check_name)]["now"] == api.run("voltage-drop", KITCHEN_DROP)["checks"][0]["status"]


def test_a_value_change_finer_than_shown_still_counts_but_float_noise_does_not():
    saved = record("transformer-currents", KITCHEN_TRANSFORMER)
    output = saved["result"]["outputs"]["secondary_a"]
    output["value"] *= 1 + 1e-9  # floating-point noise: below one part in a million
    assert jobs.recheck(saved)["differences"] == []
    output["value"] *= 1 + 1e-4  # a real change, even if the shown figure is the same
    assert [d["name"] for d in jobs.recheck(saved)["differences"]] == ["secondary_a"]


@pytest.mark.parametrize("checks, expected", [
    ([], "none"),
    ([{"status": "pass"}], "pass"),
    ([{"status": "pass"}, {"status": "warn"}], "warn"),
    ([{"status": "fail"}, {"status": "warn"}, {"status": "pass"}], "fail"),
])
def test_the_verdict_is_the_worst_check(checks, expected):
    assert jobs.verdict(checks) == expected


def test_inputs_read_as_a_person_reads_them():
    shown = {row["name"]: row["text"] for row in jobs.shown_inputs("voltage-drop", {
        "system": "3ph", "voltage": "208", "length": 28.5, "conductor_temp_c": "75", "size": "8 AWG",
        "power": ""})}
    choice_label = dict(api.get("voltage-drop").input("system").choices)["3ph"]
    assert shown == {"system": choice_label, "voltage": "208 V", "length": "28.5 m",
                     "conductor_temp_c": "75 °C", "size": "8 AWG", "power": ""}


def test_the_worker_entry_point_answers_by_name_only():
    report = json.loads(jobs.call_json("recheck", json.dumps(record("voltage-drop", KITCHEN_DROP))))
    assert report["ok"] and report["calculator"] == "voltage-drop"
    assert json.loads(jobs.call_json("format", "null"))["max_records"] == jobs.MAX_RECORDS
    refused = json.loads(jobs.call_json("__import__", "null"))
    assert refused["ok"] is False and "unknown job function" in refused["errors"][0]["message"]
    assert "not valid JSON" in json.loads(jobs.call_json("recheck", "{"))["errors"][0]["message"]
    checked = json.loads(jobs.call_json("check_job", json.dumps(json.dumps(kitchen()))))
    assert checked["problems"] == [] and len(checked["job"]["records"]) == 2


# --- the command line -----------------------------------------------------------------------

def test_cli_recomputes_every_record_of_a_valid_file(tmp_path, capsys):
    data = kitchen()
    status, out = run_cli(capsys, write(tmp_path, data))
    assert status == 0
    assert "job 'School kitchen refit' · site: Hillcrest Primary, kitchen · 2 records" in out
    for index, saved in enumerate(data["job"]["records"], start=1):
        assert f"{index}. {saved['title']} ({saved['calculator']}) — {saved['note']!r}" in out
        for output in saved["result"]["outputs"].values():
            assert f"{output['label']}: {output['display']}" in out
    assert out.count("same as the saved result") == 2
    assert out.rstrip().endswith("2 of 2 records recomputed")


def test_cli_json_gives_each_record_its_verdict(tmp_path, capsys):
    data = kitchen()
    data["job"]["records"][0]["result"]["outputs"]["drop_v"]["display"] = "99.9 V"
    status, out = run_cli(capsys, write(tmp_path, data), "--json")
    report = json.loads(out)
    assert status == 0 and report["ok"] is True
    assert [r["verdict"] for r in report["records"]] == [
        jobs.verdict(api.run("voltage-drop", KITCHEN_DROP)["checks"]),
        jobs.verdict(api.run("transformer-currents", KITCHEN_TRANSFORMER)["checks"])]
    assert [d["name"] for d in report["records"][0]["differences"]] == ["drop_v"]
    assert report["records"][1]["differences"] == []


def test_cli_reports_a_bad_record_and_still_the_others(tmp_path, capsys):
    data = kitchen()
    data["job"]["records"][1]["inputs"]["kva"] = "lots"
    data["job"]["records"].append({"calculator": "flux-capacitor", "inputs": {}})
    path = write(tmp_path, data)
    status, out = run_cli(capsys, path)
    assert status == 2
    assert "1. Voltage drop (voltage-drop)" in out and "same as the saved result" in out
    assert "job.records[1].inputs.kva: 'lots'" in out
    assert "job.records[2].calculator: unknown calculator 'flux-capacitor'" in out
    assert out.rstrip().endswith("1 of 3 records recomputed; 2 not")
    status, out = run_cli(capsys, path, "--json")
    report = json.loads(out)
    assert status == 2 and [r["ok"] for r in report["records"]] == [True, False, False]


def test_cli_names_a_file_that_is_not_json(tmp_path, capsys):
    path = write(tmp_path, '{"format": "fluxbook-job",', name="truncated.json")
    status, out = run_cli(capsys, path)
    assert status == 2
    assert f"{path}: file: not valid JSON (line 1, column 27" in out
    assert out.rstrip().endswith(f"{path} was not read as a job")
    status, out = run_cli(capsys, path, "--json")
    assert status == 2 and json.loads(out)["errors"][0]["message"].startswith("not valid JSON")


def test_cli_names_a_missing_file_and_a_wrong_command(tmp_path, capsys):
    status, out = run_cli(capsys, tmp_path / "nowhere.json")
    assert status == 2 and "cannot read" in out and "nowhere.json" in out
    status, out = run_cli(capsys)
    assert status == 2 and "job takes one FILE.json" in out


def test_cli_runs_as_a_module(tmp_path):
    """The real entry point, as a desk user types it."""
    path = write(tmp_path, kitchen())
    completed = subprocess.run([sys.executable, "-m", "calc", "job", str(path)], cwd=ROOT,
                               capture_output=True, text=True, encoding="utf-8", check=False)
    assert completed.returncode == 0, completed.stdout + completed.stderr
    assert "2 of 2 records recomputed" in completed.stdout
