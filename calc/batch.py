"""A schedule of circuits at once: rows read from CSV or tab-separated text (a header row of input
names, plus a `circuit` label), a calculator run on each, one record a row. It streams: rows are
read, checked and handed on a chunk at a time, so a file of any length is never held whole, on
as many cores as the machine has (one process where processes cannot be started, as in the
browser). The command line (`python -m calc batch`) and the browser's worker both use it.

A record: {"row", "circuit", "ok", "verdict", "governing", "outputs", "errors"}. `row` is the
row number as a spreadsheet shows it (the header is row 1); a rejected row's errors each name
its row, column, value and what is allowed.
"""

import collections
import csv
import functools
import io
import json
import os
from typing import NamedTuple

from calc import api, jobs
from calc.errors import CalcError, shorten

DEFAULT_CALCULATOR = "circuit-check"
LABEL_COLUMN = "circuit"  # the row's own name; every other column is an input
# A header with tabs was pasted from a spreadsheet; semicolons come from some locales' CSV.
DELIMITERS = ("\t", ";", ",")
CHUNK_ROWS = 250  # rows a worker takes at a time: a few ms of work, small to pickle
WINDOW_PER_PROCESS = 2  # chunks in flight per process: enough to keep every core busy
MAX_PROCESSES = 8
MAX_LABEL_CHARS = 80  # a circuit label is echoed in every line and the table
# Rows the browser takes in one schedule (the page keeps every row's result for sorting and
# export; the command line streams and has no limit).
MAX_PAGE_ROWS = 5000


class ScheduleError(CalcError):
    """The file as a whole cannot be read (no header, a column that is no input, a broken
    quote); `row` names the row at fault, when there is one."""

    def __init__(self, message, row=None):
        super().__init__(message if row is None else f"row {row}: {message}")
        self.row = row
        self.message = message


class Row(NamedTuple):
    """One row of a schedule: its number, label and inputs (blank cells left out, so they take
    their default), and what is wrong with the row itself, if anything."""

    number: int
    circuit: str
    inputs: dict
    problem: str = ""


# ---- reading --------------------------------------------------------------------------------

def _delimiter(header_line):
    return next((d for d in DELIMITERS if d in header_line), ",")


def read_rows(lines, calculator_id=DEFAULT_CALCULATOR):
    """The rows of a schedule, one at a time.

    `lines` is any iterable of text lines (an open file, text.splitlines(True)). The header row
    names the columns: the calculator's input names and `circuit`. Empty rows are passed over.
    Raises ScheduleError for a header that cannot be used or a row that cannot be read.
    """
    calculator = api.get(calculator_id)
    names = [item.name for item in calculator.inputs]
    lines = iter(lines)
    header_line = next((line for line in lines if line.strip()), None)
    if header_line is None:
        raise ScheduleError("the file is empty; its first row names the columns (circuit, "
                            + ", ".join(names[:6]) + " …)")
    delimiter = _delimiter(header_line)
    header = [cell.lstrip("\ufeff").strip().lower()
              for cell in next(csv.reader([header_line], delimiter=delimiter))]
    _check_header(header, names, calculator_id)
    reader = csv.reader(lines, delimiter=delimiter, strict=True)
    number = 1
    try:
        for cells in reader:
            number = reader.line_num + 1  # the header line was read apart
            if not any(cell.strip() for cell in cells):
                continue
            row = _row(number, header, cells)
            extra = [cell for cell in cells[len(header):] if cell.strip()]
            if extra:
                row = row._replace(problem=f"{len(cells)} cells but the header names "
                                   f"{len(header)} columns (extra {shorten(extra[0])!r}); "
                                   "quote a cell that holds the delimiter")
            yield row
    except csv.Error as error:
        raise ScheduleError(f"cannot be read ({error}); a quote opens a cell and must close "
                            "it, and a quote inside a quoted cell is doubled", number + 1) from None


def _check_header(header, names, calculator_id):
    seen = set()
    for column, name in enumerate(header, 1):
        if not name:
            raise ScheduleError(f"column {column} of the header is blank; name every column")
        if name in seen:
            raise ScheduleError(f"the header names {name!r} twice")
        seen.add(name)
        if name != LABEL_COLUMN and name not in names:
            raise ScheduleError(f"the header's column {shorten(name)!r} is not an input of "
                                f"{calculator_id}; columns are {LABEL_COLUMN} and: "
                                + ", ".join(names))


def _row(number, header, cells):
    inputs, circuit = {}, ""
    for name, cell in zip(header, cells):
        text = cell.strip()
        if name == LABEL_COLUMN:
            circuit = text[:MAX_LABEL_CHARS]
        elif text:
            inputs[name] = text
    return Row(number, circuit or f"row {number}", inputs)


# ---- checking -------------------------------------------------------------------------------

def check_row(calculator_id, row, region=None, full=False, display=None):
    """The record of one row (see the module's docstring); `full` adds the whole result;
    `display` is the unit system of its texts (calc.api.run)."""
    if row.problem:
        return {"row": row.number, "circuit": row.circuit, "ok": False, "verdict": None,
                "governing": None, "outputs": {},
                "errors": [{"row": row.number, "column": None, "value": None,
                            "message": row.problem}]}
    result = api.run(calculator_id, row.inputs, region, display)
    record = {"row": row.number, "circuit": row.circuit, "ok": result["ok"]}
    if not result["ok"]:
        record.update(verdict=None, governing=None, outputs={}, errors=[
            {"row": row.number, "column": error["field"], "value": error["value"],
             "message": error["message"]} for error in result["errors"]])
        return record
    outputs = result["outputs"]
    verdict = outputs["verdict"]["value"] if "verdict" in outputs else jobs.verdict(
        result["checks"])
    if "governing" in outputs:
        governing = outputs["governing"]["value"]
    else:
        governing = next((c["name"] for c in result["checks"] if c["status"] == verdict), None)
    record.update(verdict=verdict, governing=governing, outputs=outputs, errors=[])
    if full:
        record["result"] = {key: value for key, value in result.items() if key != "series"}
    return record


def check_rows(calculator_id, rows, region=None, full=False, render=None, display=None):
    """The records of a list of rows, in order, in this process (see run_rows)."""
    return _check_chunk(calculator_id, region, full, render, display, rows)


def chunks(rows, size=CHUNK_ROWS):
    """Lists of up to `size` rows, in order."""
    chunk = []
    for row in rows:
        chunk.append(row)
        if len(chunk) == size:
            yield chunk
            chunk = []
    if chunk:
        yield chunk


def _check_chunk(calculator_id, region, full, render, display, rows):
    records = [check_row(calculator_id, row, region, full, display) for row in rows]
    if render is None:
        return records
    return [_rendered(record, render) for record in records]


def _rendered(record, render):
    """The record as the command line counts it, with its text: the outputs stay behind in the
    worker (they are in the text), so little crosses back between processes."""
    brief = {key: record[key] for key in ("row", "circuit", "ok", "verdict", "governing")}
    brief["text"] = render(record)
    return brief


def run_rows(calculator_id, rows, region=None, processes=None, full=False, render=None,
             display=None):
    """The records of `rows` (any iterable of Row), in order, one at a time.

    `render`, a module-level function of a record (format_line, json_line, a CSV writer), is
    applied where the row is checked: each record then carries its text and no outputs.

    Runs on `processes` worker processes (default: the machine's cores, at most MAX_PROCESSES)
    with at most WINDOW_PER_PROCESS chunks each in flight, so memory holds a few chunks whatever
    the file's length. One process — or a machine where processes cannot be started — checks
    the rows here, one chunk at a time.
    """
    processes = processes or min(os.cpu_count() or 1, MAX_PROCESSES)
    pieces = chunks(rows)
    first = next(pieces, None)
    if first is None:
        return
    second = next(pieces, None)
    pool = None if second is None or processes < 2 else _pool(processes)
    if pool is None:  # one chunk, one core, or no processes to be had: here, in order
        for chunk in _chain(first, second, pieces):
            yield from check_rows(calculator_id, chunk, region, full, render, display)
        return
    work = functools.partial(_check_chunk, calculator_id, region, full, render, display)
    here = functools.partial(check_rows, calculator_id, region=region, full=full, render=render,
                             display=display)
    # Imported only with a pool: the browser's engine (no processes) never loads threading.
    from concurrent.futures import BrokenExecutor  # a pool whose worker died raises it
    with pool:
        pending = collections.deque()
        broken = False

        def take():
            """The oldest chunk's records; where a worker died, that chunk is checked here."""
            nonlocal broken
            future, chunk = pending.popleft()
            if not broken:
                try:
                    return future.result()
                except BrokenExecutor:
                    broken = True  # a worker was killed: no record is lost, the rest run here
            return list(here(chunk))

        for chunk in _chain(first, second, pieces):
            if broken:
                while pending:
                    yield from take()
                yield from here(chunk)
                continue
            try:
                pending.append((pool.submit(work, chunk), chunk))
            except BrokenExecutor:
                broken = True
                pending.append((None, chunk))
            if len(pending) >= processes * WINDOW_PER_PROCESS:
                yield from take()
        while pending:
            yield from take()


def _chain(first, second, rest):
    yield first
    if second is not None:
        yield second
    yield from rest


def _pool(processes):
    """A pool of worker processes, or None where none can be started (Pyodide, a sandbox).

    Forked where this process runs one thread (the command line: the quickest start); where
    other threads run (a test runner, an embedding program) a fork could copy a held lock into
    the child, so the workers start from a fork server (or spawned) instead.
    """
    try:
        import multiprocessing
        import threading
        from concurrent.futures import ProcessPoolExecutor

        methods = multiprocessing.get_all_start_methods()
        if "fork" in methods and threading.active_count() == 1:
            method = "fork"
        else:
            method = "forkserver" if "forkserver" in methods else "spawn"
        return ProcessPoolExecutor(processes, mp_context=multiprocessing.get_context(method))
    except (ImportError, OSError, NotImplementedError, ValueError, RuntimeError):
        return None


# ---- writing --------------------------------------------------------------------------------

def format_line(record):
    """One line of text for a record: its row, circuit, verdict and governing check (or why
    it was rejected)."""
    head = f"row {record['row']}\t{record['circuit']}\t"
    if not record["ok"]:
        problems = "; ".join(
            f"{error['column'] or 'row'} = {error['value']!r}: {error['message']}"
            if error["column"] else error["message"] for error in record["errors"])
        return head + "rejected\t" + problems
    fix = record["outputs"].get("fix", {}).get("display")
    line = f"{head}{record['verdict']}\t{record['governing'] or ''}"
    return line + (f"\t{fix}" if fix else "")


def json_line(record):
    """A record as one line of JSON."""
    return api.dumps(record)


class CsvLine:
    """A record as one line of the CSV table (a picklable callable: its columns are fixed)."""

    def __init__(self, calculator_id):
        self.header = csv_header(calculator_id)

    def __call__(self, record):
        return csv_line(record, self.header)


def csv_header(calculator_id):
    """The columns of the CSV table: row, circuit, verdict, governing, every declared output
    (its value in SI units), then the errors."""
    fixed = ["row", "circuit", "ok", "verdict", "governing"]
    outputs = [o.name for o in api.get(calculator_id).outputs if o.name not in fixed]
    return [*fixed, *outputs, "errors"]


def csv_line(record, header):
    """A record as one CSV line (text that a spreadsheet would run as a formula made inert)."""
    values = []
    for column in header:
        if column in ("row", "circuit", "ok", "verdict", "governing"):
            value = record[column]
        elif column == "errors":
            value = "; ".join(f"{e['column'] or 'row'}: {e['message']}" for e in record["errors"])
        else:
            output = record["outputs"].get(column)
            value = "" if output is None else output["value"]
        values.append(_cell(value))
    buffer = io.StringIO()
    csv.writer(buffer, lineterminator="\n").writerow(values)
    return buffer.getvalue().rstrip("\n")


def _cell(value):
    if value is None:
        return ""
    if isinstance(value, bool):
        return "yes" if value else "no"
    text = str(value)
    return "'" + text if isinstance(value, str) and text[:1] in ("=", "+", "-", "@") else text


def summary(counts, rejected):
    """The closing line: how many rows, by verdict, and the rows rejected."""
    total = sum(counts.values()) + len(rejected)
    parts = [f"{counts[v]} {v}" for v in ("pass", "warn", "fail", "none") if counts.get(v)]
    text = f"{total} row{'s' if total != 1 else ''} checked: " + (", ".join(parts) or "none")
    if rejected:
        shown = ", ".join(str(n) for n in rejected[:20]) + (" …" if len(rejected) > 20 else "")
        text += f"; {len(rejected)} rejected (row {shown})"
    return text


# ---- the browser's worker --------------------------------------------------------------------

def parse_text(argument):
    """{"calculator", "text"} -> {"ok", "rows": [{"row", "circuit", "inputs", "problem"}],
    "errors"}: the
    whole schedule pasted or chosen on the page (at most MAX_PAGE_ROWS rows)."""
    calculator_id = argument.get("calculator") or DEFAULT_CALCULATOR
    try:
        rows = []
        for row in read_rows(str(argument.get("text") or "").splitlines(True), calculator_id):
            if len(rows) == MAX_PAGE_ROWS:
                raise ScheduleError(f"the page checks at most {MAX_PAGE_ROWS} rows at once; "
                                    "split the file, or use python -m calc batch")
            rows.append({"row": row.number, "circuit": row.circuit, "inputs": row.inputs,
                         "problem": row.problem})
    except CalcError as error:
        return {"ok": False, "rows": [], "errors": [{"row": getattr(error, "row", None),
                                                      "message": str(error)}]}
    return {"ok": True, "rows": rows, "errors": []}


def check_json_rows(argument):
    """{"calculator", "rows", "region"?, "full"?, "display"?} -> [record]: a chunk of the
    page's rows."""
    calculator_id = argument.get("calculator") or DEFAULT_CALCULATOR
    rows = [Row(int(r["row"]), str(r.get("circuit") or ""), dict(r.get("inputs") or {}),
                str(r.get("problem") or "")) for r in argument.get("rows") or []]
    return check_rows(calculator_id, rows, argument.get("region"), bool(argument.get("full")),
                      display=argument.get("display"))


def csv_columns(argument):
    """{"calculator"} -> {"ok", "columns"}: the CSV table's columns (csv_header), so the page
    exports the same table as the command line."""
    return {"ok": True, "columns": csv_header(argument.get("calculator") or DEFAULT_CALCULATOR)}


CALLS = {"parse": parse_text, "check": check_json_rows, "columns": csv_columns}


def call_json(name, argument_json):
    """JSON text in, JSON text out: the worker's entry point for schedules (CALLS by name).
    Never raises: an unknown name or a bad argument comes back as {"ok": false, "errors"}."""
    function = CALLS.get(name) if isinstance(name, str) else None
    if function is None:
        return api.dumps({"ok": False, "errors": [{"row": None, "message":
                          f"unknown schedule function {shorten(name)!r}; known: "
                          + ", ".join(CALLS)}]})
    try:
        argument = json.loads(argument_json)
        if not isinstance(argument, dict):
            raise TypeError("the argument is an object")
        return api.dumps(function(argument))
    except (TypeError, ValueError, KeyError) as error:
        return api.dumps({"ok": False, "errors": [{"row": None, "message":
                          f"the schedule request could not be read ({error})"}]})
    except CalcError as error:
        return api.dumps({"ok": False, "errors": [{"row": None, "message": str(error)}]})
