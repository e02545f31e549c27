"""A horizontal edge exactly at the free surface, as the drawings see it.

core.hydrostatics counts such an edge as wetted over its whole length at zero
pressure (physics spec: points with z <= h are wetted). The drawings must not
turn that into a pressure diagram of zero height, a zero-length arrow or a
division by zero.
"""

import os

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

import warnings

import numpy as np

from wetline.app.render.geometry import (
    diagram_polygons,
    part_runs,
    pressure_arrows,
    run_resultants,
    wetted_edges,
)
from wetline.app.render.png import render_diagram
from wetline.core.case import Case
from wetline.core.section import Section

# A tank with a ledge 0.5 m wide at z = 1 m (edge 2), filled to the ledge.
LEDGE = Section.build([(0, 0), (2, 0), (2, 1), (1.5, 1), (1.5, 3), (0, 3)],
                      parts=["floor", "wall", "ledge", "wall", "open", "wall"])


def test_the_surface_edge_gets_no_diagram_and_no_resultant():
    sol = Case.default(LEDGE, 1.0).solve()
    assert sol.wetted_length[2] == 0.5 and sol.resultant[2] == 0.0
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        w = wetted_edges(sol)
        assert 2 not in w.index.tolist()
        x, z, connect = diagram_polygons(w, 1e-5)
        assert np.isfinite(x).all() and np.isfinite(z).all()
        tx, tz, px, pz = pressure_arrows(w, 1e-5, count=30)
        assert np.all(np.hypot(px - tx, pz - tz) >= 0)
        runs = run_resultants(sol, part_runs(LEDGE), w)
    assert "ledge" not in [r[0].part for r in runs]
    assert all(np.isfinite(r[2]) and np.isfinite(r[3]) and np.isfinite(r[4]) for r in runs)


def test_the_diagram_draws_without_warnings():
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        image = render_diagram(Case.default(LEDGE, 1.0), size=(640, 480), date="2026-01-02")
    assert (image.width(), image.height()) == (640, 480)
