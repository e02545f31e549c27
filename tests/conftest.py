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


def make_bowl_case(n=2000):
    """A half-round bowl of ``n`` vertices (radius 2 m, open at the top at
    z = 2 m), filled to 3 m: the suite's large section, whose sheet takes
    seconds."""
    import numpy as np

    from wetline.core.case import Case
    from wetline.core.section import Section

    t = np.linspace(np.pi, 2 * np.pi, n - 1)
    pts = np.vstack([np.column_stack([2 + 2 * np.cos(t), 2 + 2 * np.sin(t)]), [[2.0, 4.0]]])
    return Case.default(Section.build(pts, parts=["wall"] * (n - 2) + ["open", "open"],
                                      name="Bowl"), 3.0)


@pytest.fixture(scope="session")
def bowl_case():
    """Factory: ``bowl_case(n=2000)`` (:func:`make_bowl_case`)."""
    return make_bowl_case


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


def make_run_case(run="m"):
    """A 2 m wide open tank of water (1000 kg/m3) filled to 1.5 m, one unit
    of run wide: 1 m in a file in metres (``run="m"``) or 1 ft in a file in
    feet (``run="ft"``). Its loads per metre run, by hand (Cengel & Cimbala,
    Fluid Mechanics, sec. 3-4: a vertical wall carries gamma h^2 / 2, a
    floor gamma h times its length): floor 29419.95 N/m, each wall
    11032.48 N/m; in US units (NIST SP 811: 1 lbf/ft = 14.5939029372 N/m)
    2016 lbf/ft and 756.0 lbf/ft."""
    from wetline.core.case import Case
    from wetline.core.liquids import custom_liquid
    from wetline.core.section import Section

    width = {"m": 1.0, "ft": 0.3048}[run]
    section = Section.build([[0, 0], [2, 0], [2, 3], [0, 3]],
                            parts=["floor", "wall", "open", "wall"], width=width,
                            name=f"Tank one {run} wide")
    return Case(section=section, liquid=custom_liquid(1000.0), fill_level=1.5, length_unit=run)


@pytest.fixture(scope="session")
def run_case():
    """Factory: ``run_case(run="m")``, see :func:`make_run_case`."""
    return make_run_case


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


@pytest.fixture(autouse=True)
def _default_precision_policy():
    """Every test starts and ends with the default precision policy (a
    window on a document that asks for 5 figures sets it for its thread)."""
    from wetline.core.numbers import DEFAULT_DIGITS, set_figures

    set_figures(DEFAULT_DIGITS)
    yield
    set_figures(DEFAULT_DIGITS)
