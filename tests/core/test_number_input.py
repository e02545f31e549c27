"""Typed decimal numbers (core.number_input.parse_decimal) and range texts.

The reference for the value of a decimal text is Python's decimal module:
float(Decimal(text)) is the correctly rounded binary64 value (IEEE 754
round-to-nearest), which parse_decimal must give for every accepted text.
"""

import math
from decimal import Decimal

import pytest
from hypothesis import given
from hypothesis import strategies as st

from wetline.core.number_input import NumberError, number_text, parse_decimal, range_text


@pytest.mark.parametrize("text, value", [
    ("2.5", 2.5), ("-0.5", -0.5), ("+3", 3.0), ("2,5", 2.5), ("-0,25", -0.25), (".5", 0.5),
    ("5.", 5.0), (",5", 0.5), ("1e3", 1000.0), ("1E3", 1000.0), ("-2.5e-3", -0.0025),
    ("1e+3", 1000.0), ("-1e308", -1e308), ("  7 ", 7.0), ("\t7", 7.0), ("0", 0.0),
    ("007", 7.0), ("5e-324", 5e-324),
])
def test_what_a_person_types_is_read(text, value):
    assert parse_decimal(text) == value


def test_minus_zero_is_zero():
    assert math.copysign(1.0, parse_decimal("-0")) == 1.0


@pytest.mark.parametrize("text", [
    "1_0", "1_000.5", "\u0661\u0662", "\uff11\uff12", "\u0967", "inf", "-inf", "Infinity",
    "nan", "NaN", "1,000.5", "1.000,5", "1..5", "1,,5", "1.5.2", "", " ", ".", ",", "-",
    "e5", "1e", "1e+", "1e5.5", "0x10", "1 000", "1\u00a0000", "2.5m", "--1", "+-1", "1/2",
    "\u22121", "1e3\n", "½",
])
def test_anything_else_is_refused_with_the_input_named(text):
    with pytest.raises(NumberError) as info:
        parse_decimal(text, "--level")
    assert str(info.value).startswith("--level must be a finite decimal number")
    assert "\n" not in str(info.value)


@pytest.mark.parametrize("text", ["1e400", "-1e309", "9" * 400])
def test_numbers_beyond_the_largest_float_are_refused(text):
    with pytest.raises(NumberError, match="larger than any float"):
        parse_decimal(text, "the level")


def test_a_number_error_is_a_value_error():
    assert issubclass(NumberError, ValueError)
    with pytest.raises(NumberError, match="must be a decimal number, not float"):
        parse_decimal(2.5)


@given(st.floats(allow_nan=False, allow_infinity=False))
def test_every_float_reads_back_from_its_repr(x):
    assert parse_decimal(repr(x)) == x + 0.0
    assert parse_decimal(repr(x).replace(".", ",")) == x + 0.0


@given(st.from_regex(r"\A[+-]?(?:[0-9]{1,25}(?:\.[0-9]{0,25})?|\.[0-9]{1,25})"
                     r"(?:[eE][+-]?[0-9]{1,3})?\Z"))
def test_values_are_correctly_rounded_as_decimal_gives_them(text):
    exact = Decimal(text)
    reference = float(exact)
    if math.isinf(reference):
        with pytest.raises(NumberError):
            parse_decimal(text)
    else:
        assert parse_decimal(text) == reference + 0.0


def test_range_texts():
    assert range_text(1e-3, 1e5, "kg/m3") == "0.001 to 100000 kg/m3"
    assert range_text(-1e7, 1e7, "m") == "-1e7 to 1e7 m"
    assert number_text(1e15) == "1e15" and number_text(1e-100) == "1e-100"
