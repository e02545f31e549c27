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

import math

__all__ = ["DEFAULT_DIGITS", "NOISE", "format_number", "is_noise", "nice_step"]

DEFAULT_DIGITS = 4
"""Significant figures of a number shown to people."""

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


def format_number(value: float | str | None, digits: int = DEFAULT_DIGITS, *,
                  scale: float | None = None) -> str:
    """``value`` with ``digits`` significant figures, for people.

    Parameters
    ----------
    value : float, str or None
        The number; text is passed through, None and NaN give ``-``.
    digits : int
        Significant figures, >= 1.
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
    digits = max(int(digits), 1)
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
