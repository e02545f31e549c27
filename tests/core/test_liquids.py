"""Tests of core.liquids: densities of water, seawater and other liquids."""

import json
import math
import subprocess
import sys

import gsw
import iapws
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from wetline.core.liquids import (
    FRESH_WATER,
    LISTED_LIQUIDS,
    PRESETS,
    SEAWATER,
    WATER_REFERENCE_DENSITY,
    Liquid,
    LiquidError,
    custom_liquid,
    fresh_water,
    liquid_from_spec,
    liquid_from_specific_gravity,
    liquid_to_spec,
    listed_liquid,
    seawater,
)

# --- the reference libraries themselves --------------------------------


def test_iapws95_verification_point():
    # IAPWS-95 Release, Table 7: T = 300 K, rho = 996.556 kg/m3 -> p = 0.0992418352 MPa.
    assert iapws.IAPWS95(T=300.0, rho=996.556).P == pytest.approx(0.0992418352, abs=1e-8)


def test_iapws08_standard_seawater():
    # IAPWS R13-08 check table: standard seawater, 0 C, 101325 Pa, S = 0.03516504 kg/kg.
    rho = iapws.SeaWater(T=273.15, P=0.101325, S=0.03516504).rho
    assert rho == pytest.approx(1028.10720, abs=1e-5)


def test_teos10_documented_check():
    # gsw documentation: gsw.rho(34.7118, 28.8099, 10) = 1021.8399 kg/m3.
    assert gsw.rho(34.7118, 28.8099, 10) == pytest.approx(1021.8399, abs=1e-3)


# --- fresh water -------------------------------------------------------


@pytest.mark.parametrize(
    "temperature, density",
    # IAPWS-95 at 1 atm (REFERENCES.md; the CRC Handbook table agrees, from memory).
    [(4.0, 999.975), (20.0, 998.207), (60.0, 983.196)],
)
def test_fresh_water_iapws95(temperature, density):
    water = fresh_water(temperature)
    assert water.density == pytest.approx(density, abs=0.01)
    assert type(water.density) is float
    assert water.preset == FRESH_WATER and water.name == "fresh water"
    assert water.temperature == temperature and water.salinity is None
    assert "IAPWS-95" in water.source


def test_fresh_water_default_is_20_c():
    assert fresh_water() == fresh_water(20.0)
    assert fresh_water(20) == fresh_water(20.0)


def test_fresh_water_at_100_c_is_saturated_liquid():
    # IAPWS-95: saturated liquid IAPWS95(T=373.15, x=0) = 958.349 kg/m3.
    water = fresh_water(100.0)
    assert water.density == pytest.approx(958.349, abs=0.02)
    assert "saturated liquid" in water.source


def test_fresh_water_density_maximum():
    # Tanaka et al. 2001, Metrologia 38:301: maximum 999.9749 kg/m3 near 3.98 C (from memory).
    assert fresh_water(3.98).density == pytest.approx(999.9749, abs=0.001)


def test_water_reference_density_is_iapws95_at_4_c():
    # IAPWS-95 at 4 C and 1 atm: 999.975 kg/m3 (REFERENCES.md).
    assert WATER_REFERENCE_DENSITY == pytest.approx(fresh_water(4.0).density, abs=0.001)
    assert fresh_water(4.0).specific_gravity == pytest.approx(1.0, abs=1e-6)


def test_fresh_water_has_no_jump_at_the_boiling_point():
    # Below 99.974 C the density is at 1 atm, above it the saturated liquid's: the
    # switch must be continuous. IAPWS-95 gives d(rho)/dT of about -0.75 kg/m3/K
    # there, so 0.01 K apart the two differ by about 0.0075 kg/m3.
    below, above = fresh_water(99.97), fresh_water(99.98)
    assert "saturated" not in below.source and "saturated" in above.source
    assert 0.0 < below.density - above.density < 0.01


def test_fresh_water_at_0_c_is_accepted():
    assert fresh_water(0.0).density == pytest.approx(fresh_water(0.01).density, abs=0.001)
    assert fresh_water(-0.0) == fresh_water(0.0)


def test_fresh_water_below_zero_is_refused():
    with pytest.raises(LiquidError, match=r"not liquid at -5 C .* freezes at 0 C"):
        fresh_water(-5.0)


def test_fresh_water_above_boiling_is_refused():
    with pytest.raises(LiquidError) as info:
        fresh_water(120.0)
    assert str(info.value) == (
        "fresh water is not liquid at 120 C and one atmosphere (it boils at 99.97 C)"
    )
    with pytest.raises(LiquidError, match="boils"):
        fresh_water(100.001)


@pytest.mark.parametrize("bad", [math.nan, math.inf, -math.inf])
def test_fresh_water_non_finite_is_refused(bad):
    with pytest.raises(LiquidError, match="finite number"):
        fresh_water(bad)


@pytest.mark.parametrize("bad", ["20", None, True])
def test_fresh_water_non_number_is_refused(bad):
    with pytest.raises(LiquidError, match="must be a number"):
        fresh_water(bad)


# --- seawater ----------------------------------------------------------


def test_seawater_teos10():
    # TEOS-10 via gsw: gsw.rho_t_exact(35, 10, 0) = 1026.826 kg/m3.
    sea = seawater(10.0, 35.0)
    assert sea.density == pytest.approx(1026.826, abs=0.005)
    assert type(sea.density) is float
    assert sea.preset == SEAWATER and sea.name == "seawater"
    assert (sea.temperature, sea.salinity) == (10.0, 35.0)
    assert "TEOS-10" in sea.source


def test_seawater_defaults():
    assert seawater() == seawater(10.0, 35.0)


def test_standard_seawater_against_iapws08():
    # IAPWS R13-08 check table: standard seawater at 0 C, 1 atm = 1028.10720 kg/m3.
    # TEOS-10 (gsw) and iapws.SeaWater share the IAPWS-08 saline part; they differ
    # in the pure-water part: iapws.SeaWater uses IAPWS-95 by default, gsw the
    # IAPWS-09 pure-water Gibbs function (from memory). The two measured here differ
    # by 1.5e-5 kg/m3 (1.5e-8 relative), far below density measurement uncertainty;
    # 5e-5 kg/m3 allows for that and nothing more.
    sea = seawater(0.0, 35.16504)
    assert sea.density == pytest.approx(1028.10720, abs=5e-5)
    iapws08 = iapws.SeaWater(T=273.15, P=0.101325, S=0.03516504)
    assert sea.density == pytest.approx(iapws08.rho, abs=5e-5)
    # With the IAPWS-09 water part (SR7-09, fast=True) both evaluate the same
    # formulation: agreement to rounding.
    iapws09 = iapws.SeaWater(T=273.15, P=0.101325, S=0.03516504, fast=True)
    assert sea.density == pytest.approx(iapws09.rho, abs=1e-9)


@pytest.mark.parametrize("salinity", [-1.0, 120.5])
def test_seawater_salinity_out_of_range_is_refused(salinity):
    with pytest.raises(LiquidError, match=r"salinity must be 0 to 120 g/kg \(TEOS-10 range\)"):
        seawater(10.0, salinity)


def test_seawater_too_warm_is_refused():
    with pytest.raises(LiquidError, match=r"up to 40 C \(TEOS-10 range\), not 41 C"):
        seawater(41.0, 35.0)


def test_seawater_below_freezing_is_refused():
    # gsw.t_freezing(35, 0, 1) = -1.91 C: seawater freezes below 0 C.
    with pytest.raises(LiquidError) as info:
        seawater(-3.0, 35.0)
    assert str(info.value) == (
        "seawater with 35 g/kg salt is not liquid at -3 C (it freezes at -1.91 C)"
    )
    assert seawater(-1.5, 35.0).temperature == -1.5


def test_seawater_range_corners_are_accepted():
    for temperature, salinity in [(0.0, 0.0), (40.0, 0.0), (40.0, 120.0), (20.0, 120.0)]:
        sea = seawater(temperature, salinity)
        assert math.isfinite(sea.density) and sea.density > 0


def test_seawater_with_no_salt_is_close_to_fresh_water():
    # TEOS-10 and IAPWS-95 describe the same pure water; they agree far inside
    # the 0.01 kg/m3 tolerance of the REFERENCES.md water lines.
    assert seawater(20.0, 0.0).density == pytest.approx(fresh_water(20.0).density, abs=0.01)


@pytest.mark.parametrize("temperature, salinity", [(math.nan, 35.0), (10.0, math.inf), ("10", 35)])
def test_seawater_bad_numbers_are_refused(temperature, salinity):
    with pytest.raises(LiquidError, match="seawater (temperature|salinity) must be a"):
        seawater(temperature, salinity)


# --- listed liquids ----------------------------------------------------


def test_listed_liquids_structure():
    assert 8 <= len(LISTED_LIQUIDS) <= 20
    for key, liquid in LISTED_LIQUIDS.items():
        assert isinstance(liquid, Liquid)
        assert key == liquid.name == liquid.preset
        assert key == " ".join(key.lower().split())
        assert key not in PRESETS
        assert type(liquid.density) is float
        assert math.isfinite(liquid.density) and liquid.density > 0
        assert liquid.source.strip()
        assert liquid.temperature is not None and liquid.salinity is None


@pytest.mark.parametrize("name, lo, hi", [
    # Ranges of the sources quoted (from memory, as each source says).
    ("raw sewage", 1000.0, 1020.0),
    ("activated sludge", 1002.0, 1005.0),
    ("primary sludge", 1010.0, 1030.0),
    ("fats, oils and grease", 860.0, 930.0),
    ("light fuel oil", 820.0, 860.0),
    ("diesel fuel", 820.0, 845.0),  # EN 590 limits at 15 C
])
def test_liquids_of_wastewater_and_fuel_tanks(name, lo, hi):
    liquid = LISTED_LIQUIDS[name]
    assert lo <= liquid.density <= hi
    assert "from memory" in liquid.source


def test_the_new_names_people_use():
    assert listed_liquid("diesel") is LISTED_LIQUIDS["diesel fuel"]
    assert listed_liquid("Sewage") is LISTED_LIQUIDS["raw sewage"]
    assert listed_liquid("grease") is LISTED_LIQUIDS["fats, oils and grease"]
    assert listed_liquid("FOG") is LISTED_LIQUIDS["fats, oils and grease"]
    assert listed_liquid("heating oil") is LISTED_LIQUIDS["light fuel oil"]
    # Sewage carries fat: the lighter liquid floats on the heavier one.
    assert LISTED_LIQUIDS["fats, oils and grease"].density < LISTED_LIQUIDS["raw sewage"].density


def test_listed_liquids_cannot_be_changed():
    with pytest.raises(TypeError):
        LISTED_LIQUIDS["water"] = custom_liquid(1000.0)


def test_listed_liquid_by_name():
    diesel = LISTED_LIQUIDS["diesel fuel"]
    assert listed_liquid("Diesel  Fuel") is diesel
    assert listed_liquid("sulfuric acid 98%") is LISTED_LIQUIDS["sulfuric acid 98 %"]
    assert listed_liquid("Gasoline") is LISTED_LIQUIDS["petrol"]


def test_unknown_listed_liquid_names_the_known_ones():
    with pytest.raises(LiquidError) as info:
        listed_liquid("honey")
    message = str(info.value)
    assert message.startswith("unknown liquid 'honey' (known: ")
    for key in LISTED_LIQUIDS:
        assert key in message


# --- given densities ---------------------------------------------------


def test_custom_liquid():
    brine = custom_liquid(1200, "brine")
    assert brine == Liquid("brine", 1200.0, "density given by the user")
    assert type(brine.density) is float and brine.preset is None
    assert custom_liquid(950.0).name == "custom liquid"


@pytest.mark.parametrize("bad", [0.0, -1.0, math.nan, math.inf])
def test_custom_liquid_refuses_bad_density(bad):
    with pytest.raises(LiquidError, match="density must be (positive|a finite number)"):
        custom_liquid(bad)


@pytest.mark.parametrize("bad", ["1000", None, True])
def test_custom_liquid_refuses_non_numbers(bad):
    with pytest.raises(LiquidError, match="density must be a number"):
        custom_liquid(bad)


def test_liquid_itself_refuses_bad_density():
    with pytest.raises(LiquidError, match="density must be positive"):
        Liquid("x", -5.0, "test")


def test_liquid_from_specific_gravity():
    diesel = liquid_from_specific_gravity(0.84, "diesel")
    assert diesel.density == pytest.approx(0.84 * WATER_REFERENCE_DENSITY, rel=1e-15)
    assert diesel.specific_gravity == pytest.approx(0.84, rel=1e-15)
    assert "specific gravity 0.84" in diesel.source
    for bad in (0.0, -0.5, math.nan):
        with pytest.raises(LiquidError, match="specific gravity must be"):
            liquid_from_specific_gravity(bad)


def test_liquids_are_immutable():
    with pytest.raises(AttributeError):
        fresh_water().density = 1000.0


# --- the section-file fluid object -------------------------------------


def test_spec_with_density():
    liquid = liquid_from_spec({"name": "fresh water", "density": 998.2})
    assert liquid == custom_liquid(998.2, "fresh water")
    assert liquid_from_spec({"density": 1000}).name == "custom liquid"


def test_spec_presets_and_their_defaults():
    assert liquid_from_spec({"preset": "fresh water"}) == fresh_water(20.0)
    assert liquid_from_spec({"preset": "fresh water", "temperature": 60}) == fresh_water(60.0)
    assert liquid_from_spec({"preset": "seawater"}) == seawater(10.0, 35.0)
    assert liquid_from_spec(
        {"preset": "seawater", "temperature": 25, "salinity": 40}
    ) == seawater(25.0, 40.0)


def test_spec_preset_may_carry_a_name():
    liquid = liquid_from_spec({"preset": "seawater", "name": "harbour water"})
    assert liquid.name == "harbour water"
    assert liquid.density == seawater().density and liquid.preset == SEAWATER


@pytest.mark.parametrize(
    "spec, message",
    [
        ({"densty": 998.2}, "unknown key 'densty' in fluid"),
        ({"density": 998.2, "colour": "blue"}, "unknown key 'colour' in fluid"),
        ({"density": "998.2"}, "'density' in fluid must be a number, not str"),
        ({"density": True}, "'density' in fluid must be a number, not bool"),
        ({"density": None}, "'density' in fluid must be a number, not NoneType"),
        ({"density": -1000}, "fluid density must be positive, not -1000 kg/m3"),
        ({"density": 0}, "fluid density must be positive, not 0 kg/m3"),
        ({"density": 998.2, "preset": "fresh water"},
         "fluid gives both 'density' and 'preset'; give one"),
        ({}, "fluid needs a 'density' or a 'preset'"),
        ({"name": "water"}, "fluid needs a 'density' or a 'preset'"),
        ({"density": 998.2, "temperature": 20},
         "'temperature' in fluid applies only to a preset, not to a given density"),
        ({"density": 1025, "salinity": 35},
         "'salinity' in fluid applies only to a preset, not to a given density"),
        ({"preset": "fresh water", "salinity": 35},
         "'salinity' in fluid applies only to the seawater preset"),
        ({"preset": "diesel fuel"},
         "unknown preset 'diesel fuel' in fluid (use 'fresh water' or 'seawater')"),
        ({"preset": 1}, "unknown preset 1 in fluid"),
        ({"preset": "fresh water", "temperature": "20"},
         "'temperature' in fluid must be a number, not str"),
        ({"preset": "seawater", "salinity": False},
         "'salinity' in fluid must be a number, not bool"),
        ({"name": 3, "density": 1000}, "'name' in fluid must be text, not int"),
        ([("density", 1000)], "fluid must be an object, not list"),
    ],
)
def test_spec_refusals(spec, message):
    with pytest.raises(LiquidError) as info:
        liquid_from_spec(spec)
    assert str(info.value).startswith(message)


def test_spec_out_of_range_preset_inputs_are_refused():
    with pytest.raises(LiquidError, match="boils"):
        liquid_from_spec({"preset": "fresh water", "temperature": 120})
    with pytest.raises(LiquidError, match="freezes"):
        liquid_from_spec({"preset": "seawater", "temperature": -5})
    with pytest.raises(LiquidError, match="finite"):
        liquid_from_spec({"preset": "fresh water", "temperature": math.nan})


@pytest.mark.parametrize(
    "liquid",
    [
        fresh_water(20.0),
        fresh_water(4.0),
        fresh_water(100.0),
        seawater(10.0, 35.0),
        seawater(-1.0, 20.0),
        liquid_from_spec({"preset": "fresh water", "name": "cooling water"}),
        custom_liquid(1234.5, "brine"),
        custom_liquid(998.2),
    ],
    ids=lambda liquid: f"{liquid.name}-{liquid.density:.1f}",
)
def test_spec_round_trip(liquid):
    spec = liquid_to_spec(liquid)
    assert liquid_from_spec(spec) == liquid
    # The spec is plain JSON and survives a file.
    assert liquid_from_spec(json.loads(json.dumps(spec))) == liquid


def test_spec_writes_presets_with_their_inputs():
    assert liquid_to_spec(fresh_water(15.0)) == {"preset": "fresh water", "temperature": 15.0}
    assert liquid_to_spec(seawater(10.0, 35.0)) == {
        "preset": "seawater", "temperature": 10.0, "salinity": 35.0,
    }
    assert liquid_to_spec(custom_liquid(1100.0, "brine")) == {"name": "brine", "density": 1100.0}


def test_listed_liquid_is_written_as_name_and_density_and_recognised_on_reading():
    for liquid in LISTED_LIQUIDS.values():
        spec = liquid_to_spec(liquid)
        assert spec == {"name": liquid.name, "density": liquid.density}
        assert liquid_from_spec(spec) == liquid  # the listed source comes back too


def test_listed_name_with_another_density_is_a_custom_liquid():
    liquid = next(iter(LISTED_LIQUIDS.values()))
    spec = {"name": liquid.name, "density": liquid.density + 1.0}
    assert liquid_from_spec(spec) == custom_liquid(liquid.density + 1.0, liquid.name)


@given(
    density=st.floats(min_value=1e-3, max_value=1e5, allow_nan=False),
    name=st.text(max_size=20),
)
def test_custom_round_trip_property(density, name):
    liquid = custom_liquid(density, name)
    assert liquid_from_spec(liquid_to_spec(liquid)) == liquid


@settings(max_examples=50)
@given(
    temperature=st.floats(min_value=0.0, max_value=40.0),
    salinity=st.floats(min_value=0.0, max_value=120.0),
)
def test_seawater_round_trip_property(temperature, salinity):
    liquid = seawater(temperature, salinity)
    assert liquid_from_spec(liquid_to_spec(liquid)) == liquid


@settings(max_examples=20, deadline=None)  # IAPWS-95 takes milliseconds per call
@given(temperature=st.floats(min_value=0.0, max_value=100.0))
def test_fresh_water_round_trip_property(temperature):
    liquid = fresh_water(temperature)
    assert 958.0 < liquid.density < 1000.0  # IAPWS-95: 958.35 at 100 C, 999.975 at 4 C
    assert liquid_from_spec(liquid_to_spec(liquid)) == liquid


# --- boundaries --------------------------------------------------------


def test_importing_liquids_does_not_import_qt():
    code = (
        "import sys, core.liquids, core.units\n"
        "bad = [m for m in sys.modules if m.split('.')[0] in "
        "('PySide6', 'PyQt5', 'PyQt6', 'pyqtgraph')]\n"
        "assert not bad, bad\n"
    )
    subprocess.run(
        [sys.executable, "-c", code], check=True
    )


# --- the table of fresh-water densities (start-up speed) ----------------
# core.fresh_water_table spares the program importing iapws (and scipy) for
# the usual temperatures; IAPWS-95 through iapws stays the reference. The
# table holds what iapws 1.5.5 gave on the machine that wrote it, bit for
# bit; iapws solves the density iteratively, and on another CPU (numpy's
# and scipy's other SIMD paths) its last digits move: up to 7.5e-15
# relative seen (AMD EPYC against the machine of the table). So every value
# must agree with iapws here to 1e-13 relative, a few tens of ulps (the
# formulation itself is uncertain to about 1e-6), and the table gives the
# same density on every machine, which iapws alone would not.
TABLE_AGREEMENT = 1e-13


def _iapws_directly(celsius):
    state = iapws.IAPWS95(T=celsius + 273.15, P=0.101325)
    if state.phase != "Liquid":  # above the boiling point at 1 atm: saturated liquid
        state = iapws.IAPWS95(T=celsius + 273.15, x=0)
    return float(state.rho)


@pytest.mark.parametrize("celsius", [0.0, 4.0, 10.0, 12.0, 12.5, 15.0, 20.0, 37.8, 99.9, 100.0])
def test_tabulated_densities_are_iapws95(celsius):
    assert fresh_water(celsius).density == pytest.approx(_iapws_directly(celsius),
                                                         rel=TABLE_AGREEMENT, abs=0.0)


@pytest.mark.slow
def test_every_tabulated_density_is_iapws95():
    from wetline.core.fresh_water_table import DENSITIES, FIRST_SATURATED

    assert len(DENSITIES) == 1001
    for k, density in enumerate(DENSITIES):
        assert density == pytest.approx(_iapws_directly(k / 10), rel=TABLE_AGREEMENT,
                                        abs=0.0), f"{k / 10} C"
    # The boiling point at one atmosphere is 99.974 C (IAPWS-95): only 100.0 C
    # of the grid is above it.
    assert FIRST_SATURATED == 1000


@pytest.mark.parametrize("celsius", [12.34, 0.05, 99.99, 1e-9])
def test_temperatures_off_the_grid_are_computed(celsius):
    assert fresh_water(celsius).density == _iapws_directly(celsius)


def test_the_saturated_liquid_is_said_from_the_table_too():
    assert fresh_water(100.0).source == "IAPWS-95, pure water at 100 C, saturated liquid"
    assert fresh_water(99.9).source == "IAPWS-95, pure water at 99.9 C, one atmosphere"
