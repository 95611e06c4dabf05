"""A Fluxbook supply path rebuilt in pandapower, the independent reference for path results."""

import math

import pandapower as pp

from calc import conductors, network


def pandapower_net(path):
    """The same path in pandapower: ext grid, a two-winding transformer, lines, loads."""
    net = pp.create_empty_network(f_hz=path.source.frequency_hz)
    bases = network.zone_voltages(path)
    buses = [pp.create_bus(net, vn_kv=v / 1e3) for v in bases]
    grid = {"vm_pu": 1.0}
    if path.source.fault_va:
        grid.update(s_sc_max_mva=path.source.fault_va / 1e6, rx_max=1 / path.source.x_r)
    pp.create_ext_grid(net, buses[0], **grid)
    for k, element in enumerate(path.elements):
        if isinstance(element, network.Transformer):
            vkr = element.z_pct * math.cos(math.atan(element.x_r))
            pp.create_transformer_from_parameters(
                net, buses[path.parent(k)], buses[k + 1], sn_mva=element.kva / 1e6,
                vn_hv_kv=element.primary_v / 1e3, vn_lv_kv=element.secondary_v / 1e3,
                vk_percent=element.z_pct, vkr_percent=vkr, pfe_kw=0, i0_percent=0)
        else:
            z = conductors.impedance(element.size, element.material, element.conductor_temp_c,
                                     path.source.frequency_hz, element.raceway, None, element.method)
            pp.create_line_from_parameters(
                net, buses[path.parent(k)], buses[k + 1], length_km=element.length / 1e3,
                r_ohm_per_km=z.r_ac * 1e3 / element.sets, x_ohm_per_km=z.x * 1e3 / element.sets,
                c_nf_per_km=0, max_i_ka=100)
    for load in path.loads:
        p = load.apparent_va * load.power_factor / 1e6
        q = load.apparent_va * math.sqrt(1 - load.power_factor ** 2) / 1e6
        share = 100 if load.model == "impedance" else 0
        pp.create_load(net, buses[load.node], p_mw=p, q_mvar=q,
                       const_z_p_percent=share, const_z_q_percent=share)
    return net
