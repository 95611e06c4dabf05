"""calc.batch and `python -m calc batch`: reading schedules (tabs, commas, semicolons, a byte-order
mark, empty rows), rows rejected by row, column, value and what is allowed while every other row is
still checked, records in order on one core or several, streaming (a long file is never held
whole), the exit status, and the browser worker's entry point."""

import csv
import io
import json
import subprocess
import sys

import pytest

from calc import api, batch
from tests.conftest import ROOT

# A schedule with good rows, bad rows and an empty line (invented; the browser test reads it too).
MIXED_SCHEDULE = (
    "circuit,system,voltage,current,continuous,length,size,device_type,device_rating,egc_size\n"
    "L-1 Hall lights,1ph,120 V,9 A,yes,60 ft,12 AWG,inverse-time,20,12 AWG\n"
    "L-2 Dish receptacles,1ph,120 V,16 A,no,75 ft,14 AWG,inverse-time,20,14 AWG\n"
    "\n"
    "L-3 Ice maker,1ph,120 V,twelve,no,40 ft,12 AWG,inverse-time,20,12 AWG\n"
    "L-4 Walk-in fans,1ph,120 V,6 A,no,40 ft,12 AWG,breaker,20,12 AWG\n"
    "L-5 Range hood,3ph,208 V,10 A,no,30 ft,12 AWG,inverse-time,20,12 AWG,extra\n"
    "L-6 Fryer,3ph,208 V,24 A,yes,35 ft,10 AWG,inverse-time,30,10 AWG\n"
)
TEMPLATE = ROOT / "site_src" / "schedules" / "school-kitchen-panel.csv"


def rows(text, calculator="circuit-check"):
    return list(batch.read_rows(io.StringIO(text), calculator))


def cli(*args, cwd=None):
    completed = subprocess.run([sys.executable, "-m", "calc", *args], cwd=cwd or ROOT,
                               capture_output=True, text=True, timeout=120)
    return completed.returncode, completed.stdout, completed.stderr


# ---- reading --------------------------------------------------------------------------------

def test_rows_are_numbered_as_a_spreadsheet_shows_them():
    read = rows(MIXED_SCHEDULE)
    assert [r.number for r in read] == [2, 3, 5, 6, 7, 8]  # the header is row 1; row 4 is empty
    assert read[0].circuit == "L-1 Hall lights" and "circuit" not in read[0].inputs
    assert read[0].inputs["voltage"] == "120 V"
    assert read[4].problem and "extra" in read[4].problem


@pytest.mark.parametrize("delimiter", ["\t", ";", ","])
def test_tabs_semicolons_and_commas(delimiter):
    text = "\n".join(delimiter.join(cells) for cells in (["circuit", "current", "size"],
                                                         ["A", "12 A", "10 AWG"]))
    (row,) = rows(text)
    assert row.inputs == {"current": "12 A", "size": "10 AWG"}


def test_header_is_case_and_space_tolerant_and_may_start_with_a_byte_order_mark():
    (row,) = rows("\ufeff Circuit , CURRENT\nK-9, 7 A \n")
    assert row.circuit == "K-9" and row.inputs == {"current": "7 A"}


def test_blank_cells_take_the_default_and_a_missing_label_gets_the_row():
    (row,) = rows("circuit,current,size\n,8 A,\n")
    assert row.inputs == {"current": "8 A"} and row.circuit == "row 2"


@pytest.mark.parametrize("text, words", [
    ("", "empty"),
    ("circuit,volts\nA,120\n", "'volts' is not an input of circuit-check"),
    ("circuit,size,size\nA,12,12\n", "twice"),
    ("circuit,,size\nA,,12\n", "column 2"),
])
def test_a_header_that_cannot_be_used_stops_with_its_reason(text, words):
    with pytest.raises(batch.ScheduleError, match=words):
        rows(text)


def test_a_broken_quote_names_its_row():
    with pytest.raises(batch.ScheduleError, match="row"):
        rows('circuit,current\nA,7 A\nB,"1 A\n')


# ---- checking --------------------------------------------------------------------------------

def test_bad_rows_are_reported_by_row_column_value_and_what_is_allowed():
    records = list(batch.run_rows("circuit-check", rows(MIXED_SCHEDULE), processes=1))
    by_row = {r["row"]: r for r in records}
    assert [r["row"] for r in records] == [2, 3, 5, 6, 7, 8]
    assert by_row[2]["ok"] and by_row[2]["verdict"] in ("pass", "warn", "fail")
    assert by_row[3]["verdict"] == "fail" and by_row[3]["governing"]  # 20 A on 14 AWG
    (current,) = by_row[5]["errors"]
    assert (current["row"], current["column"], current["value"]) == (5, "current", "twelve")
    assert "A" in current["message"]  # what a current is written in
    (device,) = by_row[6]["errors"]
    assert device["column"] == "device_type" and "inverse-time" in device["message"]
    assert not by_row[7]["ok"] and "header names" in by_row[7]["errors"][0]["message"]
    assert by_row[8]["ok"]


def test_a_record_has_the_documented_members():
    record = batch.check_row("circuit-check", batch.Row(2, "A", {}))
    assert set(record) == {"row", "circuit", "ok", "verdict", "governing", "outputs", "errors"}
    assert record["outputs"]["verdict"]["value"] == record["verdict"]
    full = batch.check_row("circuit-check", batch.Row(2, "A", {}), full=True)
    assert full["result"]["checks"] and "series" not in full["result"]


def test_other_calculators_get_a_verdict_from_their_checks():
    (row,) = rows("circuit,length,current\nrun,300 ft,16 A\n", "voltage-drop")
    record = batch.check_row("voltage-drop", row)
    assert record["verdict"] == "fail" and record["governing"] == "drop_limit"


def _many(count):
    header = "circuit,current,length\n"
    return header + "".join(f"C{n},{5 + n % 15} A,{20 + n % 90} ft\n" for n in range(count))


def test_several_processes_give_the_same_records_in_order():
    text = _many(600)
    one = list(batch.run_rows("circuit-check", rows(text), processes=1))
    two = list(batch.run_rows("circuit-check", rows(text), processes=2))
    assert one == two and [r["row"] for r in two] == list(range(2, 602))


def test_where_no_process_can_be_started_the_rows_are_checked_here(monkeypatch):
    monkeypatch.setattr(batch, "_pool", lambda processes: None)
    records = list(batch.run_rows("circuit-check", rows(_many(600)), processes=2))
    assert len(records) == 600 and all(r["ok"] for r in records)


def test_it_streams_a_long_file_is_never_held_whole():
    """Records come out while the file is still being read: when the first record arrives, at
    most the chunks in flight have been read, not the file."""
    pulled = 0

    def lines():
        nonlocal pulled
        yield "circuit,current\n"
        for n in range(100_000):
            pulled += 1
            yield f"C{n},10 A\n"

    records = batch.run_rows("circuit-check", batch.read_rows(lines()), processes=2)
    first = next(records)
    assert first["row"] == 2
    in_flight = batch.CHUNK_ROWS * (2 * batch.WINDOW_PER_PROCESS + 2)
    assert pulled <= in_flight < 100_000
    records.close()


# ---- writing --------------------------------------------------------------------------------

def test_text_json_and_csv_lines():
    record = batch.check_row("circuit-check", batch.Row(2, "L-1", {"current": "9 A"}))
    line = batch.format_line(record)
    assert line.startswith("row 2\tL-1\t" + record["verdict"])
    assert json.loads(batch.json_line(record)) == json.loads(api.dumps(record))
    render = batch.CsvLine("circuit-check")
    cells = next(csv.reader([render(record)]))
    assert dict(zip(render.header, cells))["load_a"] == "9.0"
    rejected = batch.check_row("circuit-check", batch.Row(3, "=cmd()", {"current": "x"}))
    assert "rejected" in batch.format_line(rejected) and "current" in batch.format_line(rejected)
    assert next(csv.reader([render(rejected)]))[1] == "'=cmd()"  # a formula made inert


def test_summary_names_the_rejected_rows():
    assert batch.summary({"pass": 3, "fail": 1}, [5, 9]) == (
        "6 rows checked: 3 pass, 1 fail; 2 rejected (row 5, 9)")


# ---- the command line -------------------------------------------------------------------------

def test_cli_exit_0_when_every_row_computed(tmp_path):
    status, out, err = cli("batch", str(TEMPLATE))
    lines = out.strip().splitlines()
    assert status == 0 and len(lines) == 12 and lines[0].startswith("row 2\tKP-1")
    assert "12 rows checked" in err


def test_cli_exit_2_naming_the_rejected_rows(tmp_path):
    path = tmp_path / "mixed.csv"
    path.write_text(MIXED_SCHEDULE, encoding="utf-8")
    status, out, err = cli("batch", str(path))
    assert status == 2 and "rejected (row 5, 6, 7)" in err
    assert "row 5\tL-3 Ice maker\trejected\tcurrent = 'twelve'" in out


def test_cli_json_one_object_a_row(tmp_path):
    path = tmp_path / "mixed.csv"
    path.write_text(MIXED_SCHEDULE, encoding="utf-8")
    status, out, _ = cli("batch", str(path), "--json")
    objects = [json.loads(line) for line in out.splitlines()]
    assert status == 2 and len(objects) == 6
    assert all(set(o) == {"row", "circuit", "ok", "verdict", "governing", "outputs", "errors"}
               for o in objects)
    in_process = list(batch.run_rows("circuit-check", rows(MIXED_SCHEDULE), processes=1))
    assert [o["verdict"] for o in objects] == [r["verdict"] for r in in_process]


def test_cli_csv_table(tmp_path):
    status, out, _ = cli("batch", str(TEMPLATE), "--csv")
    table = list(csv.reader(io.StringIO(out)))
    assert status == 0 and table[0] == batch.csv_header("circuit-check") and len(table) == 13


def test_cli_other_calculator_and_region(tmp_path):
    path = tmp_path / "runs.csv"
    path.write_text("circuit,length,current,size\nA,30 m,10 A,2.5 mm2\n", encoding="utf-8")
    status, out, _ = cli("--region", "iec", "batch", str(path), "--calculator", "voltage-drop")
    assert status == 0 and out.startswith("row 2\tA\t")


@pytest.mark.parametrize("args, words", [
    (("batch",), "one FILE.csv"),
    (("batch", "a.csv", "b.csv"), "one FILE.csv"),
    (("batch", "x.csv", "--json", "--csv"), "alternatives"),
    (("batch", "x.csv", "--calculator", "toaster"), "unknown calculator"),
    (("batch", "x.csv", "--fast"), "unknown option"),
    (("batch", "does-not-exist.csv"), "cannot read"),
])
def test_cli_usage_errors_exit_2_without_a_traceback(args, words):
    status, out, err = cli(*args)
    assert status == 2 and words in err and "Traceback" not in err


def test_cli_a_file_that_cannot_be_read(tmp_path):
    path = tmp_path / "bad.csv"
    path.write_text("circuit,volts\nA,120\n", encoding="utf-8")
    status, _, err = cli("batch", str(path))
    assert status == 2 and "'volts' is not an input" in err and "Traceback" not in err
    binary = tmp_path / "binary.csv"
    binary.write_bytes(b"\xff\xfe\x00circuit")
    status, _, err = cli("batch", str(binary))
    assert status == 2 and "Traceback" not in err


def test_template_every_row_computes():
    records = list(batch.run_rows("circuit-check", batch.read_rows(TEMPLATE.open(encoding="utf-8")),
                                  processes=1))
    assert len(records) == 12 and all(r["ok"] for r in records)
    assert {r["verdict"] for r in records} >= {"pass", "fail"}  # a template that shows both


# ---- the browser worker's entry point -------------------------------------------------------------

def test_call_json_parse_check_and_columns():
    parsed = json.loads(batch.call_json("parse", json.dumps({"text": MIXED_SCHEDULE})))
    assert parsed["ok"] and [r["row"] for r in parsed["rows"]] == [2, 3, 5, 6, 7, 8]
    assert parsed["rows"][4]["problem"]
    checked = json.loads(batch.call_json("check", json.dumps({"rows": parsed["rows"][:2]})))
    assert [r["row"] for r in checked] == [2, 3]
    columns = json.loads(batch.call_json("columns", "{}"))["columns"]
    assert columns == batch.csv_header("circuit-check")


@pytest.mark.parametrize("name, argument, words", [
    ("shell", "{}", "unknown schedule function"), ("parse", "not json", "could not be read"),
    ("parse", "[1]", "could not be read"),
    ("parse", json.dumps({"text": "circuit,volts\nA,1\n"}), "'volts' is not an input"),
])
def test_call_json_never_raises(name, argument, words):
    answer = json.loads(batch.call_json(name, argument))
    text = json.dumps(answer)
    assert answer["ok"] is False and words in text


def test_the_page_takes_at_most_its_row_limit(monkeypatch):
    monkeypatch.setattr(batch, "MAX_PAGE_ROWS", 5)
    parsed = batch.parse_text({"text": _many(6)})
    assert not parsed["ok"] and "at most 5 rows" in parsed["errors"][0]["message"]


def test_a_worker_that_dies_loses_no_row(monkeypatch):
    # A worker killed mid-run (out of memory, a signal) used to leave the pool waiting for ever;
    # the chunks it held, and the rest, are now checked in this process, in order.
    import os
    import signal
    from concurrent.futures import ProcessPoolExecutor

    def dying_pool(processes):
        pool = ProcessPoolExecutor(processes)
        pool.submit(os.kill, os.getpid(), 0).result()  # the pool is up
        for pid in list(pool._processes):
            os.kill(pid, signal.SIGKILL)
        return pool

    text = _many(600)
    monkeypatch.setattr(batch, "_pool", dying_pool)
    records = list(batch.run_rows("circuit-check", rows(text), processes=2))
    expected = list(batch.run_rows("circuit-check", rows(text), processes=1))
    assert [r["row"] for r in records] == [r["row"] for r in expected]
    assert [r["verdict"] for r in records] == [r["verdict"] for r in expected]
