"""A section file in feet (or mm, in) is refused in its own length unit.

Core computes in metres and writes its refusals in metres; a file in feet
whose groundwater level of 5 ft lies above its 2 ft spill level was refused
with "groundwater level 1.524 m is above the spill level 0.6096 m", numbers
its author never wrote. The reader now gives core's lengths in the file's
unit, as the command line's tables and ``--level`` already read them.
Conversions: 1 ft = 0.3048 m and 1 in = 0.0254 m exactly (1959 yard and
pound agreement, NIST SP 811 appendix B).
"""

import copy

import pytest

from wetline.core.section_file import SectionFileError, design_from_dict
from wetline.core.units import message_in_length_unit

TRAP = {
    "format": "wetline-section", "version": 3, "name": "Grease trap, kitchen drain line",
    "length_unit": "ft", "geometry": {"kind": "plane", "width": 1},
    "fluid": {"name": "raw sewage", "density": 1010.0},
    "outline": [[0, 0], [2.5, 0], [2.5, 2], [0, 2]], "parts": ["floor", "wall", "open", "wall"],
    "fill": {"level": 1.85},
    "structure": {"outline": [[-0.25, -0.3], [2.75, -0.3], [2.75, 2], [-0.25, 2]],
                  "parts": ["base", "outer wall", "top", "outer wall"]},
    "ground": {"level": 2},
    "cases": [{"name": "grease on sewage", "fill": {"level": "spill"},
               "layers": [{"fluid": {"name": "raw sewage", "density": 1010.0}, "top": 1.85},
                          {"fluid": {"name": "fats, oils and grease", "density": 900.0}}],
               "groundwater": {"level": 1}}],
}


def trap(change):
    data = copy.deepcopy(TRAP)
    change(data)
    return data


def test_lengths_in_metres_are_written_in_the_unit():
    text = ("case 'a': the fill level 0.4572 m is not above the top of layer 1 "
            "'raw 2 m deep' at (0.3048, -0.6096) m; 2.5 m3 and 9.81 m/s2 stay")
    assert message_in_length_unit(text, "ft") == (
        "case 'a': the fill level 1.5 ft is not above the top of layer 1 "
        "'raw 2 m deep' at (1, -2) ft; 2.5 m3 and 9.81 m/s2 stay")
    assert message_in_length_unit("a wall 0.0254 m thick", "in") == "a wall 1 in thick"
    assert message_in_length_unit(text, "m") == text


@pytest.mark.parametrize("change, words", [
    (lambda d: d["cases"][0]["groundwater"].update(level=5),
     "groundwater level 5 ft is above the spill level 2 ft"),
    (lambda d: d["cases"][0]["layers"][0].update(top=2.5),
     "the spill level 2 ft is not above the top of layer 1 'raw sewage' at 2.5 ft"),
    (lambda d: d["cases"][0].update(fill={"level": 1.2}),
     "the fill level 1.2 ft is not above the top of layer 1 'raw sewage' at 1.85 ft"),
])
def test_a_file_in_feet_is_refused_in_feet(change, words):
    with pytest.raises(SectionFileError) as err:
        design_from_dict(trap(change))
    assert words in str(err.value)
    assert " m " not in str(err.value) and not str(err.value).endswith(" m")
