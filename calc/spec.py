"""The shapes every calculator shares: its inputs and outputs (the spec) and the result record."""

from dataclasses import dataclass, field
from typing import Callable

# Input kinds the form builder and the validator know.
#   quantity: a number with a unit ("150 ft"); a bare number is in the declared unit
#   choice:   one token from `choices`
#   size:     a conductor size ("12 AWG", "4/0", "250 kcmil", "2.5 mm2")
#   flag:     yes / no
#   text:     a short code read by the calculator's own `check` ("B16", "100 A 10x")
INPUT_KINDS = ("quantity", "choice", "size", "flag", "text")

CHECK_STATUSES = ("pass", "warn", "fail")

# Practices a default can follow: North American (NEC/CEC) and IEC. An input's `default` is the
# North American one; `region_defaults` holds the others.
REGIONS = ("na", "iec")


@dataclass(frozen=True)
class Input:
    """One input of a calculator, as `describe` reports it and the form renders it.

    Limits are in the declared `unit`. `region_defaults` maps a region token ("na", "iec") to a
    default that suits that region's practice; `default` is used everywhere else (the CLI).
    """

    name: str
    label: str
    kind: str
    unit: str = ""
    default: object = None
    minimum: float | None = None
    maximum: float | None = None
    min_exclusive: bool = False
    max_exclusive: bool = False
    choices: tuple = ()  # ((token, label), ...)
    help: str = ""
    optional: bool = False  # blank is allowed and means "not given" (None)
    region_defaults: dict = field(default_factory=dict)
    suggest: str = ""  # a list of usual values the form offers ("voltages")
    advanced: bool = False  # the form folds it under "More inputs"; it works the same
    check: Callable | None = None  # text: raises InputError (or UnitError) for a bad code
    suggestions: tuple = ()  # text: common values the form offers
    # Inputs with the same `group` are alternatives (a load as current, power or kVA): once one
    # of them is given, the others take no default, so a value the user did not type never
    # conflicts with one they did. The form clears the others when one is typed.
    group: str = ""

    def __post_init__(self):
        if self.kind not in INPUT_KINDS:
            raise ValueError(f"input {self.name}: kind {self.kind!r} is not one of {INPUT_KINDS}")
        if self.kind == "choice" and not self.choices:
            raise ValueError(f"input {self.name}: a choice needs its choices")

    @property
    def tokens(self):
        return tuple(token for token, _ in self.choices)


@dataclass(frozen=True)
class Output:
    """One output: its value is in the coherent SI `unit` ("A", "V", "VA", "" for a ratio)."""

    name: str
    label: str
    unit: str = ""


@dataclass(frozen=True)
class Calculator:
    """A registered calculator: the spec and the function that computes a Result from inputs.

    `compute` receives a dict of validated inputs in coherent SI units (choices as tokens,
    sizes as calc.units.ConductorSize, flags as bool, blank optionals as None).
    """

    id: str
    title: str
    summary: str
    group: str
    inputs: tuple
    outputs: tuple
    compute: Callable
    # The one to three output names that answer the page's question, shown first with the
    # verdict (issue 12). Empty: calc.calculators._summary holds them for every calculator.
    summary_outputs: tuple = ()

    def input(self, name):
        for item in self.inputs:
            if item.name == name:
                return item
        raise KeyError(name)


class Result:
    """What a calculator returns: outputs, checks, method steps, assumptions, sources, cautions.

    Calculators fill it in order; calc.api turns it into the contract's JSON.
    """

    def __init__(self):
        self.outputs = {}
        self.checks = []
        self.steps = []
        self.assumptions = []
        self.sources = []
        self.cautions = []
        self.series = None

    def output(self, name, value, display=None):
        """Set output `name` to `value` (coherent SI); `display` overrides the formatted text."""
        self.outputs[name] = (value, display)

    def check(self, name, status, message):
        if status not in CHECK_STATUSES:
            raise ValueError(f"check {name}: status {status!r} is not one of {CHECK_STATUSES}")
        self.checks.append({"name": name, "status": status, "message": message})

    def step(self, text, formula, result):
        """A method step: what it finds, the formula, then the numbers substituted and the value."""
        self.steps.append({"text": text, "formula": formula, "result": result})
