"""pf-correction: how many kvar of capacitors bring a load to a target power factor, what current
and capacitance is that, what does it save, and will the bank resonate with the supply at a
harmonic that drives produce? With the detuning reactor that moves the resonance below the 5th.
"""

from calc import cautions, electrical
from calc.calculators import _inputs
from calc.calculators._plausibility import plausibility
from calc.errors import InputError
from calc.power_factor import (
    DETUNED_BANK_READ,
    DETUNING_FACTORS,
    IEEE18_CURRENT,
    IEEE18_RMS_VOLTAGE,
    NEC_460_8_FACTOR,
    SIX_PULSE_HARMONICS,
    bus_short_circuit_power,
    capacitance_per_phase,
    capacitor_rated_reactive_power,
    capacitor_reactive_power,
    capacitor_voltage,
    resonance_order,
    tan_phi,
    tuning_order,
    voltage_rise_pct,
)
from calc.spec import Calculator, Input, Output, Result
from calc.units import format_quantity as fq

# A parallel resonance within ±10 % of a harmonic present in the load is treated as being on it
# — common practice (the resonance is broad: Q of a few to ten on LV systems).
RESONANCE_BAND = 0.10

# The detuning suggested when none is entered: 7 % tunes to 3.78 × f1, below the 5th (the
# relation n = 1/√p: J. C. Das, Power System Harmonics and Filter Design, 1st ed., 2015 — from
# memory; 7 % → 189 Hz at 50 Hz read, as worked at studylib.net document 27030577).
SUGGESTED_DETUNING_PCT = 7.0

# ---- plausibility: the range of real banks and supplies (issue 11, item 9) -------------------

# A bank is a small part of the short-circuit power at its bus (LV banks are a few percent):
# beyond this share the bus would rise by more than this many percent on switching in, the
# linear estimate ΔU ≈ Q_c/S_sc is 10 % low (exact: Q/(S − Q), computed) and the supply data or
# the bank is out of proportion — common practice. Its resonance is not judged OK beyond it.
BANK_SHARE_MAX_PCT = 10.0

# Below the fundamental (h < 1) the bank's reactive power exceeds the short-circuit power: that
# is no harmonic resonance but a bank far too large for the supply (computed: h² = S_sc/Q_c).
FUNDAMENTAL_ORDER = 1.0

# A transformer carries its nameplate continuously; a load beyond 150 % of rating exceeds the
# loading guides' emergency limits (IEEE Std C57.91, IEC 60076-7 — from memory; the same limit
# as the transformer calculators'). Such a load is not the load of the transformer entered.
TRANSFORMER_OVERLOAD_MAX = 1.5

# Transformer impedance of real units: about 0.5 % (small dry types) to 20 % (large power
# transformers) — common practice; the same range as the transformer calculators'.
TRANSFORMER_Z_RANGE_PCT = (0.5, 20.0)

# Power capacitors are built for 50 Hz or 60 Hz supplies: IEEE Std 18 covers "a nominal
# frequency of 50 Hz or 60 Hz" (read, in the standard's published abstract); a band of ±10 %
# around them.
SUPPLY_FREQUENCY_RANGE_HZ = (45.0, 66.0)

# Capacitor banks for power-factor correction are made for supplies of about 120 V and up
# (IEEE Std 18 covers units rated 216 V and up — read, in the standard's published abstract;
# 120 V single-phase units exist — common practice).
SUPPLY_VOLTAGE_MIN_V = 100.0

# Low-voltage switchboard and switchgear mains reach 5000–6000 A (UL 891, IEEE C37.20.1 — from
# memory, as the transformer calculators); larger loads are supplied at a higher voltage.
LINE_CURRENT_MAX_A = 6000.0

# Switching a bank step in should move the bus voltage by no more than a few percent; above
# this the step is large for the supply — common practice.
VOLTAGE_RISE_LIMIT_PCT = 3.0

# Targets above this risk a leading power factor when the load drops — common practice.
HIGH_TARGET_PF = 0.98

# A usual lagging target's lower end — common practice.
USUAL_TARGET_PF = 0.95

# Input floors below which the arithmetic, not the equipment, would fail (a resonance order
# from a bank of 1e-300 var, tan φ overflowing): 1 W of load, 0.1 % impedance and a power factor
# of 0.01, far below any real one.
MIN_POWER_KW = 0.001
MIN_POWER_FACTOR = 0.01
# Likewise 10 VA of transformer, 1 kVA of fault level and a 0.5 % reactor (detuning reactors are
# 5 to 14 %, inrush-limiting ones about 0.5 to 1 %).
MIN_TRANSFORMER_KVA = 0.01
MIN_SOURCE_MVA = 0.001
MIN_REACTOR_PCT = 0.5
MIN_IMPEDANCE_PCT = 0.1

# A whole load below this power factor is an idling magnetising load or a meter read with the
# wrong sign or CT; loaded motors and mixed plant run at 0.5 to 0.9 — common practice.
PRESENT_PF_MIN = 0.3

SENSES = (("lagging", "Lagging (inductive: motors, transformers)"),
          ("leading", "Leading (capacitive)"))

NEC_PCT = 100.0 * NEC_460_8_FACTOR


def _ordinal_list(orders):
    """"5th, 7th, 11th and 13th"."""
    words = [f"{h}th" for h in orders]
    return ", ".join(words[:-1]) + " and " + words[-1]


SOURCES = (
    "Q_c = P (tan φ1 − tan φ2), I = Q/(√3 V), C = Q/(2πf V²): IEEE Std 141-1993 (Red Book), "
    "ch. 8 — from memory.",
    f"Conductor ampacity ≥ {NEC_PCT:g} % of rated capacitor current: NEC 460.8(A) — from "
    "memory.",
)
SOURCE_RESONANCE = (
    "h = √(S_sc/Q_c): IEEE Std 1531-2020 and IEEE Std 519 application guidance (read; the "
    "clause numbers from memory). Detuning p with n = 1/√p and U_C = U/(1 − p): "
    f"{DETUNED_BANK_READ}. Continuous limits {100 * IEEE18_RMS_VOLTAGE:g} % voltage and "
    f"{100 * IEEE18_CURRENT:g} % current: IEEE Std 18-2012 (read)."
)
ASSUMPTIONS = (
    "The load's real power stays the same after correction; the capacitors are rated at the "
    "system voltage and frequency given (their kvar scales with V² and f).",
    "Fixed bank at the load's bus; the currents are fundamental-frequency rms values.",
)
ASSUMPTION_SUPPLY = (
    "Supply as a pure inductance (transformer and source reactance); the load's resistance "
    "damps a real resonance, motors' inductance raises its order slightly."
)
CAUTION_DISCHARGE = (
    "Capacitors hold a charge after disconnection: wait for the discharge resistors (NEC "
    "460.6: down to 50 V within 1 minute at 600 V and below — from memory), then short and "
    "ground the terminals before touching them."
)


def _target(inputs):
    """The target power factor: as entered, or USUAL_TARGET_PF when left blank. A blank target
    never conflicts with a present power factor typed above it: that load needs no bank."""
    if inputs["pf_target"] is not None:
        return inputs["pf_target"]
    if inputs["pf_now"] >= USUAL_TARGET_PF:
        raise InputError("pf_now", inputs["pf_now"],
                         f"a load at {inputs['pf_now']:g} is already at or above the usual "
                         f"target of {USUAL_TARGET_PF:g}: it needs no capacitors; to raise it "
                         "further, enter a target power factor above it (up to 1)")
    return USUAL_TARGET_PF


def _check_inputs(inputs, pf_target):
    """Cross-field problems: leading/lagging mix-ups, a target below the present pf, and a
    transformer given by half."""
    pf_now = inputs["pf_now"]
    if inputs["pf_now_sense"] == "leading":
        raise InputError("pf_now_sense", "leading",
                         "a load whose power factor already leads is over-compensated: adding "
                         "capacitors makes it worse (it needs less capacitance or a reactor). "
                         "Capacitor correction is for lagging loads such as motors; check the "
                         "meter's sign convention (a negative pf or kvar reading usually means "
                         "leading) and choose lagging if the load is inductive")
    if inputs["pf_target_sense"] == "leading" and pf_target < 1.0:
        raise InputError("pf_target_sense", "leading",
                         f"a leading target ({pf_target:g} leading) means more capacitance than "
                         "the load needs: the voltage rises and utilities may bill or forbid "
                         f"it. Choose a lagging target ({USUAL_TARGET_PF:g} to "
                         f"{HIGH_TARGET_PF:g} is usual) or 1.0")
    if pf_target < pf_now:
        raise InputError("pf_target", pf_target,
                         f"the target {pf_target:g} is below the present power factor "
                         f"{pf_now:g}; capacitors raise a lagging power factor, so enter a "
                         f"target between {pf_now:g} and 1")
    if pf_target == pf_now:
        raise InputError("pf_target", pf_target,
                         f"the load is already at {pf_now:g}: no capacitors are needed; enter a "
                         f"higher target (up to 1)")
    given = [n for n in ("xfmr_kva", "xfmr_z_pct") if inputs[n] is not None]
    if len(given) == 1:
        missing = ({"xfmr_kva", "xfmr_z_pct"} - set(given)).pop()
        words = {"xfmr_kva": "its rating (kVA)", "xfmr_z_pct": "its impedance (%Z)"}[missing]
        raise InputError(missing, None, f"the transformer needs {words} as well, from its "
                         "nameplate; or leave both blank and give the fault level")


def _view(inputs):
    pf_target = _target(inputs)
    _check_inputs(inputs, pf_target)
    power, voltage, frequency = inputs["power"], inputs["voltage"], inputs["frequency_hz"]
    pf_now = inputs["pf_now"]
    phases = int(inputs["phases"])
    # The bank as entered: with its reactor, or plain (a suggested reactor is only suggested).
    p_bank = 0.0 if inputs["reactor_pct"] is None else inputs["reactor_pct"] / 100.0
    capacitor_q = capacitor_reactive_power(power, pf_now, pf_target)
    cap_a = electrical.line_current(capacitor_q, voltage, phases)
    before_va, after_va = power / pf_now, power / pf_target
    line_before = electrical.line_current(before_va, voltage, phases)
    line_after = electrical.line_current(after_va, voltage, phases)
    result = Result()

    result.output("capacitor_q", capacitor_q)
    result.output("capacitor_a", cap_a)
    p_t, v_t = fq(power, "W"), fq(voltage, "V")
    result.step("Reactive power to cancel", "Q_c = P (tan φ1 − tan φ2)",
                f"= {p_t} × ({tan_phi(pf_now):.4f} − {tan_phi(pf_target):.4f}) = "
                f"{fq(capacitor_q, 'var')}")
    k = "√3 × " if phases == 3 else ""
    result.step("Capacitor current", f"I_C = Q_c / ({k}V)",
                f"= {fq(capacitor_q, 'var')} / ({k}{v_t}) = {fq(cap_a, 'A')}")
    banks = (("wye", "c_wye", "Capacitance per phase, wye bank (each across V/√3)",
              "C_Y = Q_c / (2πf V²)"),
             ("delta", "c_delta", "Capacitance per phase, delta bank (each across V)",
              "C_Δ = Q_c / (3 × 2πf V²) = C_Y / 3")) if phases == 3 else (
        ("single", "c_single", "Capacitance", "C = Q_c / (2πf V²)"),)
    reactor_text = (f" with the {100 * p_bank:g} % reactor in series: (1 − p) × the plain value, "
                    "so that the branch X_C − X_L = (1 − p) X_C delivers Q_c" if p_bank else "")
    for connection, name, text, formula in banks:
        capacitance = capacitance_per_phase(capacitor_q, voltage, frequency, connection, p_bank)
        result.output(name, capacitance)
        thirds = "3 × " if connection == "delta" else ""
        factor, formula = ((f"(1 − {p_bank:g}) × ", formula.replace("= Q_c", "= (1 − p) Q_c"))
                           if p_bank else ("", formula))
        result.step(text + reactor_text, formula,
                    f"= {factor}{fq(capacitor_q, 'var')} / ({thirds}2π × {frequency:g} Hz "
                    f"× ({v_t})²) = {fq(capacitance, 'F')}")
    conductor = NEC_460_8_FACTOR * cap_a
    result.output("conductor_a", conductor)
    result.step(f"Capacitor conductors, at least {NEC_PCT:g} % of the capacitor current "
                "(NEC 460.8(A))", f"I_cond ≥ {NEC_460_8_FACTOR:g} I_C", f"= {fq(conductor, 'A')}")
    reduction = 100.0 * (1.0 - pf_now / pf_target)
    loss_cut = 100.0 * (1.0 - (pf_now / pf_target) ** 2)
    result.output("apparent_before", before_va)
    result.output("apparent_after", after_va)
    result.output("line_a_before", line_before)
    result.output("line_a_after", line_after)
    result.output("line_reduction_pct", reduction)
    result.output("loss_reduction_pct", loss_cut)
    result.step("Line current before and after (same kW, same voltage)", "I = P / (pf × k V)",
                f"= {fq(line_before, 'A')} → {fq(line_after, 'A')} ({reduction:.3g} % less)")
    result.step("Losses in the supply cables and transformer upstream of the bank (∝ I²)",
                "ΔP/P = 1 − (pf1 / pf2)²", f"= {loss_cut:.3g} % less")

    if inputs["pf_target"] is None:
        result.assumptions.append(f"No target entered: {USUAL_TARGET_PF:g} lagging, the usual "
                                  "lower end (common practice).")
    _resonance(result, inputs, capacitor_q, voltage, frequency, pf_target)
    _rating(result, inputs, capacitor_q, voltage, p_bank)
    plausibility(result, _implausible(inputs, result, before_va, line_before))
    if pf_target > HIGH_TARGET_PF:
        result.check("light_load", "warn",
                     f"A target above {HIGH_TARGET_PF:g} leaves the bank over-compensating when "
                     "the load drops (leading pf, raised voltage); switch the bank in steps or "
                     "with the load (common practice).")
    result.assumptions += ASSUMPTIONS
    if phases == 3:
        result.assumptions.append("Three-phase: balanced; voltage line-to-line.")
    result.sources += SOURCES
    result.cautions += [CAUTION_DISCHARGE, *cautions.COMMON]
    if voltage > 1000.0:
        result.cautions.append(cautions.MEDIUM_VOLTAGE)
    return result


def _near_harmonic(order):
    """The characteristic harmonic within RESONANCE_BAND of `order`, or None."""
    for harmonic in SIX_PULSE_HARMONICS:
        if abs(order - harmonic) <= RESONANCE_BAND * harmonic:
            return harmonic
    return None


def _resonance(result, inputs, capacitor_q, voltage, frequency, pf_target):
    """Resonance with the supply, the harmonic check, and the detuning figures."""
    xfmr_va, z_pct = inputs["xfmr_kva"], inputs["xfmr_z_pct"]
    source_va = inputs["source_mva"]
    reactor = inputs["reactor_pct"]
    rated_v = inputs["capacitor_rated_v"]
    if xfmr_va is None and source_va is None:
        result.check("resonance", "warn",
                     "No transformer or fault level given: the bank's resonance with the "
                     "supply is not checked. Enter the transformer's kVA and %Z (nameplate) "
                     "or the fault level at the bus.")
        _series_without_supply(result, inputs, pf_target)
        _capacitor_voltage(result, voltage, 0.0 if reactor is None else reactor / 100.0,
                           rated_v, reactor is not None)
        return
    s_sc = bus_short_circuit_power(xfmr_va, z_pct, source_va)
    order = resonance_order(s_sc, capacitor_q)
    rise = voltage_rise_pct(capacitor_q, s_sc)
    result.output("short_circuit_va", s_sc)
    result.output("resonance_order", order)
    result.output("resonance_hz", order * frequency)
    result.output("voltage_rise_pct", rise)
    if xfmr_va is not None and source_va is not None:
        formula, numbers = ("S_sc = 1 / (Z%/(100 S_T) + 1/S_source)",
                            f"= 1 / ({z_pct:g} %/(100 × {fq(xfmr_va, 'VA')}) + "
                            f"1/{fq(source_va, 'VA')}) = {fq(s_sc, 'VA')}")
    elif xfmr_va is not None:
        formula, numbers = ("S_sc = 100 S_T / Z% (infinite source ahead)",
                            f"= 100 × {fq(xfmr_va, 'VA')} / {z_pct:g} % = {fq(s_sc, 'VA')}")
    else:
        formula, numbers = "S_sc = fault level given", f"= {fq(s_sc, 'VA')}"
    result.step("Short-circuit power at the bank", formula, numbers)
    result.step("Parallel resonance of the supply inductance with the bank",
                "h = √(S_sc / Q_c), f_r = h f1",
                f"= √({fq(s_sc, 'VA')} / {fq(capacitor_q, 'var')}) = {order:.3g} → "
                f"{fq(order * frequency, 'Hz')}")
    result.step("Voltage rise when the bank is switched in", "ΔU ≈ 100 Q_c / S_sc",
                f"= {rise:.3g} %")
    if rise > VOLTAGE_RISE_LIMIT_PCT:
        result.check("voltage_rise", "warn",
                     f"Switching the whole bank in raises the voltage by about {rise:.3g} %: "
                     f"more than the {VOLTAGE_RISE_LIMIT_PCT:g} % a step usually should (common "
                     "practice); split the bank into steps or check the supply data.")
    near = _near_harmonic(order)
    share = 100.0 * capacitor_q / s_sc
    if share > BANK_SHARE_MAX_PCT:
        result.check("resonance", "warn", _out_of_proportion(order, share, capacitor_q, s_sc))
    elif near is not None and reactor is not None:
        result.check("resonance", "pass",
                     f"A plain bank would resonate with the supply at h = {order:.3g}, on the "
                     f"{near}th harmonic; the {reactor:g} % reactor entered moves the resonance "
                     "below its tuning order (see the detuned check).")
    elif near is not None:
        result.check("resonance", "warn",
                     f"The bank resonates with the supply at h = {order:.3g}, on the {near}th "
                     "harmonic of six-pulse drives and rectifiers "
                     f"({', '.join(map(str, SIX_PULSE_HARMONICS))}): "
                     "a small harmonic current there is amplified, overheating capacitors and "
                     "blowing their fuses. Use a detuned bank (reactor) or change the kvar.")
    else:
        result.check("resonance", "pass",
                     f"The resonance at h = {order:.3g} is more than "
                     f"{RESONANCE_BAND * 100:g} % from the {_ordinal_list(SIX_PULSE_HARMONICS)} "
                     "harmonics; it moves as kvar steps switch and the supply changes, so check "
                     "each step.")
    p = _detuning(result, reactor, s_sc, capacitor_q, frequency, share <= BANK_SHARE_MAX_PCT)
    _capacitor_voltage(result, voltage, p, rated_v, True)
    _resonance_series(result, capacitor_q, s_sc, p)
    result.assumptions.append(ASSUMPTION_SUPPLY)
    result.sources.append(SOURCE_RESONANCE)


def _out_of_proportion(order, share, capacitor_q, s_sc):
    """The resonance check's words for a bank out of proportion to its supply."""
    if order < FUNDAMENTAL_ORDER:
        return (f"h = {order:.3g} is below the fundamental: the bank ({fq(capacitor_q, 'var')}) "
                f"exceeds the short-circuit power at the bus ({fq(s_sc, 'VA')}). That is no "
                "harmonic resonance but a bank far too large for this supply; check the "
                "transformer's kVA and %Z, or the fault level.")
    return (f"The bank is {share:.3g} % of the short-circuit power at the bus, more than the "
            f"{BANK_SHARE_MAX_PCT:g} % a bank usually is (common practice): its resonance "
            f"(h = {order:.3g}) sits low among the harmonics and switching it in moves the "
            "voltage far; the figures are not judged OK. Check the supply data or split the bank.")


def _detuning(result, reactor, s_sc, capacitor_q, frequency, in_proportion):
    """The detuned bank's tuning and resonance orders and its check; returns p [-]."""
    suggested = reactor is None
    p_pct = SUGGESTED_DETUNING_PCT if suggested else reactor
    p = p_pct / 100.0
    n = tuning_order(p)
    detuned = resonance_order(s_sc, capacitor_q, p)
    result.output("detuning_pct", p_pct)
    result.output("tuning_order", n)
    result.output("tuned_hz", n * frequency)
    result.output("detuned_resonance_order", detuned)
    label = "Suggested detuning reactor" if suggested else "Detuning reactor"
    result.step(f"{label}: p = X_L / X_C = {100 * p:g} %; series tuning order",
                "n = 1 / √p", f"= 1 / √{p:g} = {n:.3g} → {fq(n * frequency, 'Hz')}")
    result.step("Parallel resonance of the detuned bank with the supply (moves below n)",
                "h' = 1 / √(p + (1 − p) Q_c / S_sc)", f"= {detuned:.3g}")
    lowest = SIX_PULSE_HARMONICS[0]
    if not in_proportion:
        result.check("detuned", "warn",
                     f"With p = {100 * p:g} % the resonance would be at h' = {detuned:.3g}, but "
                     "the bank is out of proportion to its supply (see the resonance check): "
                     "not judged.")
    elif detuned < lowest * (1.0 - RESONANCE_BAND):
        result.check("detuned", "pass",
                     f"With p = {100 * p:g} % the bank is inductive above "
                     f"{fq(n * frequency, 'Hz')} and its resonance (h' = {detuned:.3g}) is below "
                     f"the {lowest}th harmonic.")
    else:
        result.check("detuned", "warn",
                     f"With p = {100 * p:g} % the resonance is at h' = {detuned:.3g}, not safely "
                     f"below the {lowest}th harmonic; choose a larger p "
                     f"({SUGGESTED_DETUNING_PCT:g} % or {100 * DETUNING_FACTORS[-1]:g} %).")
    return p


def _series_without_supply(result, inputs, pf_target):
    """The chart when no supply is given: the bank's reactive power against the target pf."""
    # min(): pf_now + (1 - pf_now) can round to just over 1 (0.3048 + 0.6952), past tan φ's domain.
    targets = [min(1.0, inputs["pf_now"] + (1.0 - inputs["pf_now"]) * k / 100.0) for k in range(101)]
    result.series = {
        "title": "Capacitor kvar against the target power factor",
        "x": {"label": "Target power factor", "unit": "", "values": targets},
        "y": [{"label": "Capacitor reactive power", "unit": "var",
               "values": [capacitor_reactive_power(inputs["power"], inputs["pf_now"], t)
                          for t in targets]}],
        "marks": [{"axis": "x", "value": pf_target, "label": "Target"}],
    }


def _capacitor_voltage(result, voltage, p, rated_v, show):
    """Capacitor voltage with the reactor, against the IEEE 18 continuous limits."""
    u_c = capacitor_voltage(voltage, p)
    if show:
        result.output("capacitor_v", u_c)
        result.step("Voltage on the capacitors with the series reactor: their rated voltage must "
                    "be at least this", "U_C = U / (1 − p)",
                    f"= {fq(voltage, 'V')} / (1 − {p:g}) = {fq(u_c, 'V')}")
    limit = f"{100 * IEEE18_RMS_VOLTAGE:g} %"
    if rated_v is None:
        if p:
            result.check("capacitor_voltage", "warn",
                         f"The capacitors of a detuned bank run at {fq(u_c, 'V')}, above the "
                         f"{fq(voltage, 'V')} system: enter their rated voltage to check it "
                         f"(IEEE 18 allows {limit} continuously).")
        return
    ratio = u_c / rated_v
    if ratio > IEEE18_RMS_VOLTAGE:
        status, words = "fail", f"above the {limit} continuous limit"
    elif ratio > 1.0:
        status, words = "warn", f"above rating, inside the {limit} continuous allowance"
    else:
        status, words = "pass", "within rating"
    result.check("capacitor_voltage", status,
                 f"Capacitors rated {fq(rated_v, 'V')} see {fq(u_c, 'V')} ({100 * ratio:.3g} %): "
                 f"{words} (IEEE Std 18-2012: {limit} rms voltage, {100 * IEEE18_CURRENT:g} % "
                 "current continuously).")


def _rating(result, inputs, capacitor_q, voltage, p):
    """What the capacitors' nameplate says: their kvar at their rated voltage (entered), or at
    the voltage a detuned bank puts on them. Nothing for a plain bank without a rating."""
    rated_v = inputs["capacitor_rated_v"]
    if not p and rated_v is None:
        return
    rated_q = capacitor_rated_reactive_power(capacitor_q, voltage, p, rated_v)
    result.output("capacitor_rated_q", rated_q)
    if rated_v is None:
        result.step(f"The capacitors' own reactive power at the {fq(voltage / (1 - p), 'V')} "
                    "they run at (what their nameplate must give there)", "Q_C = Q_c / (1 − p)",
                    f"= {fq(capacitor_q, 'var')} / (1 − {p:g}) = {fq(rated_q, 'var')}; the "
                    f"reactor takes the difference, {fq(rated_q - capacitor_q, 'var')}")
    else:
        result.step(f"Nameplate reactive power of capacitors rated {fq(rated_v, 'V')} that "
                    f"deliver Q_c at {fq(voltage, 'V')}", "Q_r = Q_c (1 − p) (U_r / U)²",
                    f"= {fq(capacitor_q, 'var')} × (1 − {p:g}) × ({fq(rated_v, 'V')} / "
                    f"{fq(voltage, 'V')})² = {fq(rated_q, 'var')}")
    if p:
        result.sources.append("Detuned bank: C = (1 − p) × the plain value, U_C = U/(1 − p), "
                              "Q_r = Q_c (1 − p)(U_r/U)²: " + DETUNED_BANK_READ + ".")


def _implausible(inputs, result, before_va, line_before):
    """Why these inputs or results lie outside real banks and supplies ([] when they do not)."""
    reasons = []
    voltage, frequency = inputs["voltage"], inputs["frequency_hz"]
    if inputs["pf_now"] < PRESENT_PF_MIN:
        reasons.append(f"a present power factor of {inputs['pf_now']:g}: loaded plant runs at 0.5 "
                       f"to 0.9, below {PRESENT_PF_MIN:g} only idling magnetising loads or a "
                       "meter read with the wrong sign or CT (common practice)")
    if voltage < SUPPLY_VOLTAGE_MIN_V:
        reasons.append(f"a {fq(voltage, 'V')} supply: power-factor capacitors are built for "
                       f"supplies of {SUPPLY_VOLTAGE_MIN_V:g} V and up (IEEE Std 18 units from "
                       "216 V; 120 V units exist — common practice)")
    low, high = SUPPLY_FREQUENCY_RANGE_HZ
    if not low <= frequency <= high:
        reasons.append(f"{fq(frequency, 'Hz')}: power capacitors are rated for 50 Hz or 60 Hz "
                       f"supplies (IEEE Std 18 scope); {low:g} to {high:g} Hz is usual")
    if line_before > LINE_CURRENT_MAX_A:
        reasons.append(f"the load draws {fq(line_before, 'A')} at {fq(voltage, 'V')}: "
                       f"switchboards and switchgear mains stop at about {LINE_CURRENT_MAX_A:g} "
                       "A (UL 891, IEEE C37.20.1 — from memory), so a load this large is "
                       "supplied at a higher voltage")
    xfmr_va, z_pct = inputs["xfmr_kva"], inputs["xfmr_z_pct"]
    if xfmr_va is not None:
        if before_va > TRANSFORMER_OVERLOAD_MAX * xfmr_va:
            reasons.append(f"the load ({fq(before_va, 'VA')}) is {before_va / xfmr_va:.3g} × the "
                           f"{fq(xfmr_va, 'VA')} transformer: loads beyond "
                           f"{100 * TRANSFORMER_OVERLOAD_MAX:g} % exceed the loading guides' "
                           "emergency limits (IEEE Std C57.91 — from memory); check the "
                           "transformer's rating")
        z_low, z_high = TRANSFORMER_Z_RANGE_PCT
        if not z_low <= z_pct <= z_high:
            reasons.append(f"a transformer impedance of {z_pct:g} %: real transformers are "
                           f"{z_low:g} % to {z_high:g} % (common practice)")
    value = {name: value for name, (value, _) in result.outputs.items()}
    if "short_circuit_va" in value:
        share = 100.0 * value["capacitor_q"] / value["short_circuit_va"]
        if share > BANK_SHARE_MAX_PCT:
            reasons.append(f"the bank is {share:.3g} % of the short-circuit power at the bus "
                           f"(resonance order {value['resonance_order']:.3g}): banks "
                           f"are a few percent, at most about {BANK_SHARE_MAX_PCT:g} %, and the "
                           "estimates ΔU ≈ Q_c/S_sc and h = √(S_sc/Q_c) describe such banks — "
                           "common practice")
    return reasons


def _resonance_series(result, capacitor_q, s_sc, p):
    """The chart: resonance order as the bank grows from a tenth to twice its size."""
    sizes = [capacitor_q * (0.1 + 1.9 * k / 200.0) for k in range(201)]
    result.series = {
        "title": "Resonance order against bank size",
        "x": {"label": "Bank reactive power", "unit": "var", "values": sizes},
        "y_axis": {"label": "Harmonic order", "unit": ""},
        "y": [
            {"label": "Plain bank", "unit": "",
             "values": [resonance_order(s_sc, q) for q in sizes]},
            {"label": f"Detuned, p = {100 * p:g} %", "unit": "",
             "values": [resonance_order(s_sc, q, p) for q in sizes]},
        ],
        "marks": [{"axis": "x", "value": capacitor_q, "label": "This bank"}]
        + [{"axis": "y", "value": float(h), "label": f"{h}th"} for h in SIX_PULSE_HARMONICS],
    }


CALCULATOR = Calculator(
    id="pf-correction",
    title="Power-factor correction and harmonic resonance",
    summary="Capacitor kvar, current and capacitance for a target power factor, the current and "
            "loss saved, and the bank's resonance with the supply transformer.",
    group="Power quality",
    inputs=(
        Input("power", "Load real power", "quantity", unit="kW", default=150,
              minimum=MIN_POWER_KW, maximum=1e6,
              help="Average demand in kW (or hp of input)."),
        Input("pf_now", "Present power factor", "quantity", unit="", default=0.78,
              minimum=MIN_POWER_FACTOR, maximum=1, help="From the meter or the utility bill."),
        Input("pf_target", "Target power factor", "quantity", unit="", optional=True,
              minimum=0, min_exclusive=True, maximum=1,
              help=f"{USUAL_TARGET_PF:g} to {HIGH_TARGET_PF:g} lagging is usual; blank: "
                   f"{USUAL_TARGET_PF:g}."),
        Input("voltage", "System voltage", "quantity", unit="V", default=480, minimum=1,
              maximum=69000, region_defaults={"iec": 400},
              suggest="voltages", help="Line-to-line for three-phase."),
        _inputs.phases(),
        _inputs.frequency(maximum=1000),
        Input("xfmr_kva", "Supply transformer rating", "quantity", unit="kVA", default=500,
              optional=True, minimum=MIN_TRANSFORMER_KVA, maximum=1e6,
              region_defaults={"iec": 630}, help="Blank if unknown (then give the fault level)."),
        Input("xfmr_z_pct", "Transformer impedance", "quantity", unit="%", default=5.75,
              optional=True, minimum=MIN_IMPEDANCE_PCT, maximum=30,
              region_defaults={"iec": 4}, help="%Z from the nameplate."),
        _inputs.source_power(
            label="Fault level of the supply", minimum=MIN_SOURCE_MVA, min_exclusive=False,
            help="Ahead of the transformer (or at the bus if no transformer is given); blank: "
                 "infinite."),
        Input("pf_now_sense", "Present power factor is", "choice", default="lagging",
              choices=SENSES, advanced=True),
        Input("pf_target_sense", "Target power factor is", "choice", default="lagging",
              choices=SENSES, advanced=True),
        Input("reactor_pct", "Detuning reactor p", "quantity", unit="%", optional=True,
              minimum=MIN_REACTOR_PCT, maximum=20, advanced=True,
              help="X_L/X_C of the series reactor (5.67, 7 or 14 % are usual); blank: "
                   f"{SUGGESTED_DETUNING_PCT:g} % suggested."),
        Input("capacitor_rated_v", "Capacitor rated voltage", "quantity", unit="V",
              optional=True, minimum=0, min_exclusive=True, maximum=69000, advanced=True,
              help="Line-to-line nameplate voltage of the capacitors, for the IEEE 18 check."),
    ),
    outputs=(
        Output("capacitor_q", "Capacitor reactive power", "var"),
        Output("capacitor_a", "Capacitor current", "A"),
        Output("c_wye", "Capacitance per phase, wye bank", "F"),
        Output("c_delta", "Capacitance per phase, delta bank", "F"),
        Output("c_single", "Capacitance (single-phase)", "F"),
        Output("conductor_a", f"Conductor ampacity needed ({NEC_PCT:g} %)", "A"),
        Output("line_a_before", "Line current before", "A"),
        Output("line_a_after", "Line current after", "A"),
        Output("line_reduction_pct", "Line current reduction", "%"),
        Output("loss_reduction_pct", "Upstream loss reduction", "%"),
        Output("apparent_before", "Apparent power before", "VA"),
        Output("apparent_after", "Apparent power after", "VA"),
        Output("short_circuit_va", "Short-circuit power at the bank", "VA"),
        Output("resonance_order", "Parallel resonance, harmonic order", ""),
        Output("resonance_hz", "Parallel resonance frequency", "Hz"),
        Output("voltage_rise_pct", "Voltage rise on switching in", "%"),
        Output("detuning_pct", "Detuning reactor p", "%"),
        Output("tuning_order", "Tuning order of the detuned bank", ""),
        Output("tuned_hz", "Tuning frequency of the detuned bank", "Hz"),
        Output("detuned_resonance_order", "Resonance order with the reactor", ""),
        Output("capacitor_v", "Capacitor voltage with the reactor (their least rated voltage)",
               "V"),
        Output("capacitor_rated_q", "Capacitors' nameplate reactive power at their rated voltage",
               "var"),
    ),
    compute=_view,
)
