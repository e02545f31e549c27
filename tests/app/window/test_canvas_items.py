"""The canvas's filled path items: their bounding rectangle, found without
stroking the path, holds everything Qt's own (stroked) one holds."""

import numpy as np
import pytest
from PySide6.QtCore import Qt
from PySide6.QtGui import QPen
from PySide6.QtWidgets import QGraphicsPathItem

from wetline.app.window.canvas_items import FilledPathItem, cosmetic_pen, path_of


def _zigzag():
    x = np.array([0.0, 1.0, 2.0, 3.0, 0.0, 0.0, 0.2, 0.4])
    z = np.array([0.0, 2.0, 0.0, 2.0, 0.0, 5.0, -3.0, 5.0])
    connect = np.array([1, 1, 1, 0, 1, 1, 1, 0], dtype=bool)
    return path_of(x, z, connect)


@pytest.mark.parametrize("join", [Qt.BevelJoin, Qt.MiterJoin, Qt.RoundJoin])
@pytest.mark.parametrize("width", [0.05, 0.4])
def test_the_rectangle_holds_qts_stroked_one(join, width):
    pen = QPen(Qt.black)
    pen.setWidthF(width)
    pen.setJoinStyle(join)
    ours, qts = FilledPathItem(), QGraphicsPathItem()
    for item in (ours, qts):
        item.setPen(pen)
        item.setPath(_zigzag())
    assert ours.boundingRect().contains(qts.boundingRect())


def test_without_a_pen_or_with_a_cosmetic_one_it_is_the_path():
    item = FilledPathItem()
    item.setPen(QPen(Qt.NoPen))
    item.setPath(_zigzag())
    assert item.boundingRect() == _zigzag().controlPointRect()
    item.setPen(cosmetic_pen("#000000", 1.0))
    assert item.boundingRect() == _zigzag().controlPointRect()
    item.setPath(path_of(np.array([5.0, 6.0]), np.array([1.0, 1.5]), "all"))
    assert item.boundingRect().left() == 5.0  # a new path: a new rectangle
