"""The one unit registry of Wetline, and the display unit systems.

Everything inside :mod:`core` is a plain SI float (m, m2, m3, Pa, N, N/m,
kg/m3). Units are converted only at the edges: the length unit of a section
file (:func:`length_factor`) and the units results are shown in
(:class:`DisplayUnits`). Conversion factors come from pint once and are then
plain floats, so the numerics never touch pint objects.

Factors are rounded to 15 significant digits after pint computes them. pint
chains definitions (foot = 12 inch = yard / 3 ...), which leaves the last
binary digits off (0.30479999999999996 m for a foot, 0.02831684659199999 m3
for a cubic foot); rounding to 15 digits restores the exact decimal
definitions (0.3048 m, 0.0254 m, 0.028316846592 m3, 4.4482216152605 N) and
moves any other factor by less than 5e-15 of its value.

References
----------
NIST Special Publication 811 (2008), Guide for the Use of the International
System of Units, Appendix B (conversion factors).
International yard and pound agreement (1959): 1 yd = 0.9144 m and
1 lb = 0.45359237 kg exactly, so 1 ft = 0.3048 m and 1 in = 0.0254 m.
"""

from __future__ import annotations

import dataclasses
import functools
import math
import re
from dataclasses import dataclass
from decimal import Decimal

import numpy as np
import pint

from .numbers import DEFAULT_DIGITS, format_number

__all__ = [
    "ureg",
    "UnitError",
    "length_factor",
    "to_si_exactly",
    "DisplayUnit",
    "DisplayUnits",
    "QUANTITIES",
    "SI",
    "US",
    "display_units",
    "DISPLAY_SYSTEMS",
    "SI_LENGTH_UNITS",
    "US_LENGTH_UNITS",
    "DISPLAY_LENGTH_UNITS",
    "length_display",
]

ureg = pint.UnitRegistry()
"""The program's single pint registry. Create no other: quantities from two
registries cannot be combined."""
pint.set_application_registry(ureg)

_METRE = ureg.meter


class UnitError(ValueError):
    """A unit name that is unknown or of the wrong kind; the message says which."""


def _round_factor(value: float) -> float:
    """Round a conversion factor to 15 significant digits (see module notes)."""
    return float(f"{float(value):.15g}")


def length_factor(unit: str) -> float:
    """Metres in one `unit`.

    Parameters
    ----------
    unit : str
        Any length unit pint knows: ``"mm"``, ``"cm"``, ``"m"``, ``"in"``,
        ``"ft"``, ``"yd"``, ``"inch"``, ``"feet"`` ...

    Returns
    -------
    factor : float
        Length of one `unit` [m]; multiply a value in `unit` by it to get
        metres.

    Raises
    ------
    UnitError
        If pint does not know `unit`, or it is not a length.

    Notes
    -----
    1 ft = 0.3048 m and 1 in = 0.0254 m exactly (international yard and
    pound agreement, 1959). Results are cached.

    Examples
    --------
    >>> length_factor("mm")
    0.001
    >>> length_factor("ft")
    0.3048
    """
    if not isinstance(unit, str):
        raise UnitError(f"a length unit must be text, not {type(unit).__name__}")
    return _length_factor(unit.strip())


@functools.lru_cache(maxsize=128)
def _length_factor(unit: str) -> float:
    if not unit:
        raise UnitError("no length unit given")
    # One unit name only: pint would also take expressions ("m/1", "m**1")
    # and ignore stray punctuation ("mm!"), which a file must not rely on.
    if not re.fullmatch(r"[A-Za-z_]+", unit):
        raise UnitError(f"unknown length unit '{unit}'")
    try:
        parsed = ureg.parse_units(unit)
    # pint's parser raises assorted types for malformed text (UndefinedUnitError,
    # TokenError, AssertionError, ZeroDivisionError ...); all mean "not a unit".
    except Exception:
        raise UnitError(f"unknown length unit '{unit}'") from None
    if parsed.dimensionality != _METRE.dimensionality:
        raise UnitError(f"'{unit}' is not a length unit")
    return _round_factor(ureg.Quantity(1.0, parsed).m_as(_METRE))


def to_si_exactly(values, factor):
    """``values * factor``, each product correctly rounded.

    A binary multiply can miss the nearest float by an ulp (2300 * 0.001 is
    2.3000000000000003, not 2.3); this takes the decimal product of the
    shortest representations, so 2300 mm is exactly the float 2.3 m and a
    value saved back in mm reads as the same number.

    Parameters
    ----------
    values : float or array_like
        Values in the unit of ``factor``.
    factor : float
        SI value of one unit (e.g. :func:`length_factor`) [SI].

    Returns
    -------
    float or numpy.ndarray
        [SI]

    Examples
    --------
    >>> to_si_exactly(2300.0, 0.001), 2300.0 * 0.001
    (2.3, 2.3000000000000003)
    """
    if factor == 1.0:
        return values if np.ndim(values) else float(values)
    f = Decimal(repr(float(factor)))
    if np.ndim(values) == 0:
        return float(Decimal(repr(float(values))) * f)
    arr = np.asarray(values, dtype=np.float64)
    flat = [float(Decimal(repr(v)) * f) if math.isfinite(v) else v * factor
            for v in arr.ravel().tolist()]
    return np.array(flat, dtype=np.float64).reshape(arr.shape)


QUANTITIES = (
    "length",
    "area",
    "volume",
    "liquid_volume",
    "pressure",
    "force",
    "force_per_length",
    "density",
)
"""Names of the quantities a :class:`DisplayUnits` converts."""


@dataclass(frozen=True)
class DisplayUnit:
    """One display unit: its label and its size in SI.

    Attributes
    ----------
    label : str
        Short plain-text label shown to the user (``"kPa"``, ``"lbf/ft"``).
    factor : float
        SI value of one display unit (Pa in one psi, m in one ft ...) [SI].
    """

    label: str
    factor: float


def _unit(pint_expression: str, label: str, si_unit: str) -> DisplayUnit:
    """Build a :class:`DisplayUnit` with its factor from pint."""
    factor = ureg.Quantity(1.0, pint_expression).m_as(si_unit)
    return DisplayUnit(label=label, factor=_round_factor(factor))


@dataclass(frozen=True)
class DisplayUnits:
    """A system of units results are shown in.

    Values inside Wetline are SI; this converts them for display only. For a
    plane section the loads are per width, so the app chooses between
    ``"force"`` and ``"force_per_length"``; both are here.

    Attributes
    ----------
    name : str
        Key of the system: ``"si"`` or ``"us"``.
    title : str
        Name shown to the user.
    length, area, volume, liquid_volume, pressure, force, force_per_length, density : DisplayUnit
        The display unit of each quantity. ``volume`` is geometric (m3,
        ft3); ``liquid_volume`` is the unit liquids are sold in (L, US gal).

    Examples
    --------
    >>> US.to_display(0.3048, "length")
    1.0
    >>> SI.label("force_per_length")
    'kN/m'
    """

    name: str
    title: str
    length: DisplayUnit
    area: DisplayUnit
    volume: DisplayUnit
    liquid_volume: DisplayUnit
    pressure: DisplayUnit
    force: DisplayUnit
    force_per_length: DisplayUnit
    density: DisplayUnit

    def unit(self, quantity: str) -> DisplayUnit:
        """The :class:`DisplayUnit` of `quantity` (one of :data:`QUANTITIES`)."""
        if quantity not in QUANTITIES:
            raise UnitError(
                f"unknown quantity '{quantity}' (known: {', '.join(QUANTITIES)})"
            )
        return getattr(self, quantity)

    def label(self, quantity: str) -> str:
        """Plain-text label of the display unit of `quantity`."""
        return self.unit(quantity).label

    def factor(self, quantity: str) -> float:
        """SI value of one display unit of `quantity` [SI]."""
        return self.unit(quantity).factor

    def to_display(self, value_si, quantity: str):
        """Convert `value_si` (float or numpy array, SI) to display units.

        Parameters
        ----------
        value_si : float or numpy.ndarray
            Value in SI units [m, m2, m3, Pa, N, N/m or kg/m3].
        quantity : str
            One of :data:`QUANTITIES`.

        Returns
        -------
        value : float or numpy.ndarray
            The same value in this system's unit of `quantity`.
        """
        return value_si / self.unit(quantity).factor

    def from_display(self, value, quantity: str):
        """Convert `value` from this system's unit of `quantity` to SI.

        Inverse of :meth:`to_display`. Each product is correctly rounded
        (:func:`to_si_exactly`), so a typed 2300 mm is exactly 2.3 m.
        """
        return to_si_exactly(value, self.unit(quantity).factor)

    def text(self, value_si, quantity: str, digits: int = DEFAULT_DIGITS) -> str:
        """`value_si` in this system's unit of `quantity` with its label, for
        people (:func:`wetline.core.numbers.format_number`).

        >>> SI.text(24516.6, "pressure")
        '24.52 kPa'
        """
        shown = format_number(self.to_display(value_si, quantity), digits)
        return f"{shown} {self.label(quantity)}"

    def with_length(self, unit: str) -> DisplayUnits:
        """A copy showing lengths in `unit` (see :func:`length_display`)."""
        return dataclasses.replace(self, length=length_display(unit))


SI = DisplayUnits(
    name="si",
    title="SI",
    length=_unit("m", "m", "m"),
    area=_unit("m**2", "m2", "m**2"),
    volume=_unit("m**3", "m3", "m**3"),
    liquid_volume=_unit("L", "L", "m**3"),
    pressure=_unit("kPa", "kPa", "Pa"),
    force=_unit("kN", "kN", "N"),
    force_per_length=_unit("kN/m", "kN/m", "N/m"),
    density=_unit("kg/m**3", "kg/m3", "kg/m**3"),
)
"""SI display units: m, kPa, kN, kN/m, m3, L, kg/m3."""

US = DisplayUnits(
    name="us",
    title="US customary",
    length=_unit("ft", "ft", "m"),
    area=_unit("ft**2", "ft2", "m**2"),
    volume=_unit("ft**3", "ft3", "m**3"),
    liquid_volume=_unit("gallon", "US gal", "m**3"),
    pressure=_unit("psi", "psi", "Pa"),
    force=_unit("lbf", "lbf", "N"),
    force_per_length=_unit("lbf/ft", "lbf/ft", "N/m"),
    density=_unit("lb/ft**3", "lb/ft3", "kg/m**3"),
)
"""US customary display units: ft, psi, lbf, lbf/ft, ft3, US gal, lb/ft3."""

DISPLAY_SYSTEMS = {"si": SI, "us": US}


def display_units(name: str) -> DisplayUnits:
    """The display system called `name` (``"si"`` or ``"us"``, any case).

    Examples
    --------
    >>> display_units("US").pressure.label
    'psi'
    """
    key = name.strip().lower() if isinstance(name, str) else name
    try:
        return DISPLAY_SYSTEMS[key]
    except (KeyError, TypeError):
        known = ", ".join(f"'{k}'" for k in DISPLAY_SYSTEMS)
        raise UnitError(f"unknown unit system {name!r} (known: {known})") from None


SI_LENGTH_UNITS = ("mm", "m")
"""Length units offered for display with the SI system."""

US_LENGTH_UNITS = ("in", "ft")
"""Length units offered for display with the US system."""

DISPLAY_LENGTH_UNITS = ("mm", "cm", "m", "in", "ft")
"""Every length unit :func:`length_display` accepts."""


def length_display(unit: str) -> DisplayUnit:
    """Label and size of a display length unit.

    Parameters
    ----------
    unit : str
        One of :data:`DISPLAY_LENGTH_UNITS`.

    Returns
    -------
    DisplayUnit
        ``label`` is `unit`; ``factor`` is metres in one `unit` [m].

    Examples
    --------
    >>> length_display("in")
    DisplayUnit(label='in', factor=0.0254)
    """
    if unit not in DISPLAY_LENGTH_UNITS:
        known = ", ".join(DISPLAY_LENGTH_UNITS)
        raise UnitError(f"lengths are shown in {known}, not {unit!r}")
    return DisplayUnit(label=unit, factor=length_factor(unit))
