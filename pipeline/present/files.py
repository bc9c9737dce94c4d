"""Writing the files of a report: whole or not at all."""

from __future__ import annotations

from pathlib import Path

__all__ = ["write_text_atomic"]


def write_text_atomic(path: Path, text: str) -> Path:
    """Write ``text`` to ``path`` through a temporary sibling renamed over it, so a
    reader never sees half a file; returns ``path``."""
    tmp = path.with_suffix(path.suffix + ".tmp")
    try:
        tmp.write_text(text, encoding="utf-8")
        tmp.replace(path)
    finally:
        if tmp.exists():
            tmp.unlink()
    return path
