"""The pressure law of a case: layered liquids, gas over the surface, caps.

Model: immiscible liquids of densities rho_1 (bottom) .. rho_n (top), not
increasing upward, with interfaces z_1 < .. < z_(n-1) below the free surface
h, under a uniform gauge gas pressure p_gas. The gauge pressure at height z is

.. math::

    P(z) = p_\\mathrm{gas} + g \\int_z^h \\rho(s)\\,ds \\quad (z \\le h), \\qquad
    P(z) = p_\\mathrm{gas} \\quad (z \\ge h)

which is a constant plus a sum of *ramps*:

.. math::

    P(z) = p_\\mathrm{gas} + \\sum_k c_k\\,(b_k - z)^+, \\qquad
    c_k = g\\,(\\rho_k - \\rho_{k+1}) \\ge 0,\\; b_k = z_k\\; (k < n), \\qquad
    c_n = g\\,\\rho_n,\\; b_n = h .

A wall point also has a *cap* c_e: the level of the liquid surface it sees
(h in the main body, the air-liquid interface z_i in a pocket of trapped air,
see :mod:`wetline.core.pockets`). Air is weightless, so the point feels
``P(min(z, c_e))``. Since (b - min(z, c))+ = (b - z)+ if c >= b and
(b - c) + (c - z)+ otherwise, the pressure along every straight edge is a
constant plus ramps at per-edge levels, and every integral over the edge is
one of the closed forms of the one-liquid model (wetted fraction, trapezoid
mean, trapezoid centroid, the r-weighted axisymmetric form), exact to
round-off.

:func:`integrate_edges` returns every per-edge quantity of
:class:`wetline.core.hydrostatics.Solution` (pressures at the ends, wetted
length, forces, resultants, centres of pressure, hoop forces) plus the volume
and weight of each layer. With one layer, no gas and no caps it gives what
:func:`wetline.core.hydrostatics.solve` gives, to round-off.

References: Cengel & Cimbala, *Fluid Mechanics*, sec. 3-1 to 3-4 (pressure in
a fluid at rest, several immiscible layers, forces on plane and curved
surfaces); Munson, Young & Okiishi, *Fundamentals of Fluid Mechanics*,
sec. 2.3 to 2.8.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from . import STANDARD_GRAVITY
from .fill import FLAT_INV_DZ, FillError, _green_sum, level_for_volume, volume_below
from .limits import DENSITY_RANGE, GRAVITY_RANGE, PRESSURE_LIMIT

__all__ = [
    "ABSOLUTE_ZERO_GAUGE",
    "EdgeLoads",
    "Layer",
    "PressureLaw",
    "PressureLawError",
    "integrate_edges",
    "layer_tops",
    "liquid_volume_below",
]

ABSOLUTE_ZERO_GAUGE = -101325.0
"""Lowest gauge gas pressure accepted [Pa]: a full vacuum under the standard
atmosphere (section format v3, ``gas_pressure``)."""


class PressureLawError(ValueError):
    """A pressure law that cannot be (layers out of order, a gas pressure
    below a full vacuum, gas over an open section ...). One-line message."""


def _finite(value, what):
    try:
        v = float(value)
    except (TypeError, ValueError):
        raise PressureLawError(f"{what} must be a number, not {value!r}") from None
    if not np.isfinite(v):
        raise PressureLawError(f"{what} must be a finite number, not {v}")
    return v


@dataclass(frozen=True)
class Layer:
    """One immiscible liquid of a layered case.

    Attributes
    ----------
    density : float
        [kg/m3], > 0.
    top : float
        Level of the layer's upper boundary [m]: its interface with the
        layer above, or the free surface for the top layer.
    name : str
        For messages and tables (e.g. ``"sewage"``); may be empty.
    """

    density: float
    top: float
    name: str = ""

    def label(self, index):
        """``layer 2 'sludge'`` (1-based from the bottom, as a user counts)."""
        return f"layer {index + 1}" + (f" {self.name!r}" if self.name else "")


@dataclass(frozen=True, eq=False)
class PressureLaw:
    """Gauge pressure in the liquid and gas of one case, as a function of height.

    Parameters
    ----------
    layers : tuple of Layer
        Bottom up; tops strictly rising; the last top is the free surface h.
        Densities must not increase upward.
    gas_pressure : float
        Gauge pressure of the gas over the free surface [Pa], >= -101325
        (a full vacuum). Acts on every wetted point and on the dry edges of
        the main gas space.
    gravity : float
        [m/s2], > 0.

    Raises
    ------
    PressureLawError
        With a one-line message naming the layer or the value at fault.

    Examples
    --------
    Fat (900 kg/m3) 0.5 m deep on sewage (1010 kg/m3), surface at 3 m:

    >>> law = PressureLaw((Layer(1010.0, 2.5, "sewage"), Layer(900.0, 3.0, "fat")),
    ...                   gravity=10.0)
    >>> [float(p) for p in law.pressure([3.0, 2.5, 0.0, 4.0])]
    [0.0, 4500.0, 29750.0, 0.0]
    """

    layers: tuple
    gas_pressure: float = 0.0
    gravity: float = STANDARD_GRAVITY
    ramp_levels: np.ndarray = field(init=False, repr=False)
    """Levels b_k of the ramps with a non-zero coefficient, ascending [m];
    the last is the free surface h."""
    ramp_slopes: np.ndarray = field(init=False, repr=False)
    """Coefficients c_k = g (rho_k - rho_(k+1)) > 0 of those ramps [Pa/m]
    (a layer as dense as the one below adds no ramp)."""

    def __post_init__(self):
        layers = tuple(self.layers)
        if not layers:
            raise PressureLawError("a pressure law needs at least one layer of liquid")
        if not all(isinstance(layer, Layer) for layer in layers):
            raise PressureLawError("layers must be Layer values (density, top, name)")
        g = _finite(self.gravity, "gravity")
        if not GRAVITY_RANGE[0] <= g <= GRAVITY_RANGE[1]:
            raise PressureLawError(
                f"gravity must be between {GRAVITY_RANGE[0]:g} and {GRAVITY_RANGE[1]:g} m/s2, "
                f"not {g:g}")
        p_gas = _finite(self.gas_pressure, "gas pressure")
        if p_gas < ABSOLUTE_ZERO_GAUGE:
            raise PressureLawError(
                f"gas pressure {p_gas:g} Pa is below a full vacuum ({ABSOLUTE_ZERO_GAUGE:g} Pa "
                "gauge)")
        if p_gas > PRESSURE_LIMIT:
            raise PressureLawError(
                f"gas pressure {p_gas:g} Pa is above the limit of {PRESSURE_LIMIT:g} Pa")
        checked = []
        for i, layer in enumerate(layers):
            rho = _finite(layer.density, f"{layer.label(i)} density")
            if not DENSITY_RANGE[0] <= rho <= DENSITY_RANGE[1]:
                raise PressureLawError(
                    f"{layer.label(i)} density must be between {DENSITY_RANGE[0]:g} and "
                    f"{DENSITY_RANGE[1]:g} kg/m3, not {rho:g}")
            top = _finite(layer.top, f"{layer.label(i)} top")
            checked.append(Layer(rho, top, str(layer.name)))
        for i in range(1, len(checked)):
            below, above = checked[i - 1], checked[i]
            if not above.top > below.top:
                what = "the free surface" if i == len(checked) - 1 else "its top"
                raise PressureLawError(
                    f"{above.label(i)} has {what} at {above.top:.6g} m, not above the top "
                    f"of {below.label(i - 1)} at {below.top:.6g} m: layer tops must rise")
            if above.density > below.density:
                raise PressureLawError(
                    f"{above.label(i)} ({above.density:g} kg/m3) lies on {below.label(i - 1)} "
                    f"({below.density:g} kg/m3), which is lighter: immiscible liquids settle "
                    "densest at the bottom")
        rho = np.array([layer.density for layer in checked])
        tops = np.array([layer.top for layer in checked])
        jumps = rho - np.append(rho[1:], 0.0)
        keep = jumps > 0
        levels = tops[keep]
        slopes = g * jumps[keep]
        levels.setflags(write=False)
        slopes.setflags(write=False)
        object.__setattr__(self, "layers", tuple(checked))
        object.__setattr__(self, "gravity", g)
        object.__setattr__(self, "gas_pressure", p_gas)
        object.__setattr__(self, "ramp_levels", levels)
        object.__setattr__(self, "ramp_slopes", slopes)

    # ------------------------------------------------------------ building
    @classmethod
    def single(cls, density, level, gravity=STANDARD_GRAVITY, gas_pressure=0.0, name=""):
        """One liquid of ``density`` [kg/m3] up to ``level`` [m]."""
        return cls((Layer(density, level, name),), gas_pressure=gas_pressure, gravity=gravity)

    @classmethod
    def _single_trusted(cls, density, level, gravity):
        """One liquid, no gas, from values already checked (floats; density
        and gravity positive, the level finite): no range checks, for
        :func:`wetline.core.hydrostatics.solve`'s hot path."""
        law = object.__new__(cls)
        object.__setattr__(law, "layers", (Layer(density, level, ""),))
        object.__setattr__(law, "gas_pressure", 0.0)
        object.__setattr__(law, "gravity", gravity)
        return law  # the ramp arrays are made when first asked for

    def __getattr__(self, name):
        # Only the ramp arrays of a law from _single_trusted are missing.
        if name not in ("ramp_levels", "ramp_slopes") or "layers" not in self.__dict__:
            raise AttributeError(name)
        layer = self.layers[0]
        levels = np.array([layer.top])
        slopes = np.array([self.gravity * layer.density])
        levels.setflags(write=False)
        slopes.setflags(write=False)
        object.__setattr__(self, "ramp_levels", levels)
        object.__setattr__(self, "ramp_slopes", slopes)
        return levels if name == "ramp_levels" else slopes

    def with_level(self, level):
        """The same law with the free surface (the top layer's top) at ``level`` [m]."""
        top = self.layers[-1]
        return PressureLaw(self.layers[:-1] + (Layer(top.density, level, top.name),),
                           gas_pressure=self.gas_pressure, gravity=self.gravity)

    # ------------------------------------------------------------ properties
    @property
    def level(self):
        """The free surface h [m] (the top layer's top)."""
        return self.layers[-1].top

    @property
    def interfaces(self):
        """Interface levels z_1 .. z_(n-1) [m] (tuple, ascending)."""
        return tuple(layer.top for layer in self.layers[:-1])

    @property
    def densities(self):
        """Layer densities bottom up [kg/m3] (tuple)."""
        return tuple(layer.density for layer in self.layers)

    @property
    def n_layers(self):
        return len(self.layers)

    # ------------------------------------------------------------ evaluation
    def pressure(self, z):
        """Gauge pressure P(z) [Pa] at height(s) ``z`` [m], vectorised.

        .. math:: P(z) = p_\\mathrm{gas} + \\sum_k c_k (b_k - z)^+

        Parameters
        ----------
        z : float or array_like
            Heights [m].

        Returns
        -------
        numpy.ndarray
            Same shape as ``z`` [Pa].
        """
        z = np.asarray(z, dtype=np.float64)
        out = np.full(z.shape, self.gas_pressure)
        work = np.empty(z.shape)
        for b, c in zip(self.ramp_levels, self.ramp_slopes, strict=True):
            np.subtract(b, z, out=work)
            np.maximum(work, 0.0, out=work)
            np.multiply(work, c, out=work)
            np.add(out, work, out=out)
        return out

    def pressure_at(self, z):
        """:meth:`pressure` at one height ``z`` [m], as a float [Pa] (no arrays)."""
        z = float(z)
        p = self.gas_pressure
        for b, c in zip(self.ramp_levels.tolist(), self.ramp_slopes.tolist(), strict=True):
            if z < b:
                p += c * (b - z)
        return p

    def pressure_under_cap(self, z, cap):
        """``P(min(z, cap))`` [Pa]: the pressure at height ``z`` [m] of a wall
        point whose liquid surface is at ``cap`` [m] (h in the main body, the
        interface of its pocket of trapped air otherwise). Vectorised, both
        arguments broadcast."""
        return self.pressure(np.minimum(z, cap))

    def density_at(self, z):
        """Density of the liquid at height ``z`` [kg/m3] (0 above the free
        surface); at an interface, the density of the layer above it."""
        z = float(z)
        for layer in self.layers:
            if z < layer.top:
                return layer.density
        return 0.0


@dataclass(frozen=True, eq=False)
class EdgeLoads:
    """Per-edge loads of a pressure law on a section, and the layers' volumes.

    Arrays have one entry per edge in the section's (file's) edge order and
    direction, and are read-only views of one block. Forces are what the
    liquid, gas and air exert on the wall [N] (per ``width`` for plane
    sections, over the full revolution for axisymmetric ones).

    Attributes
    ----------
    law : PressureLaw
    caps : numpy.ndarray or None
        The per-edge liquid surface levels used [m] (None: all h).
    wetted_length : numpy.ndarray
        Length of each edge at or below its liquid surface (h, or z_i in a
        pocket) [m]. A dry part carries the gas or air pressure but is not
        wetted.
    p_start, p_end : numpy.ndarray
        Pressure at each edge's start and end vertex [Pa]: P(min(z, cap)).
    fx, fz : numpy.ndarray
        Force on each edge [N]; fx is NaN for axisymmetric sections.
    resultant : numpy.ndarray
        |(fx, fz)| [N] (|fz| for axisymmetric sections).
    centre_of_pressure : numpy.ndarray
        (N, 2) point where each plane edge's resultant acts [m]: the
        centroid of its (piecewise linear) pressure diagram, on the edge's
        line. NaN where the edge carries nothing and for axisymmetric
        sections. Where the diagram changes sign (a vacuum over shallow
        liquid) the point may lie off the edge; where the force is zero it
        is NaN.
    hoop_start, hoop_end : numpy.ndarray
        Hoop force p r / cos(alpha) at both ends [N/m] (axisymmetric); NaN on
        horizontal edges and for plane sections.
    layer_volumes : numpy.ndarray
        (n_layers,) liquid volume of each layer, bottom up [m3] (area x
        width for plane sections), air in pockets excluded.
    layer_weights : numpy.ndarray
        (n_layers,) rho_k g V_k [N].
    volume : float
        All the liquid [m3].
    fluid_weight : float
        Weight of all the liquid [N], g sum_k (rho_k - rho_(k+1)) V(b_k), which
        is the sum of ``layer_weights`` (to round-off) and, with one layer,
        exactly rho g V.
    max_pressure : float
        Largest wall pressure P(z_min) [Pa].
    """

    law: PressureLaw
    caps: np.ndarray | None
    wetted_length: np.ndarray
    p_start: np.ndarray
    p_end: np.ndarray
    fx: np.ndarray
    fz: np.ndarray
    resultant: np.ndarray
    centre_of_pressure: np.ndarray
    hoop_start: np.ndarray
    hoop_end: np.ndarray
    layer_volumes: np.ndarray
    layer_weights: np.ndarray
    volume: float
    fluid_weight: float
    max_pressure: float


# Rows of the one work block of integrate_edges (per-edge results + scratch).
_ROWS = ("p_vertex", "p_end_capped", "wetted_length", "fx", "fz", "resultant", "cp_x", "cp_z",
         "hoop_start", "hoop_end", "f", "s01", "ta", "w")


def integrate_edges(section, law, caps=None):
    """Exact loads of the pressure law ``law`` on every edge of ``section``.

    Parameters
    ----------
    section : Section
    law : PressureLaw
        Its free surface must already be the level in use (capped at the
        spill level of an open section by the caller, see
        :func:`wetline.core.hydrostatics.resolve_level`).
    caps : array_like or None
        (N,) liquid surface level of each edge [m], <= h: the interface z_i
        of the pocket of trapped air the edge is in, h elsewhere
        (:attr:`wetline.core.pockets.PocketState.caps`). None: every edge
        sees the free surface h (vented pockets).

    Returns
    -------
    EdgeLoads

    Raises
    ------
    PressureLawError
        For a gas pressure on an open section, a free surface above its
        spill level, or caps of the wrong shape or above the free surface.

    Notes
    -----
    Edge e carries p(z) = P(min(z, c_e)). Without gas, an edge that no
    interface crosses and whose cap is h carries, over its wetted part, a
    pressure linear from q_0 to q_1 (its clipped end values); with the
    wetted fraction f and the start of the wetted part t_a (solve()'s
    closed forms), per unit width

    .. math::

        F = L f (q_0 + q_1)/2, \\qquad
        t_\\mathrm{cp} = t_a + f (q_0 + 2 q_1) / (3 (q_0 + q_1)) .

    Under a gas, every edge the free surface does not cross carries a
    pressure linear over its whole length (a dry one the constant p_gas),
    so F = L (p_0 + p_1)/2 at t_cp = (p_0 + 2 p_1)/(3 (p_0 + p_1)); so do
    the edges of a pocket wholly in its air (the constant P(z_i)) or wholly
    below its interface. Every other edge (crossed by an interface with a
    density step, by the free surface under a gas, or by its pocket's
    interface) is cut at the ramp levels and its cap into pieces of linear
    pressure, and the pieces' trapezoids are summed. Volumes are Green sums
    of the edges clipped below min(top of the layer, cap) (the free
    surface, the interfaces and the pockets' interfaces are horizontal and
    add nothing), so that floor force + support reaction = the liquid's
    weight to round-off.

    Examples
    --------
    A closed box 2 m wide and 3 m high, water 1 m deep under 10 kPa of gas:
    the right wall carries the gas on its full 3 m and the water's triangle
    on its wetted 1 m.

    >>> from wetline.core.section import Section
    >>> s = Section.build([[0, 0], [2, 0], [2, 3], [0, 3]],
    ...                   parts=["floor", "wall", "roof", "wall"])
    >>> law = PressureLaw.single(1000.0, 1.0, gravity=10.0, gas_pressure=10000.0)
    >>> r = integrate_edges(s, law)
    >>> float(r.fx[1]), float(r.wetted_length[1]), float(r.fz[2]), float(r.fz[0])
    (35000.0, 1.0, 20000.0, -40000.0)
    """
    _check_law_fits(section, law)
    n = section.n_edges
    h = law.level
    p_gas = law.gas_pressure

    in_pocket = None
    if caps is not None:
        caps = np.asarray(caps, dtype=np.float64)
        if caps.flags.writeable:
            caps = caps.copy()  # kept in the result: not the caller's to change
        if caps.shape != (n,):
            raise PressureLawError(f"caps must hold one level per edge ({n}), not {caps.shape}")
        top, bottom = caps.max(), caps.min()  # NaN propagates into both
        if not (np.isfinite(top) and np.isfinite(bottom) and top <= h):
            raise PressureLawError("caps must be finite levels at or below the free surface")
        in_pocket = np.flatnonzero(caps < h)
        if not in_pocket.size:
            caps = in_pocket = None
        else:
            caps.setflags(write=False)
    if caps is None and p_gas == 0.0 and law.ramp_levels.size == 1:
        # One liquid (or layers of one density: no ramp at their interfaces).
        return _one_liquid(section, law)
    return _general_edges(section, law, caps, in_pocket)


def _general_edges(section, law, caps, in_pocket):
    """:func:`integrate_edges` for any law and caps (checked by it): the
    pressure at the vertices, whole-length or wetted trapezoids, the edges
    cut at the ramp levels and caps, Green sums per layer."""
    geo = section.geometry
    n = section.n_edges
    h = law.level
    p_gas = law.gas_pressure
    levels = law.ramp_levels
    slopes = law.ramp_slopes
    axi = section.is_axisymmetric

    out = np.empty((len(_ROWS), n + 1))
    (p_vertex, p_end_c, wetted, fx, fz, res, cpx, cpz, hoop0, hoop1,
     f_buf, s01_buf, ta_buf, w_buf) = out

    # Pressure at every vertex (first repeated last), each vertex under the
    # cap of the edge it starts: q = P(min(z, cap)) - p_gas, the liquid's
    # share, then with p_gas added when there is a gas.
    q = p_vertex
    z_seen = geo.vertex_z
    if caps is not None:
        z_seen = p_end_c
        np.minimum(geo.vertex_z[:n], caps, out=z_seen[:n])
        z_seen[n] = min(geo.vertex_z[n], caps[0])
    _ramp_sum(z_seen, levels, slopes, q, w_buf)
    if p_gas != 0.0:
        np.add(q, p_gas, out=q)  # q is now the whole pressure P
    q0 = q[:n]
    q1 = q[1:]

    # Volume below every layer top but the last, and the edges an interface
    # crosses (a kink in the pressure where the layers' densities differ).
    below = []
    cut = []
    z_high = cpx[:n]
    if law.n_layers > 1 or caps is not None or p_gas != 0.0:
        np.maximum(geo.vertex_z[:n], geo.vertex_z[1:], out=z_high)
    if p_gas != 0.0:
        # Under a gas every edge carries a pressure linear over its whole
        # length (a dry one the constant p_gas) but those the surface crosses.
        cut.append(_edges_crossed(geo, z_high, h))
    for layer in law.layers[:-1]:
        crossed = _edges_crossed(geo, z_high, layer.top)
        if caps is None:
            below.append(_volume_below_top(section, z_high, layer.top, crossed,
                                           f_buf[:n], ta_buf[:n]))
        if crossed.size and layer.top in levels:
            cut.append(crossed)
    if caps is not None:
        # In a pocket, an edge wholly in the air carries the constant P(z_i)
        # and one wholly below the interface carries P(z): both linear between
        # their end values. Cut those crossing their cap, and any whose end
        # vertex sees another cap than the edge does (arbitrary caps).
        c = caps[in_pocket]
        crosses = (geo.z_low[in_pocket] < c) & (z_high[in_pocket] > c)
        cut.append(in_pocket[crosses])
        end_seen = np.minimum(geo.vertex_z[1:], caps)
        cut.append(np.flatnonzero(end_seen != z_seen[1:]))

    # Wetted fraction at the free surface (a horizontal edge at it counts);
    # edges in a pocket carry their linear pressure over their whole length.
    f = f_buf[:n]
    np.subtract(h, geo.z_low, out=f)
    np.multiply(f, geo.inv_abs_dz, out=f)
    np.clip(f, 0.0, 1.0, out=f)
    ta = ta_buf[:n]
    np.subtract(1.0, f, out=ta)
    np.multiply(ta, geo.falls, out=ta)
    volume_h = float(_green_sum(section, f, ta)) if caps is None else 0.0
    horizontal = np.flatnonzero(geo.dz == 0)
    if horizontal.size:
        f[horizontal] = geo.z_low[horizontal] <= h
    if caps is not None:
        f[in_pocket] = 1.0
        ta[in_pocket] = 0.0

    cut = [c for c in cut if c.size]
    if not cut:
        cut = np.empty(0, dtype=np.intp)
    elif len(cut) == 1:
        cut = cut[0]
    else:
        cut = np.unique(np.concatenate(cut))

    s01 = s01_buf[:n]
    np.add(q0, q1, out=s01)
    if not axi:
        fn = res[:n]
        t = cpx[:n]
        if p_gas == 0.0:
            np.multiply(f, s01, out=fn)
            np.multiply(fn, geo.length, out=fn)
            np.multiply(fn, 0.5 * section.width, out=fn)
            # t = ta + f (q0 + 2 q1) / (3 (q0 + q1)); NaN where dry (0/0).
            np.add(s01, q1, out=t)
            np.multiply(t, f, out=t)
            with np.errstate(invalid="ignore", divide="ignore"):
                np.divide(t, s01, out=t)
            np.multiply(t, 1.0 / 3.0, out=t)
            np.add(t, ta, out=t)
        else:
            # Whole-length trapezoids: F = L w (p0 + p1) / 2 at
            # t = (p0 + 2 p1) / (3 (p0 + p1)).
            np.multiply(s01, geo.length, out=fn)
            np.multiply(fn, 0.5 * section.width, out=fn)
            np.add(s01, q1, out=t)
            with np.errstate(invalid="ignore", divide="ignore"):
                np.divide(t, s01, out=t)
            np.multiply(t, 1.0 / 3.0, out=t)
        hoop0[:n] = np.nan
        hoop1 = hoop0  # both ends NaN: one read-only row serves
    else:
        acc = cpx[:n]
        rb = cpz[:n]
        if p_gas == 0.0:
            # r at the wetted part's ends: ra = x0 + ta dx, rb = ra + f dx.
            ra = w_buf[:n]
            np.multiply(ta, geo.dx, out=ra)
            np.add(ra, geo.x0, out=ra)
            np.multiply(f, geo.dx, out=rb)
            np.add(rb, ra, out=rb)
        else:  # whole-length: the edge's own ends
            ra = geo.x0
            np.add(geo.x0, geo.dx, out=rb)
        # int q r ds = Lw ((2 q0 + q1) ra + (q0 + 2 q1) rb) / 6
        np.add(s01, q0, out=acc)
        np.multiply(acc, ra, out=acc)
        np.add(s01, q1, out=s01)
        np.multiply(s01, rb, out=s01)
        np.add(acc, s01, out=acc)
        if p_gas == 0.0:
            np.multiply(acc, f, out=acc)
        np.multiply(acc, geo.length, out=acc)
        fzz = fz[:n]
        np.multiply(acc, 2.0 * np.pi / 6.0, out=fzz)
        np.multiply(fzz, geo.nz, out=fzz)
        np.abs(fzz, out=res[:n])
        fx[:n] = np.nan

    # Pressures at the ends; wetted length.
    p_start = p_vertex[:n]
    p_end = p_vertex[1:]
    if caps is not None:
        p_end = p_end_c[:n]
        np.copyto(p_end, p_vertex[1:])
        # The fraction of each edge below its cap: the wetted part, and the
        # part Green's sum takes for the liquid's volume below h (caps <= h).
        f_c = w_buf[:n]
        ta_c = s01_buf[:n]
        np.subtract(caps, geo.z_low, out=f_c)
        np.multiply(f_c, geo.inv_abs_dz, out=f_c)
        np.clip(f_c, 0.0, 1.0, out=f_c)
        np.subtract(1.0, f_c, out=ta_c)
        np.multiply(ta_c, geo.falls, out=ta_c)
        volume_h = float(_green_sum(section, f_c, ta_c))
        if horizontal.size:
            f_c[horizontal] = geo.z_low[horizontal] <= caps[horizontal]
        np.multiply(f_c, geo.length, out=wetted[:n])
    else:
        np.multiply(f, geo.length, out=wetted[:n])

    if cut.size > _FEW_CUT_EDGES:
        _cut_edges(section, law, caps, cut, p_start, p_end, fx, fz, res, cpx)
    elif cut.size:
        _cut_edges_one_by_one(section, law, caps, cut, p_start, p_end, fx, fz, res, cpx)

    if not axi:
        # fn holds the signed normal force of every edge (cut edges too).
        fn = res[:n]
        np.multiply(fn, geo.nx, out=fx[:n])
        np.multiply(fn, geo.nz, out=fz[:n])
        np.abs(fn, out=fn)
        t = cpx[:n]
        if horizontal.size:
            # A wetted horizontal edge (or one in a pocket's air) carries a
            # uniform pressure: its midpoint, also at zero pressure exactly at
            # its liquid surface (the limit of a ledge just below it).
            t[horizontal[f[horizontal] == 1.0]] = 0.5
        cz = cpz[:n]
        np.multiply(t, geo.dz, out=cz)
        np.add(cz, geo.z0, out=cz)
        np.multiply(t, geo.dx, out=t)
        np.add(t, geo.x0, out=t)
        cp = out[6:8, :n].T
    else:
        cp = np.broadcast_to(fx[:n, None], (n, 2))  # NaN, read-only, no copy
        # Hoop force N = p r / cos(alpha), cos(alpha) = |dz| / L.
        sec = w_buf[:n]
        np.multiply(geo.length, geo.inv_abs_dz, out=sec)
        np.multiply(p_start, geo.x0, out=hoop0[:n])
        np.multiply(hoop0[:n], sec, out=hoop0[:n])
        np.multiply(p_end, np.roll(geo.x0, -1), out=hoop1[:n])
        np.multiply(hoop1[:n], sec, out=hoop1[:n])
        if horizontal.size:
            hoop0[horizontal] = np.nan
            hoop1[horizontal] = np.nan

    if caps is not None:
        below = [_volume_below_caps(section, layer.top, caps, f_buf[:n], ta_buf[:n])
                 for layer in law.layers[:-1]]
    layer_volumes, layer_weights, volume, weight = _layer_volumes(law, below + [volume_h])
    max_pressure = law.pressure_at(section.z_min)
    arrays = (wetted[:n], p_start, p_end, fx[:n], fz[:n], res[:n], hoop0[:n], hoop1[:n])
    for a in arrays:
        a.setflags(write=False)
    if cp.flags.writeable:
        cp.setflags(write=False)
    return EdgeLoads(
        law=law, caps=caps, wetted_length=wetted[:n], p_start=p_start, p_end=p_end,
        fx=fx[:n], fz=fz[:n], resultant=res[:n], centre_of_pressure=cp,
        hoop_start=hoop0[:n], hoop_end=hoop1[:n], layer_volumes=layer_volumes,
        layer_weights=layer_weights, volume=volume, fluid_weight=weight,
        max_pressure=max_pressure)


# Rows of the one work block of the one-liquid path (per-edge results).
_ONE_ROWS = ("p_vertex", "wetted_length", "fx", "fz", "resultant", "cp_x", "cp_z",
             "hoop_start", "hoop_end")


def _one_liquid(section, law):
    """:func:`integrate_edges` for one liquid (or layers of one density)
    under no gas, every edge seeing the free surface h: the closed forms of
    the one-liquid model on the clipped depths a = (h - z)+ (see
    :func:`wetline.core.hydrostatics.solve`), one work block and a few
    buffers reused with ``out=``.

    With clipped depths a0, a1 at an edge's ends and the wetted fraction
    f = clip((h - z_low) / |dz|, 0, 1): wetted length f L, force
    w f L (a0 + a1) / 2 rho g n, centre of pressure at
    t = ta + f (a0 + 2 a1) / (3 (a0 + a1)), ta = 1 - f on falling edges.
    """
    h = law.level
    layer = law.layers[-1]  # the top one's density: all are alike
    rg = layer.density * law.gravity
    geo = section.geometry
    n = section.n_edges
    axi = section.is_axisymmetric

    out = np.empty((len(_ONE_ROWS), n + 1))
    p_vertex, wetted, fx, fz, res, cpx, cpz, hoop0, hoop1 = out
    a = np.empty(n + 1)
    w1 = np.empty(n)
    w2 = np.empty(n)
    w3 = np.empty(n)

    # Depth at every vertex (first repeated last); a0 / a1 are views.
    np.subtract(h, geo.vertex_z, out=a)
    np.maximum(a, 0.0, out=a)
    a0 = a[:n]
    a1 = a[1:]
    np.multiply(a, rg, out=p_vertex)
    p_start = p_vertex[:n]
    p_end = p_vertex[1:]

    # Wetted fraction f of each edge; the product overflows to inf on an edge
    # rising under 1e-200 m (1 / |dz| is huge), which the clip makes 1.
    f = w1
    np.subtract(h, geo.z_low, out=f)
    with np.errstate(over="ignore", invalid="ignore"):
        np.multiply(f, geo.inv_abs_dz, out=f)
    np.clip(f, 0.0, 1.0, out=f)
    # Horizontal edges at or below the surface are wetted whole (z <= h),
    # also exactly at it, where (h - z_low) / |dz| would be 0 / 0.
    horizontal = np.flatnonzero(geo.inv_abs_dz >= FLAT_INV_DZ)
    flat = horizontal[geo.z_low[horizontal] <= h]
    f[flat] = 1.0
    wl = wetted[:n]
    np.multiply(f, geo.length, out=wl)

    # Sum of end depths; the wetted part's mean depth is half of it.
    s01 = w2
    np.add(a0, a1, out=s01)

    # Parameter where the wetted part starts: 1 - f on falling edges.
    ta = w3
    np.subtract(1.0, f, out=ta)
    np.multiply(ta, geo.falls, out=ta)
    # The force rows are free until the forces are computed: scratch here.
    volume = float(_green_sum(section, f, ta, work=(fx[:n], fz[:n], res[:n])))

    if not axi:
        # Normal force per edge = rg * width * Lw * (a0 + a1) / 2.
        fn = res[:n]
        np.multiply(wl, s01, out=fn)
        np.multiply(fn, 0.5 * rg * section.width, out=fn)
        np.multiply(fn, geo.nx, out=fx[:n])
        np.multiply(fn, geo.nz, out=fz[:n])
        # Centre of pressure: t = ta + f (a0 + 2 a1) / (3 (a0 + a1)).
        t = cpx[:n]
        np.add(s01, a1, out=t)
        np.multiply(t, f, out=t)
        with np.errstate(invalid="ignore", divide="ignore"):
            np.divide(t, s01, out=t)
        np.multiply(t, 1.0 / 3.0, out=t)
        np.add(t, ta, out=t)
        t[flat] = 0.5  # uniform pressure, even 0 at the surface
        cz = cpz[:n]
        np.multiply(t, geo.dz, out=cz)
        np.add(cz, geo.z0, out=cz)
        cx = t  # reuse in place last
        np.multiply(cx, geo.dx, out=cx)
        np.add(cx, geo.x0, out=cx)
        cp = out[5:7, :n].T  # (N, 2) view; NaN rows where dry (0/0)
        hoop0[:n] = np.nan
        hoop1[:n] = np.nan
    else:
        # r at the wetted part's ends, ra = x0 + ta dx, rb = ra + f dx.
        ra = w3
        np.multiply(ta, geo.dx, out=ra)
        np.add(ra, geo.x0, out=ra)
        rb = cpz[:n]  # scratch: no centre of pressure for axisymmetric
        np.multiply(f, geo.dx, out=rb)
        np.add(rb, ra, out=rb)
        # int p r ds = rg Lw (2 a0 ra + a0 rb + a1 ra + 2 a1 rb) / 6
        #            = rg Lw ((2 a0 + a1) ra + (a0 + 2 a1) rb) / 6
        q = cpx[:n]
        np.add(s01, a0, out=q)
        np.multiply(q, ra, out=q)
        np.add(s01, a1, out=w2)
        np.multiply(w2, rb, out=w2)
        np.add(q, w2, out=q)
        np.multiply(q, wl, out=q)
        fzz = fz[:n]
        np.multiply(q, (2.0 * np.pi / 6.0) * rg, out=fzz)
        np.multiply(fzz, geo.nz, out=fzz)
        np.abs(fzz, out=res[:n])
        fx[:n] = np.nan
        cp = out[5:7, :n].T
        cp.fill(np.nan)
        # Hoop force N = p r / cos(alpha), cos(alpha) = |dz| / L; not defined
        # on horizontal edges (nor on those rising under 1e-200 m, where
        # 1 / cos overflows): NaN there.
        with np.errstate(over="ignore", invalid="ignore"):
            sec = geo.length * geo.inv_abs_dz
            np.multiply(p_start, geo.x0, out=hoop0[:n])
            np.multiply(hoop0[:n], sec, out=hoop0[:n])
            np.multiply(p_end, np.roll(geo.x0, -1), out=hoop1[:n])
            np.multiply(hoop1[:n], sec, out=hoop1[:n])
        hoop0[:n][horizontal] = np.nan
        hoop1[:n][horizontal] = np.nan

    out.setflags(write=False)
    weight = rg * volume
    if law.n_layers == 1:
        volumes = np.array([volume])
        weights = np.array([weight])
        volumes.setflags(write=False)
        weights.setflags(write=False)
    else:  # layers of one density: the volume below each interface
        z_high = np.maximum(geo.vertex_z[:n], geo.vertex_z[1:])
        below = [_volume_below_top(section, z_high, layer.top,
                                   _edges_crossed(geo, z_high, layer.top), w1, w2)
                 for layer in law.layers[:-1]]
        volumes, weights, _, _ = _layer_volumes(law, below + [volume])
    return EdgeLoads(
        law=law, caps=None, wetted_length=wl, p_start=p_start, p_end=p_end,
        fx=fx[:n], fz=fz[:n], resultant=res[:n], centre_of_pressure=cp,
        hoop_start=hoop0[:n], hoop_end=hoop1[:n], layer_volumes=volumes,
        layer_weights=weights, volume=volume, fluid_weight=weight,
        max_pressure=rg * max(h - section.z_min, 0.0))


def _check_law_fits(section, law):
    """PressureLawError unless ``law`` can stand in ``section``: no gas over
    an open section, no free surface above its spill level."""
    if not isinstance(law, PressureLaw):
        raise PressureLawError("law must be a PressureLaw")
    if section.is_open:
        if law.gas_pressure != 0.0:
            raise PressureLawError(
                "a gas pressure needs a closed section; this one has open edges "
                "(its surface is at atmospheric pressure)")
        if law.level > section.spill_level:
            raise PressureLawError(
                f"free surface {law.level:.6g} m is above the spill level "
                f"{section.spill_level:.6g} m; cap it first (hydrostatics.resolve_level)")


def _edges_crossed(geo, z_high, level):
    """Indices of the edges with z_low < level < z_high."""
    above = z_high > level
    above &= geo.z_low < level
    return np.flatnonzero(above)


def _volume_below_top(section, z_high, level, crossed, f, ta):
    """Green volume below ``level`` [m3]: edges wholly below count in full
    (f = 1, ta = 0), the crossed ones in part, the rest not at all."""
    geo = section.geometry
    np.less_equal(z_high, level, out=f, casting="unsafe")
    ta.fill(0.0)
    if crossed.size:
        fc = (level - geo.z_low[crossed]) * geo.inv_abs_dz[crossed]
        np.clip(fc, 0.0, 1.0, out=fc)
        f[crossed] = fc
        ta[crossed] = (1.0 - fc) * geo.falls[crossed]
    return float(_green_sum(section, f, ta))


def _volume_below_caps(section, level, caps, f, ta):
    """Liquid volume below ``level`` [m3] with per-edge caps: the Green sum
    of the edges clipped below min(level, cap)."""
    geo = section.geometry
    np.minimum(caps, level, out=f)
    np.subtract(f, geo.z_low, out=f)
    np.multiply(f, geo.inv_abs_dz, out=f)
    np.clip(f, 0.0, 1.0, out=f)
    np.subtract(1.0, f, out=ta)
    np.multiply(ta, geo.falls, out=ta)
    return float(_green_sum(section, f, ta))


_FEW_CUT_EDGES = 12
"""Up to this many cut edges are integrated with plain floats, one by one
(numpy's per-call cost dominates for a few edges); more, as arrays."""


def _ramp_sum(z, levels, slopes, out, work):
    """out = sum_k c_k (b_k - z)+ (the liquid's share of the pressure)."""
    np.subtract(levels[-1], z, out=out)
    np.maximum(out, 0.0, out=out)
    np.multiply(out, slopes[-1], out=out)
    for b, c in zip(levels[:-1], slopes[:-1], strict=True):
        np.subtract(b, z, out=work)
        np.maximum(work, 0.0, out=work)
        np.multiply(work, c, out=work)
        np.add(out, work, out=out)


def _cut_edges(section, law, caps, idx, p_start, p_end, fx, fz, res, cpx):
    """Exact loads of the edges ``idx`` by cutting each at the ramp levels
    and its cap into pieces of linear pressure, vectorised over the edges.

    Writes, for those edges: p_start and p_end; plane: the signed normal
    force into ``res`` and the centre of pressure parameter t along the edge
    into ``cpx``; axisymmetric: fz, the resultant |fz| and fx = NaN."""
    geo = section.geometry
    x0, z0, dx, dz = geo.x0[idx], geo.z0[idx], geo.dx[idx], geo.dz[idx]
    z1 = geo.vertex_z[idx + 1]
    length = geo.length[idx]
    zl = np.minimum(z0, z1)
    zh = np.maximum(z0, z1)
    h = law.level
    cap = np.full(idx.size, h) if caps is None else caps[idx]
    # Cut levels: every ramp level and the edge's cap, clipped to the edge.
    cuts = np.concatenate([np.broadcast_to(law.ramp_levels, (idx.size, law.ramp_levels.size)),
                           cap[:, None]], axis=1)
    np.clip(cuts, zl[:, None], zh[:, None], out=cuts)
    z = np.concatenate([z0[:, None], z1[:, None], cuts], axis=1)
    flat = dz == 0
    with np.errstate(invalid="ignore", divide="ignore"):
        t = (z - z0[:, None]) / dz[:, None]
    t[:, 0] = 0.0
    t[:, 1] = 1.0
    t[flat, 2:] = 1.0  # a horizontal edge: one piece of constant pressure
    order = np.argsort(t, axis=1, kind="stable")
    t = np.take_along_axis(t, order, axis=1)
    z = np.take_along_axis(z, order, axis=1)
    p = law.pressure(np.minimum(z, cap[:, None]))
    p_start[idx] = law.pressure(np.minimum(z0, cap))
    p_end[idx] = law.pressure(np.minimum(z1, cap))
    ta, tb = t[:, :-1], t[:, 1:]
    pa, pb = p[:, :-1], p[:, 1:]
    dt = tb - ta
    if not section.is_axisymmetric:
        # Per unit width: force L int p dt, moment L^2 int p t dt (trapezoids).
        force = np.sum(dt * (pa + pb), axis=1) * 0.5
        moment = np.sum(dt * (pa * (2.0 * ta + tb) + pb * (ta + 2.0 * tb)), axis=1) / 6.0
        with np.errstate(invalid="ignore", divide="ignore"):
            tcp = moment / force
        cpx[idx] = np.where(force != 0, tcp, np.nan)
        res[idx] = force * length * section.width  # signed normal force
    else:
        ra = x0[:, None] + ta * dx[:, None]
        rb = x0[:, None] + tb * dx[:, None]
        integral = np.sum(dt * ((2.0 * pa + pb) * ra + (pa + 2.0 * pb) * rb), axis=1) / 6.0
        fzz = (2.0 * np.pi) * geo.nz[idx] * length * integral
        fz[idx] = fzz
        res[idx] = np.abs(fzz)
        fx[idx] = np.nan


def _cut_edges_one_by_one(section, law, caps, idx, p_start, p_end, fx, fz, res, cpx):
    """:func:`_cut_edges` with plain floats, for a few edges (same results
    to round-off, same outputs written)."""
    geo = section.geometry
    h = law.level
    p_gas = law.gas_pressure
    ramps = list(zip(law.ramp_levels.tolist(), law.ramp_slopes.tolist(), strict=True))

    def pressure(z):
        p = p_gas
        for b, c in ramps:
            if z < b:
                p += c * (b - z)
        return p

    x0s, z0s, dxs, dzs = geo.x0, geo.z0, geo.dx, geo.dz
    z1s, lengths, nzs = geo.vertex_z, geo.length, geo.nz
    axi = section.is_axisymmetric
    width = section.width
    for i in idx.tolist():
        x0, z0, dx, dz = float(x0s[i]), float(z0s[i]), float(dxs[i]), float(dzs[i])
        z1, length, nz = float(z1s[i + 1]), float(lengths[i]), float(nzs[i])
        cap = h if caps is None else float(caps[i])
        p_start[i] = pressure(min(z0, cap))
        p_end[i] = pressure(min(z1, cap))
        if dz == 0.0:  # a horizontal edge: one piece of constant pressure
            zs = [z0, z1]
            ts = [0.0, 1.0]
        else:
            zl, zh = min(z0, z1), max(z0, z1)
            inner = [b for b, _ in ramps if zl < b < zh]
            if zl < cap < zh:
                inner.append(cap)
            zs = [z0] + sorted(inner, reverse=dz < 0) + [z1]
            ts = [0.0] + [(z - z0) / dz for z in zs[1:-1]] + [1.0]
        ps = [pressure(min(z, cap)) for z in zs]
        if not axi:
            force = moment = 0.0
            for ta, tb, pa, pb in zip(ts, ts[1:], ps, ps[1:], strict=False):
                dt = tb - ta
                force += dt * (pa + pb)
                moment += dt * (pa * (2.0 * ta + tb) + pb * (ta + 2.0 * tb))
            force *= 0.5
            cpx[i] = moment / (6.0 * force) if force != 0.0 else np.nan
            res[i] = force * length * width
        else:
            integral = 0.0
            for ta, tb, pa, pb in zip(ts, ts[1:], ps, ps[1:], strict=False):
                ra, rb = x0 + ta * dx, x0 + tb * dx
                integral += (tb - ta) * ((2.0 * pa + pb) * ra + (pa + 2.0 * pb) * rb)
            fzz = (2.0 * np.pi / 6.0) * nz * length * integral
            fz[i] = fzz
            res[i] = abs(fzz)
            fx[i] = np.nan


def _layer_volumes(law, below):
    """Volume and weight of each layer, all liquid, and its weight, from the
    liquid volume ``below`` each layer's top [m3]."""
    layers = law.layers
    cum = []
    last = 0.0
    for v in below:
        last = max(v, last)  # the volume below a level cannot fall (round-off)
        cum.append(last)
    g = law.gravity
    volumes = [b - a for a, b in zip([0.0] + cum[:-1], cum, strict=True)]
    weights = [layer.density * g * v for layer, v in zip(layers, volumes, strict=True)]
    # Ramp form of the total weight: g sum_k (rho_k - rho_(k+1)) V(top_k).
    weight = 0.0
    for k, layer in enumerate(layers):
        jump = layer.density - (layers[k + 1].density if k + 1 < len(layers) else 0.0)
        if jump > 0:
            weight += (g * jump) * cum[k]
    volumes = np.array(volumes)
    weights = np.array(weights)
    volumes.setflags(write=False)
    weights.setflags(write=False)
    return volumes, weights, cum[-1], weight


def liquid_volume_below(section, level, caps=None):
    """Liquid volume below ``level`` [m3] when each edge sees its own liquid
    surface ``caps`` (pockets of trapped air), else the cavity's volume.

    .. math:: V = s \\sum_e \\int_{e,\\,z \\le \\min(h, c_e)} x\\,dz
              \\;(\\times w), \\qquad s\\,\\pi \\sum_e \\int x^2\\,dz

    The liquid's boundary is every edge below its cap plus horizontal lines
    (free surface, pocket interfaces), which add nothing to Green's sum.

    Parameters
    ----------
    section : Section
    level : float
        [m]
    caps : array_like or None
        (N,) liquid surface level of each edge [m]; None: all ``level``.

    Returns
    -------
    float
        [m3] (area x width for plane sections).
    """
    if caps is None:
        v = volume_below(section, level)
    else:
        n = section.n_edges
        caps = np.asarray(caps, dtype=np.float64)
        v = _volume_below_caps(section, float(level), caps, np.empty(n), np.empty(n))
    return max(v, 0.0)  # a Green sum at the very bottom may round below zero


def layer_tops(section, bounds, names=None):
    """Interface levels of layers given by their top level or their own volume.

    Parameters
    ----------
    section : Section
    bounds : sequence of (str, float)
        One entry per layer but the top one, bottom up: ``("top", z)`` with
        z the interface level [m], or ``("volume", v)`` with v the layer's
        own volume [m3] (area x width for plane sections).
    names : sequence of str, optional
        Layer names, for messages.

    Returns
    -------
    list of float
        Interface levels [m], bottom up. A layer given by volume has its
        interface where the liquid below it holds the cumulative volume,
        solved exactly by :func:`wetline.core.fill.level_for_volume` (vented
        pockets).

    Raises
    ------
    PressureLawError
        For a negative volume, or more than the section holds, naming the
        layer.

    Examples
    --------
    >>> from wetline.core.section import Section
    >>> s = Section.build([[0, 0], [2, 0], [2, 3], [0, 3]],
    ...                   parts=["floor", "wall", "open", "wall"])
    >>> layer_tops(s, [("volume", 1.0), ("top", 1.0), ("volume", 2.0)])
    [0.5, 1.0, 2.0]
    """
    names = list(names) if names is not None else []
    out = []
    below = 0.0  # liquid below the last interface [m3]
    for i, (kind, value) in enumerate(bounds):
        label = Layer(1.0, 0.0, names[i] if i < len(names) else "").label(i)
        v = _finite(value, f"{label} {kind}")
        if kind == "top":
            out.append(v)
            below = volume_below(section, v)
        elif kind == "volume":
            if v < 0:
                raise PressureLawError(f"{label} volume must be >= 0, not {v:g} m3")
            below += v
            try:
                out.append(level_for_volume(section, below))
            except FillError:
                raise PressureLawError(
                    f"{label} volume {v:.6g} m3 with the layers below it makes {below:.6g} m3, "
                    "more than the section holds") from None
        else:
            raise PressureLawError(f"{label} must be given by 'top' or 'volume', not {kind!r}")
    return out
