"""The ``wetline`` command line.

Headless commands for batch work and scripts; they import no Qt (except
``export --png/--svg`` and ``report``, which paint):

- ``wetline solve FILE [--case NAME] [--level L | --volume V] [--units si|us]
  [--json | --csv]``: one load case (default the first); ``--json`` adds a ``cases``
  list naming all of them
- ``wetline cases FILE [--units si|us] [--json | --csv]``: every load case's totals,
  flotation and the envelope (``--json``: the ``wetline-cases`` record of section
  format v3; ``--csv``: the case table)
- ``wetline table FILE [--case NAME] [--steps N] [--units si|us] [--csv]``
- ``wetline export FILE [--case NAME] [--png OUT] [--svg OUT] [--dxf OUT]
  [--level L | --volume V] [--units si|us] [--size WxH]`` (at least one of ``--png``,
  ``--svg``, ``--dxf``)
- ``wetline report FILE [FILE ...] -o OUT [--case NAME] [--level L | --volume V]
  [--units si|us]``: the PDF calculation sheet of one load case (default the first); with
  several files OUT is a folder (made if missing) that gets ``<stem>.pdf`` for each, with
  progress on standard error, and a bad file is reported (``error: FILE: ...``) while
  the others still finish (exit status 2 if any failed)
- ``wetline import DRAWING.dxf -o OUT.section.json [--choose N|HANDLE|LAYER] [--unit U]
  [--axisymmetric] [--liquid-density RHO] [--level L]``

``wetline`` alone, or ``wetline FILE``, opens the desktop program.

Bad input of any kind ends with exit status 2 and one line ``error: ...`` on
standard error, never a traceback. An output that is the same file as an
input (by any path, symbolic or hard link) or as another output is refused
before anything is read or written.
"""

from __future__ import annotations

import argparse
import json
import re
import sys
import warnings

from wetline.core.numbers import format_number

__all__ = ["main"]

COMMANDS = ("solve", "cases", "table", "export", "import", "report")

NUMBER_OPTIONS = frozenset({"--level", "--volume", "--steps", "--size", "--liquid-density"})
"""Options whose value is a number (or, for --size, two): a value that starts
with a minus sign is theirs, not another option."""

_NUMBER_LIKE = re.compile(r"-(?:[0-9.,]|inf|nan)", re.IGNORECASE)


class CommandError(Exception):
    """Bad input on the command line; the message is printed as ``error: ...``."""


class _Parser(argparse.ArgumentParser):
    def error(self, message):
        raise CommandError(message)


def _parser():
    p = _Parser(prog="wetline",
                description="Hydrostatic loads on container cross-sections. "
                            "Without a command, opens the desktop program "
                            "(on FILE if given).")
    sub = p.add_subparsers(dest="command", metavar="COMMAND")

    def fill_options(sp):
        g = sp.add_mutually_exclusive_group()
        g.add_argument("--level", metavar="L",
                       help="fill to this level, in the file's length unit")
        g.add_argument("--volume", metavar="V",
                       help="fill with this volume [m3] (plane: area x width)")

    def case_option(sp):
        sp.add_argument("--case", metavar="NAME",
                        help="the load case (default: the first in the file)")

    sp = sub.add_parser("solve", help="print the loads at the file's fill (or --level/--volume)")
    sp.add_argument("file", metavar="FILE", help="a *.section.json file")
    case_option(sp)
    fill_options(sp)
    sp.add_argument("--units", choices=("si", "us"), default="si",
                    help="units of the readable table (JSON is always SI)")
    sp.add_argument("--json", action="store_true",
                    help="print the results record (SI) instead of a table")
    sp.add_argument("--csv", action="store_true",
                    help="print the per-edge results as CSV (units in the header)")

    sp = sub.add_parser("cases", help="print every load case's totals, flotation and the "
                                      "envelope")
    sp.add_argument("file", metavar="FILE", help="a *.section.json file")
    sp.add_argument("--units", choices=("si", "us"), default="si",
                    help="units of the readable table and the CSV (JSON is always SI)")
    sp.add_argument("--json", action="store_true",
                    help="print the wetline-cases record (SI) instead of a table")
    sp.add_argument("--csv", action="store_true",
                    help="print the case table as CSV (units in the header)")

    sp = sub.add_parser("table", help="print totals at levels from empty to the top")
    sp.add_argument("file", metavar="FILE")
    case_option(sp)
    sp.add_argument("--steps", default=None, metavar="N",
                    help="number of levels, at least 2 (default 21; 51 with --csv)")
    sp.add_argument("--units", choices=("si", "us"), default="si")
    sp.add_argument("--csv", action="store_true",
                    help="comma-separated values with units in the header")

    sp = sub.add_parser("export", help="draw the pressure diagram to a PNG and/or SVG file "
                                       "and/or write the outline to a DXF file")
    sp.add_argument("file", metavar="FILE")
    sp.add_argument("--png", metavar="OUT", help="the PNG file to write")
    sp.add_argument("--svg", metavar="OUT", help="the SVG (vector) file to write")
    sp.add_argument("--dxf", metavar="OUT",
                    help="the DXF file to write: the outline, each edge on a layer "
                         "named after its part, in the file's length unit")
    case_option(sp)
    fill_options(sp)
    sp.add_argument("--units", choices=("si", "us"), default="si")
    sp.add_argument("--size", default=None, metavar="WxH",
                    help="image size in pixels (default: PNG 3508x2480, A4 landscape at "
                         "300 dpi; SVG 1600x1131)")

    sp = sub.add_parser("report", help="write the PDF calculation sheet of one or more "
                                       "section files")
    sp.add_argument("files", nargs="+", metavar="FILE", help="*.section.json files")
    sp.add_argument("-o", "--output", required=True, metavar="OUT",
                    help="the PDF to write (one FILE), or a folder for <stem>.pdf of each "
                         "FILE (several; made if missing)")
    case_option(sp)
    fill_options(sp)
    sp.add_argument("--units", choices=("si", "us"), default="si")

    sp = sub.add_parser("import", help="make a section file from a closed polyline "
                                       "in a DXF drawing")
    sp.add_argument("file", metavar="DRAWING", help="a DXF file")
    sp.add_argument("-o", "--output", required=True, metavar="OUT",
                    help="the *.section.json file to write")
    sp.add_argument("--choose", metavar="N|HANDLE|LAYER",
                    help="which closed polyline, when there are several: its number "
                         "(as listed), handle or layer")
    sp.add_argument("--unit", metavar="U",
                    help="drawing unit (mm, cm, m, in, ft ...); default: the unit the "
                         "drawing states, or mm if it states none")
    sp.add_argument("--axisymmetric", action="store_true",
                    help="the outline is a half-section about x = 0 (x is the radius)")
    sp.add_argument("--liquid-density", metavar="RHO",
                    help="liquid density [kg/m3] (default: fresh water at 20 C)")
    sp.add_argument("--level", metavar="L",
                    help="fill level in the drawing unit (default: the top of the outline)")
    return p


# ----------------------------------------------------------------- numbers
def attach_negative_values(argv):
    """``argv`` with ``--level -1e308`` written ``--level=-1e308``.

    argparse takes a token that starts with "-" for an option unless it is a
    plain negative number (``-1``, ``-0.5``), so ``-1e308``, ``-inf`` and
    ``-10x10`` after an option became "expected one argument". A number-like
    token after one of :data:`NUMBER_OPTIONS` is joined to it; anything else
    (``--png --svg x``) is left for argparse to report.
    """
    out, k = [], 0
    while k < len(argv):
        token = argv[k]
        if token == "--":
            out.extend(argv[k:])
            break
        if (token in NUMBER_OPTIONS and k + 1 < len(argv)
                and _NUMBER_LIKE.match(argv[k + 1])):
            out.append(f"{token}={argv[k + 1]}")
            k += 2
            continue
        out.append(token)
        k += 1
    return out


def _decimal(text, option):
    """The number typed for ``option`` (core.number_input.parse_decimal)."""
    from wetline.core.number_input import parse_decimal

    return parse_decimal(text, option)


def _whole(text, option):
    value = _decimal(text, option)
    if not value.is_integer():
        raise CommandError(f"{option} must be a whole number, not {text.strip()}")
    return int(value)


def _level_in_metres(text, unit, option="--level"):
    """The level typed in ``unit`` as metres, within the representable range."""
    from wetline.core.limits import COORDINATE_LIMIT
    from wetline.core.number_input import range_text
    from wetline.core.units import length_factor, to_si_exactly

    value = _decimal(text, option)
    factor = length_factor(unit)
    metres = to_si_exactly(value, factor)
    limit = COORDINATE_LIMIT
    if not -limit <= metres <= limit:
        allowed = range_text(-limit, limit, "m")
        if factor != 1.0:
            allowed = f"{range_text(-limit / factor, limit / factor, unit)} ({allowed})"
        raise CommandError(f"{option} must be {allowed}, not {text.strip()}")
    return metres


def _density(text, option):
    """A liquid density [kg/m3] typed for ``option``."""
    from wetline.core.limits import DENSITY_RANGE
    from wetline.core.number_input import range_text

    value = _decimal(text, option)
    if value <= 0:
        raise CommandError(f"{option} must be a positive number of kg/m3, not {text.strip()}")
    lo, hi = DENSITY_RANGE
    if not lo <= value <= hi:
        raise CommandError(f"{option} must be {range_text(lo, hi, 'kg/m3')}, "
                           f"not {text.strip()}")
    return value


def _image_size(text):
    """``(width, height)`` [px] from ``WxH``."""
    from wetline.core.number_input import NumberError

    parts = text.lower().split("x")
    try:
        if len(parts) != 2:
            raise NumberError(text)
        w, h = (_decimal(v, "--size") for v in parts)
    except NumberError:
        raise CommandError(f"--size must look like 3508x2480, not {text!r}") from None
    if not (w.is_integer() and h.is_integer()):
        raise CommandError(f"--size must look like 3508x2480, not {text!r}")
    if w < 1 or h < 1:
        raise CommandError(f"--size must give a positive width and height in pixels, "
                           f"not {text!r}")
    return int(w), int(h)


# ----------------------------------------------------------------- helpers
def _load(path, level=None, volume=None, case=None):
    """Read a section file and pick one load case (``case``: its name, default
    the first), with a --level / --volume override of its fill (the option's
    text): ``(design, resolved)``, the design holding the override. Core's
    refusals of the override say their lengths in the file's unit."""
    from wetline.core.numbers import set_figures
    from wetline.core.section_file import read_design
    from wetline.core.units import is_core_refusal, message_in_length_unit

    volume_m3 = None if volume is None else _decimal(volume, "--volume")
    if level is not None:
        _decimal(level, "--level")  # a bad number is said before the file is read
    if volume_m3 is not None and volume_m3 < 0:
        raise CommandError(f"--volume must be a number >= 0, not {volume.strip()}")
    design = read_design(path)
    # The file's precision policy (report.significant_figures) for every table.
    set_figures(design.case.report.significant_figures)
    index = 0 if case is None else design.index(case)  # names the cases if unknown
    try:
        return _override(design, index, level, volume_m3)
    except ValueError as exc:
        if not is_core_refusal(exc):
            raise
        # Core's lengths (metres) in the file's unit, as --level and the tables.
        raise CommandError(message_in_length_unit(str(exc), design.case.length_unit)) from None


def _override(design, index, level, volume_m3):
    """``(design, resolved)``: case ``index`` of ``design`` with its fill
    given by a --level text (the file's length unit) or a volume [m3], if
    either is given, and resolved."""
    from dataclasses import replace

    if level is not None or volume_m3 is not None:
        fill = ({"fill_level": _level_in_metres(level, design.case.length_unit),
                 "fill_volume": None} if level is not None
                else {"fill_level": None, "fill_volume": volume_m3})
        if design.cases:
            cases = list(design.cases)
            cases[index] = replace(cases[index], **fill)
            design = design.with_cases(cases)
        elif level is not None:
            design = design.with_case(design.case.with_level(fill["fill_level"]))
        else:  # FillError if the section cannot hold it
            design = design.with_case(design.case.with_volume(volume_m3))
    return design, design.resolve(design.names[index])




def _refuse_overwriting_inputs(outputs, inputs, distinct=True):
    """Refuse any output that is the same file as an input, or (``distinct``)
    as another output, before anything is read or written.

    ``outputs`` holds ``(option, path)`` pairs (``("--png", "d.png")``);
    ``inputs`` the paths read. A batch passes ``distinct=False``: two files
    with one sheet name are reported one by one, as the batch goes.
    """
    from wetline.core.atomic_write import same_file

    for option, out in outputs:
        for src in inputs:
            if same_file(out, src):
                raise CommandError(f"{option} {out} is the input file {src}; "
                                   "give another output file")
    for k, (option_a, a) in enumerate(outputs if distinct else ()):
        for option_b, b in outputs[k + 1:]:
            if same_file(a, b):
                raise CommandError(f"{option_a} and {option_b} name the same file {a}; "
                                   "give two files")


def _table(rows, header, align=None):
    widths = [max(len(str(r[i])) for r in [header] + rows) for i in range(len(header))]
    align = align or ["<"] + [">"] * (len(header) - 1)
    out = []
    for r in [header] + rows:
        cells = (f"{str(c):{a}{w}}" for c, a, w in zip(r, align, widths, strict=False))
        out.append("  ".join(cells).rstrip())
    out.insert(1, "  ".join("-" * w for w in widths))
    return out


# ----------------------------------------------------------------- solve
def _render(table, align=None):
    """Text lines of a report table, numbers formatted for people."""
    from wetline.core.report_tables import cell_text

    rows = [[cell_text(v) for v in r] for r in table.rows]
    return [table.title] + ["  " + line for line in _table(rows, list(table.header), align)]


def _law_lines(solved, u, scope):
    """Lines on the layers, gas, pockets and load factor of a solved case
    (none for one liquid at atmospheric pressure, vented, factor 1)."""
    sol, r = solved.solution, solved.resolved
    lines = []
    if len(sol.layers) > 1:
        lines.append("  layers, bottom up:")
        for k, layer in enumerate(sol.layers):
            lines.append(
                f"    {k + 1} {layer.name or 'liquid'}: {u.text(layer.density, 'density', 5)}, "
                f"{u.text(layer.bottom, 'length')} to {u.text(layer.top, 'length')}, "
                f"volume {u.text(layer.volume, 'volume')}, weight {scope.text(layer.weight)}")
    if sol.gas_pressure:
        lines.append(f"  gas over the surface: {u.text(sol.gas_pressure, 'pressure', 7)} gauge")
    if sol.pocket_mode == "trapped":
        if sol.pockets:
            lines.append(f"  pockets trapped (atmosphere "
                         f"{u.text(sol.atmospheric_pressure, 'pressure', 7)} absolute):")
            for p in sol.pockets:
                lines.append(
                    f"    sealed at {u.text(p.sealed_at, 'length')}, interface "
                    f"{u.text(p.interface, 'length')}, air at "
                    f"{u.text(p.air_pressure, 'pressure')} gauge, "
                    f"{u.text(p.air_volume, 'volume')}")
        else:
            lines.append("  pockets trapped: no air is sealed at this level")
    if r.load_factor != 1.0:
        lines.append(f"  load factor {format_number(r.load_factor)} (design value = "
                     "characteristic x load factor)")
    return lines


def _structure_lines(loads, u, scope):
    """The structure block of ``wetline solve``: weights, groundwater,
    flotation and the net upward pressure on the base."""
    f = loads.flotation
    gw = "dry ground" if loads.groundwater is None else \
        f"groundwater at {u.text(loads.groundwater.level, 'length')}"
    lines = ["Structure",
             f"  self-weight {scope.text(loads.self_weight)}, extra weight "
             f"{scope.text(loads.extra_weight)}, soil on ledges {scope.text(loads.soil_weight)}, "
             f"anchorage {scope.text(loads.anchorage)}",
             f"  {gw}: buoyancy {scope.text(loads.buoyancy)}",
             f"  flotation: uplift {scope.text(f.uplift)}, resistance {scope.text(f.resistance)}, "
             f"factor {format_number(f.factor)} (required {format_number(f.required)}): "
             f"{f.verdict}"]
    top = loads.base_net_max
    if top is not None:
        lines.append(f"  net upward pressure on the base: {u.text(top.net, 'pressure')} "
                     f"(floor edge {top.index}, groundwater {u.text(top.p_groundwater, 'pressure')}"
                     f" less liquid {u.text(top.p_liquid, 'pressure')})")
    for w in loads.warnings:
        lines.append(f"  warning: {u.message(w)}")
    return lines


def solve_text(solved, units_name="si", names=()):
    """The readable table of ``wetline solve`` for one solved load case
    (:class:`wetline.core.load_cases.SolvedCase`); ``names`` lists the
    file's cases."""
    from wetline.core.force_scope import force_scope
    from wetline.core.report_tables import (
        edges_table,
        parts_table,
        totals_table,
        uplift_table,
        with_note,
    )
    from wetline.core.results import CAUTION, EARTH_PRESSURE_CAUTION
    from wetline.core.units import display_units
    from wetline.core.uplift import UPLIFT_CAUTION

    u = display_units(units_name)
    r = solved.resolved
    case = r.case
    sol = solved.solution
    sec = sol.section
    lu = case.length_unit
    scope = force_scope(sec, u, lu)
    liquid = case.liquid
    # Inputs are echoed with the digits that identify them.
    lines = [f"{sec.name or 'Section'}"]
    if len(names) > 1:
        lines.append(f"  load case {solved.name!r} ({r.index + 1} of {len(names)}: "
                     f"{', '.join(repr(n) for n in names)})")
    lines.append(f"  {sec.kind} section, {sec.n_edges} edges; forces {scope.words} "
                 f"({scope.label})")
    if len(sol.layers) <= 1:
        lines.append(f"  liquid: {liquid.name}, {u.text(liquid.density, 'density', 5)} "
                     f"({liquid.source})")
    lines.append(f"  gravity: {format_number(case.gravity, 7)} m/s2")
    lines += _law_lines(solved, u, scope)
    lines.append("")
    rows = [[name, with_note(value, note), unit]
            for name, value, unit, note in totals_table(sol, u, lu).rows]
    lines += ["Totals"] + ["  " + row for row in _table(rows, ["", "value", "unit"],
                                                         ["<", ">", "<"])]
    lines.append("")
    lines += _render(parts_table(sol, u, lu))
    lines.append("")
    lines += _render(edges_table(sol, u, lu), [">", "<"] + [">"] * 14)
    lines.append("")
    uplift = uplift_table(case, u, sol)
    if uplift.rows:
        lines += _render(uplift)
        lines.append(f"  required factor {format_number(case.required_uplift_factor)}; "
                     f"{UPLIFT_CAUTION}")
        lines.append("")
    if solved.structure is not None:
        lines += _structure_lines(solved.structure, u, scope) + [""]
    if sol.warnings:
        lines += ["Warnings"] + [f"  - {u.message(w)}" for w in sol.warnings] + [""]
    lines.append(f"Caution: {CAUTION}")
    if solved.structure is not None:
        lines.append(f"Caution: {EARTH_PRESSURE_CAUTION}")
    return "\n".join(lines) + "\n"


def _cmd_solve(args, out):
    if args.json and args.csv:
        raise CommandError("give --json or --csv, not both")
    design, resolved = _load(args.file, args.level, args.volume, args.case)
    solved = design.solve(resolved.name)
    if args.json:
        from wetline.core.load_cases import case_record

        rec = case_record(solved)
        rec["cases"] = list(design.names)
        json.dump(rec, out, indent=2, allow_nan=False)
        out.write("\n")
    elif args.csv:
        from wetline.core.report_tables import edges_table, to_csv
        from wetline.core.units import display_units

        out.write(to_csv(edges_table(solved.solution, display_units(args.units),
                                     design.case.length_unit)))
    else:
        out.write(solve_text(solved, args.units, design.names))
    return 0


# ----------------------------------------------------------------- cases
def cases_text(design, solved, units_name="si"):
    """The readable tables of ``wetline cases``: every case, then the envelope."""
    from wetline.core.force_scope import force_scope
    from wetline.core.load_cases import envelope
    from wetline.core.report_tables import (
        _scale_of,
        cases_table,
        envelope_parts_table,
        envelope_summary_table,
    )
    from wetline.core.results import CAUTION, EARTH_PRESSURE_CAUTION
    from wetline.core.units import display_units

    u = display_units(units_name)
    sec = design.section
    scope = force_scope(sec, u, design.case.length_unit)
    env = envelope(solved)
    lines = [f"{sec.name or 'Section'}: {len(solved)} load case{'s' * (len(solved) != 1)}",
             f"  {sec.kind} section, {sec.n_edges} edges; forces {scope.words} "
             f"({scope.label})", ""]
    table = cases_table(design, solved, u)
    lines += _render(table, ["<", "<"] + [">"] * 10 + ["<"] + [">"] * 2)
    lines.append("")
    lines += _render(envelope_parts_table(env, design, u, _scale_of(solved)),
                     ["<", ">", "<", ">", "<"])
    lines.append("")
    summary = envelope_summary_table(env, design, u)
    if summary.rows:
        lines += _render(summary, ["<", ">", "<", "<", "<"])
        lines.append("")
    warned = [(s.name, w) for s in solved for w in s.warnings]
    if warned:
        lines += ["Warnings"] + [f"  - {name}: {u.message(w)}" for name, w in warned] + [""]
    lines.append(f"Caution: {CAUTION}")
    if design.structure is not None:
        lines.append(f"Caution: {EARTH_PRESSURE_CAUTION}")
    return "\n".join(lines) + "\n"


def _cmd_cases(args, out):
    if args.json and args.csv:
        raise CommandError("give --json or --csv, not both")
    design, _ = _load(args.file)
    solved = design.solve_all()
    if args.json:
        from wetline.core.load_cases import cases_record

        json.dump(cases_record(design, solved), out, indent=2, allow_nan=False)
        out.write("\n")
    elif args.csv:
        from wetline.core.report_tables import cases_table, to_csv
        from wetline.core.units import display_units

        out.write(to_csv(cases_table(design, solved, display_units(args.units))))
    else:
        out.write(cases_text(design, solved, args.units))
    return 0


# ----------------------------------------------------------------- table
def _cmd_table(args, out):
    from wetline.core.report_tables import cell_text, level_load_table, to_csv
    from wetline.core.units import display_units

    if args.steps is None:
        steps = 51 if args.csv else 21
    else:
        steps = _whole(args.steps, "--steps")
        if steps < 2:
            raise CommandError(f"--steps must be at least 2, not {args.steps.strip()}")
        if steps > 100_000:
            raise CommandError(f"--steps must be at most 100000, not {args.steps.strip()}")
    design, resolved = _load(args.file, case=args.case)
    case = resolved.case
    units = display_units(args.units)
    if resolved.is_one_liquid and not case.section.pocket_tree.may_trap:
        tables = [level_load_table(case, units, steps)]
    else:
        # The case's layers and gas; both pocket assumptions where air can be
        # trapped (the CSV holds the case's own).
        found = resolved.level_tables(steps)
        if args.csv:
            found = [t for t in found if t.pockets == resolved.pockets] or found[:1]
        tables = [level_load_table(case, units, steps, table=t) for t in found]
    if args.csv:
        out.write(to_csv(tables[0]))
        return 0
    from wetline.core.report_tables import liquid_words

    named = f" case {resolved.name!r}," if len(design.names) > 1 else ""
    liquid = liquid_words(resolved) if not resolved.is_one_liquid else (
        f"{case.liquid.name}, {format_number(case.liquid.density, 5)} kg/m3")
    for k, table in enumerate(tables):
        if k:
            out.write("\n")
        title = table.title[0].lower() + table.title[1:]
        out.write(f"{case.section.name or 'Section'}:{named} {title} ({liquid})\n")
        rows = [[cell_text(v) for v in r] for r in table.rows]
        for line in _table(rows, list(table.header), [">"] * len(table.header)):
            out.write(line + "\n")
    return 0


# ----------------------------------------------------------------- export
def _cmd_export(args, out):
    if args.png is None and args.dxf is None and args.svg is None:
        raise CommandError("give --png OUT, --svg OUT and/or --dxf OUT")
    size = None if args.size is None else _image_size(args.size)
    outputs = [(f"--{kind}", path) for kind, path in
               (("png", args.png), ("svg", args.svg), ("dxf", args.dxf)) if path is not None]
    _refuse_overwriting_inputs(outputs, [args.file])
    design, resolved = _load(args.file, args.level, args.volume, args.case)
    case = resolved.case
    if args.dxf is not None:
        from wetline.core.dxf_io import write_outline

        write_outline(case.section, args.dxf, unit=case.length_unit)
        out.write(f"wrote {args.dxf}\n")
    # The diagrams draw the case with its structure, ground and groundwater,
    # exactly as the window's File > Export does.
    if args.png is not None:
        from wetline.app.render.png import export_png

        kwargs = {} if size is None else {"size": size}
        export_png(design, args.png, case=resolved.name, units=args.units, **kwargs)
        out.write(f"wrote {args.png}\n")
    if args.svg is not None:
        from wetline.app.render.svg import export_svg

        kwargs = {} if size is None else {"size": size}
        export_svg(design, args.svg, case=resolved.name, units=args.units, **kwargs)
        out.write(f"wrote {args.svg}\n")
    return 0


# ----------------------------------------------------------------- report
def _stem(path):
    """``sump`` for ``.../sump.section.json`` (else the name without its suffix)."""
    from pathlib import Path

    name = Path(path).name
    for suffix in (".section.json", ".json"):
        if name.lower().endswith(suffix) and len(name) > len(suffix):
            return name[: -len(suffix)]
    return Path(name).stem or name


class _Progress:
    """Progress of a batch on standard error: a bar redrawn in place on a
    terminal, one plain line per file otherwise."""

    def __init__(self, total, stream):
        self.total, self.stream = total, stream
        self.tty = bool(getattr(stream, "isatty", lambda: False)())

    def start(self, k, name):
        if self.tty:
            width = 24
            done = int(width * (k - 1) / self.total)
            bar = "#" * done + "-" * (width - done)
            self.stream.write(f"\r[{bar}] {k}/{self.total} {name[:40]:<40}")
            self.stream.flush()

    def finish(self, k, name, ok):
        if self.tty:
            if k == self.total:
                self.stream.write(f"\r[{'#' * 24}] {k}/{self.total} done{' ' * 37}\n")
        else:
            self.stream.write(f"[{k}/{self.total}] {name} ... {'ok' if ok else 'failed'}\n")
        self.stream.flush()

    def message(self, text):
        if self.tty:
            self.stream.write("\r\033[K")
        self.stream.write(text + "\n")
        self.stream.flush()


def _cmd_report(args, out):
    from pathlib import Path

    from wetline.app.render.sheet import write_report

    files = list(args.files)
    if len(files) == 1:
        _refuse_overwriting_inputs([("-o", args.output)], files)
        design, _ = _load(files[0], args.level, args.volume, args.case)
        write_report(design, args.output, units=args.units, case=args.case)
        out.write(f"wrote {args.output}\n")
        return 0
    folder = Path(args.output)
    if folder.exists() and not folder.is_dir():
        raise CommandError(f"{folder} is not a folder (with several FILEs, -o names a folder)")
    _refuse_overwriting_inputs([(f"-o {folder}: the sheet", folder / f"{_stem(path)}.pdf")
                                for path in files], files, distinct=False)
    try:
        folder.mkdir(parents=True, exist_ok=True)
    except OSError as exc:
        raise CommandError(f"cannot make the folder {folder}: {exc.strerror or exc}") from None
    progress = _Progress(len(files), sys.stderr)
    failed, written, targets = [], 0, {}
    for k, path in enumerate(files, start=1):
        name = Path(path).name
        progress.start(k, name)
        target = folder / f"{_stem(path)}.pdf"
        problem = None
        try:
            if target in targets:
                raise CommandError(f"gives the same sheet name {target.name} as "
                                   f"{targets[target]}")
            targets[target] = path
            design, _ = _load(path, args.level, args.volume, args.case)
            write_report(design, target, units=args.units, case=args.case)
        except (CommandError, ValueError) as exc:
            problem = str(exc)
        except OSError as exc:
            problem = str(exc.strerror or exc)
        progress.finish(k, name, problem is None)
        if problem is None:
            written += 1
        else:
            failed.append(path)
            # Messages from reading a file often start with its name already.
            if problem.startswith(f"{name}: "):
                problem = problem[len(name) + 2:]
            progress.message(f"error: {path}: {problem}")
    out.write(f"wrote {written} of {len(files)} sheets to {folder}\n")
    if failed:
        print(f"failed: {len(failed)} of {len(files)}: {', '.join(failed)}", file=sys.stderr)
        return 2
    return 0


# ----------------------------------------------------------------- import
def _cmd_import(args, out):
    from pathlib import Path

    from wetline.core.case import Case
    from wetline.core.dxf_io import choose_outline, list_outlines
    from wetline.core.liquids import custom_liquid, fresh_water
    from wetline.core.section_file import write_section_file

    drawing = Path(args.file)
    _refuse_overwriting_inputs([("-o", args.output)], [args.file])
    outlines = list_outlines(drawing, unit=args.unit)
    outline = choose_outline(outlines, args.choose, source=drawing.name)
    section = outline.to_section(kind="axisymmetric" if args.axisymmetric else "plane",
                                 name=drawing.stem)
    if args.liquid_density is None:
        liquid = fresh_water(20.0)
    else:
        liquid = custom_liquid(_density(args.liquid_density, "--liquid-density"))
    if args.level is None:
        level = section.top_level
    else:
        level = _level_in_metres(args.level, outline.unit)
    case = Case(section=section, liquid=liquid, fill_level=level,
                length_unit=outline.unit)
    write_section_file(case, args.output)
    for w in outline.warnings:
        print(f"warning: {w}", file=sys.stderr)
    parts = "parts from the drawing's part layers" if outline.parts else "all parts 'wall'"
    out.write(f"wrote {args.output}: polyline #{outline.index} on layer {outline.layer}, "
              f"{outline.n_vertices} vertices in {outline.unit}, {parts}\n")
    return 0


# ----------------------------------------------------------------- main
def main(argv):
    """Run the command line with ``argv`` (no program name); exit status."""
    argv = list(argv)
    if not argv or (argv[0] not in COMMANDS and not argv[0].startswith("-")):
        if len(argv) > 1:
            print(f"error: unknown command {argv[0]!r} (commands: {', '.join(COMMANDS)}; "
                  "or a single FILE to open)", file=sys.stderr)
            return 2
        from wetline.app.window.launch import launch

        return launch(argv[0] if argv else None)
    handlers = {"solve": _cmd_solve, "cases": _cmd_cases, "table": _cmd_table,
                "export": _cmd_export, "import": _cmd_import, "report": _cmd_report}
    try:
        with warnings.catch_warnings():
            # A numeric warning means numbers out of range slipped past the
            # input checks: the run ends in one line rather than printing the
            # warning and giving results that may not hold.
            warnings.simplefilter("error", RuntimeWarning)
            args = _parser().parse_args(attach_negative_values(argv))
            if args.command is None:
                raise CommandError("give a command: " + ", ".join(COMMANDS))
            return handlers[args.command](args, sys.stdout)
    except RuntimeWarning as exc:
        print(f"error: a computation went out of range ({exc}); the input is outside what "
              "Wetline computes with", file=sys.stderr)
        return 2
    except CommandError as exc:
        print(f"error: {exc}", file=sys.stderr)
        return 2
    except ValueError as exc:  # every core input error is a ValueError subclass
        print(f"error: {exc}", file=sys.stderr)
        return 2
    except OSError as exc:
        print(f"error: {exc.filename or ''}: {exc.strerror or exc}", file=sys.stderr)
        return 2
    except BrokenPipeError:  # pragma: no cover - e.g. piped into head
        return 0
