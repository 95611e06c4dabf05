"""Reference: RL, RC and RLC circuits, resonance, coil suppression and power-factor correction —
the formulas, circuit diagrams drawn here as inline SVG, and tables computed with calc.rlc and
calc.power_factor."""

import math
from html import escape

import numpy as np

from build.reference import GENERATED_NOTE, markdown_table
from calc import power_factor, rlc

# ---- a small schematic drawer -----------------------------------------------------------------
# Each two-terminal part is drawn along +x from (0, 0) to (length, 0) and placed with an SVG
# transform, so one drawing serves every orientation. Lines use currentColor: the diagrams follow
# the page's light or dark scheme.

BODY = 40.0  # length of a part's symbol between its leads [px]
STROKE = 'stroke="currentColor" stroke-width="2" fill="none" stroke-linecap="round"'


def _line(x1, y1, x2, y2):
    return f'<line x1="{x1:g}" y1="{y1:g}" x2="{x2:g}" y2="{y2:g}"/>'


def _leads(length):
    start, end = (length - BODY) / 2, (length + BODY) / 2
    return start, end, _line(0, 0, start, 0) + _line(end, 0, length, 0)


def _resistor(length):
    start, end, leads = _leads(length)
    step = BODY / 12
    points = [(start, 0)] + [(start + step * (2 * k + 1), -7 if k % 2 == 0 else 7)
                             for k in range(6)] + [(end, 0)]
    return leads + '<polyline points="' + " ".join(f"{x:g},{y:g}" for x, y in points) + '"/>'


def _inductor(length):
    start, _, leads = _leads(length)
    loops = "".join("a5 5 0 0 1 10 0" for _ in range(4))
    return leads + f'<path d="M{start:g} 0 {loops}"/>'


def _capacitor(length):
    middle = length / 2
    return (_line(0, 0, middle - 4, 0) + _line(middle + 4, 0, length, 0)
            + _line(middle - 4, -12, middle - 4, 12) + _line(middle + 4, -12, middle + 4, 12))


def _battery(length):
    """A cell with its positive (long) plate towards the start of the segment."""
    middle = length / 2
    return (_line(0, 0, middle - 3, 0) + _line(middle + 3, 0, length, 0)
            + _line(middle - 3, -13, middle - 3, 13) + _line(middle + 3, -6, middle + 3, 6)
            + f'<text x="{middle - 14:g}" y="-8" font-size="12" fill="currentColor" '
              'stroke="none">+</text>')


def _ac_source(length):
    middle = length / 2
    return (_line(0, 0, middle - 13, 0) + _line(middle + 13, 0, length, 0)
            + f'<circle cx="{middle:g}" cy="0" r="13"/>'
            + f'<path d="M{middle - 7:g} 0 q3.5 -8 7 0 t7 0"/>')


def _diode(length, zener=False):
    middle = length / 2
    body = (_line(0, 0, middle - 8, 0) + _line(middle + 8, 0, length, 0)
            + f'<polygon points="{middle - 8:g},-9 {middle - 8:g},9 {middle + 8:g},0"/>')
    if zener:
        return body + (f'<polyline points="{middle + 4:g},12 {middle + 8:g},9 '
                       f'{middle + 8:g},-9 {middle + 12:g},-12"/>')
    return body + _line(middle + 8, -9, middle + 8, 9)


def _varistor(length):
    middle = length / 2
    return (_line(0, 0, middle - 15, 0) + _line(middle + 15, 0, length, 0)
            + f'<rect x="{middle - 15:g}" y="-7" width="30" height="14"/>'
            + f'<polyline points="{middle - 20:g},12 {middle - 12:g},12 {middle + 14:g},-12"/>')


def _wire(length):
    return _line(0, 0, length, 0)


PARTS = {"R": _resistor, "L": _inductor, "C": _capacitor, "battery": _battery,
         "ac": _ac_source, "diode": _diode, "zener": lambda n: _diode(n, zener=True),
         "varistor": _varistor, "wire": _wire}


class Schematic:
    """An SVG drawing built part by part; coordinates in px, y down."""

    def __init__(self, width, height, title):
        self.width, self.height, self.title = width, height, title
        self.items = []

    def part(self, kind, start, end, label="", side=1):
        """A two-terminal part from `start` to `end` (axis-aligned), labelled beside it."""
        (x1, y1), (x2, y2) = start, end
        length = math.hypot(x2 - x1, y2 - y1)
        angle = math.degrees(math.atan2(y2 - y1, x2 - x1))
        self.items.append(f'<g transform="translate({x1:g} {y1:g}) rotate({angle:g})">'
                          f"{PARTS[kind](length)}</g>")
        if label:
            mx, my = (x1 + x2) / 2, (y1 + y2) / 2
            if y1 == y2:  # horizontal: label above (side 1) or below (-1)
                self.text(mx, my - 18 * side + (10 if side < 0 else 0), label, "middle")
            else:  # vertical: label to the right (side 1) or left (-1)
                self.text(mx + 20 * side, my + 4, label, "start" if side > 0 else "end")

    def wire(self, *points):
        self.items.append('<polyline points="' + " ".join(f"{x:g},{y:g}" for x, y in points)
                          + '"/>')

    def dot(self, x, y):
        self.items.append(f'<circle cx="{x:g}" cy="{y:g}" r="3" fill="currentColor"/>')

    def text(self, x, y, words, anchor="middle"):
        self.items.append(f'<text x="{x:g}" y="{y:g}" font-size="13" text-anchor="{anchor}" '
                          f'fill="currentColor" stroke="none">{escape(words)}</text>')

    def switch(self, common, first, second, to=1):
        """A changeover switch: blade from `common` towards contact 1 or 2, both marked."""
        for contact, name in ((first, "1"), (second, "2")):
            self.items.append(f'<circle cx="{contact[0]:g}" cy="{contact[1]:g}" r="3"/>')
            self.text(contact[0], contact[1] - 8, name)
        self.dot(*common)
        tip = first if to == 1 else second
        self.items.append(_line(common[0], common[1], tip[0] - 3, tip[1] + 2))

    def svg(self):
        title = escape(self.title)
        return (f'<figure class="fb-diagram"><svg xmlns="http://www.w3.org/2000/svg" '
                f'viewBox="0 0 {self.width:g} {self.height:g}" width="{self.width:g}" '
                f'height="{self.height:g}" style="max-width:100%;height:auto" role="img" '
                f'aria-label="{title}"><title>{title}</title><g {STROKE}>'
                + "".join(self.items) + f"</g></svg><figcaption>{title}</figcaption></figure>")


# ---- the diagrams -------------------------------------------------------------------------------

def _series_rlc(s, left, top, right, bottom):
    """R and L along the top from `left`, then C down the right side to `bottom`."""
    s.part("R", (left, top), (left + 80, top), "R")
    s.part("L", (left + 80, top), (left + 170, top), "L")
    s.wire((left + 170, top), (right, top))
    s.part("C", (right, top), (right, bottom), "C")


def switching_diagram():
    """DC source, changeover switch (1: source, 2: short), then R, L and C in series."""
    s = Schematic(420, 200, "Switching circuit: position 1 connects the source, 2 closes the "
                            "loop on itself")
    s.part("battery", (40, 50), (40, 170), "V", side=-1)
    s.wire((40, 50), (40, 40), (88, 40))
    s.switch((120, 60), (92, 40), (92, 80), to=1)
    s.wire((92, 80), (70, 80), (70, 170))
    s.wire((120, 60), (140, 60))
    _series_rlc(s, 140, 60, 370, 170)
    s.wire((370, 170), (40, 170))
    s.dot(70, 170)
    s.text(250, 195, "RL: C shorted · RC: L left out · RLC: all three in series")
    return s.svg()


def series_resonance_diagram():
    s = Schematic(360, 170, "Series RLC: one current through R, L and C")
    s.part("ac", (40, 140), (40, 40), "V, f", side=-1)
    s.wire((40, 40), (80, 40))
    _series_rlc(s, 80, 40, 310, 140)
    s.wire((310, 140), (40, 140))
    return s.svg()


def parallel_resonance_diagram():
    s = Schematic(360, 170, "Parallel RLC: one voltage across R, L and C")
    s.part("ac", (40, 140), (40, 40), "V, f", side=-1)
    s.wire((40, 40), (300, 40))
    s.wire((40, 140), (300, 140))
    for x, kind in ((140, "R"), (220, "L"), (300, "C")):
        s.part(kind, (x, 40), (x, 140), kind)
        s.dot(x, 40)
        s.dot(x, 140)
    return s.svg()


def suppression_diagram(kind):
    """A DC coil switched by a contact, with its suppressor across it."""
    names = {"none": "No suppression", "diode": "Freewheel diode",
             "diode_zener": "Diode + zener", "rc": "RC snubber", "varistor": "Varistor"}
    s = Schematic(250, 200, names[kind])
    s.part("battery", (30, 40), (30, 170), "V", side=-1)
    s.wire((30, 40), (70, 40))
    s.items.append(_line(70, 40, 100, 28))  # the switching contact, open
    s.dot(70, 40)
    s.items.append('<circle cx="104" cy="40" r="3"/>')
    s.wire((107, 40), (130, 40))
    s.part("R", (130, 40), (130, 100), "R coil", side=-1)
    s.part("L", (130, 100), (130, 170), "L", side=-1)
    s.wire((130, 170), (30, 170))
    if kind != "none":
        s.wire((130, 40), (200, 40))
        s.wire((130, 170), (200, 170))
        s.dot(130, 40)
        s.dot(130, 170)
    if kind == "diode":
        s.part("diode", (200, 170), (200, 40), "D")
    elif kind == "diode_zener":
        s.part("diode", (200, 170), (200, 105), "D")
        s.part("zener", (200, 40), (200, 105), "Z")
    elif kind == "rc":
        s.part("R", (200, 40), (200, 105), "Rs")
        s.part("C", (200, 105), (200, 170), "Cs")
    elif kind == "varistor":
        s.part("varistor", (200, 40), (200, 170), "MOV")
    return s.svg()


def pf_diagram():
    """Single line: supply, transformer, bus, motor load, drive and a detuned capacitor bank."""
    s = Schematic(440, 230, "Capacitor bank on a transformer-fed bus (single line)")
    s.items.append('<circle cx="40" cy="40" r="16"/>')
    s.text(40, 45, "S")
    s.text(40, 76, "S_sc source")
    s.wire((56, 40), (96, 40))
    s.items.append('<circle cx="108" cy="40" r="14"/><circle cx="128" cy="40" r="14"/>')
    s.text(118, 76, "kVA, %Z")
    s.wire((142, 40), (180, 40), (180, 100))
    s.items.append('<line x1="60" y1="100" x2="420" y2="100" stroke-width="5"/>')
    s.text(405, 92, "bus", "end")
    for x, symbol, name, caption in (
        (110, '<circle cx="110" cy="188" r="18"/>', "M", "load P, pf"),
        (230, '<rect x="212" y="170" width="36" height="30"/>', "VFD", "harmonics"),
    ):  # loads hanging from the bus
        s.wire((x, 100), (x, 170))
        s.items.append(symbol)
        s.text(x, 193 if name == "M" else 190, name)
        s.text(x, 224, caption)
    s.part("L", (350, 100), (350, 160), "reactor p", side=1)
    s.part("C", (350, 160), (350, 210), "Q_c", side=1)
    return s.svg()


# ---- the tables -------------------------------------------------------------------------------

def tau_table():
    """Rising and remaining share at whole multiples of τ, from rlc.switching_transient."""
    rows = []
    for n in range(1, 6):
        rising = rlc.switching_transient("rl", 1.0, 1.0, float(n), inductance=1.0).response
        rows.append([f"{n}τ", f"{100 * rising:.1f} %", f"{100 * (1 - rising):.1f} %"])
    return markdown_table(["Time", "Rising response (step)", "Remaining (release)"], rows)


def damping_table():
    """Overshoot, peak time and settling time against ζ, for ω0 = 1 rad/s (L = C = 1)."""
    rows = []
    for zeta in np.array([0.05, 0.1, 0.2, 0.3, 0.5, 0.707, 1.0, 2.0, 5.0]):
        r = 2.0 * float(zeta)  # ζ = (R/2)√(C/L) with L = C = 1
        peak = rlc.response_peak("rlc", r, 1.0, 1.0, 1.0)
        settle = rlc.settling_time("rlc", r, 1.0, 1.0)
        rows.append([f"{zeta:g}", f"{rlc.overshoot_pct(float(zeta)):.3g} %",
                     f"{peak.time:.3g}" if math.isfinite(peak.time) else "—", f"{settle:.3g}",
                     f"{1 / (2 * zeta):.3g}"])
    band = f"{100 * rlc.SETTLING_BAND:g} %"
    return markdown_table(["ζ", "Overshoot", "Peak time × ω0", f"Settling time ({band}) × ω0",
                           "Q = 1/(2ζ)"], rows)


def detuning_table():
    rows = []
    for p in power_factor.DETUNING_FACTORS:
        n = power_factor.tuning_order(p)
        rows.append([f"{100 * p:g} %", f"{n:.3g}", f"{n * 50:.0f} Hz", f"{n * 60:.0f} Hz",
                     f"{power_factor.capacitor_voltage(400.0, p):.0f} V",
                     f"{power_factor.capacitor_voltage(480.0, p):.0f} V"])
    return markdown_table(["p = X_L/X_C", "Tuning order n", "at 50 Hz", "at 60 Hz",
                           "U_C on 400 V", "U_C on 480 V"], rows)


def multiplier_table():
    """Capacitor reactive power per unit of real power (kvar per kW) to go from each present
    power factor to each target."""
    present = np.round(np.arange(0.60, 0.91, 0.05), 2)
    targets = np.array([0.90, 0.92, 0.95, 0.98, 1.00])
    grid = np.vectorize(power_factor.capacitor_reactive_power)(1.0, present[:, None],
                                                     np.maximum(targets[None, :], present[:, None]))
    rows = [[f"{now:.2f}"] + [f"{value:.3f}" if target > now else "—"
                              for value, target in zip(line, targets)]
            for now, line in zip(present, grid)]
    return markdown_table(["Present pf"] + [f"to {t:.2f}" for t in targets], rows)


# ---- the page ---------------------------------------------------------------------------------

def _ordinals(orders):
    """"5th, 7th, 11th or 13th"."""
    words = [f"{h}th" for h in orders]
    return ", ".join(words[:-1]) + " or " + words[-1]


def circuits_page(team_config):
    """The reference page (the team's settings do not change it)."""
    return "\n\n".join([
        "# Circuits: transients, resonance, coil suppression and capacitor banks",
        GENERATED_NOTE,
        "Formulas behind the [switching transient](../calculators/switching-transient.md), "
        "[RLC resonance](../calculators/rlc-resonance.md), "
        "[inductive kick](../calculators/inductive-kick.md) and "
        "[power-factor correction](../calculators/pf-correction.md) calculators.",
        "## Switching a DC source in and out",
        switching_diagram(),
        "- **RL:** τ = L/R; on the source i = (V/R)(1 − e^(−t/τ)); released "
        "i = (V/R) e^(−t/τ).\n"
        "- **RC:** τ = RC; on the source v_C = V(1 − e^(−t/τ)); released v_C = V e^(−t/τ).\n"
        "- **Series RLC:** α = R/(2L) (envelope τ = 1/α = 2L/R), ω0 = 1/√(LC), "
        "ζ = α/ω0 = (R/2)√(C/L). Underdamped (ζ < 1): ωd = ω0√(1 − ζ²) and "
        "v_C = V[1 − e^(−αt)(cos ωd t + (α/ωd) sin ωd t)]. Critically damped at "
        "R = 2√(L/C): v_C = V[1 − (1 + αt) e^(−αt)]. Overdamped: two real modes "
        "s = −α ± √(α² − ω0²); the slower one sets the settling.\n"
        "- **Energy:** the source delivers the heat in R plus what L (½Li²) and C (½Cv²) store; "
        "in position 2 the stored energy ends as heat in R.",
        tau_table(),
        "Second-order step from rest, by damping ratio (times in units of 1/ω0):",
        damping_table(),
        "## Resonance",
        series_resonance_diagram() + "\n" + parallel_resonance_diagram(),
        "- f0 = 1/(2π√(LC)) for both. Series: Q = (1/R)√(L/C), and at f0 the voltage across L "
        "and across C is Q × the supply. Parallel: Q = R√(C/L), and at f0 the current "
        "circulating in L and C is Q × the supply current.\n"
        "- Bandwidth B = f0/Q between the half-power frequencies "
        "f1,2 = f0(√(1 + 1/(4Q²)) ∓ 1/(2Q)); f1 f2 = f0². Damping ratio ζ = 1/(2Q).\n"
        "- For a target frequency: C = 1/((2πf)² L), L = 1/((2πf)² C).",
        "## A DC coil switched off",
        "".join(suppression_diagram(k) for k in ("none", "diode", "diode_zener", "rc",
                                                 "varistor")),
        "- Stored energy W = ½LI², I = V/R. With nothing across the coil the current rings into "
        "the stray capacitance: V_peak ≈ I√(L/C) — kilovolts from a 24 V coil, limited in "
        "practice by an arc across the opening contact.\n"
        "- A clamp at V_c (diode: V_F; diode + zener: V_F + V_Z; varistor: its clamping "
        "voltage) holds the coil at −V_c: i = (I + V_c/R) e^(−t/τ) − V_c/R, zero at "
        "t0 = τ ln(1 + IR/V_c); the switch sees V + V_c; the armature releases at "
        "τ ln((I + V_c/R)/(I_do + V_c/R)). The higher V_c, the faster the release and the "
        "more of ½LI² the clamp takes.\n"
        "- An RC snubber forms a series L, R + R_s, C loop. R_s equal to the coil resistance "
        "starts the coil voltage at zero and limits the contact's closing current to the coil "
        "current (common practice); C is then the smallest that keeps the switch voltage "
        "within its limit.",
        "## Power-factor correction and resonance with the supply",
        pf_diagram(),
        "- Q_c = P(tan φ1 − tan φ2); capacitor current I = Q_c/(√3 V) three-phase, Q_c/V "
        "single-phase; per-phase capacitance C_Y = Q_c/(2πf V²) (wye), C_Δ = C_Y/3 (delta). "
        f"Conductors at least {100 * power_factor.NEC_460_8_FACTOR:g} % of the capacitor "
        "current (NEC 460.8(A)).\n"
        "- The bank and the supply inductance resonate in parallel at h = √(S_sc/Q_c), with "
        "S_sc = 100 S_T/Z% for a transformer on a stiff source; a bank resonating near the "
        f"{_ordinals(power_factor.SIX_PULSE_HARMONICS)} harmonic of six-pulse drives amplifies "
        "their currents.\n"
        "- A detuning reactor p = X_L/X_C makes the bank inductive above n = 1/√p × f1; its "
        "parallel resonance with the supply falls to h' = 1/√(p + (1 − p)Q_c/S_sc), below n. "
        "The branch's reactance is X_C − X_L = (1 − p) X_C, so to deliver Q_c the capacitors "
        "need (1 − p) times the plain bank's capacitance, and they run at U_C = U/(1 − p), "
        "giving Q_c/(1 − p) there: rate them for it (IEEE Std 18: "
        f"{100 * power_factor.IEEE18_RMS_VOLTAGE:g} % of rated voltage continuously). Capacitors "
        "rated U_r are rated Q_r = Q_c (1 − p)(U_r/U)².",
        "kvar per kW of load (the multiplier P × (tan φ1 − tan φ2)):",
        multiplier_table(),
        "Detuning factors:",
        detuning_table(),
        "Sources: Nilsson and Riedel, *Electric Circuits*, 10th ed., ch. 6–8; Alexander and "
        "Sadiku, *Fundamentals of Electric Circuits*, 5th ed., ch. 14; Ogata, *Modern Control "
        "Engineering*, 5th ed., 5-3; IEEE Std 141 (ch. 8), IEEE Std 18, IEEE Std 1531, NEC 460 — "
        "from memory where a clause is named; J. C. Das, *Power System Harmonics and Filter "
        "Design*, 1st ed., 2015, for detuned banks (from memory; the relations read in worked "
        "examples the calculator cites); the calculators list each with its flag.",
        "",
    ])


PAGES = {"reference/circuits.md": circuits_page}
