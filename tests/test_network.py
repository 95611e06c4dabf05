"""calc.network: the radial path engine against pandapower (load flow and IEC 60909 faults),
hand calculations, limiting cases and every error path of the path data."""

import math
import random
import warnings

import pytest

from calc import network
from calc.errors import ParameterError, PathError


@pytest.fixture
def pp():
    """pandapower, for the tests that compare with it (they alone skip without it)."""
    return pytest.importorskip("pandapower")


@pytest.fixture
def pp_sc(pp):
    return pytest.importorskip("pandapower.shortcircuit")


def _pandapower(path):
    from tests.pandapower_reference import pandapower_net
    return pandapower_net(path)


def _path_data(rng, with_source=True):
    """A random source → transformer → feeder → branch path with a load at each run's end."""
    kva = rng.choice([150, 300, 500, 750, 1000, 1500])
    mv = rng.choice([4160, 12470, 13800])
    lv = rng.choice([208, 480, 600])
    data = {
        "source": {"voltage": mv, "frequency_hz": 60},
        "elements": [
            {"kind": "transformer", "kva": kva, "primary_v": mv, "secondary_v": lv,
             "z_pct": rng.uniform(2.5, 7.5), "x_r": rng.uniform(2, 10)},
            {"kind": "cable", "size": rng.choice(["4/0", "250 kcmil", "500 kcmil"]),
             "length": rng.uniform(10, 80), "sets": rng.choice([1, 2, 3])},
            {"kind": "cable", "size": rng.choice(["6 AWG", "4 AWG", "2 AWG", "1/0"]),
             "length": rng.uniform(5, 60)},
        ],
        "loads": [
            {"node": 2, "kva": 0.4 * kva, "pf": rng.uniform(0.75, 1.0), "model": "power"},
            {"node": 3, "kva": rng.uniform(5, 40), "pf": rng.uniform(0.2, 0.9),
             "model": "impedance"},
        ],
    }
    if with_source:
        data["source"].update(fault_mva=rng.uniform(50, 500), x_r=rng.uniform(5, 15))
    return data


def test_node_voltages_match_pandapower_power_flow(pp):
    # Same series impedances, ideal transformer, constant-power and constant-impedance loads;
    # pandapower's Newton-Raphson at 1e-12 MVA and our sweep at 1e-10 pu agree to 1e-7.
    # The ext grid holds its bus at 1.0 pu, so the source here is an infinite bus.
    rng = random.Random(7)
    for _ in range(15):
        path = network.path_from_dict(_path_data(rng, with_source=False))
        ours = network.solve(path)
        net = _pandapower(path)
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            pp.runpp(net, tolerance_mva=1e-12, numba=False)
        theirs = list(net.res_bus.vm_pu * network.zone_voltages(path))
        assert ours.voltages == pytest.approx(theirs, rel=1e-7)


def test_fault_currents_match_pandapower_iec_60909(pp_sc):
    # IEC 60909-0 maximum currents: c = 1.1, transformer correction K_T; pandapower's
    # calc_sc(case="max") with its default lv_tol_percent = 10 uses the same c. Initial
    # symmetrical current and peak current agree to 1e-6 (float rounding).
    rng = random.Random(11)
    for _ in range(15):
        path = network.path_from_dict(_path_data(rng))
        ours = network.faults(path, voltage_factor=1.1, iec60909=True)
        net = _pandapower(path)
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            pp_sc.calc_sc(net, case="max", ip=True, branch_results=False)
        for fault, row in zip(ours, net.res_bus_sc.itertuples()):
            assert fault.three_phase_a == pytest.approx(row.ikss_ka * 1e3, rel=1e-6)
            assert fault.peak_a == pytest.approx(row.ip_ka * 1e3, rel=1e-6)


def test_a_tree_of_two_runs_from_one_transformer_matches_pandapower(pp, pp_sc):
    # Two runs fed from the transformer secondary (node 1): "from": 1 on the second run.
    rng = random.Random(13)
    for _ in range(8):
        data = _path_data(rng, with_source=False)
        data["elements"][2]["from"] = 1
        data["loads"][1]["node"] = 3
        path = network.path_from_dict(data)
        ours = network.solve(path)
        net = _pandapower(path)
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            pp.runpp(net, tolerance_mva=1e-12, numba=False)
        theirs = list(net.res_bus.vm_pu * network.zone_voltages(path))
        assert ours.voltages == pytest.approx(theirs, rel=1e-7)
        data["source"].update(fault_mva=300, x_r=8)
        path = network.path_from_dict(data)
        net = _pandapower(path)
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            pp_sc.calc_sc(net, case="max", ip=True, branch_results=False)
        ours = network.faults(path, voltage_factor=1.1, iec60909=True)
        theirs = list(net.res_bus_sc.ikss_ka * 1e3)
        assert [f.three_phase_a for f in ours] == pytest.approx(theirs, rel=1e-6)


def test_fault_current_falls_along_the_path():
    path = network.path_from_dict(_path_data(random.Random(3)))
    currents = [f.three_phase_a for f in network.faults(path)[1:]]
    assert currents == sorted(currents, reverse=True)


def test_infinite_source_is_the_upper_bound():
    rng = random.Random(5)
    data = _path_data(rng)
    finite = network.faults(network.path_from_dict(data))
    del data["source"]["fault_mva"]
    infinite = network.faults(network.path_from_dict(data))
    assert infinite[0].three_phase_a is None  # the infinite bus itself has no finite value
    for a, b in zip(finite[1:], infinite[1:]):
        assert a.three_phase_a < b.three_phase_a


def test_transformer_secondary_fault_by_hand():
    # Infinite source, 1000 kVA, 480 V, 5.75 %: I = I_FL × 100 / %Z = 1202.8 × 100 / 5.75
    # = 20 918 A (IEEE Std 141 (Red Book) short-circuit method, read; computed).
    path = network.path_from_dict({
        "source": {"voltage": 12470},
        "elements": [{"kind": "transformer", "kva": 1000, "primary_v": 12470, "secondary_v": 480,
                      "z_pct": 5.75}]})
    fault = network.faults(path)[1]
    full_load = 1000e3 / (math.sqrt(3) * 480)
    assert fault.three_phase_a == pytest.approx(full_load * 100 / 5.75, rel=1e-12)
    # a bolted line-to-neutral fault at a delta-wye secondary equals the three-phase one
    # (Z0 = Z1 of the transformer, infinite source)
    assert fault.line_to_neutral_a == pytest.approx(fault.three_phase_a, rel=1e-12)


def test_line_to_neutral_loop_through_a_run():
    # Past the transformer a run adds its phase and its return conductor: Z = Z_T + Z_ph + Z_n.
    data = {"source": {"voltage": 12470},
            "elements": [{"kind": "transformer", "kva": 500, "primary_v": 12470, "secondary_v": 208,
                          "z_pct": 4.0, "x_r": 4.0},
                         {"kind": "cable", "size": "10 AWG", "length": 30}]}
    path = network.path_from_dict(data)
    fault = network.faults(path)[2]
    z_t = network.element_impedance(path, 0) * network.base_impedance(208)
    z_ph, z_n = network.cable_ohms(path, path.elements[1])
    expected = 208 / math.sqrt(3) / abs(z_t + z_ph + z_n)
    assert fault.line_to_neutral_a == pytest.approx(expected, rel=1e-9)


def test_voltage_collapse_is_an_error_not_a_number():
    data = _path_data(random.Random(1), with_source=False)
    data["loads"][0]["kva"] = 60000  # far beyond what the transformer can pass
    with pytest.raises(PathError, match="collapse|steady state"):
        network.solve(network.path_from_dict(data))


@pytest.mark.parametrize("change, field", [
    (lambda d: d["elements"][0].update(z_pct=40), "elements[0].z_pct"),
    (lambda d: d["elements"][0].update(primary_v=480), "elements[0].primary_v"),
    (lambda d: d["elements"][1].update(size="3.3 mm2"), "elements[1].size"),
    (lambda d: d["elements"][1].update(kind="busway"), "elements[1].kind"),
    (lambda d: d["elements"][2].update(sets=1.5), "elements[2].sets"),
    (lambda d: d["loads"][0].update(node=9), "loads[0].node"),
    (lambda d: d["loads"][0].update(model="magic"), "loads[0].model"),
    (lambda d: d["source"].update(voltage=-1), "source.voltage"),
    (lambda d: d["source"].update(phases=2), "source.phases"),
    (lambda d: d["elements"][1].update({"from": 5}), "elements[1].from"),
])
def test_bad_path_data_names_the_item(change, field):
    # A physics error names the item by its place in the data, never a form field; the message
    # names it too, so it reads on its own.
    data = _path_data(random.Random(2))
    change(data)
    with pytest.raises(ParameterError) as caught:
        network.path_from_dict(data)
    assert caught.value.parameter == field and field in caught.value.message


def test_unknown_part_of_a_path():
    with pytest.raises(ParameterError, match="unknown part 'wires'"):
        network.path_from_dict({"source": {"voltage": 480}, "wires": []})


def test_source_given_by_available_current():
    # S_sc = √3 V I_sc (IEC 60909-0 §6.2, from memory): 10 kA at 12.47 kV is 216 MVA (computed).
    path = network.path_from_dict({"source": {"voltage": 12470, "fault_a": 10e3}})
    assert path.source.fault_va == pytest.approx(math.sqrt(3) * 12470 * 10e3, rel=1e-12)
    single = network.path_from_dict({"source": {"voltage": 240, "phases": 1, "fault_a": 10e3}})
    assert single.source.fault_va == pytest.approx(240 * 10e3, rel=1e-12)


def test_a_tap_raises_the_secondary_voltage_by_its_ratio():
    # At no load an ideal transformer on a +2.5 % tap gives 1.025 pu (computed).
    data = {"source": {"voltage": 12470},
            "elements": [{"kind": "transformer", "kva": 500, "primary_v": 12470,
                          "secondary_v": 480, "z_pct": 5.75, "tap_pct": 2.5}]}
    solution = network.solve(network.path_from_dict(data))
    assert solution.voltages[1] == pytest.approx(480 * 1.025, rel=1e-12)


def test_per_unit_bases():
    # Z_base = V² / S_base; a transformer's |Z| = %Z/100 × S_base / S_rated (IEEE Std 141 ch. 4
    # per-unit method, from memory; computed).
    assert network.base_impedance(480.0) == pytest.approx(480.0 ** 2 / network.BASE_VA, rel=1e-15)
    path = network.path_from_dict({"source": {"voltage": 12470}, "elements": [
        {"kind": "transformer", "kva": 500, "primary_v": 12470, "secondary_v": 480,
         "z_pct": 5.75}]})
    assert abs(network.element_impedance(path, 0)) == pytest.approx(
        0.0575 * network.BASE_VA / 500e3, rel=1e-12)
