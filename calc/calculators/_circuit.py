"""View helpers the circuit calculators share (ampacity, circuit-check): the conductor inputs,
the ampacity in either practice with its method steps, and the texts they cite."""

import functools
from typing import NamedTuple

from calc import ampacity, conductors, protection, units
from calc.calculators._conductors import conductor_fields
from calc.errors import InputError, ParameterError
from calc.spec import Input



# Every quantity shown goes through calc.units.format_quantity (so the page's unit system
# applies). A schedule formats tens of values a row, most of them repeated (ratings, voltages,
# table values, one figure in a step and again in a message): those of dimensions no display
# system changes are remembered; lengths, areas and impedance per length follow the system in
# force and are formatted each time.
_SYSTEM_DIMENSIONS = {dimension for rows in getattr(units, "DISPLAY_OVERRIDES", {}).values()
                      for dimension in rows} | {"length", "area", "impedance_per_length"}
_dimension = functools.lru_cache(maxsize=None)(units.dimension_of)
_remembered = functools.lru_cache(maxsize=16384)(units.format_quantity)


def fq(value, unit, digits=3):
    """calc.units.format_quantity, remembered where the display system cannot change it."""
    if _dimension(unit) in _SYSTEM_DIMENSIONS or not isinstance(value, (int, float)):
        return units.format_quantity(value, unit, digits)
    return _remembered(value, unit, digits)

PRACTICES = (("nec", "NEC (North America): Table 310.16, 240.4, Article 430"),
             ("iec", "IEC 60364: Annex B capacities, 60364-4-41 and 4-43"))
IEC_METHOD_LABELS = {
    "A1": "A1: single-core cables in conduit in an insulated wall",
    "A2": "A2: multi-core cable in conduit in an insulated wall",
    "B1": "B1: single-core cables in conduit on a wall",
    "B2": "B2: multi-core cable in conduit on a wall",
    "C": "C: cable clipped direct to a wall",
    "D1": "D1: multi-core cable in a duct in the ground",
    "D2": "D2: cable direct in the ground",
    "E": "E: multi-core cable in free air or on a perforated tray",
    "F": "F: single-core cables touching in free air",
}
TERMINALS = (("auto", "By NEC 110.14(C)(1): 60 °C to 1 AWG, 75 °C above"),
             ("60", "60 °C"), ("75", "75 °C"), ("90", "90 °C (equipment listed for it)"))
NEC_INSULATIONS_C = (60, 75, 90)  # Table 310.16's columns
IEC_INSULATIONS = {70: "pvc", 90: "xlpe"}  # PVC 70 °C, XLPE/EPR 90 °C conductor temperature

# ParameterError parameters of calc.ampacity -> the form fields they come from.
AMPACITY_FIELDS = {"insulation_c": "insulation_temp_c", "column_c": "insulation_temp_c",
                   "cable_insulation": "insulation_temp_c", "terminal_c": "terminal_temp_c",
                   "conductor_count": "current_carrying", "loaded_conductors": "current_carrying",
                   "method": "installation", "circuits": "grouped"}

SOURCE_NEC = (
    "NEC Table 310.16 (2014/2017: 310.15(B)(16)), ambient correction 310.15(B)(1) (2017: Table "
    "310.15(B)(2)(a)), adjustment 310.15(C)(1) (2017: Table 310.15(B)(3)(a)), terminal "
    "temperatures 110.14(C), small conductors 240.4(D), next size up 240.4(B): read, as "
    "reproduced in the NEC 2017 text (repository mjk83093/sil) and, for the tables, in "
    "urdans/eecalcs (NEC 2014), which agree in every cell; 12 AWG aluminium's 15 A in 240.4(D) "
    "from memory."
)
SOURCE_IEC = (
    "IEC 60364-5-52:2009 Annex B: capacities Tables B.52.2 to B.52.5 and B.52.10 to B.52.13, "
    "ambient B.52.14 (air) and B.52.15 (ground), grouping B.52.17 to B.52.19: from memory, "
    "to be checked against the standard. Soil thermal resistivity 2.5 K·m/W "
    "(the tables' reference) is assumed."
)


def conductor_inputs():
    """The conductor inputs shared by ampacity and circuit-check (their names are public)."""
    return (
        Input("practice", "Rules", "choice", default="nec", choices=PRACTICES,
              region_defaults={"iec": "iec"},
              help="NEC tables and rules, or IEC 60364 capacities and rules."),
        Input("size", "Conductor size", "size", default="12 AWG",
              region_defaults={"iec": "2.5 mm²"},
              help="AWG or kcmil with the NEC; mm² with IEC 60364."),
        Input("material", "Conductor material", "choice", default="cu",
              choices=(("cu", "Copper"), ("al", "Aluminium"))),
        Input("insulation_temp_c", "Insulation temperature rating", "quantity", unit="degC",
              default=90, minimum=60, maximum=90, region_defaults={"iec": 70},
              help="NEC: 60 (TW, UF), 75 (THW, THWN, XHHW) or 90 °C (THHN, THWN-2, XHHW-2). "
                   "IEC: 70 °C PVC or 90 °C XLPE/EPR."),
        Input("ambient_c", "Ambient temperature", "quantity", unit="degC", default=30,
              minimum=-40, maximum=100,
              help="Around the conductors; for IEC methods D1 and D2 the ground temperature."),
        Input("current_carrying", "Current-carrying conductors", "quantity", unit="",
              optional=True, minimum=1, maximum=200,
              help="NEC: current-carrying conductors in the raceway or cable (a neutral that "
                   "carries only the unbalance is not counted; grounding conductors never). "
                   "IEC: loaded conductors of this circuit, 2 or 3. Blank: this circuit's own."),
        Input("installation", "Installation method (IEC)", "choice", default="C",
              choices=tuple(IEC_METHOD_LABELS.items()),
              help="IEC 60364-5-52 reference method; not used with the NEC."),
        Input("grouped", "Circuits grouped together (IEC)", "quantity", unit="", default=1,
              minimum=1, maximum=20,
              help="Circuits or multi-core cables in the group, this one included; not used "
                   "with the NEC (count its conductors instead)."),
        Input("terminal_temp_c", "Terminal temperature rating (NEC)", "choice", default="auto",
              choices=TERMINALS, advanced=True,
              help="What the breaker and equipment terminals are listed for."),
    )


# Pure functions of hashable arguments, remembered: a schedule asks them of the same sizes row
# after row, and each circuit's checks ask several times.
impedance = functools.lru_cache(maxsize=2048)(conductors.impedance)
loop_impedance_per_metre = functools.lru_cache(maxsize=2048)(protection.loop_impedance_per_metre)
egc_minimum_size = functools.lru_cache(maxsize=256)(protection.egc_minimum_size)


class Ampacity(NamedTuple):
    """A conductor's ampacity in either practice, as the views show it."""

    iec: bool
    table_a: float  # the table's value [A]
    table: str  # "NEC Table 310.16, 90 °C column" / "IEC 60364-5-52 Table B.52.2, method C"
    ambient_factor: float
    ambient_table: str
    grouping_factor: float
    grouping_table: str
    corrected_a: float  # table × factors [A]
    terminal_c: int | None  # NEC: the terminal column [°C]
    terminal_a: float | None  # NEC: its table value [A]
    ampacity_a: float  # after every correction and limit [A]
    small_limit_a: float | None  # NEC 240.4(D) [A]


def whole(inputs, name, value=None):
    """The input `name` (or `value`) as an int, refused on its field unless a whole number."""
    value = inputs[name] if value is None else value
    if not float(value).is_integer():
        raise InputError(name, value, f"{value:g} is not a whole number; enter 1, 2, 3 …")
    return int(value)


def insulation_of(inputs, iec):
    """The insulation rating [°C] (NEC) or token (IEC), refused unless a table has a column."""
    temperature = inputs["insulation_temp_c"]
    allowed = tuple(IEC_INSULATIONS) if iec else NEC_INSULATIONS_C
    if temperature not in allowed:
        which = "IEC 60364-5-52: 70 °C (PVC) or 90 °C (XLPE, EPR)" if iec else (
            "NEC Table 310.16: 60, 75 or 90 °C")
        raise InputError("insulation_temp_c", f"{temperature:g} °C",
                         f"the ampacity tables have columns for {which}")
    return IEC_INSULATIONS[temperature] if iec else int(temperature)


def conductor_ampacity(inputs, size, count, loaded=None):
    """The Ampacity of `size` with the inputs' material, insulation, ambient and grouping;
    `count` is the NEC current-carrying count, `loaded` the IEC loaded conductors."""
    iec = inputs["practice"] == "iec"
    insulation = insulation_of(inputs, iec)
    terminal = inputs.get("terminal_temp_c") or "auto"
    try:
        if iec:
            return _iec_ampacity(size, inputs["material"], insulation, loaded,
                                 inputs["installation"], inputs["ambient_c"],
                                 whole(inputs, "grouped"))
        return _nec_ampacity(size, inputs["material"], insulation, inputs["ambient_c"], count,
                             None if terminal == "auto" else int(terminal))
    except ParameterError as error:
        field = AMPACITY_FIELDS.get(error.parameter, error.parameter)
        raise InputError(field, error.value, error.message) from None


@functools.lru_cache(maxsize=4096)
def _iec_ampacity(size, material, insulation, loaded, method, ambient_c, grouped):
    iz = ampacity.iec_capacity(size, material, insulation, loaded, method, ambient_c, grouped)
    ground = method in ampacity.IEC_GROUND_METHODS
    return Ampacity(True, iz.table_a, f"IEC 60364-5-52 Table {iz.table}, method {method}",
                    iz.temperature_factor, "B.52.15 (ground)" if ground else "B.52.14 (air)",
                    iz.grouping_factor, iz.grouping_table, iz.capacity_a, None, None,
                    iz.capacity_a, None)


@functools.lru_cache(maxsize=4096)
def _nec_ampacity(size, material, insulation, ambient_c, count, terminal):
    a = ampacity.nec_ampacity(size, material, insulation, ambient_c, count, terminal)
    return Ampacity(False, a.table_a, f"NEC Table 310.16, {insulation} °C column",
                    a.ambient_factor, "310.15(B)(1)", a.adjustment_factor, "310.15(C)(1)",
                    a.corrected_a, a.terminal_c, a.terminal_a, a.ampacity_a,
                    a.small_conductor_a)


def ampacity_steps(result, amp, size, material, count_text):
    """The method steps of an Ampacity: the table, each factor with its table, the limit."""
    metal = conductors.MATERIAL_NAMES[material]
    result.step(f"Table value of {size.label} {metal} ({amp.table})", "I_table",
                f"= {fq(amp.table_a, 'A')}")
    if amp.iec:
        ambient = (f"Ambient correction, IEC 60364-5-52 Table {amp.ambient_table}", "k_θ")
        grouping = (f"Grouping, IEC 60364-5-52 Table {amp.grouping_table} ({count_text})", "k_g")
        product = ("Current-carrying capacity", "Iz", amp.ampacity_a)
    else:
        ambient = ("Ambient correction, NEC 310.15(B)(1), on the conductor's own column", "k_amb")
        grouping = (f"Adjustment for {count_text}, NEC 310.15(C)(1)", "k_adj")
        product = ("Corrected ampacity", "I", amp.corrected_a)
    result.step(*ambient, f"= {amp.ambient_factor:g}")
    result.step(*grouping, f"= {amp.grouping_factor:g}")
    result.step(product[0], f"{product[1]} = I_table × {ambient[1]} × {grouping[1]}",
                f"= {fq(amp.table_a, 'A')} × {amp.ambient_factor:g} × {amp.grouping_factor:g} = "
                f"{fq(product[2], 'A')}")
    if amp.iec:
        return
    result.step(f"Terminal limit, NEC 110.14(C): the {amp.terminal_c} °C column of Table 310.16",
                "I_term", f"= {fq(amp.terminal_a, 'A')}")
    result.step("Ampacity: the smaller of the two", "I_z = min(I, I_term)",
                f"= {fq(amp.ampacity_a, 'A')}")
    if amp.small_limit_a is not None:
        result.step(f"Small-conductor rule beside it, NEC 240.4(D): {size.label} {metal} may be "
                    "protected at no more than", "I_ocpd,max", f"= {fq(amp.small_limit_a, 'A')}")


# ---- the circuit: system, device and the sizes to try ----------------------------------------

SYSTEMS = (
    ("1ph", "Single-phase, line to neutral (120 V, 230 V)"),
    ("1ph-ll", "Single-phase, line to line of a wye (208 V, 480 V)"),
    ("1ph3w", "120/240 V single-phase, line to line (240 V)"),
    ("3ph", "Three-phase (208 V, 400 V, 480 V)"),
)
# U0, the voltage to ground, per volt of the circuit's voltage; and the system voltage-drop
# runs are solved as (calc.voltage_drop).
U0_PER_VOLT = {"1ph": 1.0, "1ph-ll": 1 / 3 ** 0.5, "1ph3w": 0.5, "3ph": 1 / 3 ** 0.5}
DROP_SYSTEM = {"1ph": "1ph", "1ph-ll": "1ph", "1ph3w": "1ph3w", "3ph": "3ph"}

DEVICE_TYPES = (
    ("inverse-time", "Inverse-time circuit breaker"),
    ("instantaneous", "Instantaneous-trip breaker (motor circuit protector)"),
    ("fuse-time-delay", "Time-delay (dual-element) fuse"),
    ("fuse-non-time-delay", "Non-time-delay fuse"),
    ("mcb-b", "IEC 60898-1 MCB, type B"),
    ("mcb-c", "IEC 60898-1 MCB, type C"),
    ("mcb-d", "IEC 60898-1 MCB, type D"),
)
# The instantaneous (or quick-melting) multiple taken when none is given. Breakers: 10 × In,
# the usual high magnetic setting (common practice; ground-fault-trip offers 5x and 10x). A
# non-time-delay fuse melts in about 0.1 s at 10 × (protection.FUSE_CLEARING_MULTIPLE, common
# practice). A time-delay fuse carries 5 × its rating for 10 s or more (UL 248, from memory), so
# it needs more: 15 × is taken — common practice, an assumption the maker's curve replaces.
DEFAULT_TRIP_MULTIPLES = {"inverse-time": 10.0, "instantaneous": 10.0,
                          "fuse-non-time-delay": 10.0, "fuse-time-delay": 15.0}
DEVICE_KINDS = {"inverse-time": "mccb", "instantaneous": "mcp", "fuse-time-delay": "fuse",
                "fuse-non-time-delay": "fuse"}


def build_device(inputs):
    """The protective device (calc.protection.Breaker) from device_type, device_rating and
    trip_multiple; a refused value is reported on its field."""
    device_type, rating = inputs["device_type"], inputs["device_rating"]
    multiple = inputs.get("trip_multiple")
    if device_type.startswith("mcb-") and rating not in protection.MCB_PREFERRED_RATINGS_A:
        preferred = ", ".join(f"{r:g}" for r in protection.MCB_PREFERRED_RATINGS_A)
        raise InputError("device_rating", rating, f"{rating:g} A is not an IEC 60898-1 preferred "
                         f"rating; an MCB is rated {preferred} A")
    with conductor_fields(rated_current="device_rating", multiple="trip_multiple",
                          kind="device_type"):
        if device_type.startswith("mcb-"):
            return protection.protective_device("mcb", rating, device_type[-1].upper())
        if multiple is None:
            multiple = DEFAULT_TRIP_MULTIPLES[device_type]
        return protection.protective_device(DEVICE_KINDS[device_type], rating, multiple)


def conventional_multiple(device_type):
    """I2 / In of a device type (IEC 60364-4-43 433.1; see ampacity.CONVENTIONAL_MULTIPLES)."""
    family = ("mcb" if device_type.startswith("mcb-") else
              "fuse" if device_type.startswith("fuse") else "breaker")
    return family, ampacity.CONVENTIONAL_MULTIPLES[family]


def larger_sizes(size, material):
    """The standard sizes of `size`'s family (AWG and kcmil, or mm²) above it, made in the
    material, smallest first."""
    return _larger_sizes(size, material)


@functools.lru_cache(maxsize=512)
def _larger_sizes(size, material):
    labels = units.METRIC_SIZES if size.system == "mm2" else units.AWG_SIZES + units.KCMIL_SIZES
    found = []
    for label in labels:
        bigger = units.CONDUCTOR_SIZES[label]
        if bigger.area_m2 <= size.area_m2 * 1.0001:
            continue
        try:
            conductors.check_made(bigger, material)
        except ValueError:
            continue
        found.append(bigger)
    return tuple(found)


# The smallest sizes the ampacity tables list for power circuits (NEC Table 310.16 lists 18 and
# 16 AWG only as 90 °C fixture wire; IEC 60364-5-52 starts at 1.5 mm²).
SMALLEST_POWER_SIZE = {"awg": "14 AWG", "mm2": "1.5 mm²"}


def first_size(size, material, works):
    """The smallest size from `size` up (itself included) for which `works(size)` is true, or
    None; a size whose data a table lacks (an InputError) is passed over."""
    for candidate in (size, *larger_sizes(size, material)):
        try:
            if works(candidate):
                return candidate
        except InputError:
            continue
    return None


def area_to_size(area, like, material):
    """The smallest standard size of `like`'s family (AWG and kcmil, or mm²) with at least
    `area` [m²] made in the material, or None."""
    smallest = units.CONDUCTOR_SIZES[SMALLEST_POWER_SIZE["mm2" if like.system == "mm2" else "awg"]]
    return first_size(smallest, material, lambda size: size.area_m2 >= area * (1 - 1e-9))
