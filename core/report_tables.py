"""Result tables in display units, shared by the command line, the CSV
export, the calculation sheet and the desktop program.

Each function returns a :class:`Table`: column headers that name their units
and rows of plain values (float, str or None for "not defined"). Text for
people comes from :func:`cell_text` (the one number formatter,
:func:`wetline.core.numbers.format_number`); :func:`to_csv` writes full
precision.

Forces are shown as :func:`wetline.core.force_scope.force_scope` says: per
run (kN/m, lbf/ft) for a plane section one unit of run wide, else for the
section's width or over the full circumference (kN, lbf); the tables take
the ``length_unit`` of the section's file for that rule. A force smaller
than :data:`wetline.core.numbers.NOISE` of the case's largest force is
round-off and is given as 0 (the JSON results record keeps the computed
value).
"""

from __future__ import annotations

import csv
import io
import math
from dataclasses import dataclass
from typing import TYPE_CHECKING

import numpy as np

from .force_scope import force_scale, force_scope
from .level_table import level_table
from .numbers import Entered, format_entered, format_number, is_noise

if TYPE_CHECKING:
    from .case import Case
    from .level_table import LevelTable
    from .units import DisplayUnits

__all__ = ["Table", "totals_table", "with_note", "parts_table", "edges_table",
           "level_load_table", "uplift_table", "to_csv", "cell_text", "cases_table",
           "envelope_parts_table", "envelope_summary_table", "liquid_words"]


@dataclass(frozen=True)
class Table:
    """A titled table: ``header`` (tuple of str) and ``rows`` (tuple of tuples)."""

    title: str
    header: tuple
    rows: tuple


def cell_text(v):
    """A table cell as text for people: whole numbers (edge indices) as
    they are, coordinates (:class:`wetline.core.numbers.Entered`) as they
    were entered, other numbers (results) by
    :func:`wetline.core.numbers.format_number` at the precision policy's
    figures, ``-`` where a value is not defined, text as it is.

    >>> cell_text(3), cell_text(44129.925), cell_text(None), cell_text("floor")
    ('3', '44130', '-', 'floor')
    >>> cell_text(Entered(2.34567)), cell_text(2.34567)
    ('2.34567', '2.346')
    """
    if isinstance(v, (bool, int)):
        return str(v)
    if isinstance(v, Entered):
        return format_entered(v)
    return format_number(v)


def with_note(value, note):
    """:func:`cell_text` of ``value`` followed by ``(note)`` when there is one."""
    return f"{cell_text(value)} ({note})" if note else cell_text(value)


def _num(v):
    if v is None:
        return None
    v = float(v)
    return None if math.isnan(v) else v + 0.0


def _entered(v):
    """A coordinate for a table: shown as entered (None for NaN)."""
    v = _num(v)
    return None if v is None else Entered(v)


def _shown(values, divisor, scale):
    """``values`` [SI] over ``divisor`` (display units), with round-off below
    ``scale`` [SI] as 0."""
    v = np.asarray(values, dtype=np.float64)
    return np.where(is_noise(v, scale), 0.0, v / divisor)


def totals_table(solution, units, length_unit="m"):
    """Level, volume, weight, floor force, support reaction, max pressure and
    the spill level (or the top of a closed section), each with a note for
    people: "held down" for a negative support reaction, "capped at the spill
    level" for a level that was capped."""
    u = units
    s = solution.section
    scope = force_scope(s, u, length_unit)
    scale = force_scale(solution)
    F = scope.label
    L = u.label("length")
    capped = solution.level != solution.requested_level
    weight, floor, support = _shown([solution.fluid_weight, solution.floor_force,
                                     solution.support_reaction], scope.divisor, scale)
    rows = [
        ("level", _num(u.to_display(solution.level, "length")), L,
         "capped at the spill level" if capped else ""),
        ("volume", _num(u.to_display(solution.volume, "volume")), u.label("volume"), ""),
        ("fluid weight", _num(weight), F, ""),
        ("floor force", _num(floor), F, ""),
        ("support reaction", _num(support), F, "held down" if support < 0 else ""),
        ("max pressure", _num(u.to_display(solution.max_pressure, "pressure")),
         u.label("pressure"), ""),
    ]
    # A summary, to the results' figures as the window's totals and the
    # drawings give it; the outline's coordinates are echoed in full.
    if s.is_open:
        rows.append(("spill level", _num(u.to_display(s.spill_level, "length")), L, ""))
    else:
        rows.append(("top of closed section", _num(u.to_display(s.z_max, "length")), L, ""))
    return Table("Totals", ("quantity", "value", "unit", "note"), tuple(rows))


def parts_table(solution, units, length_unit="m"):
    """One row per loaded part: fx, fz, down (negative: uplift)."""
    scope = force_scope(solution.section, units, length_unit)
    scale = force_scale(solution)
    F = scope.label
    rows = []
    for name, p in solution.parts.items():
        fz, down = _shown([p.fz, p.down], scope.divisor, scale)
        fx = None if p.fx is None else _shown(p.fx, scope.divisor, scale)
        rows.append((name, _num(fx), _num(fz), _num(down), "uplift" if down < 0 else ""))
    return Table("Parts", ("part", f"fx [{F}]", f"fz [{F}]", f"down [{F}]", "note"),
                 tuple(rows))


def edges_table(solution, units, length_unit="m"):
    """One row per edge, in the file's order: geometry, pressures, forces,
    centre of pressure (plane) or hoop forces (axisymmetric)."""
    u = units
    s = solution.section
    scope = force_scope(s, u, length_unit)
    scale = force_scale(solution)
    L, P, F = u.label("length"), u.label("pressure"), scope.label
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
    fz = _shown(solution.fz, scope.divisor, scale)
    if axi:
        h0 = u.to_display(solution.hoop_start, "force_per_length")
        h1 = u.to_display(solution.hoop_end, "force_per_length")
    else:
        fx = _shown(solution.fx, scope.divisor, scale)
        res = _shown(solution.resultant, scope.divisor, scale)
        cp = u.to_display(solution.centre_of_pressure, "length")
    for i in range(n):
        j = (i + 1) % n
        row = [i, s.parts[i], _entered(pts[i, 0]), _entered(pts[i, 1]), _entered(pts[j, 0]),
               _entered(pts[j, 1]), _num(wl[i]), _num(p0[i]), _num(p1[i])]
        if axi:
            row += [_num(fz[i]), _num(h0[i]), _num(h1[i])]
        else:
            row += [_num(fx[i]), _num(fz[i]), _num(res[i]), _num(cp[i, 0]), _num(cp[i, 1])]
        rows.append(tuple(row))
    return Table("Edges", tuple(header), tuple(rows))


def level_load_table(case: Case, units: DisplayUnits, steps: int = 51,
                     table: LevelTable | None = None) -> Table:
    """Totals at ``steps`` levels from empty to the top level (of ``case``'s
    one liquid, pockets vented), or of a given ``table`` (a load case's
    layers, gas or trapped pockets: :meth:`~wetline.core.load_cases.ResolvedCase.level_tables`),
    whose title then names its pocket assumption."""
    u = units
    t = level_table(case.section, case.liquid.density, case.gravity, steps) if table is None \
        else table
    scope = force_scope(case.section, u, case.length_unit)
    quantity = {"level": ("length", u.label("length")),
                "volume": ("volume", u.label("volume")),
                "max_pressure": ("pressure", u.label("pressure"))}
    columns = list(t.columns())
    forces = [arr for name, arr in columns if name not in quantity]
    scale = max((float(np.nanmax(np.abs(a), initial=0.0)) for a in forces), default=0.0)
    header, cols = [], []
    for name, arr in columns:
        if name in quantity:
            q, lab = quantity[name]
            cols.append(u.to_display(arr, q))
        else:
            lab = scope.label
            cols.append(_shown(arr, scope.divisor, scale))
        # Readable names for the fixed columns; part names exactly as written,
        # so that parts "a_b" and "a b" stay two columns.
        title = name if name.startswith("down:") else name.replace("_", " ")
        header.append(f"{title} [{lab}]")
    rows = tuple(tuple(_num(c[k]) for c in cols) for k in range(t.levels.size))
    title = "Loads against level" if table is None else \
        f"Loads against level, pockets {t.pockets}"
    return Table(title, tuple(header), rows)


def uplift_table(case, units, solution=None):
    """The uplift check of every part with a resistance entered."""
    u = units
    scope = force_scope(case.section, u, case.length_unit)
    F = scope.label
    L = u.label("length")
    rows = []
    # Where air can be trapped, the table says which assumption gave the
    # worst level (with trapped pockets both are searched).
    pockets = solution is not None and case.section.pocket_tree.may_trap
    for r in case.uplift(solution):
        row = (r.part, _num(scope.to_display(r.resistance)),
               _num(scope.to_display(r.uplift)), _num(r.factor),
               _num(u.to_display(r.worst_level, "length")),
               _num(scope.to_display(r.worst_uplift)), _num(r.worst_factor),
               _num(r.required_factor), r.verdict)
        rows.append(row + ((r.worst_pockets,) if pockets else ()))
    header = ("part", f"resistance [{F}]", f"uplift now [{F}]", "factor now",
              f"worst level [{L}]", f"worst uplift [{F}]", "worst factor", "required", "verdict")
    return Table("Uplift check", header + (("worst with pockets",) if pockets else ()),
                 tuple(rows))


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


# ------------------------------------------------------------------ load cases
def liquid_words(resolved) -> str:
    """The liquid of a load case in a few words: its name, the layers bottom
    up (``"sewage + fat"``), a gas pressure and trapped air when present.

    Parameters
    ----------
    resolved : wetline.core.load_cases.ResolvedCase
    """
    names = [liquid.name for liquid in resolved.liquids] or [resolved.case.liquid.name]
    words = " + ".join(names)
    if resolved.gas_pressure:
        words += f"; gas {format_number(resolved.gas_pressure)} Pa"
    if resolved.pockets == "trapped":
        words += "; air trapped"
    return words


def _scale_of(solved) -> float:
    """The largest force over solved cases and their structures [N]."""
    big = 0.0
    for s in solved:
        big = max(big, force_scale(s.solution))
        if s.structure is not None:
            f = s.structure.flotation
            big = max(big, abs(f.uplift), abs(f.resistance))
    return big


def cases_table(design, solved, units):
    """One row per load case: name, liquid(s), level, groundwater, load
    factor, floor force, support reaction and max pressure (characteristic
    and design side by side), the flotation factor and its verdict, and the
    net upward pressure on the base slab (characteristic and design).

    Parameters
    ----------
    design : wetline.core.load_cases.Design
    solved : sequence of wetline.core.load_cases.SolvedCase
        ``design.solve_all()``.
    units : wetline.core.units.DisplayUnits

    Returns
    -------
    Table
        Flotation and base columns are ``None`` ("-") without a structure
        (the flotation factor also where nothing lifts the structure).
    """
    u = units
    section = design.section
    scope = force_scope(section, u, design.case.length_unit)
    scale = _scale_of(solved)
    F, L, P = scope.label, u.label("length"), u.label("pressure")
    rows = []
    for s in solved:
        r, sol, loads = s.resolved, s.solution, s.structure
        lf = s.load_factor
        floor, support = _shown([sol.floor_force, sol.support_reaction], scope.divisor, scale)
        level = _num(u.to_display(sol.level, "length"))
        gw = None if r.groundwater is None else _num(u.to_display(r.groundwater.level, "length"))
        pmax = _num(u.to_display(sol.max_pressure, "pressure"))
        fl_factor = verdict = base = base_d = None
        if loads is not None:
            fl_factor = _num(loads.flotation.factor)
            verdict = loads.flotation.verdict
            top = loads.base_net_max
            if top is not None:
                base = _num(u.to_display(top.net, "pressure"))
                base_d = _num(u.to_display(lf * top.net, "pressure"))
        rows.append((s.name, liquid_words(r), level, "dry" if gw is None and loads is not None
                     else gw, _num(lf), _num(floor), _num(lf * floor), _num(support),
                     _num(lf * support), pmax, _num(lf * u.to_display(sol.max_pressure,
                                                                      "pressure")),
                     fl_factor, verdict, base, base_d))
    header = ("case", "liquid", f"level [{L}]", f"groundwater [{L}]", "load factor",
              f"floor force [{F}]", f"floor force design [{F}]", f"support reaction [{F}]",
              f"support reaction design [{F}]", f"max pressure [{P}]",
              f"max pressure design [{P}]", "flotation factor", "flotation",
              f"base net upward [{P}]", f"base net upward design [{P}]")
    return Table("Load cases (characteristic; design = characteristic x load factor)", header,
                 tuple(rows))


def envelope_parts_table(env, design, units, scale=None):
    """The envelope per loaded part: largest downward load and largest
    uplift (design values) with the governing case.

    Parameters
    ----------
    env : wetline.core.load_cases.Envelope
    design : wetline.core.load_cases.Design
    units : wetline.core.units.DisplayUnits
    scale : float, optional
        The largest force of the cases [N], for round-off shown as 0.
    """
    scope = force_scope(design.section, units, design.case.length_unit)
    F = scope.label
    rows = []
    for name, p in env.parts.items():
        down, up = _shown([p.max_down, p.max_up], scope.divisor, scale)
        rows.append((name, _num(down), p.max_down_case, _num(up), p.max_up_case))
    return Table("Envelope by part (design values)",
                 ("part", f"max down [{F}]", "case", f"max uplift [{F}]", "case"), tuple(rows))


def envelope_summary_table(env, design, units):
    """The governing values of the envelope (design values), one row each:
    the lowest flotation factor, the governing net upward pressure on the
    base slab and the largest pressure on any cavity edge, each with its
    case and where.

    Parameters
    ----------
    env : wetline.core.load_cases.Envelope
    design : wetline.core.load_cases.Design
    units : wetline.core.units.DisplayUnits
    """
    u = units
    section = design.section
    P, L = u.label("pressure"), u.label("length")
    rows = []
    fl = env.flotation
    if fl is not None:
        where = (f"required {format_number(fl.required)}: {'OK' if fl.ok else 'NOT OK'}")
        rows.append(("lowest flotation factor", _num(fl.factor), "", fl.case, where))
    b = env.base
    if b is not None:
        where = "" if b.index is None else (
            f"floor edge {b.index} at x = {format_number(u.to_display(b.point[0], 'length'))} "
            f"{L}")
        rows.append(("net upward pressure on the base", _num(u.to_display(
            b.net_upward_pressure, "pressure")), P, b.case, where))
    if env.edge_max_pressure.size:
        i = int(np.argmax(env.edge_max_pressure))
        value, case = env.edge(i)
        rows.append(("largest pressure on an edge", _num(u.to_display(value, "pressure")), P,
                     case, f"edge {i} ({section.parts[i]})"))
    return Table("Envelope, governing values (design values)",
                 ("quantity", "value", "unit", "case", "where"), tuple(rows))
