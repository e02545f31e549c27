"""What the whole suite shares: the bundled samples, template cases, markers.

Tests take these as fixtures (``sample``, ``samples_dir``, ``template_case``)
or, to parametrize over every bundled sample, ask for ``sample_path``.
"""

import faulthandler
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
SAMPLES_DIR = ROOT / "sample_sections"


def sample_paths():
    """Every bundled sample section file, sorted by name."""
    return sorted(SAMPLES_DIR.glob("*.section.json"))


def make_template_case(key="sump_with_lid", level=None):
    """A case from a template at its default level (or ``level`` [m])."""
    from wetline.core.case import Case
    from wetline.core.templates import TEMPLATES

    t = TEMPLATES[key]
    s = t.build()
    return Case.default(s, t.default_level(s) if level is None else level)


@pytest.fixture(scope="session")
def repo_root():
    """The repository's top folder."""
    return ROOT


@pytest.fixture(scope="session")
def samples_dir():
    """The bundled sample sections' folder."""
    return SAMPLES_DIR


@pytest.fixture(scope="session")
def sample():
    """Factory: the path of a bundled sample by its stem, ``sample("open_tank")``."""
    def path(name):
        p = SAMPLES_DIR / f"{name}.section.json"
        assert p.is_file(), f"no bundled sample {name!r}"
        return p

    return path


@pytest.fixture(scope="session")
def template_case():
    """Factory: ``template_case(key="sump_with_lid", level=None)``."""
    return make_template_case


HARD_LIMIT_S = 420
"""A test still running after this long ends the run with every thread's stack.

pytest-timeout (300 s) needs the interpreter to run its watchdog; a test
stuck inside Qt with the GIL held would hold CI to its own limit instead.
faulthandler's watchdog is C code and always fires."""


@pytest.hookimpl(hookwrapper=True)
def pytest_runtest_protocol(item, nextitem):
    faulthandler.dump_traceback_later(HARD_LIMIT_S, exit=True, file=sys.stderr)
    try:
        yield
    finally:
        faulthandler.cancel_dump_traceback_later()


def pytest_generate_tests(metafunc):
    """``sample_path``: one test per bundled sample section."""
    if "sample_path" in metafunc.fixturenames:
        paths = sample_paths()
        metafunc.parametrize("sample_path", paths, ids=[p.name.split(".")[0] for p in paths])
