"""The command line: python -m calc list | describe ID | run ID (--json '{...}' | name=value ...).

Prints JSON (usage text for --help). Exit 0 on a result, 2 on any error (bad arguments
included), never a traceback. Omitted inputs take the defaults of the team's region: the
`--region` option, else `region:` in the team file (FLUXBOOK_TEAM_FILE, or team.yml in the
current folder), else North American practice.
"""

import json
import os
import re
import sys
from pathlib import Path

from calc import api, jobs
from calc.spec import REGIONS
from calc.units import DISPLAY_SYSTEMS

USAGE = (
    "usage: python -m calc [--region na|iec] list\n"
    "       python -m calc [--region na|iec] describe ID\n"
    "       python -m calc [--region na|iec] run ID --json '{\"name\": value, ...}'\n"
    "       python -m calc [--region na|iec] run ID name=value [name=value ...]\n"
    "       python -m calc [--region na|iec] job FILE.json [--json]\n"
    "       python -m calc [--region na|iec] batch FILE.csv [--calculator ID] [--json | --csv]\n"
    "--region: whose defaults omitted inputs take (default: team.yml's region, else na)\n"
    "--units na|iec: the unit system of shown values and steps (ft, Ω/kft, kcmil or m, Ω/km,\n"
    "  mm²; default: the region's); values stay SI"
)

# team.yml's top-level `region: na` line. The file is YAML, but the command line needs only
# this one key and calc/ stays standard-library only, so it reads that line and nothing else.
_REGION_LINE = re.compile(r"^region\s*:\s*[\"']?([A-Za-z]+)[\"']?\s*(#.*)?$", re.MULTILINE)


def team_region(environ=None, cwd=None):
    """The region in the team file, or None when there is no file or no region line."""
    environ = os.environ if environ is None else environ
    path = Path(environ.get("FLUXBOOK_TEAM_FILE") or Path(cwd or os.getcwd()) / "team.yml")
    try:
        text = path.read_text(encoding="utf-8")
    except (OSError, UnicodeDecodeError):
        return None
    match = _REGION_LINE.search(text)
    return match.group(1).lower() if match else None


def _take_option(argv, option, allowed):
    """(value or None, argv without `--option VALUE` / `--option=VALUE`); ValueError for a bad
    or missing value."""
    rest, chosen = [], None
    flag = f"--{option}"
    args = iter(argv)
    for arg in args:
        if arg == flag or arg.startswith(flag + "="):
            value = arg.partition("=")[2] if "=" in arg else next(args, None)
            if value not in allowed:
                raise ValueError(f"{flag} takes one of {', '.join(allowed)}, not {value!r}")
            chosen = value
        else:
            rest.append(arg)
    return chosen, rest


def _usage_error(message, calculator=None):
    return {
        "ok": False,
        "calculator": calculator,
        "errors": [{"field": None, "value": None, "message": f"{message}\n{USAGE}"}],
    }


def _parse_pairs(pairs):
    inputs = {}
    for pair in pairs:
        name, sep, value = pair.partition("=")
        if not sep or not name:
            raise ValueError(f"{pair!r} is not name=value")
        inputs[name.strip()] = value
    return inputs


def main(argv=None):
    """Run the command line with `argv` (default sys.argv[1:]); return the exit status."""
    argv = sys.argv[1:] if argv is None else list(argv)
    if argv and argv[0] in ("-h", "--help", "help"):
        sys.stdout.write(USAGE + "\n")
        return 0
    try:
        region, argv = _take_option(argv, "region", REGIONS)
        display, argv = _take_option(argv, "units", DISPLAY_SYSTEMS)
        region = region or team_region()
        if region is not None and region not in REGIONS:
            raise ValueError(f"the team file's region {region!r} is not one of "
                             f"{', '.join(REGIONS)}")
    except ValueError as error:
        payload, status = _usage_error(str(error)), 2
    else:
        if argv and argv[0] == "job":  # prints text by default, so it writes its own output
            return job_command(argv[1:], region)
        if argv and argv[0] == "batch":  # streams one line a row, so it writes its own output
            return batch_command(argv[1:], region, display or region)
        payload, status = _dispatch(argv, region, display or region)
    text = api.dumps(payload, indent=2)
    stream = sys.stdout
    try:
        stream.write(text + "\n")
    except UnicodeEncodeError:  # a terminal that cannot show µ or Ω still gets valid JSON
        stream.write(json.dumps(payload, allow_nan=False, ensure_ascii=True, indent=2) + "\n")
    return status


def _dispatch(argv, region=None, display=None):
    if not argv:
        return _usage_error("no command given"), 2
    command, rest = argv[0], argv[1:]
    if command == "list" and not rest:
        return api.list_calculators(), 0
    if command == "describe" and len(rest) == 1:
        try:
            return api.describe(rest[0]), 0
        except api.InputError as error:
            return {"ok": False, "calculator": rest[0], "errors": [error.as_dict()]}, 2
    if command == "run" and rest:
        calculator_id, args = rest[0], rest[1:]
        if args and args[0] == "--json":
            if len(args) != 2:
                return _usage_error("--json takes one JSON object", calculator_id), 2
            try:
                inputs = json.loads(args[1])
            except ValueError as error:
                return _usage_error(f"--json is not valid JSON ({error})", calculator_id), 2
            result = api.run(calculator_id, inputs, region, display)
        else:
            try:
                inputs = _parse_pairs(args)
            except ValueError as error:
                return _usage_error(str(error), calculator_id), 2
            result = api.run(calculator_id, inputs, region, display)
        return result, 0 if result["ok"] else 2
    return _usage_error(f"cannot read the command {' '.join(argv)!r}"), 2


def job_command(args, region=None):
    """`job FILE.json [--json]`: recompute every record of an exported job (calc.jobs) and print
    each with its verdict and any difference from the saved result. Exit 0 when every record
    recomputes, 2 otherwise (the errors named)."""
    as_json = "--json" in args
    files = [arg for arg in args if arg != "--json"]
    if len(files) != 1 or files[0].startswith("-"):
        report = {"ok": False, "job": None, "records": [], "version": None, "errors": [
            {"where": "command", "kind": "file", "message": "job takes one FILE.json, and --json "
             "for JSON output\n" + USAGE}]}
    else:
        try:
            report = jobs.job_report(Path(files[0]).read_bytes(), region)
        except OSError as error:
            report = {"ok": False, "job": None, "records": [], "version": None, "errors": [
                {"where": "file", "kind": "file",
                 "message": f"cannot read {files[0]}: {error.strerror or error}"}]}
        report["file"] = files[0]
    text = api.dumps(report, indent=2) + "\n" if as_json else jobs.format_report(report)
    try:
        sys.stdout.write(text)
    except UnicodeEncodeError:  # a terminal that cannot show µ or Ω
        sys.stdout.write(text.encode("ascii", "backslashreplace").decode("ascii"))
    return 0 if report["ok"] else 2


def batch_command(args, region=None, display=None):
    """`batch FILE.csv [--calculator ID] [--json | --csv]`: run a calculator (circuit-check
    unless named) over every row of a CSV or tab-separated file, printing each row as it is
    checked: a line of text (row, circuit, verdict, governing check, fix), one JSON object
    (--json) or a CSV line (--csv); then a summary on stderr. Exit 0 when every row computed,
    2 when a row or the file was rejected (named)."""
    from calc import batch  # the schedule reader: only this command needs it

    options, files, calculator_id, problem = set(), [], batch.DEFAULT_CALCULATOR, None
    args = iter(args)
    for arg in args:
        if arg in ("--json", "--csv"):
            options.add(arg)
        elif arg == "--calculator" or arg.startswith("--calculator="):
            calculator_id = arg.partition("=")[2] if "=" in arg else next(args, "")
        elif arg.startswith("-"):
            problem = f"unknown option {arg!r}"
        else:
            files.append(arg)
    if len(files) != 1 or len(options) > 1 or problem:
        problem = problem or ("--json and --csv are alternatives" if len(options) > 1 else
                              "batch takes one FILE.csv")
    elif calculator_id not in api.REGISTRY:
        problem = f"unknown calculator {calculator_id!r}; known: {', '.join(api.REGISTRY)}"
    if problem:
        sys.stderr.write(f"{problem}\n{USAGE}\n")
        return 2
    counts, rejected = {}, []
    render = (batch.json_line if "--json" in options else
              batch.CsvLine(calculator_id) if "--csv" in options else batch.format_line)
    try:
        with open(files[0], encoding="utf-8-sig", newline="") as handle:
            if "--csv" in options:
                _write(",".join(render.header))
            rows = batch.read_rows(handle, calculator_id)
            for record in batch.run_rows(calculator_id, rows, region, render=render,
                                         display=display):
                if record["ok"]:
                    counts[record["verdict"]] = counts.get(record["verdict"], 0) + 1
                else:
                    rejected.append(record["row"])
                _write(record["text"])
    except BrokenPipeError:  # the reader stopped (| head): stop quietly
        os.dup2(os.open(os.devnull, os.O_WRONLY), sys.stdout.fileno())
        return 2 if rejected else 0
    except OSError as error:
        sys.stderr.write(f"cannot read {files[0]}: {error.strerror or error}\n")
        return 2
    except (batch.ScheduleError, UnicodeDecodeError) as error:
        sys.stderr.write(f"{files[0]}: {error}\n")
        return 2
    sys.stderr.write(batch.summary(counts, rejected) + "\n")
    return 2 if rejected else 0


def _write(line):
    try:
        sys.stdout.write(line + "\n")
    except UnicodeEncodeError:  # a terminal that cannot show µ or Ω
        sys.stdout.write(line.encode("ascii", "backslashreplace").decode("ascii") + "\n")


if __name__ == "__main__":
    sys.exit(main())
