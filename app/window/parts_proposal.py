"""The parts proposed for a drawn outline, with one click to keep or change
them: a small bar over the canvas's top left corner.

A drawn outline gets its parts from :func:`wetline.app.model.editing.propose_parts`
(the lowest horizontal edges ``floor``, the highest ``open``, the rest
``wall``; ``axis`` on an axisymmetric section's axis). The bar says so and
offers: Keep (the bar goes), Top closed (the open top becomes a ``roof``)
and All walls; each change is one undo step
(:func:`wetline.app.model.editing.set_parts`). Any part can still be changed
edge by edge (right-click an edge, or the vertex table).
"""

from __future__ import annotations

from PySide6.QtWidgets import QFrame, QHBoxLayout, QLabel, QPushButton, QVBoxLayout

from wetline.app.model import editing
from wetline.app.render.geometry import edges_words
from wetline.core.section import AXIS, FLOOR, OPEN

__all__ = ["PartsProposal", "proposal_text"]


def proposal_text(parts):
    """``"Parts proposed: floor on edge 0, open top on edge 2, walls on the
    rest"``: what :func:`wetline.app.model.editing.propose_parts` gave."""
    said = []
    for name, words in ((FLOOR, "floor"), (OPEN, "open top"), (AXIS, "axis")):
        edges = [i for i, p in enumerate(parts) if p == name]
        if edges:
            said.append(f"{words} on {edges_words(edges)}")
    rest = "walls on the rest" if said else "walls on every edge"
    return "Parts proposed: " + ", ".join(said + [rest])


class PartsProposal(QFrame):
    """The bar over a canvas (its parent) after an outline is drawn."""

    def __init__(self, canvas, document):
        super().__init__(canvas)
        self._doc = document
        self.setObjectName("partsProposal")
        self.setStyleSheet("#partsProposal { background: #fff8e1; border: 1px solid #e0c878; "
                           "border-radius: 3px; }")
        lay = QVBoxLayout(self)
        lay.setContentsMargins(8, 4, 6, 4)
        lay.setSpacing(3)
        self.text = QLabel()
        self.text.setWordWrap(True)
        lay.addWidget(self.text)
        row = QHBoxLayout()
        lay.addLayout(row)
        self.keep = QPushButton("Keep")
        self.closed = QPushButton("Top closed (roof)")
        self.walls = QPushButton("All walls")
        for b in (self.keep, self.closed, self.walls):
            b.setAutoDefault(False)
            row.addWidget(b)
        row.addStretch(1)
        self.keep.clicked.connect(self.hide)
        self.closed.clicked.connect(self.close_top)
        self.walls.clicked.connect(self.all_walls)
        self._parts = ()
        document.pathChanged.connect(self._on_other_section)
        self.hide()

    def offer(self, parts):
        """Show what was proposed for the outline just drawn."""
        self._parts = tuple(parts)
        self.text.setText(proposal_text(parts))
        self.closed.setEnabled(OPEN in parts)
        room = max(self.parentWidget().width() - 80, 260)
        self.setFixedWidth(min(max(self.sizeHint().width(), 320), room))
        self.adjustSize()
        self.move(60, 30)
        self.show()
        self.raise_()

    def _on_other_section(self):
        if self._doc.case.section.parts != self._parts:
            self.hide()

    def close_top(self):
        """The open top is a roof (one undo step)."""
        parts = tuple("roof" if p == OPEN else p for p in self._doc.section.parts)
        editing.set_parts(self._doc, parts, "Parts: top closed (roof)")
        self.hide()

    def all_walls(self):
        """Every edge a wall but the axis (one undo step)."""
        parts = tuple(p if p == AXIS else "wall" for p in self._doc.section.parts)
        editing.set_parts(self._doc, parts, "Parts: all walls")
        self.hide()
