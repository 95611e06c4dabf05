"""The command line: python -m calc list | describe ID | run ID (--json '{...}' | name=value ...).

Prints JSON (usage text for --help). Exit 0 on a result, 2 on any error (bad arguments included), never a traceback.
"""

import json
import sys

from calc import api

USAGE = (
    "usage: python -m calc list\n"
    "       python -m calc describe ID\n"
    "       python -m calc run ID --json '{\"name\": value, ...}'\n"
    "       python -m calc run ID name=value [name=value ...]"
)


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
    payload, status = _dispatch(argv)
    text = api.dumps(payload, indent=2)
    stream = sys.stdout
    try:
        stream.write(text + "\n")
    except UnicodeEncodeError:  # a terminal that cannot show µ or Ω still gets valid JSON
        stream.write(json.dumps(payload, allow_nan=False, ensure_ascii=True, indent=2) + "\n")
    return status


def _dispatch(argv):
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
            result = json.loads(api.run_json(calculator_id, args[1]))
        else:
            try:
                inputs = _parse_pairs(args)
            except ValueError as error:
                return _usage_error(str(error), calculator_id), 2
            result = api.run(calculator_id, inputs)
        return result, 0 if result["ok"] else 2
    return _usage_error(f"cannot read the command {' '.join(argv)!r}"), 2


if __name__ == "__main__":
    sys.exit(main())
