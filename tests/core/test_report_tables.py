"""Shared result tables and their CSV: the numbers must be the record's."""

import csv
import io

import numpy as np
import pytest

from wetline.core.force_scope import force_scale
from wetline.core.report_tables import (
    edges_table,
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
    header, rows = _csv(edges_table(sol, display_units("si"), case.length_unit))
    assert header[0] == "edge" and all("[" in h for h in header[2:])
    # Every sample is 1 m (or 1 ft) wide or axisymmetric: forces per run are
    # force / width, whole forces are the force.
    sec = case.section
    per_run = not sec.is_axisymmetric
    force = "kN/m" if per_run else "kN"
    width = sec.width if per_run else 1.0
    k = header.index(f"fz [{force}]")
    fz_sum = sum(float(r[k]) for r in rows) * 1000.0 * width
    assert fz_sum == pytest.approx(sum(e["fz"] for e in rec["edges"]), rel=1e-12, abs=1e-6)
    floor = sum(float(r[k]) for r in rows if r[1] == "floor") * 1000.0 * width
    assert floor == pytest.approx(-rec["floor_force"], rel=1e-12, abs=1e-6)
    if f"fx [{force}]" in header:
        kx = header.index(f"fx [{force}]")
        # Round-off (below 1e-12 of the largest force) is given as 0.
        noise = 1e-12 * force_scale(sol)
        for r, e in zip(rows, rec["edges"], strict=True):
            shown = float(r[kx]) * 1000.0 * width
            if shown == 0.0:
                assert abs(e["fx"]) < noise
            else:
                assert shown == pytest.approx(e["fx"], rel=1e-12, abs=1e-9)


def test_us_units_convert_with_nist_factors(sample):
    # NIST SP 811 App. B: 1 psi = 6894.757 Pa, 1 lbf = 4.448222 N, 1 ft = 0.3048 m.
    case = read_section_file(sample("open_tank"))
    sol = case.solve()
    t = totals_table(sol, display_units("us"))
    values = {r[0]: r[1] for r in t.rows}
    assert values["max pressure"] == pytest.approx(sol.max_pressure / 6894.757293168361)
    # open_tank is 1 m wide: per run, in lbf/ft (1 lbf/ft = 4.448222 / 0.3048 N/m).
    assert case.section.width == 1.0
    assert values["floor force"] == pytest.approx(sol.floor_force / (4.4482216152605 / 0.3048))
    assert values["level"] == pytest.approx(sol.level / 0.3048)


def test_parts_table_marks_uplift(sample):
    case = read_section_file(sample("sump_with_lid"))
    t = parts_table(case.solve(), display_units("si"))
    notes = {r[0]: r[-1] for r in t.rows}
    assert notes["lid"] == "uplift" and notes["floor"] == ""


def test_level_load_csv_weight_equals_floor_plus_supports(sample):
    case = read_section_file(sample("chamber_under_riser"))
    header, rows = _csv(level_load_table(case, display_units("si"), steps=9))
    w, f, s = (header.index(h) for h in ("fluid weight [kN/m]", "floor force [kN/m]",
                                          "support reaction [kN/m]"))
    for r in rows:
        assert float(r[f]) + float(r[s]) == pytest.approx(float(r[w]), rel=1e-9, abs=1e-9)


def test_undefined_values_are_empty_csv_cells(sample):
    case = read_section_file(sample("open_tank"))
    header, rows = _csv(edges_table(case.solve(), display_units("si")))
    dry = [r for r in rows if r[1] == "open"][0]
    assert dry[header.index("cp x [m]")] == ""


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
    assert downs == ["down:floor [kN/m]", "down:a_b [kN/m]", "down:a b [kN/m]",
                     'down:lid, "north" [kN/m]', "down:wall [kN/m]"]
    assert len(set(header)) == len(header)
    # the fixed columns keep their readable names
    assert header[:6] == ["level [m]", "volume [m3]", "fluid weight [kN/m]", "floor force [kN/m]",
                          "support reaction [kN/m]", "max pressure [kPa]"]
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
