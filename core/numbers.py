"""Numbers for people: the one formatter of every table, label and sheet.

One policy everywhere (the command line, the window, the diagram, the chart
and the calculation sheet): :data:`DEFAULT_DIGITS` significant figures (a
whole number keeps all its digits: 123456, not 123500), plain notation from
1e-4 up to 1e9 and an exponent outside that range, trailing zeros dropped,
``-`` for a value that is not defined. Files and the JSON results record
are not formatted here: they keep full precision.

Round-off noise: a force summed from opposite contributions (the net
horizontal force on a tank's two side walls, the support reaction of a
section whose floor carries everything) comes out as 1e-13 of the loads
instead of 0. Given the ``scale`` of the quantity (the case's largest value
of the same kind, :func:`wetline.core.force_scope.force_scale`), a value
smaller than :data:`NOISE` of it prints as ``0``.
"""

from __future__ import annotations

import contextlib
import contextvars
import math
from collections.abc import Iterator

__all__ = ["DEFAULT_DIGITS", "ENTERED_DIGITS", "FIGURES_RANGE", "NOISE", "Entered", "count_of",
           "figures", "format_entered", "format_number", "is_noise", "nice_step", "round_to_step",
           "set_figures", "using_figures"]

DEFAULT_DIGITS = 4
"""Significant figures of a result shown to people, unless the document says
otherwise (:func:`figures`)."""

FIGURES_RANGE = (3, 6)
"""Significant figures a document may ask for its results (inclusive)."""

ENTERED_DIGITS = 12
"""Significant figures a coordinate or dimension is echoed with at most
(:func:`format_entered`): enough for anything typed, few enough to hide the
last binary digits of a unit conversion (2.3 ft is 0.70104 m, which reads
back as 2.3000000000000003 ft)."""

_FIGURES: contextvars.ContextVar[int] = contextvars.ContextVar("wetline_figures",
                                                              default=DEFAULT_DIGITS)


def _checked_figures(n: int) -> int:
    lo, hi = FIGURES_RANGE
    if isinstance(n, bool) or not isinstance(n, int) or not lo <= n <= hi:
        raise ValueError(f"significant figures must be a whole number from {lo} to {hi}, "
                         f"not {n!r}")
    return n


def figures() -> int:
    """The significant figures results are shown with now: the document's
    precision policy (:func:`using_figures`), :data:`DEFAULT_DIGITS` unless set.

    >>> figures()
    4
    """
    return _FIGURES.get()


def set_figures(n: int) -> contextvars.Token[int]:
    """Make ``n`` significant figures the policy of this thread from now on
    (the desktop program, for its open document); returns the token that
    :meth:`contextvars.ContextVar.reset` takes. ValueError outside
    :data:`FIGURES_RANGE`."""
    return _FIGURES.set(_checked_figures(n))


@contextlib.contextmanager
def using_figures(n: int) -> Iterator[int]:
    """Within the block, results are shown with ``n`` significant figures
    (a sheet or a table of a document whose policy says so).

    >>> with using_figures(5):
    ...     format_number(2 / 3)
    '0.66667'
    >>> format_number(2 / 3)
    '0.6667'
    """
    token = _FIGURES.set(_checked_figures(n))
    try:
        yield n
    finally:
        _FIGURES.reset(token)

NOISE = 1e-12
"""A value smaller than this fraction of its scale is round-off: shown as 0."""

_PLAIN_EXPONENTS = range(-4, 9)
"""Decimal exponents written in plain notation (0.0001 up to 999,950,000)."""


def is_noise(value, scale: float | None):
    """True if ``value`` is round-off next to ``scale``: ``|value| < NOISE |scale|``
    (elementwise for a numpy array; False without a finite scale).

    >>> is_noise(3e-13, 1000.0), is_noise(3e-6, 1000.0), is_noise(1e-30, None)
    (True, False, False)
    """
    if scale is None or not math.isfinite(scale):
        return abs(value) < 0.0  # False, of the shape of value
    return abs(value) < NOISE * abs(scale)


def format_number(value: float | str | None, digits: int | None = None, *,
                  scale: float | None = None) -> str:
    """``value`` with ``digits`` significant figures, for people.

    Parameters
    ----------
    value : float, str or None
        The number; text is passed through, None and NaN give ``-``.
    digits : int, optional
        Significant figures, >= 1; default the precision policy in force
        (:func:`figures`, 4 unless the document says otherwise).
    scale : float, optional
        The largest value of the same kind in the case [same unit as
        ``value``]: a value smaller than :data:`NOISE` of it is round-off
        and prints as ``0``.

    Returns
    -------
    str
        Plain notation for decimal exponents -4 to 8 (``44130``, ``1.5``,
        ``123456``,
        ``0.00012346`` at five figures), else ``1.235e+11``; trailing zeros
        dropped; ``inf`` and ``-inf`` as such.

    Examples
    --------
    >>> format_number(44129.925), format_number(1.5), format_number(-0.0)
    ('44130', '1.5', '0')
    >>> format_number(0.000123456, 5), format_number(123456789012.0), format_number(None)
    ('0.00012346', '1.235e+11', '-')
    >>> format_number(2.4e-13, scale=8.8e3), format_number(2.4e-13)
    ('0', '2.4e-13')
    >>> format_number(9.99996), format_number(1 / 0.9)
    ('10', '1.111')
    """
    if value is None:
        return "-"
    if isinstance(value, str):
        return value
    v = float(value)
    if math.isnan(v):
        return "-"
    if math.isinf(v):
        return "inf" if v > 0 else "-inf"
    if v == 0 or is_noise(v, scale):
        return "0"
    digits = max(int(figures() if digits is None else digits), 1)
    mantissa, exponent = f"{v:.{digits - 1}e}".split("e")
    e = int(exponent)
    if e in _PLAIN_EXPONENTS:
        text = f"{v:.{max(digits - 1 - e, 0)}f}"
        return _drop_zeros(text)
    return f"{_drop_zeros(mantissa)}e{exponent}"


def _drop_zeros(text: str) -> str:
    if "." in text:
        text = text.rstrip("0").rstrip(".")
    return text


def nice_step(value: float, *, down: bool = False) -> float:
    """The 1-2-5 number (1, 2, 5, 10, 20 ...) nearest ``value`` from above,
    or from below if ``down``: the step of a grid, an axis or a scale bar.

    ``value`` is the raw step wanted (> 0); 1.0 for anything else.

    >>> nice_step(0.37), nice_step(0.37, down=True), nice_step(2.0), nice_step(7e3)
    (0.5, 0.2, 2.0, 10000.0)
    """
    if not (value > 0 and math.isfinite(value)):
        return 1.0
    e = math.floor(math.log10(value))
    tol = 1e-12 * value
    if down:
        for m in (10.0, 5.0, 2.0, 1.0):
            if m * 10.0 ** e <= value + tol:
                return m * 10.0 ** e
        return 10.0 ** (e - 1) * 5.0
    for m in (1.0, 2.0, 5.0, 10.0):
        if m * 10.0 ** e >= value - tol:
            return m * 10.0 ** e
    return 10.0 ** (e + 1) * 2.0


def format_entered(value: float | str | None) -> str:
    """A coordinate or dimension as it was entered: the shortest decimal
    text that gives ``value`` back when rounded to :data:`ENTERED_DIGITS`
    significant figures, in plain notation where
    :func:`format_number` uses it; ``-`` for None or NaN.

    Unlike a result, an input is not rounded to the policy's figures: a
    vertex typed at 2.34567 m must not read as 2.346 m. Points drawn with
    the mouse are rounded where they are made (to the snap spacing), so
    they read as round numbers here.

    >>> format_entered(2.34567), format_entered(0.70104 / 0.3048), format_entered(1500.0)
    ('2.34567', '2.3', '1500')
    >>> format_entered(-0.0), format_entered(1e-7), format_entered(None)
    ('0', '1e-07', '-')
    """
    if value is None or isinstance(value, str):
        return format_number(value)
    v = float(value)
    if not math.isfinite(v) or v == 0:
        return format_number(v)
    target = float(f"{v:.{ENTERED_DIGITS - 1}e}")
    for digits in range(1, ENTERED_DIGITS + 1):
        text = f"{v:.{digits - 1}e}"
        if float(f"{float(text):.{ENTERED_DIGITS - 1}e}") == target:
            return format_number(float(text), digits)
    return format_number(target, ENTERED_DIGITS)  # pragma: no cover - the loop ends there


class Entered(float):
    """A float that is a coordinate or dimension (an input, not a result):
    a table cell holding one is written by :func:`format_entered`, at every
    figure it was given, instead of the policy's figures.

    >>> Entered(2.34567) == 2.34567, format_entered(Entered(2.34567))
    (True, '2.34567')
    """

    __slots__ = ()


def count_of(n: int, word: str, words: str | None = None) -> str:
    """A count and its noun: ``"1 edge"``, ``"3 edges"``; ``words`` for an
    irregular plural.

    >>> count_of(1, "case"), count_of(4, "case"), count_of(2, "vertex", "vertices")
    ('1 case', '4 cases', '2 vertices')
    """
    return f"{n} {word}" if n == 1 else f"{n} {words or word + 's'}"


def round_to_step(value: float, step: float) -> float:
    """``value`` rounded to the nearest whole multiple of ``step`` (> 0),
    computed in decimals so the result is the float nearest that multiple
    (round(23 x 0.1) is 2.3, not 2.3000000000000003); ``value`` as it is
    for a step that is not a positive finite number.

    >>> round_to_step(2.2999, 0.1), round_to_step(-0.26, 0.05), round_to_step(7.0, 0.0)
    (2.3, -0.25, 7.0)
    """
    if not (step > 0 and math.isfinite(step) and math.isfinite(value)):
        return float(value)
    from decimal import Decimal

    n = round(value / step)
    return float(Decimal(n) * Decimal(repr(float(step)))) + 0.0
