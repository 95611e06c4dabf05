"""Supply paths rebuilt in pandapower, the independent reference for path results.

Only the tests that need pandapower import this module (after pytest.importorskip), so a machine
without it skips those tests alone. The networks are built here from plain figures — voltages,
ratings, impedances — with this module's own per-unit and ohmic conversions; only the per-metre
conductor constants come from calc.conductors (tested on their own against NEC Chapter 9 Tables
8 and 9 in tests/test_conductors.py).
"""

import math

import pandapower as pp

from calc import conductors


def _line_constants(size, material, temperature_c, frequency_hz, raceway="pvc", method="table"):
    """(R, X) of one conductor [Ω/km]."""
    z = conductors.impedance(size, material, temperature_c, frequency_hz, raceway, None, method)
    return z.r_ac * 1e3, z.x * 1e3


def _transformer(net, hv_bus, lv_bus, rating, primary_v, secondary_v, z_pct, x_r):
    """A two-winding transformer: %Z with its resistive part %R = %Z cos(atan(X/R)), no losses
    in the core (the path engine's ideal-transformer model)."""
    pp.create_transformer_from_parameters(
        net, hv_bus, lv_bus, sn_mva=rating / 1e6, vn_hv_kv=primary_v / 1e3,
        vn_lv_kv=secondary_v / 1e3, vk_percent=z_pct,
        vkr_percent=z_pct * math.cos(math.atan(x_r)), pfe_kw=0, i0_percent=0)


def _load(net, bus, apparent_va, power_factor, model):
    """A load drawing `apparent_va` at rated voltage; model "power", "current" or "impedance"."""
    p = apparent_va * power_factor / 1e6
    q = apparent_va * math.sqrt(1 - power_factor ** 2) / 1e6
    z = 100 if model == "impedance" else 0
    i = 100 if model == "current" else 0
    pp.create_load(net, bus, p_mw=p, q_mvar=q, const_z_p_percent=z, const_z_q_percent=z,
                   const_i_p_percent=i, const_i_q_percent=i)


def pandapower_net(path):
    """A calc.network.Path in pandapower: ext grid, two-winding transformers, lines, loads.

    The ext grid holds its bus at 1.0 pu in a power flow (an infinite source there); its
    short-circuit power and X/R serve pandapower's IEC 60909 module. Each bus's nominal voltage
    is worked out here from the transformers' ratings, not taken from calc.network.
    """
    net = pp.create_empty_network(f_hz=path.source.frequency_hz)
    bases = [path.source.voltage]
    buses = [pp.create_bus(net, vn_kv=path.source.voltage / 1e3)]
    for k, element in enumerate(path.elements):
        parent = path.parent(k)
        is_transformer = hasattr(element, "z_pct")
        bases.append(element.secondary_v if is_transformer else bases[parent])
        buses.append(pp.create_bus(net, vn_kv=bases[-1] / 1e3))
        if is_transformer:
            _transformer(net, buses[parent], buses[-1], element.kva, element.primary_v,
                         element.secondary_v, element.z_pct, element.x_r)
        else:
            r, x = _line_constants(element.size, element.material, element.conductor_temp_c,
                                   path.source.frequency_hz, element.raceway, element.method)
            pp.create_line_from_parameters(
                net, buses[parent], buses[-1], length_km=element.length / 1e3,
                r_ohm_per_km=r / element.sets, x_ohm_per_km=x / element.sets, c_nf_per_km=0,
                max_i_ka=100)
    grid = {"vm_pu": 1.0}
    if path.source.fault_va:
        grid.update(s_sc_max_mva=path.source.fault_va / 1e6, rx_max=1 / path.source.x_r)
    pp.create_ext_grid(net, buses[0], **grid)
    for load in path.loads:
        _load(net, buses[load.node], load.apparent_va, load.power_factor, load.model)
    return net


def motor_start_net(inputs, motor):
    """The motor-start-dip calculator's path in pandapower, from its validated inputs alone.

    Buses: 0 the transformer primary, 1 its secondary, 2 the shared node, 3 the motor. A finite
    supply is an ideal source behind an impedance of |Z| = 1 pu on its own short-circuit power
    S_sc at angle atan(X/R) (so Z = V² / S_sc); runs are the inputs' conductors in PVC conduit
    at 75 °C with the NEC table constants, as the calculator takes them. `motor` is None before
    the start, else (apparent power at rated voltage [VA], power factor, model).
    """
    net = pp.create_empty_network(f_hz=inputs["frequency_hz"])
    primary, secondary = inputs["source_v"] / 1e3, inputs["secondary_v"] / 1e3
    buses = [pp.create_bus(net, vn_kv=kv) for kv in (primary, secondary, secondary, secondary)]
    if inputs["source_mva"] is None:
        pp.create_ext_grid(net, buses[0], vm_pu=1.0)
    else:
        grid = pp.create_bus(net, vn_kv=primary)
        pp.create_ext_grid(net, grid, vm_pu=1.0)
        angle = math.atan(inputs["source_x_r"])
        pp.create_impedance(net, grid, buses[0], rft_pu=math.cos(angle), xft_pu=math.sin(angle),
                            sn_mva=inputs["source_mva"] / 1e6)
    _transformer(net, buses[0], buses[1], inputs["xfmr_kva"], inputs["source_v"],
                 inputs["secondary_v"], inputs["xfmr_z_pct"], inputs["xfmr_x_r"])
    for (start, end), run in (((1, 2), "feeder"), ((2, 3), "branch")):
        r, x = _line_constants(inputs[f"{run}_size"], inputs["material"], 75.0,
                               inputs["frequency_hz"])
        pp.create_line_from_parameters(
            net, buses[start], buses[end], length_km=inputs[f"{run}_length"] / 1e3,
            r_ohm_per_km=r, x_ohm_per_km=x, c_nf_per_km=0, max_i_ka=100)
    _load(net, buses[2], inputs["other_kva"], inputs["other_pf"], "power")
    if motor is not None:
        _load(net, buses[3], *motor)
    return net
