"""Every Examples section in calc/ runs and gives its literal result (numpydoc, STYLE.md)."""

import doctest
import importlib
import pkgutil

import pytest

import calc

MODULES = sorted(m.name for m in pkgutil.iter_modules(calc.__path__) if m.name != "__main__")


@pytest.mark.parametrize("name", MODULES)
def test_docstring_examples(name):
    module = importlib.import_module(f"calc.{name}")
    result = doctest.testmod(module, optionflags=doctest.NORMALIZE_WHITESPACE)
    assert result.failed == 0
