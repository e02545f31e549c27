"""The one unit registry of Wetline, and the display unit systems.

Everything inside :mod:`core` is a plain SI float (m, m2, m3, Pa, N, N/m,
kg/m3). Units are converted only at the edges: the length unit of a section
file (:func:`length_factor`) and the units results are shown in
(:class:`DisplayUnits`). Conversion factors are plain floats, so the
numerics never touch pint objects.

pint is the reference, but building its registry costs about 0.15 s of every
start. The factors a common file and the two display systems need (mm, cm,
m, in, ft; kPa, kN, psi, lbf ...) are therefore written out here, exactly as
pint gives them after the rounding below (a test compares every one with
pint); pint's registry (:func:`registry`, also ``ureg``) is built only when
another unit must be parsed.

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
from collections.abc import Sequence
from dataclasses import dataclass
from decimal import Decimal
from typing import TYPE_CHECKING, Any, overload

import numpy as np
import numpy.typing as npt

from .numbers import format_number

if TYPE_CHECKING:  # pragma: no cover - types only
    import pint

__all__ = [  # and ``ureg``, built on first use (module __getattr__)
    "registry",
    "pint_factor",
    "EXACT_LENGTH_FACTORS",
    "DISPLAY_UNIT_DEFINITIONS",
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
    "message_in_length_unit",
    "is_core_refusal",
]

@functools.lru_cache(maxsize=1)
def registry() -> pint.UnitRegistry[Any]:
    """The program's single pint registry, built on first use (about 0.15 s).

    Create no other: quantities from two registries cannot be combined.
    ``wetline.core.units.ureg`` is the same object.
    """
    import pint

    reg: pint.UnitRegistry[Any] = pint.UnitRegistry()
    pint.set_application_registry(reg)
    return reg


def __getattr__(name: str) -> Any:
    """``ureg``: the registry, built when first asked for (PEP 562)."""
    if name == "ureg":
        return registry()
    raise AttributeError(f"module {__name__!r} has no attribute {name!r}")


EXACT_LENGTH_FACTORS = {"m": 1.0, "mm": 0.001, "cm": 0.01, "in": 0.0254, "ft": 0.3048}
"""Metres in one of the common length units, as :func:`length_factor` gets
them from pint (1 in = 0.0254 m and 1 ft = 0.3048 m exactly, 1959)."""


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
    name = unit.strip()
    exact = EXACT_LENGTH_FACTORS.get(name)
    return exact if exact is not None else _length_factor(name)


@functools.lru_cache(maxsize=128)
def _length_factor(unit: str) -> float:
    """:func:`length_factor` through pint."""
    if not unit:
        raise UnitError("no length unit given")
    # One unit name only: pint would also take expressions ("m/1", "m**1")
    # and ignore stray punctuation ("mm!"), which a file must not rely on.
    if not re.fullmatch(r"[A-Za-z_]+", unit):
        raise UnitError(f"unknown length unit '{unit}'")
    ureg = registry()
    try:
        parsed = ureg.parse_units(unit)
    # pint's parser raises assorted types for malformed text (UndefinedUnitError,
    # TokenError, AssertionError, ZeroDivisionError ...); all mean "not a unit".
    except Exception:
        raise UnitError(f"unknown length unit '{unit}'") from None
    metre = ureg.meter
    if parsed.dimensionality != metre.dimensionality:
        raise UnitError(f"'{unit}' is not a length unit")
    return _round_factor(ureg.Quantity(1.0, parsed).m_as(metre))


FloatArray = npt.NDArray[np.float64]


@overload
def to_si_exactly(values: float, factor: float) -> float: ...


@overload
def to_si_exactly(values: FloatArray | Sequence[float], factor: float) -> FloatArray: ...


def to_si_exactly(values: float | FloatArray | Sequence[float], factor: float) -> Any:
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
        if np.ndim(values):
            return np.asarray(values, dtype=np.float64)
        return float(values)  # type: ignore[arg-type]
    f = Decimal(repr(float(factor)))
    if np.ndim(values) == 0:
        return float(Decimal(repr(float(values))) * f)  # type: ignore[arg-type]
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


def pint_factor(pint_expression: str, si_unit: str) -> float:
    """SI value of one ``pint_expression`` as pint gives it, rounded to 15
    significant digits (see the module notes) [SI].

    Examples
    --------
    >>> pint_factor("psi", "Pa")
    6894.75729316836
    """
    return _round_factor(registry().Quantity(1.0, pint_expression).m_as(si_unit))


def _unit(label: str, factor: float) -> DisplayUnit:
    return DisplayUnit(label=label, factor=factor)


DISPLAY_UNIT_DEFINITIONS = {
    # label: (pint expression, SI unit) of every display unit below; a test
    # checks each written factor against pint_factor(*definition).
    "m": ("m", "m"), "m2": ("m**2", "m**2"), "m3": ("m**3", "m**3"), "L": ("L", "m**3"),
    "kPa": ("kPa", "Pa"), "kN": ("kN", "N"), "kN/m": ("kN/m", "N/m"),
    "kg/m3": ("kg/m**3", "kg/m**3"), "ft": ("ft", "m"), "ft2": ("ft**2", "m**2"),
    "ft3": ("ft**3", "m**3"), "US gal": ("gallon", "m**3"), "psi": ("psi", "Pa"),
    "lbf": ("lbf", "N"), "lbf/ft": ("lbf/ft", "N/m"), "lb/ft3": ("lb/ft**3", "kg/m**3"),
}


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
        unit: DisplayUnit = getattr(self, quantity)
        return unit

    def label(self, quantity: str) -> str:
        """Plain-text label of the display unit of `quantity`."""
        return self.unit(quantity).label

    def factor(self, quantity: str) -> float:
        """SI value of one display unit of `quantity` [SI]."""
        return self.unit(quantity).factor

    @overload
    def to_display(self, value_si: float, quantity: str) -> float: ...

    @overload
    def to_display(self, value_si: FloatArray, quantity: str) -> FloatArray: ...

    def to_display(self, value_si: float | FloatArray, quantity: str) -> Any:
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

    @overload
    def from_display(self, value: float, quantity: str) -> float: ...

    @overload
    def from_display(self, value: FloatArray | Sequence[float], quantity: str) -> FloatArray: ...

    def from_display(self, value: float | FloatArray | Sequence[float], quantity: str) -> Any:
        """Convert `value` from this system's unit of `quantity` to SI.

        Inverse of :meth:`to_display`. Each product is correctly rounded
        (:func:`to_si_exactly`), so a typed 2300 mm is exactly 2.3 m.
        """
        return to_si_exactly(value, self.unit(quantity).factor)

    def text(self, value_si: float, quantity: str, digits: int | None = None) -> str:
        """`value_si` in this system's unit of `quantity` with its label, for
        people (:func:`wetline.core.numbers.format_number`).

        >>> SI.text(24516.6, "pressure")
        '24.52 kPa'
        """
        shown = format_number(self.to_display(value_si, quantity), digits)
        return f"{shown} {self.label(quantity)}"

    def message(self, text: str) -> str:
        """A message of core's (a refusal or a warning, lengths in metres)
        with its lengths in this system's length unit, as its tables show
        them (:func:`message_in_length_unit`)."""
        return message_in_length_unit(text, self.length.label)

    def with_length(self, unit: str) -> DisplayUnits:
        """A copy showing lengths in `unit` (see :func:`length_display`)."""
        return dataclasses.replace(self, length=length_display(unit))


SI = DisplayUnits(
    name="si",
    title="SI",
    length=_unit("m", 1.0),
    area=_unit("m2", 1.0),
    volume=_unit("m3", 1.0),
    liquid_volume=_unit("L", 0.001),
    pressure=_unit("kPa", 1000.0),
    force=_unit("kN", 1000.0),
    force_per_length=_unit("kN/m", 1000.0),
    density=_unit("kg/m3", 1.0),
)
"""SI display units: m, kPa, kN, kN/m, m3, L, kg/m3."""

US = DisplayUnits(
    name="us",
    title="US customary",
    length=_unit("ft", 0.3048),  # 1959 agreement: exact
    area=_unit("ft2", 0.09290304),
    volume=_unit("ft3", 0.028316846592),
    liquid_volume=_unit("US gal", 0.003785411784),  # 231 in3, exact
    pressure=_unit("psi", 6894.75729316836),  # lbf/in2, rounded to 15 digits
    force=_unit("lbf", 4.4482216152605),  # 0.45359237 kg x 9.80665 m/s2, exact
    force_per_length=_unit("lbf/ft", 14.5939029372064),
    density=_unit("lb/ft3", 16.0184633739601),
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


_NUMBER = r"(-?\d+(?:\.\d*)?(?:[eE][-+]?\d+)?)"
_LENGTH_IN_METRES = re.compile(_NUMBER + r" m(?![\w/])")
"""A length in metres as core writes one: a number, a space, "m" (not m2,
m3, m/s2, mm)."""
_POINT_IN_METRES = re.compile(r"\(" + _NUMBER + r", " + _NUMBER + r"\) m(?![\w/])")
"""A point in metres as core writes one: "(x, z) m"."""
_QUOTED = re.compile(r"""((?<!\w)'[^']*'(?!\w)|"[^"]*")""")
"""A quoted piece of a message (a name, a text typed); an apostrophe
inside a word ("structure's") starts none."""


def message_in_length_unit(text: str, unit: str) -> str:
    """A refusal of core's with its lengths in `unit` instead of metres.

    Core computes in metres and writes a length as a number, a space and
    "m" ("at 1.85 m") and a point as "(x, z) m". The same message for a
    person who works in `unit` (a file's length unit, a window's display
    unit): each such length and point converted and written with
    :func:`wetline.core.numbers.format_number`. Numbers before m2, m3 or
    m/s2 stay as they are, and so does quoted text (a name, or what was
    typed: "not '3 m'").

    Parameters
    ----------
    text : str
        The message, lengths in metres.
    unit : str
        A length unit :func:`length_factor` knows ("mm", "in", "ft" ...);
        for "m" the text is returned unchanged.

    Examples
    --------
    >>> message_in_length_unit("the spill level 0.6096 m at (0.3048, 0) m", "ft")
    'the spill level 2 ft at (1, 0) ft'
    """
    if unit == "m":
        return text
    factor = length_factor(unit)

    def shown(metres: str) -> str:
        return format_number(float(metres) / factor)

    def point(match: re.Match[str]) -> str:
        return f"({shown(match.group(1))}, {shown(match.group(2))}) {unit}"

    def rewrite(part: str) -> str:
        part = _POINT_IN_METRES.sub(point, part)
        return _LENGTH_IN_METRES.sub(lambda m: f"{shown(m.group(1))} {unit}", part)

    pieces = _QUOTED.split(text)
    return "".join(p if k % 2 else rewrite(p) for k, p in enumerate(pieces))


def is_core_refusal(exc: BaseException) -> bool:
    """True if `exc` is one of core's own exceptions, whose lengths are in
    metres (so :func:`message_in_length_unit` applies); False for any other,
    such as a typed number that does not parse, whose message quotes the
    text as typed.

    Examples
    --------
    >>> from wetline.core.section import SectionError
    >>> is_core_refusal(SectionError("x")), is_core_refusal(ValueError("x"))
    (True, False)
    """
    return type(exc).__module__.startswith("wetline.core.")
