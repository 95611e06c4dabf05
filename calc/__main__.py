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

USAGE = (
    "usage: python -m calc [--region na|iec] list\n"
    "       python -m calc [--region na|iec] describe ID\n"
    "       python -m calc [--region na|iec] run ID --json '{\"name\": value, ...}'\n"
    "       python -m calc [--region na|iec] run ID name=value [name=value ...]\n"
    "       python -m calc [--region na|iec] job FILE.json [--json]\n"
    "--region: whose defaults omitted inputs take (default: team.yml's region, else na)"
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


def _take_region(argv):
    """(region or None, argv without the option); ValueError for a bad or missing value."""
    rest, region = [], None
    args = iter(argv)
    for arg in args:
        if arg == "--region" or arg.startswith("--region="):
            value = arg.partition("=")[2] if "=" in arg else next(args, None)
            if value not in REGIONS:
                raise ValueError(f"--region takes one of {', '.join(REGIONS)}, not {value!r}")
            region = value
        else:
            rest.append(arg)
    return region, rest


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
        region, argv = _take_region(argv)
        region = region or team_region()
        if region is not None and region not in REGIONS:
            raise ValueError(f"the team file's region {region!r} is not one of "
                             f"{', '.join(REGIONS)}")
    except ValueError as error:
        payload, status = _usage_error(str(error)), 2
    else:
        if argv and argv[0] == "job":  # prints text by default, so it writes its own output
            return job_command(argv[1:], region)
        payload, status = _dispatch(argv, region)
    text = api.dumps(payload, indent=2)
    stream = sys.stdout
    try:
        stream.write(text + "\n")
    except UnicodeEncodeError:  # a terminal that cannot show µ or Ω still gets valid JSON
        stream.write(json.dumps(payload, allow_nan=False, ensure_ascii=True, indent=2) + "\n")
    return status


def _dispatch(argv, region=None):
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
            result = api.run(calculator_id, inputs, region)
        else:
            try:
                inputs = _parse_pairs(args)
            except ValueError as error:
                return _usage_error(str(error), calculator_id), 2
            result = api.run(calculator_id, inputs, region)
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


if __name__ == "__main__":
    sys.exit(main())
