"""Loads against level for the chart: the active case's law, both pocket
assumptions where the section can trap air.

A case of one liquid under no gas is :func:`wetline.core.level_table.level_table`
(fast, closed forms for every level at once). A case with layers or a gas
is :func:`wetline.core.level_table.law_level_table` from just above its top
interface (the layers below the top one stay where they are; the top
layer's surface moves). Where the section can trap air under a ceiling
(``section.pocket_tree.may_trap``) a second table with the air trapped
follows the vented one, whatever the case's own assumption, so the chart
shows which governs (:meth:`wetline.core.load_cases.ResolvedCase.level_tables`
does the same for the command line).
"""

from __future__ import annotations

import numpy as np
from numpy.typing import NDArray

from wetline.core.level_table import LevelTable, law_level_table, level_table
from wetline.core.load_cases import TRAPPED, Design
from wetline.core.pressure_law import PressureLaw

__all__ = ["case_level_tables"]


def case_level_tables(design: Design, active: int, levels: NDArray[np.float64],
                      solved_levels: int | None = None) -> tuple[LevelTable, ...]:
    """The chart's tables of case ``active`` of ``design`` at ``levels`` [m]
    (ascending, from the lowest point to the spill or top level): pockets
    vented first, then trapped where the section can trap air. With layers
    the levels start just above the top interface.

    ``solved_levels``, if given, caps the number of levels where the tables
    are solved level by level (layers, a gas, trapped air: a pocket solve
    and an exact integration at each, about 0.1 to 0.5 ms a level), over the
    same range: a drag's preview, whose full table follows on release. The
    closed-form table of one vented liquid keeps every level."""
    r = design.resolve(design.names[active])
    c = r.case
    section = c.section
    law = r.law
    plain = law is None or (len(r.liquids) <= 1 and r.gas_pressure == 0.0)
    may_trap = section.pocket_tree.may_trap
    if plain and not may_trap:
        return (level_table(section, c.liquid.density, c.gravity, levels=levels),)
    if law is None:
        law = PressureLaw.single(c.liquid.density, float(levels[-1]), c.gravity)
    levels = np.asarray(levels, dtype=np.float64)
    cap = None if solved_levels is None else max(int(solved_levels), 2)
    if cap is not None and levels.size > cap:
        ends = float(levels[0]), float(levels[-1])
        levels = np.linspace(*ends, cap)
        levels[-1] = ends[1]  # the spill level, exactly
    if law.interfaces:
        top = law.interfaces[-1]
        hi = float(levels[-1])
        if not hi > top:
            return (level_table(section, c.liquid.density, c.gravity, levels=levels),)
        lv = np.linspace(top, hi, levels.size)
        lv[0] = top + 1e-6 * (hi - top)
        lv[-1] = hi
        levels = lv
    if plain:
        tables = [level_table(section, c.liquid.density, c.gravity, levels=levels)]
    else:
        tables = [law_level_table(section, law, levels=levels)]
    if may_trap:
        tables.append(law_level_table(section, law, levels=levels, pockets=TRAPPED,
                                      atmospheric_pressure=r.atmospheric_pressure))
    return tuple(tables)
