"""Benchmark: picture layout and rendering against the number of crossings.

Run from the repository root:  python tests/benchmarks/bench_draw.py
Writes reports/bench_draw.md.  For each family member it times, in one run side by side,
the Tutte solves alone (``_piece_positions``), the whole :func:`layout` (solves, smoothing
and the stray-intersection check) and :func:`draw_diagram` to SVG and PNG (layout included).
"""

from __future__ import annotations

import os
import platform
import sys
import tempfile
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[2]))

from pipeline import parse  # noqa: E402
from pipeline.present.draw import draw_diagram, layout  # noqa: E402
from pipeline.present.draw.geometry import _piece_positions  # noqa: E402
from _bench import best_time as _time

SIZES = [10, 40, 100, 400]
RENDER_LIMIT = 100  # rendering beyond this is slow and the labels unreadable anyway


def families(n: int) -> dict[str, str]:
    return {
        "torus T(2,q)": f"torus:2,{n + 1 if n % 2 == 0 else n}",
        "closed 4-braid": "braid:" + ",".join(["1,-2,3,2"] * (n // 4)),
        "two-bridge conway 2 2 ... 2": "conway:" + " ".join(["2"] * (n // 2)),
    }



def main() -> None:
    rows = []
    with tempfile.TemporaryDirectory() as tmp:
        draw_diagram(parse("torus:2,3"), os.path.join(tmp, "warm.svg"))  # import matplotlib once
        for n in SIZES:
            for name, text in families(n).items():
                d = parse(text)
                t_tutte = _time(lambda: [_piece_positions(d, p) for p in d.pieces])
                t_layout = _time(lambda: layout(d))
                if d.n_crossings <= RENDER_LIMIT:
                    t_svg = _time(lambda: draw_diagram(d, os.path.join(tmp, "d.svg")), 1)
                    t_png = _time(lambda: draw_diagram(d, os.path.join(tmp, "d.png")), 1)
                else:
                    t_svg = t_png = None
                rows.append((name, d.n_crossings, t_tutte, t_layout, t_svg, t_png))
                print(rows[-1], flush=True)
    out = Path(__file__).resolve().parents[2] / "reports" / "bench_draw.md"

    def fmt(t):
        return "—" if t is None else f"{t:.3f}"

    lines = ["# Benchmark: pictures (`knotledger draw`)", "",
             f"Machine: {platform.machine()}, Python {platform.python_version()}, "
             f"{os.cpu_count()} cores (shared with other jobs; best of 3 for layout, one run for rendering).",
             "", "| family | crossings | Tutte solves s | layout s | SVG s | PNG s | layout / Tutte |",
             "|---|---:|---:|---:|---:|---:|---:|"]
    for name, n, a, b, c, d in rows:
        lines.append(f"| {name} | {n} | {a:.3f} | {b:.3f} | {fmt(c)} | {fmt(d)} | {b / a:.1f} |")
    lines += ["", "Rendering is skipped above "
              f"{RENDER_LIMIT} crossings (seconds per picture grow with the number of labels).", ""]
    out.write_text("\n".join(lines))
    print(f"wrote {out}")


if __name__ == "__main__":
    main()
