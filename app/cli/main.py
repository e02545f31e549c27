"""The ``wetline`` command line.

Headless commands for batch work and scripts; they import no Qt (except
``export --png/--svg`` and ``report``, which paint):

- ``wetline solve FILE [--level L | --volume V] [--units si|us] [--json | --csv]``
- ``wetline table FILE [--steps N] [--units si|us] [--csv]``
- ``wetline export FILE [--png OUT] [--svg OUT] [--dxf OUT] [--level L | --volume V]
  [--units si|us] [--size WxH]`` (at least one of ``--png``, ``--svg``, ``--dxf``)
- ``wetline report FILE [FILE ...] -o OUT [--level L | --volume V] [--units si|us]``: the
  PDF calculation sheet; with several files OUT is a folder (made if missing) that gets
  ``<stem>.pdf`` for each, with progress on standard error, and a bad file is reported
  (``error: FILE: ...``) while the others still finish (exit status 2 if any failed)
- ``wetline import DRAWING.dxf -o OUT.section.json [--choose N|HANDLE|LAYER] [--unit U]
  [--axisymmetric] [--liquid-density RHO] [--level L]``

``wetline`` alone, or ``wetline FILE``, opens the desktop program.

Bad input of any kind ends with exit status 2 and one line ``error: ...`` on
standard error, never a traceback.
"""

from __future__ import annotations

import argparse
import json
import math
import sys

from wetline.core.numbers import format_number

__all__ = ["main"]

COMMANDS = ("solve", "table", "export", "import", "report")


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
        g.add_argument("--level", type=float, metavar="L",
                       help="fill to this level, in the file's length unit")
        g.add_argument("--volume", type=float, metavar="V",
                       help="fill with this volume [m3] (plane: area x width)")

    sp = sub.add_parser("solve", help="print the loads at the file's fill (or --level/--volume)")
    sp.add_argument("file", metavar="FILE", help="a *.section.json file")
    fill_options(sp)
    sp.add_argument("--units", choices=("si", "us"), default="si",
                    help="units of the readable table (JSON is always SI)")
    sp.add_argument("--json", action="store_true",
                    help="print the results record (SI) instead of a table")
    sp.add_argument("--csv", action="store_true",
                    help="print the per-edge results as CSV (units in the header)")

    sp = sub.add_parser("table", help="print totals at levels from empty to the top")
    sp.add_argument("file", metavar="FILE")
    sp.add_argument("--steps", type=int, default=None, metavar="N",
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
    sp.add_argument("--liquid-density", type=float, metavar="RHO",
                    help="liquid density [kg/m3] (default: fresh water at 20 C)")
    sp.add_argument("--level", type=float, metavar="L",
                    help="fill level in the drawing unit (default: the top of the outline)")
    return p


# ----------------------------------------------------------------- helpers
def _load(path, level=None, volume=None):
    """Read a section file and apply a --level / --volume override."""
    from wetline.core.section_file import read_section_file
    from wetline.core.units import length_factor, to_si_exactly

    case = read_section_file(path)
    if level is not None:
        if not math.isfinite(level):
            raise CommandError(f"--level must be a finite number, not {level}")
        case = case.with_level(to_si_exactly(level, length_factor(case.length_unit)))
    elif volume is not None:
        if not math.isfinite(volume) or volume < 0:
            raise CommandError(f"--volume must be a number >= 0, not {volume}")
        case = case.with_volume(volume)  # FillError if the section cannot hold it
    return case


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


def solve_text(case, units_name="si"):
    """The readable table of ``wetline solve``."""
    from wetline.core.force_scope import force_scope
    from wetline.core.report_tables import (
        edges_table,
        parts_table,
        totals_table,
        uplift_table,
        with_note,
    )
    from wetline.core.results import CAUTION
    from wetline.core.units import display_units
    from wetline.core.uplift import UPLIFT_CAUTION

    u = display_units(units_name)
    sol = case.solve()
    sec = sol.section
    lu = case.length_unit
    scope = force_scope(sec, u, lu)
    liquid = case.liquid
    # Inputs are echoed with the digits that identify them.
    lines = [f"{sec.name or 'Section'}",
             f"  {sec.kind} section, {sec.n_edges} edges; forces in {scope.label} {scope.words}",
             f"  liquid: {liquid.name}, {u.text(liquid.density, 'density', 5)} "
             f"({liquid.source})",
             f"  gravity: {format_number(case.gravity, 7)} m/s2", ""]
    rows = [[name, with_note(value, note), unit]
            for name, value, unit, note in totals_table(sol, u, lu).rows]
    lines += ["Totals"] + ["  " + r for r in _table(rows, ["", "value", "unit"],
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
    if sol.warnings:
        lines += ["Warnings"] + [f"  - {w}" for w in sol.warnings] + [""]
    lines.append(f"Caution: {CAUTION}")
    return "\n".join(lines) + "\n"


def _cmd_solve(args, out):
    case = _load(args.file, args.level, args.volume)
    if args.json and args.csv:
        raise CommandError("give --json or --csv, not both")
    if args.json:
        from wetline.core.results import results_record

        json.dump(results_record(case), out, indent=2, allow_nan=False)
        out.write("\n")
    elif args.csv:
        from wetline.core.report_tables import edges_table, to_csv
        from wetline.core.units import display_units

        out.write(to_csv(edges_table(case.solve(), display_units(args.units),
                                     case.length_unit)))
    else:
        out.write(solve_text(case, args.units))
    return 0


# ----------------------------------------------------------------- table
def _cmd_table(args, out):
    from wetline.core.report_tables import cell_text, level_load_table, to_csv
    from wetline.core.units import display_units

    case = _load(args.file)
    steps = args.steps if args.steps is not None else (51 if args.csv else 21)
    if steps < 2:
        raise CommandError(f"--steps must be at least 2, not {steps}")
    if steps > 100_000:
        raise CommandError(f"--steps must be at most 100000, not {steps}")
    table = level_load_table(case, display_units(args.units), steps)
    if args.csv:
        out.write(to_csv(table))
    else:
        out.write(f"{case.section.name or 'Section'}: loads against level "
                  f"({case.liquid.name}, {format_number(case.liquid.density, 5)} kg/m3)\n")
        rows = [[cell_text(v) for v in r] for r in table.rows]
        for line in _table(rows, list(table.header), [">"] * len(table.header)):
            out.write(line + "\n")
    return 0


# ----------------------------------------------------------------- export
def _cmd_export(args, out):
    if args.png is None and args.dxf is None and args.svg is None:
        raise CommandError("give --png OUT, --svg OUT and/or --dxf OUT")
    size = None
    if args.size is not None:
        try:
            w, h = (int(v) for v in args.size.lower().split("x"))
        except ValueError:
            raise CommandError(f"--size must look like 3508x2480, not {args.size!r}") from None
        size = (w, h)
    case = _load(args.file, args.level, args.volume)
    if args.dxf is not None:
        from wetline.core.dxf_io import write_outline

        write_outline(case.section, args.dxf, unit=case.length_unit)
        out.write(f"wrote {args.dxf}\n")
    if args.png is not None:
        from wetline.app.render.png import export_png

        kwargs = {} if size is None else {"size": size}
        export_png(case, args.png, units=args.units, **kwargs)
        out.write(f"wrote {args.png}\n")
    if args.svg is not None:
        from wetline.app.render.svg import export_svg

        kwargs = {} if size is None else {"size": size}
        export_svg(case, args.svg, units=args.units, **kwargs)
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
        case = _load(files[0], args.level, args.volume)
        write_report(case, args.output, units=args.units)
        out.write(f"wrote {args.output}\n")
        return 0
    folder = Path(args.output)
    if folder.exists() and not folder.is_dir():
        raise CommandError(f"{folder} is not a folder (with several FILEs, -o names a folder)")
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
            write_report(_load(path, args.level, args.volume), target, units=args.units)
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
    from wetline.core.units import length_factor, to_si_exactly

    drawing = Path(args.file)
    outlines = list_outlines(drawing, unit=args.unit)
    outline = choose_outline(outlines, args.choose, source=drawing.name)
    section = outline.to_section(kind="axisymmetric" if args.axisymmetric else "plane",
                                 name=drawing.stem)
    if args.liquid_density is None:
        liquid = fresh_water(20.0)
    else:
        if not math.isfinite(args.liquid_density) or args.liquid_density <= 0:
            raise CommandError(f"--liquid-density must be a positive number of kg/m3, "
                               f"not {format_number(args.liquid_density)}")
        liquid = custom_liquid(args.liquid_density)
    if args.level is None:
        level = section.top_level
    elif not math.isfinite(args.level):
        raise CommandError(f"--level must be a finite number, not {args.level}")
    else:
        level = to_si_exactly(args.level, length_factor(outline.unit))
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
    handlers = {"solve": _cmd_solve, "table": _cmd_table, "export": _cmd_export,
                "import": _cmd_import, "report": _cmd_report}
    try:
        args = _parser().parse_args(argv)
        if args.command is None:
            raise CommandError("give a command: " + ", ".join(COMMANDS))
        return handlers[args.command](args, sys.stdout)
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
