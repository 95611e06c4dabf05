"""View helpers the motor calculators share (motor-current, motor-start-dip)."""

from calc import induction_motors


def code_letter_choices():
    """The NEMA code letters as form choices, each with its kVA/hp range in the label."""
    return tuple((letter, f"{letter} ({low:g}–{high:g} kVA/hp)" if high else
                  f"{letter} ({low:g} kVA/hp and up)")
                 for letter, (low, high) in induction_motors.CODE_LETTERS.items())
