"""Numbers people give: typed decimals read one way, and the accepted range
of each input said the same way everywhere.

:func:`parse_decimal` reads what a person types as a decimal number, for the
command line's options and the program's typed fields alike: ASCII digits,
an optional sign, one point or comma as the decimal separator and an
optional exponent (``2.5``, ``-0,5``, ``1e3``). Python's ``float()`` also
takes ``1_0``, digits of other scripts, ``inf`` and ``nan``, which no one
means as a fill level.

Files, the command line and typed fields refuse a number outside the range
Wetline computes with (:mod:`wetline.core.limits`) with a message naming the
input and the range, e.g. ``gravity must be 0.001 to 1000 m/s2, not 1e9``.
The helpers here write those ranges and values briefly: ``1e-6`` rather
than ``1e-06``, and a number from a file as the file wrote it.
"""

from __future__ import annotations

import json
import math
import re

__all__ = ["NumberError", "number_text", "parse_decimal", "range_text", "shown"]


class NumberError(ValueError):
    """Text that is not a decimal number; the message names the input."""


_DECIMAL = re.compile(r"[+-]?(?:[0-9]+(?:[.,][0-9]*)?|[.,][0-9]+)(?:[eE][+-]?[0-9]+)?")


def parse_decimal(text: str, what: str = "the number") -> float:
    """The number a person typed as ``text``.

    Parameters
    ----------
    text : str
        An optional sign, ASCII digits with at most one decimal point or
        comma, and an optional exponent: ``"2.5"``, ``"-0,5"``, ``".5"``,
        ``"3."``, ``"1e3"``, ``"-2.5E-3"``. Spaces and tabs around it are
        ignored; nothing else is accepted (no ``1_0``, no thousands
        separators, no ``inf`` or ``nan``, no digits of other scripts).
    what : str
        The input's name for the message (``"--level"``, ``"the level"``).

    Returns
    -------
    float
        The correctly rounded float of the decimal (as ``float()`` gives it);
        ``-0`` is 0.0.

    Raises
    ------
    NumberError
        For any other text, or a number beyond the largest float (1.8e308).

    Examples
    --------
    >>> parse_decimal("2,5"), parse_decimal("-1e308"), parse_decimal(" .5 ")
    (2.5, -1e+308, 0.5)
    >>> parse_decimal("1_0", "--level")
    Traceback (most recent call last):
    ...
    wetline.core.number_input.NumberError: --level must be a finite decimal number ... not '1_0'
    """
    if not isinstance(text, str):
        raise NumberError(f"{what} must be a decimal number, not {type(text).__name__}")
    body = text.strip(" \t")
    if _DECIMAL.fullmatch(body) is None:
        raise NumberError(f"{what} must be a finite decimal number such as 2.5, -0.5 or 1e3, "
                          f"not {text!r}")
    value = float(body.replace(",", "."))
    if not math.isfinite(value):
        raise NumberError(f"{what} must be a finite decimal number, not {body} "
                          "(larger than any float)")
    return value + 0.0


def number_text(value: float) -> str:
    """Short text of a limit or a value: ``%g`` without the exponent's
    padding.

    Examples
    --------
    >>> number_text(1e-6), number_text(1e7), number_text(0.001), number_text(100000.0)
    ('1e-6', '1e7', '0.001', '100000')
    >>> number_text(-2.5e-324), number_text(float("inf"))
    ('-4.94066e-324', 'inf')
    """
    text = f"{value:g}"
    mantissa, _, exponent = text.partition("e")
    return f"{mantissa}e{int(exponent)}" if exponent else text


def range_text(lo: float, hi: float, unit: str = "") -> str:
    """``"0.001 to 100000 kg/m3"``: the range ``lo .. hi`` in ``unit``.

    Examples
    --------
    >>> range_text(-1e7, 1e7, "m")
    '-1e7 to 1e7 m'
    """
    tail = f" {unit}" if unit else ""
    return f"{number_text(lo)} to {number_text(hi)}{tail}"


_SHOWN_LENGTH = 24


def _float_text(value: float) -> str:
    """repr of a float without the exponent's sign and padding: ``1e308``."""
    if not math.isfinite(value):
        return number_text(value)
    mantissa, _, exponent = repr(value).partition("e")
    return f"{mantissa}e{int(exponent)}" if exponent else mantissa


def shown(value: object) -> str:
    """A value from a file for a one-line message: a number as the file
    wrote it (when it remembers its text), other JSON as JSON, cut to a
    couple of dozen characters.

    Examples
    --------
    >>> shown(10 ** 400)
    '100000000000000000000...'
    >>> shown([2, "3"]), shown(1e308), shown(0.1 + 0.2)
    ('[2, "3"]', '1e308', '0.30000000000000004')
    """
    text = getattr(value, "text", None)
    if not isinstance(text, str):
        if isinstance(value, int) and not isinstance(value, bool) and abs(value) > 10 ** 30:
            text = str(value)[: _SHOWN_LENGTH + 1]  # no need to write out the whole of it
        elif isinstance(value, float):
            text = _float_text(value)
        else:
            try:
                text = json.dumps(value, allow_nan=True)
            except (RecursionError, TypeError, ValueError):
                text = type(value).__name__
    if len(text) > _SHOWN_LENGTH:
        text = text[: _SHOWN_LENGTH - 3] + "..."
    return text
