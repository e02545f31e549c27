"""Benchmark of the core engine (figures printed; not a test).

    python bench/bench_core.py [--repeat 300]

Targets (issue "Core engine"): solving a 10,000-vertex section (all edges,
parts and totals) in at most 0.25 ms median on one core, and at most 12 times
one numpy shoelace-area pass over the same outline measured in the same run;
level from volume at 10,000 vertices in at most 0.5 ms; cost linear in the
number of vertices. Run in the default environment (no malloc tuning).
"""

import argparse
import os
import platform
import statistics
import time

import numpy as np

from wetline.core.fill import level_for_volume
from wetline.core.hydrostatics import solve
from wetline.core.section import Section

SIZES = (100, 1_000, 10_000, 100_000)


def wavy_tank(n, kind="plane"):
    """A closed outline of n vertices: a tank whose walls ripple, with a
    floor, an opening at the top and many wall parts; a test of scale."""
    t = np.linspace(0.0, 2.0 * np.pi, n, endpoint=False)
    r = 1.0 + 0.08 * np.sin(23.0 * t)
    x = 2.0 + 1.5 * r * np.cos(t)
    z = 2.0 + 1.8 * r * np.sin(t)
    parts = ["wall"] * n
    for i in range(n):
        if z[i] < 0.6 and z[(i + 1) % n] < 0.6:
            parts[i] = "floor"
        elif z[i] > 3.6 and z[(i + 1) % n] > 3.6:
            parts[i] = "open"
        elif x[i] > 3.0:
            parts[i] = "lid" if z[i] > 2.5 else "wall"
    return Section.build(np.c_[x, z], parts=parts, kind=kind)


def median_us(fn, repeat):
    for _ in range(max(5, repeat // 10)):
        fn()
    times = []
    for _ in range(repeat):
        t0 = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t0)
    return statistics.median(times) * 1e6


def main():
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--repeat", type=int, default=300)
    args = ap.parse_args()
    print(f"python {platform.python_version()}, numpy {np.__version__}, "
          f"{platform.machine()}, {os.cpu_count()} cores")
    for var in ("OPENBLAS_CORETYPE", "MALLOC_MMAP_THRESHOLD_"):
        if var in os.environ:
            print(f"  note: {var}={os.environ[var]}")
    header = (f"{'vertices':>9} {'build ms':>9} {'solve us':>9} {'shoelace us':>12} "
              f"{'ratio':>6} {'level-from-volume us':>21} {'solve us/vertex':>16}")
    print(header)
    rows = {}
    for n in SIZES:
        t0 = time.perf_counter()
        s = wavy_tank(n)
        build_ms = (time.perf_counter() - t0) * 1e3
        _ = s.geometry, s.volume_curve  # built once, outside the timings
        x = np.ascontiguousarray(s.outline[:, 0])
        z = np.ascontiguousarray(s.outline[:, 1])
        level = 3.0
        repeat = args.repeat if n <= 10_000 else max(20, args.repeat // 10)
        t_solve = median_us(lambda s=s, level=level: solve(s, level, 1000.0), repeat)
        def shoelace(x=x, z=z):
            return 0.5 * np.sum(x * np.roll(z, -1) - np.roll(x, -1) * z)

        t_shoe = median_us(shoelace, repeat)
        volume = solve(s, level, 1000.0).volume
        t_lfv = median_us(lambda s=s, volume=volume: level_for_volume(s, volume), repeat)
        rows[n] = t_solve
        print(f"{n:>9} {build_ms:>9.2f} {t_solve:>9.1f} {t_shoe:>12.1f} {t_solve / t_shoe:>6.1f} "
              f"{t_lfv:>21.1f} {t_solve / n * 1e3:>13.2f} ns")
        if n == 10_000:
            verdict = ("ok" if t_solve <= 250 and t_solve <= 12 * t_shoe and t_lfv <= 500
                       else "MISSED")
            summary = (f"10k targets: solve {t_solve:.0f} us (<= 250), "
                       f"{t_solve / t_shoe:.1f} x shoelace (<= 12), "
                       f"level from volume {t_lfv:.0f} us (<= 500): {verdict}")
    print(summary)
    print(f"scaling 10k -> 100k: x{rows[100_000] / rows[10_000]:.1f} for x10 vertices")
    s = wavy_tank(10_000, kind="axisymmetric")
    print(f"axisymmetric 10k: solve {median_us(lambda: solve(s, 3.0, 1000.0), args.repeat):.1f} us")


if __name__ == "__main__":
    main()
