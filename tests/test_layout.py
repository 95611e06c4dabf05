"""The package's layout holds: one module a calculator, physics apart from views, modules of a
readable size, output names that say what they hold (issue 10)."""

import ast
import importlib
import inspect
import re

import pytest

from build import paths
from calc import api

CALC_DIR = paths.ROOT / "calc"
CALCULATOR_DIR = CALC_DIR / "calculators"

# The domain modules: physics and published tables only (STYLE.md).
PHYSICS_MODULES = (
    "electrical", "conductors", "voltage_drop", "line_loss", "transformers", "induction_motors",
    "dc_motors", "protection", "rlc", "power_factor", "network", "ampacity",
)
# Modules around the calculators, neither physics nor views.
FRAMEWORK_MODULES = ("__init__", "__main__", "api", "spec", "units", "errors", "cautions", "jobs",
                     "batch")

MAX_MODULE_LINES = 900  # a newcomer reads a module whole


def module_name(calculator_id):
    return calculator_id.replace("-", "_")


@pytest.mark.parametrize("calculator_id", list(api.REGISTRY))
def test_every_calculator_has_exactly_its_own_module(calculator_id):
    calculator = api.REGISTRY[calculator_id]
    expected = f"calc.calculators.{module_name(calculator_id)}"
    assert calculator.compute.__module__ == expected
    module = importlib.import_module(expected)
    assert module.CALCULATOR is calculator


def test_calculator_modules_are_the_registry_and_nothing_else():
    modules = {p.stem for p in CALCULATOR_DIR.glob("*.py") if not p.stem.startswith("_")}
    assert modules == {module_name(c) for c in api.REGISTRY}


def test_top_level_modules_are_physics_or_framework():
    modules = {p.stem for p in CALC_DIR.glob("*.py")}
    assert modules == set(PHYSICS_MODULES) | set(FRAMEWORK_MODULES)


@pytest.mark.parametrize("path", sorted(CALC_DIR.rglob("*.py")), ids=lambda p: p.name)
def test_no_module_is_over_the_size_limit(path):
    lines = len(path.read_text(encoding="utf-8").splitlines())
    assert lines <= MAX_MODULE_LINES, f"{path.relative_to(paths.ROOT)} has {lines} lines"


def _imports(tree):
    for node in ast.walk(tree):
        if isinstance(node, ast.Import):
            yield from (alias.name for alias in node.names)
        elif isinstance(node, ast.ImportFrom):
            yield node.module or ""
            yield from (f"{node.module}.{alias.name}" for alias in node.names)


@pytest.mark.parametrize("name", PHYSICS_MODULES)
def test_physics_modules_know_nothing_of_forms(name):
    source = (CALC_DIR / f"{name}.py").read_text(encoding="utf-8")
    imported = set(_imports(ast.parse(source)))
    assert not {"calc.spec", "calc.api", "calc.calculators"} & {i.rsplit(".", 1)[0] for i in imported}
    assert not any(i.startswith(("calc.spec", "calc.calculators", "calc.api")) for i in imported)
    assert "calc.errors.InputError" not in imported, "a physics error names no form field"


def _public_functions(module):
    return [
        (name, item) for name, item in vars(module).items()
        if inspect.isfunction(item) and item.__module__ == module.__name__
        and not name.startswith("_")
    ]


def _all_public_functions():
    found = []
    for name in PHYSICS_MODULES:
        try:
            module = importlib.import_module(f"calc.{name}")
        except ModuleNotFoundError:
            found.append((name, "(module missing)", None))
            continue
        found += [(name, fn_name, fn) for fn_name, fn in _public_functions(module)]
    return found


PUBLIC_FUNCTIONS = _all_public_functions()


@pytest.mark.parametrize(
    "function", PUBLIC_FUNCTIONS, ids=[f"{m}.{f}" for m, f, _ in PUBLIC_FUNCTIONS])
def test_public_physics_functions_have_numpydoc(function):
    """Parameters with [unit] for numbers, Returns, Notes (the formula) and References."""
    _, _, fn = function
    assert fn is not None, "the physics module is missing"
    doc = inspect.getdoc(fn) or ""
    sections = set(re.findall(r"^(\w[\w ]*)\n-{3,}$", doc, flags=re.MULTILINE))
    needed = {"Returns", "Notes", "References"}
    params = [p for p in inspect.signature(fn).parameters.values()
              if p.kind not in (p.VAR_POSITIONAL, p.VAR_KEYWORD)]
    if params:
        needed.add("Parameters")
    assert needed <= sections, f"missing {sorted(needed - sections)}"
    if not params:
        return
    block = re.split(r"^\w[\w ]*\n-{3,}$", doc.split("Parameters\n----------\n", 1)[1],
                     flags=re.MULTILINE)[0]
    entries = dict(re.findall(r"^(\w+(?:, \w+)*) : (.*(?:\n    .*)*)", block, flags=re.MULTILINE))
    documented = {name for names in entries for name in names.split(", ")}
    missing = [p.name for p in params if p.name not in documented]
    assert not missing, f"Parameters does not describe {missing}"
    for names, text in entries.items():
        kind = text.split("\n", 1)[0]
        if re.match(r"(float|array)", kind):
            assert re.search(r"\[[^\]]+\]", text), f"{names}: a number's description gives its [unit]"


# Unit words an output name may end a token with, and the SI unit each one must then hold.
UNIT_TOKENS = {
    "a": "A", "v": "V", "w": "W", "va": "VA", "var": "var", "pct": "%", "ohm": "Ω", "hz": "Hz",
    "s": "s", "j": "J",
}
# Prefixed and non-SI units: a value in the contract is never in these, so a name never says them.
NEVER_TOKENS = {
    "kva", "kvar", "kw", "kwh", "mva", "mvar", "mw", "mwh", "kv", "ka", "ma", "mv", "mh", "uh",
    "uf", "nf", "ms", "us", "km", "mm", "mm2", "kcmil", "awg", "hp", "ft", "kft", "kohm", "mohm",
    "rpm", "degc", "degf", "pu",
}


@pytest.mark.parametrize("calculator_id", list(api.REGISTRY))
def test_output_names_say_what_they_hold(calculator_id):
    """An output whose name carries a unit holds that unit; prefixed units are never named."""
    for output in api.REGISTRY[calculator_id].outputs:
        tokens = output.name.lower().split("_")
        wrong = NEVER_TOKENS & set(tokens)
        assert not wrong, f"{output.name} names {wrong} but holds {output.unit!r}"
        for token in tokens:
            if token in UNIT_TOKENS:
                assert output.unit == UNIT_TOKENS[token], (
                    f"{output.name} names {token!r} but holds {output.unit!r}")


def test_the_output_name_rule_rejects_what_it_should():
    # The rule itself, on names it must refuse: kva holding VA, _a holding V.
    def refused(name, unit):
        tokens = name.split("_")
        return bool(NEVER_TOKENS & set(tokens)) or any(
            t in UNIT_TOKENS and UNIT_TOKENS[t] != unit for t in tokens)
    assert refused("kva", "VA") and refused("kvar", "var") and refused("kva_before", "VA")
    assert refused("drop_a", "V") and refused("size", "m²") is False
    assert not refused("capacitor_q", "var") and not refused("fault_ln_a", "A")


def _documented_units(fn):
    """{parameter: the [unit] its numpydoc description gives, or None}."""
    doc = inspect.getdoc(fn) or ""
    if "Parameters\n----------\n" not in doc:
        return {}
    block = re.split(r"^\w[\w ]*\n-{3,}$", doc.split("Parameters\n----------\n", 1)[1],
                     flags=re.MULTILINE)[0]
    found = {}
    for names, text in re.findall(r"^(\w+(?:, \w+)*) : (.*(?:\n    .*)*)", block, flags=re.MULTILINE):
        brackets = re.findall(r"\[([^\]]+)\]", text)
        listed = names.split(", ")
        if len(brackets) == len(listed) > 1:  # "r, l, c : float" / "... [Ω], ... [H] and ... [F]"
            found.update(zip(listed, brackets))
            continue
        for name in listed:
            found[name] = brackets[0] if brackets else None
    return found


def test_physics_parameters_follow_the_nomenclature_page():
    """A parameter named as a quantity on the nomenclature page is documented in its unit."""
    from build.reference.nomenclature import QUANTITIES
    unit_of = {name: unit for name, unit, _ in QUANTITIES}
    wrong = []
    for module_name, fn_name, fn in PUBLIC_FUNCTIONS:
        if fn is None:
            continue
        for parameter, unit in _documented_units(fn).items():
            expected = unit_of.get(parameter)
            if expected and expected != "-" and unit is not None and unit != expected:
                wrong.append(f"{module_name}.{fn_name}({parameter}) [{unit}], page [{expected}]")
    assert not wrong, wrong


def test_names_shared_by_domains_are_on_the_nomenclature_page():
    """A parameter name two physics modules both use is one quantity: the page names it."""
    from build.reference.nomenclature import QUANTITIES
    listed = {name for name, _, _ in QUANTITIES}
    modules_using = {}
    for module_name, _, fn in PUBLIC_FUNCTIONS:
        if fn is not None:
            for parameter in _documented_units(fn):
                modules_using.setdefault(parameter, set()).add(module_name)
    shared = {name for name, modules in modules_using.items() if len(modules) > 1}
    assert shared - listed == set(), sorted(shared - listed)
