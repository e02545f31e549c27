"""The representable range of Wetline's inputs, one place for every check.

Numbers outside these ranges are refused with a message naming the key and
the range, before any computation: inside them every closed form of the
engine stays finite and accurate in float64 (no overflow, no underflow to
subnormals), whatever the shape.

Decided for Wetline (no standard sets them); generous for any real container
and its liquid: a 1 um feature is far below drawing precision, 10,000 km
far above any structure.
"""

from __future__ import annotations

__all__ = [
    "MAX_FILE_BYTES",
    "MAX_VERTICES",
    "EXTENT_RANGE",
    "COORDINATE_LIMIT",
    "SMALLEST_COORDINATE",
    "SMALLEST_RELATIVE_EXTENT",
    "DENSITY_RANGE",
    "GRAVITY_RANGE",
    "WIDTH_RANGE",
    "FORCE_LIMIT",
    "UNIT_WEIGHT_RANGE",
    "PRESSURE_LIMIT",
]

MAX_FILE_BYTES = 64 * 1024 * 1024
"""Largest section file, DXF drawing or coordinate list read [bytes] (64 MiB)."""

MAX_VERTICES = 200_000
"""Most vertices in one outline []."""

EXTENT_RANGE = (1e-6, 1e7)
"""Smallest and largest extent (width or height) of an outline [m]."""

COORDINATE_LIMIT = 1e7
"""Largest magnitude of a coordinate or level [m]."""

SMALLEST_COORDINATE = 1e-100
"""Smallest magnitude of a coordinate other than 0 [m]: differences, squares
and reciprocals of coordinates then stay normal, finite floats."""

SMALLEST_RELATIVE_EXTENT = 1e-7
"""Smallest width (height) of an outline as a fraction of its largest |x|
(|z|) []: drawn farther from the origin, the differences of its coordinates
lose more than about 2e-9 of their value to round-off."""

DENSITY_RANGE = (1e-3, 1e5)
"""Densities accepted [kg/m3] (a light gas to well above any liquid metal)."""

GRAVITY_RANGE = (1e-3, 1e3)
"""Accelerations of gravity accepted [m/s2]."""

WIDTH_RANGE = (1e-6, 1e7)
"""Out-of-plane widths of plane sections accepted [m]."""

FORCE_LIMIT = 1e15
"""Largest magnitude of an input force (self-weight, holding-down, anchorage) [N]."""

UNIT_WEIGHT_RANGE = (1.0, 1e6)
"""Unit weights of structure materials and soils accepted [N/m3]."""

PRESSURE_LIMIT = 1e9
"""Largest magnitude of an input pressure (gas over the surface) [Pa]."""
