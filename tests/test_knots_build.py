"""Tests of pipeline.census.knots_build: the knots table built in bounded-memory batches.

The module's promise (its docstring): the batched result equals one call of the
classifier over all rows.  The reference here is that one call,
:func:`pipeline.identify.knots_table.build_knots_table` on every row at once, against
the batched build with batches as small as possible, on stored diagrams tables written
for the purpose.  The notes checked are the ones the knots table documents (README.md
``knots``): a fingerprint-only key whose diagram is identical (same ``diagram_id``) to
one of a normal-form key is the same type — an identical diagram is an isotopy, the
definition of ``diagram_id`` (DESIGN.md, canonical form) *(common practice)*.
"""

from __future__ import annotations

import json

import pyarrow as pa
import pyarrow.parquet as pq
import pytest

from pipeline.census.knots_build import COLUMNS, _batches, knots_rows
from pipeline.census.schemas import DIAGRAMS
from pipeline.identify.knots_table import build_knots_table


def _row(row_id, *, key, proof, fp, did, notation, crossings=3, mirror=None, **extra):
    knot = {"fingerprint": fp, "proof": proof, "mirror_key": mirror or key}
    return {"row_id": row_id, "diagram_id": did, "family": "pd", "family_index": 0,
            "params": "{}", "notation": notation, "crossings": crossings, "components": 1,
            "status": "ok", "knot_key": key, "mirror_key": mirror or key, "knot_proof": proof,
            "extras": json.dumps({"knot": knot, "other": "dropped by the build"}), **extra}


def _store(tmp_path, rows, *, parts=1):
    """A census directory whose diagrams table holds ``rows`` in ``parts`` Parquet files."""
    d = tmp_path / "census"
    (d / "diagrams").mkdir(parents=True)
    step = -(-len(rows) // parts)
    for i in range(parts):
        chunk = rows[i * step:(i + 1) * step]
        pq.write_table(pa.Table.from_pylist(chunk, schema=DIAGRAMS), d / "diagrams" / f"part-{i}.parquet")
    return d


def _one_call(rows):
    """The reference: the classifier over all rows at once, on the columns the build reads."""
    return build_knots_table([{c: r.get(c) for c in COLUMNS} for r in rows])


# A normal-form key and a fingerprint-only key of one diagram (equal diagram_id) whose
# fingerprints differ because the second row lacks an invariant (an ``fp-partial:``
# fingerprint, proving nothing): only the diagram_id joins them.
SHARED_DIAGRAM = [
    _row(0, key="torus:2,3", proof="normal form", fp="fp:aaaa", did="D-trefoil", notation="torus:2,3"),
    _row(1, key="fp-partial:bbbb", proof="fingerprint only", fp="fp-partial:bbbb", did="D-trefoil",
         notation="pd:[[1,5,2,4],[3,1,4,6],[5,3,6,2]]"),
    _row(2, key="torus:2,5", proof="normal form", fp="fp:cccc", did="D-cinquefoil", notation="torus:2,5",
         crossings=5),
]


def test_rows_sharing_a_diagram_id_fall_in_one_batch_even_with_tiny_batches(tmp_path):
    # bug: clusters were joined by fingerprint only, so with batch_rows=1 the two keys of
    # D-trefoil were classified in different batches and the note vanished
    d = _store(tmp_path, SHARED_DIAGRAM)
    batched = knots_rows(d, build_knots_table, batch_rows=1)
    assert sorted(batched, key=lambda k: k["knot_key"]) == _one_call(SHARED_DIAGRAM)
    note = {k["knot_key"]: k["distinctness_note"] for k in batched}["fp-partial:bbbb"]
    assert note is not None and note.startswith("the same type as torus:2,3")


def test_batches_are_connected_components_of_keys_fingerprints_and_diagram_ids(tmp_path):
    # brute force: the components of the key/fingerprint/diagram_id graph found by
    # repeated merging of overlapping sets, against the batches with batch_rows=1
    import pyarrow.dataset as ds
    rows = SHARED_DIAGRAM + [
        _row(3, key="2b:7/3", proof="normal form", fp="fp:dddd", did="D-52", notation="rational:7/3", crossings=5),
        _row(4, key="fp:dddd", proof="fingerprint only", fp="fp:dddd", did="D-52b", notation="pd:x", crossings=7),
        _row(5, key="fp:eeee", proof="fingerprint only", fp="fp:eeee", did=None, notation="pd:y", crossings=8),
    ]
    d = _store(tmp_path, rows, parts=3)
    sets = [{("k", r["knot_key"]), ("f", r["knot_key"] and json.loads(r["extras"])["knot"]["fingerprint"]),
             ("d", r["diagram_id"] or f"none-{r['row_id']}")} for r in rows]
    merged = True
    while merged:
        merged = False
        for i in range(len(sets)):
            for j in range(i + 1, len(sets)):
                if sets[i] & sets[j]:
                    sets[i] |= sets.pop(j)
                    merged = True
                    break
            if merged:
                break
    expected = sorted(sorted(n[1] for n in s if n[0] == "k") for s in sets)
    dataset = ds.dataset(str(d / "diagrams"), format="parquet", schema=DIAGRAMS)
    got = sorted(sorted(b) for b in _batches(dataset, 1))
    assert got == expected


@pytest.mark.parametrize("batch_rows", [1, 2, 3, 10 ** 9])
def test_batched_build_equals_one_call_on_a_mixed_table(tmp_path, batch_rows):
    rows = SHARED_DIAGRAM + [
        # mutants-like pair: two normal-form keys with one fingerprint (same cluster)
        _row(3, key="mont:0:1/2,1/3,2/5", proof="normal form", fp="fp:ffff", did="D-m1", notation="m1"),
        _row(4, key="mont:0:1/2,2/5,1/3", proof="normal form", fp="fp:ffff", did="D-m2", notation="m2"),
        _row(5, key="fp:gggg", proof="fingerprint only", fp="fp:gggg", did="D-g", notation="pd:g"),
        _row(6, key="fp:gggg", proof="fingerprint only", fp="fp:gggg", did="D-g", notation="pd:g2"),
    ]
    d = _store(tmp_path, rows, parts=2)
    batched = knots_rows(d, build_knots_table, batch_rows=batch_rows)
    assert sorted(batched, key=lambda k: k["knot_key"]) == _one_call(rows)
    assert not (d / "_tmp" / "knots-build").exists()    # the spill files are removed


def test_the_build_reads_only_the_knot_part_of_extras(tmp_path):
    seen = []

    def spy(rows):
        seen.extend(rows)
        return build_knots_table(rows)

    knots_rows(_store(tmp_path, SHARED_DIAGRAM), spy, batch_rows=1)
    assert sorted(r["row_id"] for r in seen) == [0, 1, 2]
    assert all(set(r) == set(COLUMNS) for r in seen)
    assert all(set(json.loads(r["extras"])) == {"knot"} for r in seen)
