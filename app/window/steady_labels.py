"""Value labels whose text changes at every step of a drag or slider move,
without laying out their panel again each time.

A QLabel asks its layout to lay out again at every text change unless its
size is fixed (Qt skips the request when the minimum and maximum sizes are
equal). :class:`SteadyColumn` keeps the labels of one column of values at
one fixed width, the widest text they have shown, and each at the height of
its text: a new text that fits changes only the label's own pixels; a wider
or taller one grows the column once (one layout). Single-line labels only
(a word-wrapped label's height follows its width).

:class:`SteadyParagraph` does the same for one word-wrapped label (a note or
a line of details under the values): fixed at the width its layout gave it
and the height its text takes at that width, it lays out again only when a
text needs another height or its panel is resized.
"""

from __future__ import annotations

import shiboken6
from PySide6.QtCore import QEvent, QObject

__all__ = ["SteadyColumn", "SteadyParagraph"]

_FREE = 16_777_215
"""Qt's largest widget size (QWIDGETSIZE_MAX)."""


class SteadyColumn:
    """Single-line value labels sharing one fixed width that only grows."""

    def __init__(self):
        self.width = 0
        self._labels = []

    def add(self, label):
        """Keep ``label`` (a single-line QLabel) in this column; returns it."""
        if label.wordWrap():
            raise ValueError("a steady label is single-line (word wrap off)")
        self._labels.append(label)
        self.fit(label)
        return label

    def set_text(self, label, text):
        """Show ``text`` in ``label`` (one of this column's); lay out only if
        the text does not fit the column's width or the label's height."""
        if label.text() == text:
            return
        label.setText(text)  # fixed size: Qt requests no layout
        self.fit(label)

    def fit(self, label):
        """Fit ``label`` (after a change of its text, font or style sheet):
        the column widens for it if it must, every label with it."""
        hint = label.sizeHint()  # one text layout: its width and height
        if hint.width() > self.width:
            self.width = hint.width()
            for other in self._labels:
                self._fix(other, hint.height() if other is label else None)
        else:
            self._fix(label, hint.height())

    def _fix(self, label, height=None):
        if height is None:
            height = label.sizeHint().height()
        if label.minimumSize() != label.maximumSize() or label.maximumWidth() != self.width \
                or label.maximumHeight() != height:
            label.setFixedSize(self.width, height)


class SteadyParagraph(QObject):
    """One word-wrapped label whose text changes often (see the module).

    While the panels around it keep their widths, the label is fixed at its
    width and at Qt's height for its text there (``heightForWidth``), so a
    new text of the same number of lines asks for no layout; a text of more
    or fewer lines changes the fixed height (one layout). A change of width
    of any widget around it (the dock dragged narrower, the window resized)
    frees the label, so the layout gives it the new width and the panel can
    shrink; the next text fixes it there again.
    """

    def __init__(self, label):
        super().__init__(label)
        if not label.wordWrap():
            raise ValueError("a steady paragraph is a word-wrapped label")
        self.label = label
        self._fixed = False
        self._laid_out = False  # shown and laid out since the last change
        self._around = []

    def set_text(self, text):
        """Show ``text``; lay out only if its height changes."""
        label = self.label
        if label.text() == text:
            return
        label.setText(text)  # fixed: no layout asked for
        if not label.isVisible():
            self._free()
            return
        if not self._laid_out:
            # Just shown, created or freed: its width is the layout's only
            # once that has run; fix it at the next text.
            self._laid_out = True
            return
        self._watch()
        width = label.width()
        height = label.heightForWidth(width)
        if not self._fixed or label.minimumWidth() != width or label.height() != height:
            label.setFixedSize(width, height)
            self._fixed = True

    def _watch(self):
        """Hear the resizes of every widget around the label (its parents
        change while a window is being built)."""
        around = []
        w = self.label.parentWidget()
        while w is not None:
            around.append(w)
            w = w.parentWidget()
        if around != self._around:
            for w in self._around:
                if shiboken6.isValid(w):  # (an old parent may be gone)
                    w.removeEventFilter(self)
            for w in around:
                w.installEventFilter(self)
            self._around = around

    def _free(self):
        self._laid_out = False
        if self._fixed:
            self._fixed = False
            label = self.label
            label.setMinimumSize(0, 0)
            label.setMaximumSize(_FREE, _FREE)
            # QLabel keeps the size hints it worked out while fixed (its
            # fixed width among them) until its text changes: set it again.
            text = label.text()
            label.clear()
            label.setText(text)

    def eventFilter(self, obj, event):
        if event.type() == QEvent.Type.Resize and self._fixed \
                and event.size().width() != event.oldSize().width():
            self._free()
        return False
