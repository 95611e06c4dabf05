"""Motor-start voltage dip along a supply path: how far the voltage falls at the motor and at the
shared node where other loads (the lights) hang, how long, whether it matters, and what fixes it.
"""

import math

from calc import cautions, motors, network, transformers, units
from calc.errors import InputError
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

SQRT3 = math.sqrt(3.0)
HP_W = units.to_si(1, "hp")

# Starting methods and their line currents come from calc.motors (REFERENCE_VALUES 4d). Methods
# that act like an impedance (full voltage, wye-delta, autotransformer) are the locked-rotor
# impedance scaled by I_LR / I_line; soft starters and drives hold a current. The primary reactor
# needs its voltage fraction, which this calculator does not ask for, so it is left out here.
STARTING = tuple(item for item in motors.STARTING_METHODS if item[0] != "reactor")
HELD_CURRENT = ("soft", "vfd")
HELD_PF = {"soft": 0.35, "vfd": 0.9}  # power factor of that current (common practice)

# Judgement thresholds, each with its basis (see REFERENCE_VALUES 7).
MOTOR_ACCELERATE_PCT = 80.0  # IEEE 141 ch. 3, critical voltage levels — from memory
CONTACTOR_DROPOUT_PCT = (60.0, 70.0)  # IEEE 141 / NEMA ICS: may drop out — from memory
IEC_61000_3_3_D_MAX_PCT = 4.0  # general case (6 % or 7 % under conditions) — from memory
IEC_61000_3_3_D_C_PCT = 3.3  # for more than 500 ms during a change (Ed. 3 T_max) — from memory
# Rule-of-thumb "borderline of irritation" for lamp flicker against starts per hour (common
# practice; the shape of the flicker curve published in IEEE 141, values from memory).
FLICKER_IRRITATION = ((1.0, 6.0), (10.0, 4.0), (60.0, 2.5), (600.0, 1.3))

SIZE_STEP = 2  # how many sizes larger the "bigger shared conductor" remedy tries


def letter_range(code_letter):
    """(low, high) locked-rotor kVA per hp of a NEMA code letter; V has no upper figure, so its
    lower one stands for both (NEMA MG 1 §10.37.2 via calc.motors.CODE_LETTERS)."""
    low, high = motors.CODE_LETTERS[code_letter]
    return low, low if high is None else high


def locked_rotor_current(hp, voltage, code_letter, phases=3):
    """(low, high) locked-rotor current [A] from the NEMA code letter range.

    I_LR = kVA/hp × hp × 1000 / (√3 V) for three-phase (NEMA MG 1 10.37.2, read).

    Examples
    --------
    >>> [round(i) for i in locked_rotor_current(25, 480, "G")]
    [168, 189]
    """
    return tuple(motors.locked_rotor_current(kva_per_hp, hp * HP_W, voltage, phases)
                 for kva_per_hp in letter_range(code_letter))


def interpolate_log(points, x):
    """Straight-line interpolation in log(x), clamped at both ends."""
    if x <= points[0][0]:
        return points[0][1]
    for (x0, y0), (x1, y1) in zip(points, points[1:]):
        if x <= x1:
            t = (math.log(x) - math.log(x0)) / (math.log(x1) - math.log(x0))
            return y0 + t * (y1 - y0)
    return points[-1][1]


def _path_data(inputs, feeder_size=None, kva=None, separate=False):
    """The supply path as data: source → transformer (node 1) → shared feeder (node 2) → motor
    branch (node 3); `separate` feeds the motor by its own run from the transformer instead."""
    source = {"voltage": inputs["source_v"], "frequency_hz": inputs["frequency_hz"],
              "x_r": inputs["source_x_r"]}
    if inputs["source_mva"] is not None:
        source["fault_mva"] = inputs["source_mva"] / 1e6
    transformer = {"kind": "transformer", "name": "Transformer",
                   "kva": (kva or inputs["xfmr_kva"]) / 1e3, "primary_v": inputs["source_v"],
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


def _motor_load(inputs, starting):
    """The starting motor as a load at its terminals: (load data, held current or None, I_LR)."""
    hp = inputs["motor_power"] / HP_W
    volts = inputs["secondary_v"]
    if inputs["lra"] is not None:
        locked = inputs["lra"]
    else:
        locked = locked_rotor_current(hp, volts, inputs["code_letter"])[1]  # high end: worst case
    full_load = inputs["motor_power"] / (SQRT3 * volts * 0.9 * 0.85)  # η 0.9, pf 0.85 assumed
    line = motors.starting_current(starting, locked, full_load).line
    if starting in HELD_CURRENT:
        return {"kva": SQRT3 * volts * line / 1e3, "pf": HELD_PF[starting], "model": "current"}, line, locked
    kva = SQRT3 * volts * line / 1e3  # the locked-rotor impedance seen through the starter
    return {"kva": kva, "pf": inputs["starting_pf"], "model": "impedance"}, None, locked


def impedance_scale(starting):
    """Z seen by the supply ÷ the motor's locked-rotor Z for an impedance-like starting method."""
    return 1.0 / motors.starting_current(starting, 1.0, 1.0).line


def _dips(inputs, starting=None, feeder_size=None, kva=None, separate=False):
    """Voltages before and during the start at each node; dips in % of the voltage before."""
    motor, held, locked = _motor_load(inputs, starting or inputs["starting"])
    other = {"kva": inputs["other_kva"] / 1e3, "pf": inputs["other_pf"], "model": "power", "node": 2}
    data = _path_data(inputs, feeder_size, kva, separate)
    try:
        before = network.solve(network.path_from_dict({**data, "loads": [other]}))
        during = network.solve(network.path_from_dict({**data, "loads": [other, dict(motor, node=3)]}))
    except network.PathError as error:
        raise InputError("motor_power", inputs["motor_power"], f"{error}: the supply cannot start "
                         "this motor; a larger transformer or a reduced-voltage starter is needed") from None
    dip = [100.0 * (b - d) / b for b, d in zip(before.voltages, during.voltages)]
    return {"before": before.voltages, "during": during.voltages, "dip": dip,
            "motor_v": during.voltages[3], "motor_dip": dip[3], "shared_dip": dip[2],
            "locked": locked, "held": held}


def _next_size(size, steps):
    labels = units.METRIC_SIZES if size.system == "mm2" else units.AWG_SIZES + units.KCMIL_SIZES
    index = labels.index(size.label) + steps
    return units.parse_conductor_size(labels[min(index, len(labels) - 1)])


def _next_rating(kva, region_is_iec):
    ratings = transformers.PREFERRED_KVA_IEC if region_is_iec else transformers.PREFERRED_KVA_3PH_NA
    larger = [r * 1e3 for r in ratings if r * 1e3 > kva * 1.0001]
    return larger[0] if larger else kva * 1.5


def _motor_start_view(inputs):
    result = Result()
    base = _dips(inputs)
    nominal = inputs["secondary_v"]
    motor_pct = 100.0 * base["motor_v"] / nominal
    result.output("dip_pct_motor", base["motor_dip"])
    result.output("dip_pct_shared", base["shared_dip"])
    result.output("motor_v_start", base["motor_v"])
    result.output("dip_pct_transformer", base["dip"][1])
    result.output("locked_rotor_a", base["locked"])

    start_text = dict(STARTING)[inputs["starting"]]
    source = ("infinite source" if inputs["source_mva"] is None else
              f"source {fq(inputs['source_mva'], 'VA')} short-circuit, X/R {inputs['source_x_r']:g}")
    result.step(f"Supply path: {source} → {fq(inputs['xfmr_kva'], 'VA')} {inputs['xfmr_z_pct']:g} % "
                f"transformer → shared feeder {inputs['feeder_size'].label} × {fq(inputs['feeder_length'], 'm')}"
                f" → motor branch {inputs['branch_size'].label} × {fq(inputs['branch_length'], 'm')}",
                "per-unit series impedances; other loads at the shared node (constant power)",
                "solved by the path engine before and during the start")
    if inputs["lra"] is None:
        result.step(f"Locked-rotor current from code letter {inputs['code_letter']} (top of its range, "
                    "the worst case)", "I_LR = kVA/hp × hp × 1000 / (√3 V)",
                    f"= {letter_range(inputs['code_letter'])[1]:g} × "
                    f"{inputs['motor_power'] / HP_W:.3g} hp × 1000 / (√3 × {fq(nominal, 'V')}) = "
                    f"{fq(base['locked'], 'A')}")
    if base["held"] is None:
        result.step(f"Starting: {start_text}; the motor is its locked-rotor impedance at "
                    f"pf {inputs['starting_pf']:g}, seen by the supply × {impedance_scale(inputs['starting']):.3g}",
                    "Z_start = V² / S_LR × scale", "constant impedance while it accelerates")
    else:
        result.step(f"Starting: {start_text}", "I_line = multiple × I_FL",
                    f"= {fq(base['held'], 'A')} held")
    for node, name in ((1, "Transformer secondary"), (2, "Shared node (other loads)"), (3, "Motor terminals")):
        result.step(f"{name}: voltage before and during the start",
                    "dip = (V_before − V_start) / V_before",
                    f"= ({fq(base['before'][node], 'V')} − {fq(base['during'][node], 'V')}) / "
                    f"{fq(base['before'][node], 'V')} = {base['dip'][node]:.3g} %")

    # judgements
    accelerate = motor_pct >= MOTOR_ACCELERATE_PCT
    result.check("motor_accelerates", "pass" if accelerate else "fail",
                 f"Motor terminals at {motor_pct:.3g} % of rated during the start; a motor needs "
                 f"roughly {MOTOR_ACCELERATE_PCT:g} % to accelerate its load (IEEE 141 ch. 3, from memory).")
    lowest = min(motor_pct, 100.0 * base["during"][2] / nominal)
    low, high = CONTACTOR_DROPOUT_PCT
    status = "pass" if lowest >= high else ("warn" if lowest >= low else "fail")
    result.check("contactor_dropout", status,
                 f"Lowest voltage {lowest:.3g} % of nominal; contactors and starters may drop out "
                 f"near {low:g}–{high:g} % (IEEE 141 / NEMA ICS, from memory).")
    shared = base["shared_dip"]
    result.check("iec_61000_3_3", "pass" if shared <= IEC_61000_3_3_D_MAX_PCT else "fail",
                 f"Dip at the shared node {shared:.3g} %; IEC 61000-3-3 allows a maximum relative "
                 f"voltage change d_max of {IEC_61000_3_3_D_MAX_PCT:g} % in general (6 % or 7 % for "
                 "equipment switched rarely or attended; from memory). It is a limit for equipment "
                 "on a reference supply, used here as the published yardstick.")
    long_dip = shared > IEC_61000_3_3_D_C_PCT and inputs["start_time_s"] > 0.5
    result.check("dip_duration", "warn" if long_dip else "pass",
                 f"The dip lasts about {inputs['start_time_s']:g} s (given); IEC 61000-3-3 lets d(t) "
                 f"exceed {IEC_61000_3_3_D_C_PCT:g} % for at most 0.5 s during a change (from memory).")
    irritation = interpolate_log(FLICKER_IRRITATION, inputs["starts_per_hour"])
    result.check("lights_flicker", "pass" if shared <= irritation else "warn",
                 f"At {inputs['starts_per_hour']:g} starts per hour people find dips above about "
                 f"{irritation:.2g} % irritating (rule-of-thumb flicker curve: common practice, "
                 f"from memory); this start dips the lights {shared:.3g} %.")

    # what would fix it, each recomputed
    remedies = []
    bigger = _next_size(inputs["feeder_size"], SIZE_STEP)
    if bigger.label != inputs["feeder_size"].label:
        remedies.append((f"Shared feeder two sizes larger ({bigger.label})", _dips(inputs, feeder_size=bigger)))
    remedies.append(("Motor on its own run from the transformer", _dips(inputs, separate=True)))
    for option in ("wye-delta", "soft"):
        if option != inputs["starting"]:
            remedies.append((f"Reduced-voltage start: {dict(STARTING)[option]}", _dips(inputs, starting=option)))
    larger = _next_rating(inputs["xfmr_kva"], inputs["secondary_v"] in (230.0, 400.0, 690.0))
    remedies.append((f"Next larger transformer ({fq(larger, 'VA')}, same %Z)", _dips(inputs, kva=larger)))
    for name, option in remedies:
        result.step(f"If: {name}", "shared-node dip; motor terminal voltage",
                    f"= {option['shared_dip']:.3g} % (now {shared:.3g} %); at the motor's starter "
                    f"{100.0 * option['motor_v'] / nominal:.3g} % of rated")

    result.assumptions += [
        "The starting motor is a constant impedance (its locked-rotor impedance) until it nears "
        "speed; soft starters and drives are a held current. The dip is the worst moment, at "
        "standstill.",
        "Other loads at the shared node draw constant power; the source holds its voltage behind "
        "its short-circuit impedance.",
        "Without a nameplate LRA the top of the code-letter range is used (worst case).",
        "For the drive and soft-starter currents, full-load current is estimated with "
        "efficiency 0.9 and power factor 0.85.",
        "The start time is as given; with a high-inertia load it is longer.",
    ]
    result.sources += [
        "NEMA MG 1 §10.37.2 / NEC Table 430.7(B): locked-rotor kVA per hp by code letter.",
        "Starting-method ratios: wye-delta 1/3, autotransformer tap², from motor theory.",
        "IEEE Std 141 (Red Book) ch. 3: voltage needed to accelerate, contactor drop-out, flicker "
        "curve — from memory.",
        "IEC 61000-3-3: relative voltage change limits d_max, d_c and d(t) — from memory.",
        "Path solution: Fluxbook's radial path engine (checked against pandapower power flow).",
    ]
    result.cautions += [
        "A motor that stalls, or whose rotor is locked, keeps drawing locked-rotor current and "
        "overheats in seconds: its overload protection must trip it.",
        "Changing a starter or transformer is design work: have it checked by a qualified person "
        "and against the motor maker's data.",
    ]
    result.cautions += list(cautions.COMMON)

    nodes = [0.0, 1.0, 2.0, 3.0]
    result.series = {
        "title": "Voltage at each point of the path (0 source, 1 transformer, 2 shared node, 3 motor)",
        "x": {"label": "Point on the path", "unit": "", "values": nodes},
        "y_axis": {"label": "Voltage", "unit": "% of nominal"},
        "y": [
            {"label": "Before the start", "unit": "%", "values": [
                100.0 * v / b for v, b in zip(base["before"], [inputs["source_v"], nominal, nominal, nominal])]},
            {"label": "During the start", "unit": "%", "values": [
                100.0 * v / b for v, b in zip(base["during"], [inputs["source_v"], nominal, nominal, nominal])]},
        ],
        "marks": [{"axis": "y", "value": MOTOR_ACCELERATE_PCT, "label": "80 %: to accelerate"}],
    }
    return result


MOTOR_START_DIP = Calculator(
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
              choices=tuple((k, f"{k} ({letter_range(k)[0]:g}–{letter_range(k)[1]:g} kVA/hp)"
                             if motors.CODE_LETTERS[k][1] else f"{k} (22.4 kVA/hp and up)")
                            for k in motors.CODE_LETTERS)),
        Input("lra", "Locked-rotor current (nameplate)", "quantity", unit="A", optional=True,
              minimum=0, min_exclusive=True, maximum=1e5,
              help="If known, it replaces the code letter (blank = use the letter)."),
        Input("starting", "Starting method", "choice", default="dol", choices=STARTING),
        Input("secondary_v", "Utilisation voltage", "quantity", unit="V", default=480, minimum=100,
              maximum=1000, region_defaults={"iec": 400}, suggest="voltages",
              help="Transformer secondary and motor rating, line-to-line."),
        Input("xfmr_kva", "Transformer rating", "quantity", unit="kVA", default=300, minimum=0,
              min_exclusive=True, maximum=100000, region_defaults={"iec": 630}),
        Input("xfmr_z_pct", "Transformer impedance", "quantity", unit="%", default=5.75, minimum=0,
              min_exclusive=True, maximum=30, region_defaults={"iec": 4.0}),
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
        Input("material", "Conductor material", "choice", default="cu",
              choices=(("cu", "Copper"), ("al", "Aluminium")), advanced=True),
        Input("source_v", "Transformer primary voltage", "quantity", unit="V", default=12470,
              minimum=100, maximum=800000, region_defaults={"iec": 11000}, advanced=True),
        Input("source_mva", "Supply short-circuit level", "quantity", unit="MVA", default=250,
              optional=True, minimum=0, min_exclusive=True, maximum=1e5,
              region_defaults={"iec": 250}, advanced=True,
              help="At the transformer primary (blank = infinite source)."),
        Input("source_x_r", "Supply X/R", "quantity", unit="", default=10, minimum=0.1,
              maximum=100, advanced=True),
        Input("xfmr_x_r", "Transformer X/R", "quantity", unit="", default=5, minimum=0.1,
              maximum=100, advanced=True),
        Input("frequency_hz", "Frequency", "quantity", unit="Hz", default=60, minimum=1,
              maximum=400, region_defaults={"iec": 50}, advanced=True),
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
