"""The window shows forces by the one unit rule: a plane section one unit
of run wide (1 m, or 1 ft in a file in ft) per run, in lbf/ft in US units.

The case (``run_case``, tests/conftest.py): per run the floor carries
29419.95 N/m = 2016 lbf/ft and each wall 11032.48 N/m = 756 lbf/ft
(gamma h and gamma h^2 / 2, Cengel & Cimbala sec. 3-4; NIST SP 811 App. B).
"""

import csv
import io

import pytest
from PySide6.QtCore import Qt

from wetline.app.model import editing
from wetline.app.model.display import DisplayChoice
from wetline.app.window import dialogs


@pytest.mark.parametrize("run", ["m", "ft"])
def test_every_view_is_per_foot_run_in_us_units(make_window, settle, tmp_path, monkeypatch,
                                                run, run_case):
    w = make_window(run_case(run))
    editing.set_units(w.doc, DisplayChoice("us", "ft"))
    settle(w)
    # Totals and their note.
    assert w.totals.values["floor"].text() == "2016 lbf/ft"
    assert w.totals.scope.text().startswith("Forces per ft run.")
    # Parts and edges tables.
    parts = w.parts_table.model()
    assert parts.headerData(3, Qt.Horizontal) == "Down [lbf/ft]"
    row = [parts.index(r, 0).data() for r in range(parts.rowCount())].index("floor")
    assert parts.index(row, 3).data() == "2016"
    edges = w.edges_table.model()
    headers = [edges.headerData(c, Qt.Horizontal) for c in range(edges.columnCount())]
    assert headers[7] == "Resultant [lbf/ft]"
    assert edges.index(1, 7).data() == "756"
    # Canvas labels and the chart's axis.
    shown = w.canvas.shown_labels()
    # Each side wall's value is named by its edge; the part's total (the
    # walls' pushes cancel) is written once.
    assert "floor: 2016 lbf/ft" in shown
    assert {"edge 1: 756 lbf/ft", "edge 3: 756 lbf/ft"} <= set(shown)
    assert w.chart._axis_labels[1] == "Load [lbf/ft]"
    # The per-edge CSV.
    out = tmp_path / "edges.csv"
    monkeypatch.setattr(dialogs, "ask_export_file", lambda *a: str(out))
    w.actions_by_name["export_edges_csv"].trigger()
    header = next(csv.reader(io.StringIO(out.read_text())))
    assert "fz [lbf/ft]" in header


def test_si_display_of_a_foot_run_is_per_metre_run(make_window, settle, run_case):
    w = make_window(run_case("ft"))
    settle(w)
    assert w.totals.values["floor"].text() == "29.42 kN/m"
    assert w.totals.scope.text().startswith("Forces per m run.")
