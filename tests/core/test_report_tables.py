"""Shared result tables and their CSV: the numbers must be the record's."""

import csv
import io
import math

import numpy as np
import pytest

from wetline.core.report_tables import (
    edges_table,
    fmt,
    level_load_table,
    parts_table,
    to_csv,
    totals_table,
)
from wetline.core.results import results_record
from wetline.core.section_file import read_section_file
from wetline.core.units import display_units


def _csv(table):
    rows = list(csv.reader(io.StringIO(to_csv(table))))
    return rows[0], rows[1:]


def test_edge_csv_sums_match_the_json_record(sample_path):
    case = read_section_file(sample_path)
    sol = case.solve()
    rec = results_record(case, sol)
    header, rows = _csv(edges_table(sol, display_units("si")))
    assert header[0] == "edge" and all("[" in h for h in header[2:])
    k = header.index("fz [kN]")
    fz_sum = sum(float(r[k]) for r in rows) * 1000.0
    assert fz_sum == pytest.approx(sum(e["fz"] for e in rec["edges"]), rel=1e-12, abs=1e-6)
    floor = sum(float(r[k]) for r in rows if r[1] == "floor") * 1000.0
    assert floor == pytest.approx(-rec["floor_force"], rel=1e-12, abs=1e-6)
    if "fx [kN]" in header:
        kx = header.index("fx [kN]")
        for r, e in zip(rows, rec["edges"], strict=True):
            assert float(r[kx]) * 1000.0 == pytest.approx(e["fx"], rel=1e-12, abs=1e-9)


def test_us_units_convert_with_nist_factors(sample):
    # NIST SP 811 App. B: 1 psi = 6894.757 Pa, 1 lbf = 4.448222 N, 1 ft = 0.3048 m.
    case = read_section_file(sample("open_tank"))
    sol = case.solve()
    t = totals_table(sol, display_units("us"))
    values = {r[0]: r[1] for r in t.rows}
    assert values["max pressure"] == pytest.approx(sol.max_pressure / 6894.757293168361)
    assert values["floor force"] == pytest.approx(sol.floor_force / 4.4482216152605)
    assert values["level"] == pytest.approx(sol.level / 0.3048)


def test_parts_table_marks_uplift(sample):
    case = read_section_file(sample("sump_with_lid"))
    t = parts_table(case.solve(), display_units("si"))
    notes = {r[0]: r[-1] for r in t.rows}
    assert notes["lid"] == "uplift" and notes["floor"] == ""


def test_level_load_csv_weight_equals_floor_plus_supports(sample):
    case = read_section_file(sample("chamber_under_riser"))
    header, rows = _csv(level_load_table(case, display_units("si"), steps=9))
    w, f, s = (header.index(h) for h in ("fluid weight [kN]", "floor force [kN]",
                                          "support reaction [kN]"))
    for r in rows:
        assert float(r[f]) + float(r[s]) == pytest.approx(float(r[w]), rel=1e-9, abs=1e-9)


def test_undefined_values_are_empty_csv_cells(sample):
    case = read_section_file(sample("open_tank"))
    header, rows = _csv(edges_table(case.solve(), display_units("si")))
    dry = [r for r in rows if r[1] == "open"][0]
    assert dry[header.index("cp x [m]")] == ""


@pytest.mark.parametrize("value, text", [
    (44129.925, "44130"), (1.5, "1.5"), (0.0, "0"), (-0.0, "0"), (None, "-"),
    (float("nan"), "-"), (math.inf, "inf"), (123456789012.0, "1.2346e+11"),
])
def test_fmt(value, text):
    assert fmt(value) == text


# ------------------------------------------------ part names in the CSV
ODD_PARTS = ["floor", "a_b", "a b", 'lid, "north"', "wall", "open"]


def _odd_case():
    # Part names as a user may type them: an underscore and a space must stay
    # two parts, a comma and quotes must survive the CSV (RFC 4180 quoting).
    from wetline.core.case import Case
    from wetline.core.section import Section

    s = Section.build([(0, 0), (3, 0), (3, 1), (3, 2), (3, 3), (0, 3)], parts=ODD_PARTS)
    return Case.default(s, 2.5)


def test_level_load_csv_keeps_part_names_as_written():
    header, rows = _csv(level_load_table(_odd_case(), display_units("si"), steps=5))
    downs = [h for h in header if h.startswith("down:")]
    assert downs == ["down:floor [kN]", "down:a_b [kN]", "down:a b [kN]",
                     'down:lid, "north" [kN]', "down:wall [kN]"]
    assert len(set(header)) == len(header)
    # the fixed columns keep their readable names
    assert header[:6] == ["level [m]", "volume [m3]", "fluid weight [kN]", "floor force [kN]",
                          "support reaction [kN]", "max pressure [kPa]"]
    assert all(len(r) == len(header) for r in rows)


def test_edge_csv_keeps_part_names_as_written():
    case = _odd_case()
    header, rows = _csv(edges_table(case.solve(), display_units("si")))
    assert [r[1] for r in rows] == ODD_PARTS
    assert all(len(r) == len(header) for r in rows)


def test_csv_writes_numpy_numbers_as_plain_numbers():
    from wetline.core.report_tables import Table

    t = Table("t", ("a", "b", "c"), ((np.float64(0.1), np.int64(3), 2.5),))
    assert to_csv(t) == "a,b,c\n0.1,3,2.5\n"
