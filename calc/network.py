"""Radial supply paths: a source, series elements (transformers, conductor runs) and nodes with
loads; node voltages under load, element currents, and fault currents at every node.

A path is a chain by default; an element may name the node it is fed from ("from"), which makes
the path a radial tree (two runs from one transformer, say). Element k always ends at node k + 1.

Per-unit on one base apparent power; each transformer starts a new voltage zone whose base is its
rated secondary voltage. A path is plain data (a dict, as JSON holds it) so pages, share links and
saved jobs can carry it; `path_from_dict` checks it and names the field of any mistake.
"""

import cmath
import math
from dataclasses import dataclass, field

from calc import conductors, units
from calc.errors import CalcError, InputError, UnitError

SQRT3 = math.sqrt(3.0)
BASE_VA = 1e6  # per-unit base apparent power; any value gives the same answers
DEFAULT_SOURCE_X_R = 10.0  # utility source X/R when none is given (common practice for LV studies)
MAX_ITERATIONS = 200
TOLERANCE_PU = 1e-10

LOAD_MODELS = ("impedance", "current", "power")


class PathError(CalcError):
    """The path cannot be solved: no steady state (voltage collapse) or it is not connected."""


@dataclass
class Source:
    voltage: float  # nominal line-to-line (3ph) or line (1ph) [V]
    phases: int = 3
    frequency_hz: float = 60.0
    fault_va: float | None = None  # three-phase short-circuit power [VA]; None = infinite bus
    x_r: float = DEFAULT_SOURCE_X_R


@dataclass
class Transformer:
    name: str
    kva: float  # rating [VA] (named kva in the data, in kVA there)
    primary_v: float
    secondary_v: float
    z_pct: float
    x_r: float = 5.0
    tap_pct: float = 0.0  # + raises the secondary voltage
    grounded_secondary: bool = True  # a wye secondary with its neutral grounded (Dyn)
    parent: int | None = None  # the node it is fed from; None = the previous element's far end


@dataclass
class Cable:
    name: str
    size: object  # units.ConductorSize
    length: float  # one-way [m]
    material: str = "cu"
    sets: int = 1
    raceway: str = "pvc"
    conductor_temp_c: float = 75.0
    method: str = "table"
    neutral_size: object = None  # return conductor for line-to-neutral faults; None = same size
    parent: int | None = None  # the node it is fed from; None = the previous element's far end


@dataclass
class Load:
    node: int  # 0 = the source bus, k = the far end of element k
    apparent_va: float  # at rated voltage
    power_factor: float = 0.85  # lagging
    model: str = "power"
    name: str = ""


@dataclass
class Path:
    source: Source
    elements: list
    loads: list = field(default_factory=list)

    @property
    def nodes(self):
        return len(self.elements) + 1

    def parent(self, index):
        """The node element `index` is fed from (its far end is node index + 1)."""
        given = self.elements[index].parent
        return index if given is None else given


# ---- reading a path from data ----------------------------------------------------------------

def _number(data, key, where, default=None, low=None, high=None, exclusive_low=False):
    value = data.get(key, default)
    if value is None:
        raise InputError(f"{where}.{key}", None, f"{where}.{key} is required")
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        raise InputError(f"{where}.{key}", value, f"{where}.{key} must be a number, got {value!r}")
    value = float(value)
    bad_low = low is not None and (value <= low if exclusive_low else value < low)
    if not math.isfinite(value) or bad_low or (high is not None and value > high):
        span = f"{'above' if exclusive_low else 'at least'} {low:g}" if low is not None else ""
        span += f"{' and ' if span else ''}at most {high:g}" if high is not None else ""
        raise InputError(f"{where}.{key}", value, f"{where}.{key} = {value:g} is out of range; "
                         f"enter a number {span}")
    return value


def path_from_dict(data):
    """Check path data and build a Path. Voltages in V, kVA in kVA, lengths in m, z_pct in %.

    Raises
    ------
    InputError
        Naming the first wrong item as "source.voltage", "elements[1].z_pct", "loads[0].node"...
    """
    if not isinstance(data, dict):
        raise InputError("path", data, "a path is an object with source, elements and loads")
    unknown = sorted(set(data) - {"source", "elements", "loads"})
    if unknown:
        raise InputError("path", unknown[0], f"unknown part {unknown[0]!r}; a path has source, "
                         "elements and loads")
    raw = data.get("source") or {}
    phases = raw.get("phases", 3)
    if phases not in (1, 3):
        raise InputError("source.phases", phases, "source.phases must be 1 or 3")
    fault_va = None
    if raw.get("fault_mva") is not None:
        fault_va = _number(raw, "fault_mva", "source", low=0, exclusive_low=True) * 1e6
    elif raw.get("fault_a") is not None:
        voltage = _number(raw, "voltage", "source", low=0, exclusive_low=True)
        current = _number(raw, "fault_a", "source", low=0, exclusive_low=True)
        fault_va = (SQRT3 if phases == 3 else 1.0) * voltage * current
    source = Source(
        voltage=_number(raw, "voltage", "source", low=0, exclusive_low=True, high=800e3),
        phases=phases,
        frequency_hz=_number(raw, "frequency_hz", "source", 60.0, low=1, high=400),
        fault_va=fault_va,
        x_r=_number(raw, "x_r", "source", DEFAULT_SOURCE_X_R, low=0.05, high=100),
    )
    elements = []
    for i, item in enumerate(data.get("elements") or []):
        where = f"elements[{i}]"
        kind = item.get("kind") if isinstance(item, dict) else None
        parent = item.get("from", i) if isinstance(item, dict) else i
        if not isinstance(parent, int) or isinstance(parent, bool) or not 0 <= parent <= i:
            raise InputError(f"{where}.from", parent, f"{where}.from must be a node already on "
                             f"the path, 0 to {i}: the path does not connect there")
        if kind == "transformer":
            elements.append(Transformer(
                name=str(item.get("name", f"Transformer {i + 1}")),
                kva=_number(item, "kva", where, low=0, exclusive_low=True, high=1e6) * 1e3,
                primary_v=_number(item, "primary_v", where, low=0, exclusive_low=True, high=800e3),
                secondary_v=_number(item, "secondary_v", where, low=0, exclusive_low=True, high=800e3),
                z_pct=_number(item, "z_pct", where, low=0, exclusive_low=True, high=30),
                x_r=_number(item, "x_r", where, 5.0, low=0.05, high=100),
                tap_pct=_number(item, "tap_pct", where, 0.0, low=-10, high=10),
                grounded_secondary=bool(item.get("grounded_secondary", True)),
                parent=parent,
            ))
        elif kind == "cable":
            try:
                size = units.parse_conductor_size(item.get("size"))
                neutral = item.get("neutral_size")
                neutral = units.parse_conductor_size(neutral) if neutral else None
            except UnitError as error:
                raise InputError(f"{where}.size", item.get("size"), str(error)) from None
            sets = _number(item, "sets", where, 1, low=1, high=20)
            if not sets.is_integer():
                raise InputError(f"{where}.sets", sets, "sets must be a whole number")
            elements.append(Cable(
                name=str(item.get("name", f"Run {i + 1}")), size=size, neutral_size=neutral,
                length=_number(item, "length", where, low=0, exclusive_low=True, high=1e5),
                material=_choice(item, "material", where, ("cu", "al"), "cu"),
                sets=int(sets),
                raceway=_choice(item, "raceway", where, tuple(t for t, _ in conductors.RACEWAYS), "pvc"),
                conductor_temp_c=_number(item, "conductor_temp_c", where, 75.0, low=-40, high=250),
                method=_choice(item, "method", where, ("table", "physics"), "table"),
                parent=parent,
            ))
        else:
            raise InputError(f"{where}.kind", kind, f"{where}.kind must be transformer or cable")
    path = Path(source, elements)
    _check_voltages(path)
    for i, item in enumerate(data.get("loads") or []):
        where = f"loads[{i}]"
        node = item.get("node") if isinstance(item, dict) else None
        if not isinstance(node, int) or isinstance(node, bool) or not 0 <= node < path.nodes:
            raise InputError(f"{where}.node", node, f"{where}.node must be a node of the path, "
                             f"0 to {path.nodes - 1}: the path does not connect there")
        path.loads.append(Load(
            node=node,
            apparent_va=_number(item, "kva", where, low=0, high=1e6) * 1e3,
            power_factor=_number(item, "pf", where, 0.85, low=0, exclusive_low=True, high=1),
            model=_choice(item, "model", where, LOAD_MODELS, "power"),
            name=str(item.get("name", f"Load {i + 1}")),
        ))
    return path


def _choice(data, key, where, allowed, default):
    value = data.get(key, default)
    if value not in allowed:
        raise InputError(f"{where}.{key}", value, f"{where}.{key} must be one of: {', '.join(allowed)}")
    return value


def _check_voltages(path):
    """Each transformer's primary must be the zone voltage it is fed at (within ±15 %)."""
    bases = [path.source.voltage]
    for i, element in enumerate(path.elements):
        zone = bases[path.parent(i)]
        if isinstance(element, Transformer):
            if not 0.85 <= zone / element.primary_v <= 1.15:
                raise InputError(f"elements[{i}].primary_v", element.primary_v,
                                 f"the {element.name} primary is rated {element.primary_v:g} V but "
                                 f"is fed at {zone:g} V; the path does not connect")
            zone = element.secondary_v
        bases.append(zone)


# ---- per-unit model --------------------------------------------------------------------------

def zone_voltages(path):
    """Base voltage of each node [V]: the source's, then each transformer's rated secondary."""
    bases = [path.source.voltage]
    for index, element in enumerate(path.elements):
        parent_base = bases[path.parent(index)]
        bases.append(element.secondary_v if isinstance(element, Transformer) else parent_base)
    return bases


def _z_base(path, voltage):
    # Per-phase equivalent: V_LL² / S_3ph for three-phase; a single-phase loop is V² / S.
    return voltage * voltage / BASE_VA


def _impedance_from_magnitude(magnitude, x_r):
    angle = math.atan(x_r)
    return complex(magnitude * math.cos(angle), magnitude * math.sin(angle))


def source_impedance(path):
    """Source impedance [pu] from its short-circuit power and X/R (0 for an infinite bus)."""
    if path.source.fault_va is None:
        return 0j
    return _impedance_from_magnitude(BASE_VA / path.source.fault_va, path.source.x_r)


def cable_ohms(path, cable):
    """(Z_phase, Z_return) [Ω] of a run: its conductors in parallel, per phase."""
    frequency = path.source.frequency_hz
    z = conductors.impedance(cable.size, cable.material, cable.conductor_temp_c, frequency,
                             cable.raceway, None, cable.method)
    phase = complex(z.r_ac, z.x) * cable.length / cable.sets
    if cable.neutral_size is None:
        return phase, phase
    n = conductors.impedance(cable.neutral_size, cable.material, cable.conductor_temp_c,
                             frequency, cable.raceway, None, cable.method)
    return phase, complex(n.r_ac, n.x) * cable.length / cable.sets


def element_impedance(path, index):
    """Series impedance of element `index` [pu] on the system base (a 1ph cable: the loop)."""
    element = path.elements[index]
    if isinstance(element, Transformer):
        magnitude = element.z_pct / 100.0 * BASE_VA / element.kva
        return _impedance_from_magnitude(magnitude, element.x_r)
    base = zone_voltages(path)[index + 1]
    phase, back = cable_ohms(path, element)
    ohms = phase + back if path.source.phases == 1 else phase
    return ohms / _z_base(path, base)


def ratio(element):
    """Off-nominal voltage ratio of an element: the transformer's tap, 1 for a run."""
    return 1.0 + element.tap_pct / 100.0 if isinstance(element, Transformer) else 1.0


# ---- load flow ----------------------------------------------------------------------------

@dataclass
class Solution:
    voltages_pu: list  # complex, per node
    voltages: list  # magnitude [V], per node (line-to-line for three-phase)
    currents: list  # magnitude [A] in each element, at its far end's base
    iterations: int


def _load_current_pu(load, voltage_pu):
    s_pu = load.apparent_va / BASE_VA
    sin_phi = math.sqrt(max(0.0, 1.0 - load.power_factor ** 2))
    s = complex(s_pu * load.power_factor, s_pu * sin_phi)
    if load.model == "power":
        return (s / voltage_pu).conjugate()
    if load.model == "current":
        return (s / (voltage_pu / abs(voltage_pu))).conjugate()
    return s.conjugate() * voltage_pu  # constant impedance: S at 1 pu, so Y = S*


def solve(path, source_voltage_pu=1.0):
    """Steady-state node voltages by backward/forward sweep on the radial path.

    Raises
    ------
    PathError
        When no steady state exists (the loads collapse the voltage) or the sweep does not
        converge; never a wrong number.
    """
    n = path.nodes
    z_source = source_impedance(path)
    z_elements = [element_impedance(path, k) for k in range(len(path.elements))]
    ratios = [ratio(e) for e in path.elements]
    parents = [path.parent(k) for k in range(len(path.elements))]
    voltages = [complex(source_voltage_pu)] * n
    for iteration in range(1, MAX_ITERATIONS + 1):
        injected = [0j] * n
        for load in path.loads:
            if abs(voltages[load.node]) < 0.05:
                raise PathError("voltage collapse: the load cannot be supplied through this path")
            injected[load.node] += _load_current_pu(load, voltages[load.node])
        # backward sweep: each node's current includes everything fed from it; an element's
        # primary-side current is its far end's times the ideal ratio (I₁ = t I₂)
        through = list(injected)
        for k in range(len(z_elements) - 1, -1, -1):
            through[parents[k]] += ratios[k] * through[k + 1]
        # forward sweep from the source
        new = [0j] * n
        new[0] = source_voltage_pu - z_source * through[0]
        for k, z in enumerate(z_elements):
            current_k = through[k + 1] * ratios[k]  # current on the element's primary side
            new[k + 1] = (new[parents[k]] - z * current_k) * ratios[k]
        change = max(abs(a - b) for a, b in zip(new, voltages))
        voltages = new
        if any(not cmath.isfinite(v) or abs(v) > 10 for v in voltages):
            break
        if change < TOLERANCE_PU:
            bases = zone_voltages(path)
            currents = []
            for k in range(len(path.elements)):
                amps_base = BASE_VA / ((SQRT3 if path.source.phases == 3 else 1.0) * bases[k + 1])
                currents.append(abs(through[k + 1]) * amps_base)
            return Solution(voltages, [abs(v) * b for v, b in zip(voltages, bases)], currents,
                            iteration)
    raise PathError("no steady state: the loads collapse the voltage along this path")


# ---- faults ---------------------------------------------------------------------------------

def peak_factor(x_r):
    """IEC 60909-0 peak factor κ = 1.02 + 0.98 e^(−3 R/X) (clause 4.3.1.1, from memory)."""
    return 1.02 + 0.98 * math.exp(-3.0 / x_r) if x_r > 0 else 1.02


@dataclass
class Fault:
    node: int
    three_phase_a: float | None  # bolted symmetrical current [A]; None at an infinite bus
    x_r: float
    peak_a: float  # κ √2 I
    line_to_neutral_a: float | None  # where a grounded neutral exists downstream of a source


def transformer_correction(transformer, voltage_factor):
    """IEC 60909-0 K_T = 0.95 c_max / (1 + 0.6 x_T) for a network transformer (clause 6.3.3,
    from memory); x_T is its reactance in per unit of its own rating."""
    x_t = transformer.z_pct / 100.0 * math.sin(math.atan(transformer.x_r))
    return 0.95 * voltage_factor / (1.0 + 0.6 * x_t)


def faults(path, voltage_factor=1.0, iec60909=False, source_voltage_factor=None):
    """Bolted fault currents at every node (loads and motor contribution neglected).

    `voltage_factor` is IEC 60909's c (1.0 for a plain bolted-fault estimate; c_max 1.05 or 1.10
    LV and 1.10 MV for maximum currents, IEC 60909-0 Table 1, from memory). With `iec60909`,
    each transformer's impedance is also multiplied by K_T (clause 6.3.3), and the feeder is
    Z_Q = c_Q U² / S''kQ with c_Q = `source_voltage_factor` (§6.2; the feeder's own c, 1.10
    above 1 kV) or, when that is not given, c itself.

    Three-phase: I = c V / (√3 |Z_th|). Line-to-neutral, past a grounded-wye transformer
    secondary: I = 3 c V/√3 / |2 Z1 + Z0|, with Z0 the transformer's (delta-wye: Z0 = Z1 of the
    transformer) plus each run's phase and 3 × return conductor — which for runs is the loop
    method's Z_phase + Z_return. Before any transformer it is given only for a single-phase path.
    """
    bases = zone_voltages(path)
    # IEC 60909 defines the feeder by its fault level at its own c: Z_Q = c_Q U² / S''kQ.
    c_q = voltage_factor if source_voltage_factor is None else source_voltage_factor
    z1_nodes = [source_impedance(path) * (c_q if iec60909 else 1.0)]
    z0_nodes = [None if path.source.phases == 3 else 0j]
    result = []
    for node in range(path.nodes):
        if node > 0:
            index = node - 1
            element = path.elements[index]
            z_element = element_impedance(path, index)
            if iec60909 and isinstance(element, Transformer):
                z_element *= transformer_correction(element, voltage_factor)
            z1_nodes.append(z1_nodes[path.parent(index)] + z_element)
            z0 = z0_nodes[path.parent(index)]
            if isinstance(element, Transformer):
                z0 = z_element if element.grounded_secondary else None
            elif z0 is not None:
                phase, back = cable_ohms(path, element)
                z0 = z0 + (phase + 3.0 * back) / _z_base(path, bases[node])
            z0_nodes.append(z0)
        z1, z0 = z1_nodes[node], z0_nodes[node]
        amps_base = BASE_VA / ((SQRT3 if path.source.phases == 3 else 1.0) * bases[node])
        if z1 == 0:  # the bus of an infinite source: no finite fault current to report
            result.append(Fault(node, None, None, None, None))
            continue
        i3 = voltage_factor * amps_base / abs(z1)
        x_r = z1.imag / z1.real if z1.real > 0 else 100.0
        if path.source.phases == 1:
            ln = i3  # a single-phase loop: the loop impedance is already in z1
        elif z0 is not None:
            ln = voltage_factor * 3.0 * amps_base / abs(2.0 * z1 + z0)
        else:
            ln = None
        result.append(Fault(node, i3, x_r, peak_factor(x_r) * math.sqrt(2.0) * i3, ln))
    return result
