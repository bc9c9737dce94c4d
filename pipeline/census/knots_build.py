"""Build the knots table in bounded memory.

:func:`pipeline.identify.knots_table.build_knots_table` needs every row of a knot key together,
and it annotates each key with the other keys that share one of its fingerprints.
It also notes a fingerprint-only key whose rows share a ``diagram_id`` with a row of a
normal-form key.  So the rows are split into *clusters*: connected components of the
graph joining a knot key to the fingerprints, the diagram ids and the flype codes of its rows
(union-find over the distinct pairs, a structure the size of the number of distinct
diagrams, not of the census rows).  Clusters are
packed into batches of about ``batch_rows`` rows; one streaming pass spills every row
(needed columns only) to the Arrow file of its batch, and each batch file is then read,
handed to the classifier, and deleted — two linear passes over the table in all.  Every
knot key, every fingerprint and every diagram id lives in exactly one batch, so the
result equals one call over all rows, while memory is bounded by the batch size
(plus the largest cluster).
"""

from __future__ import annotations

import json
from pathlib import Path
from typing import Callable, Iterator

from ..numbers import UnionFind

__all__ = ["knots_rows", "COLUMNS"]

#: diagrams columns the classifier reads (the rest stay on disk).
COLUMNS = ["row_id", "diagram_id", "family", "params", "notation", "crossings", "components",
           "determinant", "determinant_text", "invariant_factors", "alexander", "jones",
           "signature", "chirality", "chirality_reason", "knot_key", "mirror_key", "knot_proof",
           "status", "extras", "flype_code"]


def _slim(extras: str | None) -> str | None:
    """Keep only the ``knot`` part of extras (the classifier's own fields)."""
    if not extras:
        return None
    knot = json.loads(extras).get("knot")
    return json.dumps({"knot": knot}) if knot else None


def _batches(dataset, batch_rows: int) -> Iterator[list]:
    sets = UnionFind()
    counts: dict = {}
    for batch in dataset.to_batches(columns=["knot_key", "extras", "diagram_id", "flype_code"]):
        keys = batch.column("knot_key").to_pylist()
        extras = batch.column("extras").to_pylist()
        dids = batch.column("diagram_id").to_pylist()
        codes = batch.column("flype_code").to_pylist()
        for key, ex, did, code in zip(keys, extras, dids, codes):
            k = ("k", key)
            sets.add(k)
            counts[k] = counts.get(k, 0) + 1
            fp = (json.loads(ex).get("knot") or {}).get("fingerprint") if ex else None
            # a key joins the fingerprints of its rows (fingerprint notes) and their
            # diagram ids (the same-diagram note) and flype codes (the flype-class check):
            # all are read across keys
            for node in (("f", fp) if fp is not None else None, ("d", did) if did else None,
                         ("c", code) if code else None):
                if node is not None:
                    sets.union(k, node)
    clusters: dict = {}
    for node, n in counts.items():
        root = sets.find(node)
        size, keys = clusters.get(root, (0, []))
        keys.append(node[1])
        clusters[root] = (size + n, keys)
    batch, size = [], 0
    for root in sorted(clusters, key=lambda r: str(min(map(str, clusters[r][1])))):
        n, keys = clusters[root]
        batch.extend(keys)
        size += n
        if size >= batch_rows:
            yield batch
            batch, size = [], 0
    if batch:
        yield batch


def knots_rows(directory: str | Path, build: Callable[[list[dict]], list[dict]], *,
               batch_rows: int = 10_000) -> list[dict]:
    """Knots rows of a census directory, built batch by batch with ``build``.

    Two passes over the diagrams table: the first finds the clusters; the second
    spills each row (needed columns only) to the Arrow file of its batch under
    ``DIR/_tmp/knots-build/``; then each batch file is read, classified and deleted.
    """
    import shutil
    import pyarrow as pa
    import pyarrow.compute as pc
    import pyarrow.dataset as ds
    from .schemas import DIAGRAMS
    directory = Path(directory)
    dataset = ds.dataset(str(directory / "diagrams"), format="parquet", schema=DIAGRAMS)
    batch_of = {key: b for b, keys in enumerate(_batches(dataset, batch_rows)) for key in keys}
    spill = directory / "_tmp" / "knots-build"
    shutil.rmtree(spill, ignore_errors=True)
    spill.mkdir(parents=True)
    writers: dict = {}
    try:
        for rb in dataset.to_batches(columns=COLUMNS):
            ids = pa.array([batch_of[k] for k in rb.column("knot_key").to_pylist()], pa.int32())
            for b in sorted(set(ids.to_pylist())):
                if b not in writers:
                    writers[b] = pa.ipc.new_file(str(spill / f"batch-{b}.arrow"), rb.schema)
                writers[b].write_batch(rb.filter(pc.equal(ids, b)))
        for w in writers.values():
            w.close()
        out: list[dict] = []
        for b in sorted(writers):
            path = spill / f"batch-{b}.arrow"
            with pa.memory_map(str(path)) as src:
                rows = pa.ipc.open_file(src).read_all().to_pylist()
            for r in rows:
                r["extras"] = _slim(r["extras"])
            rows.sort(key=lambda r: r["row_id"])
            out.extend(build(rows))
            del rows
            path.unlink()
            pa.default_memory_pool().release_unused()
        return out
    finally:
        shutil.rmtree(spill, ignore_errors=True)
