"""Uplift check: upward loads, resistance, factors, worst level."""

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from wetline.core.case import Case
from wetline.core.level_table import part_down_at
from wetline.core.liquids import custom_liquid
from wetline.core.section import Section
from wetline.core.section_file import SectionFileError, dumps_case, loads_case
from wetline.core.uplift import DEFAULT_REQUIRED_FACTOR, PartResistance, uplift_check, worst_uplift

G0 = 9.80665


def lid_under_standpipe():
    # Closed box 2 m wide, 1 m high; roof is the "lid".
    return Section.build([[0, 0], [2, 0], [2, 1], [0, 1]],
                         parts=["floor", "wall", "lid", "wall"], name="box")


def test_lid_under_standpipe_uplift_and_factor():
    # Lid 2 m wide per metre, water 1.5 m above its underside: 29.42 kN/m up
    # (REFERENCES.md, "Lid under a standpipe", common practice).
    s = lid_under_standpipe()
    case = Case(section=s, liquid=custom_liquid(1000.0), fill_level=2.5,
                resistances={"lid": PartResistance(self_weight=20000.0, holding_down=5000.0)})
    (r,) = case.uplift()
    assert r.uplift == pytest.approx(1000 * G0 * 1.5 * 2.0, rel=1e-12)
    assert r.uplift == pytest.approx(29.42e3, abs=5)
    assert r.resistance == 25000.0
    assert r.factor == pytest.approx(25000.0 / r.uplift, rel=1e-12)
    # Closed section: the current level is the top of the fill range.
    assert r.worst_level == pytest.approx(2.5)
    assert r.worst_factor == pytest.approx(r.factor)
    assert not r.ok and r.verdict == "NOT OK"


def test_default_required_factor_is_one_over_0_9():
    # EN 1997-1 UPL, Annex A Table A.15 recommended gamma_G,stb = 0.9,
    # gamma_G,dst = 1.0 -> G >= U / 0.9 (REFERENCES.md, uplift).
    assert DEFAULT_REQUIRED_FACTOR == pytest.approx(1 / 0.9, rel=1e-15)


def test_plane_resistance_is_per_metre_times_width():
    s = lid_under_standpipe().replace(width=3.0)
    case = Case(section=s, liquid=custom_liquid(1000.0), fill_level=1.5,
                resistances={"lid": PartResistance(self_weight=1000.0)})
    (r,) = case.uplift()
    assert r.resistance == 3000.0
    assert r.uplift == pytest.approx(1000 * G0 * 0.5 * 2.0 * 3.0, rel=1e-12)


def test_part_pressed_down_has_infinite_factor():
    s = lid_under_standpipe()
    case = Case(section=s, liquid=custom_liquid(1000.0), fill_level=0.5,
                resistances={"floor": PartResistance(self_weight=10.0)})
    (r,) = case.uplift()
    assert r.uplift == 0.0 and math.isinf(r.factor) and r.ok


def test_open_sump_worst_level_is_the_spill_level():
    s = Section.build([[0, 0], [2.4, 0], [2.4, 1.6], [1.9, 1.6], [1.9, 2.8], [0, 2.8]],
                      parts=["floor", "wall", "lid", "wall", "open", "wall"])
    case = Case(section=s, liquid=custom_liquid(1000.0), fill_level=2.0,
                resistances={"lid": PartResistance(self_weight=3000.0)})
    (r,) = case.uplift()
    assert r.worst_level == pytest.approx(2.8)
    assert r.worst_uplift == pytest.approx(1000 * G0 * 1.2 * 0.5, rel=1e-12)
    assert r.uplift == pytest.approx(1000 * G0 * 0.4 * 0.5, rel=1e-12)
    assert r.ok_now and not r.ok


def test_worst_uplift_finds_an_interior_maximum():
    # A "baffle" bracket on the right wall: its underside (1.5 m wide, z = 1)
    # is pushed up, its sloping top (2 m wide, z 1.5 -> 2) pushed down once
    # wetted. Per metre, up/(rho g) = 1.5 (h - 1) - 2 (h - 1.5)^2 on
    # 1.5 <= h <= 2, greatest at h = 1.875 with 1.03125 m2, then falling
    # (closed-form, derived here from p = rho g (h - z); common practice).
    s = Section.build([[0, 0], [4, 0], [4, 1], [2.5, 1], [2, 1.5], [4, 2], [4, 3], [0, 3]],
                      parts=["floor", "wall", "baffle", "wall", "baffle", "wall", "open",
                             "wall"])
    level, up = worst_uplift(s, "baffle", 1000.0, z_lo=s.z_min, z_hi=s.top_level)
    assert level == pytest.approx(1.875, rel=1e-12)
    assert up == pytest.approx(1000 * G0 * 1.03125, rel=1e-12)
    dense = np.linspace(s.z_min, s.top_level, 100_001)
    brute = -part_down_at(s, "baffle", dense, 1000.0)
    assert up >= brute.max() * (1 - 1e-12)


@settings(max_examples=60, deadline=None)
@given(st.lists(st.floats(0.3, 2.0), min_size=5, max_size=14),
       st.integers(0, 100), st.booleans())
def test_worst_uplift_is_at_least_every_sampled_level(radii, seed, axi):
    n = len(radii)
    ang = np.linspace(0, 2 * np.pi, n, endpoint=False)
    r = np.asarray(radii)
    pts = np.c_[3.0 + r * np.cos(ang), 3.0 + r * np.sin(ang)]
    rng = np.random.default_rng(seed)
    parts = [str(p) for p in rng.choice(["wall", "lid", "floor"], n)]
    s = Section.build(pts, parts=parts, kind="axisymmetric" if axi else "plane")
    for part in s.loaded_part_names:
        level, up = worst_uplift(s, part, 1000.0, z_lo=s.z_min, z_hi=s.z_max)
        dense = np.linspace(s.z_min, s.z_max, 2001)
        brute = np.maximum(-part_down_at(s, part, dense, 1000.0), 0.0)
        scale = 1000 * G0 * (s.z_max - s.z_min) * (s.area if not axi else s.area * 6)
        assert up >= brute.max() - 1e-9 * scale
        assert s.z_min <= level <= s.z_max


def test_bad_resistance_values_are_refused():
    with pytest.raises(ValueError, match="self weight must be >= 0"):
        PartResistance(self_weight=-1.0)
    with pytest.raises(ValueError, match="holding down must be a number"):
        PartResistance(holding_down=float("nan"))
    s = lid_under_standpipe()
    with pytest.raises(ValueError, match="required factor must be positive"):
        uplift_check(Case.default(s), {}, required_factor=0.0)


def test_version_2_round_trip_and_migration():
    s = lid_under_standpipe()
    case = Case(section=s, liquid=custom_liquid(1000.0), fill_level=2.5,
                resistances={"lid": PartResistance(1.5, 2.5)}, required_uplift_factor=1.25)
    text = dumps_case(case)
    assert '"version": 2' in text
    assert loads_case(text) == case
    plain = Case(section=s, liquid=custom_liquid(1000.0), fill_level=2.5)
    assert '"version": 1' in dumps_case(plain)
    assert loads_case(dumps_case(plain)) == plain


def test_version_2_keys_in_a_version_1_file_are_refused():
    text = dumps_case(Case(section=lid_under_standpipe(), liquid=custom_liquid(1000.0),
                           fill_level=2.5))
    bad = text.replace('"fill": {"level": 2.5}',
                       '"fill": {"level": 2.5}, "uplift": {"required_factor": 1.2}')
    with pytest.raises(SectionFileError, match="'uplift' needs section file version 2"):
        loads_case(bad)


@pytest.mark.parametrize("uplift, words", [
    ('{"parts": {"lidd": {"self_weight": 1}}}', "names 'lidd'"),
    ('{"parts": {"lid": {"self_wieght": 1}}}', "unknown key 'self_wieght'"),
    ('{"parts": {"lid": {"self_weight": -1}}}', "must be >= 0"),
    ('{"required_factor": 0}', "must be positive"),
    ('{"required_factor": "1.2"}', "must be a number"),
])
def test_version_2_refusals_name_the_key(uplift, words):
    text = dumps_case(Case(section=lid_under_standpipe(), liquid=custom_liquid(1000.0),
                           fill_level=2.5))
    bad = text.replace('"version": 1', '"version": 2').replace(
        '"fill": {"level": 2.5}', '"fill": {"level": 2.5}, "uplift": ' + uplift)
    with pytest.raises(SectionFileError, match=words):
        loads_case(bad)
