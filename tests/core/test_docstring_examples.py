"""The docstring examples of every engine module run and give what they show.

Run through :mod:`doctest` on the installed modules (``wetline.core.*``), so
each module is imported once, under its real name.
"""

import doctest
import importlib
import pkgutil

import pytest

import wetline.core

MODULES = sorted(m.name for m in pkgutil.iter_modules(wetline.core.__path__, "wetline.core."))


def test_every_engine_module_is_found():
    assert "wetline.core.section" in MODULES and len(MODULES) >= 15


@pytest.mark.parametrize("name", MODULES)
def test_docstring_examples(name):
    module = importlib.import_module(name)
    result = doctest.testmod(module, optionflags=doctest.ELLIPSIS | doctest.NORMALIZE_WHITESPACE,
                             verbose=False, report=True)
    assert result.failed == 0, f"{result.failed} of {result.attempted} examples failed in {name}"
