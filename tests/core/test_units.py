"""Tests of core.units: the pint registry, length units and display units."""

import math
import subprocess
import sys

import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st

from wetline.core.units import (
    DISPLAY_LENGTH_UNITS,
    QUANTITIES,
    SI,
    SI_LENGTH_UNITS,
    US,
    US_LENGTH_UNITS,
    DisplayUnits,
    UnitError,
    display_units,
    length_display,
    length_factor,
    ureg,
)

G0 = 9.80665  # standard gravity [m/s2], exact: 3rd CGPM (1901), SI Brochure
RHO_CONVENTIONAL_WATER = 1000.0  # [kg/m3], the "conventional" water column of NIST SP 811


# --- length units of section files -------------------------------------


@pytest.mark.parametrize(
    "unit, metres",
    [
        # International yard and pound agreement (1959): 1 yd = 0.9144 m exactly,
        # hence 1 ft = 0.3048 m and 1 in = 0.0254 m exactly.
        ("ft", 0.3048),
        ("in", 0.0254),
        ("yd", 0.9144),
        ("foot", 0.3048),
        ("inch", 0.0254),
        # SI prefixes, exact by definition (SI Brochure).
        ("mm", 0.001),
        ("cm", 0.01),
        ("m", 1.0),
        ("km", 1000.0),
    ],
)
def test_length_factor_is_exact_for_defined_units(unit, metres):
    assert length_factor(unit) == metres


def test_length_factor_ignores_surrounding_spaces():
    assert length_factor("  mm ") == 0.001


@pytest.mark.parametrize("unit", ["mtr", "m)", "((", "1/0", "m^", "3 m", "x y"])
def test_unknown_length_unit_is_refused_by_name(unit):
    with pytest.raises(UnitError, match=r"unknown length unit '.*'"):
        length_factor(unit)


def test_unknown_length_unit_message():
    with pytest.raises(UnitError) as info:
        length_factor("mtr")
    assert str(info.value) == "unknown length unit 'mtr'"


@pytest.mark.parametrize("unit", ["kg", "psi", "degC", "percent"])
def test_non_length_unit_is_refused(unit):
    with pytest.raises(UnitError) as info:
        length_factor(unit)
    assert str(info.value) == f"'{unit}' is not a length unit"


@pytest.mark.parametrize("unit", ["m**2", "m/s", "m/1", "mm!", "2*m"])
def test_unit_expressions_are_refused_as_unknown(unit):
    # A file names one unit; pint would accept expressions and ignore stray
    # punctuation, so anything but a plain name is refused.
    with pytest.raises(UnitError) as info:
        length_factor(unit)
    assert str(info.value) == f"unknown length unit '{unit}'"


def test_empty_and_non_text_units_are_refused():
    with pytest.raises(UnitError, match="no length unit"):
        length_factor("  ")
    with pytest.raises(UnitError, match="must be text"):
        length_factor(1.0)


def test_unit_error_is_a_value_error():
    assert issubclass(UnitError, ValueError)


# --- display unit systems ----------------------------------------------


def test_psi_against_nist():
    # NIST SP 811 (2008) App. B: 1 psi = 6894.757293 Pa.
    assert US.factor("pressure") == pytest.approx(6894.757293, abs=1e-6)
    # Definition: 1 lbf = 0.45359237 kg x 9.80665 m/s2 (1959 agreement, 3rd CGPM),
    # over one square inch of 0.0254**2 m2.
    assert US.factor("pressure") == pytest.approx(0.45359237 * G0 / 0.0254**2, rel=1e-14)


def test_conventional_foot_of_water():
    # NIST SP 811 App. B: conventional ftH2O (rho = 1000 kg/m3, g0) = 2989.067 Pa.
    column = RHO_CONVENTIONAL_WATER * G0 * length_factor("ft")
    assert column == pytest.approx(2989.067, abs=1e-3)
    # The shared registry uses the same (conventional) definition; same source.
    assert ureg.Quantity(1.0, "foot_H2O").m_as("Pa") == pytest.approx(2989.067, abs=1e-3)


def test_water_column_rules_of_thumb():
    # Common practice: 0.433 psi per foot of water, 2.31 ft of water per psi,
    # about 9.81 kPa per metre; within 0.3 %. Convention: conventional water,
    # rho = 1000 kg/m3 and g0 (NIST SP 811 App. B).
    unit_weight = RHO_CONVENTIONAL_WATER * G0  # [N/m3]
    psi_per_ft = US.to_display(unit_weight * US.from_display(1.0, "length"), "pressure")
    assert psi_per_ft == pytest.approx(0.433, rel=3e-3)
    ft_per_psi = US.to_display(US.from_display(1.0, "pressure") / unit_weight, "length")
    assert ft_per_psi == pytest.approx(2.31, rel=3e-3)
    kpa_per_m = SI.to_display(unit_weight * 1.0, "pressure")
    assert kpa_per_m == pytest.approx(9.81, rel=3e-3)


def test_us_factors_against_definitions():
    # 1 lbf = 0.45359237 kg x 9.80665 m/s2 exactly (1959 agreement; 3rd CGPM).
    assert US.factor("force") == pytest.approx(0.45359237 * G0, rel=1e-15)
    # NIST SP 811 App. B: pound-force per foot 14.59390 N/m (from memory).
    assert US.factor("force_per_length") == pytest.approx(14.59390, abs=1e-5)
    # NIST SP 811 App. B: pound per cubic foot 16.01846 kg/m3 (from memory).
    assert US.factor("density") == pytest.approx(16.01846, abs=1e-5)
    # 1 ft2, 1 ft3 from 1 ft = 0.3048 m (1959 agreement), exact decimals.
    assert US.factor("area") == 0.09290304
    assert US.factor("volume") == 0.028316846592
    # US gallon = 231 in3 = 3.785411784e-3 m3 exactly (NIST SP 811 App. B; the
    # 231 in3 definition from memory).
    assert US.factor("liquid_volume") == pytest.approx(231 * 0.0254**3, rel=1e-15)


def test_si_factors():
    # SI prefixes, exact (SI Brochure).
    assert SI.factor("pressure") == 1000.0
    assert SI.factor("force") == 1000.0
    assert SI.factor("force_per_length") == 1000.0
    assert SI.factor("liquid_volume") == 0.001
    for quantity in ("length", "area", "volume", "density"):
        assert SI.factor(quantity) == 1.0


def test_labels():
    assert [SI.label(q) for q in QUANTITIES] == [
        "m", "m2", "m3", "L", "kPa", "kN", "kN/m", "kg/m3",
    ]
    assert [US.label(q) for q in QUANTITIES] == [
        "ft", "ft2", "ft3", "US gal", "psi", "lbf", "lbf/ft", "lb/ft3",
    ]


def test_unknown_quantity_is_refused():
    with pytest.raises(UnitError, match="unknown quantity 'speed'"):
        SI.to_display(1.0, "speed")
    with pytest.raises(UnitError, match="unknown quantity"):
        US.label("name")


@given(
    value=st.floats(min_value=-1e12, max_value=1e12, allow_nan=False),
    quantity=st.sampled_from(QUANTITIES),
    system=st.sampled_from([SI, US]),
)
def test_display_round_trip(value, quantity, system):
    back = system.from_display(system.to_display(value, quantity), quantity)
    assert back == pytest.approx(value, rel=1e-15, abs=1e-300)


def test_display_conversion_takes_arrays():
    values = np.array([0.0, 0.3048, 3.048])
    np.testing.assert_allclose(US.to_display(values, "length"), [0.0, 1.0, 10.0], rtol=1e-15)


def test_display_units_by_name():
    assert display_units("si") is SI
    assert display_units(" US ") is US
    with pytest.raises(UnitError, match=r"unknown unit system 'imperial' \(known: 'si', 'us'\)"):
        display_units("imperial")
    with pytest.raises(UnitError, match="unknown unit system"):
        display_units(None)


def test_display_units_are_immutable_and_hashable():
    assert isinstance(SI, DisplayUnits)
    with pytest.raises(AttributeError):
        SI.title = "other"
    assert len({SI, US}) == 2


# --- display length units ----------------------------------------------


def test_length_display_choices():
    assert SI_LENGTH_UNITS == ("mm", "m")
    assert US_LENGTH_UNITS == ("in", "ft")
    assert set(SI_LENGTH_UNITS + US_LENGTH_UNITS) <= set(DISPLAY_LENGTH_UNITS)


@pytest.mark.parametrize("unit", DISPLAY_LENGTH_UNITS)
def test_length_display_matches_length_factor(unit):
    shown = length_display(unit)
    assert shown.label == unit
    assert shown.factor == length_factor(unit)


def test_length_display_refuses_other_units():
    with pytest.raises(UnitError, match="lengths are shown in mm, cm, m, in, ft, not 'yd'"):
        length_display("yd")


def test_with_length_changes_only_the_length():
    in_mm = SI.with_length("mm")
    assert in_mm.to_display(1.25, "length") == pytest.approx(1250.0, rel=1e-15)
    assert in_mm.label("length") == "mm"
    assert in_mm.pressure == SI.pressure
    assert SI.label("length") == "m"  # the module constant is untouched
    # 1 in = 0.0254 m exactly (1959 agreement).
    assert US.with_length("in").to_display(0.0254, "length") == pytest.approx(1.0, rel=1e-15)


# --- boundaries --------------------------------------------------------


def test_importing_units_does_not_import_qt():
    code = (
        "import sys, core.units\n"
        "bad = [m for m in sys.modules if m.split('.')[0] in "
        "('PySide6', 'PyQt5', 'PyQt6', 'pyqtgraph')]\n"
        "assert not bad, bad\n"
    )
    subprocess.run([sys.executable, "-c", code], check=True)


def test_factors_are_plain_floats():
    for system in (SI, US):
        for quantity in QUANTITIES:
            factor = system.factor(quantity)
            assert type(factor) is float and math.isfinite(factor) and factor > 0


# --- the factors written out for a fast start ---------------------------
# pint stays the reference: the registry is built only for other units, so
# every factor written out must be exactly what pint gives (after the
# 15-digit rounding of core.units).


def test_written_out_length_factors_are_pints():
    from wetline.core.units import EXACT_LENGTH_FACTORS, _length_factor

    assert set(EXACT_LENGTH_FACTORS) == {"mm", "cm", "m", "in", "ft"}
    for unit, factor in EXACT_LENGTH_FACTORS.items():
        assert _length_factor(unit) == factor, unit  # pint, not the table
        assert length_factor(unit) == factor


def test_written_out_display_factors_are_pints():
    from wetline.core.units import DISPLAY_UNIT_DEFINITIONS, pint_factor

    seen = set()
    for system in (SI, US):
        for quantity in QUANTITIES:
            unit = system.unit(quantity)
            expression, si_unit = DISPLAY_UNIT_DEFINITIONS[unit.label]
            assert unit.factor == pint_factor(expression, si_unit), unit.label
            seen.add(unit.label)
    assert seen == set(DISPLAY_UNIT_DEFINITIONS)


def test_the_registry_is_one_and_built_on_demand():
    from wetline.core import units

    assert units.registry() is units.ureg is ureg
    code = ("import sys; from wetline.core.units import SI, US, length_factor\n"
            "length_factor('mm'); length_factor('ft')\n"
            "print('pint' in sys.modules)\n"
            "length_factor('yd'); print('pint' in sys.modules)")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                         check=True).stdout.split()
    assert out == ["False", "True"]
