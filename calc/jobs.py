"""Job records: the job file Fluxbook exports (format, schema, checks), input-name migrations, and
recomputing a saved record to compare it with what was saved.

One implementation for the command line (`python -m calc job FILE.json`) and the browser (the
calculator worker calls `call_json`). Pure: no I/O and no clock; dates come from the file or the
page. The file format is documented in DEVELOPERS.md ("Job records").
"""

import json
import math
import re

from calc import __version__, api
from calc.errors import CalcError, InputErrors, shorten

FORMAT = "fluxbook-job"  # the "format" member every job file carries
SCHEMA_VERSION = 1  # the job file's schema; bump it (with an upgrade step) when its shape changes

# A job file is read whole into memory, on a phone too. 500 records of the largest calculator
# (about 9 kB each without its chart) come to 4.5 MB; the limits leave room and stop a wrong file.
MAX_FILE_BYTES = 8_000_000
MAX_RECORDS = 500

# Released input names change only with an entry here: (calculator id, old input name) -> new
# name. Saved jobs, exported files and old share links are read through it. Chains are followed
# (a -> b, then b -> c). Values are kept exactly as typed; only the name moves.
MIGRATIONS = {}

# Released calculator ids change only with an entry here: old id -> new id.
RENAMED_CALCULATORS = {}

# Longest text accepted for each member (characters); longer is refused with its length said.
TEXT_LIMITS = {
    "name": 120, "site": 200, "notes": 2000, "note": 1000, "title": 200, "fluxbook_version": 40,
    "calculator": 80, "date": 40,
}
RESULT_TEXT_CHARS = 4000  # one message, step or source of a saved result
INPUT_TEXT_CHARS = api.MAX_TEXT_CHARS

JOB_KEYS = ("name", "site", "notes", "created", "updated", "records")
RECORD_KEYS = ("calculator", "title", "inputs", "note", "saved", "fluxbook_version", "result")
FILE_KEYS = ("format", "schema", "fluxbook_version", "exported", "job")
RESULT_LISTS = ("assumptions", "sources", "cautions")
STATUS_ORDER = ("pass", "warn", "fail")  # worst last
VERDICT_WORDS = {"pass": "OK", "warn": "Check", "fail": "Not OK", "none": "no checks"}

# ISO 8601 as a browser writes it (2026-12-03T10:15:00.000Z); a date alone is accepted too.
_DATE = re.compile(r"\d{4}-\d{2}-\d{2}(T\d{2}:\d{2}(:\d{2}(\.\d{1,9})?)?(Z|[+-]\d{2}:?\d{2})?)?")
_UNIT_SYMBOLS = {"degC": "°C", "ohm": "Ω"}  # how a declared unit reads on a printed sheet


class JobFileError(CalcError):
    """The file as a whole cannot be read as a job (not JSON, too large, not a job, newer schema).

    `where` names the part of the file at fault ("file", "schema", "job.records").
    """

    def __init__(self, where, message):
        super().__init__(f"{where}: {message}")
        self.where = where
        self.message = message

    def as_dict(self):
        return {"where": self.where, "kind": "file", "message": self.message}


def _problem(where, message, kind="file"):
    """One thing wrong in a file. kind "file": the file is refused as it stands; kind "input": the
    record is well formed but this version does not accept one of its values (it cannot be
    recomputed, and is kept as saved)."""
    return {"where": where, "kind": kind, "message": message}


def _type_name(value):
    return {dict: "an object", list: "a list", str: "text", bool: "true/false",
            type(None): "null"}.get(type(value), "a number")


# --- reading a file -------------------------------------------------------------------------

def parse_job_text(text):
    """The JSON data of a job file's text (str or UTF-8 bytes); JobFileError when it is not JSON.

    Examples
    --------
    >>> parse_job_text('{"format": "fluxbook-job"}')
    {'format': 'fluxbook-job'}
    >>> parse_job_text('{"format": ')
    Traceback (most recent call last):
    ...
    calc.jobs.JobFileError: file: not valid JSON (line 1, column 12: Expecting value)
    """
    if isinstance(text, (bytes, bytearray)):
        if len(text) > MAX_FILE_BYTES:
            raise JobFileError("file", _too_large(len(text)))
        try:
            text = bytes(text).decode("utf-8")
        except UnicodeDecodeError as error:
            raise JobFileError("file", f"not UTF-8 text (byte {error.start} cannot be read); a job "
                               "file is JSON text") from None
    if not isinstance(text, str):
        raise JobFileError("file", f"expected the file's text, got {_type_name(text)}")
    size = len(text.encode("utf-8", "surrogatepass"))
    if size > MAX_FILE_BYTES:
        raise JobFileError("file", _too_large(size))
    text = text.removeprefix("\ufeff")  # a byte-order mark some editors add
    if not text.strip():
        raise JobFileError("file", "the file is empty; a job file is JSON text")
    try:
        return json.loads(text, parse_constant=_refuse_constant)
    except json.JSONDecodeError as error:
        raise JobFileError("file", f"not valid JSON (line {error.lineno}, column {error.colno}: "
                           f"{error.msg})") from None
    except RecursionError:
        raise JobFileError("file", "not a job file: its JSON is nested too deeply") from None


def _too_large(size):
    return f"{size / 1e6:.1f} MB is too large for a job file (at most {MAX_FILE_BYTES / 1e6:g} MB)"


def _refuse_constant(name):
    raise JobFileError("file", f"{name} is not a number a job file may hold")


def check_job(data):
    """Check and normalise a job file's data.

    Parameters
    ----------
    data : object
        The parsed JSON of a job file.

    Returns
    -------
    dict
        {"job": normalised job or None, "problems": [{"where", "kind", "message"}],
        "notices": [text]}. Problems of kind "file" mean the file must be refused as it stands;
        kind "input" marks a record this version cannot recompute (it is kept as saved). Notices
        say what a migration changed.

    Raises
    ------
    JobFileError
        The data is not a job at all, or is of a newer schema.
    """
    if not isinstance(data, dict):
        raise JobFileError("file", f"the file holds {_type_name(data)}, not a Fluxbook job (an "
                           f'object with "format": "{FORMAT}")')
    if data.get("format") != FORMAT:
        raise JobFileError("format", f'not a Fluxbook job file: "format" is '
                           f'{_shown(data.get("format"))}, expected "{FORMAT}"')
    schema = data.get("schema")
    if isinstance(schema, bool) or not isinstance(schema, int):
        raise JobFileError("schema", f'"schema" is {_shown(schema)}; a job file gives its schema as '
                           f"a whole number (this version writes {SCHEMA_VERSION})")
    if schema > SCHEMA_VERSION:
        raise JobFileError("schema", f"the file is of job schema {schema}, made by a newer Fluxbook; "
                           f"this version reads schema {SCHEMA_VERSION} and older: update Fluxbook")
    if schema < 1:
        raise JobFileError("schema", f"job schema {schema} does not exist; schemas start at 1")
    problems, notices = [], []
    problems += _unknown_keys(data, FILE_KEYS, "file", "a job file")
    _text(data, "fluxbook_version", "file", problems, required=True)
    _date(data, "exported", "file", problems)
    raw_job = data.get("job")
    if not isinstance(raw_job, dict):
        problems.append(_problem("job", f'"job" must be an object, not {_type_name(raw_job)}'))
        return {"job": None, "problems": problems, "notices": notices}
    problems += _unknown_keys(raw_job, JOB_KEYS, "job", "a job")
    job = {
        "name": _text(raw_job, "name", "job", problems, required=True),
        "site": _text(raw_job, "site", "job", problems),
        "notes": _text(raw_job, "notes", "job", problems),
        "created": _date(raw_job, "created", "job", problems),
        "updated": _date(raw_job, "updated", "job", problems),
        "records": [],
    }
    raw_records = raw_job.get("records", [])
    if not isinstance(raw_records, list):
        problems.append(_problem("job.records", f"must be a list, not {_type_name(raw_records)}"))
        raw_records = []
    if len(raw_records) > MAX_RECORDS:
        raise JobFileError("job.records", f"{len(raw_records)} records is more than a job file "
                           f"may hold (at most {MAX_RECORDS})")
    for index, raw in enumerate(raw_records):
        record, record_problems, record_notices = check_record(raw, f"job.records[{index}]")
        problems += record_problems
        notices += record_notices
        if record is not None:
            job["records"].append(record)
    return {"job": job, "problems": problems, "notices": notices}


def check_job_text(text):
    """`check_job` of a file's text; a file-level error comes back as one problem (never raises).

    Examples
    --------
    >>> check_job_text('[1, 2]')["problems"][0]["message"]
    'the file holds a list, not a Fluxbook job (an object with "format": "fluxbook-job")'
    """
    try:
        return check_job(parse_job_text(text))
    except JobFileError as error:
        return {"job": None, "problems": [error.as_dict()], "notices": []}


def _shown(value):
    """A value from a file, for a message: short, and never the whole of a long text."""
    if isinstance(value, (dict, list)):
        return _type_name(value)
    return repr(shorten(value))


def _unknown_keys(mapping, allowed, where, what):
    return [
        _problem(where, f"unknown member {_shown(key)}; {what} has: {', '.join(allowed)}")
        for key in mapping if key not in allowed
    ]


def _text(mapping, key, where, problems, required=False, limit_key=None):
    value = mapping.get(key)
    limit = TEXT_LIMITS[limit_key or key]
    if value is None:
        if required:
            problems.append(_problem(f"{where}.{key}", f'"{key}" is required (text)'))
        return ""
    if not isinstance(value, str):
        problems.append(_problem(f"{where}.{key}", f"must be text, not {_type_name(value)}"))
        return ""
    if len(value) > limit:
        problems.append(_problem(f"{where}.{key}", f"{len(value)} characters is too long "
                                 f"(at most {limit})"))
        return ""
    if required and not value.strip():
        problems.append(_problem(f"{where}.{key}", f'"{key}" must not be blank'))
    return value


def _date(mapping, key, where, problems):
    value = mapping.get(key)
    if value is None:
        return ""
    if not isinstance(value, str) or len(value) > TEXT_LIMITS["date"] or not _DATE.fullmatch(value):
        problems.append(_problem(f"{where}.{key}", f"{_shown(value)} is not a date; write it as "
                                 "2026-12-03 or 2026-12-03T10:15:00Z"))
        return ""
    return value


# --- one record -----------------------------------------------------------------------------

def migrate_calculator(calculator_id):
    """The current id of a calculator saved under `calculator_id` (RENAMED_CALCULATORS)."""
    seen = set()
    while calculator_id in RENAMED_CALCULATORS and calculator_id not in seen:
        seen.add(calculator_id)
        calculator_id = RENAMED_CALCULATORS[calculator_id]
    return calculator_id


def migrate_inputs(calculator_id, inputs):
    """Inputs saved under older names, renamed through MIGRATIONS; values untouched.

    Returns
    -------
    (dict, list, list)
        The inputs under today's names (in the order given), the renames made as (old, new),
        and conflicts as (old, new) where both names were given.

    Examples
    --------
    >>> migrate_inputs("voltage-drop", {"length": "150 ft"})
    ({'length': '150 ft'}, [], [])
    """
    migrated, renamed, conflicts = {}, [], []
    for name, value in inputs.items():
        new, seen = name, {name}
        while (calculator_id, new) in MIGRATIONS:
            new = MIGRATIONS[(calculator_id, new)]
            if new in seen:  # a loop in the table: keep the name as given
                new = name
                break
            seen.add(new)
        if new in migrated:
            conflicts.append((name, new))
            continue
        if new != name:
            renamed.append((name, new))
        migrated[new] = value
    return migrated, renamed, conflicts


def check_record(raw, where="record"):
    """Check, migrate and normalise one saved record.

    Returns
    -------
    (dict or None, list, list)
        The record (calculator id and input names migrated, title from today's registry, saved
        result kept for reference) or None when it is unusable; its problems; its notices.
    """
    problems, notices = [], []
    if not isinstance(raw, dict):
        return None, [_problem(where, f"a record must be an object, not {_type_name(raw)}")], []
    problems += _unknown_keys(raw, RECORD_KEYS, where, "a record")
    saved_id = raw.get("calculator")
    if not isinstance(saved_id, str) or not saved_id.strip():
        problems.append(_problem(f"{where}.calculator", f"must name a calculator, not "
                                 f"{_shown(saved_id)}"))
        return None, problems, notices
    calculator_id = migrate_calculator(saved_id)
    if calculator_id not in api.REGISTRY:
        problems.append(_problem(f"{where}.calculator", f"unknown calculator {_shown(saved_id)}; "
                                 f"known: {', '.join(sorted(api.REGISTRY))}"))
        return None, problems, notices
    if calculator_id != saved_id:
        notices.append(f"{where}: calculator {saved_id!r} is now called {calculator_id!r}")
    calculator = api.REGISTRY[calculator_id]
    raw_inputs = raw.get("inputs")
    if not isinstance(raw_inputs, dict):
        problems.append(_problem(f"{where}.inputs", f"must be an object of input name: value, not "
                                 f"{_type_name(raw_inputs)}"))
        return None, problems, notices
    inputs, renamed, conflicts = migrate_inputs(calculator_id, raw_inputs)
    for old, new in renamed:
        notices.append(f"{where}: input {old!r} of {calculator_id} is now called {new!r}")
    for old, new in conflicts:
        problems.append(_problem(f"{where}.inputs.{shorten(old)}", f"gives {new!r} twice (once "
                                 "under an older name); keep one"))
    known = {item.name for item in calculator.inputs}
    for name, value in inputs.items():
        field = f"{where}.inputs.{shorten(name)}"
        if name not in known:
            problems.append(_problem(field, f"unknown input {_shown(name)} of {calculator_id}; "
                                     f"inputs are: {', '.join(item.name for item in calculator.inputs)}"))
        elif not _is_input_value(value):
            problems.append(_problem(field, f"must be text, a number or true/false, not "
                                     f"{_type_name(value)}"))
        elif isinstance(value, str) and len(value) > INPUT_TEXT_CHARS:
            problems.append(_problem(field, f"{len(value)} characters is too long (at most "
                                     f"{INPUT_TEXT_CHARS})"))
    if any(p["kind"] == "file" for p in problems):
        return None, problems, notices
    try:
        api.validate(calculator, inputs)
    except InputErrors as errors:
        for error in errors.errors:
            problems.append(_problem(f"{where}.inputs.{error.field}" if error.field else where,
                                     error.message, kind="input"))
    record = {
        "calculator": calculator_id,
        "title": calculator.title,
        "inputs": inputs,
        "note": _text(raw, "note", where, problems),
        "saved": _date(raw, "saved", where, problems),
        "fluxbook_version": _text(raw, "fluxbook_version", where, problems),
        "result": _check_result(raw.get("result"), f"{where}.result", problems),
    }
    if any(p["kind"] == "file" for p in problems):
        return None, problems, notices
    return record, problems, notices


def _is_input_value(value):
    if isinstance(value, float):
        return math.isfinite(value)
    return value is None or isinstance(value, (str, int, bool))


def _check_result(raw, where, problems):
    """A saved result, kept for reference: known members checked, the chart and unknown members
    dropped (the chart is drawn again when the record is reopened)."""
    if raw is None:
        return None
    if not isinstance(raw, dict) or raw.get("ok") is not True:
        problems.append(_problem(where, 'a saved result must be an object with "ok": true'))
        return None
    result = {"ok": True}
    for key in ("calculator", "version"):
        value = raw.get(key, "")
        if not isinstance(value, str) or len(value) > TEXT_LIMITS["calculator"]:
            problems.append(_problem(f"{where}.{key}", "must be short text"))
        result[key] = value if isinstance(value, str) else ""
    outputs = raw.get("outputs", {})
    result["outputs"] = {}
    if not isinstance(outputs, dict):
        problems.append(_problem(f"{where}.outputs", "must be an object of output name: value"))
        outputs = {}
    for name, output in outputs.items():
        here = f"{where}.outputs.{shorten(name)}"
        if not isinstance(output, dict):
            problems.append(_problem(here, "must be an object with value, unit, label and display"))
            continue
        value = output.get("value")
        if not _is_input_value(value):
            problems.append(_problem(f"{here}.value", f"must be a number, not {_type_name(value)}"))
            continue
        texts = {key: output.get(key, "") for key in ("unit", "label", "display")}
        if not all(isinstance(t, str) and len(t) <= RESULT_TEXT_CHARS for t in texts.values()):
            problems.append(_problem(here, "unit, label and display must be text"))
            continue
        result["outputs"][name] = {"value": value, **texts}
    result["checks"] = _result_list(raw, "checks", where, problems, ("name", "status", "message"))
    for check in result["checks"]:
        if check["status"] not in STATUS_ORDER:
            problems.append(_problem(f"{where}.checks", f"status {_shown(check['status'])} is not "
                                     f"one of {', '.join(STATUS_ORDER)}"))
    result["steps"] = _result_list(raw, "steps", where, problems, ("text", "formula", "result"))
    for key in RESULT_LISTS:
        result[key] = _result_list(raw, key, where, problems)
    return result


def _result_list(raw, key, where, problems, members=None):
    """A list of texts (members None) or of objects whose `members` are texts."""
    items = raw.get(key, [])
    if not isinstance(items, list):
        problems.append(_problem(f"{where}.{key}", f"must be a list, not {_type_name(items)}"))
        return []
    kept = []
    for index, item in enumerate(items):
        here = f"{where}.{key}[{index}]"
        if members is None:
            if isinstance(item, str) and len(item) <= RESULT_TEXT_CHARS:
                kept.append(item)
            else:
                problems.append(_problem(here, "must be text"))
            continue
        if not isinstance(item, dict) or not all(
                isinstance(item.get(m, ""), str) and len(item.get(m, "")) <= RESULT_TEXT_CHARS
                for m in members):
            problems.append(_problem(here, f"must be an object of text: {', '.join(members)}"))
            continue
        kept.append({m: item.get(m, "") for m in members})
    return kept


# --- recomputing ----------------------------------------------------------------------------

def verdict(checks):
    """The worst check status of a result's checks: "fail", "warn", "pass", or "none".

    Examples
    --------
    >>> verdict([{"status": "pass"}, {"status": "warn"}])
    'warn'
    >>> verdict([])
    'none'
    """
    statuses = [c.get("status") for c in checks if c.get("status") in STATUS_ORDER]
    return max(statuses, key=STATUS_ORDER.index) if statuses else "none"


def shown_inputs(calculator_id, inputs):
    """The inputs as a person reads them on a sheet: [{"name", "label", "text"}] in form order.

    A bare number gets the input's unit, a choice its label, a flag Yes or No; a blank is "".

    Examples
    --------
    >>> shown_inputs("transformer-currents", {"kva": "75", "phases": "3"})[:2]
    [{'name': 'kva', 'label': 'Rating', 'text': '75 kVA'}, {'name': 'phases', 'label': 'Phases', 'text': 'Three-phase'}]
    """
    calculator = api.get(calculator_id)
    shown = []
    for item in calculator.inputs:
        if item.name not in inputs:
            continue
        shown.append({"name": item.name, "label": item.label,
                      "text": _input_text(item, inputs[item.name])})
    return shown


def _input_text(item, value):
    if value is None or (isinstance(value, str) and not value.strip()):
        return ""
    if item.kind == "flag":
        word = str(value).strip().lower()
        return "Yes" if value is True or word in ("yes", "true", "on", "1") else (
            "No" if value is False or word in ("no", "false", "off", "0") else str(value))
    if item.kind == "choice":
        return dict(item.choices).get(str(value).strip(), str(value))
    text = format(value, ".15g") if isinstance(value, float) else str(value).strip()
    if item.kind == "quantity" and item.unit and _is_bare_number(text):
        return f"{text} {_UNIT_SYMBOLS.get(item.unit, item.unit)}"
    return text


def _is_bare_number(text):
    try:
        float(text)
    except ValueError:
        return False
    return True


def differences(saved, now):
    """What changed between a saved result and today's: outputs and check statuses.

    An output differs when its shown text differs or its value moved by more than one part in a
    million (finer than any shown figure, coarser than floating-point noise).

    Returns
    -------
    list of dict
        {"kind": "output" | "check", "name", "label", "saved", "now"}; for outputs "saved" and
        "now" are the shown texts (empty when the output is absent on one side); for checks,
        the statuses.
    """
    found = []
    saved_outputs, now_outputs = saved.get("outputs", {}), now.get("outputs", {})
    for name in list(saved_outputs) + [n for n in now_outputs if n not in saved_outputs]:
        old, new = saved_outputs.get(name), now_outputs.get(name)
        if old and new and old.get("display") == new.get("display") and _close(
                old.get("value"), new.get("value")):
            continue
        label = (new or old).get("label", name)
        found.append({"kind": "output", "name": name, "label": label,
                      "saved": _output_text(old), "now": _output_text(new)})
    saved_checks = {c["name"]: c["status"] for c in saved.get("checks", [])}
    now_checks = {c["name"]: c["status"] for c in now.get("checks", [])}
    for name in list(saved_checks) + [n for n in now_checks if n not in saved_checks]:
        if saved_checks.get(name) != now_checks.get(name):
            found.append({"kind": "check", "name": name, "label": name,
                          "saved": saved_checks.get(name, ""), "now": now_checks.get(name, "")})
    return found


def _output_text(output):
    if not output:
        return ""
    display = output.get("display", "")
    return display if display else f"{output.get('value')} {output.get('unit', '')}".strip()


def _close(a, b):
    if isinstance(a, bool) or isinstance(b, bool) or not isinstance(a, (int, float)) or not \
            isinstance(b, (int, float)):
        return a == b
    return math.isclose(a, b, rel_tol=1e-6, abs_tol=1e-12)


def without_chart(result):
    """A result as a record keeps it: everything but the chart data (redrawn on reopening)."""
    return {key: value for key, value in result.items() if key != "series"}


def recheck(raw, region=None, where="record"):
    """Recompute a saved record with this version and compare it with what was saved.

    Parameters
    ----------
    raw : dict
        A record as stored or exported (older input names are migrated first).
    region : {"na", "iec"}, optional
        Whose defaults inputs the record leaves out take (the command line's --region).

    Returns
    -------
    dict
        {"ok", "calculator", "title", "inputs" (migrated), "renamed" [[old, new]], "shown_inputs",
        "verdict", "saved_verdict", "result" (today's, without the chart), "differences",
        "errors" [{"where", "kind", "message"}], "notices", "version"}. "ok" is false when the
        record cannot be recomputed; the errors say why.
    """
    record, problems, notices = check_record(raw, where)
    report = {
        "ok": False, "calculator": None, "title": "", "note": "", "inputs": {}, "renamed": [],
        "shown_inputs": [], "verdict": "none", "saved_verdict": None, "result": None,
        "differences": [], "errors": [], "notices": notices, "version": __version__,
    }
    if isinstance(raw, dict) and isinstance(raw.get("note"), str):
        report["note"] = raw["note"][:TEXT_LIMITS["note"]]
    if record is None:
        report["errors"] = problems
        return report
    calculator_id = record["calculator"]
    report.update(calculator=calculator_id, title=record["title"], inputs=record["inputs"],
                  shown_inputs=shown_inputs(calculator_id, record["inputs"]))
    raw_inputs = raw.get("inputs", {})
    report["renamed"] = [[old, new] for old, new in migrate_inputs(calculator_id, raw_inputs)[1]]
    saved = record["result"]
    if saved is not None:
        report["saved_verdict"] = verdict(saved["checks"])
    if problems:  # an input this version refuses: the record is kept as saved
        report["errors"] = problems
        return report
    result = api.run(calculator_id, record["inputs"], region)
    if not result["ok"]:
        report["errors"] = [
            _problem(f"{where}.inputs.{e['field']}" if e["field"] else where, e["message"], "input")
            for e in result["errors"]
        ]
        return report
    result = without_chart(result)
    report.update(ok=True, result=result, verdict=verdict(result["checks"]))
    if saved is not None:
        report["differences"] = differences(saved, result)
    return report


def job_report(text, region=None):
    """Every record of a job file recomputed: what `python -m calc job FILE` prints.

    Returns
    -------
    dict
        {"ok", "job": {"name", "site", "notes", "created", "updated"} or None, "records":
        [recheck report + "index"], "errors": [problems of the file as a whole], "version"}.
        "ok" is true only when the file is sound and every record recomputed.
    """
    report = {"ok": False, "job": None, "records": [], "errors": [], "version": __version__}
    try:
        data = parse_job_text(text)
        checked = check_job(data)
    except JobFileError as error:
        report["errors"] = [error.as_dict()]
        return report
    if checked["job"] is None:
        report["errors"] = checked["problems"]
        return report
    report["job"] = {k: v for k, v in checked["job"].items() if k != "records"}
    raw_records = data["job"].get("records", [])
    if not isinstance(raw_records, list) or len(raw_records) > MAX_RECORDS:
        raw_records = []  # already reported as a problem of the file
    record_wheres = tuple(f"job.records[{i}]" for i in range(len(raw_records)))
    report["errors"] = [p for p in checked["problems"] if not p["where"].startswith(record_wheres)]
    for index, raw in enumerate(raw_records):
        entry = recheck(raw, region, where=record_wheres[index])
        entry["index"] = index
        report["records"].append(entry)
    report["ok"] = not report["errors"] and all(entry["ok"] for entry in report["records"])
    return report


def format_report(report):
    """The text `python -m calc job FILE` prints for a job_report (with "file" added)."""
    source = report.get("file") or "the file"
    lines = []
    job = report["job"]
    if job is not None:
        site = f" · site: {job['site']}" if job["site"] else ""
        lines.append(f"{source}: job {job['name']!r}{site} · {len(report['records'])} records, "
                     f"recomputed with Fluxbook {report['version']}")
    for error in report["errors"]:
        lines.append(f"{source}: {error['where']}: {error['message']}")
    for entry in report["records"]:
        note = f" — {entry['note']!r}" if entry["note"] else ""
        name = f"{entry['title']} ({entry['calculator']})" if entry["calculator"] else "record"
        lines += ["", f"{entry['index'] + 1}. {name}{note}"]
        if not entry["ok"]:
            lines.append("   not recomputed:")
            lines += [f"     {e['where']}: {e['message']}" for e in entry["errors"]]
            continue
        saved = entry["saved_verdict"]
        if saved is None:
            compared = "no saved result to compare"
        elif entry["differences"]:
            compared = "differs from the saved result"
        else:
            compared = "same as the saved result"
        saved_text = f" (saved: {VERDICT_WORDS[saved]})" if saved else ""
        lines.append(f"   verdict: {VERDICT_WORDS[entry['verdict']]}{saved_text} · {compared}")
        lines += [f"   {VERDICT_WORDS[c['status']]}: {c['message']}"
                  for c in entry["result"]["checks"] if c["status"] != "pass"]
        lines += [f"   {o['label']}: {o['display']}" for o in entry["result"]["outputs"].values()]
        lines += [f"   input {old!r} read as {new!r} (renamed since it was saved)"
                  for old, new in entry["renamed"]]
        lines += [f"   changed: {d['label']}: saved {d['saved'] or '(none)'}, now "
                  f"{d['now'] or '(none)'}" for d in entry["differences"]]
    done = sum(1 for entry in report["records"] if entry["ok"])
    total = len(report["records"])
    if job is None:
        summary = f"{source} was not read as a job"
    elif report["ok"]:
        summary = f"{done} of {total} records recomputed"
    else:
        file_errors = f"; {len(report['errors'])} errors in the file" if report["errors"] else ""
        summary = f"{done} of {total} records recomputed; {total - done} not{file_errors}"
    lines += ["", summary]
    return "\n".join(lines).lstrip("\n") + "\n"


# --- the browser's entry point ----------------------------------------------------------------

def format_info():
    """What the page needs to know of the file format and its limits."""
    return {"format": FORMAT, "schema": SCHEMA_VERSION, "fluxbook_version": __version__,
            "max_file_bytes": MAX_FILE_BYTES, "max_records": MAX_RECORDS}


CALLS = {
    "format": lambda argument: format_info(),
    "check_job": check_job_text,  # argument: the file's text
    "recheck": recheck,  # argument: one stored record
}


def call_json(name, argument_json):
    """JSON text in, JSON text out: the worker's entry point for job functions (CALLS by name).

    Never raises: an unknown name or unreadable argument comes back as {"ok": false, "errors"}.

    Examples
    --------
    >>> json.loads(call_json("format", "null"))["schema"]
    1
    >>> json.loads(call_json("shell", "null"))["errors"][0]["message"]
    "unknown job function 'shell'; known: format, check_job, recheck"
    """
    function = CALLS.get(name) if isinstance(name, str) else None
    if function is None:
        message = f"unknown job function {shorten(name)!r}; known: {', '.join(CALLS)}"
        return api.dumps({"ok": False, "errors": [_problem("call", message)]})
    try:
        argument = json.loads(argument_json)
    except (TypeError, ValueError) as error:
        return api.dumps({"ok": False, "errors": [_problem("call", f"not valid JSON ({error})")]})
    try:
        return api.dumps(function(argument))
    except Exception as error:  # a bug: say so plainly, never a traceback
        message = f"internal error in {name} ({type(error).__name__}); please report it"
        return api.dumps({"ok": False, "errors": [_problem("call", message)]})
