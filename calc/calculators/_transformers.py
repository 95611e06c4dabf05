"""View helpers and texts the transformer calculators share: the ideal-transformer steps every
result carries, the rating, voltage and connection inputs, and picking the one load field given.
"""

from calc import cautions, transformers
from calc.errors import InputError
from calc.spec import Input
from calc.units import format_quantity as fq

SOURCE_IDEAL = (
    "Ideal-transformer relations (ratios, reflected impedance, power balance): S. J. Chapman, "
    "Electric Machinery Fundamentals, 5th ed., sections 2.3 and 2.10 — from memory."
)

# Form labels of calc.transformers.WINDING_CONNECTIONS.
CONNECTION_LABELS = {
    "delta-wye": "Delta – wye (Dyn)",
    "delta-delta": "Delta – delta (Dd)",
    "wye-wye": "Wye – wye (Yyn)",
    "wye-delta": "Wye – delta (Yd)",
}
CONNECTIONS = tuple((name, CONNECTION_LABELS[name]) for name in transformers.WINDING_CONNECTIONS)

Z_PCT_MAX = 30  # the largest nameplate impedance the forms accept [%]


def rating_input(**overrides):
    """`kva`: the transformer's nameplate apparent power."""
    spec = dict(unit="kVA", default=75, minimum=0.001, maximum=1_000_000,
                region_defaults={"iec": 630})
    spec.update(overrides)
    return Input("kva", spec.pop("label", "Rating"), "quantity", **spec)


def voltage_input(name, label, default, iec, help_text):
    """A winding voltage [V] (`default`, `iec` in IEC practice) with the team's usual voltages
    offered."""
    return Input(name, label, "quantity", unit="V", default=default, minimum=1, maximum=800_000,
                 region_defaults={"iec": iec}, suggest="voltages", help=help_text)


def connection_input(**overrides):
    """`connection`: the three-phase winding connection."""
    spec = dict(default="delta-wye", choices=CONNECTIONS, advanced=True,
                help="Three-phase only: sets the turns ratio (and, for the fault level, whether "
                     "there is a line-to-neutral fault to find).")
    spec.update(overrides)
    return Input("connection", "Winding connection", "choice", **spec)


def ratio_display(ratio):
    """A ratio as "a : 1" or "1 : a", the larger side first."""
    if ratio >= 1.0:
        return f"{fq(ratio, '')} : 1"
    return f"1 : {fq(1.0 / ratio, '')}"


def standard_ratings(phases, series):
    """Standard ratings [kVA], smallest first: IEEE/ANSI by phase count ("na") or IEC ("iec")."""
    if series == "iec":
        return transformers.PREFERRED_KVA_IEC
    return transformers.PREFERRED_KVA_3PH_NA if phases == 3 else transformers.PREFERRED_KVA_1PH_NA


def next_standard_rating(apparent_power, ratings_kva):
    """The smallest of `ratings_kva` [kVA] at or above `apparent_power` [VA], in VA; None when
    the load is above the largest. A load exactly at a rating (to 1e-9) takes that rating."""
    for kva in ratings_kva:
        if kva * 1e3 >= apparent_power * (1.0 - 1e-9):
            return kva * 1e3
    return None


def the_one_given(inputs, names, missing):
    """The one field of `names` that is filled in; InputError if none or more than one is."""
    given = [name for name in names if inputs.get(name) is not None]
    if not given:
        raise InputError(names[0], None, missing)
    if len(given) > 1:
        raise InputError(given[1], inputs[given[1]], f"give only one of {', '.join(names)} "
                         f"({given[0]} and {given[1]} are both filled in; leave one blank)")
    return given[0]


def transformer_cautions(result, *voltages):
    """Back-feed, medium voltage where a winding is above the low-voltage limit, then the
    common cautions, after the calculator's own."""
    result.cautions.append(cautions.BACKFEED)
    if max(voltages) > transformers.LOW_VOLTAGE_LIMIT_V:
        result.cautions.append(cautions.MEDIUM_VOLTAGE)
    result.cautions += list(cautions.COMMON)


def ideal_relations(result, primary_v, secondary_v, phases, apparent_power, output_power=None,
                    losses=0.0, connection="delta-wye", show_turns=True):
    """The ideal-transformer steps every transformer result carries (the winding turns ratio
    only where the connection is known)."""
    ratio = primary_v / secondary_v
    i1 = transformers.rated_current(apparent_power, primary_v, phases)
    i2 = transformers.rated_current(apparent_power, secondary_v, phases)
    result.step("Ideal transformer: the voltage ratio, and the currents in the inverse ratio",
                "a = V₁ / V₂ = I₂ / I₁",
                f"= {fq(primary_v, 'V')} / {fq(secondary_v, 'V')} = {ratio_display(ratio)}; at "
                f"{fq(apparent_power, 'VA')}: I₁ = {fq(i1, 'A')}, I₂ = {fq(i2, 'A')}")
    if phases == 3 and show_turns:
        turns = transformers.turns_ratio(primary_v, secondary_v, 3, connection)
        result.step(f"Winding turns ratio, {connection} (a delta winding has the line voltage, a "
                    "wye winding the line voltage / √3)", "N₁ / N₂",
                    f"= {ratio_display(turns)}")
    load_z = secondary_v * secondary_v / apparent_power
    per_phase = " (per phase, wye-equivalent)" if phases == 3 else ""
    reflected = transformers.reflected_impedance(load_z, primary_v, secondary_v)
    result.step("Impedance reflected through the ratio squared: the rated load impedance seen "
                f"from the primary{per_phase}", "Z₁ = a² Z₂, Z₂ = V₂² / S",
                f"= {ratio:.4g}² × {fq(load_z, 'ohm')} = {fq(reflected, 'ohm')}")
    if output_power is None:
        output_power, text = apparent_power, "Power balance at rated load, unity power factor"
    else:
        text = "Power balance"
    loss_text = fq(losses, "W") if losses else "0 W (ideal)"
    result.step(f"{text}: power in = power out + losses", "P₁ = P₂ + P_loss",
                f"= {fq(output_power, 'W')} + {loss_text} = {fq(output_power + losses, 'W')}")
