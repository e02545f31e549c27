"""A structure reused across many cavities (a vertex of the cavity dragged
step by step, the structure unchanged) gives the same check and the same
exterior geometry, bit for bit, as a fresh copy of the structure for each
cavity: what the structure keeps of itself between calls (its Section,
segments, polygon, tree of edges) never carries one cavity's state into the
next. Reference: the same functions on fresh objects (shapely for the
geometry)."""

import dataclasses

import numpy as np
import pytest

from wetline.core.section import Section
from wetline.core.structure import (
    Structure,
    StructureError,
    exterior_geometry,
    walls_of_thickness,
)


def _bowl(n=200):
    t = np.linspace(np.pi, 2 * np.pi, n - 2)
    x = 2.0 + (2.0 + 0.05 * np.sin(40 * t)) * np.cos(t)
    z = 2.0 + 1.5 * np.sin(t)
    pts = np.vstack([np.column_stack([x, z]), [[4.0, 3.5], [0.0, 3.5]]])
    parts = ["floor" if abs(x[i] - 2.0) < 0.8 else "wall" for i in range(n - 3)]
    return Section.build(pts, parts=parts + ["wall", "open", "wall"])


def _fields(g):
    return (g.self_weight, g.soil_segments, g.soil_owner, g.overhung, g.floor_edges,
            g.base_pieces, g.outer.outline, g.outer.kind, g.outer.width)


def _same(a, b):
    for u, v in zip(_fields(a), _fields(b), strict=True):
        if isinstance(u, np.ndarray):
            assert u.dtype == v.dtype and np.array_equal(u, v)
        else:
            assert u == v


def _dragged(cavity, i, dz):
    pts = cavity.outline.copy()
    pts[i, 1] += dz
    return Section.build(pts, parts=cavity.parts, kind=cavity.kind, width=cavity.width)


def test_reused_structure_matches_a_fresh_one_along_a_drag():
    cavity = _bowl()
    structure = Structure.build(walls_of_thickness(cavity, 0.3, 0.25, 0.25), cavity=cavity)
    i = (cavity.n_edges - 2) // 2
    for dz in (-0.05, -0.1, -0.2, -0.1, 0.0, 0.05):
        c = _dragged(cavity, i, dz)
        fresh = dataclasses.replace(structure)  # a new object: nothing kept
        _same(exterior_geometry(structure, c), exterior_geometry(fresh, c))
    # the same structure for a cavity of another width: its own Section
    wide = Section.build(cavity.outline, parts=cavity.parts, width=2.5)
    g = exterior_geometry(structure, wide)
    assert g.outer.width == 2.5
    assert g.self_weight == pytest.approx(2.5 * exterior_geometry(structure, cavity).self_weight)


def test_reused_structure_refuses_as_a_fresh_one():
    cavity = _bowl()
    structure = Structure.build(walls_of_thickness(cavity, 0.3, 0.25, 0.25), cavity=cavity)
    i = (cavity.n_edges - 2) // 2
    exterior_geometry(structure, cavity)  # the structure keeps its geometry
    for dz in (-0.4, -1.0):  # through the base, then out below it
        c = _dragged(cavity, i, dz)
        with pytest.raises(StructureError) as kept:
            structure.check(c)
        with pytest.raises(StructureError) as fresh:
            dataclasses.replace(structure).check(c)
        assert str(kept.value) == str(fresh.value)
        assert kept.value.location is not None
        assert np.array_equal(kept.value.location, fresh.value.location)
    structure.check(cavity)  # and the undragged cavity still passes
