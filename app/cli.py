"""The ``wetline`` command line.

Headless commands for batch work and scripts; they import no Qt (except
``export``, which paints the diagram):

- ``wetline solve FILE [--level L | --volume V] [--units si|us] [--json]``
- ``wetline table FILE [--steps N] [--units si|us] [--csv]``
- ``wetline export FILE --png OUT [--level L | --volume V] [--units si|us] [--size WxH]``

``wetline`` alone, or ``wetline FILE``, opens the desktop program.

Bad input of any kind ends with exit status 2 and one line ``error: ...`` on
standard error, never a traceback.
"""

from __future__ import annotations

import argparse
import csv
import io
import json
import math
import sys

__all__ = ["main"]

COMMANDS = ("solve", "table", "export")


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

    sp = sub.add_parser("table", help="print totals at levels from empty to the top")
    sp.add_argument("file", metavar="FILE")
    sp.add_argument("--steps", type=int, default=None, metavar="N",
                    help="number of levels, at least 2 (default 21; 51 with --csv)")
    sp.add_argument("--units", choices=("si", "us"), default="si")
    sp.add_argument("--csv", action="store_true", help="comma-separated values with units in the header")

    sp = sub.add_parser("export", help="draw the pressure diagram to a PNG file")
    sp.add_argument("file", metavar="FILE")
    sp.add_argument("--png", required=True, metavar="OUT", help="the PNG file to write")
    fill_options(sp)
    sp.add_argument("--units", choices=("si", "us"), default="si")
    sp.add_argument("--size", default=None, metavar="WxH",
                    help="image size in pixels (default 3508x2480: A4 landscape at 300 dpi)")
    return p


# ----------------------------------------------------------------- helpers
def _load(path, level=None, volume=None):
    """Read a section file and apply a --level / --volume override."""
    from core.section_file import read_section_file
    from core.units import length_factor

    case = read_section_file(path)
    if level is not None:
        if not math.isfinite(level):
            raise CommandError(f"--level must be a finite number, not {level}")
        case = case.with_level(level * length_factor(case.length_unit))
    elif volume is not None:
        if not math.isfinite(volume) or volume < 0:
            raise CommandError(f"--volume must be a number >= 0, not {volume}")
        from core.fill import capacity

        cap = capacity(case.section)
        if volume > cap * (1 + 1e-12):
            where = "below its spill level" if case.section.is_open else "in all"
            raise CommandError(
                f"--volume {volume:g} m3 is more than the section holds {where} ({cap:.6g} m3)")
        case = case.with_volume(volume)
    return case


def fmt(v, digits=5):
    """A number for a table: ``digits`` significant figures, no exponent
    for ordinary magnitudes, ``-`` for None/NaN."""
    if v is None or (isinstance(v, float) and math.isnan(v)):
        return "-"
    v = float(v)
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


def _table(rows, header, align=None):
    widths = [max(len(str(r[i])) for r in [header] + rows) for i in range(len(header))]
    align = align or ["<"] + [">"] * (len(header) - 1)
    out = []
    for r in [header] + rows:
        out.append("  ".join(f"{str(c):{a}{w}}" for c, a, w in zip(r, align, widths)).rstrip())
    out.insert(1, "  ".join("-" * w for w in widths))
    return out


def _force_units(section, units):
    """Label for forces: per run for plane sections 1 length unit wide."""
    label = units.label("force")
    if section.is_axisymmetric:
        return label, "over the full revolution"
    width = section.width / units.factor("length")
    return label, (f"for a width of {fmt(width)} {units.label('length')}")


# ----------------------------------------------------------------- solve
def solve_text(case, units_name="si"):
    """The readable table of ``wetline solve``."""
    from core.results import CAUTIONS
    from core.units import display_units

    u = display_units(units_name)
    sol = case.solve()
    sec = sol.section
    L, P, F = u.label("length"), u.label("pressure"), u.label("force")
    flabel, fnote = _force_units(sec, u)

    def ln(v):
        return fmt(u.to_display(v, "length"))

    def pr(v):
        return fmt(u.to_display(v, "pressure"))

    def fo(v):
        return None if v is None else fmt(u.to_display(v, "force"))

    liquid = case.liquid
    lines = [f"{sec.name or 'Section'}",
             f"  {sec.kind} section, {sec.n_edges} edges; forces in {flabel} {fnote}",
             f"  liquid: {liquid.name}, {fmt(u.to_display(liquid.density, 'density'))} "
             f"{u.label('density')} ({liquid.source})",
             f"  gravity: {fmt(case.gravity, 7)} m/s2",
             f"  level: {ln(sol.level)} {L}"
             + (f" (requested {ln(sol.requested_level)} {L})"
                if sol.level != sol.requested_level else "")
             + (f"; spill level {ln(sec.spill_level)} {L}" if sec.is_open
                else f"; closed, top {ln(sec.z_max)} {L}"),
             ""]
    support = fo(sol.support_reaction)
    if sol.support_reaction < 0:
        support += " (held down)"
    totals = [["volume", fmt(u.to_display(sol.volume, "volume")), u.label("volume")],
              ["fluid weight", fo(sol.fluid_weight), F],
              ["floor force", fo(sol.floor_force), F],
              ["support reaction", support, F],
              ["max pressure", pr(sol.max_pressure), P]]
    lines += ["Totals"] + ["  " + r for r in _table(totals, ["", "value", "unit"],
                                                     ["<", ">", "<"])]
    lines.append("")
    prows = []
    for name, p in sol.parts.items():
        prows.append([name, fo(p.fx) if p.fx is not None else "-", fo(p.fz), fo(p.down),
                      "uplift" if p.down < 0 else ""])
    lines += ["Parts"] + ["  " + r for r in _table(
        prows, ["part", f"fx [{F}]", f"fz [{F}]", f"down [{F}]", ""])]
    lines.append("")
    axi = sec.is_axisymmetric
    header = ["#", "part", f"start [{L}]", f"end [{L}]", f"wetted [{L}]",
              f"p start [{P}]", f"p end [{P}]"]
    header += ([f"fz [{F}]", f"hoop start [{u.label('force_per_length')}]",
                f"hoop end [{u.label('force_per_length')}]"] if axi else
               [f"fx [{F}]", f"fz [{F}]", f"resultant [{F}]", f"centre of pressure [{L}]"])
    erows = []
    pts = sec.outline
    n = sec.n_edges
    for i in range(n):
        j = (i + 1) % n
        row = [str(i), sec.parts[i], f"({ln(pts[i, 0])}, {ln(pts[i, 1])})",
               f"({ln(pts[j, 0])}, {ln(pts[j, 1])})", ln(sol.wetted_length[i]),
               pr(sol.p_start[i]), pr(sol.p_end[i])]
        if axi:
            fpl = u.factor("force_per_length")
            row += [fo(sol.fz[i]), fmt(sol.hoop_start[i] / fpl), fmt(sol.hoop_end[i] / fpl)]
        else:
            cp = sol.centre_of_pressure[i]
            row += [fo(sol.fx[i]), fo(sol.fz[i]), fo(sol.resultant[i]),
                    "-" if not math.isfinite(cp[0]) else f"({ln(cp[0])}, {ln(cp[1])})"]
        erows.append(row)
    lines += ["Edges"] + ["  " + r for r in _table(erows, header, [">", "<"] + [">"] * (len(header) - 2))]
    lines.append("")
    if sol.warnings:
        lines += ["Warnings"] + [f"  - {w}" for w in sol.warnings] + [""]
    lines.append(f"Caution: {CAUTIONS}")
    return "\n".join(lines) + "\n"


def _cmd_solve(args, out):
    case = _load(args.file, args.level, args.volume)
    if args.json:
        from core.results import results_record

        json.dump(results_record(case), out, indent=2, allow_nan=False)
        out.write("\n")
    else:
        out.write(solve_text(case, args.units))
    return 0


# ----------------------------------------------------------------- table
def table_rows(case, steps, units_name="si"):
    """Header (with units) and rows of the level-load table, display units."""
    from core.level_table import level_table
    from core.units import display_units

    u = display_units(units_name)
    t = level_table(case.section, case.liquid.density, case.gravity, steps)
    F, L = u.label("force"), u.label("length")
    quantity = {"level": ("length", L), "volume": ("volume", u.label("volume")),
                "max_pressure": ("pressure", u.label("pressure"))}
    header, cols = [], []
    for name, arr in t.columns():
        q, lab = quantity.get(name, ("force", F))
        header.append(f"{name.replace('_', ' ')} [{lab}]")
        cols.append(u.to_display(arr, q))
    rows = [[float(c[k]) for c in cols] for k in range(t.levels.size)]
    return header, rows


def _cmd_table(args, out):
    case = _load(args.file)
    steps = args.steps if args.steps is not None else (51 if args.csv else 21)
    if steps < 2:
        raise CommandError(f"--steps must be at least 2, not {steps}")
    if steps > 100_000:
        raise CommandError(f"--steps must be at most 100000, not {steps}")
    header, rows = table_rows(case, steps, args.units)
    if args.csv:
        buf = io.StringIO()
        w = csv.writer(buf, lineterminator="\n")
        w.writerow(header)
        for r in rows:
            w.writerow([repr(v + 0.0) for v in r])
        out.write(buf.getvalue())
    else:
        out.write(f"{case.section.name or 'Section'}: loads against level "
                  f"({case.liquid.name}, {fmt(case.liquid.density)} kg/m3)\n")
        for line in _table([[fmt(v) for v in r] for r in rows], header, [">"] * len(header)):
            out.write(line + "\n")
    return 0


# ----------------------------------------------------------------- export
def _cmd_export(args, out):
    size = None
    if args.size is not None:
        try:
            w, h = (int(v) for v in args.size.lower().split("x"))
        except ValueError:
            raise CommandError(f"--size must look like 3508x2480, not {args.size!r}") from None
        size = (w, h)
    case = _load(args.file, args.level, args.volume)
    from app.export_png import export_png

    kwargs = {} if size is None else {"size": size}
    export_png(case, args.png, units=args.units, **kwargs)
    out.write(f"wrote {args.png}\n")
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
        from app.gui import launch

        return launch(argv[0] if argv else None)
    handlers = {"solve": _cmd_solve, "table": _cmd_table, "export": _cmd_export}
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
