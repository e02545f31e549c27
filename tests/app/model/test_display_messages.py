"""Core's refusals give lengths in metres (core is SI); the window shows
them in its display unit, as it shows every other length
(:meth:`wetline.app.model.display.DisplayChoice.message`). A window in feet
said "the fill level 1.56163 m is not above the top of layer 1 'raw sewage'
at 1.85 m" to a user who had typed 5.123456 ft.

The conversions are the display's own (exact factors: 1 ft = 0.3048 m by
definition, common practice); a number followed by "m3", "m2" or "m/s2",
or a unit other than metres, is left as it is.
"""

import pytest

from wetline.app.model.display import DisplayChoice

FT = DisplayChoice("us", "ft")


def test_lengths_and_points_in_metres_are_given_in_the_display_unit():
    text = ("case 'normal': the fill level 1.56163 m is not above the top of layer 1 "
            "'raw sewage' at 1.85 m: every layer but the top one must lie below the free surface")
    assert FT.message(text) == (
        f"case 'normal': the fill level {FT.fmt_length(1.56163)} is not above the top of "
        f"layer 1 'raw sewage' at {FT.fmt_length(1.85)}: every layer but the top one must "
        "lie below the free surface")
    assert FT.fmt_length(1.85) == "6.07 ft"
    point = "cavity vertex 3 at (0.3048, -6.096) m lies outside the structure outline"
    assert FT.message(point) == "cavity vertex 3 at (1, -20) ft lies outside the structure outline"
    assert DisplayChoice("si", "mm").message("a wall 0.25 m thick") == "a wall 250 mm thick"


@pytest.mark.parametrize("text", [
    "a volume of 2.5 m3 and an area of 3 m2",
    "gravity 9.81 m/s2 must be positive",
    "outline has 12 vertices; at most 10000",
    "the mouth is 3 m wide",  # in metres already: the display is in m
])
def test_what_is_not_a_length_in_metres_stays(text):
    si = DisplayChoice("si", "m")
    assert si.message(text) == text
    if "3 m wide" not in text:
        assert FT.message(text) == text


def test_exponents_and_signs_are_read():
    assert FT.message("at 1e-3 m and -3.048E1 m") == (
        f"at {FT.fmt_length(1e-3)} and {FT.fmt_length(-30.48)}")


def test_quoted_text_stays_as_typed():
    """A typed text that does not parse is quoted back as typed ("not '3 m'"
    read "not '9.843 ft'" in feet), and so is a quoted name; a possessive
    apostrophe starts no quote."""
    typed = "x must be a finite decimal number such as 2.5, -0.5 or 1e3, not '3 m'"
    assert FT.message(typed) == typed
    named = "layer 1 'tank 2 m deep' at 1.85 m"
    assert FT.message(named) == f"layer 1 'tank 2 m deep' at {FT.fmt_length(1.85)}"
    possessive = "the structure's wall at 0.3048 m"
    assert FT.message(possessive) == "the structure's wall at 1 ft"
