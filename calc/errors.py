"""Errors raised by calc/: every one is a ValueError whose message a technician can act on.

Physics modules raise errors that name their own parameter, never a form field; a calculator
view attaches the field with `field_error` (or by catching and raising InputError itself).
"""

import contextlib


# An error echoes at most this many characters of what it received: a pasted page of text must
# not come back whole in a message or widen the page.
ECHO_CHARS = 40


def shorten(value, limit=ECHO_CHARS):
    """`value` for echoing in a message: text longer than `limit` is cut, with its length said.

    Examples
    --------
    >>> shorten("x" * 50000)
    'xxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxx… (50000 characters)'
    >>> shorten("150 ft")
    '150 ft'
    """
    if isinstance(value, str) and len(value) > limit:
        return f"{value[:limit]}… ({len(value)} characters)"
    return value


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
        return {"field": shorten(self.field), "value": shorten(value), "message": self.message}


class InputErrors(CalcError):
    """Several inputs are wrong at once; `errors` lists an InputError for each."""

    def __init__(self, errors):
        self.errors = list(errors)
        super().__init__("; ".join(str(e) for e in self.errors))


class ParameterError(CalcError):
    """A physics function was given a value it does not accept (an unknown table key, a value
    outside the function's domain).

    Parameters
    ----------
    parameter : str
        The function's own parameter name ("code_letter", "material"); not a form field.
    value : object
        The value received.
    message : str
        What is wrong and what is allowed.
    """

    def __init__(self, parameter, value, message):
        super().__init__(message)
        self.parameter = parameter
        self.value = value
        self.message = message


class VoltageCollapse(CalcError):
    """A run cannot deliver its load: no steady load-end voltage exists (too long or too thin)."""


class PathError(CalcError):
    """A supply path cannot be solved: no steady state (voltage collapse) or not connected."""


@contextlib.contextmanager
def field_error(field, value=None):
    """Re-raise a ParameterError or UnitError from the block as an InputError on `field`.

    The view names the form field; the physics error keeps its own message. `value` defaults to
    the value the physics function received.

    Examples
    --------
    >>> try:
    ...     with field_error("code_letter"):
    ...         raise ParameterError("letter", "Z", "Z is not a NEMA code letter")
    ... except InputError as error:
    ...     print(error.field, error.value, error.message)
    code_letter Z Z is not a NEMA code letter
    """
    try:
        yield
    except ParameterError as error:
        raise InputError(field, error.value if value is None else value, error.message) from None
    except UnitError as error:
        raise InputError(field, value, str(error)) from None
