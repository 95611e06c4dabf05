"""Errors raised by calc/: every one is a ValueError whose message a technician can act on."""


class CalcError(ValueError):
    """Base of every error calc/ raises on purpose (a ValueError, as pint's errors are)."""


class UnitError(CalcError):
    """A quantity or conductor size could not be read, or has the wrong kind of unit.

    The message says what was received and what is allowed, but not which field: the caller
    (calc.api) adds the field name.
    """


class InputError(CalcError):
    """One input is wrong.

    Parameters
    ----------
    field : str or None
        The input's name as the contract spells it (None when no single field is to blame).
    value : object
        The value received, as the user gave it.
    message : str
        What is wrong and what is allowed.
    """

    def __init__(self, field, value, message):
        super().__init__(f"{field}: {message}" if field else message)
        self.field = field
        self.value = value
        self.message = message

    def as_dict(self):
        """The error entry of the contract: {"field", "value", "message"}."""
        value = self.value
        if isinstance(value, float) and value != value or value in (float("inf"), float("-inf")):
            value = str(value)  # echo what was sent, but JSON output never carries NaN or infinity
        elif not isinstance(value, (str, int, float, bool, type(None))):
            value = str(value)
        return {"field": self.field, "value": value, "message": self.message}


class InputErrors(CalcError):
    """Several inputs are wrong at once; `errors` lists an InputError for each."""

    def __init__(self, errors):
        self.errors = list(errors)
        super().__init__("; ".join(str(e) for e in self.errors))
