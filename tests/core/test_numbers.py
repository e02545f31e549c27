"""The one number formatter, its round-off rule and the 1-2-5 steps.

Significant figures and plain-versus-exponent notation are common practice
for engineering tables (no source); the values below are worked by hand.
"""

import math

import pytest

from wetline.core.numbers import DEFAULT_DIGITS, NOISE, format_number, is_noise, nice_step


def test_four_significant_figures_by_default():
    assert DEFAULT_DIGITS == 4
    assert format_number(44129.925) == "44130"
    assert format_number(21.5431) == "21.54"
    assert format_number(0.0041204) == "0.00412"  # trailing zeros dropped
    assert format_number(1 / 0.9) == "1.111"


@pytest.mark.parametrize("value, text", [
    (44129.925, "44130"), (1.5, "1.5"), (0.0, "0"), (-0.0, "0"), (None, "-"),
    (float("nan"), "-"), (math.inf, "inf"), (-math.inf, "-inf"), (123456789012.0, "1.235e+11"),
    (123456.0, "123456"), (0.0001, "0.0001"), (0.00009999, "9.999e-05"), (-2.5e-7, "-2.5e-07"),
    (9.99996, "10"), ("floor", "floor"),
])
def test_format_number(value, text):
    assert format_number(value) == text


def test_more_figures_when_asked():
    assert format_number(998.207, 5) == "998.21"
    assert format_number(9.80665, 6) == "9.80665"
    assert format_number(0.000123456, 5) == "0.00012346"


def test_round_off_next_to_its_scale_is_zero():
    # Two walls' opposite horizontal forces of 44.1 kN leave 7e-12 N.
    assert format_number(7.3e-12, scale=44129.9) == "0"
    assert format_number(-7.3e-12, scale=44129.9) == "0"
    assert format_number(7.3e-12) == "7.3e-12"  # no scale: shown as computed
    # Just above the threshold it is a value.
    assert format_number(2 * NOISE * 1000.0, scale=1000.0) == "2e-09"
    assert is_noise(0.4 * NOISE, 1.0) and not is_noise(NOISE, 1.0)


@pytest.mark.parametrize("raw, up, down", [
    (0.37, 0.5, 0.2), (1.0, 1.0, 1.0), (3.0, 5.0, 2.0), (7000.0, 10000.0, 5000.0),
    (0.012, 0.02, 0.01), (99.0, 100.0, 50.0),
])
def test_nice_step(raw, up, down):
    assert nice_step(raw) == pytest.approx(up)
    assert nice_step(raw, down=True) == pytest.approx(down)


def test_nice_step_of_nothing_is_one():
    assert nice_step(0.0) == 1.0 and nice_step(float("nan")) == 1.0 and nice_step(-3) == 1.0


# ---------------------------------------------------------------- the policy
def test_the_policy_sets_the_figures_of_results_only_within_its_block():
    from wetline.core.numbers import figures, using_figures

    assert figures() == 4
    with using_figures(6):
        assert format_number(2 / 3) == "0.666667"
        assert format_number(2 / 3, 3) == "0.667"  # an explicit request still wins
    assert format_number(2 / 3) == "0.6667"


def test_the_policy_reaches_the_force_and_unit_texts():
    from wetline.core.force_scope import ForceScope
    from wetline.core.numbers import using_figures
    from wetline.core.units import SI

    scope = ForceScope(True, "per m run", "force_per_length", "kN/m", 1000.0)
    with using_figures(5):
        assert scope.text(72345.678) == "72.346 kN/m"
        assert SI.text(24516.6, "pressure") == "24.517 kPa"
    assert scope.text(72345.678) == "72.35 kN/m"


@pytest.mark.parametrize("n", [2, 7, 4.0, True, "4"])
def test_the_policy_refuses_figures_out_of_its_range(n):
    from wetline.core.numbers import using_figures

    with pytest.raises(ValueError, match="significant figures must be a whole number from 3 to 6"):
        with using_figures(n):
            pass


@pytest.mark.parametrize("value, text", [
    (2.34567, "2.34567"), (2.3, "2.3"), (1500.0, "1500"), (-0.25, "-0.25"),
    (0.70104 / 0.3048, "2.3"),  # 2.3 ft through metres and back
    (2300 * 0.001 / 0.001, "2300"), (0.1 + 0.2, "0.3"), (123456.789012, "123456.789012"),
    (0.0031588654, "0.0031588654"), (None, "-"), (float("nan"), "-"), (0.0, "0"),
])
def test_coordinates_are_shown_as_entered(value, text):
    from wetline.core.numbers import format_entered

    assert format_entered(value) == text


def test_round_to_step_gives_the_float_of_the_decimal_multiple():
    # round(x / 0.1) * 0.1 leaves binary residue (23 * 0.1 = 2.3000000000000003);
    # the decimal product is the float nearest 2.3.
    from wetline.core.numbers import round_to_step

    assert 23 * 0.1 != 2.3
    assert round_to_step(2.31, 0.1) == 2.3
    assert round_to_step(0.7, 0.1) == 0.7
    assert round_to_step(-1.04, 0.05) == -1.05
    assert round_to_step(12.6, 1) == 13.0
    assert round_to_step(5.0, 0) == 5.0
