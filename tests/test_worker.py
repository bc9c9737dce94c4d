"""The census worker: row isolation, rejects, the chunk timeout (main thread and worker
thread), and the rows of a chunk whose worker never came back."""

from __future__ import annotations

import json
import threading
import time

import pytest

from pipeline.census.spec import parse_spec, iter_items
from pipeline.census.worker import compute_chunk, given_up_result

from _faults import SlowRow

TWO_BRIDGE = '[[family]]\nkind = "two_bridge"\nalpha = [3, 7]\n'   # φ(3) + ... + φ(7) = 2 + 2 + 4 + 2 + 6 = 16 rows


def _items(text: str = TWO_BRIDGE):
    return list(iter_items(parse_spec(text)))


class _SlowStart(list):
    """A chunk whose iteration starts only after ``delay`` seconds (the timer fires first)."""

    delay = 0.5

    def __iter__(self):
        time.sleep(self.delay)
        return super().__iter__()


def test_rows_match_schubert_determinant_and_carry_cheap_columns():
    items = _items()
    res = compute_chunk(3, items, {"max_modulus": 5})
    assert res["chunk"] == 3 and res["stats"]["items"] == len(items) and not res["stats"]["timed_out"]
    for row in res["diagrams"]:
        p = json.loads(row["params"])
        assert row["status"] == "ok"
        assert row["determinant"] == p["alpha"]   # det b(α, β) = α (Schubert 1956)
        assert row["components"] == (1 if p["alpha"] % 2 else 2)  # b(α, β): knot iff α odd
    # colourings: n · Π gcd(n, d_i) with the single factor α (Przytycki 1998, *(memory)*)
    from math import gcd
    alpha = {r["row_id"]: json.loads(r["params"])["alpha"] for r in res["diagrams"]}
    for c in res["colorings"]:
        n = c["modulus"]
        assert c["count"] == n * gcd(n, alpha[c["row_id"]])


def test_a_failing_row_is_its_own_status_and_the_chunk_goes_on():
    def boom(item):
        if item.row_id == 2:
            raise RuntimeError("boom\nsecond line")
    res = compute_chunk(0, _items(), {"max_modulus": 3}, fault=boom)
    status = {r["row_id"]: r["status"] for r in res["diagrams"]}
    assert status[2] == "error: RuntimeError: boom"
    assert all(s == "ok" for rid, s in status.items() if rid != 2) and len(status) == 16


def test_unparsable_and_malformed_items_become_rejects_with_reasons():
    good, = _items('[[family]]\nkind = "torus"\np = 2\nq = 3\n')
    bad = good._replace(row_id=1, notation="torus:2,x")
    broken = good._replace(row_id=2, error="empty 'diagram' cell")
    res = compute_chunk(0, [good, bad, broken], {"max_modulus": 3})
    assert [r["row_id"] for r in res["diagrams"]] == [0]
    reasons = {r["row_id"]: r["reason"] for r in res["rejects"]}
    assert "'x' is not an integer" in reasons[1] and reasons[2] == "empty 'diagram' cell"


def test_timeout_before_the_first_item_gives_up_every_row():
    # The timer fires while the loop has not bound its variable yet: every row must carry
    # the timeout status (this raised UnboundLocalError before).
    items = _SlowStart(_items())
    res = compute_chunk(0, items, {"max_modulus": 3, "timeout": 0.05})
    assert res["stats"]["timed_out"]
    assert len(res["diagrams"]) == 16
    assert {r["status"] for r in res["diagrams"]} == {"skipped: chunk timeout 0.05 s"}
    assert all(r.get("determinant") is None and r["crossings"] is None for r in res["diagrams"])
    assert not res["colorings"]


def test_timeout_in_the_main_thread_interrupts_the_slow_row():
    items = _items()
    res = compute_chunk(0, items, {"max_modulus": 3, "timeout": 0.5}, fault=SlowRow(4, 30))
    status = {r["row_id"]: r["status"] for r in res["diagrams"]}
    assert all(status[i] == "ok" for i in range(4))
    assert all(status[i] == "skipped: chunk timeout 0.5 s" for i in range(4, 16))
    assert not [c for c in res["colorings"] if c["row_id"] >= 4]


def test_timeout_in_a_worker_thread_is_checked_between_diagrams():
    # dask runs chunks in threads: no SIGALRM there, the slow row finishes, the rest is given up
    got = {}
    t = threading.Thread(target=lambda: got.update(
        compute_chunk(0, _items(), {"max_modulus": 3, "timeout": 0.2}, fault=SlowRow(1, 0.4))))
    t.start()
    t.join()
    status = {r["row_id"]: r["status"] for r in got["diagrams"]}
    assert status[0] == status[1] == "ok"
    assert all(status[i] == "skipped: chunk timeout 0.2 s" for i in range(2, 16))


@pytest.mark.parametrize("why", ["", "error: worker process died (TerminatedWorkerError)"])
def test_given_up_result_keeps_rejects_and_says_why(why):
    items = _items('[[family]]\nkind = "torus"\np = 2\nq = [3, 4]\n')
    items.append(items[0]._replace(row_id=2, error="malformed"))
    res = given_up_result(5, items, 7.0, why)
    assert [r["row_id"] for r in res["diagrams"]] == [0, 1]
    assert {r["status"] for r in res["diagrams"]} == {why or "skipped: chunk timeout 7 s"}
    assert res["diagrams"][0]["notation"] == "torus:2,3" and res["diagrams"][0]["crossings"] is None
    assert res["rejects"][0]["reason"] == "malformed" and res["stats"]["items"] == 3
