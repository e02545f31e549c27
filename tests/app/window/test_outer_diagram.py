"""The groundwater's pressure diagram on the structure's outer face: the
canvas and the exported diagram draw it from one geometry function
(:func:`wetline.app.render.geometry.groundwater_solution` and
:func:`~wetline.app.render.geometry.outer_wetted`), so what the window shows
is what the sheet prints.

The pressures are checked against p = rho_w g (z_w - z) (Cengel & Cimbala,
Fluid Mechanics, sec. 3-1) and the forces against core's exterior loads,
which tests/core checks against Archimedes.
"""

import numpy as np

from wetline.app.render import geometry
from wetline.app.render.case_drawing import case_drawing
from wetline.app.render.diagram_view import DiagramView
from wetline.app.render.scene import DiagramScene
from wetline.app.render.style import Fonts
from wetline.app.window import structure_layer

FIELDS = ("index", "ax", "az", "bx", "bz", "pa", "pb", "nx", "nz")


def test_the_canvas_makes_no_groundwater_solution_of_its_own():
    # One piece of code for the job: the layer asks the geometry module.
    assert not hasattr(structure_layer, "solve")
    assert structure_layer.groundwater_solution is geometry.groundwater_solution
    assert structure_layer.outer_wetted is geometry.outer_wetted


def test_canvas_and_diagram_draw_the_same_outer_edges(make_window, buried_wet_well, settle):
    from PySide6.QtCore import QRectF

    w = make_window(buried_wet_well())
    doc = w.doc
    doc.select_case(3)  # empty, flood groundwater at 4 m
    settle(w)
    layer = w.canvas.structure_layer
    drawn = layer._water_edges
    design = doc.design
    loads = doc.solved_case.structure
    gw = loads.groundwater
    ref = geometry.outer_wetted_edges(design.structure, design.section, gw.level, gw.density,
                                      loads.gravity)
    dr = case_drawing(design, doc.active_name)
    scene = DiagramScene(dr.case, dr.solution, "si", (1600, 1131), "2026-01-02",
                         structure=dr.structure, case_name=dr.case_name)
    view = DiagramView(scene, QRectF(0, 0, 1000, 1000), Fonts(scene.base_font))
    for name in FIELDS:
        np.testing.assert_array_equal(getattr(drawn, name), getattr(ref, name), err_msg=name)
        np.testing.assert_array_equal(getattr(view.outer_wetted, name), getattr(ref, name),
                                      err_msg=name)
    # rho_w g (z_w - z) at the base's underside, z = -0.4 m: 1000 x 9.80665 x 4.4 Pa.
    assert np.isclose(max(ref.pa.max(), ref.pb.max()), 1000.0 * 9.80665 * 4.4, rtol=1e-14)
    # The water's forces on the structure are core's (the signs flipped).
    np.testing.assert_array_equal(-layer.water_solution.fz, loads.fz)
