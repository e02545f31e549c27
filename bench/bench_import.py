"""Benchmark of DXF import (figures printed; not a test).

    python bench/bench_import.py [--sizes 1000 10000 20000 100000 200000] [--skip-export]

Times the whole import of a closed outline of N vertices, file to validated
Section (``read_outline``: ezdxf reads the drawing, Wetline finds, flattens,
matches parts and validates), for two kinds of drawing:

- **CAD**: one closed LWPOLYLINE in mm, as a drawing office sends it;
- **export**: what ``write_outline`` writes (the outline plus one LINE per
  edge on its part's layer), read back with its parts; its writing time is
  printed too.

Target (issue "DXF import"): linear in N, so the ratio 200k / 20k is about
10; before the fix, writing a 200,000-vertex outline took two minutes
(ezdxf appended the polyline's points one at a time).
"""

import argparse
import os
import platform
import statistics
import sys
import tempfile
import time
from pathlib import Path

import ezdxf
import numpy as np

from wetline.core.dxf_io import read_outline, write_outline
from wetline.core.section import Section

SIZES = (1_000, 10_000, 20_000, 100_000, 200_000)


def wavy_tank(n):
    """A closed outline of n vertices [m]: a tank whose walls ripple, with a
    floor, an opening at the top and a lid (as bench_core's)."""
    t = np.linspace(0.0, 2.0 * np.pi, n, endpoint=False)
    r = 1.0 + 0.08 * np.sin(23.0 * t)
    x = 2.0 + 1.5 * r * np.cos(t)
    z = 2.0 + 1.8 * r * np.sin(t)
    z1 = np.roll(z, -1)
    parts = np.full(n, "wall", dtype=object)
    parts[(x > 3.0) & (z > 2.5)] = "lid"
    parts[(z < 0.6) & (z1 < 0.6)] = "floor"
    parts[(z > 3.6) & (z1 > 3.6)] = "open"
    return Section.build(np.c_[x, z], parts=parts.tolist())


def cad_drawing(section, path):
    """One closed LWPOLYLINE in mm, all points set at once."""
    doc = ezdxf.new("R2010", units=4)
    poly = doc.modelspace().add_lwpolyline([], close=True, dxfattribs={"layer": "OUTLINE"})
    n = section.n_edges
    poly.lwpoints.set(np.column_stack([section.outline * 1000.0, np.zeros((n, 3))]))
    doc.saveas(path)


def timed(fn, repeat):
    times = []
    for _ in range(repeat):
        t0 = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t0)
    return statistics.median(times)


def main():
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--sizes", type=int, nargs="+", default=list(SIZES))
    ap.add_argument("--skip-export", action="store_true",
                    help="time only the CAD drawing (the export's writing is slow)")
    args = ap.parse_args()
    print(f"python {platform.python_version()}, numpy {np.__version__}, "
          f"ezdxf {ezdxf.__version__}, {platform.machine()}, {os.cpu_count()} cores")
    print(f"{'vertices':>9} {'file MB':>8} {'CAD import s':>13} {'us/vertex':>10} "
          f"{'export write s':>15} {'export import s':>16} {'us/vertex':>10}")
    cad, export = {}, {}
    with tempfile.TemporaryDirectory() as tmp:
        for n in args.sizes:
            s = wavy_tank(n)
            repeat = 3 if n <= 20_000 else 1
            path = Path(tmp) / f"cad{n}.dxf"
            cad_drawing(s, path)
            size_mb = path.stat().st_size / 1e6
            cad[n] = timed(lambda path=path: read_outline(path), repeat)
            line = (f"{n:>9} {size_mb:>8.1f} {cad[n]:>13.3f} {cad[n] / n * 1e6:>10.1f}")
            if not args.skip_export:
                out = Path(tmp) / f"export{n}.dxf"
                t_write = timed(lambda s=s, out=out: write_outline(s, out, unit="mm"), 1)
                back, _ = read_outline(out)
                assert back.parts == s.parts, "parts lost in the round trip"
                export[n] = timed(lambda out=out: read_outline(out), repeat)
                line += (f" {t_write:>15.2f} {export[n]:>16.3f} "
                         f"{export[n] / n * 1e6:>10.1f}")
            print(line)
            sys.stdout.flush()
    if 20_000 in cad and 200_000 in cad:
        print(f"ratio 200k / 20k (x10 vertices): CAD x{cad[200_000] / cad[20_000]:.1f}"
              + (f", export x{export[200_000] / export[20_000]:.1f}" if export else ""))


if __name__ == "__main__":
    main()
