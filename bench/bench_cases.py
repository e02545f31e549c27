"""Benchmark of load cases (figures printed; not a test).

    python bench/bench_cases.py [--repeat 200] [--vertices 2000] [--cases 20]

Target (issue 9): solving 20 load cases of a 2,000-vertex section with its
structure (liquid loads, groundwater, soil, flotation, net pressure on the
base) and their envelope well inside 8 ms. The design itself (checking the
structure against the cavity and the case-independent exterior geometry)
is built once per edit and timed apart, as are the JSON record pieces.
The mixed case set shares some situations (every overflow case, every
brine case), as real files do, and ``solve_all`` solves those once; the
second set has no two cases alike. Besides wall-clock medians the script
prints the process's CPU time (on a shared machine the wall time includes
waiting for a core) and one bare solve of the cavity for scale. Run in the
default environment (no malloc tuning).
"""

import argparse
import os
import platform
import statistics
import time

import numpy as np

from wetline.core.case import Case
from wetline.core.hydrostatics import solve
from wetline.core.liquids import custom_liquid
from wetline.core.load_cases import (
    EMPTY,
    SPILL,
    Design,
    LoadCase,
    case_record,
    cases_record,
    envelope,
)
from wetline.core.section import Section
from wetline.core.structure import Ground, Groundwater, Structure, walls_of_thickness


def wavy_tank(n, closed=False):
    """A rippled tank of n vertices with a floor, a top opening (or a lid,
    ``closed``) and wall parts, as bench_core.py."""
    t = np.linspace(0.0, 2.0 * np.pi, n, endpoint=False)
    r = 1.0 + 0.08 * np.sin(23.0 * t)
    x = 2.0 + 1.5 * r * np.cos(t)
    z = 2.0 + 1.8 * r * np.sin(t)
    parts = ["wall"] * n
    for i in range(n):
        if z[i] < 0.6 and z[(i + 1) % n] < 0.6:
            parts[i] = "floor"
        elif z[i] > 3.6 and z[(i + 1) % n] > 3.6:
            parts[i] = "lid" if closed else "open"
        elif x[i] > 3.0:
            parts[i] = "lid" if z[i] > 2.5 else "wall"
    return Section.build(np.c_[x, z], parts=parts, name="wavy tank")


def around(cavity, factor=1.15):
    """The cavity's outline enlarged about its centre (2, 2): a structure of
    as many vertices, holding it (the outline is star-shaped about the centre)."""
    c = np.array([2.0, 2.0])
    return Structure.build(c + factor * (cavity.outline - c), cavity=cavity)


def cases(k, spill, top):
    """k cases of every kind: levels, overflow (or full), empty under
    groundwater, volumes, another liquid; load factors 1 to 1.35."""
    out = []
    for i in range(k):
        kind = i % 5
        if kind == 0:
            out.append(LoadCase(f"level {i}", fill_level=0.5 + 3.0 * i / k))
        elif kind == 1:
            out.append(LoadCase(f"top {i}", fill_level=SPILL if spill else top,
                                load_factor=1.35))
        elif kind == 2:
            out.append(LoadCase(f"empty, groundwater {i}", fill_level=EMPTY,
                                groundwater=Groundwater(top * (0.4 + 0.6 * i / k))))
        elif kind == 3:
            out.append(LoadCase(f"volume {i}", fill_volume=2.0 + 0.2 * i,
                                groundwater=Groundwater(1.0), load_factor=1.2))
        else:
            out.append(LoadCase(f"brine {i}", liquid=custom_liquid(1200.0, "brine"),
                                groundwater=Groundwater(2.0 + 0.05 * i)))
    return tuple(out)


def distinct_cases(k, top):
    """k cases no two of which share a liquid situation or a groundwater level."""
    return tuple(LoadCase(f"distinct {i}", fill_level=0.2 + (top - 0.4) * i / k,
                          groundwater=Groundwater(0.1 + (top - 0.3) * (k - i) / k),
                          load_factor=1.0 + 0.01 * i) for i in range(k))


def timed_ms(fn, repeat):
    """(wall median, wall best, CPU median) of ``repeat`` runs [ms]. On a
    shared machine the wall time includes waiting for a core; the CPU time
    of this process does not."""
    for _ in range(max(3, repeat // 10)):
        fn()
    wall, cpu = [], []
    for _ in range(repeat):
        c0 = time.process_time()
        t0 = time.perf_counter()
        fn()
        wall.append(time.perf_counter() - t0)
        cpu.append(time.process_time() - c0)
    return (statistics.median(wall) * 1e3, min(wall) * 1e3, statistics.median(cpu) * 1e3)


def run(label, cav, structure, k, repeat, distinct=False):
    base = Case(cav, custom_liquid(1000.0, "water"), fill_level=3.0)
    cs = distinct_cases(k, cav.top_level) if distinct else cases(k, cav.is_open, cav.top_level)
    ground = Ground(3.5)
    print(f"{label}: cavity {cav.n_edges} vertices, structure {structure.n_edges} vertices, "
          f"{len(cs)} cases")
    t0 = time.perf_counter()
    structure.check(cav)
    t_check = (time.perf_counter() - t0) * 1e3
    d_med, d_best, d_cpu = timed_ms(lambda: Design(base, structure, ground, cs),
                                    max(10, repeat // 10))
    design = Design(base, structure, ground, cs)
    s_med, s_best, s_cpu = timed_ms(lambda: envelope(design.solve_all()), repeat)
    solved = design.solve_all()
    e_med, _, _ = timed_ms(lambda: envelope(solved), repeat)
    r_med, _, _ = timed_ms(lambda: cases_record(design, solved), 5)
    c_med, _, c_cpu = timed_ms(lambda: case_record(solved[0]), 20)
    one, _, one_cpu = timed_ms(lambda: solve(cav, 3.0, 1000.0), repeat)
    print(f"  structure check              {t_check:8.2f} ms (once per edit)")
    print(f"  Design (checks + geometry)   {d_med:8.2f} ms median, {d_best:.2f} best, "
          f"{d_cpu:.2f} CPU")
    print(f"  solve {len(cs)} cases + envelope  {s_med:8.2f} ms median, {s_best:.2f} best, "
          f"{s_cpu:.2f} CPU ({s_cpu / len(cs) * 1e3:.0f} us CPU a case)")
    print(f"    of which the envelope      {e_med:8.2f} ms")
    print(f"  one bare solve of the cavity {one * 1e3:8.1f} us median, {one_cpu * 1e3:.1f} us CPU "
          f"(for scale: the {len(cs)} cases cost {s_cpu / one_cpu:.0f} of them)")
    print(f"  cases record (JSON)          {r_med:8.2f} ms median")
    print(f"    one case's record          {c_med:8.2f} ms median, {c_cpu:.2f} CPU "
          f"({cav.n_edges} edges, {structure.n_edges} outer edges)")
    return s_med, s_best, s_cpu


def main():
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--repeat", type=int, default=200)
    ap.add_argument("--vertices", type=int, default=2000)
    ap.add_argument("--cases", type=int, default=20)
    args = ap.parse_args()
    print(f"python {platform.python_version()}, numpy {np.__version__}, "
          f"{platform.machine()}, {os.cpu_count()} cores, load average "
          f"{os.getloadavg()[0]:.1f}")
    closed = wavy_tank(args.vertices, closed=True)
    s_med, s_best, s_cpu = run("closed tank", closed, around(closed), args.cases, args.repeat)
    d_med, d_best, d_cpu = run("closed tank, no two cases alike", closed, around(closed),
                               args.cases, args.repeat, distinct=True)
    cav = wavy_tank(args.vertices)
    t0 = time.perf_counter()
    outline = walls_of_thickness(cav, base=0.4, wall=0.3, roof=0.3)
    t_walls = (time.perf_counter() - t0) * 1e3
    run("open tank, walls_of_thickness", cav, Structure.build(outline, cavity=cav), args.cases,
        args.repeat)
    print(f"walls_of_thickness at {args.vertices} vertices: {t_walls:.0f} ms (once, when asked)")
    for label, med, best, cpu in (("mixed cases", s_med, s_best, s_cpu),
                                  ("no two alike", d_med, d_best, d_cpu)):
        verdict = "ok" if med <= 8.0 else ("ok in CPU time" if cpu <= 8.0 else "MISSED")
        print(f"target: {args.cases} cases + envelope at {args.vertices} vertices (cavity and "
              f"structure) <= 8 ms, {label}: median {med:.2f}, best {best:.2f}, "
              f"CPU {cpu:.2f}: {verdict}")


if __name__ == "__main__":
    main()
