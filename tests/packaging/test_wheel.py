"""The installed distribution: everything under ``wetline/``, with the data the
program needs, so it never collides with another package's ``core`` or ``app``."""

import subprocess
import sys
import zipfile

import pytest


@pytest.fixture(scope="module")
def wheel(tmp_path_factory, repo_root):
    out = tmp_path_factory.mktemp("wheel")
    subprocess.run([sys.executable, "-m", "pip", "wheel", str(repo_root), "--no-deps",
                    "--quiet", "--disable-pip-version-check",
                    "-w", str(out)], check=True, capture_output=True, text=True)
    wheels = list(out.glob("wetline-*.whl"))
    assert len(wheels) == 1, wheels
    with zipfile.ZipFile(wheels[0]) as z:
        return {n: (z.read(n).decode("utf-8") if n.endswith(".dist-info/entry_points.txt")
                    else None) for n in z.namelist()}


@pytest.mark.slow
def test_every_file_is_under_wetline_or_the_dist_info(wheel):
    stray = [n for n in wheel if not (n.startswith("wetline/") or ".dist-info/" in n)]
    assert stray == []
    assert not any(n.startswith(("core/", "app/")) for n in wheel)


@pytest.mark.slow
def test_the_engine_program_and_bundled_data_are_inside(wheel):
    names = set(wheel)
    for module in ("wetline/__init__.py", "wetline/__main__.py", "wetline/core/section.py",
                   "wetline/core/templates.py", "wetline/app/cli/main.py",
                   "wetline/app/window/main_window.py", "wetline/app/render/scene.py"):
        assert module in names, module
    samples = [n for n in names if n.startswith("wetline/samples/") and n.endswith(".section.json")]
    assert "wetline/samples/sump_with_lid.section.json" in samples and len(samples) >= 7
    assert not any("/tests/" in n or n.startswith("wetline/tests") for n in names)


@pytest.mark.slow
def test_the_script_entry_point_is_the_wetline_package(wheel):
    [entry] = [text for n, text in wheel.items() if n.endswith(".dist-info/entry_points.txt")]
    assert "wetline = wetline.__main__:main" in entry
