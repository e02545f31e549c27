"""Benchmark of the full pressure law: layers, gas, trapped air (figures printed; not a test).

    python bench/bench_pressure.py [--repeat 300]

Targets (issue 10): layers and gas add at most 30 % to a solve at 10,000
vertices; the trapped-pocket search at 10,000 vertices in at most 2 ms, on
the bench's wavy tank (its rippled top makes domes and saddles) and on a
section without pockets. Timings are interleaved (each round runs every
case once) so that a busy machine slows them alike, and the ratios hold.
Run in the default environment (no malloc tuning).
"""

import argparse
import os
import platform
import statistics
import time

import numpy as np
from bench_core import wavy_tank

from wetline.core.hydrostatics import solve
from wetline.core.pockets import find_pockets, level_for_liquid_volume, trap_air
from wetline.core.pressure_law import Layer, PressureLaw, integrate_edges, liquid_volume_below
from wetline.core.section import OPEN, Section

N = 10_000


def closed(s):
    """The same outline with its opening made a lid (a gas needs a closed section)."""
    return Section.build(s.outline, parts=["lid" if p == OPEN else p for p in s.parts],
                         kind=s.kind)


def smooth_tank(n, kind="plane"):
    """An ellipse of n vertices: no saddle, so nothing can be trapped."""
    t = np.linspace(0.0, 2.0 * np.pi, n, endpoint=False)
    parts = ["open" if np.sin(u) > 0.999 else "wall" for u in t]
    return Section.build(np.c_[2.0 + 1.5 * np.cos(t), 2.0 + 1.8 * np.sin(t)], parts=parts,
                         kind=kind)


def interleaved(cases, repeat):
    """Median time [us] of each callable, the rounds interleaved."""
    for fn in cases.values():
        for _ in range(max(5, repeat // 20)):
            fn()
    times = {k: [] for k in cases}
    for _ in range(repeat):
        for k, fn in cases.items():
            t0 = time.perf_counter()
            fn()
            times[k].append(time.perf_counter() - t0)
    return {k: statistics.median(v) * 1e6 for k, v in times.items()}


def main():
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--repeat", type=int, default=300)
    args = ap.parse_args()
    print(f"python {platform.python_version()}, numpy {np.__version__}, "
          f"{platform.machine()}, {os.cpu_count()} cores, load {os.getloadavg()[0]:.1f}")
    for kind in ("plane", "axisymmetric"):
        s = wavy_tank(N, kind)
        sc = closed(s)
        _ = s.geometry, sc.geometry
        one = PressureLaw.single(1000.0, 3.0)
        two = PressureLaw((Layer(1010.0, 1.5, "sewage"), Layer(900.0, 3.0, "fat")))
        two_gas = PressureLaw((Layer(1010.0, 1.5, "sewage"), Layer(900.0, 3.0, "fat")),
                              gas_pressure=5000.0)
        t = interleaved({
            "solve": lambda s=s: solve(s, 3.0, 1000.0),
            "one": lambda s=s, law=one: integrate_edges(s, law),
            "two": lambda s=s, law=two: integrate_edges(s, law),
            "two_gas": lambda s=sc, law=two_gas: integrate_edges(s, law),
        }, args.repeat)
        print(f"\n{kind}, {N} vertices (wavy tank), level 3.0 m:")
        print(f"  solve() today, one liquid          {t['solve']:7.1f} us")
        print(f"  integrate_edges, one liquid         {t['one']:7.1f} us")
        print(f"  integrate_edges, 2 layers           {t['two']:7.1f} us")
        print(f"  integrate_edges, 2 layers + gas     {t['two_gas']:7.1f} us")
        print(f"  2 layers + gas: {t['two_gas'] / t['solve'] - 1:+.0%} on solve() today, "
              f"{t['two_gas'] / t['one'] - 1:+.0%} on the one-liquid kernel (target +30%)")

        tree = find_pockets(s)
        law = PressureLaw.single(1000.0, s.spill_level)
        state = trap_air(tree, law)
        below = law.with_level(3.5)
        volume = liquid_volume_below(s, 3.5, trap_air(tree, below).caps)
        smooth = smooth_tank(N, kind)
        _ = smooth.geometry
        t = interleaved({
            "find": lambda s=s: find_pockets(s),
            "trap": lambda tree=tree, law=law: trap_air(tree, law),
            "cold": lambda s=s, law=law: trap_air(find_pockets(s), law),
            "none": lambda s=smooth: trap_air(find_pockets(s), PressureLaw.single(1000.0, 3.0)),
            "loads": lambda s=s, law=law, caps=state.caps: integrate_edges(s, law, caps),
        }, max(30, args.repeat // 5))
        lfv = interleaved({"lfv": lambda tree=tree, law=law, v=volume:
                           level_for_liquid_volume(tree, law, v)},
                          max(10, args.repeat // 30))["lfv"]
        print(f"  trapped air at the spill level {law.level:.3f} m: "
              f"{len(state.pockets)} pockets, "
              f"{sum(p.edges.size for p in state.pockets)} pocket edges, "
              f"{tree.n_nodes} tree nodes")
        print(f"  find_pockets (per section)          {t['find']:7.1f} us")
        print(f"  trap_air (tree built)               {t['trap']:7.1f} us")
        print(f"  find_pockets + trap_air (cold)      {t['cold']:7.1f} us   (target 2000 us)")
        print(f"  no pockets (ellipse), cold          {t['none']:7.1f} us")
        print(f"  integrate_edges with the caps       {t['loads']:7.1f} us")
        print(f"  level for a volume, air in place    {lfv:7.1f} us   (the volume at 3.5 m)")


if __name__ == "__main__":
    main()
