"""Load cases, the design that holds them, the envelope and the records.

The envelope is checked against a brute-force maximum over cases solved
one by one here, straight from the solver (not through the design), on
random case sets (hypothesis); the single values against hand
calculations from first principles.
"""

import json
import math

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from wetline.core.case import Case
from wetline.core.fill import level_for_volume
from wetline.core.hydrostatics import solve
from wetline.core.liquids import custom_liquid, fresh_water
from wetline.core.load_cases import (
    EMPTY,
    MAX_LOAD_FACTOR,
    SPILL,
    Design,
    LoadCase,
    LoadCaseError,
    case_record,
    cases_record,
    envelope,
    envelope_record,
)
from wetline.core.section import Section
from wetline.core.structure import Ground, Groundwater, Structure, StructureError, exterior_loads
from wetline.core.uplift import DEFAULT_REQUIRED_FACTOR

G0 = 9.80665
RW = 1000.0 * G0


def wet_well(name="Wet well, pumping station 3"):
    cav = Section.build([[0, 0], [3, 0], [3, 2.5], [2.2, 2.5], [2.2, 4], [0, 4]],
                        parts=["floor", "wall", "roof", "riser", "open", "wall"], name=name)
    s = Structure.build([[-0.3, -0.4], [3.3, -0.4], [3.3, 2.8], [2.5, 2.8], [2.5, 4], [-0.3, 4]],
                        ["base", "outer wall", "outer roof", "outer riser", "top", "outer wall"],
                        cavity=cav)
    return cav, s


def spec_design():
    """The section format v3 example, without its layers and trapped air."""
    cav, s = wet_well()
    cases = (LoadCase("normal top water"),
             LoadCase("overflow", fill_level=SPILL),
             LoadCase("empty, flood groundwater", fill_level=EMPTY,
                      groundwater=Groundwater(4.0)),
             LoadCase("factored", load_factor=1.2))
    return Design(Case(cav, custom_liquid(1000.0, "water"), fill_level=3.2), s, Ground(4.0),
                  cases)


# ------------------------------------------------------------- load cases
def test_load_case_refusals():
    with pytest.raises(LoadCaseError, match="a load case needs a name"):
        LoadCase("  ")
    with pytest.raises(LoadCaseError, match="a load case needs a name"):
        LoadCase(None)
    with pytest.raises(LoadCaseError, match=r"case 'x': fill level must be a number, 'spill' "
                                            r"or 'empty', not 'full'"):
        LoadCase("x", fill_level="full")
    with pytest.raises(LoadCaseError, match="case 'x': a fill gives one of level and volume"):
        LoadCase("x", fill_level=1.0, fill_volume=2.0)
    with pytest.raises(LoadCaseError, match=r"case 'x': fill volume must be >= 0, not -1"):
        LoadCase("x", fill_volume=-1)
    with pytest.raises(LoadCaseError, match=r"case 'x': fill level must be a finite number"):
        LoadCase("x", fill_level=math.nan)
    with pytest.raises(LoadCaseError, match=r"case 'x': fill level 2e\+07 m lies beyond"):
        LoadCase("x", fill_level=2e7)
    with pytest.raises(LoadCaseError, match=r"case 'x': gravity must be between 0\.001 and "
                                            r"1000 m/s2, not 0"):
        LoadCase("x", gravity=0.0)
    with pytest.raises(LoadCaseError, match=r"case 'x': load factor must be > 0 and at most "
                                            r"100, not 0"):
        LoadCase("x", load_factor=0)
    with pytest.raises(LoadCaseError, match=r"load factor must be > 0 and at most 100, not 101"):
        LoadCase("x", load_factor=MAX_LOAD_FACTOR + 1)
    with pytest.raises(LoadCaseError, match=r"case 'x': load factor must be a number, not bool"):
        LoadCase("x", load_factor=True)
    with pytest.raises(LoadCaseError, match="case 'x': liquid must be a Liquid"):
        LoadCase("x", liquid=1000.0)
    with pytest.raises(LoadCaseError, match="case 'x': groundwater must be a Groundwater"):
        LoadCase("x", groundwater=3.0)
    e = pytest.raises(LoadCaseError, LoadCase, "named", load_factor=-1).value
    assert e.case == "named"


def test_load_case_values():
    c = LoadCase("a", fill_level=2, gravity=9, load_factor=1)
    assert (c.fill_level, c.gravity, c.load_factor) == (2.0, 9.0, 1.0)
    assert isinstance(c.fill_level, float) and not c.is_plain
    assert LoadCase("b").is_plain


# ------------------------------------------------------------------ design
def test_without_cases_one_case_named_after_the_file():
    cav, s = wet_well()
    d = Design(Case(cav, fresh_water(10.0), fill_level=3.2))
    assert d.names == ("Wet well, pumping station 3",)
    solved = d.solve()
    ref = solve(cav, 3.2, fresh_water(10.0).density)
    assert solved.solution.floor_force == ref.floor_force and solved.structure is None
    unnamed = Section.build(cav.outline, parts=cav.parts)
    assert Design(Case(unnamed, fresh_water(10.0), fill_level=1.0)).names == ("case 1",)


def test_overrides_start_from_the_file_level():
    cav, s = wet_well()
    oil = custom_liquid(850.0, "diesel")
    base = Case(cav, fresh_water(10.0), fill_level=3.2)
    d = Design(base, s, cases=(
        LoadCase("file"), LoadCase("oil", liquid=oil), LoadCase("moon", gravity=1.62),
        LoadCase("by volume", fill_volume=6.0), LoadCase("at 1 m", fill_level=1.0),
        LoadCase("over the top", fill_level=9.0)))
    r = {n: d.resolve(n) for n in d.names}
    assert r["file"].case.liquid == base.liquid and r["file"].level == 3.2
    assert r["oil"].case.liquid is oil and r["oil"].level == 3.2
    assert r["moon"].case.gravity == 1.62 and r["moon"].case.liquid == base.liquid
    assert r["by volume"].level == level_for_volume(cav, 6.0)
    assert r["at 1 m"].level == 1.0
    # a level above the spill level is capped with a warning, per case
    sol = d.solve("over the top").solution
    assert sol.level == 4.0 and any("capped" in w for w in sol.warnings)
    assert d.solve("moon").structure.gravity == 1.62
    assert d.resolve().name == "file" and d.index("oil") == 1


def test_spill_and_empty():
    cav, s = wet_well()
    d = Design(Case(cav, fresh_water(10.0), fill_level=3.2), s,
               cases=(LoadCase("overflow", fill_level=SPILL), LoadCase("empty", fill_level=EMPTY),
                      LoadCase("no volume", fill_volume=0.0)))
    over = d.solve("overflow")
    assert over.solution.level == 4.0 and over.resolved.fill == SPILL
    empty = d.solve("empty")
    assert empty.solution.volume == 0.0 and empty.solution.warnings == ()
    assert empty.resolved.fill == EMPTY
    # a fill of zero volume did not say "empty": it keeps the solver's warning
    assert any("empty" in w for w in d.solve("no volume").solution.warnings)


def test_design_refusals():
    cav, s = wet_well()
    base = Case(cav, fresh_water(10.0), fill_level=3.2)
    with pytest.raises(LoadCaseError, match="two load cases are named 'a'; names must be unique"):
        Design(base, cases=(LoadCase("a"), LoadCase("a", fill_level=1.0)))
    closed = Section.build([[0, 0], [2, 0], [2, 2], [0, 2]], name="closed")
    with pytest.raises(LoadCaseError, match="case 'top': fill level 'spill' needs an open section"):
        Design(Case(closed, fresh_water(), fill_level=1.0),
               cases=(LoadCase("top", fill_level=SPILL),))
    with pytest.raises(LoadCaseError, match=r"case 'much': fill volume 100 m3 is more than the "
                                            r"section holds"):
        Design(base, cases=(LoadCase("much", fill_volume=100.0),))
    with pytest.raises(LoadCaseError, match="case 'wet': groundwater needs a structure"):
        Design(base, cases=(LoadCase("wet", groundwater=Groundwater(1.0)),))
    with pytest.raises(LoadCaseError, match=r"case 'flood': groundwater level 4\.5 m is above the "
                                            r"spill level 4 m of the open section"):
        Design(base, s, cases=(LoadCase("flood", groundwater=Groundwater(4.5)),))
    with pytest.raises(LoadCaseError, match="ground needs a structure"):
        Design(base, ground=Ground(4.0))
    with pytest.raises(LoadCaseError, match=r"case 'w': saturated soil unit weight 9000 N/m3 is "
                                            r"less than the groundwater's 9806\.65 N/m3"):
        Design(base, s, Ground(4.0, unit_weight_saturated=9000.0),
               cases=(LoadCase("w", groundwater=Groundwater(1.0)),))
    # a structure that does not hold this cavity
    small = Section.build([[0, 0], [3.5, 0], [3.5, 4], [0, 4]],
                          parts=["floor", "wall", "open", "wall"])
    with pytest.raises(StructureError, match="cavity vertex 1 at"):
        Design(Case(small, fresh_water(), fill_level=1.0), s)
    d = Design(base, s, cases=(LoadCase("a"),))
    with pytest.raises(LoadCaseError, match=r"no load case named 'b' \(cases: 'a'\)"):
        d.solve("b")
    with pytest.raises(TypeError, match="cases must be LoadCase values"):
        Design(base, cases=("a",))
    with pytest.raises(TypeError, match="case must be a Case"):
        Design(cav)


def test_copies_are_checked_again():
    d = spec_design()
    assert d.with_ground(None).ground is None
    dry = d.with_cases([LoadCase("only")])
    assert dry.names == ("only",)
    assert dry.with_structure(None).structure is None and dry.with_structure(None).ground is None
    with pytest.raises(LoadCaseError, match="case 'empty, flood groundwater': groundwater "
                                            "needs a structure"):
        d.with_structure(None)
    assert d.with_case(d.case.with_level(1.0)).resolve().level == 1.0


# -------------------------------------------------------------- envelope
def test_envelope_of_the_spec_example_by_hand():
    # By hand (1000 kg/m3, g0, per metre):
    #   floor 3 m wide: overflow at the spill level 4.0 -> 9,806.65 x 4 x 3
    #     = 117,679.8 N down; factored 3.2 m x 1.2 -> 112,972.6 N (less)
    #   roof 0.8 m wide at 2.5: overflow 1.5 m of head up -> 11,767.98 N up;
    #     factored 0.7 m x 1.2 -> 6,590.07 N
    #   flotation only in "empty, flood groundwater": U = 9,806.65 x
    #     (3.6 x 3.2 + 2.8 x 1.2 = 14.88) = 145,922.95 N; R = 25,000 x
    #     (14.88 - 10.8 = 4.08) + soil on the outer roof, submerged,
    #     10,193.35 x 1.2 x 0.8: 102,000 + 9,785.62 = 111,785.62 N; 0.766
    #   base: 9,806.65 x 4.4 = 43,149.26 Pa in that case
    env = envelope(spec_design().solve_all())
    floor = env.parts["floor"]
    assert floor.max_down == pytest.approx(117679.8, rel=1e-13)
    assert floor.max_down_case == "overflow"
    assert (floor.max_up, floor.max_up_case) == (0.0, None)
    roof = env.parts["roof"]
    assert roof.max_up == pytest.approx(11767.98, rel=1e-12) and roof.max_up_case == "overflow"
    assert (roof.max_down, roof.max_down_case) == (0.0, None)
    assert env.parts["wall"] == type(floor)(0.0, None, 0.0, None)
    assert set(env.parts) == {"floor", "wall", "roof", "riser"}
    assert env.edge(0) == (pytest.approx(RW * 4.0, rel=1e-13), "overflow")
    assert env.edge(4) == (0.0, None)  # the open edge is never wetted
    f = env.flotation
    assert f.case == "empty, flood groundwater"
    u = RW * (3.6 * 3.2 + 2.8 * 1.2)
    r = 25000.0 * (3.6 * 4.4 - 0.8 * 1.2 - 3.0 * 4.0 + 0.8 * 1.5) + (20000.0 - RW) * 1.2 * 0.8
    assert f.factor == pytest.approx(r / u, rel=1e-12)
    assert round(f.factor, 3) == 0.766
    assert f.required == DEFAULT_REQUIRED_FACTOR and not f.ok
    assert env.base.case == "empty, flood groundwater" and env.base.index == 0
    assert env.base.net_upward_pressure == pytest.approx(RW * 4.4, rel=1e-13)


def test_load_factor_scales_design_values_and_flotation():
    cav, s = wet_well()
    base = Case(cav, custom_liquid(1000.0), fill_level=3.0)
    lo = LoadCase("characteristic", fill_level=EMPTY, groundwater=Groundwater(3.0))
    hi = LoadCase("factored", fill_level=EMPTY, groundwater=Groundwater(3.0), load_factor=1.5)
    solved = Design(base, s, cases=(lo, hi)).solve_all()
    env = envelope(solved)
    f = solved[0].structure.flotation
    assert env.flotation.case == "factored"
    assert env.flotation.factor == pytest.approx(f.resistance / (1.5 * f.uplift), rel=1e-15)
    assert env.base.case == "factored"
    assert env.base.net_upward_pressure == pytest.approx(1.5 * RW * 3.4, rel=1e-13)


def test_envelope_without_uplift_or_structure():
    cav, s = wet_well()
    base = Case(cav, custom_liquid(1000.0), fill_level=3.0)
    env = envelope(Design(base, s, cases=(LoadCase("dry"),)).solve_all())
    assert (env.flotation.factor, env.flotation.case, env.flotation.ok) == (None, None, True)
    # the liquid presses the base down: never lifted
    assert (env.base.net_upward_pressure, env.base.case, env.base.index) == (0.0, None, None)
    rec = envelope_record(env)
    assert rec["flotation"] == {"factor": None, "case": None,
                                "required": DEFAULT_REQUIRED_FACTOR, "ok": True}
    assert rec["base"] == {"index": None, "net_upward_pressure": 0.0, "case": None,
                           "point": None}
    bare = envelope(Design(base).solve_all())
    assert bare.flotation is None and bare.base is None
    assert envelope_record(bare)["flotation"] is None
    with pytest.raises(ValueError, match="at least one solved case"):
        envelope([])


def _case_strategy(i):
    level = st.one_of(st.floats(-0.5, 5.0), st.sampled_from([SPILL, EMPTY]), st.none())
    return st.builds(
        lambda lvl, vol, rho, g, lf, gw: LoadCase(
            f"case {i}", liquid=None if rho is None else custom_liquid(rho),
            fill_level=None if vol is not None else lvl, fill_volume=vol, gravity=g,
            groundwater=None if gw is None else Groundwater(gw), load_factor=lf),
        level, st.one_of(st.none(), st.floats(0.0, 10.0)),
        st.one_of(st.none(), st.floats(700.0, 1600.0)),
        st.one_of(st.none(), st.floats(9.0, 10.0)),
        st.sampled_from([1.0, 1.0, 0.9, 1.2, 1.35, 1.5]),
        st.one_of(st.none(), st.floats(-1.0, 4.0)))


@st.composite
def case_sets(draw):
    n = draw(st.integers(1, 7))
    return tuple(draw(_case_strategy(i)) for i in range(n))


@settings(max_examples=80, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(case_sets(), st.booleans())
def test_envelope_is_the_maximum_over_the_cases(cases, with_ground):
    # Each case solved here on its own, straight from the solvers; the
    # envelope must hold each maximum and name the first case reaching it.
    cav, s = wet_well()
    base = Case(cav, custom_liquid(1000.0), fill_level=3.2)
    ground = Ground(3.0) if with_ground else None
    design = Design(base, s, ground, cases)
    env = envelope(design.solve_all())
    rows = []
    for c in cases:
        g = c.gravity or G0
        rho = 1000.0 if c.liquid is None else c.liquid.density
        if c.fill_level == SPILL:
            level = cav.spill_level
        elif c.fill_level == EMPTY:
            level = cav.z_min
        elif c.fill_volume is not None:
            level = level_for_volume(cav, c.fill_volume)
        elif c.fill_level is not None:
            level = c.fill_level
        else:
            level = 3.2
        sol = solve(cav, level, rho, g)
        loads = exterior_loads(s, cav, groundwater=c.groundwater, ground=ground,
                               liquid_solution=sol)
        rows.append((c.name, c.load_factor, sol, loads))

    def first_max(values):
        best, who = None, None
        for name, v in values:
            if best is None or v > best:
                best, who = v, name
        return best, who

    for part in cav.loaded_part_names:
        down, who = first_max([(n, lf * sol.parts[part].down) for n, lf, sol, _ in rows])
        pe = env.parts[part]
        assert pe.max_down == (down if down > 0 else 0.0)
        assert pe.max_down_case == (who if down > 0 else None)
        up, who = first_max([(n, -lf * sol.parts[part].down) for n, lf, sol, _ in rows])
        assert pe.max_up == (up if up > 0 else 0.0)
        assert pe.max_up_case == (who if up > 0 else None)
    for i in range(cav.n_edges):
        p, who = first_max([(n, lf * max(sol.p_start[i], sol.p_end[i]))
                            for n, lf, sol, _ in rows])
        assert env.edge(i) == (p, who if p > 0 else None)
    lifted = [(n, lds.flotation.resistance / (lf * lds.flotation.uplift))
              for n, lf, _, lds in rows if lds.flotation.uplift > 0]
    if lifted:
        low, who = first_max([(n, -v) for n, v in lifted])
        assert env.flotation.factor == -low and env.flotation.case == who
    else:
        assert env.flotation.factor is None and env.flotation.case is None
    net, who = first_max([(n, lf * max(b.net for b in lds.base)) for n, lf, _, lds in rows])
    assert env.base.net_upward_pressure == (net if net > 0 else 0.0)
    assert env.base.case == (who if net > 0 else None)
    json.dumps(envelope_record(env), allow_nan=False)


# --------------------------------------------------------------- records
def test_cases_record_shape():
    d = spec_design()
    rec = cases_record(d)
    text = json.dumps(rec, allow_nan=False)
    assert rec["format"] == "wetline-cases" and rec["version"] == 1
    assert [c["case"] for c in rec["cases"]] == list(d.names)
    first = rec["cases"][0]
    assert first["format"] == "wetline-results" and first["load_factor"] == 1.0
    assert first["structure"]["groundwater_level"] is None
    flood = rec["cases"][2]["structure"]
    assert flood["groundwater_level"] == 4.0 and flood["flotation"]["ok"] is False
    assert rec["cases"][3]["load_factor"] == 1.2
    env = rec["envelope"]
    assert set(env) == {"parts", "edges", "flotation", "base"}
    assert env["parts"]["floor"] == {"max_down": pytest.approx(117679.8, rel=1e-13),
                                     "max_down_case": "overflow", "max_up": 0.0,
                                     "max_up_case": None}
    assert env["edges"][0] == {"index": 0, "max_pressure": pytest.approx(RW * 4, rel=1e-13),
                               "case": "overflow"}
    assert set(env["flotation"]) >= {"factor", "case"}
    assert "NaN" not in text and "Infinity" not in text


def test_case_record_without_structure_has_null_structure():
    cav, _ = wet_well()
    d = Design(Case(cav, fresh_water(), fill_level=1.0))
    rec = case_record(d.solve())
    assert rec["structure"] is None and rec["case"] == cav.name


def test_case_record_carries_the_structure_warnings():
    cav = Section.build([[0.3, 0.4], [2.7, 0.4], [2.7, 3.7], [0.3, 3.7]],
                        parts=["floor", "wall", "roof", "wall"], name="overhung")
    s = Structure.build([[0, 0], [3.5, 0], [3.5, 0.4], [3, 0.4], [3, 3.5], [3.6, 3.5], [3.6, 4],
                         [0, 4]], cavity=cav)
    d = Design(Case(cav, fresh_water(), fill_level=1.0), s, Ground(5.0))
    rec = case_record(d.solve())
    assert any("overstated" in w for w in rec["warnings"])
    assert d.solve().warnings[-1] == rec["warnings"][-1]


def test_solve_all_gives_each_case_its_loads():
    d = spec_design()
    solved = d.solve_all()
    assert [s.name for s in solved] == list(d.names)
    assert [s.load_factor for s in solved] == [1.0, 1.0, 1.0, 1.2]
    flood = solved[2].structure
    assert flood.groundwater_level == 4.0 and solved[0].structure.groundwater_level is None
    assert np.array_equal(d.solve("overflow").solution.fz, solved[1].solution.fz)


def test_solve_all_shares_equal_situations_and_matches_single_solves():
    cav, s = wet_well()
    gw = Groundwater(3.0)
    d = Design(Case(cav, custom_liquid(1000.0), fill_level=3.2), s, Ground(4.0), cases=(
        LoadCase("empty a", fill_level=EMPTY, groundwater=gw),
        LoadCase("empty b", fill_level=EMPTY, groundwater=Groundwater(3.0), load_factor=1.5),
        LoadCase("full", fill_level=SPILL, groundwater=gw),
        LoadCase("heavy", liquid=custom_liquid(1200.0), groundwater=Groundwater(2.0))))
    a, b, full, heavy = d.solve_all()
    assert a.solution is b.solution and a.solution is not full.solution
    assert a.structure.fz is b.structure.fz and a.structure.fz is full.structure.fz
    assert heavy.structure.fz is not a.structure.fz
    for solved in (a, b, full, heavy):
        alone = d.solve(solved.name)
        assert np.array_equal(alone.solution.fz, solved.solution.fz)
        assert np.array_equal(alone.structure.fz, solved.structure.fz)
        assert alone.structure.flotation == solved.structure.flotation
        assert alone.structure.base_net_max == solved.structure.base_net_max
    # the net on the base still sees each case's own liquid
    assert full.structure.base_net_max.net < a.structure.base_net_max.net


def test_design_type_and_envelope_refusals():
    cav, s = wet_well()
    base = Case(cav, fresh_water(), fill_level=1.0)
    with pytest.raises(TypeError, match="structure must be a Structure"):
        Design(base, structure=cav)
    with pytest.raises(TypeError, match="ground must be a Ground"):
        Design(base, s, ground=4.0)
    other = Design(Case(Section.build([[0, 0], [1, 0], [1, 1]]), fresh_water(), fill_level=0.5))
    with pytest.raises(ValueError, match="the envelope's cases must be of one section"):
        envelope(Design(base).solve_all() + other.solve_all())
    # same number of edges, another section
    moved = Section.build(cav.outline + [0.0, 1.0], parts=cav.parts, name=cav.name)
    with pytest.raises(ValueError, match="the envelope's cases must be of one section"):
        envelope(Design(base).solve_all()
                 + Design(Case(moved, fresh_water(), fill_level=1.5)).solve_all())
