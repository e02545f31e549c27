"""The core/app boundary is a checked rule: nothing under core/ imports Qt or
pyqtgraph, so the engine and the command line run with no display."""

import ast
import subprocess
import sys
from pathlib import Path

CORE = Path(__file__).resolve().parents[2] / "core"  # the repository's core/ = wetline.core
FORBIDDEN = ("PySide6", "PyQt5", "PyQt6", "PySide2", "pyqtgraph", "shiboken6")


def _imported_modules(path):
    tree = ast.parse(path.read_text(encoding="utf-8"), filename=str(path))
    for node in ast.walk(tree):
        if isinstance(node, ast.Import):
            for alias in node.names:
                yield alias.name
        elif isinstance(node, ast.ImportFrom) and node.module and node.level == 0:
            yield node.module


def test_no_core_module_names_qt_in_an_import():
    files = sorted(CORE.rglob("*.py"))
    assert files, "core/ has no modules?"
    offenders = [f"{f.relative_to(CORE.parent)} imports {m}"
                 for f in files for m in _imported_modules(f)
                 if m.split(".")[0] in FORBIDDEN]
    assert offenders == []


def test_importing_every_core_module_loads_no_qt():
    modules = [f"wetline.core.{f.stem}" for f in sorted(CORE.glob("*.py")) if f.stem != "__init__"]
    code = ("import importlib, sys\n"
            f"for m in {modules!r}: importlib.import_module(m)\n"
            f"bad = [m for m in sys.modules if m.split('.')[0] in {FORBIDDEN!r}]\n"
            "print(','.join(bad))\n")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
    assert out.stdout.strip() == ""
