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


def _elements(path):
    return [(e.type, e.x, e.y) for e in (path.elementAt(i) for i in range(path.elementCount()))]


@pytest.mark.parametrize(("n", "share"), [(1, 0.0), (2, 1.0), (3, 1.0), (5, 0.0), (60, 0.1),
                                         (300, 0.05), (300, 0.5), (2000, 1.0)])
def test_paths_have_the_elements_pyqtgraph_makes(n, share):
    """path_of writes each run of connected points as a polygon: the same
    moveTo and lineTo elements, bit for bit, as pyqtgraph's arrayToQPath
    (the reference, from PyPI), for runs of two points or more (a diagram's
    polygons and lines), with few runs or past MAX_POLYGONS."""
    import pyqtgraph as pg

    rng = np.random.default_rng(n)
    x, z = rng.normal(size=n) * 10.0 ** rng.integers(-3, 6), rng.normal(size=n)
    connect = rng.random(n) >= share  # False: the point ends a run
    for i in range(n - 1):
        if i == 0 or not connect[i - 1]:
            connect[i] = True  # no run of one point
    expected = pg.arrayToQPath(x, z, connect=connect, finiteCheck=False)
    assert _elements(path_of(x, z, connect)) == _elements(expected)
    assert _elements(path_of(x, z, "all")) == _elements(
        pg.arrayToQPath(x, z, connect="all", finiteCheck=False))


@pytest.mark.parametrize("connect", ["all", "pairs"])
def test_a_line_item_draws_what_a_pyqtgraph_curve_draws(qapp, connect):
    """The load layer's curves are LineItems (Qt paints them): the same
    pixels as pyqtgraph's PlotCurveItem (the reference) for the same points
    and pen, solid and dashed, and its data read back as pyqtgraph's. (A
    solid connected line wider than a pixel is joined at its vertices, where
    pyqtgraph draws separate segments: the load layer has none.)"""
    import pyqtgraph as pg
    from PySide6.QtWidgets import QGraphicsItem

    from wetline.app.window.canvas_items import LineItem

    rng = np.random.default_rng(3)
    x, z = rng.random(40) * 4.0, rng.random(40) * 3.0
    images = []
    for make in (lambda pen: pg.PlotCurveItem(connect=connect, skipFiniteCheck=True, pen=pen),
                 lambda pen: LineItem(pen, connect)):
        view = pg.PlotWidget(background="w")
        view.resize(300, 240)
        view.getPlotItem().hideAxis("left")
        view.getPlotItem().hideAxis("bottom")
        view.setRange(xRange=(0, 4), yRange=(0, 3), padding=0)
        widths = (1.0, 2.5) if connect == "all" else (1.5, 2.5)
        for k, style in enumerate((Qt.SolidLine, Qt.DashLine)):
            item = make(pg.mkPen("#204080", width=widths[k], style=style))
            item.setData(x + k * 0.01, z)
            view.addItem(item)
        view.show()
        qapp.processEvents()
        images.append(view.grab().toImage())
        view.close()
    assert images[0] == images[1]
    line = LineItem(pg.mkPen("k"), connect)
    line.setData([0.0, 1.0], [2.0, 3.0])
    assert [list(a) for a in line.getData()] == [[0.0, 1.0], [2.0, 3.0]]
    assert line.opts["pen"].color().name() == "#000000"
    with pytest.raises(ValueError, match="drawn afresh"):
        line.setCacheMode(QGraphicsItem.DeviceCoordinateCache)
