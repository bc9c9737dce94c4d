"""Benchmark: writing explorer.html and using it in headless Chromium at 1k-100k knot types.

Run from the repository root:  python tests/benchmarks/bench_explorer.py
Writes reports/bench_explorer.md.  Builds the small test census once (tests/_census_fixture.py),
times :func:`explorer_data` with and without drawings, then replicates its knot records
(keys made unique) to N = 1,000, 10,000 and 100,000 types and measures, in one Chromium
session side by side: page load until the table is ready, a combined filter, a sort by
determinant and turning a page (milliseconds, from ``performance.now()`` in the page).
Needs Chromium, chromedriver and selenium (docs_ci_browser.md).
"""

from __future__ import annotations

import os
import platform
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
sys.path[:0] = [str(ROOT), str(ROOT / "tests")]

from _census_fixture import build_census  # noqa: E402
from pipeline.census.reader import open_census  # noqa: E402
from pipeline.present.explorer import COLUMNS, explorer_data, explorer_html  # noqa: E402

SIZES = [1_000, 10_000, 100_000]
ARGS = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
        "--disable-background-networking", "--disable-component-update", "--disable-sync"]

_OPS = """
const t0 = performance.now();
document.getElementById('chir').value = 'chiral';
document.getElementById('sig-min').value = '0'; document.getElementById('sig-max').value = '0';
document.getElementById('cr-max').value = '12'; apply();
const t1 = performance.now();
document.querySelector('#knots th[data-col="det"]').click();
const t2 = performance.now();
document.getElementById('next').click();
const t3 = performance.now();
return [t1 - t0, t2 - t1, t3 - t2, view.length];
"""


def main() -> None:
    from selenium import webdriver
    from selenium.webdriver.support.ui import WebDriverWait
    os.environ["SE_OFFLINE"] = "true"
    with tempfile.TemporaryDirectory() as tmp:
        tmp = Path(tmp)
        census = open_census(build_census(tmp))
        t = time.perf_counter(); base = explorer_data(census, draw_per_family=0); t_nodraw = time.perf_counter() - t
        t = time.perf_counter(); drawn = explorer_data(census); t_draw = time.perf_counter() - t
        opts = webdriver.ChromeOptions()
        opts.binary_location = "/usr/bin/chromium"
        for a in ARGS + [f"--user-data-dir={tmp / 'profile'}"]:
            opts.add_argument(a)
        driver = webdriver.Chrome(options=opts, service=webdriver.ChromeService(executable_path="/usr/bin/chromedriver"))
        rows = []
        try:
            for n in SIZES:
                recs = []
                k = COLUMNS.index("key")
                for i in range(n):
                    r = list(base["knots"][i % len(base["knots"])])
                    r[k] = f"{r[k]}#{i}"
                    recs.append(r)
                t = time.perf_counter()
                page = explorer_html(dict(base, knots=recs))
                t_html = time.perf_counter() - t
                path = tmp / f"explorer_{n}.html"
                path.write_text(page, encoding="utf-8")
                t = time.perf_counter()
                driver.get(path.as_uri())
                WebDriverWait(driver, 120).until(lambda d: d.execute_script("return document.body.dataset.ready") == "1")
                t_load = time.perf_counter() - t
                f, s, p, hits = driver.execute_script(_OPS)
                rows.append((n, len(page) / 1e6, t_html, t_load, f, s, p, hits))
                print(rows[-1], flush=True)
        finally:
            driver.quit()
    n_svg = len(drawn["svgs"])
    lines = ["# Benchmark: explorer.html (writing it, and using it in headless Chromium)", "",
             f"Machine: {platform.machine()}, Python {platform.python_version()}, {os.cpu_count()} cores "
             "(shared with other jobs; one run each, all in one session).", "",
             f"Test census ({len(census.diagrams)} diagrams, {len(census.knots)} knot types): `explorer_data` "
             f"{t_nodraw:.2f} s without drawings, {t_draw:.2f} s with {n_svg} drawings "
             f"({(t_draw - t_nodraw) / max(n_svg, 1) * 1000:.0f} ms per drawing).", "",
             "Synthetic pages (the test census's knot records replicated, keys made unique):", "",
             "| knot types | page MB | write s | load until ready s | filter ms | sort by det ms | next page ms | rows after filter |",
             "|---:|---:|---:|---:|---:|---:|---:|---:|"]
    lines += [f"| {n} | {mb:.1f} | {th:.2f} | {tl:.2f} | {f:.0f} | {s:.0f} | {p:.0f} | {h} |"
              for n, mb, th, tl, f, s, p, h in rows]
    lines += ["", "Pages above 1 MB of JSON embed it gzip-compressed (unpacked by `DecompressionStream`). "
              "Only one page of rows (50 by default) is in the document, so a filter or sort costs a pass "
              "over plain arrays.", ""]
    (ROOT / "reports" / "bench_explorer.md").write_text("\n".join(lines), encoding="utf-8")
    print("wrote reports/bench_explorer.md")


if __name__ == "__main__":
    main()
