"""ampacity: how much current may this conductor carry where it is installed?

North American practice: NEC Table 310.16 at the conductor's insulation rating, corrected for
the ambient (310.15(B)(1)) and adjusted for more than three current-carrying conductors
(310.15(C)(1)), then limited by the terminals' temperature (110.14(C)); the small-conductor rule
of 240.4(D) is shown beside it. IEC practice: IEC 60364-5-52 Annex B by reference installation
method, with the ambient (or ground) temperature and grouping factors.
"""

from calc import ampacity, cautions
from calc.calculators._circuit import (
    SOURCE_IEC,
    SOURCE_NEC,
    ampacity_steps,
    conductor_ampacity,
    conductor_inputs,
    fq,
    whole,
)
from calc.calculators._plausibility import outside, plausibility
from calc.spec import Calculator, Output, Result

# Plausibility: building wiring sees ambients from about −30 °C (outdoors in a cold winter) to
# 70 °C (boiler rooms, raceways in sun near roofs, which NEC 310.15(B)(2) raises by 33 °C);
# common practice. Outside it the figure is for a place few circuits run.
AMBIENT_USUAL_C = (-30.0, 70.0)
# 18 and 16 AWG in Table 310.16 are fixture and control wire: 240.4(D) lets them carry power
# only with devices listed and marked for them (read, as reproduced in the NEC 2017 text).
FIXTURE_SIZES = ("18 AWG", "16 AWG")

CAUTION_NOT_CIRCUIT = (
    "This is the conductor's ampacity alone: the load, the breaker, voltage drop and the fault "
    "path are checked by circuit-check.")
CAUTION_OTHER_LIMITS = (
    "Cable makers' ratings, a raceway in sun on a roof (NEC 310.15(B)(2)), thermal insulation "
    "around the cable and harmonic neutral current can lower the ampacity further.")


def _count(inputs):
    """NEC current-carrying conductors, or IEC loaded conductors (blank: three)."""
    given = inputs.get("current_carrying")
    return 3 if given is None else whole(inputs, "current_carrying", given)


def _plausibility(result, inputs, size):
    reasons = []
    ambient = inputs["ambient_c"]
    if outside(ambient, *AMBIENT_USUAL_C):
        reasons.append(f"an ambient of {ambient:g} °C is outside the {AMBIENT_USUAL_C[0]:g} to "
                       f"{AMBIENT_USUAL_C[1]:g} °C building wiring usually sees (common practice)")
    if size.label in FIXTURE_SIZES:
        reasons.append(f"{size.label} is fixture or control wire: as a branch circuit it needs "
                       "a device listed and marked for it (NEC 240.4(D)(1), (2))")
    plausibility(result, reasons)


def _view(inputs):
    iec = inputs["practice"] == "iec"
    size, material = inputs["size"], inputs["material"]
    count = _count(inputs)
    amp = conductor_ampacity(inputs, size, count, count)
    result = Result()
    result.output("table_a", amp.table_a)
    result.output("ambient_factor", amp.ambient_factor, f"{amp.ambient_factor:g}")
    result.output("grouping_factor", amp.grouping_factor, f"{amp.grouping_factor:g}")
    result.output("corrected_a", amp.corrected_a)
    if not iec:
        result.output("terminal_a", amp.terminal_a)
    result.output("ampacity_a", amp.ampacity_a)
    if not iec:
        largest = ampacity.largest_device(amp.ampacity_a, amp.small_limit_a)
        result.output("max_device_a", largest)

    if iec:
        loaded = f"{count} loaded conductors, {inputs['grouped']:g} circuit(s) grouped"
        ampacity_steps(result, amp, size, material, loaded)
        result.check("ampacity_basis", "pass",
                     f"Iz = {fq(amp.ampacity_a, 'A')}: {amp.table}, ambient "
                     f"{amp.ambient_factor:g} (Table {amp.ambient_table}), grouping "
                     f"{amp.grouping_factor:g} (Table {amp.grouping_table}).")
    else:
        ampacity_steps(result, amp, size, material,
                       f"{count} current-carrying conductors")
        governs = (f"the {amp.terminal_c} °C terminal column governs"
                   if amp.terminal_a < amp.corrected_a else
                   "the corrected value governs (the terminals allow more)")
        beside = ("" if amp.small_limit_a is None else
                  f"; NEC 240.4(D) limits its device to {fq(amp.small_limit_a, 'A')}")
        result.step("Largest overcurrent device NEC 240.4 allows (the next standard rating "
                    "above the ampacity up to 800 A, 240.4(B), within 240.4(D))", "I_ocpd,max",
                    f"= {fq(largest, 'A')}")
        result.check("ampacity_basis", "pass",
                     f"The ampacity is {fq(amp.ampacity_a, 'A')}: {governs} "
                     f"(corrected {fq(amp.corrected_a, 'A')}, terminals "
                     f"{fq(amp.terminal_a, 'A')}){beside}.")
    _plausibility(result, inputs, size)
    result.assumptions += [
        "Continuous operation at the insulation's rated temperature; the tables' conditions "
        "otherwise (NEC: raceway, cable or earth; IEC: the reference method as drawn in "
        "IEC 60364-5-52 Table B.52.3).",
        "An ambient between two table rows takes the hotter row (the safe side); an ambient "
        "below the first IEC row takes that row.",
    ]
    if not iec:
        result.assumptions.append(
            "Terminal rating 'auto' applies NEC 110.14(C)(1) by size (60 °C to 1 AWG, 75 °C "
            "above); equipment listed for more is entered as its rating.")
    result.sources.append(SOURCE_IEC if iec else SOURCE_NEC)
    result.cautions += [CAUTION_NOT_CIRCUIT, CAUTION_OTHER_LIMITS, *cautions.COMMON]
    return result


CALCULATOR = Calculator(
    id="ampacity",
    title="Ampacity of a conductor",
    summary="The current a conductor may carry where it is installed: NEC Table 310.16 with "
            "ambient, grouping and terminal limits, or IEC 60364-5-52 by installation method.",
    group="Conductors",
    inputs=conductor_inputs(),
    outputs=(
        Output("table_a", "Table value", "A"),
        Output("ambient_factor", "Ambient correction factor", ""),
        Output("grouping_factor", "Grouping (adjustment) factor", ""),
        Output("corrected_a", "After correction and grouping", "A"),
        Output("terminal_a", "Terminal column limit (NEC 110.14(C))", "A"),
        Output("ampacity_a", "Ampacity", "A"),
        Output("max_device_a", "Largest overcurrent device (NEC 240.4)", "A"),
    ),
    compute=_view,
)
