"""Benchmark of load cases (figures printed; not a test).

    python bench/bench_cases.py [--repeat 200] [--vertices 2000] [--cases 20]

Target (issue 9): solving 20 load cases of a 2,000-vertex section with its
structure (liquid loads, groundwater, soil, flotation, net pressure on the
base) and their envelope well inside 8 ms. The design itself (checking the
structure against the cavity and the case-independent exterior geometry)
is built once per edit and timed apart, as are the JSON record pieces.
Run in the default environment (no malloc tuning).
"""

import argparse
import os
import platform
import statistics
import time

import numpy as np

from wetline.core.case import Case
from wetline.core.liquids import custom_liquid
from wetline.core.load_cases import EMPTY, SPILL, Design, LoadCase, cases_record, envelope
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


def timed_ms(fn, repeat):
    """(median, best) of ``repeat`` runs [ms]; the best shows the cost on an
    idle core, the median what a shared machine gave."""
    for _ in range(max(3, repeat // 10)):
        fn()
    times = []
    for _ in range(repeat):
        t0 = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t0)
    return statistics.median(times) * 1e3, min(times) * 1e3


def run(label, cav, structure, k, repeat):
    base = Case(cav, custom_liquid(1000.0, "water"), fill_level=3.0)
    cs = cases(k, cav.is_open, cav.top_level)
    ground = Ground(3.5)
    print(f"{label}: cavity {cav.n_edges} vertices, structure {structure.n_edges} vertices, "
          f"{len(cs)} cases")
    t0 = time.perf_counter()
    structure.check(cav)
    t_check = (time.perf_counter() - t0) * 1e3
    d_med, d_best = timed_ms(lambda: Design(base, structure, ground, cs), max(10, repeat // 10))
    design = Design(base, structure, ground, cs)
    s_med, s_best = timed_ms(lambda: envelope(design.solve_all()), repeat)
    solved = design.solve_all()
    e_med, _ = timed_ms(lambda: envelope(solved), repeat)
    r_med, _ = timed_ms(lambda: cases_record(design, solved), 5)
    print(f"  structure check              {t_check:8.2f} ms (once per edit)")
    print(f"  Design (checks + geometry)   {d_med:8.2f} ms median, {d_best:.2f} best")
    print(f"  solve {len(cs)} cases + envelope  {s_med:8.2f} ms median, {s_best:.2f} best "
          f"({s_best / len(cs) * 1e3:.0f} us a case at best)")
    print(f"    of which the envelope      {e_med:8.2f} ms")
    print(f"  cases record (JSON)          {r_med:8.2f} ms median")
    return s_med, s_best


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
    s_med, s_best = run("closed tank", closed, around(closed), args.cases, args.repeat)
    cav = wavy_tank(args.vertices)
    t0 = time.perf_counter()
    outline = walls_of_thickness(cav, base=0.4, wall=0.3, roof=0.3)
    t_walls = (time.perf_counter() - t0) * 1e3
    run("open tank, walls_of_thickness", cav, Structure.build(outline, cavity=cav), args.cases,
        args.repeat)
    print(f"walls_of_thickness at {args.vertices} vertices: {t_walls:.0f} ms (once, when asked)")
    verdict = "ok" if s_med <= 8.0 else ("ok on an idle core" if s_best <= 8.0 else "MISSED")
    print(f"target: {args.cases} cases + envelope at {args.vertices} vertices (cavity and "
          f"structure) <= 8 ms: median {s_med:.2f}, best {s_best:.2f}: {verdict}")


if __name__ == "__main__":
    main()
