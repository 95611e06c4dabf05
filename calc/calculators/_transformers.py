"""View helpers and texts the transformer calculators share: the ideal-transformer steps every
result carries, the rating, voltage and connection inputs, picking the one load field given, and
the range of real transformers that the plausibility checks hold inputs to.
"""

from calc import cautions, transformers
from calc.calculators._plausibility import outside
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
# The smallest the forms accept [%]: no real transformer is below about 1 %, and a %Z that
# rounds to nothing makes an infinite fault current.
Z_PCT_MIN = 0.1

# ---- the range of real transformers (the plausibility check) ------------------------------------
# Nameplate %Z of real two-winding units: about 1.5-2 % for small dry-types to 15-20 % for large
# power transformers (common practice; IEC 60076-5 Table 1 asks at least 4-8 % by rating).
Z_PCT_RANGE = (0.5, 20.0)
# The lowest winding voltage of power transformers: 12 V (control, lighting and buck-boost
# secondaries; common practice). Below it a "transformer" is an electronics part.
WINDING_V_MIN = 12.0
# The lowest public supply voltage: 100 V (Japan) less 10 % (IEC 60038 tolerance; from memory).
SUPPLY_V_MIN = 90.0
# Windings above a voltage are built from a smallest rating up: (above [V], smallest [kVA]).
# Above 1 kV, medium-voltage control-power units start at about 1 kVA (smaller ones are instrument
# transformers); above 36 kV (the top of the distribution class, IEC 60076 / IEEE C57.12), the
# smallest are station-service units of about 50 kVA. Common practice (from memory).
SMALLEST_KVA_ABOVE_V = ((transformers.LOW_VOLTAGE_LIMIT_V, 1.0), (36_000.0, 50.0))
# The largest current of a low-voltage winding [A]: low-voltage switchboard and switchgear mains
# reach 5000-6000 A (UL 891, IEEE C37.20.1; from memory), so larger loads are split between
# transformers or served at a higher voltage.
LV_WINDING_CURRENT_MAX_A = 6000.0
# A load beyond 150 % of rating exceeds the loading guides' emergency limits (IEEE C57.91, IEC
# 60076-7: 150 % for distribution transformers, from memory).
LOAD_PCT_MAX = 150.0


def smallest_rating(voltage):
    """The smallest usual rating [VA] of a transformer with a winding at `voltage` [V] (0 when
    any size is built)."""
    smallest = 0.0
    for above, kva in SMALLEST_KVA_ABOVE_V:
        if voltage > above:
            smallest = kva * 1e3
    return smallest


def equipment_reasons(apparent_power, phases, windings, z_pct=None):
    """Reasons, for the plausibility check, that a transformer of `apparent_power` [VA] with these
    `windings` [(name, voltage [V])] and nameplate `z_pct` [%] is not real equipment."""
    reasons = []
    rating = fq(apparent_power, "VA")
    for name, voltage in windings:
        volts = fq(voltage, "V")
        if voltage < WINDING_V_MIN:
            reasons.append(f"the {name} of {volts} is below any power transformer winding (from "
                           f"{WINDING_V_MIN:g} V, common practice)")
        smallest = smallest_rating(voltage)
        if apparent_power < smallest:
            reasons.append(f"a {rating} transformer with a {volts} {name}: windings at this "
                           f"voltage are built for {fq(smallest, 'VA')} and up (common practice); "
                           "check the rating and the voltage")
        current = transformers.rated_current(apparent_power, voltage, phases)
        if voltage <= transformers.LOW_VOLTAGE_LIMIT_V and current > LV_WINDING_CURRENT_MAX_A:
            reasons.append(f"{rating} at {volts} is {fq(current, 'A')} in the {name}: low-voltage "
                           f"windings and switchboards are built for up to about "
                           f"{fq(LV_WINDING_CURRENT_MAX_A, 'A')} (UL 891, IEEE C37.20.1, from "
                           "memory); split the load or use a higher voltage")
    if z_pct is not None and outside(z_pct, *Z_PCT_RANGE):
        reasons.append(f"an impedance of {z_pct:g} % is outside the {Z_PCT_RANGE[0]:g}-"
                       f"{Z_PCT_RANGE[1]:g} % of real transformers (common practice); check the "
                       "nameplate")
    return reasons


def load_reason(load_pct, what="the load"):
    """The reason, if any, that a load [% of rating] is beyond the loading guides."""
    if load_pct > LOAD_PCT_MAX:
        return (f"{what} of {load_pct:g} % of rating is beyond the {LOAD_PCT_MAX:g} % emergency "
                "limit of the loading guides (IEEE C57.91, IEC 60076-7; from memory)")
    return None


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
