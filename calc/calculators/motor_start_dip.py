"""motor-start-dip: how far does the voltage fall at the motor and at the shared node where other
loads (the lights) hang when a motor starts, how long, does it matter, and what would fix it?

The supply path — source, transformer, shared feeder, motor branch — is solved by calc.network
before and during the start, with the starting motor as its locked-rotor impedance seen through
the starter (or the current a soft starter or drive holds). Each usual remedy is recomputed.
"""

from calc import cautions, electrical, network, transformers, units
from calc import induction_motors as im
from calc.calculators import _inputs, _motors
from calc.calculators._plausibility import outside
from calc.calculators.fault_current import LV_TRANSFORMER_VA, transformer_reasons
from calc.calculators._transformers import Z_PCT_MIN
from calc.errors import InputError, ParameterError, PathError, field_error
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

# Starting methods from calc.induction_motors. Methods that act like an impedance (full voltage,
# wye-delta, autotransformer) are the locked-rotor impedance scaled by I_LR / I_line; soft
# starters and drives hold a current. The primary reactor needs its voltage fraction, which
# this calculator does not ask for, so it is left out here.
STARTING = tuple(item for item in im.STARTING_METHODS if item[0] != "reactor")
# Power factor of the current a soft starter or drive holds (common practice).
HELD_PF = {"soft": 0.35, "vfd": 0.9}
# The full-load current that soft-starter and drive limits multiply, estimated with a typical
# efficiency and power factor (common practice).
ASSUMED_EFFICIENCY = 0.9
ASSUMED_PF = 0.85

# Plausibility: the locked-rotor power factor of real motors, about 0.1-0.2 for the largest to
# 0.5-0.6 for small ones (common practice).
LOCKED_ROTOR_PF_RANGE = (0.1, 0.6)

SIZE_STEP = 2  # how many sizes larger the "bigger shared conductor" remedy tries
IEC_SECONDARY_VOLTAGES = (230.0, 400.0, 690.0)  # these secondaries take the IEC rating series

# The path data this view builds, item by item, and the form field each one comes from; an
# item not listed is the starting motor's load (motor_power).
PATH_FIELDS = {
    "source.voltage": "source_v", "source.frequency_hz": "frequency_hz",
    "source.fault_mva": "source_mva", "source.x_r": "source_x_r",
    "elements[0].kva": "xfmr_kva", "elements[0].primary_v": "source_v",
    "elements[0].secondary_v": "secondary_v", "elements[0].z_pct": "xfmr_z_pct",
    "elements[0].x_r": "xfmr_x_r",
    "elements[1].size": "feeder_size", "elements[1].length": "feeder_length",
    "elements[1].material": "material",
    "elements[2].size": "branch_size", "elements[2].length": "branch_length",
    "elements[2].material": "material",
    "loads[0].kva": "other_kva", "loads[0].pf": "other_pf", "loads[1].pf": "starting_pf",
}

SOURCES = [
    "NEMA MG 1 §10.37.2 / NEC Table 430.7(B): locked-rotor kVA per hp by code letter (read, as "
    "reproduced by EASA).",
    "Starting-method ratios: wye-delta 1/3, autotransformer tap², from motor theory (from "
    "memory).",
    "IEEE Std 141-1993 (Red Book) ch. 3: voltage needed to accelerate, contactor drop-out, "
    "flicker curve — from memory.",
    "IEC 61000-3-3: relative voltage change limits d_max, d_c and d(t) — from memory.",
    "Path solution: Fluxbook's radial path engine (checked against pandapower power flow).",
]
CAUTIONS = [
    "A motor that stalls, or whose rotor is locked, keeps drawing locked-rotor current and "
    "overheats in seconds: its overload protection must trip it.",
    "Changing a starter or transformer is design work: have it checked by a qualified person "
    "and against the motor maker's data.",
]


def _path_data(inputs, feeder_size=None, rating=None, separate=False):
    """The supply path as data: source → transformer (node 1) → shared feeder (node 2) → motor
    branch (node 3); `separate` feeds the motor by its own run from the transformer instead."""
    source = {"voltage": inputs["source_v"], "frequency_hz": inputs["frequency_hz"],
              "x_r": inputs["source_x_r"]}
    level = _inputs.source_level(inputs, inputs["source_v"])
    if level is not None:
        source["fault_mva"] = level / 1e6
    transformer = {"kind": "transformer", "name": "Transformer",
                   "kva": (rating or inputs["xfmr_kva"]) / 1e3, "primary_v": inputs["source_v"],
                   "secondary_v": inputs["secondary_v"], "z_pct": inputs["xfmr_z_pct"],
                   "x_r": inputs["xfmr_x_r"]}
    feeder = {"kind": "cable", "name": "Shared feeder",
              "size": (feeder_size or inputs["feeder_size"]).label,
              "length": inputs["feeder_length"], "material": inputs["material"]}
    branch = {"kind": "cable", "name": "Motor branch", "size": inputs["branch_size"].label,
              "length": inputs["branch_length"], "material": inputs["material"]}
    if separate:  # its own run from the transformer, as long as feeder and branch together
        branch.update({"name": "Separate motor run", "from": 1,
                       "length": inputs["feeder_length"] + inputs["branch_length"]})
    return {"source": source, "elements": [transformer, feeder, branch]}


def _locked_rotor(inputs):
    """Locked-rotor current [A]: the nameplate LRA, else the top of the code letter's range."""
    if inputs["lra"] is not None:
        return inputs["lra"]
    with field_error("code_letter"):
        low, high = im.code_letter_currents(inputs["code_letter"], inputs["motor_power"],
                                            inputs["secondary_v"], 3)
    return low if high is None else high  # V has no upper figure: its lower one stands


def _motor_load(inputs, starting):
    """The starting motor as a load at its terminals: (load data, held current or None, I_LR)."""
    volts = inputs["secondary_v"]
    locked = _locked_rotor(inputs)
    full_load = im.full_load_current(inputs["motor_power"], volts, 3, ASSUMED_EFFICIENCY,
                                     ASSUMED_PF)
    line = im.starting_current(starting, locked, full_load).line
    kva = electrical.apparent_power(volts, line, 3) / 1e3
    if starting in im.HELD_CURRENT_METHODS:
        return {"kva": kva, "pf": HELD_PF[starting], "model": "current"}, line, locked
    # the locked-rotor impedance seen through the starter
    return {"kva": kva, "pf": inputs["starting_pf"], "model": "impedance"}, None, locked


def _solve(data):
    """Node voltages of path data; a path-data error is put on the form field it came from."""
    try:
        path = network.path_from_dict(data)
    except ParameterError as error:
        raise InputError(PATH_FIELDS.get(error.parameter, "motor_power"), error.value,
                         error.message) from None
    return network.solve(path)


def _dips(inputs, starting=None, feeder_size=None, rating=None, separate=False):
    """Voltages before and during the start at each node; dips in % of the voltage before."""
    motor, held, locked = _motor_load(inputs, starting or inputs["starting"])
    other = {"kva": inputs["other_kva"] / 1e3, "pf": inputs["other_pf"], "model": "power",
             "node": 2}
    data = _path_data(inputs, feeder_size, rating, separate)
    try:
        before = _solve({**data, "loads": [other]})
        during = _solve({**data, "loads": [other, dict(motor, node=3)]})
    except PathError as error:
        raise InputError("motor_power", inputs["motor_power"], f"{error}: the supply cannot "
                         "start this motor; a larger transformer or a reduced-voltage starter is "
                         "needed") from None
    dip = [100.0 * (b - d) / b for b, d in zip(before.voltages, during.voltages)]
    return {"before": before.voltages, "during": during.voltages, "dip": dip,
            "motor_v": during.voltages[3], "motor_dip": dip[3], "shared_dip": dip[2],
            "locked": locked, "held": held}


def _next_size(size, steps):
    labels = units.METRIC_SIZES if size.system == "mm2" else units.AWG_SIZES + units.KCMIL_SIZES
    index = labels.index(size.label) + steps
    return units.parse_conductor_size(labels[min(index, len(labels) - 1)])


def _next_rating(rating, region_is_iec):
    """The next larger preferred transformer rating [VA] (1.5 × beyond the list)."""
    ratings = (transformers.PREFERRED_KVA_IEC if region_is_iec
               else transformers.PREFERRED_KVA_3PH_NA)
    larger = [r * 1e3 for r in ratings if r * 1e3 > rating * 1.0001]
    return larger[0] if larger else rating * 1.5


def _method_steps(inputs, base, result):
    nominal = inputs["secondary_v"]
    source = ("infinite source" if inputs["source_mva"] is None else
              f"source {fq(inputs['source_mva'], 'VA')} short-circuit, X/R "
              f"{inputs['source_x_r']:g}")
    result.step(f"Supply path: {source} → {fq(inputs['xfmr_kva'], 'VA')} "
                f"{inputs['xfmr_z_pct']:g} % transformer → shared feeder "
                f"{inputs['feeder_size'].label} × {fq(inputs['feeder_length'], 'm')} → motor "
                f"branch {inputs['branch_size'].label} × {fq(inputs['branch_length'], 'm')}",
                "per-unit series impedances; other loads at the shared node (constant power)",
                "solved by the path engine before and during the start")
    if inputs["lra"] is None:
        low, high = im.code_letter_range(inputs["code_letter"])
        result.step(f"Locked-rotor current from code letter {inputs['code_letter']} (top of its "
                    "range, the worst case)", "I_LR = kVA/hp × hp × 1000 / (√3 V)",
                    f"= {low if high is None else high:g} × "
                    f"{im.horsepower(inputs['motor_power']):.3g} hp × 1000 / (√3 × "
                    f"{fq(nominal, 'V')}) = {fq(base['locked'], 'A')}")
    start_text = dict(STARTING)[inputs["starting"]]
    if base["held"] is None:
        scale = im.starting_impedance_scale(inputs["starting"])
        result.step(f"Starting: {start_text}; the motor is its locked-rotor impedance at "
                    f"pf {inputs['starting_pf']:g}, seen by the supply × {scale:.3g}",
                    "Z_start = V² / S_LR × scale", "constant impedance while it accelerates")
    else:
        result.step(f"Starting: {start_text}", "I_line = multiple × I_FL",
                    f"= {fq(base['held'], 'A')} held")
    for node, name in ((1, "Transformer secondary"), (2, "Shared node (other loads)"),
                       (3, "Motor terminals")):
        result.step(f"{name}: voltage before and during the start",
                    "dip = (V_before − V_start) / V_before",
                    f"= ({fq(base['before'][node], 'V')} − {fq(base['during'][node], 'V')}) / "
                    f"{fq(base['before'][node], 'V')} = {base['dip'][node]:.3g} %")


def _judgements(inputs, base, result):
    nominal = inputs["secondary_v"]
    motor_pct = 100.0 * base["motor_v"] / nominal
    accelerate = motor_pct >= im.ACCELERATING_VOLTAGE_PCT
    result.check("motor_accelerates", "pass" if accelerate else "fail",
                 f"Motor terminals at {motor_pct:.3g} % of rated during the start; a motor needs "
                 f"roughly {im.ACCELERATING_VOLTAGE_PCT:g} % to accelerate its load (IEEE 141 "
                 "ch. 3, from memory).")
    lowest = min(motor_pct, 100.0 * base["during"][2] / nominal)
    low, high = im.CONTACTOR_DROPOUT_PCT
    status = "pass" if lowest >= high else ("warn" if lowest >= low else "fail")
    result.check("contactor_dropout", status,
                 f"Lowest voltage {lowest:.3g} % of nominal; contactors and starters may drop out "
                 f"near {low:g}–{high:g} % (IEEE 141 / NEMA ICS, from memory).")
    shared = base["shared_dip"]
    d_max, d_c, t_max = (im.IEC_61000_3_3_D_MAX_PCT, im.IEC_61000_3_3_D_C_PCT,
                         im.IEC_61000_3_3_T_MAX_S)
    result.check("iec_61000_3_3", "pass" if shared <= d_max else "fail",
                 f"Dip at the shared node {shared:.3g} %; IEC 61000-3-3 allows a maximum relative "
                 f"voltage change d_max of {d_max:g} % in general (6 % or 7 % for equipment "
                 "switched rarely or attended; from memory). It is a limit for equipment on a "
                 "reference supply, used here as the published yardstick.")
    long_dip = shared > d_c and inputs["start_time_s"] > t_max
    result.check("dip_duration", "warn" if long_dip else "pass",
                 f"The dip lasts about {inputs['start_time_s']:g} s (given); IEC 61000-3-3 lets "
                 f"d(t) exceed {d_c:g} % for at most {t_max:g} s during a change (from memory).")
    irritation = im.flicker_irritation_dip(inputs["starts_per_hour"])
    result.check("lights_flicker", "pass" if shared <= irritation else "warn",
                 f"At {inputs['starts_per_hour']:g} starts per hour people find dips above about "
                 f"{irritation:.2g} % irritating (rule-of-thumb flicker curve: common practice, "
                 f"from memory); this start dips the lights {shared:.3g} %.")


def _remedies(inputs, base, result):
    """What would fix it, each recomputed: a method step per remedy."""
    shared, nominal = base["shared_dip"], inputs["secondary_v"]
    remedies = []
    bigger = _next_size(inputs["feeder_size"], SIZE_STEP)
    if bigger.label != inputs["feeder_size"].label:
        remedies.append((f"Shared feeder {SIZE_STEP} sizes larger ({bigger.label})",
                         _dips(inputs, feeder_size=bigger)))
    remedies.append(("Motor on its own run from the transformer", _dips(inputs, separate=True)))
    for option in ("wye-delta", "soft"):
        if option != inputs["starting"]:
            remedies.append((f"Reduced-voltage start: {dict(STARTING)[option]}",
                             _dips(inputs, starting=option)))
    larger = _next_rating(inputs["xfmr_kva"], nominal in IEC_SECONDARY_VOLTAGES)
    remedies.append((f"Next larger transformer ({fq(larger, 'VA')}, same %Z)",
                     _dips(inputs, rating=larger)))
    for name, option in remedies:
        result.step(f"If: {name}", "shared-node dip; motor terminal voltage",
                    f"= {option['shared_dip']:.3g} % (now {shared:.3g} %); at the motor's starter "
                    f"{100.0 * option['motor_v'] / nominal:.3g} % of rated")


def _plausibility(inputs, base, result):
    """The motor's size at its voltage, the transformer and the starting data against real
    equipment."""
    power, volts = inputs["motor_power"], inputs["secondary_v"]
    full_load = im.full_load_current(power, volts, 3, ASSUMED_EFFICIENCY, ASSUMED_PF)
    reasons = transformer_reasons(inputs["xfmr_kva"], volts, inputs["xfmr_z_pct"])
    if outside(inputs["starting_pf"], *LOCKED_ROTOR_PF_RANGE):
        low, high = LOCKED_ROTOR_PF_RANGE
        reasons.append(f"a locked-rotor power factor of {inputs['starting_pf']:g} is outside the "
                       f"{low:g}–{high:g} of real motors (common practice)")
    if inputs["lra"] is not None:
        share = base["locked"] / full_load
        low, high = im.PLAUSIBLE_LOCKED_ROTOR_MULTIPLE
        if outside(share, low, high):
            reasons.append(f"the locked-rotor current given is {share:.3g} × the estimated "
                           f"full-load current {fq(full_load, 'A')}; across-the-line starting "
                           f"draws {low:g}–{high:g} × (common practice)")
    _motors.size_plausibility(result, power, volts, 3, full_load, reasons)


def _motor_start_view(inputs):
    result = Result()
    base = _dips(inputs)
    nominal = inputs["secondary_v"]
    result.output("dip_pct_motor", base["motor_dip"])
    result.output("dip_pct_shared", base["shared_dip"])
    result.output("motor_v_start", base["motor_v"])
    result.output("dip_pct_transformer", base["dip"][1])
    result.output("locked_rotor_a", base["locked"])
    _method_steps(inputs, base, result)
    _judgements(inputs, base, result)
    _remedies(inputs, base, result)

    result.assumptions += [
        "The starting motor is a constant impedance (its locked-rotor impedance) until it nears "
        "speed; soft starters and drives are a held current. The dip is the worst moment, at "
        "standstill.",
        "Other loads at the shared node draw constant power; the source holds its voltage behind "
        "its short-circuit impedance.",
        "Without a nameplate LRA the top of the code-letter range is used (worst case).",
        "For the drive and soft-starter currents, full-load current is estimated with "
        f"efficiency {ASSUMED_EFFICIENCY:g} and power factor {ASSUMED_PF:g}.",
        "The start time is as given; with a high-inertia load it is longer.",
    ]
    _plausibility(inputs, base, result)
    result.sources += SOURCES
    result.cautions += CAUTIONS + list(cautions.COMMON)

    bases = [inputs["source_v"], nominal, nominal, nominal]
    result.series = {
        "title": "Voltage at each point of the path (0 source, 1 transformer, 2 shared node, "
                 "3 motor)",
        "x": {"label": "Point on the path", "unit": "", "values": [0.0, 1.0, 2.0, 3.0]},
        "y_axis": {"label": "Voltage", "unit": "% of nominal"},
        "y": [
            {"label": "Before the start", "unit": "%",
             "values": [100.0 * v / b for v, b in zip(base["before"], bases)]},
            {"label": "During the start", "unit": "%",
             "values": [100.0 * v / b for v, b in zip(base["during"], bases)]},
        ],
        "marks": [{"axis": "y", "value": im.ACCELERATING_VOLTAGE_PCT,
                   "label": f"{im.ACCELERATING_VOLTAGE_PCT:g} %: to accelerate"}],
    }
    return result


CALCULATOR = Calculator(
    id="motor-start-dip",
    title="Motor-start voltage dip",
    summary="How far the voltage dips at the motor and at the lights when a motor starts, "
            "whether it matters, and what would fix it.",
    group="Motors",
    inputs=(
        Input("motor_power", "Motor rating", "quantity", unit="hp", default=25, minimum=0,
              min_exclusive=True, maximum=5000, region_defaults={"iec": "18.5 kW"},
              help="Nameplate output, hp or kW."),
        Input("code_letter", "NEMA code letter", "choice", default="G",
              choices=_motors.code_letter_choices()),
        Input("lra", "Locked-rotor current (nameplate)", "quantity", unit="A", optional=True,
              minimum=0, min_exclusive=True, maximum=1e5,
              help="If known, it replaces the code letter (blank = use the letter)."),
        Input("starting", "Starting method", "choice", default="dol", choices=STARTING),
        Input("secondary_v", "Utilisation voltage", "quantity", unit="V", default=480, minimum=100,
              maximum=1000, region_defaults={"iec": 400}, suggest="voltages",
              help="Transformer secondary and motor rating, line-to-line."),
        Input("xfmr_kva", "Transformer rating", "quantity", unit="kVA", default=300, minimum=0,
              min_exclusive=True, maximum=100000, region_defaults={"iec": 630}),
        Input("xfmr_z_pct", "Transformer impedance", "quantity", unit="%", default=5.75,
              minimum=Z_PCT_MIN, maximum=30, region_defaults={"iec": 4.0}),
        Input("feeder_size", "Shared feeder size", "size", default="4/0",
              region_defaults={"iec": "95 mm²"}),
        Input("feeder_length", "Shared feeder length", "quantity", unit="m", default="150 ft",
              minimum=0, min_exclusive=True, maximum=5000, region_defaults={"iec": "50 m"}),
        Input("branch_size", "Motor branch size", "size", default="6 AWG",
              region_defaults={"iec": "16 mm²"}),
        Input("branch_length", "Motor branch length", "quantity", unit="m", default="100 ft",
              minimum=0, min_exclusive=True, maximum=5000, region_defaults={"iec": "30 m"}),
        Input("other_kva", "Other load at the shared node", "quantity", unit="kVA", default=75,
              minimum=0, maximum=100000, region_defaults={"iec": 100},
              help="Lights and other equipment on the shared feeder."),
        Input("starts_per_hour", "Starts per hour", "quantity", unit="", default=2, minimum=0.01,
              maximum=600),
        Input("start_time_s", "Start time", "quantity", unit="s", default=3, minimum=0.01,
              maximum=120, advanced=True, help="How long the motor takes to reach speed."),
        Input("starting_pf", "Locked-rotor power factor", "quantity", unit="", default=0.35,
              minimum=0.05, maximum=1, advanced=True,
              help="Typically 0.2 to 0.4 (common practice); lower for large motors."),
        Input("other_pf", "Other load power factor", "quantity", unit="", default=0.9,
              minimum=0, min_exclusive=True, maximum=1, advanced=True),
        _inputs.material(advanced=True),
        Input("source_v", "Transformer primary voltage", "quantity", unit="V", default=12470,
              minimum=100, maximum=800000, region_defaults={"iec": 11000}, advanced=True),
        _inputs.source_power(default=250, advanced=True),
        _inputs.source_x_r(advanced=True),
        Input("xfmr_x_r", "Transformer X/R", "quantity", unit="", default=5, minimum=0.1,
              maximum=100, advanced=True),
        _inputs.frequency(advanced=True),
    ),
    outputs=(
        Output("dip_pct_motor", "Dip at the motor", "%"),
        Output("dip_pct_shared", "Dip at the shared node (lights)", "%"),
        Output("motor_v_start", "Motor voltage during the start", "V"),
        Output("dip_pct_transformer", "Dip at the transformer secondary", "%"),
        Output("locked_rotor_a", "Locked-rotor current used", "A"),
    ),
    compute=_motor_start_view,
)
