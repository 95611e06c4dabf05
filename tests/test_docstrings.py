"""Every Examples section in calc/ runs and gives its literal result (numpydoc, STYLE.md).

The one place doctests run: domain test files do not call doctest themselves.
"""

import doctest
import importlib
import pkgutil

import pytest

import calc

MODULES = sorted(m.name.removeprefix("calc.")
                 for m in pkgutil.walk_packages(calc.__path__, prefix="calc.")
                 if not m.name.endswith("__main__"))


@pytest.mark.parametrize("name", MODULES)
def test_docstring_examples(name):
    module = importlib.import_module(f"calc.{name}")
    result = doctest.testmod(module, optionflags=doctest.NORMALIZE_WHITESPACE)
    assert result.failed == 0
