"""Small helpers shared by the benchmark scripts (run as ``python tests/benchmarks/X.py``)."""

from __future__ import annotations

import math
import time
from typing import Callable


def fit_exponent(points: list[tuple[int, float]]) -> float:
    """Least-squares slope of log(time) against log(n): the k of time ≈ C·n^k."""
    xs = [math.log(n) for n, _ in points]
    ys = [math.log(t) for _, t in points]
    mx, my = sum(xs) / len(xs), sum(ys) / len(ys)
    return sum((x - mx) * (y - my) for x, y in zip(xs, ys)) / sum((x - mx) ** 2 for x in xs)


def best_time(fn: Callable[[], object], repeat: int = 3) -> float:
    """Best wall-clock seconds of ``repeat`` calls of ``fn``."""
    best = float("inf")
    for _ in range(repeat):
        t0 = time.perf_counter()
        fn()
        best = min(best, time.perf_counter() - t0)
    return best


def short(text: str) -> str:
    """A long Conway notation shortened for tables: ``conway:2 x200``."""
    if text.startswith("conway:"):
        parts = text[7:].split()
        return f"conway:{parts[0]} x{len(parts)}"
    return text
