"""switching-transient, rlc-resonance and inductive-kick: published worked examples, limiting
cases, properties (energy balance, Q = 1/2ζ), error paths and every check's threshold, with
ngspice and scipy.signal as independent references for the same circuits. A test that runs
ngspice skips itself when ngspice is missing (tests/spice.py)."""

import math

import numpy as np
import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st
from scipy import integrate, optimize, signal

from build.reference import circuits
from calc import api, rlc
from calc.calculators import inductive_kick, rlc_resonance, switching_transient
from tests import spice
from tests.conftest import check_message, checks, errors, run, values

TWO_PI = 2 * math.pi


# ---- switching-transient: published values ------------------------------------------------

# Series RLC step from rest: R = 280 Ω, L = 0.1 H, C = 0.4 µF, 48 V. The published solution is
# v_C = 48 − 48 e^(−1400t) cos 4800t − 14 e^(−1400t) sin 4800t V (α = 1400 /s, ωd = 4800 rad/s).
# J. W. Nilsson and S. A. Riedel, Electric Circuits, 10th ed., section 8.4, worked example of the
# step response of a series RLC circuit — from memory.
NILSSON_R, NILSSON_L, NILSSON_C, NILSSON_V = 280.0, 0.1, 0.4e-6, 48.0


def nilsson_vc(t):
    decay = np.exp(-1400 * t)
    return 48 - 48 * decay * np.cos(4800 * t) - 14 * decay * np.sin(4800 * t)


@pytest.mark.parametrize("t", [50e-6, 200e-6, 654.5e-6, 1e-3, 2.5e-3, 6e-3])
def test_series_rlc_step_matches_the_published_solution(t):
    out = values(run("switching-transient", circuit="rlc", r=NILSSON_R, l=NILSSON_L,
                     c=NILSSON_C, source_v=NILSSON_V, t=t))
    # The published constants are exact integers: only float rounding separates the two.
    assert out["value_at_t"] == pytest.approx(nilsson_vc(t), rel=1e-9)
    assert out["capacitor_v_at_t"] == out["value_at_t"]


def test_series_rlc_damping_numbers_match_the_published_example():
    out = values(run("switching-transient", circuit="rlc", r=NILSSON_R, l=NILSSON_L,
                     c=NILSSON_C, source_v=NILSSON_V))
    # α = 1400 /s, ω0 = 5000 rad/s, ωd = 4800 rad/s (Nilsson and Riedel, as above): exact.
    assert out["tau"] == pytest.approx(1 / 1400, rel=1e-12)
    assert out["damping_ratio"] == pytest.approx(1400 / 5000, rel=1e-12)
    assert out["natural_hz"] == pytest.approx(5000 / TWO_PI, rel=1e-12)
    assert out["damped_hz"] == pytest.approx(4800 / TWO_PI, rel=1e-12)
    # The first peak of the published solution is at t = π/ωd, 48 (1 + e^(−1400π/4800)) V.
    assert out["peak_time"] == pytest.approx(math.pi / 4800, rel=1e-9)
    assert out["peak_value"] == pytest.approx(nilsson_vc(math.pi / 4800), rel=1e-9)


# e^(−t/τ) at whole multiples of τ, to five figures: 0.36788, 0.13534, 0.049787, 0.018316,
# 0.0067379 (computed); the 63.2 % at τ and 99.3 % at 5τ of a rising response are the figures
# J. W. Nilsson and S. A. Riedel, Electric Circuits, 10th ed., section 7.1 (the time constant)
# gives — from memory.
TAU_TABLE = [(1, 0.36788), (2, 0.13534), (3, 0.049787), (4, 0.018316), (5, 0.0067379)]


@pytest.mark.parametrize("multiple, remaining", TAU_TABLE)
@pytest.mark.parametrize("circuit", ["rl", "rc"])
def test_first_order_response_at_multiples_of_tau(circuit, multiple, remaining):
    rising = values(run("switching-transient", circuit=circuit, r=48, l="0.5 H", c="100 uF",
                        source_v=24, t=multiple * rlc.time_constant(circuit, 48, 0.5, 1e-4)))
    falling = values(run("switching-transient", circuit=circuit, position="2", r=48,
                         l="0.5 H", c="100 uF", source_v=24,
                         t=multiple * rlc.time_constant(circuit, 48, 0.5, 1e-4)))
    # Five significant figures in the table: rel 1e-4 on e^(−n) (its rounding).
    assert falling["percent_at_t"] / 100 == pytest.approx(remaining, rel=1e-4)
    assert 1 - rising["percent_at_t"] / 100 == pytest.approx(remaining, rel=1e-4)


def test_63_percent_at_one_time_constant_by_default():
    # A blank t means one time constant: 63.2 % (Nilsson and Riedel, Electric Circuits, 10th
    # ed., section 7.1 — from memory; 1 − e^(−1) computed).
    out = values(run("switching-transient"))
    assert out["percent_at_t"] == pytest.approx(63.2, abs=0.05)  # printed to 3 figures
    assert out["tau"] == pytest.approx(0.5 / 48, rel=1e-12)  # τ = L/R


@pytest.mark.parametrize("zeta, overshoot_pct", [(0.5, 16.3), (0.7, 4.6), (0.2, 52.7)])
def test_overshoot_matches_the_textbook_figures(zeta, overshoot_pct):
    # Maximum overshoot of a second-order step, M_p = e^(−ζπ/√(1−ζ²)): 16.3 % at ζ = 0.5,
    # 4.6 % at ζ = 0.7, 52.7 % at ζ = 0.2 — K. Ogata, Modern Control Engineering, 5th ed.,
    # section 5-3 (Figure 5-8 and the M_p formula), from memory; printed to 3 figures (abs 0.05).
    l, c = 1.0, 1e-6
    r = 2 * zeta * math.sqrt(l / c)
    out = values(run("switching-transient", circuit="rlc", r=r, l=l, c=c, source_v=100))
    assert (out["peak_value"] / 100 - 1) * 100 == pytest.approx(overshoot_pct, abs=0.05)
    assert rlc.overshoot_pct(zeta) == pytest.approx(overshoot_pct, abs=0.05)


def test_critical_resistance_gives_critical_damping():
    # R_c = 2√(L/C), computed from ζ = (R/2)√(C/L) = 1 (Nilsson and Riedel, 10th ed., section
    # 8.3 — from memory): ζ = 1 and no overshoot output.
    result = run("switching-transient", circuit="rlc", r=2 * math.sqrt(0.5 / 1e-4), l=0.5,
                 c=1e-4, source_v=24)
    assert values(result)["damping_ratio"] == pytest.approx(1.0, rel=1e-12)
    assert "peak_value" not in result["outputs"] and "damped_hz" not in result["outputs"]
    assert "critically damped" in " ".join(s["text"] for s in result["steps"])


# ---- switching-transient: limiting cases ----------------------------------------------------

@pytest.mark.parametrize("circuit", ["rl", "rc", "rlc"])
def test_at_the_switching_instant_nothing_has_changed(circuit):
    step = values(run("switching-transient", circuit=circuit, t=0))
    release = values(run("switching-transient", circuit=circuit, position="2", t=0))
    assert step["value_at_t"] == 0.0 and step["percent_at_t"] == 0.0
    assert release["percent_at_t"] == pytest.approx(100.0, rel=1e-15)


@pytest.mark.parametrize("circuit", ["rl", "rc", "rlc"])
def test_long_after_switching_the_circuit_is_at_its_final_value(circuit):
    step = values(run("switching-transient", circuit=circuit, t=100))  # > 1000 τ of defaults
    release = values(run("switching-transient", circuit=circuit, position="2", t=100))
    assert step["percent_at_t"] == pytest.approx(100.0, rel=1e-12)
    assert release["percent_at_t"] == pytest.approx(0.0, abs=1e-12)


def test_rlc_with_a_huge_capacitor_behaves_as_rl():
    # C → ∞: the capacitor holds almost no voltage (v_C ≈ ∫i dt / C ≤ I t / C = 0.5 A ×
    # 10 ms / 100 F = 5e-5 V), so the current is the RL current within 5e-5/24 = 2e-6.
    rl = values(run("switching-transient", circuit="rl", r=48, l=0.5, source_v=24, t=0.01))
    rlc_ = values(run("switching-transient", circuit="rlc", r=48, l=0.5, c=100, source_v=24,
                      t=0.01))
    assert rlc_["current_at_t"] == pytest.approx(rl["current_at_t"], rel=1e-5)


def test_rlc_with_a_tiny_inductor_behaves_as_rc():
    # L → 0: the loop is RC with a fast mode L/R = 2e-14 s that is long gone at t = 1 ms;
    # the correction to v_C is of order L/(R²C) = 1e-11 relative.
    rc = values(run("switching-transient", circuit="rc", r=1000, c=1e-6, source_v=10, t=1e-3))
    rlc_ = values(run("switching-transient", circuit="rlc", r=1000, l=1e-11, c=1e-6,
                      source_v=10, t=1e-3))
    assert rlc_["value_at_t"] == pytest.approx(rc["value_at_t"], rel=1e-9)


@pytest.mark.parametrize("t", [1e-4, 1e-3, 5e-3])
def test_the_response_is_continuous_through_critical_damping(t):
    # The closed forms for ζ just below, at and just above 1 must agree (no formula switch
    # jumps): a relative change of 1e-8 in R moves v_C by no more than ~1e-8 relative.
    l, c = 1.0, 1e-6
    rc = 2 * math.sqrt(l / c)
    near = [rlc.switching_transient("rlc", rc * (1 + d), 10, t, l, c).response
            for d in (-1e-8, 0.0, 1e-8)]
    assert near[0] == pytest.approx(near[1], rel=1e-7)
    assert near[2] == pytest.approx(near[1], rel=1e-7)


# ---- switching-transient: properties --------------------------------------------------------

COMPONENTS = {
    "r": st.floats(1.0, 1e4),
    "l": st.floats(1e-4, 10.0),
    "c": st.floats(1e-8, 1e-2),
    "v": st.floats(1.0, 1000.0),
}


@settings(max_examples=60, deadline=None)
@given(circuit=st.sampled_from(["rl", "rc", "rlc"]), position=st.sampled_from(["1", "2"]),
       **COMPONENTS)
def test_energy_balance(circuit, position, r, l, c, v):
    """Source energy = energy dissipated in R + energy stored, by numeric integration."""
    l_ = None if circuit == "rc" else l
    c_ = None if circuit == "rl" else c
    so = rlc.series_second_order(r, l, c) if circuit == "rlc" else None
    assume(so is None or so.damping_ratio > 0.02)  # ringing for longer needs too many points
    tau = 1 / so.slow_rate if so else rlc.time_constant(circuit, r, l, c)
    end = 3 * tau

    def point(t):
        return rlc.switching_transient(circuit, r, v, t, l_, c_, position)

    def stored(p):
        return 0.5 * (l_ or 0) * p.current ** 2 + 0.5 * (c_ or 0) * p.capacitor_voltage ** 2

    source_v = v if position == "1" else 0.0
    # Break the span where an overdamped loop's fast mode (rate α + β) has died out, so that
    # quad's adaptive sampling sees it.
    fast = so.alpha + so.beta if so else 1 / tau
    breaks = [0.0] + [k / fast for k in (1, 10, 100) if k / fast < end] + [end]

    def integral(f):
        return sum(integrate.quad(f, a, b, limit=2000, epsabs=0, epsrel=1e-10)[0]
                   for a, b in zip(breaks, breaks[1:]))

    supplied = integral(lambda t: source_v * point(t).current)
    dissipated = integral(lambda t: r * point(t).current ** 2)
    initial, final = stored(point(0.0)), stored(point(end))
    scale = max(initial, final, supplied, dissipated)
    # quad's error estimate is below 1e-10 relative; 1e-7 leaves room for its smooth-kernel
    # assumption on a decaying oscillation.
    assert initial + supplied == pytest.approx(dissipated + final, abs=1e-7 * scale)


@settings(max_examples=100, deadline=None)
@given(circuit=st.sampled_from(["rl", "rc", "rlc"]), t=st.floats(0, 0.05), **COMPONENTS)
def test_step_and_release_add_up_to_the_steady_state(circuit, t, r, l, c, v):
    # Linearity: a release is the steady state minus a step (the source swapped out).
    step = rlc.switching_transient(circuit, r, v, t, l, c, "1").response
    release = rlc.switching_transient(circuit, r, v, t, l, c, "2").response
    full = v / r if circuit == "rl" else v
    assert step + release == pytest.approx(full, rel=1e-9, abs=1e-12 * full)


@settings(max_examples=100, deadline=None)
@given(circuit=st.sampled_from(["rl", "rc", "rlc"]), **COMPONENTS)
def test_settling_time_is_the_last_exit_from_the_2_percent_band(circuit, r, l, c, v):
    settle = rlc.settling_time(circuit, r, l, c)
    so = rlc.series_second_order(r, l, c)
    assume(circuit != "rlc" or so.damping_ratio > 0.01)
    final = v / r if circuit == "rl" else v

    def error(t):
        return abs(rlc.switching_transient(circuit, r, v, t, l, c).response - final) / final

    assert error(settle) == pytest.approx(0.02, rel=1e-6)
    after = np.linspace(settle, settle * 4, 2001)[1:]
    assert max(error(t) for t in after) <= 0.02 * (1 + 1e-9)


# ---- switching-transient: independent references --------------------------------------------

def _random_rlc(seed, count=8):
    """Seeded random series RLC circuits spread over damping ratios 0.01 to 5."""
    rng = np.random.default_rng(seed)
    circuits_ = []
    for _ in range(count):
        zeta = 10 ** rng.uniform(-2, math.log10(5))
        l = 10 ** rng.uniform(-4, 0)
        c = 10 ** rng.uniform(-8, -3)
        circuits_.append((2 * zeta * math.sqrt(l / c), l, c, rng.uniform(5, 600)))
    return circuits_


@pytest.mark.parametrize("position", ["1", "2"])
@pytest.mark.parametrize("r, l, c, v", _random_rlc(seed=6))
def test_rlc_transient_agrees_with_ngspice(r, l, c, v, position):
    so = rlc.series_second_order(r, l, c)
    i0, v0, source = (0.0, 0.0, v) if position == "1" else (0.0, v, 0.0)
    if so.sigma > 0:
        period = TWO_PI / so.beta
        stop = min(6 / so.slow_rate, 20 * period)
        step = min(stop / spice.STEPS_PER_SPAN, period / 2000)
        # The trapezoidal rule keeps an oscillation's amplitude but slips its phase by about
        # (ωd h)²/12 per radian; over ωd T radians the worst error is that times the swing.
        tolerance = 1e-5 + 2 * (so.beta * step) ** 2 / 12 * so.beta * stop
    else:
        stop = 6 / so.slow_rate
        step = min(stop / spice.STEPS_PER_SPAN, 0.02 / (so.alpha + so.beta))
        # Overdamped: no phase to slip; what is left is ngspice's start-up steps where the
        # current's slope jumps at t = 0 (measured 1.1e-5 of V/R at ζ ≈ 5).
        tolerance = 5e-5
    out = spice.transient([f"V1 1 0 DC {source!r}", f"R1 1 2 {r!r}", f"L1 2 3 {l!r} IC={i0!r}",
                           f"C1 3 0 {c!r} IC={v0!r}"], stop, ["v(3)", "i(L1)"], step)
    ours = [rlc.switching_transient("rlc", r, v, t, l, c, position) for t in out["time"]]
    swing_i = v * math.sqrt(c / l) if so.damping_ratio < 1 else v / r
    dv = np.max(np.abs(np.array([p.capacitor_voltage for p in ours]) - out["v(3)"])) / v
    di = np.max(np.abs(np.array([p.current for p in ours]) - out["i(L1)"])) / swing_i
    assert dv <= tolerance and di <= tolerance, (so.damping_ratio, dv, di, tolerance)


@pytest.mark.parametrize("circuit", ["rl", "rc"])
@pytest.mark.parametrize("position", ["1", "2"])
def test_first_order_transient_agrees_with_ngspice(circuit, position):
    r, l, c, v = 33.0, 0.22, 47e-6, 110.0
    tau = rlc.time_constant(circuit, r, l, c)
    if circuit == "rl":
        i0, source = (0.0, v) if position == "1" else (v / r, 0.0)
        elements = [f"V1 1 0 DC {source}", f"R1 1 2 {r}", f"L1 2 0 {l} IC={i0!r}"]
        probe, scale = "i(L1)", v / r
    else:
        v0, source = (0.0, v) if position == "1" else (v, 0.0)
        elements = [f"V1 1 0 DC {source}", f"R1 1 2 {r}", f"C1 2 0 {c} IC={v0}"]
        probe, scale = "v(2)", v
    out = spice.transient(elements, 6 * tau, [probe])
    ours = np.array([rlc.switching_transient(circuit, r, v, t, l, c, position).response
                     for t in out["time"]])
    # 20 000 steps over 6τ: the trapezoidal local error (h/τ)³/12 per step sums to < 1e-9;
    # 1e-6 covers ngspice's reltol of 1e-6.
    assert np.max(np.abs(ours - out[probe])) / scale <= 1e-6


@pytest.mark.parametrize("r, l, c, v", _random_rlc(seed=16, count=6))
def test_rlc_step_and_release_agree_with_scipy_signal(r, l, c, v):
    # v_C/V = 1/(LC s² + RC s + 1); the release from v_C = V is the free response of the same
    # state-space model. scipy.signal.step/lsim use the matrix exponential: exact to ~1e-12.
    so = rlc.series_second_order(r, l, c)
    end = min(6 / so.slow_rate, 20 * TWO_PI / so.beta if so.sigma > 0 else math.inf)
    t = np.linspace(0, end, 3001)
    _, step = signal.step(([1.0], [l * c, r * c, 1.0]), T=t)
    ours = np.array([rlc.switching_transient("rlc", r, v, x, l, c).response for x in t])
    assert np.max(np.abs(ours - v * step)) <= 1e-8 * v
    # States x = [v_C, i]: v_C' = i/C, i' = (u − v_C − R i)/L.
    system = signal.StateSpace([[0, 1 / c], [-1 / l, -r / l]], [[0], [1 / l]], [[1, 0]], [[0]])
    _, free, _ = signal.lsim(system, U=np.zeros_like(t), T=t, X0=[v, 0.0])
    ours = np.array([rlc.switching_transient("rlc", r, v, x, l, c, "2").response for x in t])
    assert np.max(np.abs(ours - free)) <= 1e-8 * v


# ---- switching-transient: contract, chart and checks ---------------------------------------

def test_chart_has_tau_marks_and_the_chosen_time():
    series = run("switching-transient", circuit="rc", t="12 ms")["series"]
    labels = [m["label"] for m in series["marks"]]
    assert labels[:5] == ["1τ", "2τ", "3τ", "4τ", "5τ"] and "t" in labels
    tau = 48 * 100e-6
    assert [m["value"] for m in series["marks"][:5]] == pytest.approx(
        [k * tau for k in range(1, 6)])
    assert series["x"]["values"][0] == 0 and series["x"]["values"][-1] >= 5 * tau


def test_underdamped_chart_carries_the_envelope():
    series = run("switching-transient", circuit="rlc")["series"]
    assert [line["label"] for line in series["y"]] == ["Capacitor voltage", "Envelope",
                                                       "Envelope (lower)"]
    response, upper, lower = (np.array(line["values"]) for line in series["y"])
    # The envelope bounds the response everywhere (it touches at the extremes).
    assert np.all(lower - 1e-12 <= response) and np.all(response <= upper + 1e-12)


def test_chosen_time_is_marked_unless_it_sits_on_a_tau_mark():
    at_tau = [m["label"] for m in run("switching-transient")["series"]["marks"]]
    between = [m["label"] for m in run("switching-transient", t="15 ms")["series"]["marks"]]
    assert "t" not in at_tau and "t" in between


def test_overshoot_is_a_warning_and_a_reverse_swing_mentions_electrolytics():
    step = run("switching-transient", circuit="rlc")
    release = run("switching-transient", circuit="rlc", position="2")
    assert checks(step)["overshoot"] == "warn"
    assert "reverse" in check_message(release, "overshoot")


def test_capacitor_discharge_caution_states_the_energy():
    result = run("switching-transient", circuit="rc", c="1000 uF", source_v="400 V")
    # ½ C V² = ½ × 1e-3 × 400² = 80 J (computed by hand)
    assert any("80.0 J" in caution for caution in result["cautions"])


@pytest.mark.parametrize("inputs, field, words", [
    ({"r": 0}, "r", "out of range"),
    ({"r": "-5 ohm"}, "r", "out of range"),
    ({"l": 0}, "l", "out of range"),
    ({"l": "-1 mH"}, "l", "out of range"),
    ({"c": 0, "circuit": "rc"}, "c", "out of range"),
    ({"circuit": "rl", "l": None}, "l", "needs the inductance"),
    ({"circuit": "rc", "c": ""}, "c", "needs the capacitance"),
    ({"circuit": "rlc", "c": None}, "c", "needs the capacitance"),
    ({"source_v": 0}, "source_v", "at least 1e-06 V"),
    ({"t": "-1 ms"}, "t", "at least 0 s"),
    ({"circuit": "lc"}, "circuit", "choose one of"),
    ({"position": "3"}, "position", "choose one of"),
    ({"l": "10 uF"}, "l", "inductance"),
])
def test_switching_bad_inputs_get_field_messages(inputs, field, words):
    refused = errors("switching-transient", **inputs)
    assert list(refused) == [field] and words in refused[field]


# ---- rlc-resonance: published values -------------------------------------------------------

def test_series_resonance_published_example():
    # R = 2 Ω, L = 1 mH, C = 0.4 µF driven by 20 sin ωt V: ω0 = 50 krad/s, Q = 25, B = 2 krad/s,
    # ω1 ≈ 49 krad/s, ω2 ≈ 51 krad/s, I = 10 A at ω0 and 10/√2 = 7.071 A at ω1 and ω2.
    # C. K. Alexander and M. N. O. Sadiku, Fundamentals of Electric Circuits, 5th ed., section
    # 14.5, series-resonance worked example — from memory.
    out = values(run("rlc-resonance", r=2, l="1 mH", c="0.4 uF", source_v=20))
    assert out["f0"] * TWO_PI == pytest.approx(50e3, rel=1e-12)  # exact: 1/√(4e-10)
    assert out["q"] == pytest.approx(25, rel=1e-12)
    assert out["bandwidth"] * TWO_PI == pytest.approx(2e3, rel=1e-12)
    # ω1, ω2 printed to 2 figures (49, 51 krad/s): within 0.5 krad/s.
    assert out["f_low"] * TWO_PI == pytest.approx(49e3, abs=500)
    assert out["f_high"] * TWO_PI == pytest.approx(51e3, abs=500)
    assert out["current_at_f"] == pytest.approx(10.0, rel=1e-12)
    at_edge = values(run("rlc-resonance", r=2, l="1 mH", c="0.4 uF", source_v=20,
                         frequency_hz=out["f_low"]))
    assert at_edge["current_at_f"] == pytest.approx(7.071, rel=1e-4)  # 4 figures printed


def test_parallel_resonance_published_example():
    # R = 8 kΩ, L = 0.2 mH, C = 8 µF: ω0 = 25 krad/s, Q = 1600, B = 15.625 rad/s,
    # ω1 = 24.992 krad/s, ω2 = 25.008 krad/s. Alexander and Sadiku, 5th ed., section 14.6,
    # parallel-resonance worked example — from memory.
    out = values(run("rlc-resonance", topology="parallel", r="8 kohm", l="0.2 mH", c="8 uF"))
    assert out["f0"] * TWO_PI == pytest.approx(25e3, rel=1e-12)
    assert out["q"] == pytest.approx(1600, rel=1e-12)
    assert out["bandwidth"] * TWO_PI == pytest.approx(15.625, rel=1e-12)
    # ω1, ω2 printed to 5 figures: within 0.5 rad/s.
    assert out["f_low"] * TWO_PI == pytest.approx(24992, abs=0.5)
    assert out["f_high"] * TWO_PI == pytest.approx(25008, abs=0.5)
    assert out["z_at_f"] == pytest.approx(8000, rel=1e-12)  # |Z(ω0)| = R


# ---- rlc-resonance: limiting cases and properties ------------------------------------------

@pytest.mark.parametrize("topology, r, sign, reactance", [
    ("series", 5.0, -1, lambda w, l, c: 1 / (w * c)),  # far below f0 a series RLC is its C
    ("parallel", 5e3, 1, lambda w, l, c: w * l),  # ... and a parallel RLC is its L
])
def test_far_below_resonance_the_reactive_part_dominates(topology, r, sign, reactance):
    l, c = 1e-3, 1e-6
    f = rlc.resonant_frequency(l, c) / 1e4
    out = values(run("rlc-resonance", topology=topology, r=r, l=l, c=c, frequency_hz=f))
    # R/X_C = 1.6e-5 (series) and X_L/R = 6.3e-7 (parallel) at f0/10⁴: |Z| is the reactance
    # within (ratio)²/2 and the angle is ±90° within the ratio in radians (≤ 0.001°).
    assert out["z_at_f"] == pytest.approx(reactance(TWO_PI * f, l, c), rel=1e-6)
    assert out["phase_at_f"] == pytest.approx(sign * 90, abs=1e-3)


@settings(max_examples=200, deadline=None)
@given(topology=st.sampled_from(["series", "parallel"]), r=st.floats(1e-3, 1e6),
       l=st.floats(1e-9, 10.0), c=st.floats(1e-12, 1e-1))
def test_resonance_properties(topology, r, l, c):
    out = values(run("rlc-resonance", topology=topology, r=r, l=l, c=c))
    assert out["q"] == pytest.approx(1 / (2 * out["damping_ratio"]), rel=1e-12)  # Q = 1/(2ζ)
    # f2 − f1 loses the digits f1 and f2 share at high Q: allow a few ulps of f2.
    assert out["f_high"] - out["f_low"] == pytest.approx(out["bandwidth"], rel=1e-9,
                                                         abs=1e-15 * out["f_high"])
    assert out["f_low"] * out["f_high"] == pytest.approx(out["f0"] ** 2, rel=1e-9)
    assert out["z_at_f"] == pytest.approx(r, rel=1e-9)  # at f0 only R remains
    z_low = abs(rlc.rlc_impedance(topology, r, l, c, out["f_low"]))
    # Half-power: |Z| = √2 R (series) or R/√2 (parallel). Near f0 the reactance is a difference
    # of two terms Q times larger than R, so |Z(f1)| carries ~Q ulps of rounding.
    assert z_low == pytest.approx(r * (math.sqrt(2) if topology == "series" else 1 / math.sqrt(2)),
                                  rel=1e-9 + out["q"] * 1e-15)


@settings(max_examples=100, deadline=None)
@given(l=st.floats(1e-6, 1.0), c=st.floats(1e-9, 1e-3), target=st.floats(1.0, 1e6))
def test_target_frequency_round_trip(l, c, target):
    out = values(run("rlc-resonance", l=l, c=c, target_hz=target))
    assume(1e-12 <= out["l_for_target"] <= 1e4 and 1e-15 <= out["c_for_target"] <= 100)
    with_new_c = values(run("rlc-resonance", l=l, c=out["c_for_target"]))
    with_new_l = values(run("rlc-resonance", l=out["l_for_target"], c=c))
    assert with_new_c["f0"] == pytest.approx(target, rel=1e-12)
    assert with_new_l["f0"] == pytest.approx(target, rel=1e-12)


def _random_tanks(seed, count=6):
    rng = np.random.default_rng(seed)
    return [(10 ** rng.uniform(-1, 4), 10 ** rng.uniform(-5, 0), 10 ** rng.uniform(-9, -4))
            for _ in range(count)]


@pytest.mark.parametrize("topology", ["series", "parallel"])
@pytest.mark.parametrize("r, l, c", _random_tanks(seed=14))
def test_impedance_agrees_with_ngspice_ac(topology, r, l, c):
    f0 = rlc.resonant_frequency(l, c)
    if topology == "series":  # 1 V across the series loop: Z = 1 / I
        elements = ["V1 1 0 DC 0 AC 1", f"R1 1 2 {r!r}", f"L1 2 3 {l!r}", f"C1 3 0 {c!r}"]
        out = spice.ac(elements, f0 / 100, f0 * 100, 100, ["i(V1)"])
        z_spice = -1 / out["i(V1)"]  # ngspice's source current flows into its + terminal
    else:  # 1 A into the tank: Z = V
        elements = ["I1 0 1 DC 0 AC 1", f"R1 1 0 {r!r}", f"L1 1 0 {l!r}", f"C1 1 0 {c!r}"]
        out = spice.ac(elements, f0 / 100, f0 * 100, 100, ["v(1)"])
        z_spice = out["v(1)"]
    ours = np.array([rlc.rlc_impedance(topology, r, l, c, f) for f in out["frequency"]])
    # An AC analysis is one complex linear solve per frequency, written with 15 digits; the
    # difference is rounding (ngspice adds no gmin to linear R, L, C): rel 1e-9.
    assert np.max(np.abs(ours - z_spice) / np.abs(z_spice)) <= 1e-9


@pytest.mark.parametrize("topology", ["series", "parallel"])
@pytest.mark.parametrize("r, l, c", _random_tanks(seed=41, count=4))
def test_impedance_agrees_with_scipy_freqresp(topology, r, l, c):
    # Z(s) = (LC s² + RC s + 1)/(C s) series; R L s / (RLC s² + L s + R) parallel.
    if topology == "series":
        system = signal.lti([l * c, r * c, 1.0], [c, 0.0])
    else:
        system = signal.lti([r * l, 0.0], [r * l * c, l, r])
    f0 = rlc.resonant_frequency(l, c)
    freqs = np.geomspace(f0 / 50, f0 * 50, 301)
    _, response = signal.freqresp(system, w=TWO_PI * freqs)
    ours = np.array([rlc.rlc_impedance(topology, r, l, c, f) for f in freqs])
    assert np.max(np.abs(ours - response) / np.abs(response)) <= 1e-9  # polynomial rounding


def test_sweep_marks_resonance_and_half_power_points():
    result = run("rlc-resonance", r=20, frequency_hz="7 kHz")  # Q = 2.5: a wide resonance
    series, out = result["series"], values(result)
    marks = {m["label"]: m["value"] for m in series["marks"]}
    assert marks == {"f0": out["f0"], "f1": out["f_low"], "f2": out["f_high"], "f": 7000}
    lowest = series["x"]["values"][int(np.argmin(series["y"][0]["values"]))]
    assert lowest == out["f0"]  # the series |Z| minimum sits on f0 (f0 is a sweep point)
    sharp = run("rlc-resonance")["series"]  # Q = 25: f1 and f2 would print over f0
    assert [m["label"] for m in sharp["marks"]] == ["f0"]
    freqs = sharp["x"]["values"]
    assert freqs == sorted(freqs) and freqs[0] == pytest.approx(0.2 * values(result)["f0"])


def test_voltage_magnification_is_warned():
    result = run("rlc-resonance", source_v="230 V")
    # Q V = 25 × 230 V = 5750 V (computed by hand)
    assert checks(result)["magnification"] == "warn"
    assert "5.75 kV" in check_message(result, "magnification")
    assert values(result)["reactive_v_at_f0"] == pytest.approx(5750, rel=1e-12)


def test_overdamped_resonance_is_flagged():
    result = run("rlc-resonance", r=100)  # Q = √(1e-3/0.4e-6)/100 = 50/100 = 0.5 (by hand)
    assert values(result)["q"] == pytest.approx(0.5, rel=1e-12)
    assert checks(result)["sharpness"] == "pass"
    low_q = run("rlc-resonance", r=200)
    assert checks(low_q)["sharpness"] == "warn"


@pytest.mark.parametrize("inputs, field, words", [
    ({"r": 0}, "r", "out of range"),
    ({"l": "-1 mH"}, "l", "out of range"),
    ({"c": 0}, "c", "out of range"),
    ({"frequency_hz": 0}, "frequency_hz", "at least 0.001 Hz"),
    ({"target_hz": "-50 Hz"}, "target_hz", "at least 0.001 Hz"),
    ({"topology": "bridge"}, "topology", "choose one of"),
    ({"c": "4 mH"}, "c", "capacitance"),
])
def test_resonance_bad_inputs_get_field_messages(inputs, field, words):
    refused = errors("rlc-resonance", **inputs)
    assert list(refused) == [field] and words in refused[field]


# ---- inductive-kick --------------------------------------------------------------------------

COIL = dict(supply_v=24, r=48, l="0.5 H")  # an invented 24 V, 12 W DC contactor coil


def test_stored_energy_and_current():
    # W = ½ L I² = ½ × 0.5 H × (24/48 A)² = 62.5 mJ (Nilsson and Riedel, 10th ed., section
    # 6.1, energy in an inductor — from memory; numbers by hand).
    out = values(run("inductive-kick", **COIL))
    assert out["coil_a"] == pytest.approx(0.5, rel=1e-12)
    assert out["stored_energy"] == pytest.approx(0.0625, rel=1e-12)


def test_unsuppressed_kick_is_the_energy_balance_figure():
    # With no losses all of ½LI² would reach the stray C: V = I √(L/C) = 0.5 × √(0.5/200e-12)
    # = 25 000 V (computed). The coil's 48 Ω damps the quarter cycle by e^(−ζπ/2),
    # ζ = (R/2)√(C/L) = 4.8e-4, and the supply's own charge adds √(1 + (24/25000)²): -0.07 %.
    out = values(run("inductive-kick", suppression="none", **COIL))
    assert out["peak_v"] == pytest.approx(25000, rel=2e-3)
    assert out["unsuppressed_v"] == out["peak_v"]


def _clamp_ode(coil_r, coil_l, current, clamp, t):
    """i(t) of L di/dt = −R i − V_c by scipy's solve_ivp (an independent integration)."""
    solution = integrate.solve_ivp(lambda _, i: [(-coil_r * i[0] - clamp) / coil_l], (0, t[-1]),
                                   [current], t_eval=t, rtol=1e-11, atol=1e-14)
    return solution.y[0]


@pytest.mark.parametrize("suppression, clamp", [("diode", 0.8), ("diode_zener", 0.8 + 24),
                                                ("varistor", 60.0)])
def test_clamped_release_agrees_with_an_ode_solver(suppression, clamp):
    out = values(run("inductive-kick", suppression=suppression, **COIL))
    # With a clamp the coil voltage is −V_c and the switch sees V + V_c (the defaults: V_F =
    # 0.8 V, V_Z = the supply, varistor 2.5 × the supply).
    assert out["peak_v"] == pytest.approx(clamp, rel=1e-12)
    assert out["switch_v"] == pytest.approx(24 + clamp, rel=1e-12)
    t = np.linspace(0, out["release_delay"], 2001)
    current = _clamp_ode(48, 0.5, 0.5, clamp, t)
    # solve_ivp at rtol 1e-11: the current reaches the 20 % dropout (0.1 A) at the delay.
    assert current[-1] == pytest.approx(0.1, rel=1e-8)
    # Energy into the clamp, V_c ∫ i dt until i = 0, by the trapezoid rule on 20 001 points
    # (its error (Δt)²/12 × max|i''| is below 1e-8 relative here).
    t0 = 0.5 / 48 * math.log1p(0.5 * 48 / clamp)
    t = np.linspace(0, t0, 20001)
    absorbed = clamp * integrate.trapezoid(_clamp_ode(48, 0.5, 0.5, clamp, t), t)
    assert out["absorbed_energy"] == pytest.approx(absorbed, rel=1e-7)


def test_suppressors_trade_voltage_for_release_time():
    # A higher clamp voltage takes the energy faster: release shortest with the varistor,
    # longest with the bare diode; the voltage rises in the same order (common practice).
    order = ["diode", "diode_zener", "varistor"]
    outs = [values(run("inductive-kick", suppression=s, **COIL)) for s in order]
    delays = [o["release_delay"] for o in outs]
    peaks = [o["peak_v"] for o in outs]
    assert delays == sorted(delays, reverse=True) and peaks == sorted(peaks)


def test_a_clamp_far_above_the_supply_absorbs_all_the_energy_at_once():
    # V_c → ∞: t0 → L I / V_c → 0 and W_c → ½ L I² (the coil's R has no time to take any).
    kick = rlc.clamped_kick(24.0, 48.0, 0.5, 1e6, 0.2)
    assert kick.absorbed_energy == pytest.approx(0.0625, rel=1e-4)  # 1 − O(I R / V_c)
    assert kick.release_delay == pytest.approx(0.5 * 0.4 / 1e6, rel=1e-4)  # L ΔI / V_c


@pytest.mark.parametrize("suppression, capacitance, snubber_r", [
    ("none", 200e-12, 0.0), ("rc", 0.47e-6, 100.0), ("rc", 10e-6, 48.0), ("rc", 220e-6, 22.0)])
def test_capacitive_kick_agrees_with_ngspice(suppression, capacitance, snubber_r):
    r, l, v, i0 = 48.0, 0.5, 24.0, 0.5
    kick = rlc.capacitive_kick(v, r, l, capacitance, 0.2, snubber_r)
    so = rlc.series_second_order(r + snubber_r, l, capacitance)
    if so.sigma > 0:
        period = TWO_PI / so.beta
        stop, step = 3 * period, period / 4000
    else:
        stop, step = 6 / so.slow_rate, 0.02 / (so.alpha + so.beta)
    # Coil L + R from node 1 to 0 carrying 0.5 A; the capacitor (through R_s) across it,
    # charged to the supply; the switch already open.
    elements = [f"L1 1 2 {l} IC={i0}", f"R1 2 0 {r}", f"C1 1 3 {capacitance!r} IC={v}",
                f"RS 3 0 {max(snubber_r, 1e-9)!r}"]
    out = spice.transient(elements, stop, ["v(1)", "i(L1)"], step)
    times = out["time"]
    coil_v, current = rlc.kick_waveform(v, r, l, suppression, times, capacitance, snubber_r)
    swing = max(abs(kick.peak_coil_v), v)
    # Trapezoidal phase slip (ωd h)²/12 per radian over ωd T, as for the transients, plus
    # ngspice's reltol of 1e-6; R_s of 1 nΩ stands for the stray case's zero.
    tolerance = 1e-5 + (2 * (so.beta * step) ** 2 / 12 * so.beta * stop if so.sigma > 0 else 0)
    assert np.max(np.abs(np.array(coil_v) - out["v(1)"])) / swing <= tolerance
    assert np.max(np.abs(np.array(current) - out["i(L1)"])) / i0 <= tolerance
    # The closed-form peak is the simulated peak within the step's reach.
    assert kick.peak_coil_v == pytest.approx(out["v(1)"].min(), rel=max(tolerance, 1e-5))


def test_diode_release_against_an_ngspice_diode_model():
    # A junction diode (IS = 1e-14 A, n = 1) drops 0.76 to 0.82 V between 0.1 and 0.5 A where
    # the calculator takes a constant 0.8 V; the release time depends on it only through
    # V_F/R ≪ I, so the two agree within 0.5 %.
    out = values(run("inductive-kick", suppression="diode", **COIL))
    elements = ["L1 1 2 0.5 IC=0.5", "R1 2 0 48", "D1 0 1 DMOD", ".model DMOD D(IS=1e-14 N=1)"]
    sim = spice.transient(elements, 0.03, ["i(L1)"], 1e-6)
    delay = np.interp(-0.1, -sim["i(L1)"], sim["time"])  # current falling through 0.1 A
    assert out["release_delay"] == pytest.approx(delay, rel=5e-3)


@settings(max_examples=40, deadline=None)
@given(supply=st.floats(5, 250), r=st.floats(5, 5000), l=st.floats(0.01, 5),
       margin=st.floats(1.05, 10))
def test_suggested_snubber_keeps_the_switch_within_its_limit(supply, r, l, margin):
    limit = supply * margin
    snub_r, snub_c = rlc.suggested_snubber(supply, r, l, limit, 0.2)
    assert snub_r == r
    kick = rlc.capacitive_kick(supply, r, l, snub_c, 0.2, snub_r)
    assert kick.peak_switch_v <= limit * (1 + 1e-9)
    smaller = rlc.capacitive_kick(supply, r, l, snub_c * 0.97, 0.2, snub_r)
    assert smaller.peak_switch_v > limit  # and it is the smallest such C (within 3 %)


@settings(max_examples=40, deadline=None)
@given(capacitance=st.floats(1e-9, 1e-3), snubber_r=st.floats(0, 500))
def test_snubber_energy_balance(capacitance, snubber_r):
    # ½LI² + ½CV² = energy into R_s + energy into the coil's R, integrated from the waveform.
    r, l, v = 48.0, 0.5, 24.0
    so = rlc.series_second_order(r + snubber_r, l, capacitance)
    end = 12 / so.slow_rate
    t = np.linspace(0, end, 200001)
    _, current = rlc.kick_waveform(v, r, l, "rc", t, capacitance, snubber_r)
    current = np.array(current)
    assume(so.damping_ratio > 0.05)  # fewer than ~60 ringing cycles in the window
    heat = (r + snubber_r) * integrate.trapezoid(current ** 2, t)
    stored = 0.5 * l * (v / r) ** 2 + 0.5 * capacitance * v ** 2
    assert heat == pytest.approx(stored, rel=1e-4)  # trapezoid on 2e5 points, tail e^(−24)
    kick = rlc.capacitive_kick(v, r, l, capacitance, 0.2, snubber_r)
    assert kick.absorbed_energy == pytest.approx(heat * snubber_r / (r + snubber_r),
                                                 rel=1e-4, abs=1e-15)


def test_switch_rating_check_passes_and_fails():
    fail = run("inductive-kick", suppression="varistor", switch_rating_v=60, **COIL)
    ok = run("inductive-kick", suppression="diode", switch_rating_v=60, **COIL)
    assert checks(fail)["switch_rating"] == "fail"
    assert checks(ok)["switch_rating"] == "pass"


def test_unsuppressed_kick_warns_of_arcing():
    result = run("inductive-kick", suppression="none", **COIL)
    assert checks(result)["unsuppressed"] == "warn"
    assert "arc" in check_message(result, "unsuppressed")


def test_kick_chart_shows_coil_and_switch_voltages():
    series = run("inductive-kick", suppression="rc", **COIL)["series"]
    coil, switch = (np.array(line["values"]) for line in series["y"])
    assert np.allclose(coil + switch, 24.0)  # around the loop: V = v_coil + v_switch
    assert series["marks"][0]["label"] == "Release"


@pytest.mark.parametrize("inputs, field, words", [
    ({"r": 0}, "r", "out of range"),
    ({"l": "-1 H"}, "l", "out of range"),
    ({"supply_v": 0}, "supply_v", "at least 0.1 V"),
    ({"switch_rating_v": 12}, "switch_rating_v", "cannot block"),
    ({"suppression": "varistor", "clamp_v": 20}, "clamp_v", "must be above"),
    ({"dropout_pct": 100}, "dropout_pct", "less than 100 %"),
    ({"suppression": "capacitor"}, "suppression", "choose one of"),
    ({"snubber_c": 0}, "snubber_c", "out of range"),
])
def test_kick_bad_inputs_get_field_messages(inputs, field, words):
    refused = errors("inductive-kick", **{**COIL, **inputs})
    assert list(refused) == [field] and words in refused[field]


# ---- the circuits reference page ------------------------------------------------------------

def test_reference_page_draws_its_diagrams_and_tables_from_calc():
    page = circuits.PAGES["reference/circuits.md"](None)
    assert page.count("<svg") >= 6 and page.count("<svg") == page.count("</svg>")
    # The τ table comes from switching_transient: 63.2 % at τ (Nilsson and Riedel, Electric
    # Circuits, 10th ed., section 7.1 — from memory).
    assert "| 1τ | 63.2 % | 36.8 % |" in page
    # The detuning table: p = 7 % tunes to n = 1/√p = 3.78 (J. C. Das, Power System Harmonics
    # and Filter Design, 1st ed., 2015 — from memory; 7 % → 189 Hz at 50 Hz read, as worked at
    # studylib.net document 27030577; 3.78 computed).
    assert "| 7 % | 3.78 |" in page


@settings(max_examples=200, deadline=None)
@given(st.dictionaries(st.sampled_from(["circuit", "position", "r", "l", "c", "source_v", "t"]),
                       st.one_of(st.text(max_size=8), st.floats(allow_nan=True), st.none(),
                                 st.integers(-5, 5))))
def test_any_input_gives_a_result_or_field_errors(inputs):
    for calculator in ("switching-transient", "rlc-resonance", "inductive-kick"):
        known = {i.name for i in api.get(calculator).inputs}
        given_inputs = {k: v for k, v in inputs.items() if k in known}
        result = api.run(calculator, given_inputs)
        text = api.dumps(result)  # raises on NaN or infinity
        assert "internal error" not in text, (calculator, given_inputs, text)
        if not result["ok"]:
            assert all(e["message"] for e in result["errors"])


# ---- thresholds: every limit a check uses, just inside and just outside ----------------------
# Each test builds its inputs from the constant the check reads, so that a changed judgement
# fails here. "Inside" is the side the check accepts (or stays silent on).

def test_settling_band_threshold():
    # The "settled" check turns from "still running" to "for good" at the settling time, the
    # last exit from the SETTLING_BAND band (pass either way: it reports, it does not judge).
    settle = rlc.settling_time("rl", 48.0, 0.5)
    before = run("switching-transient", t=settle * 0.99)
    after = run("switching-transient", t=settle * 1.01)
    assert checks(before)["settled"] == checks(after)["settled"] == "pass"
    assert "still running" in check_message(before, "settled")
    assert "for good" in check_message(after, "settled")
    band_pct = f"{100 * rlc.SETTLING_BAND:g} %"
    assert band_pct in check_message(after, "settled")
    # The response at those times lies outside and inside the band (τ ln(1/band) for RL).
    assert 100 - values(before)["percent_at_t"] > 100 * rlc.SETTLING_BAND
    assert 100 - values(after)["percent_at_t"] < 100 * rlc.SETTLING_BAND


def _rlc_with_zeta(zeta, **inputs):
    # L = 1 H, C = 1 F: ω0 = 1 rad/s and ζ = R/2 exactly.
    return run("switching-transient", circuit="rlc", r=2.0 * zeta, l=1.0, c=1.0, source_v=10,
               **inputs)


def test_overshoot_threshold_at_critical_damping():
    # Overshoot is warned while underdamped: ζ below 1 − CRITICAL_BAND.
    limit = 1.0 - rlc.CRITICAL_BAND
    ringing = _rlc_with_zeta(limit - rlc.CRITICAL_BAND)
    critical = _rlc_with_zeta(limit + rlc.CRITICAL_BAND / 2)
    assert checks(ringing)["overshoot"] == "warn"
    assert "overshoot" not in checks(critical)
    # And well clear of the band, at 0.99 and 1.01 of ζ = 1.
    assert checks(_rlc_with_zeta(0.99))["overshoot"] == "warn"
    assert "overshoot" not in checks(_rlc_with_zeta(1.01))


def test_light_damping_threshold():
    limit = switching_transient.LIGHT_DAMPING_ZETA
    assert checks(_rlc_with_zeta(limit * 0.99))["light_damping"] == "warn"
    assert "light_damping" not in checks(_rlc_with_zeta(limit * 1.01))


def _series_with_q(q, **inputs):
    # L = 1 mH, C = 0.4 µF: √(L/C) = 50 Ω, so Q = 50 Ω / R.
    return run("rlc-resonance", r=50.0 / q, l="1 mH", c="0.4 uF", **inputs)


def test_sharpness_threshold():
    limit = rlc_resonance.SHARP_Q
    assert checks(_series_with_q(limit * 0.99))["sharpness"] == "warn"
    assert checks(_series_with_q(limit * 1.01))["sharpness"] == "pass"


def test_magnification_threshold():
    limit = rlc_resonance.MAGNIFYING_Q
    assert "magnification" not in checks(_series_with_q(limit * 0.99))
    assert checks(_series_with_q(limit * 1.01))["magnification"] == "warn"
    parallel = run("rlc-resonance", topology="parallel", r=50.0 * limit * 1.01, l="1 mH",
                   c="0.4 uF")  # parallel Q = R / 50 Ω
    assert checks(parallel)["magnification"] == "warn"


def test_switch_rating_threshold():
    switch_v = values(run("inductive-kick", **COIL))["switch_v"]  # diode: V + V_F = 24.8 V
    assert checks(run("inductive-kick", switch_rating_v=switch_v * 1.01,
                      **COIL))["switch_rating"] == "pass"
    assert checks(run("inductive-kick", switch_rating_v=switch_v * 0.99,
                      **COIL))["switch_rating"] == "fail"


def test_switch_rating_must_exceed_the_supply():
    assert "switch_rating_v" in errors("inductive-kick", switch_rating_v=24 * 0.99, **COIL)
    run("inductive-kick", switch_rating_v=24 * 1.01, **COIL)


def test_varistor_clamp_must_exceed_the_supply():
    assert "clamp_v" in errors("inductive-kick", suppression="varistor", clamp_v=24 * 0.99,
                               **COIL)
    out = values(run("inductive-kick", suppression="varistor", clamp_v=24 * 1.01, **COIL))
    assert out["peak_v"] == pytest.approx(24 * 1.01, rel=1e-12)


def test_varistor_clamp_ratio_when_none_is_entered():
    out = values(run("inductive-kick", suppression="varistor", **COIL))
    assert out["peak_v"] == pytest.approx(inductive_kick.VARISTOR_CLAMP_RATIO * 24, rel=1e-12)


@pytest.mark.parametrize("share, status", [(0.99, "pass"), (1.01, "warn")])
def test_unsuppressed_kick_threshold_is_the_paschen_minimum(share, status):
    # The stray capacitance that puts the unsuppressed kick of a 24 V, 48 Ω, 50 mH coil at
    # `share` of PASCHEN_MINIMUM_V (about 0.12 µF), found by root-finding on the closed form.
    target = rlc.PASCHEN_MINIMUM_V * share

    def excess(log_c):
        return -rlc.capacitive_kick(24.0, 48.0, 0.05, math.exp(log_c), 0.2).peak_coil_v - target

    stray = math.exp(optimize.brentq(excess, math.log(1e-9), math.log(1e-6), xtol=1e-14))
    result = run("inductive-kick", supply_v=24, r=48, l="50 mH", suppression="none",
                 stray_c=stray)
    assert values(result)["unsuppressed_v"] == pytest.approx(target, rel=1e-9)
    assert checks(result)["unsuppressed"] == status


def test_slow_release_is_warned_for_a_plain_diode_only():
    assert checks(run("inductive-kick", **COIL))["slow_release"] == "warn"
    for suppression in ("diode_zener", "varistor", "rc", "none"):
        assert "slow_release" not in checks(run("inductive-kick", suppression=suppression,
                                                **COIL))


def test_default_switch_limit_sizes_the_suggested_snubber():
    # With no rating entered the snubber keeps the switch at DEFAULT_SWITCH_LIMIT_RATIO × the
    # supply (the smallest C that does: the bisection ends within float precision of it).
    limit = inductive_kick.DEFAULT_SWITCH_LIMIT_RATIO * 24
    out = values(run("inductive-kick", suppression="rc", **COIL))
    assert out["switch_v"] <= limit * (1 + 1e-12)
    assert out["switch_v"] == pytest.approx(limit, rel=1e-6)


# ---- issue 11, item 9: standard values and plausibility -------------------------------------

# IEC 60063:2015 E6 and E12 — read, as reproduced in Wikipedia, "E series of preferred numbers"
# (the IEC 60063 table): E6 1.0 1.5 2.2 3.3 4.7 6.8; E12 adds 1.2 1.8 2.7 3.9 5.6 8.2.
IEC_60063_E6 = (1.0, 1.5, 2.2, 3.3, 4.7, 6.8)
IEC_60063_E12 = (1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2)


def test_issue11_the_series_are_the_published_ones():
    assert rlc.E_SERIES == {"E6": IEC_60063_E6, "E12": IEC_60063_E12}


@pytest.mark.parametrize("series", ["E6", "E12"])
@pytest.mark.parametrize("decade", [1e-12, 1e-6, 1.0, 1e3])
def test_issue11_preferred_value_up_over_every_value_of_the_series(series, decade):
    values_ = rlc.E_SERIES[series] + (10.0,)
    for value, following in zip(values_, values_[1:]):
        # A preferred value is its own answer; a hair above it (1e-6) goes to the next one.
        assert rlc.preferred_value_up(value * decade, series) == pytest.approx(value * decade,
                                                                               rel=1e-15)
        assert rlc.preferred_value_up(value * decade * (1 + 1e-6), series) == pytest.approx(
            following * decade, rel=1e-15)


def test_issue11_next_standard_value_of_44_7_uf_is_47_uf():
    # The audit's case: the default coil's snubber needs 44.7 µF (computed minimum); the next
    # IEC 60063 value up is 47 µF in E6 and E12 (the series above). Before the fix the step
    # called 44.7 µF itself "the next standard value".
    result = run("inductive-kick")
    out = values(result)
    assert out["snubber_c"] == pytest.approx(44.7e-6, abs=0.05e-6)  # printed to 3 figures
    assert out["snubber_c_standard"] == 47e-6
    assert result["outputs"]["snubber_c_standard"]["display"] == "47 µF"
    step = next(s["result"] for s in result["steps"] if "Suggested RC snubber" in s["text"])
    assert "47 µF" in step and "E12" in step
    assert rlc.preferred_value_up(34e-6, "E6") == 47e-6  # E6 skips 3.9
    assert rlc.preferred_value_up(34e-6, "E12") == 39e-6


def _plausibility(calculator, **inputs):
    result = run(calculator, **inputs)
    return checks(result)["plausibility"], check_message(result, "plausibility")


@pytest.mark.parametrize("calculator", ["switching-transient", "rlc-resonance", "inductive-kick"])
def test_issue11_defaults_are_ordinary(calculator):
    assert _plausibility(calculator)[0] == "pass"


@pytest.mark.parametrize("inputs", [
    dict(circuit="rlc", r=280, l="100 mH", c="0.4 uF", source_v=48, t="1 ms"),
    dict(circuit="rl", r=48, l="0.5 H", source_v=24, t="20 ms"),
    dict(circuit="rc", position="2", r="10 kohm", c="1000 uF", source_v="400 V", t="1 min"),
    dict(circuit="rc", r=1000, c="4.7 uF", source_v=12),
])
def test_issue11_ordinary_transients_are_plausible(inputs):
    assert _plausibility("switching-transient", **inputs)[0] == "pass"


@pytest.mark.parametrize("name, circuit, bounds, word", [
    ("r", "rc", "RESISTANCE_RANGE_OHM", "resistance"),
    ("l", "rl", "INDUCTANCE_RANGE_H", "inductance"),
    ("c", "rc", "CAPACITANCE_RANGE_F", "capacitance"),
])
@pytest.mark.parametrize("edge, share, outside", [(0, 1.01, False), (0, 0.99, True),
                                                  (1, 0.99, False), (1, 1.01, True)])
def test_issue11_part_ranges(name, circuit, bounds, word, edge, share, outside):
    from calc.calculators import _circuits
    value = getattr(_circuits, bounds)[edge] * share
    status, message = _plausibility("switching-transient", circuit=circuit, **{name: value})
    assert (status, f"the {word}" in message) == (("warn", True) if outside else ("pass", False))
    status, message = _plausibility("rlc-resonance", **{name: value})
    assert (f"the {word}" in message) == outside


@pytest.mark.parametrize("share, status", [(0.99, "pass"), (1.01, "warn")])
def test_issue11_quality_factor_threshold(share, status):
    from calc.calculators._circuits import Q_MAX
    result = _series_with_q(Q_MAX * share)
    assert values(result)["q"] == pytest.approx(Q_MAX * share, rel=1e-12)
    assert checks(result)["plausibility"] == status
    # The same limit on a ringing series RLC step: Q = 1/(2ζ), ζ = R/2 with L = C = 1.
    assert checks(_rlc_with_zeta(1 / (2 * Q_MAX * share)))["plausibility"] == status


@pytest.mark.parametrize("share, status", [(0.99, "pass"), (1.01, "warn")])
def test_issue11_lumped_frequency_threshold(share, status):
    # f0 = 1/(2π√(LC)) at `share` of LUMPED_MAX_HZ with L = 10 nH (C = 2.5 pF, Q = 63).
    f0, l = rlc_resonance.LUMPED_MAX_HZ * share, 1e-8
    c = rlc.resonant_partner(f0, l)
    result = run("rlc-resonance", r=1, l=l, c=c)
    assert values(result)["f0"] == pytest.approx(f0, rel=1e-12)
    assert checks(result)["plausibility"] == status


@pytest.mark.parametrize("share, status", [(0.99, "pass"), (1.01, "warn")])
def test_issue11_peak_current_threshold(share, status):
    # RL on a DC source: the current approaches V/R = `share` of PEAK_CURRENT_MAX_A.
    current = switching_transient.PEAK_CURRENT_MAX_A * share
    result = run("switching-transient", circuit="rl", r=0.01, l="1 mH", source_v=current * 0.01)
    assert values(result)["peak_current"] == pytest.approx(current, rel=1e-12)
    assert checks(result)["plausibility"] == status


@pytest.mark.parametrize("name, bounds, words", [
    ("supply_v", "COIL_SUPPLY_RANGE_V", "a coil supply"),
    ("l", "COIL_INDUCTANCE_RANGE_H", "a coil inductance"),
    ("stray_c", "STRAY_CAPACITANCE_RANGE_F", "a stray capacitance"),
])
@pytest.mark.parametrize("edge, share, outside", [(0, 1.01, False), (0, 0.99, True),
                                                  (1, 0.99, False), (1, 1.01, True)])
def test_issue11_coil_ranges(name, bounds, words, edge, share, outside):
    value = getattr(inductive_kick, bounds)[edge] * share
    inputs = {**COIL, "r": 480, name: value}  # 480 Ω: 1.2 W at 24 V, 133 W at 252 V
    assert (words in _plausibility("inductive-kick", **inputs)[1]) == outside


@pytest.mark.parametrize("edge, share, outside", [(0, 1.01, False), (0, 0.99, True),
                                                  (1, 0.99, False), (1, 1.01, True)])
def test_issue11_coil_power_range(edge, share, outside):
    power = inductive_kick.COIL_POWER_RANGE_W[edge] * share
    inputs = {**COIL, "r": 24 ** 2 / power}  # V²/R lands at `share` of the bound
    assert ("a coil power" in _plausibility("inductive-kick", **inputs)[1]) == outside


@pytest.mark.parametrize("share, outside", [(0.99, False), (1.01, True)])
def test_issue11_snubber_capacitance_threshold(share, outside):
    # The coil inductance whose suggested snubber (24 V, 48 Ω, switch at twice the supply) is
    # `share` of SNUBBER_CAPACITANCE_MAX_F, found by root-finding (C grows with L).
    target = inductive_kick.SNUBBER_CAPACITANCE_MAX_F * share

    def excess(log_l):
        return math.log(rlc.suggested_snubber(24.0, 48.0, math.exp(log_l), 48.0, 0.2)[1] / target)

    inductance = math.exp(optimize.brentq(excess, math.log(0.01), math.log(50.0), xtol=1e-12))
    status, message = _plausibility("inductive-kick", supply_v=24, r=48, l=inductance)
    assert values(run("inductive-kick", supply_v=24, r=48, l=inductance))["snubber_c"] == \
        pytest.approx(target, rel=1e-6)
    assert ("a snubber capacitor" in message) == outside
    assert status == ("warn" if outside else "pass")


@pytest.mark.parametrize("calculator, name, floor", [
    ("rlc-resonance", "frequency_hz", rlc_resonance.MIN_FREQUENCY_HZ),
    ("rlc-resonance", "target_hz", rlc_resonance.MIN_FREQUENCY_HZ),
    ("inductive-kick", "supply_v", inductive_kick.MIN_VOLTAGE_V),
    ("inductive-kick", "diode_vf", inductive_kick.MIN_VOLTAGE_V),
])
def test_input_floors_refuse_only_what_overflows(calculator, name, floor):
    assert run(calculator, **{name: floor * 1.01})["ok"]
    refused = errors(calculator, **{name: floor * 0.99})
    assert list(refused) == [name] and "at least" in refused[name]
