"""Value labels whose text changes at every step of a drag or slider move,
without laying out their panel again each time.

A QLabel asks its layout to lay out again at every text change unless its
size is fixed (Qt skips the request when the minimum and maximum sizes are
equal). :class:`SteadyColumn` keeps the labels of one column of values at
one fixed width, the widest text they have shown, and each at the height of
its text: a new text that fits changes only the label's own pixels; a wider
or taller one grows the column once (one layout). Single-line labels only
(a word-wrapped label's height follows its width).
"""

from __future__ import annotations

__all__ = ["SteadyColumn"]


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
        width = label.sizeHint().width()
        if width > self.width:
            self.width = width
            for other in self._labels:
                self._fix(other)
        else:
            self._fix(label)

    def _fix(self, label):
        height = label.sizeHint().height()
        if label.minimumSize() != label.maximumSize() or label.maximumWidth() != self.width \
                or label.maximumHeight() != height:
            label.setFixedSize(self.width, height)
