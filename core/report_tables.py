"""Result tables in display units, shared by the command line, the CSV
export, the calculation sheet and the desktop program.

Each function returns a :class:`Table`: column headers that name their units
and rows of plain values (float, str or None for "not defined"). Formatting
to text is left to the caller; :func:`to_csv` writes full precision.
"""

from __future__ import annotations

import csv
import io
import math
from dataclasses import dataclass
from typing import TYPE_CHECKING

import numpy as np

from .level_table import level_table

if TYPE_CHECKING:
    from .case import Case
    from .units import DisplayUnits

__all__ = ["Table", "force_scope", "totals_table", "with_note", "parts_table", "edges_table",
           "level_load_table", "uplift_table", "to_csv", "fmt"]


@dataclass(frozen=True)
class Table:
    """A titled table: ``header`` (tuple of str) and ``rows`` (tuple of tuples)."""

    title: str
    header: tuple
    rows: tuple


def fmt(v, digits=5):
    """A number for people: ``digits`` significant figures, no exponent for
    ordinary magnitudes, trailing zeros dropped; ``-`` for None/NaN, text
    passed through.

    >>> fmt(44129.925), fmt(0.000123456), fmt(None), fmt(-0.0)
    ('44130', '0.00012346', '-', '0')
    """
    if v is None:
        return "-"
    if isinstance(v, str):
        return v
    v = float(v)
    if math.isnan(v):
        return "-"
    if math.isinf(v):
        return "inf" if v > 0 else "-inf"
    if v == 0:
        return "0"
    mag = math.floor(math.log10(abs(v)))
    if -4 <= mag < 9:
        decimals = max(digits - 1 - mag, 0)
        text = f"{v:.{decimals}f}"
        if "." in text:
            text = text.rstrip("0").rstrip(".")
        return "0" if text in ("-0", "") else text
    return f"{v:.{digits - 1}e}"


def force_scope(section, units):
    """What a section's force values cover, in words for a sentence
    ("Forces per m run."): the full circumference (axisymmetric), a metre or
    foot run (plane, that wide), else the section's width in ``units``."""
    if section.is_axisymmetric:
        return "over the full circumference"
    if abs(section.width - 1.0) <= 1e-9:
        return "per m run"
    if units.name == "us" and abs(section.width - 0.3048) <= 1e-9:
        return "per ft run"
    return (f"for a width of {fmt(units.to_display(section.width, 'length'))} "
            f"{units.label('length')}")


def _num(v):
    if v is None:
        return None
    v = float(v)
    return None if math.isnan(v) else v + 0.0


def totals_table(solution, units):
    """Level, volume, weight, floor force, support reaction, max pressure and
    the spill level (or the top of a closed section), each with a note for
    people: "held down" for a negative support reaction, "capped at the spill
    level" for a level that was capped."""
    u = units
    s = solution.section
    F = u.label("force")
    L = u.label("length")
    capped = solution.level != solution.requested_level
    rows = [
        ("level", _num(u.to_display(solution.level, "length")), L,
         "capped at the spill level" if capped else ""),
        ("volume", _num(u.to_display(solution.volume, "volume")), u.label("volume"), ""),
        ("fluid weight", _num(u.to_display(solution.fluid_weight, "force")), F, ""),
        ("floor force", _num(u.to_display(solution.floor_force, "force")), F, ""),
        ("support reaction", _num(u.to_display(solution.support_reaction, "force")), F,
         "held down" if solution.support_reaction < 0 else ""),
        ("max pressure", _num(u.to_display(solution.max_pressure, "pressure")),
         u.label("pressure"), ""),
    ]
    if s.is_open:
        rows.append(("spill level", _num(u.to_display(s.spill_level, "length")), L, ""))
    else:
        rows.append(("top of closed section", _num(u.to_display(s.z_max, "length")), L, ""))
    return Table("Totals", ("quantity", "value", "unit", "note"), tuple(rows))


def with_note(value, note):
    """``fmt(value)`` followed by ``(note)`` when there is one."""
    return f"{fmt(value)} ({note})" if note else fmt(value)


def parts_table(solution, units):
    """One row per loaded part: fx, fz, down (negative: uplift)."""
    u = units
    F = u.label("force")
    rows = []
    for name, p in solution.parts.items():
        rows.append((name, _num(None if p.fx is None else u.to_display(p.fx, "force")),
                     _num(u.to_display(p.fz, "force")), _num(u.to_display(p.down, "force")),
                     "uplift" if p.down < 0 else ""))
    return Table("Parts", ("part", f"fx [{F}]", f"fz [{F}]", f"down [{F}]", "note"),
                 tuple(rows))


def edges_table(solution, units):
    """One row per edge, in the file's order: geometry, pressures, forces,
    centre of pressure (plane) or hoop forces (axisymmetric)."""
    u = units
    s = solution.section
    L, P, F = u.label("length"), u.label("pressure"), u.label("force")
    NL = u.label("force_per_length")
    axi = s.is_axisymmetric
    header = ["edge", "part", f"x start [{L}]", f"z start [{L}]", f"x end [{L}]",
              f"z end [{L}]", f"wetted length [{L}]", f"p start [{P}]", f"p end [{P}]"]
    if axi:
        header += [f"fz [{F}]", f"hoop start [{NL}]", f"hoop end [{NL}]"]
    else:
        header += [f"fx [{F}]", f"fz [{F}]", f"resultant [{F}]", f"cp x [{L}]", f"cp z [{L}]"]
    pts = u.to_display(s.outline, "length")
    n = s.n_edges
    wl = u.to_display(solution.wetted_length, "length")
    p0 = u.to_display(solution.p_start, "pressure")
    p1 = u.to_display(solution.p_end, "pressure")
    rows = []
    if axi:
        fz = u.to_display(solution.fz, "force")
        h0 = u.to_display(solution.hoop_start, "force_per_length")
        h1 = u.to_display(solution.hoop_end, "force_per_length")
    else:
        fx = u.to_display(solution.fx, "force")
        fz = u.to_display(solution.fz, "force")
        res = u.to_display(solution.resultant, "force")
        cp = u.to_display(solution.centre_of_pressure, "length")
    for i in range(n):
        j = (i + 1) % n
        row = [i, s.parts[i], _num(pts[i, 0]), _num(pts[i, 1]), _num(pts[j, 0]),
               _num(pts[j, 1]), _num(wl[i]), _num(p0[i]), _num(p1[i])]
        if axi:
            row += [_num(fz[i]), _num(h0[i]), _num(h1[i])]
        else:
            row += [_num(fx[i]), _num(fz[i]), _num(res[i]), _num(cp[i, 0]), _num(cp[i, 1])]
        rows.append(tuple(row))
    return Table("Edges", tuple(header), tuple(rows))


def level_load_table(case: Case, units: DisplayUnits, steps: int = 51) -> Table:
    """Totals at ``steps`` levels from empty to the top level."""
    u = units
    t = level_table(case.section, case.liquid.density, case.gravity, steps)
    F = u.label("force")
    quantity = {"level": ("length", u.label("length")),
                "volume": ("volume", u.label("volume")),
                "max_pressure": ("pressure", u.label("pressure"))}
    header, cols = [], []
    for name, arr in t.columns():
        q, lab = quantity.get(name, ("force", F))
        # Readable names for the fixed columns; part names exactly as written,
        # so that parts "a_b" and "a b" stay two columns.
        title = name if name.startswith("down:") else name.replace("_", " ")
        header.append(f"{title} [{lab}]")
        cols.append(u.to_display(arr, q))
    rows = tuple(tuple(_num(c[k]) for c in cols) for k in range(t.levels.size))
    return Table("Loads against level", tuple(header), rows)


def uplift_table(case, units, solution=None):
    """The uplift check of every part with a resistance entered."""
    u = units
    F = u.label("force")
    L = u.label("length")
    rows = []
    for r in case.uplift(solution):
        rows.append((r.part, _num(u.to_display(r.resistance, "force")),
                     _num(u.to_display(r.uplift, "force")), _num(r.factor),
                     _num(u.to_display(r.worst_level, "length")),
                     _num(u.to_display(r.worst_uplift, "force")), _num(r.worst_factor),
                     _num(r.required_factor), r.verdict))
    return Table("Uplift check", ("part", f"resistance [{F}]", f"uplift now [{F}]",
                                  "factor now", f"worst level [{L}]", f"worst uplift [{F}]",
                                  "worst factor", "required", "verdict"), tuple(rows))


def _csv_cell(v: object) -> object:
    """A cell: empty for None, the shortest exact text of a float (numpy's
    too), integers as integers, text as written (the csv module quotes it)."""
    if v is None:
        return ""
    if isinstance(v, (float, np.floating)):
        return repr(float(v))
    if isinstance(v, np.integer):
        return int(v)
    return v


def to_csv(table: Table) -> str:
    """CSV text of ``table``: the header row names the units; numbers at
    full precision; empty cells where a value is not defined; text cells
    (part names) exactly as written, quoted by the csv module where they
    hold a comma, a quote or a line break (RFC 4180)."""
    buf = io.StringIO()
    w = csv.writer(buf, lineterminator="\n")
    w.writerow(table.header)
    for row in table.rows:
        w.writerow([_csv_cell(v) for v in row])
    return buf.getvalue()
