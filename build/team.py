"""A team's defaults (team.yml): read, check and hand to the pages. Bad settings stop the build."""

import os
from dataclasses import dataclass, field
from pathlib import Path

import yaml

from build import paths
from calc import api
from calc.errors import InputErrors

REGIONS = {
    "na": "North American practice (NEC, CEC)",
    "iec": "IEC practice (IEC 60364, BS 7671)",
}

# Usual system voltages offered as suggestions in voltage fields [V], by region.
# North America: ANSI C84.1 nominal system voltages; IEC: IEC 60038 — both from memory.
REGION_VOLTAGES = {
    "na": (120, 208, 240, 277, 347, 480, 600, 2400, 4160, 12470, 13200, 13800, 25000, 34500),
    "iec": (230, 400, 690, 1000, 3300, 6600, 11000, 20000, 22000, 33000),
}

# Voltage-drop recommendations [%] when the team sets none. North America: NEC 210.19(A)
# Informational Note No. 4 (3 % branch, 5 % feeder + branch, not enforceable). IEC: IEC 60364-5-52
# Annex G, Table G.52.1, installation type A (3 % lighting, 5 % other uses; read, as reproduced
# at scribd.com/document/599637287).
REGION_DROP_LIMITS = {
    "na": {"branch_pct": 3.0, "total_pct": 5.0},
    "iec": {"lighting_pct": 3.0, "other_pct": 5.0},
}

# Conductor temperature for resistance when the team sets none [°C]: NEC Chapter 9 Table 8 is
# at 75 °C; IEC 60364-5-52 Annex G uses 1.25 × ρ20, about 80 °C for copper (computed).
REGION_CONDUCTOR_TEMP_C = {"na": 75.0, "iec": 80.0}

# Calculator inputs that take their starting value from a team-wide setting. The first voltage-
# drop figure is the branch (na) or lighting (iec) recommendation.
TEAM_WIDE_INPUTS = {
    "max_drop_pct": lambda config: next(iter(config.voltage_drop.values())),
    "conductor_temp_c": lambda config: config.conductor_temp_c,
}

KEYS = ("organisation", "region", "system_voltages", "voltage_drop", "conductor_temp_c", "defaults")


class TeamConfigError(Exception):
    """team.yml is wrong: the message names the file, the key, the value and what is allowed."""


@dataclass
class TeamConfig:
    organisation: str = ""
    region: str = "na"
    system_voltages: tuple = REGION_VOLTAGES["na"]
    voltage_drop: dict = field(default_factory=lambda: dict(REGION_DROP_LIMITS["na"]))
    conductor_temp_c: float = REGION_CONDUCTOR_TEMP_C["na"]
    defaults: dict = field(default_factory=dict)  # {calculator id: {input name: raw value}}
    source: str = "built-in defaults"

    def input_default(self, calculator_id, item):
        """The value a form field starts with: the team's, else the region's, else the spec's.

        Inputs named after a team-wide setting (the drop limit, the conductor temperature)
        start from that setting unless the team set the field itself.
        """
        team = self.defaults.get(calculator_id, {})
        if item.name in team:
            return team[item.name]
        if item.name in TEAM_WIDE_INPUTS:
            return TEAM_WIDE_INPUTS[item.name](self)
        return item.region_defaults.get(self.region, item.default)

    def for_page(self):
        """The settings the browser sees (nothing secret lives here)."""
        return {
            "organisation": self.organisation,
            "region": self.region,
            "system_voltages": list(self.system_voltages),
            "voltage_drop": dict(self.voltage_drop),
            "conductor_temp_c": self.conductor_temp_c,
        }


def team_file():
    """The team file in force: $FLUXBOOK_TEAM_FILE if set, else team.yml at the top."""
    override = os.environ.get(paths.TEAM_FILE_ENV)
    return Path(override) if override else paths.TEAM_FILE


def load(path=None):
    """Read and check a team file; a missing file gives the built-in North American defaults."""
    path = Path(path) if path else team_file()
    if not path.exists():
        if os.environ.get(paths.TEAM_FILE_ENV):
            raise TeamConfigError(f"{path}: the team file named by {paths.TEAM_FILE_ENV} is missing")
        return TeamConfig()
    try:
        data = yaml.safe_load(path.read_text(encoding="utf-8")) or {}
    except yaml.YAMLError as error:
        raise TeamConfigError(f"{path}: not valid YAML ({error})") from None
    return parse(data, str(path))


def parse(data, source="team settings"):
    """Check a team settings mapping and return a TeamConfig."""
    if not isinstance(data, dict):
        raise TeamConfigError(f"{source}: expected key: value settings, got {type(data).__name__}")
    unknown = sorted(set(data) - set(KEYS))
    if unknown:
        raise TeamConfigError(f"{source}: unknown setting {unknown[0]!r}; settings are: {', '.join(KEYS)}")
    region = data.get("region", "na")
    if region not in REGIONS:
        raise TeamConfigError(f"{source}: region {region!r} is not one of: {', '.join(REGIONS)}")
    config = TeamConfig(
        organisation=_text(data.get("organisation", ""), "organisation", source),
        region=region,
        system_voltages=_voltages(data.get("system_voltages", REGION_VOLTAGES[region]), source),
        voltage_drop=_drop_limits(data.get("voltage_drop", REGION_DROP_LIMITS[region]), region, source),
        conductor_temp_c=_number(
            data.get("conductor_temp_c", REGION_CONDUCTOR_TEMP_C[region]), "conductor_temp_c",
            source, low=-40.0, high=250.0,
        ),
        defaults=_calculator_defaults(data.get("defaults", {}) or {}, source),
        source=source,
    )
    return config


def _text(value, key, source):
    if not isinstance(value, str) or len(value) > 120:
        raise TeamConfigError(f"{source}: {key} must be text of at most 120 characters")
    return value.strip()


def _number(value, key, source, low, high):
    if isinstance(value, bool) or not isinstance(value, (int, float)) or not low <= value <= high:
        raise TeamConfigError(f"{source}: {key} is {value!r}; enter a number from {low:g} to {high:g}")
    return float(value)


def _voltages(values, source):
    if not isinstance(values, (list, tuple)) or not values:
        raise TeamConfigError(f"{source}: system_voltages must be a list of voltages in V")
    return tuple(_number(v, "system_voltages", source, 1.0, 800_000.0) for v in values)


def _drop_limits(values, region, source):
    allowed = tuple(REGION_DROP_LIMITS[region])
    if not isinstance(values, dict):
        raise TeamConfigError(f"{source}: voltage_drop must be {', '.join(allowed)} in %")
    unknown = sorted(set(values) - set(allowed))
    if unknown:
        raise TeamConfigError(
            f"{source}: voltage_drop.{unknown[0]} is not used in region {region}; use {', '.join(allowed)}"
        )
    limits = dict(REGION_DROP_LIMITS[region])
    for key, value in values.items():
        limits[key] = _number(value, f"voltage_drop.{key}", source, 0.1, 20.0)
    return limits


def _calculator_defaults(values, source):
    if not isinstance(values, dict):
        raise TeamConfigError(f"{source}: defaults must map calculator ids to input: value")
    checked = {}
    for calculator_id, inputs in values.items():
        if calculator_id not in api.REGISTRY:
            raise TeamConfigError(
                f"{source}: defaults.{calculator_id} is not a calculator; ids are: {', '.join(api.REGISTRY)}"
            )
        if not isinstance(inputs, dict):
            raise TeamConfigError(f"{source}: defaults.{calculator_id} must map input names to values")
        inputs = {name: value for name, value in inputs.items()}
        try:
            api.validate(api.get(calculator_id), inputs)
        except InputErrors as errors:
            first = errors.errors[0]
            raise TeamConfigError(f"{source}: defaults.{calculator_id}.{first.field}: {first.message}") from None
        checked[calculator_id] = inputs
    return checked
