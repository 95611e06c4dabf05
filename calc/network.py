"""Radial supply paths: a source, series elements (transformers, conductor runs) and nodes with
loads; node voltages under load, element currents, and fault currents at every node.

A path is a chain by default; an element may name the node it is fed from ("from"), which makes
the path a radial tree (two runs from one transformer, say). Element k always ends at node k + 1.

Per-unit on one base apparent power; each transformer starts a new voltage zone whose base is its
rated secondary voltage. A path is plain data (a dict, as JSON holds it) so pages, share links and
saved jobs can carry it; `path_from_dict` checks it and names the data item of any mistake
("elements[1].z_pct") as a ParameterError, which a calculator view puts on its own form field.

Quantities follow the nomenclature page: voltage [V] (line-to-line for three-phase), apparent
power [VA] (kVA in path data, as nameplates give it), current [A], impedance [Ω] or per unit
[pu] on BASE_VA, length [m], frequency [Hz].
"""

import cmath
import math
from dataclasses import dataclass, field

from calc import conductors, electrical, units
from calc.errors import ParameterError, PathError, UnitError

BASE_VA = 1e6  # per-unit base apparent power; any value gives the same answers
DEFAULT_SOURCE_X_R = 10.0  # utility source X/R when none is given (common practice for LV studies)
MAX_ITERATIONS = 200
TOLERANCE_PU = 1e-10

LOAD_MODELS = ("impedance", "current", "power")


@dataclass
class Source:
    """The supply at node 0: an ideal voltage behind its short-circuit impedance."""

    voltage: float  # nominal line-to-line (3ph) or line (1ph) [V]
    phases: int = 3
    frequency_hz: float = 60.0
    fault_va: float | None = None  # three-phase short-circuit power [VA]; None = infinite bus
    x_r: float = DEFAULT_SOURCE_X_R


@dataclass
class Transformer:
    """A two-winding transformer on the path: its rating, ratio, impedance and tap."""

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
    """A conductor run on the path (one or more sets in parallel)."""

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
    """A load at a node: its apparent power at rated voltage and how it varies with voltage."""

    node: int  # 0 = the source bus, k = the far end of element k
    apparent_va: float  # at rated voltage
    power_factor: float = 0.85  # lagging
    model: str = "power"
    name: str = ""


@dataclass
class Path:
    """A radial supply path: the source, the series elements and the loads."""

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
        raise ParameterError(f"{where}.{key}", None, f"{where}.{key} is required")
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        raise ParameterError(f"{where}.{key}", value,
                             f"{where}.{key} must be a number, got {value!r}")
    value = float(value)
    bad_low = low is not None and (value <= low if exclusive_low else value < low)
    if not math.isfinite(value) or bad_low or (high is not None and value > high):
        span = f"{'above' if exclusive_low else 'at least'} {low:g}" if low is not None else ""
        span += f"{' and ' if span else ''}at most {high:g}" if high is not None else ""
        raise ParameterError(f"{where}.{key}", value, f"{where}.{key} = {value:g} is out of "
                             f"range; enter a number {span}")
    return value


def path_from_dict(data):
    """Check path data and build a Path.

    Parameters
    ----------
    data : dict
        {"source": {"voltage" [V], "phases" 1 or 3, "frequency_hz" [Hz], "fault_mva" [MVA] or
        "fault_a" [A], "x_r" [-]}, "elements": [{"kind": "transformer", "kva" [kVA],
        "primary_v" [V], "secondary_v" [V], "z_pct" [%], "x_r", "tap_pct" [%],
        "grounded_secondary"} or {"kind": "cable", "size", "length" [m], "material", "sets",
        "raceway", "conductor_temp_c" [°C], "method", "neutral_size"}, each with an optional
        "from": node], "loads": [{"node", "kva" [kVA], "pf" [-], "model"}]}, as JSON holds it.

    Returns
    -------
    Path
        The checked path, in SI units (VA, V, m).

    Raises
    ------
    ParameterError
        Naming the first wrong item by its place in the data as `parameter` ("source.voltage",
        "elements[1].z_pct", "loads[0].node"...), with the value and what is allowed.

    Notes
    -----
    Element k always ends at node k + 1 and is fed from node k unless it says "from": the path
    is then a radial tree. Each transformer's rated primary must be within ±15 % of the voltage
    of the zone it is fed from. A source given by available current has S_sc = k V I_sc.

    References
    ----------
    IEC 60909-0:2016, clause 6.2 (S"k = √3 U_n I"k) — from memory.

    Examples
    --------
    >>> path = path_from_dict({"source": {"voltage": 12470, "fault_mva": 250},
    ...                        "elements": [{"kind": "transformer", "kva": 500, "primary_v": 12470,
    ...                                      "secondary_v": 480, "z_pct": 5.75}]})
    >>> path.nodes, path.source.fault_va, path.elements[0].kva
    (2, 250000000.0, 500000.0)
    """
    if not isinstance(data, dict):
        raise ParameterError("path", data, "a path is an object with source, elements and loads")
    unknown = sorted(set(data) - {"source", "elements", "loads"})
    if unknown:
        raise ParameterError("path", unknown[0], f"unknown part {unknown[0]!r}; a path has "
                             "source, elements and loads")
    source = _source(data.get("source") or {})
    elements = [_element(i, item) for i, item in enumerate(data.get("elements") or [])]
    path = Path(source, elements)
    _check_voltages(path)
    path.loads = [_load(i, item, path) for i, item in enumerate(data.get("loads") or [])]
    return path


def _source(raw):
    phases = raw.get("phases", 3)
    if phases not in (1, 3):
        raise ParameterError("source.phases", phases, "source.phases must be 1 or 3")
    fault_va = None
    if raw.get("fault_mva") is not None:
        fault_va = _number(raw, "fault_mva", "source", low=0, exclusive_low=True) * 1e6
    elif raw.get("fault_a") is not None:
        voltage = _number(raw, "voltage", "source", low=0, exclusive_low=True)
        current = _number(raw, "fault_a", "source", low=0, exclusive_low=True)
        fault_va = electrical.short_circuit_power(voltage, phases, fault_current=current)
    return Source(
        voltage=_number(raw, "voltage", "source", low=0, exclusive_low=True, high=800e3),
        phases=phases,
        frequency_hz=_number(raw, "frequency_hz", "source", 60.0, low=1, high=400),
        fault_va=fault_va,
        x_r=_number(raw, "x_r", "source", DEFAULT_SOURCE_X_R, low=0.05, high=100),
    )


def _element(i, item):
    where = f"elements[{i}]"
    kind = item.get("kind") if isinstance(item, dict) else None
    parent = item.get("from", i) if isinstance(item, dict) else i
    if not isinstance(parent, int) or isinstance(parent, bool) or not 0 <= parent <= i:
        raise ParameterError(f"{where}.from", parent, f"{where}.from must be a node already on "
                             f"the path, 0 to {i}: the path does not connect there")
    if kind == "transformer":
        return Transformer(
            name=str(item.get("name", f"Transformer {i + 1}")),
            kva=_number(item, "kva", where, low=0, exclusive_low=True, high=1e6) * 1e3,
            primary_v=_number(item, "primary_v", where, low=0, exclusive_low=True, high=800e3),
            secondary_v=_number(item, "secondary_v", where, low=0, exclusive_low=True, high=800e3),
            z_pct=_number(item, "z_pct", where, low=0, exclusive_low=True, high=30),
            x_r=_number(item, "x_r", where, 5.0, low=0.05, high=100),
            tap_pct=_number(item, "tap_pct", where, 0.0, low=-10, high=10),
            grounded_secondary=bool(item.get("grounded_secondary", True)),
            parent=parent,
        )
    if kind == "cable":
        try:
            size = units.parse_conductor_size(item.get("size"))
            neutral = item.get("neutral_size")
            neutral = units.parse_conductor_size(neutral) if neutral else None
        except UnitError as error:
            raise ParameterError(f"{where}.size", item.get("size"), f"{where}.size: {error}") \
                from None
        sets = _number(item, "sets", where, 1, low=1, high=20)
        if not sets.is_integer():
            raise ParameterError(f"{where}.sets", sets, f"{where}.sets must be a whole number")
        material = _choice(item, "material", where, ("cu", "al"), "cu")
        for key, checked in (("size", size), ("neutral_size", neutral)):
            if checked is None:
                continue
            try:  # a size not made in the material is refused here, on the data path's name
                conductors.check_made(checked, material)
            except ParameterError as error:
                raise ParameterError(f"{where}.{key}", item.get(key), error.message) from None
        return Cable(
            name=str(item.get("name", f"Run {i + 1}")), size=size, neutral_size=neutral,
            length=_number(item, "length", where, low=0, exclusive_low=True, high=1e5),
            material=material,
            sets=int(sets),
            raceway=_choice(item, "raceway", where, tuple(t for t, _ in conductors.RACEWAYS),
                            "pvc"),
            conductor_temp_c=_number(item, "conductor_temp_c", where, 75.0, low=-40, high=250),
            method=_choice(item, "method", where, ("table", "physics"), "table"),
            parent=parent,
        )
    raise ParameterError(f"{where}.kind", kind, f"{where}.kind must be transformer or cable")


def _load(i, item, path):
    where = f"loads[{i}]"
    node = item.get("node") if isinstance(item, dict) else None
    if not isinstance(node, int) or isinstance(node, bool) or not 0 <= node < path.nodes:
        raise ParameterError(f"{where}.node", node, f"{where}.node must be a node of the path, "
                             f"0 to {path.nodes - 1}: the path does not connect there")
    return Load(
        node=node,
        apparent_va=_number(item, "kva", where, low=0, high=1e6) * 1e3,
        power_factor=_number(item, "pf", where, 0.85, low=0, exclusive_low=True, high=1),
        model=_choice(item, "model", where, LOAD_MODELS, "power"),
        name=str(item.get("name", f"Load {i + 1}")),
    )


def _choice(data, key, where, allowed, default):
    value = data.get(key, default)
    if value not in allowed:
        raise ParameterError(f"{where}.{key}", value,
                             f"{where}.{key} must be one of: {', '.join(allowed)}")
    return value


def _check_voltages(path):
    """Each transformer's primary must be the zone voltage it is fed at (within ±15 %)."""
    bases = [path.source.voltage]
    for i, element in enumerate(path.elements):
        zone = bases[path.parent(i)]
        if isinstance(element, Transformer):
            if not 0.85 <= zone / element.primary_v <= 1.15:
                raise ParameterError(f"elements[{i}].primary_v", element.primary_v,
                                     f"elements[{i}].primary_v: the {element.name} primary is "
                                     f"rated {element.primary_v:g} V but is fed at {zone:g} V; "
                                     "the path does not connect")
            zone = element.secondary_v
        bases.append(zone)


# ---- per-unit model --------------------------------------------------------------------------

def zone_voltages(path):
    """Base voltage of each node: the source's, then each transformer's rated secondary.

    Parameters
    ----------
    path : Path
        The supply path.

    Returns
    -------
    list of float
        One base voltage per node [V] (line-to-line for three-phase).

    Notes
    -----
    V_base(0) = V_source; V_base(k + 1) = V_secondary of element k if it is a transformer, else
    V_base of the node it is fed from.

    References
    ----------
    IEEE Std 141-1993 (Red Book), ch. 4 (per-unit method: a voltage base per transformer zone)
    — from memory.

    Examples
    --------
    >>> zone_voltages(_EXAMPLE)
    [12470.0, 480.0, 480.0]
    """
    bases = [path.source.voltage]
    for index, element in enumerate(path.elements):
        parent_base = bases[path.parent(index)]
        bases.append(element.secondary_v if isinstance(element, Transformer) else parent_base)
    return bases


def base_impedance(voltage):
    """The impedance base of a voltage zone on the system's BASE_VA.

    Parameters
    ----------
    voltage : float
        The zone's base voltage [V] (line-to-line for three-phase).

    Returns
    -------
    float
        Z_base [Ω].

    Notes
    -----
    Z_base = V² / S_base: per phase for three-phase (V_LL² / S_3ph), the loop for single-phase
    (V² / S).

    References
    ----------
    IEEE Std 141-1993 (Red Book), ch. 4 (per-unit method) — from memory.

    Examples
    --------
    >>> base_impedance(480.0)
    0.2304
    """
    return voltage * voltage / BASE_VA


def _impedance_from_magnitude(magnitude, x_r):
    angle = math.atan(x_r)
    return complex(magnitude * math.cos(angle), magnitude * math.sin(angle))


def source_impedance(path):
    """The source's short-circuit impedance in per unit.

    Parameters
    ----------
    path : Path
        The supply path (its source's fault_va and x_r).

    Returns
    -------
    complex
        Z_source [pu] on BASE_VA; 0 for an infinite bus (no fault level given).

    Notes
    -----
    |Z| = S_base / S_sc at the angle atan(X/R).

    References
    ----------
    IEC 60909-0:2016, clause 6.2 (network feeder Z_Q = c U² / S"kQ, here with c = 1) — from
    memory.

    Examples
    --------
    >>> z = source_impedance(_EXAMPLE)
    >>> round(abs(z), 6), round(z.imag / z.real, 6)
    (0.004, 10.0)
    """
    if path.source.fault_va is None:
        return 0j
    return _impedance_from_magnitude(BASE_VA / path.source.fault_va, path.source.x_r)


def cable_ohms(path, cable):
    """The phase and return-conductor impedance of a run, its sets in parallel.

    Parameters
    ----------
    path : Path
        The supply path (its frequency).
    cable : Cable
        The run.

    Returns
    -------
    (complex, complex)
        (Z_phase, Z_return) [Ω] over the run's length; the return is the phase conductor's
        unless a neutral size is given.

    Notes
    -----
    Z = (R_ac + j X) × length / sets, R_ac and X per metre from calc.conductors.impedance at
    the run's temperature, raceway and method.

    References
    ----------
    NEC Chapter 9 Table 9 (AC resistance and reactance, 600 V cables in conduit; read, as
    reproduced) and IEC 60287-1-1 clause 2.1 (AC resistance; from memory) — as calc.conductors
    cites them.

    Examples
    --------
    >>> phase, back = cable_ohms(_EXAMPLE, _EXAMPLE.elements[1])
    >>> round(phase.real * 1e3, 2), phase == back
    (10.09, True)
    """
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
    """The series impedance of one element in per unit on the system base.

    Parameters
    ----------
    path : Path
        The supply path.
    index : int
        The element's place in path.elements.

    Returns
    -------
    complex
        Z [pu] on BASE_VA; for a single-phase path a run's is its loop (phase + return).

    Notes
    -----
    Transformer: |Z| = (%Z / 100) × S_base / S_rated at atan(X/R). Run: Z_ohms / Z_base of its
    zone.

    References
    ----------
    IEEE Std 141-1993 (Red Book), ch. 4 (per-unit impedances, change of base) — from memory.

    Examples
    --------
    >>> z = element_impedance(_EXAMPLE, 0)
    >>> round(abs(z), 4)
    0.115
    """
    element = path.elements[index]
    if isinstance(element, Transformer):
        magnitude = element.z_pct / 100.0 * BASE_VA / element.kva
        return _impedance_from_magnitude(magnitude, element.x_r)
    base = zone_voltages(path)[index + 1]
    phase, back = cable_ohms(path, element)
    ohms = phase + back if path.source.phases == 1 else phase
    return ohms / base_impedance(base)


def ratio(element):
    """The off-nominal voltage ratio of an element.

    Parameters
    ----------
    element : Transformer or Cable
        A path element.

    Returns
    -------
    float
        t [-]: 1 + tap / 100 for a transformer (a + tap raises the secondary voltage), 1 for a
        run.

    Notes
    -----
    In per unit an ideal transformer on its rated ratio is 1:1; a tap adds the ratio t, so
    V₂ = t V₁ and I₁ = t I₂ (the sweep in `solve`).

    References
    ----------
    IEEE Std 141-1993 (Red Book), ch. 4 (off-nominal taps in per unit) — from memory.

    Examples
    --------
    >>> ratio(Transformer("T", 500e3, 12470.0, 480.0, 5.75, tap_pct=2.5))
    1.025
    """
    return 1.0 + element.tap_pct / 100.0 if isinstance(element, Transformer) else 1.0


# ---- load flow ----------------------------------------------------------------------------

@dataclass
class Solution:
    """Node voltages and element currents of a solved path."""

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

    Parameters
    ----------
    path : Path
        The supply path with its loads.
    source_voltage_pu : float, optional
        The source's internal voltage [pu] (1.0: nominal).

    Returns
    -------
    Solution
        Complex node voltages [pu], their magnitudes [V], each element's current [A] and the
        iterations taken.

    Raises
    ------
    PathError
        When no steady state exists (the loads collapse the voltage) or the sweep does not
        converge; never a wrong number.

    Notes
    -----
    Loads draw I = (S / V)* (constant power), S* / |V| at the voltage's angle (constant
    current) or S* V (constant impedance, S at 1 pu). Backward sweep: each element carries the
    current of everything fed through it, times its ratio t. Forward sweep: V_to = (V_from −
    Z I) t, from V_0 = E − Z_source I_0. Repeated until no node moves by more than
    TOLERANCE_PU.

    References
    ----------
    D. Shirmohammadi et al., "A compensation-based power flow method for weakly meshed
    distribution and transmission networks", IEEE Trans. Power Systems 3(2), 1988 (the
    backward/forward sweep) — from memory. Checked against pandapower's Newton-Raphson power
    flow (tests/test_network.py).

    Examples
    --------
    >>> solution = solve(_EXAMPLE)
    >>> [round(v, 1) for v in solution.voltages], [round(i, 1) for i in solution.currents]
    ([12460.2, 467.6, 459.7], [376.8, 376.8])
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
            currents = [abs(through[k + 1]) * _base_current(path, bases[k + 1])
                        for k in range(len(path.elements))]
            return Solution(voltages, [abs(v) * b for v, b in zip(voltages, bases)], currents,
                            iteration)
    raise PathError("no steady state: the loads collapse the voltage along this path")


def _base_current(path, voltage):
    """The current base of a voltage zone [A]: S_base / (k V)."""
    return electrical.line_current(BASE_VA, voltage, path.source.phases)


# ---- faults ---------------------------------------------------------------------------------

def peak_factor(x_r):
    """The factor κ by which a fault's first peak exceeds √2 × its symmetrical current.

    Parameters
    ----------
    x_r : float
        X/R of the impedance to the fault [-].

    Returns
    -------
    float
        κ [-], between 1.02 (resistive) and 2.0.

    Notes
    -----
    κ = 1.02 + 0.98 e^(−3 R/X); 1.02 for X/R ≤ 0.

    References
    ----------
    IEC 60909-0:2016, clause 4.3.1.1: the formula read, as reproduced in pandapower's
    documentation (doc/shortcircuit/correction.rst and ip.rst); the clause number from memory.

    Examples
    --------
    >>> round(peak_factor(10.0), 4), peak_factor(0.0)
    (1.746, 1.02)
    """
    return 1.02 + 0.98 * math.exp(-3.0 / x_r) if x_r > 0 else 1.02


@dataclass
class Fault:
    """Bolted fault currents at one node."""

    node: int
    three_phase_a: float | None  # bolted symmetrical current [A]; None at an infinite bus
    x_r: float
    peak_a: float  # κ √2 I
    line_to_neutral_a: float | None  # where a grounded neutral exists downstream of a source


def transformer_correction(transformer, voltage_factor):
    """IEC 60909's impedance correction factor K_T of a network transformer.

    Parameters
    ----------
    transformer : Transformer
        The transformer (its z_pct and x_r).
    voltage_factor : float
        IEC 60909 voltage factor c_max of the low-voltage side [-] (1.05 or 1.10 LV).

    Returns
    -------
    float
        K_T [-].

    Notes
    -----
    K_T = 0.95 c_max / (1 + 0.6 x_T), x_T the reactance in per unit of the transformer's own
    rating (x_T = z sin(atan(X/R))).

    References
    ----------
    IEC 60909-0:2016, clause 6.3.3: the formula read, as reproduced in pandapower's
    documentation (doc/shortcircuit/branch_elements.rst); the clause number from memory.

    Examples
    --------
    >>> round(transformer_correction(_EXAMPLE.elements[0], 1.05), 4)
    0.9649
    """
    x_t = transformer.z_pct / 100.0 * math.sin(math.atan(transformer.x_r))
    return 0.95 * voltage_factor / (1.0 + 0.6 * x_t)


def faults(path, voltage_factor=1.0, iec60909=False, source_voltage_factor=None):
    """Bolted fault currents at every node (loads and motor contribution neglected).

    Parameters
    ----------
    path : Path
        The supply path (its loads are ignored).
    voltage_factor : float, optional
        IEC 60909's c [-]: 1.0 for a plain bolted-fault estimate; c_max 1.05 or 1.10 LV and
        1.10 MV for maximum currents.
    iec60909 : bool, optional
        Apply IEC 60909-0: each transformer's impedance × K_T, and the feeder's Z_Q at its own
        voltage factor.
    source_voltage_factor : float, optional
        c_Q of the feeder [-] (1.10 above 1 kV); None takes `voltage_factor`.

    Returns
    -------
    list of Fault
        One per node: three-phase current [A], X/R, peak [A] and line-to-neutral current [A]
        (None where no grounded neutral exists; all None at an infinite bus).

    Notes
    -----
    Three-phase: I = c V / (√3 |Z_th|). Line-to-neutral, past a grounded-wye transformer
    secondary: I = 3 c V/√3 / |2 Z1 + Z0|, with Z0 the transformer's (delta-wye: Z0 = Z1 of the
    transformer) plus each run's phase and 3 × return conductor — which for runs is the loop
    method's Z_phase + Z_return. Before any transformer it is given only for a single-phase
    path. Peak: κ √2 I with κ from the X/R at the node. With `iec60909` the feeder is Z_Q =
    c_Q U² / S"kQ.

    References
    ----------
    IEC 60909-0:2016: voltage factor c (Table 1), K_T (§6.3.3) and κ (§4.3.1.1) read, as
    reproduced in pandapower's documentation (doc/shortcircuit/); feeder Z_Q (§6.2), line-to-earth
    I"k1 (§4.2.1.3) and the clause numbers from memory. IEEE Std 141-1993 (Red Book) ch. 4: I_sc =
    I_FL × 100 / %Z at a transformer on an infinite source (read). Checked against pandapower's
    IEC 60909 module (tests/test_network.py).

    Examples
    --------
    >>> fault = faults(_EXAMPLE)[1]
    >>> round(fault.three_phase_a), round(fault.line_to_neutral_a), round(fault.x_r, 3)
    (10109, 10223, 5.087)
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
                z0 = z0 + (phase + 3.0 * back) / base_impedance(bases[node])
            z0_nodes.append(z0)
        z1, z0 = z1_nodes[node], z0_nodes[node]
        amps_base = _base_current(path, bases[node])
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


# The path the Examples above use: 250 MVA X/R 10 at 12.47 kV, a 500 kVA 5.75 % X/R 5
# transformer to 480 V, 50 m of 4/0 copper, 300 kVA at 0.85 pf at its end.
_EXAMPLE = path_from_dict({
    "source": {"voltage": 12470, "fault_mva": 250, "x_r": 10},
    "elements": [{"kind": "transformer", "kva": 500, "primary_v": 12470, "secondary_v": 480,
                  "z_pct": 5.75, "x_r": 5},
                 {"kind": "cable", "size": "4/0", "length": 50}],
    "loads": [{"node": 2, "kva": 300, "pf": 0.85}],
})
