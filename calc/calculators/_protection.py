"""View helpers the protection calculators share (fault-current, ground-fault-trip)."""

from calc import conductors
from calc.errors import InputError, field_error


def require_table_conductor(field, size, material):
    """Refuse, on `field`, a size not made in the material or without a published resistance:
    the fault loop and the fault path take their resistance from the tables."""
    with field_error(field, size.label):
        conductors.check_made(size, material)
    if conductors.table_resistance(size, material) is None:
        name = conductors.MATERIAL_NAMES[material]
        raise InputError(field, size.label, f"{size.label} {name} has no published resistance "
                         "in NEC Chapter 9 Table 8 or IEC 60228; choose another size")
