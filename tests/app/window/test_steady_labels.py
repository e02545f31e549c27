"""Value labels that keep a fixed size: a new text that fits asks for no
layout of the panel; a wider one widens the whole column once; no text is
ever cut (each label at least as wide and exactly as tall as Qt's own size
hint for its text, the reference). And the totals panel shows the same
texts as before, on a real window."""

import pytest
from PySide6.QtCore import QEvent, QObject
from PySide6.QtWidgets import QApplication, QFormLayout, QLabel, QWidget

from wetline.app.model import editing
from wetline.app.window.steady_labels import SteadyColumn, SteadyParagraph
from wetline.core.section_file import read_section_file


class _Layouts(QObject):
    def __init__(self):
        super().__init__()
        self.count = 0

    def eventFilter(self, obj, ev):
        if ev.type() == QEvent.LayoutRequest:
            self.count += 1
        return False


def _not_cut(label):
    hint = label.sizeHint()
    return label.width() >= hint.width() and label.height() == hint.height()


def test_fitting_texts_ask_for_no_layout(qtbot):
    host = QWidget()
    qtbot.addWidget(host)
    form = QFormLayout(host)
    column = SteadyColumn()
    a, b = column.add(QLabel("1.00 m")), column.add(QLabel("-"))
    form.addRow("level", a)
    form.addRow("force", b)
    host.show()
    qtbot.waitExposed(host)
    QApplication.processEvents()
    counter = _Layouts()
    QApplication.instance().installEventFilter(counter)
    try:
        for k in range(20):
            column.set_text(a, f"{1 + k / 100:.2f} m")
            column.set_text(b, f"{k} kN")
            QApplication.processEvents()
        assert counter.count == 0
        assert a.text() == "1.19 m" and b.text() == "19 kN"
        assert _not_cut(a) and _not_cut(b)
        column.set_text(b, "123 456 789.0 kN/m (held down)")  # wider: one layout
        QApplication.processEvents()
        assert counter.count >= 1
    finally:
        QApplication.instance().removeEventFilter(counter)
    assert _not_cut(a) and _not_cut(b)
    assert a.width() == b.width() == column.width  # one column, right edges in line


def test_word_wrapped_label_refused():
    label = QLabel("long text")
    label.setWordWrap(True)
    with pytest.raises(ValueError, match="single-line"):
        SteadyColumn().add(label)


def _whole(label):
    # Qt's own height for the text at the label's width: nothing cut.
    return label.height() >= label.heightForWidth(label.width())


def test_a_paragraph_whose_lines_stay_asks_for_no_layout(qtbot):
    host = QWidget()
    qtbot.addWidget(host)
    from PySide6.QtWidgets import QVBoxLayout

    lay = QVBoxLayout(host)
    label = QLabel("roof: uplift 28.21 kN/m now, 47.17 kN/m at 4 m (worst)")
    label.setWordWrap(True)
    lay.addWidget(label)
    lay.addStretch(1)
    para = SteadyParagraph(label)
    host.resize(240, 300)
    host.show()
    qtbot.waitExposed(host)
    QApplication.processEvents()
    para.set_text(label.text() + " ")  # laid out once, then fixed
    QApplication.processEvents()
    para.set_text(label.text() + " ")
    QApplication.processEvents()
    counter = _Layouts()
    QApplication.instance().installEventFilter(counter)
    try:
        for k in range(20):
            para.set_text(f"roof: uplift {28 + k / 100:.2f} kN/m now, 47.17 kN/m at 4 m "
                          "(worst)")
            QApplication.processEvents()
            assert _whole(label)
        assert counter.count == 0
        long = "roof: " + "a much longer explanation of the check " * 4
        para.set_text(long)  # more lines: one layout, the label taller
        QApplication.processEvents()
        assert counter.count >= 1 and label.text() == long and _whole(label)
    finally:
        QApplication.instance().removeEventFilter(counter)
    # The panel made wider: the paragraph takes the new width (no fixed
    # width left behind), its text whole.
    narrow = label.width()
    host.resize(480, 300)
    QApplication.processEvents()
    para.set_text(long + ".")
    QApplication.processEvents()
    margins = lay.contentsMargins()
    assert label.width() == 480 - margins.left() - margins.right() > narrow
    assert _whole(label)


def test_a_paragraph_lets_its_scrolled_panel_shrink(qtbot):
    # In a scroll area (the results dock), a fixed width would hold the
    # panel wide when the dock is dragged narrower: the scroll area's
    # resize frees it, and the next text fits the narrower panel.
    from PySide6.QtWidgets import QScrollArea, QVBoxLayout

    area = QScrollArea()
    area.setWidgetResizable(True)
    qtbot.addWidget(area)
    host = QWidget()
    lay = QVBoxLayout(host)
    label = QLabel()
    label.setWordWrap(True)
    lay.addWidget(label)
    area.setWidget(host)
    para = SteadyParagraph(label)
    area.resize(500, 300)
    area.show()
    qtbot.waitExposed(area)
    for text in ("flotation: uplift 6836 lbf/ft, resistance 11044 lbf/ft, factor 1.615",
                 "flotation: uplift 6837 lbf/ft, resistance 11044 lbf/ft, factor 1.615"):
        para.set_text(text)
        QApplication.processEvents()
    assert para._fixed
    wide = label.width()
    area.resize(250, 300)
    QApplication.processEvents()
    para.set_text("flotation: uplift 6838 lbf/ft, resistance 11044 lbf/ft, factor 1.615")
    QApplication.processEvents()
    assert label.width() < wide and host.width() <= area.viewport().width()
    assert _whole(label)


def test_a_single_line_label_is_not_a_paragraph():
    with pytest.raises(ValueError, match="word-wrapped"):
        SteadyParagraph(QLabel("short"))


def test_totals_follow_the_fill(make_window, settle, sample):
    w = make_window(read_section_file(sample("cone_hopper")))
    totals = w.totals
    for level in (0.5, 1.5, 2.5):

        editing.fill_to_level(w.doc, level)
        w.doc.flush()
        settle(w)
        assert totals.values["level"].text() == w.doc.units.fmt_length(w.doc.solution.level)
        for label in totals.values.values():
            assert _not_cut(label)


def test_the_window_paragraphs_stay_whole_through_slider_steps(make_window, settle, sample):
    # The chamber with its trapped-air case: the totals' pocket line, the
    # uplift details and the flotation values change at every slider step;
    # each shows its whole text (Qt's height for it at its width), the same
    # text a fresh panel would, also after the window is made narrower.
    from wetline.core.section_file import read_design

    w = make_window(read_design(sample("chamber_with_lip")))
    w.resize(1500, 940)
    w.doc.select_case(2)
    settle(w)
    slider = w.fill_panel.slider
    paragraphs = [w.totals.layers, w.uplift_panel.details,
                  *[v for v in w.flotation_panel.values.values()]]

    def check():
        for label in paragraphs:
            if label.isVisible():
                assert _whole(label), label.text()
    for v in (300, 450, 600, 750, 900):
        slider.setValue(v)
        settle(w)
        check()
    assert "Trapped air" in w.totals.layers.text()
    assert f"{w.doc.units.fmt_length(w.doc.solution.level)}" in w.totals.values["level"].text()
    w.resize(1100, 940)
    settle(w)
    for v in (500, 700):
        slider.setValue(v)
        settle(w)
        check()
