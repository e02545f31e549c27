"""Tests of wetline.app.render.png: the headless PNG of the pressure diagram."""

import os

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

import datetime
import json

import numpy as np
import pytest
from PySide6.QtGui import QColor, QImage

import wetline.core.atomic_write as atomic_write
from wetline.app.render import png, style, text_blocks
from wetline.app.render.label_painter import LabelPainter
from wetline.app.render.output import ExportError
from wetline.app.render.png import DEFAULT_SIZE, export_png, render_diagram
from wetline.core.results import CAUTION
from wetline.core.section_file import read_section_file, write_section_file
from wetline.core.templates import TEMPLATES

SMALL = (800, 600)
DATE = datetime.date(2026, 1, 2)


def pixels(image):
    """(H, W, 3) uint8 RGB array of a QImage."""
    img = image.convertToFormat(QImage.Format.Format_RGB888)
    w, h, bpl = img.width(), img.height(), img.bytesPerLine()
    buf = np.frombuffer(img.constBits(), dtype=np.uint8, count=h * bpl)
    return buf.reshape(h, bpl)[:, : 3 * w].reshape(h, w, 3).copy()


def colour_count(rgb):
    flat = rgb.reshape(-1, 3).astype(np.uint32)
    return len(np.unique((flat[:, 0] << 16) | (flat[:, 1] << 8) | flat[:, 2]))


def near(rgb, hex_colour, tol=12):
    """Mask of pixels within ``tol`` of a colour."""
    c = QColor(hex_colour)
    target = np.array([c.red(), c.green(), c.blue()])
    return (np.abs(rgb.astype(int) - target) <= tol).all(axis=2)


def assert_drawn(path, size):
    image = QImage(str(path))
    assert not image.isNull(), "the PNG does not load"
    assert (image.width(), image.height()) == size
    rgb = pixels(image)
    assert colour_count(rgb) > 200, "too few colours: the image looks blank"
    # The drawing area (left 60 %, away from the frame) has ink, not only paper.
    h, w = rgb.shape[:2]
    area = rgb[int(0.1 * h): int(0.9 * h), int(0.05 * w): int(0.6 * w)]
    non_white = (area < 245).any(axis=2).mean()
    assert non_white > 0.05, f"the drawing area is almost white ({non_white:.3f} inked)"
    return rgb


# --------------------------------------------------------------- writing
@pytest.mark.parametrize("key", sorted(TEMPLATES))
def test_every_template_exports_a_drawn_png(tmp_path, key, template_case):
    out = tmp_path / f"{key}.png"
    export_png(template_case(key), out, size=SMALL, date=DATE)
    rgb = assert_drawn(out, SMALL)
    assert near(rgb, style.DIAGRAM_LINE, 10).sum() > 50, "no pressure diagram"
    assert near(rgb, style.LOAD, 10).sum() > 20, "no resultant arrow"
    assert list(tmp_path.iterdir()) == [out], "a temporary file was left behind"


def test_default_size_fits_a4_landscape_at_300_dpi(tmp_path, template_case):
    out = tmp_path / "a4.png"
    export_png(template_case("sump_with_lid"), out)
    assert DEFAULT_SIZE == (3508, 2480)
    assert_drawn(out, DEFAULT_SIZE)
    image = QImage(str(out))
    assert round(image.dotsPerMeterX() * 0.0254) == 300


def test_us_units(tmp_path, template_case):
    out = tmp_path / "us.png"
    export_png(template_case("flared_hopper"), out, units="us", size=SMALL)
    assert_drawn(out, SMALL)


def test_us_units_are_labelled_in_feet_psi_and_lbf(monkeypatch, template_case):
    texts = []
    real = LabelPainter.draw_label

    def spy(self, p, label, rect):
        texts.append(label.text)
        return real(self, p, label, rect)

    monkeypatch.setattr(LabelPainter, "draw_label", spy)
    render_diagram(template_case("open_tank"), units="us", size=SMALL)
    joined = " ".join(texts)
    assert "psi" in joined and "lbf" in joined and "ft" in joined
    assert "kPa" not in joined and "kN" not in joined


def test_closed_tank_above_its_roof_draws_uplift(tmp_path, monkeypatch, template_case):
    case = template_case("closed_tank")  # default level 1.5 m above the roof
    assert case.solve().head_above_top > 0
    texts = []
    real = LabelPainter.draw_label

    def spy(self, p, label, rect):
        texts.append(label.text)
        return real(self, p, label, rect)

    monkeypatch.setattr(LabelPainter, "draw_label", spy)
    out = tmp_path / "closed.png"
    export_png(case, out, size=SMALL)
    rgb = assert_drawn(out, SMALL)
    assert near(rgb, style.UPLIFT, 10).sum() > 20, "no uplift colour in the image"
    assert any(t.startswith("roof: uplift") for t in texts), texts
    assert any(t.startswith("head 1.5 m") for t in texts), texts  # the standpipe head


def test_open_tank_draws_no_uplift(template_case):
    rgb = pixels(render_diagram(template_case("open_tank"), size=SMALL))
    # The legend shows the uplift arrow, a few pixels; the drawing has none.
    h, w = rgb.shape[:2]
    assert near(rgb[:, : int(0.5 * w)], style.UPLIFT, 10).sum() == 0


def test_axisymmetric_template(tmp_path, template_case):
    out = tmp_path / "cone.png"
    export_png(template_case("cone_hopper"), out, size=SMALL)
    assert_drawn(out, SMALL)


def test_portrait_size_puts_the_title_block_below(tmp_path, template_case):
    out = tmp_path / "tall.png"
    export_png(template_case("chamber_under_riser"), out, size=(600, 900))
    assert_drawn(out, (600, 900))


def test_empty_section_and_capped_level_still_draw(tmp_path, template_case):
    for name, level in (("empty", -1.0), ("capped", 99.0)):
        out = tmp_path / f"{name}.png"
        export_png(template_case("sump_with_lid"), out, level=level, size=SMALL)
        image = QImage(str(out))
        assert (image.width(), image.height()) == SMALL
        assert colour_count(pixels(image)) > 100


def test_export_replaces_an_existing_file(tmp_path, template_case):
    out = tmp_path / "old.png"
    out.write_bytes(b"not a png")
    export_png(template_case("open_tank"), out, size=SMALL)
    assert out.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n"
    assert list(tmp_path.iterdir()) == [out]


def test_render_returns_an_image_of_the_size_asked(template_case):
    image = render_diagram(template_case("open_tank"), size=(640, 480), date="2026-01-02")
    assert (image.width(), image.height()) == (640, 480)


# --------------------------------------------------------- title block text
def test_title_block_states_the_case(monkeypatch, template_case):
    """Every fact the brief asks for reaches the painter."""
    texts = []
    for cls in (text_blocks.Rows, text_blocks.Note, text_blocks.Title, text_blocks.Caution,
                text_blocks.Heading, text_blocks.Table):
        real = cls.draw

        def spy(self, p, fonts, x, y, width, _real=real):
            texts.append(str(vars(self)))
            return _real(self, p, fonts, x, y, width)

        monkeypatch.setattr(cls, "draw", spy)
    case = template_case("sump_with_lid", level=2.0)
    render_diagram(case, size=SMALL, date=DATE)
    text = " ".join(texts)
    for expected in ("Pump sump with overhanging lid", "fresh water", "kg/m3", "IAPWS-95",
                     "9.80665 m/s2", "('Level', '2 m', None)", "Liquid volume", "Liquid weight",
                     "Floor force", "Support reaction", "held down", "Max. pressure",
                     "per m run", "2026-01-02", "kPa", "kN", CAUTION, "uplift"):
        assert expected in text, expected


def test_capped_level_is_noted(monkeypatch, template_case):
    texts = []
    real = text_blocks.Rows.draw

    def spy(self, p, fonts, x, y, width):
        texts.extend(v for _, v, _ in self.rows)
        return real(self, p, fonts, x, y, width)

    monkeypatch.setattr(text_blocks.Rows, "draw", spy)
    render_diagram(template_case("open_tank"), level=10.0, size=SMALL)
    assert "2.5 m, capped at spill level" in texts


def test_date_defaults_to_today(monkeypatch, template_case):
    texts = []
    real = text_blocks.Rows.draw

    def spy(self, p, fonts, x, y, width):
        texts.extend(v for _, v, _ in self.rows)
        return real(self, p, fonts, x, y, width)

    monkeypatch.setattr(text_blocks.Rows, "draw", spy)
    render_diagram(template_case("open_tank"), size=SMALL)
    assert datetime.date.today().isoformat() in texts


# ---------------------------------------------------------------- errors
@pytest.mark.parametrize("size, words", [
    ((0, 600), "width must be positive"),
    ((800, -5), "height must be positive"),
    ((20001, 600), "too large"),
    ((800, 50000), "too large"),
    ((50, 600), "too small"),
    ((800.5, 600), "whole number"),
    ("800x600", "pair"),
    ((800,), "pair"),
])
def test_bad_size_is_refused_and_nothing_is_written(tmp_path, size, words, template_case):
    out = tmp_path / "x.png"
    with pytest.raises(ExportError, match=words):
        export_png(template_case("open_tank"), out, size=size)
    assert list(tmp_path.iterdir()) == []


def test_export_error_is_a_value_error():
    assert issubclass(ExportError, ValueError)


@pytest.mark.parametrize("make_path, words", [
    (lambda d: d / "missing" / "x.png", "does not exist"),
    (lambda d: d, "is a folder"),
    (lambda d: d / "file.txt" / "x.png", "not a folder"),
])
def test_unwritable_path_is_refused_and_leaves_nothing(tmp_path, make_path, words, template_case):
    (tmp_path / "file.txt").write_text("x")
    before = sorted(tmp_path.rglob("*"))
    with pytest.raises(ExportError, match=words):
        export_png(template_case("open_tank"), make_path(tmp_path), size=SMALL)
    assert sorted(tmp_path.rglob("*")) == before


def test_failed_save_removes_the_temporary_file(tmp_path, monkeypatch, template_case):
    monkeypatch.setattr(QImage, "save", lambda self, *a, **k: False)
    out = tmp_path / "x.png"
    with pytest.raises(ExportError, match="saving the PNG failed"):
        export_png(template_case("open_tank"), out, size=SMALL)
    assert list(tmp_path.iterdir()) == []


def test_failed_rename_removes_the_temporary_file(tmp_path, monkeypatch, template_case):
    def refuse(src, dst):
        raise PermissionError(13, "Permission denied")

    monkeypatch.setattr(atomic_write.os, "replace", refuse)
    out = tmp_path / "x.png"
    with pytest.raises(ExportError, match="Permission denied"):
        export_png(template_case("open_tank"), out, size=SMALL)
    assert list(tmp_path.iterdir()) == []


def test_bad_level_is_refused(template_case):
    with pytest.raises(ExportError, match="finite"):
        render_diagram(template_case("open_tank"), level=float("nan"), size=SMALL)


# ---------------------------------------------------------- command line
def test_export_command_reads_the_file_and_converts_the_level(tmp_path, monkeypatch, capsys,
                                                              template_case):
    from wetline.app.cli.main import main

    case = template_case("open_tank").with_length_unit("mm")
    src = tmp_path / "tank.section.json"
    write_section_file(case, src)
    assert json.loads(src.read_text())["length_unit"] == "mm"
    seen = {}

    def fake_export(subject, path, **kwargs):
        seen.update(design=subject, path=path, **kwargs)

    monkeypatch.setattr(png, "export_png", fake_export)
    out = str(tmp_path / "out.png")
    assert main(["export", str(src), "--png", out, "--level", "1200", "--units", "us",
                 "--size", "900x700"]) == 0
    # The design with the level, and the name of the case drawn.
    assert seen["design"].resolve(seen["case"]).case.fill_level == 1.2  # 1200 mm, exactly
    assert seen["units"] == "us"
    assert seen["size"] == (900, 700)
    seen.clear()
    assert main(["export", str(src), "--png", out]) == 0
    assert "size" not in seen  # export_png's own default, A4 at 300 dpi
    assert seen["design"].resolve(seen["case"]).case.fill_level == \
        read_section_file(src).fill_level


def test_export_command_writes_a_png(tmp_path, capsys, template_case):
    from wetline.app.cli.main import main

    src = tmp_path / "sump.section.json"
    write_section_file(template_case("sump_with_lid"), src)
    out = tmp_path / "sump.png"
    assert main(["export", str(src), "--png", str(out), "--level", "2",
                 "--size", f"{SMALL[0]}x{SMALL[1]}"]) == 0
    assert_drawn(out, SMALL)


def test_export_command_refuses_bad_input(tmp_path, capsys, template_case):
    from wetline.app.cli.main import main

    assert main(["export", str(tmp_path / "none.section.json"), "--png",
                 str(tmp_path / "x.png")]) == 2
    assert "no such file" in capsys.readouterr().err
    src = tmp_path / "t.section.json"
    write_section_file(template_case("open_tank"), src)
    assert main(["export", str(src), "--png", str(tmp_path / "x.png"), "--level", "inf"]) == 2
    assert "finite" in capsys.readouterr().err
    assert main(["export", str(src), "--png", str(tmp_path / "x.png"), "--units",
                 "imperial"]) == 2
    assert "invalid choice" in capsys.readouterr().err
    assert sorted(p.name for p in tmp_path.iterdir()) == ["t.section.json"]
