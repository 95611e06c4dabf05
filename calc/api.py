"""The one calculator registry and the contract around it: list, describe, run and run_json.

Everything the page, the command line, share links and scripts do goes through here, so input
checking, output formatting and the guarantee of finite numbers live in one place.
"""

import json
import math

from calc import __version__, units
from calc.calculators import CALCULATORS
from calc.calculators._summary import summary_outputs
from calc.errors import CalcError, InputError, InputErrors, UnitError, shorten
from calc.spec import REGIONS

REGISTRY = {calculator.id: calculator for calculator in CALCULATORS}

_TRUE = ("yes", "true", "on", "1")
_FALSE = ("no", "false", "off", "0")


def list_calculators():
    """[{"id", "title", "summary", "group"}] for every registered calculator."""
    return [
        {"id": c.id, "title": c.title, "summary": c.summary, "group": c.group}
        for c in REGISTRY.values()
    ]


def get(calculator_id):
    """The registered Calculator for `calculator_id`, or InputError naming the valid ids."""
    try:
        return REGISTRY[calculator_id]
    except (KeyError, TypeError):
        known = ", ".join(sorted(REGISTRY))
        raise InputError(
            None, calculator_id, f"unknown calculator {shorten(calculator_id)!r}; known: {known}"
        ) from None


def describe(calculator_id):
    """The calculator's spec as the form builder and the CLI's `describe` use it."""
    calculator = get(calculator_id)
    return {
        "id": calculator.id,
        "title": calculator.title,
        "summary": calculator.summary,
        "group": calculator.group,
        "inputs": [_describe_input(item) for item in calculator.inputs],
        "outputs": [
            {"name": o.name, "label": o.label, "unit": o.unit} for o in calculator.outputs
        ],
        "summary": list(summary_outputs(calculator)),
    }


def _describe_input(item):
    entry = {
        "name": item.name,
        "label": item.label,
        "kind": item.kind,
        "unit": item.unit,
        "default": item.default,
        "help": item.help,
        "optional": item.optional,
    }
    if item.kind == "quantity":
        entry["units"] = units.units_for(units.dimension_of(item.unit))
        entry["unit_hint"] = unit_hint(item)
        entry["min"] = item.minimum
        entry["max"] = item.maximum
        entry["min_exclusive"] = item.min_exclusive
        entry["max_exclusive"] = item.max_exclusive
    if item.kind == "choice":
        entry["choices"] = [{"value": token, "label": label} for token, label in item.choices]
    if item.kind == "text" and item.suggestions:
        entry["suggestions"] = list(item.suggestions)
    if item.kind == "size":
        entry["choices"] = [
            {"value": label, "label": label}
            for label in units.AWG_SIZES + units.KCMIL_SIZES + units.METRIC_SIZES
        ]
    if item.region_defaults:
        entry["region_defaults"] = dict(item.region_defaults)
    if item.suggest:
        entry["suggest"] = item.suggest
    if item.advanced:
        entry["advanced"] = True
    if item.group:
        entry["group"] = item.group
    return entry


class Inputs(dict):
    """Validated inputs (name -> SI value) as a calculator's `compute` receives them, with
    `typed_units`: for each quantity given as text, the unit symbol the user typed ("hp",
    "ft"), so a view can tell a motor's "10 hp" from an electrical "7.5 kW"."""

    def __init__(self, *args, typed_units=None, **kwargs):
        super().__init__(*args, **kwargs)
        self.typed_units = dict(typed_units or {})


def default_for(item, region=None):
    """The value an omitted input takes: the region's default where it has one, else `default`
    (North American practice)."""
    if region is not None:
        return item.region_defaults.get(region, item.default)
    return item.default


def validate(calculator, inputs, region=None):
    """Check and convert raw inputs (numbers or text) into the values `compute` receives.

    Omitted inputs take the default of `region` ("na" or "iec"; None is North American).
    Raises InputErrors listing every wrong field, including names the calculator does not have.
    """
    if region is not None and region not in REGIONS:
        raise InputErrors([InputError(None, region, f"region {region!r} is not one of: "
                                      + ", ".join(REGIONS))])
    if not isinstance(inputs, dict):
        raise InputErrors([InputError(None, inputs, "inputs must be an object of name: value")])
    errors = []
    names = {item.name for item in calculator.inputs}
    for name in inputs:
        if name not in names:
            allowed = ", ".join(item.name for item in calculator.inputs)
            errors.append(
                InputError(name, inputs[name],
                           f"unknown input {shorten(name)!r}; inputs are: {allowed}")
            )
    values = Inputs()
    given_groups = {item.group for item in calculator.inputs
                    if item.group and not _is_blank(inputs.get(item.name))}
    for item in calculator.inputs:
        if item.name in inputs:
            raw = inputs[item.name]
        elif item.group in given_groups:
            raw = None  # an alternative of this input was given: no default competes with it
        else:
            raw = default_for(item, region)
        try:
            values[item.name] = _convert(item, raw)
        except InputError as error:
            errors.append(error)
            continue
        if item.kind == "quantity" and values[item.name] is not None:
            values.typed_units[item.name] = units.typed_unit(raw, item.unit)
    if errors:
        raise InputErrors(errors)
    return values


def _is_blank(raw):
    return raw is None or (isinstance(raw, str) and not raw.strip())


# Longest text any input takes; longer text is refused before it is read, and never echoed whole.
MAX_TEXT_CHARS = 200


def _convert(item, raw):
    if isinstance(raw, str) and len(raw) > MAX_TEXT_CHARS:
        raise InputError(item.name, raw, f"{len(raw)} characters is too long for "
                         f"{item.label} (at most {MAX_TEXT_CHARS}); {_allowed(item)}")
    if _is_blank(raw):
        if item.optional:
            return None
        raise InputError(item.name, raw, f"{item.label} is required; {_allowed(item)}")
    try:
        if item.kind == "quantity":
            value = units.to_si(raw, item.unit)
            _check_limits(item, raw, value)
            return value
        if item.kind == "size":
            return units.parse_conductor_size(raw)
    except UnitError as error:
        raise InputError(item.name, raw, f"{error}") from None
    if item.kind == "text":
        text = str(raw).strip()
        if len(text) > 80:
            raise InputError(item.name, raw, f"at most 80 characters; {_allowed(item)}")
        if item.check is not None:
            try:
                item.check(text)
            except (InputError, UnitError) as error:
                raise InputError(item.name, raw, getattr(error, "message", str(error))) from None
        return text
    if item.kind == "choice":
        token = str(raw).strip() if not isinstance(raw, bool) else None
        if isinstance(raw, float) and raw.is_integer():
            token = str(int(raw))
        if token not in item.tokens:
            raise InputError(item.name, raw, f"{raw!r} is not a choice; {_allowed(item)}")
        return token
    # flag
    if isinstance(raw, bool):
        return raw
    text = str(raw).strip().lower()
    if text in _TRUE:
        return True
    if text in _FALSE:
        return False
    raise InputError(item.name, raw, f"{raw!r} is not yes or no; {_allowed(item)}")


def _check_limits(item, raw, value):
    low = None if item.minimum is None else units.to_si(item.minimum, item.unit)
    high = None if item.maximum is None else units.to_si(item.maximum, item.unit)
    too_low = low is not None and (value <= low if item.min_exclusive else value < low)
    too_high = high is not None and (value >= high if item.max_exclusive else value > high)
    if too_low or too_high:
        shown = units.format_quantity(value, item.unit)
        raise InputError(item.name, raw, f"{shown} is out of range; {_allowed(item)}")


def _allowed(item):
    """The sentence that says what a field accepts."""
    if item.kind == "choice":
        return "choose one of: " + ", ".join(f"{t} ({label})" for t, label in item.choices)
    if item.kind == "size":
        return "enter a conductor size such as 12 AWG, 4/0, 250 kcmil or 2.5 mm2"
    if item.kind == "flag":
        return "enter yes or no"
    if item.kind == "text":
        return item.help or "enter a code"
    unit_list = unit_hint(item)
    parts = []
    if item.minimum is not None:
        parts.append(("greater than " if item.min_exclusive else "at least ") + _limit(item, "minimum"))
    if item.maximum is not None:
        parts.append(("less than " if item.max_exclusive else "at most ") + _limit(item, "maximum"))
    span = " and ".join(parts)
    return f"enter a value {span} ({unit_list})" if span else f"enter a value ({unit_list})"


def _limit(item, which):
    number = getattr(item, which)
    text = str(int(number)) if float(number).is_integer() else repr(float(number))
    return f"{text} {units.unit_symbol(item.unit)}".strip()  # 1000000 kVA, never 1e+06 kVA


def is_ratio(item):
    """A plain-number input that is a ratio (at most 1: pf, efficiency): "85 %" reads as 0.85."""
    return units.dimension_of(item.unit) == "dimensionless" and item.maximum is not None \
        and item.maximum <= 1


def unit_hint(item):
    """What a quantity input accepts, in words for its field and its messages: the units a
    number may carry ("V, kV, mV"), or for a plain number that it takes none (a ratio: or %)."""
    dimension = units.dimension_of(item.unit)
    if dimension == "dimensionless":
        return units.RATIO_HINT if is_ratio(item) else units.NUMBER_HINT
    return ", ".join(units.units_for(dimension))


def run(calculator_id, inputs, region=None, display=None):
    """Run a calculator on raw inputs and return the contract's result or error dict.

    Omitted inputs take the defaults of `region` ("na" or "iec"; None: North American).
    `display` ("na" or "iec"; None: calc.units.DISPLAY_UNITS) is the unit system of the texts:
    outputs' "display", method steps and messages; values stay SI. Lengths the caller gave with
    a unit come back in that unit's system ("150 ft" in feet) when the given lengths agree.

    Never raises for bad input: errors come back as {"ok": false, "errors": [...]} with the
    field, the value received and what is allowed.
    """
    try:
        calculator = get(calculator_id)
    except InputError as error:
        return _error_result(calculator_id, [error])
    if display is not None and display not in units.DISPLAY_SYSTEMS:
        return _error_result(calculator.id, [InputError(
            None, display, f"display {shorten(display)!r} is not one of: "
            + ", ".join(units.DISPLAY_SYSTEMS))])
    try:
        values = validate(calculator, inputs, region)
        with units.display_units(display, _typed_length_system(calculator, inputs, values)):
            result = calculator.compute(values)
            return _result_dict(calculator, result)
    except InputErrors as errors:
        return _error_result(calculator.id, errors.errors)
    except InputError as error:
        return _error_result(calculator.id, [error])
    except CalcError as error:
        return _error_result(calculator.id, [InputError(None, None, str(error))])
    except Exception as error:  # a bug: say so plainly, never show a traceback to the user
        message = (
            f"internal error in {calculator.id} ({type(error).__name__}); the inputs look valid, "
            "so please report this calculation with its link"
        )
        return _error_result(calculator.id, [InputError(None, None, message)])


def _typed_length_system(calculator, inputs, values):
    """"na" or "iec" when every length the caller gave (not a default) was in that system."""
    systems = {units.length_system(values.typed_units[item.name]) for item in calculator.inputs
               if item.name in inputs and item.name in values.typed_units
               and units.dimension_of(item.unit) == "length"}
    return systems.pop() if len(systems) == 1 else None


def run_json(calculator_id, inputs_json, display=None):
    """JSON text in, JSON text out: the worker's single entry point. User text is only data.
    `display` is run's (the page's unit switch)."""
    try:
        inputs = json.loads(inputs_json)
    except (TypeError, ValueError) as error:
        payload = _error_result(
            calculator_id, [InputError(None, None, f"inputs are not valid JSON ({error})")]
        )
    else:
        payload = run(calculator_id, inputs, display=display)
    return dumps(payload)


def dumps(payload, indent=None):
    """The contract's JSON text: NaN and infinity are refused, keys in a stable order."""
    return json.dumps(payload, allow_nan=False, ensure_ascii=False, indent=indent)


def _error_result(calculator_id, errors):
    return {
        "ok": False,
        "calculator": calculator_id if isinstance(calculator_id, str) else str(calculator_id),
        "errors": [error.as_dict() for error in errors],
    }


def _result_dict(calculator, result):
    outputs = {}
    for spec in calculator.outputs:
        if spec.name not in result.outputs:
            continue  # an output that does not apply to these inputs (documented per calculator)
        value, display = result.outputs[spec.name]
        if isinstance(value, float) and not math.isfinite(value):
            raise CalcError(f"{spec.label} could not be computed for these inputs")
        if display is None:
            display = units.format_quantity(value, spec.unit)
        outputs[spec.name] = {
            "value": value,
            "unit": spec.unit,
            "label": spec.label,
            "display": display,
        }
    payload = {
        "ok": True,
        "calculator": calculator.id,
        "version": __version__,
        "outputs": outputs,
        "checks": result.checks,
        "steps": result.steps,
        "assumptions": result.assumptions,
        "sources": result.sources,
        "cautions": result.cautions,
    }
    if result.series is not None:
        payload["series"] = result.series
    _require_finite(payload["series"] if "series" in payload else None)
    return payload


def _require_finite(series):
    """A chart with a NaN or infinity is refused rather than drawn wrong (one chart or a list)."""
    if series is None:
        return
    for chart in series if isinstance(series, list) else [series]:
        for line in [chart["x"]] + list(chart["y"]):
            for number in line["values"]:
                if not math.isfinite(number):
                    raise CalcError(
                        f"the chart {line['label']!r} could not be computed for these inputs")
