"""Value labels that keep a fixed size: a new text that fits asks for no
layout of the panel; a wider one widens the whole column once; no text is
ever cut (each label at least as wide and exactly as tall as Qt's own size
hint for its text, the reference). And the totals panel shows the same
texts as before, on a real window."""

import pytest
from PySide6.QtCore import QEvent, QObject
from PySide6.QtWidgets import QApplication, QFormLayout, QLabel, QWidget

from wetline.app.model import editing
from wetline.app.window.steady_labels import SteadyColumn
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
