"""Reference: how the numbers are checked. For every registered calculator, the outside values
its tests hold — published table rows, worked examples (tests/vectors) and stored ngspice and
pandapower results (tests/reference_data) — recomputed with calc.api.run at build time.

A stored check is a record: {"calculator", "title", "inputs", "output", "reference", "unit",
"tolerance": {"rel", "abs"}, "why", and "source" or "produced_by"}. It passes when
|Fluxbook − reference| ≤ rel × |reference| + abs. The deviation shown is always the one measured
here, never a stored figure. The simulators are not needed: their answers are read from files.
"""

import html
import json
import math
from pathlib import Path
from typing import NamedTuple

from build.reference import GENERATED_NOTE, markdown_table
from calc import api

# Where the checks live: the repository's tests/ folder, beside this build/ folder.
TESTS_DIR = Path(__file__).resolve().parents[2] / "tests"
REFERENCE_DATA_DIR = TESTS_DIR / "reference_data"  # stored simulator results and table rows
VECTOR_DIR = TESTS_DIR / "vectors"  # worked examples, shared with the Pyodide tests
GENERATOR = "tests/reference_data/make_reference_data.py"

KIND_TABLE, KIND_EXAMPLE, KIND_SIMULATOR = "published table", "worked example", "simulator"
KINDS = (KIND_TABLE, KIND_EXAMPLE, KIND_SIMULATOR)


class StoredCheckError(ValueError):
    """A stored check that cannot be recomputed: unknown calculator, refused inputs, or an
    output the calculator no longer has. Never skipped: the page shows it and the tests fail."""


class Outcome(NamedTuple):
    ours: float  # recomputed now with calc.api.run
    reference: float  # the outside value, as stored
    deviation: float  # |ours − reference| / |reference| (absolute when the reference is 0)
    allowed: float  # rel × |reference| + abs [the output's unit]
    passed: bool
    unit: str  # the output's unit as the calculator reports it


def compare(check, run=api.run):
    """Recompute one stored check and measure it against its reference.

    Raises StoredCheckError naming the check, the calculator and the output when the check
    cannot be recomputed as stored.
    """
    calculator, output = check["calculator"], check["output"]
    where = f"{check.get('file', 'check')}: {calculator} {check['title']!r}"
    if calculator not in api.REGISTRY:
        raise StoredCheckError(f"{where}: no calculator {calculator!r} is registered")
    result = run(calculator, check["inputs"])
    if not result.get("ok"):
        problems = "; ".join(f"{e['field']}: {e['message']}" for e in result.get("errors", []))
        raise StoredCheckError(f"{where}: the calculator refused the stored inputs ({problems})")
    if output not in result["outputs"]:
        names = ", ".join(result["outputs"])
        raise StoredCheckError(f"{where}: the result has no output {output!r} (it has: {names}); "
                               "update the stored check or restore the output")
    ours = float(result["outputs"][output]["value"])
    reference = float(check["reference"])
    tolerance = check["tolerance"]
    allowed = tolerance.get("rel", 0.0) * abs(reference) + tolerance.get("abs", 0.0)
    error = abs(ours - reference)
    deviation = error / abs(reference) if reference else error
    unit = result["outputs"][output].get("unit") or check.get("unit", "")
    return Outcome(ours, reference, deviation, allowed, error <= allowed, unit)


def _read(path):
    return json.loads(path.read_text(encoding="utf-8"))


def stored_checks(directory=REFERENCE_DATA_DIR):
    """Every record of every JSON file in tests/reference_data, with its file, kind and source."""
    checks = []
    for path in sorted(Path(directory).glob("*.json")):
        data = _read(path)
        kind = data.get("kind", KIND_SIMULATOR)
        for record in data["records"]:
            check = dict(record, file=f"tests/reference_data/{path.name}", kind=kind)
            if kind == KIND_SIMULATOR:
                check["source"] = f"{record['produced_by']['program']}: " \
                                  f"{record['produced_by']['command']}"
            checks.append(check)
    return checks


def vector_checks(directory=VECTOR_DIR):
    """One check per expected output of every worked example in tests/vectors (error-path
    vectors test input messages, not numbers, and are left out)."""
    checks = []
    for path in sorted(Path(directory).glob("*.json")):
        data = _read(path)
        for vector in data["vectors"]:
            for output, expected in vector.get("expect", {}).items():
                checks.append({"calculator": data["calculator"], "title": vector["name"],
                               "inputs": vector["inputs"], "output": output,
                               "reference": expected, "unit": "",
                               "tolerance": {"rel": vector["rel"], "abs": 0.0},
                               "why": "the vector's own tolerance: the precision of its source",
                               "source": vector["source"], "kind": KIND_EXAMPLE,
                               "file": f"tests/vectors/{path.name}"})
    return checks


def all_checks():
    return vector_checks() + stored_checks()


def evaluate(checks, run=api.run):
    """[(check, Outcome or StoredCheckError)] — a check that cannot run is reported, not
    dropped."""
    evaluated = []
    for check in checks:
        try:
            evaluated.append((check, compare(check, run)))
        except StoredCheckError as error:
            evaluated.append((check, error))
    return evaluated


# ---- the page ----------------------------------------------------------------------------------

def _number(value):
    if value == 0 or not math.isfinite(value):
        return f"{value:g}"
    return f"{value:.6g}"


def _deviation(check, outcome):
    if isinstance(outcome, StoredCheckError):
        return "not computed"
    if outcome.reference:
        return f"{outcome.deviation:.1e}"
    return f"{outcome.deviation:.1e} {outcome.unit}".strip()


def _tolerance(check):
    rel, abs_ = check["tolerance"].get("rel", 0.0), check["tolerance"].get("abs", 0.0)
    parts = ([f"rel {rel:.0e}"] if rel else []) + \
        ([f"± {_number(abs_)} {check.get('unit', '')}".strip()] if abs_ else [])
    return " + ".join(parts) or "exact"


def _status(outcome):
    if isinstance(outcome, StoredCheckError):
        return "✗ " + str(outcome).split(": ", 2)[-1]
    return "✓" if outcome.passed else "✗ outside"


def _cell(text):
    return str(text).replace("|", "\\|").replace("\n", " ")


def _rows(evaluated):
    """Each check's cells as plain text, in HEADER's order."""
    rows = []
    for check, outcome in evaluated:
        computed = not isinstance(outcome, StoredCheckError)
        unit = outcome.unit if computed else check.get("unit", "")
        rows.append([check["title"], check["output"],
                     f"{_number(float(check['reference']))} {unit}".strip(),
                     f"{_number(outcome.ours)} {unit}".strip() if computed else "—",
                     _deviation(check, outcome), _tolerance(check), _status(outcome)])
    return rows


HEADER = ["Check", "Output", "Reference", "Fluxbook now", "Deviation", "Tolerance", ""]
# The page's largest part is these tables (some 640 rows), so they are written as compact HTML
# rather than Markdown: a check comparing several outputs names its case once (rowspan), and
# the figures' right alignment comes from the .fb-verify rule in fluxbook.css, not each cell.
TABLE_CLASS = "fb-verify"


def checks_table(rows):
    """The rows of _rows as one HTML table; consecutive rows of one case share its cell."""
    lines = ["<thead><tr>" + "".join(f"<th>{html.escape(h)}</th>" for h in HEADER) + "</tr></thead><tbody>"]
    for i, row in enumerate(rows):
        if i and row[0] == rows[i - 1][0]:
            first = ""  # spanned by the case's first row
        else:
            span = 1
            while i + span < len(rows) and rows[i + span][0] == row[0]:
                span += 1
            first = f'<td rowspan="{span}">' if span > 1 else "<td>"
            first += html.escape(row[0]) + "</td>"
        cells = [f"<code>{html.escape(row[1])}</code>", *map(html.escape, row[2:])]
        lines.append(f"<tr>{first}" + "".join(f"<td>{cell}</td>" for cell in cells) + "</tr>")
    # The theme wraps (and scrolls) a table without a class: the class goes on a div around it.
    return f'<div class="{TABLE_CLASS}"><table>\n' + "\n".join(lines) + "\n</tbody></table></div>"


def _worst(evaluated):
    """(worst deviation as a share of its tolerance, failures) over computed checks."""
    share, failures = 0.0, 0
    for _, outcome in evaluated:
        if isinstance(outcome, StoredCheckError) or not outcome.passed:
            failures += 1
            continue
        if outcome.allowed:
            share = max(share, abs(outcome.ours - outcome.reference) / outcome.allowed)
    return share, failures


def _sources(evaluated):
    """Markdown: the sources of one table's checks, each once. A file or a tolerance that every
    check shares (a calculator's vector file, "the vector's own tolerance") is said once."""
    checks = [check for check, _ in evaluated]
    shared = {key: checks[0][key] for key in ("file", "why") if len({c[key] for c in checks}) == 1}
    lead = "; ".join(part for part in (shared.get("file"), shared.get("why") and
                                       f"tolerance: {shared['why']}") if part)
    seen = []
    for check in checks:
        text = check["source"]
        if "file" not in shared:
            text += f" ({check['file']})"
        if "why" not in shared:
            text += f"; tolerance: {check['why']}"
        if text not in seen:
            seen.append(text)
    heading = f"Sources and tolerances ({lead}):" if lead else "Sources and tolerances:"
    return heading + "\n\n" + "\n".join(f"- {_cell(text)}" for text in seen)


def verification_page(team_config):
    evaluated = evaluate(all_checks())
    by_calculator = {c.id: {kind: [] for kind in KINDS} for c in api.REGISTRY.values()}
    for check, outcome in evaluated:
        by_calculator.setdefault(check["calculator"], {kind: [] for kind in KINDS})
        by_calculator[check["calculator"]][check["kind"]].append((check, outcome))
    summary, sections = [], []
    for calculator in api.REGISTRY.values():
        groups = by_calculator[calculator.id]
        share, failures = _worst([item for kind in KINDS for item in groups[kind]])
        summary.append([f"[{calculator.title}](#{calculator.id})", *(len(groups[k]) for k in KINDS),
                        f"{share:.2f}", "all within" if not failures else f"**{failures} not**"])
        parts = [f"## {calculator.title} {{#{calculator.id}}}"]
        if not groups[KIND_SIMULATOR]:
            parts.append("*No simulator comparison: its numbers rest on the published tables "
                         "and worked examples below, and on the unit tests of its formulas.*")
        for kind, heading in ((KIND_TABLE, "Published table rows"),
                              (KIND_EXAMPLE, "Worked examples"),
                              (KIND_SIMULATOR, "Simulator results")):
            if groups[kind]:
                parts.append(f"### {heading}")
                parts.append(checks_table(_rows(groups[kind])))
                parts.append(_sources(groups[kind]))
        sections.append("\n\n".join(parts))
    without = [c.title for c in api.REGISTRY.values()
               if not by_calculator[c.id][KIND_SIMULATOR]]
    unknown = sorted(set(by_calculator) - set(api.REGISTRY))
    counts = {kind: sum(len(by_calculator[c][kind]) for c in by_calculator) for kind in KINDS}
    return "\n\n".join([
        "# How the numbers are checked",
        GENERATED_NOTE,
        "Every calculator is held to values from outside Fluxbook: rows of published tables, "
        "worked examples from textbooks, standards and articles, and results of two independent "
        "programs — the circuit simulator ngspice and the power-system package pandapower — on "
        "the same circuits. This page recomputes each of them with the calculators now, as the "
        "site was built, and shows how far Fluxbook's answer lies from the outside value. The "
        "deviation is relative (|Fluxbook − reference| / |reference|) unless a unit is shown. A "
        "check passes when the difference is within its tolerance, which says how precise the "
        "source is; the same checks run in the test suite, so a release cannot ship with one "
        "outside.",
        f"In all: {counts[KIND_TABLE]} published table rows, {counts[KIND_EXAMPLE]} worked-"
        f"example values and {counts[KIND_SIMULATOR]} stored simulator results.",
        "## Summary",
        markdown_table(["Calculator", "Table rows", "Worked examples", "Simulator results",
                        "Worst deviation / tolerance", "Within tolerance"], summary, "lrrrrl"),
        "**No simulator comparison** (their checks are published values and worked examples "
        "only): " + (", ".join(without) + "." if without else "none."),
        *([f"**Checks naming unregistered calculators:** {', '.join(unknown)}."]
          if unknown else []),
        "## Where the simulator results come from",
        "The simulators are not needed to build this site. Their answers are stored as JSON in "
        "`tests/reference_data/`, one record a comparison, each with the calculator, its inputs, "
        "the output compared, the simulator's value, the tolerance and why, and the program, "
        "version and command that produced it. They were produced by "
        f"`.venv/bin/python {GENERATOR}` with ngspice from Debian and pandapower from PyPI; "
        "rerun it after changing a case or a simulator and review the difference. Each case is "
        "built from the calculator's inputs with textbook relations, not with Fluxbook's code.",
        *sections,
    ]) + "\n"


PAGES = {"reference/verification.md": verification_page}
