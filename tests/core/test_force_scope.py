"""The one rule of what force values cover and the unit they are shown in.

Conversion factors: NIST SP 811 (2008) App. B and the 1959 international
yard and pound agreement: 1 ft = 0.3048 m, 1 lbf = 4.4482216152605 N, so
1 lbf/ft = 14.593902937206 N/m.
"""

import pytest

from wetline.core.force_scope import force_scale, force_scope
from wetline.core.section import Section
from wetline.core.units import SI, US

LBF = 4.4482216152605
FT = 0.3048
TANK = Section.build([[0, 0], [2, 0], [2, 3], [0, 3]], parts=["floor", "wall", "open", "wall"])


def test_one_metre_run_is_per_run_in_both_systems():
    si, us = force_scope(TANK, SI), force_scope(TANK, US)
    assert (si.per_run, si.label, si.words) == (True, "kN/m", "per m run")
    assert (us.per_run, us.label, us.words) == (True, "lbf/ft", "per ft run")
    # 14593.9 N on a 1 m run is 1 kN/m x 14.5939 = 1000 lbf/ft.
    assert si.to_display(14593.902937206) == pytest.approx(14.593902937206)
    assert us.to_display(14593.902937206) == pytest.approx(1000.0, rel=1e-12)


def test_one_foot_run_is_per_run_only_in_a_file_in_feet():
    foot = TANK.replace(width=FT)
    us = force_scope(foot, US, "ft")
    assert (us.per_run, us.label, us.words) == (True, "lbf/ft", "per ft run")
    # 100 lbf on a 1 ft run is 100 lbf/ft.
    assert us.to_display(100 * LBF) == pytest.approx(100.0, rel=1e-12)
    si = force_scope(foot, SI, "ft")
    assert (si.label, si.words) == ("kN/m", "per m run")
    assert si.to_display(100 * LBF) == pytest.approx(100 * LBF / FT / 1000.0, rel=1e-12)
    # The same width in a file in metres is just a width.
    plain = force_scope(foot, US, "m")
    assert (plain.per_run, plain.label, plain.words) == (False, "lbf", "for a width of 1 ft")
    assert plain.to_display(100 * LBF) == pytest.approx(100.0, rel=1e-12)


def test_any_other_width_gives_the_force_on_that_width():
    wide = TANK.replace(width=2.5)
    si, us = force_scope(wide, SI), force_scope(wide, US)
    assert (si.per_run, si.label, si.words) == (False, "kN", "for a width of 2.5 m")
    assert (us.label, us.words) == ("lbf", "for a width of 8.202 ft")  # 2.5 / 0.3048
    assert us.to_display(LBF) == pytest.approx(1.0)


def test_axisymmetric_is_the_full_circumference():
    cone = Section.build([[0, 0], [1, 0], [2, 2], [0, 2]], parts=["floor", "wall", "open", "axis"],
                         kind="axisymmetric")
    scope = force_scope(cone, US, "ft")
    assert (scope.per_run, scope.label) == (False, "lbf")
    assert scope.words == "over the full circumference"


def test_text_and_round_off(template_case):
    sol = template_case("open_tank").solve()
    scope = force_scope(sol.section, SI)
    scale = force_scale(sol)
    assert scale >= sol.fluid_weight > 0
    assert scope.text(24516.6) == "24.52 kN/m"
    assert scope.text(3e-13 * scale, scale=scale) == "0 kN/m"
    assert scope.number(-2.0e-3 * scale, scale=scale) != "0"
