"""Tests of wetline.app.render.svg: the pressure diagram as vector SVG."""

import os

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

import datetime
import re
import xml.etree.ElementTree as ET

import numpy as np
import pytest

from wetline.app.cli.main import main
from wetline.app.render.output import ExportError
from wetline.app.render.scene import DiagramScene
from wetline.app.render.style import part_colours
from wetline.app.render.svg import export_svg, render_svg
from wetline.core.force_scope import force_scope
from wetline.core.section import OPEN
from wetline.core.units import display_units

SVG = "{http://www.w3.org/2000/svg}"
SIZE = (1000, 700)
DATE = datetime.date(2026, 1, 2)


def outline_segments(root, case, size):
    """Two-point polylines drawn with the outline's pen (width 3 lw)."""
    lw = DiagramScene(case, case.solve(), "si", size, DATE).line_width
    width = f"{3.0 * lw:.6g}"
    colours = set(part_colours(case.section.part_names).values())
    segs = []
    for g in root.iter(SVG + "g"):
        if g.get("stroke") not in colours:
            continue
        if not np.isclose(float(g.get("stroke-width", "0")), float(width), rtol=1e-3):
            continue
        for e in g:
            if e.tag == SVG + "polyline":
                pts = [tuple(map(float, p.split(","))) for p in e.get("points").split()]
                if len(pts) == 2:
                    segs.append(pts)
    return segs


@pytest.mark.parametrize("key", ["sump_with_lid", "flared_hopper", "chamber_under_riser"])
def test_the_drawn_outline_maps_back_onto_the_section(tmp_path, key, template_case):
    """Every wall edge of the section is in the SVG as a segment whose ends,
    mapped back from drawing units with one scale and offset, are the
    edge's vertices; nothing else is drawn with the outline's pen."""
    case = template_case(key)
    out = tmp_path / "d.svg"
    export_svg(case, out, size=SIZE, date=DATE)
    root = ET.parse(out).getroot()
    segs = outline_segments(root, case, SIZE)
    s = case.section
    walls = [i for i in range(s.n_edges) if s.parts[i] != OPEN]
    assert len(segs) == len(walls), "the outline is missing or incomplete"
    px = np.array([p for seg in segs for p in seg])
    world = s.outline[[v for i in walls for v in (i, (i + 1) % s.n_edges)]]
    # One scale for both axes (z is drawn upward), from the bounding boxes.
    kx = np.ptp(px[:, 0]) / np.ptp(world[:, 0])
    kz = np.ptp(px[:, 1]) / np.ptp(world[:, 1])
    assert kx == pytest.approx(kz, rel=2e-3)
    x = world[:, 0].min() + (px[:, 0] - px[:, 0].min()) / kx
    z = world[:, 1].max() - (px[:, 1] - px[:, 1].min()) / kx
    back = np.column_stack([x, z]).reshape(-1, 2, 2)
    tol = 2e-3 * max(np.ptp(world[:, 0]), np.ptp(world[:, 1]))
    for i in walls:
        a, b = s.outline[i], s.outline[(i + 1) % s.n_edges]
        hit = [seg for seg in back
               if (np.allclose(seg[0], a, atol=tol) and np.allclose(seg[1], b, atol=tol))
               or (np.allclose(seg[0], b, atol=tol) and np.allclose(seg[1], a, atol=tol))]
        assert hit, f"edge {i} ({s.parts[i]}) is not drawn"


def test_title_and_text_elements_hold_the_name_and_totals(tmp_path, template_case):
    case = template_case("sump_with_lid")
    out = tmp_path / "d.svg"
    export_svg(case, out, size=SIZE, date=DATE)
    root = ET.parse(out).getroot()
    assert root.tag == SVG + "svg"
    assert root.get("viewBox") == f"0 0 {SIZE[0]} {SIZE[1]}"
    title = root.find(SVG + "title").text
    assert case.section.name in title
    texts = [e.text or "" for e in root.iter(SVG + "text")]
    assert case.section.name in texts
    sol = case.solve()
    scope = force_scope(case.section, display_units("si"), case.length_unit)
    floor, weight = scope.text(sol.floor_force), scope.text(sol.fluid_weight)
    assert floor.endswith(" kN/m")  # the sump is 1 m wide: per m run
    assert floor in texts and weight in texts
    assert "2026-01-02" in texts


def test_us_units_and_axisymmetric(tmp_path, template_case):
    out = tmp_path / "cone.svg"
    export_svg(template_case("cone_hopper"), out, units="us", size=SIZE)
    text = " ".join(e.text or "" for e in ET.parse(out).getroot().iter(SVG + "text"))
    assert "lbf" in text and "psi" in text and "kN" not in text


def test_render_returns_svg_bytes_and_refuses_bad_input(template_case):
    case = template_case("open_tank")
    data = render_svg(case, size=(400, 300))
    assert data.startswith(b"<?xml") and b"<svg" in data
    with pytest.raises(ExportError, match="finite"):
        render_svg(case, level=float("nan"))
    with pytest.raises(ExportError, match="too small"):
        render_svg(case, size=(50, 300))


def test_write_is_atomic_and_bad_paths_are_refused(tmp_path, template_case):
    case = template_case("open_tank")
    out = tmp_path / "x.svg"
    out.write_text("old")
    export_svg(case, out, size=(400, 300))
    assert out.read_bytes().startswith(b"<?xml")
    assert list(tmp_path.iterdir()) == [out]
    with pytest.raises(ExportError, match="does not exist"):
        export_svg(case, tmp_path / "missing" / "x.svg", size=(400, 300))
    with pytest.raises(ExportError, match="is a folder"):
        export_svg(case, tmp_path, size=(400, 300))
    assert list(tmp_path.iterdir()) == [out]


def test_command_line_export_svg(tmp_path, capsys, sample):
    out = tmp_path / "sump.svg"
    status = main(["export", str(sample("sump_with_lid")), "--svg", str(out),
                   "--size", "800x560"])
    o, err = capsys.readouterr()
    assert status == 0, err
    assert f"wrote {out}" in o
    root = ET.parse(out).getroot()
    assert re.match(r"0 0 800 560", root.get("viewBox"))
    status = main(["export", str(sample("sump_with_lid"))])
    o, err = capsys.readouterr()
    assert status == 2 and err.startswith("error: ") and "--svg" in err


def test_level_names_in_the_drawing_read_as_in_the_window(tmp_path, capsys, template_case,
                                                           sample):
    """Defect: the exported drawing wrote each named level "as entered", to
    12 figures: a free surface found from a volume read "free surface
    1.7211268225 m" (a result, printed past the policy's 4 figures) and the
    wet well's ground in feet "14.7637795276 ft", where the window, its
    dimension lines and the tables say 1.721 m and 14.76 ft."""
    from wetline.core.numbers import format_number

    case = template_case("cone_hopper").with_volume(3.3)
    level = case.solve().level
    out = tmp_path / "cone.svg"
    export_svg(case, out, size=SIZE)
    texts = [e.text or "" for e in ET.parse(out).getroot().iter(SVG + "text")]
    assert f"free surface {format_number(level)} m" in texts
    assert not any(re.search(r"\d\.\d{6,}", t) for t in texts), texts

    out = tmp_path / "well.svg"
    status = main(["export", str(sample("buried_wet_well")), "--svg", str(out), "--units", "us"])
    assert status == 0, capsys.readouterr().err
    words = " ".join(e.text or "" for e in ET.parse(out).getroot().iter(SVG + "text"))
    assert "ground 14.76 ft" in words
    assert not re.search(r"\d\.\d{6,}", words), words
