"""motor-current: how much current does an induction motor take at full load, the instant it
starts, and with each starting method — and is its torque then enough for the load?

Full-load current from output, efficiency and power factor beside the NEC table; locked-rotor
current from the NEMA code letter (or a nameplate LRA, or its multiple of full-load current);
starting current and torque by method, with a chart of line current against motor voltage.
"""

from calc import cautions
from calc import induction_motors as im
from calc.calculators import _inputs, _motors
from calc.calculators._plausibility import outside, plausibility
from calc.errors import InputError, field_error
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

NO_CODE_LETTER = "none"  # the choice for a motor whose letter is not known
CODE_TABLES = (("nec", "NEC Tables 430.248 / 430.250 (North America)"),
               ("none", "None: nameplate practice (IEC)"))

# A calculated full-load current within this of the table value is called consistent. The
# tables are for typical motors, not this one: with typical efficiency and power factor the
# formula falls 5-15 % below them from 5 hp up (computed in tests/test_induction_motors.py).
TABLE_AGREEMENT = 0.15

# Starting torque at or above full-load torque starts any load that needs no more than running
# torque at standstill; below it only fans and centrifugal pumps (common practice).
FULL_LOAD_TORQUE_PCT = 100.0

# Plausibility: full-load efficiency and power factor of real induction motors, from small
# single-phase motors (about 0.4-0.6 each) to the largest premium-efficiency ones (efficiency
# about 0.97-0.98, power factor about 0.9-0.93); an induction motor needs magnetising current,
# so its power factor never reaches 1 — common practice.
EFFICIENCY_RANGE = (0.4, 0.98)
POWER_FACTOR_RANGE = (0.4, 0.95)

SOURCES = [
    "Code letters: NEMA MG 1 §10.37.2 as reproduced in NEC Table 430.7(B) (read, as reproduced "
    "by EASA).",
    "Full-load currents: NEC Tables 430.248 (single-phase) and 430.250 (three-phase) — read, "
    "as reproduced (NEC 2017, repository mjk83093/sil NEC2017_Chapter_4.md; 430.250 also NEC "
    "2008, scribd.com/doc/250218196).",
    "Starting methods: wye-delta 1/3, autotransformer line current ≈ tap², reactor ≈ k, "
    "torque ∝ V² — machine theory, from memory; soft-starter and drive settings — common "
    "practice.",
    "Power relations: S. J. Chapman, Electric Machinery Fundamentals, 5th ed., ch. 6 — from "
    "memory.",
]
CAUTIONS = [
    "NEC 430.6(A)(1): size conductors, switches and short-circuit/ground-fault protection "
    "from the TABLE full-load current, not the nameplate (except low-speed, high-torque and "
    "multispeed motors); size overload protection from the nameplate current (430.6(A)(2)) "
    "— from memory; your code book and local amendments decide.",
    "A motor whose rotor is stuck draws locked-rotor current until its protection trips; "
    "never defeat overloads to get a motor started.",
    "Open-transition wye-delta and autotransformer starters draw a brief surge at the "
    "changeover; check that protection rides through it.",
]


def _three_phase_k(phases):
    return "√3 × " if phases == 3 else ""


def _locked_rotor(inputs, power, voltage, phases, flc, result):
    """Locked-rotor range from the code letter and the current used for starting [A]."""
    letter, lra, multiple = inputs["code_letter"], inputs["lra"], inputs["lr_multiple"]
    if letter == NO_CODE_LETTER:
        letter = None
    if lra is not None and multiple is not None:
        raise InputError("lr_multiple", multiple, "give the locked-rotor current or its multiple "
                         "of full-load current, not both (clear one)")
    if letter is None and lra is None and multiple is None:
        raise InputError("code_letter", inputs["code_letter"], "give the NEMA code letter from "
                         "the nameplate, or the locked-rotor current (LRA) or its multiple of "
                         "full-load current under More inputs")
    k = _three_phase_k(phases)
    low_a = high_a = None
    if letter is not None:
        with field_error("code_letter"):
            low, high = im.code_letter_range(letter)
            low_a, high_a = im.code_letter_currents(letter, power, voltage, phases)
        result.output("locked_rotor_a_min", low_a)
        upper = f"{high:g}" if high is not None else "(no upper figure)"
        if high_a is not None:
            result.output("locked_rotor_a_max", high_a)
        result.step(f"Locked-rotor current range of code letter {letter} ({low:g} to {upper} "
                    "kVA/hp; NEC Table 430.7(B))",
                    f"I_LR = kVA/hp × hp × 1000 / ({k}V)",
                    f"= {low:g} … {upper} × {im.horsepower(power):.4g} hp × 1000 / ({k}"
                    f"{fq(voltage, 'V')}) = {fq(low_a, 'A')} … "
                    f"{fq(high_a, 'A') if high_a is not None else 'no limit'}")
    if lra is not None:
        used, basis = lra, "the locked-rotor current given"
    elif multiple is not None:
        used, basis = multiple * flc, f"{multiple:g} × the calculated full-load current"
        result.step("Locked-rotor current from the multiple given", "I_LR = m × I_FL",
                    f"= {multiple:g} × {fq(flc, 'A')} = {fq(used, 'A')}")
    elif high_a is not None:
        used, basis = high_a, f"the upper end of code letter {letter} (the most current it allows)"
    else:
        used, basis = low_a, f"the lower end of code letter {letter} (V has no upper figure)"
        result.check("code_letter_v", "warn", "Code letter V has no upper figure: the starting "
                     f"current shown is its minimum, {fq(used, 'A')}; the motor may draw more.")
    if letter is None:
        result.output("locked_rotor_a_min", used)
        result.output("locked_rotor_a_max", used)
    if lra is not None or multiple is not None:
        _implied_letter(letter, used, power, voltage, phases, result)
    share = used / flc
    low_m, high_m = im.PLAUSIBLE_LOCKED_ROTOR_MULTIPLE
    usual_low, usual_high = im.USUAL_LOCKED_ROTOR_MULTIPLE
    typical = low_m <= share <= high_m
    result.check("locked_rotor_multiple", "pass" if typical else "warn",
                 f"Locked-rotor current is {share:.3g} × full-load current; across-the-line "
                 f"starting is typically {usual_low:g}-{usual_high:g} × (common practice)" +
                 ("." if typical else f", so {share:.3g} × deserves a check of the data."))
    return used, basis


def _implied_letter(letter, used, power, voltage, phases, result):
    """The locked-rotor ratio of a given current, and its code letter against the one entered."""
    ratio = im.locked_rotor_ratio(used, power, voltage, phases)
    kva_per_hp = im.locked_rotor_kva_per_hp(used, power, voltage, phases)
    implied = im.code_letter_for(kva_per_hp)
    result.output("locked_rotor_ratio", ratio,
                  f"{kva_per_hp:.3g} kVA/hp (code letter {implied})")
    if letter is not None:
        status = "pass" if implied == letter else "warn"
        result.check("code_letter_match", status,
                     f"{fq(used, 'A')} is {kva_per_hp:.3g} kVA/hp, code letter {implied}; the "
                     f"letter entered is {letter}" + ("." if status == "pass" else
                     ": check the nameplate (NEC Table 430.7(B) ranges)."))


def _starting(inputs, phases, locked_a, flc, result):
    method = inputs["starting"]
    if method == "wye-delta" and phases == 1:
        raise InputError("starting", method, "wye-delta starting needs a three-phase motor with "
                         "both ends of each winding brought out (six leads); choose another "
                         "method for a single-phase motor")
    limit = inputs["current_limit"]
    start = im.starting_current(method, locked_a, flc, inputs["voltage_pct"] / 100.0, limit)
    _starting_step(method, start, limit, locked_a, flc, result)
    result.output("starting_a", start.line)
    result.output("motor_starting_a", start.motor)
    result.output("starting_multiple", start.line / flc, f"{start.line / flc:.3g} × FLC")
    lrt = inputs["lrt_pct"]
    if method == "vfd":
        flt_pct = 100.0 * start.torque_fraction
        result.output("starting_torque_flt_pct", flt_pct)
        if lrt is not None:
            result.output("starting_torque_pct", 100.0 * flt_pct / lrt)
    else:
        result.output("starting_torque_pct", 100.0 * start.torque_fraction)
        if lrt is not None:
            result.output("starting_torque_flt_pct", lrt * start.torque_fraction)
    if lrt is not None:
        torque = lrt * start.torque_fraction if method != "vfd" else 100.0 * start.torque_fraction
        enough = torque >= FULL_LOAD_TORQUE_PCT
        name = dict(im.STARTING_METHODS)[method]
        result.check("starting_torque", "pass" if enough else "warn",
                     f"Starting torque {torque:.3g} % of full-load torque with {name.lower()}" +
                     (". " if enough else ": below full-load torque, enough for fans and "
                      "centrifugal pumps, which need little at standstill, but not for a loaded "
                      "conveyor or a compressor starting against pressure (common practice). ") +
                     ("" if method == "vfd" else "Torque ∝ V² through the run-up too."))
    return start


def _starting_step(method, start, limit, locked_a, flc, result):
    """The method step for the starting method chosen (and the soft starter's limit check)."""
    la = fq(locked_a, "A")
    line = fq(start.line, "A")
    if method == "dol":
        result.step("Across the line: the motor sees full voltage and draws its locked-rotor "
                    "current", "I_start = I_LR", f"= {line}")
    elif method == "wye-delta":
        result.step("Wye-delta: each winding sees V/√3 and the line current of a wye is a third "
                    "of a delta's", "I_start = I_LR / 3; T = T_LR / 3", f"= {la} / 3 = {line}")
    elif method in im.AUTOTRANSFORMER_TAPS:
        tap = im.AUTOTRANSFORMER_TAPS[method]
        result.step(f"Autotransformer at {100 * tap:g} %: motor current a × I_LR, line current "
                    "a² × I_LR (magnetising current neglected)", "I_line = a² I_LR; T = a² T_LR",
                    f"= {tap:g}² × {la} = {line} (motor {fq(start.motor, 'A')})")
    elif method == "reactor":
        k = start.voltage_fraction
        result.step(f"Primary reactor or resistor leaving k = {100 * k:g} % of rated voltage at "
                    "the motor at standstill", "I_start = k I_LR; T = k² T_LR",
                    f"= {k:g} × {la} = {line}")
    elif method == "soft":
        set_limit = limit if limit is not None else im.DEFAULT_CURRENT_LIMIT["soft"]
        result.step("Soft starter: the current limit sets the current; the voltage falls to "
                    "suit, so torque falls with the square", "I = limit × I_FL; T = (I/I_LR)² T_LR",
                    f"= {set_limit:g} × {fq(flc, 'A')} = {line}; "
                    f"({line} / {la})² = {start.torque_fraction:.3g}")
        if set_limit * flc >= locked_a:
            result.check("current_limit", "warn",
                         f"A limit of {set_limit:g} × FLC ({fq(set_limit * flc, 'A')}) is at or "
                         f"above the locked-rotor current {la}: it never acts, and the start "
                         "is as across the line.")
    else:
        set_limit = limit if limit is not None else im.DEFAULT_CURRENT_LIMIT["vfd"]
        result.step("Variable-frequency drive: the drive starts at low frequency and holds the "
                    "current to its limit", "I = limit × I_FL; T ≈ limit × T_FL",
                    f"= {set_limit:g} × {fq(flc, 'A')} = {line}")


def _full_load(inputs, power, voltage, phases, result):
    """The calculated full-load current [A], and the NEC table's beside it."""
    efficiency, pf = inputs["efficiency"], inputs["pf"]
    if not efficiency * pf * voltage > 1e-200:  # their product would underflow to 0
        raise InputError("efficiency", efficiency, "efficiency × power factor × voltage is too "
                         "small to compute with; a motor's efficiency is typically 0.7-0.97")
    flc = im.full_load_current(power, voltage, phases, efficiency, pf)
    result.output("full_load_a", flc)
    k = _three_phase_k(phases)
    result.step("Full-load current from the output power (input = output / efficiency)",
                f"I_FL = P / (η × pf × {k}V)",
                f"= {fq(power, 'W')} ({im.horsepower(power):.4g} hp) / ({efficiency:g} × {pf:g} × "
                f"{k}{fq(voltage, 'V')}) = {fq(flc, 'A')}")
    if inputs["code_table"] != "nec":
        return flc
    table_a, column, number = im.nec_table_current(power, voltage, phases)
    if table_a is None:
        result.check("code_table", "warn", f"No NEC table value: {number}.")
        return flc
    result.output("table_a", table_a)
    deviation = flc / table_a - 1.0
    result.step(f"NEC Table {number} full-load current ({column:g} V column; read, as "
                "reproduced — check your code book)", "I_table", f"= {fq(table_a, 'A')}; the "
                f"formula gives {100 * deviation:+.1f} % against it")
    agree = abs(deviation) <= TABLE_AGREEMENT
    band = f"±{100 * TABLE_AGREEMENT:g} %"
    result.check("table_agreement", "pass" if agree else "warn",
                 f"Calculated {fq(flc, 'A')} is {100 * deviation:+.1f} % from the table's "
                 f"{fq(table_a, 'A')}" + (f" (within {band}, the spread of typical motors)."
                                         if agree else f"; outside {band}: check the efficiency "
                                         "and power factor against the nameplate."))
    return flc


def _motor_current_view(inputs):
    power, voltage = inputs["power"], inputs["voltage"]
    phases = int(inputs["phases"])
    result = Result()
    flc = _full_load(inputs, power, voltage, phases, result)
    locked_a, basis = _locked_rotor(inputs, power, voltage, phases, flc, result)
    result.output("locked_rotor_a", locked_a)
    start = _starting(inputs, phases, locked_a, flc, result)
    result.series = _reduced_voltage_series(locked_a, flc, start, inputs["starting"])

    result.assumptions += [
        "Full-load current from rated output, efficiency and power factor at rated voltage and "
        "frequency; the nameplate current is the better figure where it is known.",
        f"Starting current from {basis}, at full rated voltage; a supply that sags during the "
        "start lowers it (see the motor-start dip calculator).",
        "Reduced-voltage methods: current ∝ voltage and torque ∝ voltage² at standstill; "
        "autotransformer magnetising current and open-transition switching surges neglected.",
    ]
    if inputs["starting"] == "vfd":
        result.assumptions.append(
            "Drive: the current shown is on the motor side; from the supply a drive draws "
            "roughly the power delivered, so at low speed its line current is lower (common "
            "practice).")
    if inputs["lrt_pct"] is None and inputs["starting"] != "vfd":
        result.assumptions.append(
            "Starting torque is given as a share of the across-the-line locked-rotor torque; "
            "enter the locked-rotor torque (% of full-load) under More inputs to compare it with "
            "the load.")
    _motors.size_plausibility(result, power, voltage, phases, flc, _plausibility_reasons(inputs))
    result.sources += SOURCES
    result.cautions += CAUTIONS + list(cautions.COMMON)
    return result


def _plausibility_reasons(inputs):
    """Efficiency and power factor outside those of real induction motors."""
    reasons = []
    for name, label, (low, high) in (("efficiency", "efficiency", EFFICIENCY_RANGE),
                                     ("pf", "power factor", POWER_FACTOR_RANGE)):
        if outside(inputs[name], low, high):
            reasons.append(f"a full-load {label} of {inputs[name]:g} is outside the {low:g}–"
                           f"{high:g} of real induction motors (common practice)")
    return reasons


def _reduced_voltage_series(locked_a, flc, start, method):
    """Line current at standstill against the motor's voltage: reactor (∝ k) and autotransformer
    (∝ k²), with the chosen method and the full-load current marked."""
    shares = [0.3 + 0.7 * n / 70 for n in range(71)]
    marks = [{"axis": "y", "value": flc, "label": "Full-load current"}]
    if method not in ("vfd", "dol"):
        marks.append({"axis": "x", "value": 100.0 * start.voltage_fraction,
                      "label": dict(im.STARTING_METHODS)[method]})
    return {
        "title": "Starting line current against the voltage at the motor",
        "x": {"label": "Motor voltage at standstill", "unit": "%",
              "values": [100.0 * k for k in shares]},
        "y_axis": {"label": "Line current at standstill", "unit": "A"},
        "y": [
            {"label": "Reactor or resistor (∝ k)", "unit": "A",
             "values": [k * locked_a for k in shares]},
            {"label": "Autotransformer (∝ k²)", "unit": "A",
             "values": [k * k * locked_a for k in shares]},
        ],
        "marks": marks,
    }


CALCULATOR = Calculator(
    id="motor-current",
    title="Motor full-load, locked-rotor and starting current",
    summary="Full-load current from output, efficiency and power factor beside the NEC table; "
            "locked-rotor current from the code letter; starting current and torque by method.",
    group="Motors",
    inputs=(
        Input("power", "Rated output", "quantity", unit="hp", default=10, minimum=0,
              min_exclusive=True, maximum=100000, region_defaults={"iec": "7.5 kW"},
              help="Mechanical output on the nameplate, hp or kW (e.g. 10 hp or 7.5 kW)."),
        Input("voltage", "Rated voltage", "quantity", unit="V", default=460, minimum=1,
              maximum=15000, region_defaults={"iec": 400},
              suggest="voltages", help="Line-to-line for three-phase (460 V, 400 V)."),
        _inputs.phases(),
        Input("efficiency", "Full-load efficiency", "quantity", unit="", default=0.91, minimum=0,
              min_exclusive=True, maximum=1,
              help="Nameplate nominal efficiency, e.g. 0.917 or 91.7 %."),
        Input("pf", "Full-load power factor", "quantity", unit="", default=0.85, minimum=0,
              min_exclusive=True, maximum=1, help="From the nameplate or data sheet, e.g. 0.85."),
        Input("code_letter", "NEMA code letter", "choice", default="H",
              region_defaults={"iec": NO_CODE_LETTER},
              choices=_motors.code_letter_choices()
              + ((NO_CODE_LETTER, "Not marked or not known"),),
              help="Locked-rotor kVA per hp, marked 'CODE' on the nameplate."),
        Input("starting", "Starting method", "choice", default="dol",
              choices=im.STARTING_METHODS),
        Input("voltage_pct", "Reactor or resistor: motor voltage at start", "quantity",
              unit="%", default=65, minimum=0, min_exclusive=True, maximum=100,
              help="k × V left at the motor at standstill (usual taps 50, 65, 80 %)."),
        Input("current_limit", "Soft starter or drive: current limit (× FLC)", "quantity",
              unit="", optional=True, minimum=0, min_exclusive=True, maximum=10,
              help=f"Blank: {im.DEFAULT_CURRENT_LIMIT['soft']:g} × for a soft starter, "
                   f"{im.DEFAULT_CURRENT_LIMIT['vfd']:g} × for a drive (common practice)."),
        Input("lra", "Locked-rotor current (LRA), if known", "quantity", unit="A", optional=True,
              minimum=0, min_exclusive=True, maximum=1e6, advanced=True,
              help="From the nameplate or data sheet; it replaces the code-letter figure.",
              group="locked_rotor"),
        Input("lr_multiple", "Locked-rotor current as a multiple of FLC", "quantity", unit="",
              optional=True, minimum=1, maximum=20, advanced=True,
              region_defaults={"iec": 7},
              help="I_LR / I_N from the data sheet (IEC practice), e.g. 7.", group="locked_rotor"),
        Input("lrt_pct", "Locked-rotor torque (% of full-load torque)", "quantity", unit="%",
              optional=True, minimum=0, min_exclusive=True, maximum=1000, advanced=True,
              help="From the data sheet, e.g. 150 %; lets the result compare torque with load."),
        Input("code_table", "Code table of full-load currents", "choice", default="nec",
              choices=CODE_TABLES, region_defaults={"iec": "none"}, advanced=True),
    ),
    outputs=(
        Output("full_load_a", "Full-load current (calculated)", "A"),
        Output("table_a", "Full-load current, NEC table", "A"),
        Output("locked_rotor_a_min", "Locked-rotor current, lowest for the code letter", "A"),
        Output("locked_rotor_a_max", "Locked-rotor current, highest for the code letter", "A"),
        Output("locked_rotor_a", "Locked-rotor current used", "A"),
        Output("starting_a", "Starting line current", "A"),
        Output("motor_starting_a", "Starting current in the motor leads", "A"),
        Output("starting_multiple", "Starting current, multiple of FLC", ""),
        Output("starting_torque_pct", "Starting torque, % of across-the-line torque", "%"),
        Output("starting_torque_flt_pct", "Starting torque, % of full-load torque", "%"),
        Output("locked_rotor_ratio",
               "Locked-rotor apparent power per output power (of the current given)", "VA/W"),
    ),
    compute=_motor_current_view,
)
